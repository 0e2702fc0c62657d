"""The traced working of one section: what the package shows a reviewer.

Order: drawing; closed-form formulas (single shapes) or the parts table with
its sums (composite shapes, built-up sections); centroid and second moments;
principal axes; fibre distances and elastic moduli; plastic moduli; radii of
gyration; shear properties; torsion; mass; parallel-axis properties; and the
check by Green's theorem, whose failure is an error. Formulas go through
``work.calc`` so they read like the sheet's own; results of a numerical
method go through ``work.let`` with the method in the note.
"""
from __future__ import annotations

import math
from functools import lru_cache

from calcsheet import units as U

from . import drawing
from .fields import ALIASES, NAMES, OPT_UNITS, OPTIONAL, UNITS
from .warping import Given, cubic_moment
from .shapes import ARC_SEGMENTS
from .properties import Basic, disagreement, green, properties, tabular

_COLUMN_SUMS = "sum of the column in the parts table"


@lru_cache(maxsize=None)
def unit(text: str):
    """A pint Unit parsed once: building quantities from unit strings is slow (pint re-parses each time)."""
    return U.registry().Unit(text)


@lru_cache(maxsize=None)
def _quantity_parts(unit_text: str):
    """The registry's quantity class and the units container of ``unit_text`` (looked up once per unit)."""
    return U.registry().Quantity, unit(unit_text)._units


def _q(value: float, unit_text: str):
    """``registry().Quantity(float(value), unit(unit_text))``, the same object made directly.

    pint's constructor, given a float and a unit, stores exactly these two attributes; on the way it creates
    a throw-away registry object and runs an import statement per quantity, which made it the larger part of a
    built-up section's parts tables (hundreds of cells). tests/plugins/section/test_section_quantities.py holds
    the two constructions equal.
    """
    cls, units = _quantity_parts(unit_text)
    q = object.__new__(cls)
    q._magnitude = float(value)
    q._units = units
    return q


def _mm(q) -> float | None:
    return None if q is None else float(q.m_as(unit("mm")))


def _snap(v: float, scale: float) -> float:
    """Round-off dust (1e-14 mm) shown as what it is: zero."""
    return 0.0 if abs(v) < scale else v


def _label(r) -> str:
    return r.name + (" (hole)" if r.sign < 0 and "hole" not in r.name.lower() else "")


def _compact_table_steps(work, shape) -> None:
    """The parallel-axis method in one table (a single material, no holes to explain): areas, centroids and
    second moments of the parts, then A, the centroid and I as the table's column sums."""
    rows = shape.rows
    sA = sum(r.sign * r.A for r in rows)
    xc = sum(r.sign * r.A * r.x for r in rows) / sA
    yc = sum(r.sign * r.A * r.y for r in rows) / sA
    scale = 1e-9 * (sum(abs(r.x) + abs(r.y) for r in rows) / len(rows) + 1.0)
    body, sums = [], [0.0] * 5
    for r in rows:
        a = r.sign * r.A
        dx, dy = _snap(r.x - xc, scale), _snap(r.y - yc, scale)
        vals = [r.sign * r.Iox, a * dy * dy, r.sign * r.Ioy, a * dx * dx, r.sign * r.Ioxy + a * dx * dy]
        sums = [p + v for p, v in zip(sums, vals)]
        body.append([_label(r), _q(a, "mm^2"), _q(r.x, "mm"), _q(r.y, "mm"), _q(vals[0], "mm^4"),
                     _q(vals[1], "mm^4"), _q(vals[2], "mm^4"), _q(vals[3], "mm^4")])
    work.table("Parts table: areas, centroids and second moments (parallel-axis theorem)",
               ["Part", "A_i", "x_i", "y_i", "I_o,x,i", "A_i·d_y,i²", "I_o,y,i", "A_i·d_x,i²"], body,
               units=[None, "mm^2", "mm", "mm", "mm^4", "mm^4", "mm^4", "mm^4"],
               footer=[["Σ", _q(sA, "mm^2"), "", "", _q(sums[0], "mm^4"), _q(sums[1], "mm^4"), _q(sums[2], "mm^4"),
                        _q(sums[3], "mm^4")]],
               note="d = yᵢ − ȳ and xᵢ − x̄ from the centroid below; Iₒ about each part's own centroid; rounded-off "
                    "corners are negative rows.")
    work.let("A", _q(sA, "mm^2"), unit="mm^2", desc="area", note="Σ Aᵢ, " + _COLUMN_SUMS)
    work.let("x_c", _q(xc, "mm"), unit="mm", desc="centroid, x", note="Σ Aᵢ·xᵢ / Σ Aᵢ over the table")
    work.let("y_c", _q(yc, "mm"), unit="mm", desc="centroid, y", note="Σ Aᵢ·yᵢ / Σ Aᵢ over the table")
    work.let("I_x", _q(sums[0] + sums[1], "mm^4"), unit="mm^4", desc="second moment about the centroidal x axis",
             note="Σ I_o,x + Σ A·d_y², sums of the columns in the parts table")
    work.let("I_y", _q(sums[2] + sums[3], "mm^4"), unit="mm^4", desc="second moment about the centroidal y axis",
             note="Σ I_o,y + Σ A·d_x², sums of the columns in the parts table")
    ixy = 0.0 if shape.symmetry != "none" else sums[4]
    work.let("I_xy", _q(ixy, "mm^4"), unit="mm^4", desc="product of area about the centroidal axes",
             note="the section is symmetric about an axis parallel to x or y" if shape.symmetry != "none"
             else "Σ (I_o,xy + A·d_x·d_y) over the parts")


