"""The promise of `calcsheet check`: a clean check means evaluation raises no unit or arity error.

Generated sheets cover every operator, every built-in function (with its own arity and one off),
powers, `if`, declared units and plugin calls with right and wrong argument dimensions. For each:

    the checker finds an error  ⇔  evaluating the sheet *without the checker in front* raises a
                                    dimension, unit or arity error

and, where both succeed, the dimension the checker inferred for every name is the dimension of its
evaluated value. Sheets whose evaluation stops on a numeric error first (a square root of a negative,
a division by zero) say nothing about dimensions and are set aside.
"""
from __future__ import annotations

from functools import lru_cache

import pint
import pytest
from hypothesis import HealthCheck, assume, event, given, settings
from hypothesis import strategies as st

from calcsheet import builtins as B
from calcsheet import nodes as N
from calcsheet import units as U
from calcsheet.checker import Checker
from calcsheet.errors import (
    AngleError,
    CalcError,
    DeclaredUnitError,
    DimensionError,
    OffsetTemperatureError,
    PluginArgumentError,
    TypeMismatchError,
)
from calcsheet.evaluator import Evaluator, SheetFunction, evaluate_statement
from calcsheet.parser import parse_sheet
from calcsheet.plugin import Field, Namespace, Param, PluginRegistry, Record
from calcsheet.resolver import resolve

# ---------------------------------------------------------------- a small test-only plugin

ns = Namespace("agr", version="0.1", doc="test-only plugin for the agreement property")


@ns.function("span", params=[Param("L", "[length]"), Param("w", "[force]/[length]"), Param("n", None)],
             fields=[Field("M", "[force]*[length]"), Field("R", "[force]"), Field("k")], returns="agr.span")
def _span(work, L, w, n):
    work.calc("M", "n*w*L^2/8")
    work.calc("R", "w*L/2")
    work.calc("k", "n + 1")
    return {"M": work["M"], "R": work["R"], "k": work["k"]}


REGISTRY = PluginRegistry(blocked=set())
REGISTRY.register(ns)

# ---------------------------------------------------------------- what the sheets are made of

PREAMBLE = """\
a = 2 m
b = 750 mm
c = 4 s
r = 0.5
g = 30 deg
f = 5 kN
w = 3 kN/m
t_1 = 20 degC
t_2 = 35 degC
p = agr.span(L=6 m, w=5 kN/m, n=1)
La = [2 m, 2500 mm, 4 m]
Fa = [1 kN, 2 kN, 3 kN]
k_t =
| h   | k   | F  |
| mm  | 1   | kN |
| 100 | 1.0 | 3  |
| 200 | 0.9 | 5  |
| 300 | 0.7 | 6  |
c_t =
| h \\ b   | 1   | 2   |
| mm \\ mm | kN  | kN  |
| 100     | 1.0 | 2.0 |
| 300     | 3.0 | 5.0 |
"""
# lists (all of three elements: lengths are values, not dimensions) and a table's columns stand among the names
NAMES = ["a", "b", "c", "r", "g", "f", "w", "t_1", "t_2", "p.M", "p.R", "p.k", "pi", "La", "Fa", "k_t.k", "k_t.h"]
LITERALS = ["2", "0.25", "3 m", "150 mm", "2 s", "45 deg", "1.5 rad", "4 kN", "10 kN/m", "12 MPa", "300 K"]
EXPONENTS = ["2", "3", "0.5", "-1", "(1/2)", "13", "-13", "r", "2 m/1 m"]
DECLARED = ["m", "mm", "kN", "kN*m", "deg", "", "s", "MPa", "m^2", "K", "degC"]

DIMENSION_ERRORS = (DimensionError, DeclaredUnitError, AngleError, OffsetTemperatureError, PluginArgumentError,
                    TypeMismatchError)


