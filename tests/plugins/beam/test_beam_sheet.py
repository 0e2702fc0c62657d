"""beam.solve from a sheet: results, working, envelope, errors with positions, figures."""
import textwrap
import xml.etree.ElementTree as ET

import pytest

import calcsheet
from calcsheet.trace import CheckResult, Figure, Step

HEAD = "---\nproject: Beam tests\n{units}---\n"


def run(body, units="SI"):
    text = HEAD.format(units=f"units: {units}\n") + textwrap.dedent(body)
    return calcsheet.run(text)


def ok(r):
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert not errs, [d.message for d in errs]
    return r


def val(r, name, unit):
    return r.values[name].m_as(unit)


def steps(record):
    return {it.name: it for it in record.working.items if isinstance(it, Step)}


def test_simple_span_results_and_traced_equilibrium():
    r = ok(run("""
        b = beam.solve(spans=[8 m], supports="pinned, roller", E=200 GPa, I=2e8 mm^4,
            loads=[beam.point(P=40 kN, x=2 m)])
        R_1 = b.R_1
        R_2 = b.R_2
        M = b.M_max
        x_M = b.x_M_max
    """))
    # AISC Manual Table 3-23 case 8: R1 = Pb/L = 30 kN, R2 = Pa/L = 10 kN, M = Pab/L = 60 kN·m at the load
    assert val(r, "R_1", "kN") == pytest.approx(30.0)
    assert val(r, "R_2", "kN") == pytest.approx(10.0)
    assert val(r, "M", "kN*m") == pytest.approx(60.0)
    assert val(r, "x_M", "m") == pytest.approx(2.0)
    st = steps(r.values["b"])
    assert st["R_B"].value.m_as("kN") == pytest.approx(10.0)  # ΣM_A = 0
    assert "ΣM about A" in st["R_B"].description
    assert st["R_A"].value.m_as("kN") == pytest.approx(30.0)  # ΣF_y = 0
    assert st["M_0"].value.m_as("kN*m") == pytest.approx(60.0)  # moments of the forces left of x₀
    assert st["M_hb"].description.startswith("handbook")
    checks = [it for it in r.values["b"].working.items if isinstance(it, CheckResult)]
    assert checks and all(c.ok for c in checks)


def test_us_units_uniform_load():
    r = ok(run("""
        b = beam.solve(spans=[24 ft], supports="pinned, roller", E=29000 ksi, I=510 in^4,
            loads=[beam.udl(w=1.2 kip/ft)])
        M = b.M_max
        d = b.delta_max
        R = b.R_1
    """, units="US"))
    assert val(r, "M", "kip*ft") == pytest.approx(1.2 * 24**2 / 8)  # AISC T3-23 case 1: wL²/8
    assert val(r, "R", "kip") == pytest.approx(1.2 * 24 / 2)  # wL/2
    assert val(r, "d", "in") == pytest.approx(5 * (1.2 / 12) * 288**4 / (384 * 29000 * 510))  # 5wL⁴/384EI
    assert r.values["b"].fields["M_max"].units == calcsheet.units.registry().Unit("kip*ft")


def test_combinations_envelope_is_superposition_of_cases():
    common = """
        b = beam.solve(spans=[5 m, 7 m, 5 m], supports="pinned, roller, roller, roller", E=210 GPa, I=1.5e8 mm^4,
            loads=[{loads}]{combos})
        R_2 = b.R_2
        R_min_2 = b.R_min_2
        M = b.M_min
    """
    D = 'beam.udl(w=6 kN/m, case="D")'
    L = 'beam.udl(w=10 kN/m, span=2, case="L"), beam.point(P=20 kN, x=2.5 m, span=3, case="L")'
    rD = ok(run(common.format(loads=D, combos="")))
    rL = ok(run(common.format(loads=L.replace('case="L"', 'case="D"'), combos="")))
    combos = ', combos=[beam.combo(name="ULS", factors="1.2 D + 1.6 L"), beam.combo(name="dead", factors="D")]'
    r = ok(run(common.format(loads=D + ", " + L, combos=combos)))
    uls = 1.2 * val(rD, "R_2", "kN") + 1.6 * val(rL, "R_2", "kN")  # superposition, case by case
    dead = val(rD, "R_2", "kN")
    assert val(r, "R_2", "kN") == pytest.approx(max(uls, dead))
    assert val(r, "R_min_2", "kN") == pytest.approx(min(uls, dead))
    st = steps(r.values["b"])
    assert {"R_sum_ULS", "W_tot_ULS", "R_sum_dead"} <= set(st)  # equilibrium tabulated per combination
    checks = [it for it in r.values["b"].working.items if isinstance(it, CheckResult)]
    assert len(checks) >= 4 and all(c.ok for c in checks)


