"""Root fillets and rounded corners: the spandrel's closed forms, arcs that converge, and the published effect."""
import math

import numpy as np
import pytest
import shapely

from calcsheet_plugins.section import fillets as FL
from calcsheet_plugins.section import shapes as S
from calcsheet_plugins.section.polygon import make_ring
from calcsheet_plugins.section.properties import green, tabular


def test_spandrel_closed_forms_against_shapely_and_a_fine_outline():
    r = 10.0
    # square r × r at the origin less the quarter disc centred at (r, r)
    disc = shapely.Point(r, r).buffer(r, quad_segs=4096)
    region = shapely.box(0, 0, r, r).difference(disc)
    row = FL.spandrel_row("s", 0.0, 0.0, r, 1, 1)
    assert row.A == pytest.approx(region.area, rel=1e-6)  # shapely: area and centroid
    assert (row.x, row.y) == pytest.approx((region.centroid.x, region.centroid.y), rel=1e-5)
    pts = np.array(region.exterior.coords)[:-1]
    g = green([make_ring(pts)])
    assert (row.Iox, row.Ioy, row.Ioxy) == pytest.approx((g.I_x, g.I_y, g.I_xy), rel=1e-5)


def test_a_spandrel_in_each_quadrant_mirrors_its_product_of_area():
    a, b = FL.spandrel_row("a", 0, 0, 5.0, 1, 1), FL.spandrel_row("b", 0, 0, 5.0, -1, 1)
    assert b.Ioxy == pytest.approx(-a.Ioxy) and b.x == pytest.approx(-a.x) and b.y == pytest.approx(a.y)


def test_arcs_converge_quadratically_in_the_number_of_segments():
    # the rows are exact; the outline's inscribed arcs lose area like (Δθ)²
    pts = [(0, 0), (150, 0), (150, 10.7), (78.55, 10.7), (78.55, 289.3), (150, 289.3), (150, 300), (0, 300),
           (0, 289.3), (71.45, 289.3), (71.45, 10.7), (0, 10.7)]
    radii = [0, 0, 0, 15, 15, 0, 0, 0, 0, 15, 15, 0]
    exact = tabular(FL.ishape(300.0, 150.0, 10.7, 7.1, 15.0).rows)
    errs = []
    for n in (16, 64, 256, 1024):
        g = green([make_ring(FL.rounded(pts, radii, segments=n))])
        errs.append((abs(g.A - exact.A) / exact.A, abs(g.I_x - exact.I_x) / exact.I_x))
    for (a0, i0), (a1, i1) in zip(errs, errs[1:]):
        assert a1 < a0 / 12 and i1 < i0 / 12  # 4× the segments, ~16× smaller error
    assert errs[-1][0] < 1e-6 and errs[-1][1] < 1e-6


def test_without_fillets_the_rolled_I_is_the_three_plate_I():
    a = tabular(FL.ishape(300.0, 150.0, 10.7, 7.1, 1e-9).rows)
    b = tabular(S.ishape(300.0, 150.0, 10.7, 7.1).rows)
    assert (a.A, a.I_x, a.I_y) == pytest.approx((b.A, b.I_x, b.I_y), rel=1e-12)


def test_ipe_300_with_its_root_fillets_is_the_published_section_and_three_plates_are_not():
    # IPE 300: A = 53.81 cm², I_y = 8356 cm⁴ (EN 10365 dimensions; producers' tables, # from memory);
    # the four fillets are 4·(1 − π/4)·r² = 193 mm² (common practice)
    fil = tabular(FL.ishape(300.0, 150.0, 10.7, 7.1, 15.0).rows)
    plates = tabular(S.ishape(300.0, 150.0, 10.7, 7.1).rows)
    assert fil.A == pytest.approx(5381, rel=5e-4) and fil.I_x == pytest.approx(8356e4, rel=5e-4)
    assert fil.A - plates.A == pytest.approx(4 * (1 - math.pi / 4) * 15**2, rel=1e-12)
    assert plates.I_x < 0.99 * 8356e4


def test_hollow_corners_reduce_the_area_by_the_standards_formula():
    # A = 2t(b + h − 2t) − (4 − π)(r_o² − r_i²) (EN 10210-2 Annex, # from memory)
    t, b, h, ro, ri = 8.0, 120.0, 200.0, 20.0, 12.0
    rows = tabular(FL.box(b, h, t, ro, ri).rows)
    assert rows.A == pytest.approx(2 * t * (b + h - 2 * t) - (4 - math.pi) * (ro**2 - ri**2), rel=1e-12)


def test_a_fillet_that_does_not_fit_is_refused_naming_r():
    with pytest.raises(S.ShapeError) as e:
        FL.ishape(100.0, 50.0, 5.0, 4.0, 30.0)
    assert e.value.param == "r"


