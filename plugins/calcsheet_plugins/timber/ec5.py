"""EN 1995-1-1 (Eurocode 5) member checks, traced with clause and equation numbers.

Design values: X_d = k_mod·X_k/γ_M (2.4.1 Eq. (2.14)), with k_h (3.2, 3.3) on bending and k_sys (6.6) where a
load-distribution system shares the load. Each step is a formula the engine evaluates; values from the data
files are recorded with their table; a case outside what is built is a located error naming the clause.
"""
from __future__ import annotations

from calcsheet.plugin import Field, Param

from . import data as D
from . import equations as EQ
from . import namespace

# what the design basis lists when a sheet calls one of these functions (the namespace lists both codes)
EC5_STANDARDS = ("EN 1995-1-1:2004+AC:2006+A1:2008", "EN 338:2009 (strength classes)",
                 "EN 14080:2013 (glulam strength classes)")

STD = "EN 1995-1-1"


def _num(x, default=None):
    if x is None:
        return default
    return float(x.m_as("")) if hasattr(x, "m_as") else float(x)


def _grade(work, grade: str) -> dict:
    g = D.ec5_grades().get(grade)
    if g is None:  # pragma: no cover - choices are checked by the engine
        work.fail(f"unknown strength class {grade!r}", param="grade")
    return g


def _service_class(work, service_class) -> int:
    sc = _num(service_class, 1)
    if sc not in (1.0, 2.0, 3.0):
        work.fail(f"service class must be 1, 2 or 3 ({STD} 2.3.1.3), got {sc:g}", param="service_class")
    return int(sc)


class Chain:
    """The factor chain: each factor with its value and why it applies; printed as a table."""

    def __init__(self):
        self.rows: list[list] = []

    WHY_MAX = 70  # characters: the table's cells do not wrap on the page

    def add(self, name: str, value: float, why: str, reduces: bool = True):
        assert len(why) <= self.WHY_MAX, why
        self.rows.append([name, value, why, reduces])

    def table(self, work, title: str):
        work.table(title, ["factor", "value", "why it applies"], [[r[0], f"{r[1]:.3g}", r[2]] for r in self.rows])
        # the governing factor: the one that lowers the resistance most (γ_M counts as 1/γ_M)
        effect = [(r[1] if r[3] else 1 / r[1], r[0]) for r in self.rows if r[1] > 0]
        if not effect:
            return "none"
        lowest = min(effect)
        if lowest[0] >= 1:
            work.note("No factor in the chain reduces the resistance.", kind="method")
        else:
            work.note(f"Governing factor: {lowest[1]} (multiplies the resistance by {lowest[0]:.3g}, the largest "
                      f"reduction in the chain).", kind="method")
        return lowest[1]


def _setup(work, grade, service_class, duration, annex, k_sys, chain: Chain):
    """k_mod, γ_M, k_sys and the grade's record; returns (grade dict, product, service class)."""
    g = _grade(work, grade)
    product = g["product"]
    sc = _service_class(work, service_class)
    km = D.k_mod(product, sc, duration)
    work.let("k_mod", work.q(km, ""), desc=f"modification factor, {product} timber, service class {sc}, "
                                          f"{duration} action", note=f"{STD} 3.1.3, Table 3.1")
    chain.add("k_mod", km, f"{duration} action, service class {sc} (Table 3.1)")
    gm, src = D.gamma_M(product, annex)
    work.let("gamma_M", work.q(gm, ""), desc=f"partial factor for {product} timber", note=src)
    chain.add("γ_M", gm, f"{product} timber, {annex} (2.4.1 Table 2.3)", reduces=False)
    ks = 1.0
    if k_sys == "yes":
        t = D.ec5()["k_sys"]
        ks = float(t["value"])
        work.let("k_sys", work.q(ks, ""), desc="system strength factor", note=f"{t['source']}: {t['why']}")
        chain.add("k_sys", ks, "members share the load through a distribution system (6.6(2))")
    else:
        work.let("k_sys", work.q(1.0, ""), desc="system strength factor (no load-distribution system)",
                 note=f"{STD} 6.6(1)")
    return g, product, sc


def _char(work, g, name: str, unit: str, desc: str):
    """A characteristic value from the strength-class data, with its table."""
    work.let(name, work.q(float(g[name]), unit), desc=desc, note=g["source"])


def _k_h(work, g, product, name: str, h, chain: Chain, axis: str):
    """3.2(3) Eq. (3.1) solid timber, 3.3(3) Eq. (3.2) glulam."""
    t = D.ec5()["k_h"][product]
    hm = h.m_as("mm")
    scope_h = "h" if axis == "y" else "b"   # the call's own h (major axis) or b (minor axis)
    if product == "solid" and g["rho_k"] > t["rho_k_max"]:
        work.let(name, work.q(1.0, ""), desc=f"depth factor, bending about {axis}",
                 note=f"{t['source']}: applies only where ρ_k ≤ {t['rho_k_max']} kg/m³ (ρ_k = {g['rho_k']} kg/m³)")
        return 1.0
    if hm >= t["h_ref"]:
        work.let(name, work.q(1.0, ""), desc=f"depth factor, bending about {axis}",
                 note=f"{t['source']}: the depth {hm:g} mm is at least {t['h_ref']} mm")
        return 1.0
    work.calc(name, f"min((({t['h_ref']} mm)/{scope_h})^{t['exponent']}, {t['cap']})", unit="1",
              desc=f"depth factor, bending about {axis}, {t['source']}")
    v = float(work.scope[name].m_as(""))
    chain.add(name, v, f"depth {hm:g} mm below {t['h_ref']} mm ({t['source'].split(', ')[-1]})")
    return v


PARAMS_COMMON = [
    Param("service_class", doc="service class 1, 2 or 3 (2.3.1.3)", default=1),
    Param("duration", kind="text", choices=D.durations(),
          doc="load-duration class of the governing combination (2.3.1.2, Table 2.1)", default="medium-term"),
    Param("annex", kind="text", choices=D.annexes(), doc="γ_M from Table 2.3 or a National Annex",
          default="recommended"),
    Param("k_sys", kind="flag", doc="several members share the load through a load-distribution system (6.6)",
          default="no"),
]

GRADE = Param("grade", kind="text", choices=tuple(D.ec5_grades()),
              doc="strength class: C14…C50, D18…D70 (EN 338:2009), GL20h…GL32h, GL20c…GL32c (EN 14080:2013)")


