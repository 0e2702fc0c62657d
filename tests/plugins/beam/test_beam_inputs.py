"""What beam.solve and the load functions refuse, as a specification: each refusal is one located error at the
parameter at fault, saying what is wrong in the sheet's own terms (load 2, span 3, support B).
"""
import textwrap

import pytest

import calcsheet

CALL = "beam.solve("  # a parameter the sheet did not give: the error is at the call
BEAM = 'spans=[4 m, 5 m], supports="pinned, roller, roller", E=200 GPa, I=1e8 mm^4'


def run(body):
    return calcsheet.run("---\nproject: Beam inputs\n---\n" + textwrap.dedent(body).lstrip("\n") + "\n")


def refusal(body):
    r = run(body)
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert len(errs) == 1, [d.message for d in r.diagnostics]
    line = body.strip().splitlines()[errs[0].span.line - 5]  # four lines of front matter
    return errs[0].message, line[errs[0].span.col - 1:]


REFUSED = [
    # the load functions themselves
    ("p = beam.point(P=5 kN, x=-1 m)", "x=", "beam.point: x is negative; give positions measured from the left"),
    ("p = beam.moment(M=5 kN*m, x=-1 m)", "x=", "beam.moment: x is negative"),
    ("p = beam.axial(F=5 kN, x=-0.5 m)", "x=", "beam.axial: x is negative"),
    ("p = beam.udl(w=5 kN/m, start=-1 m)", "start=", "beam.udl: start is negative"),
    ("p = beam.udl(w=5 kN/m, end=-1 m)", "end=", "beam.udl: end is negative"),
    ("p = beam.udl(w=5 kN/m, start=2 m, end=2 m)", "end=", "beam.udl: end must lie beyond start"),
    ("p = beam.varying(w_1=0 kN/m, w_2=5 kN/m, start=3 m, end=2 m)", "end=", "beam.varying: end must lie beyond start"),
    ("p = beam.point(P=5 kN, x=1 m, span=0)", "span=", "beam.point: span must be a whole number 1, 2, …, got 0"),
    ("p = beam.point(P=5 kN, x=1 m, span=1.5)", "span=", "got 1.5"),
    ("p = beam.point(P=5 kN, x=1 m, case=\"1D\")", "case=", "case name '1D' must be a letter followed by"),
    ("p = beam.point(P=5 kN, x=1 m, case=\"L-1\")", "case=", "case name 'L-1' must be"),
    # positions against the beam and its spans
    (f"b = beam.solve({BEAM}, loads=[beam.point(P=5 kN, x=2 m), beam.point(P=5 kN, x=9.5 m)])", "loads=",
     "load 2 (point): x = 9.5 m lies outside the beam (9 m long)"),
    (f"b = beam.solve({BEAM}, loads=[beam.point(P=5 kN, x=4.5 m, span=1)])", "loads=",
     "load 1 (point): x = 4.5 m lies outside span 1 (4 m long)"),
    (f"b = beam.solve({BEAM}, loads=[beam.udl(w=5 kN/m, end=6 m, span=2)])", "loads=",
     "load 1 (udl): end = 6 m lies outside span 2 (5 m long)"),
    (f"b = beam.solve({BEAM}, loads=[beam.udl(w=5 kN/m, start=10 m)])", "loads=",
     "load 1 (udl): start = 10 m lies outside the beam"),
    (f"b = beam.solve({BEAM}, loads=[beam.udl(w=5 kN/m, start=9 m)])", "loads=",
     "load 1 (udl): it ends at or before its start"),
    (f"b = beam.solve({BEAM}, loads=[beam.point(P=5 kN, x=1 m, span=3)])", "loads=",
     "load 1 (point) is on span 3, but the beam has 2 span(s)"),
    (f"b = beam.solve({BEAM}, loads=[])", "loads=", "give at least one load"),
    # stiffness
    ('b = beam.solve(spans=[4 m, 5 m], supports="pinned, roller, roller", E=200 GPa, I=1e8 mm^4, '
     'I_spans=[1e8 mm^4, 1e8 mm^4], loads=[beam.point(P=5 kN, x=2 m)])', "I_spans=",
     "give either I (one value) or I_spans (one per span), not both"),
    ('b = beam.solve(spans=[4 m, 5 m], supports="pinned, roller, roller", E=200 GPa, I_spans=[1e8 mm^4], '
     'loads=[beam.point(P=5 kN, x=2 m)])', "I_spans=", "I_spans has 1 values for 2 span(s)"),
    ('b = beam.solve(spans=[4 m, 5 m], supports="pinned, roller, roller", E=200 GPa, '
     'I_spans=[1e8 mm^4, 0 mm^4], loads=[beam.point(P=5 kN, x=2 m)])', "I_spans=",
     "I of span 2 must be greater than zero"),
    ('b = beam.solve(spans=[4 m, 5 m], supports="pinned, roller, roller", E=-200 GPa, I=1e8 mm^4, '
     'loads=[beam.point(P=5 kN, x=2 m)])', "E=", "E must be greater than zero, got -2e+11 Pa"),
    ('b = beam.solve(spans=[4 m, 5 m], supports="pinned, roller, roller", I=1e8 mm^4, '
     'loads=[beam.point(P=5 kN, x=2 m)])', CALL,
     "the beam is statically indeterminate (degree 1): its reactions depend on its stiffness; give E (or material=…)"),
    ('b = beam.solve(spans=[6 m], supports="fixed, fixed", loads=[beam.point(P=5 kN, x=2 m)])', CALL,
     "statically indeterminate (degree 2)"),
    ('b = beam.solve(spans=[3 m, 3 m, 3 m], supports="pinned, roller, roller, roller", E=200 GPa, '
     'loads=[beam.point(P=5 kN, x=2 m)])', CALL,
     "statically indeterminate (degree 2): its reactions depend on its stiffness; give I (or section=…)"),
    # springs and settlements
    ('b = beam.solve(spans=[4 m, 5 m], supports="pinned, spring, roller", E=200 GPa, I=1e8 mm^4, '
     'loads=[beam.point(P=5 kN, x=2 m)])', CALL,
     'support B is a spring: give its stiffness with springs=[beam.spring(at="B", k=…)]'),
    ('b = beam.solve(spans=[4 m, 5 m], supports="pinned, spring, roller", E=200 GPa, I=1e8 mm^4, '
     'springs=[beam.spring(at="D", k=1 kN/mm)], loads=[beam.point(P=5 kN, x=2 m)])', "springs=",
     "there is no support 'D'; the supports are A, B, C"),
    ('b = beam.solve(spans=[4 m, 5 m], supports="pinned, spring, roller", E=200 GPa, I=1e8 mm^4, '
     'springs=[beam.spring(at="B", k=1 kN/mm), beam.spring(at="2", k_theta=1 kN*m)], '
     'loads=[beam.point(P=5 kN, x=2 m)])', "springs=", "two springs at support 2; give k and k_theta in one"),
    ('b = beam.solve(spans=[4 m, 5 m], supports="pinned, roller, roller", E=200 GPa, I=1e8 mm^4, '
     'settlement=[beam.settlement(at="B", delta=5 mm), beam.settlement(at="B", delta=1 mm)], '
     'loads=[beam.point(P=5 kN, x=2 m)])', "settlement=", "support B settles twice"),
    ('b = beam.solve(spans=[4 m], supports="pinned, roller", settlement=[beam.settlement(at="B", delta=5 mm)], '
     'loads=[beam.point(P=5 kN, x=2 m)])', CALL,
     "springs and settlements make the forces depend on the stiffness: give E (or material=…) and I (or section=…)"),
    # combinations
    ('b = beam.solve(spans=[4 m], supports="pinned, roller", E=200 GPa, I=1e8 mm^4, '
     'loads=[beam.point(P=5 kN, x=2 m, case="D"), beam.point(P=5 kN, x=1 m)], '
     'combos=[beam.combo(name="U", factors="1.4 D")])', "loads=",
     "load 2 has no case; give it case=\"…\" so the combinations can factor it"),
    ('b = beam.solve(spans=[4 m], supports="pinned, roller", E=200 GPa, I=1e8 mm^4, '
     'loads=[beam.point(P=5 kN, x=2 m, case="D")], '
     'combos=[beam.combo(name="U", factors="1.4 D"), beam.combo(name="U", factors="D")])', "combos=",
     "two combinations are named 'U'"),
]