def _table_steps(work, shape, transformed: bool) -> None:
    """The parallel-axis method in two tables: centroid, then second moments about it."""
    rows = shape.rows
    tr = transformed
    cols = ["Part"] + (["n", "A_i", "n·A_i"] if tr else ["A_i"]) + ["x_i", "y_i", "n·A_i·x_i" if tr else "A_i·x_i",
                                                                "n·A_i·y_i" if tr else "A_i·y_i"]
    units = [None] + ([None, "mm^2", "mm^2"] if tr else ["mm^2"]) + ["mm", "mm", "mm^3", "mm^3"]
    body = []
    sA = sAx = sAy = 0.0
    for r in rows:
        a = r.sign * r.A
        at = a * r.n
        sA, sAx, sAy = sA + at, sAx + at * r.x, sAy + at * r.y
        body.append([_label(r)]
                    + ([round(r.n, 4), _q(a, "mm^2"), _q(at, "mm^2")] if tr else [_q(a, "mm^2")])
                    + [_q(r.x, "mm"), _q(r.y, "mm"), _q(at * r.x, "mm^3"), _q(at * r.y, "mm^3")])
    foot = [["Σ"] + (["", "", _q(sA, "mm^2")] if tr else [_q(sA, "mm^2")]) + ["", "", _q(sAx, "mm^3"),
                                                                              _q(sAy, "mm^3")]]
    work.table("Parts table: areas and centroids" + (" (transformed, n = E_i/E_ref)" if tr else ""), cols, body,
               units=units, footer=foot,
               note="Holes are negative rows." + (" Each part counts at n times its area." if tr else ""))
    work.let("A", _q(sA, "mm^2"), unit="mm^2", desc="area" + (" (transformed)" if tr else ""),
             note="Σ " + ("n·" if tr else "") + "Aᵢ, " + _COLUMN_SUMS)
    work.let("Sigma_Ax", _q(sAx, "mm^3"), unit="mm^3", desc="first moment about the y axis", note=_COLUMN_SUMS)
    work.let("Sigma_Ay", _q(sAy, "mm^3"), unit="mm^3", desc="first moment about the x axis", note=_COLUMN_SUMS)
    work.calc("x_c", "Sigma_Ax/A", unit="mm", desc="centroid, x")
    work.calc("y_c", "Sigma_Ay/A", unit="mm", desc="centroid, y")
    xc, yc = work["x_c"].m_as(unit("mm")), work["y_c"].m_as(unit("mm"))
    i_scale = sum(abs(r.n) * (abs(r.Iox) + abs(r.Ioy) + r.A * ((r.x - xc) ** 2 + (r.y - yc) ** 2)) for r in rows)
    product = any(abs(r.Ioxy) > 1e-12 * i_scale or abs(r.n * r.A * (r.x - xc) * (r.y - yc)) > 1e-12 * i_scale
                  for r in rows)
    by_symmetry = product and getattr(shape, "symmetry", "none") != "none"  # spandrels' products cancel
    product = product and not by_symmetry
    scale = 1e-9 * (sum(abs(r.x) + abs(r.y) for r in rows) / len(rows) + 1.0)
    body_x, body_y, body_p = [], [], []
    sums = [0.0] * 6
    for r in rows:
        w = r.sign * r.n
        dx, dy = _snap(r.x - xc, scale), _snap(r.y - yc, scale)
        vals = [w * r.Iox, w * r.A * dy * dy, w * r.Ioy, w * r.A * dx * dx, w * r.Ioxy, w * r.A * dx * dy]
        sums = [a + v for a, v in zip(sums, vals)]
        label = _label(r)
        body_x.append([label, _q(vals[0], "mm^4"), _q(dy, "mm"), _q(vals[1], "mm^4"), _q(vals[0] + vals[1], "mm^4")])
        body_y.append([label, _q(vals[2], "mm^4"), _q(dx, "mm"), _q(vals[3], "mm^4"), _q(vals[2] + vals[3], "mm^4")])
        if product:  # the table of products is shown only then
            body_p.append([label, _q(vals[4], "mm^4"), _q(dx, "mm"), _q(dy, "mm"), _q(vals[5], "mm^4")])
    times_n = "; Iₒ and A count n times" if tr else ""
    work.table("Parts table: second moments about the centroidal x axis (parallel-axis theorem)",
               ["Part", "I_o,x,i", "d_y,i", "A_i·d_y,i²", "I_x,i"], body_x,
               units=[None, "mm^4", "mm", "mm^4", "mm^4"],
               footer=[["Σ", _q(sums[0], "mm^4"), "", _q(sums[1], "mm^4"), _q(sums[0] + sums[1], "mm^4")]],
               note=f"d = yᵢ − ȳ, each part's centroid above the section's; Iₒ is each part's second moment about "
                    f"its own centroid{times_n}; holes negative.")
    work.table("Parts table: second moments about the centroidal y axis (parallel-axis theorem)",
               ["Part", "I_o,y,i", "d_x,i", "A_i·d_x,i²", "I_y,i"], body_y,
               units=[None, "mm^4", "mm", "mm^4", "mm^4"],
               footer=[["Σ", _q(sums[2], "mm^4"), "", _q(sums[3], "mm^4"), _q(sums[2] + sums[3], "mm^4")]],
               note=f"d = xᵢ − x̄, each part's centroid right of the section's{times_n}.")
    if product:
        work.table("Parts table: product of area about the centroidal axes", ["Part", "I_o,xy,i", "d_x,i", "d_y,i",
                   "A_i·d_x,i·d_y,i"], body_p, units=[None, "mm^4", "mm", "mm", "mm^4"],
                   footer=[["Σ", _q(sums[4], "mm^4"), "", "", _q(sums[5], "mm^4")]])
    work.let("Sigma_Iox", _q(sums[0], "mm^4"), unit="mm^4", desc="parts' own second moments about x",
             note=_COLUMN_SUMS)
    work.let("Sigma_Ady2", _q(sums[1], "mm^4"), unit="mm^4", desc="transfer terms about x", note=_COLUMN_SUMS)
    work.let("Sigma_Ioy", _q(sums[2], "mm^4"), unit="mm^4", desc="parts' own second moments about y",
             note=_COLUMN_SUMS)
    work.let("Sigma_Adx2", _q(sums[3], "mm^4"), unit="mm^4", desc="transfer terms about y", note=_COLUMN_SUMS)
    work.calc("I_x", "Sigma_Iox + Sigma_Ady2", unit="mm^4", desc="second moment about the centroidal x axis")
    work.calc("I_y", "Sigma_Ioy + Sigma_Adx2", unit="mm^4", desc="second moment about the centroidal y axis")
    if product:
        work.let("Sigma_Ioxy", _q(sums[4], "mm^4"), unit="mm^4", desc="parts' own products of area",
                 note=_COLUMN_SUMS)
        work.let("Sigma_Adxdy", _q(sums[5], "mm^4"), unit="mm^4", desc="transfer terms of the product",
                 note=_COLUMN_SUMS)
        work.calc("I_xy", "Sigma_Ioxy + Sigma_Adxdy", unit="mm^4", desc="product of area about the centroidal axes")
    else:
        work.let("I_xy", _q(0.0, "mm^4"), unit="mm^4", desc="product of area about the centroidal axes",
                 note="the section is symmetric about an axis parallel to x or y" if by_symmetry
                 else "every part is symmetric about an axis parallel to x or y through its own centroid "
                 "and the transfer terms cancel")


