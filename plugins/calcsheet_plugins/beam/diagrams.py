"""Beam figures to scale: the member with its supports and loads, then shear, moment and deflection.

Why drawn from the exact solution: the curves come from the same piecewise
polynomials as the numbers in the working, and the labelled values (maxima,
values at supports, points of zero shear) are the exact ones, not read off
the sampled curve.
"""
from __future__ import annotations

import math

import numpy as np

from calcsheet.svg import CHAR_EM, Svg

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
    svg.spill = []  # labels with no free place near their load: written in rows below the dimension line
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
            yl = base - max(h1, h2) - 3
            _label(svg, [((pa + pb) / 2, yl, "middle"), (pa, yl, "start"), (pb, yl, "end"),
                         ((pa + pb) / 2, yl - 10, "middle")],
                   f"{txt} {lu}" + (f" ({ld.case})" if ld.case else ""), 9)
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
                rows = [ty + (11 if up else -11) * k for k in range(3)] + [ty - (11 if up else -11) * k
                                                                           for k in range(1, 4)]
                _label(svg, [(px + dx, yy, a) for yy in rows for dx, a in ((4, "start"), (-4, "end"))],
                       f"{fmt(lit.value(abs(s.P), 'force'))} {fu}" + (f" ({ld.case})" if ld.case else ""), 9)
        elif s.glyph == "axial":
            px = float(fr.px(s.x))
            d = 22 if s.F >= 0 else -22
            svg.line(px - d, y0 - 9, px, y0 - 9, stroke=INK, stroke_width=1.2)
            svg.polygon([(px, y0 - 9), (px - (5 if d > 0 else -5), y0 - 12), (px - (5 if d > 0 else -5), y0 - 6)],
                        fill=INK)
            if label:
                _label(svg, [(px - d / 2, y0 - 14 - 11 * k, "middle") for k in range(3)],
                       f"{fmt(lit.value(abs(s.F), 'force'))} {fu}", 9)
        elif s.glyph == "couple":
            px = float(fr.px(s.x))
            _couple(svg, px, y0, s.M >= 0)
            if label:
                _label(svg, [(px, y0 - 24 - 11 * k, "middle") for k in range(3)] + [(px + 16, y0 - 4, "start")],
                       f"{fmt(lit.value(abs(s.M), 'moment'))} {mu}", 9)
    for x, text, size, anchor, color in svg.spill:
        y = svg.height + 12
        svg.height = y + 4
        svg.label([(x, y, anchor), (x, y, "middle")], text, size, fill=color, font_family=FONT)
    return svg.render()


def _label(svg, candidates, text, size, color=INK):
    """A load label at the first free place among the candidates; when every one is taken, a row of its own
    above the figure's top (the figure grows), so a value is never dropped nor printed over another."""
    if svg.label(candidates, text, size, fill=color, font_family=FONT):
        return
    x, _, anchor = candidates[0]
    svg.spill.append((x, text, size, anchor, color))


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


# Each combination gets its own (colour, dash) pair: 8 colours that stay apart for common colour-vision
# deficiencies (common practice for charts) times 5 dash patterns give 40 distinct styles.
COLOURS = ["#0072b2", "#d55e00", "#009e73", "#cc79a7", "#e69f00", "#56b4e9", "#000000", "#999933"]
STYLES = len(COLOURS) * len(DASHES)
MANY_CURVES = STYLES  # beyond this many combinations a diagram shows their envelope and the governing one


