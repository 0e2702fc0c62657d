"""AISC 360-16 F4 and F5: I-shaped members bent about the major axis whose web is noncompact (F4) or slender
(F5), and singly symmetric I-shapes with compact or noncompact webs (F4).

Every formula is a traced step labelled with its equation number; which branch applies is decided from the
traced values and stated in words. The limits deciding a branch are data (aisc360_16.toml [F4], [F5]).
"""
from __future__ import annotations

from .common import aisc, field, num

STD = "AISC 360-16"


def flange_geometry(ctx):
    """S_xc, S_xt, h_c, h_p, b_fc, t_fc of an I-shape bent about x, with the compression flange decided by the
    call (``ctx.compression_flange``: "top" for a sagging moment, "bottom" for a hogging one).

    A doubly symmetric section uses S_x and h for both; a singly symmetric one (a section record whose top and
    bottom moduli differ) takes them from the record's fibre distances and plastic neutral axis: y_top and y_bot
    from the centroid to the top and bottom fibres (y_bot = d − y_top when not given), y_c and y_p the centroid and
    the plastic neutral axis in one frame measured upwards (only their difference is used)."""
    w, sc, u, rec = ctx.work, ctx.sc, ctx.u, ctx.section
    top, bot = field(rec, "S_x_top"), field(rec, "S_x_bot")
    singly = top is not None and bot is not None and abs(top.m_as("mm^3") / bot.m_as("mm^3") - 1) > 0.005
    flange = getattr(ctx, "compression_flange", "top")
    sc["b_fc"], sc["t_fc"] = sc["b_f"], sc["t_f"]
    ctx.lam_fc = "lambda_f"
    if not singly:
        w.calc("S_xc", "S_x", unit=u["i3"], desc="elastic modulus to the compression flange (doubly symmetric: S_x)")
        w.calc("S_xt", "S_x", unit=u["i3"], desc="elastic modulus to the tension flange (doubly symmetric: S_x)")
        w.calc("h_c", "h", unit=u["ln"], desc=f"h_c = h for a doubly symmetric web ({STD} B4.1b(a))")
        w.calc("h_p", "h", unit=u["ln"], desc="h_p = h for a doubly symmetric web")
        return False
    for name in ("y_top", "y_c", "y_p"):
        if field(rec, name) is None:
            w.fail(f"a singly symmetric I-shape needs the section record's {name} (use section.ishape or "
                   f"section.built_up, or give it in steel_design.shape)", param="section")
        sc[name] = field(rec, name)
    sc["S_x_top"], sc["S_x_bot"] = top, bot
    if flange == "top":
        w.note(f"Singly symmetric I-shape, sagging moment: the top flange is the compression flange; S_xc, h_c and "
               f"h_p follow from it ({STD} F4, B4.1b case 16).", kind="method")
        w.calc("S_xc", "S_x_top", unit=u["i3"], desc="elastic modulus to the compression (top) flange")
        w.calc("S_xt", "S_x_bot", unit=u["i3"], desc="elastic modulus to the tension (bottom) flange")
        w.calc("h_c", "2*(y_top - t_fc)", unit=u["ln"],
               desc="h_c: twice the distance from the centroid to the inside face of the compression flange")
        w.calc("h_p", "2*(y_c + y_top - y_p - t_fc)", unit=u["ln"],
               desc="h_p: twice the distance from the plastic neutral axis to the inside face of the compression flange")
        return True
    w.note(f"Singly symmetric I-shape, hogging moment: the bottom flange is the compression flange; S_xc, h_c, h_p "
           f"and the flange's slenderness follow from it ({STD} F4, B4.1b cases 10/11 and 16).", kind="method")
    if field(rec, "y_bot") is not None:
        w.let("y_bot", field(rec, "y_bot"), unit=u["ln"], desc="centroid to the bottom fibre", note="from the section")
    else:
        w.calc("y_bot", "d - y_top", unit=u["ln"], desc="centroid to the bottom fibre")
    _bottom_flange(ctx)
    w.calc("S_xc", "S_x_bot", unit=u["i3"], desc="elastic modulus to the compression (bottom) flange")
    w.calc("S_xt", "S_x_top", unit=u["i3"], desc="elastic modulus to the tension (top) flange")
    w.calc("h_c", "2*(y_bot - t_fc)", unit=u["ln"],
           desc="h_c: twice the distance from the centroid to the inside face of the compression (bottom) flange")
    w.calc("h_p", "2*(y_p - (y_c - y_bot) - t_fc)", unit=u["ln"],
           desc="h_p: twice the distance from the plastic neutral axis to the inside face of the compression flange")
    # B4.1b case 10 (rolled) or 11 (built-up) for the flange that is in compression, against the limits already traced
    w.calc("lambda_fc", "b_fc/(2*t_fc)", unit="1", desc="compression (bottom) flange slenderness b/t = b_fc/(2t_fc)")
    lam, lp, lr = (num(sc[n]) for n in ("lambda_fc", "lambda_p_f", "lambda_r_f"))
    cls = "compact" if lam <= lp else ("noncompact" if lam <= lr else "slender")
    w.note(f"Compression (bottom) flange in flexure: λ = {lam:.3g}, λ_p = {lp:.3g}, λ_r = {lr:.3g}: {cls} "
           f"({STD} Table B4.1b).", kind="method")
    ctx.classes["class_flange_flexure"] = cls
    ctx.lam_fc = "lambda_fc"
    return True


