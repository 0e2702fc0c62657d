"""column.buckling as a specification: the inputs it accepts and refuses, units, ties and names."""
import math
import textwrap

import pytest

import calcsheet
from calcsheet import units as U
from calcsheet.trace import Step

GIVEN = "E=200 GPa, F_y=250 MPa, A=6000 mm^2, I_x=8e7 mm^4, I_y=2e7 mm^4"


def run(body):
    return calcsheet.run(textwrap.dedent(body).lstrip())


def col(args):
    r = run(f"c = column.buckling({args})\n")
    assert r.ok, r.format_diagnostics()
    return r.values["c"]


def refused(args, param):
    r = run(f"c = column.buckling({args})\n")
    assert not r.ok and param in r.errors[0].message, r.format_diagnostics()


@pytest.mark.parametrize("ends, K", [("free-fixed", 2.1), ("pinned-fixed", 0.8), ("guided-fixed", 1.2),
                                     ("guided-pinned", 2.0)])
def test_end_conditions_may_be_named_from_either_end(ends, K):
    # the same column read top-down or bottom-up (AISC 360-16 Commentary Table C-A-7.1 — from memory)
    assert col(f'L=3 m, ends="{ends}", {GIVEN}').fields["K_x"].m_as("") == K


@pytest.mark.parametrize("args, param", [
    (f"L=0 m, {GIVEN}", "L"), (f"L=-1 m, {GIVEN}", "L"), (f"L=3 m, L_y=0 m, {GIVEN}", "L_y"),
    (f"L=3 m, L_y=-2 m, {GIVEN}", "L_y"), (f"L=3 m, K_x=0, {GIVEN}", "K_x"), (f"L=3 m, K_y=-1, {GIVEN}", "K_y"),
    ("L=3 m, E=0 GPa, F_y=250 MPa, A=6000 mm^2, I_x=8e7 mm^4, I_y=2e7 mm^4", "E"),
    ("L=3 m, E=200 GPa, F_y=0 MPa, A=6000 mm^2, I_x=8e7 mm^4, I_y=2e7 mm^4", "F_y"),
    ("L=3 m, E=200 GPa, F_y=250 MPa, A=0 mm^2, I_x=8e7 mm^4, I_y=2e7 mm^4", "A"),
    ("L=3 m, E=200 GPa, F_y=250 MPa, A=6000 mm^2, I_x=0 mm^4, I_y=2e7 mm^4", "I_x"),
    ("L=3 m, E=200 GPa, F_y=250 MPa, A=6000 mm^2, I_x=8e7 mm^4, I_y=-2e7 mm^4", "I_y"),
])
def test_zero_or_negative_inputs_are_refused_naming_the_parameter(args, param):
    refused(args, param)


def test_the_result_does_not_depend_on_the_units_the_inputs_are_written_in():
    mm = col(f"L=0.8 m, K_x=0.5, K_y=0.7, {GIVEN}")
    m = col("L=800 mm, K_x=0.5, K_y=0.7, E=2e5 MPa, F_y=0.25 GPa, A=0.006 m^2, I_x=8e-5 m^4, I_y=2e-5 m^4")
    for name in ("P_cr", "P_e_x", "P_e_y"):
        assert m.fields[name].m_as("kN") == pytest.approx(mm.fields[name].m_as("kN"), rel=1e-12), name
    assert m.fields["KL_r"].m_as("") == pytest.approx(mm.fields["KL_r"].m_as(""), rel=1e-12)


def test_a_us_sheet_gets_kips_and_ksi():
    r = run("""
        ---
        units: US
        ---
        c = column.buckling(L=12 ft, E=29000 ksi, F_y=50 ksi, A=10 in^2, I_x=300 in^4, I_y=100 in^4)
        P = c.P_cr
    """)
    assert r.ok, r.format_diagnostics()
    c = r.values["c"].fields
    assert str(c["P_cr"].units) == "kip" and str(c["sigma_cr"].units) == "ksi"
    # y governs: KL/r = 144/√10 = 45.5 < C_c = √(2π²·29000/50) = 107: Johnson (Shigley §4-14 — from memory)
    lam = 144 / math.sqrt(10)
    assert c["P_cr"].m_as("kip") == pytest.approx((50 - 50**2 * lam**2 / (4 * math.pi**2 * 29000)) * 10, rel=1e-12)


def test_when_both_axes_give_the_same_critical_stress_x_is_reported():
    c = col("L=3 m, E=200 GPa, F_y=250 MPa, A=6000 mm^2, I_x=3e7 mm^4, I_y=3e7 mm^4")
    assert c.fields["sigma_cr_x"].m_as("MPa") == c.fields["sigma_cr_y"].m_as("MPa")
    assert c.fields["axis"] == "x"


def test_the_governing_axis_is_the_one_with_the_smaller_critical_stress():
    c = col(f"L=3 m, {GIVEN}")  # I_y < I_x with equal lengths: y governs
    assert c.fields["axis"] == "y"
    c = col(f"L=3 m, L_y=0.5 m, {GIVEN}")  # braced about y at close centres: x governs
    assert c.fields["axis"] == "x"


def test_each_K_step_says_which_basis_it_comes_from():
    def k_step(rec):
        return next(i for i in rec.working.items if isinstance(i, Step) and i.name == "K_x")

    assert "recommended design value" in k_step(col(f"L=3 m, {GIVEN}")).description
    assert "theoretical value" in k_step(col(f'L=3 m, K_basis="theoretical", {GIVEN}')).description


def test_a_section_record_lends_its_own_radius_of_gyration():
    r = run("""
        sec = section.rectangle(b=100 mm, h=200 mm)
        c = column.buckling(L=3 m, E=200 GPa, F_y=250 MPa, section=sec)
        d = column.buckling(L=3 m, E=200 GPa, F_y=250 MPa, A=20000 mm^2, I_x=6.6666666666666667e7 mm^4,
                            I_y=1.6666666666666667e7 mm^4)
    """)
    assert r.ok, r.format_diagnostics()
    steps = {i.name: i for i in r.values["c"].working.items if isinstance(i, Step)}
    given = {i.name: i for i in r.values["d"].working.items if isinstance(i, Step)}
    assert "√(I/A)" not in steps["r_x"].description  # read from the section's own working
    assert "√(I/A)" in given["r_x"].description  # computed from the values given
    # rectangle: r = h/√12 (common practice)
    assert steps["r_x"].value.m_as("mm") == pytest.approx(200 / math.sqrt(12), rel=1e-12)


@pytest.mark.parametrize("system, E_unit, F_unit", [("SI", "GPa", "MPa"), ("US", "ksi", "ksi")])
def test_values_taken_from_a_material_are_shown_in_the_sheet_s_units(system, E_unit, F_unit):
    r = run(f"""
        ---
        units: {system}
        ---
        mat = material.steel(grade="S355")
        c = column.buckling(L=3 m, material=mat, A=6000 mm^2, I_x=8e7 mm^4, I_y=2e7 mm^4)
    """)
    assert r.ok, r.format_diagnostics()
    steps = {i.name: i for i in r.values["c"].working.items if isinstance(i, Step)}
    assert steps["E"].display_unit == U.Quantity(1, E_unit).units
    assert steps["F_y"].display_unit == U.Quantity(1, F_unit).units
