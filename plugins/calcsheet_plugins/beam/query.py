"""beam.at and beam.result: values anywhere, and the results of one combination, read from a solved beam.

Why separate functions: the envelope answers "is the member OK"; a designer
also needs the deflection under a load, the slope at a bearing, the points of
contraflexure for bracing, the actions of one combination for an interaction
check. Each value comes from the exact piecewise polynomials of the solution,
not from a sampled diagram.
"""
from __future__ import annotations


import numpy as np

from calcsheet.plugin import Field, Param
from calcsheet.suggest import did_you_mean

from . import namespace
from .analysis import extreme_label
from .model import letters
from .solver import TIE, horner
from .working import Lit

FORCE, LEN, MOM = "[force]", "[length]", "[force]*[length]"
LETTERS = "ABCDEFGHIJKLMNOPQRSTUVWXYZ"

_MEMBER = Param("member", kind="record", record="beam", doc="a beam.solve result")


def _solved(work, member):
    model = member.fields.get("model")
    if model is None or not hasattr(model, "results"):
        work.fail("this beam record carries no solution; pass a beam.solve result", param="member")
    return model.setup, model.results


def _combo(work, res, combo):
    names = [c.combo.name for c in res.combos]
    if combo is None:
        if len(res.combos) == 1:
            return res.combos[0]
        work.fail("the beam has " + str(len(names)) + " combinations; name one with combo=\"…\" (" +
                  ", ".join(names[:12]) + (" …" if len(names) > 12 else "") + ")", param="combo")
    cr = res.by_name(combo)
    if cr is None:
        hint = did_you_mean(combo, names, quote='"')
        work.fail(f"the beam has no combination named {combo!r}" +
                  (f" ({hint})" if hint else "") + "; combinations: " +
                  ", ".join(names[:12]) + (" …" if len(names) > 12 else ""), param="combo")
    return cr


def _clean(v: float, scale: float) -> float:
    return 0.0 if abs(v) < 1e-9 * max(scale, 1e-300) else v


@namespace.function(
    "at",
    params=[_MEMBER, Param("x", LEN, "position from the left end of the beam"),
            Param("combo", kind="text", doc="name of the combination (may be left out when there is one)",
                  default=None)],
    fields=[Field("x", LEN, "position"), Field("combo", kind="text", doc="the combination"),
            Field("V", FORCE, "shear just to the right of x (V = dM/dx, sum of upward forces to the left)"),
            Field("V_left", FORCE, "shear just to the left of x (differs at a point load or support)"),
            Field("M", MOM, "bending moment, sagging positive (just right of x at an applied couple)"),
            Field("N", FORCE, "axial force, compression positive (the larger in magnitude either side of x)"),
            Field("theta", "[angle]", "slope dδ/dx (needs E and I in beam.solve)", optional=True),
            Field("delta", LEN, "deflection, downward positive (needs E and I in beam.solve)", optional=True)],
    returns="beam.point_values",
)
def at(work, member, x, combo=None):
    """V, M, θ and δ at any point of a solved beam, for one combination."""
    setup, res = _solved(work, member)
    cr = _combo(work, res, combo)
    lit = Lit(setup.units)
    L = setup.model.length
    xs = float(x.m_as("m"))
    if not (-1e-9 * L <= xs <= L * (1 + 1e-9)):
        work.fail(f"x = {xs:g} m lies outside the beam (0 to {L:g} m)", param="x")
    xs = min(max(xs, 0.0), L)
    sol = cr.sol
    sV = max(abs(cr.V_max.value), 1e-300)
    sM = max(abs(cr.M_max.value), abs(cr.M_min.value), 1e-300)
    V = _clean(float(sol.at("V", xs, side="right")[0]), sV) if xs < L else 0.0
    V_left = _clean(float(sol.at("V", xs, side="left")[0]), sV) if xs > 0 else 0.0
    M = _clean(float(sol.at("M", xs, side="right" if xs < L else "left")[0]), sM)
    th = float(sol.at("theta", xs, side="right" if xs < L else "left")[0])
    d = float(sol.at("delta", xs, side="right" if xs < L else "left")[0])
    u = setup.units
    note = f"{cr.combo.name}: from the exact piecewise polynomials of the solution"
    out = {"x": x, "combo": cr.combo.name,
           "V": work.let("V", lit.q(V, "force"), unit=u["force"], desc=f"shear at x = {xs:g} m", note=note),
           "V_left": lit.q(V_left, "force"),
           "N": lit.q(cr.N_at(xs), "force"),
           "M": work.let("M", lit.q(M, "moment"), unit=u["moment"], desc=f"bending moment at x = {xs:g} m",
                         note=note),
           "theta": None if not setup.stiff else work.let("theta", work.q(th, "rad"), unit="rad", desc=f"slope at x = {xs:g} m", note=note),
           "delta": None if not setup.stiff else work.let("delta", lit.q(d, "defl"), unit=u["defl"], desc=f"deflection at x = {xs:g} m "
                             f"(downward positive)", note=note)}
    return {k: v for k, v in out.items() if v is not None}


