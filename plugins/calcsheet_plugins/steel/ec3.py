"""EN 1993-1-1:2005+AC:2009 member checks for I and H sections: 5.5 classification, 6.2 resistances,
6.3.1 flexural buckling, 6.3.2 lateral-torsional buckling (M_cr with C_1/C_2), 6.3.3 interaction (Annex B).

Partial factors, Table 5.2 limits, the buckling curves and their selection are
data (en1993_1_1.toml, with National Annex overrides); C_1, C_2, k_c and C_m by
moment shape are in ltb_moment_factors.toml with their published source.
"""
from __future__ import annotations

from calcsheet.plugin import Field, Param

from . import namespace
from .common import ec3, field, form_of, moment_factors, num, positive, tidy

STD = "EN 1993-1-1"
SHAPES = ("uniform", "end_moments", "udl", "point_mid")
CLASS_RANK = {1: 1, 2: 2, 3: 3, 4: 4}


def _units(work):
    return {"st": "MPa", "fo": "kN", "mo": "kN*m", "ln": "mm", "ar": "mm^2", "L": "m", "i4": "mm^4", "i3": "mm^3",
            "i6": "mm^6"}


class _Ctx:
    def __init__(self, work, section, material, f_y, E, G, na, fabrication):
        self.work, self.sc, self.u = work, work.scope, _units(work)
        w, sc, u = work, work.scope, self.u
        if section is None:
            w.fail("give section=… (a section record: steel_design.shape(…), section.rolled(…))", param="section")
        self.section = section
        if form_of(section, None) not in ("I", ""):
            w.fail(f"{STD} checks in this plugin cover I and H sections only (5.5, 6.2.9.1, 6.3.2.3); "
                   f"this section is {form_of(section, None)}", param="section")
        self.fabrication = fabrication or str(section.fields.get("fabrication", "rolled"))
        if self.fabrication not in ("rolled", "welded"):
            w.fail(f"fabrication must be rolled or welded for an I/H section, not {self.fabrication}", param="fabrication")
        data = ec3()
        annex = data["national_annex"].get(na)
        if annex is None:
            w.fail(f"no national annex '{na}' in the data; known: {', '.join(data['national_annex'])}", param="na")
        self.na = na
        pf = {**data["partial_factors"], **{k: v for k, v in annex.items() if k.startswith("gamma")}}
        for g in ("gamma_M0", "gamma_M1"):
            w.let(g, w.q(pf[g], ""), desc=f"partial factor, {STD} {data['partial_factors']['clause']}",
                  note=f"{annex['source']}")
        ltb = {**data["ltb"], **{k: v for k, v in annex.items() if k in ("lambda_LT_0", "beta")}}
        self.ltb_data = ltb
        sh = {**data["shear"], **{k: v for k, v in annex.items() if k == "eta"}}
        w.let("eta", w.q(sh["eta"], ""), desc=f"shear area factor η, {STD} {sh['clause']} (conservative 1.0)")
        # material
        consts = data["constants"]
        for name, given, key in (("f_y", f_y, "f_y"), ("E", E, "E"), ("G", G, "G")):
            if given is not None:
                sc[name] = given
            elif material is not None and key in material.fields:
                w.let(name, material.fields[key], unit="MPa", desc=f"{name} of {material.fields.get('name', 'the material')}",
                      note="from the material")
            elif name in ("E", "G"):
                c = consts[name]
                w.let(name, w.q(c["value"], c["unit"]), unit="MPa", desc=name, note=c["source"])
            else:
                w.fail("give f_y=… or material=… (a material record with f_y)", param="f_y")
            positive(w, name, sc[name])
        # section, in EN 1993 axis names (y–y major, z–z minor)
        rows = []
        for ec, ours, unit, desc in (("A", "A", "ar", "area"), ("h", "d", "ln", "depth"), ("b", "b_f", "ln", "width"),
                                     ("t_w", "t_w", "ln", "web thickness"), ("t_f", "t_f", "ln", "flange thickness"),
                                     ("I_y", "I_x", "i4", "second moment, major axis"),
                                     ("I_z", "I_y", "i4", "second moment, minor axis"),
                                     ("W_el_y", "S_x", "i3", "elastic modulus, y–y"), ("W_pl_y", "Z_x", "i3", "plastic modulus, y–y"),
                                     ("W_el_z", "S_y", "i3", "elastic modulus, z–z"), ("W_pl_z", "Z_y", "i3", "plastic modulus, z–z"),
                                     ("I_t", "J", "i4", "torsion constant"), ("I_w", "C_w", "i6", "warping constant")):
            v = field(section, ours)
            if v is None:
                w.fail(f"the section record has no {ours} ({desc}; EN 1993 symbol {ec}), which {STD} needs here",
                       param="section", hint="give it in steel_design.shape(…)")
            sc[ec] = v
            rows.append([ec, ours, desc, v.to(u[unit])])
        r = field(section, "r")
        sc["r"] = r if r is not None else w.q(0.0, "mm")
        rows.append(["r", "r", "root radius" + ("" if r is not None else " (not given: 0)"), sc["r"].to("mm")])
        w.table("Section properties used (EN 1993 axes: y–y major = the record's x, z–z minor = its y)",
                ["EN 1993", "record", "Property", "Value"], rows,
                note=f"section: {section.fields.get('name', section.source or 'given')}, {self.fabrication}")
        w.calc("epsilon", "sqrt(235 MPa/f_y)", unit="1", desc=f"ε = √(235/f_y), {STD} Table 5.2")
        self.grade = "S460" if sc["f_y"].m_as("MPa") > 440 + 1e-9 else "S235-S420"

    # ------------------------------------------------------------ 5.5 classification
    def classify(self, N_Ed, bending):
        w, sc, t = self.work, self.sc, ec3()["table_5_2"]
        eps = num(sc["epsilon"])
        root = "2*r" if self.fabrication == "rolled" else "0 mm"
        w.calc("c_f", f"(b - t_w - {root})/2", unit="mm", desc=f"flange outstand c, {STD} Table 5.2 (sheet 2)")
        w.calc("c_w", f"h - 2*t_f - {root}", unit="mm", desc=f"web depth c, {STD} Table 5.2 (sheet 1)")
        w.calc("ct_f", "c_f/t_f", unit="1", desc="flange c/t")
        w.calc("ct_w", "c_w/t_w", unit="1", desc="web c/t")
        lf, lw = num(sc["ct_f"]), num(sc["ct_w"])
        o = t["outstand_compression"]
        f_lims = [o["class1"] * eps, o["class2"] * eps, o["class3"] * eps]
        n = 0.0 if N_Ed is None else N_Ed.m_as("N")
        if n > 0 and bending:
            w.calc("alpha_w", "min(1, (c_w/2 + N_Ed/(2*t_w*f_y))/c_w)", unit="1",
                   desc="plastic neutral axis parameter α of the web (Table 5.2, symmetric I under N and M_y)")
            w.calc("psi_w", "max(-1, 2*N_Ed/(A*f_y) - 1)", unit="1",
                   desc="elastic stress ratio ψ of the web, ψ = 2N_Ed/(A f_y) − 1 (common practice)")
            a, psi = num(sc["alpha_w"]), num(sc["psi_w"])
            c = t["web_bending_compression"]
            if a > 0.5:
                l1, l2 = c["class1_alpha_gt_half"] * eps / (13 * a - 1), c["class2_alpha_gt_half"] * eps / (13 * a - 1)
            else:
                l1, l2 = c["class1_alpha_le_half"] * eps / a, c["class2_alpha_le_half"] * eps / a
            l3 = c["class3_psi_gt_m1"] * eps / (0.67 + 0.33 * psi) if psi > -1 else \
                c["class3_psi_le_m1"] * eps * (1 - psi) * (-psi) ** 0.5
            w_lims, w_case = [l1, l2, l3], f"bending and compression (α = {a:.3f}, ψ = {psi:.3f})"
        elif n > 0:
            c = t["web_compression"]
            w_lims, w_case = [c["class1"] * eps, c["class2"] * eps, c["class3"] * eps], "compression"
        else:
            c = t["web_bending"]
            w_lims, w_case = [c["class1"] * eps, c["class2"] * eps, c["class3"] * eps], "bending"

        def cls(lam, lims):
            return next((i + 1 for i, lim in enumerate(lims) if lam <= lim), 4)

        cf, cw = cls(lf, f_lims), cls(lw, w_lims)
        self.klass = max(cf, cw)
        self.parts = (cf, cw)
        w.table(f"{STD} 5.5, Table 5.2 classification (ε = {eps:.3f})",
                ["Part", "stress", "c/t", "class 1 limit", "class 2 limit", "class 3 limit", "class"],
                [["flange outstand", "compression", f"{lf:.2f}", *(f"{x:.2f}" for x in f_lims), cf],
                 ["web (internal)", w_case, f"{lw:.2f}", *(f"{x:.2f}" for x in w_lims), cw]])
        w.note(f"Cross-section class {self.klass} ({STD} 5.5.2(6): the highest class of its parts; flange class {cf}, "
               f"web class {cw}).", kind="method")
        if self.klass == 4:
            w.fail(f"the section is class 4 ({'flange' if cf == 4 else 'web'} c/t exceeds the class 3 limit): effective "
                   f"properties ({STD} 6.2.2.5, EN 1993-1-5) are out of scope", param="section")
        return self.klass

    # ------------------------------------------------------------ 6.2 cross-section resistances
    def resistances(self, N_Ed, M_y_Ed, M_z_Ed, V_Ed):
        w, sc = self.work, self.sc
        plastic = self.klass <= 2
        w.calc("N_pl_Rd", "A*f_y/gamma_M0", unit="kN", desc=f"plastic resistance (tension 6.2.3 Eq. 6.6; compression "
                                                            f"6.2.4 Eq. 6.10, class 1–3)")
        wy, wz = ("W_pl_y", "W_pl_z") if plastic else ("W_el_y", "W_el_z")
        w.calc("M_c_y_Rd", f"{wy}*f_y/gamma_M0", unit="kN*m",
               desc=f"bending resistance about y–y, {STD} 6.2.5 Eq. {'6.13' if plastic else '6.14'}")
        w.calc("M_c_z_Rd", f"{wz}*f_y/gamma_M0", unit="kN*m",
               desc=f"bending resistance about z–z, {STD} 6.2.5 Eq. {'6.13' if plastic else '6.14'}")
        root = "2*r" if self.fabrication == "rolled" else "0 mm"
        w.calc("h_w", "h - 2*t_f", unit="mm", desc="web depth between flanges h_w")
        if self.fabrication == "rolled":
            w.calc("A_v", f"max(A - 2*b*t_f + (t_w + {root})*t_f, eta*h_w*t_w)", unit="mm^2",
                   desc=f"shear area, rolled I/H, load parallel to web, {STD} 6.2.6(3)(a)")
        else:
            w.calc("A_v", "eta*h_w*t_w", unit="mm^2", desc=f"shear area, welded I/H, {STD} 6.2.6(3)(d)")
        lim = 72 * num(sc["epsilon"]) / num(sc["eta"])
        if sc["h_w"].m_as("mm") / sc["t_w"].m_as("mm") > lim:
            w.fail(f"h_w/t_w > 72ε/η = {lim:.1f}: shear buckling must be checked to EN 1993-1-5 Section 5 "
                   f"({STD} 6.2.6(6)), which is out of scope", param="section")
        w.calc("V_pl_Rd", "A_v*(f_y/sqrt(3))/gamma_M0", unit="kN", desc=f"plastic shear resistance, {STD} 6.2.6 Eq. 6.18")
        utils = {}
        if V_Ed is not None:
            w.calc("util_shear", "V_Ed/V_pl_Rd", unit="1", desc=f"shear, {STD} 6.2.6 Eq. 6.17")
            w.check("V_Ed <= V_pl_Rd", desc=f"shear, {STD} 6.2.6 (6.17)")
            utils["util_shear"] = "shear (6.2.6)"
        # 6.2.8 bending and shear
        w.calc("M_y_V_Rd", "M_c_y_Rd", unit="kN*m", desc="bending resistance about y–y allowing for shear")
        if V_Ed is not None and V_Ed.m_as("N") > 0.5 * sc["V_pl_Rd"].m_as("N"):
            w.note(f"V_Ed > 0.5 V_pl,Rd: the moment resistance is reduced for shear ({STD} 6.2.8(3)).", kind="method")
            w.calc("rho_V", "(2*V_Ed/V_pl_Rd - 1)^2", unit="1", desc=f"{STD} 6.2.8(3)")
            w.calc("A_w", "h_w*t_w", unit="mm^2", desc="web area A_w = h_w·t_w")
            w.calc("M_y_V_Rd", f"min(({wy} - rho_V*A_w^2/(4*t_w))*f_y/gamma_M0, M_c_y_Rd)", unit="kN*m",
                   desc=f"reduced bending resistance for shear, {STD} 6.2.8(5) Eq. 6.30")
        elif V_Ed is not None:
            w.note(f"V_Ed ≤ 0.5 V_pl,Rd: no reduction of the moment resistance for shear ({STD} 6.2.8(2)).", kind="method")
        n = 0.0 if N_Ed is None else N_Ed.m_as("N")
        my = 0.0 if M_y_Ed is None else M_y_Ed.m_as("N*m")
        mz = 0.0 if M_z_Ed is None else M_z_Ed.m_as("N*m")
        for nm in ("N_Ed", "M_y_Ed", "M_z_Ed"):
            if sc.get(nm) is None:
                sc[nm] = w.q(0.0, "kN" if nm == "N_Ed" else "kN*m")
        if n > 0:
            w.calc("util_axial", "N_Ed/N_pl_Rd", unit="1", desc=f"compression, {STD} 6.2.4 Eq. 6.9")
            utils["util_axial"] = "compression (6.2.4)"
        if my > 0 or mz > 0:
            if n == 0:
                w.calc("util_bending", "max(M_y_Ed/M_y_V_Rd, M_z_Ed/M_c_z_Rd)", unit="1",
                       desc=f"bending, {STD} 6.2.5 Eq. 6.12")
                if my > 0 and mz > 0:
                    w.calc("util_bending", "M_y_Ed/M_y_V_Rd + M_z_Ed/M_c_z_Rd", unit="1",
                           desc=f"biaxial bending, linear sum, {STD} 6.2.1(7) Eq. 6.2 (conservative)")
            elif plastic:
                self.n_m_plastic()
            else:
                w.note(f"Class 3: bending and axial force by the elastic stress check ({STD} 6.2.9.2).", kind="method")
                w.calc("sigma_x_Ed", "N_Ed/A + M_y_Ed/W_el_y + M_z_Ed/W_el_z", unit="MPa",
                       desc=f"largest longitudinal stress, {STD} 6.2.9.2")
                w.calc("util_bending", "sigma_x_Ed/(f_y/gamma_M0)", unit="1", desc=f"{STD} 6.2.9.2 Eq. 6.42")
            w.check("util_bending <= 1", desc=f"cross-section, bending{' and axial force' if n > 0 else ''}, {STD} 6.2")
            utils["util_bending"] = "cross-section bending" + (" and axial force (6.2.9)" if n > 0 else " (6.2.5)")
        return utils

    def n_m_plastic(self):
        w, sc = self.work, self.sc
        w.calc("n", "N_Ed/N_pl_Rd", unit="1", desc=f"{STD} 6.2.9.1(5)")
        w.calc("a_w", "min((A - 2*b*t_f)/A, 0.5)", unit="1", desc=f"{STD} 6.2.9.1(5)")
        n, N = num(sc["n"]), sc["N_Ed"].m_as("N")
        hw_tw_fy = (sc["h_w"] * sc["t_w"] * sc["f_y"] / sc["gamma_M0"]).m_as("N")
        if N <= 0.25 * sc["N_pl_Rd"].m_as("N") and N <= 0.5 * hw_tw_fy:
            w.note(f"N_Ed ≤ 0.25 N_pl,Rd and N_Ed ≤ 0.5 h_w t_w f_y/γ_M0: no allowance for axial force about y–y "
                   f"({STD} 6.2.9.1(4), Eqs. 6.33, 6.34).", kind="method")
            w.calc("M_N_y_Rd", "M_y_V_Rd", unit="kN*m", desc="no reduction for axial force")
        else:
            w.calc("M_N_y_Rd", "min(M_y_V_Rd*(1 - n)/(1 - 0.5*a_w), M_y_V_Rd)", unit="kN*m",
                   desc=f"reduced plastic moment about y–y, {STD} 6.2.9.1(5) Eq. 6.36")
        if N <= hw_tw_fy:
            w.note(f"N_Ed ≤ h_w t_w f_y/γ_M0: no allowance for axial force about z–z ({STD} 6.2.9.1(4), Eq. 6.35).",
                   kind="method")
            w.calc("M_N_z_Rd", "M_c_z_Rd", unit="kN*m", desc="no reduction for axial force")
        elif n <= num(sc["a_w"]):
            w.calc("M_N_z_Rd", "M_c_z_Rd", unit="kN*m", desc=f"n ≤ a: M_N,z,Rd = M_pl,z,Rd, {STD} Eq. 6.37")
        else:
            w.calc("M_N_z_Rd", "M_c_z_Rd*(1 - ((n - a_w)/(1 - a_w))^2)", unit="kN*m", desc=f"{STD} Eq. 6.38")
        w.calc("beta_n", "max(5*n, 1)", unit="1", desc=f"β = 5n ≥ 1, {STD} 6.2.9.1(6)")
        w.calc("util_bending", "(M_y_Ed/M_N_y_Rd)^2 + (M_z_Ed/M_N_z_Rd)^beta_n", unit="1",
               desc=f"bi-axial bending with axial force, {STD} 6.2.9.1(6) Eq. 6.41 (α = 2)")

    # ------------------------------------------------------------ 6.3.1 flexural buckling
    def flexural_buckling(self, L, L_z, N_Ed):
        w, sc, d = self.work, self.sc, ec3()
        sc["L_cr_y"] = L
        sc["L_cr_z"] = L_z if L_z is not None else L
        h_b = sc["h"].m_as("mm") / sc["b"].m_as("mm")
        tf = sc["t_f"].m_as("mm")
        form = f"{self.fabrication} I"
        rule = next(r for r in d["table_6_2"] if r["form"] == form and (form == "welded I" or
                                                                       (h_b > r["h_b_min"] if r["h_b_min"] else h_b <= 1.2))
                    and tf <= r["tf_max"])
        curves = {ax: rule[ax][self.grade] for ax in ("y", "z")}
        w.note(f"Buckling curves ({STD} Table 6.2): {form} section, {rule['condition']} (h/b = {h_b:.2f}, t_f = {tf:g} mm), "
               f"{self.grade}: curve {curves['y']} about y–y, {curves['z']} about z–z.", kind="method")
        for ax in ("y", "z"):
            sc[f"alpha_{ax}"] = w.q(d["table_6_1"][curves[ax]], "")
            w.let(f"alpha_{ax}", sc[f"alpha_{ax}"], desc=f"imperfection factor, curve {curves[ax]}, {STD} Table 6.1")
            w.calc(f"N_cr_{ax}", f"pi^2*E*I_{ax}/L_cr_{ax}^2", unit="kN", desc=f"elastic critical force about {ax}–{ax}")
            w.calc(f"lambda_{ax}", f"sqrt(A*f_y/N_cr_{ax})", unit="1", desc=f"non-dimensional slenderness, {STD} 6.3.1.2 Eq. 6.50")
            w.calc(f"Phi_{ax}", f"0.5*(1 + alpha_{ax}*(lambda_{ax} - 0.2) + lambda_{ax}^2)", unit="1",
                   desc=f"{STD} 6.3.1.2(1)")
            w.calc(f"chi_{ax}", f"min(1, 1/(Phi_{ax} + sqrt(Phi_{ax}^2 - lambda_{ax}^2)))", unit="1",
                   desc=f"reduction factor, {STD} 6.3.1.2 Eq. 6.49 (χ ≤ 1)")
        w.calc("chi_min", "min(chi_y, chi_z)", unit="1", desc="governing reduction factor")
        w.calc("N_b_Rd", "chi_min*A*f_y/gamma_M1", unit="kN", desc=f"buckling resistance, {STD} 6.3.1.1 Eq. 6.47")
        ax = "y" if num(sc["chi_y"]) <= num(sc["chi_z"]) else "z"
        w.note(f"Flexural buckling about {ax}–{ax} governs (λ̄ = {num(sc['lambda_' + ax]):.3f}, χ = "
               f"{num(sc['chi_' + ax]):.3f}). Torsional and flexural-torsional buckling (6.3.1.4) are taken as not "
               f"governing for a doubly symmetric I/H section whose torsional buckling length does not exceed L_cr,z "
               f"(common practice).", kind="method")
        if N_Ed is not None and N_Ed.m_as("N") > 0:
            lam_max = max(num(sc["lambda_y"]), num(sc["lambda_z"]))
            ratio = N_Ed.m_as("N") / min(sc["N_cr_y"].m_as("N"), sc["N_cr_z"].m_as("N"))
            if lam_max <= 0.2 or ratio <= 0.04:
                w.note(f"λ̄ = {lam_max:.3f} ≤ 0.2 or N_Ed/N_cr = {ratio:.3f} ≤ 0.04: buckling effects may be ignored "
                       f"and only the cross-section checks apply ({STD} 6.3.1.2(4)); the buckling check is still "
                       f"shown.", kind="method")
            w.calc("util_buckling", "N_Ed/N_b_Rd", unit="1", desc=f"flexural buckling, {STD} 6.3.1.1 Eq. 6.46")
            w.check("N_Ed <= N_b_Rd", desc=f"flexural buckling, {STD} 6.3.1.1 (6.46)")
            return {"util_buckling": f"flexural buckling about {ax}–{ax} (6.3.1)"}
        return {}

    # ------------------------------------------------------------ 6.3.2 LTB
    def ltb(self, L_LT, shape, psi, z_g, C_1, method, M_y_Ed):
        w, sc, d, mf = self.work, self.sc, ec3(), moment_factors()
        if L_LT is None:
            w.note(f"No lateral-torsional buckling length given: the compression flange is taken as continuously "
                   f"restrained, so LTB does not apply ({STD} 6.3.2.1, 6.3.2.2(4)).", kind="method")
            w.let("chi_LT", w.q(1.0, ""), desc="no LTB")
            return {}
        sc["L_LT"] = L_LT
        sc["z_g"] = z_g if z_g is not None else w.q(0.0, "mm")
        if C_1 is not None:
            w.let("C_1", C_1, desc="equivalent moment factor C_1", note="given")
            w.let("C_2", w.q(0.0, ""), desc="C_2", note="C_1 given: load-height term not used")
        elif shape in ("uniform", "end_moments"):
            p = 1.0 if shape == "uniform" else num(psi)
            if not -1 <= p <= 1:
                w.fail("psi must lie between -1 and 1", param="psi")
            sc["psi_LT"] = w.q(p, "")
            for name, s_ in (("M_A_r", 0.25), ("M_B_r", 0.5), ("M_C_r", 0.75)):
                w.calc(name, f"abs(1 - (1 - psi_LT)*{s_})", unit="1",
                       desc=f"|M|/M_max at the {'quarter' if s_ == 0.25 else ('mid' if s_ == 0.5 else 'three-quarter')} "
                            f"point of the linear diagram M(1 − (1 − ψ)x/L), ψ = {p:g}")
            w.calc("C_1", "sqrt(35/(1 + 9*M_A_r^2 + 16*M_B_r^2 + 9*M_C_r^2))", unit="1",
                   desc="C_1 = √(35M_max²/(M_max² + 9M_A² + 16M_B² + 9M_C²)), k = 1")
            self.work.working.items[-1].note = mf["source"]["C1_linear"]
            w.let("C_2", w.q(0.0, ""), desc="C_2 = 0: no transverse load")
        else:
            t = mf[shape]
            w.let("C_1", w.q(t["C1"], ""), desc=f"C_1, {t['text']}", note=mf["source"]["C1_C2"])
            w.let("C_2", w.q(t["C2"], ""), desc=f"C_2, {t['text']}", note=mf["source"]["C1_C2"])
        w.calc("M_cr", "C_1*pi^2*E*I_z/L_LT^2*(sqrt(I_w/I_z + L_LT^2*G*I_t/(pi^2*E*I_z) + (C_2*z_g)^2) - C_2*z_g)",
               unit="kN*m", desc="elastic critical moment, k = k_w = 1, load height z_g above the shear centre "
                                 "(NCCI SN003a Eq. (1); EN 1993-1-1 gives no formula: 6.3.2.2(2) NOTE)")
        wy = "W_pl_y" if self.klass <= 2 else "W_el_y"
        w.calc("W_y", wy, unit="mm^3", desc=f"W_y = {'W_pl,y (class 1, 2)' if self.klass <= 2 else 'W_el,y (class 3)'}, "
                                             f"{STD} 6.3.2.2(1)")
        w.calc("lambda_LT", "sqrt(W_y*f_y/M_cr)", unit="1", desc=f"non-dimensional slenderness, {STD} 6.3.2.2 Eq. 6.56")
        h_b = sc["h"].m_as("mm") / sc["b"].m_as("mm")
        key = f"{self.fabrication}_I_h_b_{'le' if h_b <= 2 else 'gt'}_2"
        if method == "rolled":
            curve = d["table_6_5"][key]
            lam0, beta = self.ltb_data["lambda_LT_0"], self.ltb_data["beta"]
            w.note(f"LTB by {STD} 6.3.2.3 (rolled or equivalent welded sections): Table 6.5, {self.fabrication} I, "
                   f"h/b = {h_b:.2f} → curve {curve}; λ̄_LT,0 = {lam0}, β = {beta} ({self.ltb_data['clause']}, "
                   f"{'recommended' if self.na == 'recommended' else self.na + ' annex'}).", kind="method")
            w.let("alpha_LT", w.q(d["table_6_1"][curve], ""), desc=f"imperfection factor, curve {curve}, {STD} Table 6.3")
            w.let("lambda_LT_0", w.q(lam0, ""), desc=f"plateau length, {STD} 6.3.2.3(1)")
            w.let("beta_LT", w.q(beta, ""), desc=f"{STD} 6.3.2.3(1)")
            w.calc("Phi_LT", "0.5*(1 + alpha_LT*(lambda_LT - lambda_LT_0) + beta_LT*lambda_LT^2)", unit="1",
                   desc=f"{STD} 6.3.2.3(1)")
            w.calc("chi_LT_0", "min(1, 1/lambda_LT^2, 1/(Phi_LT + sqrt(Phi_LT^2 - beta_LT*lambda_LT^2)))", unit="1",
                   desc=f"reduction factor, {STD} 6.3.2.3 Eq. 6.57 (χ_LT ≤ 1, ≤ 1/λ̄_LT²)")
            if shape in ("udl", "point_mid") and C_1 is None:
                w.let("k_c", w.q(mf[shape]["k_c"], ""), desc=f"correction factor, {mf[shape]['text']}", note=mf["source"]["k_c"])
            else:
                p = 1.0 if shape == "uniform" or psi is None else num(psi)
                sc["psi_kc"] = w.q(p, "")
                w.calc("k_c", "1/(1.33 - 0.33*psi_kc)", unit="1", desc=f"correction factor, linear moment, {STD} Table 6.6")
            w.calc("f_mod", "min(1, 1 - 0.5*(1 - k_c)*(1 - 2*(lambda_LT - 0.8)^2))", unit="1",
                   desc=f"modification factor f, {STD} 6.3.2.3(2) Eq. 6.58")
            w.calc("chi_LT", "min(1, 1/lambda_LT^2, chi_LT_0/f_mod)", unit="1", desc=f"χ_LT,mod, {STD} 6.3.2.3(2) Eq. 6.58")
        else:
            curve = d["table_6_4"][key]
            w.note(f"LTB by {STD} 6.3.2.2 (general case): Table 6.4, {self.fabrication} I, h/b = {h_b:.2f} → curve {curve}.",
                   kind="method")
            w.let("alpha_LT", w.q(d["table_6_1"][curve], ""), desc=f"imperfection factor, curve {curve}, {STD} Table 6.3")
            w.calc("Phi_LT", "0.5*(1 + alpha_LT*(lambda_LT - 0.2) + lambda_LT^2)", unit="1", desc=f"{STD} 6.3.2.2(1)")
            w.calc("chi_LT", "min(1, 1/(Phi_LT + sqrt(Phi_LT^2 - lambda_LT^2)))", unit="1",
                   desc=f"reduction factor, {STD} 6.3.2.2 Eq. 6.56 (χ_LT ≤ 1)")
            lam0 = 0.2
        lam = num(sc["lambda_LT"])
        if lam <= lam0:
            w.note(f"λ̄_LT = {lam:.3f} ≤ λ̄_LT,0 = {lam0}: lateral-torsional buckling effects may be ignored "
                   f"({STD} 6.3.2.2(4)); χ_LT as computed is 1.", kind="method")
        else:
            w.note(f"λ̄_LT = {lam:.3f} > λ̄_LT,0 = {lam0}: lateral-torsional buckling reduces the resistance "
                   f"(χ_LT = {num(sc['chi_LT']):.3f}).", kind="method")
        w.calc("M_b_Rd", "chi_LT*W_y*f_y/gamma_M1", unit="kN*m", desc=f"buckling resistance moment, {STD} 6.3.2.1 Eq. 6.55")
        if M_y_Ed is not None and M_y_Ed.m_as("N*m") > 0:
            w.calc("util_LTB", "M_y_Ed/M_b_Rd", unit="1", desc=f"lateral-torsional buckling, {STD} 6.3.2.1 Eq. 6.54")
            w.check("M_y_Ed <= M_b_Rd", desc=f"lateral-torsional buckling, {STD} 6.3.2.1 (6.54)")
            return {"util_LTB": "lateral-torsional buckling (6.3.2)"}
        return {}

    # ------------------------------------------------------------ 6.3.3 interaction, Annex B
    def interaction(self, shape, psi, psi_z, ltb_possible):
        w, sc, mf = self.work, self.sc, moment_factors()
        if shape in ("udl", "point_mid"):
            w.let("C_my", w.q(mf[shape]["C_m"], ""), desc=f"equivalent uniform moment factor, {mf[shape]['text']}",
                  note=mf["source"]["C_m"])
        else:
            sc["psi_y"] = w.q(1.0 if shape == "uniform" or psi is None else num(psi), "")
            w.calc("C_my", "max(0.4, 0.6 + 0.4*psi_y)", unit="1", desc=f"C_my, linear moment, {STD} Annex B Table B.3")
        sc["psi_z"] = w.q(1.0 if psi_z is None else num(psi_z), "")
        w.calc("C_mz", "max(0.4, 0.6 + 0.4*psi_z)", unit="1", desc=f"C_mz, linear moment (ψ_z), {STD} Annex B Table B.3")
        w.calc("C_mLT", "C_my", unit="1", desc="C_mLT: the same moment diagram between lateral restraints (Table B.3)")
        w.calc("n_y", "N_Ed/(chi_y*A*f_y/gamma_M1)", unit="1", desc=f"{STD} Annex B, n_y")
        w.calc("n_z", "N_Ed/(chi_z*A*f_y/gamma_M1)", unit="1", desc=f"{STD} Annex B, n_z")
        table = "B.2" if ltb_possible else "B.1"
        w.note(f"Interaction factors by {STD} Annex B (alternative method 2), Table {table} "
               f"({'members susceptible to torsional deformations' if ltb_possible else 'members not susceptible to torsional deformations'}), "
               f"class {self.klass}.", kind="method")
        if self.klass <= 2:
            w.calc("k_yy", "min(C_my*(1 + (lambda_y - 0.2)*n_y), C_my*(1 + 0.8*n_y))", unit="1", desc=f"k_yy, Table {table}")
            w.calc("k_zz", "min(C_mz*(1 + (2*lambda_z - 0.6)*n_z), C_mz*(1 + 1.4*n_z))", unit="1", desc=f"k_zz (I sections), Table {table}")
            w.calc("k_yz", "0.6*k_zz", unit="1", desc=f"k_yz, Table {table}")
            if not ltb_possible:
                w.calc("k_zy", "0.6*k_yy", unit="1", desc="k_zy, Table B.1")
            elif num(sc["lambda_z"]) < 0.4:
                w.calc("k_zy", "min(0.6 + lambda_z, 1 - 0.1*lambda_z*n_z/(C_mLT - 0.25))", unit="1", desc="k_zy, λ̄_z < 0.4, Table B.2")
            else:
                w.calc("k_zy", "max(1 - 0.1*lambda_z*n_z/(C_mLT - 0.25), 1 - 0.1*n_z/(C_mLT - 0.25))", unit="1", desc="k_zy, Table B.2")
        else:
            w.calc("k_yy", "min(C_my*(1 + 0.6*lambda_y*n_y), C_my*(1 + 0.6*n_y))", unit="1", desc=f"k_yy (class 3), Table {table}")
            w.calc("k_zz", "min(C_mz*(1 + 0.6*lambda_z*n_z), C_mz*(1 + 0.6*n_z))", unit="1", desc=f"k_zz (class 3), Table {table}")
            w.calc("k_yz", "k_zz", unit="1", desc=f"k_yz (class 3), Table {table}")
            if not ltb_possible:
                w.calc("k_zy", "0.8*k_yy", unit="1", desc="k_zy (class 3), Table B.1")
            else:
                w.calc("k_zy", "max(1 - 0.05*lambda_z*n_z/(C_mLT - 0.25), 1 - 0.05*n_z/(C_mLT - 0.25))", unit="1",
                       desc="k_zy (class 3), Table B.2")
        wz = "W_pl_z" if self.klass <= 2 else "W_el_z"
        wy = "W_pl_y" if self.klass <= 2 else "W_el_y"
        w.calc("M_y_Rk", f"{wy}*f_y", unit="kN*m", desc="characteristic moment resistance about y–y (Table 6.7)")
        w.calc("M_z_Rk", f"{wz}*f_y", unit="kN*m", desc="characteristic moment resistance about z–z (Table 6.7)")
        w.calc("N_Rk", "A*f_y", unit="kN", desc="characteristic resistance to normal force (Table 6.7)")
        w.calc("util_661", "N_Ed/(chi_y*N_Rk/gamma_M1) + k_yy*M_y_Ed/(chi_LT*M_y_Rk/gamma_M1) + k_yz*M_z_Ed/(M_z_Rk/gamma_M1)",
               unit="1", desc=f"member interaction, {STD} 6.3.3(4) Eq. 6.61")
        w.calc("util_662", "N_Ed/(chi_z*N_Rk/gamma_M1) + k_zy*M_y_Ed/(chi_LT*M_y_Rk/gamma_M1) + k_zz*M_z_Ed/(M_z_Rk/gamma_M1)",
               unit="1", desc=f"member interaction, {STD} 6.3.3(4) Eq. 6.62")
        w.calc("util_interaction", "max(util_661, util_662)", unit="1", desc="governing of (6.61) and (6.62)")
        w.check("util_interaction <= 1", desc=f"member buckling, bending and axial compression, {STD} 6.3.3 (6.61)/(6.62)")
        return {"util_interaction": "member interaction (6.3.3)"}


