"""Beam figures to scale: the member with its supports and loads, then shear, moment and deflection.

Why drawn from the exact solution: the curves come from the same piecewise
polynomials as the numbers in the working, and the labelled values (maxima,
values at supports, points of zero shear) are the exact ones, not read off
the sampled curve.
"""
from __future__ import annotations

import math

import numpy as np

from calcsheet.svg import Svg

from . import solver as S
from .model import letters

W, LEFT, RIGHT = 680.0, 56.0, 24.0
INK, GREY, SOFT = "#222", "#777", "#ddd"
DASHES = [None, "6 3", "2 3", "8 3 2 3", "1 2"]
FONT = "sans-serif"


def fmt(v: float) -> str:
    a = abs(v)
    if a >= 1000:
        return f"{v:.0f}"
    if a >= 10:
        return f"{v:.1f}"
    if a >= 0.01 or a == 0:
        return f"{v:.2f}"
    return f"{v:.3g}"


class Frame:
    """Maps beam x (SI metres) to the drawing's pixels."""

    def __init__(self, length: float):
        self.length = length
        self.scale = (W - LEFT - RIGHT) / length

    def px(self, x):
        return LEFT + np.asarray(x) * self.scale


def _text(svg, x, y, s, size=10, anchor="middle", color=INK, weight=None):
    x = min(max(x, 4 + (0 if anchor != "middle" else 30)), W - 4 - (0 if anchor != "middle" else 30))
    svg.text(x, y, s, font_size=size, text_anchor=anchor, fill=color, font_family=FONT, font_weight=weight)


def _layers(intervals):
    """Put each (a, b) interval on the lowest layer where it overlaps nothing: line loads side by side."""
    ends: list[float] = []
    out = []
    for a, b in intervals:
        for k, e in enumerate(ends):
            if a >= e - 1e-9:
                ends[k] = b
                out.append(k)
                break
        else:
            ends.append(b)
            out.append(len(ends) - 1)
    return out, len(ends)


def unit_label(u: str) -> str:
    return u.replace("*", "·").replace("^2", "²").replace("^3", "³").replace("^4", "⁴")


