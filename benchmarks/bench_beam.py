"""Benchmark: the beam solver on a long continuous member, against a numpy-only dense baseline.

Case: 100 equal spans, 1,000 point loads, diagrams sampled at 2,000 points per
span. The baseline, in the same run, assembles the same stiffness matrix
densely and solves it with numpy.linalg.solve (LAPACK, O(n³)); our solver uses
its banded Cholesky (O(n)). Also reported: how each grows as the span count
doubles. Ratios are what hold from machine to machine, not seconds.

Run: /work/main/.venv/bin/python benchmarks/bench_beam.py
"""
from __future__ import annotations

import time

import numpy as np

from calcsheet_plugins.beam import solver as S


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


def best_of(fn, repeat=3):
    best = float("inf")
    out = None
    for _ in range(repeat):
        t = time.perf_counter()
        out = fn()
        best = min(best, time.perf_counter() - t)
    return best, out


def main():
    model, loads = member(100)
    t_solve, sol = best_of(lambda: S.solve(model, loads))
    t_sample, samples = best_of(lambda: S.sample(sol, 2000))
    t_max, _ = best_of(lambda: (S.extremes(sol, "M"), S.extremes(sol, "delta")))
    t_dense, u = best_of(lambda: dense_baseline(model, loads))
    # the two solves agree
    assert np.allclose(-u[S.number_dofs(model).w], sol.nodal_w, rtol=1e-9, atol=1e-12)
    print("100 spans, 1,000 point loads, diagrams at 2,000 points per span "
          f"({len(samples[0]):,} points per quantity)")
    print(f"  solve (banded stiffness + exact fields): {t_solve * 1e3:8.1f} ms")
    print(f"  sample V, M, θ, δ at 2,000 points/span:   {t_sample * 1e3:8.1f} ms")
    print(f"  exact extrema of M and δ:                {t_max * 1e3:8.1f} ms")
    print(f"  numpy dense baseline (assemble + solve): {t_dense * 1e3:8.1f} ms")
    print(f"  ratio solve / baseline: {t_solve / t_dense:.2f}")
    band, Kf, f = reduced_system(model, loads)
    t_band, x1 = best_of(lambda: S.banded_cholesky_solve(band, f, band[:, 0].copy()), repeat=5)
    t_lapack, x2 = best_of(lambda: np.linalg.solve(Kf, f), repeat=5)
    assert np.allclose(x1, x2, rtol=1e-8)
    print(f"  linear solve only, {len(f)} unknowns: banded {t_band * 1e3:.2f} ms, "
          f"numpy dense {t_lapack * 1e3:.2f} ms, ratio {t_band / t_lapack:.2f}")
    print()
    print("linear solve only, growth with spans (all interior supports: rotations are the unknowns):")
    print(f"  {'spans':>6} {'banded ms':>10} {'dense ms':>10} {'ratio':>7}")
    for n in (100, 400, 1600, 3200):
        m, ld = member(n, loads_per_span=0)
        band, Kf, f = reduced_system(m, ld)
        tb, _ = best_of(lambda: S.banded_cholesky_solve(band, f, band[:, 0].copy()), repeat=3)
        td, _ = best_of(lambda: np.linalg.solve(Kf, f), repeat=3)
        print(f"  {n:>6} {tb * 1e3:>10.2f} {td * 1e3:>10.2f} {tb / td:>7.2f}")
    print()
    print("whole solve, growth with spans (10 point loads per span):")
    print(f"  {'spans':>6} {'solve ms':>10} {'per span µs':>12} {'dense ms':>10} {'ratio':>7}")
    prev = None
    for n in (50, 100, 200, 400, 800):
        m, ld = member(n)
        ts, _ = best_of(lambda: S.solve(m, ld), repeat=2)
        td, _ = best_of(lambda: dense_baseline(m, ld), repeat=2)
        grow = f"  ×{ts / prev:.2f} per doubling" if prev else ""
        print(f"  {n:>6} {ts * 1e3:>10.1f} {ts / n * 1e6:>12.0f} {td * 1e3:>10.1f} {ts / td:>7.2f}{grow}")
        prev = ts


if __name__ == "__main__":
    main()
