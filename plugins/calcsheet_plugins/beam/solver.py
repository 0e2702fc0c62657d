"""Exact Euler–Bernoulli analysis of a line of spans by the direct stiffness method.

Why this shape: a real member has whatever spans, supports and loads it has,
and the answer must be exact for them, not a meshed approximation. Cubic
(Hermite) elements loaded by their work-equivalent nodal loads give the exact
nodal rotations and deflections of a prismatic beam for any load; between the
nodes we integrate the load exactly, piece by piece, so V, M, θ and δ are
piecewise polynomials with no discretisation error.

The stiffness matrix is banded (half-bandwidth ≤ 4 with hinges), solved by a
banded Cholesky factorisation, so cost grows linearly with the number of spans.

Units: consistent SI base units (N, m, Pa, m⁴) as plain floats.
Signs (the sheet's): loads act downward when positive; reactions are upward
positive; an applied moment is clockwise positive; M is sagging positive;
V = dM/dx (the sum of upward forces to the left); δ is downward positive and
θ = dδ/dx.
"""
from __future__ import annotations

import bisect
import math
from dataclasses import dataclass, field

import numpy as np

from . import kinds as _kinds

SUPPORT_KINDS = ("pinned", "roller", "fixed", "free", "hinge", "guided", "spring")
HOLDS_DEFLECTION = {"pinned", "roller", "fixed"}
HOLDS_ROTATION = {"fixed", "guided"}


class BeamInputError(ValueError):
    """Bad beam input; ``param`` names the sheet parameter at fault."""

    def __init__(self, message: str, param: str | None = None):
        super().__init__(message)
        self.param = param


Load = _kinds.Load
PointLoad, MomentLoad, LineLoad = _kinds.PointLoad, _kinds.MomentLoad, _kinds.LineLoad


@dataclass
class Model:
    spans: list[float]
    supports: list[str]
    EI: list[float]  # one per span
    springs: dict = field(default_factory=dict)  # node -> (k N/m, k_theta N·m/rad): elastic supports
    settlement: dict = field(default_factory=dict)  # node -> prescribed downward displacement, m

    def __post_init__(self):
        self.spans = [float(s) for s in self.spans]
        self.EI = [float(e) for e in self.EI]
        validate_model(self)
        self._nodes = np.concatenate([[0.0], np.cumsum(self.spans)])
        self._nodes.flags.writeable = False
        self._length = float(self._nodes[-1])

    @property
    def nodes(self) -> np.ndarray:
        return self._nodes

    @property
    def length(self) -> float:
        return self._length


