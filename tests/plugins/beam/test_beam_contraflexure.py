"""beam.result's points of zero moment (contraflexure), against the closed forms of the classic beam cases.

Sources: AISC Steel Construction Manual Table 3-23 (shears, moments and deflections) — cases of a beam fixed
at one end and supported at the other, fixed at both ends, and continuous over two equal spans, each under a
uniform load (from memory); Roark's Formulas for Stress and Strain, Table 8.1, a couple on a simple span.
"""
import math

import pytest

import calcsheet

L = 6.0  # m, every case's span
W = "w=10 kN/m"


def result(spans, supports, loads):
    r = calcsheet.run(f'b = beam.solve(spans=[{spans}], supports="{supports}", E=200 GPa, I=1e8 mm^4, '
                      f'loads=[{loads}])\nres = beam.result(member=b)\n')
    assert r.ok, r.diagnostics
    rec = r.values["res"]
    n = int(rec.fields["n_M0"].m_as(""))
    return [rec.fields[f"x_M0_{i}"].m_as("m") for i in range(1, n + 1)]


def test_a_simple_span_under_a_uniform_load_has_no_point_of_zero_moment_inside():
    # M = w x (L − x)/2 vanishes only at the supports, which are the beam's ends and not counted
    assert result("6 m", "pinned, roller", f"beam.udl({W})") == []


def test_a_propped_cantilever_under_a_uniform_load_changes_sign_a_quarter_span_from_the_fixed_end():
    # fixed at A, supported at B: R_B = 3wL/8, M(x from B) = 3wL/8·x − w x²/2 = 0 at x = 3L/4 from B (Table 3-23)
    assert result("6 m", "fixed, roller", f"beam.udl({W})") == pytest.approx([L / 4], rel=1e-9)
    assert result("6 m", "roller, fixed", f"beam.udl({W})") == pytest.approx([3 * L / 4], rel=1e-9)


def test_a_fixed_ended_beam_under_a_uniform_load_has_two_points_of_zero_moment():
    # M(x) = w/12 (6Lx − 6x² − L²) = 0 at x = L (1/2 ∓ 1/(2√3)) ≈ 0.2113 L and 0.7887 L (Table 3-23)
    half = L / (2 * math.sqrt(3))
    assert result("6 m", "fixed, fixed", f"beam.udl({W})") == pytest.approx([L / 2 - half, L / 2 + half], rel=1e-9)


def test_two_equal_continuous_spans_change_sign_three_quarters_of_a_span_from_each_end():
    # R_A = 3wL/8, M = 3wL/8·x − w x²/2 = 0 at x = 3L/4, and symmetrically (Table 3-23, two equal spans)
    assert result("6 m, 6 m", "pinned, roller, roller", f"beam.udl({W})") == pytest.approx(
        [0.75 * L, 2 * L - 0.75 * L], rel=1e-9)


def test_a_couple_on_a_simple_span_changes_the_sign_of_the_moment_by_its_jump():
    # a couple M0 at a: M = −M0 x/L left of a and M0 (1 − x/L) right of it (Roark Table 8.1, applied couple):
    # the moment jumps from −M0 a/L to M0 b/L at a, a sign change with no zero in between
    assert result("6 m", "pinned, roller", "beam.moment(M=12 kN*m, x=2 m)") == pytest.approx([2.0], rel=1e-12)
    # and a couple at the end of the beam is no point inside it
    assert result("6 m", "pinned, roller", "beam.moment(M=12 kN*m, x=0 m)") == []


def test_a_propped_cantilever_with_a_central_point_load_changes_sign_on_a_straight_stretch():
    # fixed at A, supported at B, P at mid-span: R_A = 11P/16, M_A = −3PL/16 (Table 3-23, "fixed at one end,
    # supported at other — concentrated load at center"): M(x) = −3PL/16 + 11P/16·x = 0 at x = 3L/11, where the
    # moment diagram is a straight line (no load on that stretch)
    assert result("6 m", "fixed, roller", "beam.point(P=10 kN, x=3 m)") == pytest.approx([3 * L / 11], rel=1e-9)


def test_where_the_moment_ends_on_a_cantilever_is_reported_as_its_point_of_zero_moment():
    # fixed at A, P at mid-span: M = −P(L/2 − x) up to the load and nothing beyond it (statics of the free end):
    # the moment reaches zero at the load and stays zero, and that place is reported (the ends are not)
    assert result("6 m", "fixed, free", "beam.point(P=10 kN, x=3 m)") == pytest.approx([3.0], rel=1e-12)


def test_a_trapezoidal_load_against_a_hogging_overhang_changes_sign_where_the_cubic_moment_vanishes():
    # pinned at A (x = 0), roller at B (x = 6 m), free tip at 8 m with P = 20 kN; w = 5 → 15 kN/m over A–B.
    # On A–B the moment is a cubic with every coefficient non-zero (shear, uniform part, growing part); its
    # root inside the span, from the statics of the free body 0–x solved by sympy (independent of the solver):
    import sympy as sp

    x, s = sp.symbols("x s", real=True)
    w = 5 + sp.Rational(10, 6) * s  # kN/m
    P, a, Lt = 20, 6, 8
    R_B = (sp.integrate(w * s, (s, 0, a)) + P * Lt) / a  # ΣM about A = 0
    R_A = sp.integrate(w, (s, 0, a)) + P - R_B  # ΣF = 0
    M = R_A * x - sp.integrate(w * (x - s), (s, 0, x))  # the free body 0–x
    assert sp.simplify(M.subs(x, a) + P * (Lt - a)) == 0  # M_B = −P·2 m, the overhang's statics
    roots = [float(r) for r in sp.solve(sp.Eq(M, 0), x) if r.is_real and 0 < float(r) < a]
    assert len(roots) == 1
    got = result("6 m, 2 m", "pinned, roller, free",
                 "beam.varying(w_1=5 kN/m, w_2=15 kN/m, start=0 m, end=6 m), beam.point(P=20 kN, x=8 m)")
    assert got == pytest.approx(roots, rel=1e-9)


@pytest.mark.parametrize("supports", ["fixed, free", "free, fixed"])
@pytest.mark.parametrize("x", [1.5, 2.0, 2.5, 3.0, 3.5])
@pytest.mark.parametrize("P", [7.0, 10.0, 12.5])
def test_where_the_moment_ends_on_a_cantilever_is_reported_whichever_end_is_fixed(supports, x, P):
    # statics of the free end: M = −P·(distance from the load toward the fixed end) on the loaded side of the
    # load and exactly nothing between the load and the free end, so the moment ends at the load, with a
    # non-zero slope there (common practice). Round-off leaves ±1e-12 kN·m on the unloaded side, of either
    # sign, or exactly zero: the place is reported whatever that remnant is.
    assert result("6 m", supports, f"beam.point(P={P} kN, x={x} m)") == pytest.approx([x], rel=1e-12)
