"""Values anywhere (beam.at), one combination's results (beam.result), governing combinations, concurrent
actions, ties and support-letter names, against published beam formulas and statics.

Formulas: AISC Steel Construction Manual, 15th ed., Table 3-23 (case numbers from memory) and Roark's
Formulas for Stress and Strain, 7th ed., Table 8.1 (from memory); each check names its case.
"""
import textwrap

import pytest

import calcsheet
from calcsheet.trace import Note

HEAD = "---\nproject: beam queries\n---\n"
E, I = 200e9, 1e-4  # Pa, m^4 -> EI = 2e7 N·m²
EI = E * I
STIFF = "E=200 GPa, I=1e8 mm^4"


def run(body):
    r = calcsheet.run(HEAD + textwrap.dedent(body))
    errs = [d.message for d in r.diagnostics if d.severity == "error"]
    assert not errs, errs
    return r


def f(r, name, field, unit):
    return r.values[name].fields[field].m_as(unit)


def test_deflection_under_an_off_centre_point_load():
    L, P, a = 8.0, 25e3, 5.0
    b = L - a
    r = run(f"""
        b = beam.solve(spans=[8 m], supports="pinned, roller", {STIFF}, loads=[beam.point(P=25 kN, x=5 m)])
        p = beam.at(member=b, x=5 m)
        q = beam.at(member=b, x=2 m)
    """)
    assert f(r, "p", "delta", "m") == pytest.approx(P * a**2 * b**2 / (3 * EI * L), rel=1e-9)  # T3-23 case 8
    x = 2.0  # case 8, x < a: δ = P·b·x·(L² − b² − x²)/(6·EI·L)
    assert f(r, "q", "delta", "m") == pytest.approx(P * b * x * (L**2 - b**2 - x**2) / (6 * EI * L), rel=1e-9)
    assert f(r, "p", "V", "N") == pytest.approx(-P * a / L, rel=1e-9)  # right of the load: V = −R2 = −Pa/L
    assert f(r, "p", "V_left", "N") == pytest.approx(P * b / L, rel=1e-9)  # left of it: R1 = Pb/L
    assert f(r, "p", "M", "N*m") == pytest.approx(P * a * b / L, rel=1e-9)  # case 8: M = Pab/L


def test_slopes_at_the_supports():
    L, w = 6.0, 12e3
    r = run(f"""
        b = beam.solve(spans=[6 m], supports="pinned, roller", {STIFF}, loads=[beam.udl(w=12 kN/m)])
        s = beam.result(member=b)
        c = beam.solve(spans=[8 m], supports="pinned, roller", {STIFF}, loads=[beam.point(P=25 kN, x=5 m)])
        t = beam.result(member=c)
    """)
    assert f(r, "s", "theta_A", "rad") == pytest.approx(w * L**3 / (24 * EI), rel=1e-9)  # Roark 8.1: wL³/24EI
    assert f(r, "s", "theta_B", "rad") == pytest.approx(-w * L**3 / (24 * EI), rel=1e-9)
    P, a, b, L = 25e3, 5.0, 3.0, 8.0
    # Roark 8.1, concentrated load: θ_A = P·a·b·(L + b)/(6·EI·L), θ_B = −P·a·b·(L + a)/(6·EI·L)
    assert f(r, "t", "theta_A", "rad") == pytest.approx(P * a * b * (L + b) / (6 * EI * L), rel=1e-9)
    assert f(r, "t", "theta_B", "rad") == pytest.approx(-P * a * b * (L + a) / (6 * EI * L), rel=1e-9)


