"""One exception family for every stage, each carrying a source span.

Every message can be printed as ``path:line:col: severity: message`` with the
offending source line and a caret, whichever stage raised it.
"""
from __future__ import annotations

from dataclasses import dataclass, field


@dataclass(frozen=True)
class Span:
    """Where a piece of sheet text sits: 1-based line and column, end exclusive.

    ``path`` is set only for text from an included file (None: the sheet itself).
    """

    line: int
    col: int
    end_line: int
    end_col: int
    path: str | None = None

    @classmethod
    def point(cls, line: int, col: int) -> "Span":
        return cls(line, col, line, col + 1)

    def merge(self, other: "Span | None") -> "Span":
        if other is None:
            return self
        start = min((self.line, self.col), (other.line, other.col))
        end = max((self.end_line, self.end_col), (other.end_line, other.end_col))
        return Span(start[0], start[1], end[0], end[1], self.path)

    def where(self) -> str:
        """'line 12', or 'loads.calc line 12' for an included file."""
        return f"{self.path} line {self.line}" if self.path else f"line {self.line}"


NO_SPAN = Span(1, 1, 1, 2)


@dataclass
class Diagnostic:
    """A reportable finding: an error, warning or info with its place and code."""

    severity: str  # "error" | "warning" | "info"
    code: str
    message: str
    span: Span = NO_SPAN
    hint: str | None = None
    path: str = "<sheet>"
    suppressed: str | None = None  # the reason, when a line suppresses it

    def to_json(self) -> dict:
        out = {
            "severity": self.severity,
            "code": self.code,
            "line": self.span.line,
            "col": self.span.col,
            "end_line": self.span.end_line,
            "end_col": self.span.end_col,
            "message": self.message,
        }
        if self.hint:
            out["hint"] = self.hint
        return out

    def one_line(self) -> str:
        return f"{self.path}:{self.span.line}:{self.span.col}: {self.severity} {self.code}: {self.message}"

    def format(self, source: str | None = None, with_code: bool = False) -> str:
        """Human form: location, message, the source line and a caret under the span."""
        head = f"{self.path}:{self.span.line}:{self.span.col}: {self.severity}: {self.message}"
        lines = [head + (f" [{self.code}]" if with_code else "")]
        if source is not None:
            src_lines = source.splitlines()
            if 1 <= self.span.line <= len(src_lines):
                text = src_lines[self.span.line - 1].expandtabs(1)
                end = self.span.end_col if self.span.end_line == self.span.line else len(text) + 1
                width = max(1, min(end, len(text) + 1) - self.span.col)
                lines.append(f"  {self.span.line:>4} | {text}")
                lines.append("       | " + " " * (self.span.col - 1) + "^" + "~" * (width - 1))
        if self.hint:
            lines.append(f"  hint: {self.hint}")
        return "\n".join(lines)


class CalcError(Exception):
    """Base of every sheet error. Subclasses set a stable ``code``."""

    code = "error"
    severity = "error"

    def __init__(self, message: str, span: Span | None = None, hint: str | None = None):
        super().__init__(message)
        self.message = message
        self.span = span
        self.hint = hint

    def with_span(self, span: Span) -> "CalcError":
        if self.span is None:
            self.span = span
        return self

    def diagnostic(self, path: str = "<sheet>") -> Diagnostic:
        span = self.span or NO_SPAN
        return Diagnostic(self.severity, self.code, self.message, span, self.hint, span.path or path)


def _error(name: str, code: str, doc: str, severity: str = "error") -> type[CalcError]:
    return type(name, (CalcError,), {"code": code, "severity": severity, "__doc__": doc})


