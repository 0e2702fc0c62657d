"""AISC 360-16 member checks: B4 classification, E3/E4/E7, F2–F10 (F4/F5 in aisc_f4f5, F9/F10 and the general E4
in aisc_open), G2.1/G3/G4/G5, H1-1.

Every formula is a traced step (``work.calc``) labelled with its clause and
equation number; which branch of a clause applies is decided here from the
traced values and stated in words. φ, Ω, the B4.1 limits and the constants that
decide a branch are data (aisc360_16.toml). LRFD or ASD is chosen once per sheet
(front matter ``design_method:``) or per call.
"""
from __future__ import annotations

from calcsheet.plugin import Field, Param

from . import namespace
from . import aisc_f4f5, aisc_open
from .common import FORMS, PARTIAL_FORMS, REFUSED_FORMS, aisc, field, form_of, num, positive, tidy, units

# what the design basis lists when a sheet calls one of these functions (the namespace lists both codes)
AISC_STANDARDS = ("AISC 360-16",)

STD = "AISC 360-16"
METHODS = ("LRFD", "ASD")
SUB = {"compression": "c", "flexure": "b", "shear": "v", "shear_rolled_I": "v", "tension_yielding": "t"}


class _Ctx:
    # single angles (F10): the axes of bending and the vertical leg's toe; a beam or beam-column run sets them
    axes = "geometric"
    toe = "compression"

    def __init__(self, work, section, material, form, method, F_y, E, G, fabrication=None):
        self.work, self.sc, self.u = work, work.scope, units(work)
        self.method = method
        self.section = section
        if section is None:
            work.fail("give section=… (a section record: steel_design.shape(…), section.rolled(…))", param="section")
        self.form = form_of(section, form)
        if self.form in REFUSED_FORMS:
            work.fail(REFUSED_FORMS[self.form], param="form" if form else "section")
        if self.form not in FORMS and self.form not in PARTIAL_FORMS:
            work.fail("cannot tell the section's form; give form=" + ", ".join(f'"{f}"' for f in FORMS), param="form")
        top, bot = field(section, "S_x_top"), field(section, "S_x_bot")
        self.singly = (self.form == "I" and top is not None and bot is not None
                       and abs(top.m_as("mm^3") / bot.m_as("mm^3") - 1) > 0.005)
        self.fabrication = fabrication or str(section.fields.get("fabrication", "rolled"))
        self.material(material, F_y, E, G)
        self.rows = []

    # ---------------------------------------------------------------- inputs
    def material(self, material, F_y, E, G):
        w, sc, u = self.work, self.sc, self.u
        consts = aisc()["constants"]
        for name, given, key in (("F_y", F_y, "f_y"), ("E", E, "E"), ("G", G, "G")):
            if given is not None:
                sc[name] = given
            elif material is not None and key in material.fields:
                w.let(name, material.fields[key], unit=u["st"], desc=f"{name} of {material.fields.get('name', 'the material')}",
                      note="from the material")
            elif name in ("E", "G"):
                c = consts[name]
                w.let(name, w.q(c["value"], c["unit"]), unit="ksi" if u["us"] else "MPa", desc=f"{name}",
                      note=c["source"])
            else:
                w.fail("give F_y=… or material=… (a material record with f_y)", param="F_y")
            positive(w, name, sc[name])

    def prop(self, name, unit_key, desc, required=True):
        v = field(self.section, name)
        if v is None:
            if required:
                self.work.fail(f"the section record has no {name} ({desc}), which {STD} needs here",
                               param="section", hint="give it in steel_design.shape(…)")
            return None
        self.sc[name] = v
        self.rows.append([name, desc, v.to(self.u[unit_key]) if unit_key else v])
        return v

    def props(self, names):
        for n, k, d in names:
            self.prop(n, k, d)

    def radii(self):
        """r_x and r_y from the section, or sqrt(I/A) where it gives none; then the properties used so far."""
        for r in ("r_x", "r_y"):
            if self.prop(r, "ln", f"radius of gyration about {r[-1]}", required=False) is None:
                self.show_inputs("Section properties used")
                self.work.calc(r, f"sqrt(I_{r[-1]}/A)", unit=self.u["ln"], desc=f"radius of gyration about {r[-1]}")
        self.show_inputs("Section properties used")

    def show_inputs(self, title):
        if self.rows:
            self.work.table(title, ["Symbol", "Property", "Value"], self.rows,
                            note=f"section: {self.section.fields.get('name', self.section.source or 'given')}")
            self.rows = []

    def available(self, name, nominal, kind, clause_note=""):
        """P_c = φP_n (LRFD) or P_n/Ω (ASD); factors from the data file."""
        w = self.work
        f = aisc()["factors"][kind]
        unit = self.u["fo"] if nominal.startswith(("P", "V")) else self.u["mo"]
        if self.method == "LRFD":
            sym = "phi_" + SUB[kind]
            w.let(sym, w.q(f["phi"], ""), desc=f"resistance factor (LRFD), {STD} {f['clause']}{clause_note}")
            return w.calc(name, f"{sym}*{nominal}", unit=unit, desc=f"design strength (LRFD) φ·{nominal}")
        sym = "Omega_" + SUB[kind]
        w.let(sym, w.q(f["Omega"], ""), desc=f"safety factor (ASD), {STD} {f['clause']}{clause_note}")
        return w.calc(name, f"{nominal}/{sym}", unit=unit, desc=f"allowable strength (ASD) {nominal}/Ω")

    # ---------------------------------------------------------------- geometry
    def i_shape(self):
        u, w = self.u, self.work
        self.props([("A", "ar", "gross area A_g"), ("d", "ln", "depth"), ("b_f", "ln", "flange width"),
                    ("t_f", "ln", "flange thickness"), ("t_w", "ln", "web thickness"),
                    ("I_x", "i4", "I about x"), ("I_y", "i4", "I about y"), ("S_x", "i3", "S about x"),
                    ("Z_x", "i3", "Z about x"), ("S_y", "i3", "S about y"), ("Z_y", "i3", "Z about y"),
                    ("J", "i4", "torsional constant"), ("C_w", "i6", "warping constant")])
        self.radii()
        if self.form == "T":
            return
        hw = field(self.section, "h_w")
        if hw is not None:
            self.sc["h"] = hw
            w.let("h", hw, unit=u["ln"], desc="clear web depth h (B4.1b(a)), from the section")
        elif field(self.section, "k_des") is not None:
            self.sc["k_des"] = field(self.section, "k_des")
            w.calc("h", "d - 2*k_des", unit=u["ln"], desc="web depth h = d − 2k_des, clear of the fillets (B4.1b(a))")
        elif field(self.section, "r") is not None:
            self.sc["r"] = field(self.section, "r")
            w.calc("h", "d - 2*(t_f + r)", unit=u["ln"], desc="web depth h = d − 2(t_f + r), clear of the fillets (B4.1b(a))")
        else:
            w.calc("h", "d - 2*t_f", unit=u["ln"], desc="web depth h = d − 2t_f (no fillet given: welded-shape "
                                                          "definition, B4.1b(a))")
        if field(self.section, "h_o") is not None:
            self.sc["h_o"] = field(self.section, "h_o")
        else:
            w.calc("h_o", "d - t_f", unit=u["ln"], desc="distance between flange centroids h_o = d − t_f")

    def hss_rect(self):
        u, w = self.u, self.work
        self.props([("A", "ar", "gross area A_g"), ("H", "ln", "overall height"), ("B", "ln", "overall width"),
                    ("t", "ln", "design wall thickness"), ("I_x", "i4", "I about x"), ("I_y", "i4", "I about y"),
                    ("S_x", "i3", "S about x"), ("Z_x", "i3", "Z about x"), ("S_y", "i3", "S about y"),
                    ("Z_y", "i3", "Z about y"), ("J", "i4", "torsional constant")])
        self.radii()
        w.calc("b", "B - 3*t", unit=u["ln"], desc="flat width of the flange walls b = B − 3t (B4.1b(d))")
        w.calc("h", "H - 3*t", unit=u["ln"], desc="flat depth of the web walls h = H − 3t (B4.1b(d))")

    def hss_round(self):
        u, w = self.u, self.work
        self.props([("A", "ar", "gross area A_g"), ("D", "ln", "outside diameter"), ("t", "ln", "design wall thickness"),
                    ("I_x", "i4", "I"), ("S_x", "i3", "S"), ("Z_x", "i3", "Z")])
        if self.prop("r_x", "ln", "radius of gyration", required=False) is None:
            self.show_inputs("Section properties used")
            w.calc("r_x", "sqrt(I_x/A)", unit=u["ln"], desc="radius of gyration")
        self.show_inputs("Section properties used")
        self.sc["r_y"], self.sc["I_y"], self.sc["S_y"], self.sc["Z_y"] = (self.sc["r_x"], self.sc["I_x"],
                                                                         self.sc["S_x"], self.sc["Z_x"])

    def geometry(self):
        {"I": self.i_shape, "C": self.i_shape, "T": self.i_shape, "L": lambda: aisc_open.angle_geometry(self),
         "2L": lambda: aisc_open.double_angle_geometry(self),
         "RHS": self.hss_rect, "CHS": self.hss_round}[self.form]()

    # ---------------------------------------------------------------- B4 classification
    def classify(self):
        """B4.1: ratios and limits of each element, for compression and for flexure; a table and fields."""
        w, t = self.work, aisc()
        out = {}
        rows = []

        def limit(name, k, key, desc):
            w.calc(name, f"{k}*sqrt(E/F_y)", unit="1", desc=f"{desc}, {STD} Table {key}")
            return num(self.sc[name])

        def e_over_fy(name, k, key, desc):
            w.calc(name, f"{k}*E/F_y", unit="1", desc=f"{desc}, {STD} Table {key}")
            return num(self.sc[name])

        if self.form == "I":
            w.calc("lambda_f", "b_f/(2*t_f)", unit="1", desc="flange slenderness b/t = b_f/(2t_f) (B4.1a case 1, B4.1b case 10)")
            w.calc("lambda_w", "h/t_w", unit="1", desc="web slenderness h/t_w (B4.1a case 5, B4.1b case 15)")
            specs = [("flange", "lambda_f", "I_flange", "I_flange"), ("web", "lambda_w", "I_web", "I_web")]
        elif self.form == "C":
            w.calc("lambda_f", "b_f/t_f", unit="1", desc="flange slenderness b/t = b_f/t_f (channel: the full flange "
                                                          "width; B4.1a case 1, B4.1b case 10)")
            w.calc("lambda_w", "h/t_w", unit="1", desc="web slenderness h/t_w (B4.1a case 5, B4.1b case 15)")
            specs = [("flange", "lambda_f", "C_flange", "C_flange"), ("web", "lambda_w", "I_web", "I_web")]
        elif self.form == "T":
            w.calc("lambda_f", "b_f/(2*t_f)", unit="1", desc="flange slenderness b/t = b_f/(2t_f) (B4.1a case 1, B4.1b case 10)")
            w.calc("lambda_w", "d/t_w", unit="1", desc="stem slenderness d/t_w (B4.1a case 4, B4.1b case 14)")
            specs = [("flange", "lambda_f", "T_flange", "T_flange"), ("web", "lambda_w", "T_stem", "T_stem")]
        elif self.form in ("L", "2L"):
            w.calc("lambda_f", "max(d, b_f)/t", unit="1", desc="leg slenderness b/t of the longer leg (B4.1a case 3"
                                                              + (", legs of double angles with separators)" if self.form == "2L" else
                                                                 ", B4.1b case 12)"))
            specs = [("leg", "lambda_f", "L_leg", "L_leg")]
        elif self.form == "RHS":
            w.calc("lambda_f", "b/t", unit="1", desc="flange wall slenderness b/t (B4.1a case 6, B4.1b case 17)")
            w.calc("lambda_w", "h/t", unit="1", desc="web wall slenderness h/t (B4.1a case 6, B4.1b case 19)")
            specs = [("flange", "lambda_f", "HSS_rect_wall", "HSS_rect_flange"),
                     ("web", "lambda_w", "HSS_rect_wall", "HSS_rect_web")]
        else:
            w.calc("lambda_f", "D/t", unit="1", desc="wall slenderness D/t (B4.1a case 9, B4.1b case 20)")
            specs = [("wall", "lambda_f", "HSS_round", "HSS_round")]
        built_up = self.form == "I" and self.fabrication == "welded"
        if built_up:
            w.calc("k_c", "max(0.35, min(0.76, 4/sqrt(h/t_w)))", unit="1",
                   desc=f"k_c = 4/√(h/t_w), 0.35 ≤ k_c ≤ 0.76, {STD} Table B4.1a note [a]")
            w.calc("F_L", "0.7*F_y", unit=self.u["st"], desc=f"F_L = 0.7F_y, doubly symmetric ({STD} Table B4.1b note)")
        for elem, lam_name, ca, fb in specs:
            lam = num(self.sc[lam_name])
            sfx = elem[0] if elem not in ("wall", "leg") else "f"
            a, b = t["B4_1a"][ca], t["B4_1b"][fb]
            if built_up and elem == "flange":
                a2, b2 = t["B4_1a"]["I_flange_built_up"], t["B4_1b"]["I_flange_built_up"]
                w.calc("lambda_r_cf", f"{a2['lambda_r']}*sqrt(k_c*E/F_y)", unit="1",
                       desc=f"flange, compression: nonslender limit λ_r, built-up I, {STD} Table B4.1a case {a2['case']}")
                w.calc("lambda_p_f", f"{b2['lambda_p']}*sqrt(E/F_y)", unit="1",
                       desc=f"flange, flexure: compact limit λ_p, built-up I, {STD} Table B4.1b case {b2['case']}")
                w.calc("lambda_r_f", f"{b2['lambda_r']}*sqrt(k_c*E/F_L)", unit="1",
                       desc=f"flange, flexure: noncompact limit λ_r, built-up I, {STD} Table B4.1b case {b2['case']}")
                lr_c, lp, lr = (num(self.sc[n]) for n in ("lambda_r_cf", "lambda_p_f", "lambda_r_f"))
            elif "lambda_r" in a:
                lr_c = limit(f"lambda_r_c{sfx}", a["lambda_r"], "B4.1a", f"{elem}, compression: nonslender limit λ_r")
                lp = limit(f"lambda_p_{sfx}", b["lambda_p"], "B4.1b", f"{elem}, flexure: compact limit λ_p")
                lr = limit(f"lambda_r_{sfx}", b["lambda_r"], "B4.1b", f"{elem}, flexure: noncompact limit λ_r")
            else:
                lr_c = e_over_fy(f"lambda_r_c{sfx}", a["lambda_r_E_over_Fy"], "B4.1a", f"{elem}, compression: nonslender limit λ_r")
                lp = e_over_fy(f"lambda_p_{sfx}", b["lambda_p_E_over_Fy"], "B4.1b", f"{elem}, flexure: compact limit λ_p")
                lr = e_over_fy(f"lambda_r_{sfx}", b["lambda_r_E_over_Fy"], "B4.1b", f"{elem}, flexure: noncompact limit λ_r")
            comp = "nonslender" if lam <= lr_c else "slender"
            flex = "compact" if lam <= lp else ("noncompact" if lam <= lr else "slender")
            key = elem if elem not in ("wall", "leg") else "flange"
            out[f"class_{key}_compression"] = comp
            out[f"class_{key}_flexure"] = flex
            rows.append([elem, f"{lam:.3g}", f"{lr_c:.3g}", comp, f"{lp:.3g}", f"{lr:.3g}", flex])
        w.table(f"{STD} B4.1 classification", ["Element", "λ", "λ_r (compression)", "compression", "λ_p (flexure)",
                                               "λ_r (flexure)", "flexure"], rows,
                note="Tables B4.1a (members in axial compression) and B4.1b (members in flexure)")
        words = "; ".join(f"{r[0]}: {r[3]} in compression, {r[6]} in flexure (λ = {r[1]}, λ_p = {r[4]}, "
                          f"λ_r = {r[5]})" for r in rows)
        w.note(f"Classification ({STD} B4.1): {words}.", kind="method")
        self.classes = out
        return out

    # ---------------------------------------------------------------- Chapter E
    def compression(self, L, K_x, K_y, L_y, L_z, a=None, r_i=None, connectors=None):
        w, sc, u = self.work, self.sc, self.u
        sc["L_x"] = L
        sc["L_y"] = L_y if L_y is not None else L
        sc["K_x"] = K_x if K_x is not None else w.q(1.0, "")
        sc["K_y"] = K_y if K_y is not None else w.q(1.0, "")
        w.calc("L_cx", "K_x*L_x", unit=u["L"], desc="effective length about x, L_c = K·L (E2)")
        w.calc("L_cy", "K_y*L_y", unit=u["L"], desc="effective length about y, L_c = K·L (E2)")
        w.calc("F_ex", "pi^2*E/(L_cx/r_x)^2", unit=u["st"], desc=f"elastic buckling stress about x, {STD} Eq. E3-4")
        if self.form == "2L":
            aisc_open.e6(self, a, r_i, connectors)
            w.calc("F_ey", "pi^2*E/lambda_m^2", unit=u["st"],
                   desc=f"elastic buckling stress about y with the modified slenderness, {STD} Eq. E3-4, E6.1")
        else:
            w.calc("F_ey", "pi^2*E/(L_cy/r_y)^2", unit=u["st"], desc=f"elastic buckling stress about y, {STD} Eq. E3-4")
        slender = max(sc["L_cx"].m_as("m") / sc["r_x"].m_as("m"), sc["L_cy"].m_as("m") / sc["r_y"].m_as("m"))
        if slender > 200:
            w.warn(f"L_c/r = {slender:.0f} exceeds 200, the limit {STD} E2 (User Note) recommends for members "
                   f"designed for compression", param="L")
        candidates = ["F_ex", "F_ey"]
        if self.form in ("C", "T", "L", "2L") or self.singly:
            if L_z is not None:
                sc["L_cz"] = L_z
            candidates = aisc_open.e4(self, candidates)
        elif self.form == "I" and L_z is not None and L_z.m_as("m") > sc["L_cy"].m_as("m"):
            sc["L_cz"] = L_z
            w.note(f"E4 applies: the torsional unbraced length L_cz exceeds L_cy ({STD} E4, doubly symmetric member).",
                   kind="method")
            w.calc("F_ez", "(pi^2*E*C_w/L_cz^2 + G*J)/(I_x + I_y)", unit=u["st"],
                   desc=f"torsional buckling stress, doubly symmetric member, {STD} Eq. E4-2")
            candidates.append("F_ez")
        elif self.form == "I":
            w.note("E4 (torsional buckling) need not be checked: L_cz ≤ L_cy for this doubly symmetric I-shape, "
                   f"so flexural buckling about y governs over torsional buckling ({STD} E4 scope).", kind="method")
        else:
            w.note(f"E4 does not apply to a doubly symmetric closed HSS: flexural buckling (E3) governs ({STD} E4 scope).",
                   kind="method")
        w.calc("F_e", f"min({', '.join(candidates)})", unit=u["st"], desc="governing elastic buckling stress")
        mode = {"F_ex": "flexural buckling about x", "F_ey": "flexural buckling about y",
                "F_ez": "torsional buckling", "F_e_FT": "flexural-torsional buckling",
                "F_ezz": "flexural buckling about the minor principal axis z"}[
            min(candidates, key=lambda n: sc[n].m_as("Pa"))]
        ratio = sc["F_y"].m_as("Pa") / sc["F_e"].m_as("Pa")
        if ratio <= 2.25:
            w.note(f"F_y/F_e = {ratio:.3f} ≤ 2.25: inelastic buckling, {STD} Eq. E3-2.", kind="method")
            w.calc("F_cr", "0.658^(F_y/F_e)*F_y", unit=u["st"], desc=f"critical stress (inelastic), {STD} Eq. E3-2")
        else:
            w.note(f"F_y/F_e = {ratio:.3f} > 2.25: elastic buckling, {STD} Eq. E3-3.", kind="method")
            w.calc("F_cr", "0.877*F_e", unit=u["st"], desc=f"critical stress (elastic), {STD} Eq. E3-3")
        slender = [k for k, v in self.classes.items() if k.endswith("compression") and v == "slender"]
        if not slender:
            w.calc("P_n", "F_cr*A", unit=u["fo"], desc=f"nominal compressive strength, {STD} Eq. E3-1")
            clause = "E4" if "torsional" in mode else "E3"
        else:
            self.effective_area()
            w.calc("P_n", "F_cr*A_e", unit=u["fo"], desc=f"nominal compressive strength, slender elements, {STD} Eq. E7-1")
            clause = ("E4" if "torsional" in mode else "E3") + ", E7"
        w.note(f"{mode.capitalize()} governs the compressive strength ({STD} {clause}"
               f"{', with slender-element effective area' if slender else ''}).", kind="method")
        return f"{mode} ({clause})"

    def effective_area(self):
        w, sc, u, t = self.work, self.sc, self.u, aisc()["E7_1"]
        if self.form == "CHS":
            dt = num(sc["lambda_f"])
            e_fy = sc["E"].m_as("Pa") / sc["F_y"].m_as("Pa")
            if dt >= 0.45 * e_fy:
                w.fail(f"D/t = {dt:.1f} ≥ 0.45E/F_y: {STD} E7.2(b) does not cover this round HSS", param="section")
            w.calc("A_e", "(0.038*E/(F_y*lambda_f) + 2/3)*A", unit=u["ar"],
                   desc=f"effective area of a round HSS, {STD} Eq. E7-7")
            return
        parts = []
        if self.form == "I":
            elems = [("f", "b_f/2", "t_f", 4, "unstiffened", "lambda_f", "lambda_r_cf"),
                     ("w", "h", "t_w", 1, "stiffened", "lambda_w", "lambda_r_cw")]
        elif self.form == "C":
            elems = [("f", "b_f", "t_f", 2, "unstiffened", "lambda_f", "lambda_r_cf"),
                     ("w", "h", "t_w", 1, "stiffened", "lambda_w", "lambda_r_cw")]
        elif self.form == "T":
            elems = [("f", "b_f/2", "t_f", 2, "unstiffened", "lambda_f", "lambda_r_cf"),
                     ("w", "d", "t_w", 1, "unstiffened", "lambda_w", "lambda_r_cw")]
        elif self.form in ("L", "2L"):
            w.calc("lambda_a", "d/t", unit="1", desc="b/t of the vertical leg")
            w.calc("lambda_b", "b_f/t", unit="1", desc="b/t of the horizontal leg")
            n = 2 if self.form == "2L" else 1
            elems = [("a", "d", "t", n, "unstiffened", "lambda_a", "lambda_r_cf"),
                     ("b", "b_f", "t", n, "unstiffened", "lambda_b", "lambda_r_cf")]
        else:
            elems = [("f", "b", "t", 2, "HSS_wall", "lambda_f", "lambda_r_cf"),
                     ("w", "h", "t", 2, "HSS_wall", "lambda_w", "lambda_r_cw")]
        for sfx, width, thick, count, case, lam, lam_r in elems:
            c = t[case]
            w.calc(f"b_{sfx}", width, unit=u["ln"],
                   desc=f"element width b ({ {'f': 'flange outstand', 'w': 'web or stem', 'a': 'vertical leg', 'b': 'horizontal leg'}[sfx]})")
            limit = num(sc[lam_r]) * (sc["F_y"].m_as("Pa") / sc["F_cr"].m_as("Pa")) ** 0.5
            if num(sc[lam]) <= limit:
                w.note(f"{ {'f': 'Flange', 'w': 'Web', 'a': 'Vertical leg', 'b': 'Horizontal leg'}[sfx]}: λ = {num(sc[lam]):.3g} ≤ λ_r√(F_y/F_cr) = {limit:.3g}: "
                       f"fully effective, b_e = b ({STD} Eq. E7-2).", kind="method")
                continue
            sc[f"c_1{sfx}"], sc[f"c_2{sfx}"] = w.q(c["c1"], ""), w.q(c["c2"], "")
            w.note(f"{ {'f': 'Flange', 'w': 'Web', 'a': 'Vertical leg', 'b': 'Horizontal leg'}[sfx]}: λ = {num(sc[lam]):.3g} > λ_r√(F_y/F_cr) = {limit:.3g}: "
                   f"effective width by {STD} Eq. E7-3 with c_1 = {c['c1']}, c_2 = {c['c2']} (Table E7.1 {c['case']}).",
                   kind="method")
            w.calc(f"F_el{sfx}", f"(c_2{sfx}*{lam_r}/{lam})^2*F_y", unit=u["st"],
                   desc=f"elastic local buckling stress, {STD} Eq. E7-5")
            w.calc(f"b_e{sfx}", f"b_{sfx}*(1 - c_1{sfx}*sqrt(F_el{sfx}/F_cr))*sqrt(F_el{sfx}/F_cr)", unit=u["ln"],
                   desc=f"effective width, {STD} Eq. E7-3")
            parts.append(f"{count}*(b_{sfx} - b_e{sfx})*{thick}")
        if parts:
            w.calc("A_e", "A - " + " - ".join(parts), unit=u["ar"], desc=f"effective area, {STD} E7.1")
        else:
            w.calc("A_e", "A", unit=u["ar"], desc=f"effective area (all elements fully effective), {STD} E7.1")

    # ---------------------------------------------------------------- Chapter F
    def flexure_major(self, L_b, C_b, stem="tension", toe="compression", restraint="none"):
        w, sc, u = self.work, self.sc, self.u
        cls = self.classes
        if self.form == "I" and (self.singly or cls["class_web_flexure"] != "compact"):
            states = aisc_f4f5.f4f5(self, L_b, C_b)
        elif self.form == "T":
            states = aisc_open.f9(self, L_b, stem)
        elif self.form == "L" and self.axes == "principal":
            states = aisc_open.f10_principal(self, L_b, C_b, toe)
        elif self.form == "L":
            states = aisc_open.f10(self, L_b, C_b, toe, restraint)
        elif self.form in ("I", "C"):
            if self.form == "C" and (cls["class_web_flexure"] != "compact" or cls["class_flange_flexure"] != "compact"):
                w.fail(f"this channel's {'web' if cls['class_web_flexure'] != 'compact' else 'flange'} is not compact in "
                       f"flexure: {STD} F2 covers compact channels only, and F3–F5 do not cover channels", param="section")
            sc["L_b"], sc["C_b"] = L_b, C_b
            w.calc("M_p", "F_y*Z_x", unit=u["mo"], desc=f"plastic moment, {STD} Eq. F2-1")
            w.calc("L_p", "1.76*r_y*sqrt(E/F_y)", unit=u["L"], desc=f"limiting unbraced length, yielding, {STD} Eq. F2-5")
            if field(self.section, "r_ts") is not None:
                sc["r_ts"] = field(self.section, "r_ts")
                w.let("r_ts", sc["r_ts"], unit=u["ln"], desc="effective radius of gyration r_ts", note="from the section")
            else:
                w.calc("r_ts", "sqrt(sqrt(I_y*C_w)/S_x)", unit=u["ln"], desc=f"effective radius of gyration, {STD} Eq. F2-7")
            if self.form == "C":
                w.note(f"Compact channel bent about its major axis: {STD} F2 applies, with c from Eq. F2-8b.",
                       kind="method")
                aisc_open.channel_c(self)
            else:
                w.let("c", w.q(1.0, ""), desc=f"c = 1 for a doubly symmetric I-shape, {STD} Eq. F2-8a")
            w.calc("L_r", "1.95*r_ts*E/(0.7*F_y)*sqrt(J*c/(S_x*h_o) + sqrt((J*c/(S_x*h_o))^2 + 6.76*(0.7*F_y/E)^2))",
                   unit=u["L"], desc=f"limiting unbraced length, inelastic LTB, {STD} Eq. F2-6")
            lb, lp, lr = (sc[n].m_as("m") for n in ("L_b", "L_p", "L_r"))
            states = {"yielding (F2.1)": "M_p"}
            if lb <= lp:
                w.note(f"L_b = {sc['L_b'].m_as(u['L']):.3g} {u['L']} ≤ L_p = {sc['L_p'].m_as(u['L']):.3g} {u['L']}: "
                       f"lateral-torsional buckling does not apply ({STD} F2.2(a)).", kind="method")
            elif lb <= lr:
                w.note(f"Inelastic LTB governs the LTB limit state: L_p < L_b ≤ L_r ({STD} F2.2(b)).", kind="method")
                w.calc("M_n_LTB", "min(C_b*(M_p - (M_p - 0.7*F_y*S_x)*(L_b - L_p)/(L_r - L_p)), M_p)", unit=u["mo"],
                       desc=f"LTB, inelastic, {STD} Eq. F2-2")
                states["lateral-torsional buckling, inelastic (F2-2)"] = "M_n_LTB"
            else:
                w.note(f"Elastic LTB governs the LTB limit state: L_b > L_r ({STD} F2.2(c)).", kind="method")
                w.calc("F_cr_LTB", "C_b*pi^2*E/(L_b/r_ts)^2*sqrt(1 + 0.078*J*c/(S_x*h_o)*(L_b/r_ts)^2)", unit=u["st"],
                       desc=f"critical stress, elastic LTB, {STD} Eq. F2-4")
                w.calc("M_n_LTB", "min(F_cr_LTB*S_x, M_p)", unit=u["mo"], desc=f"LTB, elastic, {STD} Eq. F2-3")
                states["lateral-torsional buckling, elastic (F2-3)"] = "M_n_LTB"
            fl = cls["class_flange_flexure"]
            if fl == "noncompact":
                w.note(f"The flange is noncompact: {STD} F3 applies (flange local buckling, F3.2(a)).", kind="method")
                w.calc("M_n_FLB", "M_p - (M_p - 0.7*F_y*S_x)*(lambda_f - lambda_p_f)/(lambda_r_f - lambda_p_f)",
                       unit=u["mo"], desc=f"compression flange local buckling, noncompact flange, {STD} Eq. F3-1")
                states["flange local buckling, noncompact (F3-1)"] = "M_n_FLB"
            elif fl == "slender":
                w.note(f"The flange is slender: {STD} F3 applies (flange local buckling, F3.2(b)).", kind="method")
                w.calc("k_c", "max(0.35, min(0.76, 4/sqrt(h/t_w)))", unit="1", desc=f"k_c = 4/√(h/t_w), 0.35 ≤ k_c ≤ 0.76 ({STD} F3.2)")
                w.calc("M_n_FLB", "0.9*E*k_c*S_x/lambda_f^2", unit=u["mo"],
                       desc=f"compression flange local buckling, slender flange, {STD} Eq. F3-2")
                states["flange local buckling, slender (F3-2)"] = "M_n_FLB"
            else:
                w.note(f"Compact flange and web: {STD} F2 applies; flange local buckling does not govern.", kind="method")
        elif self.form == "RHS":
            states = self.f7("x", L_b, C_b)
        else:
            states = self.f8("x")
        return self.governing_moment("M_nx", states)

    def governing_moment(self, name, states):
        w, sc, u = self.work, self.sc, self.u
        w.calc(name, f"min({', '.join(states.values())})" if len(states) > 1 else list(states.values())[0],
               unit=u["mo"], desc="nominal flexural strength: the least of the applicable limit states")
        gov = min(states, key=lambda k: sc[states[k]].m_as("N*m"))
        axis = name[-1]
        if self.axes == "principal":
            axis = {"x": "w (major principal axis)", "y": "z (minor principal axis)"}[axis]
        w.note(f"{gov[0].upper() + gov[1:]} governs the flexural strength about {axis} ({STD} F1).", kind="method")
        return gov

    def f7(self, axis, L_b, C_b):
        """F7 rectangular HSS, bending about ``axis``: yielding, FLB, WLB, LTB."""
        w, sc, u = self.work, self.sc, self.u
        Z, S = ("Z_x", "S_x") if axis == "x" else ("Z_y", "S_y")
        if axis == "x":
            fl, lam_f, lam_w, lp_f, lr_f, lp_w, lr_w = ("class_flange_flexure", "lambda_f", "lambda_w",
                                                         "lambda_p_f", "lambda_r_f", "lambda_p_w", "lambda_r_w")
        else:  # the walls swap roles
            w.calc("lambda_p_fy", "1.12*sqrt(E/F_y)", unit="1", desc=f"flange (the H walls), compact limit, {STD} Table B4.1b case 17")
            w.calc("lambda_r_fy", "1.40*sqrt(E/F_y)", unit="1", desc=f"flange (the H walls), noncompact limit, {STD} Table B4.1b case 17")
            w.calc("lambda_p_wy", "2.42*sqrt(E/F_y)", unit="1", desc=f"web (the B walls), compact limit, {STD} Table B4.1b case 19")
            w.calc("lambda_r_wy", "5.70*sqrt(E/F_y)", unit="1", desc=f"web (the B walls), noncompact limit, {STD} Table B4.1b case 19")
            fl, lam_f, lam_w, lp_f, lr_f, lp_w, lr_w = (None, "lambda_w", "lambda_f", "lambda_p_fy", "lambda_r_fy",
                                                        "lambda_p_wy", "lambda_r_wy")
        M_p = f"M_p{axis}"
        w.calc(M_p, f"F_y*{Z}", unit=u["mo"], desc=f"plastic moment, yielding, {STD} Eq. F7-1")
        states = {"yielding (F7-1)": M_p}
        lf, lw = num(sc[lam_f]), num(sc[lam_w])
        if lf > num(sc[lr_f]):
            width, depth, I = ("b", "H", "I_x") if axis == "x" else ("h", "B", "I_y")
            w.note(f"Slender flange: flange local buckling by {STD} F7.2(c), M_n = F_y·S_e. S_e is found by removing "
                   f"the ineffective width b − b_e from both flanges (symmetric, slightly conservative — the "
                   f"simplification of AISC Design Example F.8B).", kind="method")
            w.calc(f"b_e{axis}", f"min(1.92*t*sqrt(E/F_y)*(1 - 0.38/{lam_f}*sqrt(E/F_y)), {width})", unit=u["ln"],
                   desc=f"effective width of the compression flange, {STD} Eq. F7-4")
            w.calc(f"I_e{axis}", f"{I} - 2*(({width} - b_e{axis})*t^3/12 + ({width} - b_e{axis})*t*(({depth} - t)/2)^2)",
                   unit=u["i4"], desc="effective moment of inertia, ineffective width removed from both flanges")
            w.calc(f"S_e{axis}", f"I_e{axis}/({depth}/2)", unit=u["i3"], desc="effective section modulus")
            w.calc(f"M_n_FLB{axis}", f"F_y*S_e{axis}", unit=u["mo"], desc=f"flange local buckling, slender flange, {STD} Eq. F7-3")
            states["flange local buckling, slender (F7-3)"] = f"M_n_FLB{axis}"
        elif lf > num(sc[lp_f]):
            w.note(f"Noncompact flange: flange local buckling by {STD} F7.2(b).", kind="method")
            w.calc(f"M_n_FLB{axis}", f"min({M_p} - ({M_p} - F_y*{S})*(3.57*{lam_f}*sqrt(F_y/E) - 4.0), {M_p})",
                   unit=u["mo"], desc=f"flange local buckling, {STD} Eq. F7-2")
            states["flange local buckling, noncompact (F7-2)"] = f"M_n_FLB{axis}"
        if lw > num(sc[lr_w]):
            w.fail(f"the HSS web is slender for bending about {axis} (h/t = {lw:.1f}): {STD} F7.3(c) is not implemented",
                   param="section")
        if lw > num(sc[lp_w]):
            w.note(f"Noncompact web: web local buckling by {STD} F7.3(b).", kind="method")
            w.calc(f"M_n_WLB{axis}", f"min({M_p} - ({M_p} - F_y*{S})*(0.305*{lam_w}*sqrt(F_y/E) - 0.738), {M_p})",
                   unit=u["mo"], desc=f"web local buckling, {STD} Eq. F7-5")
            states["web local buckling, noncompact (F7-5)"] = f"M_n_WLB{axis}"
        if axis == "x" and L_b is not None:
            sc["L_b"], sc["C_b"] = L_b, C_b
            w.calc("L_p", "0.13*E*r_y*sqrt(J*A)/M_px", unit=u["L"], desc=f"limiting length, {STD} Eq. F7-12")
            w.calc("L_r", "2*E*r_y*sqrt(J*A)/(0.7*F_y*S_x)", unit=u["L"], desc=f"limiting length, {STD} Eq. F7-13")
            lb, lp, lr = (sc[n].m_as("m") for n in ("L_b", "L_p", "L_r"))
            if lb <= lp:
                w.note(f"L_b ≤ L_p: lateral-torsional buckling does not apply ({STD} F7.4(a)).", kind="method")
            elif lb <= lr:
                w.note(f"Inelastic LTB: L_p < L_b ≤ L_r ({STD} F7.4(b)).", kind="method")
                w.calc("M_n_LTB", "min(C_b*(M_px - (M_px - 0.7*F_y*S_x)*(L_b - L_p)/(L_r - L_p)), M_px)", unit=u["mo"],
                       desc=f"LTB, inelastic, {STD} Eq. F7-10")
                states["lateral-torsional buckling, inelastic (F7-10)"] = "M_n_LTB"
            else:
                w.note(f"Elastic LTB: L_b > L_r ({STD} F7.4(c)).", kind="method")
                w.calc("M_n_LTB", "min(2*E*C_b*sqrt(J*A)/(L_b/r_y), M_px)", unit=u["mo"], desc=f"LTB, elastic, {STD} Eq. F7-11")
                states["lateral-torsional buckling, elastic (F7-11)"] = "M_n_LTB"
        return states

    def f8(self, axis):
        w, sc, u = self.work, self.sc, self.u
        e_fy = sc["E"].m_as("Pa") / sc["F_y"].m_as("Pa")
        dt = num(sc["lambda_f"])
        if dt >= 0.45 * e_fy:
            w.fail(f"D/t = {dt:.1f} ≥ 0.45E/F_y = {0.45 * e_fy:.1f}: outside {STD} F8", param="section")
        M_p = f"M_p{axis}"
        w.calc(M_p, "F_y*Z_x", unit=u["mo"], desc=f"plastic moment, yielding, {STD} Eq. F8-1")
        states = {"yielding (F8-1)": M_p}
        c = self.classes["class_flange_flexure"]
        if c == "noncompact":
            w.calc(f"M_n_LB{axis}", "(0.021*E/lambda_f + F_y)*S_x", unit=u["mo"], desc=f"local buckling, noncompact, {STD} Eq. F8-2")
            states["local buckling, noncompact (F8-2)"] = f"M_n_LB{axis}"
        elif c == "slender":
            w.calc("F_cr_LB", "0.33*E/lambda_f", unit=u["st"], desc=f"local buckling stress, {STD} Eq. F8-4")
            w.calc(f"M_n_LB{axis}", "F_cr_LB*S_x", unit=u["mo"], desc=f"local buckling, slender, {STD} Eq. F8-3")
            states["local buckling, slender (F8-3)"] = f"M_n_LB{axis}"
        else:
            w.note(f"Compact round HSS: local buckling does not apply ({STD} F8.2(a)).", kind="method")
        return states

    def flexure_minor(self):
        w, sc, u = self.work, self.sc, self.u
        if self.form == "L" and self.axes == "principal":
            aisc_open._principal_geometry(self, self.toe)
            return self.governing_moment("M_ny", aisc_open.f10_minor(self))
        if self.form in ("T", "L"):
            return None
        if self.form in ("I", "C"):
            w.calc("M_py", "min(F_y*Z_y, 1.6*F_y*S_y)", unit=u["mo"], desc=f"plastic moment about y, {STD} Eq. F6-1")
            states = {"yielding (F6-1)": "M_py"}
            fl = self.classes["class_flange_flexure"]
            if fl == "noncompact":
                w.calc("M_n_FLBy", "M_py - (M_py - 0.7*F_y*S_y)*(lambda_f - lambda_p_f)/(lambda_r_f - lambda_p_f)",
                       unit=u["mo"], desc=f"flange local buckling about y, noncompact, {STD} Eq. F6-2")
                states["flange local buckling, noncompact (F6-2)"] = "M_n_FLBy"
            elif fl == "slender":
                w.calc("F_cr_y", "0.69*E/lambda_f^2", unit=u["st"], desc=f"{STD} Eq. F6-4")
                w.calc("M_n_FLBy", "F_cr_y*S_y", unit=u["mo"], desc=f"flange local buckling about y, slender, {STD} Eq. F6-3")
                states["flange local buckling, slender (F6-3)"] = "M_n_FLBy"
        elif self.form == "RHS":
            states = self.f7("y", None, None)
        else:
            states = self.f8("y")
        return self.governing_moment("M_ny", states)

    # ---------------------------------------------------------------- Chapter G
    def shear(self, L_v):
        w, sc, u = self.work, self.sc, self.u
        if self.form in ("T", "L"):
            return aisc_open.g3(self)
        if self.form in ("I", "C"):
            w.calc("A_w", "d*t_w", unit=u["ar"], desc=f"web area A_w = d·t_w, {STD} G2.1")
            w.calc("lambda_v", "h/t_w", unit="1", desc="web slenderness for shear h/t_w")
            w.calc("lambda_v_a", "2.24*sqrt(E/F_y)", unit="1", desc=f"limit of {STD} G2.1(a)")
            if self.form == "I" and self.fabrication == "rolled" and num(sc["lambda_v"]) <= num(sc["lambda_v_a"]):
                w.note(f"Rolled I-shape with h/t_w ≤ 2.24√(E/F_y): C_v1 = 1.0 with φ_v = 1.00, Ω_v = 1.50 "
                       f"({STD} G2.1(a)).", kind="method")
                w.let("C_v1", w.q(1.0, ""), desc=f"web shear strength coefficient, {STD} G2.1(a)")
                kind = "shear_rolled_I"
            else:
                w.let("k_v", w.q(5.34, ""), desc=f"web plate shear buckling coefficient, no transverse stiffeners, {STD} G2.1(b)(2)(i)")
                lim = 1.10 * (num(sc["k_v"]) * sc["E"].m_as("Pa") / sc["F_y"].m_as("Pa")) ** 0.5
                if num(sc["lambda_v"]) <= lim:
                    w.note(f"h/t_w ≤ 1.10√(k_vE/F_y) = {lim:.1f}: C_v1 = 1.0 ({STD} Eq. G2-3).", kind="method")
                    w.let("C_v1", w.q(1.0, ""), desc=f"{STD} Eq. G2-3")
                else:
                    w.calc("C_v1", "1.10*sqrt(k_v*E/F_y)/lambda_v", unit="1", desc=f"{STD} Eq. G2-4")
                kind = "shear"
            w.calc("V_n", "0.6*F_y*A_w*C_v1", unit=u["fo"], desc=f"nominal shear strength, {STD} Eq. G2-1")
            return kind, "shear yielding/buckling of the web (G2.1)" + (" — channel: G2.1(b)" if self.form == "C" else "")
        if self.form == "RHS":
            w.calc("A_w", "2*h*t", unit=u["ar"], desc=f"shear area A_w = 2ht, {STD} G4")
            w.let("k_v", w.q(5.0, ""), desc=f"{STD} G4, k_v = 5")
            w.calc("lambda_v", "h/t", unit="1", desc="web slenderness h/t")
            lam = num(sc["lambda_v"])
            r = (num(sc["k_v"]) * sc["E"].m_as("Pa") / sc["F_y"].m_as("Pa")) ** 0.5
            if lam <= 1.10 * r:
                w.let("C_v2", w.q(1.0, ""), desc=f"web shear buckling coefficient, {STD} Eq. G2-9")
            elif lam <= 1.37 * r:
                w.calc("C_v2", "1.10*sqrt(k_v*E/F_y)/lambda_v", unit="1", desc=f"{STD} Eq. G2-10")
            else:
                w.calc("C_v2", "1.51*k_v*E/(lambda_v^2*F_y)", unit="1", desc=f"{STD} Eq. G2-11")
            w.calc("V_n", "0.6*F_y*A_w*C_v2", unit=u["fo"], desc=f"nominal shear strength, {STD} Eq. G4-1")
            return "shear", "shear of the HSS webs (G4)"
        if L_v is not None:
            sc["L_v"] = L_v
            w.calc("F_cr_v", "min(max(1.60*E/(sqrt(L_v/D)*lambda_f^(5/4)), 0.78*E/lambda_f^(3/2)), 0.6*F_y)",
                   unit=u["st"], desc=f"shear critical stress, {STD} Eq. G5-2a/G5-2b (≤ 0.6F_y)")
        else:
            w.note(f"L_v not given: only Eq. G5-2b is used (the larger of G5-2a and G5-2b governs, so this is "
                   f"conservative) ({STD} G5).", kind="method")
            w.calc("F_cr_v", "min(0.78*E/lambda_f^(3/2), 0.6*F_y)", unit=u["st"], desc=f"{STD} Eq. G5-2b (≤ 0.6F_y)")
        w.calc("V_n", "F_cr_v*A/2", unit=u["fo"], desc=f"nominal shear strength, {STD} Eq. G5-1")
        return "shear", "shear of the round HSS (G5)"


