"""The language's rules in one table: built-in functions, constants and operators.

For every built-in function this module says, once: how many arguments it
takes, what it requires of their dimensions and what dimension it returns
(its *rule*), how it computes on pint quantities (its *implementation*) and
how a formula printer shows it (its *print form*). Operators (``+ - * / ^``,
unary minus, comparisons) have their rules here too.

The resolver (which names exist), the static checker (rules on inferred
dimensions), the evaluator (rules on the evaluated quantities' dimensions,
then the implementation), constant folding and the printers all read this
table; nothing else lists functions. Because the checker and the evaluator
apply the *same* rule to the same dimensions, "check is clean" means
"evaluation raises no unit or arity error".

A rule receives each operand as an ``Arg`` (its dimension, and whether it is
a temperature on an offset scale), or ``None`` when the checker does not know
it (an operand already reported broken); it returns the result's ``Arg`` (or
``None``: unknown) or raises a located ``CalcError``, using the nodes for the
place and the operand names in its message.
"""
from __future__ import annotations

import math
from dataclasses import dataclass
from functools import lru_cache
from typing import Callable, NamedTuple, Sequence

import numpy as np
import pint

from . import nodes as N
from . import units as U
from .errors import (
    AngleError,
    ArityError,
    CalcError,
    DeclaredUnitError,
    DimensionError,
    DivisionByZeroError,
    NumericError,
    OffsetTemperatureError,
    OutOfRangeError,
    PluginArgumentError,
    TooComplexError,
    TypeMismatchError,
    UnknownFieldError,
)
from .names import operand
from .slips import specialise

# A quantity with units may be raised only to a power written in the sheet as plain numbers, at most this
# large: ``2 m ** (1 m/mm)`` would otherwise be m¹⁰⁰⁰, which is no physical quantity.
MAX_UNIT_POWER = 12


class Arg(NamedTuple):
    """What a rule knows of an operand: its dimension, and whether it is a °C/°F temperature."""

    dim: U.Dim
    offset: bool = False


NUMBER = Arg(U.DIMENSIONLESS)
ANGLE = Arg(U.ANGLE)


@lru_cache(maxsize=4096)
def _arg_of_unit(unit: pint.Unit) -> Arg:
    offset = any(name in U.OFFSET_UNITS for name in unit._units)
    return Arg(U.dim_of(unit), offset)


@lru_cache(maxsize=4096)
def _arg_of_units(units) -> Arg:
    return _arg_of_unit(U.registry().Unit(units))


def arg_of(q: pint.Quantity) -> Arg:
    """The ``Arg`` of an evaluated quantity (cached on its units container: ``q.units`` builds a new
    ``Unit`` on every read, which costs more than the arithmetic it guards)."""
    return _arg_of_units(q._units)


def _d(a: Arg) -> str:
    return U.describe_dim(a.dim)


# ================================================================ operators


def _offset_error(op: str, side: N.Expr) -> OffsetTemperatureError:
    what = {"+": "added to", "-": "combined with", "*": "multiplied", "/": "divided", "^": "raised to a power",
            "neg": "negated"}
    return OffsetTemperatureError(
        f"{operand(side, 'this value')} is a temperature on the °C/°F scale; it cannot be "
        f"{what[op]}" + ("" if op in ("*", "/", "^", "neg") else " another value"), side.span,
        hint="only a difference of two such temperatures is a quantity (T_2 - T_1 gives K); "
             "use that difference, or write the temperature in K")


def rule_add(op: str, a: Arg | None, b: Arg | None, node: N.BinOp) -> Arg | None:
    """``a + b``, ``a - b``: the same dimension; two °C/°F temperatures only subtract (to a difference)."""
    if (a is not None and a.offset) or (b is not None and b.offset):
        if op == "-" and a is not None and b is not None and a.offset and b.offset:
            return Arg(a.dim)
        raise _offset_error(op, node.left if a is not None and a.offset else node.right)
    if a is None or b is None:
        return a if b is None else b
    if a.dim != b.dim:
        word = "add" if op == "+" else "subtract"
        exc = DimensionError(
            f"cannot {word} {_d(b)} {'to' if op == '+' else 'from'} {_d(a)}", node.span,
            hint=f"left: {operand(node.left)} is {_d(a)}; right: {operand(node.right)} is {_d(b)}")
        if not specialise(exc, a.dim, b.dim, operand(node.right, "the right operand")):
            specialise(exc, b.dim, a.dim, operand(node.left, "the left operand"))
        raise exc
    return a


def rule_mul(op: str, a: Arg | None, b: Arg | None, node: N.BinOp) -> Arg | None:
    """``a * b``, ``a / b``: any dimensions, multiplied or divided; never a °C/°F temperature."""
    if (a is not None and a.offset) or (b is not None and b.offset):
        raise _offset_error(op, node.left if a is not None and a.offset else node.right)
    if a is None or b is None:
        return None
    return Arg(U.dim_mul(a.dim, b.dim, 1 if op == "*" else -1))


def rule_pow(a: Arg | None, b: Arg | None, node: N.BinOp, p: float | None) -> Arg | None:
    """``a ^ b``: the exponent is a plain number; a base with units takes only a power written in the
    sheet as plain numbers (``p``, folded by ``written_power``; None when it is not), at most
    ``MAX_UNIT_POWER`` in size."""
    if (a is not None and a.offset) or (b is not None and b.offset):
        raise _offset_error("^", node.left if a is not None and a.offset else node.right)
    if b is not None and b.dim != U.DIMENSIONLESS:
        raise DimensionError(f"an exponent must be a plain number, not {_d(b)}", node.right.span,
                             hint=f"{operand(node.right)} is {_d(b)}")
    if a is None:
        return None
    if a.dim == U.DIMENSIONLESS:
        return NUMBER
    if p is None:
        raise DimensionError("a quantity with units may only be raised to a number written in the sheet",
                             node.right.span, hint="write e.g. L^2 or L^0.5")
    if abs(p) > MAX_UNIT_POWER:
        raise DimensionError(f"a quantity with units raised to the power {p:g} is not a physical quantity",
                             node.right.span, hint=f"{operand(node.left)} is {_d(a)}; powers of a quantity "
                                                   f"with units go up to {MAX_UNIT_POWER}")
    return Arg(U.dim_pow(a.dim, p))


def rule_neg(a: Arg | None, node: N.Neg) -> Arg | None:
    """``-a``: any quantity, same dimension."""
    return a


