"""How values are shown: preferred units per dimension, significant figures.

Printers ask this module which unit a value is shown in and how its number
is written; they only decide the markup.
"""
from __future__ import annotations

import math
from decimal import ROUND_HALF_UP, Decimal
from dataclasses import dataclass
from functools import lru_cache

import pint

from . import units as U

F = (("[length]", 1), ("[mass]", 1), ("[time]", -2))  # force


@dataclass(frozen=True)
class DisplayPolicy:
    system: str = "SI"  # "SI" | "US"
    sigfigs: int = 3

    def unit_for(self, value) -> pint.Unit | None:
        """The preferred unit for a computed value with no declared unit."""
        if not isinstance(value, pint.Quantity):
            return None
        return preferred_unit(U.dim_of(value), self.system, _magnitude_hint(value))


def _magnitude_hint(q: pint.Quantity) -> float | None:
    """The size of a value in SI base units, to pick mm or m, kPa or MPa."""
    try:
        m = q.magnitude
        m = abs(float(m)) if not hasattr(m, "__len__") else float(abs(m).max())
        return m * _base_factor(q.units)
    except Exception:
        return None


@lru_cache(maxsize=4096)
def _base_factor(unit: pint.Unit) -> float:
    return float(U.registry().Quantity(1.0, unit).to_base_units().magnitude)


def _u(text: str) -> pint.Unit:
    return _unit_cache(text)


@lru_cache(maxsize=None)
def _unit_cache(text: str) -> pint.Unit:
    from .units import split_unit

    return U.build_unit(split_unit(text))


# For each dimension: a list of (upper bound in SI base units, unit), first match wins.
_SI = {
    (("[length]", 1),): [(1.0, "mm"), (math.inf, "m")],
    (("[length]", 2),): [(1.0, "mm^2"), (math.inf, "m^2")],
    (("[length]", 3),): [(1.0, "mm^3"), (math.inf, "m^3")],
    (("[length]", 4),): [(1.0, "mm^4"), (math.inf, "m^4")],
    (("[length]", 6),): [(math.inf, "mm^6")],
    F: [(1e6, "kN"), (math.inf, "MN")],
    (("[mass]", 1), ("[time]", -2)): [(math.inf, "kN/m")],
    (("[length]", -1), ("[mass]", 1), ("[time]", -2)): [(1e5, "kPa"), (1e10, "MPa"), (math.inf, "GPa")],
    (("[length]", 2), ("[mass]", 1), ("[time]", -2)): [(math.inf, "kN*m")],
    (("[length]", -2), ("[mass]", 1), ("[time]", -2)): [(math.inf, "kN/m^3")],
    (("[length]", 1), ("[mass]", 1), ("[time]", -2), ("[angle]", -1)): [(math.inf, "kN*m/rad")],
    (("[mass]", 1),): [(math.inf, "kg")],
    (("[length]", -1), ("[mass]", 1)): [(math.inf, "kg/m")],
    (("[length]", -3), ("[mass]", 1)): [(math.inf, "kg/m^3")],
    (("[time]", 1),): [(math.inf, "s")],
    (("[time]", -1),): [(math.inf, "Hz")],
    (("[angle]", 1),): [(math.inf, "deg")],
    (("[temperature]", 1),): [(math.inf, "K")],
}
_US = {
    (("[length]", 1),): [(3.048, "in"), (math.inf, "ft")],  # below 10 ft in inches
    (("[length]", 2),): [(0.9290304, "in^2"), (math.inf, "ft^2")],
    (("[length]", 3),): [(math.inf, "in^3")],
    (("[length]", 4),): [(math.inf, "in^4")],
    (("[length]", 6),): [(math.inf, "in^6")],
    F: [(math.inf, "kip")],
    (("[mass]", 1), ("[time]", -2)): [(math.inf, "kip/ft")],
    (("[length]", -1), ("[mass]", 1), ("[time]", -2)): [(6894.757 * 0.5, "psf"), (6.894757e6, "psi"),
                                                        (math.inf, "ksi")],
    (("[length]", 2), ("[mass]", 1), ("[time]", -2)): [(math.inf, "kip*ft")],
    (("[length]", -2), ("[mass]", 1), ("[time]", -2)): [(math.inf, "pcf")],
    (("[mass]", 1),): [(math.inf, "lbm")],
    (("[length]", -1), ("[mass]", 1)): [(math.inf, "lbm/ft")],
    (("[length]", -3), ("[mass]", 1)): [(math.inf, "lbm/ft^3")],
    (("[time]", 1),): [(math.inf, "s")],
    (("[time]", -1),): [(math.inf, "Hz")],
    (("[angle]", 1),): [(math.inf, "deg")],
    (("[temperature]", 1),): [(math.inf, "K")],
}


