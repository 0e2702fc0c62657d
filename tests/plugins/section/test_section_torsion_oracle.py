"""Torsion, warping and the shear centre against an independent finite-element warping analysis.

The oracle is sectionproperties (MIT licence; a test-only dependency), meshing the same outline coarsely (a few
hundred elements: its own discretisation error is below 0.5 % here). Our values come from closed forms, named
beside each check, so the comparison also shows what those closed forms leave out (fillets, in thin-walled J).
"""
import math

import numpy as np
import pytest

from calcsheet_plugins.section import fillets as FL
from calcsheet_plugins.section import shapes as S

sp = pytest.importorskip("sectionproperties")
shapely = pytest.importorskip("shapely")
from sectionproperties.analysis import Section  # noqa: E402
from sectionproperties.pre.geometry import Geometry  # noqa: E402


def fe(shape, mesh):
    outer = [r for r in shape.rings if r.sign > 0][0]
    holes = [np.column_stack([r.x, r.y]) for r in shape.rings if r.sign < 0]
    poly = shapely.Polygon(np.column_stack([outer.x, outer.y]), holes).simplify(0.05)
    g = Geometry(poly)
    g.create_mesh(mesh_sizes=[mesh])
    s = Section(g)
    s.calculate_geometric_properties()
    s.calculate_warping_properties()
    return s


def traced(run, text):
    r = run(f"s = {text}\n")
    assert not [d for d in r.diagnostics if d.severity == "error"], r.diagnostics
    return {k: v for k, v in r.values["s"].fields.items()}


def mm(q, u="mm"):
    return q.m_as(u)


def test_rolled_I_with_fillets(run):
    # IPE 300 geometry (EN 10365): J by El Darwish & Johnston, C_w = I_y·h_o²/4 (AISC 360-16 F2 user note)
    f = traced(run, "section.ishape(h=300 mm, b=150 mm, t_f=10.7 mm, t_w=7.1 mm, r=15 mm)")
    s = fe(FL.ishape(300.0, 150.0, 10.7, 7.1, 15.0), 80)
    assert mm(f["J"], "mm^4") == pytest.approx(s.get_j(), rel=0.01)
    assert mm(f["C_w"], "mm^6") == pytest.approx(s.get_gamma(), rel=0.02)
    assert mm(f["C_w"], "mm^6") == pytest.approx(mm(f["I_y"], "mm^4") * (300 - 10.7) ** 2 / 4, rel=1e-12)
    xs, ys = s.get_sc()
    assert (mm(f["x_s"]), mm(f["y_s"])) == pytest.approx((xs, ys), abs=0.05)


def test_channel(run):
    # shear centre e_o and C_w by the thin-walled closed forms (AISC Design Guide 9, Appendix C)
    f = traced(run, "section.channel(h=200 mm, b=75 mm, t_f=11.5 mm, t_w=8.5 mm, r=11.5 mm)")
    s = fe(FL.channel(200.0, 75.0, 11.5, 8.5, 11.5), 30)
    xs, ys = s.get_sc()
    assert mm(f["x_s"]) == pytest.approx(xs, abs=0.02 * 75)
    assert mm(f["y_s"]) == pytest.approx(ys, abs=0.01)
    assert mm(f["C_w"], "mm^6") == pytest.approx(s.get_gamma(), rel=0.02)
    # the thin-walled J ignores the fillets: below the FE value, by under 10 % here
    assert 0.9 * s.get_j() < mm(f["J"], "mm^4") < s.get_j()


def test_tee(run):
    f = traced(run, "section.tee(h=150 mm, b=150 mm, t_f=12 mm, t_w=8 mm, r=10 mm)")
    s = fe(FL.tee(150.0, 150.0, 12.0, 8.0, 10.0), 30)
    xs, ys = s.get_sc()
    assert (mm(f["x_s"]), mm(f["y_s"])) == pytest.approx((xs, ys), abs=0.01 * 150)
    assert mm(f["J"], "mm^4") == pytest.approx(s.get_j(), rel=0.02)
    assert mm(f["C_w"], "mm^6") == pytest.approx(s.get_gamma(), rel=0.03)  # closed form ignores the fillets
    beta_fe = s.section_props.beta_x_plus
    assert abs(mm(f["beta_x"])) == pytest.approx(abs(beta_fe), rel=0.02)


