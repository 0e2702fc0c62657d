"""Built-up sections: parts placed, rotated, mirrored, holes cut, materials transformed.

A part is any shape moved into the built-up section's own frame: first
mirrored (``"left-right"`` flips x, ``"up-down"`` flips y), then rotated
anticlockwise about its origin, then shifted so its ``anchor`` lands on
(x, y). Anchors name a point of the moved part's bounding box
(``bottom-left``, ``bottom-centre``, ``top-left``, ``top-centre``, ``centre``)
or its ``centroid``. A hole is placed the same way and subtracts from the part
it lies in, at that part's modular ratio. Parts of another material count at
n = E_i/E_ref (transformed section).
"""
from __future__ import annotations

import hashlib
import math
from dataclasses import dataclass, replace

import numpy as np

from . import polygon as P
from .properties import tabular
from .shapes import ARC_TOLERANCE, EXACT_TOLERANCE, Row, Shape, ShapeError

ANCHORS = ("bottom-left", "bottom-centre", "bottom-right", "top-left", "top-centre", "top-right", "centre",
           "centroid")
MIRRORS = ("none", "left-right", "up-down")


@dataclass
class Placed:
    name: str
    role: str  # "part" | "hole"
    shape: Shape  # rows and rings already in the built-up frame
    E: float | None = None  # MPa
    rho: float | None = None  # kg/mm³


def place(shape: Shape, x: float, y: float, anchor: str = "bottom-left", rotate: float = 0.0,
          mirror: str = "none") -> Shape:
    """A copy of ``shape`` moved into the built-up frame (closed forms dropped: they describe the original)."""
    if anchor not in ANCHORS:
        raise ShapeError(f"anchor must be one of {', '.join(ANCHORS)}", "anchor")
    if mirror not in MIRRORS:
        raise ShapeError(f"mirror must be one of {', '.join(MIRRORS)}", "mirror")
    c, s = math.cos(rotate), math.sin(rotate)

    def move_xy(px, py):
        if mirror == "left-right":
            px = -px
        elif mirror == "up-down":
            py = -py
        return px * c - py * s, px * s + py * c

    rings = []
    for r in shape.rings:
        mx, my = move_xy(r.x, r.y)
        rings.append(P.make_ring(np.column_stack([mx, my]), r.sign, r.n))
    rows = [row.transformed(None, rotate, 0.0, 0.0, mirror) for row in shape.rows]
    solid = [r for r in rings if r.sign > 0]
    xs = np.concatenate([r.x for r in solid])
    ys = np.concatenate([r.y for r in solid])
    x0, x1, y0, y1 = xs.min(), xs.max(), ys.min(), ys.max()
    if anchor == "centroid":
        b = tabular(rows)
        ax, ay = b.x_c, b.y_c
    else:
        vert, _, horiz = anchor.partition("-") if anchor != "centre" else ("centre", "", "centre")
        ay = {"bottom": y0, "top": y1, "centre": (y0 + y1) / 2}[vert]
        ax = {"left": x0, "right": x1, "centre": (x0 + x1) / 2}[horiz]
    dx, dy = x - ax, y - ay
    return replace(
        shape, rows=[replace(r, x=r.x + dx, y=r.y + dy) for r in rows], rings=[r.moved(dx, dy) for r in rings],
        closed_form=None, pre_steps=[], J_steps=[], dims=[],
    )


