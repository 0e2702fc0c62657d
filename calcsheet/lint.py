"""Warnings and infos for statements that type-check but still look wrong.

Run by the checker after a statement's dimensions are known to be right:
values implausible for what their name says they are (``plausibility``),
table-unit slips, unit names that shadow variables, checks with no
utilisation, unusual declared units, and inputs nothing uses. Values are
known statically only for expressions built from literals, so nothing here
evaluates a plugin.
"""
from __future__ import annotations

from typing import TYPE_CHECKING

from . import builtins as B
from . import nodes as N
from . import plausibility as P
from . import units as U
from .errors import (
    Diagnostic,
    ImplausibleValueWarning,
    NoUtilisationWarning,
    UnitShadowsVariableWarning,
    UnitSlipWarning,
    UnusedInputWarning,
    UnusualUnitInfo,
)
from .builtins import CONSTANTS
from .names import closest, operand, unit_literal
from .resolver import Resolution

if TYPE_CHECKING:  # pragma: no cover
    from .checker import Checker, T


class Constants:
    """Values of expressions made of literals and of names defined by such expressions (memoised)."""

    def __init__(self, checker: "Checker"):
        self.checker = checker
        self.memo: dict[str, object] = {}
        self.foldable_names: dict[str, bool] = {}

    def foldable(self, node) -> bool:
        """Whether a value is made of literals only (decided without pint, so cheap to ask often)."""
        stack = [node]
        while stack:
            n = stack.pop()
            if isinstance(n, N.Number):
                continue
            if isinstance(n, N.Name):
                if n.id in CONSTANTS:
                    continue
                known = self.foldable_names.get(n.id)
                if known is None:
                    res = self.checker.res
                    stmt = res.statements.get(n.id) if res else None
                    self.foldable_names[n.id] = False  # guards against cycles
                    known = isinstance(stmt, N.Definition) and self.foldable(stmt.expr)
                    self.foldable_names[n.id] = known
                if not known:
                    return False
                continue
            if isinstance(n, (N.Paren, N.Neg, N.BinOp)):
                stack.extend(n.children())
                continue
            return False
        return True

    def of_name(self, name: str):
        if name in self.memo:
            return self.memo[name]
        self.memo[name] = None  # guards against cycles
        res = self.checker.res
        stmt = res.statements.get(name) if res else None
        value = None
        if isinstance(stmt, N.Definition) and name not in res.broken:
            value = self.of(stmt.expr)
            if value is not None and stmt.unit:
                try:
                    value = value.to(U.build_unit(stmt.unit))
                except Exception:
                    value = None
        self.memo[name] = value
        return value

    def of(self, node):
        """A pint Quantity, or None when the value is not known without evaluating."""
        if not self.foldable(node):
            return None
        try:
            return B.fold(node, self.of_name)
        except Exception:  # any rule or pint complaint means: not a plain constant
            return None


# ------------------------------------------------------------ values for their kind


def _fmt(x: float) -> str:
    if x == 0:
        return "0"
    if 1e-3 <= abs(x) < 1e6:
        return f"{x:,.4g}" if abs(x) >= 1e4 else f"{x:.4g}"
    return f"{x:.3g}"


# A unit one step of 1000 larger / smaller, for "did you mean" suggestions.
_STEP_UP = {"Pa": "kPa", "kPa": "MPa", "MPa": "GPa", "psi": "ksi", "N/mm^2": "kN/mm^2", "N/m^2": "kN/m^2",
            "g/cm^3": "kg/cm^3", "N/m^3": "kN/m^3", "g/m^3": "kg/m^3", "kg/m^3": "t/m^3", "lbf": "kip"}
_STEP_DOWN = {v: k for k, v in _STEP_UP.items()}


def _article(words: str) -> str:
    return "an" if words[:1] in "aeiou" else "a"


