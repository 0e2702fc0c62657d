"""Exact, vectorised integrals over polygon regions (Green's theorem).

A *region* is a list of rings. Each ring is a closed polygon (x, y arrays,
first vertex not repeated, anticlockwise) with a ``weight``: +1 for
material, -1 for a hole, or ±n for a part of another material (transformed
section). The region's integral of f is Σ weight_k · ∬_ring_k f dA.

Why Green's theorem: it is exact for straight-edged outlines, independent of
any decomposition into rectangles, and costs one vectorised pass over the
vertices, so it serves as the second, independent method behind every
section's parts table. Everything here works in one consistent length unit
(the plugin uses millimetres) on plain floats.
"""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np


@dataclass(frozen=True)
class Ring:
    """One closed outline. ``sign`` is +1 (material) or -1 (hole); ``n`` the modular ratio."""

    x: np.ndarray
    y: np.ndarray
    sign: int = 1
    n: float = 1.0

    @property
    def weight(self) -> float:
        return self.sign * self.n

    def moved(self, dx: float, dy: float) -> "Ring":
        return Ring(self.x + dx, self.y + dy, self.sign, self.n)


def make_ring(points, sign: int = 1, n: float = 1.0) -> Ring:
    """A ring from (x, y) points in either orientation; stored anticlockwise."""
    pts = np.asarray(points, dtype=float)
    x, y = pts[:, 0].copy(), pts[:, 1].copy()
    if signed_area(x, y) < 0:
        x, y = x[::-1].copy(), y[::-1].copy()
    return Ring(x, y, sign, n)


def _dot(a: np.ndarray, b: np.ndarray) -> float:
    """Inner product without BLAS: OpenBLAS threads its dot product, which stalls badly on a busy machine."""
    return np.dot(a, b) if a.shape[0] < 8192 else np.einsum("i,i->", a, b)


def _next(a: np.ndarray) -> np.ndarray:
    out = np.empty_like(a)
    out[:-1] = a[1:]
    out[-1] = a[0]
    return out


def signed_area(x: np.ndarray, y: np.ndarray) -> float:
    x1, y1 = _next(x), _next(y)
    return 0.5 * float(_dot(x, y1) - _dot(x1, y))


@dataclass(frozen=True)
class Moments:
    """Integrals about the origin: A=∬dA, Sx=∬y dA, Sy=∬x dA, Ixx=∬y², Iyy=∬x², Ixy=∬xy."""

    A: float
    Sx: float
    Sy: float
    Ixx: float
    Iyy: float
    Ixy: float

    def __add__(self, o: "Moments") -> "Moments":
        return Moments(*(a + b for a, b in zip(self.astuple(), o.astuple())))

    def scaled(self, w: float) -> "Moments":
        return Moments(*(w * a for a in self.astuple()))

    def astuple(self):
        return (self.A, self.Sx, self.Sy, self.Ixx, self.Iyy, self.Ixy)


ZERO = Moments(0.0, 0.0, 0.0, 0.0, 0.0, 0.0)


def _edge_moments(x0, y0, x1, y1, w=None) -> Moments:
    """Sum of the exact per-edge Green terms for edges (x0,y0)->(x1,y1), each times its ring's weight ``w``."""
    c = x0 * y1 - x1 * y0
    if w is not None:
        c *= w
    A = c.sum() / 2.0
    Sy = _dot(x0 + x1, c) / 6.0
    Sx = _dot(y0 + y1, c) / 6.0
    Ixx = _dot(y0 * y0 + y0 * y1 + y1 * y1, c) / 12.0
    Iyy = _dot(x0 * x0 + x0 * x1 + x1 * x1, c) / 12.0
    Ixy = _dot(x0 * (2.0 * y0 + y1) + x1 * (y0 + 2.0 * y1), c) / 24.0
    return Moments(float(A), float(Sx), float(Sy), float(Ixx), float(Iyy), float(Ixy))


def ring_moments(x: np.ndarray, y: np.ndarray) -> Moments:
    """Moments of one ring about the origin (computed about a local point for accuracy)."""
    ox, oy = float(x.mean()), float(y.mean())
    xs, ys = x - ox, y - oy
    m = _edge_moments(xs, ys, _next(xs), _next(ys))
    return shift_moments(m, ox, oy)