@lru_cache(maxsize=None)
def expressions(depth: int = 3):
    leaves = st.sampled_from(NAMES + LITERALS)
    if depth == 0:
        return leaves
    sub = expressions(depth - 1)

    def binop(parts):
        x, op, y = parts
        return f"({x} {op} {y})"

    def call(parts):
        name, args, delta = parts
        fn = B.FUNCTIONS[name]
        n = max(0, min(len(args), (fn.max_args or 3)) + delta)
        args = (args * 3)[:n]
        return f"{name}({', '.join(args)})"

    def if_(parts):
        x, op, y, t, e = parts
        return f"if({x} {op} {y}, {t}, {e})"

    return st.one_of(
        leaves,
        st.tuples(sub, st.sampled_from(["+", "-", "*", "/"]), sub).map(binop),
        st.tuples(sub, st.sampled_from(EXPONENTS)).map(lambda t: f"({t[0]})^{t[1]}"),
        sub.map(lambda x: f"-{x}"),
        st.tuples(st.sampled_from(sorted(n for n in B.FUNCTIONS if n not in ("if", "lookup"))),
                  st.lists(sub, min_size=1, max_size=3), st.sampled_from([0, 0, 0, -1, 1])).map(call),
        st.tuples(sub, st.sampled_from(["<=", "<", ">=", ">"]), sub, sub, sub).map(if_),
        st.tuples(st.sampled_from(LOOKUPS), sub, sub).map(lambda t: t[0].format(x=t[1], y=t[2])),
    )


# lookups: right and wrong tables, columns, key names, key dimensions and shapes (``clamp`` keeps most keys in range;
# a key out of range is a numeric error, set aside like a division by zero)
LOOKUPS = ["lookup(k_t.k, h={x}, clamp)", "lookup(k_t.F, h={x}, clamp)", "lookup(k_t.k, h={x})",
           "lookup(k_t.k, b={x}, clamp)", "lookup(k_t.h, h={x}, clamp)", "lookup(k_t, h={x}, clamp)",
           "lookup(c_t, h={x}, b={y}, clamp)", "lookup(c_t.h, h={x}, b={y}, clamp)", "lookup(c_t, h={x}, clamp)",
           "lookup(a, h={x})", "lookup(k_t.k, h={x}, {y})"]


# expressions right by construction, of a known kind: L length, N plain number, A angle, F force, W line load
TYPED_LEAVES = {
    "L": ["a", "b", "3 m", "150 mm", "La", "k_t.h", "max(La)"],
    "N": ["r", "2", "0.25", "p.k", "pi", "lookup(k_t.k, h=b, clamp)", "lookup(k_t.k, h=150 mm)", "k_t.k", "count(Fa)"],
    "A": ["g", "45 deg", "1.5 rad"],
    "F": ["f", "4 kN", "p.R", "Fa", "lookup(k_t.F, h=250 mm)", "lookup(c_t, h=a, b=1.5 mm, clamp)", "sum(Fa)"],
    "W": ["w", "10 kN/m"],
}


@lru_cache(maxsize=None)
def typed(kind: str, depth: int = 2):
    leaves = st.sampled_from(TYPED_LEAVES[kind])
    if depth == 0:
        return leaves
    same = typed(kind, depth - 1)
    number = typed("N", depth - 1)
    options = [
        leaves,
        st.tuples(same, st.sampled_from(["+", "-"]), same).map(lambda t: f"({t[0]} {t[1]} {t[2]})"),
        st.tuples(same, number).map(lambda t: f"({t[0]} * {t[1]})"),
        st.tuples(st.sampled_from(["min", "max"]), st.lists(same, min_size=1, max_size=3)).map(
            lambda t: f"{t[0]}({', '.join(t[1])})"),
        same.map(lambda x: f"abs({x})"),
        st.tuples(typed("L", depth - 1), st.sampled_from(["<=", ">"]), typed("L", depth - 1), same, same).map(
            lambda t: f"if({t[0]} {t[1]} {t[2]}, {t[3]}, {t[4]})"),
    ]
    if kind == "N":
        options += [
            typed("A", depth - 1).map(lambda x: f"sin({x})"),
            st.tuples(typed("L", depth - 1), typed("L", depth - 1)).map(lambda t: f"({t[0]} / {t[1]})"),
            st.tuples(st.sampled_from(["exp", "ceil", "floor"]), same).map(lambda t: f"{t[0]}({t[1]})"),
            st.tuples(same, st.sampled_from(["2", "r", "(1/2)", "-1"])).map(lambda t: f"({t[0]})^{t[1]}"),
        ]
    if kind == "A":
        options += [st.tuples(typed("L", depth - 1), typed("L", depth - 1)).map(lambda t: f"atan2({t[0]}, {t[1]})"),
                    number.map(lambda x: f"atan({x})")]
    if kind == "L":
        options += [st.tuples(same, same).map(lambda t: f"sqrt({t[0]} * {t[1]})"),
                    st.tuples(typed("F", depth - 1), typed("W", depth - 1)).map(lambda t: f"({t[0]} / {t[1]})")]
    if kind == "F":
        options += [st.tuples(typed("W", depth - 1), same.map(lambda x: x)).map(lambda t: f"({t[0]} * a)")]
    return st.one_of(*options)