# ================================================================== timber_design.ec5_grade
GRADE_FIELDS = [Field(k, "[pressure]", doc) for k, doc in (
    ("f_m_k", "characteristic bending strength"), ("f_t_0_k", "tension parallel"),
    ("f_t_90_k", "tension perpendicular"), ("f_c_0_k", "compression parallel"),
    ("f_c_90_k", "compression perpendicular"), ("f_v_k", "shear"),
    ("E_0_mean", "mean modulus parallel"), ("E_0_05", "5th-percentile modulus parallel"),
    ("G_mean", "mean shear modulus"))] + [
    Field("rho_k", "[mass]/[length]**3", "characteristic density"),
    Field("rho_mean", "[mass]/[length]**3", "mean density"),
    Field("kind", kind="text", doc="softwood or hardwood"), Field("product", kind="text", doc="solid or glulam"),
    Field("edition", kind="text", doc="the product standard and edition the values come from")]


@namespace.function("ec5_grade", standards=EC5_STANDARDS, params=[GRADE], fields=GRADE_FIELDS, returns="timber_design.grade")
def ec5_grade(work, grade):
    """Characteristic values of a strength class (EN 338:2009 Table 1, EN 14080:2013 Tables 4 and 5)."""
    g = _grade(work, grade)
    out = {}
    for f in GRADE_FIELDS:
        if f.kind_ != "quantity":
            continue
        unit = "MPa" if f.name.startswith("f_") else ("GPa" if f.name[0] in "EG" else "kg/m^3")
        _char(work, g, f.name, unit, f.doc)
        out[f.name] = work[f.name]
    out.update(kind=g["kind"], product=g["product"], edition=g["edition"])
    return out


# ================================================================== timber_design.ec5_strengths
@namespace.function(
    "ec5_strengths", standards=EC5_STANDARDS,
    params=[GRADE, Param("h", "[length]", "depth for k_h (bending about the major axis)", default=None),
            Param("b", "[length]", "width for k_h (bending about the minor axis)", default=None), *PARAMS_COMMON],
    fields=[Field("k_mod", doc="Table 3.1"), Field("gamma_M", doc="Table 2.3"), Field("k_h", doc="3.2 / 3.3, depth h"),
            Field("k_h_z", doc="3.2 / 3.3, width b"), Field("k_sys", doc="6.6"), Field("k_def", doc="Table 3.2"),
            Field("f_m_d", "[pressure]", "design bending strength, major axis"),
            Field("f_m_z_d", "[pressure]", "design bending strength, minor axis"),
            Field("f_t_0_d", "[pressure]", "design tension strength parallel"),
            Field("f_c_0_d", "[pressure]", "design compression strength parallel"),
            Field("f_c_90_d", "[pressure]", "design compression strength perpendicular"),
            Field("f_v_d", "[pressure]", "design shear strength"),
            Field("E_0_mean", "[pressure]", "mean modulus (serviceability)"),
            Field("E_0_05", "[pressure]", "5th-percentile modulus (stability)"),
            Field("governing", kind="text", doc="the factor that reduces the resistance most")],
    returns="timber_design.strengths",
)
def ec5_strengths(work, grade, h=None, b=None, service_class=1, duration="medium-term", annex="recommended",
                  k_sys="no"):
    """Design strengths X_d = k_mod·k_h·k_sys·X_k/γ_M (2.4.1 Eq. (2.14)) with the factor chain."""
    chain = Chain()
    g, product, sc = _setup(work, grade, service_class, duration, annex, k_sys, chain)
    for name, label in (("f_m_k", "bending"), ("f_t_0_k", "tension parallel to the grain"),
                        ("f_c_0_k", "compression parallel to the grain"),
                        ("f_c_90_k", "compression perpendicular to the grain"), ("f_v_k", "shear")):
        _char(work, g, name, "MPa", f"characteristic {label} strength")
    for name, which in (("h", "k_h"), ("b", "k_h_z")):
        given = h if name == "h" else b
        if given is not None and given.magnitude <= 0:
            work.fail(f"{name} must be greater than zero", param=name)
        if given is None:
            work.let(which, work.q(1.0, ""), desc=f"depth factor ({name} not given)", note=f"{STD} 3.2(3)")
        else:
            _k_h(work, g, product, which, given, chain, "y" if name == "h" else "z")
    kd = D.k_def(product, sc)
    work.let("k_def", work.q(kd, ""), desc=f"deformation factor, {product} timber, service class {sc}",
             note=f"{STD} 3.1.4, Table 3.2")
    work.calc("f_m_d", "k_mod*k_h*k_sys*f_m_k/gamma_M", unit="MPa",
              desc=f"design bending strength, {STD} 2.4.1 Eq. (2.14) with k_h and k_sys")
    work.calc("f_m_z_d", "k_mod*k_h_z*k_sys*f_m_k/gamma_M", unit="MPa", desc="design bending strength, minor axis")
    work.calc("f_t_0_d", "k_mod*k_h*k_sys*f_t_0_k/gamma_M", unit="MPa", desc="design tension strength, Eq. (2.14)")
    work.calc("f_c_0_d", "k_mod*k_sys*f_c_0_k/gamma_M", unit="MPa", desc="design compression strength, Eq. (2.14)")
    work.calc("f_c_90_d", "k_mod*k_sys*f_c_90_k/gamma_M", unit="MPa",
              desc="design compression strength perpendicular to the grain, Eq. (2.14)")
    work.calc("f_v_d", "k_mod*k_sys*f_v_k/gamma_M", unit="MPa", desc="design shear strength, Eq. (2.14)")
    gov = chain.table(work, f"Factor chain, {STD}")
    out = {k: work[k] for k in ("k_mod", "gamma_M", "k_h", "k_h_z", "k_sys", "k_def", "f_m_d", "f_m_z_d",
                                "f_t_0_d", "f_c_0_d", "f_c_90_d", "f_v_d")}
    out["E_0_mean"] = work.q(float(g["E_0_mean"]), "GPa")
    out["E_0_05"] = work.q(float(g["E_0_05"]), "GPa")
    out["governing"] = gov
    return out


