"""beam.solve and beam.stresses: the sheet-facing functions, gluing model, solver, working and diagrams.

Why thin: each job (reading the sheet's arguments, solving, tracing, drawing)
lives in its own module; this one only orders them and states the results.
"""
from __future__ import annotations

import numpy as np

from calcsheet.plugin import Field, Param

from . import diagrams, results, working
from . import namespace
from .model import build, letters
from .solver import BeamInputError

FORCE, LEN, MOM = "[force]", "[length]", "[force]*[length]"

SOLVE_PARAMS = [
    Param("spans", kind="list", dim=LEN, doc="span lengths, left to right, e.g. [6 m, 6 m]"),
    Param("supports", kind="text",
          doc="one per span end: pinned, roller, fixed, free, guided or hinge, e.g. \"pinned, roller, roller\""),
    Param("loads", kind="list", record="load", doc="beam.point / moment / udl / varying records"),
    Param("combos", kind="list", record="combo", default=None,
          doc="beam.combo records; results are enveloped over them (default: every load at factor 1)"),
    Param("combinations", kind="list", record="combinations", default=None,
          doc="loads.combinations sets; their combinations are solved too, with pattern loading of the "
              "variable cases on a beam of more than one span"),
    Param("E", "[pressure]", "modulus of elasticity (default: material.E)", default=None),
    Param("I", "[length]**4", "second moment of area (default: section.I_x)", default=None),
    Param("I_spans", kind="list", dim="[length]**4", doc="I of each span, for a member that changes section",
          default=None),
    Param("material", kind="record", record="material", doc="a material record giving E", default=None),
    Param("section", kind="record", record="section", doc="a section record giving I_x", default=None),
    Param("springs", kind="list", record="spring", default=None,
          doc="beam.spring records: elastic supports (a \"spring\" support) and rotational springs"),
    Param("settlement", kind="list", record="settlement", default=None,
          doc="beam.settlement records: prescribed downward movement of supports"),
    Param("limit", doc="deflection limit as span/δ, e.g. 360 for L/360 (default 360)", default=None),
    Param("deflection", kind="text", doc="name of the combination the deflection limit applies to "
                                         "(default: all)", default=None),
    Param("samples", doc="diagram points per span (default 200)", default=None),
]

# fields that need E and I: absent for a statically determinate beam given neither
NEEDS_STIFFNESS = {"delta_max", "x_delta_max", "theta_max", "delta_gov", "L_gov", "span_ratio", "delta_allow",
                   "limit", "EI", "combo_delta_max", "delta_down", "x_delta_down", "combo_delta_down", "delta_up",
                   "x_delta_up", "combo_delta_up", "combo_delta_gov", "delta_max_{i}"}
STIFFNESS_HINT = " — needs E and I: give E (or material=…) and I (or section=…) to beam.solve"

