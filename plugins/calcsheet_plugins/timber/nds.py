"""NDS 2018 (ASD) member checks: reference values times adjustment factors, traced with clause numbers.

F'_b = F_b·C_D·C_M·C_t·C_L·C_F·C_fu·C_i·C_r (Table 4.3.1, sawn lumber; Table 5.3.1 for glulam with the lesser of
C_L and C_V), F'_v, F'_c⊥, F'_c = F_c·C_D·C_M·C_t·C_F·C_i·C_P, E'_min = E_min·C_M·C_t·C_i. Every factor is a
value from the data files recorded with its table, or a traced formula.
"""
from __future__ import annotations

from calcsheet.plugin import Field, Param

from . import data as D
from . import equations as EQ
from . import namespace
from .ec5 import Chain, _finish, _positive

# what the design basis lists when a sheet calls one of these functions (the namespace lists both codes)
NDS_STANDARDS = ("ANSI/AWC NDS-2018 (ASD) and NDS Supplement 2018",)

STD = "NDS 2018"
TEMPS = ("normal", "100F-125F", "125F-150F")
PROPS = ("b", "t", "v", "c", "cp", "E")  # F_b, F_t, F_v, F_c, F_c⊥, E and E_min
PROP_KEY = {"b": "F_b", "t": "F_t", "v": "F_v", "c": "F_c", "cp": "F_c_perp", "E": "E"}


def _flag(x) -> bool:
    return x == "yes"


class Member:
    """The species/grade values, the dressed size and the factors that do not depend on the check."""

    def __init__(self, work, species, grade, size, b, d):
        vals = D.nds_values()
        if grade not in vals[species]:
            work.fail(f"{species} has no grade {grade!r} in the data; grades: {', '.join(vals[species])}",
                      param="grade")
        self.v = vals[species][grade]
        self.species, self.grade = species, grade
        self.product = self.v["product"]
        self.source = f"NDS Supplement 2018 {self.v['table']}, {species} {grade} (from memory)"
        self.nominal = None
        if size is not None:
            if self.product != "sawn":
                work.fail("nominal sizes are for sawn lumber: give b and d for glulam", param="size")
            t, w = (int(x) for x in size.split("x"))
            self.nominal = (t, w)
            bb, dd = D.nds_sizes()[size]
            work.let("b", work.q(bb, "in"), desc=f"dressed thickness of a {size}", note=D.nds_values()["sizes"]["source"])
            work.let("d", work.q(dd, "in"), desc=f"dressed width of a {size}", note=D.nds_values()["sizes"]["source"])
        elif b is None or d is None:
            work.fail("give size=\"2x10\" (sawn lumber) or both b and d", param="size" if b is None else "d")
        else:
            _positive(work, b=b, d=d)
            if self.product == "sawn":
                work.fail("give the nominal size of sawn lumber (size=\"2x10\"): the size factor C_F depends on it "
                          "(NDS Supplement Table 4A)", param="b")

    def ref(self, work, key, name, desc):
        work.let(name, work.q(float(self.v[key]), "psi"), unit="psi", desc=desc, note=self.source)


