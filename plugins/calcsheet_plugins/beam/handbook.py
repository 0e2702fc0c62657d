"""Handbook cross-checks: when a combination is a standard case, show its closed-form formulas.

Why: a reviewer trusts a program more when the textbook formula, with the same
numbers substituted, lands on the same value. Cases and formulas: AISC Steel
Construction Manual, Table 3-23 "Shears, Moments and Deflections" (case
numbers from memory); the same formulas appear in Roark's Formulas for Stress
and Strain, Table 8.1.
"""
from __future__ import annotations

import re
import tomllib
from pathlib import Path

from .kinds import LineLoad, MomentLoad, PointLoad

SIMPLE = ("pinned", "roller")


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


def _load_data() -> dict:
    with (Path(__file__).with_name("handbook.toml")).open("rb") as fh:
        return tomllib.load(fh)


DATA = _load_data()
SOURCE = DATA["source"]
CASES = DATA["case"]


def symbolic(formula: str) -> str:
    """A formula as printed beside the check: '5*w*L^4/(384*EI)' -> '5·w·L⁴/(384·EI)'."""
    out = formula.replace("*", "·")
    for k, v in _SUPERSCRIPT.items():
        out = out.replace("^" + k, v)
    return out


def describe(check: dict) -> str:
    text = symbolic(check["formula"])
    if check.get("note"):
        text += f" ({check['note']})"
    return text + check.get("suffix", "")


_SUPERSCRIPT = {"2": "²", "3": "³", "4": "⁴"}
_NAME = re.compile(r"[A-Za-z_][A-Za-z_0-9]*")


def substitute(formula: str, subs: dict[str, str]) -> str:
    """The formula with each value name replaced by its literal (parenthesised, so a power applies to it all)."""
    def one(m):
        v = subs.get(m.group(0))
        if v is None:
            return m.group(0)
        return v if v.startswith("(") else f"({v})"
    return _NAME.sub(one, formula)


# ---------------------------------------------------------------- matchers: recognise a case, give its values
# Each returns None, or (values in SI, support indices named in `solver` keys such as R[fixed]).


def simple_udl(model, kinds, w, points, EI):
    if len(model.spans) == 1 and kinds[0] in SIMPLE and kinds[1] in SIMPLE and w and not points:
        return {"w": w, "L": model.length, "EI": EI}, {}


def simple_central_point(model, kinds, w, points, EI):
    L = model.length
    if (len(model.spans) == 1 and kinds[0] in SIMPLE and kinds[1] in SIMPLE and len(points) == 1 and not w
            and abs(points[0].x - L / 2) <= 1e-9 * L):
        return {"P": points[0].P, "L": L, "EI": EI}, {}


def simple_point(model, kinds, w, points, EI):
    L = model.length
    if (len(model.spans) == 1 and kinds[0] in SIMPLE and kinds[1] in SIMPLE and len(points) == 1 and not w
            and abs(points[0].x - L / 2) > 1e-9 * L and 0 < points[0].x < L):
        a = points[0].x
        return {"P": points[0].P, "L": L, "EI": EI, "a": a, "b": L - a}, {}


def _cantilever(model, kinds):
    if len(model.spans) == 1 and sorted(kinds) == ["fixed", "free"]:
        return 0 if kinds[0] == "fixed" else 1
    return None


def cantilever_end_point(model, kinds, w, points, EI):
    iF = _cantilever(model, kinds)
    L = model.length
    if iF is not None and len(points) == 1 and not w:
        tip = L if iF == 0 else 0.0
        if abs(points[0].x - tip) <= 1e-9 * L:
            return {"P": points[0].P, "L": L, "EI": EI}, {"fixed": iF}


def cantilever_udl(model, kinds, w, points, EI):
    iF = _cantilever(model, kinds)
    if iF is not None and w and not points:
        return {"w": w, "L": model.length, "EI": EI}, {"fixed": iF}


def fixed_fixed_udl(model, kinds, w, points, EI):
    if len(model.spans) == 1 and kinds == ["fixed", "fixed"] and w and not points:
        return {"w": w, "L": model.length, "EI": EI}, {}


