"""Every default of every section, column and material parameter, and what leaving it out means.

A default is a decision the sheet does not show, so each one is written down
here with its effect, stated from outside the plugin (a closed form, a
standard's value, common practice). ``test_every_default_has_an_entry_here``
enumerates the declared parameters: a new default, or a changed one, fails
until this table says what it does. Each effect test compares the call that
leaves the parameter out with a call that states the documented meaning
explicitly, or with a hand value.
"""
import inspect
import math
import textwrap

import pytest

import calcsheet
from calcsheet.plugin import REQUIRED
from calcsheet.trace import Table
from calcsheet_plugins.column import namespace as column_ns
from calcsheet_plugins.material import namespace as material_ns
from calcsheet_plugins.section import namespace as section_ns

SHAPES = {  # one call per section function, with none of its optional parameters
    "rectangle": "section.rectangle(b=150 mm, h=300 mm)",
    "box": "section.box(b=150 mm, h=250 mm, t=8 mm)",
    "circle": "section.circle(d=80 mm)",
    "tube": "section.tube(d=114.3 mm, t=6.3 mm)",
    "ishape": "section.ishape(h=300 mm, b=150 mm, t_f=10.7 mm, t_w=7.1 mm)",
    "channel": "section.channel(h=200 mm, b=75 mm, t_f=11.5 mm, t_w=8.5 mm)",
    "tee": "section.tee(h=200 mm, b=150 mm, t_f=12 mm, t_w=10 mm)",
    "angle": "section.angle(h=150 mm, t=10 mm)",
    "triangle": "section.triangle(b=100 mm, h=80 mm)",
    "semicircle": "section.semicircle(d=120 mm)",
    "polygon": "section.polygon(points=[(0 mm, 0 mm), (90 mm, 0 mm), (90 mm, 12 mm), (12 mm, 60 mm), (0 mm, 60 mm)])",
    "built_up": "section.built_up(parts=[section.part(shape=section.rectangle(b=100 mm, h=10 mm)), "
                "section.part(shape=section.rectangle(b=10 mm, h=90 mm), y=10 mm, x=45 mm)])",
}
COMMON = {"rho": None, "x_ref": None, "y_ref": None, "detail": "full"}

# (namespace.function, parameter) -> the declared default; each has an effect test below
DEFAULTS = {
    **{(f"section.{f}", p): v for f in SHAPES for p, v in COMMON.items() if not (f == "built_up" and p == "rho")},
    ("section.box", "t"): None, ("section.box", "t_f"): None, ("section.box", "t_w"): None,
    ("section.tube", "t"): None, ("section.tube", "d_i"): None,
    ("section.ishape", "b_bot"): None, ("section.ishape", "t_fb"): None,
    ("section.angle", "b"): None,
    ("section.box", "r_out"): None, ("section.box", "r_in"): None, ("section.box", "corners"): "sharp",
    ("section.ishape", "r"): None, ("section.channel", "r"): None, ("section.tee", "r"): None,
    ("section.angle", "r"): None,
    ("section.rolled", "x_ref"): None, ("section.rolled", "y_ref"): None, ("section.rolled", "detail"): "compact",
    ("section.triangle", "form"): "right",
    ("section.built_up", "E_ref"): None,
    **{(f"section.{f}", p): v for f in ("part", "hole") for p, v in
       {"x": None, "y": None, "anchor": None, "rotate": None, "mirror": "none", "name": None}.items()},
    ("section.part", "E"): None, ("section.part", "rho"): None,
    ("column.buckling", "ends"): "pinned-pinned", ("column.buckling", "ends_y"): None,
    ("column.buckling", "K_basis"): "design", ("column.buckling", "K_x"): None, ("column.buckling", "K_y"): None,
    ("column.buckling", "L_y"): None, ("column.buckling", "section"): None, ("column.buckling", "material"): None,
    ("column.buckling", "E"): None, ("column.buckling", "F_y"): None, ("column.buckling", "A"): None,
    ("column.buckling", "I_x"): None, ("column.buckling", "I_y"): None, ("column.buckling", "f_pl"): None,
    ("material.concrete", "rule"): "EN 1992-1-1",
    ("material.steel", "t"): None,
    ("material.custom", "nu"): None, ("material.custom", "G"): None, ("material.custom", "f_u"): None,
    ("material.custom", "rho"): None,
}