@pytest.mark.parametrize("body, at, words", REFUSED, ids=[w[:40] for _, _, w in REFUSED])
def test_a_refusal_names_what_is_wrong_at_the_parameter_at_fault(body, at, words):
    message, there = refusal(body)
    assert words in message
    assert there.startswith(at), (there[:30], at)


def test_a_support_is_named_by_its_letter_or_its_number():
    for at in ('"B"', '"2"'):
        r = run('b = beam.solve(spans=[4 m, 5 m], supports="pinned, roller, roller", E=200 GPa, I=1e8 mm^4, '
                f'settlement=[beam.settlement(at={at}, delta=5 mm)], loads=[beam.point(P=0 kN, x=2 m)])\n'
                "R = b.R_B\n")
        assert r.ok, r.diagnostics
    # with no load, the support B settled by δ holds the beam down with the force that deflects the simple span
    # A–C (a = 4 m, b = 5 m, l = 9 m) by δ at B: y = P a² b² / (3 EI l) (Roark, Table 8.1 case 1e — from memory)
    EI, d, a, b = 200e9 * 1e-4, 5e-3, 4.0, 5.0
    assert r.values["R"].m_as("N") == pytest.approx(-3 * EI * (a + b) * d / (a**2 * b**2), rel=1e-9)


def test_a_determinate_beam_needs_no_stiffness():
    # statics alone gives a simply supported beam's reactions (common practice)
    r = run('b = beam.solve(spans=[6 m], supports="pinned, roller", loads=[beam.point(P=12 kN, x=2 m)])\n'
            "A = b.R_A\nB = b.R_B\n")
    assert r.ok, r.diagnostics
    assert r.values["A"].m_as("kN") == pytest.approx(8.0) and r.values["B"].m_as("kN") == pytest.approx(4.0)
    # a Gerber beam (fixed, internal hinge, roller) is determinate too: degree 3 + 1 − 2 − 1 = 0
    r = run('b = beam.solve(spans=[4 m, 4 m], supports="fixed, hinge, roller", loads=[beam.point(P=10 kN, x=6 m)])\n'
            "C = b.R_C\n")
    assert r.ok, r.diagnostics
    assert r.values["C"].m_as("kN") == pytest.approx(5.0)  # the suspended span B–C carries P at its middle


