"""Every SVG figure's labels stay inside the figure and never overlap one another.

A reviewer reads the numbers on a diagram; a label that runs off the figure or sits on another label cannot
be read. The figures checked are those of every demo sheet (sheets/*.calc) and of beams generated at random.

How a text box is estimated (conservatively, since the renderer's font is not known here):
- width  = 0.62 × font size per character: a sans-serif face averages about 0.5–0.55 em per character for
  mixed text with digits (common practice for label layout), so 0.62 over-estimates every ordinary label;
- height = 1.0 × font size: from 0.8 em above the baseline (ascenders, capitals) to 0.2 em below it
  (descenders), or ±0.5 em about y when the text is centred on it (dominant-baseline="middle");
- text-anchor start / middle / end shifts the box to the right of, about, or to the left of x;
- a rotate(a cx cy) transform rotates the box's corners, and the axis-aligned box around them is used.
Two boxes overlap when their intersection is wider and taller than OVERLAP_TOL pixels (a shared edge is
not an overlap). A box lies inside the viewBox when none of it is outside by more than EDGE_TOL pixels.
"""
from __future__ import annotations

import math
import re
import xml.etree.ElementTree as ET
from pathlib import Path

import pytest
from hypothesis import HealthCheck, Phase, given, settings
from hypothesis import strategies as st

import calcsheet
from calcsheet.trace import Figure

ROOT = Path(__file__).resolve().parents[2]
SHEETS = sorted((ROOT / "sheets").glob("*.calc"))
CHAR_W, ASCENT, DESCENT = 0.62, 0.8, 0.2
OVERLAP_TOL, EDGE_TOL = 0.5, 0.5
NS = "{http://www.w3.org/2000/svg}"


def _floats(text: str) -> list[float]:
    return [float(v) for v in re.findall(r"-?\d+(?:\.\d+)?(?:e-?\d+)?", text)]


def _matrix(transform: str | None):
    """The 2×3 affine matrix of an SVG transform list (translate, scale, rotate, matrix)."""
    a, b, c, d, e, f = 1.0, 0.0, 0.0, 1.0, 0.0, 0.0
    for name, args in re.findall(r"(\w+)\s*\(([^)]*)\)", transform or ""):
        v = _floats(args)
        if name == "translate":
            m = (1, 0, 0, 1, v[0], v[1] if len(v) > 1 else 0.0)
        elif name == "scale":
            m = (v[0], 0, 0, v[1] if len(v) > 1 else v[0], 0, 0)
        elif name == "rotate":
            t = math.radians(v[0])
            cx, cy = (v[1], v[2]) if len(v) == 3 else (0.0, 0.0)
            co, si = math.cos(t), math.sin(t)
            m = (co, si, -si, co, cx - co * cx + si * cy, cy - si * cx - co * cy)
        elif name == "matrix":
            m = tuple(v)
        else:  # pragma: no cover - a transform this test does not know is a failure of the test itself
            raise AssertionError(f"unknown transform {name}")
        # compose: current · m
        a, b, c, d, e, f = (a * m[0] + c * m[1], b * m[0] + d * m[1], a * m[2] + c * m[3], b * m[2] + d * m[3],
                            a * m[4] + c * m[5] + e, b * m[4] + d * m[5] + f)
    return a, b, c, d, e, f


def _apply(m, x, y):
    a, b, c, d, e, f = m
    return a * x + c * y + e, b * x + d * y + f


def _compose(m1, m2):
    a, b, c, d, e, f = m1
    return (a * m2[0] + c * m2[1], b * m2[0] + d * m2[1], a * m2[2] + c * m2[3], b * m2[2] + d * m2[3],
            a * m2[4] + c * m2[5] + e, b * m2[4] + d * m2[5] + f)


def text_boxes(svg: str) -> tuple[tuple[float, float, float, float], list[tuple[str, tuple]]]:
    """The viewBox and the estimated box (x0, y0, x1, y1) of every <text>, in viewBox coordinates."""
    root = ET.fromstring(svg)
    vb = tuple(_floats(root.get("viewBox")))
    view = (vb[0], vb[1], vb[0] + vb[2], vb[1] + vb[3])
    out = []

    def walk(el, m):
        m = _compose(m, _matrix(el.get("transform")))
        if el.tag == NS + "text":
            content = "".join(el.itertext())
            if not content.strip():
                return
            size = float(el.get("font-size") or 16)
            x, y = float(el.get("x", 0)), float(el.get("y", 0))
            w = CHAR_W * size * len(content)
            anchor = el.get("text-anchor", "start")
            x0 = x - (w if anchor == "end" else w / 2 if anchor == "middle" else 0.0)
            if el.get("dominant-baseline") in ("middle", "central"):
                y0, y1 = y - size / 2, y + size / 2
            else:
                y0, y1 = y - ASCENT * size, y + DESCENT * size
            corners = [_apply(m, px, py) for px in (x0, x0 + w) for py in (y0, y1)]
            xs, ys = [p[0] for p in corners], [p[1] for p in corners]
            out.append((content, (min(xs), min(ys), max(xs), max(ys))))
            return
        for child in el:
            walk(child, m)

    walk(root, (1.0, 0.0, 0.0, 1.0, 0.0, 0.0))
    return view, out