def shift_moments(m: Moments, ox: float, oy: float) -> Moments:
    """Moments about the origin of a region given its moments about (-ox, -oy) offset frame."""
    A = m.A
    return Moments(
        A,
        m.Sx + oy * A,
        m.Sy + ox * A,
        m.Ixx + 2 * oy * m.Sx + oy * oy * A,
        m.Iyy + 2 * ox * m.Sy + ox * ox * A,
        m.Ixy + ox * m.Sx + oy * m.Sy + ox * oy * A,
    )


def _flat(rings):
    """All rings' vertices end to end: (x, y, index of each vertex's next one in its own ring, counts, starts)."""
    counts = np.array([len(r.x) for r in rings])
    ends = np.cumsum(counts)
    starts = ends - counts
    x = np.concatenate([r.x for r in rings])
    y = np.concatenate([r.y for r in rings])
    nxt = np.arange(1, len(x) + 1)
    nxt[ends - 1] = starts  # the last vertex of a ring closes it to its first
    return x, y, nxt, counts, starts


def region_moments(rings, weighted: bool = True) -> Moments:
    """Σ weight · moments of each ring, each ring integrated about its own mean vertex (as ``ring_moments``).

    Several rings (a built-up section, a shape with holes) go through together: one vectorised pass over
    all their edges, summed per ring with ``np.add.reduceat``, then moved to the origin and weighted.
    """
    rings = list(rings)
    if len(rings) <= 2:
        total = ZERO
        for r in rings:
            w = r.weight if weighted else r.sign
            total = total + ring_moments(r.x, r.y).scaled(w)
        return total
    x, y, nxt, counts, starts = _flat(rings)
    ox = np.add.reduceat(x, starts) / counts
    oy = np.add.reduceat(y, starts) / counts
    w = np.array([float(r.weight if weighted else r.sign) for r in rings])
    ex, ey = np.repeat(ox, counts), np.repeat(oy, counts)
    x0, y0 = x - ex, y - ey
    x1, y1 = x0[nxt], y0[nxt]
    c = x0 * y1 - x1 * y0
    terms = np.stack([c / 2.0, (y0 + y1) * c / 6.0, (x0 + x1) * c / 6.0,
                      (y0 * y0 + y0 * y1 + y1 * y1) * c / 12.0, (x0 * x0 + x0 * x1 + x1 * x1) * c / 12.0,
                      (x0 * (2.0 * y0 + y1) + x1 * (y0 + 2.0 * y1)) * c / 24.0])
    A, Sx, Sy, Ixx, Iyy, Ixy = np.add.reduceat(terms, starts, axis=1)  # per ring, about its own mean vertex
    # shift_moments, ring by ring, then weighted
    moved = (A, Sx + oy * A, Sy + ox * A, Ixx + 2 * oy * Sx + oy * oy * A, Iyy + 2 * ox * Sy + ox * ox * A,
             Ixy + ox * Sx + oy * Sy + ox * oy * A)
    return Moments(*(float(np.dot(w, m)) for m in moved))


@dataclass(frozen=True)
class CentroidalProps:
    A: float
    x_c: float
    y_c: float
    I_x: float
    I_y: float
    I_xy: float  # ∬(x-x_c)(y-y_c) dA


def centroidal(m: Moments) -> CentroidalProps:
    if m.A <= 0:
        raise ValueError("region has no positive area")
    xc, yc = m.Sy / m.A, m.Sx / m.A
    return CentroidalProps(
        m.A, xc, yc, m.Ixx - m.A * yc * yc, m.Iyy - m.A * xc * xc, m.Ixy - m.A * xc * yc
    )


_CHUNK = 8000  # vertices per block: the work arrays stay in cache, and each dot product stays below _dot's limit