# ================================================================ public functions

def resolve_method(work, method):
    """LRFD or ASD: chosen once per sheet by the front matter's ``design_method:``, or per call; a call that
    contradicts the sheet's choice is an error at its ``method``."""
    sheet = work.settings.get("front_matter", {}).get("design_method")
    if sheet is not None:
        sheet = str(sheet).strip().upper()
        if sheet not in METHODS:
            work.fail(f"the front matter's design_method: {sheet!r} is neither LRFD nor ASD", param="method")
        if method is not None and method != sheet:
            work.fail(f"method=\"{method}\" contradicts the sheet's design_method: {sheet} (front matter); a sheet "
                      f"uses one method throughout ({STD} B3)", param="method")
        return sheet
    return method or "LRFD"


def _cb(work, C_b, M_max, M_A, M_B, M_C, beam=None, combo=None, x_start=None, x_end=None):
    w = work
    moments = (M_max, M_A, M_B, M_C)
    if beam is not None:
        if C_b is not None or any(m is not None for m in moments):
            w.fail("give C_b, the four moments, or beam=…, only one of them", param="beam")
        from .moments import from_beam

        from_beam(w, beam, combo, x_start, x_end, units(w)["mo"])
        return cb_formula(w)
    for nm, q in (("combo", combo), ("x_start", x_start), ("x_end", x_end)):
        if q is not None:
            w.fail(f"{nm} applies only with beam=… (the moments of a beam.solve result)", param=nm)
    if C_b is not None:
        if any(m is not None for m in moments):
            w.fail("give C_b or the four moments M_max, M_A, M_B, M_C, not both", param="C_b")
        if num(C_b) <= 0:
            w.fail("C_b must be greater than zero", param="C_b")
        return C_b
    if all(m is None for m in moments):
        w.let("C_b", w.q(1.0, ""), desc="lateral-torsional buckling modification factor",
              note=f"not given: C_b = 1.0 (uniform moment, conservative — {STD} F1)")
        return w.scope["C_b"]
    if any(m is None for m in moments):
        w.fail("give all four of M_max, M_A, M_B, M_C for Eq. F1-1", param="M_max")
    return cb_formula(w)