# ================================================================== lateral torsional stability
def _k_crit(work, g, product, b, h, L, l_ef, load_case, load_position, braced, chain: Chain):
    """6.3.3: σ_m,crit (6.31)/(6.32), λ_rel,m (6.30), k_crit (6.34)."""
    if braced == "yes":
        work.let("k_crit", work.q(1.0, ""), desc="lateral torsional stability factor",
                 note=f"{STD} 6.3.3(5): compression edge held laterally throughout and torsion prevented at the "
                      f"supports")
        return 1.0
    if l_ef is None:
        ratio = D.l_ef_ratio(load_case)
        work.let("l_ef_ratio", work.q(ratio, ""), desc=f"effective length ratio, {load_case}",
                 note=f"{STD} 6.3.3(3), Table 6.1")
        extra = {"centroid": "", "compression-edge": " + 2*h", "tension-edge": " - 0.5*h"}[load_position]
        why = {"centroid": "load at the centroid", "compression-edge": "load on the compression edge: + 2h",
               "tension-edge": "load on the tension edge: − 0.5h"}[load_position]
        work.calc("l_ef", f"l_ef_ratio*L{extra}", unit="mm", desc=f"effective length, Table 6.1 ({why})")
        if work["l_ef"].magnitude <= 0:
            work.fail(f"the effective length of Table 6.1 is not positive for this span and depth ({STD} 6.3.3(3)):"
                      f" give l_ef", param="L")
    else:
        work.scope["l_ef"] = l_ef
    if "E_0_05" not in work:
        work.let("E_0_05", work.q(float(g["E_0_05"]), "GPa"), desc="5th-percentile modulus", note=g["source"])
    if product == "solid" and g["kind"] == "softwood":
        work.calc("sigma_m_crit", "0.78*b^2*E_0_05/(h*l_ef)", unit="MPa",
                  desc=f"critical bending stress, solid softwood rectangle, {STD} 6.3.3(3) Eq. (6.32)")
    else:
        if product == "glulam":
            work.let("G_0_05", work.q(float(g["G_05"]), "GPa"), desc="5th-percentile shear modulus",
                     note=g["source"])
        else:
            work.calc("G_0_05", f"{g['G_mean']} GPa*E_0_05/({g['E_0_mean']} GPa)", unit="GPa",
                      desc="5th-percentile shear modulus taken as G_mean·E_0,05/E_0,mean (EN 338 gives no G_05; "
                           "the same ratio as the moduli — common practice)")
        work.calc("I_z", "h*b^3/12", unit="mm^4", desc="second moment about the minor axis")
        work.calc("I_tor", "h*b^3*(1/3 - 0.21*(b/h)*(1 - b^4/(12*h^4)))", unit="mm^4",
                  desc="torsion constant of a solid rectangle (Roark, torsion table)")
        if "W_y" not in work:
            work.calc("W_y", "b*h^2/6", unit="mm^3", desc="section modulus about the major axis")
        work.calc("sigma_m_crit", "pi*sqrt(E_0_05*I_z*G_0_05*I_tor)/(l_ef*W_y)", unit="MPa",
                  desc=f"critical bending stress, {STD} 6.3.3(2) Eq. (6.31)")
    work.calc("lambda_rel_m", "sqrt(f_m_k/sigma_m_crit)", unit="1",
              desc=f"relative slenderness for bending, {STD} 6.3.3(2) Eq. (6.30)")
    lam = float(work["lambda_rel_m"].m_as(""))
    rng = EQ.k_crit_range(lam)
    if rng == "stocky":
        work.note(f"λ_rel,m = {lam:.3f} ≤ 0.75: no reduction for lateral torsional buckling (6.34 first range).",
                  kind="method")
        work.calc("k_crit", "1", unit="1", desc=f"{STD} 6.3.3(4) Eq. (6.34), λ_rel,m ≤ 0.75")
    elif rng == "intermediate":
        work.note(f"0.75 < λ_rel,m = {lam:.3f} ≤ 1.4: the linear range of (6.34) governs.", kind="method")
        work.calc("k_crit", "1.56 - 0.75*lambda_rel_m", unit="1", desc=f"{STD} 6.3.3(4) Eq. (6.34), 0.75 < λ_rel,m ≤ 1.4")
    else:
        work.note(f"λ_rel,m = {lam:.3f} > 1.4: elastic lateral torsional buckling governs (6.34 third range).",
                  kind="method")
        work.calc("k_crit", "1/lambda_rel_m^2", unit="1", desc=f"{STD} 6.3.3(4) Eq. (6.34), λ_rel,m > 1.4")
    v = float(work["k_crit"].m_as(""))
    chain.add("k_crit", v, f"lateral torsional stability, λ_rel,m = {lam:.3f} (6.3.3)")
    return v


