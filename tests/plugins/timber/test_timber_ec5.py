"""timber_design.ec5_*: each member check against the EN 1995-1-1 equations re-derived here in plain Python.

The re-derivation uses only the clause equations and the class values of EN 338:2009 / EN 14080:2013 (quoted
from memory beside each), never the plugin's own helpers.
"""
import math
import textwrap

import pytest

import calcsheet

HEAD = "---\nproject: timber tests\n---\n"


def run(body):
    r = calcsheet.run(HEAD + textwrap.dedent(body))
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert not errs, [d.message for d in errs]
    return r


def errors(body):
    r = calcsheet.run(HEAD + textwrap.dedent(body))
    return [d for d in r.diagnostics if d.severity == "error"]


def f(r, name, field, unit=""):
    return r.values[name].fields[field].m_as(unit)


# ------------------------------------------------------------------ a C24 floor joist, hand re-derivation
def ec5_beam_by_hand(b, h, L, M, V, F, l_b, wG, wQ, psi2, sc=2):
    """EN 1995-1-1, C24 (EN 338:2009 Table 1, from memory), solid softwood, medium-term action."""
    f_mk, f_vk, f_c90k, E05, Emean = 24.0, 4.0, 2.5, 7400.0, 11000.0      # MPa
    k_mod = {1: 0.8, 2: 0.8, 3: 0.65}[sc]                                 # Table 3.1, medium-term
    k_def = {1: 0.6, 2: 0.8, 3: 2.0}[sc]                                  # Table 3.2
    gM = 1.3                                                              # Table 2.3
    k_h = min((150 / h) ** 0.2, 1.3) if h < 150 else 1.0                  # (3.1)
    sigma = M * 1e6 / (b * h**2 / 6)
    f_md = k_mod * k_h * f_mk / gM                                        # (2.14)
    l_ef = 0.9 * L + 2 * h                                                # Table 6.1, load on the top edge
    s_crit = 0.78 * b**2 * E05 / (h * l_ef)                               # (6.32)
    lam = math.sqrt(f_mk / s_crit)                                        # (6.30)
    k_crit = 1 if lam <= 0.75 else (1.56 - 0.75 * lam if lam <= 1.4 else 1 / lam**2)   # (6.34)
    U_m = sigma / (k_crit * f_md)                                         # (6.33)
    tau = 1.5 * V * 1e3 / (0.67 * b * h)                                  # (6.13a), k_cr = 0.67
    U_v = tau / (k_mod * f_vk / gM)                                       # (6.13)
    A_ef = b * (l_b + min(30, l_b, (L - l_b) / 2))                       # 6.1.5(1), end bearing
    k_c90 = 1.5 if L - l_b >= 2 * h else 1.0                              # 6.1.5(4), discrete supports
    U_c90 = F * 1e3 / A_ef / (k_c90 * k_mod * f_c90k / gM)                # (6.3), (6.4)
    I = b * h**3 / 12
    uG = 5 * wG * L**4 / (384 * Emean * I)                                # N/mm = kN/m
    uQ = 5 * wQ * L**4 / (384 * Emean * I)
    u_fin = uG * (1 + k_def) + uQ * (1 + psi2 * k_def)                    # (2.3), (2.4)
    return dict(U_bending=U_m, U_shear=U_v, U_bearing=U_c90, u_inst=uG + uQ, u_fin=u_fin, k_crit=k_crit)