def cb_formula(w):
    if abs(w.scope["M_max"]).m_as("N*m") <= 0:
        w.fail("M_max must not be zero", param="M_max")
    w.calc("C_b", "12.5*abs(M_max)/(2.5*abs(M_max) + 3*abs(M_A) + 4*abs(M_B) + 3*abs(M_C))", unit="1",
           desc=f"lateral-torsional buckling modification factor, {STD} Eq. F1-1")
    return w.scope["C_b"]


COMMON = [
    Param("section", kind="record", record="section", doc="the section (steel_design.shape, section.rolled)"),
    Param("material", kind="record", record="material", doc="material record (f_y, E, G)", default=None),
    Param("method", kind="text", choices=METHODS,
          doc="LRFD (φ) or ASD (Ω); default: the front matter's design_method:, else LRFD", default=None),
    Param("F_y", "[pressure]", "yield stress (default material.f_y)", default=None),
    Param("E", "[pressure]", "modulus of elasticity (default material.E, else 29,000 ksi)", default=None),
    Param("G", "[pressure]", "shear modulus (default material.G, else 11,200 ksi)", default=None),
    Param("form", kind="text", choices=FORMS + tuple(PARTIAL_FORMS) + tuple(REFUSED_FORMS),
          doc="section form (default: from the record); 2L (double angles) in compression only",
          default=None),
]
LENGTHS = [
    Param("L", "[length]", "member length (buckling about x; about y unless L_y)"),
    Param("K_x", doc="effective length factor about x (default 1)", default=None),
    Param("K_y", doc="effective length factor about y (default 1)", default=None),
    Param("L_y", "[length]", "unbraced length for buckling about y (default L)", default=None),
    Param("L_z", "[length]", "torsional unbraced length L_cz (E4; default: L_y)", default=None),
    Param("a", "[length]", "double angles (E6): distance between the intermediate connectors", default=None),
    Param("r_i", "[length]", "double angles (E6): least radius of gyration of one angle (default: the record's r_i)",
          default=None),
    Param("connectors", kind="text", choices=("snug-tight", "welded", "pretensioned"),
          doc="double angles (E6.1): how the intermediate connectors are made", default=None),
]
BENDING = [
    Param("L_b", "[length]", "laterally unbraced length of the compression flange"),
    Param("C_b", doc="LTB modification factor (or give M_max, M_A, M_B, M_C, or beam=…)", default=None),
    Param("M_max", "[force]*[length]", "largest moment in the unbraced segment (F1-1)", default=None),
    Param("M_A", "[force]*[length]", "moment at the quarter point (F1-1)", default=None),
    Param("M_B", "[force]*[length]", "moment at the centreline (F1-1)", default=None),
    Param("M_C", "[force]*[length]", "moment at the three-quarter point (F1-1)", default=None),
    Param("beam", kind="record", record="beam", doc="a beam.solve result: C_b from its moment diagram (F1-1)",
          default=None),
    Param("combo", kind="text", doc="the beam's combination (may be left out when it has one)", default=None),
    Param("x_start", "[length]", "start of the unbraced segment on the beam (default 0)", default=None),
    Param("x_end", "[length]", "end of the unbraced segment on the beam (default: the beam's end)", default=None),
    Param("stem", kind="text", choices=("tension", "compression"),
          doc="tees (F9): the stem tip in tension (flange in compression) or in compression", default="tension"),
    Param("toe", kind="text", choices=("compression", "tension"),
          doc="single angles (F10): the toe of the vertical leg in compression or tension", default="compression"),
    Param("compression_flange", kind="text", choices=("top", "bottom"),
          doc="singly symmetric I-shapes (F4, F5): the flange in compression — top for a sagging moment, bottom for "
              "a hogging one (default: from the sign of the beam's moment with beam=…, else top)", default=None),
    Param("axes", kind="text", choices=("geometric", "principal"),
          doc="single angles (F10): bending about the geometric axes (M_rx, M_ry) or the principal axes (M_rx is then "
              "the moment about the major axis w, M_ry about the minor axis z; toe= the vertical leg's toe under M_rx)",
          default="geometric"),
    Param("restraint", kind="text", choices=("none", "at_max_moment"),
          doc="single angles (F10.2): lateral-torsional restraint only at the ends, or also at the point of "
              "maximum moment", default="none"),
]
BEND_NAMES = [p.name for p in BENDING]
CLASS_FIELDS = [
    Field("class_flange_compression", kind="text", doc="B4.1a: nonslender or slender (angles: the legs)"),
    Field("class_web_compression", kind="text", doc="B4.1a: nonslender or slender (tees: the stem)", optional=True),
    Field("class_flange_flexure", kind="text", doc="B4.1b: compact, noncompact or slender"),
    Field("class_web_flexure", kind="text", doc="B4.1b: compact, noncompact or slender", optional=True),
]
F_COMP = [Field("P_n", "[force]", "nominal compressive strength"),
          Field("P_c", "[force]", "available compressive strength φ_cP_n (LRFD) or P_n/Ω_c (ASD)"),
          Field("F_cr", "[pressure]", "critical stress"), Field("F_e", "[pressure]", "elastic buckling stress"),
          Field("F_ex", "[pressure]", "flexural buckling stress about x, E3-4"),
          Field("F_ey", "[pressure]", "flexural buckling stress about y, E3-4"),
          Field("F_ez", "[pressure]", "torsional buckling stress, E4-2 or E4-7", optional=True),
          Field("F_e_FT", "[pressure]", "flexural-torsional buckling stress, E4-3 or E4-4", optional=True),
          Field("H", doc="flexural constant, E4-8", optional=True),
          Field("r_o", "[length]", "polar radius of gyration about the shear centre, E4-9", optional=True),
          Field("governing_compression", kind="text", doc="the buckling mode and clause")]
