"""The ``section`` namespace: every shape, parts, holes and built-up sections.

Sheet form::

    ipe   = section.ishape(h=310 mm, b=165 mm, t_f=9.7 mm, t_w=5.8 mm, detail="brief")
    plate = section.part(shape=section.rectangle(b=200 mm, h=12 mm), x=0 mm, y=310 mm,
                         anchor="bottom-centre", E=70 GPa, rho=2700 kg/m^3, name="cover plate")
    bolt  = section.hole(shape=section.rectangle(b=22 mm, h=12 mm), x=-60 mm, y=316 mm)
    sec   = section.built_up(parts=[section.part(shape=ipe, anchor="bottom-centre"), plate, bolt],
                             E_ref=210 GPa)
    sigma [MPa] = M / sec.S_x_top

Coordinates: a shape's own origin is the bottom-left corner of its bounding
box (x right, y up), so ``y_ref=0 mm`` names its base; a polygon keeps the
coordinates it was given. In a built-up section each part is mirrored, then
rotated anticlockwise, then moved so its ``anchor`` point lies at (x, y).
Every function returns the same standard field set (fields.STANDARD), so any
section record can go to the beam and column plugins; ``mass`` is 0 kg/m when
no density is given.
"""
from __future__ import annotations

import hashlib

import numpy as np
from dataclasses import replace

from calcsheet.plugin import Field, Namespace, Param, Record
from calcsheet.trace import Figure, Note
from calcsheet import units as U

from . import builtup as B
from . import catalogue as C
from . import fillets as FL
from .fields import ALIASES, OPT_UNITS, UNITS
from . import shapes as S
from .fields import section_fields
from .report import _q, report, unit
from . import drawing
from .properties import properties

namespace = Namespace(
    "section", version="0.1.0",
    doc="Cross-section properties: shapes, polygons and built-up sections (holes, transformed materials), "
        "traced by the parallel-axis method and checked by Green's theorem.",
)

FIELDS = section_fields()
L = "[length]"
COMMON = [
    Param("rho", "[mass]/[length]**3", "density, for the mass per length", default=None),
    Param("x_ref", L, "a vertical axis x = x_ref (shape coordinates) for I_y_ref", default=None),
    Param("y_ref", L, "a horizontal axis y = y_ref (shape coordinates; 0 mm is the base) for I_x_ref",
          default=None),
    Param("detail", kind="text", doc='"full": every step; "brief": A, centroid and I in full, the rest in one table',
          default="full", choices=("full", "brief")),
]



def _record(work, out: dict, geometry) -> Record:
    """The result record, carrying its own geometry (a Shape or a Placed part) as the record's payload.

    The record is built here rather than by the host only so the payload can travel with it; its fields are
    checked against the declaration exactly as the host checks a returned dict (presence, dimension).
    """
    pf = work.plugin
    declared = {}
    for name, value in out.items():
        f = pf.field(name)
        if f is None:
            raise AssertionError(f"{pf.qualname} returned an undeclared field '{name}'")
        if f.kind_ == "quantity" and U.without_angle(U.dim_of(value)) != U.without_angle(f.dimension):
            raise AssertionError(f"{pf.qualname} field '{name}' has the wrong dimension")
        declared[name] = f
    absent = {}
    for f in pf.fields:
        if f.name not in out:
            if not f.optional:
                raise AssertionError(f"{pf.qualname} did not return its field '{f.name}'")
            absent[f.name] = f.doc
    return Record(type=pf.returns, fields=dict(out), working=work.working, source=pf.qualname, family=pf.family,
                  declared=declared, optional=absent, payload=geometry)


def _geometry(rec):
    return rec.payload if isinstance(rec, Record) else None


def _mm(q):
    return None if q is None else float(q.m_as(unit("mm")))


def _build(work, make):
    try:
        return make()
    except S.ShapeError as exc:
        work.fail(str(exc), param=exc.param)


def _section(work, shape, rho=None, x_ref=None, y_ref=None, **kw):
    if rho is not None:
        if rho.m_as("kg/m^3") <= 0:
            work.fail("rho must be greater than zero", param="rho")
        for r in shape.rows:
            r.rho = rho.m_as("kg/mm^3")
        shape.label += f", ρ = {rho.m_as('kg/m^3'):.10g} kg/m³"
    if shape.kind == "polygon":  # the label alone does not tell two outlines apart
        digest = hashlib.sha1(b"".join(np.round(r.x, 9).tobytes() + np.round(r.y, 9).tobytes()
                                       for r in shape.rings)).hexdigest()[:10]
        shape.label += f" #{digest}"
    out = report(work, shape, rho=rho, x_ref=x_ref, y_ref=y_ref, **kw)
    return _record(work, out, shape)


def _register(name, params, doc):
    def deco(func):
        return namespace.function(name, params=params, shared=True, fields=FIELDS, returns="section", doc=doc)(func)
    return deco


namespace.share(*COMMON)  # every shape takes rho, x_ref, y_ref and detail (as **common)