def validate_model(m: Model) -> None:
    if not m.spans:
        raise BeamInputError("give at least one span", "spans")
    for i, s in enumerate(m.spans, 1):
        if not np.isfinite(s) or s <= 0:
            raise BeamInputError(f"span {i} has length {s:g} m; every span must be longer than zero", "spans")
    if len(m.supports) != len(m.spans) + 1:
        raise BeamInputError(
            f"{len(m.spans)} span(s) need {len(m.spans) + 1} supports (one at each end of every span), "
            f"got {len(m.supports)}",
            "supports",
        )
    for i, k in enumerate(m.supports, 1):
        if k not in SUPPORT_KINDS:
            raise BeamInputError(f"support {i} is {k!r}; use one of {', '.join(SUPPORT_KINDS)}", "supports")
    if m.supports[0] == "hinge" or m.supports[-1] == "hinge":
        raise BeamInputError("a hinge at an end of the beam releases nothing; use \"free\" or a support", "supports")
    for i, (k, kt) in m.springs.items():
        if not (0 <= i < len(m.supports)):
            raise BeamInputError(f"a spring is at support {i + 1}, but the beam has {len(m.supports)}", "springs")
        if not (np.isfinite(k) and np.isfinite(kt)) or k < 0 or kt < 0 or (k == 0 and kt == 0):
            raise BeamInputError(f"the spring at support {i + 1} needs a stiffness greater than zero", "springs")
        kind = m.supports[i]
        if k and kind in HOLDS_DEFLECTION:
            raise BeamInputError(f"support {i + 1} is {kind}: it already holds the beam up; make it \"spring\" "
                                 f"for a translational spring", "springs")
        if kt and kind in HOLDS_ROTATION:
            raise BeamInputError(f"support {i + 1} is {kind}: it already holds the rotation; a rotational spring "
                                 f"needs a support free to rotate (pinned, roller, spring)", "springs")
        if kind == "hinge":
            raise BeamInputError(f"support {i + 1} is a hinge; put the spring on a support", "springs")
    for i, v in m.settlement.items():
        if not (0 <= i < len(m.supports)) or m.supports[i] not in HOLDS_DEFLECTION:
            raise BeamInputError(f"a settlement needs a support that holds the beam up (pinned, roller or fixed); "
                                 f"support {i + 1} is {m.supports[i] if 0 <= i < len(m.supports) else 'missing'}",
                                 "settlement")
        if not np.isfinite(v):
            raise BeamInputError(f"the settlement at support {i + 1} is not a number", "settlement")
    if len(m.EI) != len(m.spans):
        raise BeamInputError(f"give EI for each of the {len(m.spans)} spans", "I")
    for i, e in enumerate(m.EI, 1):
        if not np.isfinite(e) or e <= 0:
            raise BeamInputError(f"EI of span {i} is {e:g} N·m²; E and I must be greater than zero", "I")


def validate_loads(m: Model, loads) -> None:
    L = m.length
    for ld in loads:
        ld.validate(L, 1e-9 * L, BeamInputError)


# ---------------------------------------------------------------- degrees of freedom


@dataclass
class Dofs:
    w: list[int]  # deflection dof per node
    rl: list[int]  # rotation dof at a node, as seen by the element on its left
    rr: list[int]  # ... and by the element on its right (differs at a hinge)
    restrained: np.ndarray  # bool per dof
    n: int


def number_dofs(m: Model) -> Dofs:
    w, rl, rr, fixed = [], [], [], []
    k = 0
    last = len(m.supports) - 1
    for i, kind in enumerate(m.supports):
        w.append(k)
        fixed.append(kind in HOLDS_DEFLECTION)
        k += 1
        rl.append(k)
        fixed.append(kind in HOLDS_ROTATION)
        k += 1
        if kind == "hinge" and 0 < i < last:
            rr.append(k)
            fixed.append(False)
            k += 1
        else:
            rr.append(rl[-1])
    return Dofs(w, rl, rr, np.array(fixed, dtype=bool), k)


def element_stiffness(EI: float, L: float) -> np.ndarray:
    c = EI / L**3
    return c * np.array(
        [
            [12, 6 * L, -12, 6 * L],
            [6 * L, 4 * L * L, -6 * L, 2 * L * L],
            [-12, -6 * L, 12, -6 * L],
            [6 * L, 2 * L * L, -6 * L, 4 * L * L],
        ]
    )


def _hermite(L: float) -> list[np.ndarray]:
    """Hermite shape functions as ascending polynomial coefficients in local x."""
    return [
        np.array([1.0, 0.0, -3.0 / L**2, 2.0 / L**3]),
        np.array([0.0, 1.0, -2.0 / L, 1.0 / L**2]),
        np.array([0.0, 0.0, 3.0 / L**2, -2.0 / L**3]),
        np.array([0.0, 0.0, -1.0 / L, 1.0 / L**2]),
    ]


_P = np.polynomial.polynomial


