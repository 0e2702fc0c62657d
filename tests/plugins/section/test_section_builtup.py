"""Built-up sections through the sheet language, each against a hand calculation in the test.

The hand calculations are written out here with plain arithmetic (the tabular
parallel-axis method a reviewer uses), independent of the plugin's code.
"""
import pytest


def mm(q, unit="mm"):
    return q.m_as(unit)


def test_welded_girder_with_bolt_holes_in_the_bottom_flange(run):
    r = run("""
        top = section.part(shape=section.rectangle(b=200 mm, h=20 mm), x=0 mm, y=380 mm, anchor="bottom-centre",
                           name="top flange")
        web = section.part(shape=section.rectangle(b=10 mm, h=360 mm), x=0 mm, y=20 mm, anchor="bottom-centre",
                           name="web")
        bot = section.part(shape=section.rectangle(b=200 mm, h=20 mm), x=0 mm, y=0 mm, anchor="bottom-centre",
                           name="bottom flange")
        h1 = section.hole(shape=section.rectangle(b=22 mm, h=20 mm), x=-60 mm, y=10 mm, name="bolt hole 1")
        h2 = section.hole(shape=section.rectangle(b=22 mm, h=20 mm), x=60 mm, y=10 mm, name="bolt hole 2")
        g = section.built_up(parts=[top, web, bot, h1, h2])
    """)
    assert not [d for d in r.diagnostics if d.severity == "error"], r.diagnostics
    g = r.values["g"].fields
    # hand calculation, rows: (A, y, I_o)
    rows = [(200 * 20, 390, 200 * 20**3 / 12), (10 * 360, 200, 10 * 360**3 / 12), (200 * 20, 10, 200 * 20**3 / 12),
            (-22 * 20, 10, -22 * 20**3 / 12), (-22 * 20, 10, -22 * 20**3 / 12)]
    A = sum(a for a, _, _ in rows)
    assert A == 10720
    y_c = sum(a * y for a, y, _ in rows) / A  # = 2 311 200 / 10 720
    assert y_c == pytest.approx(215.597, abs=1e-3)
    I_x = sum(io + a * (y - y_c) ** 2 for a, y, io in rows)
    assert mm(g["A"], "mm^2") == pytest.approx(A, rel=1e-12)
    assert mm(g["y_c"]) == pytest.approx(y_c, rel=1e-12)
    assert mm(g["x_c"]) == pytest.approx(0.0, abs=1e-9)
    assert mm(g["I_x"], "mm^4") == pytest.approx(I_x, rel=1e-12)
    assert mm(g["S_x_bot"], "mm^3") == pytest.approx(I_x / y_c, rel=1e-12)
    assert mm(g["S_x_top"], "mm^3") == pytest.approx(I_x / (400 - y_c), rel=1e-12)
    assert mm(g["S_x"], "mm^3") == pytest.approx(I_x / max(y_c, 400 - y_c), rel=1e-12)  # governing: farther fibre
    # about y: holes at ±60 mm
    I_y = 2 * 20 * 200**3 / 12 + 360 * 10**3 / 12 - 2 * (20 * 22**3 / 12 + 440 * 60**2)
    assert mm(g["I_y"], "mm^4") == pytest.approx(I_y, rel=1e-12)
    # plastic axis: half the area 5360 mm²; the top flange holds 4000, so it lies in the web 136 mm below it
    y_p = 380 - (5360 - 4000) / 10
    assert mm(g["y_p"]) == pytest.approx(y_p, rel=1e-12)
    Z = 4000 * (390 - y_p) + 10 * (380 - y_p) ** 2 / 2 + 10 * (y_p - 20) ** 2 / 2 + (4000 - 880) * (y_p - 10)
    assert mm(g["Z_x"], "mm^3") == pytest.approx(Z, rel=1e-12)
    # shear at the neutral axis (in the web): Q of the part above y_c
    Q = 4000 * (390 - y_c) + 10 * (380 - y_c) ** 2 / 2
    assert mm(g["Q_x"], "mm^3") == pytest.approx(Q, rel=1e-12)
    assert mm(g["t_x"]) == pytest.approx(10.0, rel=1e-12)