def rule_compare(a: Arg | None, b: Arg | None, node, left: N.Expr, right: N.Expr, where: str = "a check") -> None:
    """``a <= b`` (a check, or the condition of ``if``): both sides of the same dimension."""
    if a is None or b is None or a.dim == b.dim:
        return
    exc = DimensionError(
        f"cannot compare {_d(a)} with {_d(b)}", node.span,
        hint=f"left: {operand(left)} is {_d(a)}; right: {operand(right)} is {_d(b)}; "
             f"both sides of {where} must have the same dimension")
    if not specialise(exc, b.dim, a.dim, operand(left, "the left side")):
        specialise(exc, a.dim, b.dim, operand(right, "the right side"))
    raise exc


def rule_declared(got: Arg | None, want: Arg, stmt: N.Definition, mismatch: Callable[[], Exception]) -> Arg | None:
    """``name [unit] = expr``: the expression's dimension is the unit's (an angle and a plain number
    agree: radians are plain numbers); the value takes the unit's dimension, except under ``[]`` where it
    keeps its own. A unit on the °C/°F scale takes only a temperature on such a scale (a difference of
    two is not one). ``mismatch`` makes the error for a dimension that differs (each walker says why)."""
    if got is None:
        return want if stmt.unit else None
    if U.without_angle(got.dim) != U.without_angle(want.dim):
        raise mismatch()
    if want.offset and not got.offset:
        raise OffsetTemperatureError(
            f"{stmt.name} is declared [{stmt.unit_text}], a temperature on the °C/°F scale, but the expression "
            "is a temperature difference or in K", stmt.unit_span or stmt.span,
            hint="declare a difference in K (or delta units), or write the temperature itself in °C/°F")
    return want if stmt.unit else got


def unit_arg(unit: pint.Unit) -> Arg:
    """The ``Arg`` of a declared unit."""
    return _arg_of_unit(unit)


def _pow_impl(a, b, node: N.BinOp, p: float):
    if arg_of(a).dim == U.DIMENSIONLESS:
        if is_list(a):  # elementwise, one numpy operation
            base = a.m_as(_unit(""))
            if not p.is_integer() and np.any(base < 0):
                raise NumericError("a negative number to a fractional power is not real", node.span)
            if p < 0 and np.any(base == 0):
                raise DivisionByZeroError("zero to a negative power", node.span)
            with np.errstate(over="ignore"):
                return _q(base**p)
        base = float(a.m_as(_unit("")))
        if base < 0 and not p.is_integer():
            raise NumericError("a negative number to a fractional power is not real", node.span)
        if base == 0 and p < 0:
            raise DivisionByZeroError("zero to a negative power", node.span)
        try:
            return _q(base**p)
        except OverflowError:
            raise NumericError("the power overflows", node.span) from None
    m = a._magnitude
    scalar = type(m) is float
    if not p.is_integer() and ((m < 0) if scalar else np.any(m < 0)):
        raise NumericError("a negative quantity to a fractional power is not real", node.span)
    if p < 0 and ((m == 0) if scalar else np.any(m == 0)):
        raise DivisionByZeroError("zero to a negative power", node.span)
    try:
        return a**p
    except OverflowError:  # a float power beyond ±1.8e308 raises (an array's gives inf, refused after)
        raise NumericError("the power overflows", node.span) from None


def _div_impl(a, b, node: N.BinOp):
    m = b._magnitude
    if (m == 0) if type(m) is float else np.any(m == 0):
        raise DivisionByZeroError("division by zero", node.right.span, hint="the divisor evaluates to zero")
    return a / b


@dataclass(frozen=True)
class Operator:
    """A binary operator: its rule on dimensions, its implementation on quantities, its printed symbol."""

    symbol: str
    rule: Callable  # (op, a, b, node[, p]) -> Arg | None
    impl: Callable  # (a, b, node[, p]) -> Quantity
    printed: str
    doc: str


OPERATORS: dict[str, Operator] = {
    "+": Operator("+", rule_add, lambda a, b, node: a + b, "+", "sum of two values of one dimension"),
    "-": Operator("-", rule_add, lambda a, b, node: a - b, "−", "difference of two values of one dimension"),
    "*": Operator("*", rule_mul, lambda a, b, node: a * b, "·", "product; dimensions multiply"),
    "/": Operator("/", rule_mul, _div_impl, "/", "quotient; dimensions divide"),
    "^": Operator("^", rule_pow, _pow_impl, "^", "power; see rule_pow"),
}

COMPARISONS: dict[str, Callable[[float, float], bool]] = {
    "<=": lambda a, b: a <= b, "<": lambda a, b: a < b, ">=": lambda a, b: a >= b, ">": lambda a, b: a > b,
}


@lru_cache(maxsize=2048)
def written_power(node: N.Expr) -> float | None:
    """The value of an exponent written with plain number literals only (``2``, ``(1/3)``, ``-0.5``), else None.

    The checker and the evaluator both ask this of a power's exponent; it folds with the operators'
    own implementations (``fold``)."""
    if not _literal_only(node):
        return None
    try:
        v = fold(node)
    except Exception:  # a division by zero, an overflow: not a written power
        return None
    return None if v is None else float(v.m_as(_unit("")))


def _literal_only(node: N.Expr) -> bool:
    for n in N.walk(node):
        if isinstance(n, N.Number):
            if n.unit:
                return False
        elif not isinstance(n, (N.Paren, N.Neg, N.BinOp)):
            return False
    return True


def fold(node: N.Expr, name_value: Callable[[str], pint.Quantity | None] | None = None):
    """The one constant folder: the value of an expression of literals, constants and (through
    ``name_value``) names with known values, computed with the operators' rules and implementations;
    None when any part is not known without evaluating. Errors of the rules propagate."""
    reg = U.registry()
    if isinstance(node, N.Number):
        if any(U.VOCABULARY.get(n) in U.OFFSET_UNITS for n, _ in node.unit):
            return None
        return reg.Quantity(node.value, U.build_unit(node.unit) if node.unit else _unit(""))
    if isinstance(node, N.Paren):
        return fold(node.inner, name_value)
    if isinstance(node, N.Neg):
        v = fold(node.operand, name_value)
        return None if v is None else -v
    if isinstance(node, N.Name):
        if node.id in CONSTANTS:
            return CONSTANTS[node.id].quantity()
        return name_value(node.id) if name_value is not None else None
    if isinstance(node, N.BinOp):
        a = fold(node.left, name_value)
        if a is None:
            return None
        b = fold(node.right, name_value)
        if b is None:
            return None
        return apply_binop(node, a, b)
    return None