def equivalent_loads(L: float, loads_local) -> np.ndarray:
    """Work-equivalent nodal loads (y up, θ anticlockwise) = minus the exact fixed-end actions."""
    N = _hermite(L)
    dN = [_P.polyder(n) for n in N]
    f = np.zeros(4)
    for kind, a, b, v1, v2 in loads_local:
        if kind == "P":  # downward force v1 at a
            f -= v1 * np.array([_P.polyval(a, n) for n in N])
        elif kind == "M":  # clockwise couple v1 at a: anticlockwise -v1
            f -= v1 * np.array([_P.polyval(a, d) for d in dN])
        else:  # downward linear load v1..v2 on [a, b]
            if b - a <= 0:
                continue
            slope = (v2 - v1) / (b - a)
            q = np.array([-(v1 - slope * a), -slope])  # upward q(x) in local x
            for i in range(4):
                prim = _P.polyint(_P.polymul(N[i], q))
                f[i] += _P.polyval(b, prim) - _P.polyval(a, prim)
    return f


# ---------------------------------------------------------------- banded solver

HALF_BAND = 4


class Mechanism(Exception):
    def __init__(self, dof: int):
        self.dof = dof


def banded_cholesky_solve(band: np.ndarray, rhs: np.ndarray, diag_scale: np.ndarray) -> np.ndarray:
    """Solve K u = f with K symmetric positive definite, stored as band[i, d] = K[i, i-d].

    The factorisation works to the bandwidth the matrix actually has (the last
    sub-diagonal that holds a non-zero), not the storage's: a beam whose nodes
    keep their deflection leaves only the rotations free, and their system is
    tridiagonal. That case runs a dedicated LDLᵀ (Thomas) sweep; wider bands a
    general banded Cholesky. Both are plain-float loops: the inner sums have
    at most a few terms, where numpy calls would cost more than the arithmetic.
    Cost is O(n·p²). A pivot that vanishes relative to its diagonal means the
    structure can move without resistance: that dof is reported as a mechanism.
    """
    n, p1 = band.shape
    used = np.flatnonzero(band[:, 1:].any(axis=0)) if p1 > 1 else ()
    p = int(used[-1]) + 1 if len(used) else 0
    if p <= 1:
        return _tridiagonal_solve(band, rhs, diag_scale, n, p)
    return _banded_cholesky(band[:, : p + 1], rhs, diag_scale, n, p)


def _tridiagonal_solve(band, rhs, diag_scale, n: int, p: int) -> np.ndarray:
    """K = L D Lᵀ with unit lower-bidiagonal L: the pivots D are the squares of Cholesky's."""
    a = band[:, 0].tolist()
    b = band[:, 1].tolist() if p else [0.0] * n
    b[0] = 0.0  # K[0, -1] does not exist
    tol = (np.asarray(diag_scale, dtype=float) * 1e-10).tolist()
    f = np.asarray(rhs, dtype=float).tolist()
    d, m, y = [], [], []
    d_prev, y_prev = 1.0, 0.0
    for ai, bi, fi, ti in zip(a, b, f, tol):
        mi = bi / d_prev  # L[i, i-1]
        d_prev = ai - mi * bi
        if not (d_prev > ti):
            raise Mechanism(len(d))
        y_prev = fi - mi * y_prev  # forward substitution, L y = f
        d.append(d_prev)
        m.append(mi)
        y.append(y_prev)
    x, m_next = 0.0, 0.0
    for i in range(n - 1, -1, -1):  # D Lᵀ x = y
        x = y[i] / d[i] - m_next * x
        m_next = m[i]
        y[i] = x
    return np.array(y)