class _Brief:
    """detail="brief": the same formulas, evaluated by the engine, shown compactly.

    For shapes that only feed a built-up section the reviewer needs A, the centroid
    and I in full (they enter the parts table); the other properties are listed as
    values three to a row, with their formulas in one paragraph beneath.
    """

    def __init__(self, work):
        self.work = work
        self.values = []
        self.formulas = []
        self.methods = []
        self.numerical = []  # (name, method): values of a numerical method other than Green's theorem

    def _take(self, name):
        step = self.work.working.items.pop()
        value = self.work[name]
        if hasattr(value, "m_as") and step.display_unit is not None:
            value = value.to(step.display_unit)
        self.values.append((name, value))

    def calc(self, name, formula, unit=None, desc=None, note=None):
        self.work.calc(name, formula, unit=unit, desc=desc)
        self._take(name)
        self.formulas.append(f"{name} = {formula}")

    def let(self, name, value, unit=None, desc=None, note=None):
        self.work.let(name, value, unit=unit, desc=desc, note=note)
        self._take(name)
        if note and not any(w in note for w in ("extreme vertex", "named", "density", "symmetric")):
            self.methods.append(name)

    def __getitem__(self, name):
        return self.work[name]

    def flush(self):
        rows, per = [], 4  # four name–value pairs a row keeps the table short (about a dozen rows)
        for k in range(0, len(self.values), per):
            row = []
            for name, value in self.values[k:k + per]:
                row += [name, value]
            rows.append(row + [""] * (2 * per - len(row)))
        self.work.table("Further properties", ["Property", "Value"] * per, rows, units=[None] * (2 * per))
        self.work.note("Formulas: " + "; ".join(self.formulas) + ".", kind="method")
        self.work.note("Found from the outline by Green's theorem (methods as in a full working): "
                       + ", ".join(self.methods) + ".", kind="method")
        if self.numerical:
            self.work.note("By " + self.numerical[0][1] + " (the centre-line model above): "
                           + ", ".join(n for n, _ in self.numerical) + ".", kind="method")