# ================================================================== timber_design.ec5_beam
BEAM_PARAMS = [
    GRADE,
    Param("b", "[length]", "breadth"), Param("h", "[length]", "depth"), Param("L", "[length]", "span"),
    Param("M_d", "[force]*[length]", "design bending moment about the major axis"),
    Param("V_d", "[force]", "design shear force"),
    *PARAMS_COMMON,
    Param("braced", kind="flag", doc="compression edge held laterally throughout (6.3.3(5))", default="no"),
    Param("load_case", kind="text", choices=D.l_ef_cases(), doc="Table 6.1 case for l_ef",
          default="simply-supported-uniform-load"),
    Param("load_position", kind="text", choices=("centroid", "compression-edge", "tension-edge"),
          doc="where the load acts on the depth (Table 6.1 note)", default="compression-edge"),
    Param("l_ef", "[length]", "effective length for lateral torsional buckling (overrides Table 6.1)", default=None),
    Param("F_c_90_d", "[force]", "design support reaction for the bearing check", default=None),
    Param("l_b", "[length]", "bearing length along the grain", default=None),
    Param("b_b", "[length]", "bearing width (default b)", default=None),
    Param("a_end", "[length]", "distance from the member end to the bearing (default 0: an end bearing)",
          default=None),
    Param("support", kind="text", choices=("discrete", "continuous"), doc="support kind for k_c,90 (6.1.5(4)-(6))",
          default="discrete"),
    Param("w_G", "[force]/[length]", "characteristic permanent line load, simply supported (deflection)",
          default=None),
    Param("w_Q", "[force]/[length]", "characteristic leading variable line load (deflection)", default=None),
    Param("u_G", "[length]", "instantaneous deflection under the permanent load (instead of w_G)", default=None),
    Param("u_Q", "[length]", "instantaneous deflection under the variable load (instead of w_Q)", default=None),
    Param("psi_2", doc="quasi-permanent factor of the variable action (EN 1990 Table A1.1)", default=None),
    Param("limit_inst", doc="instantaneous deflection limit as span/limit (7.2 Table 7.2: 300-500)", default=None),
    Param("limit_fin", doc="final deflection limit as span/limit (7.2 Table 7.2: 150-300)", default=None),
]
U_FIELDS = [
    Field("U_bending", doc="σ_m,d/(k_crit·f_m,d), 6.1.6 (6.11) and 6.3.3 (6.33)"),
    Field("U_shear", doc="τ_d/f_v,d, 6.1.7 (6.13)"),
    Field("U_bearing", doc="σ_c,90,d/(k_c,90·f_c,90,d), 6.1.5 (6.3)", optional=True),
    Field("U_inst", doc="u_inst/(L/limit_inst), 2.2.3 and 7.2", optional=True),
    Field("U_fin", doc="u_fin/(L/limit_fin), 2.3.2.2 and 7.2", optional=True),
    Field("U_max", doc="largest utilisation"), Field("governing", kind="text", doc="the check that governs"),
]
BEAM_FIELDS = [
    Field("k_mod"), Field("gamma_M"), Field("k_h"), Field("k_crit"), Field("k_def"),
    Field("sigma_m_d", "[pressure]", "design bending stress"), Field("f_m_d", "[pressure]", "design bending strength"),
    Field("tau_d", "[pressure]", "design shear stress"), Field("f_v_d", "[pressure]", "design shear strength"),
    Field("u_inst", "[length]", "instantaneous deflection", optional=True),
    Field("u_fin", "[length]", "final deflection", optional=True),
    *U_FIELDS,
    Field("factor", kind="text", doc="the factor that reduces the bending resistance most"),
]


def _positive(work, **vals):
    for k, v in vals.items():
        if v is not None and v.magnitude <= 0:
            work.fail(f"{k} must be greater than zero", param=k)


def _bearing(work, g, product, b, h, L, F_c_90_d, l_b, b_b, a_end, support, out):
    """6.1.5, A1:2008 text: σ_c,90,d ≤ k_c,90·f_c,90,d (6.3), σ_c,90,d = F_c,90,d/A_ef (6.4)."""
    if l_b is None:
        work.fail("give the bearing length l_b with F_c_90_d", param="F_c_90_d")
    _positive(work, l_b=l_b, b_b=b_b)
    t = D.ec5()["k_c90"]
    sc = work.scope
    sc["b_b"] = b_b if b_b is not None else b
    sc["a_end"] = a_end if a_end is not None else work.q(0, "mm")
    work.calc("Delta_l_1", f"min({t['extension']} mm, a_end, l_b)", unit="mm",
              desc="extension of the contact length towards the member end, 6.1.5(1) (≤ 30 mm, ≤ a, ≤ l)")
    work.calc("l_1", "L - l_b", unit="mm", desc="clear distance to the next bearing (the other support)")
    if work["l_1"].magnitude <= 0:
        work.fail("the bearing length is not shorter than the span", param="l_b")
    work.calc("Delta_l_2", f"min({t['extension']} mm, l_b, l_1/2)", unit="mm",
              desc="extension into the span, 6.1.5(1) (≤ 30 mm, ≤ l, ≤ l_1/2)")
    work.calc("A_ef", "b_b*(l_b + Delta_l_1 + Delta_l_2)", unit="mm^2",
              desc="effective contact area, 6.1.5(1)")
    work.calc("sigma_c_90_d", "F_c_90_d/A_ef", unit="MPa", desc=f"design bearing stress, {STD} 6.1.5 Eq. (6.4)")
    l1_ok = sc["l_1"].m_as("mm") >= 2 * h.m_as("mm")
    kc = float(t["default"])
    why = "k_c,90 = 1.0"
    if g["kind"] != "softwood":
        why = "hardwood: the increased values of 6.1.5(4)-(6) are for softwood only"
    elif not l1_ok:
        why = "l_1 < 2h: the increased values of 6.1.5(4)-(6) do not apply"
    elif support == "discrete" and product == "glulam" and l_b.m_as("mm") > t["discrete_glulam_l_max"]:
        why = f"glulam on a discrete support with l > {t['discrete_glulam_l_max']} mm: 6.1.5(4)-(6) gives 1.0"
    else:
        kc = float(t[support][product])
        why = f"{product} softwood on {support} supports, l_1 ≥ 2h"
    work.let("k_c_90", work.q(kc, ""), desc="bearing factor k_c,90", note=f"{t['source']}: {why}")
    work.let("f_c_90_k", work.q(float(g["f_c_90_k"]), "MPa"), unit="MPa",
             desc="characteristic compression strength perpendicular to the grain", note=g["source"])
    work.calc("f_c_90_d", "k_mod*k_sys*f_c_90_k/gamma_M", unit="MPa",
              desc=f"design compression strength perpendicular to the grain, {STD} 2.4.1 Eq. (2.14)")
    work.calc("U_bearing", "sigma_c_90_d/(k_c_90*f_c_90_d)", unit="1", desc=f"bearing utilisation, {STD} 6.1.5 Eq. (6.3)")
    out["U_bearing"] = work["U_bearing"]


