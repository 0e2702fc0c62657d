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

from calcsheet.plugin import Field, Namespace, Param

from . import builtup as B
from . import shapes as S
from .fields import section_fields
from .report import _q, report, unit

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

_GEOMETRY: dict[str, object] = {}  # record key (its 'shape' text) -> Shape or Placed


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
    _GEOMETRY[shape.label] = shape
    return out


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
                   Param("t_w", L, "side walls", default=None)],
           "Hollow rectangle: uniform wall t, or walls t_f (top, bottom) and t_w (sides).")
def box(work, b, h, t=None, t_f=None, t_w=None, **common):
    return _section(work, _build(work, lambda: S.box(_mm(b), _mm(h), _mm(t), _mm(t_f), _mm(t_w))), **common)


@_register("circle", [Param("d", L, "diameter")], "Solid circle.")
def circle(work, d, **common):
    return _section(work, _build(work, lambda: S.circle(_mm(d))), **common)


@_register("tube", [Param("d", L, "outside diameter"), Param("t", L, "wall", default=None),
                    Param("d_i", L, "inside diameter", default=None)],
           "Circular tube: outside diameter d and wall t, or inside diameter d_i.")
def tube(work, d, t=None, d_i=None, **common):
    return _section(work, _build(work, lambda: S.tube(_mm(d), _mm(t), _mm(d_i))), **common)


@_register("ishape", [Param("h", L, "overall depth"), Param("b", L, "top flange width"),
                      Param("t_f", L, "top flange thickness"), Param("t_w", L, "web thickness"),
                      Param("b_bot", L, "bottom flange width (default b)", default=None),
                      Param("t_fb", L, "bottom flange thickness (default t_f)", default=None)],
           "I-shape with equal flanges, or unequal ones via b_bot and t_fb (fillets not modelled).")
def ishape(work, h, b, t_f, t_w, b_bot=None, t_fb=None, **common):
    return _section(work, _build(work, lambda: S.ishape(_mm(h), _mm(b), _mm(t_f), _mm(t_w), _mm(b_bot), _mm(t_fb))), **common)


@_register("channel", [Param("h", L, "overall depth"), Param("b", L, "flange width"),
                       Param("t_f", L, "flange thickness"), Param("t_w", L, "web thickness")],
           "Channel, web on the left, flanges pointing right.")
def channel(work, h, b, t_f, t_w, **common):
    return _section(work, _build(work, lambda: S.channel(_mm(h), _mm(b), _mm(t_f), _mm(t_w))), **common)


@_register("tee", [Param("h", L, "overall depth"), Param("b", L, "flange width"),
                   Param("t_f", L, "flange thickness"), Param("t_w", L, "stem thickness")],
           "Tee, flange on top.")
def tee(work, h, b, t_f, t_w, **common):
    return _section(work, _build(work, lambda: S.tee(_mm(h), _mm(b), _mm(t_f), _mm(t_w))), **common)


@_register("angle", [Param("h", L, "vertical leg"), Param("t", L, "leg thickness"),
                     Param("b", L, "horizontal leg (default h: equal angle)", default=None)],
           "Equal or unequal angle, heel at the bottom-left.")
def angle(work, h, t, b=None, **common):
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
    geom = _GEOMETRY.get(shape.fields.get("shape"))
    if geom is None:
        work.fail("this section record was not made in this run; build it with a section function", param="shape")
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
    _GEOMETRY[key] = B.Placed(label, role, moved, E.m_as("MPa") if E is not None else None, rho_mm)
    work.note(f"{'Hole' if role == 'hole' else 'Part'} '{label}': {geom.label.split(' #')[0]}, "
              f"{'mirrored ' + mirror + ', ' if mirror != 'none' else ''}"
              f"rotated {rotate.m_as('deg') if rotate is not None else 0:g}°, {anchor} at "
              f"({_mm(x) or 0:g}, {_mm(y) or 0:g}) mm" + (f", E = {E.m_as('MPa'):g} MPa" if E is not None else ""))
    return {"A": _q(abs(b.A), "mm^2"), "x_c": _q(b.x_c, "mm"), "y_c": _q(b.y_c, "mm"), "role": role,
            "shape": key}


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
        p = _GEOMETRY.get(rec.fields.get("shape"))
        if not isinstance(p, B.Placed):
            work.fail(f"item {k + 1} of parts was not made by section.part or section.hole in this run",
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
    _GEOMETRY[asm.shape.label] = asm.shape
    return out