SOLVE_FIELDS = [
    Field("L", LEN, "total length"),
    Field("n_spans", doc="number of spans"),
    Field("R_{i}", FORCE, "largest (upward) reaction at support i over the combinations"),
    Field("R_min_{i}", FORCE, "smallest reaction at support i (negative: uplift)"),
    Field("M_sup_{i}", MOM, "bending moment in the member at support i, largest in magnitude"),
    Field("M_max", MOM, "largest sagging moment"),
    Field("x_M_max", LEN, "where it occurs"),
    Field("M_min", MOM, "largest hogging moment (negative)"),
    Field("x_M_min", LEN, "where it occurs"),
    Field("M_abs", MOM, "largest moment in magnitude"),
    Field("V_max", FORCE, "largest shear in magnitude"),
    Field("x_V_max", LEN, "where it occurs"),
    Field("x_V0", LEN, "point of zero shear at the largest sagging moment"),
    Field("delta_max", LEN, "largest deflection in magnitude"),
    Field("x_delta_max", LEN, "where it occurs"),
    Field("theta_max", "[angle]", "largest slope in magnitude"),
    Field("delta_gov", LEN, "deflection of the span with the smallest span/δ"),
    Field("L_gov", LEN, "length of that span"),
    Field("span_ratio", doc="smallest span/δ over the spans"),
    Field("delta_allow", LEN, "allowed deflection L_gov/limit"),
    Field("limit", doc="the limit span/δ used"),
    Field("EI", "[force]*[length]**2", "flexural stiffness (of span 1)"),
    Field("combo_M_max", kind="text", doc="combination giving M_max"),
    Field("V_at_M_max", FORCE, "shear acting with M_max (same section and combination; the larger in magnitude "
                               "of the values just left and right)"),
    Field("combo_M_min", kind="text", doc="combination giving M_min"),
    Field("V_at_M_min", FORCE, "shear acting with M_min"),
    Field("combo_V_max", kind="text", doc="combination giving V_max"),
    Field("M_at_V_max", MOM, "moment acting with V_max"),
    Field("combo_delta_max", kind="text", doc="combination giving delta_max"),
    Field("delta_down", LEN, "largest downward deflection (0 when none)"),
    Field("x_delta_down", LEN, "where it occurs"),
    Field("combo_delta_down", kind="text", doc="combination giving delta_down"),
    Field("delta_up", LEN, "largest upward deflection, as a positive number (0 when none)"),
    Field("x_delta_up", LEN, "where it occurs"),
    Field("combo_delta_up", kind="text", doc="combination giving delta_up"),
    Field("combo_delta_gov", kind="text", doc="combination giving delta_gov"),
    Field("M_max_{i}", MOM, "largest sagging moment in span i (envelope)"),
    Field("M_min_{i}", MOM, "largest hogging moment in span i (envelope, negative)"),
    Field("delta_max_{i}", LEN, "largest deflection in magnitude in span i (envelope)"),
    Field("N_at_M_max", FORCE, "axial force acting with M_max, compression positive"),
    Field("N_at_M_min", FORCE, "axial force acting with M_min, compression positive"),
    Field("N_at_V_max", FORCE, "axial force acting with V_max, compression positive"),
    Field("N_max", FORCE, "largest axial compression (0 without loads along the axis; negative: tension only)"),
    Field("x_N_max", LEN, "where it starts (the leftmost stretch)"),
    Field("combo_N_max", kind="text", doc="combination giving N_max"),
    Field("n_combos", doc="number of combinations solved (pattern variants included)"),
    Field("ties", doc="how many of M_max, M_min, V_max, delta_max occur at more than one place or combination"),
    Field("model", kind="text", doc="the solved beam (not a value: beam.at and beam.result read it)"),
] + [Field(f"{p}_{c}", dim, doc, optional=True) for c in "ABCDEFGHIJKLMNOPQRSTUVWXYZ" for p, dim, doc in (
    ("R", FORCE, f"largest upward reaction at support {c} (absent: no vertical restraint there)"),
    ("R_min", FORCE, f"smallest reaction at support {c}, negative is uplift (absent: no vertical restraint there)"),
    ("M", MOM, f"bending moment in the member at support {c}, largest in magnitude (absent: a free end or hinge)"),
)]


def _number(q, name, lo=None):
    v = float(q.m_as(""))
    if not np.isfinite(v) or (lo is not None and v < lo):
        raise BeamInputError(f"{name} must be a number of at least {lo:g}, got {v:g}", name)
    return v


SOLVE_FIELDS = [Field(f.name, f.dim, f.doc + STIFFNESS_HINT, f.kind, f.record, True) if f.name in NEEDS_STIFFNESS
                else f for f in SOLVE_FIELDS]