def _deflection(work, g, product, sc_, L, w_G, w_Q, u_G, u_Q, psi_2, limit_inst, limit_fin, out):
    """2.3.2.2: u_fin,G = u_inst,G(1 + k_def) (2.3), u_fin,Q1 = u_inst,Q1(1 + ψ_2,1·k_def) (2.4)."""
    if (w_G is None) != (w_Q is None) or (u_G is None) != (u_Q is None) or (w_G is not None and u_G is not None):
        work.fail("give both w_G and w_Q (a simply supported uniform load) or both u_G and u_Q",
                  param="w_G" if w_G is not None else "u_G")
    if limit_inst is None or limit_fin is None:
        work.fail("the sheet sets the deflection limits: give limit_inst and limit_fin as span/limit "
                  "(EN 1995-1-1 7.2 Table 7.2 suggests 300-500 and 150-300)",
                  param="w_G" if w_G is not None else "u_G")
    if psi_2 is None:
        work.fail("give psi_2, the quasi-permanent factor of the variable action (EN 1990 Table A1.1), for the "
                  "final deflection (2.3.2.2 Eq. (2.4))", param="w_G" if w_G is not None else "u_G")
    if not 0 <= _num(psi_2) <= 1:
        work.fail("psi_2 must lie between 0 and 1 (EN 1990 Table A1.1)", param="psi_2")
    for k, v in (("limit_inst", limit_inst), ("limit_fin", limit_fin)):
        if _num(v) <= 0:
            work.fail(f"{k} is span/limit: give a positive number such as 300", param=k)
    for k, v in (("w_G", w_G), ("w_Q", w_Q), ("u_G", u_G), ("u_Q", u_Q)):
        if v is not None and v.magnitude < 0:
            work.fail(f"{k} must not be negative", param=k)
    sc = work.scope
    kd = D.k_def(product, sc_)
    work.let("k_def", work.q(kd, ""), desc=f"deformation factor, {product} timber, service class {sc_}",
             note=f"{STD} 3.1.4, Table 3.2")
    if w_G is not None:
        work.let("E_0_mean", work.q(float(g["E_0_mean"]), "GPa"), unit="GPa",
                 desc="mean modulus parallel to the grain, for the instantaneous deflection (2.2.3(2))",
                 note=g["source"])
        work.calc("I_y", "b*h^3/12", unit="mm^4", desc="second moment about the major axis")
        work.calc("u_inst_G", "5*w_G*L^4/(384*E_0_mean*I_y)", unit="mm",
                  desc="instantaneous deflection, permanent load, 5wL⁴/(384EI) (bending only)")
        work.calc("u_inst_Q", "5*w_Q*L^4/(384*E_0_mean*I_y)", unit="mm",
                  desc="instantaneous deflection, variable load")
    else:
        sc["u_inst_G"], sc["u_inst_Q"] = u_G, u_Q
    work.calc("u_inst", "u_inst_G + u_inst_Q", unit="mm", desc="instantaneous deflection, characteristic combination")
    work.calc("u_fin_G", "u_inst_G*(1 + k_def)", unit="mm", desc=f"final deflection, permanent, {STD} 2.3.2.2 Eq. (2.3)")
    work.calc("u_fin_Q", "u_inst_Q*(1 + psi_2*k_def)", unit="mm",
              desc=f"final deflection, leading variable action, {STD} 2.3.2.2 Eq. (2.4)")
    work.calc("u_fin", "u_fin_G + u_fin_Q", unit="mm", desc=f"final deflection, {STD} 2.3.2.2 Eq. (2.2)")
    work.calc("U_inst", "u_inst/(L/limit_inst)", unit="1", desc="instantaneous deflection against span/limit_inst (7.2)")
    work.calc("U_fin", "u_fin/(L/limit_fin)", unit="1", desc="final deflection against span/limit_fin (7.2)")
    for k in ("u_inst", "u_fin", "U_inst", "U_fin"):
        out[k] = work[k]


def _finish(work, out, names: dict[str, str]):
    """U_max and the governing check's name."""
    present = [(float(out[k].m_as("")), k) for k in names if k in out]
    u, key = max(present)
    out["U_max"] = work.q(u, "")
    out["governing"] = names[key]
    work.note(f"Governing check: {names[key]} (utilisation {u:.3f}).", kind="method")


@namespace.function("ec5_beam", standards=EC5_STANDARDS, params=BEAM_PARAMS, fields=BEAM_FIELDS, returns="timber_design.beam")
def ec5_beam(work, grade, b, h, L, M_d, V_d, service_class=1, duration="medium-term", annex="recommended",
             k_sys="no", braced="no", load_case="simply-supported-uniform-load", load_position="compression-edge",
             l_ef=None, F_c_90_d=None, l_b=None, b_b=None, a_end=None, support="discrete", w_G=None, w_Q=None,
             u_G=None, u_Q=None, psi_2=None, limit_inst=None, limit_fin=None):
    """A rectangular beam: bending with lateral torsional stability, shear, bearing, deflection (EN 1995-1-1)."""
    _positive(work, b=b, h=h, L=L, l_ef=l_ef)
    for k, v in (("M_d", M_d), ("V_d", V_d)):
        if v.magnitude < 0:
            work.fail(f"{k} is a magnitude: give it as a positive value", param=k)
    if h.m_as("mm") < b.m_as("mm"):
        work.note("h < b: bending about the minor axis of the section; k_crit is then 1 in practice.")
    chain = Chain()
    g, product, sc_ = _setup(work, grade, service_class, duration, annex, k_sys, chain)
    work.let("f_m_k", work.q(float(g["f_m_k"]), "MPa"), desc="characteristic bending strength", note=g["source"])
    _k_h(work, g, product, "k_h", h, chain, "y")
    # bending, 6.1.6 and 6.3.3
    work.calc("W_y", "b*h^2/6", unit="mm^3", desc="section modulus about the major axis")
    work.calc("sigma_m_d", "M_d/W_y", unit="MPa", desc="design bending stress")
    work.calc("f_m_d", "k_mod*k_h*k_sys*f_m_k/gamma_M", unit="MPa",
              desc=f"design bending strength, {STD} 2.4.1 Eq. (2.14) with k_h (3.2/3.3) and k_sys (6.6)")
    _k_crit(work, g, product, b, h, L, l_ef, load_case, load_position, braced, chain)
    work.calc("U_bending", "sigma_m_d/(k_crit*f_m_d)", unit="1",
              desc=f"bending utilisation, {STD} 6.1.6 Eq. (6.11) with k_crit, 6.3.3 Eq. (6.33)")
    # shear, 6.1.7
    kcr = float(D.ec5()["k_cr"][product])
    work.let("k_cr", work.q(kcr, ""), desc="crack factor for shear", note=D.ec5()["k_cr"]["source"])
    work.calc("b_ef", "k_cr*b", unit="mm", desc=f"effective width for shear, {STD} 6.1.7(2) Eq. (6.13a)")
    work.calc("tau_d", "1.5*V_d/(b_ef*h)", unit="MPa", desc="design shear stress, rectangular section, 1.5V/(b_ef·h)")
    work.let("f_v_k", work.q(float(g["f_v_k"]), "MPa"), unit="MPa", desc="characteristic shear strength",
             note=g["source"])
    work.calc("f_v_d", "k_mod*k_sys*f_v_k/gamma_M", unit="MPa", desc=f"design shear strength, {STD} 2.4.1 Eq. (2.14)")
    work.calc("U_shear", "tau_d/f_v_d", unit="1", desc=f"shear utilisation, {STD} 6.1.7 Eq. (6.13)")
    out = {k: work[k] for k in ("k_mod", "gamma_M", "k_h", "k_crit", "sigma_m_d", "f_m_d", "tau_d", "f_v_d",
                                "U_bending", "U_shear")}
    if F_c_90_d is not None:
        _bearing(work, g, product, b, h, L, F_c_90_d, l_b, b_b, a_end, support, out)
    if any(v is not None for v in (w_G, w_Q, u_G, u_Q)):
        _deflection(work, g, product, sc_, L, w_G, w_Q, u_G, u_Q, psi_2, limit_inst, limit_fin, out)
        out["k_def"] = work["k_def"]
    else:
        out["k_def"] = work.q(D.k_def(product, sc_), "")
    out["factor"] = chain.table(work, f"Factor chain for bending, {STD}")
    _finish(work, out, {"U_bending": "bending with lateral torsional stability (6.1.6, 6.3.3)",
                        "U_shear": "shear (6.1.7)", "U_bearing": "bearing perpendicular to the grain (6.1.5)",
                        "U_inst": "instantaneous deflection (2.2.3, 7.2)", "U_fin": "final deflection (2.3.2.2, 7.2)"})
    return out


