"""The short cuts of the built-up assembly give the answers of the full tests they stand in front of.

``builtup._deep`` lets a pair of parts skip the overlap test when their boxes overlap by no more than the
tolerance along x or along y (parts stacked edge to edge). Held here: for random star-shaped outlines placed
so, the full test (``builtup._overlap``) also finds no overlap; and for pairs the box test lets through,
shapely (an independent library) agrees with the full test wherever the overlap is clear of the tolerance.
The batched point tests (every point against every ring of the nearby parts at once) equal the one-ring
tests exactly, and their distances equal shapely's.
"""
import math

import numpy as np
import pytest
import shapely
from hypothesis import given, settings, strategies as st

from calcsheet_plugins.section import builtup as B
from calcsheet_plugins.section import polygon as P
from calcsheet_plugins.section import shapes as S


@st.composite
def star_points(draw, max_n=16):
    """Vertices at increasing angles around a centre, every angular gap below π: a simple outline."""
    n = draw(st.integers(3, max_n))
    gaps = draw(st.lists(st.floats(0.5, 1.0), min_size=n, max_size=n))
    radii = draw(st.lists(st.floats(5.0, 100.0), min_size=n, max_size=n))
    turn = draw(st.floats(0.0, 2 * math.pi))
    ang = turn + np.cumsum(gaps) / np.sum(gaps) * 2 * math.pi
    return np.column_stack([np.array(radii) * np.cos(ang), np.array(radii) * np.sin(ang)])


def shape_of(pts):
    try:
        return S.polygon(pts)
    except S.ShapeError:  # a sliver the outline cleaner refuses: not a part anyone could build
        return None


def box(shape):
    return B._box(shape.rings)


TOL = 0.01  # mm: of the order the assembly uses for sections some 100 mm across (1e-4 of the size)


@settings(max_examples=150, deadline=None)
@given(star_points(), star_points(), st.floats(-1.0, 0.99), st.floats(-0.9, 0.9), st.booleans())
def test_parts_whose_boxes_overlap_by_at_most_the_tolerance_never_overlap(pa, pb, into, slide, along_x):
    a, b0 = shape_of(pa), shape_of(pb)
    if a is None or b0 is None:
        return
    ax0, ax1, ay0, ay1 = box(a)
    bx0, bx1, by0, by1 = box(b0)
    # b sits on top of a (or to its right), reaching ``into`` × TOL into a's box, and slid along the contact
    if along_x:
        dx = ax1 - bx0 - into * TOL
        dy = (ay0 + ay1) / 2 - (by0 + by1) / 2 + slide * (ay1 - ay0) / 2
    else:
        dy = ay1 - by0 - into * TOL
        dx = (ax0 + ax1) / 2 - (bx0 + bx1) / 2 + slide * (ax1 - ax0) / 2
    b = B.place(b0, bx0 + dx, by0 + dy)  # its box's bottom-left corner moved by (dx, dy)
    assert not B._deep(box(a), box(b), TOL)
    assert not B._overlap(a, b, TOL)  # the full test: no point deep inside the other, no edges crossing
    assert not B._overlap(b, a, TOL)


@settings(max_examples=100, deadline=None)
@given(star_points(), star_points(), st.floats(-60.0, 60.0), st.floats(-60.0, 60.0))
def test_where_the_boxes_overlap_deeply_the_full_test_still_decides_as_shapely_does(pa, pb, dx, dy):
    a, b = shape_of(pa), shape_of(pb + [dx, dy])
    if a is None or b is None or not B._deep(box(a), box(b), TOL):
        return
    ga, gb = shapely.Polygon(pa), shapely.Polygon(pb + [dx, dy])
    common = shapely.intersection(ga, gb).area
    if common > 1.0:  # overlapping by a square millimetre or more: clear of the tolerance
        assert B._overlap(a, b, TOL)
    elif common == 0.0 and ga.distance(gb) > TOL:
        assert not B._overlap(a, b, TOL)


def test_the_box_test_counts_overlap_along_both_axes():
    a = (0.0, 10.0, 0.0, 10.0)
    assert B._deep(a, (5.0, 15.0, 5.0, 15.0), 0.01)
    assert not B._deep(a, (5.0, 15.0, 9.995, 15.0), 0.01)  # 0.005 deep in y: touching
    assert not B._deep(a, (9.995, 15.0, 5.0, 15.0), 0.01)  # 0.005 deep in x: touching
    assert not B._deep(a, (20.0, 30.0, 0.0, 10.0), 0.01)  # apart
    assert B._deep(a, (9.98, 15.0, 5.0, 15.0), 0.01)  # 0.02 deep: the full test decides