@pytest.mark.parametrize("at, ok", [('"1"', True), ('"3"', True), ('"A"', True), ('"C"', True), ('"0"', False),
                                    ('"4"', False), ('"D"', False), ('"b"', False)])
def test_a_settlement_names_any_support_from_the_first_to_the_last(at, ok):
    r = run('b = beam.solve(spans=[4 m, 5 m], supports="pinned, roller, roller", E=200 GPa, I=1e8 mm^4, '
            f'settlement=[beam.settlement(at={at}, delta=1 mm)], loads=[beam.point(P=1 kN, x=2 m)])\n')
    assert r.ok is ok, r.diagnostics
    if not ok:
        assert "the supports are A, B, C" in r.errors[0].message


@pytest.mark.parametrize("call, start, end, extent", [
    ("beam.udl(w=5 kN/m)", 0, 0, "full"),
    ("beam.udl(w=5 kN/m, start=1 m)", 1, 0, "from"),
    ("beam.udl(w=5 kN/m, end=2 m)", 0, 2, "to"),
    ("beam.varying(w_1=1 kN/m, w_2=2 kN/m, start=1 m, end=2 m)", 1, 2, "partial"),
])
def test_a_line_load_record_says_its_extent_and_reads_an_absent_end_as_zero(call, start, end, extent):
    r = run(f"p = {call}\n")
    assert r.ok, r.diagnostics
    f = r.values["p"].fields
    assert (f["start"].m_as("m"), f["end"].m_as("m"), f["extent"]) == (start, end, extent)


def test_a_beam_that_does_not_deflect_says_so_and_allows_span_over_360():
    # only a force along the axis: nothing bends, δ = 0 everywhere (statics); the default limit is L/360
    r = run('b = beam.solve(spans=[6 m], supports="pinned, roller", E=200 GPa, I=1e8 mm^4, '
            'loads=[beam.axial(F=-5 kN, x=6 m)])\n')
    assert r.ok, r.diagnostics
    b = r.values["b"]
    assert b.fields["delta_gov"].m_as("mm") == 0.0
    assert b.fields["delta_allow"].m_as("mm") == pytest.approx(6000 / 360)
    assert b.fields["L_gov"].m_as("m") == 6.0
    assert any("does not deflect" in getattr(i, "text", "") for i in b.working.items)
