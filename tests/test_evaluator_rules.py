"""The evaluator's own rules, with no static checker in front of it.

A sheet's statements pass the checker before they are evaluated, so a rule the
evaluator drops would stay hidden there; a plugin's formulas (``work.calc``,
``work.check``) reach the evaluator directly. These tests therefore evaluate
parsed expressions themselves, and go through a small plugin of their own.
The rules are those of dimensional analysis: a sum or a comparison needs one
dimension on both sides; an exponent, and the argument of exp/ln/log10/asin/
ceil/floor, must be a plain number; sin/cos/tan need an angle (an angle is not
a plain number here, although pint treats it as one).
"""
import math

import pytest

from calcsheet.errors import CheckSignError

import calcsheet
from calcsheet import units as U
from calcsheet.checker import Checker
from calcsheet.errors import (
    AngleError,
    CalcError,
    DimensionError,
    DivisionByZeroError,
    NumericError,
    TypeMismatchError,
)
from calcsheet.evaluator import Evaluator
from calcsheet.parser import parse_expression, parse_statement
from calcsheet.plugin import Field, Namespace, Param, PluginRegistry, default_registry


def ev(text, **env):
    return Evaluator().eval(parse_expression(text), env)


# ---------------------------------------------------------------- errors, one per rule

REFUSED = [
    # sums and differences: one dimension on both sides
    ("30 deg + 1", DimensionError, "add"),          # pint would give 87.3 deg
    ("1 + 30 deg", DimensionError, "add"),
    ("30 deg - 1", DimensionError, "subtract"),
    ("2 m + 3 s", DimensionError, "add"),
    ("2 m - 3 s", DimensionError, "subtract"),
    ("2 m*3 s + 6", DimensionError, "add"),
    ("30 deg*1 deg + 1", DimensionError, "add"),
    ("atan2(1 m, 2 m) + 1", DimensionError, "add"),  # atan2 gives an angle
    # exponents: plain numbers only, and real results
    ("2 m^(1 m)", DimensionError, "exponent"),
    ("2^(30 deg)", DimensionError, "exponent"),
    ("(-4 m^2)^0.5", NumericError, "not real"),
    ("(-8)^(1/3)", NumericError, "not real"),
    ("(0 m)^(-1)", DivisionByZeroError, "zero"),
    ("0^(-1)", DivisionByZeroError, "zero"),
    ("(2 m)^13", DimensionError, "power"),
    ("2^100000", NumericError, "overflow"),
    # products that overflow, divisions by zero
    ("1e308 m*10", NumericError, "infinite"),
    ("2 m/(0 s)", DivisionByZeroError, "division by zero"),
    # functions
    ("sin(30)", AngleError, "angle"),
    ("cos(2 m)", AngleError, "angle"),
    ("tan(1)", AngleError, "angle"),
    ("exp(1 m)", DimensionError, "plain number"),
    ("exp(30 deg)", DimensionError, "plain number"),
    ("ln(2 m)", DimensionError, "plain number"),
    ("log10(30 deg)", DimensionError, "plain number"),
    ("asin(1 m)", DimensionError, "plain number"),
    ("ceil(1.5 m)", DimensionError, "plain number"),
    ("floor(30 deg)", DimensionError, "plain number"),
    ("min(1 m, 2 s)", DimensionError, "min"),
    ("max(1 m, 2 s)", DimensionError, "max"),
    ("atan2(1 m, 1 s)", DimensionError, "same dimension"),
    ("sqrt(-4 m^2)", NumericError, "negative"),
    ("acos(2)", NumericError, "outside"),
    ("asin(-1.5)", NumericError, "outside"),
    ("ln(0)", NumericError, "not positive"),
    ("log10(-1)", NumericError, "not positive"),
    ("exp(1000)", NumericError, "overflow"),
    ("if(1 m <= 1 s, 1, 2)", DimensionError, "compare"),
    ("if(1 m <= 2 m, 1 m, 2 s)", DimensionError, "the two values of if()"),
    ("if(1, 2, 3)", TypeMismatchError, "comparison"),
]