def value_findings(name: str, expr: N.Expr, value, span, path: str) -> list[Diagnostic]:
    """Implausible-value and unit-slip warnings for ``name = value`` (value a pint Quantity)."""
    out: list[Diagnostic] = []
    dim = U.dim_of(value)
    kind = P.kind_of(name, dim)
    if kind is None:
        return out
    slipped = P.slip(kind, value)
    if slipped is not None:
        side, m, edge = slipped
        lit = unit_literal(expr)
        unit = "mm⁴" if kind.slip == "I" else "mm³"
        table = "cm⁴ (1 cm⁴ = 10⁴ mm⁴) or in⁴ (1 in⁴ ≈ 416,000 mm⁴)" if kind.slip == "I" else \
            "cm³ (1 cm³ = 10³ mm³) or in³ (1 in³ ≈ 16,400 mm³)"
        if side == "small":
            msg = (f"{name} = {_fmt(m)} {unit} is small for a {kind.words}: it is that of a "
                   f"{_fmt(edge)} mm square bar")
            hint = f"section tables list it in {table}"
            if lit is not None:
                hint += f"; if the value came from such a table, write {lit.text} " + \
                        ("cm^4" if kind.slip == "I" else "cm^3")
        else:
            msg = (f"{name} = {_fmt(m)} {unit} is larger than any rolled or built-up member "
                   f"(a {_fmt(edge / 1000)} m square block)")
            hint = "was a value in mm⁴ written with cm^4 or m^4?" if kind.slip == "I" else \
                "was a value in mm³ written with cm^3 or m^3?"
        out.append(UnitSlipWarning(msg, span, hint=hint).diagnostic(path))
        return out
    judged = P.judge(name, value)
    if judged is None:
        return out
    kind, rng, m = judged
    where = f"the {kind.words} of {rng.material}" if rng.material else f"{_article(kind.words)} {kind.words}"
    unit = f" {rng.unit}" if rng.unit else ""
    lit = unit_literal(expr)
    shown = f"{_fmt(m)}{unit}"
    if lit is not None and lit.unit_text.replace(" ", "") != rng.unit.replace(" ", ""):
        shown = f"{lit.text} {lit.unit_text} ({shown})"
    msg = (f"{name} = {shown} is outside {_fmt(rng.low)}–{_fmt(rng.high)}{unit}, "
           f"the range for {where} ({rng.source})")
    hint = None
    for factor, steps in ((1000.0, _STEP_UP), (0.001, _STEP_DOWN)) if rng.unit else ():
        if rng.low <= m * factor <= rng.high:
            if lit is not None and lit.unit_text in steps:
                hint = f"did you mean {lit.text} {steps[lit.unit_text]}?"
            else:
                hint = f"it is {'1000 times too small' if factor > 1 else '1000 times too large'}: check its unit"
            break
    if hint is None and rng.typical:
        hint = f"a typical value is {rng.typical}"
    if hint is None:
        hint = "check the value and its unit"
    out.append(ImplausibleValueWarning(msg, span, hint=hint).diagnostic(path))
    return out


_USUAL: dict = {}  # (kind, declared unit's factors) -> whether the unit is a usual one for the kind


def definition_findings(stmt: N.Definition, t: "T", checker: "Checker", path: str) -> list[Diagnostic]:
    out: list[Diagnostic] = []
    if t.kind != "q":
        return out
    kind = P.kind_of(stmt.name, t.dim)
    if kind is None:
        return out  # a name that says nothing of its value: no unit or range to hold it to
    if stmt.unit and kind.usual_units:
        usual = _USUAL.get((kind.key, stmt.unit))
        if usual is None:  # once per kind and declared unit (the checker has read the unit)
            usual = P.is_usual_unit(kind, U.build_unit(stmt.unit))
            if len(_USUAL) < 4096:
                _USUAL[(kind.key, stmt.unit)] = usual
        if not usual:
            out.append(UnusualUnitInfo(
                f"{stmt.name} is declared [{stmt.unit_text}]; {_article(kind.words)} {kind.words} is usually given in "
                + ", ".join(kind.usual_units[:5]), stmt.unit_span or stmt.span,
                hint="the unit is valid, but a reviewer may misread it; declare a usual one unless "
                     "there is a reason").diagnostic(path))
    if kind.ranges or kind.slip:
        value = checker.consts.of_name(stmt.name)
        if value is not None:
            out.extend(value_findings(stmt.name, stmt.expr, value, stmt.expr.span or stmt.span, path))
    return out


