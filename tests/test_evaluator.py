"""The evaluator on its own: one statement step for the full run and the rebuild, and the plugin host."""
from __future__ import annotations

import pytest

from calcsheet import units as U
from calcsheet.errors import PluginArgumentError, PluginInputError
from calcsheet.evaluator import Evaluator, evaluate_statement
from calcsheet.parser import parse_expression, parse_statement
from calcsheet.plugin import Field, Namespace, Param, PluginRegistry


def test_a_definition_binds_its_value_in_the_unit_it_is_shown_in():
    ev, env, display = Evaluator(), {}, {}
    step = evaluate_statement(ev, parse_statement("L [mm] = 2.5 m"), env, display, inputs={"L"})
    assert (step.name, step.is_input, step.anchor) == ("L", True, "v-L")
    assert env["L"].units == U.registry().Unit("mm") and env["L"].magnitude == pytest.approx(2500)
    assert display["L"] == U.registry().Unit("mm")


def test_an_override_replaces_the_value_and_keeps_the_sheets_own():
    ev, env, display, applied = Evaluator(), {}, {}, {}
    step = evaluate_statement(ev, parse_statement("L = 6 m"), env, display,
                              overrides={"L": parse_expression("7.5 m")}, applied=applied)
    assert step.value.to("m").magnitude == pytest.approx(7.5)
    assert step.overridden.to("m").magnitude == pytest.approx(6)
    assert list(applied) == ["L"] and env["L"] is step.value


def test_a_check_gives_its_utilisation():
    ev = Evaluator()
    env = {"M": U.Quantity(20, "kN*m")}
    c = evaluate_statement(ev, parse_statement("check M <= 25 kN*m"), env, {})
    assert c.ok and c.ratio == pytest.approx(0.8)


def test_a_copied_celsius_temperature_keeps_its_scale():
    ev, env = Evaluator(), {"T": U.Quantity(20, "degC")}
    step = evaluate_statement(ev, parse_statement("T_2 = T"), env, {})
    assert step.value.units == U.registry().Unit("degC")


# ---------------------------------------------------------------- the plugin host

ns = Namespace("ev1")


@ns.function("f", params=[Param("xs", "[length]", kind="list"), Param("pts", "[length]", kind="points"),
                          Param("mode", kind="text", choices=("a", "b"), default="a")],
             fields=[Field("n")], returns="ns.f")
def f(work, xs, pts, mode="a"):
    return {"n": work.q(len(xs) + len(pts), "")}


@ns.function("leaky", fields=[Field("n")], returns="ns.leaky")
def leaky(work):
    return {"n": work.q(1, ""), "extra": work.q(2, "")}


REG = PluginRegistry(blocked=set())
REG.register(ns)


def call(text, env=None):
    return Evaluator(plugins=REG).eval(parse_expression(text), env or {})


def test_the_host_coerces_lists_and_points_and_checks_each_item():
    rec = call("ev1.f(xs=[1 m, 2 m], pts=[(0 m, 0 m), (1 m, 0 m), (0 m, 1 m)])")
    assert rec.get("n").magnitude == 5
    assert call("ev1.f(xs=1 m, pts=[(0 m, 0 m)])").get("n").magnitude == 2  # one item may stand for a list
    with pytest.raises(PluginArgumentError, match="'xs' needs length, got time"):
        call("ev1.f(xs=[1 m, 2 s], pts=[(0 m, 0 m)])")
    with pytest.raises(PluginArgumentError, match="points written"):
        call("ev1.f(xs=[1 m], pts=[1 m])")
    with pytest.raises(PluginArgumentError, match='must be one of "a", "b"') as exc:
        call('ev1.f(xs=[1 m], pts=[(0 m, 0 m)], mode="c")')
    assert exc.value.span is not None


def test_a_field_the_plugin_did_not_declare_is_a_plugin_bug_not_a_crash():
    with pytest.raises(PluginInputError, match="undeclared field 'extra'"):
        call("ev1.leaky()")


def test_a_check_of_opposite_signs_is_an_error_at_its_line_never_ok():
    import calcsheet

    r = calcsheet.run("N = -116 kN\nA = 1500 mm^2\nsigma = N/A\ncheck sigma <= 275 MPa\n")
    (d,) = [d for d in r.diagnostics if d.code == "check-sign"]
    assert d.severity == "error" and d.span.line == 4
    assert "abs(sigma)" in d.hint and "compression" in d.hint
    fixed = calcsheet.run("N = -116 kN\nA = 1500 mm^2\nsigma = N/A\ncheck abs(sigma) <= 275 MPa\n")
    assert fixed.ok and fixed.checks[0].ratio == pytest.approx(116e3 / 1500 / 275)  # |N|/A/f: arithmetic


def test_a_check_against_zero_is_still_a_plain_comparison():
    import calcsheet

    assert calcsheet.run("R = 3 kN\ncheck R >= 0 kN\n").ok  # a sign check: no ratio, no error
