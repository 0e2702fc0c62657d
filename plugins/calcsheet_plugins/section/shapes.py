"""Shape geometry: each shape as parts-table rows and as an exact outline.

A ``Shape`` holds the same section twice, on purpose:

* ``rows`` — the decomposition a reviewer checks by hand (rectangles,
  triangles, circles, a semicircle; holes as negative rows), each with its
  own area, centroid and centroidal second moments from closed forms;
* ``rings`` — the outline polygon(s) that Green's theorem integrates, arcs
  discretised finely.

The two are built independently from the dimensions, so agreement between
them is a real check. Coordinates are millimetres, x to the right, y up, the
origin at the bottom-left corner of the shape's bounding box (so an axis at
y = 0 is the base). Bad dimensions raise ``ShapeError`` naming the parameter.
"""
from __future__ import annotations

import math
from dataclasses import dataclass, field, replace

import numpy as np

from .polygon import Ring, make_ring, self_intersection, signed_area
from . import warping as WP

ARC_SEGMENTS = 2048  # segments per full turn; inscribed-polygon error in I is about (2π/N)²/1.5 ≈ 6e-6
ARC_TOLERANCE = 5e-5  # relative agreement demanded of shapes with arcs
EXACT_TOLERANCE = 1e-9  # ... and of straight-edged shapes
MAX_POLYGON_POINTS = 10_000  # the self-crossing check is O(n²): about 5 s at this size


class ShapeError(ValueError):
    def __init__(self, message: str, param: str | None = None):
        super().__init__(message)
        self.param = param


@dataclass
class Row:
    """One line of the parallel-axis table (actual, untransformed area; ``sign`` -1 for a hole)."""

    name: str
    A: float
    x: float
    y: float
    Iox: float
    Ioy: float
    Ioxy: float = 0.0
    sign: int = 1
    n: float = 1.0
    rho: float | None = None  # kg/mm³

    def transformed(self, fx, rot: float, dx: float, dy: float, mirror: str) -> "Row":
        Ix, Iy, Ixy, x, y = self.Iox, self.Ioy, self.Ioxy, self.x, self.y
        if mirror == "left-right":
            x, Ixy = -x, -Ixy
        elif mirror == "up-down":
            y, Ixy = -y, -Ixy
        c, s = math.cos(rot), math.sin(rot)
        xr, yr = x * c - y * s, x * s + y * c
        Ixr = Ix * c * c + Iy * s * s + 2 * Ixy * s * c
        Iyr = Ix * s * s + Iy * c * c - 2 * Ixy * s * c
        Ixyr = (Iy - Ix) * s * c + Ixy * (c * c - s * s)
        return replace(self, x=xr + dx, y=yr + dy, Iox=Ixr, Ioy=Iyr, Ioxy=Ixyr)


@dataclass(frozen=True)
class Step:
    """A traced formula in sheet syntax over the call's parameter names."""

    name: str
    formula: str
    unit: str
    desc: str


@dataclass(frozen=True)
class Dimension:
    """A dimension line for the drawing from (x1, y1) to (x2, y2); ``offset`` in drawing levels to its
    left (-1: one level to its right, 0: on the measured line itself)."""

    x1: float
    y1: float
    x2: float
    y2: float
    label: str
    offset: float


@dataclass
class Shape:
    kind: str
    label: str
    rows: list[Row]
    rings: list[Ring]
    J: float
    J_method: str
    J_steps: list[Step] = field(default_factory=list)
    pre_steps: list[Step] = field(default_factory=list)  # derived inputs (d_i = d - 2*t ...)
    closed_form: list[Step] | None = None  # A, x_c, y_c, I_x, I_y, I_xy when one formula each
    dims: list[Dimension] = field(default_factory=list)
    has_arcs: bool = False
    warnings: list[tuple[str, str | None]] = field(default_factory=list)
    # warping and shear centre: formulas (sheet syntax, in the call's scope) for h_o, C_w, x_s, y_s ...
    warping: list[Step] = field(default_factory=list)
    symmetry: str = "none"  # "double", "vertical" (about a vertical axis), "horizontal", "none"
    closed: bool = False  # a closed cell (box, tube): Bredt's J, shear flow T/(2·A_m)
    # the centre-line model of a numerical warping analysis (walls, lumps, result; see warping.sectorial), shown as
    # a table in the working
    sectorial: tuple | None = None

    @property
    def tolerance(self) -> float:
        return ARC_TOLERANCE if self.has_arcs else EXACT_TOLERANCE


