"""The one unit registry of the process, and our curated unit vocabulary.

Sheet text never reaches pint's string parser: the grammar splits a unit
expression into names and exponents, and each name is looked up here, in a
vocabulary of engineering units we chose on purpose (pint alone would read
``kNm`` as kilo-number-metre and ``in`` as an inch without a word).
"""
from __future__ import annotations

import math
import re
from functools import lru_cache

import pint

from .errors import SheetSyntaxError, Span, UnknownUnitError
from .suggest import did_you_mean

# Trade units pint lacks, defined exactly from their parts.
# (A unit's symbol defaults to its name; repeating it as "= psf" makes pint warn.)
_EXTRA_DEFINITIONS = [
    "kip = 1000 * force_pound",  # pint has kip already; defined here only if a pint release drops it
    "psf = force_pound / foot ** 2",
    "ksf = kip / foot ** 2",
    "pcf = force_pound / foot ** 3",
    "plf = force_pound / foot",
    "klf = kip / foot",
]

_registry: pint.UnitRegistry | None = None


def registry() -> pint.UnitRegistry:
    """The process-wide registry, created on first use."""
    global _registry
    if _registry is None:
        try:
            reg = pint.UnitRegistry(cache_folder=":auto:", autoconvert_offset_to_baseunit=False)
        except Exception:  # an unwritable cache folder must not stop a build
            reg = pint.UnitRegistry(autoconvert_offset_to_baseunit=False)
        for line in _EXTRA_DEFINITIONS:
            name = line.split("=")[0].strip()
            if name not in reg:
                reg.define(line)
        reg.formatter.default_format = "~"
        pint.set_application_registry(reg)
        global _QUANTITY
        _QUANTITY = reg.Quantity
        _registry = reg
    return _registry


# ---------------------------------------------------------------- quantities without pint's generic paths
# Evaluation makes a quantity for every literal and every operation. pint's constructor sniffs its arguments
# (strings to parse, units to coerce, upcast types) and its operators recheck offset units on every call;
# for a float magnitude and a units container that passed our rules the outcome is always the same two
# attributes. The helpers below set them directly, and cache what depends only on the units.

_QUANTITY: type | None = None  # the registry's Quantity class, set with the registry
_new = object.__new__


def quantity(magnitude, units) -> pint.Quantity:
    """``registry().Quantity(magnitude, units)`` for a float (or ndarray) magnitude and a pint units container
    (``unit._units``): the same object pint's constructor makes, without its argument checks."""
    q = _new(_QUANTITY or registry().Quantity)
    q._magnitude = magnitude
    q._units = units
    return q


_KEEP = 4096  # entries a units cache holds before it starts again (a sheet uses a few dozen units)


def remember(cache: dict, key, entry, keep: int = _KEEP):
    """``cache[key] = entry`` for the caches keyed by units containers' identity (here and in builtins); a full
    cache starts again, dropping each entry with the containers it holds, so an id is never taken for another's."""
    if len(cache) >= keep:
        cache.clear()
    cache[key] = entry
    return entry


_UNIT_OPS: dict = {}  # (op, id(a), id(b) or power) -> (a, b, result): held, so the ids stay theirs


def units_op(op: str, a, b):
    """pint's own units container of ``a * b`` (op ``"*"``), ``a / b`` (``"/"``), ``b / a`` (``"inv"``: the
    reciprocal, ``b`` unused) or ``a ** b`` (``"^"``, ``b`` a float), worked out once per pair of containers.

    Keyed by the containers' identity, not equality: ``{m: 2}`` and ``{m: 2.0}`` are equal to pint but are not
    the same container, and the result is exactly the one pint makes from these operands."""
    key = (op, id(a), b if op == "^" else id(b))
    hit = _UNIT_OPS.get(key)
    if hit is not None:
        return hit[2]
    if op == "*":
        out = a * b
    elif op == "/":
        out = a / b
    elif op == "inv":
        out = 1 / a
    else:
        out = a ** b
    remember(_UNIT_OPS, key, (a, b, out))
    return out


@lru_cache(maxsize=4096)
def multiplicative(units) -> bool:
    """Whether pint computes with these units by plain multiplication: no offset (°C/°F) unit, no logarithmic
    or other non-multiplicative unit, and no delta unit (pint gives a sum with one the other side's unit)."""
    q = quantity(1.0, units)
    return not q._get_non_multiplicative_units() and not q._get_delta_units()