COMMON = [
    Param("section", kind="record", record="section", doc="an I or H section (steel_design.shape, section.rolled)"),
    Param("material", kind="record", record="material", doc="material record (f_y, E, G)", default=None),
    Param("f_y", "[pressure]", "yield strength (default material.f_y)", default=None),
    Param("E", "[pressure]", "modulus of elasticity (default material.E, else 210 GPa)", default=None),
    Param("G", "[pressure]", "shear modulus (default material.G, else 81 GPa)", default=None),
    Param("na", kind="text", doc="National Annex values to use (data: en1993_1_1.toml)", default="recommended"),
    Param("fabrication", kind="text", choices=("rolled", "welded"), doc="rolled or welded (default: from the record)",
          default=None),
]
BUCKLING = [Param("L", "[length]", "buckling length about y–y, L_cr,y"),
            Param("L_z", "[length]", "buckling length about z–z, L_cr,z (default L)", default=None)]
LTB = [Param("L_LT", "[length]", "length between lateral restraints for LTB (omit: continuously restrained)", default=None),
       Param("moment_shape", kind="text", choices=SHAPES, doc="moment diagram between restraints", default="uniform"),
       Param("psi", doc="end moment ratio ψ for moment_shape=\"end_moments\" (−1 … 1)", default=None),
       Param("z_g", "[length]", "load height above the shear centre (positive: destabilising)", default=None),
       Param("C_1", doc="C_1 given directly (overrides the moment shape)", default=None),
       Param("ltb_method", kind="text", choices=("rolled", "general"),
             doc="6.3.2.3 (rolled or equivalent welded) or 6.3.2.2 (general)", default="rolled")]