def _sample(ring: P.Ring, limit: int = 256) -> P.Ring:
    k = max(1, len(ring.x) // limit)
    return P.Ring(ring.x[::k], ring.y[::k], ring.sign, ring.n) if k > 1 else ring


def _boundary_points(ring: P.Ring, per_edge: int = 8):
    """Vertices and points along every edge (subsampled rings of arcs keep their density)."""
    r = _sample(ring, 512)
    x0, y0 = r.x, r.y
    x1, y1 = P._next(r.x), P._next(r.y)
    t = (np.arange(per_edge) / per_edge)[None, :]
    return (x0[:, None] + t * (x1 - x0)[:, None]).ravel(), (y0[:, None] + t * (y1 - y0)[:, None]).ravel()


def _inside(px, py, shape: Shape) -> np.ndarray:
    """Points inside the shape's material (points on a boundary may go either way)."""
    inside = np.zeros(len(px), bool)
    for r in shape.rings:
        if r.sign > 0:
            inside |= P.point_in_ring(px, py, r)
    for r in shape.rings:
        if r.sign < 0:
            inside &= ~P.point_in_ring(px, py, r)
    return inside


def _near(px, py, shape: Shape, tol: float) -> np.ndarray:
    """Points within tol of one of the shape's boundaries."""
    near = np.zeros(len(px), bool)
    for r in shape.rings:
        near |= P.distance_to_ring(px, py, _sample(r, 1024)) <= tol
    return near


def _in_material(px, py, shape: Shape, tol: float, strict: bool) -> np.ndarray:
    """Points inside the shape's material (strict: farther than tol from every boundary).

    Distances to the boundary are measured only when they can change the answer: strict, when some point
    is inside; otherwise, when some point is not.
    """
    inside = _inside(px, py, shape)
    if (not inside.any()) if strict else inside.all():
        return inside
    near = _near(px, py, shape, tol)
    return inside & ~near if strict else inside | near


def _inside_near(px, py, shape: Shape, tol: float) -> tuple[np.ndarray, np.ndarray]:
    """For each point: inside the shape's material, and within tol of one of its boundaries."""
    return _inside(px, py, shape), _near(px, py, shape, tol)


_BATCH = 2_000_000  # points × edges a batched inside/near test may hold at once (a few arrays of this many floats)


def _inside_near_each(px, py, shapes: list[Shape], tol: float) -> list[tuple[np.ndarray, np.ndarray]]:
    """``_inside_near`` against each of several shapes: one vectorised pass over all their rings when the
    arrays stay small (a hole and the few parts around it), else shape by shape. The same answers."""
    rings = [r for s in shapes for r in s.rings]
    if not rings or len(px) * sum(len(r.x) for r in rings) > _BATCH:
        return [_inside_near(px, py, s, tol) for s in shapes]
    in_ring = P.point_in_rings(px, py, rings)
    dist = P.distance_to_rings(px, py, [_sample(r, 1024) for r in rings])
    out, k = [], 0
    for s in shapes:
        inside = np.zeros(len(px), bool)
        for j, r in enumerate(s.rings, k):
            if r.sign > 0:
                inside |= in_ring[:, j]
        for j, r in enumerate(s.rings, k):
            if r.sign < 0:
                inside &= ~in_ring[:, j]
        near = (dist[:, k:k + len(s.rings)] <= tol).any(axis=1)
        k += len(s.rings)
        out.append((inside, near))
    return out


def _rows_centroid(shape: Shape):
    b = tabular(shape.rows)
    return np.array([b.x_c]), np.array([b.y_c])


def _overlap(a: Shape, b: Shape, tol: float) -> bool:
    for ra in a.rings:
        for rb in b.rings:
            if P.segments_cross(_sample(ra), _sample(rb), tol):
                return True
    for u, v in ((a, b), (b, a)):
        # vertices and points along every edge: two parts of one width stacked with one pushed into the
        # other share no vertex deep inside and no crossing edges, but the pushed edge runs deep inside
        pts = [_boundary_points(r) for r in u.rings]
        px, py = np.concatenate([x for x, _ in pts]), np.concatenate([y for _, y in pts])
        cx, cy = _rows_centroid(u)
        # a point of u's outline (or u's centroid when it lies in u's own material) is deep inside v
        if _in_material(px, py, v, tol, strict=True).any() or (
                _in_material(cx, cy, u, tol, strict=True).any() and _in_material(cx, cy, v, tol, strict=True).any()):
            return True
    return False


def _touch(a: Shape, b: Shape, d: float) -> bool:
    """The outlines of a and b come within d of each other: a vertex of one within d of the other's outline,
    or edges crossing. (Each outline thinned to 256 points a ring, as the overlap test does.)"""
    sa = [_sample(r) for r in a.rings if r.sign > 0]
    sb = [_sample(r) for r in b.rings if r.sign > 0]
    if not sa or not sb:
        return False
    for u, v in ((sa, sb), (sb, sa)):
        if float(P.distance_to_rings(np.concatenate([r.x for r in u]), np.concatenate([r.y for r in u]), v).min()) <= d:
            return True
    return any(P.segments_cross(ra, rb, 0.0) for ra in sa for rb in sb)


def _box(rings) -> tuple[float, float, float, float]:
    """(x_min, x_max, y_min, y_max) of the rings' vertices (of all of them: -inf..inf boxes for none)."""
    rings = list(rings)
    if not rings:
        return (math.inf, -math.inf, math.inf, -math.inf)
    return (min(float(r.x.min()) for r in rings), max(float(r.x.max()) for r in rings),
            min(float(r.y.min()) for r in rings), max(float(r.y.max()) for r in rings))


def _apart(a, b, d: float) -> bool:
    """The boxes are more than ``d`` apart along x or along y: no point of one is within d of the other.

    The pairwise tests below only look for material of one shape inside, across or within a distance of
    another, all of which need the boxes to come that close; a pair whose boxes do not is skipped with
    the same answer the full test gives, so a section of many parts costs little more than its neighbours.
    """
    return a[1] + d < b[0] or b[1] + d < a[0] or a[3] + d < b[2] or b[3] + d < a[2]


def _deep(a, b, d: float) -> bool:
    """The boxes overlap by more than ``d`` along x *and* along y: only then can the overlap test find anything.

    ``_overlap(u, v, d)`` looks for a point of one shape's material farther than d inside the other's, or for
    edges crossing each other by more than d on both sides. Where the boxes overlap by d or less along one
    axis (parts stacked edge to edge, the commonest built-up section), every point of u inside v lies within
    d of the side of v's box it is near, so a straight path of length ≤ d leaves v's material: the point is
    within d of v's boundary, not farther; and two edges that cross by more than d each side reach more than
    d past each other along both axes. The full test would answer "no overlap"; this says so without it.
    (Exactly the full test's answer for rings of up to 2,047 vertices; a longer ring the full test itself
    measures against a thinned outline, so its answer there is as approximate as the thinning.)
    """
    return min(a[1], b[1]) - max(a[0], b[0]) > d and min(a[3], b[3]) - max(a[2], b[2]) > d


def _collapse(name: str, shape: Shape, sign: int, n: float, rho) -> Row:
    """One parts-table row for a whole placed shape: its own area, centroid and centroidal moments."""
    b = tabular(shape.rows)
    if rho is None:  # the shape's own densities, as one equivalent density over its area
        m = sum(r.sign * (r.rho or 0.0) * r.A for r in shape.rows)
        a = sum(r.sign * r.A for r in shape.rows)
        rho = m / a if m else None
    return Row(name, b.A, b.x_c, b.y_c, b.I_x, b.I_y, b.I_xy, sign=sign, n=n, rho=rho)


@dataclass
class Assembly:
    shape: Shape
    n: list[float]  # per row
    E_ref: float | None
    warnings: list[tuple[str, str | None]]
    part_of_row: list[int]


def assemble(parts: list[Placed], E_ref: float | None = None) -> Assembly:
    solids = [p for p in parts if p.role == "part"]
    holes = [p for p in parts if p.role == "hole"]
    if not solids:
        raise ShapeError("a built-up section needs at least one part that is not a hole", "parts")
    if E_ref is None:
        E_ref = next((p.E for p in solids if p.E is not None), None)
    if E_ref is not None and E_ref <= 0:
        raise ShapeError("E_ref must be greater than zero", "E_ref")
    xs = np.concatenate([r.x for p in solids for r in p.shape.rings])
    ys = np.concatenate([r.y for p in solids for r in p.shape.rings])
    size = float(max(np.ptp(xs), np.ptp(ys)))
    tol = 1e-6 * size
    has_arcs = any(p.shape.has_arcs for p in parts)
    sag = size * (1 - math.cos(math.pi / 256)) if has_arcs else 0.0
    touch_tol = 1e-4 * size + sag

    def n_of(p):
        if p.E is None:
            return 1.0
        if E_ref is None:
            return 1.0
        return p.E / E_ref

    warnings: list[tuple[str, str | None]] = []
    box = [_box(p.shape.rings) for p in solids]  # a shape's material lies inside its outer rings' box
    for i in range(len(solids)):
        for j in range(i + 1, len(solids)):
            if _deep(box[i], box[j], tol + sag) and _overlap(solids[i].shape, solids[j].shape, tol + sag):
                raise ShapeError(f"parts '{solids[i].name}' and '{solids[j].name}' overlap: material would count "
                                 "twice (cut a hole in one where the other sits)", "parts")
    # connectivity (union-find over touching parts)
    parent = list(range(len(solids)))

    def root(k):
        while parent[k] != k:
            parent[k] = parent[parent[k]]
            k = parent[k]
        return k

    outer = [_box(r for r in p.shape.rings if r.sign > 0) for p in solids]  # _touch measures between these
    for i in range(len(solids)):
        for j in range(i + 1, len(solids)):
            if not _apart(outer[i], outer[j], touch_tol) and _touch(solids[i].shape, solids[j].shape, touch_tol):
                parent[root(i)] = root(j)
    groups = {}
    for k in range(len(solids)):
        groups.setdefault(root(k), []).append(solids[k].name)
    if len(groups) > 1:
        listing = "; ".join(", ".join(g) for g in groups.values())
        warnings.append((f"parts do not touch: the section is not connected ({len(groups)} pieces: {listing}); "
                         "its properties assume the pieces act together", "parts"))

    rows, rings, n_rows, owner = [], [], [], []
    for k, p in enumerate(solids):
        n = n_of(p)
        rows.append(_collapse(p.name, p.shape, 1, n, p.rho))
        rings += [P.Ring(r.x, r.y, r.sign, r.n * n) for r in p.shape.rings]
        n_rows.append(n)
        owner.append(k)
    hole_box = [_box(h.shape.rings) for h in holes]
    for h_i, h in enumerate(holes):
        solid_rings = [r for r in h.shape.rings if r.sign > 0]
        edge_points = [_boundary_points(r) for r in solid_rings]
        px = np.concatenate([e[0] for e in edge_points])
        py = np.concatenate([e[1] for e in edge_points])
        hb = hole_box[h_i]
        # the material a hole cuts: parts holding its centroid or its boundary points strictly
        # (a boundary point on the line where two parts touch belongs to neither)
        cx, cy = _rows_centroid(h.shape)
        qx, qy = np.concatenate([px, cx]), np.concatenate([py, cy])
        where = np.full(len(px), -1)
        cut = []
        nearby = [k for k in range(len(solids)) if not _apart(hb, box[k], touch_tol)]  # others: no point in or near
        for k, (inside, near) in zip(nearby, _inside_near_each(qx, qy, [solids[k].shape for k in nearby], touch_tol)):
            m = (inside | near)[:len(px)] & (where < 0)  # the boundary points in the material, or on its edge
            where[m] = k
            if (inside & ~near).any():
                cut.append(k)
        if (where < 0).any():
            bad = int(np.argmax(where < 0))
            raise ShapeError(f"hole '{h.name}' is not fully inside the material (its edge passes ({px[bad]:.4g}, "
                             f"{py[bad]:.4g}) mm, outside every part)", "parts")
        cut = cut or sorted(set(where.tolist()))
        ns = {n_of(solids[k]) for k in cut}
        if len(ns) > 1:
            raise ShapeError(f"hole '{h.name}' crosses parts of different materials: split it into one hole per part",
                             "parts")
        for o_i, other in enumerate(holes[:h_i]):
            if _deep(hb, hole_box[o_i], tol + sag) and _overlap(h.shape, other.shape, tol + sag):
                raise ShapeError(f"holes '{other.name}' and '{h.name}' overlap: material would be removed twice",
                                 "parts")
        for p in solids:
            for r in p.shape.rings:
                if r.sign < 0 and _deep(hb, _box([r]), tol + sag):
                    void = replace(p.shape, rings=[P.Ring(r.x, r.y, 1, 1.0)])
                    if _overlap(h.shape, void, tol + sag):
                        raise ShapeError(f"hole '{h.name}' overlaps the open inside of part '{p.name}'", "parts")
        k0 = cut[0]
        n = n_of(solids[k0])
        rows.append(_collapse(h.name, h.shape, -1, n, solids[k0].rho))
        rings += [P.Ring(r.x, r.y, -r.sign, r.n * n) for r in h.shape.rings]
        n_rows.append(n)
        owner.append(k0)
    J = sum(p.shape.J for p in solids)
    digest = hashlib.sha1()
    for r in rings:
        digest.update(np.round(r.x, 9).tobytes())
        digest.update(np.round(r.y, 9).tobytes())
        digest.update(repr((r.sign, r.n)).encode())
    label = (f"built-up section of {len(solids)} part{'s' * (len(solids) != 1)}"
             + (f" and {len(holes)} hole{'s' * (len(holes) != 1)}" if holes else "") + f" #{digest.hexdigest()[:10]}")
    shape = Shape(
        "built-up", label, rows, rings, J=J,
        J_method="sum of the parts' own torsion constants, J = Σ J_i (each part's method as in its own working; "
                 "closed cells formed between parts and the effect of holes are not counted)",
        has_arcs=has_arcs, warnings=warnings,
    )
    return Assembly(shape, n_rows, E_ref, warnings, owner)


def tolerance_for(shape: Shape) -> float:
    return ARC_TOLERANCE if shape.has_arcs else EXACT_TOLERANCE
