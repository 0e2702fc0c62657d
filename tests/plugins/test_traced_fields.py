"""Every field a plugin returns is the value its working shows, and no second copy drifts from it.

A reviewer checks the package, not the record: if a field were computed twice
(once in the traced working, once in Python for the record), a wrong formula in
either copy would reach the sheet or the print, but not both. For every demo-like
call of the section, column and material plugins: the traced step named like a
field (or, in a brief working, the table entry) shows the returned value; and the
plugins' plain-Python helpers that compute the same quantity agree with it.
"""
import math
import textwrap

import pint
import pytest

import calcsheet
from calcsheet.trace import Step, Table
from calcsheet_plugins.column import buckling as B
from calcsheet_plugins.section import shapes as S
from calcsheet_plugins.section.fields import NAMES
from calcsheet_plugins.section.properties import properties

SECTIONS = {
    "rectangle": "section.rectangle(b=150 mm, h=300 mm)",
    "box": "section.box(b=150 mm, h=250 mm, t_f=12 mm, t_w=8 mm)",
    "circle": "section.circle(d=80 mm)",
    "tube": "section.tube(d=114.3 mm, t=6.3 mm)",
    "ishape": "section.ishape(h=300 mm, b=150 mm, t_f=10.7 mm, t_w=7.1 mm)",
    "ishape_unequal": "section.ishape(h=400 mm, b=200 mm, t_f=16 mm, t_w=9 mm, b_bot=120 mm, t_fb=10 mm)",
    "channel": "section.channel(h=200 mm, b=75 mm, t_f=11.5 mm, t_w=8.5 mm)",
    "tee": "section.tee(h=200 mm, b=150 mm, t_f=12 mm, t_w=10 mm)",
    "angle": "section.angle(h=150 mm, b=90 mm, t=10 mm)",
    "triangle": 'section.triangle(b=100 mm, h=80 mm, form="isosceles")',
    "semicircle": "section.semicircle(d=120 mm)",
    "polygon": "section.polygon(points=[(0 mm, 0 mm), (90 mm, 0 mm), (90 mm, 12 mm), (12 mm, 60 mm), (0 mm, 60 mm)])",
    "refs_and_mass": "section.rectangle(b=100 mm, h=200 mm, x_ref=0 mm, y_ref=0 mm, rho=7850 kg/m^3)",
    "built_up": "section.built_up(parts=[section.part(shape=section.rectangle(b=100 mm, h=10 mm)), "
                "section.part(shape=section.rectangle(b=10 mm, h=90 mm), y=10 mm, x=45 mm)])",
    "transformed": "section.built_up(parts=[section.part(shape=section.rectangle(b=75 mm, h=300 mm), E=11 GPa), "
                   "section.part(shape=section.rectangle(b=12 mm, h=280 mm), x=75 mm, y=10 mm, E=210 GPa), "
                   "section.hole(shape=section.circle(d=18 mm), x=37.5 mm, y=230 mm)], E_ref=11 GPa)",
}


def _run(body):
    r = calcsheet.run(textwrap.dedent(body).lstrip())
    assert r.ok, r.format_diagnostics()
    return r


def _shown(record):
    """name -> value the working shows: its steps, and the 'Further properties' table of a brief working."""
    shown = {}
    for item in record.working.items:
        if isinstance(item, Step):
            shown[item.name] = item.value
        elif isinstance(item, Table) and item.title == "Further properties":
            for row in item.rows:
                for name, value in zip(row[0::2], row[1::2]):
                    if name:
                        shown[name] = value
    return shown


def _same(a, b, what):
    if isinstance(a, pint.Quantity):
        assert isinstance(b, pint.Quantity), what
        unit = b.units
        assert a.m_as(unit) == pytest.approx(b.m_as(unit), rel=1e-12, abs=1e-9 * (abs(b.m_as(unit)) + 1e-300)), what
    else:
        assert a == b, what


@pytest.mark.parametrize("detail", ["full", "brief"])
@pytest.mark.parametrize("name", sorted(SECTIONS))
def test_every_section_field_is_the_value_its_working_shows(name, detail):
    call = SECTIONS[name]
    call = call[:-1] + f', detail="{detail}")'
    rec = _run(f"s = {call}\n").values["s"]
    shown = _shown(rec)
    for field in NAMES:
        assert field in shown, f"{name}: field {field} is returned but its working never shows it"
        _same(shown[field], rec.fields[field], f"{name} {detail}: {field}")


