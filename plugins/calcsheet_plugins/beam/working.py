"""The beam's traced working: what a checker would write by hand, as formulas the engine evaluates.

Why formulas with the numbers written in: a reviewer reads ΣM_A = 0 with the
loads and lever arms substituted, and the engine evaluates exactly that text,
so the package cannot show one thing and compute another.
"""
from __future__ import annotations

from calcsheet.units import Quantity

from . import handbook
from .model import _SI_OF, letters

MAX_TERMS = 12
MANY_COMBOS = 8  # beyond this many combinations, equilibrium is tabulated and the worst one checked


def num(v: float) -> str:
    """A plain literal the sheet grammar reads back (no '+' in exponents)."""
    v = float(v)
    if v == 0:
        return "0"
    a = abs(v)
    if 1e-4 <= a < 1e9:
        s = f"{v:.10g}"
        if "e" not in s:
            return s
    mant, exp = f"{v:.9e}".split("e")
    mant = mant.rstrip("0").rstrip(".")
    return f"{mant}e{int(exp)}"


class Lit:
    """Writes SI floats as literals in the sheet's display units."""

    def __init__(self, units: dict):
        self.units = units

    def value(self, v_si: float, what: str) -> float:
        return float(Quantity(v_si, _SI_OF[what]).m_as(self.units[what]))

    def __call__(self, v_si: float, what: str) -> str:
        val = self.value(v_si, what)
        s = f"{num(val)} {self.units[what]}"
        return f"({s})" if val < 0 else s

    def q(self, v_si: float, what: str):
        return Quantity(self.value(v_si, what), self.units[what])


def _sanitize_case(c: str) -> str:
    return f"_{c}" if c else ""


# ---------------------------------------------------------------- load resultants


def load_terms(ld, x_ref: float, lit: Lit):
    """(force term, moment-about-x_ref term) for one load, clockwise moments positive."""
    return ld.terms(x_ref, lit)


def case_sums(work, setup, x_ref: float, ref_letter: str, lit: Lit, with_moment: bool = True) -> dict:
    """Per case: total downward load W_c and its moment about the reference support M_ref_c."""
    names = {}
    used = setup.used_cases()
    for case, loads in setup.case_loads().items():
        if case not in used:
            continue
        tag = _sanitize_case(case)
        label = f"case {case}" if case else "the loads"
        W_name, M_name = f"W{tag}", f"M_{ref_letter}_loads{tag}"
        if len(loads) > MAX_TERMS:
            W, Mo = _resultants(loads, x_ref)
            work.let(W_name, lit.q(W, "force"), unit=lit.units["force"], desc=f"total downward load of {label}",
                     note=f"sum of the {len(loads)} loads listed in the loads table")
            if with_moment:
                work.let(M_name, lit.q(Mo, "moment"), unit=lit.units["moment"],
                         desc=f"moment of {label} about {ref_letter}, clockwise positive",
                         note=f"Σ W·a over the {len(loads)} loads in the loads table")
        else:
            terms = [t for t in (load_terms(ld, x_ref, lit) for ld in loads) if t[1] is not None]
            Wt = [t[0] for t in terms if t[0]]
            work.calc(W_name, " + ".join(Wt) if Wt else f"0 {lit.units['force']}", unit=lit.units["force"],
                      desc=f"total downward load of {label}")
            if with_moment:
                work.calc(M_name, " + ".join(t[1] for t in terms) or f"0 {lit.units['moment']}",
                          unit=lit.units["moment"],
                          desc=f"moment of {label} about {ref_letter} (load × lever arm, clockwise positive)")
        names[case] = (W_name, M_name)
    return names


def _resultants(loads, x_ref):
    return sum(ld.force() for ld in loads), sum(ld.moment_about(x_ref) for ld in loads)


def combo_sum(factors: dict, names: dict, which: int) -> str:
    """'1.2*W_D + 1.6*W_L' — a combination's factored sum of per-case names."""
    parts = []
    for case, f in factors.items():
        n = names[case][which]
        parts.append(n if f == 1.0 else f"{num(f)}*{n}" if f > 0 else f"({num(f)})*{n}")
    return " + ".join(parts)


# ---------------------------------------------------------------- determinate beams


