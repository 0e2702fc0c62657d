"""What a name says a value is, and the range that kind of value has in practice.

A sheet calls the steel modulus ``E_s`` and the yield strength ``f_y``; those
names carry enough meaning to catch ``E_s = 200 MPa`` (meant GPa) or a cm⁴
table value typed as mm⁴. The kind is decided from the name *and* the
dimension (``F_y`` as a force is a force component, not a yield strength), so
a name alone never raises a false alarm. Every range names its source or says
``common practice``.
"""
from __future__ import annotations

import re
from dataclasses import dataclass, field
from functools import lru_cache

from . import units as U

PRESSURE = (("[length]", -1), ("[mass]", 1), ("[time]", -2))
MOMENT = (("[length]", 2), ("[mass]", 1), ("[time]", -2))
FORCE = (("[length]", 1), ("[mass]", 1), ("[time]", -2))
LINE_LOAD = (("[mass]", 1), ("[time]", -2))
DENSITY = (("[length]", -3), ("[mass]", 1))
UNIT_WEIGHT = (("[length]", -2), ("[mass]", 1), ("[time]", -2))
LENGTH = (("[length]", 1),)
AREA = (("[length]", 2),)
LENGTH3 = (("[length]", 3),)
LENGTH4 = (("[length]", 4),)


@dataclass(frozen=True)
class Range:
    """A plausible interval, in ``unit`` (our unit spelling), with where it comes from."""

    low: float
    high: float
    unit: str
    source: str
    material: str = ""  # "steel", ... or "" for the kind in general
    typical: str = ""  # a typical value to suggest, e.g. "210 GPa"


@dataclass(frozen=True)
class Kind:
    """A kind of engineering quantity: names that denote it, its dimension and usual units."""

    key: str
    words: str  # "elastic modulus"
    pattern: re.Pattern
    dim: tuple
    usual_units: tuple[str, ...]
    ranges: tuple[Range, ...] = ()
    slip: str | None = None  # 'I' or 'S' for the table-unit slip check


# Material suffixes a name may carry (E_s, rho_steel, E_cm...). Only words that
# say the material plainly; a bare '_t' may be 'tangent', so it is not read.
MATERIALS = {
    "steel": ("s", "st", "steel", "stl"),
    "aluminium": ("al", "alu", "aluminium", "aluminum"),
    "concrete": ("c", "cm", "conc", "concrete"),
    "timber": ("timber", "wood", "glulam"),
}