FORCES = [Param("N_Ed", "[force]", "design axial compression", default=None),
          Param("M_y_Ed", "[force]*[length]", "design moment about y–y (major)", default=None),
          Param("M_z_Ed", "[force]*[length]", "design moment about z–z (minor)", default=None),
          Param("V_Ed", "[force]", "design shear parallel to the web", default=None),
          Param("psi_z", doc="end moment ratio of M_z for C_mz (default 1, uniform)", default=None)]
FIELDS = [
    Field("section_class", doc="cross-section class 1–3 (5.5)"),
    Field("N_pl_Rd", "[force]", "plastic resistance A f_y/γ_M0"),
    Field("M_c_y_Rd", "[force]*[length]", "bending resistance y–y"), Field("M_c_z_Rd", "[force]*[length]", "bending resistance z–z"),
    Field("V_pl_Rd", "[force]", "plastic shear resistance"), Field("A_v", "[length]**2", "shear area"),
    Field("N_b_Rd", "[force]", "flexural buckling resistance", optional=True),
    Field("chi_y", doc="χ about y–y", optional=True), Field("chi_z", doc="χ about z–z", optional=True),
    Field("lambda_y", doc="λ̄_y", optional=True), Field("lambda_z", doc="λ̄_z", optional=True),
    Field("M_cr", "[force]*[length]", "elastic critical moment", optional=True),
    Field("lambda_LT", doc="λ̄_LT", optional=True), Field("chi_LT", doc="χ_LT (χ_LT,mod for 6.3.2.3)", optional=True),
    Field("M_b_Rd", "[force]*[length]", "LTB resistance moment", optional=True),
    Field("k_yy", doc="Annex B", optional=True), Field("k_yz", doc="Annex B", optional=True),
    Field("k_zy", doc="Annex B", optional=True), Field("k_zz", doc="Annex B", optional=True),
    Field("util_axial", doc="N_Ed/N_pl,Rd", optional=True), Field("util_bending", doc="cross-section bending (6.2)", optional=True),
    Field("util_shear", doc="V_Ed/V_pl,Rd", optional=True), Field("util_buckling", doc="N_Ed/N_b,Rd", optional=True),
    Field("util_LTB", doc="M_y,Ed/M_b,Rd", optional=True), Field("util_interaction", doc="max of (6.61), (6.62)", optional=True),
    Field("util", doc="largest utilisation"), Field("governing", kind="text", doc="the check with the largest utilisation"),
]


