"""AISC 360-16 for open shapes other than doubly symmetric I: channels, tees, single angles and singly
symmetric I-shapes — E4 (torsional and flexural-torsional buckling, Eqs. E4-2…E4-9), F2 for channels
(c, Eq. F2-8b), F9 (tees in the plane of symmetry), F10 (single angles, geometric axis), G3 (angle legs and
tee stems).

Every formula is a traced step labelled with its equation number; the constants deciding a branch are data
(aisc360_16.toml [F9], [F10], [G3]).
"""
from __future__ import annotations

import math

import numpy as np

from .common import aisc, field, num

STD = "AISC 360-16"


# ---------------------------------------------------------------- geometry
def angle_geometry(ctx):
    """A single angle: legs d (vertical, along y) and b_f (horizontal), thickness t, principal axes."""
    w, u = ctx.work, ctx.u
    ctx.props([("A", "ar", "gross area A_g"), ("d", "ln", "leg along y (vertical leg)"),
               ("b_f", "ln", "leg along x (horizontal leg)"), ("t", "ln", "leg thickness"),
               ("I_x", "i4", "I about the geometric x axis"), ("I_y", "i4", "I about the geometric y axis"),
               ("S_x", "i3", "smaller elastic modulus about x"), ("S_y", "i3", "smaller elastic modulus about y"),
               ("J", "i4", "torsional constant")])
    for name, key, desc in (("I_1", "i4", "major principal second moment (I_w)"),
                            ("I_2", "i4", "minor principal second moment (I_z)"),
                            ("x_0", "ln", "shear centre from the centroid, x"),
                            ("y_0", "ln", "shear centre from the centroid, y")):
        if ctx.prop(name, key, desc, required=False) is None:
            w.fail(f"a single angle needs the section record's {name} ({desc}) for {STD} E3/E4 about the principal "
                   f"axes; use section.rolled(…) or section.angle(…), or give it in steel_design.shape(…)",
                   param="section")
    th = field(ctx.section, "theta_p")
    if th is None:
        w.fail("a single angle needs theta_p (angle of the principal axes) in its section record", param="section")
    ctx.sc["theta_p"] = th
    ctx.rows.append(["theta_p", "angle from x to the major principal axis", th])
    if ctx.prop("C_w", "i6", "warping constant", required=False) is None:
        w.let("C_w", w.q(0.0, u["i6"]), desc="warping constant of a single angle", note="taken as 0 (common practice)")
    ctx.radii()


def double_angle_geometry(ctx):
    """Two angles back to back (the y axis their axis of symmetry, between the vertical legs): properties of the
    pair as given (A, I_x, I_y, J about the pair's centroid), legs d (vertical) and b_f (horizontal) and t of one
    angle, ȳ (y_bar, the outer face of the horizontal legs to the centroid) or the shear centre y_0."""
    w, u = ctx.work, ctx.u
    ctx.props([("A", "ar", "gross area of the pair A_g"), ("d", "ln", "vertical leg of one angle (back to back)"),
               ("b_f", "ln", "horizontal (outstanding) leg of one angle"), ("t", "ln", "leg thickness"),
               ("I_x", "i4", "I of the pair about x"), ("I_y", "i4", "I of the pair about y (axis of symmetry)"),
               ("J", "i4", "torsional constant of the pair")])
    if ctx.prop("C_w", "i6", "warping constant", required=False) is None:
        w.let("C_w", w.q(0.0, u["i6"]), desc="warping constant of a double angle", note="taken as 0 (common practice)")
    ctx.radii()


