"""A small SVG builder for plugin figures: every text is escaped on the way in.

Plugins draw with trusted code, but labels can carry sheet text; nothing
written through this builder can inject markup or reach a URL.
"""
from __future__ import annotations

import html

_NUM = "{:.3f}"

# A text box's size estimated from its font size and character count, so labels can be placed without a
# font: 0.62 em per character over-estimates an ordinary sans-serif label (about 0.5–0.55 em per character
# with digits; common practice for label layout); 0.8 em above the baseline and 0.2 em below it.
CHAR_EM, ASCENT_EM, DESCENT_EM = 0.62, 0.8, 0.2


def text_box(x: float, y: float, content: str, size: float, anchor: str = "start",
             middle: bool = False) -> tuple[float, float, float, float]:
    """The estimated box (x0, y0, x1, y1) of an unrotated text at (x, y), SVG pixels (y down)."""
    w = CHAR_EM * size * len(str(content))
    x0 = x - (w if anchor == "end" else w / 2 if anchor == "middle" else 0.0)
    if middle:
        return x0, y - size / 2, x0 + w, y + size / 2
    return x0, y - ASCENT_EM * size, x0 + w, y + DESCENT_EM * size


def boxes_overlap(a, b, pad: float = 0.0) -> bool:
    return min(a[2], b[2]) - max(a[0], b[0]) > -pad and min(a[3], b[3]) - max(a[1], b[1]) > -pad


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
        self.boxes: list[tuple[float, float, float, float]] = []  # estimated boxes of the texts written

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
        if not attrs.get("transform"):
            self.boxes.append(text_box(x, y, content, float(attrs.get("font_size") or 16),
                                       attrs.get("text_anchor") or "start",
                                       attrs.get("dominant_baseline") in ("middle", "central")))
        self.parts.append(f'<text x="{_n(x)}" y="{_n(y)}" {self._attrs(attrs)}>{esc(content)}</text>')

    def reserve(self, box) -> None:
        """Keep labels off an area (e.g. a legend's line sample) as if a text were there."""
        self.boxes.append(tuple(box))

    def fits(self, box, pad: float = 1.0) -> bool:
        """Whether a text box lies inside the figure and clear of every text written so far."""
        x0, y0, x1, y1 = box
        if x0 < 0 or y0 < 0 or x1 > self.width or y1 > self.height:
            return False
        return not any(boxes_overlap(box, b, pad) for b in self.boxes)

    def label(self, candidates, content, size: float, **attrs) -> bool:
        """Write ``content`` at the first candidate (x, y, anchor) where it fits; a candidate running off the
        figure's side is first slid back inside. Returns False (and writes nothing) when none fits, so the
        caller can drop or shorten the label rather than print it over another."""
        for x, y, anchor in candidates:
            box = text_box(x, y, content, size, anchor)
            if box[0] < 1:
                x += 1 - box[0]
            elif box[2] > self.width - 1:
                x -= box[2] - (self.width - 1)
            box = text_box(x, y, content, size, anchor)
            if self.fits(box):
                self.text(x, y, content, font_size=size, text_anchor=anchor, **attrs)
                return True
        return False

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
