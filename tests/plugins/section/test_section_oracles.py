"""Independent libraries as oracles: sympy, scipy and shapely.

Fixed shapes first, then random simple polygons with hypothesis and the
properties any correct integration must have (translation, parallel axes,
rotation invariance of I_x + I_y, additivity over parts).
"""
import math

import numpy as np
import pytest
import shapely
import sympy as sp
from hypothesis import given, settings, strategies as st
from scipy import integrate

from calcsheet_plugins.section import builtup as B
from calcsheet_plugins.section import polygon as P
from calcsheet_plugins.section import properties as PR
from calcsheet_plugins.section import shapes as S


# ---------------------------------------------------------------- sympy: exact integration


def test_tee_against_sympy_exact_integration():
    """∬ y² dA over the tee's two rectangles, integrated symbolically (exact rationals)."""
    h, b, tf, tw = 200, 150, 12, 10
    x, y = sp.symbols("x y")
    x1, x2 = sp.Rational(b - tw, 2), sp.Rational(b + tw, 2)
    regions = [((0, b), (h - tf, h)), ((x1, x2), (0, h - tf))]

    def integral(f):
        return sum(sp.integrate(f, (y, ya, yb), (x, xa, xb)) for (xa, xb), (ya, yb) in regions)

    A = integral(1)
    yc = integral(y) / A
    Ix = integral((y - yc) ** 2)
    p = PR.properties(S.tee(float(h), float(b), float(tf), float(tw)))
    assert p["A"] == pytest.approx(float(A), rel=1e-14)
    assert p["y_c"] == pytest.approx(float(yc), rel=1e-14)
    assert p["I_x"] == pytest.approx(float(Ix), rel=1e-12)
    # the plastic axis halves the area: solve ∬_{y>c} dA = A/2 exactly, c in the stem
    c = sp.symbols("c")
    above = b * tf + tw * (h - tf - c)
    c_exact = sp.solve(sp.Eq(above, A / 2), c)[0]
    Zx_sym = (
        sp.integrate(y - c_exact, (y, h - tf, h)) * b + sp.integrate(y - c_exact, (y, c_exact, h - tf)) * tw
        + sp.integrate(c_exact - y, (y, 0, c_exact)) * tw)
    assert p["y_p"] == pytest.approx(float(c_exact), rel=1e-13)
    assert p["Z_x"] == pytest.approx(float(Zx_sym), rel=1e-12)


@pytest.mark.parametrize("points", [
    [(0, 0), (120, 0), (120, 15), (15, 15), (15, 90), (0, 90)],  # an angle as a polygon
    [(0, 0), (60, -10), (100, 40), (50, 80), (10, 50)],  # irregular convex
    [(0, 0), (100, 0), (100, 100), (70, 100), (50, 30), (30, 100), (0, 100)],  # notched, non-convex
])
def test_polygons_against_sympy_geometry(points):
    poly = sp.Polygon(*[sp.Point(sp.Rational(px), sp.Rational(py)) for px, py in points])
    area = abs(poly.area)
    cen = poly.centroid
    Ixx, Iyy, Ixy = poly.second_moment_of_area()  # about the centroid (sympy's convention: I_xy = ∬ x y dA)
    p = PR.properties(S.polygon([(float(a), float(b)) for a, b in points]))
    sgn = 1 if poly.area > 0 else -1  # sympy's moments carry the orientation's sign
    assert p["A"] == pytest.approx(float(area), rel=1e-13)
    assert p["x_c"] == pytest.approx(float(cen.x), rel=1e-12)
    assert p["y_c"] == pytest.approx(float(cen.y), rel=1e-12)
    assert p["I_x"] == pytest.approx(float(sgn * Ixx), rel=1e-12)
    assert p["I_y"] == pytest.approx(float(sgn * Iyy), rel=1e-12)
    assert p["I_xy"] == pytest.approx(float(sgn * Ixy), rel=1e-11, abs=1e-9 * float(abs(Ixx)))


# ---------------------------------------------------------------- scipy: quadrature


def test_semicircle_against_scipy_quadrature():
    r = 50.0
    d = 2 * r
    p = PR.properties(S.semicircle(d))
    # region: 0 ≤ y ≤ √(r² − (x − r)²), 0 ≤ x ≤ 2r
    top = lambda x: math.sqrt(max(r * r - (x - r) ** 2, 0.0))  # noqa: E731
    A, _ = integrate.dblquad(lambda y, x: 1.0, 0, d, 0, top)
    Sx, _ = integrate.dblquad(lambda y, x: y, 0, d, 0, top)
    yc = Sx / A
    Ix, _ = integrate.dblquad(lambda y, x: (y - yc) ** 2, 0, d, 0, top)
    Iy, _ = integrate.dblquad(lambda y, x: (x - r) ** 2, 0, d, 0, top)
    assert p["A"] == pytest.approx(A, rel=1e-8)
    assert p["y_c"] == pytest.approx(yc, rel=1e-8)
    assert p["I_x"] == pytest.approx(Ix, rel=1e-8)
    assert p["I_y"] == pytest.approx(Iy, rel=1e-8)
    # outline-based properties sit on the 2048-gon: within its discretisation error
    Zq, _ = integrate.dblquad(lambda y, x: abs(y - p["y_p"]), 0, d, 0, top)
    above, _ = integrate.dblquad(lambda y, x: 1.0, 0, d, lambda x: min(p["y_p"], top(x)), top)
    assert above == pytest.approx(A / 2, rel=2e-5)
    assert p["Z_x"] == pytest.approx(Zq, rel=2e-5)


