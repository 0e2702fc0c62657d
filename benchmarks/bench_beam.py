"""Benchmark: the beam solver on a long continuous member, against a numpy-only dense baseline.

Case: 100 spans, 1,000 point loads, diagrams sampled at 2,000 points per span (timings printed, no
ratio: the dense baseline does not recover fields). The ratio compares the same work on both sides: one
linear solve of the same reduced stiffness system, our banded Cholesky (O(n)) against numpy.linalg.solve
(LAPACK, O(n³)), at 100 and 1,600 spans, timed by ``timing.paired``. Growth: the whole solve at 200 and
800 spans (exponent, goal ≤ 1.1). Ratios are what hold from machine to machine, not seconds.

Run: /work/main/.venv/bin/python benchmarks/bench_beam.py
"""
from __future__ import annotations

import math

import numpy as np

from calcsheet_plugins.beam import solver as S
from timing import paired, report


def member(n_spans: int, loads_per_span: int = 10, seed: int = 1):
    rng = np.random.default_rng(seed)
    spans = rng.uniform(4.0, 8.0, n_spans)
    model = S.Model(list(spans), ["pinned"] + ["roller"] * n_spans, [2.0e7] * n_spans)
    L = model.length
    xs = np.sort(rng.uniform(0, L, loads_per_span * n_spans))
    loads = [S.PointLoad(float(x), float(p)) for x, p in zip(xs, rng.uniform(5e3, 50e3, len(xs)))]
    return model, loads


def dense_baseline(model, loads):
    """The same system, assembled densely and solved by numpy: the reference cost."""
    dofs = S.number_dofs(model)
    X = model.nodes
    n = dofs.n
    K = np.zeros((n, n))
    F = np.zeros(n)
    per_el = [[] for _ in model.spans]
    for ld in loads:
        e = int(np.clip(np.searchsorted(X, ld.x, side="right") - 1, 0, len(model.spans) - 1))
        per_el[e].append(("P", ld.x - X[e], 0.0, ld.P, 0.0))
    for e in range(len(model.spans)):
        d = [dofs.w[e], dofs.rr[e], dofs.w[e + 1], dofs.rl[e + 1]]
        K[np.ix_(d, d)] += S.element_stiffness(model.EI[e], model.spans[e])
        F[d] += S.equivalent_loads(model.spans[e], per_el[e])
    free = np.flatnonzero(~dofs.restrained)
    u = np.zeros(n)
    u[free] = np.linalg.solve(K[np.ix_(free, free)], F[free])
    return u


def reduced_system(model, loads):
    """The free-dof stiffness (banded and dense) and load vector the solver factorises."""
    dofs = S.number_dofs(model)
    n = dofs.n
    K = np.zeros((n, n))
    F = np.random.default_rng(0).normal(size=n)
    for e in range(len(model.spans)):
        d = [dofs.w[e], dofs.rr[e], dofs.w[e + 1], dofs.rl[e + 1]]
        K[np.ix_(d, d)] += S.element_stiffness(model.EI[e], model.spans[e])
    free = np.flatnonzero(~dofs.restrained)
    Kf = K[np.ix_(free, free)]
    m = len(free)
    band = np.zeros((m, S.HALF_BAND + 1))
    for dd in range(S.HALF_BAND + 1):
        band[dd:, dd] = np.diagonal(Kf, -dd)
    return band, Kf, F[free]


def main():
    model, loads = member(100)
    sol = S.solve(model, loads)
    samples = S.sample(sol, 2000)
    u = dense_baseline(model, loads)
    # the two solves agree
    assert np.allclose(-u[S.number_dofs(model).w], sol.nodal_w, rtol=1e-9, atol=1e-12)
    print("100 spans, 1,000 point loads, diagrams at 2,000 points per span "
          f"({len(samples[0]):,} points per quantity)")
    t_solve, t_dense = paired(lambda: S.solve(model, loads), lambda: dense_baseline(model, loads), repeat=5)
    t_sample = paired(lambda: S.sample(sol, 2000), lambda: None, repeat=3)[0]
    print(f"    solve (banded stiffness + exact fields) {t_solve * 1e3:.1f} ms; numpy dense assemble + solve "
          f"{t_dense * 1e3:.1f} ms (different work: not a ratio); sampling V, M, θ, δ {t_sample * 1e3:.1f} ms")

    # the same work on both sides: one linear solve K u = f of the same reduced system
    for n in (100, 1600):
        m, ld = member(n, loads_per_span=0)
        band, Kf, f = reduced_system(m, ld)
        x1 = S.banded_cholesky_solve(band, f, band[:, 0].copy())
        assert np.allclose(x1, np.linalg.solve(Kf, f), rtol=1e-8)
        tb, td = paired(lambda: S.banded_cholesky_solve(band, f, band[:, 0].copy()),
                        lambda: np.linalg.solve(Kf, f), repeat=5)
        goal = 1.0  # O(n) against LAPACK's O(n³) on a banded system: it must win
        report(f"banded linear solve ÷ numpy dense solve, same system, {n:,} spans ({len(f):,} unknowns)",
               tb / td, goal, note=f"{tb * 1e3:.2f} ms vs {td * 1e3:.2f} ms")

    # growth of our whole solve: both sizes timed alternately, the same number of times
    small, large = 200, 800
    ms, ls_ = member(small)
    ml, ll = member(large)
    t_small, t_large = paired(lambda: S.solve(ms, ls_), lambda: S.solve(ml, ll), repeat=3)
    exponent = math.log(t_large / t_small) / math.log(large / small)
    report(f"growth exponent of the whole beam solve, {small} → {large} spans", exponent, 1.1, unit="",
           note=f"{t_small * 1e3:.0f} ms → {t_large * 1e3:.0f} ms")


if __name__ == "__main__":
    main()