def e6(ctx, a, r_i, connectors):
    """The modified slenderness of a double angle for buckling about y (E6.1), or the stated assumption."""
    w, sc, u = ctx.work, ctx.sc, ctx.u
    d = aisc()["E6"]
    w.calc("lambda_o", "L_cy/r_y", unit="1", desc="slenderness of the built-up member acting as a unit about y, (L_c/r)_o")
    if a is None:
        w.note(f"No connector spacing a given: the two angles are taken to act as a unit, (L_c/r)_m = (L_c/r)_o — "
               f"true only for connectors close enough (welded or pretensioned with a/r_i ≤ 40, {STD} E6-2a); give "
               f"a=… and connectors=… for {STD} E6.1.", kind="method")
        w.warn(f"double angle without a=…: the modified slenderness of {STD} E6.1 is not applied (assumed a/r_i ≤ 40 "
               f"with welded or pretensioned connectors)", param="L")
        w.calc("lambda_m", "lambda_o", unit="1", desc="(L_c/r)_m = (L_c/r)_o (assumed, see the note)")
        return
    if connectors is None:
        w.fail(f"with a=… give connectors=\"snug-tight\", \"welded\" or \"pretensioned\" ({STD} E6.1)", param="connectors")
    sc["a"] = a
    if r_i is not None:
        sc["r_i"] = r_i
    elif field(ctx.section, "r_i") is not None:
        w.let("r_i", field(ctx.section, "r_i"), unit=u["ln"], desc="least radius of gyration of one angle (r_z)",
              note="from the section")
    else:
        w.fail(f"{STD} E6 needs r_i, the least radius of gyration of one angle (its r_z): give r_i=… or the "
               f"record's r_i", param="r_i")
    w.calc("lambda_i", "a/r_i", unit="1", desc="slenderness of one angle between connectors, a/r_i")
    if connectors == "snug-tight":
        w.calc("lambda_m", "sqrt(lambda_o^2 + lambda_i^2)", unit="1",
               desc=f"modified slenderness, snug-tight bolted connectors, {STD} Eq. E6-1")
    elif num(sc["lambda_i"]) <= d["a_over_ri_limit"]:
        w.calc("lambda_m", "lambda_o", unit="1",
               desc=f"a/r_i ≤ {d['a_over_ri_limit']:g}, {connectors} connectors: (L_c/r)_m = (L_c/r)_o, {STD} Eq. E6-2a")
    else:
        w.let("K_i", w.q(d["K_i_angles"], ""), desc=f"K_i for angles back to back, {STD} E6.1")
        w.calc("lambda_m", "sqrt(lambda_o^2 + (K_i*lambda_i)^2)", unit="1",
               desc=f"modified slenderness, {connectors} connectors, a/r_i > {d['a_over_ri_limit']:g}, {STD} Eq. E6-2b")
    ki = d["K_i_angles"] if connectors != "snug-tight" else 1.0
    gov = max(num(sc["lambda_m"]), sc["L_cx"].m_as("m") / sc["r_x"].m_as("m"))
    if ki * num(sc["lambda_i"]) > d["component_limit"] * gov:
        w.warn(f"K_i·a/r_i = {ki * num(sc['lambda_i']):.1f} exceeds 3/4 of the member's governing slenderness "
               f"{gov:.1f} ({STD} E6.2): add connectors", param="a")


def shear_centre(ctx):
    """x_o, y_o from the section record (or, for a tee, from ȳ − t_f/2)."""
    w, sc, u, rec = ctx.work, ctx.sc, ctx.u, ctx.section
    x0, y0 = field(rec, "x_0"), field(rec, "y_0")
    if ctx.form in ("T", "2L") and y0 is None and field(rec, "y_bar") is not None:
        sc["y_bar"] = field(rec, "y_bar")
        if ctx.form == "T":
            w.calc("y_o", "y_bar - t_f/2", unit=u["ln"], desc="shear centre of a tee: at the flange mid-thickness, "
                                                            "y_o = ȳ − t_f/2 (common practice)")
        else:
            w.calc("y_o", "y_bar - t/2", unit=u["ln"], desc="shear centre of a double angle: on the axis of symmetry "
                                                          "at the horizontal legs' mid-thickness, y_o = ȳ − t/2 "
                                                          "(common practice)")
        w.let("x_o", w.q(0.0, u["ln"]), desc="x_o = 0 (on the axis of symmetry)")
        return
    if x0 is None or y0 is None:
        w.fail(f"{STD} E4 needs the shear centre (x_0, y_0 from the centroid) of this "
               f"{ {'C': 'channel', 'T': 'tee', 'L': 'angle', '2L': 'double angle', 'I': 'singly symmetric I-shape'}[ctx.form]}; use a "
               f"section record that gives it (section.rolled, the section shape functions) or give x_0, y_0 in "
               f"steel_design.shape(…)", param="section")
    scale = max(field(rec, "d").m_as("mm") if field(rec, "d") is not None else 1.0, 1.0)
    clean = lambda q: q if abs(q.m_as("mm")) > 1e-9 * scale else q * 0  # noqa: E731 (round-off of a symmetric axis)
    w.let("x_o", clean(x0), unit=u["ln"], desc="shear centre from the centroid along x", note="from the section")
    w.let("y_o", clean(y0), unit=u["ln"], desc="shear centre from the centroid along y", note="from the section")


# ---------------------------------------------------------------- Chapter E4
def e4(ctx, candidates):
    """Torsional and flexural-torsional buckling of a singly symmetric or unsymmetric member; returns the
    candidate names extended with F_e_FT (and, for angles, the minor principal axis flexural buckling)."""
    w, sc, u = ctx.work, ctx.sc, ctx.u
    shear_centre(ctx)
    if "L_cz" not in sc:
        w.calc("L_cz", "L_cy", unit=u["L"], desc="effective length for torsional buckling L_cz (taken as L_cy)")
    w.calc("r_o", "sqrt(x_o^2 + y_o^2 + (I_x + I_y)/A)", unit=u["ln"],
           desc=f"polar radius of gyration about the shear centre, {STD} Eq. E4-9")
    w.calc("H", "1 - (x_o^2 + y_o^2)/r_o^2", unit="1", desc=f"flexural constant, {STD} Eq. E4-8")
    w.calc("F_ez", "(pi^2*E*C_w/L_cz^2 + G*J)/(A*r_o^2)", unit=u["st"],
           desc=f"torsional buckling stress, {STD} Eq. E4-7")
    if ctx.form == "L":
        return _e4_cubic(ctx, candidates)
    axis = "x" if ctx.form == "C" else "y"
    other = "y" if axis == "x" else "x"
    what = {"C": "channel", "T": "tee", "2L": "double angle", "I": "singly symmetric I-shape"}[ctx.form]
    w.note(f"E4 applies: a {what} is singly symmetric about its {axis} axis; flexural buckling about {axis} couples "
           f"with twisting (flexural-torsional buckling, {STD} Eq. E4-3 with the {axis} axis the axis of symmetry); "
           f"flexural buckling about {other} stays uncoupled (E3).", kind="method")
    w.calc("F_e_FT", f"(F_e{axis} + F_ez)/(2*H)*(1 - sqrt(1 - 4*F_e{axis}*F_ez*H/(F_e{axis} + F_ez)^2))",
           unit=u["st"], desc=f"flexural-torsional buckling stress, singly symmetric member, {STD} Eq. E4-3")
    return candidates + ["F_e_FT"]