@pytest.mark.parametrize("text, error, words", REFUSED, ids=[t for t, *_ in REFUSED])
def test_the_evaluator_refuses_it_with_a_located_error(text, error, words):
    with pytest.raises(error) as info:
        ev(text)
    assert words in str(info.value)
    span = info.value.span
    assert span is not None and span.line == 1 and span.end_col > span.col  # located, not a raw pint error


@pytest.mark.parametrize("text, message", [
    ("30 deg + 1", "cannot add dimensionless to angle"),
    ("2 m - 3 s", "cannot subtract time from length"),
    ("2 kN + 1 MPa", "cannot add pressure (stress, area load) to force"),
    ("1 m^2 + 1 m^3", "cannot add length³ (section modulus, volume) to area"),
    ("sin(2 m)", "sin() needs an angle, got length"),
    ("1 kN/m^3 + 1 kN", "cannot add force to force/volume (unit weight)"),
    ("1 kg/m + 1 kg", "cannot add mass to mass/length"),
    ("1 kg/m^3 + 1 kg", "cannot add mass to density"),
    ("1 K + 1 m", "cannot add length to temperature"),
])
def test_the_message_names_both_dimensions_in_words(text, message):
    with pytest.raises(CalcError) as info:
        ev(text)
    assert str(info.value) == message


def test_the_error_points_at_the_operation_that_broke():
    # "2 m + (3 s*1)": the bad sum is the whole expression; "x*(2 m + 3 s)": only the bracket
    whole = pytest.raises(DimensionError, ev, "2 m + 3 s*1").value.span
    inner = pytest.raises(DimensionError, ev, "4*(2 m + 3 s)").value.span
    assert (whole.end_col - whole.col) == len("2 m + 3 s*1")
    assert (inner.end_col - inner.col) == len("2 m + 3 s")
    exponent = pytest.raises(DimensionError, ev, "2 m^(1 m)").value.span
    assert exponent.end_col - exponent.col == len("(1 m)")  # the exponent, not the base


# ---------------------------------------------------------------- what each operator gives


def test_sums_convert_to_the_left_operand_unit():
    assert ev("1 m + 250 mm").m_as("mm") == pytest.approx(1250.0)
    assert ev("1 m - 250 mm").m_as("mm") == pytest.approx(750.0)
    assert ev("30 deg + 1 rad").m_as("deg") == pytest.approx(30 + 180 / math.pi)


def test_products_quotients_and_powers_carry_their_dimensions():
    assert U.dim_of(ev("2 m*3 s")) == U.dim_of(U.Quantity(1, "m*s"))
    assert ev("2 m*3 s").m_as("m*s") == 6.0
    assert ev("6 kN/(2 m)").m_as("kN/m") == 3.0
    assert ev("(3 m)^2").m_as("m^2") == 9.0
    assert ev("(16 m^2)^0.5").m_as("m") == 4.0
    assert ev("2^10").m_as("") == 1024.0
    assert ev("-(2 m)").m_as("m") == -2.0
    assert ev("(-2)^3").m_as("") == -8.0  # a negative base to a whole power is real
    assert ev("(5 mm/(1 m))^2").m_as("") == pytest.approx(25e-6)  # a ratio is reduced before its power


def test_powers_at_the_edges_of_their_rules():
    # x^0 = 1 and 1^p = 1 for any p; a positive base below 1 has real fractional powers
    assert ev("(0 m)^0").m_as("") == 1.0
    assert ev("0^0").m_as("") == 1.0
    assert ev("1^(-2)").m_as("") == 1.0
    assert ev("(1 m)^(-1)").m_as("1/m") == 1.0
    assert ev("(0.25 m^2)^0.5").m_as("m") == 0.5
    assert ev("0.25^0.5").m_as("") == 0.5
    assert ev("(0 m)^2").m_as("m^2") == 0.0
    assert "zero to a negative power" in str(pytest.raises(DivisionByZeroError, ev, "0^(-1)").value)
    assert "zero to a negative power" in str(pytest.raises(DivisionByZeroError, ev, "(0 m)^(-2)").value)


