"""A small SVG builder for plugin figures: every text is escaped on the way in.

Plugins draw with trusted code, but labels can carry sheet text; nothing
written through this builder can inject markup or reach a URL.
"""
from __future__ import annotations

import html

_NUM = "{:.3f}"


def esc(text) -> str:
    return html.escape(str(text), quote=True)


def _n(v: float) -> str:
    s = _NUM.format(float(v)).rstrip("0").rstrip(".")
    return "0" if s in ("-0", "") else s


class Svg:
    """Collects elements in user coordinates (y up) and writes an SVG (y down)."""

    def __init__(self, width: float, height: float, *, title: str = "", css_class: str = "figure"):
        self.width = width
        self.height = height
        self.title = title
        self.css_class = css_class
        self.parts: list[str] = []

    def _attrs(self, attrs: dict) -> str:
        out = []
        for key, val in attrs.items():
            if val is None:
                continue
            out.append(f'{key.rstrip("_").replace("_", "-")}="{esc(val)}"')
        return " ".join(out)

    def line(self, x1, y1, x2, y2, **attrs):
        self.parts.append(f'<line x1="{_n(x1)}" y1="{_n(y1)}" x2="{_n(x2)}" y2="{_n(y2)}" {self._attrs(attrs)}/>')

    def polyline(self, points, **attrs):
        pts = " ".join(f"{_n(x)},{_n(y)}" for x, y in points)
        self.parts.append(f'<polyline points="{pts}" {self._attrs(attrs)}/>')

    def polygon(self, points, **attrs):
        pts = " ".join(f"{_n(x)},{_n(y)}" for x, y in points)
        self.parts.append(f'<polygon points="{pts}" {self._attrs(attrs)}/>')

    def path(self, d: str, **attrs):
        self.parts.append(f'<path d="{esc(d)}" {self._attrs(attrs)}/>')

    def circle(self, cx, cy, r, **attrs):
        self.parts.append(f'<circle cx="{_n(cx)}" cy="{_n(cy)}" r="{_n(r)}" {self._attrs(attrs)}/>')

    def rect(self, x, y, w, h, **attrs):
        self.parts.append(f'<rect x="{_n(x)}" y="{_n(y)}" width="{_n(w)}" height="{_n(h)}" {self._attrs(attrs)}/>')

    def text(self, x, y, content, **attrs):
        self.parts.append(f'<text x="{_n(x)}" y="{_n(y)}" {self._attrs(attrs)}>{esc(content)}</text>')

    def raw_group(self, inner: "Svg", transform: str):
        """Nest another builder's elements under a transform we compute (numbers only)."""
        self.parts.append(f'<g transform="{esc(transform)}">' + "".join(inner.parts) + "</g>")

    def render(self) -> str:
        title = f"<title>{esc(self.title)}</title>" if self.title else ""
        return (
            f'<svg xmlns="http://www.w3.org/2000/svg" class="{esc(self.css_class)}" '
            f'width="{_n(self.width)}" height="{_n(self.height)}" '
            f'viewBox="0 0 {_n(self.width)} {_n(self.height)}">{title}' + "".join(self.parts) + "</svg>"
        )


def dimension(svg: Svg, x1, y1, x2, y2, label, offset: float = 0.0, *, colour: str = "#333",
              font_size: float = 10) -> None:
    """A dimension line between two points (SVG pixel coordinates), ``offset`` px to its left.

    Draws extension lines from the points, the dimension line with an arrowhead
    at each end, and the label (escaped) at its middle, reading along the line.
    """
    import math

    dx, dy = x2 - x1, y2 - y1
    length = math.hypot(dx, dy)
    if length == 0:
        return
    ux, uy = dx / length, dy / length
    nx, ny = uy, -ux  # left of the direction on screen (y down)
    ax, ay = x1 + nx * offset, y1 + ny * offset
    bx, by = x2 + nx * offset, y2 + ny * offset
    if offset:
        gap = 2 if offset > 0 else -2
        ext = offset + (4 if offset > 0 else -4)
        svg.line(x1 + nx * gap, y1 + ny * gap, x1 + nx * ext, y1 + ny * ext, stroke=colour, stroke_width=0.6)
        svg.line(x2 + nx * gap, y2 + ny * gap, x2 + nx * ext, y2 + ny * ext, stroke=colour, stroke_width=0.6)
    svg.line(ax, ay, bx, by, stroke=colour, stroke_width=0.7)
    head = min(6.0, length / 3)
    for px, py, sx in ((ax, ay, 1), (bx, by, -1)):
        tipx, tipy = px, py
        basex, basey = px + sx * ux * head, py + sx * uy * head
        svg.polygon([(tipx, tipy), (basex + nx * head * 0.35, basey + ny * head * 0.35),
                     (basex - nx * head * 0.35, basey - ny * head * 0.35)], fill=colour)
    angle = math.degrees(math.atan2(dy, dx))
    if angle >= 90 - 1e-9 or angle < -90:  # keep text upright; vertical text reads bottom to top
        angle -= 180 if angle > 0 else -180
    mx, my = (ax + bx) / 2, (ay + by) / 2
    lift = font_size * 0.35 + 2
    tx, ty = mx + nx * lift * (1 if offset >= 0 else -1), my + ny * lift * (1 if offset >= 0 else -1)
    if abs(angle) < 1e-9:
        ty = min(ay, by) - 3 if offset >= 0 else max(ay, by) + font_size + 1
        tx = mx
    svg.text(tx, ty, label, font_size=font_size, text_anchor="middle", fill=colour,
             transform=f"rotate({angle:.2f} {tx:.2f} {ty:.2f})" if abs(angle) > 1e-9 else None,
             dominant_baseline="middle" if abs(angle) > 1e-9 else None)