def _engine_basic(work) -> Basic:
    return Basic(*(work[n].m_as(unit(u)) for n, u in (("A", "mm^2"), ("x_c", "mm"), ("y_c", "mm"), ("I_x", "mm^4"),
                                                 ("I_y", "mm^4"), ("I_xy", "mm^4"))))


def report(work, shape, *, rho=None, x_ref=None, y_ref=None, transformed=False, J_steps=True,
           extra_notes=(), mass_note=None, detail="full", compact=False) -> dict:
    """Trace every standard property of ``shape`` into ``work`` and return the fields."""
    for message, param in shape.warnings:
        work.warn(message, param=param)
    vals = properties(shape, _mm(x_ref), _mm(y_ref))
    work.figure(drawing.draw(shape, vals), caption=f"{shape.label.split(' #')[0]} — to scale, dimensions in mm")
    for text in extra_notes:
        work.note(text)
    for st in shape.pre_steps:
        work.calc(st.name, st.formula, unit=st.unit, desc=st.desc)
    if shape.closed_form is not None:
        for st in shape.closed_form:
            work.calc(st.name, st.formula, unit=st.unit, desc=st.desc)
        if "I_xy" not in work.scope or work["I_xy"] is None or not hasattr(work["I_xy"], "m_as"):
            work.let("I_xy", _q(0.0, "mm^4"), unit="mm^4", desc="product of area about the centroidal axes",
                     note="the section is symmetric about a centroidal axis")
    else:
        if (compact or detail == "brief") and not transformed:  # brief: one parts table, sums as its footer
            _compact_table_steps(work, shape)
        else:
            _table_steps(work, shape, transformed)
    # the engine's values are the reported ones; they must match the core's tabular sums
    mine, engine = tabular(shape.rows), _engine_basic(work)
    worst = max(disagreement(mine, engine).values())
    if worst > 1e-9:
        work.fail(f"internal error: traced formulas and parts table differ by {worst:.2e} (please report)")

    rec = _Brief(work) if detail == "brief" else work
    if abs(vals["I_xy"]) > 1e-12 * (abs(vals["I_x"]) + abs(vals["I_y"])):
        rec.calc("I_m", "(I_x + I_y)/2", unit="mm^4", desc="centre of Mohr's circle")
        rec.calc("R_m", "sqrt(((I_x - I_y)/2)^2 + I_xy^2)", unit="mm^4", desc="radius of Mohr's circle")
        rec.calc("I_1", "I_m + R_m", unit="mm^4", desc="major principal second moment")
        rec.calc("I_2", "I_m - R_m", unit="mm^4", desc="minor principal second moment")
    else:
        rec.calc("I_1", "max(I_x, I_y)", unit="mm^4", desc="major principal second moment (I_xy = 0)")
        rec.calc("I_2", "min(I_x, I_y)", unit="mm^4", desc="minor principal second moment (I_xy = 0)")
    rec.let("theta_p", _q(math.degrees(vals["theta_p"]), "deg"), unit="deg", desc="principal angle",
             note="θp = ½·atan2(−2·Ixy, Ix − Iy): anticlockwise from the x axis to the axis of I1"
             if abs(vals["I_xy"]) > 1e-12 * (abs(vals["I_x"]) + abs(vals["I_y"]))
             else "Ixy = 0: the centroidal axes are principal")

    for name, desc in (("y_max", "level of the top fibre"), ("y_min", "level of the bottom fibre"),
                       ("x_min", "position of the left fibre"), ("x_max", "position of the right fibre")):
        rec.let(name, _q(vals[name], "mm"), unit="mm", desc=desc, note="extreme vertex of the outline")
    rec.calc("depth", "y_max - y_min", unit="mm", desc="overall depth")
    rec.calc("width", "x_max - x_min", unit="mm", desc="overall width")
    rec.calc("y_top", "y_max - y_c", unit="mm", desc="centroid to the top fibre")
    rec.calc("y_bot", "y_c - y_min", unit="mm", desc="centroid to the bottom fibre")
    rec.calc("x_left", "x_c - x_min", unit="mm", desc="centroid to the left fibre")
    rec.calc("x_right", "x_max - x_c", unit="mm", desc="centroid to the right fibre")
    rec.calc("S_x_top", "I_x/y_top", unit="mm^3", desc="elastic modulus, top fibre")
    rec.calc("S_x_bot", "I_x/y_bot", unit="mm^3", desc="elastic modulus, bottom fibre")
    rec.calc("S_y_left", "I_y/x_left", unit="mm^3", desc="elastic modulus, left fibre")
    rec.calc("S_y_right", "I_y/x_right", unit="mm^3", desc="elastic modulus, right fibre")
    rec.calc("S_x", "min(S_x_top, S_x_bot)", unit="mm^3", desc="governing elastic modulus about x")
    rec.calc("S_y", "min(S_y_left, S_y_right)", unit="mm^3", desc="governing elastic modulus about y")
    if transformed:
        work.note("Moduli are of the transformed section in reference-material units: the stress in part i is "
                  "n_i·M·y/I.")

    pna = "equal " + ("transformed " if transformed else "") + "area on each side, found exactly from the outline"
    rec.let("y_p", _q(vals["y_p"], "mm"), unit="mm", desc="horizontal plastic neutral axis", note=pna)
    rec.let("Z_x", _q(vals["Z_x"], "mm^3"), unit="mm^3", desc="plastic modulus about the horizontal axis",
             note="Zx = ∬|y − yp| dA, by Green's theorem over the outline cut at the plastic axis")
    rec.let("x_p", _q(vals["x_p"], "mm"), unit="mm", desc="vertical plastic neutral axis", note=pna)
    rec.let("Z_y", _q(vals["Z_y"], "mm^3"), unit="mm^3", desc="plastic modulus about the vertical axis",
             note="Zy = ∬|x − xp| dA, by Green's theorem over the outline cut at the plastic axis")

    rec.calc("r_x", "sqrt(I_x/A)", unit="mm", desc="radius of gyration about x")
    rec.calc("r_y", "sqrt(I_y/A)", unit="mm", desc="radius of gyration about y")
    rec.calc("r_min", "sqrt(I_2/A)", unit="mm", desc="least radius of gyration (minor principal axis)")

    rec.let("Q_x", _q(vals["Q_x"], "mm^3"), unit="mm^3", desc="first moment of the area above the neutral axis",
             note="Qx = ∬(y − yc) dA over the area above the centroidal x axis, from the outline cut there")
    tw = " (transformed: each part at n times its width)" if transformed else ""
    rec.let("t_x", _q(vals["t_x"], "mm"), unit="mm", desc="material width at the neutral axis" + tw,
             note="width of material cut by the centroidal x axis (at a step, the smaller side); shear stress τ = V·Qx/(Ix·tx)")
    rec.let("Q_y", _q(vals["Q_y"], "mm^3"), unit="mm^3", desc="first moment of the area right of the y axis",
             note="Qy = ∬(x − xc) dA over the area right of the centroidal y axis")
    rec.let("t_y", _q(vals["t_y"], "mm"), unit="mm", desc="material width cut by the centroidal y axis" + tw,
             note="width of material cut by the centroidal y axis")

    work.note("Torsion: " + shape.J_method + ".", kind="method")
    if J_steps and shape.J_steps:
        for st in shape.J_steps:
            rec.calc(st.name, st.formula, unit=st.unit, desc=st.desc)
    else:
        rec.let("J", _q(shape.J, "mm^4"), unit="mm^4", desc="torsion constant", note=shape.J_method)

    _warping(work, rec, shape, vals)

    if rho is not None:
        rec.calc("mass", "rho*A", unit="kg/m", desc="mass per length")
    elif vals["mass"] > 0:
        rec.let("mass", _q(vals["mass"], "kg/m"), unit="kg/m", desc="mass per length",
                 note=mass_note or "Σ ρ_i·A_i over the parts (actual areas, holes negative)")
    else:
        rec.let("mass", _q(0.0, "kg/m"), unit="kg/m", desc="mass per length: no material given",
                 note="no material (density) given, so no mass is computed; the field reads 0 kg/m")

    if y_ref is not None:
        rec.calc("I_x_ref", "I_x + A*(y_c - y_ref)^2", unit="mm^4", desc="second moment about the axis y = y_ref")
    else:
        rec.let("I_x_ref", work["I_x"], unit="mm^4", desc="second moment about y = y_ref",
                 note="no y_ref named: the centroidal axis")
    if x_ref is not None:
        rec.calc("I_y_ref", "I_y + A*(x_c - x_ref)^2", unit="mm^4", desc="second moment about the axis x = x_ref")
    else:
        rec.let("I_y_ref", work["I_y"], unit="mm^4", desc="second moment about x = x_ref",
                 note="no x_ref named: the centroidal axis")

    if detail == "brief":
        rec.flush()
    _agreement(work, shape, engine, table=detail != "brief")
    _snap_noise(work, max(vals["y_max"] - vals["y_min"], vals["x_max"] - vals["x_min"]))
    out = {name: work[name].to(unit(UNITS[name])) if name != "theta_p" else work[name] for name in NAMES}
    out["shape"] = shape.label
    out.update(optional_fields(work, shape))
    return out


