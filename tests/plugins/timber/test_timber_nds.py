"""timber_design.nds_*: beams and columns against the NDS 2018 equations re-derived here in plain Python.

Reference values are DF-L No.2 from NDS Supplement 2018 Table 4A (from memory): F_b 900, F_v 180, F_c⊥ 625,
F_c 1350 psi, E 1.6e6, E_min 0.58e6 psi; dressed sizes from Supplement Table 1B.
"""
import math
import textwrap

import pytest

import calcsheet

HEAD = "---\nproject: timber tests\nunits: US\n---\n"


def run(body):
    r = calcsheet.run(HEAD + textwrap.dedent(body))
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert not errs, [d.message for d in errs]
    return r


def errors(body):
    return [d for d in calcsheet.run(HEAD + textwrap.dedent(body)).diagnostics if d.severity == "error"]


def f(r, name, field, unit=""):
    return r.values[name].fields[field].m_as(unit)


def C_L(alpha):
    """NDS Eq. (3.3-6), written out again."""
    a = (1 + alpha) / 1.9
    return a - math.sqrt(a * a - alpha / 0.95)


def C_P(alpha, c):
    """NDS Eq. (3.7-1), written out again."""
    a = (1 + alpha) / (2 * c)
    return a - math.sqrt(a * a - alpha / c)


def test_repetitive_2x10_joist_braced_by_its_subfloor():
    r = run("""
        j = timber_design.nds_beam(species="Douglas Fir-Larch", grade="No.2", size="2x10", L=13 ft,
            M=1465 lbf*ft, V=451 lbf, repetitive="yes", R=451 lbf, l_b=1.5 in,
            w_LT=16 plf, w_ST=53.3 plf, limit_ST=360, limit_T=240)
    """)
    b, d, L = 1.5, 9.25, 13 * 12
    Fb_p = 900 * 1.0 * 1.1 * 1.15          # C_D 1.0 (10 years), C_F 1.1 (2x10, Table 4A), C_r 1.15 (4.3.9)
    assert f(r, "j", "F_b_p", "psi") == pytest.approx(Fb_p)
    assert f(r, "j", "U_bending") == pytest.approx(1465 * 12 / (b * d**2 / 6) / Fb_p, rel=1e-9)
    assert f(r, "j", "U_shear") == pytest.approx(1.5 * 451 / (b * d) / 180, rel=1e-9)     # (3.4-2)
    assert f(r, "j", "U_bearing") == pytest.approx(451 / (b * 1.5) / 625, rel=1e-9)
    I = b * d**3 / 12
    dLT = 5 * (16 / 12) * L**4 / (384 * 1.6e6 * I)
    dST = 5 * (53.3 / 12) * L**4 / (384 * 1.6e6 * I)
    assert f(r, "j", "Delta_T", "in") == pytest.approx(1.5 * dLT + dST, rel=1e-9)          # 3.5.2, K_cr 1.5
    assert f(r, "j", "U_defl_ST") == pytest.approx(dST / (L / 360), rel=1e-9)


def test_unbraced_beam_takes_C_L_from_table_3_3_3_and_eq_3_3_6():
    r = run("""
        j = timber_design.nds_beam(species="Douglas Fir-Larch", grade="No.2", size="2x12", L=10 ft,
            M=1000 lbf*ft, V=400 lbf, l_u=10 ft, load_duration="2 months")
    """)
    b, d, lu = 1.5, 11.25, 120.0
    le = 1.63 * lu + 3 * d                  # Table 3.3.3, single span uniform load, 7 <= l_u/d <= 14.3
    assert 7 <= lu / d <= 14.3
    RB = math.sqrt(le * d / b**2)           # (3.3-5)
    FbE = 1.20 * 580_000 / RB**2
    Fb_star = 900 * 1.15 * 1.0              # C_D 1.15 (2 months), C_F 1.0 (2x12)
    assert f(r, "j", "C_L") == pytest.approx(C_L(FbE / Fb_star), rel=1e-9)
    assert f(r, "j", "F_b_p", "psi") == pytest.approx(Fb_star * C_L(FbE / Fb_star), rel=1e-9)


def test_glulam_beam_takes_the_lesser_of_C_L_and_C_V():
    r = run("""
        g = timber_design.nds_beam(species="Glulam DF/DF", grade="24F-V4", b=5.125 in, d=24 in, L=20.33 ft,
            M=73000 lbf*ft, V=14000 lbf)
    """)
    # NDS 5.3.6 Eq. (5.3-1), x = 10 for species other than Southern Pine
    C_V = (21 / 20.33) ** 0.1 * (12 / 24) ** 0.1 * (5.125 / 5.125) ** 0.1
    assert f(r, "g", "C_V") == pytest.approx(C_V, rel=1e-9)
    assert f(r, "g", "F_b_p", "psi") == pytest.approx(2400 * C_V, rel=1e-9)   # braced: C_L = 1 > C_V