def propped_udl(model, kinds, w, points, EI):
    if (len(model.spans) == 1 and "fixed" in kinds and (kinds[0] in SIMPLE or kinds[1] in SIMPLE) and w
            and not points):
        iF = kinds.index("fixed")
        return {"w": w, "L": model.length}, {"fixed": iF, "simple": 1 - iF}


def two_equal_spans_udl(model, kinds, w, points, EI):
    if (len(model.spans) == 2 and all(k in SIMPLE for k in kinds)
            and abs(model.spans[0] - model.spans[1]) <= 1e-9 * model.length and w and not points):
        return {"w": w, "L": model.spans[0]}, {}


def overhang_end_point(model, kinds, w, points, EI):
    if (len(model.spans) == 2 and not w and len(points) == 1 and kinds[0] in SIMPLE and kinds[1] in SIMPLE
            and kinds[2] == "free" and abs(points[0].x - model.length) <= 1e-9 * model.length):
        return {"P": points[0].P, "L": model.spans[0], "a": model.spans[1], "EI": EI}, {}


def cases(model, kinds, loads):
    """(case from handbook.toml, values, support indices) for the first case this beam and load match, or None."""
    if len(set(model.EI)) != 1:
        return None
    w, points, others = _classify(model, kinds, loads)
    if others:
        return None
    for case in CASES:
        found = globals()[case["match"]](model, kinds, w, points, model.EI[0])
        if found:
            return case, found[0], found[1]
    return None


_SOLVER_KEY = re.compile(r"(?:R\[(\w+)\]|M_max|-M_min|\|M\||\|delta\||delta\(x=(\w+)\))\Z")


def solver_value(cr, key: str, values: dict, supports: dict) -> float:
    """The solver's value named by a check's `solver` key (see handbook.toml)."""
    m = _SOLVER_KEY.match(key)
    if not m:
        raise KeyError(key)
    if key.startswith("R["):
        i = m.group(1)
        return float(cr.sol.reactions[supports[i] if i in supports else int(i)])
    if key == "M_max":
        return cr.M_max.value
    if key == "-M_min":
        return -cr.M_min.value
    if key == "|M|":
        return max(abs(cr.M_max.value), abs(cr.M_min.value))
    if key == "|delta|":
        return abs(cr.d_max.value)
    at = m.group(2)
    x = cr.sol.model.length if at == "end" else values[at]
    return float(cr.sol.at("delta", x, side="left")[0])


def literal(lit, v_si: float, what: str, sig: int = 6) -> str:
    """A value as a sheet literal in the sheet's display unit, to ``sig`` significant figures: short enough to
    read and check by hand (1.46438e7 kip*in^2, not 14643791.67), exact enough for the 1e-4 agreement."""
    val = lit.value(v_si, what)
    text = f"{val:.{sig}g}"
    if "e" in text:
        mant, exp = text.split("e")
        text = f"{mant}e{int(exp)}"
    s = f"{text} {lit.units[what]}"
    return f"({s})" if val < 0 else s


def cross_check(work, setup, cr, lit, many: bool):
    found = cases(setup.model, setup.kinds, cr.loads)
    if not found:
        return
    case, values, supports = found
    tag = cr.combo.tag
    label = f" ({cr.combo.name})" if many else ""
    kinds_of = {"w": "line", "P": "force", "L": "length", "a": "length", "b": "length", "EI": "EI"}
    subs = {k: literal(lit, v, kinds_of[k]) for k, v in values.items()}
    work.note(f"Cross-check{label}: this is a standard case — {case['title']}, {SOURCE}.", kind="method")
    for check in case["checks"]:
        what = check["unit"]
        if what == "defl" and not setup.stiff:
            continue
        n = f"{check['name']}{tag}"
        text = describe(check)
        work.calc(n, substitute(check["formula"], subs), unit=lit.units[what], desc=f"handbook: {text}")
        solver = solver_value(cr, check["solver"], values, supports)
        s_name = f"{check['name'].replace('_hb', '_sol')}{tag}"
        work.let(s_name, lit.q(solver, what), unit=lit.units[what], desc="the same value from the stiffness solution",
                 note="the stiffness solution's result, tabulated above")
        work.check(f"abs({n} - {s_name}) <= 1e-4*abs({n})", desc=f"the stiffness solution agrees with {text}")