F_FLEX = [Field("M_nx", "[force]*[length]", "nominal flexural strength, major axis"),
          Field("M_cx", "[force]*[length]", "available flexural strength φ_bM_n or M_n/Ω_b, major axis"),
          Field("M_p", "[force]*[length]", "plastic moment F_y·Z_x", optional=True),
          Field("L_p", "[length]", "limiting unbraced length L_p", optional=True),
          Field("L_r", "[length]", "limiting unbraced length L_r", optional=True),
          Field("C_b", doc="LTB modification factor used", optional=True),
          Field("M_cr", "[force]*[length]", "elastic lateral-torsional buckling moment (F9-10, F10-5)", optional=True),
          Field("R_pc", doc="web plastification factor (F4-9)", optional=True),
          Field("beta_w", "[length]", "single angles about their principal axes: β_w of F10-4", optional=True),
          Field("R_pg", doc="bending strength reduction factor (F5-6)", optional=True),
          Field("governing_flexure", kind="text", doc="the limit state governing M_nx")]
F_FLEXY = [Field("M_ny", "[force]*[length]", "nominal flexural strength, minor axis (I-shapes, channels, HSS)",
                 optional=True),
           Field("M_cy", "[force]*[length]", "available flexural strength, minor axis", optional=True),
           Field("governing_flexure_y", kind="text", doc="the limit state governing M_ny", optional=True)]