def argument_findings(param: str, value_node: N.Expr, checker: "Checker", path: str) -> list[Diagnostic]:
    """A plugin argument given as a constant is judged by the parameter's name (E=200 MPa)."""
    if isinstance(value_node, N.Name):
        return []  # judged where it is defined
    value = checker.consts.of(value_node)
    if value is None:
        return []
    return value_findings(param, value_node, value, value_node.span, path)


# ------------------------------------------------------------ checks


def check_findings(stmt: N.Check, checker: "Checker", path: str) -> list[Diagnostic]:
    """A check whose capacity side is a constant zero or negative has no utilisation."""
    demand_node, capacity_node = (stmt.left, stmt.right) if stmt.op in ("<=", "<") else (stmt.right, stmt.left)
    out = []
    cap_m = _literal_magnitude(capacity_node)  # the everyday capacity, a literal: its sign needs no pint
    capacity = None
    if cap_m is None:
        capacity = checker.consts.of(capacity_node)
    demand = _fold_from_inputs(demand_node, checker)
    try:
        if capacity is not None:
            cap_m = float(capacity.magnitude)
        dem_m = None if demand is None else float(demand.magnitude)
    except (TypeError, ValueError):
        return out
    if cap_m is not None and cap_m <= 0:
        out.append(NoUtilisationWarning(
            f"the capacity side of this check ({_side(capacity_node)}) is {'zero' if cap_m == 0 else 'negative'}, "
            "so its utilisation (demand/capacity) cannot be formed", capacity_node.span,
            hint="write checks as demand <= capacity with a positive capacity; to require a value to be "
                 "positive write check x > 0 (its utilisation is then 0)").diagnostic(path))
    elif dem_m is not None and dem_m < 0:
        out.append(NoUtilisationWarning(
            f"the demand side of this check ({_side(demand_node)}) is negative, so its utilisation cannot be formed",
            demand_node.span, hint="compare magnitudes: check abs(x) <= limit").diagnostic(path))
    return out


def _literal_magnitude(node) -> float | None:
    """The magnitude ``builtins.fold`` gives a literal (``Quantity(value, unit)``: its own value) without
    making the quantity; None for anything else, and for a °C/°F literal (which ``fold`` does not fold). The
    literal's unit reads: the checker has typed it before any lint runs."""
    if type(node) is not N.Number:
        return None
    for name, _ in node.unit:
        if U.VOCABULARY.get(name) in U.OFFSET_UNITS:
            return None
    return float(node.value)


def _fold_from_inputs(node, checker: "Checker"):
    """The constant value of a side that reads only literals and inputs, else None.

    Used for the demand side: folding every calculated demand would evaluate the
    sheet a second time inside the static check, while a negative demand that
    matters is nearly always written from inputs. (Capacities are folded fully:
    they are few and short.)
    """
    res = checker.res
    inputs = res.input_set() if res else frozenset()
    if type(node) is N.Name:  # the everyday demand, one name: no walk
        if node.id not in CONSTANTS and node.id not in inputs:
            return None
    elif any(isinstance(n, N.Name) and n.id not in CONSTANTS and n.id not in inputs for n in N.walk(node)):
        return None
    return checker.consts.of(node)


def _side(node) -> str:
    return operand(node, "the expression")


# ------------------------------------------------------------ names


