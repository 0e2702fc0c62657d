"""Solve every combination on one shared set of breakpoints and envelope what the sheet needs.

Why a shared grid: the combinations' diagrams then sample the same x, so the
envelope is a plain pointwise max/min, and every maximum is found exactly from
each combination's own piecewise polynomials.
"""
from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from . import solver as S
from .model import Setup


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


def _abs_extreme(sol, what, spans=None) -> S.Extreme:
    hi, lo = S.extremes(sol, what, spans)
    return hi if abs(hi.value) >= abs(lo.value) else lo


def _clean(e: S.Extreme, scale: float) -> S.Extreme:
    """Round-off noise (1e-14 of the largest value) is zero."""
    return S.Extreme(0.0, e.x) if abs(e.value) < 1e-9 * scale else e


def run(setup: Setup, per_span: int = 200) -> Results:
    model = setup.model
    all_loads = [ld.solver for ld in setup.loads]
    grid = S.breakpoints(model, all_loads)
    case_loads = setup.case_loads()
    out = []
    X = model.nodes
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
        out.append(ComboResult(
            cb, loads, sol, Mmax, Mmin, _abs_extreme(sol, "V"), max(spans_d, key=lambda e: abs(e.value)),
            _abs_extreme(sol, "theta"), spans_d, S.zero_shear_points(sol), sup_M,
        ))
    res = Results(setup, out, grid)
    if per_span:
        res.samples = {cr.combo.name: S.sample(cr.sol, per_span) for cr in out}
    return res