def Quantity(value, unit):
    reg = registry()
    if isinstance(unit, str):
        unit = reg.Unit(unit)
    return reg.Quantity(value, unit)


# Our spelling -> pint's canonical unit name. Only these may follow a number.
VOCABULARY: dict[str, str] = {
    # length
    "mm": "millimeter", "cm": "centimeter", "m": "meter", "km": "kilometer", "um": "micrometer",
    "µm": "micrometer", "in": "inch", "ft": "foot", "yd": "yard", "mi": "mile",
    # area / volume
    "ha": "hectare", "L": "liter", "l": "liter",
    # force
    "N": "newton", "kN": "kilonewton", "MN": "meganewton", "lbf": "force_pound", "kip": "kip",
    "kips": "kip", "kgf": "kilogram_force", "tf": "tonne_force",
    # pressure / stress
    "Pa": "pascal", "kPa": "kilopascal", "MPa": "megapascal", "GPa": "gigapascal",
    "psi": "psi", "ksi": "ksi", "psf": "psf", "ksf": "ksf", "bar": "bar",
    # line load, unit weight (US)
    "plf": "plf", "klf": "klf", "pcf": "pcf",
    # mass
    "kg": "kilogram", "g": "gram", "t": "tonne", "tonne": "tonne", "lbm": "pound",
    # time, frequency
    "s": "second", "min": "minute", "h": "hour", "hr": "hour", "Hz": "hertz",
    # energy, power
    "J": "joule", "kJ": "kilojoule", "W": "watt", "kW": "kilowatt",
    # angle
    "rad": "radian", "deg": "degree", "°": "degree", "mrad": "milliradian",
    # temperature (offset units: allowed as values, refused in arithmetic)
    "K": "kelvin", "degC": "degree_Celsius", "degF": "degree_Fahrenheit",
    # ratio
    "%": "percent", "percent": "percent", "permille": "permille",
}

# Spellings engineers type that we refuse, with what to write instead.
REFUSED: dict[str, str] = {
    "kNm": "write kN*m (a moment); 'kNm' is not a unit here",
    "Nm": "write N*m",
    "kipft": "write kip*ft",
    "lb": "write lbf for a force or lbm for a mass",
    "lbs": "write lbf for a force or lbm for a mass",
    "Mpa": "unit names are case-sensitive: write MPa",
    "mpa": "unit names are case-sensitive: write MPa",
    "kpa": "unit names are case-sensitive: write kPa",
    "gpa": "unit names are case-sensitive: write GPa",
    "KN": "unit names are case-sensitive: write kN",
    "kn": "unit names are case-sensitive: write kN",
    "ton": "say t (tonne, 1000 kg) or tf; 'ton' is ambiguous",
    "sec": "write s",
}

ANGLE_UNITS = {"radian", "degree", "milliradian", "arcminute", "arcsecond", "turn"}
OFFSET_UNITS = {"degree_Celsius", "degree_Fahrenheit"}

_FACTORS: dict = {}  # (source, target units container) -> pint's own conversion factor, or None (not a factor)


def convert(q: pint.Quantity, unit) -> pint.Quantity:
    """``q.to(unit)`` (a pint Unit or units container), with the same result: pint converts a multiplicative
    unit by ``magnitude * factor``; the factor of each pair of units is taken from pint once (as the conversion
    of 1) and reused. A pair whose conversion is not a plain factor (°C, °F) always goes through pint."""
    src, dst = q._units, getattr(unit, "_units", unit)
    if src is dst:
        return q
    hit = _CONVERSIONS.get((id(src), id(dst)))
    if hit is None:  # once per pair of containers: equal (nothing to do), a plain factor, or pint's path
        hit = remember(_CONVERSIONS, (id(src), id(dst)), (src, dst, _SAME if src == dst else factor(src, dst)))
    how = hit[2]
    if how is _SAME:
        return q
    if how is None:
        return q.to(unit)
    return quantity(q._magnitude * how, dst)


_SAME = object()
_CONVERSIONS: dict = {}  # (id(src), id(dst)) -> (src, dst, _SAME | factor | None): held, so the ids stay theirs