def declared():
    for ns in (section_ns, column_ns, material_ns):
        for name, pf in ns.functions.items():
            for p in pf.params:
                if not p.required:
                    yield pf, p


def test_every_default_has_an_entry_here():
    found = {(pf.qualname, p.name): p.default for pf, p in declared()}
    assert set(found) == set(DEFAULTS), {"untested": set(found) - set(DEFAULTS), "gone": set(DEFAULTS) - set(found)}
    for key, value in found.items():
        assert value == DEFAULTS[key], f"{key}: default changed to {value!r}; update its effect test"


def test_the_python_signature_states_the_same_default():
    # two copies of one default: the declared Param and the function's own keyword default
    for pf, p in declared():
        params = inspect.signature(pf.func).parameters
        if p.name not in params:  # taken through **kwargs: the declared default is the only copy
            assert any(v.kind is inspect.Parameter.VAR_KEYWORD for v in params.values()), (pf.qualname, p.name)
            continue
        sig = params[p.name]
        assert sig.default is not inspect.Parameter.empty and sig.default == p.default, (pf.qualname, p.name)
    for ns in (section_ns, column_ns, material_ns):
        for pf in ns.functions.values():
            for p in pf.params:
                if p.default is REQUIRED and p.name in inspect.signature(pf.func).parameters:
                    assert inspect.signature(pf.func).parameters[p.name].default is inspect.Parameter.empty


def one(call, **fields):
    r = calcsheet.run(textwrap.dedent(call).lstrip())
    assert r.ok, r.format_diagnostics()
    return r


def rec(call):
    return one(f"s = {call}\n").values["s"]


def with_args(call, extra):
    return call[:-1] + ", " + extra + ")"


def f(record, name, unit):
    return record.fields[name].m_as(unit)


# ---------------------------------------------------------------- section: the common four


@pytest.mark.parametrize("name", [n for n in SHAPES if n != "built_up"])
def test_without_a_density_the_mass_is_zero(name):
    assert f(rec(SHAPES[name]), "mass", "kg/m") == 0.0
    # with one, mass = ρ·A (any section handbook — common practice)
    s = rec(with_args(SHAPES[name], "rho=7850 kg/m^3"))
    assert f(s, "mass", "kg/m") == pytest.approx(7850 * f(s, "A", "m^2"), rel=1e-12)


@pytest.mark.parametrize("name", sorted(SHAPES))
def test_without_reference_axes_the_reference_moments_are_the_centroidal_ones(name):
    s = rec(SHAPES[name])
    assert f(s, "I_x_ref", "mm^4") == f(s, "I_x", "mm^4")
    assert f(s, "I_y_ref", "mm^4") == f(s, "I_y", "mm^4")
    # and naming the centroidal axes explicitly changes nothing (parallel-axis theorem, d = 0)
    s2 = rec(with_args(SHAPES[name], f"x_ref={f(s, 'x_c', 'mm')!r} mm, y_ref={f(s, 'y_c', 'mm')!r} mm"))
    assert f(s2, "I_x_ref", "mm^4") == pytest.approx(f(s, "I_x", "mm^4"), rel=1e-12)
    assert f(s2, "I_y_ref", "mm^4") == pytest.approx(f(s, "I_y", "mm^4"), rel=1e-12)


