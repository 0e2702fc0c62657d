"""The section drawn to scale: outline, holes, materials, centroid, axes, dimensions.

Uses calcsheet.svg (every text escaped). Model coordinates are mm with y up;
the drawing maps them to pixels with y down at one scale for both axes.
"""
from __future__ import annotations

import math

from calcsheet.svg import Svg, dimension

FILLS = ["#c9ced6", "#f3c98b", "#a9cce3", "#b9dca8", "#e6b8d6"]
STROKE = "#1f2a36"
AXIS = "#c0392b"
PRINCIPAL = "#1f6fb2"

BOX_W, BOX_H = 330.0, 260.0
MARGIN_L, MARGIN_R, MARGIN_T, MARGIN_B = 70.0, 95.0, 62.0, 56.0


def _fmt(v: float) -> str:
    return f"{v:.4g}"


def draw(shape, vals: dict, box: tuple[float, float] = (BOX_W, BOX_H)) -> str:
    """Legend swatches sit top-right; the x-axis label clears the y_c dimension at two levels out. ``box`` is the
    largest size (px) of the section itself, margins apart (text keeps its size)."""
    x0, x1, y0, y1 = vals["x_min"], vals["x_max"], vals["y_min"], vals["y_max"]
    W, H = max(x1 - x0, 1e-9), max(y1 - y0, 1e-9)
    s = min(box[0] / W, box[1] / H)
    width = MARGIN_L + W * s + MARGIN_R
    height = MARGIN_T + H * s + MARGIN_B
    svg = Svg(width, height, title=shape.label.split(" #")[0], css_class="figure section-figure")

    def P(x, y):
        return MARGIN_L + (x - x0) * s, MARGIN_T + (y1 - y) * s

    ns = []
    for r in shape.rings:
        if r.sign > 0 and round(r.n, 9) not in ns:
            ns.append(round(r.n, 9))
    ns.sort(key=lambda n: (n != 1.0, n))
    fill_of = {n: FILLS[i % len(FILLS)] for i, n in enumerate(ns)}
    for r in shape.rings:
        pts = [P(x, y) for x, y in zip(r.x, r.y)]
        if r.sign > 0:
            svg.polygon(pts, fill=fill_of[round(r.n, 9)], stroke=STROKE, stroke_width=1.0, stroke_linejoin="round")
        else:
            svg.polygon(pts, fill="#ffffff", stroke=STROKE, stroke_width=0.9, stroke_dasharray="3 2")

    cx, cy = P(vals["x_c"], vals["y_c"])
    ext = 18
    left, right = MARGIN_L - ext, MARGIN_L + W * s + 64
    top, bottom = MARGIN_T - 52, MARGIN_T + H * s + ext
    dash = "8 3 2 3"
    svg.line(left, cy, right, cy, stroke=AXIS, stroke_width=0.8, stroke_dasharray=dash)
    svg.line(cx, top, cx, bottom, stroke=AXIS, stroke_width=0.8, stroke_dasharray=dash)
    svg.text(right + 3, cy + 4, "x", fill=AXIS, font_size=11, font_style="italic")
    svg.text(cx + 4, top + 8, "y", fill=AXIS, font_size=11, font_style="italic")
    th = vals["theta_p"]
    distinct = abs(vals["I_1"] - vals["I_2"]) > 1e-6 * abs(vals["I_1"])
    if distinct and abs(math.sin(2 * th)) > 1e-3:
        L = 0.42 * math.hypot(W, H) * s
        for k, lab in ((0, "1"), (1, "2")):
            a = th + k * math.pi / 2
            ux, uy = math.cos(a), -math.sin(a)
            svg.line(cx - ux * L, cy - uy * L, cx + ux * L, cy + uy * L, stroke=PRINCIPAL, stroke_width=0.8,
                     stroke_dasharray="2 2")
            svg.text(cx + ux * (L + 6), cy + uy * (L + 6) + 4, lab, fill=PRINCIPAL, font_size=11,
                     font_style="italic", text_anchor="middle")
    svg.circle(cx, cy, 4.5, fill="#ffffff", stroke=AXIS, stroke_width=1.2)
    svg.line(cx - 4.5, cy, cx + 4.5, cy, stroke=AXIS, stroke_width=1.0)
    svg.line(cx, cy - 4.5, cx, cy + 4.5, stroke=AXIS, stroke_width=1.0)
    svg.text(cx + 7, cy - 7, "C", fill=AXIS, font_size=10, font_weight="bold")

    dims = list(shape.dims)
    level = 24.0
    if dims:
        for d in dims:
            ax, ay = P(d.x1, d.y1)
            bx, by = P(d.x2, d.y2)
            dimension(svg, ax, ay, bx, by, d.label, offset=d.offset * level, font_size=9.5)
    else:
        ax, ay = P(x0, y0)
        bx, by = P(x1, y0)
        dimension(svg, ax, ay, bx, by, _fmt(W), offset=-level, font_size=9.5)
        ax, ay = P(x0, y1)
        bx, by = P(x0, y0)
        dimension(svg, ax, ay, bx, by, _fmt(H), offset=-level, font_size=9.5)
    # centroid height, on the right
    ax, ay = P(x1, y0)
    bx, by = P(x1, vals["y_c"])
    dimension(svg, ax, ay, bx, by, f"ȳ = {_fmt(vals['y_c'] - y0)}", offset=-2 * level, colour=AXIS, font_size=9)
    if len(ns) > 1:
        y = 12.0
        for n in ns:
            svg.rect(width - 88, y - 8, 12, 10, fill=fill_of[n], stroke=STROKE, stroke_width=0.6)
            svg.text(width - 72, y, f"n = {n:.4g}", font_size=9.5)
            y += 14
    return svg.render()