def _fmt(v: float) -> str:
    return f"{v:.10g}"


def _positive(**values) -> None:
    for name, v in values.items():
        if v is None:
            continue
        if not (isinstance(v, float) and math.isfinite(v)):
            raise ShapeError(f"{name} must be a finite length", name)
        if v <= 0:
            raise ShapeError(f"{name} must be greater than zero (got {_fmt(v)} mm)", name)


def _rect_row(name, x0, y0, b, h) -> Row:
    return Row(name, b * h, x0 + b / 2, y0 + h / 2, b * h**3 / 12, h * b**3 / 12)


def _rect_points(x0, y0, b, h):
    return [(x0, y0), (x0 + b, y0), (x0 + b, y0 + h), (x0, y0 + h)]


def _circle_points(cx, cy, r, start=0.0, stop=2 * math.pi, closed_arc=False):
    n = max(8, int(round(ARC_SEGMENTS * abs(stop - start) / (2 * math.pi))))
    t = np.linspace(start, stop, n + 1 if closed_arc else n, endpoint=closed_arc)
    return np.column_stack([cx + r * np.cos(t), cy + r * np.sin(t)])


def _outline(pts_list, signs=None) -> list[Ring]:
    signs = signs or [1] * len(pts_list)
    return [make_ring(p, s) for p, s in zip(pts_list, signs)]


def _dims_box(b, h):
    return [
        Dimension(0, 0, b, 0, f"{_fmt(b)}", -1),
        Dimension(0, h, 0, 0, f"{_fmt(h)}", -1),
    ]


def _roark_rectangle_J(long_side: float, short_side: float) -> float:
    a, b = long_side, short_side
    return a * b**3 * (1 / 3 - 0.21 * (b / a) * (1 - b**4 / (12 * a**4)))


def _roark_steps(long_name: str, short_name: str) -> list[Step]:
    a, b = long_name, short_name
    return [Step("J", f"{a}*{b}^3*(1/3 - 0.21*({b}/{a})*(1 - {b}^4/(12*{a}^4)))", "mm^4",
                 "torsion constant of a solid rectangle")]


COMPACT_J = ("Saint-Venant's approximation for a compact solid section, J ≈ A⁴/(4π²·I_p) "
             "(exact for an ellipse; about 14 % high for an equilateral triangle)")


def _compact_steps() -> list[Step]:
    return [Step("J", "A^4/(4*pi^2*(I_x + I_y))", "mm^4", "torsion constant (compact section)")]


def _compact_J(rows) -> float:
    A = sum(r.sign * r.A for r in rows)
    xc = sum(r.sign * r.A * r.x for r in rows) / A
    yc = sum(r.sign * r.A * r.y for r in rows) / A
    Ip = sum(r.sign * (r.Iox + r.Ioy + r.A * ((r.x - xc) ** 2 + (r.y - yc) ** 2)) for r in rows)
    return A**4 / (4 * math.pi**2 * Ip)


# ---------------------------------------------------------------- solid shapes


def rectangle(b: float, h: float) -> Shape:
    _positive(b=b, h=h)
    rows = [_rect_row("rectangle", 0, 0, b, h)]
    long_, short = ("h", "b") if h >= b else ("b", "h")
    return Shape(
        "rectangle", f"rectangle b={_fmt(b)} h={_fmt(h)} mm", rows, _outline([_rect_points(0, 0, b, h)]),
        J=_roark_rectangle_J(max(b, h), min(b, h)),
        J_method="solid rectangle, J = a·b³·[1/3 − 0.21·(b/a)·(1 − b⁴/(12a⁴))], a the long side "
                 "(Roark's Formulas for Stress and Strain, torsion table)",
        J_steps=_roark_steps(long_, short),
        closed_form=[Step("A", "b*h", "mm^2", "area"), Step("x_c", "b/2", "mm", "centroid from the left edge"),
                     Step("y_c", "h/2", "mm", "centroid above the base"),
                     Step("I_x", "b*h^3/12", "mm^4", "second moment about the centroidal x axis"),
                     Step("I_y", "h*b^3/12", "mm^4", "second moment about the centroidal y axis")],
        dims=_dims_box(b, h), symmetry="double",
    )