@pytest.mark.parametrize("name", sorted(SHAPES))
def test_the_default_working_is_full(name):
    full = rec(SHAPES[name])
    assert not any(isinstance(i, Table) and i.title == "Further properties" for i in full.working.items)
    brief = rec(with_args(SHAPES[name], 'detail="brief"'))
    assert any(isinstance(i, Table) and i.title == "Further properties" for i in brief.working.items)
    explicit = rec(with_args(SHAPES[name], 'detail="full"'))
    assert [type(i).__name__ for i in explicit.working.items] == [type(i).__name__ for i in full.working.items]


def test_a_rolled_sections_default_working_is_compact_and_full_adds_the_models_working():
    compact = rec('section.rolled(designation="IPE 300")')
    full = rec('section.rolled(designation="IPE 300", detail="full")')
    assert len(compact.working.items) < len(full.working.items) / 2
    assert f(compact, "I_x", "mm^4") == f(full, "I_x", "mm^4") and f(compact, "C_w", "mm^6") == f(full, "C_w", "mm^6")


def test_a_rolled_section_without_reference_axes_reports_its_centroidal_moments():
    s = rec('section.rolled(designation="IPE 300")')
    assert f(s, "I_x_ref", "mm^4") == f(s, "I_x", "mm^4") and f(s, "I_y_ref", "mm^4") == f(s, "I_y", "mm^4")
    base = rec('section.rolled(designation="IPE 300", y_ref=0 mm)')
    assert f(base, "I_x_ref", "mm^4") > f(s, "I_x", "mm^4")


def test_a_rolled_section_reference_moment_follows_the_parallel_axis_theorem():
    # the reference moment is built from the record's own (table) I and A, not the model's I with the table's A
    s = rec('section.rolled(designation="IPE 300")')
    base = rec('section.rolled(designation="IPE 300", y_ref=0 mm)')
    # parallel-axis theorem about the base: I_x + A·y_c² (any statics text — common practice)
    assert f(base, "I_x_ref", "mm^4") == pytest.approx(
        f(s, "I_x", "mm^4") + f(s, "A", "mm^2") * f(s, "y_c", "mm") ** 2, rel=1e-9)


# ---------------------------------------------------------------- section: shape-specific


def test_without_a_radius_shapes_have_sharp_corners_and_no_fillets():
    # plate-by-plate areas with no fillet or corner material (common practice)
    assert f(rec("section.channel(h=200 mm, b=75 mm, t_f=11.5 mm, t_w=8.5 mm)"), "A", "mm^2") == \
        pytest.approx(2 * 75 * 11.5 + (200 - 23) * 8.5, rel=1e-12)
    assert f(rec("section.tee(h=200 mm, b=150 mm, t_f=12 mm, t_w=10 mm)"), "A", "mm^2") == \
        pytest.approx(150 * 12 + 188 * 10, rel=1e-12)
    assert f(rec("section.ishape(h=300 mm, b=150 mm, t_f=10 mm, t_w=7 mm)"), "A", "mm^2") == \
        pytest.approx(2 * 150 * 10 + 280 * 7, rel=1e-12)
    assert f(rec("section.angle(h=100 mm, t=10 mm)"), "A", "mm^2") == pytest.approx(100 * 10 + 90 * 10, rel=1e-12)
    sharp = rec('section.box(b=150 mm, h=250 mm, t=8 mm, corners="sharp")')
    assert f(sharp, "A", "mm^2") == pytest.approx(150 * 250 - 134 * 234, rel=1e-12)
    assert f(rec("section.box(b=150 mm, h=250 mm, t=8 mm)"), "A", "mm^2") == f(sharp, "A", "mm^2")


