"""Generated combinations on a beam: pattern loading against published continuous-beam formulas, and the
properties every set must have (equilibrium per combination, the envelope is the pointwise extreme of the
combinations, superposition of the cases)."""
import textwrap

import numpy as np
import pytest

import calcsheet
from calcsheet.trace import CheckResult, Table

HEAD = "---\nproject: loads on a beam\n---\n"
STIFF = "E=200 GPa, I=1e8 mm^4"


def run(body):
    r = calcsheet.run(HEAD + textwrap.dedent(body))
    errs = [d.message for d in r.diagnostics if d.severity == "error"]
    assert not errs, errs
    return r


TWO_SPANS = f"""
    c = loads.combinations(set="EN 1990 6.10", cases="G, Q: imposed B")
    b = beam.solve(spans=[5 m, 5 m], supports="pinned, roller, roller", {STIFF},
        loads=[beam.udl(w=4 kN/m, case="G"), beam.udl(w=10 kN/m, case="Q")], combinations=[c])
"""


def test_pattern_loading_of_two_equal_spans():
    r = run(TWO_SPANS)
    b = r.values["b"].fields
    g, q, L = 4.0, 10.0, 5.0
    # largest sagging moment in span 1: 1.35 g on both spans (AISC T3-23 case 29: R_A = 3wL/8) plus 1.5 q on
    # span 1 only (case 30: R_A = 7wL/16); M(x) = R_A·x − w1·x²/2 is largest where V = 0
    RA = 1.35 * g * 3 * L / 8 + 1.5 * q * 7 * L / 16
    w1 = 1.35 * g + 1.5 * q
    assert b["M_max"].m_as("kN*m") == pytest.approx(RA**2 / (2 * w1), rel=1e-9)
    assert b["x_M_max"].m_as("m") == pytest.approx(RA / w1, rel=1e-9)
    # largest hogging at B with both spans loaded: (1.35g + 1.5q)·L²/8 (case 29)
    assert b["M_min"].m_as("kN*m") == pytest.approx(-(1.35 * g + 1.5 * q) * L**2 / 8, rel=1e-9)
    # smallest reaction at A: G favourable (1.0) with q on span 2 only: 3gL/8 − 1.5·q·L/16 (case 30: R_A = −wL/16)
    assert b["R_min_A"].m_as("kN") == pytest.approx(1.0 * g * 3 * L / 8 - 1.5 * q * L / 16, rel=1e-9)
    assert b["combo_M_max"].startswith("U") and b["combo_M_max"][-1] in "ab"


def test_every_generated_combination_is_listed_with_its_factors_and_clause():
    r = run(TWO_SPANS)
    rec = r.values["b"]
    table = next(it for it in rec.working.items if isinstance(it, Table) and it.title == "Combinations")
    assert table.columns == ["Name", "Factors", "Leading", "Duration", "Source"]
    assert any(row[1] == "1.35 G + 1.5 Q" and row[4] == "EN 1990:2002+A1:2005 6.4.3.2 (6.10)" for row in table.rows)
    assert any("[Q on spans 1]" in row[1] for row in table.rows)
    assert len(table.rows) == rec.fields["n_combos"].m_as("")


BODY = f"""
    u = loads.combinations(set="ASCE 7-22 LRFD", cases="D, L, S")
    b = beam.solve(spans=[4 m, 6 m, 3 m], supports="pinned, roller, roller, free", {STIFF},
        loads=[beam.udl(w=2 kN/m, case="D"), beam.udl(w=5 kN/m, case="L"),
               beam.point(P=8 kN, x=2 m, span=2, case="S"), beam.varying(w_1=0 kN/m, w_2=3 kN/m, span=3, case="L")],
        combinations=[u])
"""


def names_of(rec):
    table = next(it for it in rec.working.items if isinstance(it, Table) and it.title == "Combinations")
    return [row[0] for row in table.rows]


def test_equilibrium_holds_for_every_combination():
    r = run(BODY)
    rec = r.values["b"]
    checks = [it for it in rec.working.items if isinstance(it, CheckResult) and it.description.startswith("Σ")]
    assert len(checks) == 2 and all(c.ok for c in checks)  # many combinations: the worst residual is checked
    table = next(it for it in rec.working.items if isinstance(it, Table) and it.title.startswith("Equilibrium"))
    assert [row[0] for row in table.rows] == names_of(rec)
    for row in table.rows:  # and every row balances (columns read by name: the reactions stand beside the sums)
        cell = dict(zip(table.columns, row))
        W, R, MW, MR = (cell[k] for k in ("ΣW", "ΣR", "ΣW·a", "ΣR·a + couples"))
        assert R.m_as("kN") == pytest.approx(W.m_as("kN"), rel=1e-9, abs=1e-9)
        assert MR.m_as("kN*m") == pytest.approx(MW.m_as("kN*m"), rel=1e-9, abs=1e-9)