F_SHEAR = [Field("V_n", "[force]", "nominal shear strength"), Field("V_c", "[force]", "available shear strength"),
           Field("governing_shear", kind="text", doc="clause")]
F_UTIL = [Field("util_axial", doc="P_r/P_c", optional=True), Field("util_flexure", doc="M_rx/M_cx", optional=True),
          Field("util_flexure_y", doc="M_ry/M_cy", optional=True), Field("util_shear", doc="V_r/V_c", optional=True),
          Field("util_interaction", doc="H1-1a or H1-1b", optional=True),
          Field("util", doc="largest utilisation"), Field("governing", kind="text", doc="the check with the largest utilisation"),
          Field("method", kind="text", doc="LRFD or ASD"), Field("form", kind="text", doc="I, C, T, L, RHS or CHS")]


def _start(work, section, material, method, F_y, E, G, form):
    method = resolve_method(work, method)
    ctx = _Ctx(work, section, material, form, method, F_y, E, G)
    work.note(f"{STD}, {method}: {'design strength φR_n ≥ R_u' if method == 'LRFD' else 'allowable strength R_n/Ω ≥ R_a'} "
              f"({STD} B3.1/B3.2); required strengths P_r, M_r, V_r are for the {method} combinations.", kind="method")
    ctx.geometry()
    return ctx