@pytest.mark.parametrize("name", [n for n in sorted(SECTIONS) if n not in ("built_up", "transformed")])
def test_the_core_property_table_agrees_with_the_record(name):
    # properties() is the plain-Python pass over the outline that drawing and checks use; a field it
    # computes must equal the traced one (a drift here is a wrong number in one of two places)
    r = _run(f"s = {SECTIONS[name]}\n")
    rec = r.values["s"]
    call = SECTIONS[name]
    units = {"theta_p": "rad", "mass": "kg/m"}
    # rebuild the shape the same way the plugin does, from the call's own numbers
    shape = _shape_of(name)
    x_ref = 0.0 if name == "refs_and_mass" else None
    vals = properties(shape, x_ref, x_ref)
    for field in NAMES:
        if field == "mass" and "rho" in call:
            continue  # the density is applied by the plugin, not the bare shape
        u = units.get(field) or {2: "mm^2", 3: "mm^3", 4: "mm^4"}.get(_power(field), "mm")
        got = rec.fields[field].m_as(u)
        assert vals[field] == pytest.approx(got, rel=1e-9, abs=1e-9 * (abs(got) + 1)), (name, field)


def _power(field):
    from calcsheet_plugins.section.fields import STANDARD

    dim = next(d for n, d, *_ in STANDARD if n == field)
    return int(dim.split("**")[1]) if "**" in dim else 1


def _shape_of(name):
    return {
        "rectangle": lambda: S.rectangle(150.0, 300.0),
        "box": lambda: S.box(150.0, 250.0, None, 12.0, 8.0),
        "circle": lambda: S.circle(80.0),
        "tube": lambda: S.tube(114.3, 6.3, None),
        "ishape": lambda: S.ishape(300.0, 150.0, 10.7, 7.1, None, None),
        "ishape_unequal": lambda: S.ishape(400.0, 200.0, 16.0, 9.0, 120.0, 10.0),
        "channel": lambda: S.channel(200.0, 75.0, 11.5, 8.5),
        "tee": lambda: S.tee(200.0, 150.0, 12.0, 10.0),
        "angle": lambda: S.angle(150.0, 10.0, 90.0),
        "triangle": lambda: S.triangle(100.0, 80.0, "isosceles"),
        "semicircle": lambda: S.semicircle(120.0),
        "polygon": lambda: S.polygon([(0.0, 0.0), (90.0, 0.0), (90.0, 12.0), (12.0, 60.0), (0.0, 60.0)]),
        "refs_and_mass": lambda: S.rectangle(100.0, 200.0),
    }[name]()


# ---------------------------------------------------------------- column

COLUMNS = [  # (call, the arguments it gives: name -> value in MPa / mm^2 / plain)
    ('c = column.buckling(L=4 m, E=200 GPa, F_y=250 MPa, A=6000 mm^2, I_x=8e7 mm^4, I_y=2e7 mm^4)',
     {"E": 200e3, "F_y": 250.0, "A": 6000.0}),
    ('c = column.buckling(L=9 m, ends="fixed-free", E=200 GPa, F_y=250 MPa, A=6000 mm^2, I_x=8e7 mm^4, '
     'I_y=2e7 mm^4)', {"E": 200e3, "F_y": 250.0, "A": 6000.0}),
    ('c = column.buckling(L=3.1 m, L_y=1.55 m, section=section.ishape(h=120 mm, b=120 mm, t_f=8 mm, t_w=6 mm), '
     'material=material.steel(grade="S355"))', {}),
    ('c = column.buckling(L=5 m, K_x=0.8, K_y=1.2, E=70 GPa, F_y=240 MPa, A=3000 mm^2, I_x=1e7 mm^4, '
     'I_y=4e6 mm^4, f_pl=150 MPa)', {"E": 70e3, "F_y": 240.0, "A": 3000.0, "K_x": 0.8, "K_y": 1.2}),
]
IDS = ["pinned-johnson", "flagpole-euler", "records", "given-K"]


@pytest.mark.parametrize("call, given", COLUMNS, ids=IDS)
def test_every_column_field_is_the_value_its_working_shows(call, given):
    rec = _run(call + "\n").values["c"]
    shown = _shown(rec)
    for field, value in rec.fields.items():
        if field in ("axis", "range"):
            continue
        if field in given:  # an argument the sheet gave: returned as given
            assert value.m_as("") == given[field], field
            continue
        assert field in shown, f"field {field} is returned but its working never shows it"
        _same(shown[field], value, field)


