"""The diagram points of a solution (solver.sample): every piece sampled from its start to its end, so each
diagram shows the value on both sides of every jump (a point load's shear step, a couple's moment step) and
reaches both ends of the beam; the sampled values are the solution's own."""
import numpy as np
import pytest

from calcsheet_plugins.beam.solver import LineLoad, MomentLoad, Model, PointLoad, sample, solve

EI = 2.0e7


def _solution():
    m = Model([4.0, 5.0], ["fixed", "roller", "free"][:2] + ["roller"], [EI, EI])
    return solve(m, [PointLoad(1.5, 10e3), MomentLoad(6.0, 4e3), LineLoad(4.5, 9.0, 2e3, 5e3)])


@pytest.mark.parametrize("per_span", [2, 7, 200])
def test_each_piece_is_sampled_from_its_start_to_its_end(per_span):
    sol = _solution()
    x, V, M, T, D = sample(sol, per_span)
    p = sol.pieces
    ends = p.start + p.length
    assert x[0] == 0.0 and x[-1] == pytest.approx(sol.model.length, abs=1e-12)
    assert np.all(np.diff(x) >= 0)
    for a, b in zip(p.start, ends):
        assert np.any(np.isclose(x, a, rtol=0, atol=1e-12)) and np.any(np.isclose(x, b, rtol=0, atol=1e-12))
    # a jump is shown from both sides: two points at x = 1.5 m, with the shear stepping down by P
    at_p = np.flatnonzero(np.isclose(x, 1.5, rtol=0, atol=1e-12))
    assert len(at_p) == 2 and V[at_p[0]] - V[at_p[1]] == pytest.approx(10e3, rel=1e-9)
    # and the couple's step in the moment at x = 6 m
    at_c = np.flatnonzero(np.isclose(x, 6.0, rtol=0, atol=1e-12))
    assert len(at_c) == 2 and abs(M[at_c[1]] - M[at_c[0]]) == pytest.approx(4e3, rel=1e-9)


def test_the_sampled_values_are_the_solutions_own():
    sol = _solution()
    x, V, M, T, D = sample(sol, 20)
    inside = (x > 0.01) & (x < sol.model.length - 0.01) & ~np.isin(np.round(x, 9), [1.5, 4.0, 4.5, 6.0])
    for what, vals in (("V", V), ("M", M), ("theta", T), ("delta", D)):
        assert np.allclose(vals[inside], sol.at(what, x[inside]), rtol=1e-9, atol=1e-9 * np.max(np.abs(vals)))


def test_each_span_gets_about_per_span_points_whatever_its_length():
    sol = solve(Model([2.0, 6.0], ["pinned", "roller", "roller"], [EI, EI]), [LineLoad(0.0, 8.0, 1e3, 1e3)])
    x, *_ = sample(sol, 30)
    short, long_ = np.sum(x <= 2.0), np.sum(x >= 2.0)
    assert 31 <= short <= 33 and 31 <= long_ <= 33  # per_span + 1 points from each span's start to its end
    assert np.max(np.diff(x[x <= 2.0])) < np.max(np.diff(x[x >= 2.0]))  # so the short span is sampled finer