def cubic_root(a, b, c, p, q):
    """Smallest positive root of E4-4 with F_ex = a, F_ey = b, F_ez = c, (x_o/r̄_o)² = p, (y_o/r̄_o)² = q."""
    coeffs = [1 - p - q, -(a + b + c) + p * b + q * a, a * b + b * c + c * a, -a * b * c]
    roots = [r.real for r in np.roots(coeffs) if abs(r.imag) <= 1e-9 * max(abs(r.real), 1.0) and r.real > 0]
    return min(roots)


def _e4_cubic(ctx, candidates):
    w, sc, u = ctx.work, ctx.sc, ctx.u
    th = sc["theta_p"].m_as("rad")
    sc["c_th"], sc["s_th"] = w.q(math.cos(th), ""), w.q(math.sin(th), "")
    w.calc("r_w", "sqrt(I_1/A)", unit=u["ln"], desc="radius of gyration about the major principal axis w")
    w.calc("r_z", "sqrt(I_2/A)", unit=u["ln"], desc="radius of gyration about the minor principal axis z")
    w.calc("L_cp", "max(L_cx, L_cy)", unit=u["L"], desc="effective length about the principal axes (the larger of "
                                                       "L_cx, L_cy: conservative for an angle)")
    w.calc("F_ew", "pi^2*E/(L_cp/r_w)^2", unit=u["st"], desc=f"flexural buckling stress about w, {STD} Eq. E4-5 (principal axes)")
    w.calc("F_ezz", "pi^2*E/(L_cp/r_z)^2", unit=u["st"], desc=f"flexural buckling stress about z, {STD} Eq. E4-6 (principal axes)")
    w.calc("w_o", "x_o*c_th + y_o*s_th", unit=u["ln"], desc="shear centre coordinate along the major principal axis w")
    w.calc("z_o", "y_o*c_th - x_o*s_th", unit=u["ln"], desc="shear centre coordinate along the minor principal axis z")
    a, b, c = (sc[n].m_as("Pa") for n in ("F_ew", "F_ezz", "F_ez"))
    ro = sc["r_o"].m_as("m")
    p, q = (sc["w_o"].m_as("m") / ro) ** 2, (sc["z_o"].m_as("m") / ro) ** 2
    root = cubic_root(a, b, c, p, q)
    w.let("F_e_FT", w.q(root, "Pa").to(u["st"]), unit=u["st"],
          desc=f"flexural-torsional buckling stress, unsymmetric member: the smallest root of {STD} Eq. E4-4, "
               f"(F_e − F_ew)(F_e − F_ez,z)(F_e − F_ez) − F_e²(F_e − F_ez,z)(w_o/r̄_o)² − F_e²(F_e − F_ew)(z_o/r̄_o)² = 0",
          note="the cubic's roots found numerically (numpy.roots); the smallest positive one is taken")
    w.note(f"E4 applies: a single angle is unsymmetric about its geometric axes; the buckling stresses are taken about "
           f"the principal axes w–w and z–z and the flexural-torsional stress is the smallest root of {STD} Eq. E4-4.",
           kind="method")
    return candidates + ["F_ezz", "F_e_FT"]


# ---------------------------------------------------------------- Chapter F: channels
def channel_c(ctx):
    w = ctx.work
    w.calc("c", "h_o/2*sqrt(I_y/C_w)", unit="1", desc=f"c for a channel, {STD} Eq. F2-8b")