def _common_factors(work, m: Member, load_duration, wet, temperature, incised, chain: Chain, need=PROPS):
    """C_D, C_M, C_t, C_F, C_i for the properties in ``need``."""
    f = D.nds()
    load_duration = D.nds_duration(load_duration)
    cd = float(f["C_D"][load_duration])
    work.let("C_D", work.q(cd, ""), desc=f"load duration factor, {load_duration} ({f['C_D']['why'][load_duration]})",
             note=f["C_D"]["source"])
    chain.add("C_D", cd, f"{load_duration} load ({f['C_D']['why'][load_duration]}), Table 2.3.2")
    # size factor first: C_M for F_b and F_c depends on F·C_F
    cf = {"b": 1.0, "t": 1.0, "c": 1.0}
    if m.product == "sawn":
        t, w = m.nominal
        rows = f["C_F"]["stud" if m.v["class"] == "stud" else "dimension"]
        if w > rows[-1][0]:
            work.fail(f"C_F for {m.grade} wider than {rows[-1][0]} in: use the No.3 values (Table 4A footnote); "
                      f"not built", param="size")
        row = D.table_row(rows, w)
        cf = {"b": row[1] if t <= 3 else row[2], "t": row[3], "c": row[4]}
        for p in ("b", "t", "c"):
            if p in need:
                work.let(f"C_F_{p}", work.q(cf[p], ""), desc=f"size factor for {PROP_KEY[p]}, {t}x{w} {m.grade}",
                         note=f["C_F"]["source"])
                if cf[p] != 1:
                    chain.add(f"C_F ({PROP_KEY[p]})", cf[p], f"{w} in nominal width (Table 4A)")
    wet_ = _flag(wet)
    cm = f["C_M"]["sawn" if m.product == "sawn" else "glulam"]
    it = TEMPS.index(temperature)
    ct = f["C_t"]
    ci = f["C_i"]
    if _flag(incised) and m.product != "sawn":
        work.fail(f"the incising factor C_i is for sawn lumber ({STD} 4.3.8)", param="incised")
    for p in need:
        key = PROP_KEY[p]
        v = float(cm[key]) if wet_ else 1.0
        why = "wet service" if wet_ else "dry service (moisture content ≤ 19 %)"
        if wet_ and m.product == "sawn" and p in ("b", "c"):
            limit = cm[f"{key}_waived_below"]
            if float(m.v[key]) * cf[p] <= limit:
                v, why = 1.0, f"wet service, but {key}·C_F ≤ {limit} psi"
        work.let(f"C_M_{p}", work.q(v, ""), desc=f"wet service factor for {key} ({why})", note=cm["source"])
        if v != 1:
            chain.add(f"C_M ({key})", v, why)
        if p in ("t", "E"):
            tv = ct["F_t_E"][it]
        else:
            tv = (ct["other_wet"] if wet_ else ct["other_dry"])[it]
        work.let(f"C_t_{p}", work.q(float(tv), ""), desc=f"temperature factor for {key} ({temperature})",
                 note=ct["source"])
        if tv != 1:
            chain.add(f"C_t ({key})", float(tv), f"sustained temperature {temperature}")
        iv = float(ci[key]) if _flag(incised) else 1.0
        work.let(f"C_i_{p}", work.q(iv, ""), desc=f"incising factor for {key}" + ("" if _flag(incised) else
                                                                                 " (not incised)"),
                 note=ci["source"])
        if iv != 1:
            chain.add(f"C_i ({key})", iv, "incised for preservative treatment (Table 4.3.8)")
    if "E" in need:
        m.ref(work, "E", "E", "reference modulus of elasticity")
        m.ref(work, "E_min", "E_min", "reference modulus for stability")
        work.calc("E_p", "E*C_M_E*C_t_E*C_i_E", unit="psi", desc=f"adjusted modulus E', {STD} Table 4.3.1")
        work.calc("E_min_p", "E_min*C_M_E*C_t_E*C_i_E", unit="psi",
                  desc=f"adjusted stability modulus E'_min, {STD} Table 4.3.1 (C_T = 1: not a wall stud)")