def scale_binop(node: N.BinOp, q: pint.Quantity, x: float, literal_right: bool):
    """``q * x``, ``q / x``, ``x * q`` or ``x / q`` where ``x`` is a plain-number literal of the sheet (the
    right operand when ``literal_right``): the operator's rule with a dimensionless operand, then the
    arithmetic with the float itself, which gives what multiplying by a dimensionless quantity gives."""
    op = node.op
    m = q._magnitude
    if type(m) is float and type(x) is float:
        ua = q._units
        entry = _FAST.get(("scale", op, literal_right, id(ua)))
        if entry is None:
            entry = _learn_scale(node, q, literal_right)
        units = entry[1]
        if units is not None:  # what pint computes for these units, from the float magnitudes
            if op == "*":
                return U.quantity(m * x, units)
            if literal_right:
                if x == 0:
                    raise DivisionByZeroError("division by zero", node.right.span,
                                              hint="the divisor evaluates to zero")
                return U.quantity(m / x, units)
            if m == 0:
                raise DivisionByZeroError("division by zero", node.right.span, hint="the divisor evaluates to zero")
            return U.quantity(x / m, units)
    elif literal_right:
        OPERATORS[op].rule(op, arg_of(q), NUMBER, node)
    else:
        OPERATORS[op].rule(op, NUMBER, arg_of(q), node)
    if literal_right:
        if op == "*":
            return q * x
        if x == 0:
            raise DivisionByZeroError("division by zero", node.right.span, hint="the divisor evaluates to zero")
        return q / x
    if op == "*":
        return x * q
    return _div_impl(x, q, node)


def power_binop(node: N.BinOp, a: pint.Quantity, p: float):
    """``a ^ p`` where ``p`` is a plain-number literal of the sheet: what ``apply_binop`` does with the
    literal as a dimensionless quantity (its written power is its value), without making one."""
    p = float(p)
    m = a._magnitude
    if type(m) is float:
        entry = _FAST.get(("power", p, id(a._units)))
        if entry is None:
            entry = _learn_power(node, a, p)
        units = entry[1]
        if units is not None:  # the checks and the arithmetic of _pow_impl and pint's power, on the float
            if p == 1:
                return a  # pint gives the quantity itself
            if m < 0 and not p.is_integer():
                raise NumericError("a negative quantity to a fractional power is not real", node.span)
            if m == 0 and p < 0:
                raise DivisionByZeroError("zero to a negative power", node.span)
            try:
                return U.quantity(m**p, units)
            except OverflowError:
                raise NumericError("the power overflows", node.span) from None
    else:
        rule_pow(arg_of(a), NUMBER, node, p if arg_of(a).dim != U.DIMENSIONLESS else None)
    return _pow_impl(a, None, node, p)


def apply_binop(node: N.BinOp, a: pint.Quantity, b: pint.Quantity):
    """Rule, then implementation, of one binary operator on two quantities (the evaluator and the folder)."""
    op = OPERATORS[node.op]
    if node.op != "^":
        ma, mb = a._magnitude, b._magnitude
        if type(ma) is float and type(mb) is float:
            entry = _FAST.get((node.op, id(a._units), id(b._units)))
            if entry is None:
                entry = _learn_binop(node, a, b)
            how = entry[2]
            if how is None:
                return op.impl(a, b, node)  # the rule passed for these units; pint computes
            if node.op == "*":
                return U.quantity(ma * mb, how)
            if node.op == "/":
                if mb == 0:
                    raise DivisionByZeroError("division by zero", node.right.span,
                                              hint="the divisor evaluates to zero")
                return U.quantity(ma / mb, how)
            units, f = how  # + and −: the right operand in the left one's units, as pint converts it
            if f is not None:
                mb = mb * f
            return U.quantity(ma + mb if node.op == "+" else ma - mb, units)
    if node.op == "^":
        p = written_power(node.right) if arg_of(a).dim != U.DIMENSIONLESS else None
        rule_pow(arg_of(a), arg_of(b), node, p)
        rule_scalar(is_list(b), node.right, "an exponent")
        return _pow_impl(a, b, node, float(b.m_as(_unit(""))))
    op.rule(node.op, arg_of(a), arg_of(b), node)
    if is_list(a) and is_list(b):
        rule_lengths([len(a.magnitude), len(b.magnitude)], [node.left, node.right], node)
    return op.impl(a, b, node)


# An operator's rule depends only on its operands' units, so once it has passed for a pair of units
# containers it is remembered as passed for that pair (a rule that fails is never remembered: it raises its
# located error every time). For two float magnitudes of multiplicative units the entry also says what pint
# computes: the result's units container, and for + and − the factor pint converts the right operand by;
# arithmetic is then done on the floats. Keyed by the containers' identity (each entry holds them, so an id
# is never reused while its entry lives); what pint would do differently (°C/°F, delta and logarithmic
# units) keeps pint's own path.
_FAST: dict = {}
_FAST_KEEP = 4096


def _remember(key, entry):
    return U.remember(_FAST, key, entry, _FAST_KEEP)


def _learn_binop(node: N.BinOp, a: pint.Quantity, b: pint.Quantity):
    op = node.op
    OPERATORS[op].rule(op, arg_of(a), arg_of(b), node)
    ua, ub = a._units, b._units
    how = None
    if U.multiplicative(ua) and U.multiplicative(ub):
        if op in ("*", "/"):
            how = U.units_op(op, ua, ub)
        elif ua == ub:  # pint adds the magnitudes as they are
            how = (ua, None)
        else:
            f = U.factor(ub, ua)
            how = None if f is None else (ua, f)
    return _remember((op, id(ua), id(ub)), (ua, ub, how))


def _learn_scale(node: N.BinOp, q: pint.Quantity, literal_right: bool):
    op, ua = node.op, q._units
    if literal_right:
        OPERATORS[op].rule(op, arg_of(q), NUMBER, node)
    else:
        OPERATORS[op].rule(op, NUMBER, arg_of(q), node)
    units = None
    if U.multiplicative(ua):
        # q * x, x * q and q / x keep q's units (pint: q's units times no units); x / q has their reciprocal
        units = U.units_op("inv", ua, None) if op == "/" and not literal_right else ua
    return _remember(("scale", op, literal_right, id(ua)), (ua, units))


def _learn_power(node: N.BinOp, a: pint.Quantity, p: float):
    ua = a._units
    dimensionless = arg_of(a).dim == U.DIMENSIONLESS
    rule_pow(arg_of(a), NUMBER, node, None if dimensionless else p)
    units = None
    if not dimensionless and p != 0 and U.multiplicative(ua):  # a plain number is converted first: pint's path
        units = U.units_op("^", ua, p)
    return _remember(("power", p, id(ua)), (ua, units))


