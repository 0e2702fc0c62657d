"""The operators on two floats: the same quantities pint makes, and the same located errors, every time.

``builtins.apply_binop``, ``scale_binop`` and ``power_binop`` remember, per pair of units, that an operator's
rule passed and what pint computes for those units, and then do the arithmetic on the floats. The oracle here
is pint itself (an independent library): for every operator, pairs of units drawn from the vocabulary and
magnitudes drawn by hypothesis, the result's magnitude is the very float pint gives (not approximately), its
units container is pint's (exponents of the same type), and a mistake still raises its located error on the
second and later meetings of the same units, when the remembered path is taken.
"""
from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calcsheet import builtins as B
from calcsheet import nodes as N
from calcsheet import units as U
from calcsheet.errors import DimensionError, DivisionByZeroError, NumericError, OffsetTemperatureError
from calcsheet.errors import Span

REG = U.registry()
SPAN = Span(1, 1, 1, 9)

# units of one dimension each, written as a sheet writes them, so sums meet conversions (mm + m, psf + kPa)
FAMILIES = [
    ["mm", "m", "ft", "in", "km"],
    ["kN", "N", "kip", "lbf"],
    ["kN/m", "N/mm", "plf", "klf", "kPa*m"],
    ["MPa", "kPa", "psi", "ksi", "psf", "N/mm^2"],
    ["kN*m", "N*mm", "kip*ft", "lbf*in"],
    ["mm^3", "m^3", "in^3", "mm^2*m"],
    ["deg", "rad"],
    ["%", "permille"],
]
ALL = [u for fam in FAMILIES for u in fam]
floats = st.floats(min_value=-1e6, max_value=1e6, allow_nan=False, allow_infinity=False)


def unit(text):
    return U.build_unit(U.split_unit(text)) if text else REG.Unit("")


def q(m, text):
    return REG.Quantity(float(m), unit(text))


def node(op, left=None, right=None):
    left = left or N.Name(id="a", span=Span(1, 1, 1, 2))
    right = right or N.Name(id="b", span=Span(1, 5, 1, 6))
    return N.BINOPS[op](left=left, right=right, span=SPAN)


def same(got, want):
    """The very quantity: same class, same float, same units container with exponents of the same type."""
    assert type(got) is type(want)
    assert type(got._magnitude) is type(want._magnitude)
    assert got._magnitude == want._magnitude or (math.isnan(got._magnitude) and math.isnan(want._magnitude))
    assert got._units == want._units
    assert [(k, type(v), v) for k, v in sorted(got._units.items())] == \
        [(k, type(v), v) for k, v in sorted(want._units.items())]


PINT = {"+": lambda a, b: a + b, "-": lambda a, b: a - b, "*": lambda a, b: a * b, "/": lambda a, b: a / b}


@settings(max_examples=300, deadline=None)
@given(fam=st.sampled_from(FAMILIES), data=st.data(), x=floats, y=floats, op=st.sampled_from(["+", "-"]))
def test_a_sum_of_one_dimension_is_pints_sum_to_the_last_bit(fam, data, x, y, op):
    ua, ub = data.draw(st.sampled_from(fam)), data.draw(st.sampled_from(fam))
    a, b = q(x, ua), q(y, ub)
    for _ in range(2):  # the first meeting asks the rule and pint; the second takes the remembered path
        same(B.apply_binop(node(op), a, b), PINT[op](a, b))


@settings(max_examples=300, deadline=None)
@given(ua=st.sampled_from(ALL), ub=st.sampled_from(ALL), x=floats, y=floats, op=st.sampled_from(["*", "/"]))
def test_a_product_or_quotient_is_pints_to_the_last_bit(ua, ub, x, y, op):
    a, b = q(x, ua), q(y, ub)
    for _ in range(2):
        if op == "/" and y == 0:
            with pytest.raises(DivisionByZeroError):
                B.apply_binop(node(op), a, b)
        else:
            same(B.apply_binop(node(op), a, b), PINT[op](a, b))