def _bending(work, m: Member, l_u, loading, repetitive, flat_use, chain: Chain, axis="x"):
    """F'_b with C_L (3.3.3), C_fu, C_r and, for glulam, C_V (5.3.6). Returns the name of F'_b."""
    f = D.nds()
    sc = work.scope
    m.ref(work, "F_b", "F_b", "reference bending design value")
    # C_r, C_fu
    if _flag(repetitive):
        if m.product != "sawn" or m.nominal[0] > 4:
            work.fail(f"the repetitive member factor C_r is for dimension lumber 2\"-4\" thick ({STD} 4.3.9)",
                      param="repetitive")
        work.let("C_r", work.q(float(f["C_r"]["value"]), ""), desc="repetitive member factor",
                 note=f"{f['C_r']['source']}: {f['C_r']['why']}")
        chain.add("C_r", float(f["C_r"]["value"]), "repetitive members, at most 24 in on centre (4.3.9)")
    else:
        work.let("C_r", work.q(1.0, ""), desc="repetitive member factor (not a repetitive system)",
                 note=f["C_r"]["source"])
    if _flag(flat_use):
        if m.product != "sawn":
            work.fail("C_fu for glulam (Table 5A footnote) is not built", param="flat_use")
        t, w = m.nominal
        row = D.table_row(f["C_fu"]["sawn"], w)
        work.let("C_fu", work.q(row[1] if t <= 3 else row[2], ""), desc="flat use factor (load on the wide face)",
                 note=f["C_fu"]["source"])
        chain.add("C_fu", float(work["C_fu"].m_as("")), "loaded on the wide face (Table 4A)")
    else:
        work.let("C_fu", work.q(1.0, ""), desc="flat use factor (edgewise bending)", note=f["C_fu"]["source"])
    cf = "C_F_b" if m.product == "sawn" else "1"
    star = f"F_b*C_D*C_M_b*C_t_b*{cf}*C_i_b*C_r"
    work.calc("F_b_star", star, unit="psi",
              desc=f"F_b* = F_b times every factor except C_fu, C_V and C_L, {STD} 3.3.3.8")
    # beam stability, 3.3.3
    depth, width = ("d", "b") if axis == "x" and not _flag(flat_use) else ("b", "d")
    if l_u is None or sc[depth].m_as("in") <= sc[width].m_as("in"):
        why = ("the compression edge is braced throughout and the ends are held against rotation (3.3.3.3)"
               if l_u is None else "d ≤ b: no lateral instability (3.3.3.1)")
        work.let("C_L", work.q(1.0, ""), desc="beam stability factor", note=f"{STD} {why}")
        sc["F_bE"] = None
    else:
        _positive(work, l_u=l_u)
        rows = f["l_e"][loading]
        le, row = EQ.l_e(rows, l_u.m_as("in"), sc[depth].m_as("in"))
        sc["l_u"] = l_u
        ratio = l_u.m_as("in") / sc[depth].m_as("in")
        work.note(f"l_u/d = {ratio:.2f}: Table 3.3.3, {loading}, gives l_e = {row[1]}·l_u"
                  + (f" + {row[2]:g}·d" if row[2] else "") + ".", kind="method")
        work.calc("l_e", f"{row[1]}*l_u" + (f" + {row[2]:g}*{depth}" if row[2] else ""), unit="in",
                  desc=f"effective length for beam stability, {STD} 3.3.3, Table 3.3.3")
        work.calc("R_B", f"sqrt(l_e*{depth}/{width}^2)", unit="1", desc=f"slenderness ratio, {STD} 3.3.3.6 Eq. (3.3-5)")
        rb = float(work["R_B"].m_as(""))
        if rb > f["limits"]["R_B_max"]:
            work.fail(f"R_B = {rb:.1f} exceeds {f['limits']['R_B_max']} ({STD} 3.3.3.7): brace the compression "
                      f"edge or deepen the section", param="l_u")
        work.calc("F_bE", "1.20*E_min_p/R_B^2", unit="psi", desc=f"critical buckling design value, {STD} 3.3.3.8")
        work.calc("C_L", "(1 + F_bE/F_b_star)/1.9 - sqrt(((1 + F_bE/F_b_star)/1.9)^2 - (F_bE/F_b_star)/0.95)",
                  unit="1", desc=f"beam stability factor, {STD} 3.3.3.8 Eq. (3.3-6)")
        chain.add("C_L", float(work["C_L"].m_as("")), f"beam stability, R_B = {rb:.2f} (3.3.3)")
    stab = "C_L"
    if m.product == "glulam":
        x = f["C_V"]["x_other"] if "Southern Pine" not in m.species else f["C_V"]["x_southern_pine"]
        if sc["b"].m_as("in") > f["C_V"]["b_max"]:
            work.fail(f"b wider than {f['C_V']['b_max']} in: take b = {f['C_V']['b_max']} in for C_V "
                      f"(5.3.6, multiple-piece laminations): not built", param="b")
        work.let("x_V", work.q(float(x), ""), desc="volume factor exponent", note=f["C_V"]["source"])
        work.calc("C_V", "min(((21 ft)/L)^(1/x_V)*((12 in)/d)^(1/x_V)*((5.125 in)/b)^(1/x_V), 1)", unit="1",
                  desc=f"volume factor, {STD} 5.3.6 Eq. (5.3-1)")
        work.calc("C_LV", "min(C_L, C_V)", unit="1",
                  desc=f"the lesser of C_L and C_V: they are not applied together ({STD} 5.3.6)")
        chain.add("C_V", float(work["C_V"].m_as("")), "glulam volume effect (5.3.6)")
        stab = "C_LV"
    work.calc("F_b_p", f"F_b*C_D*C_M_b*C_t_b*{stab}*{cf}*C_fu*C_i_b*C_r", unit="psi",
              desc=f"adjusted bending design value F'_b, {STD} Table {'4.3.1' if m.product == 'sawn' else '5.3.1'}")
    return "F_b_p"