NOISE = 1e-9  # relative to the section's size: round-off dust, far below any dimension a drawing states


def _noise_free(value, size: float):
    """A length-power quantity (mm, mm², mm³, mm⁴, mm⁶…) smaller than NOISE·D^k, D the section's larger overall
    dimension in mm and k the power of length, is floating-point round-off (x_s − x_c of a symmetric section
    gives 1.4e-14 mm): it is 0. Other quantities (angles, masses, ratios) are returned as they are."""
    units = getattr(value, "_units", None)
    if units is None or size <= 0:
        return value
    try:
        power = _length_power(units)
    except Exception:  # not a unit pint can convert: leave it
        return value
    if power is None:
        return value
    k, to_mm = power
    try:
        v = float(value.magnitude) * to_mm
    except Exception:  # an array: leave it
        return value
    if v != 0.0 and abs(v) < NOISE * size ** k:
        return value * 0.0
    return value


@lru_cache(maxsize=256)
def _length_power(units):
    """(k, factor to mm^k) for a unit of length to the power k; None for any other dimension (worked out once
    per unit: a section's working snaps hundreds of values in a handful of units)."""
    one = U.registry().Quantity(1.0, units)
    dims = dict(one.dimensionality)
    if set(dims) != {"[length]"}:
        return None
    k = dims["[length]"]
    return k, float(one.to(unit("mm") ** k).magnitude)


