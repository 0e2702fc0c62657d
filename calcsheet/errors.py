"""One exception family for every stage, each carrying a source span.

Every message can be printed as ``path:line:col: severity: message`` with the
offending source line and a caret, whichever stage raised it.
"""
from __future__ import annotations

import threading
from collections import OrderedDict
from dataclasses import dataclass, field

_LINES: OrderedDict = OrderedDict()  # id(source) -> (source, its lines): the last few sources split
_LINES_KEPT = 8
_LINES_LOCK = threading.Lock()  # the live preview formats from more than one thread


def source_lines(source: str) -> list[str]:
    """The lines of a source, split once however many diagnostics point into it: formatting n diagnostics
    is linear in the sheet, not quadratic. The source is found by identity (the very string object, kept
    alive beside its lines), not by equality: an equal text read anew by a later run in the same process
    would otherwise be compared character by character with the kept one at every diagnostic."""
    key = id(source)
    with _LINES_LOCK:
        hit = _LINES.get(key)
        if hit is not None and hit[0] is source:
            return hit[1]
        lines = source.splitlines()
        _LINES[key] = (source, lines)
        _LINES.move_to_end(key)
        while len(_LINES) > _LINES_KEPT:
            _LINES.popitem(last=False)
        return lines


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


def quick_init(cls):
    """Give a frozen dataclass an ``__init__`` that fills the instance dict directly.

    The generated one of a frozen dataclass sets each field through ``object.__setattr__``, which costs
    more than the rest of making the object; a parse makes several per token. Same signature, same
    defaults, same instances (still frozen: assignment after construction still raises). A class with a
    default factory, ``__post_init__``, slots or keyword-only fields keeps its generated ``__init__``."""
    import dataclasses
    import inspect

    params = dataclasses.fields(cls)
    if (not cls.__dataclass_params__.frozen or hasattr(cls, "__post_init__") or hasattr(cls, "__slots__")
            or any(f.init and (f.default_factory is not dataclasses.MISSING or f.kw_only) for f in params)):
        return cls
    sig = inspect.signature(cls.__init__)
    names = [p for p in sig.parameters if p != "self"]
    if names != [f.name for f in params if f.init]:
        return cls
    defaults = {f"_d{i}": p.default for i, p in enumerate(sig.parameters.values())
                if p.name != "self" and p.default is not inspect.Parameter.empty}
    args, k = [], 0
    for i, p in enumerate(sig.parameters.values()):
        if p.name == "self":
            continue
        args.append(f"{p.name}=_d{i}" if f"_d{i}" in defaults else p.name)
    body = "; ".join(f"d[{n!r}] = {n}" for n in names) or "pass"
    src = f"def __init__(self, {', '.join(args)}):\n    d = self.__dict__; {body}\n"
    ns: dict = {}
    exec(src, defaults, ns)  # our own field names only: no sheet text reaches this
    init = ns["__init__"]
    init.__qualname__ = f"{cls.__qualname__}.__init__"
    init.__doc__ = cls.__init__.__doc__
    cls.__init__ = init
    return cls


quick_init(Span)
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
        if self.suppressed:
            out["suppressed"] = True
            out["reason"] = self.suppressed
        return out

    def one_line(self) -> str:
        return f"{self.path}:{self.span.line}:{self.span.col}: {self.severity} {self.code}: {self.message}"

    def format(self, source: str | None = None, with_code: bool = False) -> str:
        """Human form: location, message, the source line and a caret under the span."""
        head = f"{self.path}:{self.span.line}:{self.span.col}: {self.severity}: {self.message}"
        lines = [head + (f" [{self.code}]" if with_code else "")]
        if source is not None:
            src_lines = source_lines(source)
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
    """Base of every sheet error. Subclasses set a stable ``code``.

    ``slip`` names the known slip a dimension error most likely is (``calcsheet.slips``).
    """

    code = "error"
    severity = "error"

    def __init__(self, message: str, span: Span | None = None, hint: str | None = None, *,
                 slip: str | None = None):
        super().__init__(message)
        self.message: str = message
        self.span: Span | None = span
        self.hint: str | None = hint
        self.slip: str | None = slip

    def with_span(self, span: Span) -> "CalcError":
        if self.span is None:
            self.span = span
        return self

    def diagnostic(self, path: str = "<sheet>") -> Diagnostic:
        span = self.span or NO_SPAN
        return Diagnostic(self.severity, self.code, self.message, span, self.hint, span.path or path)


class SheetSyntaxError(CalcError):
    """The text is not a valid statement."""
    code = "syntax"