@namespace.function("solve", params=SOLVE_PARAMS, fields=SOLVE_FIELDS, returns="beam")
def solve(work, spans, supports, loads, combos=None, combinations=None, E=None, I=None, I_spans=None, material=None,
          section=None, springs=None, settlement=None, limit=None, deflection=None, samples=None):
    """Reactions, shear, moment, slope and deflection of a beam on any supports, exactly, with its working."""
    try:
        setup = build(work, spans, supports, loads, combos, E, I, I_spans, material, section, combinations,
                      springs, settlement)
        per_span = int(_number(samples, "samples", 10)) if samples is not None else 200
        lim = _number(limit, "limit", 1) if limit is not None else None
        res = results.run(setup, per_span=min(per_span, 5000))
    except BeamInputError as exc:
        work.fail(str(exc), param=exc.param)
    lit = working.Lit(setup.units)
    u = setup.units
    model = setup.model
    X = model.nodes
    Ls = letters(len(X))

    _input_tables(work, setup, lit)
    if not setup.stiff:
        work.note("No E or I was given: the beam is statically determinate, so its reactions, shears and moments "
                  "follow from statics alone; deflections and slopes need E and I and are not computed.",
                  kind="method")
    elif len(set(model.EI)) == 1:
        if E is not None and I is not None:
            work.calc("EI", "E*I", unit=u["EI"], desc="flexural stiffness")
        else:
            work.let("EI", lit.q(model.EI[0], "EI"), unit=u["EI"], desc="flexural stiffness E·I",
                     note=("E from the material" if E is None else "E as given") + "; " +
                          ("I from the section's I_x" if I is None else "I as given"))
    else:
        work.table("Flexural stiffness by span", ["Span", "E", "I", "EI"],
                   [[f"{Ls[k]}–{Ls[k + 1]}", lit.q(e, "modulus"), lit.q(i, "inertia"), lit.q(e * i, "EI")]
                    for k, (e, i) in enumerate(zip(setup.E_si, setup.I_si))],
                   units=[None, u["modulus"], u["inertia"], u["EI"]])
        work.let("EI", lit.q(model.EI[0], "EI"), unit=u["EI"], desc="flexural stiffness of span 1")
    if setup.default_combo and len({ld.case for ld in setup.loads}) > 1:
        work.note("No combinations were given: every load acts at once, each at factor 1.0.")

    working.write(work, setup, res, lit)
    _result_tables(work, setup, res, lit)
    defl_check: list = []
    out = _envelope(work, setup, res, lit, lim, deflection, defl_check)
    if not setup.stiff:
        for name in list(out):
            if name in NEEDS_STIFFNESS or name.startswith("delta_max_"):
                del out[name]
    for svg, caption in diagrams.figures(setup, res, lit, defl_check[0] if defl_check else None):
        work.figure(svg, caption=caption)
    return out


def _input_tables(work, setup, lit):
    X = setup.model.nodes
    Ls = letters(len(X))
    u = setup.units
    work.table("Supports", ["Support", "x", "Type"],
               [[Ls[i], lit.q(X[i], "length"), _support_text(setup, i, k)] for i, k in enumerate(setup.kinds)],
               units=[None, u["length"], None])
    rows = []
    for ld in setup.loads:
        name, what, x1, x2 = ld.solver.row(lit, working.num)
        rows.append([ld.index, ld.case or "–", name, what, lit.q(x1, "length"),
                     lit.q(x2, "length") if x2 is not None else "–"])
    if len(rows) <= 60:
        work.table("Loads (unfactored; downward positive)", ["No.", "Case", "Type", "Value", "from x", "to x"], rows,
                   units=[None, None, None, None, u["length"], u["length"]])
    else:
        work.note(f"{len(rows)} loads were given; the table is left out for length.")
    if len(setup.combos) > 1 or not setup.default_combo:
        if any(c.clause for c in setup.combos):
            work.table("Combinations", ["Name", "Factors", "Leading", "Duration", "Source"],
                       [[c.name, c.text, c.leading or "–", c.duration or "–", c.clause or "the sheet"]
                        for c in setup.combos])
        else:
            work.table("Combinations", ["Name", "Factors"], [[c.name, c.text] for c in setup.combos])


def _support_text(setup, i, kind):
    parts = [kind]
    k, kt = setup.model.springs.get(i, (0.0, 0.0))
    if k:
        parts.append(f"k = {working.num(k / 1e3)} kN/m")
    if kt:
        parts.append(f"k_θ = {working.num(kt / 1e3)} kN·m/rad")
    if i in setup.model.settlement:
        parts.append(f"settles {working.num(setup.model.settlement[i] * 1e3)} mm")
    return ", ".join(parts)


