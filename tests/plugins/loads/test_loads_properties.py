"""Properties every generated set must have on any beam (hypothesis; no saved examples are replayed):
equilibrium of each combination, the envelope is the extreme of the combinations, and each combination
is the factored sum of its cases."""
import textwrap

import pytest
from hypothesis import given, settings, strategies as st

import calcsheet
from calcsheet.trace import CheckResult, Table
from calcsheet_plugins.loads.generate import generate, parse_cases

HEAD = "---\nproject: load properties\n---\n"


@st.composite
def members(draw):
    n = draw(st.integers(1, 2))
    spans = [draw(st.sampled_from([3.0, 4.5, 6.0])) for _ in range(n)]
    supports = ["pinned"] + ["roller"] * n
    set_name, cases = draw(st.sampled_from([("ASCE 7-22 LRFD", ["D", "L", "S"]), ("EN 1990 6.10", ["G", "Q", "W"])]))
    kinds = {"Q": "imposed C", "W": "wind", "S": "snow"} if set_name.startswith("EN") else {}
    loads = []
    total = {}  # each case's total downward load, kN
    for c in cases:
        w = draw(st.floats(-3, 12).map(lambda v: round(v, 2)))
        loads.append(f'beam.udl(w={w} kN/m, case="{c}")')
        total[c] = w * sum(spans)
        if draw(st.booleans()):
            x = round(draw(st.floats(0, sum(spans))), 2)
            P = round(draw(st.floats(1, 20)), 2)
            loads.append(f'beam.point(P={P} kN, x={x} m, case="{c}")')
            total[c] += P
    case_text = ", ".join(f"{c}: {kinds[c]}" if c in kinds else c for c in cases)
    text = (f'u = loads.combinations(set="{set_name}", cases="{case_text}")\n'
            f'b = beam.solve(spans=[{", ".join(f"{s} m" for s in spans)}], supports="{", ".join(supports)}", '
            f'E=200 GPa, I=1e8 mm^4, loads=[{", ".join(loads)}], combinations=[u])\n')
    # the combination names beam.solve will use: the set's own, plus pattern variants on two spans
    combos = generate(set_name, parse_cases(case_text, set_name))
    return text, [c.name for c in combos], n, {c.name: sum(f * total[k] for k, f in c.factors.items())
                                                for c in combos}


@settings(max_examples=3, deadline=None, database=None)
@given(case=members())
def test_every_combination_balances_and_the_envelope_is_their_extreme(case):
    text, names, n_spans, W = case
    if n_spans > 1:  # pattern variants are named after their combination: find them in the package's table
        r = calcsheet.run(HEAD + text)
        assert not [d for d in r.diagnostics if d.severity == "error"], text
        names = [row[0] for row in next(it for it in r.values["b"].working.items
                                        if isinstance(it, Table) and it.title == "Combinations").rows]
    per = "".join(f'r{i} = beam.result(member=b, combo="{n}")\n' for i, n in enumerate(names))
    r2 = calcsheet.run(HEAD + text + per)
    assert not [d for d in r2.diagnostics if d.severity == "error"], text
    rec = r2.values["b"]
    env = r2.values["b"].fields
    res = [r2.values[f"r{i}"].fields for i in range(len(names))]
    assert env["M_max"].m_as("kN*m") == pytest.approx(max(p["M_max"].m_as("kN*m") for p in res), rel=1e-12)
    assert env["M_min"].m_as("kN*m") == pytest.approx(min(p["M_min"].m_as("kN*m") for p in res), rel=1e-12)
    assert env["R_A"].m_as("kN") == pytest.approx(max(p["R_A"].m_as("kN") for p in res), rel=1e-12, abs=1e-9)
    assert env["R_min_A"].m_as("kN") == pytest.approx(min(p["R_A"].m_as("kN") for p in res), rel=1e-12, abs=1e-9)
    if n_spans == 1:  # equilibrium of each combination: ΣR = Σ factor × case total (statics)
        for i, name in enumerate(names):
            assert res[i]["R_A"].m_as("kN") + res[i]["R_B"].m_as("kN") == pytest.approx(W[name], rel=1e-9, abs=1e-9)
    else:  # the traced checks (one pair per combination, or the worst of the tabulated ones)
        checks = [c for c in rec.working.items if isinstance(c, CheckResult) and (c.description or "").startswith("Σ")]
        assert checks and all(c.ok for c in checks)