def test_tube_plastic_and_shear_against_quadrature():
    d, t = 100.0, 8.0
    ro, ri = d / 2, d / 2 - t
    p = PR.properties(S.tube(d, t=t))
    # Q above the centroid: ∫_0^ro y·w(y) dy with w the chord width of the ring
    w = lambda y: 2 * math.sqrt(max(ro**2 - y**2, 0)) - 2 * math.sqrt(max(ri**2 - y**2, 0))  # noqa: E731
    Q, _ = integrate.quad(lambda y: y * w(y), 0, ro, points=[ri], limit=200)
    assert p["Q_x"] == pytest.approx(Q, rel=2e-5)
    assert p["Z_x"] == pytest.approx(2 * Q, rel=2e-5)  # doubly symmetric: Z = 2Q


# ---------------------------------------------------------------- shapely: area and centroid


def test_built_up_with_holes_against_shapely():
    beam = B.place(S.ishape(400.0, 200.0, 16.0, 10.0), 0.0, 0.0, "bottom-centre")
    plate = B.place(S.rectangle(260.0, 40.0), 0.0, 400.0, "bottom-centre")
    holes = [B.place(S.rectangle(22.0, 40.0), x, 420.0, "centroid") for x in (-90.0, 90.0)]
    web_hole = B.place(S.circle(24.0), 0.0, 420.0, "centroid")  # a duct through the thick plate
    parts = [B.Placed("beam", "part", beam), B.Placed("plate", "part", plate)] + [
        B.Placed(f"h{k}", "hole", h) for k, h in enumerate(holes + [web_hole])]
    asm = B.assemble(parts)
    p = PR.properties(asm.shape)
    g = shapely.union_all([shapely.Polygon(np.column_stack([r.x, r.y])) for r in beam.rings + plate.rings])
    for h in holes + [web_hole]:
        g = g.difference(shapely.Polygon(np.column_stack([h.rings[0].x, h.rings[0].y])))
    assert PR.green(asm.shape.rings).A == pytest.approx(g.area, rel=1e-12)
    assert p["A"] == pytest.approx(g.area, rel=5e-5)  # tabular uses the exact circle, shapely the 2048-gon
    assert p["x_c"] == pytest.approx(g.centroid.x, abs=1e-6)
    assert p["y_c"] == pytest.approx(g.centroid.y, rel=5e-6)


# ---------------------------------------------------------------- random polygons (hypothesis)


@st.composite
def star_polygons(draw, max_n=24):
    """Simple polygons: vertices at increasing angles around a centre, every angular gap below π, so the
    centre sees the whole outline (star-shaped, never self-crossing)."""
    n = draw(st.integers(4, max_n))
    gaps = draw(st.lists(st.floats(0.5, 1.0), min_size=n, max_size=n))
    radii = draw(st.lists(st.floats(5.0, 200.0), min_size=n, max_size=n))
    cx, cy = draw(st.floats(-300, 300)), draw(st.floats(-300, 300))
    ang = np.cumsum(gaps) / np.sum(gaps) * 2 * math.pi
    pts = np.column_stack([cx + np.array(radii) * np.cos(ang), cy + np.array(radii) * np.sin(ang)])
    assert shapely.Polygon(pts).is_valid
    return pts


def _basic(pts):
    return P.polygon_properties(pts[:, 0], pts[:, 1])


@settings(max_examples=60, deadline=None)
@given(star_polygons())
def test_random_polygon_area_and_centroid_match_shapely(pts):
    c = _basic(pts)
    g = shapely.Polygon(pts)
    assert c.A == pytest.approx(g.area, rel=1e-9)
    assert c.x_c == pytest.approx(g.centroid.x, abs=1e-7 * (1 + abs(g.centroid.x)))
    assert c.y_c == pytest.approx(g.centroid.y, abs=1e-7 * (1 + abs(g.centroid.y)))


@settings(max_examples=60, deadline=None)
@given(star_polygons(), st.floats(-500, 500), st.floats(-500, 500))
def test_translation_moves_only_the_centroid(pts, dx, dy):
    a, b = _basic(pts), _basic(pts + [dx, dy])
    scale = a.I_x + a.I_y
    assert b.A == pytest.approx(a.A, rel=1e-9)
    assert b.x_c == pytest.approx(a.x_c + dx, abs=1e-7 * (1 + abs(a.x_c) + abs(dx)))
    assert b.y_c == pytest.approx(a.y_c + dy, abs=1e-7 * (1 + abs(a.y_c) + abs(dy)))
    for u, v in ((a.I_x, b.I_x), (a.I_y, b.I_y), (a.I_xy, b.I_xy)):
        assert v == pytest.approx(u, abs=1e-8 * scale)


