"""Handbook cross-checks: when a combination is a standard case, show its closed-form formulas.

Why: a reviewer trusts a program more when the textbook formula, with the same
numbers substituted, lands on the same value. Cases and formulas: AISC Steel
Construction Manual, Table 3-23 "Shears, Moments and Deflections" (case
numbers from memory); the same formulas appear in Roark's Formulas for Stress
and Strain, Table 8.1.
"""
from __future__ import annotations

import math

from .solver import LineLoad, MomentLoad, PointLoad

SIMPLE = ("pinned", "roller")
SOURCE = "AISC Manual Table 3-23"


def _classify(model, kinds, loads):
    L = model.length
    tol = 1e-9 * L
    full_w = 0.0
    points, others = [], []
    for ld in loads:
        if isinstance(ld, LineLoad):
            if ld.x1 <= tol and ld.x2 >= L - tol and abs(ld.w1 - ld.w2) <= 1e-12 * max(abs(ld.w1), 1e-300):
                full_w += ld.w1
            else:
                others.append(ld)
        elif isinstance(ld, PointLoad):
            points.append(ld)
        elif isinstance(ld, MomentLoad):
            others.append(ld)
    if len(points) > 1:
        P = {round(p.x / L, 12) for p in points}
        if len(P) == 1:  # loads at one point add up
            points = [PointLoad(points[0].x, sum(p.P for p in points))]
    return full_w, points, others


def cases(model, kinds, loads):
    """(title, [(name, formula_symbolic, formula_substituted_builder, solver_value_key, unit_kind)])"""
    n = len(model.spans)
    if len(set(model.EI)) != 1:
        return None
    w, points, others = _classify(model, kinds, loads)
    if others:
        return None
    L = model.length
    EI = model.EI[0]
    if n == 1 and kinds[0] in SIMPLE and kinds[1] in SIMPLE:
        if w and not points:
            return ("simply supported beam, uniform load (case 1)", {"w": w, "L": L, "EI": EI}, [
                ("R_hb", "w·L/2", "{w}*{L}/2", ("R", 0), "force"),
                ("M_hb", "w·L²/8", "{w}*{L}^2/8", ("Mmax",), "moment"),
                ("delta_hb", "5·w·L⁴/(384·EI)", "5*{w}*{L}^4/(384*{EI})", ("dmax",), "defl"),
            ])
        if len(points) == 1 and not w:
            P, a = points[0].P, points[0].x
            b = L - a
            if abs(a - L / 2) <= 1e-9 * L:
                return ("simply supported beam, central point load (case 7)", {"P": P, "L": L, "EI": EI}, [
                    ("R_hb", "P/2", "{P}/2", ("R", 0), "force"),
                    ("M_hb", "P·L/4", "{P}*{L}/4", ("Mmax",), "moment"),
                    ("delta_hb", "P·L³/(48·EI)", "{P}*{L}^3/(48*{EI})", ("dmax",), "defl"),
                ])
            if 0 < a < L:
                return ("simply supported beam, point load at any point (case 8)",
                        {"P": P, "L": L, "EI": EI, "a": a, "b": b}, [
                    ("R_hb", "P·b/L (left support)", "{P}*{b}/{L}", ("R", 0), "force"),
                    ("M_hb", "P·a·b/L", "{P}*{a}*{b}/{L}", ("Mmax",), "moment"),
                    ("delta_hb", "P·a²·b²/(3·EI·L) under the load", "{P}*{a}^2*{b}^2/(3*{EI}*{L})",
                     ("delta_at", a), "defl"),
                ])
    if n == 1 and sorted(kinds) == ["fixed", "free"]:
        fixed_left = kinds[0] == "fixed"
        tip = L if fixed_left else 0.0
        iF = 0 if fixed_left else 1
        if len(points) == 1 and not w and abs(points[0].x - tip) <= 1e-9 * L:
            return ("cantilever, point load at the free end (case 22)", {"P": points[0].P, "L": L, "EI": EI}, [
                ("R_hb", "P", "{P}", ("R", iF), "force"),
                ("M_hb", "P·L (hogging, at the support)", "{P}*{L}", ("Mabs",), "moment"),
                ("delta_hb", "P·L³/(3·EI) at the free end", "{P}*{L}^3/(3*{EI})", ("dmax",), "defl"),
            ])
        if w and not points:
            return ("cantilever, uniform load (case 18)", {"w": w, "L": L, "EI": EI}, [
                ("R_hb", "w·L", "{w}*{L}", ("R", iF), "force"),
                ("M_hb", "w·L²/2 (hogging, at the support)", "{w}*{L}^2/2", ("Mabs",), "moment"),
                ("delta_hb", "w·L⁴/(8·EI) at the free end", "{w}*{L}^4/(8*{EI})", ("dmax",), "defl"),
            ])
    if n == 1 and kinds == ["fixed", "fixed"] and w and not points:
        return ("beam fixed at both ends, uniform load (case 15)", {"w": w, "L": L, "EI": EI}, [
            ("R_hb", "w·L/2", "{w}*{L}/2", ("R", 0), "force"),
            ("M_hb", "w·L²/12 (hogging, at the ends)", "{w}*{L}^2/12", ("Mneg",), "moment"),
            ("M_hb2", "w·L²/24 (sagging, at the centre)", "{w}*{L}^2/24", ("Mmax",), "moment"),
            ("delta_hb", "w·L⁴/(384·EI)", "{w}*{L}^4/(384*{EI})", ("dmax",), "defl"),
        ])
    if n == 1 and "fixed" in kinds and (kinds[0] in SIMPLE or kinds[1] in SIMPLE) and w and not points:
        iF = kinds.index("fixed")
        return ("beam fixed at one end, supported at the other, uniform load (case 12)", {"w": w, "L": L}, [
            ("R_hb", "5·w·L/8 (fixed end)", "5*{w}*{L}/8", ("R", iF), "force"),
            ("R_hb2", "3·w·L/8 (simple end)", "3*{w}*{L}/8", ("R", 1 - iF), "force"),
            ("M_hb", "w·L²/8 (hogging, fixed end)", "{w}*{L}^2/8", ("Mneg",), "moment"),
            ("M_hb2", "9·w·L²/128 at 3L/8 from the simple end", "9*{w}*{L}^2/128", ("Mmax",), "moment"),
        ])
    if (n == 2 and all(k in SIMPLE for k in kinds) and abs(model.spans[0] - model.spans[1]) <= 1e-9 * L
            and w and not points):
        l1 = model.spans[0]
        return ("continuous beam, two equal spans, uniform load on both (case 29)", {"w": w, "L": l1}, [
            ("R_hb", "0.375·w·L (end supports)", "0.375*{w}*{L}", ("R", 0), "force"),
            ("R_hb2", "1.25·w·L (centre support)", "1.25*{w}*{L}", ("R", 1), "force"),
            ("M_hb", "w·L²/8 (hogging, centre support)", "{w}*{L}^2/8", ("Mneg",), "moment"),
        ])
    if n == 2 and not w and len(points) == 1:
        if kinds[0] in SIMPLE and kinds[1] in SIMPLE and kinds[2] == "free":
            l, a, P = model.spans[0], model.spans[1], points[0]
            if abs(P.x - L) <= 1e-9 * L:
                return ("beam overhanging one support, point load at the end of the overhang (case 26)",
                        {"P": P.P, "L": l, "a": a, "EI": EI}, [
                    ("R_hb", "P·(L + a)/L (support next to the overhang)", "{P}*({L} + {a})/{L}", ("R", 1),
                     "force"),
                    ("M_hb", "P·a (hogging, at that support)", "{P}*{a}", ("Mabs",), "moment"),
                    ("delta_hb", "P·a²·(L + a)/(3·EI) at the free end", "{P}*{a}^2*({L} + {a})/(3*{EI})",
                     ("delta_at", L), "defl"),
                ])
    return None