def test_angles_are_converted_to_radians_for_trigonometry():
    assert ev("sin(30 deg)").m_as("") == pytest.approx(0.5)
    assert ev("cos(60 deg)").m_as("") == pytest.approx(0.5)
    assert ev("tan(45 deg)").m_as("") == pytest.approx(1.0)
    assert ev("asin(0.5)").m_as("deg") == pytest.approx(30.0)
    assert ev("atan2(1 m, 1000 mm)").m_as("deg") == pytest.approx(45.0)
    assert ev("sin(pi*1 rad/6)").m_as("") == pytest.approx(0.5)


def test_functions_of_plain_numbers_and_of_quantities():
    assert ev("sqrt(9 m^2)").m_as("m") == 3.0
    assert ev("abs(-2 m)").m_as("m") == 2.0
    assert ev("min(2 m, 1500 mm, 3 m)").m_as("mm") == 1500.0
    assert ev("max(2 m, 1500 mm, 3 m)").m_as("mm") == 3000.0
    assert ev("ceil(1.2)").m_as("") == 2.0 and ev("floor(1.8)").m_as("") == 1.0
    assert ev("ln(exp(2))").m_as("") == pytest.approx(2.0)
    assert ev("log10(1000)").m_as("") == pytest.approx(3.0)
    assert ev("ceil(1500 mm/(1 m))").m_as("") == 2.0  # a ratio of lengths is a plain number
    assert ev("if(2 m <= 1 m, 10 kN, 20 kN)").m_as("kN") == 20.0
    assert ev("if(1 m <= 1000 mm, 10 kN, 20 kN)").m_as("kN") == 10.0  # equality takes the first branch


def test_a_conditional_step_records_the_values_of_both_branches():
    # the package prints the branch not taken with its numbers too, so a reviewer sees both cases
    env = {k: U.Quantity(v, "kN") for k, v in (("a", 1.0), ("b", 2.0), ("c", 3.0), ("d", 4.0))}
    step = Evaluator().evaluate_definition(parse_statement("x = if(a <= b, c, d)"), env, {})
    assert step.value.m_as("kN") == 3.0
    assert set(step.used) == {"a", "b", "c", "d"}
    assert step.used["d"][0].m_as("kN") == 4.0


# ---------------------------------------------------------------- same verdict as the static checker

# (2 m)^13 is refused only when evaluated: a cap on powers of quantities, not a dimension rule
PARITY = [t for t, *_ in REFUSED if t not in ("if(1, 2, 3)", "(2 m)^13")] + [
    "1 m + 1 mm", "30 deg + 1 rad", "sqrt(4 m^2) + 1 m", "(2 m)^(1/2)", "tan(1 rad)", "abs(2 m)",
    "2 m*3 s", "(1 m/mm) + 1",
]


@pytest.mark.parametrize("text", PARITY)
def test_the_evaluator_and_the_checker_agree_on_every_dimension_rule(text):
    # the checker infers dimensions without evaluating; a rule either keeps must be kept by both
    expr = parse_expression(text)
    checker_error = evaluator_error = None
    try:
        Checker(default_registry()).infer(expr)
    except CalcError as exc:
        checker_error = exc
    try:
        Evaluator().eval(expr, {})
    except CalcError as exc:
        evaluator_error = exc
    dimension_rules = (DimensionError, AngleError)
    assert isinstance(checker_error, dimension_rules) == isinstance(evaluator_error, dimension_rules), \
        (checker_error, evaluator_error)


# ---------------------------------------------------------------- through a plugin's own formulas

probe = Namespace("probe", version="1.0", doc="a plugin that evaluates the formula it is given")


@probe.function("calc", params=[Param("a", "[length]"), Param("b", "[time]"), Param("formula", kind="text")],
                fields=[Field("v", doc="the value, as a plain number in its own unit")], returns="probe.calc")
def _probe_calc(work, a, b, formula):
    work.calc("v", formula)
    return {"v": work.q(float(work["v"].magnitude), "")}