def simple_span(work, setup, res, iA: int, iB: int, lit: Lit):
    """Two vertical supports, no rotational restraint, no hinge: the two equilibrium equations."""
    X = setup.model.nodes
    L = letters(len(X))
    A, B = L[iA], L[iB]
    work.note(f"The beam is statically determinate: supports {A} and {B} carry it, so two equilibrium "
              f"equations give the reactions. Moments are taken about {A}, clockwise positive.", kind="method")
    LAB = f"L_{A}{B}"
    work.calc(LAB, lit(X[iB] - X[iA], "length"), unit=lit.units["length"], desc=f"distance from {A} to {B}")
    names = case_sums(work, setup, X[iA], A, lit)
    for cr in res.combos:
        cb = cr.combo
        RB, RA = f"R_{B}{cb.tag}", f"R_{A}{cb.tag}"
        label = f" ({cb.name})" if len(res.combos) > 1 else ""
        msum = combo_sum(cb.factors, names, 1)
        work.calc(RB, f"({msum})/{LAB}" if " " in msum else f"{msum}/{LAB}", unit=lit.units["force"],
                  desc=f"ΣM about {A} = 0: R_{B}·L_{A}{B} = moment of the loads{label}")
        work.calc(RA, f"{combo_sum(cb.factors, names, 0)} - {RB}", unit=lit.units["force"],
                  desc=f"ΣF_y = 0: R_{A} = total load − R_{B}{label}")
        max_moment_simple(work, setup, cr, iA, iB, RA, RB, lit, label)


def max_moment_simple(work, setup, cr, iA, iB, RA, RB, lit: Lit, label: str):
    """How M_max was found: where the shear changes sign, then the moments of the forces to its left."""
    X = setup.model.nodes
    x0 = cr.M_max.x
    tag = cr.combo.tag
    if cr.M_max.value <= 0:
        work.note(f"No sagging moment{label}: the largest moment is hogging, at a support.")
        return
    at_load = any(abs(x0 - ld.start()) < 1e-9 * setup.model.length for ld in cr.loads if ld.glyph != "line")
    at_node = any(abs(x0 - xn) < 1e-9 * setup.model.length for xn in X)
    how = ("the shear changes sign across the load there" if at_load or at_node
           else "the shear V(x) = 0 there (the root of V on that stretch, found exactly)")
    xn = f"x_0{tag}"
    work.let(xn, lit.q(x0, "length"), unit=lit.units["length"],
             desc=f"position of the largest sagging moment{label}", note=how)
    tol = 1e-9 * setup.model.length
    # forces to the left of x₀; a clockwise couple exactly at x₀ counts too (the maximum is the value just
    # after its upward jump), an anticlockwise one does not (the maximum is the value just before it)
    left = [t for t in (ld.left_term(x0, xn, lit, tol) for ld in cr.loads) if t]
    if len(left) > MAX_TERMS:
        work.let(f"M_0{tag}", lit.q(cr.M_max.value, "moment"), unit=lit.units["moment"],
                 desc=f"largest sagging moment{label}", note="area of the shear diagram from the left end to x₀")
        return
    terms = []
    if X[iA] < x0:
        terms.append(f"{RA}*({xn} - {lit(X[iA], 'length')})" if X[iA] else f"{RA}*{xn}")
    if X[iB] < x0:
        terms.append(f"+ {RB}*({xn} - {lit(X[iB], 'length')})")
    terms.extend(left)
    formula = " ".join(terms).lstrip("+ ")
    work.calc(f"M_0{tag}", formula, unit=lit.units["moment"],
              desc=f"largest sagging moment{label}: moments about x₀ of the forces to its left")