def _snap_noise(work, size: float) -> None:
    """Print round-off dust as 0 everywhere in this working (steps, tables) and in the values it returns."""
    from calcsheet.trace import Step, Table

    for item in work.working.items:
        if isinstance(item, Step):
            clean = _noise_free(item.value, size)
            if clean is not item.value:
                item.value = clean
                if work.scope.get(item.name) is not None:
                    work.scope[item.name] = _noise_free(work.scope[item.name], size)
        elif isinstance(item, Table):
            for row in list(item.rows) + list(item.footer or []):
                for k, cell in enumerate(row):
                    row[k] = _noise_free(cell, size)
    for name, value in list(work.scope.items()):
        work.scope[name] = _noise_free(value, size)


_DIMENSIONED = {name: dim for name, dim, _, _ in OPTIONAL}


def optional_fields(work, shape) -> dict:
    """The optional fields this working produced (and the European aliases of the standard ones)."""
    out = {}
    for name, u in OPT_UNITS.items():
        v = work.scope.get(name)
        if v is None or not hasattr(v, "m_as") or _DIMENSIONED[name] is None:
            continue
        if U.dim_of(v) != U.parse_dimension(_DIMENSIONED[name]):
            continue
        out[name] = v.to(unit(u))
    if "x_s" not in out and shape.symmetry == "double":
        for name, base in (("x_s", "x_c"), ("y_s", "y_c")):
            out[name] = work.scope[base].to(unit("mm"))
        out["x_0"] = out["y_0"] = _q(0.0, "mm")
        out["beta_x"] = _q(0.0, "mm")
        out["r_o"] = ((work.scope["I_x"] + work.scope["I_y"]) / work.scope["A"]) ** 0.5
        out["r_o"] = out["r_o"].to(unit("mm"))
    if shape.kind in ("ishape", "channel", "tee"):
        if "h" in out:
            out.setdefault("d", out["h"])
        if "b" in out:
            out.setdefault("b_f", out["b"])
    for alias, base in ALIASES.items():
        if alias in out:
            continue
        v = out.get(base) if base in out else work.scope.get(base) if base in NAMES else None
        if v is not None and hasattr(v, "m_as"):
            out[alias] = v.to(unit(OPT_UNITS[alias]))
    return out