def _banded_cholesky(band, rhs, diag_scale, n: int, p: int) -> np.ndarray:
    p1 = p + 1
    A = band.tolist()
    scale = [float(v) for v in diag_scale]
    L = [[0.0] * p1 for _ in range(n)]  # L[i][d] = L[i, i-d]
    sqrt = math.sqrt
    for i in range(n):
        Li = L[i]
        Ai = A[i]
        j0 = max(0, i - p)
        for j in range(j0, i + 1):
            s = Ai[i - j]
            Lj = L[j]
            for k in range(max(j0, j - p), j):
                s -= Li[i - k] * Lj[j - k]
            if j == i:
                if not (s > 1e-10 * scale[i]):
                    raise Mechanism(i)
                Li[0] = sqrt(s)
            else:
                Li[i - j] = s / Lj[0]
    y = [float(v) for v in rhs]
    for i in range(n):
        Li = L[i]
        s = y[i]
        for k in range(max(0, i - p), i):
            s -= Li[i - k] * y[k]
        y[i] = s / Li[0]
    for i in range(n - 1, -1, -1):
        s = y[i]
        for k in range(i + 1, min(n, i + p + 1)):
            s -= L[k][k - i] * y[k]
        y[i] = s / L[i][0]
    return np.array(y)


# ---------------------------------------------------------------- the solution


@dataclass
class Pieces:
    """Piecewise polynomials in u = x - start, ascending coefficients."""

    start: np.ndarray
    length: np.ndarray
    span: np.ndarray  # span index of each piece
    V: np.ndarray  # (n, 3)
    M: np.ndarray  # (n, 4)
    theta: np.ndarray  # (n, 5)  sheet sign: θ = dδ/dx
    delta: np.ndarray  # (n, 6)  downward positive


@dataclass
class Solution:
    model: Model
    reactions: np.ndarray  # upward force at each node (0 where none)
    reaction_moments: np.ndarray  # anticlockwise couple from each support on the beam
    nodal_w: np.ndarray  # downward deflection at each node
    end_actions: list[tuple[float, float, float, float]]  # per span: V_left, M_left, V_right, M_right (beam signs)
    fixed_end: list[np.ndarray]  # per span: fixed-end actions (nodal loads) used
    pieces: Pieces
    loads: list = field(default_factory=list)

    def at(self, what: str, x, side: str = "right") -> np.ndarray:
        """V, M, theta or delta at points x (the piece starting at x when side='right')."""
        p = self.pieces
        x = np.atleast_1d(np.asarray(x, dtype=float))
        if side == "right":
            idx = np.searchsorted(p.start, x, side="right") - 1
        else:
            idx = np.searchsorted(p.start, x, side="left") - 1
        idx = np.clip(idx, 0, len(p.start) - 1)
        return horner(getattr(p, what)[idx], x - p.start[idx])


def horner(C: np.ndarray, u: np.ndarray) -> np.ndarray:
    """Evaluate rows of ascending coefficients C at u (same leading shape, u may add a trailing axis)."""
    if u.ndim == C.ndim:  # u is (n, k)
        out = np.broadcast_to(C[:, -1:], u.shape).copy()
        for j in range(C.shape[1] - 2, -1, -1):
            out = out * u + C[:, j : j + 1]
        return out
    out = C[:, -1].copy()
    for j in range(C.shape[1] - 2, -1, -1):
        out = out * u + C[:, j]
    return out


def breakpoints(m: Model, loads) -> np.ndarray:
    X = m.nodes
    pts = [X]
    for ld in loads:
        pts.append(ld.breakpoints())
    b = np.unique(np.clip(np.concatenate([np.atleast_1d(np.asarray(p, float)) for p in pts]), 0.0, m.length))
    # merge points closer than a hair (a load placed "at" a support by arithmetic)
    keep = np.concatenate([[True], np.diff(b) > 1e-9 * m.length])
    b = b[keep]
    # snap the nearest breakpoint to each node exactly
    j = _nearest(b, X)
    b[j] = X
    return np.unique(b)


