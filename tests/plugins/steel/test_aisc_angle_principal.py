"""AISC 360-16 F10 for single angles bent about their principal axes (axes="principal").

Independent references: the principal axes, second moments and centroid of the flat legs (fillets left out)
from sectionproperties, the corners' distances to the principal axes computed here from them; β_w of an
unequal-leg angle against the AISC Commentary's tabulated value (from memory) and against sectionproperties'
monosymmetry constant; F10-1 … F10-8 re-derived in plain Python from the Specification, named beside each line.
F_y = 36 ksi, E = 29 000 ksi.
"""
import math

import pytest

from .conftest import errors, f, run

E, FY = 29000.0, 36.0


@pytest.fixture(scope="module")
def geo():
    from sectionproperties.analysis import Section
    from sectionproperties.pre.library import angle_section

    out = {}
    for d, b, t in ((4.0, 4.0, 0.25), (6.0, 4.0, 0.5)):
        g = angle_section(d=d, b=b, t=t, r_r=0.0, r_t=0.0, n_r=4)
        g.create_mesh(mesh_sizes=[0.01])
        s = Section(g)
        s.calculate_geometric_properties()
        s.calculate_warping_properties()
        (cx, cy), (I11, I22), phi = s.get_c(), s.get_ip(), math.radians(s.get_phi())
        A = s.get_area()

        def wz(x, y):  # coordinates along the 11 (major) and 22 (minor) axes
            dx, dy = x - cx, y - cy
            return dx * math.cos(phi) + dy * math.sin(phi), -dx * math.sin(phi) + dy * math.cos(phi)

        corners = {"heel": [(0, 0)], "v": [(0, d), (t, d)], "h": [(b, 0), (b, t)]}
        out[(d, b)] = dict(d=d, b=b, t=t, A=A, I1=I11, I2=I22, beta=max(abs(v) for v in s.get_beta_p()[:2]),
                           pts={k: [wz(x, y) for x, y in v] for k, v in corners.items()})
    return out


def shape(g):
    return (f'name="L{g["d"]:g}X{g["b"]:g}X{g["t"]:g} (flat legs)", form="L", A={g["A"]} in^2, d={g["d"]} in, '
            f'b_f={g["b"]} in, t={g["t"]} in, I_x=3.0 in^4, I_y=3.0 in^4, S_x=1.0 in^3, S_y=1.0 in^3, J=0.05 in^4, '
            f'x_0=-0.9 in, y_0=-0.9 in, I_1={g["I1"]} in^4, I_2={g["I2"]} in^4, theta_p=45 deg')


def leg_local(lam, Sc):
    lp, lr = 0.54 * math.sqrt(E / FY), 0.91 * math.sqrt(E / FY)           # Table B4.1b case 12
    if lam <= lp:
        return math.inf
    if lam <= lr:
        return FY * Sc * (2.43 - 1.72 * lam * math.sqrt(FY / E))          # Eq. F10-6
    return 0.71 * E / lam**2 * Sc                                          # Eqs. F10-7, F10-8


def major(g, Lb, Cb, toe, beta):
    pts, t = g["pts"], g["t"]
    zmax = max(abs(z) for v in pts.values() for _, z in v)
    My = FY * g["I1"] / zmax                                               # first yield about w
    states = [1.5 * My]                                                    # Eq. F10-1
    if Lb > 0:
        rz = math.sqrt(g["I2"] / g["A"])
        k = 4.4 * beta * rz / (Lb * t)
        Mcr = 9 * E * g["A"] * rz * t * min(Cb, 1.5) / (8 * Lb) * (math.sqrt(1 + k**2) + k)  # Eq. F10-4
        states.append(min((1.92 - 1.17 * math.sqrt(My / Mcr)) * My, 1.5 * My) if My / Mcr <= 1
                      else (0.92 - 0.17 * Mcr / My) * Mcr)                 # Eqs. F10-2, F10-3
    side = math.copysign(1, pts["v"][0][1]) * (1 if toe == "compression" else -1)
    for leg, width in (("v", g["d"]), ("h", g["b"])):
        if any(z * side > 1e-9 for _, z in pts[leg]):                      # this toe is in compression
            states.append(leg_local(width / t, g["I1"] / max(abs(z) for _, z in pts[leg])))
    return min(states)


def minor(g):
    pts, t = g["pts"], g["t"]
    wmax = max(abs(w) for v in pts.values() for w, _ in v)
    states = [1.5 * FY * g["I2"] / wmax]                                   # Eq. F10-1
    for leg, width in (("v", g["d"]), ("h", g["b"])):                      # either toe (the sign is not asked)
        states.append(leg_local(width / t, g["I2"] / max(abs(w) for w, _ in pts[leg])))
    return min(states)


def beam(g, args):
    r = run(f"s = steel_design.shape({shape(g)})\nout = steel_design.aisc_beam(section=s, F_y=36 ksi, E=29000 ksi, "
            f'axes="principal", {args})\n')
    return r.values["out"].fields


@pytest.mark.parametrize("L_ft, Cb, toe", [(0, 1.0, "compression"), (4, 1.0, "compression"), (6, 1.14, "tension"),
                                           (16, 2.0, "compression"), (30, 1.0, "tension")])
def test_equal_leg_angle_about_the_major_principal_axis(geo, L_ft, Cb, toe):
    g = geo[(4.0, 4.0)]
    out = beam(g, f'L_b={L_ft} ft, C_b={Cb}, toe="{toe}"')
    if L_ft:
        assert f(out["beta_w"], "in") == 0.0                              # β_w = 0 for equal legs (F10.2)
    assert f(out["M_nx"], "kip*in") == pytest.approx(major(g, L_ft * 12.0, Cb, toe, 0.0), rel=1e-6)



@pytest.mark.parametrize("toe, sign", [("compression", -1), ("tension", 1)])
def test_unequal_leg_angle_beta_w_and_the_major_axis(geo, toe, sign):
    # L6X4X1/2 with the long leg vertical: its toe in compression means the long leg in compression, β_w < 0
    g = geo[(6.0, 4.0)]
    out = beam(g, f'L_b=8 ft, toe="{toe}"')
    beta = f(out["beta_w"], "in")
    assert beta == pytest.approx(sign * 3.14, rel=0.01)                   # AISC Commentary Table C-F10.1, L6x4 (from memory)
    assert abs(beta) == pytest.approx(g["beta"], rel=0.04)               # sectionproperties (its own shear centre)
    assert f(out["M_nx"], "kip*in") == pytest.approx(major(g, 96.0, 1.0, toe, beta), rel=1e-6)


@pytest.mark.parametrize("dims", [(4.0, 4.0), (6.0, 4.0)])
def test_single_angle_about_the_minor_principal_axis(geo, dims):
    g = geo[dims]
    out = beam(g, "L_b=6 ft, M_ry=0.5 kip*ft")
    assert f(out["M_ny"], "kip*in") == pytest.approx(minor(g), rel=1e-6)
    assert f(out["util_flexure_y"]) == pytest.approx(6.0 / (0.9 * minor(g)), rel=1e-6)  # LRFD φ_b = 0.90


def test_principal_axes_with_axial_force_need_H2_a_located_error(geo):
    errs = errors(f"s = steel_design.shape({shape(geo[(4.0, 4.0)])})\nb = steel_design.aisc_beam_column(section=s, "
                  f'F_y=36 ksi, L=6 ft, L_b=6 ft, axes="principal", P_r=5 kip, M_rx=1 kip*ft)', units="US")
    assert errs and "H2" in errs[0].message and errs[0].span is not None