def preferred_unit(dim: U.Dim, system: str = "SI", magnitude_si: float | None = None) -> pint.Unit | None:
    """The unit an engineer expects for this dimension and size; None for dimensionless."""
    if dim == U.DIMENSIONLESS:
        return None
    table = _US if system.upper() == "US" else _SI
    bands = table.get(dim)
    if bands:
        m = magnitude_si if magnitude_si is not None else 0.0
        for bound, unit in bands:
            if m < bound:
                return _u(unit)
        return _u(bands[-1][1])
    # Fallback: any force^a * length^b (moment per length, stiffness, flexural rigidity...)
    d = dict(dim)
    if set(d) <= {"[length]", "[mass]", "[time]"} and math.isclose(d.get("[time]", 0), -2 * d.get("[mass]", 0)):
        a = d.get("[mass]", 0)
        b = d.get("[length]", 0) - a
        force, length = ("kip", "in") if system.upper() == "US" else ("kN", "m")
        unit = _u(force) ** a if a else None
        if b:
            lu = _u(length) ** b
            unit = lu if unit is None else unit * lu
        return unit
    return None


def shown(value: pint.Quantity, unit: pint.Unit | None = None) -> pint.Quantity:
    """The quantity as printed: in ``unit`` when given and compatible; a plain
    ratio such as mm/m reduced (angles and percentages keep their unit)."""
    if unit is not None:
        try:
            return value.to(unit)
        except pint.DimensionalityError:
            return value
    units = value.units._units
    if value.dimensionless and units and not any(
            n in ("radian", "degree", "percent", "permille", "milliradian") for n in units):
        return value.to_reduced_units()
    return value


# ------------------------------------------------------------------ numbers


def _round_sig(x: float, sigfigs: int) -> float:
    """``x`` to ``sigfigs`` figures, a half rounded up as on paper, after float noise is dropped at 12
    figures (19.2499999999996 from a unit conversion is 19.25, shown 19.3 at three figures)."""
    d = Decimal(f"{x:.12g}")
    if d == 0:
        return 0.0
    return float(d.quantize(Decimal(1).scaleb(d.adjusted() - sigfigs + 1), rounding=ROUND_HALF_UP))


def split_number(x: float, sigfigs: int = 3) -> tuple[str, int | None]:
    """Mantissa text and power of ten (None when written plainly).

    Values from 0.001 up to below 100 000 are written plainly (2437 -> 2440 at
    three figures); others as ×10ⁿ.
    """
    if x == 0:
        return "0", None
    if not math.isfinite(x):
        return str(x), None
    sigfigs = max(1, int(sigfigs))
    x = _round_sig(x, sigfigs)  # round to the significant figures first
    exp = math.floor(math.log10(abs(x)))
    if 1e-3 <= abs(x) < 1e5:
        return f"{x:.{max(0, sigfigs - 1 - exp)}f}", None
    return f"{x / 10**exp:.{sigfigs - 1}f}", exp


def plain_number(x: float, sigfigs: int = 3) -> str:
    """A number for machine-friendly text: '1.23e5'."""
    text, exp = split_number(x, sigfigs)
    return text if exp is None else f"{text}e{exp}"