@_register("rectangle", [Param("b", L, "width"), Param("h", L, "depth")], "Solid rectangle b × h.")
def rectangle(work, b, h, **common):
    return _section(work, _build(work, lambda: S.rectangle(_mm(b), _mm(h))), **common)


@_register("box", [Param("b", L, "outside width"), Param("h", L, "outside depth"),
                   Param("t", L, "uniform wall", default=None),
                   Param("t_f", L, "top and bottom walls", default=None),
                   Param("t_w", L, "side walls", default=None),
                   Param("r_out", L, "outside corner radius (uniform wall t only)", default=None),
                   Param("r_in", L, "inside corner radius (uniform wall t only)", default=None),
                   Param("corners", kind="text", doc="corner radii by a product standard's rule: hot-finished "
                         "(EN 10210-2), cold-formed (EN 10219-2) or AISC HSS", default="sharp",
                         choices=("sharp", "EN 10210-2", "EN 10219-2", "AISC"))],
           "Hollow rectangle: uniform wall t, or walls t_f (top, bottom) and t_w (sides); corners sharp, or rounded "
           "by r_out/r_in or a product standard's rule.")
def box(work, b, h, t=None, t_f=None, t_w=None, r_out=None, r_in=None, corners="sharp", **common):
    if corners == "sharp" and r_out is None and r_in is None:
        return _section(work, _build(work, lambda: S.box(_mm(b), _mm(h), _mm(t), _mm(t_f), _mm(t_w))), **common)
    if t is None or t_f is not None or t_w is not None:
        work.fail("rounded corners need one uniform wall t", param="t" if t is None else "t_f" if t_f is not None
                  else "t_w")
    if corners != "sharp":
        if r_out is not None or r_in is not None:
            work.fail(f'give either corners="{corners}" or r_out and r_in, not both',
                      param="r_out" if r_out is not None else "r_in")
        ro, ri = C.hollow_radii(corners, _mm(t))
        work.calc("r_out", f"{ro / _mm(t):g}*t", unit="mm", desc=f"outside corner radius ({corners})")
        work.calc("r_in", f"{ri / _mm(t):g}*t", unit="mm", desc=f"inside corner radius ({corners})")
    else:
        if r_out is None or r_in is None:
            work.fail("give both corner radii r_out and r_in", param="r_in" if r_out is not None else "r_out")
        ro, ri = _mm(r_out), _mm(r_in)
    return _section(work, _build(work, lambda: FL.box(_mm(b), _mm(h), _mm(t), ro, ri)), **common)


@_register("circle", [Param("d", L, "diameter")], "Solid circle.")
def circle(work, d, **common):
    return _section(work, _build(work, lambda: S.circle(_mm(d))), **common)


@_register("tube", [Param("d", L, "outside diameter"), Param("t", L, "wall", default=None),
                    Param("d_i", L, "inside diameter", default=None)],
           "Circular tube: outside diameter d and wall t, or inside diameter d_i.")
def tube(work, d, t=None, d_i=None, **common):
    return _section(work, _build(work, lambda: S.tube(_mm(d), _mm(t), _mm(d_i))), **common)


R = Param("r", L, "root radius of the fillets (rolled sections); none: sharp corners", default=None)


@_register("ishape", [Param("h", L, "overall depth"), Param("b", L, "top flange width"),
                      Param("t_f", L, "top flange thickness"), Param("t_w", L, "web thickness"),
                      Param("b_bot", L, "bottom flange width (default b)", default=None),
                      Param("t_fb", L, "bottom flange thickness (default t_f)", default=None), R],
           "I-shape with equal flanges, or unequal ones via b_bot and t_fb; root fillets r.")
def ishape(work, h, b, t_f, t_w, b_bot=None, t_fb=None, r=None, **common):
    if r is not None:
        return _section(work, _build(work, lambda: FL.ishape(_mm(h), _mm(b), _mm(t_f), _mm(t_w), _mm(r), _mm(b_bot),
                                                             _mm(t_fb))), **common)
    return _section(work, _build(work, lambda: S.ishape(_mm(h), _mm(b), _mm(t_f), _mm(t_w), _mm(b_bot), _mm(t_fb))),
                    **common)


@_register("channel", [Param("h", L, "overall depth"), Param("b", L, "flange width"),
                       Param("t_f", L, "flange thickness"), Param("t_w", L, "web thickness"), R],
           "Channel (parallel flanges), web on the left, flanges pointing right; root fillets r.")
def channel(work, h, b, t_f, t_w, r=None, **common):
    if r is not None:
        return _section(work, _build(work, lambda: FL.channel(_mm(h), _mm(b), _mm(t_f), _mm(t_w), _mm(r))), **common)
    return _section(work, _build(work, lambda: S.channel(_mm(h), _mm(b), _mm(t_f), _mm(t_w))), **common)


@_register("tee", [Param("h", L, "overall depth"), Param("b", L, "flange width"),
                   Param("t_f", L, "flange thickness"), Param("t_w", L, "stem thickness"), R],
           "Tee, flange on top; root fillets r.")