def solve(m: Model, loads, grid: np.ndarray | None = None) -> Solution:
    """Solve one set of (already factored) loads. ``grid`` fixes the piece breakpoints."""
    loads = list(loads)
    validate_loads(m, loads)
    if grid is None:
        grid = breakpoints(m, loads)
    grid_list = grid.tolist()
    loads = [_snap(ld, grid_list, 1e-9 * m.length) for ld in loads]
    X = m.nodes
    L_tot = m.length
    dofs = number_dofs(m)
    nspan = len(m.spans)

    # loads per element, in local coordinates
    per_el: list[list] = [[] for _ in range(nspan)]
    tol_el = 1e-12 * L_tot
    Xl = X.tolist()
    for ld in loads:
        bp = ld.breakpoints()
        if not bp:
            continue
        # only the spans the load's extent touches (a point load: one or two)
        lo = min(max(bisect.bisect_right(Xl, min(bp)) - 2, 0), nspan - 1)
        hi = min(max(bisect.bisect_left(Xl, max(bp)), 0), nspan - 1)
        for e in range(lo, hi + 1):
            per_el[e].extend(_on_span(ld, Xl, e, nspan, tol_el, L_tot))

    # assemble (full system, banded lower storage)
    n = dofs.n
    band = np.zeros((n, HALF_BAND + 1))
    F = np.zeros(n)
    el_dofs, el_k, el_f = [], [], []
    for e in range(nspan):
        d = [dofs.w[e], dofs.rr[e], dofs.w[e + 1], dofs.rl[e + 1]]
        k = element_stiffness(m.EI[e], m.spans[e])
        f = equivalent_loads(m.spans[e], per_el[e])
        for a in range(4):
            F[d[a]] += f[a]
            for b in range(4):
                if d[a] >= d[b]:
                    band[d[a], d[a] - d[b]] += k[a, b]
        el_dofs.append(d)
        el_k.append(k)
        el_f.append(f)

    for i, (k, kt) in m.springs.items():
        band[dofs.w[i], 0] += k
        band[dofs.rl[i], 0] += kt
    # prescribed support settlement: move the restrained dof, and its stiffness loads the free dofs
    u = np.zeros(dofs.n)
    for i, s_down in m.settlement.items():
        r = dofs.w[i]
        u[r] = -s_down  # y up
        for dd in range(1, HALF_BAND + 1):
            if r + dd < dofs.n:
                F[r + dd] -= band[r + dd, dd] * u[r]
            if r - dd >= 0:
                F[r - dd] -= band[r, dd] * u[r]

    free = np.flatnonzero(~dofs.restrained)
    pos = -np.ones(n, dtype=int)
    pos[free] = np.arange(len(free))
    rb = np.zeros((len(free), HALF_BAND + 1))
    for gi in free:
        for dd in range(HALF_BAND + 1):
            gj = gi - dd
            if gj >= 0 and pos[gj] >= 0:
                rb[pos[gi], pos[gi] - pos[gj]] = band[gi, dd]
    if len(free):
        scale = np.maximum(rb[:, 0], 1e-300)
        try:
            u[free] = banded_cholesky_solve(rb, F[free], scale)
        except Mechanism:
            raise BeamInputError(_mechanism_message(m, dofs, free, rb), "supports") from None

    # element end forces and reactions
    R = np.zeros(n)
    ends = []
    for e in range(nspan):
        d = el_dofs[e]
        fe = el_k[e] @ u[d] - el_f[e]  # forces the nodes put on the element (y up, anticlockwise)
        R[d] += fe
        ends.append((fe[0], -fe[1], -fe[2], fe[3]))  # V(0+), M(0+), V(L-), M(L-) in beam signs
    # reaction = what the supports must supply: K u - F at restrained dofs plus loads at nodes
    # (at a spring the element forces balance the spring force, so the same sum is the spring's reaction)
    sprung_w = {i for i, (k, _) in m.springs.items() if k}
    sprung_r = {i for i, (_, kt) in m.springs.items() if kt}
    reactions = np.array([R[dofs.w[i]] if dofs.restrained[dofs.w[i]] or i in sprung_w else 0.0
                          for i in range(nspan + 1)])
    rmom = np.array([R[dofs.rl[i]] if dofs.restrained[dofs.rl[i]] or i in sprung_r else 0.0
                     for i in range(nspan + 1)])
    # R above already includes equivalent loads of point loads at nodes through fe; a point load
    # exactly at a node sits inside one element's load vector, so R is correct as assembled.

    pieces = _integrate(m, per_el, ends, u, dofs, grid)
    fem = [-f for f in el_f]
    return Solution(m, reactions, rmom, -u[dofs.w], ends, fem, pieces, loads)


