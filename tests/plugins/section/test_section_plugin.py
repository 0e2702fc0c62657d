"""The section namespace as a sheet sees it: one field set, checked signatures, clear errors, traced working."""
import subprocess
import sys
import xml.etree.ElementTree as ET
from pathlib import Path

import pytest

from calcsheet import units as U
from calcsheet.trace import Figure, Note, Step, Table
from calcsheet_plugins.section import namespace
from calcsheet_plugins.section import shapes as S
from calcsheet_plugins.section.fields import NAMES

ROOT = Path(__file__).resolve().parents[3]

EVERY_SHAPE = {
    "rectangle": "section.rectangle(b=150 mm, h=300 mm)",
    "box": "section.box(b=150 mm, h=250 mm, t_f=12 mm, t_w=8 mm)",
    "circle": "section.circle(d=80 mm)",
    "tube": "section.tube(d=114.3 mm, t=6.3 mm)",
    "ishape": "section.ishape(h=300 mm, b=150 mm, t_f=10.7 mm, t_w=7.1 mm)",
    "channel": "section.channel(h=200 mm, b=75 mm, t_f=11.5 mm, t_w=8.5 mm)",
    "tee": "section.tee(h=200 mm, b=150 mm, t_f=12 mm, t_w=10 mm)",
    "angle": "section.angle(h=150 mm, b=90 mm, t=10 mm)",
    "triangle": 'section.triangle(b=100 mm, h=80 mm, form="isosceles")',
    "semicircle": "section.semicircle(d=120 mm)",
    "rolled": 'section.rolled(designation="W18X50")',
    "polygon": "section.polygon(points=[(0 mm, 0 mm), (90 mm, 0 mm), (90 mm, 12 mm), (12 mm, 60 mm), (0 mm, 60 mm)])",
    "built_up": "section.built_up(parts=[section.part(shape=section.rectangle(b=100 mm, h=10 mm)), "
                "section.part(shape=section.rectangle(b=10 mm, h=90 mm), y=10 mm, x=45 mm)])",
}


def errors(result):
    return [d for d in result.diagnostics if d.severity == "error"]


def test_every_section_function_is_covered_here():
    returning_sections = {n for n, pf in namespace.functions.items() if pf.returns == "section"}
    assert returning_sections == set(EVERY_SHAPE)


@pytest.mark.parametrize("name", sorted(EVERY_SHAPE))
def test_every_section_function_returns_the_same_standard_fields(run, name):
    r = run(f"s = {EVERY_SHAPE[name]}\n")
    assert not errors(r), r.diagnostics
    rec = r.values["s"]
    assert list(rec.fields)[:len(NAMES) + 1] == NAMES + ["shape"]
    pf = namespace.functions[name]
    # anything further is one of the optional fields every section function declares, of its declared dimension
    assert all(pf.field(n).optional for n in list(rec.fields)[len(NAMES) + 1:])
    for field in list(rec.fields):
        if pf.field(field).kind_ != "quantity":
            continue
        assert U.without_angle(U.dim_of(rec.fields[field])) == U.without_angle(pf.field(field).dimension), field
    # a downstream plugin can rely on these without knowing the shape
    f = rec.fields
    # (a catalogue section's S_x is the table's, its fibre moduli the table's I over the model's fibre distances)
    assert f["S_x"].m_as("mm^3") == pytest.approx(min(f["S_x_top"].m_as("mm^3"), f["S_x_bot"].m_as("mm^3")),
                                                  rel=1e-2 if name == "rolled" else 1e-6)
    assert f["I_1"].m_as("mm^4") >= f["I_2"].m_as("mm^4") > 0
    assert f["r_min"].m_as("mm") <= min(f["r_x"].m_as("mm"), f["r_y"].m_as("mm")) + 1e-9
    assert f["mass"].m_as("kg/m") == (0.0 if name != "rolled" else pytest.approx(50 * 0.45359237 / 0.3048))
    assert f["Z_x"].m_as("mm^3") >= f["S_x"].m_as("mm^3") * (1 - 1e-9)  # plastic ≥ elastic (shape factor ≥ 1)