def tee(work, h, b, t_f, t_w, r=None, **common):
    if r is not None:
        return _section(work, _build(work, lambda: FL.tee(_mm(h), _mm(b), _mm(t_f), _mm(t_w), _mm(r))), **common)
    return _section(work, _build(work, lambda: S.tee(_mm(h), _mm(b), _mm(t_f), _mm(t_w))), **common)


@_register("angle", [Param("h", L, "vertical leg"), Param("t", L, "leg thickness"),
                     Param("b", L, "horizontal leg (default h: equal angle)", default=None), R],
           "Equal or unequal angle, heel at the bottom-left; root fillet r.")
def angle(work, h, t, b=None, r=None, **common):
    if r is not None:
        if b is None:
            work.calc("b", "h", unit="mm", desc="horizontal leg (equal angle)")
        return _section(work, _build(work, lambda: FL.angle(_mm(h), _mm(b if b is not None else h), _mm(t), _mm(r))),
                        **common)
    return _section(work, _build(work, lambda: S.angle(_mm(h), _mm(t), _mm(b))), **common)


@_register("triangle", [Param("b", L, "base"), Param("h", L, "height"),
                        Param("form", kind="text", doc="right angle at the bottom-left, or isosceles",
                              default="right", choices=("right", "isosceles"))],
           "Right or isosceles triangle on its base.")
def triangle(work, b, h, form="right", **common):
    return _section(work, _build(work, lambda: S.triangle(_mm(b), _mm(h), form)), **common)


@_register("semicircle", [Param("d", L, "diameter")], "Semicircle, flat side down.")
def semicircle(work, d, **common):
    return _section(work, _build(work, lambda: S.semicircle(_mm(d))), **common)


@_register("polygon", [Param("points", L, "outline vertices (x, y) in order", kind="points")],
           "Any simple polygon, given by its vertices in order (either direction).")
def polygon(work, points, **common):
    pts = [(_mm(px), _mm(py)) for px, py in points]
    return _section(work, _build(work, lambda: S.polygon(pts)), **common)


# ---------------------------------------------------------------- built-up sections

PLACE = [
    Param("shape", kind="record", record="section", doc="any section (a shape, polygon or built-up section)"),
    Param("x", L, "x of the anchor point in the built-up frame", default=None),
    Param("y", L, "y of the anchor point in the built-up frame", default=None),
    Param("anchor", kind="text", doc="point of the moved part placed at (x, y)", choices=B.ANCHORS,
          default=None),
    Param("rotate", "[angle]", "anticlockwise rotation about the shape's origin", default=None),
    Param("mirror", kind="text", doc="flip before rotating", choices=B.MIRRORS, default="none"),
    Param("name", kind="text", doc="label in the parts table", default=None),
]
PART_FIELDS = [
    Field("A", "[length]**2", "area of the part (actual, untransformed)"),
    Field("x_c", L, "centroid x in the built-up frame"),
    Field("y_c", L, "centroid y in the built-up frame"),
    Field("role", kind="text", doc='"part" or "hole"'),
    Field("shape", kind="text", doc="key to the placed outline"),
]
_COUNT = {"part": 0, "hole": 0}


def _placed(work, role, shape, x, y, anchor, rotate, mirror, name, E=None, rho=None):
    geom = _geometry(shape)
    if not isinstance(geom, S.Shape):
        work.fail("this section record carries no outline; build it with a section function", param="shape")
    if E is not None and E.m_as("MPa") <= 0:
        work.fail("E must be greater than zero", param="E")
    if rho is not None and rho.m_as("kg/m^3") <= 0:
        work.fail("rho must be greater than zero", param="rho")
    anchor = anchor or ("centroid" if role == "hole" else "bottom-left")
    moved = _build(work, lambda: B.place(geom, _mm(x) or 0.0, _mm(y) or 0.0, anchor,
                                         rotate.m_as("radian") if rotate is not None else 0.0, mirror))
    rho_mm = rho.m_as("kg/mm^3") if rho is not None else None
    if rho_mm is not None:
        moved.rows = [replace(r, rho=rho_mm) for r in moved.rows]
    from .properties import tabular

    b = tabular(moved.rows)
    digest = hashlib.sha1(repr((shape.fields.get("shape"), _mm(x), _mm(y), anchor,
                                rotate.m_as("radian") if rotate is not None else 0.0, mirror, name, role,
                                E.m_as("MPa") if E is not None else None, rho_mm)).encode()).hexdigest()[:10]
    label = name or f"{role} ({geom.label.split(' #')[0]})"
    key = f"{role} {label} #{digest}"
    placed = B.Placed(label, role, moved, E.m_as("MPa") if E is not None else None, rho_mm)
    work.note(f"{'Hole' if role == 'hole' else 'Part'} '{label}': {geom.label.split(' #')[0]}, "
              f"{'mirrored ' + mirror + ', ' if mirror != 'none' else ''}"
              f"rotated {rotate.m_as('deg') if rotate is not None else 0:g}°, {anchor} at "
              f"({_mm(x) or 0:g}, {_mm(y) or 0:g}) mm" + (f", E = {E.m_as('MPa'):g} MPa" if E is not None else ""))
    return _record(work, {"A": _q(abs(b.A), "mm^2"), "x_c": _q(b.x_c, "mm"), "y_c": _q(b.y_c, "mm"),
                          "role": role, "shape": key}, placed)