def test_box_t_alone_means_equal_walls_and_t_f_t_w_replace_it():
    uniform = rec("section.box(b=150 mm, h=250 mm, t=8 mm)")
    explicit = rec("section.box(b=150 mm, h=250 mm, t_f=8 mm, t_w=8 mm)")
    # hollow rectangle: I = (B·H³ − b·h³)/12 (any section handbook — common practice)
    I = (150 * 250**3 - 134 * 234**3) / 12
    assert f(uniform, "I_x", "mm^4") == pytest.approx(I, rel=1e-12) == f(explicit, "I_x", "mm^4")
    walls = rec("section.box(b=150 mm, h=250 mm, t_f=12 mm, t_w=8 mm)")
    assert f(walls, "I_x", "mm^4") == pytest.approx((150 * 250**3 - 134 * 226**3) / 12, rel=1e-12)
    r = calcsheet.run("s = section.box(b=150 mm, h=250 mm)\n")
    assert not r.ok  # no wall at all is refused, not silently a solid


def test_tube_wall_or_inside_diameter():
    by_t = rec("section.tube(d=114.3 mm, t=6.3 mm)")
    by_di = rec("section.tube(d=114.3 mm, d_i=101.7 mm)")
    # annulus: I = π(D⁴ − d⁴)/64 (any section handbook — common practice)
    assert f(by_t, "I_x", "mm^4") == pytest.approx(math.pi * (114.3**4 - 101.7**4) / 64, rel=1e-9)
    assert f(by_di, "I_x", "mm^4") == pytest.approx(f(by_t, "I_x", "mm^4"), rel=1e-9)
    assert not calcsheet.run("s = section.tube(d=114.3 mm)\n").ok


def test_ishape_bottom_flange_defaults_to_the_top_one():
    eq = rec("section.ishape(h=300 mm, b=150 mm, t_f=10.7 mm, t_w=7.1 mm)")
    ex = rec("section.ishape(h=300 mm, b=150 mm, t_f=10.7 mm, t_w=7.1 mm, b_bot=150 mm, t_fb=10.7 mm)")
    # doubly symmetric I: centroid at mid-depth, I = (b·h³ − (b − t_w)(h − 2t_f)³)/12 (common practice)
    assert f(eq, "y_c", "mm") == pytest.approx(150.0, rel=1e-12)
    assert f(eq, "I_x", "mm^4") == pytest.approx((150 * 300**3 - 142.9 * 278.6**3) / 12, rel=1e-12)
    assert f(ex, "I_x", "mm^4") == pytest.approx(f(eq, "I_x", "mm^4"), rel=1e-12)
    only_b = rec("section.ishape(h=300 mm, b=150 mm, t_f=10.7 mm, t_w=7.1 mm, b_bot=100 mm)")
    only_t = rec("section.ishape(h=300 mm, b=150 mm, t_f=10.7 mm, t_w=7.1 mm, t_fb=15 mm)")
    # A = top flange + web + bottom flange, each default taken from the top flange
    assert f(only_b, "A", "mm^2") == pytest.approx(150 * 10.7 + 7.1 * 278.6 + 100 * 10.7, rel=1e-12)
    assert f(only_t, "A", "mm^2") == pytest.approx(150 * 10.7 + 7.1 * (300 - 10.7 - 15) + 150 * 15, rel=1e-12)


def test_angle_without_b_is_an_equal_angle():
    s = rec("section.angle(h=150 mm, t=10 mm)")
    # an equal angle is symmetric about its 45° line: I_x = I_y, centroid on the diagonal (common practice)
    assert f(s, "I_x", "mm^4") == pytest.approx(f(s, "I_y", "mm^4"), rel=1e-12)
    assert f(s, "x_c", "mm") == pytest.approx(f(s, "y_c", "mm"), rel=1e-12)
    assert f(s, "A", "mm^2") == pytest.approx(150 * 10 + 140 * 10, rel=1e-12)
    assert f(s, "width", "mm") == 150.0


def test_triangle_default_form_has_its_right_angle_at_the_bottom_left():
    s = rec("section.triangle(b=90 mm, h=60 mm)")
    # right triangle: centroid at (b/3, h/3), I_x = b·h³/36, I_xy = −b²h²/72 (any section handbook)
    assert f(s, "x_c", "mm") == pytest.approx(30.0) and f(s, "y_c", "mm") == pytest.approx(20.0)
    assert f(s, "I_x", "mm^4") == pytest.approx(90 * 60**3 / 36, rel=1e-12)
    assert abs(f(s, "I_xy", "mm^4")) == pytest.approx(90**2 * 60**2 / 72, rel=1e-12)
    same = rec('section.triangle(b=90 mm, h=60 mm, form="right")')
    assert f(same, "I_xy", "mm^4") == f(s, "I_xy", "mm^4")


