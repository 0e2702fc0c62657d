"""AISC 360-16 checks against the AISC Design Examples (Companion to the AISC Steel Construction Manual,
Volume 1), as printed in v16.0.

Each test names its example; the expected values are the examples' printed results, looked up in the stored
text of the v16.0 examples, matched within the examples' own rounding (three significant figures; where an
example rounds an intermediate value such as L_b = 11.7 ft the test says so). v16.0 accompanies AISC 360-22;
every equation these tests exercise (B4.1, E3, E4-2, E7, F2, F3, F6, F7-1…F7-4, F7-10…F7-13, F8, G2.1, G4, G5,
H1-1) carries over unchanged from 360-16, except F7-2, whose 360-16 form (3.57(b/t)√(F_y/E) − 4.0) and 360-22
form (linear in λ) agree at the example's b/t within its rounding. Inputs are the section properties the
examples print; properties an example does not print (needed only to build the section record) are from the
AISC Manual Table 1-1 family and marked # from memory.
"""
import pytest

from .conftest import W14X99, W14X132, W18X50, W24X62, call, errors, f, run

A992 = "F_y=50 ksi"


# ---------------------------------------------------------------- Example F.1-1A: W18×50, continuously braced
def test_F_1_1A_continuously_braced_W18x50():
    lrfd = call(W18X50, "aisc_beam", f"{A992}, L_b=0 ft, M_rx=266 kip*ft")
    asd = call(W18X50, "aisc_beam", f"{A992}, L_b=0 ft, M_rx=184 kip*ft, method=\"ASD\"")
    assert f(lrfd["M_cx"], "kip*ft") == pytest.approx(379, abs=0.5)  # φ_bM_n = 379 kip-ft
    assert f(asd["M_cx"], "kip*ft") == pytest.approx(252, abs=0.5)   # M_n/Ω_b = 252 kip-ft
    assert lrfd["class_flange_flexure"] == "compact" and lrfd["class_web_flexure"] == "compact"
    assert lrfd["governing_flexure"].startswith("yielding")


# ---------------------------------------------------------------- Example F.1-2B: braced at third points
def test_F_1_2B_W18x50_braced_at_third_points_inelastic_LTB():
    # the example rounds L_b to 11.7 ft, L_r to 16.9 ft and C_b to 1.01 (from its F1-1 moments 1.00/0.972/1.00/0.972)
    cb = call(W18X50, "aisc_beam", f"{A992}, L_b=11.7 ft, M_max=1 kip*ft, M_A=0.972 kip*ft, M_B=1 kip*ft, "
                                   "M_C=0.972 kip*ft")
    assert f(cb["C_b"]) == pytest.approx(1.01, abs=0.005)
    args = f"{A992}, L_b=11.7 ft, C_b=1.01"
    out = call(W18X50, "aisc_beam", args)
    asd = call(W18X50, "aisc_beam", args + ', method="ASD"')
    assert f(out["L_p"], "in") == pytest.approx(69.9, abs=0.05)    # L_p = 69.9 in. (5.83 ft), Eq. F2-5
    assert f(out["L_r"], "in") == pytest.approx(203, abs=0.5)      # L_r = 203 in. (16.9 ft), Eq. F2-6
    assert f(out["M_nx"], "kip*in") == pytest.approx(4060, rel=0.003)  # M_n = 4,060 kip-in., Eq. F2-2
    assert f(out["M_cx"], "kip*ft") == pytest.approx(304, rel=0.004)   # φ_bM_n = 304 kip-ft
    assert f(asd["M_cx"], "kip*ft") == pytest.approx(202, rel=0.005)   # M_n/Ω_b = 202 kip-ft
    assert "inelastic" in out["governing_flexure"]


# ---------------------------------------------------------------- Example F.1-3B: braced at mid-span
def test_F_1_3B_W18x50_braced_at_midspan_elastic_LTB_with_Cb_from_F1_1():
    # the unbraced half of a uniformly loaded span: M/M_max at its quarter points = 7/16, 3/4, 15/16
    args = f"{A992}, L_b=17.5 ft, M_max=1 kip*ft, M_A=0.4375 kip*ft, M_B=0.75 kip*ft, M_C=0.9375 kip*ft"
    lrfd = call(W18X50, "aisc_beam", args)
    asd = call(W18X50, "aisc_beam", args + ', method="ASD"')
    assert f(lrfd["C_b"]) == pytest.approx(1.30, abs=0.005)           # C_b = 1.30
    assert f(lrfd["M_nx"], "kip*in") == pytest.approx(3840, rel=0.003)  # M_n = F_crS_x = 3,840 kip-in. (F_cr = 43.2 ksi)
    assert f(lrfd["M_cx"], "kip*ft") == pytest.approx(288, rel=0.004)  # φ_bM_n = 288 kip-ft
    assert f(asd["M_cx"], "kip*ft") == pytest.approx(192, rel=0.004)   # M_n/Ω_b = 192 kip-ft
    assert "elastic" in lrfd["governing_flexure"] and "inelastic" not in lrfd["governing_flexure"]