def _run(work, section, material, f_y, E, G, na, fabrication, *, L=None, L_z=None, L_LT=None, moment_shape="uniform",
         psi=None, z_g=None, C_1=None, ltb_method="rolled", N_Ed=None, M_y_Ed=None, M_z_Ed=None, V_Ed=None, psi_z=None,
         want=()):
    w = work
    for nm, q in (("L", L), ("L_z", L_z), ("L_LT", L_LT)):
        positive(w, nm, q)
    for nm, q in (("N_Ed", N_Ed), ("M_y_Ed", M_y_Ed), ("M_z_Ed", M_z_Ed), ("V_Ed", V_Ed)):
        if q is not None and q.magnitude < 0:
            w.fail(f"{nm}: give the design value's magnitude (≥ 0; N_Ed is compression)", param=nm)
    if moment_shape == "end_moments" and psi is None and C_1 is None:
        w.fail("moment_shape=\"end_moments\" needs psi=… (the end moment ratio)", param="psi")
    ctx = _Ctx(work, section, material, f_y, E, G, na, fabrication)
    sc = work.scope
    bending = M_y_Ed is not None or M_z_Ed is not None or "ltb" in want
    ctx.classify(N_Ed if N_Ed is not None or "buckling" not in want else w.q(1.0, "N"), bending)
    utils = ctx.resistances(N_Ed, M_y_Ed, M_z_Ed, V_Ed)
    if "buckling" in want:
        utils.update(ctx.flexural_buckling(L, L_z, N_Ed))
    if "ltb" in want:
        utils.update(ctx.ltb(L_LT, moment_shape, psi, z_g, C_1, ltb_method, M_y_Ed))
    if "buckling" in want and "ltb" in want and N_Ed is not None and N_Ed.m_as("N") > 0:
        utils.update(ctx.interaction(moment_shape, psi, psi_z, L_LT is not None))
    out = {"section_class": w.q(float(ctx.klass), "")}
    for k in ("N_pl_Rd", "M_c_y_Rd", "M_c_z_Rd", "V_pl_Rd", "A_v", "N_b_Rd", "M_cr", "M_b_Rd"):
        if k in sc:
            out[k] = sc[k]
    for k in ("chi_y", "chi_z", "lambda_y", "lambda_z", "lambda_LT", "chi_LT", "k_yy", "k_yz", "k_zy", "k_zz", *utils):
        if k in sc:
            out[k] = w.q(num(sc[k]), "")
    if utils:
        name = max(utils, key=lambda k: num(sc[k]))
        out["util"], out["governing"] = out[name], utils[name]
        w.note(f"Largest utilisation: {utils[name]}, {num(out['util']):.3f}.", kind="method")
    else:
        out["util"], out["governing"] = w.q(0.0, ""), "no design force given"
    return tidy(out, ctx.u)