def label_problems(svg: str) -> list[str]:
    view, boxes = text_boxes(svg)
    bad = []
    for text, (x0, y0, x1, y1) in boxes:
        if x0 < view[0] - EDGE_TOL or y0 < view[1] - EDGE_TOL or x1 > view[2] + EDGE_TOL or y1 > view[3] + EDGE_TOL:
            bad.append(f"{text!r} leaves the figure: box ({x0:.0f}, {y0:.0f}, {x1:.0f}, {y1:.0f}) "
                       f"in viewBox {tuple(round(v) for v in view)}")
    for i, (ta, a) in enumerate(boxes):
        for tb, b in boxes[i + 1:]:
            w = min(a[2], b[2]) - max(a[0], b[0])
            h = min(a[3], b[3]) - max(a[1], b[1])
            if w > OVERLAP_TOL and h > OVERLAP_TOL:
                bad.append(f"{ta!r} overlaps {tb!r} ({w:.0f}×{h:.0f} px)")
    return bad


def figures_of(result) -> list[tuple[str, str]]:
    """Every (caption, svg) of a run: figures in any plugin call's working, at any depth."""
    found = []

    def walk(items):
        for item in items:
            if isinstance(item, Figure):
                found.append((item.caption, item.svg))
            working = getattr(item, "working", None)
            if working is not None:
                walk(working.items)

    walk(result.items)
    return found


# ------------------------------------------------------------------ the estimate itself

def test_the_estimate_sees_an_overlap_and_a_label_off_the_figure():
    svg = ('<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 100 50">'
           '<text x="10" y="20" font-size="10">abc</text><text x="20" y="22" font-size="10">def</text>'
           '<text x="95" y="40" font-size="10">far</text></svg>')
    problems = label_problems(svg)
    assert any("overlaps" in p for p in problems)
    assert any("'far' leaves the figure" in p for p in problems)


def test_the_estimate_follows_anchor_and_rotation():
    svg = ('<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 100 100">'
           '<text x="50" y="50" font-size="10" text-anchor="middle" transform="rotate(-90 50 50)">abcd</text>'
           '</svg>')
    _, [(_, (x0, y0, x1, y1))] = text_boxes(svg)
    w = 4 * CHAR_W * 10
    assert math.isclose(y1 - y0, w) and math.isclose((y0 + y1) / 2, 50)
    assert math.isclose(x1 - x0, 10)


def test_labels_apart_and_inside_pass():
    svg = ('<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 200 50">'
           '<text x="10" y="20" font-size="10">abc</text><text x="100" y="20" font-size="10">def</text></svg>')
    assert label_problems(svg) == []


# ------------------------------------------------------------------ the demo sheets

@pytest.fixture(scope="module", params=[p.name for p in SHEETS])
def demo_figures(request):
    result = calcsheet.run(ROOT / "sheets" / request.param)
    return request.param, figures_of(result)


def test_demo_sheet_figures_have_readable_labels(demo_figures):
    name, figs = demo_figures
    problems = [f"{name} / {caption}: {p}" for caption, svg in figs for p in label_problems(svg)]
    assert not problems, "\n".join(problems)


# ------------------------------------------------------------------ generated beams

SUPPORTS = ["pinned", "roller"]


@st.composite
def beam_sheets(draw):
    n = draw(st.integers(1, 3))
    spans = [draw(st.sampled_from([2.0, 3.5, 4.8, 6.0, 9.0])) for _ in range(n)]
    ends = ["pinned"] + ["roller"] * n
    if draw(st.booleans()) and n == 1:
        ends = draw(st.sampled_from([["fixed", "free"], ["fixed", "roller"], ["fixed", "fixed"]]))
    loads = []
    for k in range(draw(st.integers(2, 5))):
        span = draw(st.integers(1, n))
        kind = draw(st.sampled_from(["udl", "point", "point"]))
        case = "G" if k == 0 else "Q" if k == 1 else draw(st.sampled_from(["G", "Q"]))
        if kind == "udl":
            w = draw(st.sampled_from([1.5, 4.25, 12.0, 37.5]))
            loads.append(f'beam.udl(w={w} kN/m, span={span}, case="{case}")')
        else:
            p = draw(st.sampled_from([2.0, 8.5, 15.0, 120.0]))
            x = round(draw(st.floats(0.05, 0.95)) * spans[span - 1], 2)
            loads.append(f'beam.point(P={p} kN, x={x} m, span={span}, case="{case}")')
    combos = draw(st.integers(1, 7))
    combo_list = ", ".join(f'beam.combo(name="C{i + 1}", factors="{1.0 + 0.1 * i:.2f} G + {1.5 - 0.2 * i:.2f} Q")'
                           for i in range(combos))
    span_list = ", ".join(f"{s} m" for s in spans)
    return ("b = beam.solve(spans=[" + span_list + f'], supports="{", ".join(ends)}", '
            f"loads=[{', '.join(loads)}], combos=[{combo_list}], E=200 GPa, I=8.0e7 mm^4)\n")


@settings(max_examples=12, deadline=None, derandomize=True, phases=[Phase.generate],
          suppress_health_check=[HealthCheck.too_slow, HealthCheck.function_scoped_fixture])
@given(beam_sheets())
def test_generated_beam_figures_have_readable_labels(text):
    result = calcsheet.run(text)
    assert not result.errors, [d.message for d in result.errors]
    figs = figures_of(result)
    assert len(figs) == 4
    problems = [f"{caption}: {p}" for caption, svg in figs for p in label_problems(svg)]
    assert not problems, text + "\n".join(problems)
