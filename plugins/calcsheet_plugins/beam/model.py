"""From the sheet's arguments to a solver model: supports, stiffness, loads, cases, combinations.

Why its own module: every rule about what a sheet may say (a load past the
end of its span, a combination naming a case nobody loaded) lives here, with
the parameter to blame, before any arithmetic happens.
"""
from __future__ import annotations

from dataclasses import dataclass, field

from calcsheet.units import Quantity
from calcsheet.suggest import did_you_mean

from .combos import parse_factors
from .kinds import KINDS, Place
from .solver import SUPPORT_KINDS, BeamInputError, Model

UNITS = {
    "SI": dict(force="kN", moment="kN*m", length="m", defl="mm", line="kN/m", EI="kN*m^2", stress="MPa",
               inertia="mm^4", modulus="GPa"),
    "US": dict(force="kip", moment="kip*ft", length="ft", defl="in", line="kip/ft", EI="kip*in^2", stress="ksi",
               inertia="in^4", modulus="ksi"),
}
_SI_OF = dict(force="N", moment="N*m", length="m", defl="m", line="N/m", EI="N*m^2", stress="Pa",
              inertia="m^4", modulus="Pa")


def letters(n: int) -> list[str]:
    out = []
    for i in range(n):
        s, k = "", i
        while True:
            s = chr(65 + k % 26) + s
            k = k // 26 - 1
            if k < 0:
                break
        out.append(s)
    return out


def parse_supports(supports) -> list[str]:
    if isinstance(supports, str):
        items = [s for s in supports.replace(",", " ").split() if s]
    else:
        items = [str(s) for s in supports]
    for i, s in enumerate(items, 1):
        if s not in SUPPORT_KINDS:
            hint = did_you_mean(s, SUPPORT_KINDS, quote='"')
            hint = f" ({hint})" if hint else ""
            raise BeamInputError(f"support {i} is \"{s}\"{hint}; use " + ", ".join(SUPPORT_KINDS), "supports")
    return items


@dataclass
class SheetLoad:
    """One load as the sheet gave it, and its solver form (SI floats, beam coordinates)."""

    index: int
    record: object
    kind: str
    case: str
    solver: object


@dataclass
class Combination:
    name: str
    factors: dict[str, float]
    text: str
    tag: str  # suffix for names in the working ("" when there is only one)
    clause: str = ""  # standard and clause (generated combinations)
    set: str = ""  # the set it was generated from
    leading: str = ""
    leading_kind: str = ""
    duration: str = ""
    pattern: list[str] = field(default_factory=list)  # variable cases to load span by span
    loaded: str = ""  # "spans 1, 3" for a pattern variant
    note: str = ""
    parent: str = ""  # the combination a pattern variant comes from

    def named(self, name: str) -> bool:
        """Is this (one of) the combination(s) a sheet means by name: its own, its set's or its parent's."""
        return name in (self.name, self.set, self.parent)


def span_patterns(n: int) -> list[tuple[str, tuple[int, ...]]]:
    """Skip-loading arrangements of a line of n spans (1-based): all spans, alternate spans (odd, even),
    each pair of adjacent spans. Alternate spans give the largest span moments, adjacent pairs the largest
    hogging at the support between them (EN 1992-1-1 5.1.3(1)P; ASCE/SEI 7-22 4.3.3 partial loading)."""
    out: list[tuple[str, tuple[int, ...]]] = []
    seen = set()
    cands = [tuple(range(1, n + 1)), tuple(range(1, n + 1, 2)), tuple(range(2, n + 1, 2))]
    cands += [(k, k + 1) for k in range(1, n)]
    for c in cands:
        if c and c not in seen:
            seen.add(c)
            out.append(("spans " + ", ".join(map(str, c)), c))
    return out


def split_case(case: str, k: int) -> str:
    """The name of case's loads on span k alone (a pattern variant); '_' cannot occur in a sheet's case name."""
    return f"{case}_s{k}"