# ---------------------------------------------------------------- section: parts, holes, built-up

PLATE = "section.rectangle(b=100 mm, h=20 mm)"


def built(*parts, extra=""):
    call = "section.built_up(parts=[" + ", ".join(parts) + "]" + (", " + extra if extra else "") + ")"
    return rec(call)


def test_a_part_by_default_sits_with_its_bottom_left_corner_at_the_origin_unrotated_unmirrored():
    d = built(f"section.part(shape={PLATE})", "section.part(shape=section.rectangle(b=10 mm, h=10 mm), "
              "x=200 mm, y=200 mm)")
    ex = built(f'section.part(shape={PLATE}, x=0 mm, y=0 mm, anchor="bottom-left", rotate=0 deg, mirror="none")',
               "section.part(shape=section.rectangle(b=10 mm, h=10 mm), x=200 mm, y=200 mm)")
    # centroid of the two: (Σ A·x)/(Σ A), plate centroid at (50, 10), square at (205, 205)
    A1, A2 = 2000.0, 100.0
    assert f(d, "x_c", "mm") == pytest.approx((A1 * 50 + A2 * 205) / (A1 + A2), rel=1e-12)
    assert f(d, "y_c", "mm") == pytest.approx((A1 * 10 + A2 * 205) / (A1 + A2), rel=1e-12)
    for field in ("x_c", "y_c", "I_x", "I_y", "I_xy"):
        assert f(d, field, "mm^4" if field.startswith("I") else "mm") == \
            pytest.approx(f(ex, field, "mm^4" if field.startswith("I") else "mm"), rel=1e-12)


def test_a_hole_by_default_is_centred_on_its_point():
    plate = f"section.part(shape={PLATE})"
    d = built(plate, "section.hole(shape=section.rectangle(b=10 mm, h=10 mm), x=20 mm, y=10 mm)")
    ex = built(plate, 'section.hole(shape=section.rectangle(b=10 mm, h=10 mm), x=20 mm, y=10 mm, '
                      'anchor="centroid", rotate=0 deg, mirror="none")')
    # the hole's centroid at (20, 10): A = 2000 − 100, x_c = (2000·50 − 100·20)/1900
    assert f(d, "A", "mm^2") == pytest.approx(1900.0)
    assert f(d, "x_c", "mm") == pytest.approx((2000 * 50 - 100 * 20) / 1900, rel=1e-12)
    assert f(d, "y_c", "mm") == pytest.approx(10.0, rel=1e-12)
    assert f(ex, "x_c", "mm") == f(d, "x_c", "mm")
    # with neither x nor y, the hole's centroid is at the origin: a plate centred there loses a centred square
    centred = built(f"section.part(shape={PLATE}, x=-50 mm, y=-10 mm)",
                    "section.hole(shape=section.rectangle(b=10 mm, h=10 mm))")
    assert f(centred, "x_c", "mm") == pytest.approx(0.0, abs=1e-9)
    assert f(centred, "y_c", "mm") == pytest.approx(0.0, abs=1e-9)
    assert f(centred, "I_x", "mm^4") == pytest.approx(100 * 20**3 / 12 - 10 * 10**3 / 12, rel=1e-12)


def test_unnamed_parts_are_labelled_by_their_shape_in_the_parts_table():
    s = built(f"section.part(shape={PLATE})", 'section.part(shape=section.rectangle(b=10 mm, h=10 mm), y=20 mm, '
              'name="cleat")')
    labels = [row[0] for item in s.working.items if isinstance(item, Table) for row in item.rows]
    assert any(lbl.startswith("part (") for lbl in labels) and "cleat" in labels


