"""Section working and geometry at their edges: every column of the parts tables, fibre distances of an outline
that does not start at the origin, and the edge-crossing test anywhere in the plane.

Sources: a rectangle's second moment b·h³/12 about its own centroid and the parallel-axis theorem (common
practice); shapely as an independent oracle of whether two outlines overlap.
"""
import numpy as np
import pytest
import shapely

import calcsheet
from calcsheet.trace import Table
from calcsheet_plugins.section import polygon as P


def record(text):
    r = calcsheet.run(f"s = {text}\n")
    assert r.ok, r.diagnostics
    return r.values["s"]


def table(rec, start):
    (t,) = [i for i in rec.working.items if isinstance(i, Table) and i.title.startswith(start)]
    return t


def test_every_column_of_a_tees_parts_tables_is_its_parts_own_value():
    # flange 200 × 20 on top of a 10 × 280 stem (h = 300 mm): by hand, rectangle by rectangle
    rec = record("section.tee(b=200 mm, t_f=20 mm, h=300 mm, t_w=10 mm)")
    A = {"flange": 200 * 20, "stem": 10 * 280}
    yc = (A["flange"] * 290 + A["stem"] * 140) / (A["flange"] + A["stem"])  # Σ A·y / Σ A
    own_x = {"flange": 200 * 20**3 / 12, "stem": 10 * 280**3 / 12}  # b·h³/12
    own_y = {"flange": 20 * 200**3 / 12, "stem": 280 * 10**3 / 12}  # h·b³/12
    dy = {"flange": 290 - yc, "stem": 140 - yc}
    for row in table(rec, "Parts table: second moments about the centroidal x axis").rows:
        p = row[0]
        got = [c.m_as("mm^4") if i != 2 else c.m_as("mm") for i, c in enumerate(row[1:], 1)]
        assert got == pytest.approx([own_x[p], dy[p], A[p] * dy[p] ** 2, own_x[p] + A[p] * dy[p] ** 2], rel=1e-6)
    for row in table(rec, "Parts table: second moments about the centroidal y axis").rows:
        p = row[0]
        got = [c.m_as("mm^4") if i != 2 else c.m_as("mm") for i, c in enumerate(row[1:], 1)]
        assert got == pytest.approx([own_y[p], 0.0, 0.0, own_y[p]], rel=1e-6, abs=1e-6)  # both centred on x


def test_fibre_distances_are_measured_from_the_centroid_wherever_the_outline_lies():
    # a 100 × 200 mm rectangle from (−30, −50) to (70, 150): centroid (20, 50), every fibre h/2 or b/2 away
    rec = record("section.polygon(points=[(-30 mm, -50 mm), (70 mm, -50 mm), (70 mm, 150 mm), (-30 mm, 150 mm)])")
    f = {k: v.m_as("mm") if "S_" not in k else v.m_as("mm^3") for k, v in rec.fields.items()
         if k in ("y_top", "y_bot", "x_left", "x_right", "S_x_top", "S_x_bot", "S_y_left", "S_y_right")}
    assert f["y_top"] == pytest.approx(100.0) and f["y_bot"] == pytest.approx(100.0)
    assert f["x_left"] == pytest.approx(50.0) and f["x_right"] == pytest.approx(50.0)
    S_x, S_y = 100 * 200**2 / 6, 200 * 100**2 / 6  # b·h²/6, the rectangle's elastic moduli
    assert f["S_x_top"] == pytest.approx(S_x) and f["S_x_bot"] == pytest.approx(S_x)
    assert f["S_y_left"] == pytest.approx(S_y) and f["S_y_right"] == pytest.approx(S_y)


def _square(x0, y0, a):
    return P.Ring(np.array([x0, x0 + a, x0 + a, x0]), np.array([y0, y0, y0 + a, y0 + a]))


@pytest.mark.parametrize("offset", [0.0, 1e4, -3e4])
def test_two_outlines_crossing_by_more_than_the_tolerance_cross_wherever_they_lie(offset):
    # two 10 mm squares overlapping by 1 mm each way; crossing is a property of their relative position only
    a, b = _square(offset, offset, 10.0), _square(offset + 9.0, offset + 9.0, 10.0)
    sa = shapely.Polygon(np.column_stack([a.x, a.y]))
    sb = shapely.Polygon(np.column_stack([b.x, b.y]))
    assert shapely.intersection(sa, sb).area == pytest.approx(1.0)  # the oracle: they do overlap
    assert P.segments_cross(a, b, 0.01)
    # and two that only touch along an edge do not cross
    c = _square(offset + 10.0, offset, 10.0)
    assert not P.segments_cross(a, c, 0.01)