def _nearest(grid: np.ndarray, x) -> np.ndarray:
    """Index of the nearest grid point to each x (grid sorted): O(log n) each."""
    x = np.asarray(x, dtype=float)
    j = np.clip(np.searchsorted(grid, x), 1, max(len(grid) - 1, 1))
    left = grid[j - 1]
    right = grid[np.minimum(j, len(grid) - 1)]
    return np.where(np.abs(x - left) <= np.abs(right - x), j - 1, np.minimum(j, len(grid) - 1))


def _snap_x(x: float, grid: np.ndarray, tol: float) -> float:
    j = int(_nearest(grid, x))
    return float(grid[j]) if abs(grid[j] - x) <= tol else x


def _snap(ld, grid: list, tol: float):
    """Put a load that sits a hair from a breakpoint exactly on it, so its jump lands on a piece start."""
    def snap(x: float) -> float:
        j = bisect.bisect_left(grid, x)
        for k in (j - 1, j):
            if 0 <= k < len(grid) and abs(grid[k] - x) <= tol:
                return grid[k]
        return x
    return ld.snapped(snap)


def _on_span(ld, X, e: int, nspan: int, tol: float, L_tot: float) -> list:
    """The load's parts on span e (local coordinates). A point force or couple belongs to exactly one span:
    the one starting at or before it (the last span for one at the right end)."""
    out = []
    for part in ld.parts(X[e], X[e + 1], tol):
        if part[0] == "w":
            out.append(part)
            continue
        x = min(max(X[e] + part[1], 0.0), L_tot)
        home = min(max(bisect.bisect_right(X, x) - 1, 0), nspan - 1)
        if home == e:
            out.append((part[0], x - X[e], 0.0, part[3], 0.0))
    return out


def _mechanism_message(m: Model, dofs: Dofs, free: np.ndarray, rb: np.ndarray) -> str:
    """Say which part of the beam can move: the null mode of the stiffness matrix (failure path only)."""
    n = len(free)
    K = np.zeros((n, n))
    for i in range(n):
        for d in range(rb.shape[1]):
            if i - d >= 0:
                K[i, i - d] = K[i - d, i] = rb[i, d]
    D = 1.0 / np.sqrt(np.maximum(np.diag(K), 1e-300))
    vals, vecs = np.linalg.eigh(K * D[:, None] * D[None, :])
    mode = np.zeros(dofs.n)
    mode[free] = vecs[:, 0] * D
    X = m.nodes
    w = np.array([mode[dofs.w[i]] for i in range(len(X))])
    moving = np.flatnonzero(np.abs(w) > 1e-6 * max(np.abs(w).max(), 1e-300))
    if len(moving) and np.abs(w).max() > 0:
        a, b = X[max(moving[0] - 1, 0)], X[min(moving[-1] + 1, len(X) - 1)]
        where = f"the part from x = {a:g} m to x = {b:g} m can move up and down freely"
    else:
        where = "a joint can rotate freely"
    return (f"the supports cannot hold the beam — it is a mechanism: {where}; "
            f"add a support, fix an end, or remove a hinge")