# ---------------------------------------------------------------- Chapter F9: tees
def f9(ctx, L_b, stem):
    """Tee bent in its plane of symmetry; ``stem`` is "tension" or "compression" (of the stem tip)."""
    w, sc, u = ctx.work, ctx.sc, ctx.u
    d = aisc()["F9"]
    tension = stem == "tension"
    w.note(f"Tee bent in its plane of symmetry with the stem {'in tension (flange in compression)' if tension else 'in compression'}: "
           f"{STD} F9 (yielding, lateral-torsional buckling, {'flange local buckling' if tension else 'stem local buckling'}).",
           kind="method")
    w.calc("M_y", "F_y*S_x", unit=u["mo"], desc=f"yield moment, {STD} Eq. F9-3")
    if tension:
        w.calc("M_p", f"min(F_y*Z_x, {d['stem_tension_Mp_cap']:g}*M_y)", unit=u["mo"],
               desc=f"plastic moment, stem in tension, {STD} Eq. F9-2")
    else:
        w.calc("M_p", "M_y", unit=u["mo"], desc=f"plastic moment, tee stem in compression, {STD} Eq. F9-4")
    w.calc("M_n_Y", "M_p", unit=u["mo"], desc=f"yielding, {STD} Eq. F9-1")
    states = {"yielding (F9-1)": "M_n_Y"}
    if L_b is not None and L_b.magnitude > 0:
        sc["L_b"] = L_b
        sign = "" if tension else "-"
        w.calc("B_T", f"{sign}{d['B_coefficient']:g}*(d/L_b)*sqrt(I_y/J)", unit="1",
               desc=f"{STD} Eq. {'F9-11 (stem in tension)' if tension else 'F9-12 (stem in compression)'}")
        w.calc("M_cr", "1.95*E/L_b*sqrt(I_y*J)*(B_T + sqrt(1 + B_T^2))", unit=u["mo"],
               desc=f"elastic lateral-torsional buckling moment, {STD} Eq. F9-10")
        w.note(f"C_b is not used in {STD} F9 (its lateral-torsional buckling equations carry none).", kind="method")
        if tension:
            w.calc("L_p", "1.76*r_y*sqrt(E/F_y)", unit=u["L"], desc=f"limiting unbraced length, {STD} Eq. F9-8")
            w.calc("L_r", "1.95*(E/F_y)*sqrt(I_y*J)/S_x*sqrt(2.36*(F_y/E)*d*S_x/J + 1)", unit=u["L"],
                   desc=f"limiting unbraced length, {STD} Eq. F9-9")
            lb, lp, lr = (sc[n].m_as("m") for n in ("L_b", "L_p", "L_r"))
            if lb <= lp:
                w.note(f"L_b ≤ L_p: lateral-torsional buckling does not apply ({STD} F9.2(a)(1)).", kind="method")
            elif lb <= lr:
                w.note(f"Inelastic LTB: L_p < L_b ≤ L_r ({STD} F9.2(a)(2)).", kind="method")
                w.calc("M_n_LTB", "M_p - (M_p - M_y)*(L_b - L_p)/(L_r - L_p)", unit=u["mo"],
                       desc=f"lateral-torsional buckling, inelastic, {STD} Eq. F9-6")
                states["lateral-torsional buckling, inelastic (F9-6)"] = "M_n_LTB"
            else:
                w.note(f"Elastic LTB: L_b > L_r ({STD} F9.2(a)(3)).", kind="method")
                w.calc("M_n_LTB", "M_cr", unit=u["mo"], desc=f"lateral-torsional buckling, elastic, {STD} Eq. F9-7")
                states["lateral-torsional buckling, elastic (F9-7)"] = "M_n_LTB"
        else:
            w.calc("M_n_LTB", "min(M_cr, M_y)", unit=u["mo"],
                   desc=f"lateral-torsional buckling, stem in compression, {STD} Eq. F9-13")
            states["lateral-torsional buckling, stem in compression (F9-13)"] = "M_n_LTB"
    else:
        w.note(f"L_b = 0 (continuously braced): lateral-torsional buckling does not apply ({STD} F9.2).", kind="method")
    if tension:
        _sxc(ctx)
        fl = ctx.classes["class_flange_flexure"]
        if fl == "noncompact":
            w.calc("M_n_FLB", "min(M_p - (M_p - 0.7*F_y*S_xc)*(lambda_f - lambda_p_f)/(lambda_r_f - lambda_p_f), 1.6*M_y)",
                   unit=u["mo"], desc=f"flange local buckling, noncompact flange, {STD} Eq. F9-14")
            states["flange local buckling, noncompact (F9-14)"] = "M_n_FLB"
        elif fl == "slender":
            w.calc("M_n_FLB", "0.7*E*S_xc/lambda_f^2", unit=u["mo"],
                   desc=f"flange local buckling, slender flange, {STD} Eq. F9-15")
            states["flange local buckling, slender (F9-15)"] = "M_n_FLB"
        else:
            w.note(f"Compact flange: flange local buckling does not apply ({STD} F9.3(a)(1)).", kind="method")
    else:
        e_fy = sc["E"].m_as("Pa") / sc["F_y"].m_as("Pa")
        lam = num(sc["lambda_w"])
        lo, hi = d["stem_compact"] * e_fy ** 0.5, d["stem_noncompact"] * e_fy ** 0.5
        if lam <= lo:
            w.calc("F_cr_S", "F_y", unit=u["st"], desc=f"d/t_w = {lam:.2f} ≤ 0.84√(E/F_y) = {lo:.2f}: {STD} Eq. F9-17")
        elif lam <= hi:
            w.calc("F_cr_S", "(1.43 - 0.515*lambda_w*sqrt(F_y/E))*F_y", unit=u["st"],
                   desc=f"0.84√(E/F_y) < d/t_w ≤ 1.52√(E/F_y): {STD} Eq. F9-18")
        else:
            w.calc("F_cr_S", "1.52*E/lambda_w^2", unit=u["st"], desc=f"d/t_w > 1.52√(E/F_y): {STD} Eq. F9-19")
        w.calc("M_n_SLB", "F_cr_S*S_x", unit=u["mo"], desc=f"local buckling of the tee stem, {STD} Eq. F9-16")
        states["local buckling of the stem (F9-16)"] = "M_n_SLB"
    return states


