"""Generate a standard set's combinations from the sheet's named load cases. Pure: data in, combinations out.

Why data: the factors, ψ values and clauses live in sets.toml and actions.toml
with their source and edition; this module only applies the rules every set
states — each variable action leading in turn, permanent actions unfavourable
and favourable, accompanying actions present or absent, "one of" groups —
and removes duplicates.
"""
from __future__ import annotations

import itertools
import math
import re
import tomllib
from dataclasses import dataclass, field
from pathlib import Path

from calcsheet.suggest import did_you_mean

_HERE = Path(__file__).parent


def _load(name: str) -> dict:
    with (_HERE / name).open("rb") as fh:
        return tomllib.load(fh)


SETS = _load("sets.toml")
ACTIONS = _load("actions.toml")
KINDS: dict[str, dict] = ACTIONS["kind"]
SCALES: dict[str, list[str]] = ACTIONS["scales"]
EN = SETS["en1990"]
SET_NAMES = tuple(SETS["set"])
_CANONICAL = {k.lower(): k for k in KINDS}  # "imposed b" and "imposed  B" mean "imposed B"


class CombinationError(ValueError):
    """Bad input to a combination set; ``param`` names the sheet parameter at fault."""

    def __init__(self, message: str, param: str | None = None):
        super().__init__(message)
        self.param = param


@dataclass(frozen=True)
class Case:
    name: str
    kind: str

    @property
    def family(self) -> str:
        return KINDS[self.kind]["family"]

    def psi(self, i: int) -> float:
        return float(KINDS[self.kind].get("psi", [1.0, 1.0, 1.0])[i])


@dataclass
class Combination:
    name: str
    factors: dict[str, float]  # case -> factor, in the order the cases were given
    clause: str
    standard: str
    set: str
    limit_state: str
    leading: str = ""  # leading variable case ("" when none)
    leading_kind: str = ""
    duration: str = ""  # shortest load-duration class among the actions present
    duration_scale: str = ""
    pattern: list[str] = field(default_factory=list)  # variable cases to pattern span by span
    note: str = ""  # e.g. "G favourable"

    @property
    def text(self) -> str:
        return factor_text(self.factors)


def num(v: float) -> str:
    s = f"{v:.6g}"
    return s


def factor_text(factors: dict[str, float]) -> str:
    """'1.35 G + 1.5 Q' (factor 1 written as the bare name)."""
    parts = []
    for i, (c, f) in enumerate(factors.items()):
        term = c if f == 1.0 else f"{num(abs(f))} {c}"
        parts.append(("- " if f < 0 else "") + term if i == 0 else ("- " if f < 0 else "+ ") + term)
    return " ".join(parts)


_ITEM = re.compile(r"\s*([A-Za-z][A-Za-z0-9]*)\s*(?::\s*([A-Za-z][A-Za-z0-9 -]*?))?\s*\Z")


def parse_cases(text: str, set_name: str) -> list[Case]:
    """'G, Q1: imposed E, W: wind' or 'D, L, S' -> cases with their kinds."""
    standard = "ASCE 7" if set_name.startswith("ASCE") else "EN 1990"
    if len(text) > 2000:
        raise CombinationError("the case list is too long", "cases")
    out: list[Case] = []
    for item in [t for t in text.split(",")]:
        if not item.strip():
            raise CombinationError("an empty entry in the case list; write e.g. \"G, Q: imposed B\"", "cases")
        m = _ITEM.match(item)
        if not m:
            raise CombinationError(f"cannot read {item.strip()!r}; write a case name, optionally followed by "
                                   f"':' and its kind, e.g. \"Q1: imposed B\"", "cases")
        name, kind = m.group(1), (m.group(2) or "").strip()
        if not kind:
            kind = _kind_from_name(name, standard)
        kind = _CANONICAL.get(" ".join(kind.split()).lower(), kind)
        if kind not in KINDS:
            hint = did_you_mean(kind, KINDS, quote='"')
            raise CombinationError(f"case {name}: unknown kind {kind!r}" +
                                   (f" ({hint})" if hint else "") +
                                   "; kinds: " + ", ".join(k for k in KINDS if KINDS[k]["standard"] == standard),
                                   "cases")
        if KINDS[kind]["standard"] != standard:
            raise CombinationError(f"case {name}: kind {kind!r} belongs to {KINDS[kind]['standard']}, but the set "
                                   f"{set_name!r} is {standard}", "cases")
        if any(c.name == name for c in out):
            raise CombinationError(f"case {name} is listed twice", "cases")
        out.append(Case(name, kind))
    if not out:
        raise CombinationError("give at least one case", "cases")
    return out


def _kind_from_name(name: str, standard: str) -> str:
    if standard == "ASCE 7":
        # a case named by its ASCE 7 symbol (D, L, Lr, S, R, W, E), optionally followed by digits: L2
        base = re.sub(r"\d+\Z", "", name)
        if base in KINDS and KINDS[base]["standard"] == standard:
            return base
        raise CombinationError(f"case {name}: name it by its ASCE 7 symbol (D, L, Lr, S, R, W, E, optionally with "
                               f"a number: L2) or give its kind: \"{name}: L\"", "cases")
    if re.fullmatch(r"G\d*", name):
        return "permanent"
    raise CombinationError(f"case {name}: give its kind, e.g. \"{name}: imposed B\" (imposed A–H, snow, snow high, "
                           f"wind, temperature) or \"{name}: permanent\"", "cases")