def _integrate(m: Model, per_el, ends, u, dofs: Dofs, grid: np.ndarray) -> Pieces:
    """March along each span from its left end, integrating the load exactly."""
    X = m.nodes
    tol = 1e-12 * m.length
    starts, lens, spans, Vc, Mc, Tc, Wc = [], [], [], [], [], [], []
    for e in range(len(m.spans)):
        x0, x1 = X[e], X[e + 1]
        EI = m.EI[e]
        lo = np.searchsorted(grid, x0 + 1e-12 * m.length, side="right")
        hi = np.searchsorted(grid, x1 - 1e-12 * m.length, side="left")
        inner = grid[lo:hi]
        cuts = np.concatenate([[x0], inner, [x1]])
        V, M = ends[e][0], ends[e][1]
        th = u[dofs.rr[e]]  # y-up slope
        w = u[dofs.w[e]]
        loads = per_el[e]
        for s, t in zip(cuts[:-1], cuts[1:]):
            ls, lt = s - x0, t - x0
            # jumps at the piece start (the end forces are what the node supplies, so a load
            # sitting on the span's left end still acts here)
            for kind, a, _b, v1, _v2 in loads:
                if kind in ("P", "M") and abs(a - ls) <= tol:
                    if kind == "P":
                        V -= v1
                    else:
                        M += v1
            # linear upward q on this piece: q(u) = q0 + q1 u
            q0 = q1 = 0.0
            for kind, a, b, v1, v2 in loads:
                if kind == "w" and a <= ls + tol and b >= lt - tol and b > a:
                    slope = (v2 - v1) / (b - a)
                    q0 -= v1 + slope * (ls - a)
                    q1 -= slope
            h = t - s
            Vp = np.array([V, q0, q1 / 2])
            Mp = np.array([M, V, q0 / 2, q1 / 6])
            Tp = np.array([th, M / EI, V / (2 * EI), q0 / (6 * EI), q1 / (24 * EI)])
            Wp = np.array([w, th, M / (2 * EI), V / (6 * EI), q0 / (24 * EI), q1 / (120 * EI)])
            starts.append(s)
            lens.append(h)
            spans.append(e)
            Vc.append(Vp)
            Mc.append(Mp)
            Tc.append(-Tp)
            Wc.append(-Wp)
            V = float(_P.polyval(h, Vp))
            M = float(_P.polyval(h, Mp))
            th = float(_P.polyval(h, Tp))
            w = float(_P.polyval(h, Wp))
    return Pieces(
        np.array(starts), np.array(lens), np.array(spans, dtype=int),
        np.array(Vc), np.array(Mc), np.array(Tc), np.array(Wc),
    )


# ---------------------------------------------------------------- extrema and sampling


TIE = 1e-9  # two extremes within this relative difference are the same value


@dataclass
class Extreme:
    value: float
    x: float
    others: list = field(default_factory=list)  # other positions where the same value occurs (ties)


def piece_extrema(C: np.ndarray, start: np.ndarray, length: np.ndarray, samples: int = 12):
    """Max and min of each piece's polynomial, exactly (derivative roots by bisection).

    Returns (max_val, x_max, min_val, x_min) arrays per piece.
    """
    n = len(start)
    t = np.linspace(0.0, 1.0, samples + 1)
    U = length[:, None] * t[None, :]
    dC = C[:, 1:] * np.arange(1, C.shape[1])[None, :]
    vals = horner(C, U)
    cand_u = [U]
    cand_v = [vals]
    if dC.shape[1] > 0:
        D = horner(dC, U)
        sc = np.signbit(D[:, :-1]) != np.signbit(D[:, 1:])
        rows, cols = np.nonzero(sc)
        if len(rows):
            lo = U[rows, cols].copy()
            hi = U[rows, cols + 1].copy()
            dlo = D[rows, cols]
            Cr = dC[rows]
            for _ in range(60):
                mid = 0.5 * (lo + hi)
                dm = horner(Cr, mid)
                same = np.signbit(dm) == np.signbit(dlo)
                lo = np.where(same, mid, lo)
                hi = np.where(same, hi, mid)
            r = 0.5 * (lo + hi)
            extra_u = np.full((n, samples), np.nan)
            extra_u[rows, cols] = r
            extra_v = np.full((n, samples), np.nan)
            extra_v[rows, cols] = horner(C[rows], r)
            cand_u.append(extra_u)
            cand_v.append(extra_v)
    Ua = np.concatenate(cand_u, axis=1)
    Va = np.concatenate(cand_v, axis=1)
    vmax = np.where(np.isnan(Va), -np.inf, Va)
    vmin = np.where(np.isnan(Va), np.inf, Va)
    imax = np.argmax(vmax, axis=1)
    imin = np.argmin(vmin, axis=1)
    ar = np.arange(n)
    return vmax[ar, imax], start + Ua[ar, imax], vmin[ar, imin], start + Ua[ar, imin]