def _sxc(ctx):
    """S_xc of a tee: the elastic modulus to the flange (I_x/ȳ)."""
    w, sc, u, rec = ctx.work, ctx.sc, ctx.u, ctx.section
    ybar = field(rec, "y_bar")
    if ybar is None and field(rec, "y_top") is not None and field(rec, "y_bot") is not None:
        ybar = min(field(rec, "y_top"), field(rec, "y_bot"), key=lambda q: q.m_as("mm"))
    if ybar is None:
        w.fail("a tee needs y_bar (ȳ, the flange face to the centroid) or a section record with y_top/y_bot, "
               f"for S_xc in {STD} F9.3", param="section")
    sc["y_bar"] = ybar
    w.calc("S_xc", "I_x/y_bar", unit=u["i3"], desc="elastic modulus to the flange (in compression), S_xc = I_x/ȳ")


# ---------------------------------------------------------------- Chapter F10: single angles, geometric axis
def f10(ctx, L_b, C_b, toe, restraint):
    w, sc, u = ctx.work, ctx.sc, ctx.u
    d = aisc()["F10"]
    compression = toe == "compression"
    w.note(f"Single angle bent about its geometric x axis, toe of the vertical leg in {toe}: {STD} F10 "
           f"(yielding, lateral-torsional buckling, leg local buckling).", kind="method")
    w.calc("M_y", "F_y*S_x", unit=u["mo"], desc="yield moment about the geometric axis, M_y = F_yS_x")
    w.calc("M_n_Y", f"{d['yield_factor']:g}*M_y", unit=u["mo"], desc=f"yielding, {STD} Eq. F10-1")
    states = {"yielding (F10-1)": "M_n_Y"}
    red = 1.0
    if L_b is not None and L_b.magnitude > 0:
        if abs(sc["d"].m_as("mm") - sc["b_f"].m_as("mm")) > 1e-6 * sc["d"].m_as("mm"):
            w.fail(f"lateral-torsional buckling of an unequal-leg angle bent about a geometric axis is not built "
                   f"({STD} F10.2 requires principal-axis bending for it: give axes=\"principal\" with the principal-axis "
                   f"moments); give L_b=0 for a continuously restrained angle, or use an equal-leg angle", param="L_b")
        sc["L_b"], sc["C_b"] = L_b, C_b
        sc["b_leg"] = sc["d"]
        if restraint == "none":
            red = d["no_restraint_My_factor"]
            w.calc("M_y_LTB", f"{red:g}*M_y", unit=u["mo"],
                   desc=f"no lateral-torsional restraint: M_y taken as 0.80 × the geometric-axis yield moment "
                        f"({STD} F10.2(b)(ii)(i))")
            k = ""
        else:
            w.calc("M_y_LTB", "M_y", unit=u["mo"], desc=f"lateral-torsional restraint at the point of maximum moment: "
                                                         f"the geometric-axis yield moment ({STD} F10.2(b)(ii)(ii))")
            k = f"{d['restraint_Mcr_factor']:g}*"
        sgn = "-" if compression else "+"
        w.calc("M_cr", f"{k}0.58*E*b_leg^4*t*C_b/L_b^2*(sqrt(1 + 0.88*(L_b*t/b_leg^2)^2) {sgn} 1)", unit=u["mo"],
               desc=f"elastic LTB moment, equal-leg angle, geometric axis, {STD} Eq. "
                    f"{'F10-5a (toe in compression)' if compression else 'F10-5b (toe in tension)'}"
                    + (" × 1.25 (restraint at the point of maximum moment)" if k else ""))
        _ltb_from_mcr(w, sc, states, u, "M_y_LTB")
    else:
        w.note(f"L_b = 0 (continuously restrained): lateral-torsional buckling does not apply ({STD} F10.2).",
               kind="method")
    if compression:
        w.calc("S_c", f"{red:g}*S_x", unit=u["i3"],
               desc="elastic modulus to the toe in compression" + (" (0.80S_x without lateral-torsional restraint, "
                                                                   f"{STD} F10.3)" if red != 1.0 else ""))
        w.calc("lambda_leg", "d/t", unit="1", desc="b/t of the leg whose toe is in compression")
        lam = num(sc["lambda_leg"])
        lp, lr = num(sc["lambda_p_f"]), num(sc["lambda_r_f"])
        if lam <= lp:
            w.note(f"Compact leg (b/t = {lam:.2f} ≤ λ_p = {lp:.2f}): leg local buckling does not apply ({STD} F10.3(a)).",
                   kind="method")
        elif lam <= lr:
            w.calc("M_n_LLB", "F_y*S_c*(2.43 - 1.72*lambda_leg*sqrt(F_y/E))", unit=u["mo"],
                   desc=f"leg local buckling, noncompact leg, {STD} Eq. F10-6")
            states["leg local buckling, noncompact (F10-6)"] = "M_n_LLB"
        else:
            w.calc("F_cr_LLB", "0.71*E/lambda_leg^2", unit=u["st"], desc=f"{STD} Eq. F10-8")
            w.calc("M_n_LLB", "F_cr_LLB*S_c", unit=u["mo"], desc=f"leg local buckling, slender leg, {STD} Eq. F10-7")
            states["leg local buckling, slender (F10-7)"] = "M_n_LLB"
    else:
        w.note(f"The toe is in tension: leg local buckling does not apply ({STD} F10.3).", kind="method")
    return states