@settings(max_examples=300, deadline=None)
@given(u=st.sampled_from(ALL), x=floats, k=floats, op=st.sampled_from(["*", "/"]), right=st.booleans())
def test_scaling_by_a_plain_literal_is_pints_to_the_last_bit(u, x, k, op, right):
    a = q(x, u)
    literal = N.Number(value=float(k), text=repr(float(k)), span=Span(1, 5, 1, 6))
    n = node(op, right=literal) if right else node(op, left=literal)
    want = None
    divisor = k if right else x
    if not (op == "/" and divisor == 0):
        want = (a * k if op == "*" else a / k) if right else (k * a if op == "*" else k / a)
    for _ in range(2):
        if want is None:
            with pytest.raises(DivisionByZeroError):
                B.scale_binop(n, a, float(k), literal_right=right)
        else:
            same(B.scale_binop(n, a, float(k), literal_right=right), want)


@settings(max_examples=200, deadline=None)
@given(u=st.sampled_from([u for u in ALL if u not in ("%", "permille")]), x=floats,
       p=st.sampled_from([2.0, 3.0, 0.5, -1.0, -2.0, 1 / 3, 4.0, 1.0, 0.25]))
def test_a_written_power_is_pints_to_the_last_bit(u, x, p):
    a = q(x, u)
    for _ in range(2):
        if x < 0 and not p.is_integer():
            with pytest.raises(NumericError):
                B.power_binop(node("^"), a, p)
        elif x == 0 and p < 0:
            with pytest.raises(DivisionByZeroError):
                B.power_binop(node("^"), a, p)
        else:
            try:
                want = a**p
            except OverflowError:  # pint's float power overflows: a located error here
                with pytest.raises(NumericError, match="overflows"):
                    B.power_binop(node("^"), a, p)
            else:
                same(B.power_binop(node("^"), a, p), want)


def test_a_quantity_to_the_power_one_is_itself_as_pint_gives_it():
    a = q(3.0, "m")
    assert B.power_binop(node("^"), a, 1.0) is a


@pytest.mark.parametrize("op, ua, ub", [("+", "m", "s"), ("-", "kN", "kN*m"), ("+", "deg", ""), ("-", "", "rad")])
def test_a_sum_of_two_dimensions_is_refused_every_time_not_only_the_first(op, ua, ub):
    a, b = q(1.0, ua), q(2.0, ub)
    for _ in range(3):
        with pytest.raises(DimensionError) as exc:
            B.apply_binop(node(op), a, b)
        assert exc.value.span == SPAN


def test_a_temperature_on_a_scale_is_refused_every_time_and_a_difference_of_two_is_pints():
    t1, t2 = q(20.0, "degC"), q(35.0, "degC")
    for _ in range(2):
        for op in ("+", "*", "/"):
            with pytest.raises(OffsetTemperatureError):
                B.apply_binop(node(op), t2, t1)
        with pytest.raises(OffsetTemperatureError):
            B.scale_binop(node("*"), t1, 2.0, literal_right=True)
        same(B.apply_binop(node("-"), t2, t1), t2 - t1)  # a difference: delta_degC, pint's own path


def test_a_temperature_difference_plus_kelvin_is_what_pint_gives():
    d = q(35.0, "degC") - q(20.0, "degC")  # 15 delta_degC
    k = q(2.0, "K")
    for _ in range(2):
        same(B.apply_binop(node("+"), d, k), d + k)
        same(B.apply_binop(node("+"), k, d), k + d)


def test_equal_units_written_with_exponents_of_two_types_each_keep_their_own():
    m = REG.Unit("m")
    a_int, a_float = REG.Quantity(2.0, m**2), REG.Quantity(2.0, m**2.0)
    b = q(3.0, "m")
    for _ in range(2):
        same(B.apply_binop(node("*"), a_int, b), a_int * b)
        same(B.apply_binop(node("*"), a_float, b), a_float * b)


def test_arrays_and_whole_numbers_take_pints_own_path_with_the_same_result():
    import numpy as np

    arr = REG.Quantity(np.array([1.0, 2.0]), unit("m"))
    got = B.apply_binop(node("+"), arr, q(500.0, "mm"))
    assert np.array_equal(got.magnitude, (arr + q(500.0, "mm")).magnitude) and got.units == arr.units
    whole = REG.Quantity(3, unit("m"))
    same(B.apply_binop(node("*"), whole, q(2.0, "m")), whole * q(2.0, "m"))


def test_the_memory_of_units_stays_bounded():
    for i in range(B._FAST_KEEP + 10):
        B.apply_binop(node("*"), REG.Quantity(1.0, unit("m")._units * REG.Unit("s")._units ** (i % 7 + 1)),
                      q(2.0, "m"))
    assert len(B._FAST) <= B._FAST_KEEP