@namespace.function("ec3_beam", params=COMMON + LTB + FORCES, fields=FIELDS, returns="steel_check.ec3",
                    family="steel_check")
def ec3_beam(work, section, material=None, f_y=None, E=None, G=None, na="recommended", fabrication=None, L_LT=None,
             moment_shape="uniform", psi=None, z_g=None, C_1=None, ltb_method="rolled", N_Ed=None, M_y_Ed=None,
             M_z_Ed=None, V_Ed=None, psi_z=None):
    """A beam to EN 1993-1-1: 5.5 classification, 6.2 resistances (bending, shear, bending with shear), 6.3.2 LTB."""
    return _run(work, section, material, f_y, E, G, na, fabrication, L_LT=L_LT, moment_shape=moment_shape, psi=psi,
                z_g=z_g, C_1=C_1, ltb_method=ltb_method, N_Ed=N_Ed, M_y_Ed=M_y_Ed, M_z_Ed=M_z_Ed, V_Ed=V_Ed,
                want=("ltb",))


@namespace.function("ec3_column", params=COMMON + BUCKLING + FORCES[:1], fields=FIELDS, returns="steel_check.ec3",
                    family="steel_check")
def ec3_column(work, section, L, material=None, f_y=None, E=None, G=None, na="recommended", fabrication=None, L_z=None,
               N_Ed=None):
    """A column to EN 1993-1-1: 5.5 classification, 6.2.4 compression, 6.3.1 flexural buckling (curves a0–d)."""
    return _run(work, section, material, f_y, E, G, na, fabrication, L=L, L_z=L_z, N_Ed=N_Ed, want=("buckling",))


