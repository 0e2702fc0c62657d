"""column.buckling: Euler and Johnson critical loads about both axes, as traced formulas.

Why every step is a formula: the whole of a buckling check is closed-form, so
the package shows each one with its numbers, and the engine evaluates them.
"""
from __future__ import annotations

import math
import tomllib
from functools import lru_cache
from pathlib import Path

from calcsheet.plugin import Field, Param

from . import namespace

DATA = Path(__file__).with_name("end_conditions.toml")


@lru_cache(maxsize=1)
def end_conditions() -> dict:
    with DATA.open("rb") as fh:
        return tomllib.load(fh)


def conditions() -> tuple[str, ...]:
    return tuple(k for k in end_conditions() if k != "sources")


def k_factor(ends: str, basis: str = "design") -> tuple[float, str]:
    """(K, source) for a named end condition; accepts either order ("pinned-fixed")."""
    data = end_conditions()
    key = ends if ends in data else "-".join(reversed(ends.split("-")))
    return float(data[key][basis]), data["sources"][basis]


def euler_load(E: float, I: float, K: float, L: float) -> float:
    return math.pi**2 * E * I / (K * L) ** 2


def transition_slenderness(E: float, F_y: float) -> float:
    return math.sqrt(2 * math.pi**2 * E / F_y)


def critical_stress(E: float, F_y: float, slenderness: float) -> float:
    """Euler above the transition slenderness, Johnson's parabola below it."""
    if slenderness >= transition_slenderness(E, F_y):
        return math.pi**2 * E / slenderness**2
    return F_y - F_y**2 * slenderness**2 / (4 * math.pi**2 * E)


def _ends_choices():
    names = conditions()
    return names + tuple("-".join(reversed(n.split("-"))) for n in names if n.split("-")[0] != n.split("-")[1])


PARAMS = [
    Param("L", "[length]", "column length between end restraints"),
    Param("ends", kind="text", choices=_ends_choices(), doc="end conditions for buckling about x (and y unless "
                                                          "ends_y is given)", default="pinned-pinned"),
    Param("ends_y", kind="text", choices=_ends_choices(), doc="end conditions for buckling about y",
          default=None),
    Param("K_basis", kind="text", choices=("design", "theoretical"), doc="which K values to use",
          default="design"),
    Param("K_x", doc="effective length factor about x (overrides ends)", default=None),
    Param("K_y", doc="effective length factor about y (overrides ends_y)", default=None),
    Param("L_y", "[length]", "unbraced length for buckling about y (default L)", default=None),
    Param("section", kind="record", record="section", doc="a section record (A, I_x, I_y, r_x, r_y)",
          default=None),
    Param("material", kind="record", record="material", doc="a material record (E, f_y)", default=None),
    Param("E", "[pressure]", "modulus of elasticity (default material.E)", default=None),
    Param("F_y", "[pressure]", "yield stress (default material.f_y)", default=None),
    Param("A", "[length]**2", "area (default section.A)", default=None),
    Param("I_x", "[length]**4", "second moment of area about x (default section.I_x)", default=None),
    Param("I_y", "[length]**4", "second moment of area about y (default section.I_y)", default=None),
    Param("f_pl", "[pressure]", "proportional limit (default F_y/2)", default=None),
]
FIELDS = [
    Field("K_x", doc="effective length factor, x"), Field("K_y", doc="effective length factor, y"),
    Field("KL_r_x", doc="slenderness about x"), Field("KL_r_y", doc="slenderness about y"),
    Field("KL_r", doc="governing (largest) slenderness"),
    Field("C_c", doc="transition slenderness √(2π²E/F_y)"),
    Field("P_e_x", "[force]", "Euler load about x"), Field("P_e_y", "[force]", "Euler load about y"),
    Field("sigma_e_x", "[pressure]", "Euler stress about x"), Field("sigma_e_y", "[pressure]", "Euler stress about y"),
    Field("sigma_cr_x", "[pressure]", "critical stress about x"),
    Field("sigma_cr_y", "[pressure]", "critical stress about y"),
    Field("sigma_cr", "[pressure]", "governing critical stress"),
    Field("P_cr", "[force]", "governing critical load σ_cr·A"),
    Field("axis", kind="text", doc="governing axis, x or y"),
    Field("range", kind="text", doc="elastic (Euler) or inelastic (Johnson)"),
]