def test_factor_text_with_optional_star_and_negative_factor():
    r = ok(run("""
        b = beam.solve(spans=[4 m], supports="fixed, free", E=200 GPa, I=1e8 mm^4,
            loads=[beam.point(P=10 kN, x=4 m, case="G"), beam.point(P=10 kN, x=4 m, case="W")],
            combos=[beam.combo(name="uplift", factors="0.9*G - 1.5 W")])
        M = b.M_sup_1
        R = b.R_min_1
    """))
    assert val(r, "R", "kN") == pytest.approx(0.9 * 10 - 1.5 * 10)  # net -6 kN: upward
    assert val(r, "M", "kN*m") == pytest.approx(6.0 * 4)  # cantilever PL, now sagging (upward tip load)


def test_cantilever_working_and_handbook_cross_check():
    r = ok(run("""
        b = beam.solve(spans=[3 m], supports="fixed, free", E=200 GPa, I=5e7 mm^4,
            loads=[beam.udl(w=4 kN/m)])
        M = b.M_sup_1
        d = b.delta_max
    """))
    assert val(r, "M", "kN*m") == pytest.approx(-4 * 9 / 2)  # AISC T3-23 case 18: wL²/2 hogging
    assert val(r, "d", "mm") == pytest.approx(4e3 * 3**4 / (8 * 200e9 * 5e-5) * 1e3)  # wL⁴/8EI
    st = steps(r.values["b"])
    assert st["M_A"].value.m_as("kN*m") == pytest.approx(-18.0)


def test_propped_cantilever_uses_stiffness_method_and_checks_equilibrium():
    r = ok(run("""
        b = beam.solve(spans=[6 m], supports="fixed, roller", E=200 GPa, I=1e8 mm^4, loads=[beam.udl(w=10 kN/m)])
        R_1 = b.R_1
        M = b.M_max
    """))
    assert val(r, "R_1", "kN") == pytest.approx(5 * 10 * 6 / 8)  # AISC T3-23 case 12: 5wL/8
    assert val(r, "M", "kN*m") == pytest.approx(9 * 10 * 36 / 128)  # 9wL²/128
    notes = [getattr(it, "text", "") for it in r.values["b"].working.items]
    assert any("indeterminate to degree 1" in t for t in notes)


def test_segmentwise_stiffness_and_material_record():
    r = ok(run("""
        mat = material.steel(grade="S275")
        b = beam.solve(spans=[4 m, 4 m], supports="fixed, free, fixed", material=mat,
            I_spans=[1e8 mm^4, 1e8 mm^4], loads=[beam.point(P=16 kN, x=4 m)])
        d = b.delta_max
    """))
    # fixed-fixed, central load: PL³/192EI (AISC T3-23 case 16); the split at the load changes nothing
    assert val(r, "d", "mm") == pytest.approx(16e3 * 8**3 / (192 * 210e9 * 1e-4) * 1e3)


def test_stresses_from_a_rectangular_section():
    r = ok(run("""
        sec = section.rectangle(b=100 mm, h=300 mm)
        b = beam.solve(spans=[5 m], supports="pinned, roller", E=11 GPa, section=sec, loads=[beam.udl(w=4 kN/m)])
        s = beam.stresses(member=b, section=sec)
        sig = s.sigma_bot
        tau = s.tau_max
    """))
    M, V = 4 * 25 / 8, 4 * 5 / 2  # kN·m, kN
    assert val(r, "sig", "MPa") == pytest.approx(6 * M * 1e6 / (100 * 300**2))  # σ = 6M/(bh²), rectangle
    assert val(r, "tau", "MPa") == pytest.approx(1.5 * V * 1e3 / (100 * 300))  # τ_max = 1.5V/(bh), rectangle