@dataclass
class Setup:
    model: Model
    kinds: list[str]
    loads: list[SheetLoad]
    combos: list[Combination]
    system: str
    I_si: list[float]
    E_si: list[float]
    default_combo: bool = False
    notes: list[str] = field(default_factory=list)
    split: dict[str, list] = field(default_factory=dict)  # pattern cases: "Q_s2" -> Q's loads on span 2
    stiff: bool = True  # False: a determinate beam given no E or I (forces only; no deflections)

    def used_cases(self) -> set[str]:
        return {c for cb in self.combos for c in cb.factors}

    @property
    def units(self) -> dict:
        return UNITS[self.system]

    def case_loads(self) -> dict[str, list]:
        out: dict[str, list] = {}
        for ld in self.loads:
            out.setdefault(ld.case, []).append(ld.solver)
        out.update(self.split)
        return out


class SolvedBeam:
    """The solved beam carried in a beam.solve result (field ``model``) for beam.at and beam.result.

    Not a value a sheet computes with: outputs (JSON, diffs) skip it, as they skip every non-quantity,
    non-text field."""

    def __init__(self, setup, results):
        self.setup = setup
        self.results = results

    def __str__(self) -> str:
        return f"solved beam ({len(self.results.combos)} combination(s))"

    __repr__ = __str__


def si(q, what: str) -> float:
    return float(q.m_as(_SI_OF[what]))


