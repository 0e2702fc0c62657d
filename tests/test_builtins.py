"""The built-ins table: one rule per function and operator, applied alike by `check` and by evaluation.

Values are checked against facts of mathematics (sin 30° = 1/2, atan2(1, 1) = 45°, √16 = 4), not
against the program's own output.
"""
from __future__ import annotations

import math

import pytest

from calcsheet import builtins as B
from calcsheet import units as U
from calcsheet.cli import main
from calcsheet.engine import run
from calcsheet.errors import DimensionError, OffsetTemperatureError
from calcsheet.evaluator import Evaluator
from calcsheet.parser import parse_expression
from calcsheet.render.text import TextPrinter


def errors(text, **kw):
    return [(d.span.line, d.span.col, d.code) for d in run(text, **kw).errors]


# ---------------------------------------------------------------- the three sheets of issue 9


@pytest.mark.parametrize("line, where, code, words", [
    ("x = sqrt(a, b)", 5, "type-mismatch", "sqrt() takes 1 argument, got 2"),
    ("x = atan2(a)", 5, "type-mismatch", "atan2() takes 2 arguments, got 1"),
    ("x = a^13", 7, "dimension-mismatch", "raised to the power 13"),
])
def test_check_rejects_what_build_rejects_with_a_located_diagnostic(sheet, capsys, line, where, code, words):
    text = f"a = 2 m\nb = 3 m\n{line}\n"
    p = sheet(text)
    assert main(["check", "--format", "line", str(p)]) == 1
    out = capsys.readouterr().out
    assert f"{p}:3:{where}: error {code}: " in out and words in out
    checked = run(text, evaluate=False).errors
    built = run(text).errors
    assert [(d.span.line, d.span.col, d.code) for d in checked] == [(3, where, code)]
    assert [(d.span.line, d.span.col, d.code) for d in built] == [(3, where, code)]


def test_a_plain_number_may_take_any_power_a_quantity_up_to_twelve():
    assert errors("r = 1.01\nx = r^13\n") == []
    assert errors("a = 2 m\nx = a^12\ny = x^0.5\n") == []
    assert run("a = 2 m\nx = a^12\n").values["x"].to("m^12").magnitude == pytest.approx(2**12)


@pytest.mark.parametrize("text, where", [
    ("n = 2\na = 2 m\nx = a^n\n", (3, 7)),          # a power read from a name
    ("a = 2 m\nx = a^(2 mm/1 mm)\n", (2, 7)),        # a power carrying units, even if they cancel
])
def test_a_quantity_takes_only_a_power_written_as_plain_numbers(text, where):
    assert errors(text, evaluate=False) == [(*where, "dimension-mismatch")]
    assert errors(text) == [(*where, "dimension-mismatch")]


# ---------------------------------------------------------------- arity, from the table


@pytest.mark.parametrize("name", sorted(B.FUNCTIONS))
def test_every_function_refuses_one_argument_too_many_in_check_and_in_build(name):
    fn = B.FUNCTIONS[name]
    n = (fn.max_args or fn.min_args + 2) + 1
    text = "r = 0.5\nx = " + f"{name}(" + ", ".join(["r"] * n) + ")\n"
    if fn.max_args is None:  # min and max take any number
        assert errors(text) == []
        return
    assert errors(text, evaluate=False) == [(2, 5, "type-mismatch")]
    assert errors(text) == [(2, 5, "type-mismatch")]


@pytest.mark.parametrize("name", sorted(B.FUNCTIONS))
def test_every_function_refuses_too_few_arguments(name):
    fn = B.FUNCTIONS[name]
    text = "r = 0.5\nx = " + f"{name}(" + ", ".join(["r"] * (fn.min_args - 1)) + ")\n"
    assert errors(text, evaluate=False) == [(2, 5, "type-mismatch")]
    assert errors(text) == [(2, 5, "type-mismatch")]


def test_the_resolver_knows_exactly_the_table_names():
    assert errors("x = sqr(2)\n") == [(1, 5, "unknown-function")]
    assert "did you mean 'sqrt'?" in run("x = sqr(2)\n").errors[0].hint
    assert errors("pi = 3\n") == [(1, 1, "redefinition")]
    assert errors("atan2 = 3\n") == [(1, 1, "redefinition")]


