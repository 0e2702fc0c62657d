"""The material library: every value sourced, properties consistent, concrete rules as published."""
import math
import textwrap

import pytest

import calcsheet
from calcsheet_plugins.material import library


def run(body):
    r = calcsheet.run("---\nproject: Material tests\n---\n" + textwrap.dedent(body))
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert not errs, [d.message for d in errs]
    return r


GRADES = [(cat, key) for cat in ("steel", "aluminium", "timber") for key in library.grades(cat)]


@pytest.mark.parametrize("cat, key", GRADES)
def test_every_value_has_a_source_and_a_unit_of_the_right_kind(cat, key):
    entry = library.entry(cat, key)
    for prop in library.PROPERTIES:
        q, source = library.value(entry[prop])
        assert source.strip(), (key, prop)
        assert "from memory" not in source or "verify" in source
        assert q.magnitude > 0
    assert library.value(entry["E"])[0].check("[pressure]")
    assert library.value(entry["rho"])[0].check("[mass]/[length]**3")


@pytest.mark.parametrize("cat, key", [g for g in GRADES if g[0] != "timber"])
def test_isotropic_metals_satisfy_G_equals_E_over_2_1_plus_nu(cat, key):
    # isotropic linear elasticity: G = E/(2(1+ν)) (any strength-of-materials text — common practice)
    e = library.entry(cat, key)
    E, G, nu = (library.value(e[p])[0] for p in ("E", "G", "nu"))
    assert G.m_as("MPa") == pytest.approx(E.m_as("MPa") / (2 * (1 + nu.m_as(""))), rel=0.02)


def test_steel_densities_agree_across_unit_systems():
    # 7850 kg/m³ and 490 lb/ft³ are the same steel (490 pcf = 7849 kg/m³; common practice)
    si = library.value(library.entry("steel", "S355")["rho"])[0]
    us = library.value(library.entry("steel", "A992")["rho"])[0]
    assert us.m_as("kg/m^3") == pytest.approx(si.m_as("kg/m^3"), rel=1e-3)


def test_library_record_from_a_sheet():
    r = run("""
        mat = material.steel(grade="A992")
        E = mat.E
        f = mat.f_y
    """)
    assert r.values["E"].m_as("ksi") == pytest.approx(29000)
    assert r.values["f"].m_as("ksi") == pytest.approx(50)
    assert any("verify" in d.message for d in r.diagnostics if d.severity == "warning")


@pytest.mark.parametrize("f_ck, E_table", [(20, 30), (30, 33), (40, 35), (50, 37)])
def test_concrete_E_by_en_1992(f_ck, E_table):
    # EN 1992-1-1 Table 3.1 tabulates E_cm (rounded to 1 GPa): C20 30, C30 33, C40 35, C50 37 (from memory)
    r = run(f"""
        c = material.concrete(f_c={f_ck} MPa)
        E = c.E
        G = c.G
    """)
    assert r.values["E"].m_as("GPa") == pytest.approx(E_table, abs=0.6)
    assert r.values["G"].m_as("GPa") == pytest.approx(r.values["E"].m_as("GPa") / 2.4)  # ν = 0.2


def test_concrete_E_by_aci_318_agrees_with_its_us_form():
    # ACI 318-19 19.2.2.1: E_c = 4700√f'c (MPa); its inch-pound form 57000√f'c (psi) — from memory;
    # the two forms differ by under 1 %
    r = run("""
        c = material.concrete(f_c=4000 psi, rule="ACI 318")
        E = c.E
    """)
    assert r.values["E"].m_as("psi") == pytest.approx(57000 * math.sqrt(4000), rel=0.01)


def test_custom_material_and_its_checks():
    r = run("""
        m = material.custom(name="bespoke alloy", E=70 GPa, nu=0.33, f_y=200 MPa, rho=2700 kg/m^3)
        G = m.G
    """)
    assert r.values["G"].m_as("GPa") == pytest.approx(70 / (2 * 1.33))  # G = E/(2(1+ν))
    bad = calcsheet.run("---\nproject: t\n---\nm = material.custom(name=\"x\", E=70 GPa, nu=0.7, f_y=200 MPa)\n")
    errs = [d for d in bad.diagnostics if d.severity == "error"]
    assert errs and "Poisson" in errs[0].message


def test_unknown_grade_is_refused_with_choices():
    r = calcsheet.run("---\nproject: t\n---\nm = material.steel(grade=\"S999\")\n")
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert errs and "S355" in errs[0].message


@pytest.mark.parametrize("grade, t_mm, f_y, f_u", [
    # EN 10025-2:2004 Table 7 (R_eH by nominal thickness; R_m for 3 ≤ t ≤ 100 mm) — from memory
    ("S355", 10, 355, 470), ("S355", 16, 355, 470), ("S355", 16.5, 345, 470), ("S355", 40, 345, 470),
    ("S355", 50, 335, 470), ("S355", 120, 295, 450), ("S275", 20, 265, 410), ("S235", 70, 215, 360),
    ("S355", 2, 355, 510),
])
def test_en_grades_take_strengths_by_thickness_band(grade, t_mm, f_y, f_u):
    r = run(f'm = material.steel(grade="{grade}", t={t_mm} mm)')
    assert r.values["m"].fields["f_y"].m_as("MPa") == f_y
    assert r.values["m"].fields["f_u"].m_as("MPa") == f_u


def test_thickness_outside_the_bands_or_without_bands_is_a_located_error():
    for body in ('m = material.steel(grade="S355", t=200 mm)', 'm = material.steel(grade="A992", t=20 mm)'):
        r = calcsheet.run("---\nproject: Material tests\n---\n" + body)
        errs = [d for d in r.diagnostics if d.severity == "error"]
        assert errs and errs[0].span is not None and "t" in errs[0].message


def test_en_yield_strength_never_increases_with_thickness():
    for grade in ("S235", "S275", "S355"):
        fy = library.entry("steel", grade)["bands"]["f_y"]
        assert all(a >= b for a, b in zip(fy, fy[1:])), grade
        assert fy[0] == library.value(library.entry("steel", grade)["f_y"])[0].m_as("MPa")
