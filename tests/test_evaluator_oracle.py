"""The evaluator against pint itself: random formulas, computed both ways.

pint (driven directly, without our parser or evaluator) is the independent
oracle for the arithmetic and the unit algebra.
"""
import math

import pytest
from hypothesis import assume, given, settings, strategies as st

import calcsheet
from calcsheet import units as U

UNITS = {"mm": "millimeter", "m": "meter", "kN": "kilonewton", "N": "newton", "MPa": "megapascal",
         "kPa": "kilopascal", "kN/m": "kilonewton / meter", "kN*m": "kilonewton * meter", "in": "inch",
         "kip": "kip", "ksi": "ksi", "s": "second"}


def pint_q(v, sym):
    reg = U.registry()
    return reg.Quantity(v, reg.Unit(UNITS[sym]))  # pint's own parser, on our trusted unit names


leaf = st.builds(lambda v, u: (f"{v} {u}", pint_q(v, u)),
                 st.floats(0.5, 500, allow_nan=False).map(lambda x: round(x, 3)), st.sampled_from(list(UNITS)))
number = st.builds(lambda v: (f"{v}", U.registry().Quantity(v)), st.integers(1, 9))


def combine(children):
    def mul(a, b):
        return f"({a[0]})*({b[0]})", a[1] * b[1]

    def div(a, b):
        if b[1].magnitude == 0:
            return mul(a, b)
        return f"({a[0]})/({b[0]})", a[1] / b[1]

    def add(a, b):
        if a[1].dimensionality != b[1].dimensionality:
            return mul(a, b)
        return f"({a[0]}) + ({b[0]})", a[1] + b[1]

    def sub(a, b):
        if a[1].dimensionality != b[1].dimensionality:
            return div(a, b)
        return f"({a[0]}) - ({b[0]})", a[1] - b[1]

    def square(a):
        return f"({a[0]})^2", a[1] ** 2

    def root(a):
        return f"sqrt(({a[0]})^2)", abs(a[1])

    op = st.sampled_from([mul, div, add, sub])
    return st.one_of(st.builds(lambda f, a, b: f(a, b), op, children, children),
                     st.builds(square, children), st.builds(root, children))


formulas = st.recursive(st.one_of(leaf, number), combine, max_leaves=8)


@settings(max_examples=150, deadline=None)
@given(formulas)
def test_random_formulas_agree_with_pint(formula):
    text, expected = formula
    assume(math.isfinite(float(expected.magnitude)) and expected.magnitude != 0)
    r = calcsheet.run(f"x = {text}\n")
    if not r.ok:
        # only a genuine zero divisor may fail (a difference that came out exactly 0)
        assert all(d.code in ("division-by-zero",) for d in r.errors), r.format_diagnostics()
        return
    got = r.values["x"]
    assert got.dimensionality == expected.dimensionality
    assert got.to(expected.units).magnitude == pytest.approx(float(expected.magnitude), rel=1e-9)