def polygon_properties(x: np.ndarray, y: np.ndarray) -> CentroidalProps:
    """Area, centroid and centroidal second moments of one simple polygon (either orientation).

    The fast path for large outlines: vectorised passes about the first vertex
    (centroidal values do not depend on the origin, and a local origin keeps
    the products small), with the per-edge Green terms rewritten in sums
    sx = x0 + x1, sy = y0 + y1 so each moment is one or two dot products.
    The vertices go through in blocks of ``_CHUNK``: six small work arrays,
    reused, stay in the processor's cache, where whole-length temporaries
    would go out to memory and back on every pass; the blocks' sums add up.
    """
    x = np.asarray(x, float)
    y = np.asarray(y, float)
    n = len(x)
    ox, oy = x[0], y[0]
    m = min(_CHUNK, n)
    x0, y0, x1, y1, c, t = (np.empty(m) for _ in range(6))
    dot = np.dot  # blocks are shorter than _dot's limit: BLAS's own, unthreaded at this length
    A2 = Sy6 = Sx6 = Ixx12 = Iyy12 = Ixy24 = 0.0
    for s in range(0, n, _CHUNK):
        e = min(s + _CHUNK, n)
        if e - s != m:  # the last, shorter block
            m = e - s
            x0, y0, x1, y1, c, t = (a[:m] for a in (x0, y0, x1, y1, c, t))
        np.subtract(x[s:e], ox, out=x0)
        np.subtract(y[s:e], oy, out=y0)
        if e < n:  # the next vertex of each; the last vertex's next is the first, (0, 0) about itself
            np.subtract(x[s + 1:e + 1], ox, out=x1)
            np.subtract(y[s + 1:e + 1], oy, out=y1)
        else:
            np.subtract(x[s + 1:e], ox, out=x1[:-1])
            np.subtract(y[s + 1:e], oy, out=y1[:-1])
            x1[-1] = y1[-1] = 0.0
        np.multiply(x0, y1, out=c)
        np.multiply(x1, y0, out=t)
        c -= t
        A2 += c.sum()  # 2A
        # y0² + y0·y1 + y1² = sy² − y0·y1;  x likewise;  2x0y0 + x0y1 + x1y0 + 2x1y1 = sx·sy + x0y0 + x1y1
        np.multiply(x0, x1, out=t)
        Iyy12 -= dot(t, c)
        np.multiply(y0, y1, out=t)
        Ixx12 -= dot(t, c)
        np.multiply(x0, y0, out=t)
        Ixy24 += dot(t, c)
        np.multiply(x1, y1, out=t)
        Ixy24 += dot(t, c)
        sx = np.add(x0, x1, out=x1)  # x1, y1 no longer needed
        sy = np.add(y0, y1, out=y1)
        Sy6 += dot(sx, c)  # 6 ∬x dA
        Sx6 += dot(sy, c)
        np.multiply(sx, sx, out=t)
        Iyy12 += dot(t, c)
        np.multiply(sy, sy, out=t)
        Ixx12 += dot(t, c)
        np.multiply(sx, sy, out=t)
        Ixy24 += dot(t, c)
    if A2 < 0:
        A2, Sy6, Sx6, Ixx12, Iyy12, Ixy24 = -A2, -Sy6, -Sx6, -Ixx12, -Iyy12, -Ixy24
    A = A2 / 2
    xc, yc = Sy6 / 6 / A, Sx6 / 6 / A
    return CentroidalProps(float(A), float(xc + ox), float(yc + oy), float(Ixx12 / 12 - A * yc * yc),
                           float(Iyy12 / 12 - A * xc * xc), float(Ixy24 / 24 - A * xc * yc))


# ---------------------------------------------------------------- cuts at a line


def _edges(rings, weighted: bool = True):
    """Every edge of the region as flat arrays (x0, y0, x1, y1, weight): one pass covers all the rings.

    The weight is one float when every ring has the same (one outline; plates of one material).
    """
    if not rings:
        e = np.zeros(0)
        return e, e, e, e, 1.0
    ws = [float(r.weight if weighted else r.sign) for r in rings]
    if len(rings) == 1:
        r = rings[0]
        return r.x, r.y, _next(r.x), _next(r.y), ws[0]
    x, y, nxt, counts, _ = _flat(rings)
    w = ws[0] if all(v == ws[0] for v in ws) else np.repeat(np.array(ws), counts)
    return x, y, x[nxt], y[nxt], w


def _moments_above(rings, c: float, weighted: bool = True, edges=None) -> Moments:
    """Moments, about the line y = c (and x = 0), of the part of the region with y >= c.

    In coordinates shifted so the cut is y' = 0, every Green edge term carries the
    factor x0*y1' - x1*y0', which vanishes for the closing segments along y' = 0;
    clipping each edge to y' >= 0 is therefore enough — no polygon reassembly.
    All rings' edges are clipped in one vectorised pass (``edges``, from ``_edges``, when the caller
    cuts the same region many times).
    """
    ax, ay, bx, by, w = _clipped_above(c, _edges(rings, weighted) if edges is None else edges)
    if isinstance(w, float):
        return _edge_moments(ax, ay, bx, by).scaled(w)
    return _edge_moments(ax, ay, bx, by, w)