COMMON = [
    Param("species", kind="text", choices=D.nds_species(), doc="species group (NDS Supplement table)"),
    Param("grade", kind="text", choices=D.nds_grades(), doc="grade, or glulam combination symbol"),
    Param("size", kind="text", choices=tuple(D.nds_sizes()), doc="nominal size of sawn lumber, e.g. \"2x10\"",
          default=None),
    Param("b", "[length]", "breadth (glulam)", default=None), Param("d", "[length]", "depth (glulam)", default=None),
    Param("L", "[length]", "span or height"),
]
ADJ = [
    Param("load_duration", kind="text", choices=D.nds_durations(),
          doc="load duration of the governing combination (Table 2.3.2)", default="10 years"),
    Param("wet", kind="flag", doc="wet service (moisture content above 19 %)", default="no"),
    Param("temperature", kind="text", choices=TEMPS, doc="sustained temperature band (Table 2.3.3)",
          default="normal"),
    Param("incised", kind="flag", doc="incised for preservative treatment (4.3.8)", default="no"),
]


# ================================================================== timber_design.nds_beam
@namespace.function(
    "nds_beam", standards=NDS_STANDARDS,
    params=[*COMMON, Param("M", "[force]*[length]", "bending moment (ASD)"), Param("V", "[force]", "shear (ASD)"),
            *ADJ,
            Param("repetitive", kind="flag", doc="repetitive member (4.3.9)", default="no"),
            Param("flat_use", kind="flag", doc="bent about the weak axis, load on the wide face", default="no"),
            Param("l_u", "[length]", "unbraced length of the compression edge (none: braced throughout)",
                  default=None),
            Param("loading", kind="text", choices=D.nds_le_cases(), doc="Table 3.3.3 case",
                  default="single-span-uniform-load"),
            Param("R", "[force]", "support reaction for the bearing check", default=None),
            Param("l_b", "[length]", "bearing length", default=None),
            Param("w_LT", "[force]/[length]", "long-term line load (dead + sustained live), simply supported",
                  default=None),
            Param("w_ST", "[force]/[length]", "short-term line load (live)", default=None),
            Param("D_LT", "[length]", "deflection under the long-term load (instead of w_LT)", default=None),
            Param("D_ST", "[length]", "deflection under the short-term load (instead of w_ST)", default=None),
            Param("K_cr", kind="text", choices=tuple(k for k in D.nds()["K_cr"] if k != "source"),
                  doc="creep case (3.5.2)", default=None),
            Param("limit_ST", doc="short-term deflection limit as span/limit (e.g. 360)", default=None),
            Param("limit_T", doc="total deflection limit as span/limit (e.g. 240)", default=None)],
    fields=[Field("C_D"), Field("C_L"), Field("C_V", optional=True, doc="glulam only"),
            Field("F_b_p", "[pressure]", "F'_b"), Field("f_b", "[pressure]", "bending stress"),
            Field("F_v_p", "[pressure]", "F'_v"), Field("f_v", "[pressure]", "shear stress"),
            Field("U_bending", doc="f_b/F'_b (3.3.1)"), Field("U_shear", doc="f_v/F'_v (3.4.1)"),
            Field("U_bearing", doc="f_c⊥/F'_c⊥ (3.10.2)", optional=True),
            Field("Delta_ST", "[length]", "short-term deflection", optional=True),
            Field("Delta_T", "[length]", "total deflection with creep, K_cr·Δ_LT + Δ_ST (3.5.2)", optional=True),
            Field("U_defl_ST", doc="Δ_ST/(L/limit_ST)", optional=True),
            Field("U_defl_T", doc="Δ_T/(L/limit_T)", optional=True),
            Field("U_max"), Field("governing", kind="text"), Field("factor", kind="text")],
    returns="timber_design.nds_beam",
)
def nds_beam(work, species, grade, L, M, V, size=None, b=None, d=None, load_duration="10 years", wet="no",
             temperature="normal", incised="no", repetitive="no", flat_use="no", l_u=None,
             loading="single-span-uniform-load", R=None, l_b=None, w_LT=None, w_ST=None, D_LT=None, D_ST=None,
             K_cr=None, limit_ST=None, limit_T=None):
    """A sawn-lumber or glulam beam to the NDS 2018 (ASD): bending with C_L/C_V, shear, bearing, deflection."""
    _positive(work, L=L)
    for k, v in (("M", M), ("V", V), ("R", R), ("w_LT", w_LT), ("w_ST", w_ST)):
        if v is not None and v.magnitude < 0:
            work.fail(f"{k} is a magnitude: give it as a positive value", param=k)
    for k, v in (("limit_ST", limit_ST), ("limit_T", limit_T)):
        if v is not None and float(v.m_as("") if hasattr(v, "m_as") else v) <= 0:
            work.fail(f"{k} is span/limit: give a positive number such as 360", param=k)
    m = Member(work, species, grade, size, b, d)
    chain = Chain()
    _common_factors(work, m, load_duration, wet, temperature, incised, chain, need=("b", "v", "cp", "E"))
    if _flag(flat_use):
        work.calc("S", "d*b^2/6", unit="in^3", desc="section modulus, flatwise")
    else:
        work.calc("S", "b*d^2/6", unit="in^3", desc="section modulus, edgewise")
    _bending(work, m, l_u, loading, repetitive, flat_use, chain)
    work.calc("f_b", "M/S", unit="psi", desc="bending stress")
    work.calc("U_bending", "f_b/F_b_p", unit="1", desc=f"bending, f_b ≤ F'_b ({STD} 3.3.1)")
    m.ref(work, "F_v", "F_v", "reference shear design value")
    work.calc("F_v_p", "F_v*C_D*C_M_v*C_t_v*C_i_v", unit="psi", desc=f"adjusted shear design value F'_v, {STD} Table 4.3.1")
    work.calc("f_v", "3*V/(2*b*d)", unit="psi", desc=f"shear stress, rectangular section, {STD} 3.4.2 Eq. (3.4-2)")
    work.calc("U_shear", "f_v/F_v_p", unit="1", desc=f"shear, f_v ≤ F'_v ({STD} 3.4.1)")
    out = {"C_D": work["C_D"], "C_L": work["C_L"], "F_b_p": work["F_b_p"], "f_b": work["f_b"],
           "F_v_p": work["F_v_p"], "f_v": work["f_v"], "U_bending": work["U_bending"], "U_shear": work["U_shear"]}
    if "C_V" in work:
        out["C_V"] = work["C_V"]
    if R is not None:
        if l_b is None:
            work.fail("give the bearing length l_b with R", param="R")
        _positive(work, l_b=l_b)
        m.ref(work, "F_c_perp", "F_c_perp", "reference compression perpendicular to grain")
        work.let("C_b", work.q(1.0, ""), desc="bearing area factor",
                 note=f"{STD} 3.10.4: taken as 1.0 at an end bearing (it applies only 3 in or more from the end)")
        work.calc("F_c_perp_p", "F_c_perp*C_M_cp*C_t_cp*C_i_cp*C_b", unit="psi",
                  desc=f"adjusted F'_c⊥, {STD} Table 4.3.1 (no C_D on F_c⊥)")
        work.calc("f_c_perp", "R/(b*l_b)", unit="psi", desc="bearing stress")
        work.calc("U_bearing", "f_c_perp/F_c_perp_p", unit="1", desc=f"bearing, f_c⊥ ≤ F'_c⊥ ({STD} 3.10.2)")
        out["U_bearing"] = work["U_bearing"]
    loads_given = w_LT is not None or w_ST is not None
    defl_given = D_LT is not None or D_ST is not None
    if loads_given or defl_given:
        where = "w_LT" if w_LT is not None else "w_ST" if w_ST is not None else "D_LT" if D_LT is not None else "D_ST"
        if loads_given and defl_given:
            work.fail("give the line loads w_LT, w_ST or the deflections D_LT, D_ST, not both", param=where)
        pair = (w_LT, w_ST) if loads_given else (D_LT, D_ST)
        if None in pair or limit_ST is None or limit_T is None:
            work.fail("deflection needs both long- and short-term parts (w_LT and w_ST, or D_LT and D_ST) and the "
                      "limits limit_ST and limit_T the sheet sets", param=where)
        for k, v in (("D_LT", D_LT), ("D_ST", D_ST)):
            if v is not None and v.magnitude < 0:
                work.fail(f"{k} is a magnitude: give it as a positive value", param=k)
        f = D.nds()["K_cr"]
        case = K_cr or ("glulam-" if m.product == "glulam" else "seasoned-") + ("wet" if _flag(wet) else "dry")
        if case == "seasoned-wet":
            case = "unseasoned-or-wet"
        work.let("K_cr", work.q(float(f[case]), ""), desc=f"creep factor, {case}", note=f["source"])
        if loads_given:
            work.calc("I", "b*d^3/12" if not _flag(flat_use) else "d*b^3/12", unit="in^4",
                      desc="second moment of area")
            work.calc("Delta_LT", "5*w_LT*L^4/(384*E_p*I)", unit="in",
                      desc="deflection under the long-term load, simply supported, 5wL⁴/(384E'I)")
            work.calc("Delta_ST", "5*w_ST*L^4/(384*E_p*I)", unit="in", desc="deflection under the short-term load")
        else:
            work.scope["Delta_LT"], work.scope["Delta_ST"] = D_LT, D_ST
        work.calc("Delta_T", "K_cr*Delta_LT + Delta_ST", unit="in", desc=f"total deflection with creep, {STD} 3.5.2")
        work.calc("U_defl_ST", "Delta_ST/(L/limit_ST)", unit="1", desc="short-term deflection against span/limit_ST")
        work.calc("U_defl_T", "Delta_T/(L/limit_T)", unit="1", desc="total deflection against span/limit_T")
        for k in ("Delta_ST", "Delta_T", "U_defl_ST", "U_defl_T"):
            out[k] = work[k]
    out["factor"] = chain.table(work, f"Adjustment factors for F_b, {STD}")
    _finish(work, out, {"U_bending": "bending (3.3)", "U_shear": "shear (3.4)", "U_bearing": "bearing (3.10)",
                        "U_defl_ST": "short-term deflection (3.5)", "U_defl_T": "total deflection with creep (3.5.2)"})
    return out