def _solver_value(cr, key):
    if key[0] == "R":
        return cr.sol.reactions[key[1]]
    if key[0] == "Mmax":
        return cr.M_max.value
    if key[0] == "Mneg":
        return cr.M_min.value
    if key[0] == "Mabs":
        return max(abs(cr.M_max.value), abs(cr.M_min.value))
    if key[0] == "dmax":
        return abs(cr.d_max.value)
    if key[0] == "delta_at":
        return float(cr.sol.at("delta", key[1], side="left")[0])
    raise KeyError(key)


def cross_check(work, setup, cr, lit, many: bool):
    found = cases(setup.model, setup.kinds, cr.loads)
    if not found:
        return
    title, values, rows = found
    tag = cr.combo.tag
    label = f" ({cr.combo.name})" if many else ""
    kinds_of = {"w": "line", "P": "force", "L": "length", "a": "length", "b": "length", "EI": "EI"}
    subs = {k: lit(v, kinds_of[k]) for k, v in values.items()}
    work.note(f"Cross-check{label}: this is a standard case — {title}, {SOURCE}.", kind="method")
    for name, symbolic, template, key, what in rows:
        unit = lit.units[what]
        n = f"{name}{tag}"
        sub = template
        for k, v in subs.items():
            # every literal carries a unit: parenthesise so a power applies to the whole quantity
            sub = sub.replace("{" + k + "}", v if v.startswith("(") else f"({v})")
        work.calc(n, sub, unit=unit, desc=f"handbook: {symbolic}")
        solver = _solver_value(cr, key)
        if key[0] == "Mneg":
            solver = -solver
        work.check(f"abs({n} - {lit(solver, what)}) <= 1e-4*abs({n})",
                   desc=f"the stiffness solution ({lit(solver, what)}) agrees with {symbolic}")