def _bottom_flange(ctx):
    """b_fc, t_fc of the bottom flange: from the record (b_f_bot, t_f_bot), else from the section's area and
    centroid for a section of flat plates (no fillets): with D = d − t_f and K = A − b_ft_f − t_wD, the first moment
    about the bottom fibre, A·y_bot = K·t/2 + t_wD²/2 + b_ft_f(d − t_f/2), is linear in the bottom flange's t."""
    w, sc, u, rec = ctx.work, ctx.sc, ctx.u, ctx.section
    b, t = field(rec, "b_f_bot"), field(rec, "t_f_bot")
    if b is not None and t is not None:
        w.let("b_fc", b, unit=u["ln"], desc="width of the compression (bottom) flange", note="from the section")
        w.let("t_fc", t, unit=u["ln"], desc="thickness of the compression (bottom) flange", note="from the section")
        return
    w.calc("K_bf", "A - b_f*t_f - t_w*(d - t_f)", unit=u["ar"],
           desc="A less the top flange and a web reaching the bottom fibre (plates, no fillets)")
    if sc["K_bf"].magnitude <= 0:
        w.fail("the section record gives no bottom flange (b_f_bot, t_f_bot), and its area leaves none: give them "
               "in steel_design.shape(…)", param="section")
    w.calc("t_fc", "2*(A*y_bot - t_w*(d - t_f)^2/2 - b_f*t_f*(d - t_f/2))/K_bf", unit=u["ln"],
           desc="bottom flange thickness from the first moment of area about the bottom fibre (plates, no fillets)")
    ok = 0 < sc["t_fc"].m_as("mm") < (sc["d"] - sc["t_f"]).m_as("mm")
    if ok:
        w.calc("b_fc", "(K_bf + t_w*t_fc)/t_fc", unit=u["ln"], desc="bottom flange width from its area")
        ok = sc["b_fc"].m_as("mm") > sc["t_w"].m_as("mm")
    if not ok:
        w.fail("the bottom flange cannot be recovered from this section record's area and centroid: give b_f_bot "
               "and t_f_bot in steel_design.shape(…)", param="section")


def f4f5(ctx, L_b, C_b):
    """F4 or F5 for an I-shape about its major axis; returns the limit states {label: scope name}."""
    w, sc, u = ctx.work, ctx.sc, ctx.u
    d = aisc()
    singly = flange_geometry(ctx)
    w.calc("I_yc", "t_fc*b_fc^3/12", unit=u["i4"], desc="second moment of the compression flange about y")
    w.calc("lambda_hc", "h_c/t_w", unit="1", desc="web slenderness λ = h_c/t_w")
    w.calc("lambda_rw", "5.70*sqrt(E/F_y)", unit="1", desc=f"noncompact web limit, {STD} Table B4.1b case 15/16")
    slender = num(sc["lambda_hc"]) > num(sc["lambda_rw"])
    sc["L_b"], sc["C_b"] = L_b, C_b
    ratio = sc["I_yc"].m_as("mm^4") / sc["I_y"].m_as("mm^4")
    lim = d["F4"]["Iyc_over_Iy_limit"]
    w.calc("a_w", f"min(h_c*t_w/(b_fc*t_fc), {d['F5']['a_w_max']:g})" if slender else "h_c*t_w/(b_fc*t_fc)",
           unit="1", desc=f"{STD} Eq. F4-12" + (" (≤ 10 for F5)" if slender else ""))
    w.calc("r_t", "b_fc/sqrt(12*(1 + a_w/6))", unit=u["ln"], desc=f"effective radius of gyration for LTB, {STD} Eq. F4-11")
    w.calc("L_p", "1.1*r_t*sqrt(E/F_y)", unit=u["L"], desc=f"limiting unbraced length, yielding, {STD} Eq. F4-7")
    if slender:
        return _f5(ctx, singly)
    return _f4(ctx, singly, ratio, lim)


