"""Properties of the F4, F5, F9 and F10 strength curves: continuous where their branches meet, never above the
yielding strength, non-increasing with the unbraced length. Facts of the equations themselves (AISC 360-16):
F9-9 defines L_r as the length where M_cr of F9-10 equals M_y; F5-5 defines L_r where F5-4 equals 0.7F_y·C_b;
F10-2 and F10-3 both give 0.75M_y at M_y/M_cr = 1; F4-2 equals R_pcM_yc at L_p.
"""
import pytest
from hypothesis import given, settings, strategies as st
from scipy.optimize import brentq

from .conftest import call, f, run

WT = 'section.rolled(designation="WT5X6")'
F14 = ('name="girder", form="I", fabrication="welded", A=87 in^2, d=66 in, b_f=14 in, t_f=2 in, t_w=0.5 in, '
       'I_x=67300 in^4, I_y=915 in^4, S_x=2040 in^3, Z_x=2270 in^3, S_y=131 in^3, Z_y=200 in^3, J=77.3 in^4, '
       'C_w=936960 in^6, h_o=64 in')
SLENDER = ('name="slender", form="I", fabrication="welded", A=35 in^2, d=62 in, b_f=16 in, t_f=1.0 in, t_w=0.25 in, '
           'I_x=30000 in^4, I_y=683 in^4, S_x=968 in^3, Z_x=1100 in^3, S_y=85 in^3, Z_y=130 in^3, J=11 in^4, '
           'C_w=600000 in^6')


def tee(L_b_in):
    r = run(f"s = {WT}\nout = steel_design.aisc_flexure(section=s, F_y=50 ksi, L_b={L_b_in} in)\n")
    return r.values["out"].fields


def test_F9_Lr_is_where_Mcr_reaches_My():
    Lr = f(tee(100)["L_r"], "in")
    beyond, before = tee(Lr * (1 + 1e-9)), tee(Lr * (1 - 1e-9))
    # F9-7 (M_n = M_cr) just beyond L_r against F9-6 (M_n → M_y) just before: equal within the rounded constants
    assert f(beyond["M_nx"], "kip*in") == pytest.approx(f(before["M_nx"], "kip*in"), rel=5e-4)


@settings(max_examples=8, deadline=None)
@given(st.floats(0.5, 40.0), st.floats(0.05, 5.0))
def test_tee_strength_is_non_increasing_in_the_unbraced_length(L_ft, step):
    a = f(tee(L_ft * 12)["M_nx"], "kip*in")
    b = f(tee((L_ft + step) * 12)["M_nx"], "kip*in")
    sec = run(f"s = {WT}\n").values["s"].fields
    Mp = min(50 * f(sec["Z_x"], "in^3"), 1.6 * 50 * f(sec["S_x"], "in^3"))   # F9-2
    assert b <= a * (1 + 1e-9) and a <= Mp * (1 + 1e-9)


def beam(sec, L_b_in, **kw):
    extra = "".join(f", {k}={v}" for k, v in kw.items())
    return call(sec, "aisc_flexure", f"F_y=50 ksi, L_b={L_b_in} in{extra}")


@pytest.mark.parametrize("sec", [F14, SLENDER], ids=["F4", "F5"])
def test_F4_F5_continuous_at_L_p_and_L_r(sec):
    first = beam(sec, 100)
    for name in ("L_p", "L_r"):
        L = f(first[name], "in")
        lo = f(beam(sec, L * (1 - 1e-9))["M_nx"], "kip*in")
        hi = f(beam(sec, L * (1 + 1e-9))["M_nx"], "kip*in")
        assert hi == pytest.approx(lo, rel=2e-3)   # F4-5 vs F4-2 meet within the rounded 0.078 and 6.76


@settings(max_examples=6, deadline=None)
@given(st.floats(5.0, 60.0), st.floats(0.1, 10.0))
def test_F4_F5_strength_is_non_increasing_in_the_unbraced_length(L_ft, step):
    for sec in (F14, SLENDER):
        a = f(beam(sec, L_ft * 12)["M_nx"], "kip*in")
        b = f(beam(sec, (L_ft + step) * 12)["M_nx"], "kip*in")
        assert b <= a * (1 + 1e-9)


def test_F10_branches_meet_at_My_over_Mcr_equal_to_one():
    # F10-2 and F10-3 both give 0.75·M_y where M_y/M_cr = 1: M_n is continuous there. The crossing length of the
    # L4X4X1/4 (no lateral-torsional restraint, M_y = 0.80F_yS_x) is found from Eq. F10-5a by a root finder.
    sec = run('s = section.rolled(designation="L4X4X1/4")\n').values["s"].fields
    b, t, Sx = f(sec["d"], "in"), f(sec["t"], "in"), f(sec["S_x"], "in^3")
    My = 0.8 * 50 * Sx

    def mcr(L):  # Eq. F10-5a, C_b = 1, toe in compression
        return 0.58 * 29000 * b**4 * t / L**2 * ((1 + 0.88 * (L * t / b**2) ** 2) ** 0.5 - 1)

    L = brentq(lambda x: mcr(x) - My, 12.0, 2400.0)

    def angle(L_in):
        r = run('s = section.rolled(designation="L4X4X1/4")\n'
                f'out = steel_design.aisc_flexure(section=s, F_y=50 ksi, L_b={L_in} in, C_b=1.0)\n')
        return f(r.values["out"].fields["M_nx"], "kip*in")

    lo, hi = angle(L * (1 - 1e-7)), angle(L * (1 + 1e-7))
    assert lo == pytest.approx(hi, rel=1e-5)
    assert min(lo, 1.5 * 50 * Sx) == pytest.approx(0.75 * My, rel=1e-5) or lo < 0.75 * My   # leg buckling may be lower