def test_contraflexure_of_a_propped_cantilever_and_of_two_equal_spans():
    r = run(f"""
        p = beam.solve(spans=[8 m], supports="fixed, roller", {STIFF}, loads=[beam.udl(w=10 kN/m)])
        rp = beam.result(member=p)
        t = beam.solve(spans=[5 m, 5 m], supports="pinned, roller, roller", {STIFF}, loads=[beam.udl(w=10 kN/m)])
        rt = beam.result(member=t)
    """)
    # T3-23 case 12: M = 3wLx/8 − wx²/2 from the simple end, zero at x = 3L/4, i.e. L/4 from the fixed end
    assert f(r, "rp", "n_M0", "") == 1
    assert f(r, "rp", "x_M0_1", "m") == pytest.approx(8 / 4, rel=1e-9)
    # T3-23 case 29: each span as a propped span, zero moment 3L/4 from each end support
    assert f(r, "rt", "n_M0", "") == 2
    assert f(r, "rt", "x_M0_1", "m") == pytest.approx(3.75, rel=1e-9)
    assert f(r, "rt", "x_M0_2", "m") == pytest.approx(6.25, rel=1e-9)
    # the end slope of two equal spans, wL³/(48EI) (Roark 8.1 continuous beam, from memory)
    assert f(r, "rt", "theta_A", "rad") == pytest.approx(10e3 * 5**3 / (48 * EI), rel=1e-9)
    assert f(r, "rt", "theta_B", "rad") == 0


def test_supports_are_named_by_letter_and_the_numbered_names_remain():
    r = run(f"""
        b = beam.solve(spans=[5 m, 5 m], supports="pinned, roller, roller", {STIFF}, loads=[beam.udl(w=8 kN/m)])
    """)
    rec = r.values["b"].fields
    assert rec["R_B"].m_as("kN") == pytest.approx(1.25 * 8 * 5, rel=1e-9)  # T3-23 case 29: R_B = 1.25wL
    assert rec["R_B"] == rec["R_2"] and rec["R_A"] == rec["R_1"] and rec["R_min_C"] == rec["R_min_3"]
    assert rec["M_B"] == rec["M_sup_2"]
    assert rec["M_B"].m_as("kN*m") == pytest.approx(-8 * 25 / 8, rel=1e-9)  # case 29: −wL²/8


def test_equal_extremes_are_ties_at_the_leftmost_place_whatever_the_stiffness():
    for modulus in ("200 GPa", "210 GPa", "70 GPa", "11 GPa"):
        r = run(f"""
            b = beam.solve(spans=[5 m, 5 m], supports="pinned, roller, roller", E={modulus}, I=1e8 mm^4,
                           loads=[beam.udl(w=10 kN/m)])
        """)
        rec = r.values["b"]
        # two equal spans: the deflection peak of span 1 lies at 0.4215 L (T3-23 case 29; from memory),
        # the same value mirrored in span 2; the leftmost is reported
        assert rec.fields["x_delta_max"].m_as("m") == pytest.approx(2.1077, abs=1e-4)
        assert rec.fields["x_M_max"].m_as("m") == pytest.approx(3 * 5 / 8, rel=1e-9)  # case 29: 3L/8
        notes = [it.text for it in rec.working.items if isinstance(it, Note)]
        assert any("same value of delta_max" in n and "7.8923" in n for n in notes)
        # M_max and delta_max; V_max (5wL/8 either side of B) is one place, not a tie
        assert rec.fields["ties"].m_as("") == 2


def test_the_governing_combination_and_the_actions_acting_with_it():
    r = run(f"""
        b = beam.solve(spans=[6 m], supports="pinned, roller", {STIFF},
            loads=[beam.udl(w=2 kN/m, case="D"), beam.point(P=10 kN, x=2 m, case="L")],
            combos=[beam.combo(name="one", factors="1.4 D"), beam.combo(name="two", factors="1.2 D + 1.6 L")])
    """)
    rec = r.values["b"].fields
    assert rec["combo_M_max"] == "two" and rec["combo_V_max"] == "two"
    # statics for "two": w = 2.4 kN/m, P = 16 kN at 2 m: R_A = wL/2 + P·4/6 = 7.2 + 10.667 kN;
    # the peak is at the load, where V jumps from R_A − w·2 = 13.067 to −2.933 kN: concurrent V is the larger
    RA = 2.4 * 3 + 16 * 4 / 6
    assert rec["x_M_max"].m_as("m") == pytest.approx(2.0, rel=1e-9)
    assert rec["V_at_M_max"].m_as("kN") == pytest.approx(RA - 2.4 * 2, rel=1e-9)
    assert rec["M_max"].m_as("kN*m") == pytest.approx(RA * 2 - 2.4 * 2**2 / 2, rel=1e-9)
    assert rec["M_at_V_max"].m_as("kN*m") == pytest.approx(0.0, abs=1e-9)  # V_max at the left support
    assert rec["n_combos"].m_as("") == 2