_K = [
    Kind("modulus", "elastic modulus", re.compile(r"E(_\w+)?$"), PRESSURE,
         ("GPa", "MPa", "N/mm^2", "kN/mm^2", "ksi", "psi"),
         (
             # EN 1993-1-1:2005 3.2.6 gives E = 210 000 N/mm²; AISC 360-16 gives E = 29 000 ksi (200 GPa);
             # EN 1993-1-4 gives 200 GPa for stainless (from memory)
             Range(190, 215, "GPa", "EN 1993-1-1 3.2.6 (210 GPa), AISC 360 (29,000 ksi), EN 1993-1-4 (200 GPa)",
                   "steel", "210 GPa"),
             # EN 1999-1-1 3.2.5 gives E = 70 000 N/mm²; US aluminum tables ~10,000-10,100 ksi (from memory)
             Range(65, 75, "GPa", "EN 1999-1-1 3.2.5 (70 GPa)", "aluminium", "70 GPa"),
             # EN 1992-1-1 Table 3.1: E_cm 27-44 GPa for C12/15-C90/105; lightweight concrete lower (from memory)
             Range(15, 50, "GPa", "EN 1992-1-1 Table 3.1 (E_cm 27-44 GPa), lightweight lower", "concrete", "33 GPa"),
             # EN 338 Table 1: E_0,mean 7 GPa (C14) to 20 GPa (D70) (from memory)
             Range(6, 22, "GPa", "EN 338 Table 1 (E_0,mean 7-20 GPa)", "timber", "11 GPa"),
             # timber across the grain (~0.2 GPa, E_90) is named E_90 and not judged here
             Range(1, 250, "GPa", "common practice: structural materials, masonry (~2 GPa) to steel (~210 GPa)"),
         )),
    Kind("yield", "yield strength", re.compile(r"[fF]_?y(\w*)$"), PRESSURE,
         ("MPa", "N/mm^2", "ksi", "psi"),
         (
             # EN 1993-1-1 Table 3.1: S235-S460; EN 1993-1-12 up to S700; ASTM A36 36 ksi (from memory)
             Range(180, 720, "MPa", "EN 1993-1-1 Table 3.1 (S235-S460), EN 1993-1-12 (to S700)", "steel", "355 MPa"),
             Range(25, 1200, "MPa", "common practice: annealed aluminium (~30 MPa) to bolt grade 10.9 (900 MPa)"),
         )),
    Kind("ultimate", "ultimate strength", re.compile(r"[fF]_?u(\w*)$"), PRESSURE,
         ("MPa", "N/mm^2", "ksi", "psi"),
         (Range(60, 1600, "MPa", "common practice: aluminium (~70 MPa) to prestressing strand (~1860 MPa is a "
                                 "tendon, named f_pk)"),)),
    Kind("concrete_strength", "concrete compressive strength", re.compile(r"f_?c(k|m|k_cube|_28)?$"), PRESSURE,
         ("MPa", "N/mm^2", "psi", "ksi"),
         # EN 1992-1-1 Table 3.1: f_ck 12-90 MPa; ACI 318 f'c from 2500 psi (17 MPa) (from memory)
         (Range(8, 120, "MPa", "EN 1992-1-1 Table 3.1 (f_ck 12-90 MPa)"),)),
    Kind("density", "density", re.compile(r"rho(_\w+)?$"), DENSITY,
         ("kg/m^3", "t/m^3", "g/cm^3", "lbm/ft^3"),
         (
             # EN 1991-1-1 Table A.4: steel 77.0-78.5 kN/m³, i.e. ~7850-8000 kg/m³ (from memory)
             Range(7700, 8100, "kg/m^3", "EN 1991-1-1 Table A.4 (steel 77-78.5 kN/m³)", "steel", "7850 kg/m^3"),
             Range(2600, 2900, "kg/m^3", "common practice: aluminium alloys ~2700 kg/m³", "aluminium",
                   "2700 kg/m^3"),
             # EN 1991-1-1 Table A.1: lightweight 9-20 kN/m³, normal 24, reinforced 25 (from memory)
             Range(800, 2800, "kg/m^3", "EN 1991-1-1 Table A.1 (lightweight to reinforced)", "concrete",
                   "2400 kg/m^3"),
             # EN 338 Table 1: rho_mean 350 (C14) to 1080 (D70) kg/m³ (from memory)
             Range(250, 1200, "kg/m^3", "EN 338 Table 1 (rho_mean 350-1080 kg/m³)", "timber", "420 kg/m^3"),
             Range(1, 23000, "kg/m^3", "common practice: air (1.2 kg/m³) to the densest metals (~22,600 kg/m³)"),
         )),
    Kind("unit_weight", "unit weight", re.compile(r"gamma(_\w+)?$"), UNIT_WEIGHT,
         ("kN/m^3", "N/m^3", "pcf", "lbf/ft^3"),
         (
             Range(75, 79, "kN/m^3", "EN 1991-1-1 Table A.4 (steel 77-78.5 kN/m³)", "steel", "78.5 kN/m^3"),
             Range(8, 27, "kN/m^3", "EN 1991-1-1 Table A.1 (lightweight 9-20, normal 24, reinforced 25 kN/m³)",
                   "concrete", "25 kN/m^3"),
             Range(0.01, 230, "kN/m^3", "common practice: air (0.012 kN/m³) to the densest metals (~222 kN/m³)"),
         )),
    Kind("poisson", "Poisson's ratio", re.compile(r"nu(_\w+)?$"), U.DIMENSIONLESS, (),
         # an isotropic material has -1 < nu <= 0.5; structural materials lie in 0.1-0.5 (common practice)
         (Range(0.0, 0.5, "", "common practice: isotropic elasticity bounds nu at 0.5", "",
                "0.3 for steel, 0.2 for concrete"),)),
    Kind("second_moment", "second moment of area", re.compile(r"I(_\w+)?$"), LENGTH4,
         ("mm^4", "cm^4", "m^4", "in^4"), slip="I"),
    Kind("section_modulus", "section modulus", re.compile(r"(S|W|Z)(_\w+)?$"), LENGTH3,
         ("mm^3", "cm^3", "m^3", "in^3"), slip="S"),
    Kind("moment", "bending moment", re.compile(r"M(_\w+)?$"), MOMENT,
         ("kN*m", "N*m", "N*mm", "kN*mm", "MN*m", "kip*ft", "kip*in", "lbf*ft", "lbf*in")),
    Kind("stress", "stress", re.compile(r"(sigma|tau)(_\w+)?$"), PRESSURE,
         ("MPa", "N/mm^2", "kPa", "GPa", "ksi", "psi")),
    Kind("length", "length", re.compile(r"(L|l|h|b|d|t|a|s|e|z|y|x)(_\w+)?$"), LENGTH,
         ("mm", "cm", "m", "in", "ft")),
    Kind("force", "force", re.compile(r"(P|V|N|R|F|H|T|Q)(_\w+)?$"), FORCE,
         ("kN", "N", "MN", "kip", "lbf")),
    Kind("line_load", "line load", re.compile(r"(w|q)(_\w+)?$"), LINE_LOAD,
         ("kN/m", "N/mm", "N/m", "kip/ft", "klf", "plf", "lbf/ft", "lbf/in")),
]
KINDS: dict[str, Kind] = {k.key: k for k in _K}