def leg_geometry(d, b, t):
    """Principal-axis geometry of an angle of flat legs (vertical leg d along +y, horizontal leg b along +x, heel
    at the origin; fillets and toe roundings left out — common practice), by Gauss–Legendre integration over the
    two leg rectangles (3 points a side: exact for the cubic integrands). Returns θ (x to the major axis w), the
    corners' (w, z) coordinates keyed heel / v_toe (the vertical leg's toe corners) / h_toe, and |β_w| =
    |(1/I_w)∫z(w² + z²)dA − 2z_0| (AISC 360-16 F10.2), z_0 the shear centre (the legs' midline intersection)."""
    rects = [(0.0, t, 0.0, d), (t, b, 0.0, t)]
    g, wg = np.polynomial.legendre.leggauss(3)

    def integ(fn):
        tot = 0.0
        for x0, x1, y0, y1 in rects:
            for gi, wi in zip(g, wg):
                for gj, wj in zip(g, wg):
                    x, y = (x0 + x1) / 2 + (x1 - x0) / 2 * gi, (y0 + y1) / 2 + (y1 - y0) / 2 * gj
                    tot += wi * wj * (x1 - x0) * (y1 - y0) / 4 * fn(x, y)
        return tot

    A = integ(lambda x, y: 1.0)
    xc, yc = integ(lambda x, y: x) / A, integ(lambda x, y: y) / A
    Ix, Iy = integ(lambda x, y: (y - yc) ** 2), integ(lambda x, y: (x - xc) ** 2)
    Ixy = integ(lambda x, y: (x - xc) * (y - yc))
    th = 0.5 * math.atan2(-2 * Ixy, Ix - Iy)
    c, s_ = math.cos(th), math.sin(th)
    W = lambda x, y: (x - xc) * c + (y - yc) * s_  # noqa: E731
    Z = lambda x, y: -(x - xc) * s_ + (y - yc) * c  # noqa: E731
    Iw = integ(lambda x, y: Z(x, y) ** 2)
    beta = integ(lambda x, y: Z(x, y) * (W(x, y) ** 2 + Z(x, y) ** 2)) / Iw - 2 * Z(t / 2, t / 2)
    pts = {"heel": [(0.0, 0.0)], "v_toe": [(0.0, d), (t, d)], "h_toe": [(b, 0.0), (b, t)]}
    return th, {k: [(W(x, y), Z(x, y)) for x, y in v] for k, v in pts.items()}, abs(beta), (xc, yc)