def circle(d: float) -> Shape:
    _positive(d=d)
    r = d / 2
    rows = [Row("circle", math.pi * r * r, r, r, math.pi * d**4 / 64, math.pi * d**4 / 64)]
    return Shape(
        "circle", f"circle d={_fmt(d)} mm", rows, _outline([_circle_points(r, r, r)]),
        J=math.pi * d**4 / 32, J_method="exact for a solid circle, J = π·d⁴/32 = 2·I",
        J_steps=[Step("J", "pi*d^4/32", "mm^4", "torsion constant (exact)")],
        closed_form=[Step("A", "pi*d^2/4", "mm^2", "area"), Step("x_c", "d/2", "mm", "centroid from the left edge"),
                     Step("y_c", "d/2", "mm", "centroid above the base"),
                     Step("I_x", "pi*d^4/64", "mm^4", "second moment about the centroidal x axis"),
                     Step("I_y", "pi*d^4/64", "mm^4", "second moment about the centroidal y axis")],
        dims=[Dimension(0, r, d, r, f"⌀{_fmt(d)}", 0)],
        has_arcs=True, symmetry="double",
    )


def tube(d: float, t: float | None = None, d_i: float | None = None) -> Shape:
    _positive(d=d, t=t, d_i=d_i)
    if t is None and d_i is None:
        raise ShapeError("give the wall t or the inside diameter d_i", "t")
    if t is not None and d_i is not None and abs(d - 2 * t - d_i) > 1e-9 * d:
        raise ShapeError("t and d_i disagree (d_i must equal d - 2·t); give one of them", "d_i")
    if t is not None and t >= d / 2:
        raise ShapeError(f"wall t = {_fmt(t)} mm is not less than half the outside diameter ({_fmt(d / 2)} mm)", "t")
    if d_i is not None and d_i >= d:
        raise ShapeError(f"inside diameter d_i = {_fmt(d_i)} mm must be less than d = {_fmt(d)} mm", "d_i")
    di = d_i if d_i is not None else d - 2 * t
    r, ri = d / 2, di / 2
    rows = [Row("outside circle", math.pi * r * r, r, r, math.pi * d**4 / 64, math.pi * d**4 / 64),
            Row("bore", math.pi * ri * ri, r, r, math.pi * di**4 / 64, math.pi * di**4 / 64, sign=-1)]
    pre = [] if d_i is not None else [Step("d_i", "d - 2*t", "mm", "inside diameter")]
    return Shape(
        "tube", f"tube d={_fmt(d)} d_i={_fmt(di)} mm", rows,
        _outline([_circle_points(r, r, r), _circle_points(r, r, ri)], [1, -1]),
        J=math.pi * (d**4 - di**4) / 32, J_method="exact for a circular tube, J = π·(d⁴ − d_i⁴)/32 = 2·I",
        J_steps=[Step("J", "pi*(d^4 - d_i^4)/32", "mm^4", "torsion constant (exact)"),
                 Step("A_m", "pi*((d + d_i)/2)^2/4", "mm^2", "area enclosed by the wall mid-line")],
        pre_steps=pre,
        closed_form=[Step("A", "pi*(d^2 - d_i^2)/4", "mm^2", "area"),
                     Step("x_c", "d/2", "mm", "centroid from the left edge"),
                     Step("y_c", "d/2", "mm", "centroid above the base"),
                     Step("I_x", "pi*(d^4 - d_i^4)/64", "mm^4", "second moment about the centroidal x axis"),
                     Step("I_y", "pi*(d^4 - d_i^4)/64", "mm^4", "second moment about the centroidal y axis")],
        dims=[Dimension(0, r, d, r, f"⌀{_fmt(d)} × {_fmt((d - di) / 2)}", 0)],
        has_arcs=True, symmetry="double", closed=True,
    )