def extremes(sol: Solution, what: str, spans=None) -> tuple[Extreme, Extreme]:
    """(max, min) of V, M, theta or delta over the beam (or over given span indices).

    Values within a relative 1e-9 of each other are ties: the leftmost position is reported and the others
    are listed (positions closer than 1e-9 of the beam's length are one place).
    """
    p = sol.pieces
    sel = np.ones(len(p.start), bool) if spans is None else np.isin(p.span, list(spans))
    mx, xmx, mn, xmn = piece_extrema(getattr(p, what)[sel], p.start[sel], p.length[sel])
    return _pick(mx, xmx, 1, sol.model.length), _pick(mn, xmn, -1, sol.model.length)


def _pick(vals: np.ndarray, xs: np.ndarray, sign: int, L: float) -> Extreme:
    i = int(np.argmax(sign * vals))
    best = float(vals[i])
    near = np.flatnonzero(np.abs(vals - best) <= TIE * max(abs(best), 1e-300))
    places = np.sort(xs[near])
    keep = np.concatenate([[True], np.diff(places) > 1e-9 * L]) if len(places) else places
    places = places[keep]
    return Extreme(best, float(places[0]), [float(x) for x in places[1:]])


def zero_shear_points(sol: Solution) -> list[float]:
    """Where V passes through zero: inside a piece, or by a jump across zero at a point load."""
    p = sol.pieces
    out = []
    L = sol.model.length
    Vs = p.V
    # inside pieces: quadratic roots
    for C, s, h in zip(Vs, p.start, p.length):
        c0, c1, c2 = C
        roots = np.roots([c2, c1, c0]) if abs(c2) > 0 or abs(c1) > 0 else []
        for r in np.atleast_1d(roots):
            if abs(np.imag(r)) < 1e-12 and 1e-9 * L < np.real(r) < h - 1e-9 * L:
                out.append(float(s + np.real(r)))
    # jumps at piece boundaries
    ends_V = horner(Vs, p.length)
    starts_V = Vs[:, 0]
    for k in range(len(p.start) - 1):
        a, b = ends_V[k], starts_V[k + 1]
        if a * b < 0:
            out.append(float(p.start[k + 1]))
    return sorted(out)


def sample(sol: Solution, per_span: int = 200):
    """x and V, M, θ, δ at about ``per_span`` points per span, both sides of every jump."""
    p = sol.pieces
    span_len = np.asarray(sol.model.spans)[p.span]
    counts = np.maximum(2, np.ceil(per_span * p.length / span_len).astype(int) + 1)
    idx = np.repeat(np.arange(len(p.start)), counts)
    first = np.concatenate([[0], np.cumsum(counts)[:-1]])
    k = np.arange(int(counts.sum())) - np.repeat(first, counts)
    u = p.length[idx] * k / (counts[idx] - 1)
    x = p.start[idx] + u
    return x, horner(p.V[idx], u), horner(p.M[idx], u), horner(p.theta[idx], u), horner(p.delta[idx], u)


def combine(model: Model, case_loads: dict[str, list], factors: dict[str, float]) -> list:
    """The loads of a combination: each case's loads scaled by its factor."""
    return [ld.scaled(f) for case, f in factors.items() for ld in case_loads.get(case, [])]