def test_axially_loaded_post_C_P():
    r = run("""
        p = timber_design.nds_column(species="Douglas Fir-Larch", grade="No.2", size="4x4", L=8 ft, P=3000 lbf)
    """)
    le_d = 96 / 3.5
    FcE = 0.822 * 580_000 / le_d**2         # 3.7.1.5
    Fc_star = 1350 * 1.0 * 1.15             # C_F 1.15 for F_c of a 4x4 (Table 4A)
    cp = C_P(FcE / Fc_star, 0.8)            # c = 0.8, sawn lumber
    assert f(r, "p", "C_P") == pytest.approx(cp, rel=1e-9)
    assert f(r, "p", "U_axial") == pytest.approx(3000 / 3.5**2 / (Fc_star * cp), rel=1e-9)


def test_beam_column_interaction_eq_3_9_3():
    r = run("""
        p = timber_design.nds_column(species="Douglas Fir-Larch", grade="No.2", size="4x6", L=8.5 ft, P=3150 lbf,
            M_x=459 lbf*ft, load_duration="2 months")
    """)
    b, d, L = 3.5, 5.5, 102.0
    Emin = 580_000
    FcE1, FcE2 = 0.822 * Emin / (L / d) ** 2, 0.822 * Emin / (L / b) ** 2
    Fc_star = 1350 * 1.15 * 1.1                              # C_D 1.15, C_F 1.1 (4x6, F_c)
    Fc_p = Fc_star * C_P(min(FcE1, FcE2) / Fc_star, 0.8)
    le = 1.84 * L                                            # Table 3.3.3 "any", l_u/d > 14.3
    FbE = 1.20 * Emin / (le * d / b**2)
    Fb_star = 900 * 1.15 * 1.3                               # C_F 1.3 for F_b, 4" thick, 6" wide
    Fb_p = Fb_star * C_L(FbE / Fb_star)
    fc, fb1 = 3150 / (b * d), 459 * 12 / (b * d**2 / 6)
    U = (fc / Fc_p) ** 2 + fb1 / (Fb_p * (1 - fc / FcE1))     # (3.9-3), uniaxial
    assert f(r, "p", "U_interaction") == pytest.approx(U, rel=1e-9)
    assert r.values["p"].fields["governing"].startswith("combined")


@pytest.mark.parametrize("body, where, words", [
    ('timber_design.nds_column(species="Douglas Fir-Larch", grade="No.2", size="2x4", L=12 ft, P=100 lbf)',
     "L=12 ft", "3.7.1.4"),
    ('timber_design.nds_beam(species="Douglas Fir-Larch", grade="No.2", size="2x12", L=30 ft, M=1 lbf*ft, V=1 lbf, '
     'l_u=30 ft)', "l_u=30 ft", "3.3.3.7"),
    ('timber_design.nds_beam(species="Glulam DF/DF", grade="24F-V4", b=5.125 in, d=12 in, L=10 ft, M=1 lbf*ft, '
     'V=1 lbf, repetitive="yes")', 'repetitive="yes"', "4.3.9"),
    ('timber_design.nds_beam(species="Spruce-Pine-Fir", grade="No.2", size="2x8", L=10 ft, M=1 lbf*ft, V=1 lbf)',
     'grade="No.2"', "No.1/No.2"),
    ('timber_design.nds_beam(species="Douglas Fir-Larch", grade="No.2", b=1.5 in, d=9.25 in, L=10 ft, M=1 lbf*ft, '
     'V=1 lbf)', "b=1.5 in", "C_F"),
    ('timber_design.nds_column(species="Glulam DF/DF", grade="24F-V4", b=6.75 in, d=9 in, L=10 ft, P=1 lbf)',
     'grade="24F-V4"', "Table 5B"),
])
def test_out_of_scope_cases_are_located_errors_naming_the_clause(body, where, words):
    errs = errors(f"x = {body}\n")
    assert len(errs) == 1, [e.message for e in errs]
    e = errs[0]
    assert (e.span.line, e.span.col) == (HEAD.count("\n") + 1, f"x = {body}".index(where) + 1)
    assert words in e.message