def test_a_bare_number_where_a_length_belongs_is_an_error_at_the_call(run):
    text = "s = section.rectangle(b=150, h=12 mm)\n"
    (e,) = errors(run(text))
    assert "length" in e.message and e.span.line == 1 and e.span.col == text.index("150") + 1


def test_an_area_where_a_length_belongs_is_an_error(run):
    r = run("s = section.circle(d=150 mm^2)\n")
    (e,) = errors(r)
    assert "length" in e.message and "area" in e.message


@pytest.mark.parametrize("call, param, words", [
    ("section.box(b=200 mm, h=300 mm, t=120 mm)", "t=", "half the outside width"),
    ("section.rectangle(b=0 mm, h=10 mm)", "b=", "greater than zero"),
    ("section.ishape(h=300 mm, b=150 mm, t_f=12 mm, t_w=160 mm)", "t_w=", "web"),
    ("section.tube(d=100 mm, t=60 mm)", "t=", "half the outside diameter"),
    ("section.polygon(points=[(0 mm, 0 mm), (10 mm, 10 mm), (10 mm, 0 mm), (0 mm, 10 mm)])", "points=", "crosses itself"),
    ("section.polygon(points=[(0 mm, 0 mm), (10 mm, 0 mm), (20 mm, 0 mm)])", "points=", "no area"),
    ("section.part(shape=section.circle(d=10 mm), E=-3 GPa)", "E=", "greater than zero"),
])
def test_bad_input_names_the_parameter(run, call, param, words):
    text = f"s = {call}\n"
    r = run(text)
    (e,) = errors(r)
    assert words in e.message
    assert e.span.col == text.index(param) + 1, (e.span, e.message)


def test_web_thicker_than_flange_warns_at_t_w(run):
    text = "s = section.ishape(h=300 mm, b=150 mm, t_f=6 mm, t_w=10 mm)\n"
    r = run(text)
    (w,) = [d for d in r.diagnostics if d.severity == "warning"]
    assert "thicker than the flange" in w.message and w.span.col == text.index("t_w=") + 1


def _working(result, name):
    return result.values[name].working.items


def test_built_up_working_shows_the_parts_tables_formulas_figure_and_agreement(run):
    r = run("""
        w = section.ishape(h=300 mm, b=150 mm, t_f=10.7 mm, t_w=7.1 mm, detail="brief")
        ip = section.part(shape=w, anchor="bottom-centre", name="IPE 300")
        cover = section.part(shape=section.rectangle(b=200 mm, h=10 mm, detail="brief"), y=300 mm,
                             anchor="bottom-centre", E=70 GPa, name="<b>alloy</b> plate")
        hole = section.hole(shape=section.rectangle(b=18 mm, h=10 mm, detail="brief"), x=-60 mm, y=305 mm)
        s = section.built_up(parts=[ip, cover, hole], E_ref=210 GPa)
    """)
    assert not errors(r), r.diagnostics
    items = _working(r, "s")
    tables = [i for i in items if isinstance(i, Table)]
    titles = [t.title for t in tables]
    assert any("areas and centroids" in t for t in titles)
    assert any("centroidal x axis" in t for t in titles) and any("centroidal y axis" in t for t in titles)
    parts = next(t for t in tables if "areas and centroids" in t.title)
    assert "n" in parts.columns and len(parts.rows) == 3
    hole_row = parts.rows[2]
    assert hole_row[2].magnitude < 0  # holes are negative rows
    assert parts.rows[1][1] == pytest.approx(1 / 3, rel=1e-3)  # n = 70/210 shown on the plate's row
    steps = {i.name: i for i in items if isinstance(i, Step)}
    assert steps["y_c"].expr is not None and steps["I_x"].expr is not None  # formulas, substituted by the engine
    assert steps["S_x_top"].expr is not None and steps["r_x"].expr is not None
    assert steps["Z_x"].note and "Green" in steps["Z_x"].note
    notes = [i for i in items if isinstance(i, Note)]
    assert any(n.kind == "agreement" and "agrees" in n.text for n in notes)
    assert any(n.kind == "method" and "Torsion" in n.text for n in notes)
    (fig,) = [i for i in items if isinstance(i, Figure)]
    svg = ET.fromstring(fig.svg)  # well-formed
    assert "<script" not in fig.svg and "<b>" not in fig.svg
    fills = {el.get("fill") for el in svg.iter("{http://www.w3.org/2000/svg}polygon")}
    assert "#ffffff" in fills and len(fills - {"#ffffff", "#333", "#c0392b"}) >= 2  # hole + two materials


