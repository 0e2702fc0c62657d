"""One finiteness rule: no literal, operand, intermediate or check side is infinite or NaN; a literal
that underflows to zero is an error; a check is OK only between finite sides (issue 16, part 2).

IEEE 754 binary64 (common practice): the largest finite double is about 1.7977e308 and the smallest
positive subnormal 4.9e-324, so 1e999 overflows to inf and 1e-999 underflows to 0.
"""
from __future__ import annotations

import math

import pytest

import calcsheet

assert math.isinf(float("1e999")) and float("1e-999") == 0.0 and float("5e-324") > 0  # the facts used


def codes(r):
    return [(d.code, d.span.line) for d in r.errors]


@pytest.mark.parametrize("sheet", [
    "check 1e999 <= 1e999\n",
    "x = 2 m\ncheck x <= 1e999 m\n",
    "check -1e999 <= 0\n",
    "x = 2\ncheck max(x, 1e999) <= 1e999\n",
    "x = 2\ncheck abs(-1e999) <= x\n",
    "x = 2\ncheck if(x <= 1, 1e999, 2e999) >= x\n",
    "cap = 1e999 m\n",
])
def test_an_infinite_literal_is_an_error_wherever_it_is_written(sheet):
    for evaluate in (False, True):  # `check` reports it as `build` does
        r = calcsheet.run(sheet, evaluate=evaluate)
        assert not r.ok and all(d.code == "not-finite" for d in r.errors), r.format_diagnostics()
        assert "too large" in r.errors[0].message and r.errors[0].span.col > 1
    assert not calcsheet.run(sheet).checks  # so no check can be OK, and no summary says "satisfied"


@pytest.mark.parametrize("text", ["1e-999", "0.5e-400 m", "-3e-330"])
def test_a_literal_that_underflows_to_zero_is_a_located_error(text):
    r = calcsheet.run(f"x = 1\ny = {text}\n", evaluate=False)
    assert codes(r) == [("not-finite", 2)] and "too small" in r.errors[0].message
    assert r.errors[0].span.col == 5 + text.startswith("-")  # a minus sign is an operator, not the literal


@pytest.mark.parametrize("text", ["0", "0.0", "0e5", "0e-999", "5e-324", "1e308"])
def test_zero_and_the_extreme_finite_literals_are_accepted(text):
    r = calcsheet.run(f"y = {text}\n")
    assert r.ok, r.format_diagnostics()
    assert r.steps["y"].value.magnitude == float(text)


@pytest.mark.parametrize("sheet, line", [
    ("a = 1e300 m\nb = a * 1e300\ncheck b <= 1 m\n", 2),
    ("a = 1e200\nb = a^2\n", 2),
    ("a = 1e200 m\nb = a^2\n", 2),  # a quantity with units: its float power overflows too
    ("a = 1e-200 m\nb = a^-2\n", 2),
    ("a = 1e200 m\nb = a^(1+1)\n", 2),
    ("a = 1e300\nb = exp(a)\n", 2),
    ("a = 1e300\nb = -a * 1e10\n", 2),
    ("a = 1e300\nc = ceil(a * 1e300)\n", 2),
    ("a = 1e300\nc = floor(-a * 1e300)\n", 2),
    ("a = 1e308\nb = a + a\ncheck b >= 0\n", 2),
])
def test_an_intermediate_that_overflows_is_a_located_error_not_a_traceback(sheet, line):
    r = calcsheet.run(sheet)
    assert codes(r)[:1] == [("not-finite", line)], r.format_diagnostics()
    assert all(c.ok is not True for c in r.checks)


def test_a_check_whose_ratio_overflows_is_an_error_not_ok():
    r = calcsheet.run("d = 1e300 m\nc = 1e-300 m\ncheck d <= c * 1e305\n")
    assert r.ok  # finite sides, ratio formed: demand 1e300 m vs capacity 1e5 m -> NG, a real verdict
    assert r.checks[0].ok is False and math.isfinite(r.checks[0].ratio)
    r = calcsheet.run("d = 1e300 m\nc = 1e-300 m\ncheck c <= d\n")
    assert r.checks[0].ok and r.checks[0].ratio == 0.0  # 1e-600 underflows: a negligible demand is harmless
    r = calcsheet.run("d = 1e300 m\nc = 1e-300 m\ncheck d <= c\n")
    assert codes(r) == [("not-finite", 3)] and not r.checks


def test_every_check_reported_ok_has_finite_sides_and_ratio():
    r = calcsheet.run("a = 2 m\nb = 3 m\ncheck a <= b\ncheck -a <= b\n")
    for c in r.checks:
        assert math.isfinite(c.demand.magnitude) and math.isfinite(c.capacity.magnitude)
        assert c.ratio is None or math.isfinite(c.ratio)


def test_an_override_that_overflows_is_refused_at_the_override():
    r = calcsheet.run("x = 2\ny = ceil(x)\n", overrides={"x": "1e999"})
    assert [d.code for d in r.errors] == ["override"] and "too large" in r.errors[0].message
