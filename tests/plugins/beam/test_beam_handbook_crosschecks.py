"""Every handbook case in handbook.toml, as printed in the working, agrees with the stiffness solution.

Why: the printed cross-check is a second opinion a reviewer reads; a wrong coefficient in one of its
formulas must fail here, not pass silently as an "NG" line in a package nobody regenerates. The formulas
themselves are AISC Steel Construction Manual, 15th ed., Table 3-23 (case numbers from memory) — each
example beam below is a textbook instance of its case, and the expected number is also written out by hand.
"""
import textwrap

import pytest

import calcsheet
from calcsheet.trace import CheckResult, Step
from calcsheet_plugins.beam import handbook

HEAD = "---\nproject: handbook cases\n---\n"
EI = "E=200 GPa, I=1e8 mm^4"  # EI = 2.0e4 kN·m²

# case id -> (beam call, {step name: (expected, unit, source)})
EXAMPLES = {
    "simple-udl": ('spans=[6 m], supports="pinned, roller", loads=[beam.udl(w=10 kN/m)]',
                   {"M_hb": (45.0, "kN*m", "w·L²/8 = 10·36/8, AISC T3-23 case 1")}),
    "simple-central-point": ('spans=[5 m], supports="pinned, roller", loads=[beam.point(P=40 kN, x=2.5 m)]',
                             {"M_hb": (50.0, "kN*m", "P·L/4, AISC T3-23 case 7")}),
    "simple-point": ('spans=[8 m], supports="pinned, roller", loads=[beam.point(P=25 kN, x=5 m)]',
                     {"R_hb": (25 * 3 / 8, "kN", "P·b/L, AISC T3-23 case 8"),
                      "delta_hb": (25e3 * 25 * 9 / (3 * 2e7 * 8) * 1e3, "mm", "P·a²·b²/(3·EI·L), case 8")}),
    "cantilever-end-point": ('spans=[3 m], supports="fixed, free", loads=[beam.point(P=10 kN, x=3 m)]',
                             {"delta_hb": (10e3 * 27 / (3 * 2e7) * 1e3, "mm", "P·L³/(3·EI), AISC T3-23 case 22")}),
    "cantilever-udl": ('spans=[3 m], supports="free, fixed", loads=[beam.udl(w=4 kN/m)]',
                       {"M_hb": (18.0, "kN*m", "w·L²/2, AISC T3-23 case 18")}),
    "fixed-fixed-udl": ('spans=[6 m], supports="fixed, fixed", loads=[beam.udl(w=12 kN/m)]',
                        {"M_hb": (36.0, "kN*m", "w·L²/12, AISC T3-23 case 15"),
                         "M_hb2": (18.0, "kN*m", "w·L²/24, case 15")}),
    "propped-udl": ('spans=[8 m], supports="fixed, roller", loads=[beam.udl(w=10 kN/m)]',
                    {"R_hb": (50.0, "kN", "5wL/8, AISC T3-23 case 12"),
                     "M_hb2": (9 * 640 / 128, "kN*m", "9wL²/128, case 12")}),
    "two-equal-spans-udl": ('spans=[5 m, 5 m], supports="pinned, roller, roller", loads=[beam.udl(w=8 kN/m)]',
                            {"R_hb2": (50.0, "kN", "1.25·w·L, AISC T3-23 case 29")}),
    "overhang-end-point": ('spans=[6 m, 2 m], supports="pinned, roller, free", loads=[beam.point(P=10 kN, x=8 m)]',
                           {"R_hb": (10 * 8 / 6, "kN", "P(L+a)/L, AISC T3-23 case 26")}),
}


def test_every_case_in_the_data_has_an_example():
    assert {c["id"] for c in handbook.CASES} == set(EXAMPLES)


@pytest.mark.parametrize("case_id", sorted(EXAMPLES))
def test_printed_cross_checks_agree_with_the_solver(case_id):
    call, expected = EXAMPLES[case_id]
    r = calcsheet.run(HEAD + f"b = beam.solve({call}, {EI})\n")
    assert not [d for d in r.diagnostics if d.severity == "error"]
    rec = r.values["b"]
    case = next(c for c in handbook.CASES if c["id"] == case_id)
    notes = [it.text for it in rec.working.items if getattr(it, "kind", "") == "method"]
    assert any(case["title"] in n for n in notes), notes  # this case, not another, was recognised
    checks = [it for it in rec.working.items if isinstance(it, CheckResult) and "agrees with" in (it.description or "")]
    assert len(checks) == len(case["checks"])
    assert all(c.ok for c in checks), [(c.description, c.ratio) for c in checks]
    steps = {it.name: it.value for it in rec.working.items if isinstance(it, Step)}
    for name, (value, unit, _source) in expected.items():
        assert steps[name].m_as(unit) == pytest.approx(value, rel=1e-9)


@pytest.mark.parametrize("case_id", sorted(EXAMPLES))
def test_a_wrong_coefficient_in_a_case_formula_is_caught(case_id, monkeypatch):
    """Plant the bug this test file exists for: every printed check of the case must then disagree."""
    case = next(c for c in handbook.CASES if c["id"] == case_id)
    broken = dict(case, checks=[dict(ch, formula=f"1.1*({ch['formula']})") for ch in case["checks"]])
    monkeypatch.setattr(handbook, "CASES", [broken if c is case else c for c in handbook.CASES])
    call, _ = EXAMPLES[case_id]
    rec = calcsheet.run(HEAD + f"b = beam.solve({call}, {EI})\n").values["b"]
    checks = [it for it in rec.working.items if isinstance(it, CheckResult) and "agrees with" in (it.description or "")]
    assert checks and not any(c.ok for c in checks)


def test_the_printed_formula_is_the_evaluated_one():
    assert handbook.symbolic("5*w*L^4/(384*EI)") == "5·w·L⁴/(384·EI)"
    assert handbook.substitute("w*L^2/8", {"w": "10 kN/m", "L": "6 m"}) == "(10 kN/m)*(6 m)^2/8"