# ------------------------------------------------------------------ units


def unit_factors(unit: pint.Unit) -> tuple[tuple[tuple[str, float], ...], tuple[tuple[str, float], ...]]:
    """Numerator and denominator (symbol, exponent) pairs, as a reviewer writes them."""
    # cached on the ordered factors: lbf·ft and ft·lbf are equal pint Units with one hash, so a cache keyed on
    # the Unit would print whichever order it met first
    return _unit_factors(tuple(unit._units.items()))


@lru_cache(maxsize=2048)
def _unit_factors(items: tuple) -> tuple[tuple[tuple[str, float], ...], tuple[tuple[str, float], ...]]:
    reg = U.registry()
    num, den = [], []
    for name, exp in items:
        sym = _SYMBOLS.get(name) or reg.get_symbol(name)
        (num if exp > 0 else den).append((sym, abs(exp)))
    return tuple(num), tuple(den)


_SYMBOLS = {
    "degree": "°", "percent": "%", "force_pound": "lbf", "pound": "lbm", "kip": "kip", "psi": "psi",
    "ksi": "ksi", "psf": "psf", "ksf": "ksf", "plf": "plf", "klf": "klf", "pcf": "pcf", "micrometer": "µm",
    "degree_Celsius": "°C", "degree_Fahrenheit": "°F", "tonne": "t", "liter": "L", "hour": "h",
    "minute": "min", "kilogram_force": "kgf", "tonne_force": "tf", "permille": "‰",
}

_SUP = str.maketrans("0123456789-.", "⁰¹²³⁴⁵⁶⁷⁸⁹⁻·")


def superscript(n) -> str:
    text = str(int(n)) if float(n).is_integer() else f"{n:g}"
    return text.translate(_SUP)


def unit_text(unit: pint.Unit | None) -> str:
    """Typeset unit in plain Unicode: kN·m, mm⁴, N/mm², kN/(m·s)."""
    if unit is None:
        return ""
    num, den = unit_factors(unit)

    def part(items):
        return "·".join(s + (superscript(e) if e != 1 else "") for s, e in items)

    top = part(num) or ("1" if den else "")
    if not den:
        return top
    bottom = part(den)
    return f"{top}/({bottom})" if len(den) > 1 else f"{top}/{bottom}"


def pint_unit_string(unit: pint.Unit | None) -> str:
    """The unit as pint parses it back: 'kN * m', 'mm ** 4'."""
    if unit is None:
        return ""
    return format(unit, "~")


# Our trade units a stock pint registry lacks, as the stock units they are defined from (units.py).
_STOCK_FACTORS = {
    "psf": {"force_pound": 1, "foot": -2}, "ksf": {"kip": 1, "foot": -2}, "pcf": {"force_pound": 1, "foot": -3},
    "plf": {"force_pound": 1, "foot": -1}, "klf": {"kip": 1, "foot": -1},
}


def portable_unit_string(unit: pint.Unit | None) -> str:
    """The unit as a stock ``pint.UnitRegistry()`` parses it, meaning the same quantity: 'kN * m', and
    'lbf / ft ** 2' for psf (our registry's psf, klf ... are unknown to a stock one)."""
    if unit is None:
        return ""
    if not any(n in _STOCK_FACTORS for n in unit._units):
        return pint_unit_string(unit)
    factors: dict[str, float] = {}
    for name, exp in unit._units.items():
        for part, e in _STOCK_FACTORS.get(name, {name: 1}).items():
            factors[part] = factors.get(part, 0) + e * exp
    reg = U.registry()

    def term(name, e):
        e = abs(e)
        return reg.get_symbol(name) + ("" if e == 1 else f" ** {int(e) if float(e).is_integer() else e}")

    num = [term(n, e) for n, e in factors.items() if e > 0]
    den = [term(n, e) for n, e in factors.items() if e < 0]
    return " / ".join([" * ".join(num) or "1", *den])