_WORDS = {"liter": "litre", "meter": "metre", "degree_Celsius": "°C"}


def unit_words(symbol: str) -> str:
    """'L' -> 'litre': what a unit symbol reads as."""
    name = U.VOCABULARY.get(symbol, symbol)
    return _WORDS.get(name, name.replace("_", " "))


def shadowing_factor(lit: N.Number, defined: dict[str, int]) -> tuple[str, str] | None:
    """The first unit name in a literal that is also a sheet variable, and how to write the product.

    ``2 L`` -> ('L', '2*L'); ``0.65 kPa*s`` -> ('s', '0.65 kPa * s') (a unit runs on through
    ``*name`` only for names of the unit vocabulary, such as s, t, L, h).
    """
    for i, (name, exp) in enumerate(lit.unit):
        if name in defined:
            if i == 0:
                return name, f"{lit.text}*{name}"
            head = lit.unit_text
            cut = max(head.rfind(op, 0, head.find(name, len(lit.unit[0][0]))) for op in "*/·")
            op = head[cut] if cut >= 0 else "*"
            return name, f"{lit.text} {head[:cut]} {op} {head[cut + 1:]}" if cut >= 0 else f"{lit.text}*{name}"
    return None


def shadow_warnings(literals: list[N.Number], defined: dict[str, int], path: str) -> list[Diagnostic]:
    out = []
    for lit in literals:
        name, fix = shadowing_factor(lit, defined)
        meaning = unit_words(name)
        s = lit.span
        span = type(s)(s.end_line, s.end_col - len(lit.unit_text), s.end_line, s.end_col)
        what = (f"{lit.text} {meaning}{'s' if lit.value != 1 else ''}" if len(lit.unit) == 1
                else f"{name} there is the unit {meaning}")
        out.append(UnitShadowsVariableWarning(
            f"'{lit.text} {lit.unit_text}' is {what}: "
            f"{name} after a number is the unit, not the variable {name} defined on line {defined[name]}",
            span, hint=f"to multiply by the variable write {fix}; to keep the unit, rename the "
                       f"variable (e.g. {name}_1) so a reader cannot confuse them").diagnostic(path))
    return out


def _misspelt_uses(res: Resolution) -> set[str]:
    """Defined names that an undefined name most likely meant (their uses are already reported)."""
    unknown = {n.id for stmt in res.statements.values() for expr in _exprs(stmt) for n in N.walk(expr)
               if isinstance(n, N.Name) and n.id not in res.defined_at and n.id not in CONSTANTS}
    meant = set()
    for name in unknown:
        hit = closest(name, res.defined_at)
        if hit:
            meant.add(hit)
    return meant


def _exprs(stmt):
    if isinstance(stmt, N.Definition):
        return [stmt.expr]
    if isinstance(stmt, N.Check):
        return [stmt.left, stmt.right]
    return []


def unused_inputs(res: Resolution, path: str, skip=frozenset()) -> list[Diagnostic]:
    """Inputs nothing reads (except those a misspelt or unit-shadowed use meant: reported there)."""
    out = []
    meant = None
    read = None
    for name in res.inputs:
        if res.dependents.get(name) or name in res.broken or name in skip:
            continue
        if read is None:  # names read anywhere, even above their definition (reported there)
            read = {n.id for stmt in res.statements.values() for expr in _exprs(stmt) for n in N.walk(expr)
                    if isinstance(n, N.Name)}
        if name in read:
            continue
        if meant is None:
            meant = _misspelt_uses(res) if any(d.code == "undefined-name" for d in res.diagnostics) else set()
        if name in meant:
            continue
        stmt = res.statements.get(name)
        if stmt is None:
            continue
        out.append(UnusedInputWarning(
            f"input '{name}' is defined but nothing uses it", stmt.name_span or stmt.span,
            hint="a misspelt name where it should be used? otherwise remove it, or use it in a check"
        ).diagnostic(path))
    return out