def test_a_stack_of_plates_edge_to_edge_still_finds_a_plate_pushed_into_its_neighbour():
    plates = [B.Placed(f"plate {k}", "part", B.place(S.rectangle(300.0, 20.0), 0.0, 20.0 * k)) for k in range(5)]
    B.assemble(plates)  # edge to edge: accepted
    # plate 3 pushed 0.5 mm down into plate 2 (and 10 mm along it): its corner lies deep inside plate 2
    plates[3] = B.Placed("plate 3", "part", B.place(S.rectangle(300.0, 20.0), 10.0, 20.0 * 3 - 0.5))
    with pytest.raises(S.ShapeError, match="'plate 2' and 'plate 3' overlap"):
        B.assemble(plates)
    # pushed 0.5 mm straight down, not along: no corner inside plate 2 and no edges crossing (the sides are
    # collinear), yet 300 mm × 0.5 mm of steel would count twice; plate 3's lower edge runs inside plate 2
    plates[3] = B.Placed("plate 3", "part", B.place(S.rectangle(300.0, 20.0), 0.0, 20.0 * 3 - 0.5))
    with pytest.raises(S.ShapeError, match="'plate 2' and 'plate 3' overlap"):
        B.assemble(plates)
    assert shapely.box(-150, 40, 150, 60).intersection(shapely.box(-150, 59.5, 150, 79.5)).area == 150.0


@settings(max_examples=60, deadline=None)
@given(st.lists(star_points(), min_size=1, max_size=4), st.lists(st.floats(-120.0, 120.0), min_size=2, max_size=2))
def test_the_batched_point_tests_are_the_one_ring_tests_ring_by_ring(outlines, shift):
    rings = [P.make_ring(pts + [30.0 * k, shift[0] * (k % 2)], sign=(-1) ** k) for k, pts in enumerate(outlines)]
    rng = np.random.default_rng(len(outlines))
    px, py = rng.uniform(-150, 250, 300), rng.uniform(-150, 150, 300)
    px[:len(rings[0].x)], py[:len(rings[0].x)] = rings[0].x, rings[0].y  # vertices: on the boundary exactly
    inside, dist = P.point_in_rings(px, py, rings), P.distance_to_rings(px, py, rings)
    for j, r in enumerate(rings):
        assert np.array_equal(inside[:, j], P.point_in_ring(px, py, r))
        assert np.array_equal(dist[:, j], P.distance_to_ring(px, py, r))
    # and shapely (an independent library) agrees on the distances
    for j, r in enumerate(rings):
        ring = shapely.LinearRing(np.column_stack([r.x, r.y]))
        assert dist[:, j] == pytest.approx(shapely.distance(shapely.points(px, py), ring), abs=1e-9)


def test_holes_among_many_parts_are_assigned_as_part_by_part():
    # a hole straddling the joint of two plates of one material and one wholly in a third: the batched test of
    # the nearby parts finds the same parts as asking each part alone
    plates = [B.Placed(f"plate {k}", "part", B.place(S.rectangle(100.0, 10.0), 0.0, 10.0 * k)) for k in range(3)]
    holes = [B.Placed("across", "hole", B.place(S.rectangle(10.0, 6.0), 30.0, 10.0, "centroid"), None),
             B.Placed("inside", "hole", B.place(S.rectangle(10.0, 4.0), 70.0, 25.0, "centroid"), None)]
    asm = B.assemble(plates + holes)
    assert asm.part_of_row == [0, 1, 2, 0, 2]  # 'across' charged to the first part it cuts, 'inside' to plate 2
    pts = np.array([[30.0, 7.0], [30.0, 10.0], [70.0, 25.0], [150.0, 5.0]])
    each = B._inside_near_each(pts[:, 0], pts[:, 1], [p.shape for p in plates], 0.01)
    for k, p in enumerate(plates):
        inside, near = B._inside_near(pts[:, 0], pts[:, 1], p.shape, 0.01)
        assert np.array_equal(each[k][0], inside) and np.array_equal(each[k][1], near)