def box(b: float, h: float, t: float | None = None, t_f: float | None = None, t_w: float | None = None) -> Shape:
    _positive(b=b, h=h, t=t, t_f=t_f, t_w=t_w)
    if t is None and (t_f is None or t_w is None):
        raise ShapeError("give the uniform wall t, or both t_f and t_w", "t" if t_f is None and t_w is None
                         else ("t_w" if t_w is None else "t_f"))
    tf = t_f if t_f is not None else t
    tw = t_w if t_w is not None else t
    pf = "t_f" if t_f is not None else "t"
    pw = "t_w" if t_w is not None else "t"
    if tf >= h / 2:
        raise ShapeError(f"wall {pf} = {_fmt(tf)} mm is not less than half the outside depth ({_fmt(h / 2)} mm)", pf)
    if tw >= b / 2:
        raise ShapeError(f"wall {pw} = {_fmt(tw)} mm is not less than half the outside width ({_fmt(b / 2)} mm)", pw)
    bi, hi = b - 2 * tw, h - 2 * tf
    rows = [_rect_row("outside", 0, 0, b, h), replace(_rect_row("void", tw, tf, bi, hi), sign=-1)]
    pre = []
    if t_f is None:
        pre.append(Step("t_f", "t", "mm", "flange wall (uniform wall t)"))
    if t_w is None:
        pre.append(Step("t_w", "t", "mm", "web wall (uniform wall t)"))
    pre += [Step("b_i", "b - 2*t_w", "mm", "inside width"), Step("h_i", "h - 2*t_f", "mm", "inside depth")]
    Am = (b - tw) * (h - tf)
    ds_t = 2 * (b - tw) / tf + 2 * (h - tf) / tw
    return Shape(
        "box", f"box b={_fmt(b)} h={_fmt(h)} t_f={_fmt(tf)} t_w={_fmt(tw)} mm", rows,
        _outline([_rect_points(0, 0, b, h), _rect_points(tw, tf, bi, hi)], [1, -1]),
        J=4 * Am**2 / ds_t,
        J_method="Bredt's thin-walled closed-section formula J = 4·A_m²/∮ds/t on the wall centreline",
        J_steps=[Step("A_m", "(b - t_w)*(h - t_f)", "mm^2", "area enclosed by the wall centreline"),
                 Step("J", "4*A_m^2/(2*(b - t_w)/t_f + 2*(h - t_f)/t_w)", "mm^4", "torsion constant (Bredt)")],
        pre_steps=pre,
        closed_form=[Step("A", "b*h - b_i*h_i", "mm^2", "area"),
                     Step("x_c", "b/2", "mm", "centroid from the left edge"),
                     Step("y_c", "h/2", "mm", "centroid above the base"),
                     Step("I_x", "(b*h^3 - b_i*h_i^3)/12", "mm^4", "second moment about the centroidal x axis"),
                     Step("I_y", "(h*b^3 - h_i*b_i^3)/12", "mm^4", "second moment about the centroidal y axis")],
        dims=_dims_box(b, h) + [Dimension(b, h - tf, b, h, _fmt(tf), -1)], symmetry="double", closed=True,
    )


THIN_OPEN = "Saint-Venant's thin-walled open-section sum J = Σ b·t³/3 over the plates (fillets ignored)"


def _web_checks(t_w, b_min, t_f, where="flange") -> list[tuple[str, str | None]]:
    if t_w >= b_min:
        raise ShapeError(f"web t_w = {_fmt(t_w)} mm is not narrower than the {where} width {_fmt(b_min)} mm", "t_w")
    if t_w > t_f:
        return [(f"the web (t_w = {_fmt(t_w)} mm) is thicker than the flange (t_f = {_fmt(t_f)} mm): check the input",
                 "t_w")]
    return []