# ---------------------------------------------------------------- Example E.1A: W14×132 column
def test_E_1A_W14x132_column_30_ft():
    lrfd = call(W14X132, "aisc_column", f"{A992}, L=30 ft, P_r=840 kip")
    asd = call(W14X132, "aisc_column", f"{A992}, L=30 ft, P_r=560 kip, method=\"ASD\"")
    assert f(lrfd["P_c"], "kip") == pytest.approx(893, abs=0.6)  # φ_cP_n = 893 kips
    assert f(asd["P_c"], "kip") == pytest.approx(594, abs=0.6)   # P_n/Ω_c = 594 kips
    assert f(lrfd["F_e"], "ksi") == pytest.approx(31.3, abs=0.1)  # F_e ≈ 31.3 ksi (y-axis)
    assert "about y" in lrfd["governing_compression"]
    assert lrfd["class_flange_compression"] == "nonslender"


# ---------------------------------------------------------------- Example G.1B: W24×62 shear
def test_G_1B_W24x62_shear_rolled_I_exception():
    lrfd = call(W24X62, "aisc_shear", f"{A992}, V_r=290 kip")
    asd = call(W24X62, "aisc_shear", f"{A992}, V_r=193 kip, method=\"ASD\"")
    assert f(lrfd["V_c"], "kip") == pytest.approx(306, abs=0.5)  # φ_vV_n = 306 kips (φ_v = 1.00, C_v1 = 1.0)
    assert f(asd["V_c"], "kip") == pytest.approx(204, abs=0.5)   # V_n/Ω_v = 204 kips (Ω_v = 1.50)


# ---------------------------------------------------------------- Example H.1B: W14×99 beam-column
def test_H_1B_W14x99_beam_column_interaction():
    out = call(W14X99, "aisc_beam_column",
               f"{A992}, L=14 ft, L_b=14 ft, C_b=1.0, P_r=400 kip, M_rx=250 kip*ft, M_ry=80 kip*ft")
    assert f(out["P_c"], "kip") == pytest.approx(1130, rel=0.005)     # φ_cP_n = 1,130 kips
    assert f(out["M_cx"], "kip*ft") == pytest.approx(642, rel=0.003)  # φ_bM_nx = 642 kip-ft
    assert f(out["M_cy"], "kip*ft") == pytest.approx(311, rel=0.003)  # φ_bM_ny = 311 kip-ft
    assert f(out["util_interaction"]) == pytest.approx(0.929, abs=0.002)  # H1-1a: 0.929 ≤ 1.0
    # W14×99's flange is noncompact in flexure (b_f/2t_f = 9.34 > λ_p = 9.15): F3 and F6-2 apply
    assert out["class_flange_flexure"] == "noncompact"
    assert "noncompact" in out["governing_flexure_y"]


def test_H_1B_ASD_W14x99_beam_column():
    out = call(W14X99, "aisc_beam_column", f"{A992}, L=14 ft, L_b=14 ft, C_b=1.0, P_r=267 kip, M_rx=167 kip*ft, "
                                           "M_ry=53.3 kip*ft, method=\"ASD\"")
    assert f(out["P_c"], "kip") == pytest.approx(750, rel=0.003)      # P_n/Ω_c = 750 kips
    assert f(out["M_cx"], "kip*ft") == pytest.approx(427, rel=0.003)  # M_nx/Ω_b = 427 kip-ft
    assert f(out["M_cy"], "kip*ft") == pytest.approx(207, rel=0.003)  # M_ny/Ω_b = 207 kip-ft
    assert f(out["util_interaction"]) == pytest.approx(0.933, abs=0.002)  # H1-1a: 0.933


def test_H_1B_interaction_alone():
    # H1-1a with Example H.1B's available strengths: 400/1130 + 8/9(250/642 + 80/311) = 0.929
    r = run('i = steel_design.aisc_interaction(P_r=400 kip, P_c=1130 kip, M_rx=250 kip*ft, M_cx=642 kip*ft, '
            'M_ry=80 kip*ft, M_cy=311 kip*ft)\nlow = steel_design.aisc_interaction(P_r=100 kip, P_c=1130 kip, '
            'M_rx=250 kip*ft, M_cx=642 kip*ft)')
    assert f(r.values["i"].fields["util_interaction"]) == pytest.approx(0.929, abs=0.001)
    assert r.values["i"].fields["equation"] == "H1-1a"
    # H1-1b below P_r/P_c = 0.2: P_r/(2P_c) + M_rx/M_cx
    assert f(r.values["low"].fields["util_interaction"]) == pytest.approx(100 / 2260 + 250 / 642, rel=1e-9)
    assert r.values["low"].fields["equation"] == "H1-1b"


# ---------------------------------------------------------------- out of scope is a located error
def test_wrong_unit_at_the_call_is_a_located_error():
    errs = errors(f"s = steel_design.shape({W18X50})\nb = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=10 kip)")
    assert errs and errs[0].span is not None
