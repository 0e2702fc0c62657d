"""Bad input and out-of-scope cases: located errors that name the clause or the parameter, never a traceback."""
import pytest

from .conftest import IPE300, W18X50, errors


@pytest.mark.parametrize("body, words", [
    # a section without the fields a check needs
    ('s = section.rectangle(b=100 mm, h=200 mm)\nb = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=1 m)',
     "form"),
    (f's = steel_design.shape(name="partial", form="I", A=10 in^2, d=12 in, b_f=6 in, t_f=0.5 in, t_w=0.3 in)\n'
     f'c = steel_design.aisc_column(section=s, F_y=50 ksi, L=10 ft)', "I_x"),
    # negative or zero lengths, negative required strengths
    (f's = steel_design.shape({W18X50})\nc = steel_design.aisc_column(section=s, F_y=50 ksi, L=0 ft)', "L"),
    (f's = steel_design.shape({W18X50})\nb = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=-2 ft)', "L_b"),
    (f's = steel_design.shape({W18X50})\nb = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=2 ft, M_rx=-5 kip*ft)',
     "M_rx"),
    # C_b given twice, and half the F1-1 moments
    (f's = steel_design.shape({W18X50})\nb = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=2 ft, C_b=1.2, '
     f'M_max=5 kip*ft, M_A=1 kip*ft, M_B=1 kip*ft, M_C=1 kip*ft)', "C_b"),
    (f's = steel_design.shape({W18X50})\nb = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=2 ft, M_max=5 kip*ft)',
     "M_A"),
    # no yield stress at all
    (f's = steel_design.shape({W18X50})\nb = steel_design.aisc_beam(section=s, L_b=2 ft)', "F_y"),
    # EN 1993: ψ outside −1…1, end moments without ψ, a hollow section
    (f's = steel_design.shape({IPE300})\nb = steel_design.ec3_beam(section=s, f_y=235 MPa, L_LT=4 m, '
     f'moment_shape="end_moments", psi=1.5)', "psi"),
    (f's = steel_design.shape({IPE300})\nb = steel_design.ec3_beam(section=s, f_y=235 MPa, L_LT=4 m, '
     f'moment_shape="end_moments")', "psi"),
    ('s = steel_design.shape(name="SHS", form="RHS", H=100 mm, B=100 mm, t=5 mm, A=1900 mm^2, I_x=2.9e6 mm^4, '
     'I_y=2.9e6 mm^4, S_x=58e3 mm^3, Z_x=68e3 mm^3, S_y=58e3 mm^3, Z_y=68e3 mm^3, J=4.6e6 mm^4)\n'
     'c = steel_design.ec3_column(section=s, f_y=355 MPa, L=3 m)', "I and H"),
])
def test_bad_input_is_a_located_error_naming_what_is_wrong(body, words):
    errs = errors(body, units="SI")
    assert errs, "expected an error"
    assert errs[0].span is not None
    assert words in errs[0].message, errs[0].message
    assert "Traceback" not in errs[0].message and "failed:" not in errs[0].message


def test_shear_buckling_beyond_72_eps_names_en_1993_1_5():
    thin = ('name="deep welded I", form="I", fabrication="welded", A=9000 mm^2, d=900 mm, b_f=250 mm, t_f=16 mm, '
            't_w=6 mm, I_x=1.2e9 mm^4, I_y=4.2e7 mm^4, S_x=2.7e6 mm^3, Z_x=3.1e6 mm^3, S_y=3.3e5 mm^3, Z_y=5.0e5 mm^3, '
            'J=8e5 mm^4, C_w=8e12 mm^6')
    errs = errors(f"s = steel_design.shape({thin})\nb = steel_design.ec3_beam(section=s, f_y=235 MPa, M_y_Ed=10 kN*m)",
                  units="SI")
    # web c/t = 868/6 = 145 > 124ε: class 4 is met first and named
    assert errs and ("class 4" in errs[0].message or "EN 1993-1-5" in errs[0].message)


def test_a_section_from_the_shape_functions_works_when_it_has_the_fields():
    # section.ishape gives d, b_f, t_f, t_w, J, C_w: a welded EN 1993 column check runs on it
    errs = errors('s = section.ishape(h=200 mm, b=200 mm, t_f=12 mm, t_w=8 mm)\n'
                  'c = steel_design.ec3_column(section=s, f_y=355 MPa, fabrication="welded", L=3 m, N_Ed=100 kN)',
                  units="SI")
    assert not errs, [e.message for e in errs]


def test_welded_I_column_uses_the_welded_buckling_curves():
    import math

    from .conftest import call, f

    rolled = call(IPE300, "ec3_column", "f_y=235 MPa, L=5 m", units="SI")  # (S355: web class 4 in compression)
    welded = call(IPE300, "ec3_column", 'f_y=235 MPa, L=5 m, fabrication="welded"', units="SI")
    lam = f(rolled["lambda_y"])

    def chi(a):  # EN 1993-1-1 (6.49)
        ph = 0.5 * (1 + a * (lam - 0.2) + lam**2)
        return min(1.0, 1 / (ph + math.sqrt(ph**2 - lam**2)))

    # Table 6.2: rolled I, h/b = 2 > 1.2, t_f ≤ 40 mm → curve a about y–y; welded I, t_f ≤ 40 mm → curve b
    assert f(rolled["chi_y"]) == pytest.approx(chi(0.21), rel=1e-12)
    assert f(welded["chi_y"]) == pytest.approx(chi(0.34), rel=1e-12)