def cantilever(work, setup, res, iF: int, lit: Lit):
    X = setup.model.nodes
    L = letters(len(X))
    F = L[iF]
    right = iF == 0
    work.note(f"The beam is a cantilever, statically determinate: the fixed support {F} carries all of it.",
              kind="method")
    names = case_sums(work, setup, X[iF], F, lit)
    for cr in res.combos:
        cb = cr.combo
        label = f" ({cb.name})" if len(res.combos) > 1 else ""
        work.calc(f"R_{F}{cb.tag}", combo_sum(cb.factors, names, 0), unit=lit.units["force"],
                  desc=f"ΣF_y = 0: the support carries the whole load{label}")
        msum = combo_sum(cb.factors, names, 1)
        if right:  # loads to the right of F: M(F+) = -(ΣW·a + ΣC)
            work.calc(f"M_{F}{cb.tag}", f"-({msum})", unit=lit.units["moment"],
                      desc=f"ΣM about {F} = 0: bending moment at the fixed support (hogging negative){label}")
        else:  # loads to the left: lever arms are negative, M(F-) = ΣW·a' ... = moment about F
            work.calc(f"M_{F}{cb.tag}", msum, unit=lit.units["moment"],
                      desc=f"ΣM about {F} = 0: bending moment at the fixed support (hogging negative){label}")


# ---------------------------------------------------------------- indeterminate beams


def _tiny(v: float, scale: float) -> float:
    return 0.0 if abs(v) < 1e-9 * scale else v


def indeterminate(work, setup, res, degree: int, lit: Lit, hinges: int):
    X = setup.model.nodes
    Ls = letters(len(X))
    u = lit.units
    if degree > 0:
        work.note(f"The beam is statically indeterminate to degree {degree}. Method: direct stiffness, one "
                  f"prismatic Euler–Bernoulli element per span; each span's loads enter as their exact fixed-end "
                  f"actions, the joint rotations and deflections follow from K·d = F (a banded system), and the "
                  f"end actions are k·d plus the fixed-end actions. The result is exact for these loads.",
                  kind="method")
    else:
        work.note(f"The beam is statically determinate ({hinges} internal hinge(s) release as many moments), "
                  f"solved by the direct stiffness method with the hinges as rotation releases; equilibrium is "
                  f"checked below.", kind="method")
    many = len(res.combos) > 1
    rows = []
    for cr in res.combos:
        sM = max(abs(cr.M_max.value), abs(cr.M_min.value), 1e-300)
        sV = max(abs(cr.V_max.value), 1e-300)
        for k, (fe, ends) in enumerate(zip(cr.sol.fixed_end, cr.sol.end_actions)):
            rows.append(([cr.combo.name] if many else []) + [
                f"{Ls[k]}–{Ls[k + 1]}",
                lit.q(_tiny(-fe[1], sM), "moment"), lit.q(_tiny(fe[3], sM), "moment"),
                lit.q(_tiny(ends[0], sV), "force"), lit.q(_tiny(ends[1], sM), "moment"),
                lit.q(_tiny(ends[2], sV), "force"), lit.q(_tiny(ends[3], sM), "moment")])
    if len(rows) <= 80:
        work.table("End actions of each span",
                   (["Combination"] if many else []) +
                   ["Span", "M_FE,left", "M_FE,right", "V_left", "M_left", "V_right", "M_right"], rows,
                   units=([None] if many else []) +
                   [None, u["moment"], u["moment"], u["force"], u["moment"], u["force"], u["moment"]],
                   note="M_FE: fixed-end moments of the span's own loads (factored); then the end actions of the "
                        "solved beam. Moments sagging positive; V is the shear just inside each end.")
    else:
        work.note(f"The end-action table ({len(rows)} rows) is left out for length.")
    if len(res.combos) <= MANY_COMBOS:  # many: the reactions go into the equilibrium table (_equilibrium_table)
        reactions_table(work, setup, res, lit)


def _supports(setup) -> list[int]:
    return [i for i, k in enumerate(setup.kinds) if k in ("pinned", "roller", "fixed", "guided", "spring")]


def _reaction(c, i, lit):
    return lit.q(_tiny(c.sol.reactions[i], max(abs(c.sol.reactions).max(), 1e-300)), "force")