def test_one_combination_of_several_and_superposition_of_cases():
    body = f"""
        b = beam.solve(spans=[4 m, 6 m], supports="fixed, roller, free" if 0 else "fixed, roller, roller", {STIFF},
            loads=[beam.udl(w=3 kN/m, case="D"), beam.point(P=20 kN, x=7 m, case="L"),
                   beam.moment(M=5 kN*m, x=1 m, case="L")],
            combos=[beam.combo(name="D", factors="D"), beam.combo(name="L", factors="L"),
                    beam.combo(name="U", factors="1.2 D + 1.6 L")])
    """.replace('"fixed, roller, free" if 0 else ', "")
    lines = [f"d{k} = beam.at(member=b, x={x} m, combo=\"D\")\nl{k} = beam.at(member=b, x={x} m, combo=\"L\")\n"
             f"u{k} = beam.at(member=b, x={x} m, combo=\"U\")\n" for k, x in enumerate((0.5, 1.0, 3.3, 4.0, 7.0, 9.9))]
    r = run(textwrap.dedent(body) + "".join(lines))
    for k in range(6):
        for field, unit in (("M", "kN*m"), ("V_left", "kN"), ("theta", "rad"), ("delta", "mm")):
            want = 1.2 * f(r, f"d{k}", field, unit) + 1.6 * f(r, f"l{k}", field, unit)  # superposition
            assert f(r, f"u{k}", field, unit) == pytest.approx(want, rel=1e-9, abs=1e-9)


def test_asking_for_a_combination_that_does_not_exist_names_the_ones_that_do():
    r = calcsheet.run(HEAD + textwrap.dedent(f"""
        b = beam.solve(spans=[6 m], supports="pinned, roller", {STIFF}, loads=[beam.udl(w=2 kN/m, case="D")],
            combos=[beam.combo(name="ULS", factors="1.4 D"), beam.combo(name="SLS", factors="D")])
        p = beam.at(member=b, x=2 m, combo="UlS")
        q = beam.at(member=b, x=2 m)
        s = beam.at(member=b, x=7 m, combo="ULS")
    """))
    msgs = [d.message for d in r.diagnostics if d.severity == "error"]
    assert any("no combination named 'UlS'" in m and "ULS" in m for m in msgs)
    assert any("name one with combo=" in m for m in msgs)
    assert any("outside the beam" in m for m in msgs)


def test_combo_defaults_to_the_only_combination():
    r = run(f"""
        b = beam.solve(spans=[6 m], supports="pinned, roller", {STIFF}, loads=[beam.udl(w=2 kN/m)])
        p = beam.at(member=b, x=2 m)
        q = beam.at(member=b, x=2 m, combo="loads")
        s = beam.result(member=b)
        t = beam.result(member=b, combo="loads")
    """)
    assert r.values["p"].fields == r.values["q"].fields
    assert r.values["s"].fields == r.values["t"].fields
    # statics: M(2) = wLx/2 − wx²/2 (common practice)
    assert f(r, "p", "M", "kN*m") == pytest.approx(2 * 6 * 2 / 2 - 2 * 4 / 2, rel=1e-9)


def test_a_determinate_beam_needs_no_stiffness_for_its_forces():
    body = ('b = beam.solve(spans=[2 m, 6 m], supports="free, pinned, roller"{S}, '
            'loads=[beam.udl(w=10 kN/m), beam.point(P=5 kN, x=0 m)])\n')
    bare = run(body.format(S="")).values["b"]
    given = run(body.format(S=", " + STIFF)).values["b"]
    for name in ("R_B", "R_C", "M_max", "x_M_max", "M_min", "V_max", "M_B"):
        a, b = bare.fields[name], given.fields[name]
        assert a.m_as(b.units) == pytest.approx(b.magnitude, rel=1e-12, abs=1e-12), name
    # statics (common practice): ΣM about B: R_C·6 = 10·8·2 − 5·2 → R_C = 25 kN
    assert bare.fields["R_C"].m_as("kN") == pytest.approx(25.0, rel=1e-12)
    assert "delta_max" not in bare.fields and "EI" not in bare.fields
    r = calcsheet.run(HEAD + body.format(S="") + "d = b.delta_max\np = beam.at(member=b, x=3 m)\nq = p.delta\n")
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert len(errs) == 2 and all("E" in (d.hint or "") and "I" in (d.hint or "") for d in errs)


