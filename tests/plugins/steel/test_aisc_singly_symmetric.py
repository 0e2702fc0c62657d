"""AISC 360-16 F4 for a singly symmetric I-shape with its smaller flange in compression (a hogging moment).

No AISC Design Example works this case, so the expected values are re-derived here in plain Python from the
plates (section properties by the parallel-axis theorem, the plastic neutral axis by equal areas) and from the
Specification's equations, each named beside its line. The section: a welded girder, top flange 300 × 20 mm,
bottom flange 200 × 15 mm, web 565 × 10 mm (d = 600 mm), F_y = 345 MPa, E = 200 000 MPa.
"""
import math

import pytest

from .conftest import errors, f, run

E, FY = 200000.0, 345.0
BT, TT, BB, TB, TW, D = 300.0, 20.0, 200.0, 15.0, 10.0, 600.0
HW = D - TT - TB
SECTION = "section.ishape(h=600 mm, b=300 mm, b_bot=200 mm, t_f=20 mm, t_fb=15 mm, t_w=10 mm)"


def plates():
    """A, y_c (from the bottom), I_x, I_y, S_top, S_bot, y_p (from the bottom) of the three plates."""
    parts = [(BB * TB, TB / 2, BB * TB**3 / 12, TB * BB**3 / 12),
             (TW * HW, TB + HW / 2, TW * HW**3 / 12, HW * TW**3 / 12),
             (BT * TT, D - TT / 2, BT * TT**3 / 12, TT * BT**3 / 12)]
    A = sum(p[0] for p in parts)
    yc = sum(p[0] * p[1] for p in parts) / A
    Ix = sum(p[2] + p[0] * (p[1] - yc) ** 2 for p in parts)
    Iy = sum(p[3] for p in parts)
    # plastic neutral axis: half the area below it; the bottom flange holds less than half, so it lies in the web
    yp = TB + (A / 2 - BB * TB) / TW
    assert TB < yp < D - TT
    return A, yc, Ix, Iy, Ix / (D - yc), Ix / yc, yp


def f4_bottom_in_compression(Lb, Cb=1.0):
    A, yc, Ix, Iy, St, Sb, yp = plates()
    Sxc, Sxt = Sb, St                                         # the bottom flange in compression
    Iyc = TB * BB**3 / 12
    assert Iyc / Iy <= 0.23                                   # F4.2(c)(5) and Eq. F4-10: R_pc = 1, J = 0
    Rpc, J = 1.0, 0.0
    hc = 2 * (yc - TB)                                        # B4.1b(a): h_c
    assert hc / TW <= 5.70 * math.sqrt(E / FY)                # Table B4.1b case 16: not slender → F4
    aw = hc * TW / (BB * TB)                                  # Eq. F4-12
    rt = BB / math.sqrt(12 * (1 + aw / 6))                    # Eq. F4-11
    Lp = 1.1 * rt * math.sqrt(E / FY)                         # Eq. F4-7
    assert Sxt / Sxc >= 0.7
    FL = 0.7 * FY                                             # Eq. F4-6a
    ho = D - TT / 2 - TB / 2
    Lr = 1.95 * rt * E / FL * math.sqrt(J / (Sxc * ho) + math.sqrt((J / (Sxc * ho)) ** 2 + 6.76 * (FL / E) ** 2))  # F4-8
    Myc = FY * Sxc                                            # Eq. F4-4
    cfy = Rpc * Myc                                           # Eq. F4-1
    if Lb <= Lp:
        ltb = math.inf
    elif Lb <= Lr:
        ltb = min(Cb * (Rpc * Myc - (Rpc * Myc - FL * Sxc) * (Lb - Lp) / (Lr - Lp)), Rpc * Myc)  # Eq. F4-2
    else:
        Fcr = Cb * math.pi**2 * E / (Lb / rt) ** 2 * math.sqrt(1 + 0.078 * J / (Sxc * ho) * (Lb / rt) ** 2)  # F4-5
        ltb = min(Fcr * Sxc, Rpc * Myc)                       # Eq. F4-3
    assert BB / (2 * TB) <= 0.38 * math.sqrt(E / FY)          # Table B4.1b case 10/11: compact, no FLB (F4.3(a))
    return min(cfy, ltb), Lp, Lr                              # S_xt > S_xc: no tension flange yielding (F4.4(a))


def beam(args):
    r = run(f"s = {SECTION}\nout = steel_design.aisc_beam(section=s, F_y=345 MPa, E=200000 MPa, {args})\n", units="SI")
    return r.values["out"].fields


def test_the_plate_properties_are_the_section_records():
    r = run(f"s = {SECTION}\n", units="SI")
    sec = r.values["s"].fields
    A, yc, Ix, Iy, St, Sb, yp = plates()
    assert f(sec["S_x_bot"], "mm^3") == pytest.approx(Sb, rel=1e-9)
    assert f(sec["S_x_top"], "mm^3") == pytest.approx(St, rel=1e-9)
    assert f(sec["y_p"], "mm") == pytest.approx(yp, rel=1e-9)


@pytest.mark.parametrize("Lb", [0.5, 1.2, 3.0, 4.0, 6.0, 9.0])
def test_F4_with_the_bottom_flange_in_compression_matches_a_rederivation(Lb):
    Mn, Lp, Lr = f4_bottom_in_compression(Lb * 1000)
    out = beam(f'L_b={Lb} m, compression_flange="bottom"')
    assert f(out["L_p"], "mm") == pytest.approx(Lp, rel=1e-9)
    assert f(out["L_r"], "mm") == pytest.approx(Lr, rel=1e-9)
    assert f(out["M_nx"], "N*mm") == pytest.approx(Mn, rel=1e-9)
    assert f(out["R_pc"]) == 1.0


