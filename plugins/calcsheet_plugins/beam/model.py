"""From the sheet's arguments to a solver model: supports, stiffness, loads, cases, combinations.

Why its own module: every rule about what a sheet may say (a load past the
end of its span, a combination naming a case nobody loaded) lives here, with
the parameter to blame, before any arithmetic happens.
"""
from __future__ import annotations

from dataclasses import dataclass, field

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
            import difflib

            close = difflib.get_close_matches(s, SUPPORT_KINDS, n=1)
            hint = f" (did you mean \"{close[0]}\"?)" if close else ""
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

    @property
    def units(self) -> dict:
        return UNITS[self.system]

    def case_loads(self) -> dict[str, list]:
        out: dict[str, list] = {}
        for ld in self.loads:
            out.setdefault(ld.case, []).append(ld.solver)
        return out


def si(q, what: str) -> float:
    return float(q.m_as(_SI_OF[what]))


def build(work, spans, supports, loads, combos, E, I, I_spans, material, section) -> Setup:
    system = "US" if str(work.settings.get("system", "SI")).upper() == "US" else "SI"
    span_si = [si(s, "length") for s in spans]
    kinds = parse_supports(supports)
    n = len(span_si)

    # stiffness
    if E is None:
        if material is None:
            raise BeamInputError("give E (e.g. E=200 GPa) or material=… (a material record)", "E")
        E = material.get("E")
    if I_spans is not None:
        if I is not None:
            raise BeamInputError("give either I (one value) or I_spans (one per span), not both", "I_spans")
        if len(I_spans) != n:
            raise BeamInputError(f"I_spans has {len(I_spans)} values for {n} span(s)", "I_spans")
        I_si = [si(v, "inertia") for v in I_spans]
    else:
        if I is None:
            if section is None:
                raise BeamInputError("give I (e.g. I=8.36e7 mm^4) or section=… (a section record with I_x)", "I")
            I = section.get("I_x")
        I_si = [si(I, "inertia")] * n
    E_val = si(E, "modulus")
    if not E_val > 0:
        raise BeamInputError(f"E must be greater than zero, got {E_val:g} Pa", "E")
    for k, v in enumerate(I_si, 1):
        if not v > 0:
            raise BeamInputError(f"I of span {k} must be greater than zero", "I_spans" if I_spans is not None else "I")
    model = Model(span_si, kinds, [E_val * v for v in I_si])

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
    if combos:
        citems = combos if isinstance(combos, (tuple, list)) else (combos,)
        for ld in sheet_loads:
            if not ld.case:
                raise BeamInputError(f"load {ld.index} has no case; give it case=\"…\" so the combinations can "
                                     f"factor it", "loads")
        names = set()
        for k, rec in enumerate(citems, 1):
            name = rec.get("name")
            text = rec.get("factors")
            try:
                factors = parse_factors(text)
            except ValueError as exc:
                raise BeamInputError(f"combination {name!r}: {exc}", "combos")
            for c in factors:
                if c not in cases:
                    raise BeamInputError(f"combination {name!r} names case {c!r}, which no load has "
                                         f"(cases: {', '.join(cases)})", "combos")
            if name in names:
                raise BeamInputError(f"two combinations are named {name!r}", "combos")
            names.add(name)
            combo_list.append(Combination(name, factors, text, ""))
        used = {c for cb in combo_list for c in cb.factors}
        for c in cases:
            if c not in used:
                work.warn(f"no combination uses the loads of case {c!r}", param="combos")
    else:
        default = True
        text = " + ".join(c for c in cases) if any(cases) else ""
        combo_list.append(Combination("all loads" if len(cases) > 1 else (cases[0] or "loads"),
                                      {c: 1.0 for c in cases}, text, ""))
    if len(combo_list) > 1:
        for k, cb in enumerate(combo_list, 1):
            safe = "".join(ch for ch in cb.name if ch.isalnum())
            cb.tag = "_" + (safe if safe and safe[0].isalpha() and len(safe) <= 8 else str(k))
        tags = [cb.tag for cb in combo_list]
        if len(set(tags)) != len(tags):
            for k, cb in enumerate(combo_list, 1):
                cb.tag = f"_{k}"
    return Setup(model, kinds, sheet_loads, combo_list, system, I_si, [E_val] * n, default)


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
