"""An independent oracle: sympy integrates EI·y'''' = q(x) with each case's boundary conditions.

Loads are written with singularity functions; interior supports add unknown
reactions and hinges add an unknown slope jump; sympy solves for the
constants. The solver is compared with it on the same numbers, everywhere.
"""
import numpy as np
import pytest
import sympy as sp

from calcsheet_plugins.beam.solver import LineLoad, Model, MomentLoad, PointLoad, solve

x = sp.symbols("x", real=True)
SF = sp.SingularityFunction


def oracle(spans, supports, EI, loads):
    """Deflection (downward) and sagging moment as numeric functions, by sympy."""
    X = np.concatenate([[0], np.cumsum(spans)]).tolist()
    Lt = sp.nsimplify(X[-1])
    q = 0
    for ld in loads:
        if isinstance(ld, PointLoad):
            q += -sp.nsimplify(ld.P) * SF(x, sp.nsimplify(ld.x), -1)
        elif isinstance(ld, MomentLoad):
            q += sp.nsimplify(ld.M) * SF(x, sp.nsimplify(ld.x), -2)
        else:
            a, b = sp.nsimplify(ld.x1), sp.nsimplify(ld.x2)
            w1, w2 = sp.nsimplify(ld.w1), sp.nsimplify(ld.w2)
            k = (w2 - w1) / (b - a)
            q += -(w1 * SF(x, a, 0) + k * SF(x, a, 1) - w2 * SF(x, b, 0) - k * SF(x, b, 1))
    unknowns = list(sp.symbols("C1:5"))
    C1, C2, C3, C4 = unknowns
    extra_y = 0
    conds = []
    for xi, kind in zip(X[1:-1], supports[1:-1]):
        xs = sp.nsimplify(xi)
        if kind in ("pinned", "roller"):
            R = sp.Symbol(f"R_{len(unknowns)}")
            unknowns.append(R)
            q += R * SF(x, xs, -1)
        if kind == "hinge":
            d = sp.Symbol(f"D_{len(unknowns)}")
            unknowns.append(d)
            extra_y += d * SF(x, xs, 1)
    # indefinite integrals of singularity functions carry no constant, so C1..C4 are
    # V, M, EI·θ and EI·y just left of x = 0, before any load placed there
    V = sp.integrate(q, x) + C1
    M = sp.integrate(V, x) + C2
    EIy = sp.integrate(sp.integrate(M, x), x) + C3 * x + C4
    y = EIy / sp.nsimplify(EI) + extra_y
    theta = sp.diff(y, x)
    for xi, kind in zip(X[1:-1], supports[1:-1]):
        xs = sp.nsimplify(xi)
        if kind in ("pinned", "roller"):
            conds.append(y.subs(x, xs))
        if kind == "hinge":
            conds.append(M.subs(x, xs))
    left = {"pinned": [C4, C2], "roller": [C4, C2], "fixed": [C4, C3], "free": [C1, C2]}
    conds += left[supports[0]]
    for xe, kind in ((Lt, supports[-1]),):
        if kind in ("pinned", "roller"):
            conds += [y.subs(x, xe), M.subs(x, xe)]
        elif kind == "fixed":
            conds += [y.subs(x, xe), theta.subs(x, xe)]
        elif kind == "free":
            conds += [V.subs(x, xe), M.subs(x, xe)]
    sol = sp.solve(conds, unknowns, dict=True)[0]
    fy = sp.lambdify(x, sp.expand(-y.subs(sol)).rewrite(sp.Piecewise), "numpy")
    fM = sp.lambdify(x, sp.expand(M.subs(sol)).rewrite(sp.Piecewise), "numpy")
    return fy, fM


CASES = {
    "simply supported, partial trapezoidal load": ([6], ["pinned", "roller"], [LineLoad(1, 4.5, 3e3, 8e3)]),
    "cantilever, point load and couple": ([3], ["fixed", "free"], [PointLoad(2, 5e3), MomentLoad(1, 4e3)]),
    "fixed-fixed, off-centre point load": ([7], ["fixed", "fixed"], [PointLoad(2.5, 20e3)]),
    "propped cantilever, triangular load": ([5], ["fixed", "roller"], [LineLoad(0, 5, 0, 12e3)]),
    "three spans with overhang": (
        [1.5, 4, 5, 4], ["free", "pinned", "roller", "roller", "roller"],
        [LineLoad(0, 14.5, 2e3, 2e3), PointLoad(0, 3e3), PointLoad(8, 10e3)],
    ),
    "Gerber beam with a hinge": ([4, 2, 5], ["fixed", "roller", "hinge", "roller"], [LineLoad(0, 11, 5e3, 5e3)]),
}


@pytest.mark.parametrize("name", list(CASES))
def test_matches_sympy_integration(name):
    spans, supports, loads = CASES[name]
    EI = 3.0e7
    s = solve(Model(spans, supports, [EI] * len(spans)), loads)
    fy, fM = oracle(spans, supports, EI, loads)
    L = sum(spans)
    xs = np.linspace(0.013 * L, 0.991 * L, 57)  # away from jumps at exact load points
    d_ref = np.array([float(fy(v)) for v in xs])
    M_ref = np.array([float(fM(v)) for v in xs])
    scale_d = np.max(np.abs(d_ref))
    scale_M = np.max(np.abs(M_ref))
    assert np.max(np.abs(s.at("delta", xs) - d_ref)) <= 1e-9 * scale_d
    assert np.max(np.abs(s.at("M", xs) - M_ref)) <= 1e-9 * scale_M
