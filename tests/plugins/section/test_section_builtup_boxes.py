"""The box test in front of the built-up overlap test gives the answer the full test gives.

``builtup._deep`` lets a pair of parts skip the overlap test when their boxes overlap by no more than the
tolerance along x or along y (parts stacked edge to edge). Held here: for random star-shaped outlines placed
so, the full test (``builtup._overlap``) also finds no overlap; and for pairs the box test lets through,
shapely (an independent library) agrees with the full test wherever the overlap is clear of the tolerance.
"""
import math

import numpy as np
import pytest
import shapely
from hypothesis import given, settings, strategies as st

from calcsheet_plugins.section import builtup as B
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