def test_angle(run):
    f = traced(run, "section.angle(h=100 mm, b=100 mm, t=10 mm, r=12 mm)")
    s = fe(FL.angle(100.0, 100.0, 10.0, 12.0), 20)
    xs, ys = s.get_sc()
    assert (mm(f["x_s"]), mm(f["y_s"])) == pytest.approx((xs, ys), abs=0.01 * 100)
    assert mm(f["C_w"], "mm^6") == pytest.approx(s.get_gamma(), rel=0.03)
    assert 0.9 * s.get_j() < mm(f["J"], "mm^4") < s.get_j()  # thin-walled legs, fillet ignored


def test_box_with_corner_radii_by_bredt(run):
    # Bredt–Batho J = 4·A_m²·t/p + p·t³/3 on the rounded mid-line (EN 10210-2 Annex form)
    f = traced(run, "section.box(b=100 mm, h=150 mm, t=6.3 mm, r_out=9.45 mm, r_in=6.3 mm)")
    s = fe(FL.box(100.0, 150.0, 6.3, 9.45, 6.3), 80)
    assert mm(f["J"], "mm^4") == pytest.approx(s.get_j(), rel=0.02)
    assert (mm(f["x_s"]), mm(f["y_s"])) == pytest.approx(s.get_sc(), abs=0.1)
    t, Rc = 6.3, (9.45 + 6.3) / 2
    p = 2 * ((100 - t) + (150 - t)) - 2 * Rc * (4 - math.pi)
    Am = (100 - t) * (150 - t) - Rc**2 * (4 - math.pi)
    assert mm(f["J"], "mm^4") == pytest.approx(4 * Am**2 * t / p + p * t**3 / 3, rel=1e-12)


def test_tube(run):
    f = traced(run, "section.tube(d=168.3 mm, t=6.3 mm)")
    s = fe(S.tube(168.3, 6.3), 60)
    assert mm(f["J"], "mm^4") == pytest.approx(s.get_j(), rel=0.01)
    assert mm(f["J"], "mm^4") == pytest.approx(math.pi * (168.3**4 - 155.7**4) / 32, rel=1e-12)  # exact


def test_unequal_flange_I_monosymmetry_and_shear_centre(run):
    # C_w = h_o²·I_t·I_b/(I_t + I_b) (AISC Design Guide 9); β_x integrated exactly over the outline
    f = traced(run, "section.ishape(h=400 mm, b=200 mm, t_f=16 mm, t_w=10 mm, b_bot=120 mm, t_fb=12 mm)")
    s = fe(S.ishape(400.0, 200.0, 16.0, 10.0, 120.0, 12.0), 60)
    assert mm(f["y_s"]) == pytest.approx(s.get_sc()[1], abs=0.01 * 400)
    assert mm(f["C_w"], "mm^6") == pytest.approx(s.get_gamma(), rel=0.02)
    assert abs(mm(f["beta_x"])) == pytest.approx(abs(s.section_props.beta_x_plus), rel=0.01)
    assert mm(f["beta_x"]) < 0  # y up, the larger flange on top


def test_unequal_flange_I_with_root_fillets(run):
    # fillets on a monosymmetric rolled I: shear centre, C_w (AISC Design Guide 9 closed form, fillets ignored) and
    # J (each flange b·t³/3 − 0.21·t⁴ plus one El Darwish & Johnston junction per flange) against the FE warping
    # analysis of the same outline
    f = traced(run, "section.ishape(h=400 mm, b=200 mm, t_f=16 mm, t_w=10 mm, b_bot=120 mm, t_fb=12 mm, r=14 mm)")
    s = fe(FL.ishape(400.0, 200.0, 16.0, 10.0, 14.0, 120.0, 12.0), 60)
    # plates plus four spandrels (1 − π/4)·r² (common practice)
    assert mm(f["A"], "mm^2") == pytest.approx(200 * 16 + 120 * 12 + 372 * 10 + 4 * (1 - math.pi / 4) * 14**2, rel=1e-7)
    assert mm(f["y_s"]) == pytest.approx(s.get_sc()[1], abs=0.01 * 400)
    assert mm(f["C_w"], "mm^6") == pytest.approx(s.get_gamma(), rel=0.03)
    assert mm(f["J"], "mm^4") == pytest.approx(s.get_j(), rel=0.03)
    assert abs(mm(f["beta_x"])) == pytest.approx(abs(s.section_props.beta_x_plus), rel=0.01)
    # with equal flanges the formula is El Darwish & Johnston's own I-section formula
    same = FL.ishape(300.0, 150.0, 10.7, 7.1, 15.0, 150.0, 10.7)
    assert same.J == pytest.approx(FL.ishape(300.0, 150.0, 10.7, 7.1, 15.0).J, rel=1e-12)