def _collect(ctx, out, utils):
    w, sc = ctx.work, ctx.sc
    out.update(ctx.classes)
    out["method"], out["form"] = ctx.method, ctx.form
    for k, v in utils.items():
        out[k] = w.q(num(sc[v]), "")
    if utils:
        name = max(utils, key=lambda k: num(sc[utils[k]]))
        out["util"] = out[name]
        principal = ctx.axes == "principal"
        out["governing"] = {"util_axial": "axial compression",
                            "util_flexure": "flexure about w (major principal axis)" if principal else "flexure about x",
                            "util_flexure_y": "flexure about z (minor principal axis)" if principal else "flexure about y", "util_shear": "shear",
                            "util_interaction": "combined force (H1)"}[name]
        w.note(f"Largest utilisation: {out['governing']}, {num(out['util']):.3f}.", kind="method")
    else:
        out["util"], out["governing"] = w.q(0.0, ""), "no required strength given"
    return tidy(out, ctx.u)


def _util(w, name, req, cap, desc):
    w.calc(name, f"{req}/{cap}", unit="1", desc=desc)
    w.check(f"{req} <= {cap}", desc=desc)


def _run(work, section, material, method, F_y, E, G, form, *, L=None, K_x=None, K_y=None, L_y=None, L_z=None,
         L_b=None, C_b=None, M_max=None, M_A=None, M_B=None, M_C=None, beam=None, combo=None, x_start=None,
         x_end=None, stem="tension", toe="compression", restraint="none", L_v=None,
         P_r=None, M_rx=None, M_ry=None, V_r=None, compression_flange=None, a=None, r_i=None, connectors=None,
         axes="geometric", want=("compression", "flexure", "flexure_y", "shear")):
    early = form_of(section, form) if section is not None else ""
    if early in PARTIAL_FORMS and set(want) - {"compression"}:
        work.fail(PARTIAL_FORMS[early], param="form" if form else "section")
    ctx = _start(work, section, material, method, F_y, E, G, form)
    w, sc, u = work, work.scope, ctx.u
    if ctx.form != "2L":
        for nm, q in (("a", a), ("r_i", r_i), ("connectors", connectors)):
            if q is not None:
                w.fail(f"{nm} applies to double angles (E6) only", param=nm)
    positive(w, "a", a)
    positive(w, "r_i", r_i)
    for nm, q in (("L", L), ("L_y", L_y), ("L_z", L_z), ("L_v", L_v)):
        positive(w, nm, q)
    if L_b is not None and L_b.magnitude < 0:
        w.fail("L_b must not be negative (0 for a continuously braced compression flange)", param="L_b")
    for nm, q in (("P_r", P_r), ("M_rx", M_rx), ("M_ry", M_ry), ("V_r", V_r)):
        if q is not None and q.magnitude < 0:
            w.fail(f"{nm} is a required strength: give its magnitude (≥ 0)", param=nm)
    ctx.axes, ctx.toe = axes, toe
    if axes == "principal":
        if ctx.form != "L":
            w.fail("axes=\"principal\" applies to single angles (F10) only", param="axes")
        if P_r is not None and ("flexure" in want or "flexure_y" in want):
            w.fail(f"combined force on a single angle bent about its principal axes needs {STD} H2 (unsymmetric "
                   f"members), which is not built", param="axes")
    if ctx.form in ("T", "L") and M_ry is not None and axes != "principal":
        w.fail(f"minor-axis flexure of a {'tee' if ctx.form == 'T' else 'single angle'} is not built ({STD} "
               f"{'F9 covers tees only in their plane of symmetry' if ctx.form == 'T' else ANGLE_AXES}); "
               f"M_ry is out of scope", param="M_ry")
    ctx.classify()
    out, utils = {}, {}
    if "compression" in want:
        gov = ctx.compression(L, K_x, K_y, L_y, L_z, a, r_i, connectors)
        ctx.available("P_c", "P_n", "compression")
        out.update(P_n=sc["P_n"], P_c=sc["P_c"], F_cr=sc["F_cr"], F_e=sc["F_e"], F_ex=sc["F_ex"], F_ey=sc["F_ey"],
                   governing_compression=gov)
        for k in ("F_ez", "F_e_FT", "r_o"):
            if k in sc:
                out[k] = sc[k]
        if "H" in sc and "F_e_FT" in sc:
            out["H"] = w.q(num(sc["H"]), "")
        if P_r is not None:
            _util(w, "util_axial", "P_r", "P_c", f"axial compression, {STD} E1")
            utils["util_axial"] = "util_axial"
    biaxial = False
    if "flexure" in want:
        cb = _cb(w, C_b, M_max, M_A, M_B, M_C, beam, combo, x_start, x_end) if ctx.form != "CHS" else None
        ctx.compression_flange = _compression_flange(ctx, compression_flange, beam, combo, x_start, x_end)
        gov = ctx.flexure_major(L_b, cb, stem, toe, restraint)
        ctx.available("M_cx", "M_nx", "flexure")
        out.update(M_nx=sc["M_nx"], M_cx=sc["M_cx"], governing_flexure=gov)
        for k in ("M_p", "L_p", "L_r", "C_b", "M_cr", "R_pc", "R_pg", "beta_w"):
            if k in sc and sc[k] is not None and not isinstance(sc[k], str):
                out[k] = sc[k] if k not in ("C_b", "R_pc", "R_pg") else w.q(num(sc[k]), "")
        if "M_p" not in out and "M_px" in sc:
            out["M_p"] = sc["M_px"]
        if M_rx is not None:
            _util(w, "util_flexure", "M_rx", "M_cx", f"flexure about {'w' if axes == 'principal' else 'x'}, {STD} F1")
            utils["util_flexure"] = "util_flexure"
    if "flexure_y" in want:
        gov = ctx.flexure_minor()
        if gov is None:
            w.note(f"Minor-axis flexure of a {'tee' if ctx.form == 'T' else 'single angle'} is not checked (no M_ry; "
                   f"out of the scope built).", kind="method")
        else:
            biaxial = True
            ctx.available("M_cy", "M_ny", "flexure")
            out.update(M_ny=sc["M_ny"], M_cy=sc["M_cy"], governing_flexure_y=gov)
            if M_ry is not None:
                _util(w, "util_flexure_y", "M_ry", "M_cy", f"flexure about {'z' if axes == 'principal' else 'y'}, {STD} F1")
                utils["util_flexure_y"] = "util_flexure_y"
    if "shear" in want:
        kind, gov = ctx.shear(L_v)
        ctx.available("V_c", "V_n", kind)
        out.update(V_n=sc["V_n"], V_c=sc["V_c"], governing_shear=gov)
        if V_r is not None:
            _util(w, "util_shear", "V_r", "V_c", f"shear, {STD} G1")
            utils["util_shear"] = "util_shear"
    if "compression" in want and ("flexure" in want or "flexure_y" in want) and P_r is not None:
        for nm in ("M_rx", "M_ry"):
            if sc.get(nm) is None:
                sc[nm] = w.q(0.0, u["mo"])
        interaction(w, u, biaxial=biaxial)
        utils["util_interaction"] = "util_interaction"
    return _collect(ctx, out, utils)