def build(work, spans, supports, loads, combos, E, I, I_spans, material, section,
          combinations=None, springs=None, settlement=None) -> Setup:
    system = "US" if str(work.settings.get("system", "SI")).upper() == "US" else "SI"
    span_si = [si(s, "length") for s in spans]
    kinds = parse_supports(supports)
    n = len(span_si)

    # stiffness: needed for deflections, and for the forces of an indeterminate beam
    spring_of, settle_of = _elastic(springs, settlement, kinds)
    no_E = E is None and material is None
    no_I = I is None and I_spans is None and section is None
    stiff = True
    if no_E or no_I:
        degree = (sum(k in ("pinned", "roller", "fixed") for k in kinds) + sum(k in ("fixed", "guided") for k in kinds)
                  - 2 - sum(k == "hinge" for k in kinds))
        missing = " and ".join(w for w, m in (("E (or material=…)", no_E), ("I (or section=…)", no_I)) if m)
        if spring_of or settle_of or "spring" in kinds:
            raise BeamInputError(f"springs and settlements make the forces depend on the stiffness: give {missing}",
                                 "E" if no_E else "I")
        if degree != 0:
            raise BeamInputError(f"the beam is statically indeterminate (degree {degree}): its reactions depend "
                                 f"on its stiffness; give {missing}", "E" if no_E else "I")
        # statically determinate: statics gives the forces, whatever the stiffness (deflections are not computed)
        stiff = False
        if not no_E and E is None:
            E = material.get("E")
        E = E if E is not None else Quantity(1.0, "Pa")  # any value: statics does not read it
        if no_I:
            I_spans, I = None, Quantity(1.0, "m^4")
    if E is None:
        E = material.get("E")
    if I_spans is not None:
        if I is not None:
            raise BeamInputError("give either I (one value) or I_spans (one per span), not both", "I_spans")
        if len(I_spans) != n:
            raise BeamInputError(f"I_spans has {len(I_spans)} values for {n} span(s)", "I_spans")
        I_si = [si(v, "inertia") for v in I_spans]
    else:
        if I is None:
            I = section.get("I_x")
        I_si = [si(I, "inertia")] * n
    E_val = si(E, "modulus")
    if not E_val > 0:
        raise BeamInputError(f"E must be greater than zero, got {E_val:g} Pa", "E")
    for k, v in enumerate(I_si, 1):
        if not v > 0:
            raise BeamInputError(f"I of span {k} must be greater than zero", "I_spans" if I_spans is not None else "I")
    for i, kind in enumerate(kinds):
        if kind == "spring" and not spring_of.get(i, (0, 0))[0]:
            raise BeamInputError(f"support {letters(len(kinds))[i]} is a spring: give its stiffness with "
                                 f"springs=[beam.spring(at=\"{letters(len(kinds))[i]}\", k=…)]", "springs")
    model = Model(span_si, kinds, [E_val * v for v in I_si], spring_of, settle_of)

    # loads
    X = model.nodes
    items = loads if isinstance(loads, (tuple, list)) else (loads,)
    sheet_loads = []
    for idx, rec in enumerate(items, 1):
        sheet_loads.append(_load(rec, idx, X, model.length))
    if not sheet_loads:
        raise BeamInputError("give at least one load", "loads")

    # combinations
    cases = sorted({ld.case for ld in sheet_loads})
    combo_list: list[Combination] = []
    default = False
    citems = list(combos if isinstance(combos, (tuple, list)) else (combos,)) if combos else []
    generated = []
    for rec in (combinations if isinstance(combinations, (tuple, list)) else (combinations,)) if combinations else []:
        generated.extend(rec.get(f"combo_{i}") for i in range(1, int(rec.get("n").m_as("")) + 1))
    if citems or generated:
        for ld in sheet_loads:
            if not ld.case:
                raise BeamInputError(f"load {ld.index} has no case; give it case=\"…\" so the combinations can "
                                     f"factor it", "loads")
        names = set()
        for k, rec in enumerate(citems + generated, 1):
            name = rec.get("name")
            text = rec.get("factors")
            param = "combos" if k <= len(citems) else "combinations"
            try:
                factors = parse_factors(text)
            except ValueError as exc:
                raise BeamInputError(f"combination {name!r}: {exc}", param)
            extra = {f: rec.fields.get(f, "") for f in ("clause", "set", "leading", "leading_kind", "duration",
                                                         "note")}
            pattern = [c.strip() for c in rec.fields.get("pattern", "").split(",") if c.strip()]
            if k > len(citems):
                # a generated set may name cases this member does not carry: they contribute nothing here
                factors = {c: f for c, f in factors.items() if c in cases}
                if not factors:
                    continue
                text = " + ".join(c if f == 1.0 else f"{f:g} {c}" for c, f in factors.items()).replace("+ -", "- ")
            for c in factors:
                if c not in cases:
                    raise BeamInputError(f"combination {name!r} names case {c!r}, which no load has "
                                         f"(cases: {', '.join(cases)})", param)
            if name in names:
                raise BeamInputError(f"two combinations are named {name!r}"
                                     + (" (give each set once)" if k > len(citems) else ""), param)
            names.add(name)
            combo_list.append(Combination(name, factors, text, "", pattern=[c for c in pattern if c in factors],
                                          **extra))
        used = {c for cb in combo_list for c in cb.factors}
        for c in cases:
            if c not in used:
                work.warn(f"no combination uses the loads of case {c!r}", param="combos" if citems else "combinations")
    else:
        default = True
        text = " + ".join(c for c in cases) if any(cases) else ""
        combo_list.append(Combination("all loads" if len(cases) > 1 else (cases[0] or "loads"),
                                      {c: 1.0 for c in cases}, text, ""))
    split: dict[str, list] = {}
    expanded = _patterns(combo_list, sheet_loads, model) if n > 1 else None
    if expanded is not None:
        combo_list, split = expanded
    if len(combo_list) > 1:
        for k, cb in enumerate(combo_list, 1):
            safe = "".join(ch for ch in cb.name if ch.isalnum())
            cb.tag = "_" + (safe if safe and safe[0].isalpha() and len(safe) <= 8 else str(k))
        tags = [cb.tag for cb in combo_list]
        if len(set(tags)) != len(tags):
            for k, cb in enumerate(combo_list, 1):
                cb.tag = f"_{k}"
    return Setup(model, kinds, sheet_loads, combo_list, system, I_si, [E_val] * n, default, split=split,
                 stiff=stiff)