def _principal_geometry(ctx, toe):
    """Moduli about the principal axes to the heel and the toes, and β_w signed by the leg whose toe is in
    compression under the major-axis moment ("toe" is the vertical leg's toe, as for the geometric axis)."""
    w, sc, u = ctx.work, ctx.sc, ctx.u
    if "S_w_min" in sc:
        return
    d_, b_, t_ = (sc[n].m_as("mm") for n in ("d", "b_f", "t"))
    th, pts, beta, (xc, yc) = leg_geometry(d_, b_, t_)
    mm = lambda v: w.q(v, "mm").to(u["ln"])  # noqa: E731
    src = "from the flat legs (fillets left out, common practice), integrated exactly"
    w.let("x_bar", mm(xc), unit=u["ln"], desc="centroid from the back of the vertical leg", note=src)
    w.let("y_bar", mm(yc), unit=u["ln"], desc="centroid from the back of the horizontal leg", note=src)
    w.let("alpha_w", w.q(math.degrees(th), "deg"), desc="angle from x to the major principal axis w", note=src)
    zmax = max(abs(z) for v in pts.values() for _w, z in v)
    wmax = max(abs(w_) for v in pts.values() for w_, _z in v)
    w.let("z_max", mm(zmax), unit=u["ln"], desc="the farthest corner from the major principal axis w", note=src)
    w.let("w_max", mm(wmax), unit=u["ln"], desc="the farthest corner from the minor principal axis z", note=src)
    w.calc("S_w_min", "I_1/z_max", unit=u["i3"], desc="least elastic modulus about w (first yield)")
    w.calc("S_z_min", "I_2/w_max", unit=u["i3"], desc="least elastic modulus about z (first yield)")
    # the side of w in compression: the vertical leg's toe side (toe="compression") or the other
    zv = pts["v_toe"][0][1]
    side = (1 if zv > 0 else -1) * (1 if toe == "compression" else -1)
    ctx.toes_c = [k for k in ("v_toe", "h_toe") if any(z * side > 1e-9 * max(d_, b_) for _w, z in pts[k])]
    for k in ctx.toes_c:
        zc = max(abs(z) for _w, z in pts[k])
        w.let(f"z_{k}", mm(zc), unit=u["ln"], desc=f"the {'vertical' if k == 'v_toe' else 'horizontal'} leg's toe "
                                                  f"to w", note=src)
        w.calc(f"S_w_{k}", f"I_1/z_{k}", unit=u["i3"], desc=f"elastic modulus about w to the {'vertical' if k == 'v_toe' else 'horizontal'} leg's toe (in compression)")
    for k in ("v_toe", "h_toe"):
        wc = max(abs(w_) for w_, _z in pts[k])
        w.let(f"w_{k}", mm(wc), unit=u["ln"], desc=f"the {'vertical' if k == 'v_toe' else 'horizontal'} leg's toe to z",
              note=src)
        w.calc(f"S_z_{k}", f"I_2/w_{k}", unit=u["i3"], desc=f"elastic modulus about z to the {'vertical' if k == 'v_toe' else 'horizontal'} leg's toe")
    equal = abs(d_ - b_) <= 1e-6 * d_
    if equal:
        w.let("beta_w", w.q(0.0, u["ln"]), desc=f"β_w = 0 for an equal-leg angle ({STD} F10.2)")
        return
    short_toe = "v_toe" if d_ < b_ else "h_toe"
    short_c = short_toe in ctx.toes_c
    w.let("beta_w", mm(beta if short_c else -beta), unit=u["ln"],
          desc=f"β_w = (1/I_w)∫z(w² + z²)dA − 2z_0, {'positive: the short leg in compression' if short_c else 'negative: the long leg in compression'} ({STD} F10.2)",
          note=src)


def f10_principal(ctx, L_b, C_b, toe):
    """F10 for a single angle bent about its major principal axis w."""
    w, sc, u = ctx.work, ctx.sc, ctx.u
    d = aisc()["F10"]
    _principal_geometry(ctx, toe)
    w.note(f"Single angle bent about its major principal axis w, the vertical leg's toe in {toe}: {STD} F10 "
           f"(yielding, lateral-torsional buckling by F10-4, leg local buckling of a leg whose toe is in "
           f"compression).", kind="method")
    w.calc("M_y", "F_y*S_w_min", unit=u["mo"], desc="yield moment about w (first yield)")
    w.calc("M_n_Y", f"{d['yield_factor']:g}*M_y", unit=u["mo"], desc=f"yielding, {STD} Eq. F10-1")
    states = {"yielding (F10-1)": "M_n_Y"}
    if L_b is not None and L_b.magnitude > 0:
        sc["L_b"], sc["C_b"] = L_b, C_b
        w.calc("C_b_F10", f"min(C_b, {d['Cb_max']:g})", unit="1", desc=f"C_b ≤ {d['Cb_max']:g} ({STD} F10.2)")
        w.calc("r_z", "sqrt(I_2/A)", unit=u["ln"], desc="radius of gyration about the minor principal axis z")
        w.calc("M_cr", "9*E*A*r_z*t*C_b_F10/(8*L_b)*(sqrt(1 + (4.4*beta_w*r_z/(L_b*t))^2) + 4.4*beta_w*r_z/(L_b*t))",
               unit=u["mo"], desc=f"elastic LTB moment, major principal axis, {STD} Eq. F10-4")
        _ltb_from_mcr(w, sc, states, u, "M_y")
    else:
        w.note(f"L_b = 0 (continuously restrained): lateral-torsional buckling does not apply ({STD} F10.2).",
               kind="method")
    if not ctx.toes_c:
        w.note(f"No toe is in compression: leg local buckling does not apply ({STD} F10.3).", kind="method")
    for k in ctx.toes_c:
        _leg_local(ctx, f"S_w_{k}", states, "w", k)
    return states


def f10_minor(ctx):
    """F10 for a single angle bent about its minor principal axis z; the moment's sign is not asked, so the leg
    local buckling of both toes is checked (the lesser governs, conservative for an unequal-leg angle)."""
    w = ctx.work
    d = aisc()["F10"]
    w.note(f"Single angle bent about its minor principal axis z: yielding and leg local buckling of either toe "
           f"({STD} F10.1, F10.3); no lateral-torsional buckling about the minor axis.", kind="method")
    w.calc("M_y_z", "F_y*S_z_min", unit=ctx.u["mo"], desc="yield moment about z (first yield)")
    w.calc("M_n_Yz", f"{d['yield_factor']:g}*M_y_z", unit=ctx.u["mo"], desc=f"yielding about z, {STD} Eq. F10-1")
    states = {"yielding (F10-1)": "M_n_Yz"}
    for k in ("v_toe", "h_toe"):
        _leg_local(ctx, f"S_z_{k}", states, "z", k)
    return states