def test_the_smaller_flange_in_compression_is_weaker_than_the_larger():
    top = beam('L_b=3 m, compression_flange="top"')
    bot = beam('L_b=3 m, compression_flange="bottom"')
    assert f(bot["M_nx"], "N*mm") < f(top["M_nx"], "N*mm")
    assert beam("L_b=3 m")["M_nx"] == top["M_nx"]            # without a hint the top flange is in compression


def test_the_sign_of_the_beams_moment_decides_the_compression_flange():
    # a cantilever (fixed at x = 0) with a downward udl: the moment is hogging everywhere (the beam's sagging-positive
    # convention), so the bottom flange is in compression; C_b comes from the same diagram in both calls
    body = (f"s = {SECTION}\nb = beam.solve(spans=[4 m], supports=\"fixed, free\", loads=[beam.udl(w=20 kN/m)])\n"
            "auto = steel_design.aisc_beam(section=s, F_y=345 MPa, E=200000 MPa, L_b=4 m, beam=b)\n"
            "bot = steel_design.aisc_beam(section=s, F_y=345 MPa, E=200000 MPa, L_b=4 m, beam=b, "
            "compression_flange=\"bottom\")\n"
            "top = steel_design.aisc_beam(section=s, F_y=345 MPa, E=200000 MPa, L_b=4 m, beam=b, "
            "compression_flange=\"top\")\n")
    r = run(body, units="SI")
    auto, bot, top = (r.values[k].fields for k in ("auto", "bot", "top"))
    assert auto["M_nx"] == bot["M_nx"] and auto["M_nx"] != top["M_nx"]


def test_published_properties_with_the_bottom_flange_given():
    A, yc, Ix, Iy, St, Sb, yp = plates()
    Zx = BT * TT * (D - TT / 2 - yp) + TW * (D - TT - yp) ** 2 / 2 + TW * (yp - TB) ** 2 / 2 + BB * TB * (yp - TB / 2)
    shape = (f'name="girder", form="I", fabrication="welded", A={A} mm^2, d={D} mm, b_f={BT} mm, t_f={TT} mm, '
             f't_w={TW} mm, I_x={Ix} mm^4, I_y={Iy} mm^4, S_x={Sb} mm^3, Z_x={Zx} mm^3, S_y={2 * Iy / BT} mm^3, '
             f'Z_y=1e6 mm^3, J=1.2e6 mm^4, C_w=2.8e12 mm^6, h_o={D - TT / 2 - TB / 2} mm, S_x_top={St} mm^3, '
             f'S_x_bot={Sb} mm^3, y_top={D - yc} mm, y_c={yc} mm, y_p={yp} mm, b_f_bot={BB} mm, t_f_bot={TB} mm')
    r = run(f"s = steel_design.shape({shape})\nout = steel_design.aisc_beam(section=s, F_y=345 MPa, E=200000 MPa, "
            f"L_b=3 m, compression_flange=\"bottom\")\n", units="SI")
    Mn, _, _ = f4_bottom_in_compression(3000.0)
    assert f(r.values["out"].fields["M_nx"], "N*mm") == pytest.approx(Mn, rel=1e-9)


def test_a_record_without_the_bottom_flange_or_its_centroid_is_a_located_error():
    shape = ('name="girder", form="I", A=14650 mm^2, d=600 mm, b_f=300 mm, t_f=20 mm, t_w=10 mm, I_x=8.6e8 mm^4, '
             'I_y=5.5e7 mm^4, S_x=2.41e6 mm^3, Z_x=3.2e6 mm^3, S_y=3.7e5 mm^3, Z_y=6.1e5 mm^3, J=1.2e6 mm^4, '
             'C_w=2.8e12 mm^6, S_x_top=3.56e6 mm^3, S_x_bot=2.41e6 mm^3, y_top=242 mm')
    errs = errors(f"s = steel_design.shape({shape})\nout = steel_design.aisc_beam(section=s, F_y=345 MPa, L_b=3 m, "
                  f"compression_flange=\"bottom\")\n", units="SI")
    assert errs and "y_c" in errs[0].message and errs[0].span is not None


def test_only_the_difference_of_y_c_and_y_p_matters_and_the_bottom_flange_is_recovered_from_the_plates():
    # y_c, y_p in a frame 100 mm below the bottom fibre; no b_f_bot, t_f_bot: the flange comes from A and y_bot
    A, yc, Ix, Iy, St, Sb, yp = plates()
    Zx = BT * TT * (D - TT / 2 - yp) + TW * (D - TT - yp) ** 2 / 2 + TW * (yp - TB) ** 2 / 2 + BB * TB * (yp - TB / 2)
    shape = (f'name="girder", form="I", fabrication="welded", A={A} mm^2, d={D} mm, b_f={BT} mm, t_f={TT} mm, '
             f't_w={TW} mm, I_x={Ix} mm^4, I_y={Iy} mm^4, S_x={Sb} mm^3, Z_x={Zx} mm^3, S_y={2 * Iy / BT} mm^3, '
             f'Z_y=1e6 mm^3, J=1.2e6 mm^4, C_w=2.8e12 mm^6, h_o={D - TT / 2 - TB / 2} mm, S_x_top={St} mm^3, '
             f'S_x_bot={Sb} mm^3, y_top={D - yc} mm, y_c={yc + 100} mm, y_p={yp + 100} mm')
    r = run(f"s = steel_design.shape({shape})\nout = steel_design.aisc_beam(section=s, F_y=345 MPa, E=200000 MPa, "
            f"L_b=3 m, compression_flange=\"bottom\")\n", units="SI")
    Mn, _, _ = f4_bottom_in_compression(3000.0)
    assert f(r.values["out"].fields["M_nx"], "N*mm") == pytest.approx(Mn, rel=1e-9)
