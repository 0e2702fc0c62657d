"""calcsheet.checker: static dimension inference — sound, complete in one run, quiet downstream."""
from __future__ import annotations

import textwrap

from hypothesis import given, settings
from hypothesis import strategies as st

import calcsheet
from calcsheet import units as U
from calcsheet.checker import ANY, Checker
from calcsheet.parser import parse_sheet
from calcsheet.plugin import default_registry
from calcsheet.resolver import resolve


def check(text: str):
    return calcsheet.run(textwrap.dedent(text).lstrip("\n"), evaluate=False)


def types(text: str) -> dict:
    sheet, _ = parse_sheet(textwrap.dedent(text).lstrip("\n"))
    reg = default_registry()
    checker = Checker(reg)
    checker.check_sheet(sheet, resolve(sheet, reg))
    return checker.types


def codes(result):
    return [(d.span.line, d.code) for d in result.diagnostics if not d.suppressed]


def test_types_come_from_literals_declared_units_and_plugin_fields():
    t = types("""
        b = 100 mm
        r = section.rectangle(b=b, h=200 mm)
        I = r.I_x
        S [cm^3] = I/(100 mm)
        theta = atan(1)
        """)
    assert U.describe_dim(t["b"].dim) == "length"
    assert t["r"].kind == "record" and t["r"].record_type == "section"
    assert t["I"].dim == (("[length]", 4),)
    assert t["S"].dim == (("[length]", 3),)
    assert t["theta"].dim == U.ANGLE


def test_every_independent_error_is_reported_in_line_order():
    r = check("""
        a = 1 m + 1 kN
        b = sin(2)
        c [kN] = 3 m
        d = section.rectangle(b=1, h=1 mm)
        e = 5 kNm
        """)
    assert codes(r) == [(1, "dimension-mismatch"), (2, "not-an-angle"), (3, "declared-unit-mismatch"),
                        (4, "plugin-argument"), (5, "unknown-unit")]


def test_a_broken_value_is_reported_once_and_its_dependents_stay_quiet():
    text = """
        P = 10 kN
        M [kN*m] = P
        sigma = M/(1e5 mm^3)
        u = sigma/(250 MPa)
        check u <= 1
        check sigma <= 250 MPa
        """
    r = check(text)
    assert codes(r) == [(2, "declared-unit-mismatch")]
    assert types(text)["sigma"] is ANY and types(text)["u"] is ANY


def test_a_declared_unit_keeps_dependents_typed_even_when_its_expression_is_broken():
    # the declared [kN*m] is what downstream lines see, so their own mistakes are still found
    r = check("""
        M [kN*m] = undefined_thing*2
        sigma [MPa] = M
        """)
    assert codes(r) == [(1, "undefined-name")]


def test_the_hint_says_which_operand_carried_which_dimension():
    (d,) = check("q = 2 kPa\nb = 3 m\nw [kN/m] = q + b\n").errors
    assert "left: q is pressure" in d.hint and "right: b is length" in d.hint


def test_offset_temperatures_may_be_stored_compared_and_differenced_only():
    ok = check("""
        T_1 = 20 degC
        T_2 = 45 degC
        dT = T_2 - T_1
        k = 1.2e-5 K^-1
        e = k*dT
        check T_2 <= 50 degC
        check e <= 1
        """)
    assert codes(ok) == []
    assert codes(check("T = 20 degC\nx = T*2\n")) == [(2, "offset-temperature")]
    assert codes(check("T = 20 degC\nx = T + 5 K\n")) == [(2, "offset-temperature")]
    assert codes(check("T = 20 degC\nx = sqrt(T)\n")) == [(2, "offset-temperature")]


def test_an_exponent_must_be_a_plain_number_written_in_the_sheet():
    assert codes(check("L = 2 m\nn = 3\nx = L^n\n")) == [(3, "dimension-mismatch")]
    assert codes(check("L = 2 m\nx = L^(1 m)\n")) == [(2, "dimension-mismatch")]
    assert codes(check("L = 2 m\nx = L^(1/2)\ncheck x*x <= 3 m\n")) == []


def test_a_unit_name_that_is_also_a_variable_warns_once_per_literal():
    r = check("h = 2.4 m\nt_w = 0.5 h\ncheck t_w <= 1 h\ncheck h <= 3 m\n")
    assert codes(r) == [(2, "unit-shadows-variable"), (3, "unit-shadows-variable")]


@settings(max_examples=40, deadline=None)
@given(st.lists(st.tuples(st.sampled_from(["mm", "m", "kN", "kPa", "s", "kg", "deg", "N", "MPa"]),
                          st.sampled_from(["*", "/"])), min_size=1, max_size=6))
def test_the_inferred_dimension_is_the_evaluated_one(factors):
    """Soundness: for any product/quotient of quantities the static type equals what pint computes."""
    text = "x = 1" + "".join(f" {op} (2 {unit})" for unit, op in factors) + "\n"
    static = types(text)["x"]
    evaluated = calcsheet.run(text)
    assert evaluated.ok, evaluated.format_diagnostics()
    assert U.without_angle(static.dim) == U.without_angle(U.dim_of(evaluated.values["x"]))