@namespace.function("ec3_beam_column", params=COMMON + BUCKLING + LTB + FORCES, fields=FIELDS, returns="steel_check.ec3",
                    family="steel_check")
def ec3_beam_column(work, section, L, material=None, f_y=None, E=None, G=None, na="recommended", fabrication=None,
                    L_z=None, L_LT=None, moment_shape="uniform", psi=None, z_g=None, C_1=None, ltb_method="rolled",
                    N_Ed=None, M_y_Ed=None, M_z_Ed=None, V_Ed=None, psi_z=None):
    """A beam-column to EN 1993-1-1: 5.5, 6.2 (incl. 6.2.9.1), 6.3.1, 6.3.2 and 6.3.3 with Annex B factors."""
    return _run(work, section, material, f_y, E, G, na, fabrication, L=L, L_z=L_z, L_LT=L_LT, moment_shape=moment_shape,
                psi=psi, z_g=z_g, C_1=C_1, ltb_method=ltb_method, N_Ed=N_Ed, M_y_Ed=M_y_Ed, M_z_Ed=M_z_Ed, V_Ed=V_Ed,
                psi_z=psi_z, want=("buckling", "ltb"))


@namespace.function("ec3_chi", params=[Param("lambda_bar", doc="non-dimensional slenderness λ̄"),
                                       Param("curve", kind="text", choices=("a0", "a", "b", "c", "d"), doc="buckling curve")],
                    fields=[Field("chi", doc="reduction factor χ, Eq. 6.49"), Field("Phi", doc="Φ, 6.3.1.2(1)"),
                            Field("alpha", doc="imperfection factor, Table 6.1")], returns="steel_chi")