@probe.function("check", params=[Param("a", "[length]"), Param("b", "[length]"),
                                 Param("op", kind="text", choices=("<=", "<", ">=", ">"))],
                fields=[Field("ok", doc="1 when the check holds"), Field("ratio", doc="utilisation")], returns="probe.check")
def _probe_check(work, a, b, op):
    c = work.check(f"a {op} b", desc="probe check")
    return {"ok": work.q(1.0 if c.ok else 0.0, ""), "ratio": work.q(c.ratio if c.ratio is not None else -1, "")}


@probe.function("compare", params=[Param("a", "[length]"), Param("b", "[time]")],
                fields=[Field("ok", doc="1 when a <= b")], returns="probe.compare")
def _probe_compare(work, a, b):  # a plugin bug: a check between a length and a time
    c = work.check("a <= b")
    return {"ok": work.q(1.0 if c.ok else 0.0, "")}


@pytest.fixture(scope="module")
def plugins():
    reg = PluginRegistry()
    reg.register(probe)
    return reg


def through_plugin(plugins, formula):
    return calcsheet.run(f'L = 2 m\nt = 3 s\nres = probe.calc(a=L, b=t, formula="{formula}")\n', plugins=plugins)


@pytest.mark.parametrize("formula", ["30 deg + 1", "a + b", "a - b", "a/(1 m) + 30 deg", "exp(a)", "sin(a/(1 m))",
                                     "a^b", "min(a, b)"])
def test_a_plugin_formula_with_a_dimension_mistake_is_an_error_not_a_number(plugins, formula):
    r = through_plugin(plugins, formula)
    assert "res" not in r.values
    errs = r.errors
    assert len(errs) == 1 and errs[0].code in ("dimension-mismatch", "not-an-angle"), errs
    assert "Traceback" not in errs[0].message and "DimensionalityError" not in errs[0].message


def test_a_correct_plugin_formula_gives_its_value(plugins):
    r = through_plugin(plugins, "a/b*(1 s/(1 m)) + 1")
    assert r.ok, r.diagnostics
    assert r.values["res"].fields["v"].m_as("") == pytest.approx(2 / 3 + 1)


def test_a_plugin_formula_error_is_located_at_the_call_and_names_the_formula(plugins):
    # the formula "a + b" is the plugin's text, not the sheet's: its own line 1, column 1 mean nothing in the
    # sheet, so the error points at the call (line 3, where "probe.calc" starts) and names the formula
    r = through_plugin(plugins, "a + b")
    (err,) = r.errors
    assert err.code == "dimension-mismatch"
    assert (err.span.line, err.span.col) == (3, 7)
    assert err.message.startswith("probe.calc: in its formula v = a + b: ")
    assert "[length]" in err.message or "length" in err.message


def test_a_plugin_check_error_is_located_at_the_call(plugins):
    r = calcsheet.run('L = 2 m\n\nres = probe.check(a=L, b=L, op="<")\nt = probe.calc(a=L, b=3 s, formula="b")\n',
                      plugins=plugins)
    assert r.ok, r.diagnostics  # a check between two lengths is fine
    bad = calcsheet.run("L = 2 m\nt = 3 s\n# heading\n  x = probe.compare(a=L, b=t)\n", plugins=plugins)
    (err,) = bad.errors
    assert err.code == "dimension-mismatch"
    assert (err.span.line, err.span.col) == (4, 7)
    assert err.message.startswith("probe.compare: in its formula check a <= b: ")


def test_a_plugin_formula_error_in_an_included_file_names_that_file(plugins, tmp_path):
    (tmp_path / "part.calc").write_text('L = 2 m\nt = 3 s\nres = probe.calc(a=L, b=t, formula="a - b")\n')
    main = tmp_path / "main.calc"
    main.write_text("# Main\ninclude \"part.calc\"\n")
    r = calcsheet.run(main, plugins=plugins)
    (err,) = r.errors
    assert err.path.endswith("part.calc") and (err.span.line, err.span.col) == (3, 7), err
    assert "in its formula v = a - b" in err.message


# ---------------------------------------------------------------- the boundary of a check