@namespace.function("part", params=PLACE + [
    Param("E", "[pressure]", "elastic modulus of this part's material (default: the reference material)",
          default=None),
    Param("rho", "[mass]/[length]**3", "density of this part, for the mass per length", default=None)],
    fields=PART_FIELDS, returns="part",
    doc="A shape placed in a built-up section: mirrored, rotated, then its anchor moved to (x, y).")
def part(work, shape, x=None, y=None, anchor=None, rotate=None, mirror="none", name=None, E=None, rho=None):
    return _placed(work, "part", shape, x, y, anchor, rotate, mirror, name, E, rho)


@namespace.function("hole", params=PLACE, fields=PART_FIELDS, returns="part",
                    doc="A hole (bolt hole, cut-out) placed like a part; its anchor defaults to its centroid.")
def hole(work, shape, x=None, y=None, anchor=None, rotate=None, mirror="none", name=None):
    return _placed(work, "hole", shape, x, y, anchor, rotate, mirror, name)


@namespace.function("built_up", params=[
    Param("parts", kind="list", record="part", doc="parts and holes, from section.part and section.hole"),
    Param("E_ref", "[pressure]", "reference elastic modulus (default: the first part's E)", default=None),
    Param("x_ref", L, "a vertical axis x = x_ref for I_y_ref", default=None),
    Param("y_ref", L, "a horizontal axis y = y_ref for I_x_ref", default=None),
    Param("detail", kind="text", doc='"full" or "brief" (see the shapes)', default="full",
          choices=("full", "brief"))],
    fields=FIELDS, returns="section",
    doc="A section assembled from parts and holes; other materials by the transformed-section method.")
def built_up(work, parts, E_ref=None, x_ref=None, y_ref=None, detail="full"):
    placed = []
    for k, rec in enumerate(parts):
        p = _geometry(rec)
        if not isinstance(p, B.Placed):
            work.fail(f"item {k + 1} of parts was not made by section.part or section.hole",
                      param="parts")
        placed.append(p)
    names = [p.name for p in placed]
    for k, p in enumerate(placed):  # make repeated names distinct in the table
        if names.count(p.name) > 1:
            placed[k] = B.Placed(f"{p.name} [{k + 1}]", p.role, p.shape, p.E, p.rho)
    E_mpa = E_ref.m_as("MPa") if E_ref is not None else None
    asm = _build(work, lambda: B.assemble(placed, E_mpa))
    transformed = any(abs(n - 1.0) > 1e-12 for n in asm.n)
    notes = []
    if asm.E_ref is not None and transformed:
        notes.append(f"Transformed section: the reference material has E = {asm.E_ref:g} MPa; each part counts "
                     "at n = E of the part / E of the reference (parts without E are of the reference material).")
    out = report(work, asm.shape, x_ref=x_ref, y_ref=y_ref, transformed=transformed, extra_notes=notes,
                 detail=detail)
    if asm.E_ref is not None and transformed:
        out["E_ref"] = _q(asm.E_ref, "MPa")
        out["n_max"] = U.registry().Quantity(max(asm.n), "")
    return _record(work, out, asm.shape)


# ---------------------------------------------------------------- catalogue sections


COMPARED = (("A", "mm^2", 0.01), ("I_x", "mm^4", 0.01), ("I_y", "mm^4", 0.01), ("S_x", "mm^3", 0.01),
            ("S_y", "mm^3", 0.01), ("Z_x", "mm^3", 0.01), ("Z_y", "mm^3", 0.01), ("r_x", "mm", 0.01),
            ("r_y", "mm", 0.01), ("J", "mm^4", 0.02), ("C_w", "mm^6", 0.02), ("r_o", "mm", 0.02))
# properties the model gives where the table gives dimensions only (UPN)
MODEL_ONLY = ("A", "I_x", "I_y", "S_x", "S_y", "Z_x", "Z_y", "r_x", "r_y", "J", "C_w", "x_c", "A_m")
STEEL_DENSITY = C.STEEL_DENSITY


def _slope_text(g):
    return f"{100 * g['slope']:.4g} %"


