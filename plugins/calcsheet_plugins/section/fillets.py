"""Shapes with root fillets and rounded corners, as parts-table rows and as an outline with true arcs.

A fillet (or a rounded corner) is a *spandrel*: the r × r square at a right-angled corner less the quarter
disc of radius r tangent to both edges. Its closed forms (corner at the origin, square in the first quadrant):

    A = (1 − π/4)·r²,   c = r·(10 − 3π)/(12 − 3π) from each edge to its centroid,
    ∬y² dA = (1 − 5π/16)·r⁴ about the edge,   ∬x·y dA = (19/24 − π/4)·r⁴ about the corner,

so I_o = (1 − 5π/16)·r⁴ − A·c² about its own centroid. A root fillet adds a spandrel (material in a concave
corner); a rounded outside corner removes one; a rounded inside corner of a hollow section adds one back.
The outline replaces each such corner by a circular arc (``ARC_SEGMENTS`` per full turn), so the parts table
and Green's theorem over the outline are still two independent methods.
"""
from __future__ import annotations

import math

import numpy as np

from .shapes import (ARC_SEGMENTS, Dimension, Row, Shape, ShapeError, Step, _fmt, _positive, _rect_row,
                     _web_checks)
from .polygon import make_ring
from . import warping as WP

SPANDREL_A = 1 - math.pi / 4
SPANDREL_C = (10 - 3 * math.pi) / (12 - 3 * math.pi)
SPANDREL_II = 1 - 5 * math.pi / 16
SPANDREL_IXY = 19 / 24 - math.pi / 4


def spandrel_row(name: str, px: float, py: float, r: float, sx: int, sy: int, sign: int = 1) -> Row:
    """The spandrel at corner (px, py) whose square lies toward (sx, sy) (each ±1)."""
    A = SPANDREL_A * r * r
    c = SPANDREL_C * r
    Io = SPANDREL_II * r**4 - A * c * c
    Ioxy = sx * sy * (SPANDREL_IXY * r**4 - A * c * c)
    return Row(name, A, px + sx * c, py + sy * c, Io, Io, Ioxy, sign=sign)


def _round_corners(points, radii, corner, count) -> np.ndarray:
    """The outline through ``points`` with corner k replaced by an arc of radius ``radii[k]`` (0: sharp):
    ``corner(p, u1, u2, r)`` gives the arc's tangent points and centre, ``count(d)`` its segments for the
    swept angle d."""
    pts = [np.asarray(p, float) for p in points]
    n = len(pts)
    out = []
    for k in range(n):
        p, r = pts[k], radii[k]
        if r <= 0:
            out.append(p)
            continue
        u1 = p - pts[k - 1]
        u1 /= np.hypot(*u1)
        u2 = pts[(k + 1) % n] - p
        u2 /= np.hypot(*u2)
        t1, t2, c = corner(p, u1, u2, r)
        a1 = math.atan2(*(t1 - c)[::-1])
        a2 = math.atan2(*(t2 - c)[::-1])
        d = (a2 - a1 + math.pi) % (2 * math.pi) - math.pi
        t = np.linspace(a1, a1 + d, count(d) + 1)
        out.extend(np.column_stack([c[0] + r * np.cos(t), c[1] + r * np.sin(t)]))
    return np.array(out)


def _right_corner(p, u1, u2, r):
    """Right angle: the centre is r along the outgoing direction from the first tangent point."""
    t1 = p - r * u1
    return t1, p + r * u2, t1 + r * u2