def test_deflection_limit_and_named_combination():
    r = ok(run("""
        b = beam.solve(spans=[6 m], supports="pinned, roller", E=200 GPa, I=8e7 mm^4,
            loads=[beam.udl(w=5 kN/m, case="D"), beam.udl(w=5 kN/m, case="L")],
            combos=[beam.combo(name="ULS", factors="1.35 D + 1.5 L"), beam.combo(name="live", factors="L")],
            limit=360, deflection="live")
        d = b.delta_gov
        a = b.delta_allow
        ratio = b.span_ratio
        check d <= a
    """))
    d = 5 * 5e3 * 6**4 / (384 * 200e9 * 8e-5)  # 5wL⁴/384EI, live load only
    assert val(r, "d", "m") == pytest.approx(d)
    assert val(r, "a", "mm") == pytest.approx(6000 / 360)
    assert val(r, "ratio", "") == pytest.approx(6 / d)
    assert r.checks[0].ok


@pytest.mark.parametrize("body, param, words", [
    ('b = beam.solve(spans=[6 m, 6 m], supports="pinned, hinge, roller", E=200 GPa, I=1e8 mm^4, '
     'loads=[beam.udl(w=5 kN/m)])', "supports", "mechanism"),
    ('b = beam.solve(spans=[6 m], supports="pinned, roller", E=200 GPa, I=1e8 mm^4, '
     'loads=[beam.point(P=5 kN, x=7 m)])', "loads", "outside"),
    ('b = beam.solve(spans=[6 m], supports="pinned, roller", E=200 GPa, I=-1e8 mm^4, '
     'loads=[beam.point(P=5 kN, x=3 m)])', "I", "greater than zero"),
    ('b = beam.solve(spans=[6 m], supports="pinned, roller", E=0 GPa, I=1e8 mm^4, '
     'loads=[beam.point(P=5 kN, x=3 m)])', "E", "greater than zero"),
    ('b = beam.solve(spans=[0 m], supports="pinned, roller", E=200 GPa, I=1e8 mm^4, '
     'loads=[beam.point(P=5 kN, x=0 m)])', "spans", "longer than zero"),
    ('b = beam.solve(spans=[6 m], supports="pinned, rolller", E=200 GPa, I=1e8 mm^4, '
     'loads=[beam.point(P=5 kN, x=3 m)])', "supports", "did you mean"),
    ('b = beam.solve(spans=[6 m], supports="pinned, roller, roller", E=200 GPa, I=1e8 mm^4, '
     'loads=[beam.point(P=5 kN, x=3 m)])', "supports", "need 2 supports"),
    ('b = beam.solve(spans=[6 m], supports="pinned, roller", E=200 GPa, I=1e8 mm^4, '
     'loads=[beam.point(P=5 kN, x=3 m, case="D")], combos=[beam.combo(name="U", factors="1.2 D + 1.6 L")])',
     "combos", "case 'L'"),
    ('b = beam.solve(spans=[6 m], supports="pinned, roller", E=200 GPa, I=1e8 mm^4, '
     'loads=[beam.point(P=5 kN, x=3 m, span=2)])', "loads", "span 2"),
])
def test_bad_input_is_an_error_at_the_parameter(body, param, words):
    r = run(body + "\n")
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert len(errs) == 1 and words in errs[0].message
    line = body
    col = errs[0].span.col
    assert line[col - 1:].startswith(param + "="), (line[col - 1:col + 20], param)


def test_bad_factor_text_is_refused_at_the_combo():
    r = run('c = beam.combo(name="U", factors="1.2 D 1.6 L")\n')
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert errs and "expected + or -" in errs[0].message