def _clipped_above(c: float, edges):
    """Every edge clipped to y >= c, in coordinates y' = y - c: the kept edges' endpoints (ax, ay, bx, by)
    and their weights (a float for all, or one per kept edge)."""
    x0, y0, x1, y1, w = edges
    y0 = y0 - c
    y1 = y1 - c
    in0, in1 = y0 >= 0, y1 >= 0
    dy = y1 - y0
    with np.errstate(divide="ignore", invalid="ignore"):
        t = np.where(dy != 0, -y0 / dy, 0.0)
    xi = x0 + t * (x1 - x0)
    keep = in0 | in1
    return (np.where(in0, x0, xi)[keep], np.where(in0, y0, 0.0)[keep], np.where(in1, x1, xi)[keep],
            np.where(in1, y1, 0.0)[keep], w if isinstance(w, float) else w[keep])


def _area_above(c: float, edges) -> float:
    """``_moments_above(..., edges).A`` alone: the same clipping and the same sum, without the five other
    moments (the plastic axis's search asks only for areas)."""
    ax, ay, bx, by, w = _clipped_above(c, edges)
    cross = ax * by - bx * ay
    if isinstance(w, float):
        return w * float(cross.sum() / 2.0)
    cross *= w
    return float(cross.sum() / 2.0)


def _swap(rings):
    """Reflect across y = x (keeps each ring anticlockwise by reversing it)."""
    return [Ring(r.y[::-1].copy(), r.x[::-1].copy(), r.sign, r.n) for r in rings]


def area_above(rings, c: float, weighted: bool = True, edges=None) -> float:
    return _area_above(c, _edges(rings, weighted) if edges is None else edges)


def first_moment_above(rings, c: float, weighted: bool = True, edges=None) -> float:
    """Q = ∬_{y>c} (y - c) dA."""
    return _moments_above(rings, c, weighted, edges).Sx


def plastic_axis(rings, weighted: bool = True, edges=None, total: Moments | None = None) -> float:
    """The horizontal line that halves the (transformed) area, found exactly.

    The area above y = c is piecewise quadratic in c with breaks at the vertex
    heights: bisect over the sorted heights, then solve the quadratic in the
    bracket (fitted exactly from three evaluations). ``edges`` (from ``_edges``) and ``total`` (the region's
    moments) may be passed by a caller that has them already.
    """
    half = (region_moments(rings, weighted) if total is None else total).A / 2.0
    edges = _edges(rings, weighted) if edges is None else edges
    ys = np.unique(edges[1])
    lo, hi = 0, len(ys) - 1  # area_above(ys[lo]) >= half >= area_above(ys[hi])
    while hi - lo > 1:
        mid = (lo + hi) // 2
        if _area_above(ys[mid], edges) >= half:
            lo = mid
        else:
            hi = mid
    a, b = ys[lo], ys[hi]
    fa, fb = _area_above(a, edges), _area_above(b, edges)
    m = 0.5 * (a + b)
    fm = _area_above(m, edges)
    # f(s) = fa + p s + q s^2 on s in [0, 1]
    p = 4 * fm - 3 * fa - fb
    q = 2 * fa + 2 * fb - 4 * fm
    target = half - fa
    if abs(q) < 1e-14 * max(abs(p), 1e-300):
        s = target / p if p != 0 else 0.5
    else:
        disc = max(p * p + 4 * q * target, 0.0)
        roots = [(-p + sgn * np.sqrt(disc)) / (2 * q) for sgn in (1, -1)]
        s = min(roots, key=lambda r: abs(r - np.clip(r, 0, 1)) + (0 if 0 <= r <= 1 else 1))
    return float(a + np.clip(s, 0.0, 1.0) * (b - a))


def plastic_modulus(rings, weighted: bool = True) -> tuple[float, float]:
    """(Z about the horizontal plastic axis, its height y_p): Z = ∬|y - y_p| dA."""
    total = region_moments(rings, weighted)
    edges = _edges(rings, weighted)
    yp = plastic_axis(rings, weighted, edges, total)
    above = first_moment_above(rings, yp, weighted, edges)
    all_about = total.Sx - yp * total.A  # ∬(y - y_p) dA
    return 2 * above - all_about, yp