def beam_figure(setup, lit) -> str:
    model = setup.model
    X = model.nodes
    fr = Frame(model.length)
    loads = setup.loads
    label = len(loads) <= 16
    line_loads = [ld for ld in loads if ld.solver.glyph == "line"]
    layer_of, n_layers = _layers([(ld.solver.x1, ld.solver.x2) for ld in line_loads])
    band_h = 18.0 if n_layers <= 3 else max(6.0, 54.0 / n_layers)
    step = band_h + (13 if label else 4)
    load_top = 8 + n_layers * step
    y0 = max(70.0, load_top + 40)
    H = y0 + 78
    svg = Svg(W, H, title="Beam, supports and loads")
    svg.line(fr.px(0), y0, fr.px(model.length), y0, stroke=INK, stroke_width=3)
    names = letters(len(X))
    for i, (x, k) in enumerate(zip(X, setup.kinds)):
        px = float(fr.px(x))
        _support(svg, px, y0, k, i == 0)
        if k == "free":
            _text(svg, px, y0 + 20, names[i], 10, color=GREY)
        else:
            _text(svg, px, y0 + 36, names[i], 11, weight="bold")
    # dimension line
    yd = y0 + 58
    for a, b in zip(X[:-1], X[1:]):
        pa, pb = float(fr.px(a)), float(fr.px(b))
        svg.line(pa, yd, pb, yd, stroke=GREY, stroke_width=0.8)
        svg.line(pa, yd - 4, pa, yd + 4, stroke=GREY, stroke_width=0.8)
        svg.line(pb, yd - 4, pb, yd + 4, stroke=GREY, stroke_width=0.8)
        if pb - pa > 26:
            _text(svg, (pa + pb) / 2, yd - 3, f"{fmt(lit.value(b - a, 'length'))} {lit.units['length']}", 9,
                  color=GREY)
    lu = unit_label(lit.units["line"])
    by_layer: dict[int, float] = {}
    for ld, layer in zip(line_loads, layer_of):
        by_layer[layer] = max(by_layer.get(layer, 0.0), abs(ld.solver.w1), abs(ld.solver.w2))
    for ld, layer in zip(line_loads, layer_of):
        s = ld.solver
        base = y0 - 6 - layer * step
        wmax = by_layer[layer] or 1.0
        h1, h2 = band_h * abs(s.w1) / wmax, band_h * abs(s.w2) / wmax
        pa, pb = float(fr.px(s.x1)), float(fr.px(s.x2))
        svg.polygon([(pa, base), (pa, base - h1), (pb, base - h2), (pb, base)], fill=SOFT, stroke=GREY,
                    stroke_width=0.8, fill_opacity=0.6)
        n = max(2, int((pb - pa) / 22))
        for t in np.linspace(0, 1, n):
            px = pa + t * (pb - pa)
            hh = h1 + t * (h2 - h1)
            if hh > 4:
                _arrow(svg, px, base - hh, base, GREY)
        if label:
            w1, w2 = lit.value(s.w1, "line"), lit.value(s.w2, "line")
            txt = f"{fmt(w1)}" if s.w1 == s.w2 else f"{fmt(w1)}→{fmt(w2)}"
            _text(svg, (pa + pb) / 2, base - max(h1, h2) - 3, f"{txt} {lu}" + (f" ({ld.case})" if ld.case else ""), 9)
    last_label = []  # (x, y) of point-load labels, to stagger neighbours
    fu, mu = unit_label(lit.units["force"]), unit_label(lit.units["moment"])
    for ld in loads:
        s = ld.solver
        if s.glyph == "point":
            px = float(fr.px(s.x))
            up = s.P < 0
            top = y0 - 14 - n_layers * step
            if up:
                _arrow(svg, px, y0 + 2 + 34, y0 + 2, INK)
            else:
                _arrow(svg, px, top, y0 - 2, INK)
            if label:
                ty = y0 + 46 if up else top - 4
                while any(abs(px - ox) < 70 and abs(ty - oy) < 10 for ox, oy in last_label):
                    ty += 11 if up else -11
                last_label.append((px, ty))
                _text(svg, px + 4, ty, f"{fmt(lit.value(abs(s.P), 'force'))} {fu}" +
                      (f" ({ld.case})" if ld.case else ""), 9, anchor="start")
        elif s.glyph == "axial":
            px = float(fr.px(s.x))
            d = 22 if s.F >= 0 else -22
            svg.line(px - d, y0 - 9, px, y0 - 9, stroke=INK, stroke_width=1.2)
            svg.polygon([(px, y0 - 9), (px - (5 if d > 0 else -5), y0 - 12), (px - (5 if d > 0 else -5), y0 - 6)],
                        fill=INK)
            if label:
                _text(svg, px - d / 2, y0 - 14, f"{fmt(lit.value(abs(s.F), 'force'))} {fu}", 9)
        elif s.glyph == "couple":
            px = float(fr.px(s.x))
            _couple(svg, px, y0, s.M >= 0)
            if label:
                _text(svg, px, y0 - 24, f"{fmt(lit.value(abs(s.M), 'moment'))} {mu}", 9)
    return svg.render()


def _arrow(svg, x, y_from, y_to, color):
    svg.line(x, y_from, x, y_to, stroke=color, stroke_width=1.2)
    d = 4 if y_to > y_from else -4
    svg.polygon([(x, y_to), (x - 3, y_to - d), (x + 3, y_to - d)], fill=color)


def _couple(svg, x, y, clockwise: bool):
    r = 14
    a0, a1 = (200, -20) if clockwise else (-20, 200)
    pts = [(x + r * math.cos(math.radians(a)), y - r * math.sin(math.radians(a))) for a in np.linspace(a0, a1, 14)]
    svg.polyline(pts, fill="none", stroke=INK, stroke_width=1.2)
    (xe, ye), (xp, yp) = pts[-1], pts[-2]
    ang = math.atan2(ye - yp, xe - xp)
    svg.polygon([(xe, ye), (xe - 6 * math.cos(ang - 0.5), ye - 6 * math.sin(ang - 0.5)),
                 (xe - 6 * math.cos(ang + 0.5), ye - 6 * math.sin(ang + 0.5))], fill=INK)