# ================================================================== timber_design.ec5_column
COLUMN_PARAMS = [
    GRADE,
    Param("b", "[length]", "width (the minor-axis dimension, along y)"),
    Param("h", "[length]", "depth (the major-axis dimension, along z)"),
    Param("L", "[length]", "length between lateral restraints"),
    Param("N_d", "[force]", "design axial compression"),
    Param("M_y_d", "[force]*[length]", "design moment about the major axis y", default=None),
    Param("M_z_d", "[force]*[length]", "design moment about the minor axis z", default=None),
    Param("l_ef_y", "[length]", "buckling length about y (default L)", default=None),
    Param("l_ef_z", "[length]", "buckling length about z (default L)", default=None),
    *PARAMS_COMMON,
    Param("braced", kind="flag", doc="compression edge held laterally throughout (6.3.3(5))", default="no"),
    Param("load_case", kind="text", choices=D.l_ef_cases(), doc="Table 6.1 case for the l_ef of bending",
          default="simply-supported-constant-moment"),
    Param("load_position", kind="text", choices=("centroid", "compression-edge", "tension-edge"),
          doc="where the lateral load acts (Table 6.1 note)", default="centroid"),
]
COLUMN_FIELDS = [
    Field("k_mod"), Field("gamma_M"),
    Field("lambda_rel_y", doc="relative slenderness about y (6.21)"),
    Field("lambda_rel_z", doc="relative slenderness about z (6.22)"),
    Field("k_c_y", doc="instability factor about y (6.25)"), Field("k_c_z", doc="instability factor about z (6.26)"),
    Field("k_crit", doc="lateral torsional stability factor (6.34)", optional=True),
    Field("sigma_c_0_d", "[pressure]", "design compression stress"),
    Field("f_c_0_d", "[pressure]", "design compression strength"),
    Field("U_y", doc="(6.23) or (6.19): buckling about y with bending"),
    Field("U_z", doc="(6.24) or (6.20): buckling about z with bending"),
    Field("U_ltb", doc="(6.35): bending with lateral torsional buckling and compression", optional=True),
    Field("U_max", doc="largest utilisation"), Field("governing", kind="text", doc="the check that governs"),
    Field("factor", kind="text", doc="the factor that reduces the compression resistance most"),
]


def _buckling(work, g, product, L, l_ef_y, l_ef_z, chain: Chain):
    """6.3.2: relative slenderness (6.21)/(6.22) and k_c (6.25)-(6.29) about both axes of a rectangle."""
    sc = work.scope
    sc["l_ef_y"] = l_ef_y if l_ef_y is not None else L
    sc["l_ef_z"] = l_ef_z if l_ef_z is not None else L
    work.calc("A", "b*h", unit="mm^2", desc="area")
    work.calc("i_y", "h/sqrt(12)", unit="mm", desc="radius of gyration about y (rectangle, h/√12)")
    work.calc("i_z", "b/sqrt(12)", unit="mm", desc="radius of gyration about z (rectangle, b/√12)")
    work.calc("lambda_y", "l_ef_y/i_y", unit="1", desc="slenderness about y")
    work.calc("lambda_z", "l_ef_z/i_z", unit="1", desc="slenderness about z")
    work.calc("lambda_rel_y", "lambda_y/pi*sqrt(f_c_0_k/E_0_05)", unit="1",
              desc=f"relative slenderness about y, {STD} 6.3.2(1) Eq. (6.21)")
    work.calc("lambda_rel_z", "lambda_z/pi*sqrt(f_c_0_k/E_0_05)", unit="1",
              desc=f"relative slenderness about z, {STD} 6.3.2(1) Eq. (6.22)")
    lam_y, lam_z = (float(work[k].m_as("")) for k in ("lambda_rel_y", "lambda_rel_z"))
    beta = float(D.ec5()["beta_c"][product])
    work.let("beta_c", work.q(beta, ""), desc=f"straightness factor, {product} timber",
             note=f"{STD} 6.3.2(3), Eq. (6.29)")
    for ax, lam, eqk, eqc in (("y", lam_y, "(6.27)", "(6.25)"), ("z", lam_z, "(6.28)", "(6.26)")):
        if lam <= 0.3:
            work.calc(f"k_c_{ax}", "1", unit="1",
                      desc=f"instability factor about {ax}: λ_rel,{ax} ≤ 0.3, no reduction ({STD} 6.3.2(2))")
        else:
            work.calc(f"k_{ax}", f"0.5*(1 + beta_c*(lambda_rel_{ax} - 0.3) + lambda_rel_{ax}^2)", unit="1",
                      desc=f"{STD} 6.3.2(3) Eq. {eqk}")
            work.calc(f"k_c_{ax}", f"1/(k_{ax} + sqrt(k_{ax}^2 - lambda_rel_{ax}^2))", unit="1",
                      desc=f"instability factor about {ax}, {STD} 6.3.2(3) Eq. {eqc}")
            chain.add(f"k_c,{ax}", float(work[f"k_c_{ax}"].m_as("")),
                      f"flexural buckling about {ax}, λ_rel,{ax} = {lam:.3f} > 0.3 (6.3.2(3))")
    return lam_y, lam_z