def plastic_modulus_y(rings, weighted: bool = True) -> tuple[float, float]:
    """(Z about the vertical plastic axis, its position x_p)."""
    return plastic_modulus(_swap(rings), weighted)


def first_moment_above_y(rings, c: float, weighted: bool = True) -> float:
    """Q about the vertical line x = c of the part with x > c."""
    return first_moment_above(_swap(rings), c, weighted)


def width_at(rings, c: float, weighted: bool = False) -> float:
    """Material width cut by the line y = c (holes subtract; ``weighted``: each part at n times its width).

    At a height where the width jumps (a flange-web junction) the smaller of the
    widths just above and just below is returned: the one that governs shear.
    """
    x0, y0, x1, y1, w = _edges(list(rings), weighted)

    def one_side(upper: bool) -> float:
        if upper:
            up = (y0 <= c) & (y1 > c)
            down = (y1 <= c) & (y0 > c)
        else:
            up = (y0 < c) & (y1 >= c)
            down = (y1 < c) & (y0 >= c)
        cross = up | down
        t = (c - y0[cross]) / (y1[cross] - y0[cross])
        xc = x0[cross] + t * (x1[cross] - x0[cross])
        s = np.where(up[cross], 1.0, -1.0)
        return float(_dot(s * (w if isinstance(w, float) else w[cross]), xc))

    return min(one_side(True), one_side(False))


def width_at_x(rings, c: float, weighted: bool = False) -> float:
    return width_at(_swap(rings), c, weighted)


# ---------------------------------------------------------------- geometry tests


def point_in_ring(px: np.ndarray, py: np.ndarray, ring: Ring) -> np.ndarray:
    """Even-odd test, vectorised over points (boundary points may go either way)."""
    x0, y0 = ring.x[None, :], ring.y[None, :]
    x1, y1 = _next(ring.x)[None, :], _next(ring.y)[None, :]
    px, py = np.asarray(px, float)[:, None], np.asarray(py, float)[:, None]
    straddle = (y0 > py) != (y1 > py)
    with np.errstate(divide="ignore", invalid="ignore"):
        xint = x0 + (py - y0) * (x1 - x0) / (y1 - y0)
    hits = straddle & (px < xint)
    return (hits.sum(axis=1) % 2) == 1


def distance_to_ring(px, py, ring: Ring) -> np.ndarray:
    """Distance from each point to the ring's boundary."""
    px, py = np.asarray(px, float)[:, None], np.asarray(py, float)[:, None]
    x0, y0 = ring.x[None, :], ring.y[None, :]
    dx, dy = (_next(ring.x) - ring.x)[None, :], (_next(ring.y) - ring.y)[None, :]
    L2 = dx * dx + dy * dy
    inv = np.divide(1.0, L2, out=np.zeros_like(L2), where=L2 > 0)  # a zero-length edge: its start point
    t = np.minimum(np.maximum(((px - x0) * dx + (py - y0) * dy) * inv, 0.0), 1.0)
    ex, ey = x0 + t * dx - px, y0 + t * dy - py
    return np.sqrt(ex * ex + ey * ey).min(axis=1)


def _flat_edges(rings):
    x0, y0, nxt, _, starts = _flat(list(rings))
    return x0, y0, x0[nxt], y0[nxt], starts


def point_in_rings(px, py, rings) -> np.ndarray:
    """``point_in_ring`` of every point in every ring at once, over all the rings' edges in one vectorised pass:
    shape (points, rings). Elementwise the very arithmetic of the one-ring test (the same answers)."""
    x0, y0, x1, y1, starts = _flat_edges(rings)
    px, py = np.asarray(px, float)[:, None], np.asarray(py, float)[:, None]
    straddle = (y0 > py) != (y1 > py)
    with np.errstate(divide="ignore", invalid="ignore"):
        xint = x0 + (py - y0) * (x1 - x0) / (y1 - y0)
    hits = straddle & (px < xint)
    return (np.add.reduceat(hits, starts, axis=1, dtype=np.int64) % 2) == 1