def _result_tables(work, setup, res, lit):
    u = setup.units
    if not _indeterminate_path(setup):
        working.reactions_table(work, setup, res, lit)
    rows = []
    stiff = setup.stiff
    for c in res.combos:
        rows.append([c.combo.name, lit.q(c.M_max.value, "moment"), lit.q(c.M_max.x, "length"),
                     lit.q(c.M_min.value, "moment"), lit.q(c.M_min.x, "length"),
                     lit.q(abs(c.V_max.value), "force"), lit.q(c.V_max.x, "length"),
                     lit.q(c.d_max.value, "defl"), lit.q(c.d_max.x, "length")])
    cols = ["Combination", "M_max", "at x", "M_min", "at x", "|V|_max", "at x", "δ_max (down +)", "at x"]
    units = [None, u["moment"], u["length"], u["moment"], u["length"], u["force"], u["length"], u["defl"], u["length"]]
    if not stiff:
        rows, cols, units = [r[:7] for r in rows], cols[:7], units[:7]
    work.table("Maxima by combination (found exactly from the piecewise polynomials)", cols, rows, units=units)


def _indeterminate_path(setup) -> bool:
    if setup.model.springs or setup.model.settlement:
        return True
    kinds = setup.kinds
    vert = [i for i, k in enumerate(kinds) if k in ("pinned", "roller", "fixed")]
    rot = [i for i, k in enumerate(kinds) if k in ("fixed", "guided")]
    hinges = sum(1 for k in kinds if k == "hinge")
    simple = hinges == 0 and not rot and len(vert) == 2
    cant = hinges == 0 and len(vert) == 1 and rot == vert and vert[0] in (0, len(kinds) - 1)
    return not (simple or cant)