@pytest.mark.parametrize("b, h, L, sc", [(75, 225, 3600, 2), (47, 200, 4200, 1), (63, 125, 2400, 3)])
def test_beam_matches_the_clause_equations(b, h, L, sc):
    M, V, F, l_b, wG, wQ = 6.0, 7.0, 7.0, 60, 0.6, 1.5
    r = run(f"""
        j = timber_design.ec5_beam(grade="C24", b={b} mm, h={h} mm, L={L} mm, M_d={M} kN*m, V_d={V} kN,
            service_class={sc}, duration="medium-term", F_c_90_d={F} kN, l_b={l_b} mm,
            w_G={wG} kN/m, w_Q={wQ} kN/m, psi_2=0.3, limit_inst=300, limit_fin=250)
    """)
    hand = ec5_beam_by_hand(b, h, L, M, V, F, l_b, wG, wQ, 0.3, sc)
    for key in ("U_bending", "U_shear", "U_bearing", "k_crit"):
        assert f(r, "j", key) == pytest.approx(hand[key], rel=1e-9), key
    assert f(r, "j", "u_inst", "mm") == pytest.approx(hand["u_inst"], rel=1e-9)
    assert f(r, "j", "u_fin", "mm") == pytest.approx(hand["u_fin"], rel=1e-9)
    assert f(r, "j", "U_max") == pytest.approx(max(hand["U_bending"], hand["U_shear"], hand["U_bearing"],
                                                   hand["u_inst"] / (L / 300), hand["u_fin"] / (L / 250)))


def test_glulam_beam_uses_6_31_with_the_glulam_shear_modulus_and_k_h_of_3_2():
    r = run("""
        g = timber_design.ec5_beam(grade="GL24h", b=90 mm, h=450 mm, L=6 m, M_d=40 kN*m, V_d=25 kN,
            load_position="centroid")
    """)
    # EN 14080:2013 Table 5, GL24h (from memory): f_m,k 24, E_0,05 9600, G_05 540 MPa
    b, h, L = 90.0, 450.0, 6000.0
    k_h = min((600 / h) ** 0.1, 1.1)                                      # (3.2)
    I_z, W_y = h * b**3 / 12, b * h**2 / 6
    I_tor = h * b**3 * (1 / 3 - 0.21 * (b / h) * (1 - b**4 / (12 * h**4)))
    s_crit = math.pi * math.sqrt(9600 * I_z * 540 * I_tor) / (0.9 * L * W_y)   # (6.31), Table 6.1
    lam = math.sqrt(24 / s_crit)
    k_crit = 1.56 - 0.75 * lam if 0.75 < lam <= 1.4 else (1 if lam <= 0.75 else lam**-2)
    U = 40e6 / W_y / (k_crit * 0.8 * k_h * 24 / 1.25)                    # γ_M = 1.25 for glulam
    assert f(r, "g", "k_h") == pytest.approx(k_h)
    assert f(r, "g", "k_crit") == pytest.approx(k_crit, rel=1e-9)
    assert f(r, "g", "U_bending") == pytest.approx(U, rel=1e-9)


def test_a_braced_beam_takes_k_crit_one_and_k_sys_raises_the_strength():
    r = run("""
        a = timber_design.ec5_beam(grade="C24", b=47 mm, h=200 mm, L=4 m, M_d=3 kN*m, V_d=3 kN, braced="yes")
        s = timber_design.ec5_beam(grade="C24", b=47 mm, h=200 mm, L=4 m, M_d=3 kN*m, V_d=3 kN, braced="yes",
            k_sys="yes")
    """)
    assert f(r, "a", "k_crit") == 1
    assert f(r, "a", "U_bending") / f(r, "s", "U_bending") == pytest.approx(1.1)   # 6.6(2)