@settings(max_examples=60, deadline=None)
@given(star_polygons(), st.floats(-400, 400))
def test_parallel_axis_theorem(pts, y0):
    c = _basic(pts)
    ring = P.make_ring(pts)
    m = P.ring_moments(ring.x, ring.y)
    I_about_y0 = m.Ixx - 2 * y0 * m.Sx + y0 * y0 * m.A  # ∬(y − y0)² dA, directly
    assert I_about_y0 == pytest.approx(c.I_x + c.A * (c.y_c - y0) ** 2, rel=1e-8)


@settings(max_examples=60, deadline=None)
@given(star_polygons(), st.floats(0, 2 * math.pi))
def test_polar_moment_is_invariant_under_rotation(pts, theta):
    c = _basic(pts)
    R = np.array([[math.cos(theta), -math.sin(theta)], [math.sin(theta), math.cos(theta)]])
    r = _basic(pts @ R.T)
    assert r.I_x + r.I_y == pytest.approx(c.I_x + c.I_y, rel=1e-9)
    # and the rotated moments follow the transformation equations (Gere, moments of inertia of plane areas)
    s2, c2 = math.sin(2 * theta), math.cos(2 * theta)
    expected_Ix = (c.I_x + c.I_y) / 2 + (c.I_x - c.I_y) / 2 * c2 + c.I_xy * s2
    assert r.I_x == pytest.approx(expected_Ix, abs=1e-8 * (c.I_x + c.I_y))


@settings(max_examples=40, deadline=None)
@given(star_polygons(), st.floats(0.05, 0.95))
def test_cutting_a_polygon_in_two_keeps_the_totals(pts, frac):
    ring = P.make_ring(pts)
    c = float(ring.y.min() + frac * np.ptp(ring.y))
    total = P.region_moments([ring])
    above = P._moments_above([ring], c)
    # the part below, as the region above the line for the mirrored polygon
    mirrored = P.make_ring(np.column_stack([ring.x, -ring.y]))
    below = P._moments_above([mirrored], -c)
    assert above.A + below.A == pytest.approx(total.A, rel=1e-9)
    # shapely cuts the same polygon at the same line
    g = shapely.Polygon(pts)
    box = shapely.box(-1e4, c, 1e4, 1e4)
    assert above.A == pytest.approx(g.intersection(box).area, rel=1e-7, abs=1e-7 * total.A)
    # first moments about the cut: above counts +, below (mirrored) also +; their difference is ∬(y − c) dA
    assert above.Sx - below.Sx == pytest.approx(total.Sx - c * total.A, abs=1e-7 * abs(total.A) * np.ptp(ring.y))


@settings(max_examples=25, deadline=None)
@given(st.floats(20, 400), st.floats(20, 400), st.floats(0.1, 0.9), st.sampled_from(B.ANCHORS[:-1]))
def test_splitting_a_rectangle_into_parts_gives_the_same_section(b, h, frac, anchor):
    whole = PR.properties(S.rectangle(b, h))
    h1 = frac * h
    lower = B.place(S.rectangle(b, h1), 0.0, 0.0)
    upper = B.place(S.rectangle(b, h - h1), 0.0, h1)
    asm = B.assemble([B.Placed("lower", "part", lower), B.Placed("upper", "part", upper)])
    split = PR.properties(asm.shape)
    assert not asm.warnings
    for key in ("A", "x_c", "y_c", "I_x", "I_y", "Z_x", "Z_y", "Q_x", "S_x_top", "r_min"):
        assert split[key] == pytest.approx(whole[key], rel=1e-9)


def test_rotating_a_part_by_90_degrees_swaps_its_axes():
    a = PR.properties(S.ishape(300.0, 150.0, 10.7, 7.1))
    turned = B.place(S.ishape(300.0, 150.0, 10.7, 7.1), 0.0, 0.0, rotate=math.pi / 2)
    b = PR.properties(B.assemble([B.Placed("I", "part", turned)]).shape)
    assert b["I_x"] == pytest.approx(a["I_y"], rel=1e-12)
    assert b["I_y"] == pytest.approx(a["I_x"], rel=1e-12)
    assert b["Z_x"] == pytest.approx(a["Z_y"], rel=1e-12)


def test_mirroring_an_angle_flips_the_product_of_area():
    a = PR.properties(S.angle(150.0, 12.0, b=90.0))
    flipped = B.place(S.angle(150.0, 12.0, b=90.0), 0.0, 0.0, mirror="left-right")
    b = PR.properties(B.assemble([B.Placed("L", "part", flipped)]).shape)
    assert b["I_xy"] == pytest.approx(-a["I_xy"], rel=1e-12)
    assert b["I_1"] == pytest.approx(a["I_1"], rel=1e-12)