def test_the_envelope_is_the_pointwise_extreme_of_the_combinations():
    r = run(BODY)
    rec = r.values["b"]
    names = names_of(rec)
    xs = np.linspace(0.0, 13.0, 9)
    text = "".join(f'r{i} = beam.result(member=b, combo="{n}")\n' for i, n in enumerate(names))
    text += "".join(f'a{i}_{j} = beam.at(member=b, x={x:.4f} m, combo="{n}")\n'
                    for i, n in enumerate(names) for j, x in enumerate(xs))
    r2 = run(BODY + text)
    env = r2.values["b"].fields
    per = [r2.values[f"r{i}"].fields for i in range(len(names))]
    assert env["M_max"].m_as("kN*m") == pytest.approx(max(p["M_max"].m_as("kN*m") for p in per), rel=1e-12)
    assert env["M_min"].m_as("kN*m") == pytest.approx(min(p["M_min"].m_as("kN*m") for p in per), rel=1e-12)
    assert env["V_max"].m_as("kN") == pytest.approx(max(p["V_max"].m_as("kN") for p in per), rel=1e-12)
    assert env["delta_down"].m_as("mm") == pytest.approx(max(p["delta_down"].m_as("mm") for p in per), rel=1e-12)
    assert env["delta_up"].m_as("mm") == pytest.approx(max(p["delta_up"].m_as("mm") for p in per), rel=1e-12)
    M = np.array([[r2.values[f"a{i}_{j}"].fields["M"].m_as("kN*m") for j in range(len(xs))]
                  for i in range(len(names))])
    assert M.max() <= env["M_max"].m_as("kN*m") * (1 + 1e-12) and M.min() >= env["M_min"].m_as("kN*m") * (1 + 1e-12)
    gov = names.index(env["combo_M_max"])
    assert per[gov]["M_max"] == env["M_max"] and per[gov]["x_M_max"] == env["x_M_max"]
    for k in (1, 2, 3):  # per span: the extreme of the combinations' per-span values
        assert env[f"M_max_{k}"].m_as("kN*m") == pytest.approx(max(p[f"M_max_{k}"].m_as("kN*m") for p in per))


def test_a_generated_combination_is_the_sum_of_its_factored_cases():
    body = BODY + "".join(f'{n}{k} = beam.at(member=b, x={x} m, combo="{c}")\n'
                          for k, x in enumerate((1.0, 5.5, 11.5)) for n, c in (("p", "LC2"), ("q", "LC1")))
    r = run(body)
    rec = r.values["b"]
    # LC1 = 1.4 D (2.3.1 (1)); LC2 = 1.2 D + 1.6 L + 0.15 S (2.3.1 (2), with 0.5(0.3 S))
    table = next(it for it in rec.working.items if isinstance(it, Table) and it.title == "Combinations")
    rows = {row[0]: row[1] for row in table.rows}
    assert rows["LC1"] == "1.4 D" and rows["LC2"] == "1.2 D + 1.6 L + 0.15 S"
    for k in range(3):
        d = r.values[f"q{k}"].fields["M"].m_as("kN*m") / 1.4
        # superposition: LC2 − (1.2/1.4)·LC1 leaves 1.6 L + 0.15 S, which must not depend on D
        rest = r.values[f"p{k}"].fields["M"].m_as("kN*m") - 1.2 * d
        only = run(BODY.replace("combinations=[u]", 'combos=[beam.combo(name="LS", factors="1.6 L + 0.15 S")]')
                   + f'z = beam.at(member=b, x={(1.0, 5.5, 11.5)[k]} m)\n').values["z"].fields["M"].m_as("kN*m")
        assert rest == pytest.approx(only, rel=1e-9, abs=1e-9)


def test_deflection_limit_on_a_whole_set():
    r = run(f"""
        u = loads.combinations(set="EN 1990 6.10", cases="G, Q: imposed B")
        s = loads.combinations(set="EN 1990 characteristic", cases="G, Q: imposed B")
        b = beam.solve(spans=[6 m], supports="pinned, roller", {STIFF},
            loads=[beam.udl(w=2 kN/m, case="G"), beam.udl(w=3 kN/m, case="Q")], combinations=[u, s],
            deflection="EN 1990 characteristic")
    """)
    b = r.values["b"].fields
    assert b["combo_delta_gov"].startswith("C")
    # G + Q = 5 kN/m: 5wL⁴/(384EI), AISC T3-23 case 1
    assert b["delta_gov"].m_as("m") == pytest.approx(5 * 5e3 * 6**4 / (384 * 2e7), rel=1e-9)


def test_an_unknown_set_is_a_located_error_before_anything_runs():
    r = calcsheet.run(HEAD + 'c = loads.combinations(set="EN 1990 6.11", cases="G")\n')
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert errs and "EN 1990 6.10" in errs[0].message + str(errs[0].hint or "")
    assert errs[0].span.line == 4


def test_asce_worked_example_simply_supported_floor_beam():
    # a floor beam, D = 2 kN/m, L = 5 kN/m on 6 m: 2.3.1 (2) 1.2D + 1.6L governs, w_u = 1.2·2 + 1.6·5 = 10.4 kN/m,
    # M_u = w_u·L²/8 = 46.8 kN·m (AISC Manual Table 3-23 case 1); 2.3.1 (1) 1.4D gives only 2.8 kN/m
    r = run(f"""
        u = loads.combinations(set="ASCE 7-22 LRFD", cases="D, L")
        b = beam.solve(spans=[6 m], supports="pinned, roller", {STIFF},
            loads=[beam.udl(w=2 kN/m, case="D"), beam.udl(w=5 kN/m, case="L")], combinations=[u])
    """)
    b = r.values["b"].fields
    assert b["M_max"].m_as("kN*m") == pytest.approx(10.4 * 36 / 8, rel=1e-12)
    assert b["combo_M_max"] == "LC2"
    assert r.values["u"].fields["combo_2"].fields["factors"] == "1.2 D + 1.6 L"
    assert r.values["u"].fields["combo_2"].fields["clause"] == "ASCE/SEI 7-22 2.3.1 (2)"
    assert r.values["u"].fields["combo_2"].fields["duration"] == "ten years"  # NDS Table 2.3.2, occupancy live