SheetSyntaxError = _error("SheetSyntaxError", "syntax", "The text is not a valid statement.")
FrontMatterError = _error("FrontMatterError", "front-matter", "The front matter block is malformed.")
UnknownUnitError = _error("UnknownUnitError", "unknown-unit", "A unit name is not in our vocabulary.")
UndefinedNameError = _error("UndefinedNameError", "undefined-name", "A name is used but never defined.")
UseBeforeDefinitionError = _error(
    "UseBeforeDefinitionError", "use-before-definition", "A name is used above the line defining it."
)
RedefinitionError = _error("RedefinitionError", "redefinition", "A name is defined twice.")
DimensionError = _error("DimensionError", "dimension-mismatch", "Quantities of different dimensions meet.")
DeclaredUnitError = _error(
    "DeclaredUnitError", "declared-unit-mismatch", "A value's declared [unit] disagrees with its expression."
)
AngleError = _error("AngleError", "not-an-angle", "A trigonometric function got something that is not an angle.")
DivisionByZeroError = _error("DivisionByZeroError", "division-by-zero", "A division by zero.")
NumericError = _error("NumericError", "not-finite", "A result is infinite, NaN or complex.")
UnknownFunctionError = _error("UnknownFunctionError", "unknown-function", "A function name is not known.")
UnknownPluginError = _error("UnknownPluginError", "unknown-plugin", "A plugin namespace or function is not known.")
UnknownFieldError = _error("UnknownFieldError", "unknown-field", "A record has no such field.")
PluginArgumentError = _error(
    "PluginArgumentError", "plugin-argument", "A plugin was called with a missing, extra or mistyped argument."
)
PluginInputError = _error("PluginInputError", "plugin-input", "A plugin refused its input values.")
TypeMismatchError = _error("TypeMismatchError", "type-mismatch", "A value of the wrong kind (text, list, record).")
TooComplexError = _error("TooComplexError", "too-complex", "A sheet or expression exceeds the size limits.")
OverrideError = _error("OverrideError", "override", "A --set override names an unknown or derived value.")
IncludeError = _error("IncludeError", "include", "An included file is missing or not allowed.")


class PluginDefinitionError(Exception):
    """A plugin breaks the plugin contract; raised when it registers, naming the plugin."""


class SheetErrors(Exception):
    """Several diagnostics at once (a sheet with errors); carries them all."""

    def __init__(self, diagnostics: list[Diagnostic], source: str | None = None):
        self.diagnostics = diagnostics
        self.source = source
        super().__init__("\n".join(d.one_line() for d in diagnostics))


# ---------------------------------------------------------------- checker findings
# Findings of the static checker beyond the general errors above (docs/diagnostics.md
# has one entry per code). Dimension slips keep their general codes; their likely
# fix travels in the hint.


OffsetTemperatureError = _error(
    "OffsetTemperatureError", "offset-temperature",
    "A temperature on an offset scale (degC, degF) is used in arithmetic.")
ImplausibleValueWarning = _error(
    "ImplausibleValueWarning", "implausible-value",
    "A named quantity lies outside the range its kind has in practice.", severity="warning")
UnitSlipWarning = _error(
    "UnitSlipWarning", "unit-slip",
    "A section property looks like a table value written in the wrong unit (cm⁴ as mm⁴).", severity="warning")
UnitShadowsVariableWarning = _error(
    "UnitShadowsVariableWarning", "unit-shadows-variable",
    "A number is followed by a unit whose name is also a variable of the sheet (2 L is 2 litres).",
    severity="warning")
UnusedInputWarning = _error(
    "UnusedInputWarning", "unused-input", "An input is defined but nothing uses it.", severity="warning")
NoUtilisationWarning = _error(
    "NoUtilisationWarning", "no-utilisation",
    "A check's utilisation (demand/capacity) cannot be formed.", severity="warning")
UnusualUnitInfo = _error(
    "UnusualUnitInfo", "unusual-unit",
    "A declared [unit] is valid but unusual for what the name says the value is.", severity="info")
SuppressionError = _error(
    "SuppressionError", "bad-suppression",
    "An '// allow' comment is malformed, names an unknown code, or tries to hide an error.", severity="warning")
UnusedSuppressionWarning = _error(
    "UnusedSuppressionWarning", "unused-suppression",
    "An '// allow' comment allows a code that does not occur on its line.", severity="warning")