def zero_moment_points(cr, L: float) -> list[float]:
    """Where M changes sign inside the beam (points of contraflexure), left to right; not the beam's ends."""
    p = cr.sol.pieces
    scale = max(abs(cr.M_max.value), abs(cr.M_min.value), 1e-300)
    tol = 1e-9 * L
    pts: list[float] = []
    for C, s, h in zip(p.M, p.start, p.length):
        t = np.linspace(0.0, h, 9)
        vals = horner(np.asarray([C]), np.asarray([t]))[0]
        if np.max(np.abs(vals)) < 1e-9 * scale:
            continue  # an unloaded stretch with no moment at all
        roots = np.roots(C[::-1]) if np.any(C[1:] != 0) else []
        for r in np.atleast_1d(roots):
            if abs(np.imag(r)) > 1e-9 * max(h, 1.0):
                continue
            r = float(np.real(r))
            if -tol <= r <= h + tol:
                pts.append(float(s + min(max(r, 0.0), h)))
    # a sign change by a jump (an applied couple) at a piece start
    ends = horner(p.M, p.length)
    for k in range(len(p.start) - 1):
        a, b = ends[k], p.M[k + 1, 0]
        if a * b < 0 and abs(a) > 1e-9 * scale and abs(b) > 1e-9 * scale:
            pts.append(float(p.start[k + 1]))
    out: list[float] = []
    for x in sorted(pts):
        if x <= tol or x >= L - tol or (out and x - out[-1] <= tol):
            continue
        # a sign change, not a touch: the moment on either side differs in sign
        d = max(1e-7 * L, 1e-12)
        lo = float(cr.sol.at("M", max(x - d, 0.0), side="right")[0])
        hi = float(cr.sol.at("M", min(x + d, L), side="left")[0])
        if lo * hi < 0 or abs(lo) < 1e-9 * scale <= abs(hi) or abs(hi) < 1e-9 * scale <= abs(lo):
            out.append(x)
    return out


RESULT_FIELDS = [
    Field("combo", kind="text", doc="the combination"),
    Field("factors", kind="text", doc="its factors"),
    Field("clause", kind="text", doc="its source (empty for one the sheet wrote)"),
    Field("leading", kind="text", doc="its leading variable case (generated combinations)"),
    Field("duration", kind="text", doc="shortest load-duration class of its actions (generated combinations)"),
    Field("M_max", MOM, "largest sagging moment"), Field("x_M_max", LEN, "where"),
    Field("V_at_M_max", FORCE, "shear acting with it"),
    Field("M_min", MOM, "largest hogging moment (negative)"), Field("x_M_min", LEN, "where"),
    Field("V_at_M_min", FORCE, "shear acting with it"),
    Field("V_max", FORCE, "largest shear in magnitude"), Field("x_V_max", LEN, "where"),
    Field("M_at_V_max", MOM, "moment acting with it"),
    Field("N_at_M_max", FORCE, "axial force acting with M_max, compression positive"),
    Field("N_at_M_min", FORCE, "axial force acting with M_min"),
    Field("N_max", FORCE, "largest axial compression"),
] + [Field(f.name, f.dim, f.doc + " (needs E and I in beam.solve)", optional=True) for f in [
    Field("delta_max", LEN, "largest deflection in magnitude"), Field("x_delta_max", LEN, "where"),
    Field("delta_down", LEN, "largest downward deflection (0 when none)"), Field("x_delta_down", LEN, "where"),
    Field("delta_up", LEN, "largest upward deflection, positive (0 when none)"), Field("x_delta_up", LEN, "where")]
] + [
    Field("n_M0", doc="number of points of zero moment inside the beam"),
    Field("x_M0_{i}", LEN, "point of zero moment i, left to right (contraflexure)"),
    Field("M_max_{i}", MOM, "largest sagging moment in span i"),
    Field("M_min_{i}", MOM, "largest hogging moment in span i"),
] + [Field(f"{p}_{c}", dim, doc, optional=True) for c in LETTERS for p, dim, doc in (
    ("R", FORCE, f"reaction at support {c}, upward (absent: no vertical restraint there)"),
    ("M", MOM, f"bending moment in the member at support {c} (absent: a free end or hinge)"),
    ("theta", "[angle]", f"slope at {c} (at a hinge: just to the right; needs E and I in beam.solve)"),
)]


@namespace.function("result", params=[_MEMBER, Param("combo", kind="text", doc="name of the combination",
                                                     default=None)],
                    fields=RESULT_FIELDS, returns="beam.combination")