# ================================================================== timber_design.nds_column
@namespace.function(
    "nds_column", standards=NDS_STANDARDS,
    params=[*COMMON, Param("P", "[force]", "axial compression (ASD)"),
            Param("M_x", "[force]*[length]", "moment about the strong axis (edgewise, on d)", default=None),
            Param("M_y", "[force]*[length]", "moment about the weak axis (flatwise, on b)", default=None),
            Param("K_e", doc="buckling length coefficient (NDS Appendix G)", default=1.0),
            Param("l_e_x", "[length]", "effective length for buckling across d (default K_e·L)", default=None),
            Param("l_e_y", "[length]", "effective length for buckling across b (default K_e·L)", default=None),
            Param("l_u", "[length]", "unbraced length of the compression edge for C_L (default L with M_x)",
                  default=None),
            Param("loading", kind="text", choices=D.nds_le_cases(), doc="Table 3.3.3 case for C_L", default="any"),
            *ADJ],
    fields=[Field("C_D"), Field("C_P", doc="column stability factor (3.7-1)"),
            Field("F_c_p", "[pressure]", "F'_c"), Field("f_c", "[pressure]", "compression stress"),
            Field("F_cE", "[pressure]", "governing critical buckling design value"),
            Field("C_L", optional=True), Field("U_axial", doc="f_c/F'_c (3.6.3)"),
            Field("U_interaction", doc="3.9.2 Eq. (3.9-3)", optional=True),
            Field("U_max"), Field("governing", kind="text"), Field("factor", kind="text")],
    returns="timber_design.nds_column",
)
def nds_column(work, species, grade, L, P, size=None, b=None, d=None, M_x=None, M_y=None, K_e=1.0, l_e_x=None,
               l_e_y=None, l_u=None, loading="any", load_duration="10 years", wet="no", temperature="normal",
               incised="no"):
    """A solid sawn or glulam column, post or beam-column to the NDS 2018 (ASD): C_P (3.7.1), 3.9.2."""
    _positive(work, L=L, l_e_x=l_e_x, l_e_y=l_e_y)
    if P.magnitude < 0:
        work.fail("P is the compression: give it as a positive value (tension members, 3.8, are not built)",
                  param="P")
    for k, v in (("M_x", M_x), ("M_y", M_y)):
        if v is not None and v.magnitude < 0:
            work.fail(f"{k} is a magnitude: give it as a positive value", param=k)
    m = Member(work, species, grade, size, b, d)
    if m.product == "glulam":
        work.fail(f"{grade} is a bending combination (NDS Supplement Table 5A); glulam columns take the axial "
                  f"combinations of Table 5B, which are not built", param="grade")
    f = D.nds()
    sc = work.scope
    chain = Chain()
    need = ("c", "E") + (("b",) if M_x is not None or M_y is not None else ())
    _common_factors(work, m, load_duration, wet, temperature, incised, chain, need=need)
    ke = float(K_e.m_as("")) if hasattr(K_e, "m_as") else float(K_e)
    if ke <= 0:
        work.fail("K_e must be greater than zero", param="K_e")
    sc["K_e"] = work.q(ke, "")
    for ax, given in (("x", l_e_x), ("y", l_e_y)):
        if given is None:
            work.calc(f"l_e_{ax}", "K_e*L", unit="in", desc=f"effective column length, {STD} 3.7.1.2")
        else:
            sc[f"l_e_{ax}"] = given
    work.calc("A", "b*d", unit="in^2", desc="area")
    work.calc("S_x", "b*d^2/6", unit="in^3", desc="section modulus, edgewise")
    work.calc("le_d_x", "l_e_x/d", unit="1", desc="slenderness across d")
    work.calc("le_d_y", "l_e_y/b", unit="1", desc="slenderness across b")
    for ax in ("x", "y"):
        r = float(work[f"le_d_{ax}"].m_as(""))
        if r > f["limits"]["le_d_max"]:
            work.fail(f"l_e/d = {r:.1f} exceeds {f['limits']['le_d_max']} ({STD} 3.7.1.4)",
                      param=f"l_e_{ax}" if (l_e_x if ax == "x" else l_e_y) is not None else "L")
    m.ref(work, "F_c", "F_c", "reference compression parallel to grain")
    cf = "C_F_c" if m.product == "sawn" else "1"
    work.calc("F_c_star", f"F_c*C_D*C_M_c*C_t_c*{cf}*C_i_c", unit="psi",
              desc=f"F_c* = F_c times every factor except C_P, {STD} 3.7.1.5")
    work.calc("F_cE_x", "0.822*E_min_p/le_d_x^2", unit="psi", desc=f"critical buckling value across d, {STD} 3.7.1.5")
    work.calc("F_cE_y", "0.822*E_min_p/le_d_y^2", unit="psi", desc=f"critical buckling value across b, {STD} 3.7.1.5")
    work.calc("F_cE", "min(F_cE_x, F_cE_y)", unit="psi", desc="the axis with the larger slenderness governs")
    c = float(f["c"]["glulam" if m.product == "glulam" else "sawn"])
    work.let("c", work.q(c, ""), desc=f"column parameter, {m.product}", note=f"{f['c']['source']}")
    work.calc("C_P", "(1 + F_cE/F_c_star)/(2*c) - sqrt(((1 + F_cE/F_c_star)/(2*c))^2 - (F_cE/F_c_star)/c)",
              unit="1", desc=f"column stability factor, {STD} 3.7.1 Eq. (3.7-1)")
    chain.add("C_P", float(work["C_P"].m_as("")), "column stability (3.7.1)")
    work.calc("F_c_p", "F_c_star*C_P", unit="psi", desc=f"adjusted compression design value F'_c, {STD} Table 4.3.1")
    work.calc("f_c", "P/A", unit="psi", desc="compression stress")
    work.calc("U_axial", "f_c/F_c_p", unit="1", desc=f"compression, f_c ≤ F'_c ({STD} 3.6.3)")
    out = {k: work[k] for k in ("C_D", "C_P", "F_c_p", "f_c", "F_cE", "U_axial")}
    names = {"U_axial": "compression with column stability (3.6.3, 3.7.1)"}
    if M_x is not None or M_y is not None:
        fc = float(work["f_c"].m_as("psi"))
        terms = ["(f_c/F_c_p)^2"]
        if M_x is not None:
            if fc >= float(work["F_cE_x"].m_as("psi")):
                work.fail(f"f_c ≥ F_cE1: Eq. (3.9-3) requires f_c < F_cE1 ({STD} 3.9.2)", param="P")
            lu = l_u if l_u is not None else L
            _bending(work, m, lu, loading, "no", "no", chain)
            work.calc("f_b1", "M_x/S_x", unit="psi", desc="edgewise bending stress")
            terms.append("f_b1/(F_b_p*(1 - f_c/F_cE_x))")
            out["C_L"] = work["C_L"]
        if M_y is not None:
            if fc >= float(work["F_cE_y"].m_as("psi")):
                work.fail(f"f_c ≥ F_cE2: Eq. (3.9-3) requires f_c < F_cE2 ({STD} 3.9.2)", param="P")
            if M_x is None:
                m.ref(work, "F_b", "F_b", "reference bending design value")
            cfb = "C_F_b" if m.product == "sawn" else "1"
            work.calc("S_y", "d*b^2/6", unit="in^3", desc="section modulus, flatwise")
            cfu = 1.0
            if m.product == "sawn":
                t, w = m.nominal
                row = D.table_row(f["C_fu"]["sawn"], w)
                cfu = row[1] if t <= 3 else row[2]
            work.let("C_fu_2", work.q(cfu, ""), desc="flat use factor for flatwise bending", note=f["C_fu"]["source"])
            work.calc("F_b2_p", f"F_b*C_D*C_M_b*C_t_b*{cfb}*C_fu_2*C_i_b", unit="psi",
                      desc=f"adjusted flatwise bending value F'_b2 (C_L = 1 about the weak axis), {STD} Table 4.3.1")
            work.calc("f_b2", "M_y/S_y", unit="psi", desc="flatwise bending stress")
            if M_x is not None and sc.get("F_bE") is not None:
                work.calc("U_3_9_4", "f_c/F_cE_y + (f_b1/F_bE)^2", unit="1",
                          desc=f"condition for biaxial bending, {STD} 3.9.2 Eq. (3.9-4) (must be < 1)")
                if float(work["U_3_9_4"].m_as("")) >= 1:
                    work.fail(f"Eq. (3.9-4) is not met: f_c/F_cE2 + (f_b1/F_bE)² ≥ 1 ({STD} 3.9.2)", param="M_y")
                terms.append("f_b2/(F_b2_p*(1 - f_c/F_cE_y - (f_b1/F_bE)^2))")
            else:
                terms.append("f_b2/(F_b2_p*(1 - f_c/F_cE_y))")
        if M_x is not None and sc.get("F_bE") is not None:
            if float(work["f_b1"].m_as("psi")) >= float(work["F_bE"].m_as("psi")):
                work.fail(f"f_b1 ≥ F_bE: Eq. (3.9-3) requires f_b1 < F_bE ({STD} 3.9.2)", param="M_x")
        work.calc("U_interaction", " + ".join(terms), unit="1",
                  desc=f"bending and axial compression, {STD} 3.9.2 Eq. (3.9-3)")
        out["U_interaction"] = work["U_interaction"]
        names["U_interaction"] = "combined bending and axial compression (3.9.2 Eq. (3.9-3))"
    out["factor"] = chain.table(work, f"Adjustment factors for F_c, {STD}")
    _finish(work, out, names)
    return out