# ================================================================ functions


def _no_offset(name: str, args: Sequence[Arg | None], nodes: Sequence[N.Expr]) -> None:
    for a, arg in zip(args, nodes):
        if a is not None and a.offset:
            raise OffsetTemperatureError(f"{name}() of a temperature on the °C/°F scale", arg.span,
                                         hint="use a temperature difference (T_2 - T_1), or the value in K")


def _same_dims(name: str, args, nodes) -> Arg | None:
    x = args[0]
    for a, arg in zip(args[1:], nodes[1:]):
        if x is not None and a is not None and a.dim != x.dim:
            raise DimensionError(f"{name}() of {_d(x)} and {_d(a)}", arg.span,
                                 hint=f"{operand(nodes[0])} is {_d(x)}, {operand(arg)} is {_d(a)}; every value "
                                      "compared must have the same dimension")
    return x if x is not None else next((a for a in args if a is not None), None)


def _rule_same(name):
    """abs, min, max: values of one dimension (°C/°F temperatures allowed, all on such a scale or none);
    the result has it."""
    def rule(args, nodes, node):
        known = [(a, n) for a, n in zip(args, nodes) if a is not None]
        if len({a.offset for a, _ in known}) > 1:
            arg = next(n for a, n in known if a.offset != known[0][0].offset)
            raise OffsetTemperatureError(
                f"{name}() of a temperature on the °C/°F scale and one that is not", arg.span,
                hint="write every value on one scale: all in °C (or °F), or all in K")
        return _same_dims(name, args, nodes)
    return rule


def _rule_sum(args, nodes, node):
    """sum(list): the elements' dimension (not °C/°F: a sum of temperatures on such a scale means nothing)."""
    _no_offset("sum", args, nodes)
    return args[0]


def _rule_position(name):
    """argmax, argmin, count: any list in, a plain number (a position, a count) out."""
    def rule(args, nodes, node):
        return NUMBER
    return rule


def _rule_sqrt(args, nodes, node):
    _no_offset("sqrt", args, nodes)
    return None if args[0] is None else Arg(U.dim_pow(args[0].dim, 0.5))


def _rule_trig(name):
    """sin, cos, tan: an angle in, a plain number out."""
    def rule(args, nodes, node):
        _no_offset(name, args, nodes)
        x, arg = args[0], nodes[0]
        if x is not None and x.dim != U.ANGLE:
            if x.dim == U.DIMENSIONLESS:
                shown = operand(arg, "")
                hint = (f"{shown} is a bare number; write the angle with its unit, e.g. {shown} deg or "
                        f"{shown} rad" if isinstance(arg, N.Number) else
                        f"{shown or 'the argument'} is a bare number; give it a unit where it is defined "
                        "(deg or rad)")
            else:
                hint = f"{operand(arg)} is {_d(x)}; a trigonometric function takes an angle"
            raise AngleError(f"{name}() needs an angle, got {_d(x)}", arg.span, hint=hint)
        return NUMBER
    return rule


def _rule_inverse_trig(name):
    """asin, acos, atan: a plain number (a ratio) in, an angle out."""
    def rule(args, nodes, node):
        _no_offset(name, args, nodes)
        x = args[0]
        if x is not None and x.dim != U.DIMENSIONLESS:
            raise DimensionError(f"{name}() needs a plain number (a ratio), got {_d(x)}", nodes[0].span,
                                 hint="divide two values of the same dimension first")
        return ANGLE
    return rule


def _rule_atan2(args, nodes, node):
    """atan2(y, x): two values of one dimension in, an angle out."""
    _no_offset("atan2", args, nodes)
    y, x = args
    if y is not None and x is not None and y.dim != x.dim:
        raise DimensionError("atan2() needs two values of the same dimension", node.span,
                             hint=f"{operand(nodes[0])} is {_d(y)}, {operand(nodes[1])} is {_d(x)}")
    return ANGLE


def _rule_plain(name):
    """exp, ln, log10, ceil, floor: a plain number in, a plain number out."""
    def rule(args, nodes, node):
        _no_offset(name, args, nodes)
        x = args[0]
        if x is not None and x.dim != U.DIMENSIONLESS:
            raise DimensionError(f"{name}() needs a plain number, got {_d(x)}", nodes[0].span,
                                 hint="divide by a reference value of the same unit first")
        return NUMBER
    return rule


def rule_if(x, y, node: N.Call):
    """if(cond, value, otherwise): both outcomes of one kind and dimension.

    ``x``, ``y``: an ``Arg`` for a quantity, a word for another kind ('text', 'section.tee record'), or
    None when unknown."""
    if x is None or y is None:
        return x if y is None else y
    if isinstance(x, Arg) and isinstance(y, Arg):
        if x.dim == y.dim and x.offset != y.offset:
            raise OffsetTemperatureError(
                "one value of if() is a temperature on the °C/°F scale, the other is not", node.span,
                hint="give both outcomes on one scale: both in °C (or °F), or both in K")
        if x.dim == y.dim:
            return x
        xd, yd = _d(x), _d(y)
    elif x == y:
        return x
    else:
        xd = _d(x) if isinstance(x, Arg) else x
        yd = _d(y) if isinstance(y, Arg) else y
    raise DimensionError(f"the two values of if() differ: {xd} and {yd}", node.span,
                         hint="both outcomes must have the same dimension")


# ---- implementations (arguments already passed their rule)


def _plain(x):
    """A plain number's value: a float, or an array of them for a list (the caller keeps it elementwise)."""
    m = x.m_as(_unit(""))
    return m if isinstance(m, np.ndarray) else float(m)


def _vec(scalar, array):
    """One function on a float (math: exact errors), or on an array (numpy: one vectorised call)."""
    return lambda v: array(v) if isinstance(v, np.ndarray) else scalar(v)


@lru_cache(maxsize=None)
def _unit(name: str) -> pint.Unit:
    return U.registry().Unit(name)


def _q(value: float, unit: str = ""):
    """A result quantity (units from a cached ``Unit``: a unit string costs pint a parse each time)."""
    return U.registry().Quantity(value, _unit(unit))


def _impl_sqrt(args, node):
    x = args[0]
    if np.any(x.magnitude < 0):
        raise NumericError("square root of a negative value", node.args[0].span)
    return x**0.5