def _leg_local(ctx, modulus, states, axis, toe):
    w, sc, u = ctx.work, ctx.sc, ctx.u
    leg = "d" if toe == "v_toe" else "b_f"
    lam_name = f"lambda_{toe}"
    if lam_name not in sc:
        w.calc(lam_name, f"{leg}/t", unit="1", desc=f"b/t of the {'vertical' if leg == 'd' else 'horizontal'} leg")
    lam = num(sc[lam_name])
    lp, lr = num(sc["lambda_p_f"]), num(sc["lambda_r_f"])
    tag = f"{axis}_{toe}"
    where = f"about {axis}, {'vertical' if leg == 'd' else 'horizontal'} leg"
    if lam <= lp:
        w.note(f"Compact leg ({where}: b/t = {lam:.2f} ≤ λ_p = {lp:.2f}): leg local buckling does not apply "
               f"({STD} F10.3(a)).", kind="method")
    elif lam <= lr:
        w.calc(f"M_n_LLB_{tag}", f"F_y*{modulus}*(2.43 - 1.72*{lam_name}*sqrt(F_y/E))", unit=u["mo"],
               desc=f"leg local buckling, noncompact leg ({where}), {STD} Eq. F10-6")
        states[f"leg local buckling, noncompact, {where} (F10-6)"] = f"M_n_LLB_{tag}"
    else:
        if f"F_cr_LLB_{toe}" not in sc:
            w.calc(f"F_cr_LLB_{toe}", f"0.71*E/{lam_name}^2", unit=u["st"], desc=f"{STD} Eq. F10-8")
        w.calc(f"M_n_LLB_{tag}", f"F_cr_LLB_{toe}*{modulus}", unit=u["mo"],
               desc=f"leg local buckling, slender leg ({where}), {STD} Eq. F10-7")
        states[f"leg local buckling, slender, {where} (F10-7)"] = f"M_n_LLB_{tag}"


# ---------------------------------------------------------------- Chapter G3
def g3(ctx):
    w, sc, u = ctx.work, ctx.sc, ctx.u
    kv = aisc()["G3"]["k_v"]
    if ctx.form == "T":
        w.calc("b_v", "d", unit=u["ln"], desc="depth of the tee stem, b")
        w.calc("t_v", "t_w", unit=u["ln"], desc="stem thickness, t")
    else:
        w.calc("b_v", "d", unit=u["ln"], desc="width of the leg resisting the shear (the vertical leg), b")
        w.calc("t_v", "t", unit=u["ln"], desc="leg thickness, t")
    w.let("k_v", w.q(kv, ""), desc=f"web plate shear buckling coefficient, {STD} G3")
    w.calc("lambda_v", "b_v/t_v", unit="1", desc="b/t (in place of h/t_w in G2.2)")
    lam = num(sc["lambda_v"])
    r = (kv * sc["E"].m_as("Pa") / sc["F_y"].m_as("Pa")) ** 0.5
    if lam <= 1.10 * r:
        w.let("C_v2", w.q(1.0, ""), desc=f"b/t ≤ 1.10√(k_vE/F_y) = {1.10 * r:.1f}: {STD} Eq. G2-9")
    elif lam <= 1.37 * r:
        w.calc("C_v2", "1.10*sqrt(k_v*E/F_y)/lambda_v", unit="1", desc=f"{STD} Eq. G2-10")
    else:
        w.calc("C_v2", "1.51*k_v*E/(lambda_v^2*F_y)", unit="1", desc=f"{STD} Eq. G2-11")
    w.calc("V_n", "0.6*F_y*b_v*t_v*C_v2", unit=u["fo"], desc=f"nominal shear strength, {STD} Eq. G3-1")
    return "shear", f"shear of the {'tee stem' if ctx.form == 'T' else 'angle leg'} (G3)"


def _ltb_from_mcr(w, sc, states, u, m_y: str) -> None:
    """M_n for lateral-torsional buckling of an angle from M_cr and the yield moment named ``m_y``
    (AISC 360-16 Eq. F10-2 where M_y/M_cr ≤ 1, else Eq. F10-3)."""
    ratio = sc[m_y].m_as("N*m") / sc["M_cr"].m_as("N*m")
    if ratio <= 1:
        w.calc("M_n_LTB", f"min((1.92 - 1.17*sqrt({m_y}/M_cr))*{m_y}, 1.5*{m_y})", unit=u["mo"],
               desc=f"M_y/M_cr = {ratio:.3f} ≤ 1: lateral-torsional buckling, {STD} Eq. F10-2")
        states["lateral-torsional buckling (F10-2)"] = "M_n_LTB"
    else:
        w.calc("M_n_LTB", f"(0.92 - 0.17*M_cr/{m_y})*M_cr", unit=u["mo"],
               desc=f"M_y/M_cr = {ratio:.3f} > 1: lateral-torsional buckling, {STD} Eq. F10-3")
        states["lateral-torsional buckling (F10-3)"] = "M_n_LTB"
