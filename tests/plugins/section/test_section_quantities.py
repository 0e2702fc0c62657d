"""The section working's quantities are pint's own: ``report._q`` builds the very object pint's constructor
builds from a float and a unit (same class, magnitude, units), which then behaves as pint's in arithmetic,
conversion and comparison."""
import math

import pytest

from calcsheet import units as U
from calcsheet_plugins.section.report import _q, unit


@pytest.mark.parametrize("value, text", [(1.5, "mm"), (-2e-14, "mm^4"), (0, "mm^2"), (3, "kg/m"), (45.0, "deg"),
                                         (7.25, "mm^6"), (1e300, "mm^3"), (2, "")])
def test_a_working_quantity_is_the_one_pint_builds(value, text):
    reg = U.registry()
    ours, pints = _q(value, text), reg.Quantity(float(value), unit(text))
    assert type(ours) is type(pints)
    assert vars(ours) == vars(pints)
    assert type(ours.magnitude) is float and ours.units == pints.units
    assert ours == pints and (ours * 2 - pints) == pints
    if text == "mm":
        assert ours.to("m").magnitude == pytest.approx(value / 1000)  # 1 mm = 0.001 m (SI)
    if text == "deg":
        assert math.isclose(ours.m_as("radian"), math.radians(value))


def test_each_quantity_is_its_own_object():
    a, b = _q(1.0, "mm"), _q(1.0, "mm")
    assert a is not b and a == b