def _support(svg, px, y0, kind, first):
    if kind in ("pinned", "roller"):
        svg.polygon([(px, y0 + 2), (px - 9, y0 + 16), (px + 9, y0 + 16)], fill="white", stroke=INK, stroke_width=1.2)
        if kind == "roller":
            svg.circle(px - 5, y0 + 20, 3, fill="white", stroke=INK, stroke_width=1)
            svg.circle(px + 5, y0 + 20, 3, fill="white", stroke=INK, stroke_width=1)
            svg.line(px - 12, y0 + 24, px + 12, y0 + 24, stroke=INK, stroke_width=1)
        else:
            svg.line(px - 12, y0 + 16, px + 12, y0 + 16, stroke=INK, stroke_width=1)
            for k in range(5):
                svg.line(px - 10 + 5 * k, y0 + 16, px - 14 + 5 * k, y0 + 21, stroke=INK, stroke_width=0.7)
    elif kind in ("fixed", "guided"):
        s = -1 if first else 1
        xw = px + s * 2
        svg.line(xw, y0 - 16, xw, y0 + 16, stroke=INK, stroke_width=2)
        for k in range(7):
            yy = y0 - 15 + 5 * k
            svg.line(xw, yy, xw + s * 6, yy + 5, stroke=INK, stroke_width=0.7)
        if kind == "guided":
            svg.circle(px - s * 4, y0 - 8, 2.5, fill="white", stroke=INK)
            svg.circle(px - s * 4, y0 + 8, 2.5, fill="white", stroke=INK)
    elif kind == "hinge":
        svg.circle(px, y0, 4, fill="white", stroke=INK, stroke_width=1.4)
    elif kind == "spring":
        pts = [(px, y0 + 2)] + [(px + (5 if k % 2 else -5), y0 + 5 + 3 * k) for k in range(5)] + [(px, y0 + 20)]
        svg.polyline(pts, fill="none", stroke=INK, stroke_width=1.1)
        svg.line(px - 10, y0 + 21, px + 10, y0 + 21, stroke=INK, stroke_width=1)


def _budget(model) -> int:
    return max(12, int(1600 / len(model.spans)))


MANY_CURVES = 8  # beyond this many combinations a diagram shows their envelope


class _Named:
    """A legend entry that is not a combination (the envelope curves)."""

    def __init__(self, name: str):
        self.combo = self
        self.name = name