def test_a_part_without_E_is_of_the_reference_material_and_E_ref_defaults_to_the_first_part():
    same = built(f"section.part(shape={PLATE})", "section.part(shape=section.rectangle(b=10 mm, h=80 mm), y=20 mm)")
    stated = built(f"section.part(shape={PLATE}, E=200 GPa)",
                   "section.part(shape=section.rectangle(b=10 mm, h=80 mm), y=20 mm, E=200 GPa)")
    assert f(same, "A", "mm^2") == pytest.approx(2800.0) == f(stated, "A", "mm^2")
    # E_ref defaults to the first part's E: the second part counts at n = 70/200 (transformed section)
    mixed = built(f"section.part(shape={PLATE}, E=200 GPa)",
                  "section.part(shape=section.rectangle(b=10 mm, h=80 mm), y=20 mm, E=70 GPa)")
    assert f(mixed, "A", "mm^2") == pytest.approx(2000 + 800 * 70 / 200, rel=1e-12)
    explicit = built(f"section.part(shape={PLATE}, E=200 GPa)",
                     "section.part(shape=section.rectangle(b=10 mm, h=80 mm), y=20 mm, E=70 GPa)",
                     extra="E_ref=200 GPa")
    assert f(explicit, "A", "mm^2") == f(mixed, "A", "mm^2")


def test_a_part_without_density_adds_no_mass():
    s = built(f"section.part(shape={PLATE}, rho=7850 kg/m^3)",
              "section.part(shape=section.rectangle(b=10 mm, h=80 mm), y=20 mm)")
    assert f(s, "mass", "kg/m") == pytest.approx(7850 * 2000e-6, rel=1e-12)


# ---------------------------------------------------------------- column

COL = "E=200 GPa, F_y=250 MPa, A=6000 mm^2, I_x=8e7 mm^4, I_y=2e7 mm^4"


def col(args):
    return one(f"c = column.buckling({args})\n").values["c"]


def test_column_ends_default_to_pinned_pinned_with_K_1():
    c = col(f"L=6 m, {COL}")
    # both ends pinned: K = 1, Euler's fundamental case (Timoshenko & Gere §2.1 — from memory)
    assert f(c, "K_x", "") == 1.0 and f(c, "K_y", "") == 1.0
    assert f(c, "P_e_y", "kN") == pytest.approx(math.pi**2 * 200e3 * 2e7 / 6000**2 / 1e3, rel=1e-12)


def test_column_ends_y_defaults_to_ends():
    c = col(f'L=3 m, ends="fixed-free", {COL}')
    assert f(c, "K_y", "") == f(c, "K_x", "") == 2.1  # AISC 360-16 Commentary Table C-A-7.1 (from memory)


def test_column_K_basis_defaults_to_the_recommended_design_values():
    c = col(f'L=3 m, ends="fixed-fixed", {COL}')
    # recommended design K for fixed-fixed is 0.65, not the theoretical 0.5 (AISC 360-16 Comm. C-A-7.1, from memory)
    assert f(c, "K_x", "") == 0.65


def test_column_K_x_and_K_y_default_to_the_end_conditions():
    c = col(f'L=3 m, ends="fixed-pinned", ends_y="pinned-pinned", {COL}')
    assert (f(c, "K_x", ""), f(c, "K_y", "")) == (0.8, 1.0)
    given = col(f'L=3 m, ends="fixed-pinned", ends_y="pinned-pinned", K_x=0.8, K_y=1.0, {COL}')
    assert f(given, "P_cr", "kN") == pytest.approx(f(c, "P_cr", "kN"), rel=1e-12)