def maybe_typed(kind: str):
    """Right by construction, or anything at all."""
    return st.one_of(typed(kind), expressions(2))


KIND_UNITS = {"L": ["m", "mm"], "N": [""], "A": ["deg", "rad"], "F": ["kN"], "W": ["kN/m"]}


def statements():
    expr = expressions(2)
    kinds = st.sampled_from(sorted(TYPED_LEAVES))

    def definition_of(kind):
        unit = st.one_of(st.none(), st.none(), st.sampled_from(KIND_UNITS[kind]), st.sampled_from(DECLARED))
        return st.tuples(unit, st.one_of(typed(kind), expr)).map(
            lambda t: f"x = {t[1]}" if t[0] is None else f"x [{t[0]}] = {t[1]}")

    definition = kinds.flatmap(definition_of)
    check = st.one_of(
        st.tuples(expr, st.sampled_from(["<=", ">"]), expr),
        kinds.flatmap(lambda k: st.tuples(typed(k), st.sampled_from(["<=", ">"]), typed(k))),
    ).map(lambda t: f"check {t[0]} {t[1]} {t[2]}")
    plugin = st.tuples(maybe_typed("L"), maybe_typed("W"), maybe_typed("N")).map(
        lambda t: f"x = agr.span(L={t[0]}, w={t[1]}, n={t[2]})")
    field = st.sampled_from(["M", "R", "k"]).map(lambda f: f"y = x.{f}")
    return st.one_of(
        definition,
        check,
        sheet_function_calls(),
        st.tuples(plugin, field).map("\n".join),
        st.tuples(definition, st.one_of(expr, typed("N")).map(lambda e: f"z = x * {e}")).map("\n".join),
    )


# a sheet function of two parameters (each declared or not, the result declared or not) and calls of it
FUNCTION_BODIES = ["u*v^2/8", "u + v", "u*v", "sqrt(u*v)", "u/v", "max(u, v)", "u + a", "u*v/b", "(u - v)*r",
                   "sin(u)", "u^2", "if(u <= v, u, v)", "u - t_1"]
PARAM_UNITS = [None, None, "m", "kN", "kN/m", "1", "deg", "degC"]


def sheet_function_calls():
    decl = st.sampled_from(PARAM_UNITS).map(lambda u: "" if u is None else f" [{u}]")
    definition = st.tuples(decl, decl, st.sampled_from(PARAM_UNITS + DECLARED), st.sampled_from(FUNCTION_BODIES)).map(
        lambda t: f"F(u{t[0]}, v{t[1]}){'' if t[2] is None else f' [{t[2]}]'} = {t[3]}")
    arg = st.one_of(*(maybe_typed(k) for k in ("L", "F", "W", "N", "A")), st.sampled_from(["t_1", "t_2"]))
    call = st.tuples(arg, arg).map(lambda t: f"F({t[0]}, {t[1]})")
    use = st.one_of(call.map(lambda c: f"x = {c}"), call.map(lambda c: f"x = 2*{c}"),
                    st.tuples(call, call).map(lambda t: f"check {t[0]} <= {t[1]}"),
                    st.tuples(call, call).map(lambda t: f"x = {t[0]}\nz = x * {t[1]}"))
    return st.tuples(definition, st.one_of(st.just(""), use)).map(lambda t: "\n".join(x for x in t if x))


# ---------------------------------------------------------------- both sides, independently


def check_errors(sheet: N.Sheet):
    res = resolve(sheet, REGISTRY)
    checker = Checker(REGISTRY)
    diags = res.diagnostics + checker.check_sheet(sheet, res)
    return [d for d in diags if d.severity == "error"], checker


def evaluate_alone(sheet: N.Sheet):
    """Every statement through the evaluator, with no resolver or checker in front."""
    ev = Evaluator(plugins=REGISTRY)
    env, display = {}, {}
    for stmt in sheet.body:
        if isinstance(stmt, (N.Definition, N.Check, N.FunctionDef, N.TableDef)):
            evaluate_statement(ev, stmt, env, display)
    return env