def distance_to_rings(px, py, rings) -> np.ndarray:
    """``distance_to_ring`` from every point to every ring at once: shape (points, rings), the same floats."""
    x0, y0, x1, y1, starts = _flat_edges(rings)
    px, py = np.asarray(px, float)[:, None], np.asarray(py, float)[:, None]
    dx, dy = x1 - x0, y1 - y0
    L2 = dx * dx + dy * dy
    inv = np.divide(1.0, L2, out=np.zeros_like(L2), where=L2 > 0)  # a zero-length edge: its start point
    t = np.minimum(np.maximum(((px - x0) * dx + (py - y0) * dy) * inv, 0.0), 1.0)
    ex, ey = x0 + t * dx - px, y0 + t * dy - py
    return np.minimum.reduceat(np.sqrt(ex * ex + ey * ey), starts, axis=1)


def _segments(ring: Ring):
    return ring.x, ring.y, _next(ring.x), _next(ring.y)


def segments_cross(a: Ring, b: Ring, tol: float) -> bool:
    """True if an edge of ``a`` properly crosses an edge of ``b`` (not merely touching)."""
    ax0, ay0, ax1, ay1 = (v[:, None] for v in _segments(a))
    bx0, by0, bx1, by1 = (v[None, :] for v in _segments(b))

    def orient(px, py, qx, qy, rx, ry):
        return (qx - px) * (ry - py) - (qy - py) * (rx - px)

    la = np.hypot(ax1 - ax0, ay1 - ay0)
    lb = np.hypot(bx1 - bx0, by1 - by0)
    d1 = orient(ax0, ay0, ax1, ay1, bx0, by0) / np.maximum(la, 1e-300)
    d2 = orient(ax0, ay0, ax1, ay1, bx1, by1) / np.maximum(la, 1e-300)
    d3 = orient(bx0, by0, bx1, by1, ax0, ay0) / np.maximum(lb, 1e-300)
    d4 = orient(bx0, by0, bx1, by1, ax1, ay1) / np.maximum(lb, 1e-300)
    proper = (((d1 > tol) & (d2 < -tol)) | ((d1 < -tol) & (d2 > tol))) & (
        ((d3 > tol) & (d4 < -tol)) | ((d3 < -tol) & (d4 > tol))
    )
    return bool(proper.any())


def self_intersection(x: np.ndarray, y: np.ndarray, tol: float) -> tuple[int, int] | None:
    """The first pair of non-adjacent edges (i, j) that meet, or None (O(n²), for sheet-sized polygons)."""
    n = len(x)
    x0, y0, x1, y1 = x, y, _next(x), _next(y)
    i = np.arange(n)
    rows = max(1, min(512, 400_000 // max(n, 1)))  # keep each block's temporaries to a few MB
    for start in range(0, n, rows):
        sl = slice(start, min(n, start + rows))
        ax0, ay0, ax1, ay1 = (v[sl, None] for v in (x0, y0, x1, y1))
        bx0, by0, bx1, by1 = (v[None, :] for v in (x0, y0, x1, y1))

        def orient(px, py, qx, qy, rx, ry):
            return (qx - px) * (ry - py) - (qy - py) * (rx - px)

        d1 = orient(ax0, ay0, ax1, ay1, bx0, by0)
        d2 = orient(ax0, ay0, ax1, ay1, bx1, by1)
        d3 = orient(bx0, by0, bx1, by1, ax0, ay0)
        d4 = orient(bx0, by0, bx1, by1, ax1, ay1)
        scale = tol * tol
        meet = ((d1 * d2) <= scale) & ((d3 * d4) <= scale)
        # collinear-but-disjoint segments satisfy the test trivially: check bounding boxes too
        bbox = (
            (np.minimum(ax0, ax1) <= np.maximum(bx0, bx1) + tol)
            & (np.minimum(bx0, bx1) <= np.maximum(ax0, ax1) + tol)
            & (np.minimum(ay0, ay1) <= np.maximum(by0, by1) + tol)
            & (np.minimum(by0, by1) <= np.maximum(ay0, ay1) + tol)
        )
        ii = i[sl, None]
        jj = i[None, :]
        adjacent = (jj == ii) | (jj == (ii + 1) % n) | (ii == (jj + 1) % n)
        hit = meet & bbox & ~adjacent & (jj > ii)
        if hit.any():
            a, b = np.argwhere(hit)[0]
            return int(a + start), int(b)
    return None