@pytest.mark.parametrize("call, given", COLUMNS, ids=IDS)
def test_the_column_helpers_agree_with_the_traced_formulas(call, given):
    # euler_load, transition_slenderness and critical_stress are the same formulas in plain Python
    rec = _run(call + "\n").values["c"]
    w = _shown(rec)
    E = w["E"].m_as("MPa") if "E" in w else given["E"]
    Fy = w["F_y"].m_as("MPa") if "F_y" in w else given["F_y"]
    A = w["A"].m_as("mm^2") if "A" in w else given["A"]
    f = rec.fields
    assert B.transition_slenderness(E, Fy) == pytest.approx(f["C_c"].m_as(""), rel=1e-12)
    for axis in ("x", "y"):
        K, lam = f[f"K_{axis}"].m_as(""), f[f"KL_r_{axis}"].m_as("")
        assert B.critical_stress(E, Fy, lam) == pytest.approx(f[f"sigma_cr_{axis}"].m_as("MPa"), rel=1e-12)
        # P_e = π²EI/(KL)² = σ_e·A (Euler, any strength-of-materials text — common practice)
        P_e = f[f"P_e_{axis}"].m_as("N")
        assert P_e == pytest.approx(f[f"sigma_e_{axis}"].m_as("MPa") * A, rel=1e-9)
        r = w[f"r_{axis}"].m_as("mm")
        assert B.euler_load(E, r * r * A, K, lam * r / K) == pytest.approx(P_e, rel=1e-9)


# ---------------------------------------------------------------- material

MATERIALS = [  # (call, fields the sheet gives and the record returns unchanged)
    ('m = material.steel(grade="S355")', {}),
    ('m = material.aluminium(alloy="6061-T6")', {}),
    ('m = material.timber(grade="C24")', {}),
    ('m = material.concrete(f_c=30 MPa)', {"f_y": "30 MPa"}),
    ('m = material.concrete(f_c=4000 psi, rule="ACI 318")', {"f_y": "4000 psi"}),
    ('m = material.custom(name="alloy", E=70 GPa, f_y=200 MPa)',
     {"E": "70 GPa", "f_y": "200 MPa", "f_u": "200 MPa", "rho": "0 kg/m^3"}),
    ('m = material.custom(name="alloy", E=70 GPa, f_y=200 MPa, nu=0.33, G=26 GPa, f_u=260 MPa, rho=2700 kg/m^3)',
     {"E": "70 GPa", "f_y": "200 MPa", "nu": "0.33", "G": "26 GPa", "f_u": "260 MPa", "rho": "2700 kg/m^3"}),
]


@pytest.mark.parametrize("call, given", MATERIALS, ids=[c.split("(")[0][4:] + str(k) for k, (c, _) in
                                                        enumerate(MATERIALS)])
def test_every_material_field_is_the_value_its_working_or_table_shows(call, given):
    rec = _run(call + "\n").values["m"]
    shown = _shown(rec)
    for item in rec.working.items:  # library grades show their values in a table: Property, Symbol, Value, Source
        if isinstance(item, Table):
            for row in item.rows:
                shown[{"ν": "nu", "ρ": "rho"}.get(row[1], row[1])] = row[2]
    for field, value in rec.fields.items():
        if field == "name":
            continue
        if field in given:
            _same(value, calcsheet.run(f"v = {given[field]}\n").values["v"], field)
        else:
            assert field in shown, f"field {field} is returned but its working never shows it"
            _same(shown[field], value, field)


def test_the_default_poissons_ratio_is_traced_under_the_fields_own_name():
    rec = _run('m = material.custom(name="alloy", E=70 GPa, f_y=200 MPa)\n').values["m"]
    assert "nu" in _shown(rec)


def test_concrete_record_uses_the_traced_modulus():
    # EN 1992-1-1 Table 3.1: E_cm = 22 (f_cm/10)^0.3 GPa, f_cm = f_ck + 8 MPa (from memory)
    rec = _run("m = material.concrete(f_c=30 MPa)\n").values["m"]
    assert rec.fields["E"].m_as("GPa") == pytest.approx(22 * (38 / 10) ** 0.3, rel=1e-12)
    assert rec.fields["G"].m_as("GPa") == pytest.approx(rec.fields["E"].m_as("GPa") / (2 * 1.2), rel=1e-12)
    assert math.isclose(rec.fields["nu"].m_as(""), 0.2)