def _envelope(work, setup, res, lit, lim, deflection, defl_check):
    model = setup.model
    X = model.nodes
    u = setup.units
    many = len(res.combos) > 1
    env = " (envelope of the combinations)" if many else ""
    out = {"L": lit.q(model.length, "length"), "n_spans": work.q(len(model.spans), "")}
    for i, k in enumerate(setup.kinds):
        if k in ("pinned", "roller", "fixed", "spring") and (k != "spring" or setup.model.springs[i][0]):
            vals = [c.sol.reactions[i] for c in res.combos]
            out[f"R_{i + 1}"] = lit.q(max(vals), "force")
            out[f"R_min_{i + 1}"] = lit.q(min(vals), "force")
        if k in ("pinned", "roller", "fixed", "guided"):
            ms = [c.support_M[i] for c in res.combos]
            out[f"M_sup_{i + 1}"] = lit.q(max(ms, key=abs), "moment")
        if i < 26:
            letter = letters(len(X))[i]
            for old, new in ((f"R_{i + 1}", f"R_{letter}"), (f"R_min_{i + 1}", f"R_min_{letter}"),
                             (f"M_sup_{i + 1}", f"M_{letter}")):
                if old in out:
                    out[new] = out[old]
    gmax = res.governing("M_max")
    gmin = res.governing("M_min", -1)
    gV = max(res.combos, key=lambda c: abs(c.V_max.value))
    gd = max(res.combos, key=lambda c: abs(c.d_max.value))
    gt = max(res.combos, key=lambda c: abs(c.theta_max.value))

    def tagged(c):
        return f" ({c.combo.name})" if many else ""

    out["M_max"] = work.let("M_max", lit.q(gmax.M_max.value, "moment"), unit=u["moment"],
                            desc=extreme_label("sagging", gmax.M_max.value) + env, note=f"at x = {_x(lit, gmax.M_max.x)}{tagged(gmax)}")
    out["x_M_max"] = lit.q(gmax.M_max.x, "length")
    out["M_min"] = work.let("M_min", lit.q(gmin.M_min.value, "moment"), unit=u["moment"],
                            desc=extreme_label("hogging", gmin.M_min.value) + env, note=f"at x = {_x(lit, gmin.M_min.x)}{tagged(gmin)}")
    out["x_M_min"] = lit.q(gmin.M_min.x, "length")
    out["M_abs"] = work.calc("M_abs", "max(abs(M_max), abs(M_min))", unit=u["moment"],
                             desc="largest moment in magnitude")
    out["V_max"] = work.let("V_max", lit.q(abs(gV.V_max.value), "force"), unit=u["force"],
                            desc=f"largest shear in magnitude{env}", note=f"at x = {_x(lit, gV.V_max.x)}{tagged(gV)}")
    out["x_V_max"] = lit.q(gV.V_max.x, "length")
    zs = gmax.zero_shear
    x0 = min(zs, key=lambda z: abs(z - gmax.M_max.x)) if zs else gmax.M_max.x
    out["x_V0"] = lit.q(x0, "length")
    direction = "downward" if gd.d_max.value >= 0 else "upward"
    out["delta_max"] = lit.q(abs(gd.d_max.value), "defl") if not setup.stiff else work.let("delta_max", lit.q(abs(gd.d_max.value), "defl"), unit=u["defl"],
                                desc=f"largest deflection{env}",
                                note=f"{direction}, at x = {_x(lit, gd.d_max.x)}{tagged(gd)}")
    out["x_delta_max"] = lit.q(gd.d_max.x, "length")
    out["theta_max"] = work.q(abs(gt.theta_max.value), "rad")
    _governing(work, setup, res, lit, out, gmax, gmin, gV, gd)

    if not setup.stiff:
        return out
    # deflection against the limit
    pool = res.combos
    if deflection is not None:
        pool = [c for c in res.combos if c.combo.named(deflection)]
        if not pool:
            work.fail(f"no combination is named {deflection!r} (combinations: "
                      + ", ".join(c.combo.name for c in res.combos) + ")", param="deflection")
    best = None
    cantilever = [setup.kinds[k] == "free" or setup.kinds[k + 1] == "free" for k in range(len(model.spans))]
    for c in pool:
        for k, e in enumerate(c.span_delta):
            if abs(e.value) <= 0:
                continue
            ratio = (2 if cantilever[k] else 1) * model.spans[k] / abs(e.value)
            if best is None or ratio < best[0]:
                best = (ratio, k, e, c)
    if lim is None:
        out["limit"] = work.let("limit_d", work.q(360, ""), desc="deflection limit span/δ",
                                note="not given: 360 assumed (common practice for floor live load); pass limit=…")
        lim_name = "limit_d"
    else:
        lim_name = "limit"
        out["limit"] = work.q(lim, "")
    Ls = letters(len(X))
    if best is None:
        work.note("The beam does not deflect under these loads.")
        zero = lit.q(0.0, "defl")
        out.update(delta_gov=zero, L_gov=lit.q(model.spans[0], "length"), span_ratio=work.q(1e9, ""),
                   combo_delta_gov=pool[0].combo.name)
        out["delta_allow"] = lit.q(model.spans[0] / float(out["limit"].m_as("")), "defl")
        out["EI"] = lit.q(model.EI[0], "EI")
        return out
    ratio, k, e, c = best
    defl_check.append((pool, c, e.x, e.value))
    span_name = f"{Ls[k]}–{Ls[k + 1]}"
    if cantilever[k]:
        out["L_gov"] = work.calc("L_gov", f"2*{lit(model.spans[k], 'length')}", unit=u["length"],
                                 desc=f"span {span_name} is a cantilever: the limit applies to twice its length "
                                      f"(common practice)")
    else:
        out["L_gov"] = work.calc("L_gov", lit(model.spans[k], "length"), unit=u["length"], desc=f"span {span_name}")
    out["combo_delta_gov"] = c.combo.name
    out["delta_gov"] = work.let("delta_gov", lit.q(abs(e.value), "length"), unit=u["defl"],
                                desc=f"largest deflection in span {span_name}",
                                note=f"at x = {_x(lit, e.x)}" + (f", {c.combo.name}" if many else ""))
    out["span_ratio"] = work.calc("span_ratio", "L_gov/delta_gov", unit="1", desc="span/deflection (smallest over the spans)")
    out["span_ratio"] = work.q(float(out["span_ratio"].m_as("")), "")
    out["delta_allow"] = work.calc("delta_allow", f"L_gov/{lim_name}", unit=u["defl"], desc="allowed deflection")
    out["delta_gov"] = out["delta_gov"].to(u["defl"])
    out["delta_allow"] = out["delta_allow"].to(u["defl"])
    work.check("delta_gov <= delta_allow", desc=f"deflection within span/{working.num(float(out['limit'].m_as('')))}")
    out["EI"] = lit.q(model.EI[0], "EI")
    return out