def _impl_minmax(pick, reduce, pairwise):
    """min/max: of one list, its least/greatest element; of several values, the least/greatest (element by
    element where some are lists)."""
    def impl(args, node):
        x = args[0]
        if len(args) == 1:
            return _Q(reduce(x.magnitude), x.units) if is_list(x) else x
        if any(is_list(a) for a in args):
            mags = [a.to(x.units).magnitude for a in args]
            rule_lengths([len(m) if isinstance(m, np.ndarray) else None for m in mags], node.args, node)
            return _Q(pairwise.reduce(np.broadcast_arrays(*mags)), x.units)
        return pick(args, key=lambda q: q.to(x.units).magnitude)
    return impl


def _impl_sum(args, node):
    x = args[0]
    return _Q(float(np.sum(x.magnitude)), x.units) if is_list(x) else x


def _impl_argpick(f):
    def impl(args, node):  # the element's position counts from 1, as the package numbers them
        x = args[0]
        return _q(float(f(x.magnitude)) + 1.0 if is_list(x) else 1.0)
    return impl


def _impl_count(args, node):
    x = args[0]
    return _q(float(len(x.magnitude)) if is_list(x) else 1.0)


def _Q(magnitude, unit):
    """A quantity in ``unit`` (also a °C/°F unit, which multiplication would refuse)."""
    return U.registry().Quantity(magnitude, unit)


def _impl_trig(f):
    def impl(args, node):
        m = args[0].m_as(_unit("radian"))
        return _q(f(m) if isinstance(m, np.ndarray) else float(f(m)))
    return impl


def _impl_inverse_trig(name, f):
    def impl(args, node):
        v = _plain(args[0])
        if name != "atan" and np.any(np.abs(v) > 1):
            bad = float(v[np.argmax(np.abs(v))]) if isinstance(v, np.ndarray) else v
            raise NumericError(f"{name}() of {bad:g} is outside -1…1", node.args[0].span)
        return _q(np.degrees(f(v)) if isinstance(v, np.ndarray) else math.degrees(f(v)), "degree")
    return impl


def _impl_atan2(args, node):
    y, x = args
    ym, xm = y.magnitude, x.to(y.units).magnitude
    if isinstance(ym, np.ndarray) or isinstance(xm, np.ndarray):
        rule_lengths([len(m) if isinstance(m, np.ndarray) else None for m in (ym, xm)], node.args, node)
        return _q(np.degrees(np.arctan2(ym, xm)), "degree")
    return _q(math.degrees(math.atan2(ym, xm)), "degree")


def _impl_transcendental(name, f):
    def impl(args, node):
        v = _plain(args[0])
        if name != "exp" and np.any(v <= 0):
            raise NumericError(f"{name}() of a value that is not positive", node.args[0].span)
        try:
            with np.errstate(over="ignore"):  # an overflow is infinite, refused by the finiteness rule
                return _q(f(v))
        except OverflowError:
            raise NumericError(f"{name}() overflows", node.span) from None
    return impl


def _impl_round(f):
    def impl(args, node):
        v = _plain(args[0])
        return _q(f(v) if isinstance(v, np.ndarray) else float(f(v)))
    return impl


@dataclass(frozen=True)
class Function:
    """A built-in function: the one place its arity, rule, implementation and print form are written.

    ``print_form`` names the printers' markup hook: 'call' (``f(x)``), 'sqrt' (a radical), 'abs' (bars),
    'cases' (a brace of two outcomes). ``lazy`` functions (``if``) get their arguments unevaluated: their
    walkers handle them, with ``rule_if``.
    """

    name: str
    min_args: int
    max_args: int | None
    rule: Callable | None  # (args: list[Arg | None], nodes, call node) -> Arg | None
    impl: Callable | None  # (args: list[Quantity], call node) -> Quantity
    doc: str
    print_form: str = "call"
    lazy: bool = False
    shape: str = "elementwise"  # of lists: 'elementwise', 'reduce' (a list in, one value out), 'min-max'

    def arity_text(self) -> str:
        if self.min_args == self.max_args:
            return f"{self.min_args} argument" + ("" if self.min_args == 1 else "s")
        if self.max_args is None:
            return f"at least {self.min_args} argument" + ("" if self.min_args == 1 else "s")
        return f"{self.min_args} to {self.max_args} arguments"


def _fn(name, n, rule, impl, doc, **kw):
    lo, hi = (n, n) if isinstance(n, int) else n
    return Function(name, lo, hi, rule, impl, doc, **kw)


FUNCTIONS: dict[str, Function] = {f.name: f for f in [
    _fn("sqrt", 1, _rule_sqrt, _impl_sqrt, "square root; the dimension's exponents halve", print_form="sqrt"),
    _fn("abs", 1, _rule_same("abs"), lambda args, node: abs(args[0]), "magnitude", print_form="abs"),
    _fn("min", (1, None), _rule_same("min"), _impl_minmax(min, np.min, np.minimum),
        "least of values of one dimension; of one list, its least element", shape="min-max"),
    _fn("max", (1, None), _rule_same("max"), _impl_minmax(max, np.max, np.maximum),
        "greatest of values of one dimension; of one list, its greatest element", shape="min-max"),
    _fn("sum", 1, _rule_sum, _impl_sum, "sum of the elements of a list", shape="reduce"),
    _fn("argmax", 1, _rule_position("argmax"), _impl_argpick(np.argmax),
        "position (from 1) of a list's greatest element", shape="reduce"),
    _fn("argmin", 1, _rule_position("argmin"), _impl_argpick(np.argmin),
        "position (from 1) of a list's least element", shape="reduce"),
    _fn("count", 1, _rule_position("count"), _impl_count, "number of elements of a list", shape="reduce"),
    _fn("sin", 1, _rule_trig("sin"), _impl_trig(_vec(math.sin, np.sin)), "sine of an angle"),
    _fn("cos", 1, _rule_trig("cos"), _impl_trig(_vec(math.cos, np.cos)), "cosine of an angle"),
    _fn("tan", 1, _rule_trig("tan"), _impl_trig(_vec(math.tan, np.tan)), "tangent of an angle"),
    _fn("asin", 1, _rule_inverse_trig("asin"), _impl_inverse_trig("asin", _vec(math.asin, np.arcsin)),
        "angle of a sine"),
    _fn("acos", 1, _rule_inverse_trig("acos"), _impl_inverse_trig("acos", _vec(math.acos, np.arccos)),
        "angle of a cosine"),
    _fn("atan", 1, _rule_inverse_trig("atan"), _impl_inverse_trig("atan", _vec(math.atan, np.arctan)),
        "angle of a tangent"),
    _fn("atan2", 2, _rule_atan2, _impl_atan2, "angle of the point (x, y): atan2(y, x)"),
    _fn("exp", 1, _rule_plain("exp"), _impl_transcendental("exp", _vec(math.exp, np.exp)), "e to a plain number"),
    _fn("ln", 1, _rule_plain("ln"), _impl_transcendental("ln", _vec(math.log, np.log)), "natural logarithm"),
    _fn("log10", 1, _rule_plain("log10"), _impl_transcendental("log10", _vec(math.log10, np.log10)),
        "common logarithm"),
    _fn("ceil", 1, _rule_plain("ceil"), _impl_round(_vec(math.ceil, np.ceil)), "round a plain number up"),
    _fn("floor", 1, _rule_plain("floor"), _impl_round(_vec(math.floor, np.floor)), "round a plain number down"),
    _fn("if", 3, None, None, "if(a <= b, value, otherwise): one of two values of one dimension",
        print_form="cases", lazy=True),
]}


