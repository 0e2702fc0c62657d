"""Solve every combination on one shared set of breakpoints and envelope what the sheet needs.

Why a shared grid: the combinations' diagrams then sample the same x, so the
envelope is a plain pointwise max/min, and every maximum is found exactly from
each combination's own piecewise polynomials.
"""
from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from . import solver as S
from .model import Setup, letters
from .solver import BeamInputError


@dataclass
class ComboResult:
    combo: object
    loads: list
    sol: S.Solution
    M_max: S.Extreme
    M_min: S.Extreme
    V_max: S.Extreme  # by magnitude, signed value
    d_max: S.Extreme  # by magnitude, signed value (downward positive)
    theta_max: S.Extreme
    span_delta: list[S.Extreme]  # per span, largest |δ|
    zero_shear: list[float]
    support_M: list[float]  # bending moment at each node (largest magnitude of both sides)
    axial: tuple = ((), None)  # ((x, F) forces along the axis, x of the support that holds it) or no restraint
    d_down: S.Extreme = None  # largest downward deflection (max of δ)
    d_up: S.Extreme = None  # largest upward deflection (min of δ)
    span_M: list = None  # per span: (M max, M min)

    def V_at(self, x: float) -> float:
        """The shear acting with a moment at x: the larger in magnitude of the values just left and right."""
        a = float(self.sol.at("V", x, side="left")[0]) if x > 0 else 0.0
        b = float(self.sol.at("V", x, side="right")[0]) if x < self.sol.model.length else 0.0
        v = a if abs(a) > abs(b) else b
        return 0.0 if abs(v) < 1e-9 * max(abs(self.V_max.value), 1e-300) else v

    def N_at(self, x: float) -> float:
        """Axial force at x, compression positive (the larger in magnitude just left and right of x)."""
        pts, xr = self.axial
        if not pts:
            return 0.0
        L = self.sol.model.length
        eps = 1e-9 * L
        vals = [_axial(pts, xr, min(max(x + d, 0.0), L)) for d in (-eps, eps)]
        return max(vals, key=abs)

    def N_max(self) -> S.Extreme:
        """The largest compression (or, with none, the smallest tension) and where, leftmost on ties."""
        pts, xr = self.axial
        L = self.sol.model.length
        if not pts:
            return S.Extreme(0.0, 0.0)
        cuts = sorted({0.0, L, xr} | {min(max(x, 0.0), L) for x, _ in pts})
        segs = [(a, _axial(pts, xr, 0.5 * (a + b))) for a, b in zip(cuts[:-1], cuts[1:]) if b > a]
        best = max(v for _, v in segs)
        tied = [a for a, v in segs if abs(v - best) <= S.TIE * max(abs(best), 1e-300)]
        return S.Extreme(best, tied[0], tied[1:])

    def M_at(self, x: float) -> float:
        """The moment at x (continuous except at an applied couple: then the larger in magnitude)."""
        a = float(self.sol.at("M", x, side="left")[0]) if x > 0 else 0.0
        b = float(self.sol.at("M", x, side="right")[0]) if x < self.sol.model.length else 0.0
        v = a if abs(a) > abs(b) else b
        return 0.0 if abs(v) < 1e-9 * max(abs(self.M_max.value), abs(self.M_min.value), 1e-300) else v


@dataclass
class Results:
    setup: Setup
    combos: list[ComboResult]
    grid: np.ndarray
    samples: dict = field(default_factory=dict)

    def governing(self, key: str, sign: int = 1) -> ComboResult:
        return max(self.combos, key=lambda c: sign * getattr(c, key).value)

    def governing_abs(self, key: str) -> ComboResult:
        return max(self.combos, key=lambda c: abs(getattr(c, key).value))

    def governing_tie(self, value) -> tuple[ComboResult, list[ComboResult]]:
        """The combination whose value(c) is largest; values within a relative 1e-9 are ties, and the one
        listed first governs. Returns it and the other combinations that tie with it."""
        vals = [value(c) for c in self.combos]
        best = max(vals)
        tied = [c for c, v in zip(self.combos, vals) if abs(v - best) <= S.TIE * max(abs(best), 1e-300)]
        return tied[0], tied[1:]

    def by_name(self, name: str) -> ComboResult | None:
        return next((c for c in self.combos if c.combo.name == name), None)


HOLDS_AXIAL = ("pinned", "fixed")