def test_timber_beam_with_a_steel_plate_below_transformed(run):
    r = run("""
        wood = section.part(shape=section.rectangle(b=100 mm, h=200 mm), x=0 mm, y=10 mm, E=10 GPa,
                              rho=500 kg/m^3, name="timber")
        steel = section.part(shape=section.rectangle(b=100 mm, h=10 mm), x=0 mm, y=0 mm, E=200 GPa,
                             rho=7850 kg/m^3, name="steel plate")
        s = section.built_up(parts=[wood, steel], E_ref=10 GPa)
    """)
    assert not [d for d in r.diagnostics if d.severity == "error"], r.diagnostics
    s = r.values["s"].fields
    n = 200 / 10  # modular ratio, steel to timber
    A_t, A_s = 100 * 200, n * 100 * 10  # transformed areas
    y_c = (A_t * 110 + A_s * 5) / (A_t + A_s)
    assert y_c == pytest.approx(57.5)
    I = 100 * 200**3 / 12 + A_t * (110 - y_c) ** 2 + n * 100 * 10**3 / 12 + A_s * (5 - y_c) ** 2
    assert mm(s["A"], "mm^2") == pytest.approx(A_t + A_s, rel=1e-12)
    assert mm(s["y_c"]) == pytest.approx(y_c, rel=1e-12)
    assert mm(s["I_x"], "mm^4") == pytest.approx(I, rel=1e-12)
    assert mm(s["S_x_top"], "mm^3") == pytest.approx(I / (210 - y_c), rel=1e-12)
    # mass from actual areas: 0.02 m² timber at 500 kg/m³ plus 0.001 m² steel at 7850 kg/m³
    assert s["mass"].m_as("kg/m") == pytest.approx(0.02 * 500 + 0.001 * 7850, rel=1e-12)
    # transformed width at the neutral axis (in the timber): the timber's own 100 mm
    assert mm(s["t_x"]) == pytest.approx(100.0, rel=1e-12)
    # plastic axis of the transformed section: half of 40 000 mm² is the whole plate (20 000): y_p = 10 mm
    assert mm(s["y_p"]) == pytest.approx(10.0, rel=1e-12)


def test_transformed_section_defaults_to_the_first_parts_modulus(run):
    r = run("""
        a = section.part(shape=section.rectangle(b=100 mm, h=100 mm), E=70 GPa)
        b = section.part(shape=section.rectangle(b=100 mm, h=100 mm), y=100 mm, E=210 GPa)
        s = section.built_up(parts=[a, b])
    """)
    s = r.values["s"].fields
    # n = 3 for the upper block: y_c = (10 000·50 + 30 000·150)/40 000
    assert mm(s["y_c"]) == pytest.approx((10000 * 50 + 30000 * 150) / 40000, rel=1e-12)


def test_parts_that_do_not_touch_warn_at_the_parts_argument(run):
    r = run("""
        a = section.part(shape=section.rectangle(b=100 mm, h=10 mm), name="upper")
        b = section.part(shape=section.rectangle(b=100 mm, h=10 mm), y=50 mm, name="lower")
        s = section.built_up(parts=[a, b])
    """)
    warns = [d for d in r.diagnostics if d.severity == "warning"]
    assert warns and "not connected" in warns[0].message
    assert warns[0].span.line == 3 and warns[0].span.col == len("s = section.built_up(") + 1


@pytest.mark.parametrize("hole, words", [
    ('section.hole(shape=section.rectangle(b=22 mm, h=30 mm), x=50 mm, y=5 mm)', "not fully inside"),
    ('section.hole(shape=section.circle(d=8 mm), x=150 mm, y=5 mm)', "not fully inside"),
])
def test_a_hole_outside_the_material_is_an_error(run, hole, words):
    r = run(f"""
        a = section.part(shape=section.rectangle(b=100 mm, h=10 mm))
        h = {hole}
        s = section.built_up(parts=[a, h])
    """)
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert errs and words in errs[0].message and errs[0].span.line == 3


def test_overlapping_holes_and_overlapping_parts_are_errors(run):
    r = run("""
        a = section.part(shape=section.rectangle(b=100 mm, h=40 mm))
        h1 = section.hole(shape=section.circle(d=20 mm), x=40 mm, y=20 mm)
        h2 = section.hole(shape=section.circle(d=20 mm), x=55 mm, y=20 mm)
        s = section.built_up(parts=[a, h1, h2])
    """)
    assert any("overlap" in d.message for d in r.diagnostics if d.severity == "error")
    r = run("""
        a = section.part(shape=section.rectangle(b=100 mm, h=40 mm))
        b = section.part(shape=section.rectangle(b=100 mm, h=40 mm), x=50 mm, y=20 mm)
        s = section.built_up(parts=[a, b])
    """)
    assert any("overlap" in d.message for d in r.diagnostics if d.severity == "error")


def test_a_hole_across_two_materials_must_be_split(run):
    r = run("""
        a = section.part(shape=section.rectangle(b=100 mm, h=40 mm), E=10 GPa)
        b = section.part(shape=section.rectangle(b=100 mm, h=10 mm), y=40 mm, E=200 GPa)
        h = section.hole(shape=section.rectangle(b=20 mm, h=20 mm), x=50 mm, y=40 mm)
        s = section.built_up(parts=[a, b, h])
    """)
    assert any("different materials" in d.message for d in r.diagnostics if d.severity == "error")