@dataclass(frozen=True)
class Constant:
    """A built-in constant name: its value and unit."""

    name: str
    value: float
    unit: str
    doc: str

    @property
    def arg(self) -> Arg:
        return Arg(U.dim_of(U.registry().Unit(self.unit)))

    def quantity(self):
        return _q(self.value, self.unit)


CONSTANTS: dict[str, Constant] = {
    "pi": Constant("pi", math.pi, "", "the ratio of a circle's circumference to its diameter"),
}

def is_builtin(name: str) -> bool:
    """A name the table gives a meaning (a sheet may not define it)."""
    return name in FUNCTIONS or name in CONSTANTS


def check_call_shape(fn: Function, node: N.Call) -> None:
    """No named arguments, and the number of arguments the function takes (both walkers, before anything)."""
    if node.kwargs:
        raise TypeMismatchError(f"{fn.name}() takes no named arguments", node.kwargs[0].span)
    n = len(node.args)
    if n < fn.min_args or (fn.max_args is not None and n > fn.max_args):
        if fn.name == "if":
            raise ArityError(f"if() takes 3 arguments (condition, value, otherwise), got {n}", node.span)
        raise ArityError(f"{fn.name}() takes {fn.arity_text()}, got {n}", node.span)


def print_form(node: N.Call) -> str:
    """The markup hook a printer uses for this call ('call' when the arity is not the function's own)."""
    fn = FUNCTIONS.get(node.func)
    if fn is None or len(node.args) < fn.min_args or (fn.max_args is not None and len(node.args) > fn.max_args):
        return "call"
    return fn.print_form


# ------------------------------------------------------------ the sheet's own functions
# ``M_ss(w [kN/m], L [m]) [kN*m] = w*L^2/8``: the checker (on inferred dimensions) and the evaluator (on
# evaluated ones) apply these same rules at every call, as they do the built-ins' rules above.


def declared_arg(decl) -> Arg | None:
    """The ``Arg`` a parameter or function result is declared with (None: not declared)."""
    if decl.unit is None:
        return None
    return unit_arg(U.build_unit(decl.unit)) if decl.unit else NUMBER


# Sheet functions calling sheet functions multiply: a statement may expand this many calls in all (a
# sheet is untrusted text; f calling g twice, g calling h twice … must not run for hours).
MAX_FUNCTION_CALLS = 10_000


def count_user_call(walker, node: N.Call) -> None:
    """One more call of a sheet function in the statement ``walker`` is on (each walker resets its count)."""
    walker.user_calls = getattr(walker, "user_calls", 0) + 1
    if walker.user_calls > MAX_FUNCTION_CALLS:
        raise TooComplexError(f"this statement calls the sheet's functions more than {MAX_FUNCTION_CALLS} times "
                              "(functions calling functions)", node.span,
                              hint="compute the inner results once, as named values")


def check_user_call_shape(fd: N.FunctionDef, node: N.Call) -> None:
    """Arguments in order, as many as the function has parameters."""
    if node.kwargs:
        raise TypeMismatchError(f"{fd.name} takes its arguments in order, without names", node.kwargs[0].span)
    if len(node.args) != len(fd.params):
        want = ", ".join(fd.param_names)
        raise ArityError(f"{fd.name}({want}) takes {len(fd.params)} argument{'s' * (len(fd.params) != 1)}, "
                         f"got {len(node.args)}", node.span)


def rule_user_param(fd: N.FunctionDef, param: N.Param, got: Arg | None, arg_node: N.Expr) -> Arg | None:
    """An argument for a parameter declared ``[unit]`` has that unit's dimension (the declared-unit rule)."""
    want = declared_arg(param)
    if want is None:
        return got

    def mismatch():
        return DeclaredUnitError(
            f"{fd.name}: parameter '{param.name}' is [{param.unit_text}] ({U.describe_dim(want.dim)}) but the "
            f"argument is {U.describe_dim(got.dim)}", arg_node.span,
            hint=f"{operand(arg_node, 'the argument')} is {U.describe_dim(got.dim)}")

    return rule_declared(got, want, param, mismatch)


def rule_user_result(fd: N.FunctionDef, got: Arg | None, node: N.Call) -> Arg | None:
    """The body's dimension for this call is the declared result's, if one is declared."""
    want = declared_arg(fd)
    if want is None:
        return got

    def mismatch():
        return DeclaredUnitError(
            f"{fd.name} is declared [{fd.unit_text}] ({U.describe_dim(want.dim)}) but for this call its body "
            f"gives {U.describe_dim(got.dim)}", node.span,
            hint=f"the definition is on {fd.span.where()}" if fd.span else None)

    return rule_declared(got, want, fd, mismatch)


def at_call(exc: CalcError, fd: N.FunctionDef, node: N.Call) -> CalcError:
    """An error inside a function's body, for one call: reported at the call, naming the function."""
    if fd.span is not None and exc.span is not None and not (
            exc.span.line >= fd.span.line and exc.span.end_line <= fd.span.end_line
            and exc.span.path == fd.span.path):
        return exc  # already located outside the body
    where = f" (defined on {fd.span.where()})" if fd.span else ""
    exc.message = f"in this call of {fd.name}{where}: {exc.message}"
    exc.args = (exc.message,)
    exc.span = node.span
    return exc


# ------------------------------------------------------------ lists
# ``L = [3.6 m, 4.2 m, 4.8 m]`` is one quantity over a numpy array: every operator and elementwise built-in
# computes on the whole array at once. What a list may be is decided here, for both walkers: the checker
# knows whether an operand is a list (its type's ``many``), the evaluator sees it (``is_list``).