_BY_DIM: dict = {}


def kind_of(name: str, dim) -> Kind | None:
    """The kind a name denotes, if its dimension agrees (names alone are ambiguous)."""
    kinds = _BY_DIM.get(dim)
    if kinds is None:  # the kinds of one dimension, in their order in _K, found once
        kinds = _BY_DIM[dim] = tuple(k for k in _K if k.dim == dim)
    for k in kinds:
        if k.pattern.match(name):
            if k.key == "modulus" and re.match(r"E_?90", name):
                return None
            return k
    return None


def material_of(name: str) -> str:
    """The material a subscript names (``E_s`` -> steel), or ''."""
    parts = name.lower().split("_")[1:]
    for material, tags in MATERIALS.items():
        if any(p in tags for p in parts):
            return material
    return ""


@lru_cache(maxsize=None)
def _unit(text: str):
    from .units import split_unit

    return U.build_unit(split_unit(text)) if text else U.registry().Unit("")


def judge_range(name: str, kind: Kind) -> Range | None:
    """The range a name is judged by: its material's if the subscript names one, else the kind's general one."""
    material = material_of(name)
    general = None
    for r in kind.ranges:
        if material and r.material == material:
            return r
        if not r.material and general is None:
            general = r
    return general


def judge(name: str, value) -> tuple[Kind, Range, float] | None:
    """The kind and the range that ``value`` (a pint Quantity) falls outside, with its magnitude there."""
    dim = U.dim_of(value)
    k = kind_of(name, dim)
    if k is None or not k.ranges:
        return None
    chosen = judge_range(name, k)
    if chosen is None:
        return None
    m = float(value.to(_unit(chosen.unit)).magnitude) if chosen.unit else float(value.to("").magnitude)
    if chosen.low <= m <= chosen.high:
        return None
    return k, chosen, m


def is_usual_unit(kind: Kind, unit) -> bool:
    return not kind.usual_units or _is_usual(kind.usual_units, unit)


@lru_cache(maxsize=1024)
def _is_usual(usual_units: tuple[str, ...], unit) -> bool:
    return any(unit == _unit(u) for u in usual_units)


# ------------------------------------------------------------ table-unit slips

SLIP_LIMITS = {
    # Below the low edge a value is that of a bar under ~28 mm square, and matches a table value in
    # cm⁴/cm³ typed as mm⁴/mm³ (tables list rolled members from ~5 cm⁴ up); above the high edge it
    # exceeds the largest rolled sections (~1.3e10 mm⁴) a hundredfold (common practice).
    "I": (5e4, 1e12, "mm^4", 4),
    "S": (5e3, 1e9, "mm^3", 3),
}


def slip(kind: Kind, value) -> tuple[str, float] | None:
    """A likely table-unit slip: ('small'|'large', magnitude in mm^n, side of the equal square bar in mm)."""
    if kind.slip is None:
        return None
    low, high, unit, power = SLIP_LIMITS[kind.slip]
    m = float(value.to(_unit(unit)).magnitude)
    if m <= 0 or low <= m <= high:
        return None
    side = (12 * m) ** 0.25 if power == 4 else (6 * m) ** (1 / 3)
    return ("small" if m < low else "large"), m, side