# ---------------------------------------------------------------- generation


def generate(set_name: str, cases: list[Case]) -> list[Combination]:
    if set_name not in SETS["set"]:
        hint = did_you_mean(set_name, SET_NAMES, quote='"')
        raise CombinationError(f"unknown combination set {set_name!r}" +
                               (f" ({hint})" if hint else "") + "; sets: " +
                               ", ".join(SET_NAMES), "set")
    spec = SETS["set"][set_name]
    raw = _asce(spec, cases) if "combination" in spec else _en(spec, cases)
    out: list[Combination] = []
    seen: set[tuple] = set()
    for cb in raw:
        key = tuple(sorted((c, round(f, 12)) for c, f in cb.factors.items() if f != 0))
        if not key or key in seen:
            continue
        seen.add(key)
        cb.factors = {c: f for c, f in cb.factors.items() if f != 0}
        out.append(cb)
    for i, cb in enumerate(out, 1):
        cb.name = f"{spec['prefix']}{i}"
        cb.set = set_name
        cb.standard = spec["standard"]
        cb.limit_state = spec["limit_state"]
        _describe(cb, cases, spec)
    return out


def _describe(cb: Combination, cases: list[Case], spec: dict) -> None:
    by = {c.name: c for c in cases}
    variable = [c for c in cb.factors if by[c].family == "variable"]
    if not cb.leading and variable:
        lead = max(variable, key=lambda c: cb.factors[c])  # the principal load: largest factor, first on ties
        cb.leading = lead
    if cb.leading:
        cb.leading_kind = by[cb.leading].kind
    # the shortest duration among the actions present, on the scale of their standard
    durations = [(KINDS[by[c].kind]["scale"], KINDS[by[c].kind]["duration"]) for c in cb.factors]
    durations = [(s, d) for s, d in durations if d]
    if durations:
        scale = durations[0][0]
        order = SCALES[scale]
        cb.duration = max((d for s, d in durations if s == scale), key=order.index)
        cb.duration_scale = scale
    cb.pattern = variable if spec.get("pattern") else []


def _asce(spec: dict, cases: list[Case]) -> list[Combination]:
    by_kind: dict[str, list[str]] = {}
    for c in cases:
        by_kind.setdefault(c.kind, []).append(c.name)
    out = []
    order = {c.name: i for i, c in enumerate(cases)}
    for tpl in spec["combination"]:
        groups = []
        for group in tpl.get("either", []):
            present = [alt for alt in group if any(k in by_kind for k in alt)]
            groups.append(present or [{}])
        for choice in itertools.product(*groups) if groups else [()]:
            kinds = dict(tpl["factors"])
            for alt in choice:
                kinds.update(alt)
            factors = {}
            for k, f in kinds.items():
                for name in by_kind.get(k, []):
                    factors[name] = float(f)
            factors = dict(sorted(factors.items(), key=lambda kv: order[kv[0]]))
            out.append(Combination("", factors, f"{spec['standard']} {tpl['clause']}", "", "", ""))
    return out


def _product(names: list[str], case: Case | None = None) -> float:
    v = 1.0
    for n in names:
        if n.startswith("psi_"):
            v *= case.psi(int(n[-1]))
        else:
            v *= float(EN[n])
    return v


def _en(spec: dict, cases: list[Case]) -> list[Combination]:
    perm = [c for c in cases if c.family == "permanent"]
    var = [c for c in cases if c.family == "variable"]
    order = {c.name: i for i, c in enumerate(cases)}
    out = []
    for tpl in spec["template"]:
        leads = var if "leading" in tpl else [None]
        if not leads:
            leads = [None]
        for p_i, p in enumerate(tpl["permanent"]):
            for lead in leads:
                others = [c for c in var if c is not lead]
                # accompanying actions all present, and (where there are any) all absent: a variable action
                # that is favourable counts with factor 0 (Table A1.2(B) note; 6.4.3.2)
                for with_others in ([True, False] if others and lead is not None else [True]):
                    factors = {c.name: _product(p) for c in perm}
                    if lead is not None:
                        factors[lead.name] = _product(tpl["leading"], lead)
                    if with_others:
                        for c in others:
                            factors[c.name] = _product(tpl["accompanying"], c)
                    factors = {k: round(v, 12) for k, v in sorted(factors.items(), key=lambda kv: order[kv[0]])}
                    note = []
                    if len(tpl["permanent"]) > 1:
                        note.append("G unfavourable" if p_i == 0 else "G favourable")
                    if others and lead is not None and not with_others:
                        note.append("accompanying actions absent")
                    out.append(Combination("", factors, f"{spec['standard']} {tpl['clause']}", "", "", "",
                                           leading=lead.name if lead is not None else "",
                                           note="; ".join(note)))
    return out


def is_close(a: float, b: float) -> bool:
    return math.isclose(a, b, rel_tol=1e-12, abs_tol=1e-12)