ANGLE_AXES = ('F10 is built for bending about the geometric x axis, and about both principal axes of an equal-leg '
              'angle with axes="principal"')


def _compression_flange(ctx, given, beam, combo, x_start, x_end):
    """Which flange of an I-shape is in compression: given, else the sign of the beam's moment where |M| is
    largest in the segment (sagging positive: top), else the top flange."""
    w = ctx.work
    if given is not None:
        if ctx.form != "I" or not ctx.singly:
            w.note(f"compression_flange=\"{given}\" makes no difference for this "
                   f"{'doubly symmetric I-shape' if ctx.form == 'I' else 'section'}.", kind="method")
        return given
    if beam is not None and ctx.form == "I" and ctx.singly:
        from .moments import segment_sign

        sign = segment_sign(w, beam, combo, x_start, x_end)
        w.note(f"The beam's moment where |M| is largest in the segment is {'sagging' if sign >= 0 else 'hogging'}: "
               f"the {'top' if sign >= 0 else 'bottom'} flange is in compression.", kind="method")
        return "top" if sign >= 0 else "bottom"
    return "top"


def interaction(w, u, biaxial=True):
    sc = w.scope
    ratio = sc["P_r"].m_as("N") / sc["P_c"].m_as("N")
    moments = "M_rx/M_cx + M_ry/M_cy" if biaxial else "M_rx/M_cx"
    if ratio >= 0.2:
        w.note(f"P_r/P_c = {ratio:.3f} ≥ 0.2: {STD} Eq. H1-1a applies.", kind="method")
        w.calc("util_interaction", f"P_r/P_c + 8/9*({moments})", unit="1",
               desc=f"combined flexure and compression, {STD} Eq. H1-1a")
    else:
        w.note(f"P_r/P_c = {ratio:.3f} < 0.2: {STD} Eq. H1-1b applies.", kind="method")
        w.calc("util_interaction", f"P_r/(2*P_c) + ({moments})", unit="1",
               desc=f"combined flexure and compression, {STD} Eq. H1-1b")
    w.check("util_interaction <= 1", desc=f"interaction, {STD} H1.1")


REQ_BEAM = [Param("M_rx", "[force]*[length]", "required flexural strength about x (M_u or M_a)", default=None),
            Param("M_ry", "[force]*[length]", "required flexural strength about y", default=None),
            Param("V_r", "[force]", "required shear strength (V_u or V_a)", default=None),
            Param("L_v", "[length]", "round HSS: distance from maximum to zero shear (G5)", default=None)]