def test_ipe300_s355_web_is_class_4_in_pure_compression():
    # Table 5.2: c/t = (300 − 2·10.7 − 2·15)/7.1 = 35.0 > 42ε = 42·√(235/355) = 34.2 → class 4 (out of scope)
    errs = errors(f"s = steel_design.shape({IPE300})\nc = steel_design.ec3_column(section=s, f_y=355 MPa, L=3 m)",
                  units="SI")
    assert errs and "class 4" in errs[0].message and "web" in errs[0].message


def test_very_slender_aisc_column_warns_at_L():
    import calcsheet

    r = calcsheet.run(f"---\nproject: t\nunits: US\n---\ns = steel_design.shape({W18X50})\n"
                      f"c = steel_design.aisc_column(section=s, F_y=50 ksi, L=40 ft)\n")
    warns = [d for d in r.diagnostics if d.severity == "warning" and "200" in d.message]
    assert warns and warns[0].span is not None   # L_c/r_y = 480/1.65 = 291 > 200 (E2 User Note)


@pytest.mark.parametrize("body, words", [
    # an angle without its principal axes, a channel without its shear centre (E4 needs them)
    ('s = steel_design.shape(name="L", form="L", A=1.94 in^2, d=4 in, b_f=4 in, t=0.25 in, I_x=3.0 in^4, '
     'I_y=3.0 in^4, S_x=1.03 in^3, S_y=1.03 in^3, J=0.0438 in^4)\nc = steel_design.aisc_column(section=s, F_y=36 ksi, '
     'L=6 ft)', "I_1"),
    ('s = steel_design.shape(name="C", form="C", A=9.96 in^2, d=15 in, b_f=3.4 in, t_f=0.65 in, t_w=0.4 in, '
     'I_x=315 in^4, I_y=8.07 in^4, S_x=42 in^3, Z_x=50.8 in^3, S_y=3.09 in^3, Z_y=6.19 in^3, J=1.01 in^4, '
     'C_w=358 in^6)\nc = steel_design.aisc_column(section=s, F_y=50 ksi, L=10 ft)', "shear centre"),
    # beam= on EN 1993 with a load height (C_2 cannot come from a diagram)
    (f's = steel_design.shape({IPE300})\nb = beam.solve(spans=[6 m], supports="pinned, roller", '
     f'loads=[beam.udl(w=10 kN/m)])\nx = steel_design.ec3_beam(section=s, f_y=235 MPa, L_LT=6 m, beam=b, z_g=150 mm)',
     "C_2"),
])
def test_open_shapes_and_diagrams_missing_what_they_need_are_located_errors(body, words):
    errs = errors(body, units="US")
    assert errs and words in errs[0].message and errs[0].span is not None, [e.message for e in errs]


ANGLE_2L = ('name="2L4X4X1/4", form="2L", A=3.88 in^2, d=4 in, b_f=8.375 in, t=0.25 in, I_x=6.0 in^4, I_y=13.0 in^4, '
            'S_x=2.06 in^3, S_y=3.1 in^3, J=0.0875 in^4')
UNEQUAL_L = ('name="L6X4X1/2", form="L", A=4.75 in^2, d=6 in, b_f=4 in, t=0.5 in, I_x=17.3 in^4, I_y=6.22 in^4, '
             'S_x=4.34 in^3, S_y=2.08 in^3, J=0.396 in^4, x_0=0.737 in, y_0=1.74 in, I_1=19.8 in^4, I_2=3.64 in^4, '
             'theta_p=23.6 deg')


@pytest.mark.parametrize("body, clauses", [
    # double angles in flexure (compression is built: test_aisc_double_angle.py), by form and by the call's form=
    (f's = steel_design.shape({ANGLE_2L})\nb = steel_design.aisc_beam(section=s, F_y=36 ksi, L_b=6 ft)',
     ("F9.2(b)", "F9.4(b)")),
    (f's = steel_design.shape({W18X50})\nc = steel_design.aisc_flexure(section=s, F_y=50 ksi, L_b=6 ft, form="2L")',
     ("F9",)),
    # single angles: LTB of an unequal-leg angle about a geometric axis (principal-axis bending, F10.2), and M_ry
    (f's = steel_design.shape({UNEQUAL_L})\nb = steel_design.aisc_beam(section=s, F_y=36 ksi, L_b=6 ft)',
     ("F10.2", "principal")),
    (f's = steel_design.shape({UNEQUAL_L})\nb = steel_design.aisc_beam(section=s, F_y=36 ksi, L_b=0 ft, '
     f'M_ry=2 kip*ft)', ("F10",)),
])
def test_shapes_outside_what_is_built_are_located_errors_naming_the_clause(body, clauses):
    errs = errors(body, units="US")
    assert errs and errs[0].span is not None, [e.message for e in errs]
    assert all(c in errs[0].message for c in clauses), errs[0].message
    assert "Traceback" not in errs[0].message