def _model_note(entry) -> str:
    m, g = entry.model, entry.dims
    if m == "I":
        if entry.derived_profile is not None:
            return ("rolled I with parallel flanges and four root fillets of radius r, which the table does not give: "
                    "derived from its own " + ", ".join(entry.derived_profile["fitted"])
                    + " (least squares; catalogue/aisc_v16_derived.csv)")
        return "rolled I with parallel flanges and four root fillets of radius r"
    if m in ("I-tapered", "C-tapered", "T-tapered"):
        what = {"I-tapered": "I with tapered flanges", "C-tapered": "channel with tapered flanges",
                "T-tapered": "tee cut from a tapered-flange I"}[m]
        where = ("t_f measured b/2 from the back of the web" if entry.family == "UPN" and g["u"] == g["b"] / 2
                 else "t_f their mean thickness, at the middle of the outstand")
        fit = entry.derived_profile
        if fit is not None:
            src = f"of {fit['parent']}" if "parent" in fit else "row"
            slope = " (the slope too)" if entry.family == "MC" else ""
            return (f"{what}, inner faces sloping {_slope_text(g)}, {where}; root fillets r and toe radii r/2, which "
                    f"the table does not give: derived{slope} from the table {src}'s own "
                    + ", ".join(fit["fitted"]) + " (least squares; catalogue/aisc_v16_derived.csv)")
        toes = "toe radii r_toe" if g.get("r_toe") else "toe radii not modelled (not tabulated)"
        root = "root fillets r" + (" from k_des (k_des − root thickness of the flange = the fillet's tangent "
                                   "length on the web)" if entry.source == C.AISC_SOURCE else "")
        return f"{what}, inner faces sloping {_slope_text(g)}, {where}; {root}; {toes}"
    return {
        "C": "channel with parallel flanges of the tabulated t_f and two root fillets r (an MC's own flange slope, "
             "which varies by size and is not tabulated, is not modelled)",
        "T": "tee cut from a rolled I, two root fillets of radius r"
             + (f" (derived for {entry.derived_profile['parent']}, the shape it is cut from)"
                if entry.derived_profile else ""),
        "L": "angle with a root fillet of radius r (toe radii not modelled)",
        "2L": "two angles back to back at the designation's spacing, each with its root fillet r from the single "
              "angle's k_des (toe radii not modelled)",
        "box-aisc": "rectangular HSS of the design wall t = t_des, corner radii 2·t outside and t inside "
                    "(AISC Manual, Part 1)",
        "box-en": "hot-finished hollow section, corner radii 1.5·t outside and 1.0·t inside (EN 10210-2:2019)",
        "box-cf": "cold-formed hollow section, corner radii by the wall: outside 2·t, 2.5·t or 3·t for t ≤ 6 mm, "
                  "6 < t ≤ 10 mm and t > 10 mm, inside one t less (EN 10219-2:2019)",
        "tube": "circular tube of the (design) wall t",
    }[m]


_TABLE_UNITS = {"mm": ("in", "mm"), "mm^2": ("in^2", "cm^2"), "mm^3": ("in^3", "cm^3"), "mm^4": ("in^4", "cm^4"),
                "mm^6": ("in^6", "cm^6"), "kg/m": ("lb/ft", "kg/m")}


def _table_unit(entry, name):
    """The unit the table prints ``name`` in: inches and lb/ft (AISC); mm, cm², cm⁴… and radii of gyration in cm
    (European tables)."""
    aisc = entry.source == C.AISC_SOURCE
    if not aisc and name in ("r_x", "r_y", "r_min", "x_c"):
        return "cm"
    return _TABLE_UNITS[OPT_UNITS.get(name) or UNITS[name]][0 if aisc else 1]


_SUPER = str.maketrans("0123456789-", "⁰¹²³⁴⁵⁶⁷⁸⁹⁻")


def _published(entry, name, value) -> str:
    """A table value as the table prints it (its own unit, its own digits)."""
    u = _table_unit(entry, name)
    v = _q(value, OPT_UNITS.get(name) or UNITS.get(name)).m_as(unit(u))
    text = f"{v:.6g}"
    if "e" in text:
        mant, exp = text.split("e")
        text = f"{mant}×10{str(int(exp)).translate(_SUPER)}"
    return f"{text} {u.replace('^2', '²').replace('^3', '³').replace('^4', '⁴').replace('^6', '⁶')}"


def _model(work, entry):
    g = entry.dims
    dims = []

    def let(n, v, d, shown=None):  # the model's dimensions, from the row: one table, bound for the formulas below
        work.scope[n] = _q(v, "mm")
        dims.append((n, shown or _published(entry, {"h": "d", "b": "b_f", "r_toe": "r", "gap": "t"}.get(n, n), v), d))

    shape = _model_shape(work, entry, g, let, dims)
    cells = [c for n, v, d in dims for c in (n, v, d)]
    cells += [""] * (-len(cells) % 6)
    work.table(f"Dimensions of the model, from the table row {entry.designation}", ["Symbol", "Value", "Meaning"] * 2,
               [cells[k:k + 6] for k in range(0, len(cells), 6)], units=[None] * 6)
    return shape