def value_figure(setup, res, lit, what: str, title: str, unit_kind: str, down_positive: bool = False) -> str:
    model = setup.model
    X = model.nodes
    fr = Frame(model.length)
    H = 160.0
    top, bot = 36.0, H - 24.0
    mid = (top + bot) / 2
    curves = []
    for cr in res.combos:
        x, V, M, T, D = S.sample(cr.sol, _budget(model))
        y = {"V": V, "M": M, "delta": D}[what]
        curves.append((cr, x, y))
    vmax = max(float(np.max(np.abs(y))) for _, _, y in curves) or 1.0
    if len(curves) > MANY_CURVES and all(len(x) == len(curves[0][1]) and np.array_equal(x, curves[0][1])
                                         for _, x, _ in curves):
        # many combinations (pattern loading): draw their envelope, the pointwise largest and smallest values
        ys = np.vstack([y for _, _, y in curves])
        x0 = curves[0][1]
        curves = [(_Named("envelope, largest"), x0, ys.max(axis=0)), (_Named("envelope, smallest"), x0, ys.min(axis=0))]
    half = (bot - top) / 2
    sgn = 1.0 if down_positive else -1.0  # pixel y grows downward

    def py(v):
        return mid + sgn * np.asarray(v) / vmax * half

    svg = Svg(W, H, title=title)
    svg.line(fr.px(0), mid, fr.px(model.length), mid, stroke=GREY, stroke_width=0.8)
    for xn in X:
        svg.line(float(fr.px(xn)), top - 6, float(fr.px(xn)), bot + 6, stroke=SOFT, stroke_width=0.8)
    for k, (cr, x, y) in enumerate(curves):
        pts = list(zip(fr.px(x).tolist(), py(y).tolist()))
        if k == 0:
            poly = [(float(fr.px(0)), mid)] + pts + [(float(fr.px(model.length)), mid)]
            svg.polygon(poly, fill=SOFT, fill_opacity=0.5, stroke="none")
        svg.polyline(pts, fill="none", stroke=INK, stroke_width=1.3, stroke_dasharray=DASHES[k % len(DASHES)])
    u = unit_label(lit.units[unit_kind])
    lu = unit_label(lit.units["length"])
    note = ("downward positive" if what == "delta" else "sagging positive, drawn up" if what == "M" else "V = dM/dx")
    _text(svg, 6, 12, title, 10, anchor="start", weight="bold")
    _text(svg, 6, 24, f"{u}; {note}", 8, anchor="start", color=GREY)
    if len(curves) > 1:
        xl = W - 8.0
        for k, (cr, _, _) in reversed(list(enumerate(curves[:5]))):
            name = cr.combo.name if len(cr.combo.name) <= 18 else cr.combo.name[:17] + "…"
            xl -= 6.0 * len(name) + 8
            svg.text(xl, 12, name, font_size=9, text_anchor="start", fill=GREY, font_family=FONT)
            svg.line(xl - 24, 9, xl - 4, 9, stroke=INK, stroke_width=1.3, stroke_dasharray=DASHES[k % len(DASHES)])
            xl -= 30

    labels = []
    key = {"V": "V", "M": "M", "delta": "delta"}[what]
    for cr in res.combos:
        hi, lo = S.extremes(cr.sol, key)
        labels.append((hi, cr))
        labels.append((lo, cr))
    hi = max(labels, key=lambda t: t[0].value)
    lo = min(labels, key=lambda t: t[0].value)
    placed = []
    for ext, _ in (hi, lo):
        if abs(ext.value) <= 1e-9 * vmax:
            continue
        _mark(svg, fr, py, ext.x, ext.value, f"{fmt(lit.value(ext.value, unit_kind))} {u} at "
              f"x = {fmt(lit.value(ext.x, 'length'))} {lu}", placed, down_positive, vmax)
    single = len(res.combos) == 1  # support values of one combination among several would mislead
    if what == "M" and len(model.spans) <= 8 and single:
        gov = res.governing_abs("M_min") if len(res.combos) > 1 else res.combos[0]
        for i, xn in enumerate(X):
            if setup.kinds[i] in ("free",) or i in (0, len(X) - 1) and abs(gov.support_M[i]) < 1e-9 * vmax:
                continue
            v = gov.support_M[i]
            near = any(abs(ext.x - xn) < 1e-9 * model.length and abs(ext.value - v) < 1e-9 * vmax
                       for ext, _ in (hi, lo))
            if abs(v) > 1e-6 * vmax and not near:
                _mark(svg, fr, py, xn, v, f"{fmt(lit.value(v, 'moment'))} {u}", placed, down_positive, vmax)
    if what == "V":
        gov = res.governing("M_max")
        for z in gov.zero_shear[:8]:
            pz = float(fr.px(z))
            svg.circle(pz, mid, 2.5, fill="white", stroke=INK)
            if len(gov.zero_shear) <= 4:
                # on the side of the axis away from the curve's descent
                slope = float(gov.sol.at("V", min(z + 1e-3 * model.length, model.length))[0])
                ty = mid - 5 if slope < 0 else mid + 12
                _text(svg, pz + 4, ty, f"V = 0 at x = {fmt(lit.value(z, 'length'))} {lu}", 8, color=GREY,
                      anchor="start")
        if len(model.spans) <= 6 and single:
            for i, xn in enumerate(X):
                if setup.kinds[i] in ("pinned", "roller", "fixed", "spring"):
                    for side in ("left", "right"):
                        if xn <= 0 or xn >= model.length:  # end values are the labelled extremes
                            continue
                        v = float(gov.sol.at("V", xn, side=side)[0])
                        near = any(abs(ext.x - xn) < 1e-9 * model.length and abs(ext.value - v) < 1e-6 * vmax
                                   for ext, _ in (hi, lo))
                        if abs(v) > 0.02 * vmax and not near:
                            off = -3 if side == "left" else 3
                            _text(svg, float(fr.px(xn)) + off * 6, float(py(v)) + (-4 if v > 0 else 11),
                                  fmt(lit.value(v, "force")), 8, anchor="end" if side == "left" else "start")
    return svg.render()


def _mark(svg, fr, py, x, v, text, placed, down_positive, vmax):
    px, pv = float(fr.px(x)), float(py(v))
    svg.circle(px, pv, 2.6, fill=INK)
    above = (v > 0) != down_positive
    ty = pv - 6 if above else pv + 13
    for (ox, oy) in placed:
        if abs(ox - px) < 90 and abs(oy - ty) < 11:
            ty += -11 if above else 11
    placed.append((px, ty))
    anchor = "start" if px < LEFT + 40 else "end" if px > W - RIGHT - 40 else "middle"
    _text(svg, px + (4 if anchor == "start" else -4 if anchor == "end" else 0), ty, text, 9, anchor=anchor)


def figures(setup, res, lit):
    out = [
        (beam_figure(setup, lit), "Beam to scale, with its supports and loads (unfactored)"),
        (value_figure(setup, res, lit, "V", "Shear V", "force"), "Shear diagram"),
        (value_figure(setup, res, lit, "M", "Bending moment M", "moment"), "Bending moment diagram"),
    ]
    if setup.stiff:
        out.append((value_figure(setup, res, lit, "delta", "Deflection δ", "defl", down_positive=True),
                    "Deflection diagram"))
    return out