@settings(max_examples=300, derandomize=True, database=None, deadline=None,
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.filter_too_much])
@given(statements())
def test_check_is_clean_exactly_when_evaluation_raises_no_dimension_or_arity_error(body):
    text = PREAMBLE + body + "\n"
    sheet, parse_diags = parse_sheet(text)
    assume(not parse_diags)
    found, checker = check_errors(sheet)
    try:
        env = evaluate_alone(sheet)
        raised = None
    except DIMENSION_ERRORS as exc:
        raised = exc
    except CalcError as exc:  # a numeric error stopped evaluation before any dimension was decided
        assume(False)
        raise AssertionError(exc)  # pragma: no cover
    event("check found an error" if found else "check clean")
    event("plugin call evaluated" if "agr.span" in body and raised is None else "other")
    event("lookup " + ("evaluated" if raised is None else "refused") if "lookup(" in body else "no lookup")
    event("list " + ("evaluated" if raised is None else "refused") if any(n in body for n in ("La", "Fa", "k_t."))
          else "no list")
    assert bool(found) == (raised is not None), (
        f"\n{body}\ncheck: {[d.one_line() for d in found]}\nevaluation: {raised!r}")
    if raised is None:
        for name, value in env.items():
            if isinstance(value, SheetFunction):
                assert name in checker.functions, (body, name)
                continue
            t = checker.types[name]
            if isinstance(value, pint.Quantity):
                assert t.kind == "q" and t.dim == U.dim_of(value), (body, name, t, value)
                assert t.offset == B.arg_of(value).offset, (body, name, t, value)
                assert t.many == B.is_list(value), (body, name, t, value)  # a list exactly where one is inferred
            elif isinstance(value, B.TableValue):
                assert t.kind == "table" and t.table == value.info
            elif isinstance(value, Record):
                assert t.kind == "record" and t.record_type == value.type


# ---------------------------------------------------------------- cases the generator found once, kept


@pytest.mark.parametrize("body", [
    "x = sqrt(a, b)",
    "x = atan2(a)",
    "x = a^13",
    "x = t_1\nz = x * 2",                    # a copied °C temperature keeps its scale
    "x [deg] = r\nz = sin(x)",              # a value declared an angle is one
    "x [degC] = t_2 - t_1",                 # a difference is not a temperature on the °C scale
    "x = if(a < b, sqrt(a*b), c)",          # the branch not taken still has its dimension
    "x = agr.span(L=a, w=f, n=1)",          # a force where a line load belongs
    "x = a^r",                              # a power read from a name
    "x = max(t_1, 300 K)\nz = x * 2",        # °C and K mixed: the result's scale would depend on the values
    "x = if(a < b, t_1, t_2 - t_1)\nz = x * 2",  # one outcome on the °C scale, the other a difference
    "F(u [m], v) = u + v\nx = F(a, c)",     # an untyped parameter: the body is checked at each call
    "F(u [m], v [m]) [kN] = u + v",         # never called: a typed body is still checked
    "F(u [deg], v) = u*2 + 1\nx = F(r, a)",  # a plain number for an angle parameter takes the angle
    "x = if(a < b, La, a)",                 # one outcome a list, the other not
    "x = if(La < b, a, a)",                 # a list in the condition
    "x = r^(La/a)",                         # a list as an exponent
    "x = [a, La]",                          # a list inside a list
    "x = [a, f]",                           # two dimensions in one list
    "x = agr.span(L=La, w=w, n=1)",         # a list where the plugin takes one value
    "x = lookup(k_t.k, h=La, clamp)",       # a list as a lookup key
    "x = lookup(k_t.k, h=f, clamp)",        # a key of the wrong dimension
    "x = lookup(c_t, h=a, clamp)",          # a two-way table with one key
    "x = sum(t_1)",                         # a sum of °C temperatures
])
def test_known_disagreements_stay_agreed(body):
    text = PREAMBLE + body + "\n"
    sheet, _ = parse_sheet(text)
    found, _ = check_errors(sheet)
    try:
        evaluate_alone(sheet)
        raised = None
    except DIMENSION_ERRORS as exc:
        raised = exc
    assert bool(found) == (raised is not None)
