"""Display: significant figures, ×10ⁿ, preferred units per system."""
import pytest

from calcsheet import units as U
from calcsheet.display import DisplayPolicy, split_number, unit_text
from calcsheet.units import split_unit


def qty(v, unit):
    return U.registry().Quantity(v, U.build_unit(split_unit(unit)))


@pytest.mark.parametrize("x, sig, expect", [
    (22.5, 3, ("22.5", None)), (0.8, 3, ("0.800", None)), (2437, 3, ("2440", None)),
    (123456, 3, ("1.23", 5)), (1.23456e8, 3, ("1.23", 8)), (-0.00012, 3, ("-1.20", -4)),
    (9.9996, 3, ("10.0", None)), (99999, 3, ("1.00", 5)), (0, 3, ("0", None)), (3.14159, 5, ("3.1416", None)),
])
def test_significant_figures(x, sig, expect):
    assert split_number(x, sig) == expect


@pytest.mark.parametrize("value, unit, system, expect", [
    (0.22, "m", "SI", "mm"), (6.0, "m", "SI", "m"), (5000, "N", "SI", "kN"), (2.5e8, "Pa", "SI", "MPa"),
    (2e11, "Pa", "SI", "GPa"), (4000, "Pa", "SI", "kPa"), (5, "kN*m", "SI", "kN·m"), (3e-4, "m^4", "SI", "mm⁴"),
    (5, "kN/m", "SI", "kN/m"), (2, "ft", "US", "in"), (30, "ft", "US", "ft"), (50, "kip*ft", "US", "kip·ft"),
    (36, "ksi", "US", "ksi"), (40, "psf", "US", "psf"), (100, "psi", "US", "psi"), (3, "kN*m/m", "SI", "kN"),
])
def test_preferred_units(value, unit, system, expect):
    assert unit_text(DisplayPolicy(system).unit_for(qty(value, unit))) == expect


def test_unit_typesetting():
    assert unit_text(U.build_unit(split_unit("N/mm^2"))) == "N/mm²"
    assert unit_text(U.build_unit(split_unit("kN/m/s"))) == "kN/(m·s)"


def test_a_unit_prints_in_its_own_order_whatever_equal_unit_was_printed_first():
    # lbf·ft and ft·lbf are equal pint Units with one hash: the printed order must not depend on which came first
    from calcsheet import display, units as U

    reg = U.registry()
    assert display.unit_factors(reg.Unit("foot*force_pound"))[0] == (("ft", 1), ("lbf", 1))
    assert display.unit_factors(reg.Unit("force_pound*foot"))[0] == (("lbf", 1), ("ft", 1))