# ------------------------------------------------------------------ columns and beam-columns
def ec5_column_by_hand(grade, b, h, L, N, My=0.0, Mz=0.0, sc=1):
    """EN 1995-1-1 6.3.2, C24 or GL24h (class values from memory)."""
    f_c0k, E05, f_mk, gM, beta = {"C24": (21, 7400, 24, 1.3, 0.2), "GL24h": (24, 9600, 24, 1.25, 0.1)}[grade]
    k_mod = 0.8
    f_c0d = k_mod * f_c0k / gM
    out = {}
    for ax, d in (("y", h), ("z", b)):
        lam_rel = (L / (d / math.sqrt(12))) / math.pi * math.sqrt(f_c0k / E05)      # (6.21), (6.22)
        k = 0.5 * (1 + beta * (lam_rel - 0.3) + lam_rel**2)                          # (6.27), (6.28)
        out[f"lambda_rel_{ax}"] = lam_rel
        out[f"k_c_{ax}"] = 1.0 if lam_rel <= 0.3 else 1 / (k + math.sqrt(k**2 - lam_rel**2))
    sc_ = N * 1e3 / (b * h)
    def k_h(d):                                                           # (3.1) solid, (3.2) glulam
        if grade == "C24":
            return min((150 / d) ** 0.2, 1.3) if d < 150 else 1.0
        return min((600 / d) ** 0.1, 1.1) if d < 600 else 1.0
    k_hy, k_hz = k_h(h), k_h(b)
    smy, smz = My * 1e6 / (b * h**2 / 6), Mz * 1e6 / (h * b**2 / 6)
    fmy, fmz = k_mod * k_hy * f_mk / gM, k_mod * k_hz * f_mk / gM
    out["U_y"] = sc_ / (out["k_c_y"] * f_c0d) + smy / fmy + 0.7 * smz / fmz        # (6.23)
    out["U_z"] = sc_ / (out["k_c_z"] * f_c0d) + 0.7 * smy / fmy + smz / fmz        # (6.24)
    return out


@pytest.mark.parametrize("grade, b, h, L, N, My, Mz", [
    ("C24", 100, 200, 3750, 30, 1.0, 0.3),     # dimensions of Porteous & Kermani's Example 5.7.3 (C24 100×200,
                                               # 3.75 m, service class 2) - actions invented here
    ("C24", 140, 140, 2800, 80, 0.0, 0.0),
    ("GL24h", 140, 160, 3000, 100, 2.0, 0.0),
])
def test_column_matches_the_clause_equations(grade, b, h, L, N, My, Mz):
    mom = (f", M_y_d={My} kN*m" if My else "") + (f", M_z_d={Mz} kN*m" if Mz else "")
    r = run(f"""
        c = timber_design.ec5_column(grade="{grade}", b={b} mm, h={h} mm, L={L} mm, N_d={N} kN{mom}, braced="yes")
    """)
    hand = ec5_column_by_hand(grade, b, h, L, N, My, Mz)
    for key, v in hand.items():
        assert f(r, "c", key) == pytest.approx(v, rel=1e-9), key


def test_a_stocky_post_uses_the_cross_section_checks_6_19_and_6_20():
    r = run("""
        c = timber_design.ec5_column(grade="C24", b=200 mm, h=200 mm, L=0.5 m, N_d=200 kN, M_y_d=5 kN*m)
    """)
    sigma_c = 200e3 / 200**2
    f_c0d, f_md = 0.8 * 21 / 1.3, 0.8 * 24 / 1.3
    sm = 5e6 / (200 * 200**2 / 6)
    assert f(r, "c", "U_y") == pytest.approx((sigma_c / f_c0d) ** 2 + sm / f_md, rel=1e-9)          # (6.19)
    assert f(r, "c", "U_z") == pytest.approx((sigma_c / f_c0d) ** 2 + 0.7 * sm / f_md, rel=1e-9)    # (6.20)
    assert "(6.19)" in r.values["c"].fields["governing"]


def test_a_beam_column_checks_6_35_with_k_crit():
    r = run("""
        c = timber_design.ec5_column(grade="C24", b=63 mm, h=250 mm, L=4 m, N_d=20 kN, M_y_d=4 kN*m)
    """)
    hand = ec5_column_by_hand("C24", 63, 250, 4000, 20, 4.0)
    s_crit = 0.78 * 63**2 * 7400 / (250 * 4000)                         # (6.32), constant moment l_ef = l
    lam = math.sqrt(24 / s_crit)
    k_crit = 1.56 - 0.75 * lam if 0.75 < lam <= 1.4 else (1 if lam <= 0.75 else lam**-2)
    sm = 4e6 / (63 * 250**2 / 6)
    U = (sm / (k_crit * 0.8 * 24 / 1.3)) ** 2 + 20e3 / (63 * 250) / (hand["k_c_z"] * 0.8 * 21 / 1.3)  # (6.35)
    assert f(r, "c", "U_ltb") == pytest.approx(U, rel=1e-9)