def _ltb_branch(ctx, clause_p, clause_i, clause_e):
    sc, u, w = ctx.sc, ctx.u, ctx.work
    lb, lp, lr = (sc[n].m_as("m") for n in ("L_b", "L_p", "L_r"))
    if lb <= lp:
        w.note(f"L_b = {sc['L_b'].m_as(u['L']):.3g} {u['L']} ≤ L_p = {sc['L_p'].m_as(u['L']):.3g} {u['L']}: "
               f"lateral-torsional buckling does not apply ({STD} {clause_p}).", kind="method")
        return None
    if lb <= lr:
        w.note(f"Inelastic LTB governs the LTB limit state: L_p < L_b ≤ L_r ({STD} {clause_i}).", kind="method")
        return "inelastic"
    w.note(f"Elastic LTB governs the LTB limit state: L_b > L_r ({STD} {clause_e}).", kind="method")
    return "elastic"


def _f4(ctx, singly, ratio, lim):
    w, sc, u = ctx.work, ctx.sc, ctx.u
    cap = aisc()["F4"]["Mp_cap_over_My"]
    w.note(f"The web is {'compact or ' if singly else ''}noncompact (h_c/t_w = {num(sc['lambda_hc']):.1f} ≤ λ_r = "
           f"{num(sc['lambda_rw']):.1f}): {STD} F4 applies ({'singly symmetric' if singly else 'doubly symmetric'} "
           f"I-shape).", kind="method")
    w.calc("M_p", f"min(F_y*Z_x, {cap:g}*F_y*S_x)", unit=u["mo"], desc=f"M_p = F_yZ_x ≤ 1.6F_yS_x, {STD} F4.2(c)(6)")
    w.calc("M_yc", "F_y*S_xc", unit=u["mo"], desc=f"yield moment in the compression flange, {STD} Eq. F4-4")
    if singly:
        w.calc("lambda_pw", "min(h_c/h_p*sqrt(E/F_y)/(0.54*M_p/(F_y*S_x) - 0.09)^2, lambda_rw)", unit="1",
               desc=f"compact web limit, singly symmetric, {STD} Table B4.1b case 16 (M_y = F_yS_x)")
    else:
        w.calc("lambda_pw", "3.76*sqrt(E/F_y)", unit="1", desc=f"compact web limit, {STD} Table B4.1b case 15")
    w.note(f"I_yc/I_y = {ratio:.3f} {'>' if ratio > lim else '≤'} {lim}: "
           f"{'the web plastification factor R_pc follows F4-9a/F4-9b' if ratio > lim else 'R_pc = 1 (F4-10) and J = 0 in F4-5'} "
           f"({STD} F4.2(c)(6)).", kind="method")
    if ratio <= lim:
        w.let("R_pc", w.q(1.0, ""), desc=f"web plastification factor, {STD} Eq. F4-10")
        w.let("J_e", w.q(0.0, u["i4"]), desc=f"J taken as 0 since I_yc/I_y ≤ {lim} ({STD} F4.2(c)(5))")
    elif num(sc["lambda_hc"]) <= num(sc["lambda_pw"]):
        w.calc("R_pc", "M_p/M_yc", unit="1", desc=f"web plastification factor, h_c/t_w ≤ λ_pw, {STD} Eq. F4-9a")
        w.calc("J_e", "J", unit=u["i4"], desc="torsional constant used in F4-5 and F4-8")
    else:
        w.calc("R_pc", "min(M_p/M_yc - (M_p/M_yc - 1)*(lambda_hc - lambda_pw)/(lambda_rw - lambda_pw), M_p/M_yc)",
               unit="1", desc=f"web plastification factor, h_c/t_w > λ_pw, {STD} Eq. F4-9b")
        w.calc("J_e", "J", unit=u["i4"], desc="torsional constant used in F4-5 and F4-8")
    w.calc("M_n_CFY", "R_pc*M_yc", unit=u["mo"], desc=f"compression flange yielding, {STD} Eq. F4-1")
    states = {"compression flange yielding (F4-1)": "M_n_CFY"}
    st_ratio = sc["S_xt"].m_as("mm^3") / sc["S_xc"].m_as("mm^3")
    if st_ratio >= aisc()["F4"]["Sxt_over_Sxc_limit"]:
        w.calc("F_L", "0.7*F_y", unit=u["st"], desc=f"S_xt/S_xc = {st_ratio:.3f} ≥ 0.7: {STD} Eq. F4-6a")
    else:
        w.calc("F_L", "max(F_y*S_xt/S_xc, 0.5*F_y)", unit=u["st"], desc=f"S_xt/S_xc = {st_ratio:.3f} < 0.7: {STD} Eq. F4-6b")
    w.calc("L_r", "1.95*r_t*E/F_L*sqrt(J_e/(S_xc*h_o) + sqrt((J_e/(S_xc*h_o))^2 + 6.76*(F_L/E)^2))", unit=u["L"],
           desc=f"limiting unbraced length, inelastic LTB, {STD} Eq. F4-8")
    branch = _ltb_branch(ctx, "F4.2(a)", "F4.2(b)", "F4.2(c)")
    if branch == "inelastic":
        w.calc("M_n_LTB", "min(C_b*(R_pc*M_yc - (R_pc*M_yc - F_L*S_xc)*(L_b - L_p)/(L_r - L_p)), R_pc*M_yc)",
               unit=u["mo"], desc=f"LTB, inelastic, {STD} Eq. F4-2")
        states["lateral-torsional buckling, inelastic (F4-2)"] = "M_n_LTB"
    elif branch == "elastic":
        w.calc("F_cr_LTB", "C_b*pi^2*E/(L_b/r_t)^2*sqrt(1 + 0.078*J_e/(S_xc*h_o)*(L_b/r_t)^2)", unit=u["st"],
               desc=f"critical stress, elastic LTB, {STD} Eq. F4-5")
        w.calc("M_n_LTB", "min(F_cr_LTB*S_xc, R_pc*M_yc)", unit=u["mo"], desc=f"LTB, elastic, {STD} Eq. F4-3")
        states["lateral-torsional buckling, elastic (F4-3)"] = "M_n_LTB"
    fl = ctx.classes["class_flange_flexure"]
    if fl == "noncompact":
        w.calc("M_n_FLB", f"R_pc*M_yc - (R_pc*M_yc - F_L*S_xc)*({ctx.lam_fc} - lambda_p_f)/(lambda_r_f - lambda_p_f)",
               unit=u["mo"], desc=f"compression flange local buckling, noncompact flange, {STD} Eq. F4-13")
        states["flange local buckling, noncompact (F4-13)"] = "M_n_FLB"
    elif fl == "slender":
        w.calc("k_c", "max(0.35, min(0.76, 4/sqrt(h/t_w)))", unit="1", desc=f"k_c = 4/√(h/t_w), 0.35 ≤ k_c ≤ 0.76 ({STD} F4.3)")
        w.calc("M_n_FLB", f"0.9*E*k_c*S_xc/{ctx.lam_fc}^2", unit=u["mo"],
               desc=f"compression flange local buckling, slender flange, {STD} Eq. F4-14")
        states["flange local buckling, slender (F4-14)"] = "M_n_FLB"
    else:
        w.note(f"Compact compression flange: flange local buckling does not apply ({STD} F4.3(a)).", kind="method")
    if st_ratio < 1 - 1e-9:
        w.calc("M_yt", "F_y*S_xt", unit=u["mo"], desc=f"yield moment in the tension flange, {STD} F4.4")
        if num(sc["R_pc"]) == 1.0 and sc["J_e"].magnitude == 0:
            w.let("R_pt", w.q(1.0, ""), desc=f"{STD} Eq. F4-17")
        elif num(sc["lambda_hc"]) <= num(sc["lambda_pw"]):
            w.calc("R_pt", "M_p/M_yt", unit="1", desc=f"{STD} Eq. F4-16a")
        else:
            w.calc("R_pt", "min(M_p/M_yt - (M_p/M_yt - 1)*(lambda_hc - lambda_pw)/(lambda_rw - lambda_pw), M_p/M_yt)",
                   unit="1", desc=f"{STD} Eq. F4-16b")
        w.calc("M_n_TFY", "R_pt*M_yt", unit=u["mo"], desc=f"tension flange yielding, {STD} Eq. F4-15")
        states["tension flange yielding (F4-15)"] = "M_n_TFY"
    else:
        w.note(f"S_xt ≥ S_xc: tension flange yielding does not apply ({STD} F4.4(a)).", kind="method")
    return states