def test_four_figures_are_valid_svg_and_escape_sheet_text():
    r = ok(run("""
        b = beam.solve(spans=[4 m, 2 m], supports="pinned, roller, free", E=200 GPa, I=1e8 mm^4,
            loads=[beam.point(P=5 kN, x=6 m, case="D"), beam.varying(w_1=0 kN/m, w_2=3 kN/m, start=1 m, end=4 m, case="D"),
                   beam.moment(M=2 kN*m, x=2 m, case="D")],
            combos=[beam.combo(name="<b>&x</b>", factors="D"), beam.combo(name="half", factors="0.5 D")])
    """))
    figs = [it for it in r.values["b"].working.items if isinstance(it, Figure)]
    assert len(figs) == 4
    for f in figs:
        root = ET.fromstring(f.svg)  # well-formed
        assert root.tag.endswith("svg")
        assert "<b>" not in f.svg
    assert "&lt;b&gt;&amp;x&lt;/b&gt;" in "".join(f.svg for f in figs)  # the legend names the combination


def test_overhang_tip_load_us_customary():
    r = ok(run("""
        b = beam.solve(spans=[18 ft, 6 ft], supports="pinned, roller, free", E=29000 ksi, I=300 in^4,
            loads=[beam.point(P=8 kip, x=24 ft)])
        R_1 = b.R_min_1
        R_2 = b.R_2
        M = b.M_min
        d = b.delta_max
    """, units="US"))
    L, a, P, EI = 18 * 12, 6 * 12, 8, 29000 * 300  # in, kip
    assert val(r, "R_1", "kip") == pytest.approx(-P * a / L)  # AISC T3-23 case 26: R1 = Pa/l (down)
    assert val(r, "R_2", "kip") == pytest.approx(P * (L + a) / L)  # R2 = P(l+a)/l
    assert val(r, "M", "kip*in") == pytest.approx(-P * a)  # M = Pa at R2
    assert val(r, "d", "in") == pytest.approx(P * a**2 * (L + a) / (3 * EI))  # tip: Pa²(l+a)/3EI


def test_traced_max_moment_matches_the_solver_with_partial_and_varying_loads():
    r = ok(run("""
        b = beam.solve(spans=[1.5 m, 7 m, 2 m], supports="free, pinned, roller, free", E=200 GPa, I=1e8 mm^4,
            loads=[beam.varying(w_1=2 kN/m, w_2=8 kN/m, start=2 m, end=6.5 m), beam.udl(w=3 kN/m, end=4 m),
                   beam.point(P=5 kN, x=0 m), beam.moment(M=4 kN*m, x=5 m), beam.point(P=6 kN, x=10.5 m)])
        M = b.M_max
    """))
    st = steps(r.values["b"])
    # the hand trace (moments of the forces left of x₀, with the cut part of each line load) is evaluated by the
    # engine from its own formula text; it must land on the solver's exact maximum
    assert st["M_0"].value.m_as("kN*m") == pytest.approx(val(r, "M", "kN*m"), rel=1e-8)
    assert st["R_C"].value.m_as("kN") == pytest.approx(r.values["b"].fields["R_3"].m_as("kN"), rel=1e-8)


def test_gerber_beam_with_a_hinge_is_traced_as_determinate():
    r = ok(run("""
        b = beam.solve(spans=[5 m, 1.5 m, 4 m], supports="pinned, roller, hinge, roller", E=200 GPa, I=1e8 mm^4,
            loads=[beam.udl(w=10 kN/m)])
        R_4 = b.R_4
    """))
    # the suspended span (hinge to the last support, 4 m) is simply supported: R = wL/2 = 20 kN (statics)
    assert val(r, "R_4", "kN") == pytest.approx(20.0)
    notes = [getattr(it, "text", "") for it in r.values["b"].working.items]
    assert any("statically determinate (1 internal hinge" in t for t in notes)


def test_cantilever_deflection_limit_uses_twice_its_length():
    r = ok(run("""
        b = beam.solve(spans=[3 m], supports="fixed, free", E=200 GPa, I=1e8 mm^4, loads=[beam.point(P=5 kN, x=3 m)],
            limit=360)
        a = b.delta_allow
        ratio = b.span_ratio
    """))
    # common practice: a cantilever's span/δ limit is taken on twice its length (L/180 for an L/360 floor)
    assert val(r, "a", "mm") == pytest.approx(2 * 3000 / 360)
    d = 5e3 * 3**3 / (3 * 200e9 * 1e-4)  # PL³/3EI
    assert val(r, "ratio", "") == pytest.approx(2 * 3 / d)