class FrontMatterError(CalcError):
    """The front matter block is malformed."""
    code = "front-matter"


class UnknownUnitError(CalcError):
    """A unit name is not in our vocabulary."""
    code = "unknown-unit"


class UndefinedNameError(CalcError):
    """A name is used but never defined."""
    code = "undefined-name"


class UseBeforeDefinitionError(CalcError):
    """A name is used above the line defining it."""
    code = "use-before-definition"


class RedefinitionError(CalcError):
    """A name is defined twice."""
    code = "redefinition"


class DimensionError(CalcError):
    """Quantities of different dimensions meet."""
    code = "dimension-mismatch"


class DeclaredUnitError(CalcError):
    """A value's declared [unit] disagrees with its expression."""
    code = "declared-unit-mismatch"


class AngleError(CalcError):
    """A trigonometric function got something that is not an angle."""
    code = "not-an-angle"


class DivisionByZeroError(CalcError):
    """A division by zero."""
    code = "division-by-zero"


class CheckSignError(CalcError):
    """A check's demand and capacity have opposite signs (or are both negative): no utilisation exists."""
    code = "check-sign"


class NumericError(CalcError):
    """A result is infinite, NaN or complex."""
    code = "not-finite"


class OutOfRangeError(CalcError):
    """A table lookup outside the table's keys (never extrapolated; ``clamp`` takes the end value)."""
    code = "out-of-range"


class UnknownFunctionError(CalcError):
    """A function name is not known."""
    code = "unknown-function"


class UnknownPluginError(CalcError):
    """A plugin namespace or function is not known."""
    code = "unknown-plugin"


class UnknownFieldError(CalcError):
    """A record has no such field."""
    code = "unknown-field"


class PluginArgumentError(CalcError):
    """A plugin was called with a missing, extra or mistyped argument.

    ``param`` names the argument at fault, so the caller can point at it in the call.
    """
    code = "plugin-argument"

    def __init__(self, message: str, span: Span | None = None, hint: str | None = None, *,
                 param: str | None = None):
        super().__init__(message, span, hint)
        self.param: str | None = param


class PluginInputError(CalcError):
    """A plugin refused its input values (``param``: the argument it refused, if one)."""
    code = "plugin-input"

    def __init__(self, message: str, span: Span | None = None, hint: str | None = None, *,
                 param: str | None = None):
        super().__init__(message, span, hint)
        self.param: str | None = param


class TypeMismatchError(CalcError):
    """A value of the wrong kind (text, list, record)."""
    code = "type-mismatch"


class ArityError(TypeMismatchError):
    """A built-in function called with too few or too many arguments (a kind of type mismatch)."""


class TooComplexError(CalcError):
    """A sheet or expression exceeds the size limits."""
    code = "too-complex"


class OverrideError(CalcError):
    """A --set override names an unknown or derived value."""
    code = "override"


class InputError(CalcError):
    """A file or argument cannot be read: too large, not UTF-8, malformed, or of the wrong shape."""
    code = "input"


class IncludeError(CalcError):
    """An included file is missing or not allowed."""
    code = "include"


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


class OffsetTemperatureError(CalcError):
    """A temperature on an offset scale (degC, degF) is used in arithmetic."""
    code = "offset-temperature"


class ImplausibleValueWarning(CalcError):
    """A named quantity lies outside the range its kind has in practice."""
    code = "implausible-value"
    severity = "warning"


class UnitSlipWarning(CalcError):
    """A section property looks like a table value written in the wrong unit (cm⁴ as mm⁴)."""
    code = "unit-slip"
    severity = "warning"


class UnitShadowsVariableWarning(CalcError):
    """A number is followed by a unit whose name is also a variable of the sheet (2 L is 2 litres)."""
    code = "unit-shadows-variable"
    severity = "warning"


class UnusedInputWarning(CalcError):
    """An input is defined but nothing uses it."""
    code = "unused-input"
    severity = "warning"


class NoUtilisationWarning(CalcError):
    """A check's utilisation (demand/capacity) cannot be formed."""
    code = "no-utilisation"
    severity = "warning"


class UnusualUnitInfo(CalcError):
    """A declared [unit] is valid but unusual for what the name says the value is."""
    code = "unusual-unit"
    severity = "info"


class SuppressionError(CalcError):
    """An '// allow' comment is malformed, names an unknown code, or tries to hide an error."""
    code = "bad-suppression"
    severity = "warning"


class UnusedSuppressionWarning(CalcError):
    """An '// allow' comment allows a code that does not occur on its line."""
    code = "unused-suppression"
    severity = "warning"