def reactions_table(work, setup, res, lit, sums: list | None = None, title: str = "Reactions (upward positive)"):
    """The reactions of every combination. A few combinations: a row per support, a column per combination.
    Many (more than MANY_COMBOS): a row per combination, a column per support, so that no column group is
    split off; ``sums`` (ΣW, ΣR, ΣW·a, ΣR·a + couples of each combination) then stand beside the reactions."""
    X = setup.model.nodes
    Ls = letters(len(X))
    u = lit.units
    sup = _supports(setup)
    if len(sup) > 40:
        return
    if len(res.combos) > MANY_COMBOS and len(sup) <= 12:
        where = "Supports at x = " + ", ".join(f"{Ls[i]}: {num(lit.value(X[i], 'length'))} {u['length']}"
                                               for i in sup) + "."
        extra = ["ΣW", "ΣR", "ΣW·a", "ΣR·a + couples"] if sums else []
        work.table(title, ["Combination"] + [f"R_{Ls[i]}" for i in sup] + extra,
                   [[c.combo.name] + [_reaction(c, i, lit) for i in sup] + (sums[k] if sums else [])
                    for k, c in enumerate(res.combos)],
                   units=[None] + [u["force"]] * len(sup) + ([u["force"], u["force"], u["moment"], u["moment"]]
                                                            if sums else []),
                   note=where + (" Reactions upward positive. ΣW: the total factored load, ΣW·a its moment "
                                 "(from the loads table); ΣR·a + couples: the moment of the reactions." if sums
                                 else ""))
    else:
        cols = ["Support", "x"] + [f"R, {c.combo.name}" for c in res.combos]
        rows = [[Ls[i], lit.q(X[i], "length")] + [_reaction(c, i, lit) for c in res.combos] for i in sup]
        work.table("Reactions (upward positive)", cols, rows,
                   units=[None, u["length"]] + [u["force"]] * len(res.combos))
    fixed = [i for i in sup if setup.kinds[i] in ("fixed", "guided")]
    if fixed:
        work.table("Support moments (bending moment in the member at the support, sagging positive)",
                   ["Support"] + [c.combo.name for c in res.combos],
                   [[Ls[i]] + [lit.q(c.support_M[i], "moment") for c in res.combos] for i in fixed],
                   units=[None] + [u["moment"]] * len(res.combos))


def equilibrium_check(work, setup, res, lit: Lit):
    """ΣF_y and ΣM of the solved reactions against the loads, for each combination."""
    X = setup.model.nodes
    Ls = letters(len(X))
    sup = [i for i, k in enumerate(setup.kinds) if k in ("pinned", "roller", "fixed")]
    iA = sup[0] if sup else 0
    A = Ls[iA]
    work.note(f"Equilibrium of the result: the reactions in the table must balance the factored loads, in force "
              f"and in moment about {A}.", kind="method")
    if len(res.combos) > MANY_COMBOS:
        _equilibrium_table(work, setup, res, lit, X, iA, A)
        return
    names = case_sums(work, setup, X[iA], A, lit)
    fu, mu = lit.units["force"], lit.units["moment"]
    for cr in res.combos:
        tag = cr.combo.tag
        label = f" ({cr.combo.name})" if len(res.combos) > 1 else ""
        work.let(f"R_sum{tag}", lit.q(cr.sol.reactions.sum(), "force"), unit=fu,
                 desc=f"sum of the reactions{label}", note="ΣR over the reactions table")
        mo = float((cr.sol.reactions * (X - X[iA])).sum() + cr.sol.reaction_moments.sum())
        work.let(f"M_R{tag}", lit.q(mo, "moment"), unit=mu, desc=f"moment of the reactions about {A}{label}",
                 note="Σ R·a + support couples, anticlockwise positive")
        work.calc(f"W_tot{tag}", combo_sum(cr.combo.factors, names, 0), unit=fu, desc=f"total factored load{label}")
        work.calc(f"M_W{tag}", combo_sum(cr.combo.factors, names, 1), unit=mu,
                  desc=f"moment of the factored loads about {A}, clockwise positive{label}")
        work.check(f"abs(R_sum{tag} - W_tot{tag}) <= 1e-6*(abs(W_tot{tag}) + 1 {fu})",
                   desc=f"ΣF_y = 0{label}")
        work.check(f"abs(M_R{tag} - M_W{tag}) <= 1e-6*(abs(M_W{tag}) + 1 {mu})",
                   desc=f"ΣM about {A} = 0{label}")


