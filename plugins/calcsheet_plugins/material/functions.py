"""Material records for sheets: library grades, concrete by a named rule, and custom materials."""
from __future__ import annotations

from calcsheet.plugin import Field, Param

from . import library, namespace

FIELDS = [
    Field("name", kind="text", doc="what the material is"),
    Field("E", "[pressure]", "modulus of elasticity"),
    Field("G", "[pressure]", "shear modulus"),
    Field("nu", doc="Poisson's ratio"),
    Field("f_y", "[pressure]", "yield strength (timber: characteristic bending strength; concrete: f_ck or f'c)"),
    Field("f_u", "[pressure]", "ultimate tensile strength (timber: tension parallel to grain; concrete: tensile)"),
    Field("rho", "[mass]/[length]**3", "density"),
]
_SYMBOL = {"E": "E", "G": "G", "nu": "ν", "f_y": "f_y", "f_u": "f_u", "rho": "ρ"}
_WHAT = {"E": "modulus of elasticity", "G": "shear modulus", "nu": "Poisson's ratio", "f_y": "yield strength",
         "f_u": "ultimate strength", "rho": "density"}


def _from_library(work, category: str, key: str) -> dict:
    entry = library.entry(category, key)
    out = {"name": entry["name"]}
    rows = []
    for prop in library.PROPERTIES:
        q, source = library.value(entry[prop])
        out[prop] = q
        rows.append([_WHAT[prop], _SYMBOL[prop], q, source])
    work.table(f"{entry['name']} ({entry['standard']})", ["Property", "Symbol", "Value", "Source"], rows)
    if any("from memory" in r[3] for r in rows):
        work.warn(f"{entry['name']}: some values are recalled, not looked up — verify them against your standard")
    return out


@namespace.function("steel", params=[Param("grade", kind="text", choices=library.grades("steel"),
                                           doc="steel grade"),
                                     Param("t", "[length]", "nominal thickness of the thickest part (EN grades: f_y and "
                                                            "f_u by the product standard's thickness bands)",
                                           default=None)],
                    fields=FIELDS, returns="material")
def steel(work, grade, t=None):
    """A structural steel grade from the library; for EN grades, optionally at a nominal thickness."""
    out = _from_library(work, "steel", grade)
    if t is None:
        return out
    entry = library.entry("steel", grade)
    bands = entry.get("bands")
    if bands is None:
        work.fail(f"{entry['name']}: the library has no thickness bands for this grade; omit t", param="t")
    mm = t.m_as("mm")
    if mm <= 0:
        work.fail("t must be greater than zero", param="t")
    if mm > bands["t_max"][-1]:
        work.fail(f"t = {mm:g} mm is thicker than the last band of {bands['source'].split(' —')[0]} "
                  f"({bands['t_max'][-1]} mm)", param="t")
    i = next(k for k, lim in enumerate(bands["t_max"]) if mm <= lim)
    lo = 0 if i == 0 else bands["t_max"][i - 1]
    # R_m bands: t < 3, 3 ≤ t ≤ 100, 100 < t ≤ 150 (EN 10025-2 Table 7): t = 3 mm belongs to the second
    j = 0 if mm < bands["fu_t_max"][0] else next(k for k, lim in enumerate(bands["fu_t_max"]) if k and mm <= lim)
    out["f_y"] = work.let("f_y", work.q(bands["f_y"][i], "MPa"), unit="MPa",
                          desc=f"yield strength R_eH for {lo} < t ≤ {bands['t_max'][i]} mm (t = {mm:g} mm)",
                          note=bands["source"])
    out["f_u"] = work.let("f_u", work.q(bands["f_u"][j], "MPa"), unit="MPa",
                          desc=f"tensile strength R_m at t = {mm:g} mm", note=bands["source"])
    work.note(f"f_y and f_u taken from the product standard's thickness bands (EN 1993-1-1 3.2.1(1) a)); "
              f"a National Annex may instead require Table 3.1 (3.2.1(1) b)).", kind="method")
    out["name"] = f"{entry['name']}, t = {mm:g} mm"
    return out


@namespace.function("aluminium", params=[Param("alloy", kind="text", choices=library.grades("aluminium"),
                                               doc="alloy and temper")], fields=FIELDS, returns="material")
def aluminium(work, alloy):
    """An aluminium alloy from the library."""
    return _from_library(work, "aluminium", alloy)


@namespace.function("timber", params=[Param("grade", kind="text", choices=library.grades("timber"),
                                            doc="strength class (softwood or glulam)")], fields=FIELDS,
                    returns="material")
def timber(work, grade):
    """A timber strength class (sawn softwood or glued laminated) from the library."""
    return _from_library(work, "timber", grade)