def factor(src, dst) -> float | None:
    """The factor pint converts ``src`` to ``dst`` units containers by (``value * factor``), taken from pint
    once per pair; None when the conversion is not a plain factor (°C, °F)."""
    key = (src, dst)
    f = _FACTORS.get(key, False)
    if f is False:
        f = _factor(src, dst)
        if len(_FACTORS) < 4096:
            _FACTORS[key] = f
    return f


def _factor(src, dst) -> float | None:
    reg = registry()
    if any(name in OFFSET_UNITS for name in (*src, *dst)):
        return None
    one = reg.Quantity(1.0, src).to(dst)._magnitude  # raises DimensionalityError for another dimension
    if not isinstance(one, float) or reg.Quantity(0.0, src).to(dst)._magnitude != 0.0 or \
            reg.Quantity(3.0, src).to(dst)._magnitude != 3.0 * one:
        return None  # not a plain factor: leave every conversion to pint
    return one


@lru_cache(maxsize=None)
def unit_named(symbol: str) -> pint.Unit:
    """Look up one unit name from the vocabulary (not pint's parser)."""
    if symbol in VOCABULARY:
        return registry().Unit(VOCABULARY[symbol])
    if symbol in REFUSED:
        raise UnknownUnitError(f"unknown unit '{symbol}'", hint=REFUSED[symbol])
    hint = did_you_mean(symbol, VOCABULARY) or "see 'calcsheet units' for the unit names"
    raise UnknownUnitError(f"unknown unit '{symbol}'", hint=hint)


@lru_cache(maxsize=4096)
def build_unit(factors: tuple[tuple[str, float], ...]) -> pint.Unit:
    """A unit from (name, exponent) factors, as the grammar split them."""
    unit = registry().Unit("")
    for name, exp in factors:
        base = unit_named(name)
        unit = unit * (base if exp == 1 else base**exp)
    return unit


# ---------------------------------------------------------------- unit text
# How a unit is written in a sheet: after a number (``5 kN/m``), in a declared
# unit (``[kN*m]``) and in a plugin's ``unit=`` string. The grammar's UNIT
# terminal decides where a unit ends; these read what it matched.

_SUPER = str.maketrans("²³⁴", "234")


def unit_name_alternatives() -> str:
    """The names that may continue a unit after ``*`` or ``/`` (the grammar's ``{unit_names}``), longest first."""
    names = sorted((n for n in VOCABULARY if re.fullmatch(r"[^\W\d]\w*", n)), key=len, reverse=True)
    return "|".join(re.escape(n) for n in names)


def split_unit(text: str) -> tuple[tuple[str, float], ...]:
    """'kN/m^2' -> (('kN', 1), ('m', -2)). The grammar has already vetted the shape."""
    factors: list[tuple[str, float]] = []
    sign = 1
    for piece in re.split(r"([*/·])", text.replace(" ", "")):
        if piece in ("*", "·"):
            sign = 1
            continue
        if piece == "/":
            sign = -1
            continue
        if not piece:
            continue
        m = re.fullmatch(r"(.+?)(?:\^(-?[0-9]+(?:\.[0-9]+)?)|([²³⁴]))?", piece)
        name, exp, sup = m.group(1), m.group(2), m.group(3)
        power = float(exp) if exp else float(sup.translate(_SUPER)) if sup else 1.0
        factors.append((name, sign * power))
    return tuple(factors)


_UNIT_TEXT = re.compile(
    r"\s*(?:[^\W\d]\w*|%|°)(?:\^-?[0-9]+|[²³⁴])?(?:\s*[*/·]\s*(?:[^\W\d]\w*)(?:\^-?[0-9]+|[²³⁴])?)*\s*"
)


def parse_unit_text(text: str, span: Span | None = None) -> tuple[tuple[str, float], ...]:
    """A declared unit ``[kN*m]`` (or a plugin's ``unit=`` string); '1' and '-' mean dimensionless."""
    stripped = text.strip()
    if stripped in ("1", "-", ""):
        return ()
    if not _UNIT_TEXT.fullmatch(stripped):
        raise SheetSyntaxError(
            f"'{stripped}' is not a unit", span, hint="write units like kN*m, N/mm^2, mm^4 (no numbers or brackets)"
        )
    return split_unit(stripped)