MAX_LIST_ITEMS = 1_000_000


def is_list(q) -> bool:
    """A quantity holding a list (an array of magnitudes)."""
    return isinstance(getattr(q, "_magnitude", None), np.ndarray)


def rule_scalar(many: bool, node: N.Expr, what: str) -> None:
    """Where one value belongs (an exponent, a condition, a lookup key, a plugin's quantity), not a list."""
    if many:
        raise TypeMismatchError(f"{what} must be one value, not a list", node.span,
                                hint=f"pick one element first: max({operand(node, 'the list')}), "
                                     f"min(…) or sum(…)")


def rule_lengths(lengths: Sequence[int | None], nodes: Sequence[N.Expr], node: N.Expr) -> None:
    """Lists combined element by element have one length (a single value goes with every element)."""
    known = [(n, x) for n, x in zip(lengths, nodes) if n is not None]
    for n, x in known[1:]:
        if n != known[0][0]:
            raise TypeMismatchError(f"lists of different lengths: {known[0][0]} and {n} elements", node.span,
                                    hint=f"{operand(known[0][1], 'the first')} has {known[0][0]}, "
                                         f"{operand(x, 'the other')} has {n}; element-by-element arithmetic "
                                         "pairs the elements in order")


def shape_of_call(fn: Function, many: Sequence[bool]) -> bool:
    """Whether a built-in's result is a list, from whether its arguments are."""
    if fn.shape == "reduce" or (fn.shape == "min-max" and len(many) == 1):
        return False
    return any(many)


def rule_list_items(args: Sequence[Arg | None], many: Sequence[bool], node: N.ListExpr) -> Arg | None:
    """``[a, b, c]``: single values (no list inside a list) of the first element's dimension, all on a °C/°F
    scale or none. The list takes the first element's dimension (and unit)."""
    for m, item in zip(many, node.items):
        rule_scalar(m, item, "an element of a list")
    if len(node.items) > MAX_LIST_ITEMS:
        raise TooComplexError(f"a list of more than {MAX_LIST_ITEMS:,} elements", node.span)
    first = next(((i, a) for i, a in enumerate(args) if a is not None), None)
    if first is None:
        return None
    k, x = first
    for i, (a, item) in enumerate(zip(args, node.items)):
        if a is None or i == k:
            continue
        if a.dim != x.dim:
            exc = DimensionError(
                f"element {i + 1} of the list is {_d(a)}, but element {k + 1} is {_d(x)}", item.span,
                hint=f"{operand(item, 'this element')} is {_d(a)}; every element of a list has one dimension "
                     "(units may differ: they are converted to the first element's)")
            specialise(exc, x.dim, a.dim, operand(item, "this element"))
            raise exc
        if a.offset != x.offset:
            raise OffsetTemperatureError(
                f"element {i + 1} of the list is {'' if a.offset else 'not '}a temperature on the °C/°F scale, "
                f"element {k + 1} is {'' if x.offset else 'not'}".rstrip(), item.span,
                hint="write every element on one scale: all in °C (or °F), or all in K")
    return x


def make_list(values: Sequence[pint.Quantity], node: N.ListExpr) -> pint.Quantity:
    """The rule, then one quantity over an array, in the first element's unit."""
    rule_list_items([arg_of(v) for v in values], [is_list(v) for v in values], node)
    unit = values[0].units
    mags = np.fromiter((v.m_as(unit) if v.units != unit else v.magnitude for v in values), float, len(values))
    return _Q(mags, unit)


def rule_if_shape(x_many: bool, y_many: bool, node: N.Call) -> None:
    """Both outcomes of ``if`` are lists, or neither (the shape must not depend on the values)."""
    if x_many != y_many:
        raise TypeMismatchError("one value of if() is a list, the other is not", node.span,
                                hint="give both outcomes as lists, or both as single values")


def rule_plugin_scalar(where: str, many: bool, node: N.Expr) -> None:
    """A plugin parameter takes a list only if the plugin declares one (``kind="list"``)."""
    if many:
        raise PluginArgumentError(f"{where} takes one value, not a list", node.span,
                                  hint="call the plugin once per value, or pick one: max(…), min(…)")


# ------------------------------------------------------------ tables and lookup
# A sheet's table (``nodes.TableDef``) becomes a ``TableInfo`` (its columns' dimensions: what the checker
# needs) and, evaluated, a ``TableValue`` (the numbers). ``tab.k`` reads a column as a list; ``lookup``
# interpolates linearly between the two rows that bracket the key (two-way: between four values), and
# refuses a key outside the table unless ``clamp`` is written. Both walkers apply ``rule_lookup``.


@dataclass(frozen=True)
class TableInfo:
    """A table's shape: the key names and every column's ``Arg`` (two-way: the values' ``Arg``)."""

    name: str
    columns: tuple[tuple[str, Arg], ...]  # one-way: every column, the key first; two-way: row key, column key
    two_way: bool
    value: Arg | None = None  # two-way: what the table holds

    @property
    def keys(self) -> tuple[str, ...]:
        return tuple(c for c, _ in self.columns[:2 if self.two_way else 1])

    def column(self, name: str) -> Arg | None:
        return dict(self.columns).get(name)


def _table_units(td: N.TableDef) -> list[pint.Unit]:
    """Each column's unit (two-way: row key, column key, values), located at its cell if it is unknown."""
    texts = list(td.units)
    spans = list(td.cell_spans[1]) if len(td.cell_spans) > 1 else [td.span] * len(texts)
    if td.two_way:
        texts = [t.strip() for t in texts[0].split("\\")] + [texts[1]]
        spans = [spans[0], spans[0], spans[1]]
    out = []
    for text, sp in zip(texts, spans):
        try:
            factors = U.parse_unit_text(text, sp)
            out.append(U.build_unit(factors) if factors else _unit(""))
        except CalcError as exc:
            raise exc.with_span(sp)
    return out


def table_info(td: N.TableDef) -> TableInfo:
    units = _table_units(td)
    if td.two_way:
        keys = [k.strip() for k in td.header[0].split("\\")]
        return TableInfo(td.name, ((keys[0], _arg_of_unit(units[0])), (keys[1], _arg_of_unit(units[1]))), True,
                         _arg_of_unit(units[2]))
    return TableInfo(td.name, tuple((c, _arg_of_unit(u)) for c, u in zip(td.header, units)), False)