# ================================================================== timber_design.nds_adjusted
@namespace.function(
    "nds_adjusted", standards=NDS_STANDARDS,
    params=[*COMMON[:5], *ADJ,
            Param("repetitive", kind="flag", doc="repetitive member (4.3.9)", default="no"),
            Param("flat_use", kind="flag", doc="bent about the weak axis, load on the wide face", default="no")],
    fields=[Field("C_D"), Field("F_b_p", "[pressure]", "F'_b with C_L = 1 (compression edge braced)"),
            Field("F_v_p", "[pressure]", "F'_v"), Field("F_c_star", "[pressure]", "F_c* (all factors but C_P)"),
            Field("F_c_perp_p", "[pressure]", "F'_c⊥ (C_b = 1)"), Field("E_p", "[pressure]", "E'"),
            Field("E_min_p", "[pressure]", "E'_min"), Field("factor", kind="text")],
    returns="timber_design.nds_adjusted",
)
def nds_adjusted(work, species, grade, size=None, b=None, d=None, load_duration="10 years", wet="no",
                 temperature="normal", incised="no", repetitive="no", flat_use="no"):
    """Adjusted design values F' = F × the applicable factors (NDS 2018 Table 4.3.1 / 5.3.1), braced member."""
    m = Member(work, species, grade, size, b, d)
    chain = Chain()
    _common_factors(work, m, load_duration, wet, temperature, incised, chain)
    _bending(work, m, None, "any", repetitive, flat_use, chain)
    m.ref(work, "F_v", "F_v", "reference shear design value")
    work.calc("F_v_p", "F_v*C_D*C_M_v*C_t_v*C_i_v", unit="psi", desc=f"adjusted shear design value F'_v, {STD} Table 4.3.1")
    m.ref(work, "F_c", "F_c", "reference compression parallel to grain")
    cf = "C_F_c" if m.product == "sawn" else "1"
    work.calc("F_c_star", f"F_c*C_D*C_M_c*C_t_c*{cf}*C_i_c", unit="psi",
              desc=f"F_c* = F_c times every factor except C_P, {STD} 3.7.1.5")
    m.ref(work, "F_c_perp", "F_c_perp", "reference compression perpendicular to grain")
    work.calc("F_c_perp_p", "F_c_perp*C_M_cp*C_t_cp*C_i_cp", unit="psi",
              desc=f"adjusted F'_c⊥ (C_b = 1), {STD} Table 4.3.1")
    out = {k: work[k] for k in ("C_D", "F_b_p", "F_v_p", "F_c_star", "F_c_perp_p", "E_p", "E_min_p")}
    out["factor"] = chain.table(work, f"Adjustment factors, {STD}")
    return out