# ---------------------------------------------------------------- dimensions
# pint treats angles as dimensionless; a calculation must not (sin(30) is a
# mistake). A Dim is pint's dimensionality plus an angle exponent.

Dim = tuple  # sorted tuple of (dimension name, exponent) pairs, hashable

DIMENSIONLESS: Dim = ()
ANGLE: Dim = (("[angle]", 1),)


def _angle_exponent(units) -> float:
    return sum(exp for name, exp in units.items() if name in ANGLE_UNITS)


@lru_cache(maxsize=4096)
def _dim_of_unit(unit: pint.Unit) -> Dim:
    items = dict(unit.dimensionality)
    ang = _angle_exponent(unit._units)
    if ang:
        items["[angle]"] = ang
    return tuple(sorted((k, v) for k, v in items.items() if v))


def dim_of(value) -> Dim:
    """The Dim of a pint quantity or unit (a plain number is dimensionless)."""
    if isinstance(value, pint.Unit):
        return _dim_of_unit(value)
    if isinstance(value, pint.Quantity):
        return _dim_of_unit(value.units)
    return DIMENSIONLESS


@lru_cache(maxsize=4096)
def dim_mul(a: Dim, b: Dim, sign: int = 1) -> Dim:
    out = dict(a)
    for k, v in b:
        out[k] = out.get(k, 0) + sign * v
    return tuple(sorted((k, v) for k, v in out.items() if abs(v) > 1e-12))


@lru_cache(maxsize=4096)
def dim_pow(a: Dim, p: float) -> Dim:
    return tuple(sorted((k, v * p) for k, v in a if abs(v * p) > 1e-12))


@lru_cache(maxsize=4096)
def without_angle(a: Dim) -> Dim:
    return tuple((k, v) for k, v in a if k != "[angle]")


@lru_cache(maxsize=None)
def parse_dimension(text: str) -> Dim:
    """A plugin's declared dimension, e.g. '[force]/[length]' or '[angle]'."""
    if text in ("", "1", "[]", "dimensionless"):
        return DIMENSIONLESS
    reg = registry()
    angle = 0
    cleaned = text
    if "[angle]" in text:
        # only simple forms: "[angle]" alone or times/divided by others
        if text.strip() == "[angle]":
            return ANGLE
        raise ValueError(f"unsupported dimension expression {text!r}")
    dims = reg.get_dimensionality(cleaned)
    items = {k: v for k, v in dict(dims).items() if v}
    if angle:
        items["[angle]"] = angle
    return tuple(sorted(items.items()))


_DIM_NAMES = {
    (): "dimensionless",
    (("[angle]", 1),): "angle",
    (("[length]", 1),): "length",
    (("[length]", 2),): "area",
    (("[length]", 3),): "length³ (section modulus, volume)",
    (("[length]", 4),): "length⁴ (second moment of area)",
    (("[length]", 1), ("[mass]", 1), ("[time]", -2)): "force",
    (("[mass]", 1), ("[time]", -2)): "force/length (line load)",
    (("[length]", -1), ("[mass]", 1), ("[time]", -2)): "pressure (stress, area load)",
    (("[length]", 2), ("[mass]", 1), ("[time]", -2)): "force × length (moment)",
    (("[length]", -2), ("[mass]", 1), ("[time]", -2)): "force/volume (unit weight)",
    (("[mass]", 1),): "mass",
    (("[length]", -3), ("[mass]", 1)): "density",
    (("[length]", -1), ("[mass]", 1)): "mass/length",
    (("[time]", 1),): "time",
    (("[temperature]", 1),): "temperature",
}


def describe_dim(d: Dim) -> str:
    """Words an engineer reads: 'force/length (line load)', not '[mass]/[time]**2'."""
    if d in _DIM_NAMES:
        return _DIM_NAMES[d]
    parts = []
    for k, v in d:
        name = k.strip("[]")
        parts.append(name if v == 1 else f"{name}^{_fmt_exp(v)}")
    return "·".join(parts) or "dimensionless"


def _fmt_exp(v: float) -> str:
    return str(int(v)) if float(v).is_integer() else f"{v:g}"


def is_finite(value) -> bool:
    m = value.magnitude if isinstance(value, pint.Quantity) else value
    try:
        return math.isfinite(m)
    except TypeError:
        import numpy as np

        return bool(np.all(np.isfinite(m)))