def ec3_chi(work, lambda_bar, curve):
    """χ for a slenderness and a buckling curve, EN 1993-1-1 6.3.1.2 (Table 6.1, Eq. 6.49)."""
    if num(lambda_bar) < 0:
        work.fail("λ̄ must not be negative", param="lambda_bar")
    work.let("alpha", work.q(ec3()["table_6_1"][curve], ""), desc=f"imperfection factor, curve {curve}, {STD} Table 6.1")
    work.calc("Phi", "0.5*(1 + alpha*(lambda_bar - 0.2) + lambda_bar^2)", unit="1", desc=f"{STD} 6.3.1.2(1)")
    work.calc("chi", "min(1, 1/(Phi + sqrt(Phi^2 - lambda_bar^2)))", unit="1", desc=f"{STD} 6.3.1.2 Eq. 6.49")
    return {k: work.q(num(work.scope[k]), "") for k in ("chi", "Phi", "alpha")}


@namespace.function("ec3_classify",
                    params=COMMON + [Param("N_Ed", "[force]", "design axial compression (web in compression or "
                                                               "bending and compression)", default=None),
                                     Param("bending", kind="text", choices=("yes", "no"),
                                           doc="whether the section is bent about y–y", default="yes")],
                    fields=[Field("section_class", doc="cross-section class, 5.5.2(6)"),
                            Field("class_flange", doc="flange outstand class, Table 5.2"),
                            Field("class_web", doc="web class, Table 5.2")],
                    returns="steel_class.ec3", family="steel_class")
def ec3_classify(work, section, material=None, f_y=None, E=None, G=None, na="recommended", fabrication=None,
                 N_Ed=None, bending="yes"):
    """EN 1993-1-1 5.5 classification of an I/H section (Table 5.2); class 4 is refused (out of scope)."""
    if N_Ed is not None and N_Ed.magnitude < 0:
        work.fail("N_Ed: give the compression as a positive value", param="N_Ed")
    if N_Ed is None and bending == "no":
        work.fail("with bending=\"no\" give N_Ed (a section in pure compression)", param="N_Ed")
    ctx = _Ctx(work, section, material, f_y, E, G, na, fabrication)
    ctx.classify(N_Ed, bending == "yes")
    cf, cw = ctx.parts
    return {"section_class": work.q(float(ctx.klass), ""), "class_flange": work.q(float(cf), ""),
            "class_web": work.q(float(cw), "")}
