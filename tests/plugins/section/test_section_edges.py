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
    # the footers: Σ of each column, and the totals are the section's I_x and I_y
    for start, own, d in (("Parts table: second moments about the centroidal x axis", own_x, dy),
                          ("Parts table: second moments about the centroidal y axis", own_y, {"flange": 0, "stem": 0})):
        (foot,) = table(rec, start).footer
        total_own, total_ad2 = sum(own.values()), sum(A[p] * d[p] ** 2 for p in A)
        got = [foot[1].m_as("mm^4"), foot[3].m_as("mm^4"), foot[4].m_as("mm^4")]
        assert got == pytest.approx([total_own, total_ad2, total_own + total_ad2], rel=1e-6, abs=1e-6)
    assert rec.fields["I_y"].m_as("mm^4") == pytest.approx(sum(own_y.values()), rel=1e-9)


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


def test_a_vertex_on_an_edge_close_to_a_corner_changes_nothing():
    # a 100 × 50 mm rectangle with an extra vertex 0.005 mm above its bottom-right corner, on the right edge: the
    # fan of triangles from the first vertex then holds a sliver of 0.25 mm², which is material like the rest
    rec = record("section.polygon(points=[(0 mm, 0 mm), (100 mm, 0 mm), (100 mm, 0.005 mm), (100 mm, 50 mm), "
                 "(0 mm, 50 mm)])")
    f = rec.fields
    assert f["A"].m_as("mm^2") == pytest.approx(100 * 50, rel=1e-12)
    assert f["I_x"].m_as("mm^4") == pytest.approx(100 * 50**3 / 12, rel=1e-12)
    assert f["I_y"].m_as("mm^4") == pytest.approx(50 * 100**3 / 12, rel=1e-12)


def test_mirroring_a_part_up_down_keeps_its_second_moments_and_negates_their_product():
    # reflection in a horizontal line: y → −y, so ∬y² dA and ∬x² dA are unchanged and ∬xy dA changes sign
    # (common practice)
    r = calcsheet.run('L1 = section.angle(h=100 mm, b=75 mm, t=10 mm, detail="brief")\n'
                      'a = section.built_up(parts=[section.part(shape=L1, x=0 mm, y=0 mm)])\n'
                      'b = section.built_up(parts=[section.part(shape=L1, x=0 mm, y=0 mm, mirror="up-down")])\n')
    assert r.ok, r.diagnostics
    a, b = r.values["a"].fields, r.values["b"].fields
    for k in ("A", "I_x", "I_y", "x_c"):
        assert b[k].magnitude == pytest.approx(a[k].magnitude, rel=1e-12)
    assert b["I_xy"].m_as("mm^4") == pytest.approx(-a["I_xy"].m_as("mm^4"), rel=1e-12)
    assert a["I_xy"].m_as("mm^4") != 0
    # both stand on y = 0 (the default anchor): the mirrored centroid is as far below the 100 mm leg's top as the
    # original's is above its bottom
    assert b["y_c"].m_as("mm") == pytest.approx(100.0 - a["y_c"].m_as("mm"), rel=1e-12)
    # the parts table of the product of area says the same: its own-product column is the part's mirrored I_xy
    for name, rec in (("a", a), ("b", b)):
        (foot,) = table(r.values[name], "Parts table: product of area").footer
        assert foot[1].m_as("mm^4") + foot[4].m_as("mm^4") == pytest.approx(rec["I_xy"].m_as("mm^4"), rel=1e-9)


def test_parts_all_of_the_reference_material_make_no_transformed_section():
    # E_ref given, but every part is of that material (n = 1 for each): the section is the plain one
    r = calcsheet.run("w1 = section.part(shape=section.rectangle(b=100 mm, h=200 mm), x=0 mm, y=0 mm)\n"
                      "w2 = section.part(shape=section.rectangle(b=100 mm, h=50 mm), x=0 mm, y=200 mm)\n"
                      "c = section.built_up(parts=[w1, w2], E_ref=10 GPa)\n")
    assert r.ok, r.diagnostics
    rec = r.values["c"]
    assert "n_max" not in rec.fields
    assert not any("Transformed section" in str(getattr(i, "text", "")) for i in rec.working.items)
    assert rec.fields["I_x"].m_as("mm^4") == pytest.approx(100 * 250**3 / 12, rel=1e-12)  # one 100 × 250 block


def test_the_least_radius_of_gyration_of_a_small_square_is_a_side_over_root_twelve():
    # r = √(I/A) = √((a⁴/12)/a²) = a/√12 for a square of side a (common practice), here a = 1 mm: I₂ < 1 mm⁴
    f = record("section.rectangle(b=1 mm, h=1 mm)").fields
    assert f["r_min"].m_as("mm") == pytest.approx(1 / 12**0.5, rel=1e-12)
    # and the plain-Python pass that drawings read (properties()) gives the same, not a clamped one
    from calcsheet_plugins.section import properties as PR, shapes as S
    assert PR.properties(S.rectangle(1.0, 1.0))["r_min"] == pytest.approx(1 / 12**0.5, rel=1e-12)


def test_the_first_moment_above_the_centroid_of_a_triangle_with_a_unit_rise_edge():
    # right triangle, base b = 10 mm on the x axis, apex 1 mm above the origin: the part above the centroid
    # (y = h/3) is a similar triangle of height 2h/3 and base 2b/3, its centroid 2h/9 above the axis, so
    # Q = (½·(2b/3)·(2h/3))·(2h/9) = 4bh²/81 (statics); its sloping edge rises exactly 1 mm
    f = record("section.polygon(points=[(0 mm, 0 mm), (10 mm, 0 mm), (0 mm, 1 mm)])").fields
    assert f["y_c"].m_as("mm") == pytest.approx(1 / 3, rel=1e-12)
    assert f["Q_x"].m_as("mm^3") == pytest.approx(4 * 10 * 1**2 / 81, rel=1e-9)