def test_column_L_y_defaults_to_L():
    c = col(f"L=6 m, {COL}")
    # slenderness about y: K·L/r_y with r_y = √(I_y/A)
    assert f(c, "KL_r_y", "") == pytest.approx(6000 / math.sqrt(2e7 / 6000), rel=1e-12)
    assert f(col(f"L=6 m, L_y=6 m, {COL}"), "KL_r_y", "") == f(c, "KL_r_y", "")


def test_column_properties_come_from_the_records_when_not_given():
    rs = one("""
        sec = section.rectangle(b=100 mm, h=200 mm)
        mat = material.steel(grade="S355")
        c = column.buckling(L=3 m, section=sec, material=mat)
        d = column.buckling(L=3 m, E=mat.E, F_y=mat.f_y, A=sec.A, I_x=sec.I_x, I_y=sec.I_y)
    """)
    c, d = rs.values["c"], rs.values["d"]
    for field in ("P_cr", "sigma_cr", "P_e_x", "P_e_y"):
        unit = "kN" if field.startswith("P") else "MPa"
        assert f(c, field, unit) == pytest.approx(f(d, field, unit), rel=1e-12), field
    # rectangle: r_y = b/√12 (common practice)
    assert f(c, "KL_r_y", "") == pytest.approx(3000 / (100 / math.sqrt(12)), rel=1e-12)
    bare = calcsheet.run("c = column.buckling(L=3 m)\n")
    assert not bare.ok and "E" in bare.errors[0].message  # no record and no value: refused, never assumed


def test_column_proportional_limit_defaults_to_half_the_yield_stress():
    c = one(f"c = column.buckling(L=6 m, {COL})\n").values["c"]
    steps = {i.name: i.value for i in c.working.items if hasattr(i, "name") and hasattr(i, "value")}
    # Johnson's parabola is tangent to Euler's curve at σ = F_y/2 (Shigley §4-14 — from memory)
    assert steps["f_pl"].m_as("MPa") == pytest.approx(125.0)
    assert f(c, "C_c", "") == pytest.approx(math.sqrt(2 * math.pi**2 * 200e3 / 250), rel=1e-12)


# ---------------------------------------------------------------- material


def test_steel_without_a_thickness_takes_the_thinnest_band():
    m = one('m = material.steel(grade="S355")\n').values["m"]
    # S355, t ≤ 40 mm: f_y = 355 MPa (EN 1993-1-1 Table 3.1 — from memory)
    assert f(m, "f_y", "MPa") == 355.0
    thin = one('m = material.steel(grade="S355", t=10 mm)\n').values["m"]
    assert f(thin, "f_y", "MPa") == f(m, "f_y", "MPa")


def test_concrete_rule_defaults_to_en_1992():
    m = one("m = material.concrete(f_c=30 MPa)\n").values["m"]
    # EN 1992-1-1 Table 3.1: E_cm = 22·(f_cm/10)^0.3 GPa with f_cm = f_ck + 8 MPa (from memory)
    assert f(m, "E", "GPa") == pytest.approx(22 * 3.8**0.3, rel=1e-12)
    assert f(m, "f_u", "MPa") == pytest.approx(0.30 * 30 ** (2 / 3), rel=1e-12)


def test_custom_material_defaults():
    m = one('m = material.custom(name="x", E=200 GPa, f_y=300 MPa)\n').values["m"]
    # ν = 0.3 for steel-like metals (EN 1993-1-1 3.2.6 — from memory); G = E/(2(1+ν)) (isotropic elasticity)
    assert f(m, "nu", "") == 0.3
    assert f(m, "G", "GPa") == pytest.approx(200 / 2.6, rel=1e-12)
    assert f(m, "f_u", "MPa") == 300.0  # no ultimate strength given: the yield strength, the safe side
    assert f(m, "rho", "kg/m^3") == 0.0  # no density: self-weight is the sheet's to add
    given_nu = one('m = material.custom(name="x", E=200 GPa, f_y=300 MPa, nu=0.25)\n').values["m"]
    assert f(given_nu, "G", "GPa") == pytest.approx(200 / 2.5, rel=1e-12)