@namespace.function("ec5_column", standards=EC5_STANDARDS, params=COLUMN_PARAMS, fields=COLUMN_FIELDS, returns="timber_design.column")
def ec5_column(work, grade, b, h, L, N_d, M_y_d=None, M_z_d=None, l_ef_y=None, l_ef_z=None, service_class=1,
               duration="medium-term", annex="recommended", k_sys="no", braced="no",
               load_case="simply-supported-constant-moment", load_position="centroid"):
    """A rectangular column, post or beam-column: 6.2.4 (6.19)/(6.20) or 6.3.2 (6.23)/(6.24), and 6.3.3 (6.35)."""
    _positive(work, b=b, h=h, L=L, l_ef_y=l_ef_y, l_ef_z=l_ef_z)
    if N_d.magnitude < 0:
        work.fail("N_d is the compression: give it as a positive value (tension is 6.1.2, not built here)",
                  param="N_d")
    for k, v in (("M_y_d", M_y_d), ("M_z_d", M_z_d)):
        if v is not None and v.magnitude < 0:
            work.fail(f"{k} is a magnitude: give it as a positive value", param=k)
    sc = work.scope
    chain = Chain()
    g, product, sc_ = _setup(work, grade, service_class, duration, annex, k_sys, chain)
    for name, label in (("f_c_0_k", "compression parallel to the grain"), ("f_m_k", "bending")):
        work.let(name, work.q(float(g[name]), "MPa"), desc=f"characteristic {label} strength", note=g["source"])
    work.let("E_0_05", work.q(float(g["E_0_05"]), "GPa"), desc="5th-percentile modulus", note=g["source"])
    lam_y, lam_z = _buckling(work, g, product, L, l_ef_y, l_ef_z, chain)
    stocky = lam_y <= 0.3 and lam_z <= 0.3
    work.calc("sigma_c_0_d", "N_d/A", unit="MPa", desc="design compression stress")
    work.calc("f_c_0_d", "k_mod*k_sys*f_c_0_k/gamma_M", unit="MPa", desc=f"design compression strength, {STD} Eq. (2.14)")
    terms_y, terms_z = [], []
    if M_y_d is not None or M_z_d is not None:
        km = float(D.ec5()["k_m"]["rectangular"])
        work.let("k_m", work.q(km, ""), desc="redistribution factor, rectangular section",
                 note=D.ec5()["k_m"]["source"])
    if M_y_d is not None:
        _k_h(work, g, product, "k_h_y", h, chain, "y")
        work.calc("W_y", "b*h^2/6", unit="mm^3", desc="section modulus about y")
        work.calc("sigma_m_y_d", "M_y_d/W_y", unit="MPa", desc="design bending stress about y")
        work.calc("f_m_y_d", "k_mod*k_h_y*k_sys*f_m_k/gamma_M", unit="MPa", desc="design bending strength about y, (2.14)")
        terms_y.append("sigma_m_y_d/f_m_y_d")
        terms_z.append("k_m*sigma_m_y_d/f_m_y_d")
    if M_z_d is not None:
        _k_h(work, g, product, "k_h_z", b, chain, "z")
        work.calc("W_z", "h*b^2/6", unit="mm^3", desc="section modulus about z")
        work.calc("sigma_m_z_d", "M_z_d/W_z", unit="MPa", desc="design bending stress about z")
        work.calc("f_m_z_d", "k_mod*k_h_z*k_sys*f_m_k/gamma_M", unit="MPa", desc="design bending strength about z, (2.14)")
        terms_y.append("k_m*sigma_m_z_d/f_m_z_d")
        terms_z.append("sigma_m_z_d/f_m_z_d")
    tail_y = "".join(" + " + t for t in terms_y)
    tail_z = "".join(" + " + t for t in terms_z)
    if stocky:
        work.note("λ_rel,y and λ_rel,z ≤ 0.3: no buckling; the cross-section checks of 6.2.4 apply (6.3.2(2)).",
                  kind="method")
        work.calc("U_y", f"(sigma_c_0_d/f_c_0_d)^2{tail_y}", unit="1", desc=f"{STD} 6.2.4 Eq. (6.19)")
        work.calc("U_z", f"(sigma_c_0_d/f_c_0_d)^2{tail_z}", unit="1", desc=f"{STD} 6.2.4 Eq. (6.20)")
    else:
        work.note("A relative slenderness exceeds 0.3: flexural buckling is checked by 6.3.2(3).", kind="method")
        work.calc("U_y", f"sigma_c_0_d/(k_c_y*f_c_0_d){tail_y}", unit="1", desc=f"{STD} 6.3.2(3) Eq. (6.23)")
        work.calc("U_z", f"sigma_c_0_d/(k_c_z*f_c_0_d){tail_z}", unit="1", desc=f"{STD} 6.3.2(3) Eq. (6.24)")
    out = {k: work[k] for k in ("k_mod", "gamma_M", "lambda_rel_y", "lambda_rel_z", "k_c_y", "k_c_z",
                                "sigma_c_0_d", "f_c_0_d", "U_y", "U_z")}
    if M_y_d is not None and braced != "yes" and h.m_as("mm") > b.m_as("mm"):
        sc["f_m_k"] = work.q(float(g["f_m_k"]), "MPa")
        _k_crit(work, g, product, b, h, L, None, load_case, load_position, braced, chain)
        work.calc("U_ltb", "(sigma_m_y_d/(k_crit*f_m_y_d))^2 + sigma_c_0_d/(k_c_z*f_c_0_d)", unit="1",
                  desc=f"bending and compression with lateral torsional buckling, {STD} 6.3.3(6) Eq. (6.35)")
        out["U_ltb"] = work["U_ltb"]
        out["k_crit"] = work["k_crit"]
    out["factor"] = chain.table(work, f"Factor chain for compression, {STD}")
    eq = ("(6.19)", "(6.20)") if stocky else ("(6.23)", "(6.24)")
    _finish(work, out, {"U_y": f"compression{' and bending' if terms_y else ''} about y {eq[0]}",
                        "U_z": f"compression{' and bending' if terms_z else ''} about z {eq[1]}",
                        "U_ltb": "bending with lateral torsional buckling and compression (6.35)"})
    return out


