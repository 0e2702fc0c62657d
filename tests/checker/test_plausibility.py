"""Plausibility ranges: values inside pass, values just outside warn, at both edges of each range."""
from __future__ import annotations

import pytest

from calcsheet import plausibility as P
from calcsheet import units as U
from calcsheet.engine import run


def q(value, unit):
    from calcsheet.units import split_unit

    return U.registry().Quantity(value, U.build_unit(split_unit(unit)))


EDGES = [(name, r) for name, k in [("E", "modulus"), ("E_s", "modulus"), ("E_al", "modulus"), ("E_c", "modulus"),
                                   ("E_timber", "modulus"), ("f_y", "yield"), ("f_y_steel", "yield"),
                                   ("f_u", "ultimate"), ("f_ck", "concrete_strength"), ("rho", "density"),
                                   ("rho_s", "density"), ("rho_conc", "density"), ("rho_wood", "density"),
                                   ("rho_alu", "density"), ("gamma", "unit_weight"), ("gamma_s", "unit_weight"),
                                   ("gamma_c", "unit_weight"), ("nu", "poisson")]
         for r in [P.judge_range(name, P.KINDS[k])]]


@pytest.mark.parametrize("name, rng", EDGES, ids=[e[0] for e in EDGES])
def test_each_range_is_closed_at_both_edges_and_open_just_outside(name, rng):
    assert P.judge(name, q(rng.low, rng.unit)) is None
    assert P.judge(name, q(rng.high, rng.unit)) is None
    assert P.judge(name, q(rng.low * (1 - 1e-6) if rng.low else -1e-9, rng.unit)) is not None
    assert P.judge(name, q(rng.high * (1 + 1e-6), rng.unit)) is not None


@pytest.mark.parametrize("name, value, unit", [
    ("E_s", 210, "GPa"),       # EN 1993-1-1 3.2.6
    ("E_s", 29000, "ksi"),     # AISC 360-16, E = 29,000 ksi
    ("E_al", 70, "GPa"),       # EN 1999-1-1 3.2.5
    ("E_al", 10000, "ksi"),    # aluminium in US practice, ~10,000 ksi (from memory)
    ("E_c", 33, "GPa"),        # EN 1992-1-1 Table 3.1, C30/37 E_cm = 33 GPa
    ("E_0", 11, "GPa"),        # EN 338 C24 E_0,mean = 11 GPa (from memory)
    ("f_y", 355, "MPa"),       # S355
    ("F_y", 50, "ksi"),        # ASTM A992, 50 ksi
    ("f_y_s", 235, "MPa"),     # S235, EN 1993-1-1 Table 3.1
    ("f_ck", 30, "MPa"),       # C30/37
    ("f_ck", 4000, "psi"),     # f'c = 4000 psi, common practice
    ("rho_s", 7850, "kg/m^3"), # EN 1991-1-1 Table A.4, 78.5 kN/m³
    ("rho_c", 2400, "kg/m^3"), # EN 1991-1-1 Table A.1, 24 kN/m³ normal weight
    ("rho", 1.25, "kg/m^3"),   # air, for wind pressure (EN 1991-1-4 recommends 1.25 kg/m³)
    ("gamma_c", 25, "kN/m^3"), # reinforced concrete, EN 1991-1-1 Table A.1
    ("gamma", 150, "pcf"),     # reinforced concrete in US practice, 150 pcf (common practice)
    ("nu", 0.3, ""),           # steel, EN 1993-1-1 3.2.6
])
def test_published_values_are_plausible(name, value, unit):
    assert P.judge(name, q(value, unit)) is None


@pytest.mark.parametrize("name, value, unit", [
    ("E_s", 200, "MPa"), ("E_al", 10000, "psi"), ("E", 30000, "psi"), ("f_y", 250, "GPa"),
    ("F_y", 36, "psi"), ("rho_s", 7.85, "kg/m^3"), ("nu", 3, ""), ("f_ck", 30, "kPa"),
])
def test_unit_slips_are_implausible(name, value, unit):
    assert P.judge(name, q(value, unit)) is not None


def test_names_alone_never_decide_the_kind():
    # F_y as a force component, E as an earthquake load, I as a current: not judged
    assert P.kind_of("F_y", U.dim_of(q(1, "kN"))).key == "force"
    assert P.kind_of("F_y", U.dim_of(q(1, "MPa"))).key == "yield"
    assert P.kind_of("E", U.dim_of(q(1, "kN"))) is None
    assert P.kind_of("E_90", U.dim_of(q(1, "MPa"))) is None  # timber across the grain is not judged
    assert P.judge("E_s", q(200, "kN")) is None


@pytest.mark.parametrize("value, unit, warns", [
    (8356, "mm^4", True), (8356, "cm^4", False), (5e4, "mm^4", False), (4.99e4, "mm^4", True),
    (1e12, "mm^4", False), (1.01e12, "mm^4", True), (200, "in^4", False),
])
def test_second_moment_slips_at_the_edges(value, unit, warns):
    assert (P.slip(P.KINDS["second_moment"], q(value, unit)) is not None) is warns


@pytest.mark.parametrize("value, unit, warns", [
    (557, "mm^3", True), (557, "cm^3", False), (5e3, "mm^3", False), (4.99e3, "mm^3", True),
    (1e9, "mm^3", False), (1.01e9, "mm^3", True),
])
def test_section_modulus_slips_at_the_edges(value, unit, warns):
    assert (P.slip(P.KINDS["section_modulus"], q(value, unit)) is not None) is warns


def test_slip_message_names_the_equivalent_bar():
    # a square bar of side a has I = a^4/12: 8356 mm^4 is a 17.8 mm bar (Roark's Formulas, Table A.1)
    r = run("I_x = 8356 mm^4\nM = 1 kN*m\nsigma = M*100 mm/I_x\ncheck sigma <= 1 GPa\n", evaluate=False)
    (d,) = [d for d in r.diagnostics if d.code == "unit-slip"]
    assert "17.79 mm square bar" in d.message and "8356 cm^4" in d.hint


def test_a_value_computed_from_literals_is_judged_too():
    r = run("E = 2.1e5 * 1 kPa\nx = E*2\ncheck x <= 1 GPa\n", evaluate=False)
    assert [d.code for d in r.diagnostics] == ["implausible-value"]


def test_a_value_from_a_plugin_is_not_guessed():
    r = run('m = material.steel(grade="S355")\nE = m.E\ncheck E <= 1 GPa\n', evaluate=False)
    assert [d.code for d in r.diagnostics if d.code == "implausible-value"] == []


def test_every_range_names_a_source_or_says_common_practice():
    for kind in P.KINDS.values():
        for r in kind.ranges:
            assert "common practice" in r.source or any(ch.isdigit() for ch in r.source), r