def _axial(pts, xr: float, x: float) -> float:
    """N at x (compression positive) from forces (x_i, F_i toward +x), the member held along its axis at xr."""
    if x >= xr:
        return -sum(F for xi, F in pts if xi > x)  # the part to the right: forces pulling it away are tension
    return sum(F for xi, F in pts if xi < x)


def axial_support(setup):
    """x of the one support that holds the member along its axis, or None when no load acts along it."""
    if not any(ld.solver.axial() for ld in setup.loads):
        return None
    names = letters(len(setup.kinds))
    held = [i for i, k in enumerate(setup.kinds) if k in HOLDS_AXIAL]
    if not held:
        raise BeamInputError("a load acts along the member but no support holds it along its axis; make one "
                             "support pinned or fixed", "supports")
    if len(held) > 1:
        raise BeamInputError("supports " + ", ".join(names[i] for i in held) + " all hold the member along its "
                             "axis, so its axial force is statically indeterminate; make all but one of them a "
                             "roller", "supports")
    return float(setup.model.nodes[held[0]])


def _abs_extreme(sol, what, spans=None) -> S.Extreme:
    hi, lo = S.extremes(sol, what, spans)
    if abs(abs(hi.value) - abs(lo.value)) <= S.TIE * max(abs(hi.value), abs(lo.value), 1e-300):
        a, b = (hi, lo) if hi.x <= lo.x else (lo, hi)  # equal magnitudes: the leftmost, the other a tie
        tol = 1e-9 * sol.model.length
        others = sorted(x for x in a.others + [b.x] + b.others if abs(x - a.x) > tol)
        merged = [x for i, x in enumerate(others) if i == 0 or x - others[i - 1] > tol]
        return S.Extreme(a.value, a.x, merged)
    return hi if abs(hi.value) >= abs(lo.value) else lo


def _clean(e: S.Extreme, scale: float) -> S.Extreme:
    """Round-off noise (1e-14 of the largest value) is zero."""
    return S.Extreme(0.0, e.x) if abs(e.value) < 1e-9 * scale else e


def _largest(per_span: list) -> S.Extreme:
    """The largest |δ| over the spans; equal values (within 1e-9) in several spans: the leftmost, the others
    listed as ties."""
    best = max(abs(e.value) for e in per_span)
    tied = [e for e in per_span if abs(abs(e.value) - best) <= S.TIE * max(best, 1e-300)]
    first = tied[0]
    others = list(first.others) + [x for e in tied[1:] for x in [e.x] + list(e.others)]
    return S.Extreme(first.value, first.x, others)


def run(setup: Setup, per_span: int = 200) -> Results:
    model = setup.model
    all_loads = [ld.solver for ld in setup.loads]
    grid = S.breakpoints(model, all_loads)
    case_loads = setup.case_loads()
    out = []
    X = model.nodes
    xr = axial_support(setup)
    for cb in setup.combos:
        loads = S.combine(model, case_loads, cb.factors)
        sol = S.solve(model, loads, grid=grid)
        Mmax, Mmin = S.extremes(sol, "M")
        spans_d = [_abs_extreme(sol, "delta", [k]) for k in range(len(model.spans))]
        sup_M = []
        for xn in X:
            a = sol.at("M", xn, side="left")[0] if xn > 0 else 0.0
            b = sol.at("M", xn, side="right")[0] if xn < model.length else 0.0
            sup_M.append(a if abs(a) > abs(b) else b)
        scale = max(abs(Mmax.value), abs(Mmin.value), 1e-300)
        Mmax, Mmin = _clean(Mmax, scale), _clean(Mmin, scale)
        sup_M = [0.0 if abs(v) < 1e-9 * scale else v for v in sup_M]
        dn, up = S.extremes(sol, "delta")
        span_M = [S.extremes(sol, "M", [k]) for k in range(len(model.spans))]
        span_M = [(_clean(a, scale), _clean(b, scale)) for a, b in span_M]
        out.append(ComboResult(
            cb, loads, sol, Mmax, Mmin, _abs_extreme(sol, "V"), _largest(spans_d),
            _abs_extreme(sol, "theta"), spans_d, S.zero_shear_points(sol), sup_M,
            (tuple(p for ld in loads for p in ld.axial()), xr), dn, up, span_M,
        ))
    res = Results(setup, out, grid)
    if per_span:
        res.samples = {cr.combo.name: S.sample(cr.sol, per_span) for cr in out}
    return res