def _model_shape(work, entry, g, let, dims):
    m = entry.model
    aisc = entry.source == C.AISC_SOURCE
    if m in ("I", "I-tapered", "C-tapered", "C", "T", "T-tapered"):
        for n, d in (("h", "overall depth"), ("b", "flange width"),
                     ("t_f", "flange thickness" + ((" (mean)" if aisc else " (at its reference point)")
                                                   if m.endswith("tapered") else "")),
                     ("t_w", "web thickness")):
            let(n, g[n], d)
        fit = entry.derived_profile
        derived = aisc and (m.endswith("tapered") or fit is not None)  # r computed here: four digits, not as tabulated
        how = (" (derived from the table's " + ", ".join(fit["fitted"])
               + (f" of {fit['parent']}" if "parent" in fit else "") + ")" if fit is not None
               else " (from k_des and the taper)" if m.endswith("tapered") else " (k_des − t_f)") if aisc else ""
        let("r", g.get("r", 0.0), "root radius" + how,
            shown=_model_cell(entry, "r", g.get("r", 0.0), 4) if derived else None)
        if m.endswith("tapered"):
            work.scope["slope"] = U.registry().Quantity(g["slope"], "")
            dims.append(("slope", _slope_text(g), "slope of the inner flange faces"
                         + (" (derived from the table's values)" if entry.family == "MC" else "")))
            if g.get("r_toe"):
                let("r_toe", g["r_toe"], "toe radius" + (" (r/2)" if fit is not None else ""),
                    shown=_model_cell(entry, "r", g["r_toe"], 4) if derived else None)
        if m == "T":
            return FL.tee(g["h"], g["b"], g["t_f"], g["t_w"], g["r"])
        if m == "T-tapered":
            return FL.tapered_tee(g["h"], g["b"], g["t_f"], g["t_w"], g["r"], g["slope"], r_toe=g.get("r_toe", 0.0))
        if m == "C-tapered":
            return FL.tapered_channel(g["h"], g["b"], g["t_f"], g["t_w"], g["r"], g["slope"], g.get("r_toe", 0.0),
                                      g.get("u"))
        if m == "C":
            return FL.channel(g["h"], g["b"], g["t_f"], g["t_w"], g["r"])
        if m == "I-tapered":
            return FL.tapered_ishape(g["h"], g["b"], g["t_f"], g["t_w"], g["r"], g["slope"], g.get("r_toe", 0.0))
        return FL.ishape(g["h"], g["b"], g["t_f"], g["t_w"], g["r"])
    if m in ("L", "2L"):
        let("h", g["h"], "vertical leg" + (" d" if m == "L" else "s (back to back)"))
        let("b", g["b"], "horizontal leg" + (" b" if m == "L" else "s"))
        let("t", g["t"], "leg thickness")
        let("r", g["r"], "root radius (k_des − t" + (" of the single angle)" if m == "2L" else ")"))
        if m == "L":
            return FL.angle(g["h"], g["b"], g["t"], g["r"])
        let("gap", g["gap"], "spacing between the backs of the angles")
        return FL.double_angle(g["h"], g["b"], g["t"], g["r"], g["gap"])
    if m in ("box-aisc", "box-en", "box-cf"):
        std = {"box-aisc": "AISC", "box-en": "EN 10210-2", "box-cf": "EN 10219-2"}[m]
        ro, ri = C.hollow_radii(std, g["t"])
        let("h", g["h"], "outside depth")
        let("b", g["b"], "outside width")
        let("t", g["t"], "wall" + (" (design wall t_des)" if m == "box-aisc" else ""))
        work.scope["r_out"], work.scope["r_in"] = _q(ro, "mm"), _q(ri, "mm")
        dims.append(("r_out", f"{ro / g['t']:g}·t", f"outside corner radius ({std})"))
        dims.append(("r_in", f"{ri / g['t']:g}·t", f"inside corner radius ({std})"))
        return FL.box(g["b"], g["h"], g["t"], ro, ri)
    if m == "tube":
        let("d", g["d"], "outside diameter")
        let("t", g["t"], "wall" + (" (design wall t_des)" if aisc else ""))
        return S.tube(g["d"], g["t"])
    raise AssertionError(m)  # pragma: no cover


COMPACT_FIGURE = (190.0, 150.0)  # px: the drawing of a catalogue section in the compact working


def _silent_report(work, shape):
    """The model's properties by the same traced working as detail="full", kept out of the package (the values
    are identical). Returns them and what stays: a smaller drawing, any warning, and the one-line agreement of
    the two methods, to be placed after the comparison with the table."""
    start = len(work.working.items)
    out = report(work, shape, detail="brief", compact=True)
    kept = []
    for it in work.working.items[start:]:
        if isinstance(it, Figure):
            kept.append(Figure(drawing.draw(shape, properties(shape), box=COMPACT_FIGURE), it.caption))
        elif isinstance(it, Note) and it.kind in ("warning", "agreement"):
            kept.append(it)
    del work.working.items[start:]
    return out, kept


def _model_cell(entry, name, value, digits: int = 5) -> str:
    """A model value in the table's unit, one significant digit more than tables print (5)."""
    u = _table_unit(entry, name)
    v = _q(value, OPT_UNITS.get(name) or UNITS.get(name)).m_as(unit(u))
    text = f"{v:.{digits}g}"
    if "e" in text:
        mant, exp = text.split("e")
        text = f"{mant}×10{str(int(exp)).translate(_SUPER)}"
    return f"{text} {u.replace('^2', '²').replace('^3', '³').replace('^4', '⁴').replace('^6', '⁶')}"