def _governing(work, setup, res, lit, out, gmax, gmin, gV, gd):
    """Which combination governs each extreme, the actions acting with it, maxima per span, ties."""
    from .model import SolvedBeam

    out["combo_M_max"] = gmax.combo.name
    out["V_at_M_max"] = lit.q(gmax.V_at(gmax.M_max.x), "force")
    out["combo_M_min"] = gmin.combo.name
    out["V_at_M_min"] = lit.q(gmin.V_at(gmin.M_min.x), "force")
    out["combo_V_max"] = gV.combo.name
    out["M_at_V_max"] = lit.q(gV.M_at(gV.V_max.x), "moment")
    out["combo_delta_max"] = gd.combo.name
    out["N_at_M_max"] = lit.q(gmax.N_at(gmax.M_max.x), "force")
    out["N_at_M_min"] = lit.q(gmin.N_at(gmin.M_min.x), "force")
    out["N_at_V_max"] = lit.q(gV.N_at(gV.V_max.x), "force")
    gN, _ = res.governing_tie(lambda c: c.N_max().value)
    nmax = gN.N_max()
    if any(c.axial[0] for c in res.combos):
        names = letters(len(setup.model.nodes))
        held = next(names[i] for i, k in enumerate(setup.kinds) if k in ("pinned", "fixed"))
        out["N_max"] = work.let("N_max", lit.q(nmax.value, "force"), unit=lit.units["force"],
                                desc="largest axial compression" + (" (envelope of the combinations)"
                                                                    if len(res.combos) > 1 else ""),
                                note=f"statics along the axis: support {held} holds the member, so N(x) is the sum "
                                     f"of the axial forces on the far side of x; from x = {_x(lit, nmax.x)}"
                                     + (f" ({gN.combo.name})" if len(res.combos) > 1 else ""))
    else:
        out["N_max"] = lit.q(0.0, "force")
    out["x_N_max"] = lit.q(nmax.x, "length")
    out["combo_N_max"] = gN.combo.name
    dn, _ = res.governing_tie(lambda c: c.d_down.value)
    up, _ = res.governing_tie(lambda c: -c.d_up.value)
    out["delta_down"] = lit.q(max(0.0, dn.d_down.value), "defl")
    out["x_delta_down"] = lit.q(dn.d_down.x, "length")
    out["combo_delta_down"] = dn.combo.name
    out["delta_up"] = lit.q(max(0.0, -up.d_up.value), "defl")
    out["x_delta_up"] = lit.q(up.d_up.x, "length")
    out["combo_delta_up"] = up.combo.name
    for k in range(len(setup.model.spans)):
        out[f"M_max_{k + 1}"] = lit.q(max(c.span_M[k][0].value for c in res.combos), "moment")
        out[f"M_min_{k + 1}"] = lit.q(min(c.span_M[k][1].value for c in res.combos), "moment")
        out[f"delta_max_{k + 1}"] = lit.q(max(abs(c.span_delta[k].value) for c in res.combos), "defl")
    out["n_combos"] = work.q(len(res.combos), "")
    ties = 0
    for label, g, ext, others in (
            ("M_max", gmax, gmax.M_max, res.governing_tie(lambda c: c.M_max.value)[1]),
            ("M_min", gmin, gmin.M_min, res.governing_tie(lambda c: -c.M_min.value)[1]),
            ("V_max", gV, gV.V_max, res.governing_tie(lambda c: abs(c.V_max.value))[1]),
            ("delta_max", gd, gd.d_max, res.governing_tie(lambda c: abs(c.d_max.value))[1])):
        if abs(ext.value) == 0:
            continue
        where = [_x(lit, x) for x in ext.others]
        if where or others:
            ties += 1
            text = f"The same value of {label} occurs at x = {_x(lit, ext.x)}"
            if where:
                text += " and also at x = " + ", ".join(where)
            if others:
                text += f" in {g.combo.name}, and in " + ", ".join(c.combo.name for c in others[:6]) + (
                    " …" if len(others) > 6 else "")
            work.note(text + "; the leftmost place (and the first combination) is reported.")
    out["ties"] = work.q(ties, "")
    out["model"] = SolvedBeam(setup, res)


def _x(lit, x):
    return f"{working.num(round(lit.value(x, 'length'), 4))} {lit.units['length']}"


# ---------------------------------------------------------------- stresses