def test_wet_service_waives_C_M_for_low_F_b_times_C_F():
    r = run("""
        a = timber_design.nds_beam(species="Douglas Fir-Larch", grade="No.2", size="2x10", L=10 ft, M=500 lbf*ft,
            V=100 lbf, wet="yes")
        s = timber_design.nds_beam(species="Douglas Fir-Larch", grade="Select Structural", size="2x10", L=10 ft,
            M=500 lbf*ft, V=100 lbf, wet="yes")
    """)
    # Table 4A: C_M = 0.85 for F_b unless F_b·C_F ≤ 1150 psi; 900·1.1 = 990 (waived), 1500·1.1 = 1650 (applies)
    assert f(r, "a", "F_b_p", "psi") == pytest.approx(900 * 1.1)
    assert f(r, "s", "F_b_p", "psi") == pytest.approx(1500 * 1.1 * 0.85)
    assert f(r, "a", "F_v_p", "psi") == pytest.approx(180 * 0.97)


def test_adjusted_values_multiply_the_applicable_factors_of_table_4_3_1():
    r = run("""
        a = timber_design.nds_adjusted(species="Spruce-Pine-Fir", grade="No.1/No.2", size="2x6", wet="yes",
            temperature="100F-125F", incised="yes", repetitive="yes")
    """)
    # SPF No.1/No.2 (Table 4A, from memory): F_b 875, F_v 135, F_c 1150, F_c⊥ 425, E_min 510 000 psi.
    # Wet: C_M waived for F_b (875·1.3 ≤ 1150 psi), 0.97 F_v, 0.8 F_c, 0.67 F_c⊥, 0.9 E (Table 4A);
    # 100-125 °F wet: C_t 0.7 (F_b, F_v, F_c, F_c⊥), 0.9 (E) (Table 2.3.3); incised: 0.8, E 0.95 (Table 4.3.8)
    assert f(r, "a", "F_b_p", "psi") == pytest.approx(875 * 1.0 * 0.7 * 1.3 * 0.8 * 1.15)
    assert f(r, "a", "F_v_p", "psi") == pytest.approx(135 * 0.97 * 0.7 * 0.8)
    assert f(r, "a", "F_c_star", "psi") == pytest.approx(1150 * 0.8 * 0.7 * 1.1 * 0.8)
    assert f(r, "a", "F_c_perp_p", "psi") == pytest.approx(425 * 0.67 * 0.7)
    assert f(r, "a", "E_min_p", "psi") == pytest.approx(510_000 * 0.9 * 0.9 * 0.95)


def test_a_combination_names_its_duration_either_way():
    # the loads plugin's combinations spell durations out ("two months"); Table 2.3.2 writes "2 months"
    r = run("""
        a = timber_design.nds_adjusted(species="Douglas Fir-Larch", grade="No.2", size="2x8", load_duration="two months")
        b = timber_design.nds_adjusted(species="Douglas Fir-Larch", grade="No.2", size="2x8", load_duration="2 months")
    """)
    assert f(r, "a", "C_D") == f(r, "b", "C_D") == 1.15        # NDS 2018 Table 2.3.2, snow


def test_deflections_from_an_analysis_take_the_creep_factor():
    r = run("""
        j = timber_design.nds_beam(species="Douglas Fir-Larch", grade="No.2", size="2x10", L=13 ft, M=1000 lbf*ft,
            V=300 lbf, D_LT=0.1 in, D_ST=0.3 in, limit_ST=360, limit_T=240)
    """)
    assert f(r, "j", "Delta_T", "in") == pytest.approx(1.5 * 0.1 + 0.3)        # 3.5.2, K_cr = 1.5 (dry lumber)
    assert f(r, "j", "U_defl_T") == pytest.approx((1.5 * 0.1 + 0.3) / (156 / 240))
    errs = errors('x = timber_design.nds_beam(species="Douglas Fir-Larch", grade="No.2", size="2x10", L=13 ft, '
                  'M=1 lbf*ft, V=1 lbf, D_LT=0.1 in, limit_ST=360, limit_T=240)\n')
    assert errs and "D_ST" in errs[0].message


def test_every_reason_in_a_factor_table_fits_on_the_page():
    # the package prints table cells without wrapping; a long reason would run off the page
    from calcsheet.trace import Table
    r = run("""
        a = timber_design.nds_adjusted(species="Spruce-Pine-Fir", grade="No.1/No.2", size="2x6", wet="yes",
            temperature="125F-150F", incised="yes", repetitive="yes", flat_use="yes", load_duration="impact")
        p = timber_design.nds_column(species="Douglas Fir-Larch", grade="No.2", size="4x6", L=8.5 ft, P=3150 lbf,
            M_x=459 lbf*ft, M_y=100 lbf*ft, load_duration="2 months")
        e = timber_design.ec5_beam(grade="GL24c", b=90 mm, h=300 mm, L=6 m, M_d=10 kN*m, V_d=5 kN, k_sys="yes",
            service_class=3, duration="instantaneous")
    """)
    for name in ("a", "p", "e"):
        table = next(i for i in r.values[name].working.items if isinstance(i, Table))
        assert all(len(row[2]) <= 70 for row in table.rows), name
