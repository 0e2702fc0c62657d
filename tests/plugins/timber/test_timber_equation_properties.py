"""Properties of the stability factors, checked against their defining equations and independent roots.

k_c (EN 1995-1-1 (6.25)) is the smaller root of λ²x² − 2kx + 1 = 0 and C_P (NDS (3.7-1)) the smaller root of
c·x² − (1 + α)x + α = 0; numpy's polynomial roots are the oracle, so the closed forms are not checked against
themselves.
"""
import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calcsheet_plugins.timber import data as D
from calcsheet_plugins.timber import equations as EQ

lam = st.floats(min_value=0.3, max_value=4.0, allow_nan=False)
beta = st.sampled_from([0.1, 0.2])


@given(lam, beta)
@settings(max_examples=200, deadline=None)
def test_k_c_is_at_most_one_and_the_smaller_root_of_its_quadratic(l, b):
    kc = EQ.k_c(l, b)
    assert 0 < kc <= 1 + 1e-12
    k = 0.5 * (1 + b * (l - 0.3) + l**2)                 # (6.27)
    roots = sorted(r.real for r in np.roots([l**2, -2 * k, 1]))
    assert kc == pytest.approx(roots[0], rel=1e-9)


@given(lam, lam, beta)
@settings(max_examples=200, deadline=None)
def test_k_c_decreases_with_slenderness(l1, l2, b):
    lo, hi = sorted((l1, l2))
    assert EQ.k_c(hi, b) <= EQ.k_c(lo, b) + 1e-12


def test_k_c_is_one_at_the_limit_of_0_3_and_glulam_is_less_reduced():
    assert EQ.k_c(0.3, 0.2) == pytest.approx(1.0)      # (6.25) at λ_rel = 0.3: k = 0.545, √(k² − λ²) = 0.455
    assert EQ.k_c(1.5, 0.1) > EQ.k_c(1.5, 0.2)          # β_c 0.1 (glulam) is straighter than 0.2 (solid)


def test_k_c_approaches_the_euler_curve_for_slender_members():
    # for large λ_rel, k_c → 1/λ_rel² (the elastic buckling stress over f_c,0,k)
    l = 40.0
    assert EQ.k_c(l, 0.2) * l**2 == pytest.approx(1.0, rel=0.02)


def test_k_crit_is_continuous_to_the_rounding_of_eq_6_34():
    # (6.34): 1.56 − 0.75·0.75 = 0.9975 against 1; 1.56 − 0.75·1.4 = 0.51 against 1/1.4² = 0.5102
    eps = 1e-9
    assert abs(EQ.k_crit(0.75 + eps) - EQ.k_crit(0.75)) <= 0.0025 + 1e-6
    assert abs(EQ.k_crit(1.4 + eps) - EQ.k_crit(1.4)) <= 0.0003


@given(st.floats(min_value=0.0, max_value=5.0), st.floats(min_value=0.0, max_value=5.0))
def test_k_crit_is_at_most_one_and_never_increases(a, b):
    lo, hi = sorted((a, b))
    assert EQ.k_crit(hi) <= EQ.k_crit(lo) + 0.0025 + 1e-9   # the only rise is the 0.0025 step at 0.75
    assert EQ.k_crit(lo) <= 1


ratio = st.floats(min_value=0.01, max_value=200.0, allow_nan=False)


@given(ratio, st.sampled_from([0.8, 0.85, 0.9]))
@settings(max_examples=200, deadline=None)
def test_C_P_is_the_smaller_root_of_its_quadratic(a, c):
    cp = EQ.ylinen(a, c)
    roots = sorted(r.real for r in np.roots([c, -(1 + a), a]))
    assert cp == pytest.approx(roots[0], rel=1e-9)
    assert 0 < cp < 1
    assert cp <= a + 1e-12                               # never above the Euler value F_cE/F_c*


def test_C_P_tends_to_one_for_short_columns():
    fc_star, e_min = 1500.0, 580_000.0                  # psi, a DF-L No.2-like column
    cps = [EQ.C_P(0.822 * e_min / le_d**2, fc_star, 0.8) for le_d in (1, 2, 5)]
    assert cps[0] > 0.99 and cps == sorted(cps, reverse=True)
    # and decreases as l_e/d grows to the limit of 50 (NDS 3.7.1.4)
    series = [EQ.C_P(0.822 * e_min / le_d**2, fc_star, 0.8) for le_d in range(1, 51)]
    assert all(b < a for a, b in zip(series, series[1:]))


def test_C_L_published_example():
    # Structural Engineering Reference Manual, Example 5.3, as quoted by structuralengineerhq.com
    # ("beam stability factor tabulation"): F_bE/F_b* = 2.83 gives C_L = 0.974
    assert EQ.C_L(2.83, 1.0) == pytest.approx(0.974, abs=0.0005)


def test_C_L_is_continuous_across_the_rows_of_table_3_3_3():
    rows = D.nds()["l_e"]["any"]            # the footnote rows: the only case with a break at 14.3
    d, b, e_min, fb_star = 11.25, 1.5, 580_000.0, 1100.0
    for lim in (7.0, 14.3):
        below = EQ.l_e(rows, lim * d * (1 - 1e-9), d)[0]
        above = EQ.l_e(rows, lim * d * (1 + 1e-9), d)[0]
        assert above == pytest.approx(below, rel=1e-3)  # 14.42d vs 14.41d; 26.309d vs 26.312d
        cl = [EQ.C_L(1.2 * e_min / (le * d / b**2), fb_star) for le in (below, above)]
        assert cl[1] == pytest.approx(cl[0], rel=1e-3)


def test_k_h_limits():
    assert EQ.k_h_solid(150) == 1 and EQ.k_h_solid(40) == pytest.approx(1.3)     # (3.1) cap
    assert EQ.k_h_solid(100) == pytest.approx(1.5**0.2)
    assert EQ.k_h_glulam(600) == 1 and EQ.k_h_glulam(200) == pytest.approx(min(3**0.1, 1.1))
    assert EQ.k_h_glulam(30) == pytest.approx(1.1)                               # (3.2) cap


def test_torsion_constant_of_a_square_against_the_exact_series():
    # St Venant constant of a square a×a: 0.1406·a⁴ (Timoshenko & Goodier, from memory)
    assert EQ.torsion_constant_rectangle(1.0, 1.0) == pytest.approx(0.1406, rel=0.01)
    assert math.isclose(EQ.sigma_m_crit_softwood(75, 225, 3690, 7400), 0.78 * 75**2 * 7400 / (225 * 3690))


def test_table_3_3_3_rows_match_the_published_table():
    # NDS Table 3.3.3 as reproduced at wikiengineer.com ("Effective length for wood bending members")
    t = D.nds()["l_e"]
    assert t["single-span-uniform-load"] == [[7, 2.06, 0], [1e9, 1.63, 3]]
    assert t["cantilever-uniform-load"] == [[7, 1.33, 0], [1e9, 0.90, 3]]
    assert t["cantilever-end-point-load"] == [[7, 1.87, 0], [1e9, 1.44, 3]]
    assert t["single-span-central-point-load"] == [[7, 1.80, 0], [1e9, 1.37, 3]]
    assert t["equal-end-moments"] == [[1e9, 1.84, 0]]
    assert t["any"] == [[7, 2.06, 0], [14.3, 1.63, 3], [1e9, 1.84, 0]]
    # a uniformly loaded single span with l_u/d = 20: 1.63·l_u + 3d, not the footnote's 1.84·l_u
    assert EQ.l_e(t["single-span-uniform-load"], 20.0, 1.0)[0] == pytest.approx(1.63 * 20 + 3)