def _equilibrium_table(work, setup, res, lit: Lit, X, iA: int, A: str):
    """Many combinations: the reactions, ΣF_y and ΣM of each in one table (a row per combination), and the
    largest residual checked in the working."""
    fu, mu = lit.units["force"], lit.units["moment"]
    case_loads = setup.case_loads()
    sums, worst = [], None
    for cr in res.combos:
        W = sum(f * ld.force() for c, f in cr.combo.factors.items() for ld in case_loads.get(c, []))
        MW = sum(f * ld.moment_about(X[iA]) for c, f in cr.combo.factors.items() for ld in case_loads.get(c, []))
        R = float(cr.sol.reactions.sum())
        MR = float((cr.sol.reactions * (X - X[iA])).sum() + cr.sol.reaction_moments.sum())
        sums.append([lit.q(W, "force"), lit.q(R, "force"), lit.q(MW, "moment"), lit.q(MR, "moment")])
        rel = max(abs(R - W) / (abs(W) + 1e3), abs(MR - MW) / (abs(MW) + 1e3))
        if worst is None or rel > worst[0]:
            worst = (rel, cr, W, R, MW, MR)
    title = (f"Equilibrium by combination: the reactions, and their sum against the factored loads (moments about "
             f"{A}, clockwise positive)")
    if len(_supports(setup)) <= 12:
        reactions_table(work, setup, res, lit, sums=sums, title=title)
    else:  # too many supports to stand beside the sums: the reactions in their own table
        reactions_table(work, setup, res, lit)
        work.table(title, ["Combination", "ΣW", "ΣR", "ΣW·a", "ΣR·a + couples"],
                   [[cr.combo.name] + row for cr, row in zip(res.combos, sums)], units=[None, fu, fu, mu, mu])
    _, cr, W, R, MW, MR = worst
    work.let("W_tot", lit.q(W, "force"), unit=fu, desc=f"total factored load ({cr.combo.name}, the largest "
                                                          f"residual in the table)", note="Σ factor × load")
    work.let("R_sum", lit.q(R, "force"), unit=fu, desc=f"sum of the reactions ({cr.combo.name})",
             note="ΣR over the reactions")
    work.let("M_W", lit.q(MW, "moment"), unit=mu, desc=f"moment of the factored loads about {A} ({cr.combo.name})",
             note="Σ factor × load × lever arm")
    work.let("M_R", lit.q(MR, "moment"), unit=mu, desc=f"moment of the reactions about {A} ({cr.combo.name})",
             note="Σ R·a + support couples")
    work.check(f"abs(R_sum - W_tot) <= 1e-6*(abs(W_tot) + 1 {fu})", desc="ΣF_y = 0 (every combination in the table)")
    work.check(f"abs(M_R - M_W) <= 1e-6*(abs(M_W) + 1 {mu})", desc=f"ΣM about {A} = 0 (every combination)")


def write(work, setup, res, lit: Lit):
    kinds = setup.kinds
    vert = [i for i, k in enumerate(kinds) if k in ("pinned", "roller", "fixed")]
    rot = [i for i, k in enumerate(kinds) if k in ("fixed", "guided")]
    hinges = sum(1 for k in kinds if k == "hinge")
    elastic = setup.model.springs or setup.model.settlement
    r = len(vert) + len(rot) + sum((k > 0) + (kt > 0) for k, kt in setup.model.springs.values())
    degree = r - 2 - hinges
    if elastic:
        work.note("Elastic supports and prescribed settlements: a spring's force is its stiffness times the "
                  "movement of its support, and a settled support moves by the amount given; both enter the "
                  "stiffness matrix directly, so E and I govern the forces as well as the deflections.",
                  kind="method")
        indeterminate(work, setup, res, max(degree, 1), lit, hinges)
        equilibrium_check(work, setup, res, lit)
    elif hinges == 0 and not rot and len(vert) == 2:
        simple_span(work, setup, res, vert[0], vert[1], lit)
    elif hinges == 0 and len(vert) == 1 and rot == vert and vert[0] in (0, len(kinds) - 1):
        cantilever(work, setup, res, vert[0], lit)
    else:
        indeterminate(work, setup, res, degree, lit, hinges)
        equilibrium_check(work, setup, res, lit)
    for cr in res.combos:
        handbook.cross_check(work, setup, cr, lit, len(res.combos) > 1)