def _warping(work, rec, shape, vals) -> None:
    """Shear centre, warping constant, monosymmetry property and r_ts, each traced (see warping.py)."""
    if shape.closed:
        work.note("Closed cell: under a torque T the wall carries the shear flow q = T/(2·A_m), the shear stress "
                  "τ = q/t; warping of a closed section is negligible and C_w is not given.", kind="method")
    if shape.sectorial is not None:
        _sectorial_table(work, shape.sectorial)
    for st in shape.warping:
        if isinstance(st, Given):
            if isinstance(rec, _Brief):
                rec.let(st.name, _q(st.value, st.unit), unit=st.unit, desc=st.desc)
                rec.numerical.append((st.name, st.note))
            else:
                rec.let(st.name, _q(st.value, st.unit), unit=st.unit, desc=st.desc, note=st.note)
        else:
            rec.calc(st.name, st.formula, unit=st.unit, desc=st.desc)
    if "x_s" not in work.scope:
        return  # doubly symmetric solids and cells: the shear centre is the centroid (given as fields, untraced)
    rec.calc("x_0", "x_s - x_c", unit="mm", desc="shear centre relative to the centroid, x")
    rec.calc("y_0", "y_s - y_c", unit="mm", desc="shear centre relative to the centroid, y")
    rec.calc("r_o", "sqrt(x_0^2 + y_0^2 + (I_x + I_y)/A)", unit="mm",
             desc="polar radius of gyration about the shear centre (AISC 360-16 E4-9)")
    if shape.symmetry in ("double", "horizontal"):
        rec.let("beta_x", _q(0.0, "mm"), unit="mm", desc="monosymmetry property",
                note="the section is symmetric about its x axis: β_x = 0")
    elif shape.symmetry == "vertical":
        m3 = cubic_moment(shape.rings, vals["x_c"], vals["y_c"])
        rec.let("Sigma_y3", _q(m3, "mm^5"), unit="mm^5", desc="∬y·(x² + y²) dA about the centroid",
                note="Green's theorem over the outline, 3-point Gauss–Legendre on each edge (exact for a polygon)")
        rec.calc("beta_x", "Sigma_y3/I_x - 2*y_0", unit="mm", desc="monosymmetry property β_x")
    if "C_w" in work.scope and shape.kind in ("ishape", "channel"):
        rec.calc("r_ts", "sqrt(sqrt(I_y*C_w)/S_x)", unit="mm",
                 desc="effective radius of gyration for LTB (AISC 360-16 F2-7)")