def ishape(h: float, b: float, t_f: float, t_w: float, b_bot: float | None = None, t_fb: float | None = None) -> Shape:
    _positive(h=h, b=b, t_f=t_f, t_w=t_w, b_bot=b_bot, t_fb=t_fb)
    bb = b_bot if b_bot is not None else b
    tb = t_fb if t_fb is not None else t_f
    if t_f + tb >= h:
        raise ShapeError(f"flanges ({_fmt(t_f)} + {_fmt(tb)} mm) leave no web in the depth h = {_fmt(h)} mm", "t_f")
    warnings = _web_checks(t_w, min(b, bb), min(t_f, tb))
    W = max(b, bb)
    xc = W / 2
    hw = h - t_f - tb
    rows = [_rect_row("top flange", xc - b / 2, h - t_f, b, t_f), _rect_row("web", xc - t_w / 2, tb, t_w, hw),
            _rect_row("bottom flange", xc - bb / 2, 0, bb, tb)]
    pts = [(xc - bb / 2, 0), (xc + bb / 2, 0), (xc + bb / 2, tb), (xc + t_w / 2, tb), (xc + t_w / 2, h - t_f),
           (xc + b / 2, h - t_f), (xc + b / 2, h), (xc - b / 2, h), (xc - b / 2, h - t_f), (xc - t_w / 2, h - t_f),
           (xc - t_w / 2, tb), (xc - bb / 2, tb)]
    pre = []
    if b_bot is None:
        pre.append(Step("b_bot", "b", "mm", "bottom flange width (equal flanges)"))
    if t_fb is None:
        pre.append(Step("t_fb", "t_f", "mm", "bottom flange thickness (equal flanges)"))
    J = (b * t_f**3 + bb * tb**3 + hw * t_w**3) / 3
    lab = f"I-shape h={_fmt(h)} b={_fmt(b)} t_f={_fmt(t_f)} t_w={_fmt(t_w)}"
    if b_bot is not None or t_fb is not None:
        lab += f" b_bot={_fmt(bb)} t_fb={_fmt(tb)}"
    return Shape(
        "ishape", lab + " mm", rows, _outline([pts]), J=J, J_method=THIN_OPEN + "; web taken over its clear depth",
        J_steps=[Step("J", "(b*t_f^3 + b_bot*t_fb^3 + (h - t_f - t_fb)*t_w^3)/3", "mm^4",
                      "torsion constant (thin-walled open)")],
        pre_steps=pre,
        warping=WP.doubly_symmetric_I() if (bb == b and tb == t_f) else WP.unequal_I(),
        symmetry="double" if (bb == b and tb == t_f) else "vertical",
        dims=[Dimension(xc - b / 2, h, xc + b / 2, h, _fmt(b), 1), Dimension(xc - W / 2, h, xc - W / 2, 0, _fmt(h), -1),
              Dimension(xc - bb / 2, 0, xc + bb / 2, 0, _fmt(bb), -1),
              Dimension(xc + b / 2, h - t_f, xc + b / 2, h, _fmt(t_f), -1)],
        warnings=warnings,
    )


def channel(h: float, b: float, t_f: float, t_w: float) -> Shape:
    _positive(h=h, b=b, t_f=t_f, t_w=t_w)
    if 2 * t_f >= h:
        raise ShapeError(f"flanges (2 × {_fmt(t_f)} mm) leave no web in the depth h = {_fmt(h)} mm", "t_f")
    warnings = _web_checks(t_w, b, t_f)
    rows = [_rect_row("top flange", t_w, h - t_f, b - t_w, t_f), _rect_row("web", 0, 0, t_w, h),
            _rect_row("bottom flange", t_w, 0, b - t_w, t_f)]
    pts = [(0, 0), (b, 0), (b, t_f), (t_w, t_f), (t_w, h - t_f), (b, h - t_f), (b, h), (0, h)]
    return Shape(
        "channel", f"channel h={_fmt(h)} b={_fmt(b)} t_f={_fmt(t_f)} t_w={_fmt(t_w)} mm", rows, _outline([pts]),
        J=(2 * b * t_f**3 + (h - 2 * t_f) * t_w**3) / 3,
        J_method=THIN_OPEN + "; flanges full width, web over its clear depth",
        J_steps=[Step("J", "(2*b*t_f^3 + (h - 2*t_f)*t_w^3)/3", "mm^4", "torsion constant (thin-walled open)")],
        warping=WP.channel(), symmetry="horizontal",
        dims=_dims_box(b, h) + [Dimension(b, h - t_f, b, h, _fmt(t_f), -1)],
        warnings=warnings,
    )


def tee(h: float, b: float, t_f: float, t_w: float) -> Shape:
    _positive(h=h, b=b, t_f=t_f, t_w=t_w)
    if t_f >= h:
        raise ShapeError(f"flange t_f = {_fmt(t_f)} mm leaves no stem in the depth h = {_fmt(h)} mm", "t_f")
    warnings = _web_checks(t_w, b, t_f)
    hs = h - t_f
    rows = [_rect_row("flange", 0, hs, b, t_f), _rect_row("stem", (b - t_w) / 2, 0, t_w, hs)]
    x1, x2 = (b - t_w) / 2, (b + t_w) / 2
    pts = [(x1, 0), (x2, 0), (x2, hs), (b, hs), (b, h), (0, h), (0, hs), (x1, hs)]
    return Shape(
        "tee", f"tee h={_fmt(h)} b={_fmt(b)} t_f={_fmt(t_f)} t_w={_fmt(t_w)} mm", rows, _outline([pts]),
        J=(b * t_f**3 + hs * t_w**3) / 3, J_method=THIN_OPEN + "; stem below the flange",
        J_steps=[Step("J", "(b*t_f^3 + (h - t_f)*t_w^3)/3", "mm^4", "torsion constant (thin-walled open)")],
        warping=WP.tee(), symmetry="vertical",
        dims=[Dimension(0, h, b, h, _fmt(b), 1), Dimension(0, h, 0, 0, _fmt(h), -1),
              Dimension(b, hs, b, h, _fmt(t_f), -1)],
        warnings=warnings,
    )