def _f5(ctx, singly):
    w, sc, u = ctx.work, ctx.sc, ctx.u
    w.note(f"The web is slender (h_c/t_w = {num(sc['lambda_hc']):.1f} > λ_r = {num(sc['lambda_rw']):.1f}): "
           f"{STD} F5 applies.", kind="method")
    w.calc("R_pg", "min(1 - a_w/(1200 + 300*a_w)*(h_c/t_w - 5.7*sqrt(E/F_y)), 1)", unit="1",
           desc=f"bending strength reduction factor, {STD} Eq. F5-6")
    w.calc("M_n_CFY", "R_pg*F_y*S_xc", unit=u["mo"], desc=f"compression flange yielding, {STD} Eq. F5-1")
    states = {"compression flange yielding (F5-1)": "M_n_CFY"}
    w.calc("L_r", "pi*r_t*sqrt(E/(0.7*F_y))", unit=u["L"], desc=f"limiting unbraced length, {STD} Eq. F5-5")
    branch = _ltb_branch(ctx, "F5.2(a)", "F5.2(b)", "F5.2(c)")
    if branch == "inelastic":
        w.calc("F_cr_LTB", "min(C_b*(F_y - 0.3*F_y*(L_b - L_p)/(L_r - L_p)), F_y)", unit=u["st"],
               desc=f"critical stress, inelastic LTB, {STD} Eq. F5-3")
    elif branch == "elastic":
        w.calc("F_cr_LTB", "min(C_b*pi^2*E/(L_b/r_t)^2, F_y)", unit=u["st"], desc=f"critical stress, elastic LTB, {STD} Eq. F5-4")
    if branch:
        w.calc("M_n_LTB", "R_pg*F_cr_LTB*S_xc", unit=u["mo"], desc=f"lateral-torsional buckling, {STD} Eq. F5-2")
        states[f"lateral-torsional buckling, {branch} (F5-2)"] = "M_n_LTB"
    fl = ctx.classes["class_flange_flexure"]
    if fl == "noncompact":
        w.calc("F_cr_FLB", f"F_y - 0.3*F_y*({ctx.lam_fc} - lambda_p_f)/(lambda_r_f - lambda_p_f)", unit=u["st"],
               desc=f"critical stress, noncompact flange, {STD} Eq. F5-8")
    elif fl == "slender":
        w.calc("k_c", "max(0.35, min(0.76, 4/sqrt(h/t_w)))", unit="1", desc=f"k_c = 4/√(h/t_w), 0.35 ≤ k_c ≤ 0.76 ({STD} F5.3)")
        w.calc("F_cr_FLB", f"0.9*E*k_c/{ctx.lam_fc}^2", unit=u["st"], desc=f"critical stress, slender flange, {STD} Eq. F5-9")
    else:
        w.note(f"Compact compression flange: flange local buckling does not apply ({STD} F5.3(a)).", kind="method")
    if fl in ("noncompact", "slender"):
        w.calc("M_n_FLB", "R_pg*F_cr_FLB*S_xc", unit=u["mo"], desc=f"compression flange local buckling, {STD} Eq. F5-7")
        states[f"flange local buckling, {fl} (F5-7)"] = "M_n_FLB"
    if sc["S_xt"].m_as("mm^3") < sc["S_xc"].m_as("mm^3") * (1 - 1e-9):
        w.calc("M_n_TFY", "F_y*S_xt", unit=u["mo"], desc=f"tension flange yielding, {STD} Eq. F5-10")
        states["tension flange yielding (F5-10)"] = "M_n_TFY"
    else:
        w.note(f"S_xt ≥ S_xc: tension flange yielding does not apply ({STD} F5.4).", kind="method")
    return states