def test_an_indeterminate_beam_says_which_stiffness_it_needs():
    r = calcsheet.run(HEAD + 'b = beam.solve(spans=[6 m, 6 m], supports="pinned, roller, roller", E=200 GPa, '
                             'loads=[beam.udl(w=10 kN/m)])\n')
    msgs = [d.message for d in r.diagnostics if d.severity == "error"]
    assert msgs and "statically indeterminate" in msgs[0] and "give I (or section=…)" in msgs[0]
    assert "give E" not in msgs[0]


def test_the_slope_at_a_hinge_is_the_slope_just_to_its_right():
    # fixed at A, an internal hinge at B (4 m), roller at C (8 m), w = 10 kN/m throughout. Statics: B–C is a
    # simple span carried by A–B at the hinge, so A–B is a cantilever with its own load and P = w·b/2 at its tip.
    # Roark Table 8.1 (from memory): the cantilever's tip deflection and slope δ_B = w·a⁴/8EI + P·a³/3EI,
    # θ_B⁻ = w·a³/6EI + P·a²/2EI; B–C turns as a rigid body by −δ_B/b and bends as a simple span, end slope
    # w·b³/24EI; θ_B⁺ = w·b³/24EI − δ_B/b (downward deflection positive). The field is documented as θ_B⁺.
    w, a, b = 10e3, 4.0, 4.0
    P = w * b / 2
    d_B = w * a**4 / (8 * EI) + P * a**3 / (3 * EI)
    left = w * a**3 / (6 * EI) + P * a**2 / (2 * EI)
    right = w * b**3 / (24 * EI) - d_B / b
    r = run(f"""
        g = beam.solve(spans=[4 m, 4 m], supports="fixed, hinge, roller", {STIFF}, loads=[beam.udl(w=10 kN/m)])
        rg = beam.result(member=g)
    """)
    assert f(r, "rg", "theta_B", "rad") == pytest.approx(right, rel=1e-9)
    assert abs(right - left) > 0.5 * abs(left)  # the two sides really differ: reading the left would fail
    # the last support has nothing to its right: its slope is the one just to its left, the simple span's
    # far-end slope plus the same rigid turn, θ_C = −w·b³/24EI − δ_B/b
    assert f(r, "rg", "theta_C", "rad") == pytest.approx(-w * b**3 / (24 * EI) - d_B / b, rel=1e-9)


def test_an_overhang_beyond_a_loaded_span_lifts_by_the_supports_rotation_times_its_length():
    # simple span L = 6 m under w = 10 kN/m, a 2 m overhang a unloaded: it turns rigidly with the span's end
    # slope wL³/24EI, so its tip rises wL³a/24EI = 9 mm; the span sags 5wL⁴/384EI = 8.4375 mm at mid-span
    # (AISC Manual Table 3-23, beam overhanging one support, uniform load between supports; from memory)
    r = run(f"""
        b = beam.solve(spans=[6 m, 2 m], supports="pinned, roller, free", {STIFF},
                       loads=[beam.udl(w=10 kN/m, start=0 m, end=6 m)])
    """)
    w, L, a = 10e3, 6.0, 2.0
    assert f(r, "b", "delta_up", "m") == pytest.approx(w * L**3 * a / (24 * EI), rel=1e-9)
    assert f(r, "b", "x_delta_up", "m") == pytest.approx(8.0)
    assert f(r, "b", "delta_down", "m") == pytest.approx(5 * w * L**4 / (384 * EI), rel=1e-9)