# ------------------------------------------------------------------ strengths, errors
def test_strengths_chain_for_the_boardwalk_class():
    r = run("""
        s = timber_design.ec5_strengths(grade="C16", h=100 mm, service_class=3, duration="short-term")
    """)
    k_h = (150 / 100) ** 0.2                                               # (3.1)
    assert f(r, "s", "f_m_d", "MPa") == pytest.approx(0.7 * k_h * 16 / 1.3)  # k_mod SC3 short-term 0.70
    assert f(r, "s", "f_v_d", "MPa") == pytest.approx(0.7 * 3.2 / 1.3)
    assert f(r, "s", "k_def") == 2.0
    assert r.values["s"].fields["governing"] == "k_mod"


@pytest.mark.parametrize("body, where, words", [
    ('timber_design.ec5_beam(grade="C24", b=75 mm, h=200 mm, L=3 m, M_d=1 kN*m, V_d=1 kN, service_class=4)',
     "service_class=4", "2.3.1.3"),
    ('timber_design.ec5_beam(grade="C24", b=75 mm, h=200 mm, L=3 m, M_d=1 kN*m, V_d=1 kN, w_G=1 kN/m, w_Q=1 kN/m, '
     'psi_2=0.3)', "w_G=1 kN/m", "Table 7.2"),
    ('timber_design.ec5_beam(grade="C24", b=75 mm, h=200 mm, L=3 m, M_d=1 kN*m, V_d=1 kN, F_c_90_d=3 kN)',
     "F_c_90_d=3 kN", "l_b"),
    ('timber_design.ec5_column(grade="C24", b=75 mm, h=200 mm, L=3 m, N_d=-1 kN)', "N_d=-1 kN", "6.1.2"),
])
def test_out_of_scope_and_bad_input_are_located_errors(body, where, words):
    errs = errors(f"x = {body}\n")
    assert len(errs) == 1
    e = errs[0]
    line = HEAD.count("\n") + 1
    col = f"x = {body}".index(where) + 1
    assert (e.span.line, e.span.col) == (line, col)
    assert words in e.message


def test_a_wrong_dimension_at_the_call_is_caught_before_running():
    errs = errors('x = timber_design.ec5_beam(grade="C24", b=75 kN, h=200 mm, L=3 m, M_d=1 kN*m, V_d=1 kN)\n')
    assert errs and "length" in errs[0].message


def test_an_unknown_class_is_refused_with_a_suggestion():
    errs = errors('x = timber_design.ec5_grade(grade="C25")\n')
    assert errs and "C24" in (errs[0].hint or "") + errs[0].message


# ------------------------------------------------------------------ single checks stay callable
def test_single_checks_agree_with_the_member_calls_and_the_equations():
    r = run("""
        a = timber_design.ec5_k_c(grade="C24", b=100 mm, h=200 mm, l_ef_y=3.75 m)
        c = timber_design.ec5_column(grade="C24", b=100 mm, h=200 mm, L=3.75 m, N_d=30 kN)
        k = timber_design.ec5_k_crit(grade="C24", b=75 mm, h=225 mm, L=3.6 m)
        br = timber_design.ec5_bearing(grade="C24", b=75 mm, h=225 mm, L=4 m, F_c_90_d=8 kN, l_b=75 mm, a_end=40 mm)
        df = timber_design.ec5_deflection(grade="C24", b=75 mm, h=225 mm, L=4 m, u_G=3 mm, u_Q=6 mm, psi_2=0.3,
            limit_inst=300, limit_fin=250, service_class=2)
    """)
    for key in ("k_c_y", "k_c_z", "lambda_rel_y", "lambda_rel_z"):
        assert f(r, "a", key) == pytest.approx(f(r, "c", key), rel=1e-12)
    lam = math.sqrt(24 / (0.78 * 75**2 * 7400 / (225 * (0.9 * 3600 + 2 * 225))))     # (6.30), (6.32)
    assert f(r, "k", "k_crit") == pytest.approx(1.56 - 0.75 * lam, rel=1e-9)         # (6.34)
    # 6.1.5(1): 30 mm added on both sides (a = 40 mm ≥ 30 mm from the end); k_c,90 = 1.5 (6.1.5(4))
    assert f(r, "br", "U_bearing") == pytest.approx(8e3 / (75 * (75 + 60)) / (1.5 * 0.8 * 2.5 / 1.3), rel=1e-9)
    assert f(r, "df", "u_fin", "mm") == pytest.approx(3 * 1.8 + 6 * (1 + 0.3 * 0.8), rel=1e-9)  # (2.3), (2.4)


