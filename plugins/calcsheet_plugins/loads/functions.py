"""loads.combinations: the sheet-facing function. Each generated combination is a `combo` record that
beam.solve reads like one the sheet wrote with beam.combo, plus its clause, leading action and duration.
"""
from __future__ import annotations

from calcsheet.plugin import Field, Param, Record

from . import namespace
from .generate import KINDS, SET_NAMES, SETS, CombinationError, generate, parse_cases

COMBO_FIELDS = {f.name: f for f in [
    Field("name", kind="text", doc="name, e.g. U3"),
    Field("factors", kind="text", doc="factors and cases, e.g. \"1.35 G + 1.5 Q\""),
    Field("clause", kind="text", doc="standard and clause the combination comes from"),
    Field("set", kind="text", doc="the combination set"),
    Field("limit_state", kind="text", doc="strength, allowable stress, ULS or SLS (which)"),
    Field("leading", kind="text", doc="the leading (principal) variable case; empty when none"),
    Field("leading_kind", kind="text", doc="its kind, e.g. imposed B, snow, wind, L, S"),
    Field("duration", kind="text", doc="shortest load-duration class among the actions present"),
    Field("duration_scale", kind="text", doc="the scale that class is on (EN 1995-1-1 2.3.1.2 or NDS 2018 "
                                              "Table 2.3.2)"),
    Field("pattern", kind="text", doc="variable cases beam.solve patterns span by span (comma separated)"),
    Field("note", kind="text", doc="e.g. G favourable"),
]}


def combo_record(cb) -> Record:
    fields = {"name": cb.name, "factors": cb.text, "clause": cb.clause, "set": cb.set,
              "limit_state": cb.limit_state, "leading": cb.leading, "leading_kind": cb.leading_kind,
              "duration": cb.duration, "duration_scale": cb.duration_scale, "pattern": ", ".join(cb.pattern),
              "note": cb.note}
    return Record("combo", fields, source="loads.combinations", declared=dict(COMBO_FIELDS))


@namespace.function(
    "combinations",
    params=[Param("set", kind="text", choices=SET_NAMES, doc="the combination set, e.g. \"EN 1990 6.10\""),
            Param("cases", kind="text",
                  doc="the load cases, each with its kind after a colon where its name does not say it: "
                      "\"G, Q: imposed B, W: wind\" or \"D, L, S\"")],
    fields=[Field("set", kind="text", doc="the set"),
            Field("standard", kind="text", doc="standard and edition"),
            Field("n", doc="number of combinations"),
            Field("names", kind="text", doc="their names, comma separated"),
            Field("combo_{i}", kind="record", record="combo", doc="combination i (1, 2, …)")],
    returns="combinations",
)
def combinations(work, set, cases):
    """Every combination of a standard set for the given load cases, each with its factors and clause."""
    try:
        parsed = parse_cases(cases, set)
        combos = generate(set, parsed)
    except CombinationError as exc:
        work.fail(str(exc), param=exc.param)
    if not combos:
        work.fail(f"no combination of {set!r} applies to these cases", param="cases")
    spec = SETS["set"][set]
    rows = []
    for c in parsed:
        k = KINDS[c.kind]
        psi = k.get("psi")
        rows.append([c.name, c.kind, k["doc"]] +
                    ([f"{psi[0]:g}", f"{psi[1]:g}", f"{psi[2]:g}"] if psi is not None else ["–", "–", "–"]) +
                    [k["duration"] or "–"])
    work.table("Load cases", ["Case", "Kind", "Action", "ψ₀", "ψ₁", "ψ₂", "Duration"], rows,
               note="ψ: EN 1990:2002+A1:2005 Table A1.1 (recommended values). Duration: "
                    "EN 1995-1-1 2.3.1.2 or NDS 2018 Table 2.3.2." if spec["standard"].startswith("EN")
               else "Symbols: ASCE/SEI 7-22 2.2. Duration: NDS 2018 Table 2.3.2.")
    if spec["standard"].startswith("EN") and set not in ("EN 1990 characteristic", "EN 1990 frequent",
                                                         "EN 1990 quasi-permanent"):
        en = SETS["en1990"]
        work.note(f"Partial factors ({en['source']}): γ_G,sup = {en['gamma_G_sup']:g}, "
                  f"γ_G,inf = {en['gamma_G_inf']:g}, γ_Q = {en['gamma_Q']:g}" +
                  (f", ξ = {en['xi']:g}" if "a/b" in set else "") +
                  ". Each variable action leads in turn; the permanent actions are taken unfavourable and "
                  "favourable, and the accompanying actions present and absent.", kind="method")
    work.table(f"Combinations: {set} ({spec['standard']}, {spec['limit_state']})",
               ["Name", "Factors", "Leading", "Duration", "Source", "Note"],
               [[c.name, c.text, c.leading or "–", c.duration or "–", c.clause, c.note or "–"] for c in combos])
    if spec.get("pattern"):
        work.note("On a beam of more than one span, beam.solve loads the variable cases span by span as well "
                  "(all spans, odd spans, even spans, each pair of adjacent spans).", kind="method")
    out = {"set": set, "standard": spec["standard"], "n": work.q(len(combos), ""),
           "names": ", ".join(c.name for c in combos)}
    for i, c in enumerate(combos, 1):
        out[f"combo_{i}"] = combo_record(c)
    return out
