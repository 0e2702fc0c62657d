"""AISC 360-16 double angles in compression (E3, E4-3 about the axis of symmetry, E6 modified slenderness).

Re-derived in plain Python from the Specification's equations (named beside each line); the pair's properties
are built here from one angle's published properties by the parallel-axis theorem. Inputs: L4X3-1/2X3/8, long
legs back to back, 3/8 in. apart (AISC Manual Table 1-7 values — from memory; inputs only, the checks do not
depend on them being the catalogue's), F_y = 36 ksi, E = 29 000 ksi, G = 11 200 ksi.
"""
import math

import pytest

from .conftest import errors, f, run

E, G, FY = 29000.0, 11200.0, 36.0
A1, IX1, IY1, XBAR, YBAR, RZ, J1, T = 2.67, 4.15, 3.00, 0.994, 1.24, 0.722, 0.132, 0.375
GAP = 0.375
A, IX, IY, J = 2 * A1, 2 * IX1, 2 * (IY1 + A1 * (XBAR + GAP / 2) ** 2), 2 * J1
PAIR = (f'name="2L4X3-1/2X3/8 LLBB", form="2L", A={A} in^2, d=4 in, b_f=3.5 in, t={T} in, I_x={IX} in^4, '
        f'I_y={IY} in^4, J={J} in^4, y_bar={YBAR} in, r_i={RZ} in')


def expected(L, a=None, connectors=None):
    rx, ry = math.sqrt(IX / A), math.sqrt(IY / A)
    lo = L / ry                                                        # (L_c/r)_o
    if a is None:
        lm = lo
    elif connectors == "snug-tight":
        lm = math.sqrt(lo**2 + (a / RZ) ** 2)                          # Eq. E6-1
    elif a / RZ <= 40:
        lm = lo                                                        # Eq. E6-2a
    else:
        lm = math.sqrt(lo**2 + (0.50 * a / RZ) ** 2)                   # Eq. E6-2b, K_i = 0.50 (angles back to back)
    Fex = math.pi**2 * E / (L / rx) ** 2                               # Eq. E3-4
    Fey = math.pi**2 * E / lm**2                                       # Eq. E3-4 with (L_c/r)_m
    yo = YBAR - T / 2                                                  # shear centre at the horizontal legs' mid-thickness
    ro2 = yo**2 + (IX + IY) / A                                        # Eq. E4-9
    H = 1 - yo**2 / ro2                                                # Eq. E4-8
    Fez = G * J / (A * ro2)                                            # Eq. E4-7, C_w = 0
    Fft = (Fey + Fez) / (2 * H) * (1 - math.sqrt(1 - 4 * Fey * Fez * H / (Fey + Fez) ** 2))  # Eq. E4-3
    Fe = min(Fex, Fey, Fft)
    Fcr = 0.658 ** (FY / Fe) * FY if FY / Fe <= 2.25 else 0.877 * Fe   # Eqs. E3-2, E3-3
    assert max(4.0, 3.5) / T <= 0.45 * math.sqrt(E / FY)               # Table B4.1a case 3: nonslender legs
    return Fcr * A, lm, Fft                                            # Eq. E3-1


def column(args):
    r = run(f"s = steel_design.shape({PAIR})\nout = steel_design.aisc_column(section=s, F_y=36 ksi, E=29000 ksi, "
            f"G=11200 ksi, {args})\n")
    return r.values["out"].fields, r


@pytest.mark.parametrize("L_ft, a, conn", [(8, 48, "welded"), (8, 24, "welded"), (8, 48, "snug-tight"),
                                            (12, 36, "pretensioned"), (5, 30, "snug-tight")])
def test_double_angle_column_E4_with_the_modified_slenderness_of_E6(L_ft, a, conn):
    Pn, _, Fft = expected(L_ft * 12.0, a, conn)
    out, _ = column(f'L={L_ft} ft, a={a} in, connectors="{conn}"')
    assert f(out["F_e_FT"], "ksi") == pytest.approx(Fft, rel=1e-9)
    assert f(out["P_n"], "kip") == pytest.approx(Pn, rel=1e-9)


def test_the_modified_slenderness_lowers_the_strength_when_connectors_are_far_apart():
    close, _ = column('L=8 ft, a=24 in, connectors="welded"')       # a/r_i = 33 ≤ 40: E6-2a, no change
    far, _ = column('L=8 ft, a=48 in, connectors="welded"')         # a/r_i = 66 > 40: E6-2b
    assert f(far["F_e_FT"], "ksi") < f(close["F_e_FT"], "ksi")     # about x governs P_n at this length
    close, _ = column('L=4 ft, L_y=12 ft, a=24 in, connectors="welded"')
    far, _ = column('L=4 ft, L_y=12 ft, a=48 in, connectors="welded"')
    assert f(far["P_n"], "kip") < f(close["P_n"], "kip")             # about y (flexural-torsional) governs


def test_without_connector_spacing_the_assumption_is_stated_and_warned():
    Pn, _, _ = expected(96.0)
    out, r = column("L=8 ft")
    assert f(out["P_n"], "kip") == pytest.approx(Pn, rel=1e-9)
    warns = [d for d in r.diagnostics if d.severity == "warning" and "E6.1" in d.message]
    assert warns and warns[0].span is not None


def test_double_angles_in_flexure_are_a_located_error_naming_F9():
    errs = errors(f"s = steel_design.shape({PAIR})\nb = steel_design.aisc_beam(section=s, F_y=36 ksi, L_b=6 ft)",
                  units="US")
    assert errs and "F9.2(b)" in errs[0].message and "F9.4(b)" in errs[0].message and errs[0].span is not None


def test_a_spacing_without_the_connector_kind_is_a_located_error():
    errs = errors(f"s = steel_design.shape({PAIR})\nc = steel_design.aisc_column(section=s, F_y=36 ksi, L=8 ft, "
                  f"a=48 in)", units="US")
    assert errs and "connectors" in errs[0].message and errs[0].span is not None