@pytest.mark.parametrize("extra, where", [
    ("psi_2=1.5, limit_inst=300, limit_fin=250", "psi_2=1.5"),
    ("psi_2=0.3, limit_inst=0, limit_fin=250", "limit_inst=0"),
])
def test_deflection_inputs_are_validated_where_they_are_given(extra, where):
    body = ('x = timber_design.ec5_beam(grade="C24", b=75 mm, h=200 mm, L=3 m, M_d=1 kN*m, V_d=1 kN, w_G=1 kN/m, '
            f'w_Q=1 kN/m, {extra})')
    errs = errors(body + "\n")
    assert len(errs) == 1 and errs[0].span.col == body.index(where) + 1


def test_a_negative_moment_is_refused_rather_than_lowering_the_utilisation():
    errs = errors('x = timber_design.ec5_column(grade="C24", b=100 mm, h=200 mm, L=3 m, N_d=10 kN, M_y_d=-2 kN*m)\n')
    assert errs and "magnitude" in errs[0].message


from hypothesis import given, settings  # noqa: E402
from hypothesis import strategies as st  # noqa: E402


@given(b=st.integers(38, 120), h=st.integers(100, 400), L=st.integers(1500, 9000), sc=st.sampled_from([1, 2, 3]))
@settings(max_examples=20, deadline=None)
def test_any_rectangular_c24_beam_matches_the_clause_equations(b, h, L, sc):
    # spans every range of k_crit (6.34) and both branches of k_h (3.1)
    r = run(f"""
        j = timber_design.ec5_beam(grade="C24", b={b} mm, h={h} mm, L={L} mm, M_d=5 kN*m, V_d=5 kN,
            service_class={sc}, F_c_90_d=5 kN, l_b=60 mm, w_G=0.5 kN/m, w_Q=1 kN/m, psi_2=0.3,
            limit_inst=300, limit_fin=250)
    """)
    hand = ec5_beam_by_hand(b, h, L, 5.0, 5.0, 5.0, 60, 0.5, 1.0, 0.3, sc)
    k_h = min((150 / h) ** 0.2, 1.3) if h < 150 else 1.0
    for key in ("U_bending", "U_shear", "U_bearing", "k_crit"):
        assert f(r, "j", key) == pytest.approx(hand[key], rel=1e-9), key
    assert f(r, "j", "k_h") == pytest.approx(k_h)


def test_the_factor_chain_is_a_table_with_a_reason_for_each_factor():
    from calcsheet.trace import Note, Table
    r = run("""
        g = timber_design.ec5_beam(grade="GL24h", b=90 mm, h=450 mm, L=6 m, M_d=40 kN*m, V_d=25 kN)
    """)
    items = r.values["g"].working.items
    table = next(i for i in items if isinstance(i, Table))
    assert table.columns == ["factor", "value", "why it applies"]
    assert [row[0] for row in table.rows] == ["k_mod", "γ_M", "k_h", "k_crit"]
    assert all(row[2] for row in table.rows)
    notes = [i.text for i in items if isinstance(i, Note)]
    assert any(t.startswith("Governing factor: k_crit") for t in notes)
    assert any(t.startswith("Governing check: bending") for t in notes)