# ================================================================== single checks
_RECT = [GRADE, Param("b", "[length]", "breadth"), Param("h", "[length]", "depth")]


@namespace.function(
    "ec5_k_c", standards=EC5_STANDARDS,
    params=[*_RECT, Param("l_ef_y", "[length]", "buckling length about y"),
            Param("l_ef_z", "[length]", "buckling length about z (default l_ef_y)", default=None)],
    fields=[Field("lambda_rel_y"), Field("lambda_rel_z"), Field("k_c_y"), Field("k_c_z")],
    returns="timber_design.k_c",
)
def ec5_k_c(work, grade, b, h, l_ef_y, l_ef_z=None):
    """Instability factors k_c,y and k_c,z of a rectangle (6.3.2, (6.21)-(6.29))."""
    _positive(work, b=b, h=h, l_ef_y=l_ef_y, l_ef_z=l_ef_z)
    g = _grade(work, grade)
    work.let("f_c_0_k", work.q(float(g["f_c_0_k"]), "MPa"), desc="characteristic compression strength",
             note=g["source"])
    work.let("E_0_05", work.q(float(g["E_0_05"]), "GPa"), desc="5th-percentile modulus", note=g["source"])
    _buckling(work, g, g["product"], l_ef_y, l_ef_y, l_ef_z if l_ef_z is not None else l_ef_y, Chain())
    return {k: work[k] for k in ("lambda_rel_y", "lambda_rel_z", "k_c_y", "k_c_z")}


@namespace.function(
    "ec5_k_crit", standards=EC5_STANDARDS,
    params=[*_RECT, Param("L", "[length]", "span"),
            Param("load_case", kind="text", choices=D.l_ef_cases(), doc="Table 6.1 case",
                  default="simply-supported-uniform-load"),
            Param("load_position", kind="text", choices=("centroid", "compression-edge", "tension-edge"),
                  doc="where the load acts (Table 6.1 note)", default="compression-edge"),
            Param("l_ef", "[length]", "effective length (overrides Table 6.1)", default=None)],
    fields=[Field("sigma_m_crit", "[pressure]", "critical bending stress (6.31)/(6.32)"),
            Field("lambda_rel_m", doc="(6.30)"), Field("k_crit", doc="(6.34)")],
    returns="timber_design.k_crit",
)
def ec5_k_crit(work, grade, b, h, L, load_case="simply-supported-uniform-load", load_position="compression-edge",
               l_ef=None):
    """Lateral torsional stability factor k_crit of a rectangular beam (6.3.3)."""
    _positive(work, b=b, h=h, L=L, l_ef=l_ef)
    g = _grade(work, grade)
    work.let("f_m_k", work.q(float(g["f_m_k"]), "MPa"), desc="characteristic bending strength", note=g["source"])
    _k_crit(work, g, g["product"], b, h, L, l_ef, load_case, load_position, "no", Chain())
    return {k: work[k] for k in ("sigma_m_crit", "lambda_rel_m", "k_crit")}


@namespace.function(
    "ec5_bearing", standards=EC5_STANDARDS,
    params=[*_RECT, Param("L", "[length]", "span (for the clear distance l_1 to the next bearing)"),
            Param("F_c_90_d", "[force]", "design support reaction"), Param("l_b", "[length]", "bearing length"),
            Param("b_b", "[length]", "bearing width (default b)", default=None),
            Param("a_end", "[length]", "distance from the member end (default 0)", default=None),
            Param("support", kind="text", choices=("discrete", "continuous"), doc="6.1.5(4)-(6)",
                  default="discrete"),
            *PARAMS_COMMON],
    fields=[Field("k_c_90"), Field("sigma_c_90_d", "[pressure]"), Field("f_c_90_d", "[pressure]"),
            Field("U_bearing", doc="(6.3)")],
    returns="timber_design.bearing",
)
def ec5_bearing(work, grade, b, h, L, F_c_90_d, l_b, b_b=None, a_end=None, support="discrete", service_class=1,
                duration="medium-term", annex="recommended", k_sys="no"):
    """Compression perpendicular to the grain at a support (6.1.5, A1:2008 text)."""
    _positive(work, b=b, h=h, L=L)
    g, product, _ = _setup(work, grade, service_class, duration, annex, k_sys, Chain())
    out = {}
    _bearing(work, g, product, b, h, L, F_c_90_d, l_b, b_b, a_end, support, out)
    return {k: work[k] for k in ("k_c_90", "sigma_c_90_d", "f_c_90_d", "U_bearing")}


@namespace.function(
    "ec5_deflection", standards=EC5_STANDARDS,
    params=[*_RECT, Param("L", "[length]", "span"),
            Param("w_G", "[force]/[length]", "characteristic permanent line load", default=None),
            Param("w_Q", "[force]/[length]", "characteristic variable line load", default=None),
            Param("u_G", "[length]", "instantaneous deflection, permanent", default=None),
            Param("u_Q", "[length]", "instantaneous deflection, variable", default=None),
            Param("psi_2", doc="quasi-permanent factor (EN 1990 Table A1.1)", default=None),
            Param("limit_inst", doc="span/limit for u_inst", default=None),
            Param("limit_fin", doc="span/limit for u_fin", default=None),
            Param("service_class", doc="service class 1, 2 or 3", default=1)],
    fields=[Field("k_def"), Field("u_inst", "[length]"), Field("u_fin", "[length]"), Field("U_inst"),
            Field("U_fin")],
    returns="timber_design.deflection",
)
def ec5_deflection(work, grade, b, h, L, w_G=None, w_Q=None, u_G=None, u_Q=None, psi_2=None, limit_inst=None,
                   limit_fin=None, service_class=1):
    """Instantaneous and final deflection with creep (2.3.2.2 (2.3)/(2.4), k_def Table 3.2)."""
    _positive(work, b=b, h=h, L=L)
    g = _grade(work, grade)
    if all(v is None for v in (w_G, w_Q, u_G, u_Q)):
        work.fail("give w_G and w_Q, or u_G and u_Q", param="w_G")
    out = {}
    _deflection(work, g, g["product"], _service_class(work, service_class), L, w_G, w_Q, u_G, u_Q, psi_2,
                limit_inst, limit_fin, out)
    out["k_def"] = work["k_def"]
    return out