def _load(rec, idx: int, X, L: float) -> SheetLoad:
    kind = rec.get("kind")
    case = rec.get("case")
    k = int(round(float(rec.get("span").m_as(""))))
    nspan = len(X) - 1
    where = f"load {idx} ({kind})"
    if k > nspan:
        raise BeamInputError(f"{where} is on span {k}, but the beam has {nspan} span(s)", "loads")
    if k:
        x0, x1 = float(X[k - 1]), float(X[k])
        region = f"span {k} ({x1 - x0:g} m long)"
    else:
        x0, x1 = 0.0, L
        region = f"the beam ({L:g} m long)"
    cls = KINDS.get(kind)
    if cls is None:
        raise BeamInputError(f"load {idx} is not a beam load", "loads")
    s = cls.from_record(rec, Place(x0, x1, where, region, 1e-9 * L, BeamInputError), BeamInputError)
    return SheetLoad(idx, rec, kind, case, s)


def _patterns(combos: list[Combination], sheet_loads, model):
    """Expand each combination with patterned variable cases into its span-by-span variants."""
    if not any(cb.pattern for cb in combos):
        return None
    X = model.nodes
    n = len(model.spans)
    tol = 1e-9 * model.length
    split: dict[str, list] = {}
    out: list[Combination] = []
    seen = {tuple(sorted(cb.factors.items())) for cb in combos}
    for cb in combos:
        if not cb.pattern:
            out.append(cb)
            continue
        for j, (label, spans) in enumerate(span_patterns(n)):
            if len(spans) == n:
                out.append(cb)
                continue
            factors = {}
            for c, f in cb.factors.items():
                if c not in cb.pattern:
                    factors[c] = f
                    continue
                for k in spans:
                    name = split_case(c, k)
                    if name not in split:
                        split[name] = [p for ld in sheet_loads if ld.case == c
                                       for p in [ld.solver.on_span(float(X[k - 1]), float(X[k]), k == n, tol)] if p]
                    if split[name]:
                        factors[name] = f
            key = tuple(sorted(factors.items()))
            if key in seen:  # the same loads as a combination already listed
                continue
            seen.add(key)
            suffix = "abcdefghijklmnopqrstuvwxyz"[j - 1] if j <= 26 else str(j)
            out.append(Combination(f"{cb.name}{suffix}", factors,
                                   cb.text + f" [{', '.join(cb.pattern)} on {label}]", "", clause=cb.clause,
                                   set=cb.set, leading=cb.leading, leading_kind=cb.leading_kind,
                                   duration=cb.duration, loaded=label, note=cb.note,
                                   parent=cb.name))
    return out, split


def _support_index(at: str, kinds, param: str) -> int:
    names = letters(len(kinds))
    if at in names:
        return names.index(at)
    if at.isdigit() and 1 <= int(at) <= len(kinds):
        return int(at) - 1
    raise BeamInputError(f"there is no support {at!r}; the supports are " + ", ".join(names), param)


def _elastic(springs, settlement, kinds):
    spring_of: dict[int, tuple[float, float]] = {}
    for rec in springs or ():
        i = _support_index(rec.get("at"), kinds, "springs")
        if i in spring_of:
            raise BeamInputError(f"two springs at support {rec.get('at')}; give k and k_theta in one", "springs")
        spring_of[i] = (si(rec.get("k"), "line"), si(rec.get("k_theta"), "moment"))
    settle_of: dict[int, float] = {}
    for rec in settlement or ():
        i = _support_index(rec.get("at"), kinds, "settlement")
        if i in settle_of:
            raise BeamInputError(f"support {rec.get('at')} settles twice", "settlement")
        settle_of[i] = si(rec.get("delta"), "length")
    return spring_of, settle_of