def test_sheet_calls_with_fillets_and_corner_rules(run):
    r = run("""
        i = section.ishape(h=300 mm, b=150 mm, t_f=10.7 mm, t_w=7.1 mm, r=15 mm)
        hf = section.box(b=100 mm, h=150 mm, t=6.3 mm, corners="EN 10210-2")
        cf = section.box(b=100 mm, h=150 mm, t=6.3 mm, corners="EN 10219-2")
        sharp = section.box(b=100 mm, h=150 mm, t=6.3 mm)
    """)
    assert not [d for d in r.diagnostics if d.severity == "error"], r.diagnostics
    v = {k: r.values[k].fields for k in ("i", "hf", "cf", "sharp")}
    assert v["i"]["A"].m_as("cm^2") == pytest.approx(53.81, rel=5e-4)
    # cold-formed corners are larger than hot-finished ones: less area and stiffness than sharp corners, in order
    assert v["sharp"]["I_x"] > v["hf"]["I_x"] > v["cf"]["I_x"]


def test_rounded_box_needs_one_wall_and_one_way_of_giving_radii(run):
    (e,) = [d for d in run('s = section.box(b=100 mm, h=150 mm, t_f=6 mm, t_w=5 mm, corners="EN 10210-2")\n')
            .diagnostics if d.severity == "error"]
    assert "uniform wall" in e.message
    (e,) = [d for d in run('s = section.box(b=100 mm, h=150 mm, t=6 mm, r_out=9 mm, corners="EN 10210-2")\n')
            .diagnostics if d.severity == "error"]
    assert "not both" in e.message


def test_a_sector_row_against_shapely():
    # sector of 100° about (3, 4), bisector at 30°
    r, alpha, mid = 20.0, math.radians(100), math.radians(30)
    row = FL.sector_row("s", (3.0, 4.0), r, mid, alpha)
    t = np.linspace(mid - alpha / 2, mid + alpha / 2, 20001)
    pts = np.vstack([[3.0, 4.0], np.column_stack([3 + r * np.cos(t), 4 + r * np.sin(t)])])
    poly = shapely.Polygon(pts)
    assert row.A == pytest.approx(poly.area, rel=1e-6)
    assert (row.x, row.y) == pytest.approx((poly.centroid.x, poly.centroid.y), rel=1e-6)
    g = green([make_ring(pts)])
    assert (row.Iox, row.Ioy, row.Ioxy) == pytest.approx((g.I_x, g.I_y, g.I_xy), rel=1e-6)


def test_a_fillet_in_an_obtuse_corner_is_the_region_shapely_cuts():
    # corner of a sloped flange face meeting a vertical web face (slope 1:6), fillet radius 10
    p, prev, nxt = (0.0, 20.0), (60.0, 10.0), (0.0, 80.0)  # flange face coming in toward the web, then up the web
    rows = FL.corner_rows("f", p, prev, nxt, 10.0)
    A = sum(rw.sign * rw.A for rw in rows)
    # the fillet is the part of the corner's wedge not reached by the tangent circle (common practice)
    u1 = np.subtract(p, prev) / np.hypot(*np.subtract(p, prev))
    u2 = np.subtract(nxt, p) / np.hypot(*np.subtract(nxt, p))
    t1, t2, c, theta = FL._corner(np.array(p), u1, u2, 10.0)
    kite = shapely.Polygon([p, t1, c, t2])
    disc = shapely.Point(*c).buffer(10.0, quad_segs=8192)
    assert A == pytest.approx(kite.difference(disc).area, rel=1e-6)
    assert A == pytest.approx(10.0**2 * (1 / math.tan(theta / 2) - (math.pi - theta) / 2), rel=1e-9)


def test_tapered_flanges_parts_table_and_outline_agree():
    # the traced rows (rectangles, taper triangles, fillet kites less sectors) against Green's theorem
    for shp in (FL.tapered_ishape(304.8, 127.0, 13.8, 10.1, 10.0, 1 / 6),
                FL.tapered_channel(254.0, 69.6, 11.1, 9.6, 8.0, 1 / 6)):
        a, b = tabular(shp.rows), green(shp.rings)
        assert (a.A, a.I_x, a.I_y) == pytest.approx((b.A, b.I_x, b.I_y), rel=2e-6)


from hypothesis import given, settings  # noqa: E402
from hypothesis import strategies as st  # noqa: E402


@settings(max_examples=25, deadline=None)
@given(h=st.floats(100, 1000), bf=st.floats(0.3, 1.0), tf=st.floats(0.02, 0.08), tw=st.floats(0.3, 0.9),
       rr=st.floats(0.1, 2.0))
def test_any_filleted_I_parts_table_and_outline_agree_and_fillets_only_add(h, bf, tf, tw, rr):
    b = bf * h
    t_f = tf * h
    t_w = tw * t_f
    r = rr * t_f
    if t_w + 2 * r > b or 2 * t_f + 2 * r > h:
        return
    shp = FL.ishape(h, b, t_f, t_w, r)
    rows, outline = tabular(shp.rows), green(shp.rings)
    assert abs(rows.A - outline.A) / rows.A < 5e-5
    assert abs(rows.I_x - outline.I_x) / (rows.I_x + rows.I_y) < 5e-5
    assert abs(rows.I_y - outline.I_y) / (rows.I_x + rows.I_y) < 5e-5
    plain = tabular(S.ishape(h, b, t_f, t_w).rows)
    assert rows.A > plain.A and rows.I_x > plain.I_x and rows.I_y > plain.I_y