def result(work, member, combo=None):
    """The results of one combination: extremes with their positions and concurrent actions, reactions,
    slopes at the supports, points of zero moment, maxima per span."""
    setup, res = _solved(work, member)
    cr = _combo(work, res, combo)
    lit = Lit(setup.units)
    u = setup.units
    model = setup.model
    X = model.nodes
    L = model.length
    cb = cr.combo
    out = {"combo": cb.name, "factors": cb.text, "clause": cb.clause, "leading": cb.leading,
           "duration": cb.duration}
    note = f"{cb.name}: exact, from the piecewise polynomials"
    out["M_max"] = work.let("M_max", lit.q(cr.M_max.value, "moment"), unit=u["moment"],
                            desc=extreme_label("sagging", cr.M_max.value), note=note + f", at x = {cr.M_max.x:.4g} m")
    out["x_M_max"] = lit.q(cr.M_max.x, "length")
    out["V_at_M_max"] = lit.q(cr.V_at(cr.M_max.x), "force")
    out["M_min"] = work.let("M_min", lit.q(cr.M_min.value, "moment"), unit=u["moment"],
                            desc=extreme_label("hogging", cr.M_min.value), note=note + f", at x = {cr.M_min.x:.4g} m")
    out["x_M_min"] = lit.q(cr.M_min.x, "length")
    out["V_at_M_min"] = lit.q(cr.V_at(cr.M_min.x), "force")
    out["V_max"] = work.let("V_max", lit.q(abs(cr.V_max.value), "force"), unit=u["force"],
                            desc="largest shear in magnitude", note=note + f", at x = {cr.V_max.x:.4g} m")
    out["x_V_max"] = lit.q(cr.V_max.x, "length")
    out["M_at_V_max"] = lit.q(cr.M_at(cr.V_max.x), "moment")
    out["N_at_M_max"] = lit.q(cr.N_at(cr.M_max.x), "force")
    out["N_at_M_min"] = lit.q(cr.N_at(cr.M_min.x), "force")
    out["N_max"] = lit.q(cr.N_max().value, "force")
    if setup.stiff:  # deflections need E and I
        out["delta_max"] = lit.q(abs(cr.d_max.value), "defl")
        out["x_delta_max"] = lit.q(cr.d_max.x, "length")
        out["delta_down"] = lit.q(max(0.0, cr.d_down.value), "defl")
        out["x_delta_down"] = lit.q(cr.d_down.x, "length")
        out["delta_up"] = lit.q(max(0.0, -cr.d_up.value), "defl")
        out["x_delta_up"] = lit.q(cr.d_up.x, "length")
    zs = zero_moment_points(cr, L)
    out["n_M0"] = work.q(len(zs), "")
    for i, z in enumerate(zs, 1):
        out[f"x_M0_{i}"] = lit.q(z, "length")
    if zs:
        work.note("Points of zero moment (contraflexure): x = " + ", ".join(f"{lit.value(z, 'length'):.4g} "
                                                                           f"{u['length']}" for z in zs) + ".")
    for k in range(len(model.spans)):
        out[f"M_max_{k + 1}"] = lit.q(cr.span_M[k][0].value, "moment")
        out[f"M_min_{k + 1}"] = lit.q(cr.span_M[k][1].value, "moment")
    Ls = letters(len(X))
    scaleT = abs(cr.theta_max.value)
    scaleR = max(float(np.max(np.abs(cr.sol.reactions))), 1e-300)
    for i, kind in enumerate(setup.kinds):
        if i >= 26:
            break
        c = Ls[i]
        if kind in ("pinned", "roller", "fixed"):
            out[f"R_{c}"] = lit.q(_clean(float(cr.sol.reactions[i]), scaleR), "force")
        if kind in ("pinned", "roller", "fixed", "guided"):
            out[f"M_{c}"] = lit.q(cr.support_M[i], "moment")
        side = "left" if i == len(X) - 1 else "right"
        if setup.stiff:
            out[f"theta_{c}"] = work.q(_clean(float(cr.sol.at("theta", float(X[i]), side=side)[0]), scaleT), "rad")
    return out


def tie(a: float, b: float) -> bool:
    return abs(a - b) <= TIE * max(abs(a), abs(b), 1e-300)


def moment_diagram(work, member, combo=None):
    """The bending moment of one combination of a solved beam, for other plugins (steel_design reads C_b and C_1
    from it): ``(M, L, name, pieces)`` with ``M(x)`` in N·m at x in m (sagging positive), the length in m, the
    combination's name and the pieces' ``(start, length, coefficients)`` (ascending powers of the local x)."""
    setup, res = _solved(work, member)
    cr = _combo(work, res, combo)
    L = setup.model.length
    p = cr.sol.pieces

    def M(x: float) -> float:
        x = min(max(float(x), 0.0), L)
        return float(cr.sol.at("M", x, side="right" if x < L else "left")[0])

    return M, L, cr.combo.name, (np.asarray(p.start, float), np.asarray(p.length, float), np.asarray(p.M, float))