# ---------------------------------------------------------------- values (mathematical facts)


@pytest.mark.parametrize("expr, value, unit", [
    ("sin(30 deg)", 0.5, ""),
    ("cos(60 deg)", 0.5, ""),
    ("tan(45 deg)", 1.0, ""),
    ("asin(0.5)", 30.0, "deg"),
    ("acos(0.5)", 60.0, "deg"),
    ("atan(1)", 45.0, "deg"),
    ("atan2(1 m, 1 m)", 45.0, "deg"),
    ("atan2(-1 m, 0 m)", -90.0, "deg"),
    ("sqrt(16 m^2)", 4.0, "m"),
    ("abs(-3 kN)", 3.0, "kN"),
    ("min(2 m, 1500 mm, 3 m)", 1.5, "m"),
    ("max(2 m, 1500 mm, 3 m)", 3.0, "m"),
    ("exp(0)", 1.0, ""),
    ("ln(1)", 0.0, ""),
    ("log10(1000)", 3.0, ""),
    ("ceil(2.1)", 3.0, ""),
    ("floor(2.9)", 2.0, ""),
    ("if(1 m <= 2 m, 5 kN, 6 kN)", 5.0, "kN"),
    ("if(3 m <= 2 m, 5 kN, 6 kN)", 6.0, "kN"),
    ("pi", math.pi, ""),  # common practice
])
def test_functions_compute_known_values(expr, value, unit):
    out = Evaluator().eval(parse_expression(expr), {})
    assert out.to(U.registry().Unit(unit)).magnitude == pytest.approx(value, abs=1e-12)


@pytest.mark.parametrize("expr, dim", [
    ("sqrt(16 m^2)", (("[length]", 1),)),
    ("sqrt(4 m)", (("[length]", 0.5),)),
    ("asin(0.5)", U.ANGLE),
    ("atan2(1 kN, 2 kN)", U.ANGLE),
    ("sin(30 deg)", U.DIMENSIONLESS),
    ("min(1 m, 2 m)", (("[length]", 1),)),
])
def test_the_rule_gives_the_dimension_the_implementation_returns(expr, dim):
    node = parse_expression(expr)
    fn = B.FUNCTIONS[node.func]
    args = [Evaluator().eval(a, {}) for a in node.args]
    assert fn.rule([B.arg_of(a) for a in args], node.args, node).dim == dim
    assert U.dim_of(fn.impl(args, node)) == dim


def test_every_table_entry_is_complete():
    for name, fn in B.FUNCTIONS.items():
        assert fn.name == name and fn.doc and fn.print_form in ("call", "sqrt", "abs", "cases")
        assert fn.lazy or (fn.rule is not None and fn.impl is not None), name
        assert fn.max_args is None or fn.max_args >= fn.min_args >= 1


# ---------------------------------------------------------------- the evaluator keeps the rules on its own


def test_an_angle_plus_a_bare_number_is_a_dimension_error_in_the_evaluator():
    # pint alone gives 30 deg + 1 = 87.3 deg (radians are plain numbers)
    with pytest.raises(DimensionError) as exc:
        Evaluator().eval(parse_expression("30 deg + 1"), {})
    span = exc.value.span  # the whole sum (parse_expression's columns start after its own "x = ")
    assert span is not None and span.end_col - span.col == len("30 deg + 1")


def test_adding_a_time_to_a_length_is_a_located_dimension_error_not_a_pint_error():
    with pytest.raises(DimensionError) as exc:
        Evaluator().eval(parse_expression("1 + (2 m + 3 s)"), {})
    whole = parse_expression("1 + (2 m + 3 s)").span
    assert (exc.value.span.col - whole.col, exc.value.span.end_col - whole.col) == (5, 14)  # just "2 m + 3 s"
    assert "cannot add time to length" in exc.value.message


def test_offset_temperatures_are_refused_by_the_evaluator_too():
    env = {"T": U.Quantity(20, "degC")}
    for formula in ("T*2", "T + T", "sqrt(T)", "T^2"):
        with pytest.raises(OffsetTemperatureError):
            Evaluator().eval(parse_expression(formula), env)
    assert Evaluator().eval(parse_expression("(T + 0 K) - T"), {"T": U.Quantity(300, "K")}).magnitude == 0