def test_brief_detail_keeps_every_value_in_one_table(run):
    r = run('s = section.channel(h=200 mm, b=75 mm, t_f=11.5 mm, t_w=8.5 mm, detail="brief")\n')
    items = _working(r, "s")
    (further,) = [i for i in items if isinstance(i, Table) and i.title == "Further properties"]
    shown = {cell for row in further.rows for cell in row[0::2]}
    assert {"S_x_top", "Z_x", "Q_x", "J", "r_min"} <= shown


def test_a_disagreement_between_the_two_methods_is_an_error(run, monkeypatch):
    real = S.ishape

    def wrong(*args):
        shape = real(*args)
        shape.rows[1].Iox *= 1.01  # a mistaken web row: the traced table no longer matches the outline
        return shape

    monkeypatch.setattr(S, "ishape", wrong)
    text = "s = section.ishape(h=300 mm, b=150 mm, t_f=10.7 mm, t_w=7.1 mm)\n"
    (e,) = errors(run(text))
    assert "the two methods disagree" in e.message and "I_x" in e.message


def test_units_other_than_millimetres_are_accepted(run):
    a = run("s = section.rectangle(b=6 in, h=1 ft)\n").values["s"].fields
    b = run("s = section.rectangle(b=152.4 mm, h=304.8 mm)\n").values["s"].fields
    assert a["I_x"].m_as("mm^4") == pytest.approx(b["I_x"].m_as("mm^4"), rel=1e-12)


def test_mass_per_length_from_a_density(run):
    f = run("s = section.tube(d=100 mm, t=5 mm, rho=7850 kg/m^3)\n").values["s"].fields
    import math

    assert f["mass"].m_as("kg/m") == pytest.approx(7850 * math.pi * (0.1**2 - 0.09**2) / 4, rel=1e-12)


def test_the_demo_sheet_builds_and_its_checks_pass(run):
    import calcsheet

    r = calcsheet.run(ROOT / "sheets" / "section_flitch_beam.calc")
    assert not errors(r), r.diagnostics
    assert r.checks and all(c.ok for c in r.checks)


def test_plugins_command_lists_every_shape_with_parameter_dimensions():
    out = subprocess.run([sys.executable, "-m", "calcsheet", "plugins"], capture_output=True, text=True, cwd=ROOT,
                         timeout=60).stdout
    for name in EVERY_SHAPE:
        assert f"section.{name}(" in out
    assert "section.part(" in out and "section.hole(" in out
    assert "length" in out and "points" in out.lower()


def test_records_of_look_alike_shapes_keep_their_own_outlines(run):
    # two polygons with the same vertex count and bounding box, and a shape with and without a density
    r = run("""
        p1 = section.polygon(points=[(0 mm, 0 mm), (100 mm, 0 mm), (0 mm, 100 mm)])
        p2 = section.polygon(points=[(0 mm, 0 mm), (100 mm, 0 mm), (100 mm, 100 mm)])
        r1 = section.rectangle(b=100 mm, h=10 mm, rho=7850 kg/m^3)
        r2 = section.rectangle(b=100 mm, h=10 mm)
        s1 = section.built_up(parts=[section.part(shape=p1), section.part(shape=r1, y=-10 mm)])
    """)
    assert not errors(r), r.diagnostics
    s1, p1 = r.values["s1"].fields, r.values["p1"].fields
    assert r.values["p1"].fields["shape"] != r.values["p2"].fields["shape"]
    assert s1["mass"].m_as("kg/m") == pytest.approx(7850 * 100 * 10 * 1e-6, rel=1e-12)
    A = 5000 + 1000
    assert s1["x_c"].m_as("mm") == pytest.approx((5000 * 100 / 3 + 1000 * 50) / A, rel=1e-12)