BOUNDARY = [  # op, demand == capacity holds?  (a check states demand ≤ capacity, or capacity ≥ demand)
    ("<=", True), ("<", False), (">=", True), (">", False),
]


def _check(op, a, b):
    env = {"a": U.Quantity(*a), "b": U.Quantity(*b)}
    return Evaluator().evaluate_check(parse_statement(f"check a {op} b"), env)


@pytest.mark.parametrize("op, holds", BOUNDARY)
def test_demand_equal_to_capacity_passes_only_a_non_strict_check(op, holds):
    c = _check(op, (250.0, "MPa"), (250.0, "MPa"))
    assert c.ok is holds
    assert c.ratio == 1.0


@pytest.mark.parametrize("op, holds", BOUNDARY)
def test_equality_across_units_is_still_equality(op, holds):
    c = _check(op, (1.0, "m"), (1000.0, "mm"))  # 1 m and 1000 mm convert exactly
    assert c.ok is holds and c.ratio == pytest.approx(1.0)


@pytest.mark.parametrize("op, left_smaller_ok, left_larger_ok", [
    ("<=", True, False), ("<", True, False), (">=", False, True), (">", False, True),
])
def test_either_side_of_the_boundary(op, left_smaller_ok, left_larger_ok):
    assert _check(op, (249.999, "MPa"), (250.0, "MPa")).ok is left_smaller_ok
    assert _check(op, (250.001, "MPa"), (250.0, "MPa")).ok is left_larger_ok


@pytest.mark.parametrize("op", ["<=", "<"])
def test_demand_and_capacity_are_read_from_the_sides_the_operator_names(op):
    c = _check(op, (100.0, "MPa"), (250.0, "MPa"))
    assert c.demand.m_as("MPa") == 100.0 and c.capacity.m_as("MPa") == 250.0 and c.ratio == pytest.approx(0.4)
    flipped = _check({"<=": ">=", "<": ">"}[op], (250.0, "MPa"), (100.0, "MPa"))
    assert flipped.demand.m_as("MPa") == 100.0 and flipped.capacity.m_as("MPa") == 250.0
    assert flipped.ratio == pytest.approx(0.4) and flipped.ok


@pytest.mark.parametrize("op, holds", BOUNDARY)
def test_boundary_through_the_sheet_language(run, op, holds):
    r = run(f"""
        F_y = 250 MPa
        sigma = 0.5*500 MPa
        check sigma {op} F_y  -- at the limit
        check 2*F_y {'>=' if op in ('<=', '<') else '<='} 2*sigma  -- the same, stated the other way round
    """)
    assert r.ok, r.diagnostics
    assert r.checks[0].ok is holds and r.checks[0].ratio == 1.0
    assert r.checks[1].ok is True and r.checks[1].ratio == 1.0


@pytest.mark.parametrize("op, holds", BOUNDARY)
def test_boundary_through_a_plugin_check(plugins, op, holds):
    r = calcsheet.run(f'res = probe.check(a=1.5 m, b=1500 mm, op="{op}")\n', plugins=plugins)
    assert r.ok, r.diagnostics
    assert r.values["res"].fields["ok"].m_as("") == (1.0 if holds else 0.0)
    assert r.values["res"].fields["ratio"].m_as("") == pytest.approx(1.0)


@pytest.mark.parametrize("text", ["check a <= b", "check a < b", "check b >= a", "check b > a"])
def test_demand_and_capacity_are_shown_in_the_demand_s_own_unit(text):
    kNm, Nm = U.Quantity(1, "kN*m").units, U.Quantity(1, "N*m").units
    env = {"a": U.Quantity(2.0, "kN*m"), "b": U.Quantity(5000.0, "N*m")}
    c = Evaluator().evaluate_check(parse_statement(text), env, lambda k, v: {"a": kNm, "b": Nm}[k])
    assert c.demand.units == kNm and c.capacity.units == kNm
    assert c.demand.magnitude == 2.0 and c.capacity.magnitude == pytest.approx(5.0)