def test_if_refuses_branches_of_two_dimensions_even_when_the_other_is_not_taken():
    # the branch not taken is never evaluated (it may be sqrt of a negative), but its dimension counts
    ev = Evaluator()
    env = {"x": U.Quantity(-4, "m^2")}
    assert ev.eval(parse_expression("if(x < 0 m^2, 0 m, sqrt(x))"), env).magnitude == 0
    with pytest.raises(DimensionError):
        ev.eval(parse_expression("if(x < 0 m^2, 0 s, sqrt(x))"), env)


def test_a_plugin_formula_meets_the_same_rules(run):
    from calcsheet.plugin import Field, Namespace, Param, PluginRegistry

    ns = Namespace("tb", version="1")

    @ns.function("bad", params=[Param("a", "[angle]")], fields=[Field("y")], returns="ns.bad")
    def bad(work, a):
        work.calc("y", "a + 1")
        return {"y": work["y"]}

    reg = PluginRegistry(blocked=set())
    reg.register(ns)
    r = run("p = tb.bad(a=30 deg)\n", plugins=reg)
    assert [(d.span.line, d.code) for d in r.errors] == [(1, "dimension-mismatch")]


# ---------------------------------------------------------------- printers read the print form


def test_printers_show_each_function_by_its_print_form():
    p = TextPrinter()
    assert p.expr(parse_expression("sqrt(A)")) == "√(A)"
    assert p.expr(parse_expression("abs(M)")) == "|M|"
    assert p.expr(parse_expression("if(a <= b, c, d)")) == "(c if a ≤ b, else d)"
    assert p.expr(parse_expression("atan2(y, x)")) == "atan2(y, x)"
    assert p.expr(parse_expression("sqrt(a, b)")) == "sqrt(a, b)"  # not its arity: shown as written


# ---------------------------------------------------------------- constant folding is one folder


def test_the_folder_uses_the_operator_rules():
    assert B.fold(parse_expression("2 m * 3")).to("m").magnitude == pytest.approx(6)
    assert B.fold(parse_expression("x + 1"), lambda n: None) is None
    with pytest.raises(DimensionError):
        B.fold(parse_expression("30 deg + 1"))
    assert B.written_power(parse_expression("(1/3)")) == pytest.approx(1 / 3)
    assert B.written_power(parse_expression("n")) is None
    assert B.written_power(parse_expression("2 mm/1 m")) is None


# ---------------------------------------------------------------- adding a built-in touches one table


def test_a_new_table_entry_is_known_to_resolver_checker_evaluator_and_printers(monkeypatch):
    # the worked example of DEVELOPERS.md, "How to add a built-in"
    def rule(args, nodes, node):
        B._no_offset("hypot", args, nodes)
        return B._same_dims("hypot", args, nodes)

    def impl(args, node):
        a, b = args
        return B._q(math.hypot(a.magnitude, b.to(a.units).magnitude), "") * a.units

    monkeypatch.setitem(B.FUNCTIONS, "hypot", B._fn("hypot", 2, rule, impl, "hypotenuse"))
    r = run("a = 3 m\nb = 4000 mm\nc = hypot(a, b)\n")
    assert r.ok and r.values["c"].to("m").magnitude == pytest.approx(5.0)  # 3-4-5 triangle
    assert errors("a = 3 m\nc = hypot(a)\n", evaluate=False) == [(2, 5, "type-mismatch")]
    assert errors("a = 3 m\nc = hypot(a, 2 s)\n", evaluate=False) == [(2, 14, "dimension-mismatch")]
    assert errors("a = 3 m\nc = hypot(a, 2 s)\n") == [(2, 14, "dimension-mismatch")]
    assert TextPrinter().expr(parse_expression("hypot(a, b)")) == "hypot(a, b)"
    assert errors("hypot = 2 m\n") == [(1, 1, "redefinition")]


def test_the_readme_lists_exactly_the_functions_of_the_table():
    import re
    from pathlib import Path

    text = (Path(__file__).parents[1] / "README.md").read_text(encoding="utf-8")
    listed = re.search(r"functions `([^`]*)`", text.replace("\n  ", " ")).group(1).split()
    assert sorted(listed) == sorted(n for n in B.FUNCTIONS if n != "if")  # if() has its own paragraph
    assert "`pi`" in text and set(B.CONSTANTS) == {"pi"}