def angle(h: float, t: float, b: float | None = None) -> Shape:
    _positive(h=h, t=t, b=b)
    bb = b if b is not None else h
    if t >= min(h, bb):
        raise ShapeError(f"leg thickness t = {_fmt(t)} mm is not less than the shorter leg {_fmt(min(h, bb))} mm", "t")
    rows = [_rect_row("vertical leg", 0, 0, t, h), _rect_row("horizontal leg", t, 0, bb - t, t)]
    pts = [(0, 0), (bb, 0), (bb, t), (t, t), (t, h), (0, h)]
    pre = [] if b is not None else [Step("b", "h", "mm", "horizontal leg (equal angle)")]
    return Shape(
        "angle", f"angle h={_fmt(h)} b={_fmt(bb)} t={_fmt(t)} mm", rows, _outline([pts]),
        J=(h + bb - t) * t**3 / 3, J_method=THIN_OPEN + "; legs along their outer edges less the shared corner",
        J_steps=[Step("J", "(h + b - t)*t^3/3", "mm^4", "torsion constant (thin-walled open)")],
        pre_steps=pre, warping=WP.angle(),
        dims=_dims_box(bb, h) + [Dimension(t, h, 0, h, _fmt(t), -1)],
    )


def triangle(b: float, h: float, form: str = "right") -> Shape:
    _positive(b=b, h=h)
    if form == "right":
        pts = [(0, 0), (b, 0), (0, h)]
        row = Row("triangle", b * h / 2, b / 3, h / 3, b * h**3 / 36, h * b**3 / 36, -(b**2) * h**2 / 72)
        cf = [Step("x_c", "b/3", "mm", "centroid from the vertical leg"),
              Step("y_c", "h/3", "mm", "centroid above the base"),
              Step("I_x", "b*h^3/36", "mm^4", "second moment about the centroidal x axis"),
              Step("I_y", "h*b^3/36", "mm^4", "second moment about the centroidal y axis"),
              Step("I_xy", "-b^2*h^2/72", "mm^4", "product of area about the centroidal axes")]
    elif form == "isosceles":
        pts = [(0, 0), (b, 0), (b / 2, h)]
        row = Row("triangle", b * h / 2, b / 2, h / 3, b * h**3 / 36, h * b**3 / 48, 0.0)
        cf = [Step("x_c", "b/2", "mm", "centroid from the left corner"),
              Step("y_c", "h/3", "mm", "centroid above the base"),
              Step("I_x", "b*h^3/36", "mm^4", "second moment about the centroidal x axis"),
              Step("I_y", "h*b^3/48", "mm^4", "second moment about the centroidal y axis")]
    else:
        raise ShapeError('form must be "right" or "isosceles"', "form")
    rows = [row]
    return Shape(
        "triangle", f"{form} triangle b={_fmt(b)} h={_fmt(h)} mm", rows, _outline([pts]),
        J=_compact_J(rows), J_method=COMPACT_J, J_steps=_compact_steps(),
        closed_form=[Step("A", "b*h/2", "mm^2", "area")] + cf, dims=_dims_box(b, h),
    )