def rounded(points, radii, segments: int = ARC_SEGMENTS) -> np.ndarray:
    """The outline through ``points`` (right-angled corners) with corner k replaced by an arc of radius
    ``radii[k]`` (0: sharp), tangent to both edges."""
    per_quarter = max(4, segments // 4)
    return _round_corners(points, radii, _right_corner, lambda d: per_quarter)


def _ring(points, radii, sign=1):
    return make_ring(rounded(points, radii), sign)


def dj_alpha_D(t_f: float, t_w: float, r: float) -> tuple[float, float]:
    """El Darwish & Johnston's junction terms for a rolled I with root radius r (ASCE J. Struct. Div. 1965)."""
    alpha = -0.042 + 0.2204 * t_w / t_f + 0.1355 * r / t_f - 0.0865 * r * t_w / t_f**2 - 0.0725 * t_w**2 / t_f**2
    D = ((t_f + r) ** 2 + (r + t_w / 4) * t_w) / (2 * r + t_f)
    return alpha, D


DJ_METHOD = ("rolled I-section with root fillets, El Darwish & Johnston (1965): J = 2/3·b·t_f³ + 1/3·(h − 2t_f)·t_w³ "
             "+ 2α·D⁴ − 0.420·t_f⁴, α = −0.042 + 0.2204·t_w/t_f + 0.1355·r/t_f − 0.0865·r·t_w/t_f² − "
             "0.0725·t_w²/t_f², D = ((t_f + r)² + (r + t_w/4)·t_w)/(2r + t_f)")
DJ_STEPS = [
    Step("alpha_J", "-0.042 + 0.2204*t_w/t_f + 0.1355*r/t_f - 0.0865*r*t_w/t_f^2 - 0.0725*t_w^2/t_f^2", "",
         "fillet coefficient α (El Darwish & Johnston)"),
    Step("D_J", "((t_f + r)^2 + (r + t_w/4)*t_w)/(2*r + t_f)", "mm", "diameter of the circle inscribed at the junction"),
    Step("J", "2/3*b*t_f^3 + (h - 2*t_f)*t_w^3/3 + 2*alpha_J*D_J^4 - 0.420*t_f^4", "mm^4",
         "torsion constant, rolled I with fillets"),
]


def _dj(h, b, t_f, t_w, r):
    alpha, D = dj_alpha_D(t_f, t_w, r)
    return 2 / 3 * b * t_f**3 + (h - 2 * t_f) * t_w**3 / 3 + 2 * alpha * D**4 - 0.420 * t_f**4


DJ_UNEQUAL_METHOD = ("rolled I with unequal flanges and root fillets: each flange b·t³/3 − 0.21·t⁴, the web "
                     "(h − t_f − t_fb)·t_w³/3, and one El Darwish & Johnston (1965) junction term α·D⁴ per flange "
                     "(with equal flanges this is their I-section formula)")
DJ_UNEQUAL_STEPS = [
    Step("alpha_t", "-0.042 + 0.2204*t_w/t_f + 0.1355*r/t_f - 0.0865*r*t_w/t_f^2 - 0.0725*t_w^2/t_f^2", "",
         "fillet coefficient α, top junction (El Darwish & Johnston)"),
    Step("D_t", "((t_f + r)^2 + (r + t_w/4)*t_w)/(2*r + t_f)", "mm", "inscribed circle, top junction"),
    Step("alpha_b", "-0.042 + 0.2204*t_w/t_fb + 0.1355*r/t_fb - 0.0865*r*t_w/t_fb^2 - 0.0725*t_w^2/t_fb^2", "",
         "fillet coefficient α, bottom junction"),
    Step("D_b", "((t_fb + r)^2 + (r + t_w/4)*t_w)/(2*r + t_fb)", "mm", "inscribed circle, bottom junction"),
    Step("J", "b*t_f^3/3 - 0.21*t_f^4 + b_bot*t_fb^3/3 - 0.21*t_fb^4 + (h - t_f - t_fb)*t_w^3/3 + alpha_t*D_t^4 "
              "+ alpha_b*D_b^4", "mm^4", "torsion constant, rolled I with unequal flanges and fillets"),
]


def ishape(h: float, b: float, t_f: float, t_w: float, r: float, b_bot: float | None = None,
           t_fb: float | None = None) -> Shape:
    """Rolled I (parallel flanges) with four root fillets of radius r; equal flanges, or a bottom flange b_bot ×
    t_fb of its own (monosymmetric)."""
    _positive(h=h, b=b, t_f=t_f, t_w=t_w, r=r, b_bot=b_bot, t_fb=t_fb)
    unequal = b_bot is not None or t_fb is not None
    bb = b_bot if b_bot is not None else b
    tb = t_fb if t_fb is not None else t_f
    if t_f + tb >= h:
        raise ShapeError(f"flanges ({_fmt(t_f)} + {_fmt(tb)} mm) leave no web in the depth h = {_fmt(h)} mm", "t_f")
    warnings = _web_checks(t_w, min(b, bb), min(t_f, tb))
    if t_w + 2 * r > min(b, bb) or t_f + tb + 2 * r > h:
        raise ShapeError(f"root radius r = {_fmt(r)} mm does not fit between the flanges and the web", "r")
    W = max(b, bb)
    xc = W / 2
    hw = h - t_f - tb
    xl, xr = xc - t_w / 2, xc + t_w / 2
    rows = [_rect_row("top flange", xc - b / 2, h - t_f, b, t_f), _rect_row("web", xl, tb, t_w, hw),
            _rect_row("bottom flange", xc - bb / 2, 0, bb, tb),
            spandrel_row("fillet, top right", xr, h - t_f, r, 1, -1),
            spandrel_row("fillet, top left", xl, h - t_f, r, -1, -1),
            spandrel_row("fillet, bottom right", xr, tb, r, 1, 1),
            spandrel_row("fillet, bottom left", xl, tb, r, -1, 1)]
    pts = [(xc - bb / 2, 0), (xc + bb / 2, 0), (xc + bb / 2, tb), (xr, tb), (xr, h - t_f), (xc + b / 2, h - t_f),
           (xc + b / 2, h), (xc - b / 2, h), (xc - b / 2, h - t_f), (xl, h - t_f), (xl, tb), (xc - bb / 2, tb)]
    radii = [0, 0, 0, r, r, 0, 0, 0, 0, r, r, 0]
    dims = [Dimension(xc - b / 2, h, xc + b / 2, h, _fmt(b), 1), Dimension(xc - W / 2, h, xc - W / 2, 0, _fmt(h), -1),
            Dimension(xc + b / 2, h - t_f, xc + b / 2, h, _fmt(t_f), -1)]
    label = f"rolled I h={_fmt(h)} b={_fmt(b)} t_f={_fmt(t_f)} t_w={_fmt(t_w)} r={_fmt(r)}"
    if not unequal:
        alpha, D = dj_alpha_D(t_f, t_w, r)
        J = 2 / 3 * b * t_f**3 + hw * t_w**3 / 3 + 2 * alpha * D**4 - 0.420 * t_f**4
        return Shape(
            "ishape", label + " mm", rows, [_ring(pts, radii)], J=J, J_method=DJ_METHOD, J_steps=list(DJ_STEPS),
            dims=dims, has_arcs=True, warnings=warnings, warping=WP.doubly_symmetric_I(), symmetry="double",
        )
    (at, Dt), (ab, Db) = dj_alpha_D(t_f, t_w, r), dj_alpha_D(tb, t_w, r)
    J = b * t_f**3 / 3 - 0.21 * t_f**4 + bb * tb**3 / 3 - 0.21 * tb**4 + hw * t_w**3 / 3 + at * Dt**4 + ab * Db**4
    pre = []
    if b_bot is None:
        pre.append(Step("b_bot", "b", "mm", "bottom flange width (as the top)"))
    if t_fb is None:
        pre.append(Step("t_fb", "t_f", "mm", "bottom flange thickness (as the top)"))
    return Shape(
        "ishape", label + f" b_bot={_fmt(bb)} t_fb={_fmt(tb)} mm", rows, [_ring(pts, radii)], J=J,
        J_method=DJ_UNEQUAL_METHOD, J_steps=list(DJ_UNEQUAL_STEPS), pre_steps=pre,
        dims=dims + [Dimension(xc - bb / 2, 0, xc + bb / 2, 0, _fmt(bb), -1)], has_arcs=True, warnings=warnings,
        warping=WP.unequal_I(), symmetry="vertical",
    )


def channel(h: float, b: float, t_f: float, t_w: float, r: float) -> Shape:
    """Parallel-flange channel, web on the left, with two root fillets."""
    _positive(h=h, b=b, t_f=t_f, t_w=t_w, r=r)
    if 2 * t_f >= h:
        raise ShapeError(f"flanges (2 × {_fmt(t_f)} mm) leave no web in the depth h = {_fmt(h)} mm", "t_f")
    warnings = _web_checks(t_w, b, t_f)
    if t_w + r > b or 2 * t_f + 2 * r > h:
        raise ShapeError(f"root radius r = {_fmt(r)} mm does not fit between the flanges and the web", "r")
    rows = [_rect_row("top flange", t_w, h - t_f, b - t_w, t_f), _rect_row("web", 0, 0, t_w, h),
            _rect_row("bottom flange", t_w, 0, b - t_w, t_f),
            spandrel_row("fillet, top", t_w, h - t_f, r, 1, -1), spandrel_row("fillet, bottom", t_w, t_f, r, 1, 1)]
    pts = [(0, 0), (b, 0), (b, t_f), (t_w, t_f), (t_w, h - t_f), (b, h - t_f), (b, h), (0, h)]
    radii = [0, 0, 0, r, r, 0, 0, 0]
    J = (2 * b * t_f**3 + (h - 2 * t_f) * t_w**3) / 3
    return Shape(
        "channel", f"channel h={_fmt(h)} b={_fmt(b)} t_f={_fmt(t_f)} t_w={_fmt(t_w)} r={_fmt(r)} mm", rows,
        [_ring(pts, radii)], J=J,
        J_method="Saint-Venant's thin-walled open-section sum J = Σ b·t³/3 (fillets ignored in J)",
        J_steps=[Step("J", "(2*b*t_f^3 + (h - 2*t_f)*t_w^3)/3", "mm^4", "torsion constant (thin-walled open)")],
        dims=[Dimension(0, 0, b, 0, _fmt(b), -1), Dimension(0, h, 0, 0, _fmt(h), -1),
              Dimension(b, h - t_f, b, h, _fmt(t_f), -1)],
        has_arcs=True, warnings=warnings, warping=WP.channel(), symmetry="horizontal",
    )


def tee(h: float, b: float, t_f: float, t_w: float, r: float) -> Shape:
    """Tee, flange on top, with two root fillets (a split rolled I)."""
    _positive(h=h, b=b, t_f=t_f, t_w=t_w, r=r)
    if t_f >= h:
        raise ShapeError(f"flange t_f = {_fmt(t_f)} mm leaves no stem in the depth h = {_fmt(h)} mm", "t_f")
    warnings = _web_checks(t_w, b, t_f)
    hs = h - t_f
    if t_w + 2 * r > b or r >= hs:
        raise ShapeError(f"root radius r = {_fmt(r)} mm does not fit between the flange and the stem", "r")
    x1, x2 = (b - t_w) / 2, (b + t_w) / 2
    rows = [_rect_row("flange", 0, hs, b, t_f), _rect_row("stem", x1, 0, t_w, hs),
            spandrel_row("fillet, right", x2, hs, r, 1, -1), spandrel_row("fillet, left", x1, hs, r, -1, -1)]
    pts = [(x1, 0), (x2, 0), (x2, hs), (b, hs), (b, h), (0, h), (0, hs), (x1, hs)]
    radii = [0, 0, r, 0, 0, 0, 0, r]
    alpha, D = dj_alpha_D(t_f, t_w, r)
    J = b * t_f**3 / 3 - 0.21 * t_f**4 + hs * t_w**3 / 3 - 0.105 * t_w**4 + alpha * D**4
    return Shape(
        "tee", f"tee h={_fmt(h)} b={_fmt(b)} t_f={_fmt(t_f)} t_w={_fmt(t_w)} r={_fmt(r)} mm", rows,
        [_ring(pts, radii)], J=J,
        J_method="one flange-stem junction of a rolled I: J = b·t_f³/3 − 0.21·t_f⁴ + (h − t_f)·t_w³/3 − 0.105·t_w⁴ "
                 "+ α·D⁴, with α and D of El Darwish & Johnston (1965) (the I-section's junction term, once)",
        J_steps=[DJ_STEPS[0], DJ_STEPS[1],
                 Step("J", "b*t_f^3/3 - 0.21*t_f^4 + (h - t_f)*t_w^3/3 - 0.105*t_w^4 + alpha_J*D_J^4", "mm^4",
                      "torsion constant, tee with fillets")],
        dims=[Dimension(0, h, b, h, _fmt(b), 1), Dimension(0, h, 0, 0, _fmt(h), -1),
              Dimension(b, hs, b, h, _fmt(t_f), -1)],
        has_arcs=True, warnings=warnings, warping=WP.tee(), symmetry="vertical",
    )


def angle(h: float, b: float, t: float, r: float) -> Shape:
    """Angle, heel at the bottom-left, with a root fillet (toe radii not modelled)."""
    _positive(h=h, b=b, t=t, r=r)
    if t >= min(h, b):
        raise ShapeError(f"leg thickness t = {_fmt(t)} mm is not less than the shorter leg {_fmt(min(h, b))} mm", "t")
    if t + r > min(h, b):
        raise ShapeError(f"root radius r = {_fmt(r)} mm does not fit on the legs", "r")
    rows = [_rect_row("vertical leg", 0, 0, t, h), _rect_row("horizontal leg", t, 0, b - t, t),
            spandrel_row("root fillet", t, t, r, 1, 1)]
    pts = [(0, 0), (b, 0), (b, t), (t, t), (t, h), (0, h)]
    radii = [0, 0, 0, r, 0, 0]
    return Shape(
        "angle", f"angle h={_fmt(h)} b={_fmt(b)} t={_fmt(t)} r={_fmt(r)} mm", rows, [_ring(pts, radii)],
        J=(h + b - t) * t**3 / 3,
        J_method="Saint-Venant's thin-walled open-section sum over the legs, J = (h + b − t)·t³/3 (fillet ignored)",
        J_steps=[Step("J", "(h + b - t)*t^3/3", "mm^4", "torsion constant (thin-walled open)")],
        dims=[Dimension(0, 0, b, 0, _fmt(b), -1), Dimension(0, h, 0, 0, _fmt(h), -1),
              Dimension(t, h, 0, h, _fmt(t), -1)],
        has_arcs=True, warping=WP.angle(),
    )


def box(b: float, h: float, t: float, r_o: float, r_i: float) -> Shape:
    """Hollow rectangle with uniform wall t, outside corner radius r_o and inside corner radius r_i."""
    _positive(b=b, h=h, t=t)
    if t >= min(b, h) / 2:
        raise ShapeError(f"wall t = {_fmt(t)} mm is not less than half the smaller outside size", "t")
    if r_o < 0 or r_i < 0 or r_o > min(b, h) / 2 or r_i > min(b, h) / 2 - t:
        raise ShapeError("corner radii do not fit the section", "t")
    bi, hi = b - 2 * t, h - 2 * t
    rows = [_rect_row("outside", 0, 0, b, h)]
    for name, (px, py, sx, sy) in (("bottom left", (0, 0, 1, 1)), ("bottom right", (b, 0, -1, 1)),
                                   ("top right", (b, h, -1, -1)), ("top left", (0, h, 1, -1))):
        if r_o > 0:
            rows.append(spandrel_row(f"outside corner, {name}", px, py, r_o, sx, sy, sign=-1))
    rows.append(Row("void", bi * hi, b / 2, h / 2, bi * hi**3 / 12, hi * bi**3 / 12, sign=-1))
    for name, (px, py, sx, sy) in (("bottom left", (t, t, 1, 1)), ("bottom right", (b - t, t, -1, 1)),
                                   ("top right", (b - t, h - t, -1, -1)), ("top left", (t, h - t, 1, -1))):
        if r_i > 0:
            rows.append(spandrel_row(f"inside corner, {name}", px, py, r_i, sx, sy, sign=1))
    outer = _ring([(0, 0), (b, 0), (b, h), (0, h)], [r_o] * 4)
    inner = _ring([(t, t), (b - t, t), (b - t, h - t), (t, h - t)], [r_i] * 4, sign=-1)
    # Bredt on the wall's mid-line, corners rounded at the mean radius (EN 10210-2 Annex B form)
    R_c = (r_o + r_i) / 2
    p = 2 * ((b - t) + (h - t)) - 2 * R_c * (4 - math.pi)
    A_h = (b - t) * (h - t) - R_c**2 * (4 - math.pi)
    J = 4 * A_h**2 * t / p + p * t**3 / 3
    return Shape(
        "box", f"hollow section {_fmt(b)}×{_fmt(h)}×{_fmt(t)} mm, corner radii {_fmt(r_o)}/{_fmt(r_i)} mm", rows,
        [outer, inner], J=J,
        J_method="Bredt–Batho for a thin-walled closed cell on the wall mid-line, J = 4·A_m²·t/p + p·t³/3, with the "
                 "mid-line perimeter p and enclosed area A_m of corners rounded at the mean radius R_c "
                 "(the form EN 10210-2 Annex B uses); shear flow q = T/(2·A_m)",
        J_steps=[Step("R_c", "(r_out + r_in)/2", "mm", "mid-line corner radius"),
                 Step("p_m", "2*((b - t) + (h - t)) - 2*R_c*(4 - pi)", "mm", "mid-line perimeter"),
                 Step("A_m", "(b - t)*(h - t) - R_c^2*(4 - pi)", "mm^2", "area enclosed by the mid-line"),
                 Step("J", "4*A_m^2*t/p_m + p_m*t^3/3", "mm^4", "torsion constant (Bredt–Batho, closed cell)")],
        dims=[Dimension(0, 0, b, 0, _fmt(b), -1), Dimension(0, h, 0, 0, _fmt(h), -1),
              Dimension(b, h - t, b, h, _fmt(t), -1)],
        has_arcs=True, symmetry="double", closed=True,
    )


# ---------------------------------------------------------------- corners of any angle (tapered flanges)

def _corner(p, u1, u2, r):
    """Tangent points and centre of the circle of radius r tangent to both edges at vertex p (edge directions
    u1 in, u2 out)."""
    cos_t = float(np.clip(np.dot(-u1, u2), -1.0, 1.0))
    theta = math.acos(cos_t)  # the corner's angle between its two edges
    L = r / math.tan(theta / 2)
    bis = -u1 + u2
    bis /= np.hypot(*bis)
    c = p + bis * r / math.sin(theta / 2)
    return p - L * u1, p + L * u2, c, theta


def rounded_any(points, radii, segments: int = ARC_SEGMENTS) -> np.ndarray:
    """As ``rounded``, for corners of any angle."""
    return _round_corners(points, radii, lambda p, u1, u2, r: _corner(p, u1, u2, r)[:3],
                          lambda d: max(4, int(round(segments * abs(d) / (2 * math.pi)))))


def triangle_row(name, p0, p1, p2, sign=1) -> Row:
    """A triangle's area, centroid and centroidal moments, I = (A/12)·Σ(y_i − ȳ)² etc. (any vertex order)."""
    xs = np.array([p0[0], p1[0], p2[0]], float)
    ys = np.array([p0[1], p1[1], p2[1]], float)
    A = abs((xs[1] - xs[0]) * (ys[2] - ys[0]) - (xs[2] - xs[0]) * (ys[1] - ys[0])) / 2
    xc, yc = xs.mean(), ys.mean()
    dx, dy = xs - xc, ys - yc
    return Row(name, A, float(xc), float(yc), float(A / 12 * (dy @ dy)), float(A / 12 * (dx @ dx)),
               float(A / 12 * (dx @ dy)), sign=sign)


def sector_row(name, c, r, a_mid, alpha, sign=1) -> Row:
    """Circular sector of radius r and angle alpha about centre c, its bisector at angle a_mid.

    About the centre, with u along the bisector: ∬v² = r⁴/8·(α − sin α), ∬u² = r⁴/8·(α + sin α); the centroid
    lies 4r·sin(α/2)/(3α) along the bisector."""
    A = r * r * alpha / 2
    Iuu = r**4 / 8 * (alpha - math.sin(alpha))  # ∬v²
    Ivv = r**4 / 8 * (alpha + math.sin(alpha))  # ∬u²
    cs, sn = math.cos(a_mid), math.sin(a_mid)
    Ixx = Iuu * cs * cs + Ivv * sn * sn  # ∬y² about the centre
    Iyy = Iuu * sn * sn + Ivv * cs * cs
    Ixy = (Ivv - Iuu) * sn * cs
    d = 4 * r * math.sin(alpha / 2) / (3 * alpha)
    gx, gy = d * cs, d * sn
    return Row(name, A, float(c[0] + gx), float(c[1] + gy), Ixx - A * gy * gy, Iyy - A * gx * gx, Ixy - A * gx * gy,
               sign=sign)


def corner_rows(name, p, prev, nxt, r, sign=1) -> list[Row]:
    """The region between a corner of any angle and its tangent circle: kite (two triangles) less a sector."""
    p, prev, nxt = (np.asarray(v, float) for v in (p, prev, nxt))
    u1 = (p - prev) / np.hypot(*(p - prev))
    u2 = (nxt - p) / np.hypot(*(nxt - p))
    t1, t2, c, theta = _corner(p, u1, u2, r)
    a1 = math.atan2(*(t1 - c)[::-1])
    a2 = math.atan2(*(t2 - c)[::-1])
    d = (a2 - a1 + math.pi) % (2 * math.pi) - math.pi
    return [triangle_row(f"{name} (triangle)", p, t1, c, sign), triangle_row(f"{name} (triangle)", p, c, t2, sign),
            sector_row(f"{name} (sector)", c, r, a1 + d / 2, abs(d), -sign)]


def _taper(t_f, o, slope, u):
    """(toe, root) thickness of a flange of outstand o whose inner face slopes at ``slope``, t_f measured at u
    from the toe."""
    return t_f - slope * u, t_f + slope * (o - u)


def root_radius_from_k(k: float, t_root: float, slope: float) -> float:
    """The root radius r whose fillet, tangent to the web and to a flange face sloping at ``slope``, meets the web
    at k from the outer face of the flange, the flange being t_root thick at the web face.

    The fillet's tangent length along the web is L = r·tan((π/2 − atan s)/2) (half the supplement of the corner's
    angle π/2 + atan s), so r = (k − t_root)/tan(π/4 − atan(s)/2)."""
    return max(k - t_root, 0.0) / math.tan(math.pi / 4 - math.atan(slope) / 2)


def _toe_rows(name, pts, k, r, sign=-1):
    n = len(pts)
    return corner_rows(name, pts[k], pts[k - 1], pts[(k + 1) % n], r, sign)


def tapered_ishape(h: float, b: float, t_f: float, t_w: float, r: float, slope: float, r_toe: float = 0.0,
                   u: float | None = None) -> Shape:
    """Rolled I with tapered flanges: inner faces at ``slope``, t_f measured at u from the toe (default the middle
    of the outstand), root fillets r and toe radii r_toe (0: sharp toes)."""
    _positive(h=h, b=b, t_f=t_f, t_w=t_w)
    o = (b - t_w) / 2
    u = o / 2 if u is None else u
    t_toe, t_root = _taper(t_f, o, slope, u)
    if t_toe <= 0 or 2 * t_root >= h or not 0 <= u <= o:
        raise ShapeError("the tapered flanges do not fit these dimensions", "t_f")
    if r_toe < 0 or r_toe >= t_toe:
        raise ShapeError(f"toe radius {_fmt(r_toe)} mm does not fit the flange toe ({_fmt(t_toe)} mm)", "r_toe")
    xl, xr = (b - t_w) / 2, (b + t_w) / 2
    pts = [(0, 0), (b, 0), (b, t_toe), (xr, t_root), (xr, h - t_root), (b, h - t_toe), (b, h), (0, h), (0, h - t_toe),
           (xl, h - t_root), (xl, t_root), (0, t_toe)]
    radii = [0, 0, r_toe, r, r, r_toe, 0, 0, r_toe, r, r, r_toe]
    rows = [_rect_row("bottom flange, toe thickness", 0, 0, b, t_toe), _rect_row("top flange, toe thickness", 0, h - t_toe, b, t_toe),
            _rect_row("web", xl, t_toe, t_w, h - 2 * t_toe)]
    for side, (x0, x1) in (("right", (xr, b)), ("left", (xl, 0))):
        rows.append(triangle_row(f"bottom taper, {side}", (x0, t_toe), (x1, t_toe), (x0, t_root)))
        rows.append(triangle_row(f"top taper, {side}", (x0, h - t_toe), (x1, h - t_toe), (x0, h - t_root)))
    if r > 0:
        for k in (3, 4, 9, 10):
            rows += _toe_rows(f"root fillet {k}", pts, k, r, 1)
    if r_toe > 0:
        for k in (2, 5, 8, 11):
            rows += _toe_rows(f"toe radius {k}", pts, k, r_toe)
    return Shape(
        "ishape", f"rolled I, tapered flanges h={_fmt(h)} b={_fmt(b)} t_f={_fmt(t_f)} t_w={_fmt(t_w)} r={_fmt(r)}"
                  + (f" r_toe={_fmt(r_toe)}" if r_toe else "") + " mm",
        rows, [make_ring(rounded_any(pts, radii))], J=_dj(h, b, t_f, t_w, r),
        J_method=DJ_METHOD + ", with the flanges at their mean thickness t_f", J_steps=list(DJ_STEPS),
        dims=[Dimension(0, h, b, h, _fmt(b), 1), Dimension(0, h, 0, 0, _fmt(h), -1)],
        has_arcs=True, warping=WP.doubly_symmetric_I(), symmetry="double",
    )


def tapered_channel_rows(h: float, b: float, t_f: float, t_w: float, r: float, slope: float, r_toe: float = 0.0,
                         u: float | None = None):
    """The parts table of ``tapered_channel`` (no outline, no warping): (rows, outline corners and radii, lumped
    corners, u)."""
    _positive(h=h, b=b, t_f=t_f, t_w=t_w)
    o = b - t_w
    u = o / 2 if u is None else u
    t_toe, t_root = _taper(t_f, o, slope, u)
    if t_toe <= 0 or 2 * t_root >= h or not 0 <= u <= b:
        raise ShapeError("the tapered flanges do not fit these dimensions", "t_f")
    if r_toe < 0 or r_toe >= t_toe:
        raise ShapeError(f"toe radius {_fmt(r_toe)} mm does not fit the flange toe ({_fmt(t_toe)} mm)", "r_toe")
    pts = [(0, 0), (b, 0), (b, t_toe), (t_w, t_root), (t_w, h - t_root), (b, h - t_toe), (b, h), (0, h)]
    radii = [0, 0, r_toe, r, r, r_toe, 0, 0]
    rows = [_rect_row("web", 0, 0, t_w, h), _rect_row("bottom flange, toe thickness", t_w, 0, o, t_toe),
            _rect_row("top flange, toe thickness", t_w, h - t_toe, o, t_toe),
            triangle_row("bottom taper", (t_w, t_toe), (b, t_toe), (t_w, t_root)),
            triangle_row("top taper", (t_w, h - t_toe), (b, h - t_toe), (t_w, h - t_root))]
    corners = []
    if r > 0:
        for k, where in ((3, "bottom"), (4, "top")):
            rows += _toe_rows(f"root fillet, {where}", pts, k, r, 1)
            corners.append(_lumped(f"root fillet, {where}", rows[-3:]))
    if r_toe > 0:
        for k, where in ((2, "bottom"), (5, "top")):
            rows += _toe_rows(f"toe radius, {where}", pts, k, r_toe)
            corners.append(_lumped(f"toe radius, {where}", rows[-3:]))
    return rows, (pts, radii), corners, u


def tapered_channel(h: float, b: float, t_f: float, t_w: float, r: float, slope: float, r_toe: float = 0.0,
                    u: float | None = None) -> Shape:
    """Channel with tapered flanges, web on the left: inner faces at ``slope``, t_f measured at u from the toe
    (default the middle of the outstand b − t_w), root fillets r and toe radii r_toe (0: sharp toes)."""
    rows, (pts, radii), corners, u = tapered_channel_rows(h, b, t_f, t_w, r, slope, r_toe, u)
    walls, lumps = WP.tapered_channel_walls(h, b, t_f, t_w, slope, u, corners)
    res = WP.sectorial(walls, lumps)
    return Shape(
        "channel", f"channel, tapered flanges h={_fmt(h)} b={_fmt(b)} t_f={_fmt(t_f)} t_w={_fmt(t_w)} r={_fmt(r)}"
                   + (f" r_toe={_fmt(r_toe)}" if r_toe else "") + " mm",
        rows, [make_ring(rounded_any(pts, radii))], J=(2 * b * t_f**3 + (h - 2 * t_f) * t_w**3) / 3,
        J_method=THIN_OPEN_TAPER, J_steps=[Step("J", "(2*b*t_f^3 + (h - 2*t_f)*t_w^3)/3", "mm^4",
                                                "torsion constant (thin-walled, mean flange thickness)")],
        dims=[Dimension(0, 0, b, 0, _fmt(b), -1), Dimension(0, h, 0, 0, _fmt(h), -1)],
        has_arcs=True, symmetry="horizontal",
        warping=[Step("h_o", "h - t_f", "mm", "distance between the flange centroids h' (mean thickness)")]
        + WP.sectorial_steps(res, WP.SECTORIAL_METHOD), sectorial=(walls, lumps, res),
    )


def _lumped(name, rows):
    """(name, signed area, centroid) of a corner's rows (two triangles less a sector), for the centre-line model."""
    A = sum(r.sign * r.A for r in rows)
    return (name, A, sum(r.sign * r.A * r.x for r in rows) / A, sum(r.sign * r.A * r.y for r in rows) / A)


THIN_OPEN_TAPER = ("Saint-Venant's thin-walled open-section sum J = Σ b·t³/3 with the flanges at their mean "
                   "thickness (taper and fillets ignored in J)")


def tapered_tee(h: float, b: float, t_f: float, t_w: float, r: float, slope: float, u: float | None = None,
                r_toe: float = 0.0) -> Shape:
    """Tee cut from a tapered-flange I (flange on top): inner flange faces at ``slope``, t_f measured at u from the
    toe (default the middle of the outstand), two root fillets r and toe radii r_toe (0: sharp toes)."""
    _positive(h=h, b=b, t_f=t_f, t_w=t_w)
    o = (b - t_w) / 2
    u = o / 2 if u is None else u
    t_toe, t_root = _taper(t_f, o, slope, u)
    if t_toe <= 0 or t_root >= h or not 0 <= u <= o:
        raise ShapeError("the tapered flange does not fit these dimensions", "t_f")
    if r_toe < 0 or r_toe >= t_toe:
        raise ShapeError(f"toe radius {_fmt(r_toe)} mm does not fit the flange toe ({_fmt(t_toe)} mm)", "r_toe")
    xl, xr = (b - t_w) / 2, (b + t_w) / 2
    pts = [(xl, 0), (xr, 0), (xr, h - t_root), (b, h - t_toe), (b, h), (0, h), (0, h - t_toe), (xl, h - t_root)]
    radii = [0, 0, r, r_toe, 0, 0, r_toe, r]
    rows = [_rect_row("stem", xl, 0, t_w, h - t_toe), _rect_row("flange, toe thickness", 0, h - t_toe, b, t_toe),
            triangle_row("taper, right", (xr, h - t_toe), (b, h - t_toe), (xr, h - t_root)),
            triangle_row("taper, left", (xl, h - t_toe), (0, h - t_toe), (xl, h - t_root))]
    if r > 0:
        for k in (2, 7):
            rows += _toe_rows(f"root fillet {k}", pts, k, r, 1)
    if r_toe > 0:
        for k in (3, 6):
            rows += _toe_rows(f"toe radius {k}", pts, k, r_toe)
    hs = h - t_f
    alpha, D = dj_alpha_D(t_f, t_w, r)
    J = b * t_f**3 / 3 - 0.21 * t_f**4 + hs * t_w**3 / 3 - 0.105 * t_w**4 + alpha * D**4
    return Shape(
        "tee", f"tee, tapered flange h={_fmt(h)} b={_fmt(b)} t_f={_fmt(t_f)} t_w={_fmt(t_w)} r={_fmt(r)}"
               + (f" r_toe={_fmt(r_toe)}" if r_toe else "") + " mm", rows,
        [make_ring(rounded_any(pts, radii))], J=J,
        J_method="one flange-stem junction of a rolled I (El Darwish & Johnston 1965), the flange at its mean "
                 "thickness t_f",
        J_steps=[DJ_STEPS[0], DJ_STEPS[1],
                 Step("J", "b*t_f^3/3 - 0.21*t_f^4 + (h - t_f)*t_w^3/3 - 0.105*t_w^4 + alpha_J*D_J^4", "mm^4",
                      "torsion constant, tee with fillets")],
        dims=[Dimension(0, h, b, h, _fmt(b), 1), Dimension(0, h, 0, 0, _fmt(h), -1)],
        has_arcs=True, warping=WP.tee(), symmetry="vertical",
    )


def double_angle(h: float, b: float, t: float, r: float, gap: float) -> Shape:
    """Two angles back to back, vertical legs h toward each other a ``gap`` apart, horizontal legs b outward at the
    bottom, each with its root fillet r (toe radii not modelled)."""
    _positive(h=h, b=b, t=t, r=r)
    if gap < 0 or not math.isfinite(gap):
        raise ShapeError(f"the gap between the angles must be zero or more (got {_fmt(gap)} mm)", "gap")
    if t >= min(h, b):
        raise ShapeError(f"leg thickness t = {_fmt(t)} mm is not less than the shorter leg {_fmt(min(h, b))} mm", "t")
    if t + r > min(h, b):
        raise ShapeError(f"root radius r = {_fmt(r)} mm does not fit on the legs", "r")
    x0 = b + gap  # heel of the right angle; the left angle's heel is at x = b
    rows = [_rect_row("right angle, vertical leg", x0, 0, t, h), _rect_row("right angle, horizontal leg", x0 + t, 0, b - t, t),
            spandrel_row("right angle, root fillet", x0 + t, t, r, 1, 1),
            _rect_row("left angle, vertical leg", b - t, 0, t, h), _rect_row("left angle, horizontal leg", 0, 0, b - t, t),
            spandrel_row("left angle, root fillet", b - t, t, r, -1, 1)]
    right = [(x0, 0), (x0 + b, 0), (x0 + b, t), (x0 + t, t), (x0 + t, h), (x0, h)]
    left = [(0, 0), (b, 0), (b, h), (b - t, h), (b - t, t), (0, t)]
    rings = [_ring(right, [0, 0, 0, r, 0, 0]), _ring(left, [0, 0, 0, 0, r, 0])]
    return Shape(
        "double angle", f"two angles {_fmt(h)}×{_fmt(b)}×{_fmt(t)} mm back to back, gap {_fmt(gap)} mm, r={_fmt(r)} mm",
        rows, rings, J=2 * (h + b - t) * t**3 / 3,
        J_method="Saint-Venant's thin-walled open-section sum over the four legs, J = 2·(h + b − t)·t³/3 "
                 "(fillets ignored)",
        J_steps=[Step("J", "2*(h + b - t)*t^3/3", "mm^4", "torsion constant (thin-walled open)")],
        dims=[Dimension(0, 0, 2 * b + gap, 0, _fmt(2 * b + gap), -1), Dimension(0, h, 0, 0, _fmt(h), -1)],
        has_arcs=True, symmetry="vertical",
        warping=[Step("x_s", "b + gap/2", "mm", "shear centre, x (on the axis of symmetry)"),
                 Step("y_s", "t/2", "mm", "shear centre, y: where the horizontal legs' mid-line meets the axis "
                                        "of symmetry (as for a tee)")],
    )