def test_rotated_and_mirrored_angles_back_to_back(run):
    # two 100×75×10 angles back to back (long legs vertical, 10 mm gap): a doubly symmetric pair about y
    r = run("""
        L1 = section.angle(h=100 mm, b=75 mm, t=10 mm, detail="brief")
        right = section.part(shape=L1, x=5 mm, y=0 mm)
        left = section.part(shape=L1, x=-5 mm, y=0 mm, anchor="bottom-right", mirror="left-right")
        gusset = section.part(shape=section.rectangle(b=10 mm, h=100 mm), x=0 mm, y=0 mm, anchor="bottom-centre")
        pair = section.built_up(parts=[left, gusset, right])
    """)
    assert not [d for d in r.diagnostics if d.severity == "error"], r.diagnostics
    L1, pair = r.values["L1"].fields, r.values["pair"].fields
    assert mm(pair["x_c"]) == pytest.approx(0.0, abs=1e-9)
    assert abs(pair["I_xy"].m_as("mm^4")) < 1e-6 * pair["I_x"].m_as("mm^4")
    # hand: I_x = 2(I_x,L + A_L d²) + plate; all share the same base, so d = y_c,L − y_c
    A_L, yL = L1["A"].m_as("mm^2"), mm(L1["y_c"])
    A = 2 * A_L + 1000
    y_c = (2 * A_L * yL + 1000 * 50) / A
    I_x = 2 * (L1["I_x"].m_as("mm^4") + A_L * (yL - y_c) ** 2) + 10 * 100**3 / 12 + 1000 * (50 - y_c) ** 2
    assert mm(pair["y_c"]) == pytest.approx(y_c, rel=1e-12)
    assert pair["I_x"].m_as("mm^4") == pytest.approx(I_x, rel=1e-12)
    xL = mm(L1["x_c"])
    I_y = 2 * (L1["I_y"].m_as("mm^4") + A_L * (5 + xL) ** 2) + 100 * 10**3 / 12
    assert pair["I_y"].m_as("mm^4") == pytest.approx(I_y, rel=1e-12)


def test_parallel_axis_about_a_named_axis(run):
    r = run("""
        s = section.tee(h=200 mm, b=150 mm, t_f=12 mm, t_w=10 mm, y_ref=0 mm, x_ref=0 mm)
    """)
    s = r.values["s"].fields
    # the base: I_base = Σ (I_o + A y²) directly, without the centroid
    I_base = 150 * 12**3 / 12 + 1800 * 194**2 + 10 * 188**3 / 12 + 1880 * 94**2
    assert s["I_x_ref"].m_as("mm^4") == pytest.approx(I_base, rel=1e-12)
    I_left = 12 * 150**3 / 12 + 1800 * 75**2 + 188 * 10**3 / 12 + 1880 * 75**2
    assert s["I_y_ref"].m_as("mm^4") == pytest.approx(I_left, rel=1e-12)


def test_a_stack_of_ten_plates_with_ten_bolt_holes(run):
    # many parts, most pairs far apart: the pairwise tests must still find every contact and every hole
    lines = ['pl = section.rectangle(b=300 mm, h=20 mm)', 'ct = section.rectangle(b=22 mm, h=20 mm)']
    names = []
    for k in range(10):
        lines += [f"p{k} = section.part(shape=pl, y={20 * k} mm)",
                  f"h{k} = section.hole(shape=ct, x=60 mm, y={20 * k + 10} mm)"]
        names += [f"p{k}", f"h{k}"]
    r = run("\n".join(lines) + f"\ns = section.built_up(parts=[{', '.join(names)}])\n")
    assert not [d for d in r.diagnostics if d.severity in ("error", "warning")], r.diagnostics
    g = r.values["s"].fields
    # hand calculation: a 300 × 200 block (a part's default anchor is its bottom-left corner: x from 0 to 300)
    # less a 22 × 200 slot centred on x = 60
    A = 300 * 200 - 22 * 200
    x_c = (300 * 200 * 150 - 22 * 200 * 60) / A
    assert mm(g["A"], "mm^2") == pytest.approx(A, rel=1e-12)
    assert mm(g["y_c"]) == pytest.approx(100.0, rel=1e-12)
    assert mm(g["x_c"]) == pytest.approx(x_c, rel=1e-12)
    assert mm(g["I_x"], "mm^4") == pytest.approx((300 - 22) * 200**3 / 12, rel=1e-12)
    I_y = 200 * 300**3 / 12 + 300 * 200 * (150 - x_c) ** 2 - (200 * 22**3 / 12 + 22 * 200 * (60 - x_c) ** 2)
    assert mm(g["I_y"], "mm^4") == pytest.approx(I_y, rel=1e-12)


@pytest.mark.parametrize("gap, apart", [("0.001 mm", False), ("0.5 mm", True)])
def test_parts_count_as_touching_within_the_tolerance_only(run, gap, apart):
    # touching tolerance 1e-4 of the section's size (100 mm here): 0.01 mm
    r = run(f"""
        a = section.part(shape=section.rectangle(b=100 mm, h=10 mm), name="lower")
        b = section.part(shape=section.rectangle(b=100 mm, h=10 mm), y=10 mm + {gap}, name="upper")
        s = section.built_up(parts=[a, b])
    """)
    warns = [d for d in r.diagnostics if d.severity == "warning" and "not connected" in d.message]
    assert bool(warns) == apart