def semicircle(d: float) -> Shape:
    _positive(d=d)
    r = d / 2
    rows = [Row("semicircle", math.pi * r * r / 2, r, 4 * r / (3 * math.pi), (math.pi / 8 - 8 / (9 * math.pi)) * r**4,
                math.pi * r**4 / 8)]
    pts = _circle_points(r, 0.0, r, 0.0, math.pi, closed_arc=True)
    return Shape(
        "semicircle", f"semicircle d={_fmt(d)} mm", rows, _outline([pts]), J=_compact_J(rows), J_method=COMPACT_J,
        J_steps=_compact_steps(), pre_steps=[Step("r", "d/2", "mm", "radius")],
        closed_form=[Step("A", "pi*r^2/2", "mm^2", "area"), Step("x_c", "r", "mm", "centroid from the left end"),
                     Step("y_c", "4*r/(3*pi)", "mm", "centroid above the diameter"),
                     Step("I_x", "(pi/8 - 8/(9*pi))*r^4", "mm^4", "second moment about the centroidal x axis"),
                     Step("I_y", "pi*r^4/8", "mm^4", "second moment about the centroidal y axis")],
        dims=[Dimension(0, 0, d, 0, _fmt(d), -1), Dimension(d, 0, d, r, _fmt(r), -1)], has_arcs=True,
    )


def _triangle_row(name, p0, p1, p2) -> Row:
    """A triangle's area, centroid and centroidal moments: I = (A/12)·Σ(y_i − ȳ)² etc."""
    xs = np.array([p0[0], p1[0], p2[0]])
    ys = np.array([p0[1], p1[1], p2[1]])
    A2 = (xs[1] - xs[0]) * (ys[2] - ys[0]) - (xs[2] - xs[0]) * (ys[1] - ys[0])
    A = abs(A2) / 2
    xc, yc = xs.mean(), ys.mean()
    dx, dy = xs - xc, ys - yc
    return Row(name, A, float(xc), float(yc), float(A / 12 * (dy @ dy)), float(A / 12 * (dx @ dx)),
               float(A / 12 * (dx @ dy)), sign=1 if A2 >= 0 else -1)


def clean_points(points, param="points") -> np.ndarray:
    """Drop repeated and closing vertices; refuse degenerate or self-intersecting outlines."""
    pts = np.asarray(points, dtype=float)
    if pts.ndim != 2 or pts.shape[1] != 2:
        raise ShapeError("points must be a list of (x, y) pairs", param)
    if not np.all(np.isfinite(pts)):
        raise ShapeError("points must be finite", param)
    keep = np.ones(len(pts), bool)
    size = float(np.ptp(pts, axis=0).max()) if len(pts) else 0.0
    tol = 1e-9 * max(size, 1e-300)
    for i in range(1, len(pts)):
        keep[i] = np.hypot(*(pts[i] - pts[i - 1])) > tol
    pts = pts[keep]
    if len(pts) > 1 and np.hypot(*(pts[-1] - pts[0])) <= tol:
        pts = pts[:-1]
    if len(pts) < 3:
        raise ShapeError("a polygon needs at least three distinct points", param)
    if len(pts) > MAX_POLYGON_POINTS:
        raise ShapeError(f"a polygon of {len(pts)} points is more than the {MAX_POLYGON_POINTS} whose outline can be "
                         "checked for self-crossing here", param)
    hit = self_intersection(pts[:, 0], pts[:, 1], tol)
    if hit is not None:
        i, j = hit
        raise ShapeError(f"the outline crosses itself: edge {i + 1} (point {i + 1} to {(i + 1) % len(pts) + 1}) meets "
                         f"edge {j + 1} (point {j + 1} to {(j + 1) % len(pts) + 1})", param)
    area = abs(signed_area(pts[:, 0], pts[:, 1]))
    if area <= 1e-9 * size * size:
        raise ShapeError("the polygon has no area (its points are collinear or it folds back on itself)", param)
    return pts


def polygon(points) -> Shape:
    pts = clean_points(points)
    if signed_area(pts[:, 0], pts[:, 1]) < 0:
        pts = pts[::-1]
    # the points keep the sheet's own coordinates, so x_c, y_c read in the frame they were given in
    rows = [_triangle_row(f"triangle 1-{i + 1}-{i + 2}", pts[0], pts[i], pts[i + 1]) for i in range(1, len(pts) - 1)]
    x0, y0 = pts.min(axis=0)
    W, H = (float(v) for v in np.ptp(pts, axis=0))
    return Shape(
        "polygon", f"polygon of {len(pts)} points, {_fmt(W)} × {_fmt(H)} mm", rows, [make_ring(pts)],
        J=_compact_J(rows), J_method=COMPACT_J, J_steps=_compact_steps(),
        dims=[Dimension(x0, y0, x0 + W, y0, _fmt(W), -1), Dimension(x0, y0 + H, x0, y0, _fmt(H), -1)],
    )
