"""calcsheet.units: the words a dimension is described in, dimension arithmetic, and the registry's refusal of
°C/°F arithmetic.

Dimensional analysis (common practice): a product's dimension has the sum of the factors' exponents, a power
multiplies them; a dimension with no everyday name is written as its base dimensions with their exponents.
"""
import subprocess
import sys

import pint
import pytest

from calcsheet import units as U

L, M, T, TH, A = "[length]", "[mass]", "[time]", "[temperature]", "[angle]"


@pytest.mark.parametrize("dim, words", [
    (((A, 1),), "angle"), (((L, 1),), "length"), (((M, 1),), "mass"), (((T, 1),), "time"),
    (((TH, 1),), "temperature"), (((L, 2),), "area"),
    # the squares of the base dimensions have no everyday name: written with their exponent
    (((A, 2),), "angle^2"), (((M, 2),), "mass^2"), (((T, 2),), "time^2"), (((TH, 2),), "temperature^2"),
    (((L, 5),), "length^5"),
    # several base dimensions: a dot between them, each exponent other than 1 written
    (((L, 1), (T, 1)), "length·time"),
    (((M, 2), (T, -1)), "mass^2·time^-1"),
    (((L, 0.5),), "length^0.5"),
    ((), "dimensionless"),
])
def test_a_dimension_is_described_by_its_name_or_by_its_base_dimensions_and_exponents(dim, words):
    assert U.describe_dim(dim) == words


def test_a_products_dimension_adds_the_exponents_and_a_quotients_subtracts_them():
    length, time = ((L, 1),), ((T, 1),)
    assert U.dim_mul(length, length) == ((L, 2),)  # m·m = m²
    assert U.dim_mul(length, time, -1) == ((L, 1), (T, -1))  # m/s
    assert U.dim_mul(length, length, -1) == ()  # m/m: the exponent 0 is dropped, a plain number
    assert U.dim_pow(((L, 2),), 0.5) == ((L, 1.0),)  # √(m²) = m


def test_the_registry_never_turns_a_celsius_temperature_into_kelvin_inside_arithmetic():
    # 2 × 20 °C is neither 40 °C nor 2 × 293.15 K of anything: pint must refuse, not convert silently
    q = U.Quantity(20, "degC")
    with pytest.raises(pint.errors.OffsetUnitCalculusError):
        q * 2
    with pytest.raises(pint.errors.OffsetUnitCalculusError):
        q * U.Quantity(1, "m")


def test_the_registry_made_without_its_cache_refuses_celsius_arithmetic_too():
    # an unwritable cache folder makes registry() build a plain registry instead: the same rule must hold.
    # In a fresh interpreter, so this session's registry is not replaced.
    code = """
import pint
real = pint.UnitRegistry
def no_cache(*args, **kw):
    if "cache_folder" in kw:
        raise OSError("cache folder not writable")
    return real(*args, **kw)
pint.UnitRegistry = no_cache
from calcsheet import units as U
q = U.Quantity(20, "degC")
try:
    q * 2
except pint.errors.OffsetUnitCalculusError:
    print("refused")
"""
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, timeout=120)
    assert out.stdout.strip() == "refused", out.stderr[-2000:]