REQ_COL = [Param("P_r", "[force]", "required axial compressive strength (P_u or P_a)", default=None)]


@namespace.function("aisc_beam", standards=AISC_STANDARDS, params=COMMON + BENDING + REQ_BEAM,
                    fields=CLASS_FIELDS + F_FLEX + F_FLEXY + F_SHEAR + F_UTIL, returns="steel_check.aisc_beam",
                    family="steel_check")
def aisc_beam(work, section, material=None, method=None, F_y=None, E=None, G=None, form=None, L_b=None, C_b=None,
              M_max=None, M_A=None, M_B=None, M_C=None, beam=None, combo=None, x_start=None, x_end=None,
              stem="tension", toe="compression", restraint="none", M_rx=None, M_ry=None, V_r=None, L_v=None,
              compression_flange=None, axes="geometric"):
    """A beam to AISC 360-16: B4 classification, Chapter F about both axes, Chapter G shear."""
    return _run(work, section, material, method, F_y, E, G, form, L_b=L_b, C_b=C_b, M_max=M_max, M_A=M_A, M_B=M_B,
                M_C=M_C, beam=beam, combo=combo, x_start=x_start, x_end=x_end, stem=stem, toe=toe,
                restraint=restraint, L_v=L_v, M_rx=M_rx, M_ry=M_ry, V_r=V_r, compression_flange=compression_flange,
                axes=axes, want=("flexure", "flexure_y", "shear"))


@namespace.function("aisc_column", standards=AISC_STANDARDS, params=COMMON + LENGTHS + REQ_COL,
                    fields=CLASS_FIELDS + F_COMP + F_UTIL, returns="steel_check.aisc_column",
                    family="steel_check")
def aisc_column(work, section, L, material=None, method=None, F_y=None, E=None, G=None, form=None, K_x=None,
                K_y=None, L_y=None, L_z=None, a=None, r_i=None, connectors=None, P_r=None):
    """A column to AISC 360-16: B4 classification, Chapter E (E3, E4 where it applies, E7)."""
    return _run(work, section, material, method, F_y, E, G, form, L=L, K_x=K_x, K_y=K_y, L_y=L_y, L_z=L_z, P_r=P_r,
                a=a, r_i=r_i, connectors=connectors, want=("compression",))


@namespace.function("aisc_beam_column", standards=AISC_STANDARDS,
                    params=COMMON + LENGTHS + BENDING + REQ_COL + REQ_BEAM,
                    fields=CLASS_FIELDS + F_COMP + F_FLEX + F_FLEXY + F_SHEAR + F_UTIL,
                    returns="steel_check.aisc_beam_column", family="steel_check")
def aisc_beam_column(work, section, L, L_b, material=None, method=None, F_y=None, E=None, G=None, form=None,
                     K_x=None, K_y=None, L_y=None, L_z=None, a=None, r_i=None, connectors=None, C_b=None, M_max=None, M_A=None, M_B=None, M_C=None,
                     beam=None, combo=None, x_start=None, x_end=None, stem="tension", toe="compression",
                     restraint="none", P_r=None, M_rx=None, M_ry=None, V_r=None, L_v=None, compression_flange=None,
                     axes="geometric"):
    """A beam-column to AISC 360-16: Chapters B4, E, F, G and the H1-1 interaction."""
    return _run(work, section, material, method, F_y, E, G, form, L=L, K_x=K_x, K_y=K_y, L_y=L_y, L_z=L_z, L_b=L_b,
                C_b=C_b, M_max=M_max, M_A=M_A, M_B=M_B, M_C=M_C, beam=beam, combo=combo, x_start=x_start,
                x_end=x_end, stem=stem, toe=toe, restraint=restraint, L_v=L_v, P_r=P_r, M_rx=M_rx, M_ry=M_ry,
                V_r=V_r, compression_flange=compression_flange, a=a, r_i=r_i, connectors=connectors, axes=axes)


@namespace.function("aisc_shear", standards=AISC_STANDARDS, params=COMMON + [REQ_BEAM[2], REQ_BEAM[3]],
                    fields=CLASS_FIELDS + F_SHEAR + F_UTIL, returns="steel_check.aisc_shear",
                    family="steel_check")
def aisc_shear(work, section, material=None, method=None, F_y=None, E=None, G=None, form=None, V_r=None, L_v=None):
    """Shear alone: AISC 360-16 G2.1 (I-shapes and channels), G3 (tees, angles), G4 (rectangular HSS), G5 (round)."""
    return _run(work, section, material, method, F_y, E, G, form, V_r=V_r, L_v=L_v, want=("shear",))


@namespace.function("aisc_flexure", standards=AISC_STANDARDS, params=COMMON + BENDING + REQ_BEAM[:1],
                    fields=CLASS_FIELDS + F_FLEX + F_UTIL, returns="steel_check.aisc_flexure",
                    family="steel_check")
def aisc_flexure(work, section, L_b, material=None, method=None, F_y=None, E=None, G=None, form=None, C_b=None,
                 M_max=None, M_A=None, M_B=None, M_C=None, beam=None, combo=None, x_start=None, x_end=None,
                 stem="tension", toe="compression", restraint="none", M_rx=None, compression_flange=None,
                 axes="geometric"):
    """Major-axis flexure alone: AISC 360-16 F2–F5 (I, channels), F7/F8 (HSS), F9 (tees), F10 (single angles)."""
    return _run(work, section, material, method, F_y, E, G, form, L_b=L_b, C_b=C_b, M_max=M_max, M_A=M_A, M_B=M_B,
                M_C=M_C, beam=beam, combo=combo, x_start=x_start, x_end=x_end, stem=stem, toe=toe,
                restraint=restraint, M_rx=M_rx, compression_flange=compression_flange, axes=axes, want=("flexure",))


@namespace.function("aisc_classify", standards=AISC_STANDARDS,
                    params=COMMON[:1] + COMMON[1:2] + COMMON[3:],
                    fields=CLASS_FIELDS + [Field("form", kind="text", doc="I, C, T, L, RHS or CHS")],
                    returns="steel_class.aisc", family="steel_class")
def aisc_classify(work, section, material=None, F_y=None, E=None, G=None, form=None):
    """AISC 360-16 B4.1 classification of the flanges and web (legs, stem), for compression and flexure."""
    ctx = _Ctx(work, section, material, form, "LRFD", F_y, E, G)
    ctx.geometry()
    return {**ctx.classify(), "form": ctx.form}


@namespace.function("aisc_Cb", standards=AISC_STANDARDS,
                    params=[
    Param("M_max", "[force]*[length]", "largest moment in the unbraced segment", default=None),
    Param("M_A", "[force]*[length]", "moment at the quarter point", default=None),
    Param("M_B", "[force]*[length]", "moment at the centreline", default=None),
    Param("M_C", "[force]*[length]", "moment at the three-quarter point", default=None),
    *[p for p in BENDING if p.name in ("beam", "combo", "x_start", "x_end")]],
    fields=[Field("C_b", doc="LTB modification factor, Eq. F1-1")], returns="steel_Cb")
def aisc_Cb(work, M_max=None, M_A=None, M_B=None, M_C=None, beam=None, combo=None, x_start=None, x_end=None):
    """C_b of an unbraced segment, AISC 360-16 Eq. F1-1 (absolute values): from the four moments, or read from a
    beam.solve result over x_start … x_end."""
    if beam is None and any(m is None for m in (M_max, M_A, M_B, M_C)):
        work.fail("give the four moments M_max, M_A, M_B, M_C, or beam=… (a beam.solve result)", param="M_max")
    return {"C_b": work.q(num(_cb(work, None, M_max, M_A, M_B, M_C, beam, combo, x_start, x_end)), "")}


@namespace.function("aisc_interaction", standards=AISC_STANDARDS,
                    params=[Param("P_r", "[force]", "required axial strength"), Param("P_c", "[force]", "available axial strength"),
                            Param("M_rx", "[force]*[length]", "required flexural strength, x", default=None),
                            Param("M_cx", "[force]*[length]", "available flexural strength, x", default=None),
                            Param("M_ry", "[force]*[length]", "required flexural strength, y", default=None),
                            Param("M_cy", "[force]*[length]", "available flexural strength, y", default=None)],
                    fields=[Field("util_interaction", doc="H1-1a or H1-1b value"), Field("equation", kind="text", doc="H1-1a or H1-1b")],
                    returns="steel_interaction")
def aisc_interaction(work, P_r, P_c, M_rx=None, M_cx=None, M_ry=None, M_cy=None):
    """AISC 360-16 H1-1a/H1-1b for given required and available strengths."""
    sc = work.scope
    u = units(work)
    if P_c.magnitude <= 0:
        work.fail("P_c must be greater than zero", param="P_c")
    for m, c in (("M_rx", "M_cx"), ("M_ry", "M_cy")):
        if (sc[m] is None) != (sc[c] is None):
            work.fail(f"give both {m} and {c}", param=m)
        if sc[m] is None:
            sc[m], sc[c] = work.q(0.0, u["mo"]), work.q(1.0, u["mo"])
        elif sc[c].magnitude <= 0:
            work.fail(f"{c} must be greater than zero", param=c)
    interaction(work, u)
    eq = "H1-1a" if P_r.m_as("N") / P_c.m_as("N") >= 0.2 else "H1-1b"
    return {"util_interaction": work.q(num(sc["util_interaction"]), ""), "equation": eq}