def curve_style(k: int) -> tuple[str, str | None]:
    """The colour and dash pattern of the k-th combination (0-based): distinct for k < STYLES."""
    return COLOURS[k % len(COLOURS)], DASHES[(k // len(COLOURS)) % len(DASHES)]


class _Named:
    """A legend entry that is not a combination (the envelope curves)."""

    def __init__(self, name: str):
        self.combo = self
        self.name = name


def _legend(svg, entries, x_start, size=8.5):
    """Legend entries (name, colour, dash, bold) flowing in rows from x_start to the figure's right edge;
    returns the y of the last row."""
    x, y = x_start, 12.0
    for name, colour, dash, bold in entries:
        width = 22 + 4 + CHAR_EM * size * len(name) + 10
        if x + width > W - 6 and x > x_start:
            x, y = x_start, y + 12
        svg.line(x, y - 3, x + 22, y - 3, stroke=colour, stroke_width=2.4 if bold else 1.2, stroke_dasharray=dash)
        svg.reserve((x, y - 6, x + 22, y))
        svg.text(x + 26, y, name, font_size=size, text_anchor="start", fill=INK, font_family=FONT,
                 font_weight="bold" if bold else None)
        x += width
    return y


def value_figure(setup, res, lit, what: str, title: str, unit_kind: str, down_positive: bool = False,
                 combos=None, governing=None, check_mark=None) -> str:
    """One diagram over the combinations ``combos`` (default: all), each in its own style with a legend entry,
    the ``governing`` combination drawn bold and named; ``check_mark`` = (x, value, text) marks the value a
    check uses (the deflection check's) instead of the diagram's own extremes."""
    model = setup.model
    X = model.nodes
    fr = Frame(model.length)
    pool = list(combos if combos is not None else res.combos)
    key = {"V": "V", "M": "M", "delta": "delta"}[what]
    if governing is None:
        if what == "V":
            governing = max(pool, key=lambda c: abs(c.V_max.value))
        elif what == "M":
            governing = max(pool, key=lambda c: max(abs(c.M_max.value), abs(c.M_min.value)))
        else:
            governing = max(pool, key=lambda c: abs(c.d_max.value))
    curves = []
    for cr in pool:
        x, V, M, T, D = S.sample(cr.sol, _budget(model))
        y = {"V": V, "M": M, "delta": D}[what]
        curves.append((cr, x, y))
    vmax = max(float(np.max(np.abs(y))) for _, _, y in curves) or 1.0
    drawn = [(cr, x, y, *curve_style(k), cr is governing) for k, (cr, x, y) in enumerate(curves)]
    if len(curves) > MANY_CURVES and all(len(x) == len(curves[0][1]) and np.array_equal(x, curves[0][1])
                                         for _, x, _ in curves):
        # very many combinations: draw their envelope, the pointwise largest and smallest values, and the
        # governing combination
        ys = np.vstack([y for _, _, y in curves])
        x0 = curves[0][1]
        gov = next(c for c in curves if c[0] is governing)
        drawn = [(_Named("envelope, largest"), x0, ys.max(axis=0), GREY, "6 3", False),
                 (_Named("envelope, smallest"), x0, ys.min(axis=0), GREY, "2 3", False),
                 (gov[0], gov[1], gov[2], COLOURS[0], None, True)]
    many = len(drawn) > 1
    u = unit_label(lit.units[unit_kind])
    lu = unit_label(lit.units["length"])
    note = ("downward positive" if what == "delta" else "sagging positive, drawn up" if what == "M" else "V = dM/dx")
    head = [title, f"{u}; {note}"]
    x_leg = 6 + max(CHAR_EM * 10 * len(head[0]), CHAR_EM * 8 * len(head[1])) + 24
    svg = Svg(W, 0.0, title=title)
    last_row = _legend(svg, [(_short(cr.combo.name)
                              + (" (governs)" if bold else ""), colour, dash, bold)
                             for cr, _, _, colour, dash, bold in drawn], x_leg) if many else 12.0
    top = max(28.0, last_row + 4) + 24.0
    bot = top + 100.0
    H = bot + 30.0
    svg.height = H
    mid = (top + bot) / 2
    half = (bot - top) / 2
    sgn = 1.0 if down_positive else -1.0  # pixel y grows downward

    def py(v):
        return mid + sgn * np.asarray(v) / vmax * half

    _text(svg, 6, 12, head[0], 10, anchor="start", weight="bold")
    _text(svg, 6, 24, head[1], 8, anchor="start", color=GREY)
    svg.line(fr.px(0), mid, fr.px(model.length), mid, stroke=GREY, stroke_width=0.8)
    for xn in X:
        svg.line(float(fr.px(xn)), top - 6, float(fr.px(xn)), bot + 6, stroke=SOFT, stroke_width=0.8)
    for cr, x, y, colour, dash, bold in sorted(drawn, key=lambda d: d[5]):  # the governing curve on top
        pts = list(zip(fr.px(x).tolist(), py(y).tolist()))
        if bold or not many:
            poly = [(float(fr.px(0)), mid)] + pts + [(float(fr.px(model.length)), mid)]
            svg.polygon(poly, fill=SOFT, fill_opacity=0.5, stroke="none")
        svg.polyline(pts, fill="none", stroke=colour if many else INK, stroke_width=2.2 if bold else 1.1,
                     stroke_dasharray=dash if many else None)

    placed = []
    if check_mark is not None:
        xm, vm, text = check_mark
        _mark(svg, fr, py, xm, vm, text, placed, down_positive, vmax)
        hi = lo = None
    else:
        labels = []
        for cr in pool:
            a, b = S.extremes(cr.sol, key)
            labels.append((a, cr))
            labels.append((b, cr))
        hi = max(labels, key=lambda t: t[0].value)
        lo = min(labels, key=lambda t: t[0].value)
        for ext, cr in (hi, lo):
            if abs(ext.value) <= 1e-9 * vmax:
                continue
            _mark(svg, fr, py, ext.x, ext.value, f"{fmt(lit.value(ext.value, unit_kind))} {u} at "
                  f"x = {fmt(lit.value(ext.x, 'length'))} {lu}" + (f" ({_short(cr.combo.name)})" if many else ""),
                  placed, down_positive, vmax)
    extremes = [] if hi is None else [hi, lo]
    single = len(pool) == 1  # support values of one combination among several would mislead
    if what == "M" and len(model.spans) <= 8 and single:
        gov = pool[0]
        for i, xn in enumerate(X):
            if setup.kinds[i] in ("free",) or i in (0, len(X) - 1) and abs(gov.support_M[i]) < 1e-9 * vmax:
                continue
            v = gov.support_M[i]
            near = any(abs(ext.x - xn) < 1e-9 * model.length and abs(ext.value - v) < 1e-9 * vmax
                       for ext, _ in extremes)
            if abs(v) > 1e-6 * vmax and not near:
                _mark(svg, fr, py, xn, v, f"{fmt(lit.value(v, 'moment'))} {u}", placed, down_positive, vmax)
    if what == "V":
        gov = res.governing("M_max") if governing not in pool else governing
        for z in gov.zero_shear[:8]:
            pz = float(fr.px(z))
            svg.circle(pz, mid, 2.5, fill="white", stroke=INK)
            if len(gov.zero_shear) <= 4:
                # on the side of the axis away from the curve's descent
                slope = float(gov.sol.at("V", min(z + 1e-3 * model.length, model.length))[0])
                ys = (mid - 5, mid + 12) if slope < 0 else (mid + 12, mid - 5)
                text = f"V = 0 at x = {fmt(lit.value(z, 'length'))} {lu}"
                svg.label([(pz + dx, yy, anchor) for yy in ys for dx, anchor in ((4, "start"), (-4, "end"))],
                          text, 8, fill=GREY, font_family=FONT)
        if len(model.spans) <= 6 and single:
            for i, xn in enumerate(X):
                if setup.kinds[i] in ("pinned", "roller", "fixed", "spring"):
                    for side in ("left", "right"):
                        if xn <= 0 or xn >= model.length:  # end values are the labelled extremes
                            continue
                        v = float(gov.sol.at("V", xn, side=side)[0])
                        near = any(abs(ext.x - xn) < 1e-9 * model.length and abs(ext.value - v) < 1e-6 * vmax
                                   for ext, _ in extremes)
                        if abs(v) > 0.02 * vmax and not near:
                            off = -3 if side == "left" else 3
                            anchor = "end" if side == "left" else "start"
                            yv = float(py(v))
                            svg.label([(float(fr.px(xn)) + off * 6, yv + dy, anchor)
                                       for dy in ((-4, 11, -15, 22) if v > 0 else (11, -4, 22, -15))],
                                      fmt(lit.value(v, "force")), 8, fill=INK, font_family=FONT)
    return svg.render()


def _short(name: str, n: int = 28) -> str:
    return name if len(name) <= n else name[:n - 1] + "…"


def _mark(svg, fr, py, x, v, text, placed, down_positive, vmax):
    px, pv = float(fr.px(x)), float(py(v))
    svg.circle(px, pv, 2.6, fill=INK)
    above = (v > 0) != down_positive
    first = "start" if px < LEFT + 40 else "end" if px > W - RIGHT - 40 else "middle"
    anchors = [first] + [a for a in ("middle", "start", "end") if a != first]
    ys = [pv - 6 - 11 * k for k in range(4)] + [pv + 13 + 11 * k for k in range(3)]
    if not above:
        ys = [pv + 13 + 11 * k for k in range(4)] + [pv - 6 - 11 * k for k in range(3)]
    cands = [(px + (4 if a == "start" else -4 if a == "end" else 0), y, a) for y in ys for a in anchors]
    if not svg.label(cands, text, 9, fill=INK, font_family=FONT):
        # no free place near the point: grow the figure and write the label in a row of its own below
        y = svg.height + 12
        svg.height = y + 6
        anchor = first
        svg.label([(px + (4 if anchor == "start" else -4 if anchor == "end" else 0), y, anchor)], text, 9,
                  fill=INK, font_family=FONT)
    placed.append((px, pv))


def figures(setup, res, lit, deflection_check=None):
    """The member, then shear, moment and deflection. ``deflection_check`` = (pool, combination, x, value): the
    deflection figure then shows the combinations the check draws on and marks the value it uses."""
    out = [
        (beam_figure(setup, lit), "Beam to scale, with its supports and loads (unfactored)"),
        (value_figure(setup, res, lit, "V", "Shear V", "force"), "Shear diagram"),
        (value_figure(setup, res, lit, "M", "Bending moment M", "moment"), "Bending moment diagram"),
    ]
    if setup.stiff:
        if deflection_check is None:
            out.append((value_figure(setup, res, lit, "delta", "Deflection δ", "defl", down_positive=True),
                        "Deflection diagram"))
        else:
            pool, combo, x, value = deflection_check
            lu, du = lit.units["length"], unit_label(lit.units["defl"])
            text = (f"δ = {fmt(lit.value(value, 'defl'))} {du} at x = {fmt(lit.value(x, 'length'))} "
                    f"{unit_label(lu)} ({_short(combo.combo.name)}), used by the deflection check")
            subset = len(pool) < len(res.combos)
            caption = "Deflection diagram" + (
                f" of the combinations the deflection check uses ({_names(pool)})" if subset else "") + \
                f"; marked: the deflection the check uses, {combo.combo.name}"
            out.append((value_figure(setup, res, lit, "delta", "Deflection δ", "defl", down_positive=True,
                                     combos=pool, governing=combo, check_mark=(x, value, text)), caption))
    return out


def _names(pool) -> str:
    sets = []
    for c in pool:
        name = getattr(c.combo, "set", None) or c.combo.name
        if name not in sets:
            sets.append(name)
    return ", ".join(sets[:4]) + (" …" if len(sets) > 4 else "")