STRESS_FIELDS = [
    Field("sigma_top", "[pressure]", "largest bending stress at the top fibre, M·y_top/I (times n of the material "
                                     "there, for a transformed section)"),
    Field("sigma_bot", "[pressure]", "largest bending stress at the bottom fibre, M·y_bot/I (times n of the "
                                     "material there, for a transformed section)"),
    Field("sigma_max", "[pressure]", "the larger of the two"),
    Field("tau_max", "[pressure]", "largest shear stress at the neutral axis, V·Q/(I·t) (in reference-material "
                                   "units for a transformed section)"),
    Field("M", MOM, "moment used"),
    Field("V", FORCE, "shear used"),
    Field("n_materials", doc="number of materials of the section (1 unless it is transformed)"),
    Field("n_{i}", doc="modular ratio E_i/E_ref of material i (transformed sections)", optional=True),
    Field("sigma_{i}", "[pressure]", "largest bending stress in material i, n_i·M·y_i/I_tr at its outermost fibre "
                                     "(transformed sections)", optional=True),
    Field("sigma_top_{i}", "[pressure]", "bending stress at the top fibre of material i (transformed sections)",
          optional=True),
    Field("sigma_bot_{i}", "[pressure]", "bending stress at the bottom fibre of material i (transformed sections)",
          optional=True),
]


def _materials(section):
    """The materials of a transformed section, as (n, parts, top of its material, bottom of it) in mm of the
    built-up frame, ordered by n; None for a section of one material (or one without its outline)."""
    geom = getattr(section, "payload", None)
    rings = getattr(geom, "rings", None)
    if "E_ref" not in section.fields or not rings:
        return None
    extent: dict[float, list[float]] = {}
    for r in rings:
        if r.sign <= 0 or len(r.y) == 0:
            continue
        n = round(float(r.n), 12)
        lo, hi = extent.setdefault(n, [np.inf, -np.inf])
        extent[n] = [min(lo, float(np.min(r.y))), max(hi, float(np.max(r.y)))]
    if len(extent) < 2:
        return None
    names = {}
    for row in getattr(geom, "rows", []):
        if row.sign > 0:
            names.setdefault(round(float(row.n), 12), []).append(row.name)
    return [(n, names.get(n, []), hi, lo) for n, (lo, hi) in sorted(extent.items())]


@namespace.function(
    "stresses",
    params=[Param("member", kind="record", record="beam", doc="a beam.solve result"),
            Param("section", kind="record", record="section", doc="its cross-section (I_x, y_top, y_bot, Q_x, t_x)")],
    fields=STRESS_FIELDS,
    returns="stresses",
)
def stresses(work, member, section):
    """Bending stress σ = M·c/I at both fibres and shear stress τ = V·Q/(I·t), from the member's envelope; on a
    transformed (several-material) section, σ_i = n_i·M·y_i/I_tr at each material's own outermost fibres."""
    for name in ("I_x", "y_top", "y_bot", "Q_x", "t_x"):
        if name not in section.fields:
            work.fail(f"the section record has no {name}; stresses need I_x, y_top, y_bot, Q_x and t_x",
                      param="section")
    system = str(work.settings.get("system", "SI")).upper()
    st, mo, fo, le = ("ksi", "kip*ft", "kip", "in") if system == "US" else ("MPa", "kN*m", "kN", "mm")
    work.calc("M", "member.M_abs", unit=mo, desc="largest moment in magnitude (envelope)")
    work.calc("V", "member.V_max", unit=fo, desc="largest shear in magnitude (envelope)")
    mats = _materials(section)
    out = {"n_materials": work.q(1 if mats is None else len(mats), "")}
    if mats is None:
        top = work.calc("sigma_top", "M*section.y_top/section.I_x", unit=st,
                        desc="bending stress, top fibre: σ = M·c/I")
        bot = work.calc("sigma_bot", "M*section.y_bot/section.I_x", unit=st,
                        desc="bending stress, bottom fibre: σ = M·c/I")
    else:
        top, bot = _transformed_stresses(work, section, mats, st, le, out)
    work.calc("sigma_max", "max(sigma_top, sigma_bot)", unit=st, desc="largest bending stress")
    tau = work.calc("tau_max", "V*section.Q_x/(section.I_x*section.t_x)", unit=st,
                    desc="shear stress at the neutral axis: τ = V·Q/(I·t)")
    work.note("Sagging compresses the top fibre and hogging the bottom; the magnitudes here are the larger of "
              "the two for each fibre, with M = max(|M_max|, |M_min|).")
    if mats is not None:
        work.note("τ is in reference-material units (Q and t of the transformed section); the shear stress in "
                  "material i at the same level is n_i·τ.")
    out.update({"sigma_top": top.to(st), "sigma_bot": bot.to(st), "sigma_max": work["sigma_max"].to(st),
                "tau_max": tau.to(st), "M": work["M"].to(mo), "V": work["V"].to(fo)})
    return out


