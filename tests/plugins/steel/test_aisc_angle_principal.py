"""AISC 360-16 F10 for an equal-leg single angle bent about its principal axes (axes="principal").

Re-derived in plain Python: the principal-axis moduli from the flat legs (b × t, fillets left out — common
practice) with the record's I_1, I_2; F10-1 … F10-4 (β_w = 0 for equal legs), F10-6 … F10-8 for the toe in
compression, named beside each line. Inputs: L4X4X1/4 (AISC Manual Table 1-7 — from memory; inputs only),
F_y = 36 ksi, E = 29 000 ksi.
"""
import math

import pytest

from .conftest import errors, f, run

E, FY = 29000.0, 36.0
B, T, A, I1, I2 = 4.0, 0.25, 1.94, 4.81, 1.19
L4 = ('name="L4X4X1/4", form="L", A=1.94 in^2, d=4 in, b_f=4 in, t=0.25 in, I_x=3.00 in^4, I_y=3.00 in^4, '
      'S_x=1.03 in^3, S_y=1.03 in^3, J=0.0438 in^4, x_0=-0.965 in, y_0=-0.965 in, I_1=4.81 in^4, I_2=1.19 in^4, '
      'theta_p=45 deg')


def moduli():
    xbar = (B * B / 2 * T + (B - T) * T * T / 2) / (T * (2 * B - T))  # centroid of the flat legs from the heel's faces
    z_heel, z_toe = math.sqrt(2) * xbar, (B + T - 2 * xbar) / math.sqrt(2)
    return I1 / z_heel, I1 / z_toe, I2 / (B / math.sqrt(2))


def leg_local(Sc):
    lam, lp, lr = B / T, 0.54 * math.sqrt(E / FY), 0.91 * math.sqrt(E / FY)  # Table B4.1b case 12
    if lam <= lp:
        return math.inf
    if lam <= lr:
        return FY * Sc * (2.43 - 1.72 * lam * math.sqrt(FY / E))          # Eq. F10-6
    return 0.71 * E / lam**2 * Sc                                          # Eqs. F10-7, F10-8


def major(Lb, Cb=1.0, toe="compression"):
    Sw_heel, Sw_toe, _ = moduli()
    My = FY * min(Sw_heel, Sw_toe)
    states = [1.5 * My]                                                    # Eq. F10-1
    if Lb > 0:
        rz = math.sqrt(I2 / A)
        Mcr = 9 * E * A * rz * T * min(Cb, 1.5) / (8 * Lb)                 # Eq. F10-4, β_w = 0
        if My / Mcr <= 1:
            states.append(min((1.92 - 1.17 * math.sqrt(My / Mcr)) * My, 1.5 * My))  # Eq. F10-2
        else:
            states.append((0.92 - 0.17 * Mcr / My) * Mcr)                 # Eq. F10-3
    if toe == "compression":
        states.append(leg_local(Sw_toe))
    return min(states)


def minor():
    _, _, Sz = moduli()
    return min(1.5 * FY * Sz, leg_local(Sz))                               # Eqs. F10-1, F10-6


def beam(args):
    r = run(f"s = steel_design.shape({L4})\nout = steel_design.aisc_beam(section=s, F_y=36 ksi, E=29000 ksi, "
            f'axes="principal", {args})\n')
    return r.values["out"].fields


@pytest.mark.parametrize("L_ft, Cb, toe", [(0, 1.0, "compression"), (4, 1.0, "compression"), (6, 1.14, "compression"),
                                           (10, 1.0, "tension"), (16, 2.0, "compression"), (30, 1.0, "tension")])
def test_equal_leg_angle_about_the_major_principal_axis(L_ft, Cb, toe):
    out = beam(f'L_b={L_ft} ft, C_b={Cb}, toe="{toe}"')
    assert f(out["M_nx"], "kip*in") == pytest.approx(major(L_ft * 12.0, Cb, toe), rel=1e-9)


def test_equal_leg_angle_about_the_minor_principal_axis():
    out = beam("L_b=6 ft, M_ry=0.5 kip*ft")
    assert f(out["M_ny"], "kip*in") == pytest.approx(minor(), rel=1e-9)
    assert f(out["util_flexure_y"]) == pytest.approx(6.0 / (0.9 * minor()), rel=1e-9)  # LRFD φ_b = 0.90


def test_principal_axes_of_an_unequal_leg_angle_and_with_axial_force_are_located_errors():
    unequal = L4.replace("b_f=4 in", "b_f=3 in")
    errs = errors(f"s = steel_design.shape({unequal})\nb = steel_design.aisc_beam(section=s, F_y=36 ksi, L_b=6 ft, "
                  f'axes="principal")', units="US")
    assert errs and "β_w" in errs[0].message and "F10-4" in errs[0].message and errs[0].span is not None
    errs = errors(f"s = steel_design.shape({L4})\nb = steel_design.aisc_beam_column(section=s, F_y=36 ksi, L=6 ft, "
                  f'L_b=6 ft, axes="principal", P_r=5 kip, M_rx=1 kip*ft)', units="US")
    assert errs and "H2" in errs[0].message and errs[0].span is not None