def test_a_ratio_is_not_formed_against_a_zero_or_negative_capacity():
    assert _check("<=", (1.0, "kN"), (0.0, "kN")).ratio is None
    with pytest.raises(CheckSignError):  # opposite signs: no utilisation, an error rather than OK
        _check("<=", (-1.0, "kN"), (5.0, "kN"))
    assert _check("<=", (0.0, "kN"), (5.0, "kN")).ratio == 0.0


def _list_check(op, a, b):
    env = {"a": U.Quantity([a[0], 1.0], a[1]), "b": U.Quantity([b[0], 5.0], b[1])}
    return Evaluator().evaluate_check(parse_statement(f"check a {op} b"), env)


@pytest.mark.parametrize("check", [_check, _list_check], ids=["one value", "a list"])
def test_a_zero_side_makes_a_sign_check_judged_by_its_comparison_with_no_ratio(check):
    # a no-uplift check (the least reaction at or above zero) is a sign check: OK/NG as written, no
    # utilisation (common practice). Zero demand against a negative capacity is simply NG; a negative
    # demand against zero capacity (a compressive or downward value held at or below zero) is OK.
    ng = check("<=", (0.0, "kN"), (-5.0, "kN"))
    assert ng.ok is False
    ok = check("<=", (-3.0, "kN"), (0.0, "kN"))
    assert ok.ok is True
    uplift = check(">=", (-2.0, "kN"), (0.0, "kN"))  # least reaction -2 kN >= 0: uplift, NG
    assert uplift.ok is False


def test_a_zero_side_check_forms_no_ratio():
    assert _check("<=", (0.0, "kN"), (-5.0, "kN")).ratio is None
    assert _check("<=", (-3.0, "kN"), (0.0, "kN")).ratio is None
    with pytest.raises(CheckSignError):  # a nonzero demand against a negative capacity is never judged
        _check("<=", (1.0, "kN"), (-5.0, "kN"))


def test_a_check_across_dimensions_is_an_error():
    with pytest.raises(DimensionError):
        _check("<=", (1.0, "m"), (1.0, "s"))


# ---------------------------------------------------------------- plugin arguments, checked by the evaluator itself

from calcsheet.errors import PluginArgumentError, Span  # noqa: E402
from calcsheet.plugin import Record  # noqa: E402

ARGS = Namespace("argprobe", version="1.0")


@ARGS.function("f", params=[Param("b", "[length]"), Param("F", "[force]"),
                            Param("pts", "[length]", kind="points"), Param("n", doc="a plain number"),
                            Param("xs", "[length]", kind="list"), Param("mode", kind="text", choices=("a", "b")),
                            Param("sec", kind="record", record="section"),
                            Param("secs", kind="list", record="section")],
               fields=[Field("v", doc="unused")], returns="ARGS.f")
def _argprobe(work, b, F, pts, n, xs, mode, sec, secs):
    return {"v": work.q(0.0, "")}


PF = ARGS.functions["f"]
AT = Span(3, 5, 3, 9)


def coerce(name, value):
    ev = Evaluator()  # the evaluator's plugin host checks each argument (no checker in front of it)
    host = getattr(ev, "host", ev)
    return host.coerce_argument(PF, PF.param(name), value, AT)


def q(v, unit):
    return U.Quantity(v, unit)


@pytest.mark.parametrize("name, value, words", [
    ("b", q(2.0, "s"), "needs length, got time"),
    ("b", "text", "got a text"),
    ("n", q(2.0, "m"), "dimensionless"),
    ("pts", q(1.0, "m"), "list of (x, y) points"),
    ("pts", ((q(1.0, "m"),),), "points written (x, y)"),
    ("pts", ((q(1.0, "m"), "x"),), "points written (x, y)"),
    ("pts", ((q(1.0, "m"), q(1.0, "s")),), "needs length, got time"),
    ("xs", (q(1.0, "m"), q(1.0, "kN")), "needs length, got force"),
    ("xs", (q(1.0, "m"), "x"), "list of quantities"),
    ("mode", "c", "must be one of"),
    ("sec", q(1.0, "m"), "needs a section record"),
    ("sec", Record(type="material", fields={}), "needs a section record"),
    ("secs", (Record(type="section", fields={}), Record(type="material", fields={})), "list of section records"),
    ("secs", (Record(type="section", fields={}), q(1.0, "m")), "list of section records"),
])
def test_a_wrong_argument_is_refused_at_its_own_span(name, value, words):
    with pytest.raises(PluginArgumentError) as info:
        coerce(name, value)
    assert words in str(info.value) and info.value.span == AT