def _transformed_stresses(work, section, mats, st, le, out):
    """σ_i = n_i·M·y/I_tr at the top and bottom fibre of each material (the transformed-section method: the
    transformed section's strain is the real one, so a fibre of material i carries n_i times the stress the
    reference material would at the same place)."""
    y_c = float(section.fields["y_c"].m_as("mm"))
    E_ref = section.fields["E_ref"]
    work.note(f"Transformed section of {len(mats)} materials, E_ref = {working.num(float(E_ref.m_as('MPa')))} MPa. "
              "I_x is of the transformed section (I_tr), so M·y/I_tr is the stress the reference material would "
              "carry; at a fibre of material i it is multiplied by that material's modular ratio: "
              "σ_i = n_i·M·y/I_tr.", kind="method")
    y_sec_top = max(hi for _, _, hi, _ in mats)
    y_sec_bot = min(lo for _, _, _, lo in mats)
    per_top, per_bot = {}, {}
    for i, (n, parts, hi, lo) in enumerate(mats, start=1):
        what = (", ".join(parts[:3]) + (" …" if len(parts) > 3 else "")) if parts else f"material {i}"
        out[f"n_{i}"] = work.let(f"n_{i}", work.q(n, ""), desc=f"modular ratio E_i/E_ref of material {i} ({what})")
        work.let(f"y_top_{i}", work.q(hi - y_c, "mm").to(le), unit=le,
                 desc=f"neutral axis to the top fibre of material {i}")
        work.let(f"y_bot_{i}", work.q(y_c - lo, "mm").to(le), unit=le,
                 desc=f"neutral axis to the bottom fibre of material {i}")
        t = work.calc(f"sigma_top_{i}", f"n_{i}*M*abs(y_top_{i})/section.I_x", unit=st,
                      desc=f"bending stress, top fibre of material {i}: σ_i = n_i·M·y/I_tr")
        b = work.calc(f"sigma_bot_{i}", f"n_{i}*M*abs(y_bot_{i})/section.I_x", unit=st,
                      desc=f"bending stress, bottom fibre of material {i}: σ_i = n_i·M·y/I_tr")
        out[f"sigma_top_{i}"], out[f"sigma_bot_{i}"] = t.to(st), b.to(st)
        out[f"sigma_{i}"] = work.calc(f"sigma_{i}", f"max(sigma_top_{i}, sigma_bot_{i})", unit=st,
                                      desc=f"largest bending stress in material {i}; check it against that "
                                           f"material's own strength").to(st)
        if abs(hi - y_sec_top) <= 1e-9 * max(1.0, abs(y_sec_top)):
            per_top[i] = t
        if abs(lo - y_sec_bot) <= 1e-9 * max(1.0, abs(y_sec_bot)):
            per_bot[i] = b
    i_top = max(per_top, key=lambda k: per_top[k])
    i_bot = max(per_bot, key=lambda k: per_bot[k])
    top = work.calc("sigma_top", f"sigma_top_{i_top}", unit=st,
                    desc=f"bending stress at the section's top fibre (material {i_top})")
    bot = work.calc("sigma_bot", f"sigma_bot_{i_bot}", unit=st,
                    desc=f"bending stress at the section's bottom fibre (material {i_bot})")
    return top, bot


def extreme_label(kind: str, value: float) -> str:
    """What an extreme moment is: 'largest sagging moment', or 'no sagging moment' when the member has none
    (sagging positive: the largest moment is then the least hogging one)."""
    if (value > 0) if kind == "sagging" else (value < 0):
        return f"largest {kind} moment"
    other = "hogging" if kind == "sagging" else "sagging"
    return f"no {kind} moment anywhere (the value is the least {other} moment)"