@namespace.function("rolled", params=[
    Param("designation", kind="text", doc='catalogue designation: "W18X50", "IPE 300", "HE 300 B", "UPN 200", '
                                          '"HSS8X8X1/2", "RHS 150x100x6.3", "2L4X4X1/2X3/8" …'),
    Param("x_ref", L, "a vertical axis x = x_ref for I_y_ref", default=None),
    Param("y_ref", L, "a horizontal axis y = y_ref (0 mm is the base) for I_x_ref", default=None),
    Param("detail", kind="text", doc='"compact": the table row, the model\'s dimensions and the comparison; '
                                     '"full": also the model\'s whole parallel-axis working', default="compact",
          choices=("compact", "full"))],
    fields=FIELDS, returns="section",
    doc="A rolled or hollow section from a published table: the table's values, beside the section's own "
        "geometric model (fillets, corner radii, tapered flanges) and their deviation.")
def rolled(work, designation, x_ref=None, y_ref=None, detail="compact"):
    if len(designation) > 40:
        work.fail(f"a designation is a short name such as W18X50 or IPE 300 (this one has {len(designation)} "
                  "characters)", param="designation")
    entry = C.lookup(designation)
    if entry is None:
        near = C.nearest(designation)
        work.fail(f"no section '{designation}' in the catalogue", param="designation",
                  hint=("nearest: " + ", ".join(near)) if near else
                  "families: W, M, S, HP, C, MC, L, 2L, WT, MT, ST, HSS, Pipe (AISC v16.0); IPE, HE…A/B/M, UPN, CHS, "
                  "SHS, RHS; cold-formed CFRHS/CFSHS HxBxT of any size")
    work.note(f"{entry.designation}: {entry.source}; data file catalogue/{entry.file}. Geometric model: "
              + _model_note(entry) + ". The record's fields take the table's values where the table gives "
              "them, the model's otherwise.", kind="method")
    compared = {name for name, _, _ in COMPARED}
    others = [(n, v) for n, v in entry.values.items() if n not in compared and n not in entry.dims
              and n not in entry.derived and not (n in ("d", "b_f", "t") and entry.model != "tube")]
    if others:
        cells = [c for n, v in others for c in (n, _published(entry, n, v))]
        cells += [""] * (-len(cells) % 6)
        work.table(f"Further values of the table row {entry.designation}", ["Property", "Table"] * 3,
                   [cells[k:k + 6] for k in range(0, len(cells), 6)], units=[None] * 6)
    shape = _build(work, lambda: _model(work, entry))
    if detail == "full":
        out, after = report(work, shape, detail="brief", compact=True), []
    else:
        out, after = _silent_report(work, shape)
    rows, worst = [], []
    for name, u, tol in COMPARED:
        if name not in entry.values or name not in out:
            continue
        tv, mv = entry.values[name], out[name].m_as(unit(u))
        dev = (mv - tv) / tv if tv else 0.0
        rows.append([name, _published(entry, name, tv), _model_cell(entry, name, mv), f"{100 * dev:+.2f} %",
                     f"{100 * tol:.0f} %"])
        if abs(dev) > tol:
            worst.append(f"{name} {100 * dev:+.1f} %")
    if rows:
        work.table(f"Table row {entry.designation} ({entry.source}) against the geometric model",
                   ["Property", "Table", "Model", "Deviation", "Tolerance"], rows, units=[None] * 5,
                   note="Table values as published, in the table's units; deviation = (model − table)/table.")
    else:
        if entry.model == "C-tapered":
            work.note("C_w and the shear centre of this channel come from a thin-walled sectorial integration over "
                      "its centre line with the tapered flanges' varying thickness, the fillets and rounded toes "
                      "lumped at their centroids, and the walls' own thick-wall term; against a finite-element warping "
                      "analysis of the same outline C_w agrees within 1 % (UPN 50 to 400) and the shear centre within "
                      "1.5 mm.", kind="method")
        cells = [c for n in MODEL_ONLY if n in out
                 for c in (n, _model_cell(entry, n, out[n].m_as(unit(OPT_UNITS.get(n) or UNITS[n]))))]
        cells += [""] * (-len(cells) % 6)
        work.table(f"Properties of {entry.designation} from its geometric model (the table gives dimensions only)",
                   ["Property", "Model"] * 3, [cells[k:k + 6] for k in range(0, len(cells), 6)], units=[None] * 6,
                   note="x_c: centroid from the back of the web." if entry.model == "C-tapered" else None)
    if worst:
        work.warn(f"the geometric model of {entry.designation} deviates from the table beyond tolerance: "
                  + ", ".join(worst), param="designation")
    elif rows:
        work.note(f"The geometric model agrees with the table within tolerance for all {len(rows)} compared "
                  "properties.", kind="method")
    work.working.items.extend(after)
    for name, v in entry.values.items():
        if name not in entry.derived:
            out[name] = _q(v, UNITS.get(name) or OPT_UNITS.get(name))
    if "mass" not in entry.values or "mass" in entry.derived:
        work.scope["rho_s"] = U.registry().Quantity(STEEL_DENSITY, unit("kg/m^3"))
        work.calc("mass", "rho_s*A", unit="kg/m", desc="nominal mass per length, steel at ρ = 7850 kg/m³")
        out["mass"] = work["mass"].to(unit("kg/m"))
    for name, base, dist in (("S_x_top", "I_x", "y_top"), ("S_x_bot", "I_x", "y_bot"), ("S_y_left", "I_y", "x_left"),
                             ("S_y_right", "I_y", "x_right")):
        out[name] = (out[base] / out[dist]).to(unit("mm^3"))
    if "I_2" not in entry.values and abs(out["I_xy"].m_as(unit("mm^4"))) <= 1e-9 * out["I_x"].m_as(unit("mm^4")):
        out["I_1"], out["I_2"] = max(out["I_x"], out["I_y"]), min(out["I_x"], out["I_y"])  # principal axes x, y
        out["r_min"] = min(out["r_x"], out["r_y"])  # the table's own radius (its I/A is rounded differently)
    # reference-axis moments from the record's own (table) I and A, with the model's centroid: mixing the
    # model's I with the table's A would break the parallel-axis theorem by the model's deviation
    _reference_moments(work, out, x_ref, y_ref)
    for alias, base in ALIASES.items():
        if base in out:
            out[alias] = out[base].to(unit(OPT_UNITS[alias]))
    out["designation"] = entry.designation
    out["source"] = entry.source
    out["shape"] = f"{entry.designation} ({entry.source.split(' (')[0]})"
    return _record(work, out, shape)