@namespace.function("buckling", params=PARAMS, fields=FIELDS, returns="column")
def buckling(work, L, ends="pinned-pinned", ends_y=None, K_basis="design", K_x=None, K_y=None, L_y=None,
             section=None, material=None, E=None, F_y=None, A=None, I_x=None, I_y=None, f_pl=None):
    """Flexural buckling about both principal axes: Euler, with Johnson's parabola below the transition."""
    sc = work.scope
    if L.magnitude <= 0:
        work.fail("L must be greater than zero", param="L")
    if L_y is not None and L_y.magnitude <= 0:
        work.fail("L_y must be greater than zero", param="L_y")
    us = str(work.settings.get("system", "SI")).upper() == "US"
    st, fo, ln, ar, mi = ("ksi", "kip", "in", "in^2", "in^4") if us else ("MPa", "kN", "mm", "mm^2", "mm^4")

    def need(name, given, rec, field, param):
        if given is not None:
            return given
        if rec is not None and field in rec.fields:
            sc[name] = rec.fields[field]
            return sc[name]
        work.fail(f"give {name}=… or a {'section' if rec is section else 'material'} record that has {field}",
                  param=param)

    need("E", E, material, "E", "E")
    need("F_y", F_y, material, "f_y", "F_y")
    need("A", A, section, "A", "A")
    need("I_x", I_x, section, "I_x", "I_x")
    need("I_y", I_y, section, "I_y", "I_y")
    for name in ("E", "F_y", "A", "I_x", "I_y"):
        if sc[name].magnitude <= 0:
            work.fail(f"{name} must be greater than zero", param=name)
    if E is None:
        work.let("E", sc["E"], unit="GPa" if not us else "ksi", desc="modulus of elasticity", note="from the material")
    if F_y is None:
        work.let("F_y", sc["F_y"], unit=st, desc="yield stress", note="from the material")
    if A is None:
        work.let("A", sc["A"], unit=ar, desc="area", note="from the section")

    # effective lengths
    sc["L_x"] = L
    if L_y is None:
        sc["L_y"] = L
    for axis, given, name in (("x", K_x, ends), ("y", K_y, ends_y or ends)):
        if given is not None:
            if given.m_as("") <= 0:
                work.fail(f"K_{axis} must be greater than zero", param=f"K_{axis}")
            continue
        K, source = k_factor(name, K_basis)
        kind = "recommended design value" if K_basis == "design" else "theoretical value"
        work.let(f"K_{axis}", work.q(K, ""), desc=f"effective length factor about {axis}, {name} ({kind})",
                 note=source)

    # slenderness, per axis
    for axis in ("x", "y"):
        if section is not None and I_x is None and I_y is None and A is None and f"r_{axis}" in section.fields:
            work.calc(f"r_{axis}", f"section.r_{axis}", unit=ln, desc=f"radius of gyration about {axis}")
        else:
            work.calc(f"r_{axis}", f"sqrt(I_{axis}/A)", unit=ln, desc=f"radius of gyration about {axis}, √(I/A)")
        work.calc(f"KL_r_{axis}", f"K_{axis}*L_{axis}/r_{axis}", unit="1", desc=f"slenderness about {axis}")
        sc[f"KL_r_{axis}"] = work.q(float(sc[f"KL_r_{axis}"].m_as("")), "")
        work.calc(f"P_e_{axis}", f"pi^2*E*I_{axis}/(K_{axis}*L_{axis})^2", unit=fo,
                  desc=f"Euler buckling load about {axis}, P_e = π²EI/(KL)²")
        work.calc(f"sigma_e_{axis}", f"pi^2*E/KL_r_{axis}^2", unit=st,
                  desc=f"Euler stress about {axis}, σ_e = π²E/(KL/r)²")
    if f_pl is None:
        work.calc("f_pl", "F_y/2", unit=st, desc="proportional limit, taken as F_y/2 (the Johnson parabola's "
                                              "tangent point; residual stresses in rolled steel — common practice)")
    work.calc("C_c", "sqrt(2*pi^2*E/F_y)", unit="1", desc="transition slenderness, where σ_e = F_y/2: C_c = √(2π²E/F_y)")
    sc["C_c"] = work.q(float(sc["C_c"].m_as("")), "")

    regimes = {}
    for axis in ("x", "y"):
        lam = float(sc[f"KL_r_{axis}"].m_as(""))
        cc = float(sc["C_c"].m_as(""))
        se = sc[f"sigma_e_{axis}"]
        elastic_ok = se.m_as("Pa") <= sc["f_pl"].m_as("Pa")
        cmp = (f"σ_e = {se.m_as(st):.4g} {st} {'≤' if elastic_ok else '>'} f_pl = {sc['f_pl'].m_as(st):.4g} {st}")
        if lam >= cc:
            work.note(f"About {axis}: KL/r = {lam:.1f} ≥ C_c = {cc:.1f} and {cmp}: buckling is elastic and Euler "
                      f"applies" + ("" if elastic_ok else " (but σ_e exceeds the given proportional limit: check "
                                                          "the material)") + ".")
            work.calc(f"sigma_cr_{axis}", f"sigma_e_{axis}", unit=st, desc=f"critical stress about {axis} (Euler)")
            regimes[axis] = "elastic (Euler)"
        else:
            work.note(f"About {axis}: KL/r = {lam:.1f} < C_c = {cc:.1f} and {cmp}: beyond the elastic range Euler "
                      f"does not apply, and the Johnson parabola governs (J. B. Johnson's column formula, tangent "
                      f"to Euler's curve at σ = F_y/2).")
            work.calc(f"sigma_cr_{axis}", f"F_y - F_y^2*KL_r_{axis}^2/(4*pi^2*E)", unit=st,
                      desc=f"critical stress about {axis} (Johnson): σ_cr = F_y − F_y²(KL/r)²/(4π²E)")
            regimes[axis] = "inelastic (Johnson)"
    work.calc("sigma_cr", "min(sigma_cr_x, sigma_cr_y)", unit=st, desc="governing critical stress")
    axis = "x" if sc["sigma_cr_x"].m_as("Pa") <= sc["sigma_cr_y"].m_as("Pa") else "y"
    work.note(f"Buckling about the {axis} axis governs ({regimes[axis]}).", kind="method")
    work.calc("P_cr", "sigma_cr*A", unit=fo, desc="critical load, P_cr = σ_cr·A")
    work.calc("KL_r", "max(KL_r_x, KL_r_y)", unit="1", desc="governing slenderness")
    out = {"axis": axis, "range": regimes[axis]}
    for name in ("K_x", "K_y", "KL_r_x", "KL_r_y", "KL_r", "C_c"):
        out[name] = work.q(float(sc[name].m_as("")), "")
    for name in ("P_e_x", "P_e_y", "P_cr"):
        out[name] = sc[name].to(fo)
    for name in ("sigma_e_x", "sigma_e_y", "sigma_cr_x", "sigma_cr_y", "sigma_cr"):
        out[name] = sc[name].to(st)
    return out
