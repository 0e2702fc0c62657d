"""column.buckling against Euler's formula, the exact end-condition solutions and Johnson's parabola."""
import math
import textwrap

import pytest
from scipy.optimize import brentq

import calcsheet
from calcsheet_plugins.column.buckling import critical_stress, k_factor, transition_slenderness

E, FY = 200e3, 250.0  # MPa
A, IX, IY = 6000.0, 8.0e7, 2.0e7  # mm², mm⁴


def run(body):
    r = calcsheet.run("---\nproject: Column tests\n---\n" + textwrap.dedent(body))
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert not errs, [d.message for d in errs]
    return r


def sheet(L_m, ends, basis="theoretical"):
    return run(f"""
        c = column.buckling(L={L_m} m, ends="{ends}", K_basis="{basis}", E=200 GPa, F_y=250 MPa,
                            A=6000 mm^2, I_x=8e7 mm^4, I_y=2e7 mm^4)
        Pe_x = c.P_e_x
        Pe_y = c.P_e_y
        s = c.sigma_cr
        P = c.P_cr
    """)


@pytest.mark.parametrize("ends, K", [
    ("pinned-pinned", 1.0), ("fixed-fixed", 0.5), ("fixed-pinned", 0.7), ("fixed-free", 2.0),
])
def test_four_classic_end_conditions_follow_euler(ends, K):
    # Euler: P_cr = π²EI/(KL)², with the theoretical K of each end condition
    # (Timoshenko & Gere, Theory of Elastic Stability, §2.1–2.3 — from memory)
    L = 6.0
    r = sheet(L, ends)
    Pe_x = math.pi**2 * E * IX / (K * L * 1e3) ** 2 / 1e3  # kN
    Pe_y = math.pi**2 * E * IY / (K * L * 1e3) ** 2 / 1e3
    assert r.values["Pe_x"].m_as("kN") == pytest.approx(Pe_x, rel=1e-9)
    assert r.values["Pe_y"].m_as("kN") == pytest.approx(Pe_y, rel=1e-9)


def test_fixed_pinned_K_matches_the_exact_root():
    # the fixed–pinned column buckles at kL = 4.4934, the first root of tan(kL) = kL
    # (Timoshenko & Gere §2.3); K = π/kL = 0.6992, tabulated as 0.7
    kl = brentq(lambda z: math.tan(z) - z, 4.4, 4.6)
    assert k_factor("fixed-pinned", "theoretical")[0] == pytest.approx(math.pi / kl, rel=2e-3)
    assert k_factor("pinned-fixed", "theoretical")[0] == k_factor("fixed-pinned", "theoretical")[0]


@pytest.mark.parametrize("ends, K", [
    ("fixed-fixed", 0.65), ("fixed-pinned", 0.80), ("fixed-guided", 1.2), ("pinned-pinned", 1.0),
    ("fixed-free", 2.1), ("pinned-guided", 2.0),
])
def test_recommended_design_K_values(ends, K):
    # AISC 360-16 Commentary Table C-A-7.1, recommended design values (from memory)
    K_got, source = k_factor(ends, "design")
    assert K_got == K
    assert "Table C-A-7.1" in source


def test_johnson_meets_euler_at_half_the_yield_stress():
    # Johnson's parabola σ = F_y − (F_y/2π)²(KL/r)²/E is tangent to Euler's curve at σ = F_y/2,
    # at the transition slenderness C_c = √(2π²E/F_y) (Shigley's Mechanical Engineering Design, §4-14 — from memory)
    Cc = transition_slenderness(E, FY)
    assert Cc == pytest.approx(math.sqrt(2 * math.pi**2 * E / FY))
    assert math.pi**2 * E / Cc**2 == pytest.approx(FY / 2)  # Euler at C_c
    assert critical_stress(E, FY, Cc * (1 - 1e-9)) == pytest.approx(FY / 2, rel=1e-6)  # Johnson side
    assert critical_stress(E, FY, Cc * (1 + 1e-9)) == pytest.approx(FY / 2, rel=1e-6)  # Euler side
    for lam in (20.0, 60.0, 100.0):
        shigley = FY - (FY * lam / (2 * math.pi)) ** 2 / E
        assert critical_stress(E, FY, lam) == pytest.approx(shigley)
    assert critical_stress(E, FY, 0.0) == FY  # a stub column reaches yield


def test_governing_axis_and_range_from_a_sheet():
    r = run("""
        c = column.buckling(L=4 m, ends="pinned-pinned", E=200 GPa, F_y=250 MPa,
                            A=6000 mm^2, I_x=8e7 mm^4, I_y=2e7 mm^4)
        axis = c.axis
        s = c.sigma_cr
        lam = c.KL_r
    """)
    ry = math.sqrt(IY / A)
    lam = 4000 / ry  # 69.3 < C_c = 125.7: Johnson
    assert r.values["axis"] == "y"
    assert r.values["lam"].m_as("") == pytest.approx(lam)
    assert r.values["s"].m_as("MPa") == pytest.approx(FY - FY**2 * lam**2 / (4 * math.pi**2 * E))
    assert r.values["c"].fields["range"] == "inelastic (Johnson)"


def test_section_and_material_records_and_separate_y_restraint():
    r = run("""
        sec = section.rectangle(b=100 mm, h=200 mm)
        mat = material.steel(grade="S355")
        c = column.buckling(L=3 m, ends="fixed-free", ends_y="pinned-pinned", L_y=1.5 m, section=sec, material=mat)
        sx = c.sigma_cr_x
        sy = c.sigma_cr_y
    """)
    E2, Fy2 = 210e3, 355.0
    rx, ry = 200 / math.sqrt(12), 100 / math.sqrt(12)  # rectangle r = h/√12
    for got, lam in ((r.values["sx"], 2.1 * 3000 / rx), (r.values["sy"], 1.0 * 1500 / ry)):
        assert got.m_as("MPa") == pytest.approx(critical_stress(E2, Fy2, lam))


def test_missing_or_bad_input_names_the_parameter():
    r = calcsheet.run("---\nproject: t\n---\nc = column.buckling(L=3 m, E=200 GPa, A=6000 mm^2, I_x=8e7 mm^4, "
                      "I_y=2e7 mm^4)\n")
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert errs and "F_y" in errs[0].message
    r = calcsheet.run("---\nproject: t\n---\nc = column.buckling(L=0 m, E=200 GPa, F_y=250 MPa, A=6000 mm^2, "
                      "I_x=8e7 mm^4, I_y=2e7 mm^4)\n")
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert errs and "L must be greater than zero" in errs[0].message and errs[0].span.col == 21
