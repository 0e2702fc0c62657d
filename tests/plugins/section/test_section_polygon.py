"""The outline geometry the section checks rest on, against shapely and closed forms."""
import numpy as np
import pytest
from shapely.geometry import Point, Polygon

from calcsheet_plugins.section import polygon as P

# a non-convex outline away from the origin (so every offset in the formulas matters)
OUTLINE = [(10.0, 20.0), (70.0, 25.0), (60.0, 80.0), (40.0, 45.0), (15.0, 70.0)]


def test_point_in_ring_agrees_with_shapely():
    ring = P.make_ring(OUTLINE)
    rng = np.random.default_rng(19)
    px, py = rng.uniform(0, 80, 4000), rng.uniform(10, 90, 4000)
    poly = Polygon(OUTLINE)
    ours = P.point_in_ring(px, py, ring)
    theirs = np.array([poly.contains(Point(x, y)) for x, y in zip(px, py)])
    near_edge = np.array([poly.exterior.distance(Point(x, y)) < 1e-9 for x, y in zip(px, py)])
    assert (ours == theirs)[~near_edge].all()
    assert ours.sum() > 500 and (~ours).sum() > 500  # both kinds really tested


def test_a_region_smaller_than_one_square_unit_is_still_a_region():
    # right triangle with 1 mm legs: A = 1/2, centroid (1/3, 1/3), I_x = b·h³/36 (any section handbook)
    c = P.centroidal(P.region_moments([P.make_ring([(0.0, 0.0), (1.0, 0.0), (0.0, 1.0)])]))
    assert c.A == pytest.approx(0.5) and c.x_c == pytest.approx(1 / 3) and c.y_c == pytest.approx(1 / 3)
    assert c.I_x == pytest.approx(1 / 36)
    assert P.polygon_properties(np.array([0.0, 1.0, 0.0]), np.array([0.0, 0.0, 1.0])).A == pytest.approx(0.5)


SQUARE = [(0.0, 0.0), (1.0, 0.0), (1.0, 1.0), (0.0, 1.0)]
ON_TOP = [(0.5, 1.0), (1.0, 2.0), (0.0, 2.0)]  # a triangle standing on the square's top edge by one vertex


@pytest.mark.parametrize("flip_a", [False, True])
@pytest.mark.parametrize("flip_b", [False, True])
def test_outlines_that_only_touch_do_not_cross(flip_a, flip_b):
    a = P.make_ring(SQUARE[::-1] if flip_a else SQUARE)
    b = P.make_ring(ON_TOP[::-1] if flip_b else ON_TOP)
    for tol in (0.0, 1e-6):
        assert not P.segments_cross(a, b, tol) and not P.segments_cross(b, a, tol)
    # shapely agrees: they touch, they do not overlap
    assert Polygon(SQUARE).touches(Polygon(ON_TOP))


def test_outlines_that_overlap_cross():
    a = P.make_ring(SQUARE)
    b = P.make_ring([(0.5, 0.5), (1.5, 0.5), (1.5, 1.5), (0.5, 1.5)])
    for tol in (0.0, 1e-6):
        assert P.segments_cross(a, b, tol) and P.segments_cross(b, a, tol)
    assert Polygon(SQUARE).overlaps(Polygon([(0.5, 0.5), (1.5, 0.5), (1.5, 1.5), (0.5, 1.5)]))


@pytest.mark.parametrize("inner", [
    [(0.5, 0.0), (0.8, 0.5), (0.2, 0.5)],   # a vertex on the bottom edge, the rest inside
    [(0.2, 0.3), (0.5, 1.0), (0.3, 0.6)],   # a vertex on the top edge
    [(0.0, 0.5), (0.6, 0.3), (0.6, 0.7)],   # a vertex on the left edge
])
def test_an_outline_inside_another_touching_it_at_a_vertex_does_not_cross_it(inner):
    a, b = P.make_ring(SQUARE), P.make_ring(inner)
    for tol in (0.0, 1e-6):
        assert not P.segments_cross(a, b, tol) and not P.segments_cross(b, a, tol)
    assert Polygon(SQUARE).contains(Polygon(inner))  # shapely: inside, boundaries meet at a point


def _rect(x0, y0, b, h, sign=1, n=1.0):
    return P.make_ring([(x0, y0), (x0 + b, y0), (x0 + b, y0 + h), (x0, y0 + h)], sign, n)


def test_many_rings_weighted_against_the_closed_form_of_each_rectangle():
    # five plates, one of them of another material (n = 3), and two holes: moments about the origin,
    # each rectangle by b·h, A·y_c, b·h³/12 + A·y_c², A·x_c·y_c (any section handbook)
    rects = [(0, 0, 300, 20, 1, 1.0), (140, 20, 10, 300, 1, 1.0), (0, 320, 300, 20, 1, 1.0),
             (0, 340, 300, 12, 1, 3.0), (400, 0, 50, 50, 1, 1.0), (40, 2, 22, 16, -1, 1.0), (410, 10, 30, 30, -1, 1.0)]
    want = np.zeros(6)
    for x0, y0, b, h, sign, n in rects:
        A, xc, yc = b * h, x0 + b / 2, y0 + h / 2
        want += sign * n * np.array([A, A * yc, A * xc, b * h**3 / 12 + A * yc**2, h * b**3 / 12 + A * xc**2,
                                     A * xc * yc])
    got = P.region_moments([_rect(*r) for r in rects])
    assert np.allclose(got.astuple(), want, rtol=1e-12)
    unweighted = P.region_moments([_rect(*r) for r in rects], weighted=False)
    assert unweighted.A == pytest.approx(sum(s * b * h for _, _, b, h, s, _ in rects), rel=1e-12)