def test_arguments_of_the_right_kind_pass_through():
    pts = ((q(0.0, "mm"), q(0.0, "mm")), (q(1.0, "m"), q(2.0, "m")))
    assert coerce("pts", pts) == pts
    assert coerce("xs", q(1.0, "m")) == (q(1.0, "m"),)  # a single value is a list of one
    assert coerce("b", q(150.0, "mm")).m_as("mm") == 150.0
    assert coerce("mode", "a") == "a"
    sec = Record(type="section", fields={})
    assert coerce("sec", sec) is sec and coerce("secs", (sec, sec)) == (sec, sec)


def test_a_bare_number_for_a_quantity_gets_a_hint_naming_the_unit():
    with pytest.raises(PluginArgumentError) as info:
        coerce("b", q(150.0, ""))
    assert info.value.hint == "give the unit, e.g. b=… mm"
    with pytest.raises(PluginArgumentError) as info:
        coerce("F", q(10.0, ""))
    assert info.value.hint == "give the value its unit"
    with pytest.raises(PluginArgumentError) as info:
        coerce("F", q(10.0, "m"))
    assert info.value.hint is None  # a unit of the wrong kind is not a missing unit


# ---------------------------------------------------------------- a definition's declared unit


def test_a_declared_unit_converts_the_value_and_sets_its_display():
    step = Evaluator().evaluate_definition(parse_statement("M [kN*m] = 2000 N*m"), {}, {})
    assert step.value.m_as("kN*m") == 2.0 and step.value.magnitude == pytest.approx(2.0)
    assert step.display_unit == U.Quantity(1, "kN*m").units


def test_a_declared_plain_number_has_no_display_unit():
    step = Evaluator().evaluate_definition(parse_statement("r [1] = 5 mm/(1 m)"), {}, {})
    assert step.value.m_as("") == pytest.approx(0.005)
    assert step.display_unit is None


def test_a_declared_unit_of_the_wrong_dimension_is_an_error():
    from calcsheet.errors import DeclaredUnitError

    with pytest.raises(DeclaredUnitError):
        Evaluator().evaluate_definition(parse_statement("M [kN*m] = 2 kN"), {}, {})


# ---------------------------------------------------------------- small numbers, zero, arity words


@pytest.mark.parametrize("op, a, b, ratio", [("<=", 0.2, 0.5, 0.4), ("<", 0.2, 0.5, 0.4), (">=", 0.5, 0.2, 0.4),
                                             ("<=", 0.0, 0.5, 0.0), ("<=", 0.9, 0.9, 1.0)])
def test_the_utilisation_of_values_below_one_is_their_ratio(op, a, b, ratio):
    # a check's utilisation is demand / capacity whatever the size of the numbers (common practice)
    c = _check(op, (a, ""), (b, ""))
    assert c.ok is (op != "<" or a < b) and c.ratio == pytest.approx(ratio)


@pytest.mark.parametrize("text, value", [("0^0.5", 0.0), ("0^1.5", 0.0), ("4^0.5", 2.0), ("(-8)^3", -512.0)])
def test_zero_to_a_positive_fractional_power_is_zero(text, value):
    assert float(ev(text).m_as("")) == value


@pytest.mark.parametrize("text, words", [("max()", "max() takes at least 1 argument, got 0"),
                                         ("sqrt(1, 2)", "sqrt() takes 1 argument, got 2")])
def test_arity_errors_say_how_many_arguments_in_words(text, words):
    with pytest.raises(CalcError) as exc:
        ev(text)
    assert words in exc.value.message