def _reference_moments(work, out, x_ref, y_ref):
    """I_x_ref and I_y_ref by the parallel-axis theorem, from the record's I and A (the table's where it gives
    them) and the centroid of the geometric model (the tables give no centroid for most families)."""
    for ref, base, c, name, axis in ((y_ref, "I_x", "y_c", "I_x_ref", "y"), (x_ref, "I_y", "x_c", "I_y_ref", "x")):
        if ref is None:
            out[name] = out[base]
            continue
        work.scope[f"{base}_rec"] = out[base]
        work.scope["A_rec"] = out["A"]
        work.calc(name, f"{base}_rec + A_rec*({c} - {axis}_ref)^2", unit="mm^4",
                  desc=f"second moment about the axis {axis} = {axis}_ref, from the record's {base} and A "
                       "(parallel-axis theorem)")
        out[name] = work[name].to(unit("mm^4"))


# ---------------------------------------------------------------- first moment at any level

@namespace.function("Q_at", params=[
    Param("shape", kind="record", record="section", doc="any section record"),
    Param("y", L, "level of the cut, in the section's own coordinates (0 mm is the base of a shape)")],
    fields=[Field("Q", "[length]**3", "first moment, about the centroidal x axis, of the area above the cut"),
            Field("t", L, "material width cut at y (the smaller side at a step; transformed for several materials)"),
            Field("A_above", "[length]**2", "area above the cut"),
            Field("y_bar", L, "centroid of the area above the cut"),
            Field("y_c", L, "centroid of the whole section")],
    returns="section.cut",
    doc="First moment Q and width t at any level y, for the shear stress τ = V·Q/(I_x·t) there.")
def Q_at(work, shape, y):
    from . import polygon as P

    geom = _geometry(shape)
    if not isinstance(geom, S.Shape):
        work.fail("this section record carries no outline; build it with a section function", param="shape")
    rings = geom.rings
    c = _mm(y)
    solid = [r for r in rings if r.sign > 0]
    lo = min(float(r.y.min()) for r in solid)
    hi = max(float(r.y.max()) for r in solid)
    if not lo < c < hi:
        work.fail(f"the cut y = {c:g} mm must lie inside the section, between {lo:g} and {hi:g} mm", param="y")
    whole = P.centroidal(P.region_moments(rings))
    above = P._moments_above(rings, c)
    work.let("y_c", _q(whole.y_c, "mm"), unit="mm", desc="centroid of the section", note="from the outline")
    work.let("A_above", _q(above.A, "mm^2"), unit="mm^2", desc="area above the cut",
             note="Green's theorem over the outline clipped at y")
    work.let("y_bar", _q(c + above.Sx / above.A, "mm"), unit="mm", desc="centroid of the area above the cut",
             note="first moment of the clipped outline about the cut, over its area")
    work.calc("Q", "A_above*(y_bar - y_c)", unit="mm^3", desc="first moment about the centroidal axis (Q = A'·ȳ')")
    work.let("t", _q(P.width_at(rings, c, weighted=True), "mm"), unit="mm", desc="material width at the cut",
             note="width of material cut by the line (at a step, the smaller side)")
    return {n: work[n] for n in ("Q", "t", "A_above", "y_bar", "y_c")}