@dataclass(frozen=True, eq=False)
class TableValue:
    """An evaluated table: its shape, each column's unit, and its numbers (rows × columns; two-way: the
    grid, with the row keys and the column keys apart)."""

    info: TableInfo
    units: tuple
    data: np.ndarray
    col_keys: np.ndarray | None = None
    node: N.TableDef | None = None

    def column(self, name: str) -> pint.Quantity:
        if self.info.two_way:
            k = self.info.keys.index(name)
            mags = self.data[:, 0] if k == 0 else self.col_keys
            return _Q(np.array(mags, float), self.units[k])
        k = [c for c, _ in self.info.columns].index(name)
        return _Q(np.array(self.data[:, k], float), self.units[k])

    @property
    def n_rows(self) -> int:
        return len(self.data)

    def __eq__(self, other):
        return (isinstance(other, TableValue) and self.info == other.info and self.units == other.units
                and np.array_equal(self.data, other.data))

    __hash__ = None

    def __str__(self):
        return f"table of {self.n_rows} rows"


def make_table(td: N.TableDef) -> TableValue:
    info = table_info(td)
    units = tuple(_table_units(td))
    data = np.array(td.values, float)
    col_keys = np.array([float(h) for h in td.header[1:]]) if td.two_way else None
    return TableValue(info, units, data, col_keys, td)


def check_lookup_shape(node: N.Call) -> tuple[N.Expr, str | None, bool]:
    """``lookup(tab.k, key=value, …[, clamp])``: (the table's name node, the column or None, clamp)."""
    args = list(node.args)
    clamp = False
    if len(args) > 2:
        raise ArityError(f"lookup() takes the column, the keys by name and optionally clamp; got {len(args)} "
                         "arguments in order", node.span, hint="write lookup(tab.k, h=120 mm) or "
                                                               "lookup(tab.k, h=120 mm, clamp)")
    if len(args) == 2 and isinstance(args[1], N.Flag):
        clamp = True
        args = args[:1]
    for a in args[1:]:
        raise TypeMismatchError("lookup() takes the column, the keys by name, and optionally clamp", a.span,
                                hint="write lookup(tab.k, h=120 mm) or lookup(tab.k, h=120 mm, clamp)")
    if not args:
        raise ArityError("lookup() needs a table's column: lookup(tab.k, h=120 mm)", node.span)
    first = args[0]
    if isinstance(first, N.FieldAccess) and isinstance(first.obj, N.Name):
        table, column = first.obj, first.field_name
    elif isinstance(first, N.Name):
        table, column = first, None
    else:
        raise TypeMismatchError("lookup() reads a table of the sheet: lookup(tab.k, h=…), or "
                                "lookup(tab, h=…, b=…) for a two-way table", first.span)
    seen = set()
    for kw in node.kwargs:
        if kw.name in seen:
            raise TypeMismatchError(f"'{kw.name}' is given twice", kw.span)
        seen.add(kw.name)
    return table, column, clamp


def rule_lookup(info: TableInfo | None, column: str | None, first: N.Expr,
                keys: Sequence[tuple[N.Keyword, Arg | None, bool]], node: N.Call) -> Arg | None:
    """The keys named as the table names them, each of its key's dimension and a single value; the result
    has the read column's dimension (two-way: the table's values')."""
    if info is None:
        return None
    if info.two_way and column is not None:
        raise TypeMismatchError(f"{info.name} is a two-way table: look it up whole, "
                                f"lookup({info.name}, {info.keys[0]}=…, {info.keys[1]}=…)", first.span)
    if not info.two_way:
        if column is None:
            names = [c for c, _ in info.columns[1:]]
            raise TypeMismatchError(f"name the column of {info.name} to read: lookup({info.name}.{names[0]}, "
                                    f"{info.keys[0]}=…)", first.span)
        if info.column(column) is None:
            names = [c for c, _ in info.columns]
            raise UnknownFieldError(f"table {info.name} has no column '{column}'", first.span,
                                    hint="columns: " + ", ".join(names))
        if column == info.keys[0]:
            raise TypeMismatchError(f"'{column}' is the key of table {info.name}; read another column", first.span)
    given = {kw.name for kw, _, _ in keys}
    for kw, a, many in keys:
        want = info.column(kw.name) if kw.name in info.keys else None
        if want is None:
            raise TypeMismatchError(f"table {info.name} is looked up by {' and '.join(info.keys)}, not '{kw.name}'",
                                    kw.span)
        rule_scalar(many, kw.value, f"the key {kw.name} of a lookup")
        if a is not None and a.dim != want.dim:
            raise DimensionError(f"the key {kw.name} of table {info.name} is {_d(want)}, but the value given is "
                                 f"{_d(a)}", kw.value.span, hint=f"{operand(kw.value)} is {_d(a)}")
    missing = [k for k in info.keys if k not in given]
    if missing:
        raise ArityError(f"lookup in {info.name} needs {', '.join(k + '=…' for k in missing)}", node.span)
    return info.value if info.two_way else info.column(column)


class Bracket(NamedTuple):
    """Where a key falls in a table: between rows ``i`` and ``i + 1``, at fraction ``t``; ``clamped`` if it
    was outside and the end value is taken."""

    i: int
    t: float
    clamped: bool


def bracket(xs: np.ndarray, x: float, clamp: bool, key: str, info: TableInfo, shown, node: N.Expr) -> Bracket:
    """The two rows around ``x`` (never extrapolating: outside the keys, an error unless ``clamp``)."""
    lo, hi = float(xs[0]), float(xs[-1])
    if not lo <= x <= hi:
        if not clamp:
            raise OutOfRangeError(
                f"{key} = {shown(x)} is outside table {info.name}, which runs from {shown(lo)} to {shown(hi)}",
                node.span, hint="a table is never extrapolated: extend it, or write clamp to take the end value "
                                f"(lookup(…, {key}=…, clamp))")
        return Bracket(0, 0.0, True) if x < lo else Bracket(len(xs) - 2, 1.0, True)
    i = min(int(np.searchsorted(xs, x, side="right")) - 1, len(xs) - 2)
    return Bracket(i, (x - float(xs[i])) / (float(xs[i + 1]) - float(xs[i])), False)


def interpolate(y1: float, y2: float, t: float) -> float:
    """y₁ + (y₂ − y₁)·t: the formula the package prints, with t = (x − x₁)/(x₂ − x₁)."""
    return y1 + (y2 - y1) * t


FUNCTIONS["lookup"] = Function(
    "lookup", 1, 2, None, None, "lookup(tab.k, h=value[, clamp]): the column k at h, interpolated linearly between "
    "the two rows around it; lookup(tab, h=…, b=…) in a two-way table", lazy=True)