def test_the_eurocode_names_are_the_same_values_as_their_counterparts():
    # EN 1993-1-1 notation (y major, z minor axis): I_t = J, I_w = C_w, i_y = r_x, W_el,y = S_x … (from memory)
    from calcsheet_plugins.section.fields import ALIASES

    for text in ("section.ishape(h=300 mm, b=150 mm, t_f=10.7 mm, t_w=7.1 mm)",
                 "section.channel(h=200 mm, b=75 mm, t_f=11.5 mm, t_w=8.5 mm)"):
        f = record(text).fields
        for alias, base in ALIASES.items():
            assert alias in f and base in f, (text, alias, base)
            assert f[alias].m_as(f[base].units) == pytest.approx(f[base].magnitude, rel=1e-12), (alias, base)


def test_parts_a_micrometre_apart_are_in_contact():
    # a drawing states dimensions to 0.1 mm at best; a 0.001 mm gap between a flange and a web is contact, not
    # two separate pieces (common practice)
    r = calcsheet.run("a = section.part(shape=section.rectangle(b=100 mm, h=20 mm), x=0 mm, y=0 mm, "
                      'anchor="bottom-centre")\n'
                      "b = section.part(shape=section.rectangle(b=10 mm, h=200 mm), x=0 mm, y=20.001 mm, "
                      'anchor="bottom-centre")\n'
                      "g = section.built_up(parts=[a, b])\n")
    assert r.ok and not [d for d in r.diagnostics if "not connected" in d.message], r.diagnostics


def test_the_parts_tables_of_an_angle_add_up_to_its_second_moments():
    # an angle's legs lie off both centroidal axes: each footer is the sum of its column, and the total is the
    # section's own I (parallel-axis theorem, common practice)
    rec = record("section.angle(h=100 mm, b=75 mm, t=10 mm)")
    for start, field in (("Parts table: second moments about the centroidal x axis", "I_x"),
                         ("Parts table: second moments about the centroidal y axis", "I_y")):
        t = table(rec, start)
        (foot,) = t.footer
        for col in (1, 3, 4):
            assert foot[col].m_as("mm^4") == pytest.approx(sum(row[col].m_as("mm^4") for row in t.rows), rel=1e-9)
        assert foot[3].m_as("mm^4") > 0  # the legs' own offsets count
        assert foot[4].m_as("mm^4") == pytest.approx(rec.fields[field].m_as("mm^4"), rel=1e-9)


def test_a_section_of_one_material_says_nothing_of_a_transformed_section():
    rec = record("section.rectangle(b=100 mm, h=200 mm)")
    assert not any("transformed" in str(getattr(i, "text", "")).lower() for i in rec.working.items)


def test_a_part_wholly_inside_another_is_refused_as_overlapping():
    # an angle placed inside a 200 × 200 mm plate: no edges cross, and the angle's centroid lies outside its own
    # material (in the corner between its legs), yet every point of the angle is plate: its material would count
    # twice (A would be 40 000 + 1 650 mm²)
    r = calcsheet.run("p = section.part(shape=section.rectangle(b=200 mm, h=200 mm), x=0 mm, y=0 mm)\n"
                      'a = section.part(shape=section.angle(h=100 mm, b=75 mm, t=10 mm, detail="brief"), '
                      "x=50 mm, y=50 mm)\n"
                      "g = section.built_up(parts=[p, a])\n")
    (err,) = r.errors
    assert "overlap" in err.message and "g" not in r.values


def test_a_bar_in_the_hole_of_a_tube_is_not_an_overlap():
    # the tube's material is its wall: a 100 mm bar inside its 180 mm bore shares no material with it
    r = calcsheet.run('t = section.part(shape=section.tube(d=200 mm, t=10 mm), x=0 mm, y=0 mm, anchor="centre")\n'
                      'c = section.part(shape=section.circle(d=100 mm), x=0 mm, y=0 mm, anchor="centre")\n'
                      "g = section.built_up(parts=[t, c])\n")
    assert not r.errors, [e.message for e in r.errors]
    assert r.values["g"].fields["A"].m_as("mm^2") == pytest.approx(
        3.141592653589793 / 4 * (200**2 - 180**2 + 100**2), rel=1e-12)  # π/4·(D² − d² + d_bar²)


def test_a_mirrored_triangle_part_has_the_opposite_product_of_area_in_its_parts_table_too():
    # right triangle, legs b = 60 mm along x and h = 90 mm along y: I_xy about its centroid is −b²h²/72 with the
    # right angle at the lower left (a standard table of plane areas; from memory); mirrored up-down, +b²h²/72.
    # Its parts (the fan's triangles) carry their own products, which the mirror must turn over as well
    pts = "points=[(0 mm, 0 mm), (60 mm, 0 mm), (0 mm, 90 mm)]"
    r = calcsheet.run(f"T = section.polygon({pts})\n"
                      "a = section.built_up(parts=[section.part(shape=T, x=0 mm, y=0 mm)])\n"
                      'b = section.built_up(parts=[section.part(shape=T, x=0 mm, y=0 mm, mirror="up-down")])\n')
    assert r.ok, r.diagnostics
    want = 60**2 * 90**2 / 72
    assert r.values["a"].fields["I_xy"].m_as("mm^4") == pytest.approx(-want, rel=1e-9)
    assert r.values["b"].fields["I_xy"].m_as("mm^4") == pytest.approx(want, rel=1e-9)
    (foot,) = table(r.values["b"], "Parts table: product of area").footer
    assert foot[1].m_as("mm^4") + foot[4].m_as("mm^4") == pytest.approx(want, rel=1e-9)