def _sectorial_table(work, model) -> None:
    """The centre-line model of the numerical warping analysis: each wall with its thickness and the normalised
    sectorial coordinate ω at its ends, each lumped corner area with its centroid."""
    walls, lumps, res = model
    rows = [[w.name, f"({w.p0[0]:.4g}, {w.p0[1]:.4g})", f"({w.p1[0]:.4g}, {w.p1[1]:.4g})",
             f"{w.t0:.4g} → {w.t1:.4g}", f"{res.omega[w.start]:.5g} → {res.omega[w.end]:.5g}"] for w in walls]
    rows += [[lp.name, f"({lp.x:.4g}, {lp.y:.4g})", "lumped", f"A = {lp.A:.4g} mm²", ""] for lp in lumps]
    work.table("Centre-line model for the warping analysis (mm; ω about the shear centre, mm²)",
               ["Wall or corner", "From", "To", "Thickness t", "ω (normalised)"], rows, units=[None] * 5,
               note=f"Shear centre ({res.x_s:.5g}, {res.y_s:.5g}) mm; area of the model {res.A:.6g} mm².")


def _agreement(work, shape, engine: Basic, table: bool = True) -> None:
    """The second, independent method: Green's theorem over the outline polygon."""
    g = green(shape.rings)
    diff = disagreement(engine, g)
    worst_name = max(diff, key=diff.get)
    worst = diff[worst_name]
    nverts = sum(len(r.x) for r in shape.rings)
    units = {"A": "mm^2", "x_c": "mm", "y_c": "mm", "I_x": "mm^4", "I_y": "mm^4", "I_xy": "mm^4"}
    rows = [[name, _q(a, units[name]), _q(b, units[name]), f"{diff[name]:.1e}"]
            for name, a, b in zip(units, engine.as_tuple(), g.as_tuple())]
    if table:
        work.table("Check by a second method: Green's theorem over the outline", ["Property", "Traced working",
                   "Outline integral", "Relative difference"], rows, units=[None, None, None, None],
                   note="Differences of the second moments are relative to Ix + Iy, of the centroid to √A.")
    arcs = f", arcs as {ARC_SEGMENTS}-sided polygons per full turn" if shape.has_arcs else ""
    if worst > shape.tolerance:
        work.fail(f"the two methods disagree: {worst_name} differs by {worst:.2e} (tolerance {shape.tolerance:.0e}); "
                  "the parts table and the outline do not describe the same section")
    how = ("to rounding (every relative difference below 1e-14)" if worst < 1e-14 else
           f"to a relative difference of {worst:.1e} at most ({worst_name})")
    work.note(f"Second method: Green's-theorem integration over the outline ({nverts} vertices{arcs}) agrees with "
              f"the traced working {how}; tolerance {shape.tolerance:.0e}.", kind="agreement")