RULES = ("EN 1992-1-1", "ACI 318")


@namespace.function(
    "concrete",
    params=[Param("f_c", "[pressure]", "characteristic cylinder strength (f_ck, or f'c)"),
            Param("rule", kind="text", choices=RULES, doc="rule for E from strength", default="EN 1992-1-1")],
    fields=FIELDS,
    returns="material",
)
def concrete(work, f_c, rule="EN 1992-1-1"):
    """Normal-weight concrete with E from its strength by a named rule."""
    mpa = f_c.m_as("MPa")
    if not 12 <= mpa <= 90:  # EN 1992-1-1 Table 3.1 covers C12/15 to C90/105
        work.fail(f"f_c = {mpa:g} MPa is outside the range the rules cover (12–90 MPa)", param="f_c")
    c = library.data()["concrete"]
    nu, nu_src = library.value(c["nu"])
    rho, rho_src = library.value(c["rho"])
    work.let("nu", nu, desc="Poisson's ratio", note=nu_src)
    work.let("rho", rho, unit="kg/m^3", desc="density", note=rho_src)
    if rule == "EN 1992-1-1":
        work.calc("f_cm", "f_c + 8 MPa", unit="MPa", desc="mean strength, EN 1992-1-1 Table 3.1")
        work.calc("E", "22 GPa*(f_cm/(10 MPa))^0.3", unit="GPa",
                  desc="secant modulus E_cm, EN 1992-1-1 Table 3.1 (from memory — verify against your standard)")
        work.calc("f_u", "0.30 MPa*(f_c/(1 MPa))^(2/3)", unit="MPa",
                  desc="mean tensile strength f_ctm, EN 1992-1-1 Table 3.1, f_ck ≤ 50 MPa (from memory — verify)")
        if mpa > 50:
            work.warn("f_ctm = 0.30 f_ck^(2/3) holds up to C50/60; above that EN 1992-1-1 uses another form",
                      param="f_c")
    else:
        work.calc("E", "(4700 MPa)*sqrt(f_c/(1 MPa))", unit="MPa",
                  desc="E_c = 4700√f'c (MPa), ACI 318-19 19.2.2.1(b), normal weight (from memory — verify)")
        work.calc("f_u", "(0.62 MPa)*sqrt(f_c/(1 MPa))", unit="MPa",
                  desc="modulus of rupture f_r = 0.62√f'c, ACI 318-19 19.2.3.1 (from memory — verify)")
    work.calc("G", "E/(2*(1 + nu))", unit="GPa", desc="shear modulus of an isotropic material, G = E/(2(1+ν))")
    return {"name": f"normal-weight concrete, f_c = {mpa:g} MPa (E by {rule})", "E": work["E"], "G": work["G"],
            "nu": nu, "f_y": f_c, "f_u": work["f_u"], "rho": rho}


@namespace.function(
    "custom",
    params=[Param("name", kind="text", doc="what it is"),
            Param("E", "[pressure]", "modulus of elasticity"),
            Param("f_y", "[pressure]", "yield or characteristic strength"),
            Param("nu", doc="Poisson's ratio (default 0.3)", default=None),
            Param("G", "[pressure]", "shear modulus (default E/(2(1+ν)))", default=None),
            Param("f_u", "[pressure]", "ultimate strength (default f_y)", default=None),
            Param("rho", "[mass]/[length]**3", "density", default=None)],
    fields=FIELDS,
    returns="material",
)
def custom(work, name, E, f_y, nu=None, G=None, f_u=None, rho=None):
    """A material the sheet defines itself; its source is the sheet."""
    if E.magnitude <= 0:
        work.fail("E must be greater than zero", param="E")
    if f_y.magnitude <= 0:
        work.fail("f_y must be greater than zero", param="f_y")
    if nu is None:
        nu = work.let("nu", work.q(0.3, ""), desc="Poisson's ratio", note="not given: 0.3 assumed (steel-like)")
    v = float(nu.m_as(""))
    if not -1 < v < 0.5:
        work.fail(f"Poisson's ratio must lie between -1 and 0.5, got {v:g}", param="nu")
    if G is None:
        work.calc("G", "E/(2*(1 + nu))", unit="GPa" if E.m_as("GPa") > 0 else None,
                  desc="shear modulus of an isotropic material, G = E/(2(1+ν))")
        G = work["G"]
    if rho is None:
        work.note("No density given: the record's density is zero; self-weight must be added by the sheet.",
                  kind="warning")
        rho = work.q(0.0, "kg/m^3")
    return {"name": name, "E": E, "G": G, "nu": nu, "f_y": f_y, "f_u": f_u if f_u is not None else f_y,
            "rho": rho}
