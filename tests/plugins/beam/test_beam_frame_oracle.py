"""Springs, settlement and hinges on multi-span members against an independent frame-analysis library
(PyNiteFEA, MIT licence, test-only) and against closed-form compatibility results.

PyNite models the same member as 3D frame elements; we compare reactions, moments and deflections.
"""
import textwrap

import pytest

import calcsheet

Pynite = pytest.importorskip("Pynite")

HEAD = "---\nproject: frame oracle\n---\n"
E, I = 200e9, 1e-4  # Pa, m^4
EI = E * I


def run(body):
    r = calcsheet.run(HEAD + textwrap.dedent(body))
    errs = [d.message for d in r.diagnostics if d.severity == "error"]
    assert not errs, errs
    return r


def frame(spans, supports, udl=0.0, points=(), springs=None, settle=None, hinges=()):
    """The member in PyNite: nodes at the supports (and at point loads), y up; loads in N, N/m."""
    m = Pynite.FEModel3D()
    m.add_material("steel", E, 77e9, 0.3, 0.0)
    m.add_section("sec", 1.0, 1e-4, I, 1e-4)  # large A: no axial shortening
    xs = [0.0]
    for s in spans:
        xs.append(xs[-1] + s)
    for i, x in enumerate(xs):
        m.add_node(f"N{i}", x, 0, 0)
    for i, kind in enumerate(supports):
        m.def_support(f"N{i}", support_DX=(i == 0), support_DY=kind in ("pinned", "roller", "fixed"),
                      support_DZ=True, support_RX=True, support_RY=True, support_RZ=kind == "fixed")
    for i, (k, kt) in (springs or {}).items():
        if k:
            m.def_support_spring(f"N{i}", "DY", k)
        if kt:
            m.def_support_spring(f"N{i}", "RZ", kt)
    for i, d in (settle or {}).items():
        m.def_node_disp(f"N{i}", "DY", -d)
    for e in range(len(spans)):
        m.add_member(f"M{e}", f"N{e}", f"N{e + 1}", "steel", "sec")
        if udl:
            m.add_member_dist_load(f"M{e}", "Fy", -udl, -udl)
    for e, a, P in points:
        m.add_member_pt_load(f"M{e}", "Fy", -P, a)
    for e in hinges:  # a moment release at the right end of member e
        m.def_releases(f"M{e}", Rzj=True)
    m.analyze_linear()
    return m


def reaction(m, i):
    return m.nodes[f"N{i}"].RxnFY["Combo 1"]


def test_spring_support_on_two_spans():
    r = run("""
        b = beam.solve(spans=[5 m, 4 m], supports="pinned, spring, roller", E=200 GPa, I=1e8 mm^4,
            loads=[beam.udl(w=10 kN/m), beam.point(P=15 kN, x=2 m, span=2)],
            springs=[beam.spring(at="B", k=20000 kN/m)])
        m = beam.at(member=b, x=5 m)
    """)
    m = frame([5, 4], ["pinned", "spring", "roller"], udl=10e3, points=[(1, 2.0, 15e3)], springs={1: (2e7, 0)})
    b = r.values["b"].fields
    for i, c in enumerate("ABC"):
        assert b[f"R_{c}"].m_as("N") == pytest.approx(reaction(m, i), rel=1e-6)
    assert r.values["m"].fields["delta"].m_as("m") == pytest.approx(-m.nodes["N1"].DY["Combo 1"], rel=1e-6)
    assert b["R_B"].m_as("N") == pytest.approx(2e7 * r.values["m"].fields["delta"].m_as("m"), rel=1e-9)  # F = kδ


def test_settlement_of_the_middle_support_closed_form():
    # two equal spans: pushing the middle support down by Δ takes a force P with Δ = P(2L)³/(48EI)
    # (AISC T3-23 case 7 on the span 2L), so R_B falls by 6EIΔ/L³ from 1.25wL (case 29)
    L, w, d = 5.0, 10e3, 0.005
    r = run("""
        b = beam.solve(spans=[5 m, 5 m], supports="pinned, pinned, roller", E=200 GPa, I=1e8 mm^4,
            loads=[beam.udl(w=10 kN/m)], settlement=[beam.settlement(at="B", delta=5 mm)])
        p = beam.at(member=b, x=5 m)
    """)
    b = r.values["b"].fields
    assert b["R_B"].m_as("N") == pytest.approx(1.25 * w * L - 6 * EI * d / L**3, rel=1e-9)
    assert r.values["p"].fields["delta"].m_as("mm") == pytest.approx(5.0, rel=1e-9)
    m = frame([5, 5], ["pinned", "pinned", "roller"], udl=w, settle={1: d})
    assert b["R_A"].m_as("N") == pytest.approx(reaction(m, 0), rel=1e-6)
    # PyNite's member moment sign differs from ours (sagging positive): compare magnitudes
    assert abs(b["M_B"].m_as("N*m")) == pytest.approx(abs(m.members["M0"].moment("Mz", 5.0, "Combo 1")), rel=1e-6)


def test_rotational_spring_at_a_propped_end():
    # k_θ → 0 gives the simple span, k_θ → ∞ the propped cantilever (AISC T3-23 cases 1 and 12); in between,
    # PyNite's rotational spring support
    r = run("""
        b = beam.solve(spans=[6 m, 3 m], supports="pinned, roller, roller", E=200 GPa, I=1e8 mm^4,
            loads=[beam.udl(w=8 kN/m)], springs=[beam.spring(at="A", k_theta=5000 kN*m)])
    """)
    m = frame([6, 3], ["pinned", "roller", "roller"], udl=8e3, springs={0: (0, 5e6)})
    b = r.values["b"].fields
    for i, c in enumerate("ABC"):
        assert b[f"R_{c}"].m_as("N") == pytest.approx(reaction(m, i), rel=1e-6)
    assert abs(b["M_A"].m_as("N*m")) == pytest.approx(abs(m.members["M0"].moment("Mz", 0.0, "Combo 1")), rel=1e-6)


def test_internal_hinge_on_three_spans():
    r = run("""
        b = beam.solve(spans=[6 m, 2 m, 6 m], supports="fixed, roller, hinge, pinned", E=200 GPa, I=1e8 mm^4,
            loads=[beam.udl(w=5 kN/m), beam.point(P=20 kN, x=3 m, span=3)])
        p = beam.at(member=b, x=11 m)
    """)
    m = frame([6, 2, 6], ["fixed", "roller", "free", "pinned"], udl=5e3, points=[(2, 3.0, 20e3)], hinges=[1])
    b = r.values["b"].fields
    for i, c in ((0, "A"), (1, "B"), (3, "D")):
        assert b[f"R_{c}"].m_as("N") == pytest.approx(reaction(m, i), rel=1e-6)
    assert r.values["p"].fields["delta"].m_as("m") == pytest.approx(
        -m.members["M2"].deflection("dy", 3.0, "Combo 1"), rel=1e-6)


def test_axial_load_on_a_two_span_beam_column():
    # statics along the axis (common practice): the pinned support A holds the member; between the loads the
    # axial force is the sum of those beyond the section; PyNite's member axial force as the oracle
    r = run("""
        b = beam.solve(spans=[4 m, 3 m], supports="pinned, roller, roller", E=200 GPa, I=1e8 mm^4,
            loads=[beam.udl(w=6 kN/m, case="D"), beam.axial(F=-120 kN, x=7 m, case="D"),
                   beam.axial(F=30 kN, x=2 m, case="D")])
        p = beam.at(member=b, x=1 m)
        q = beam.at(member=b, x=5 m)
    """)
    assert r.values["p"].fields["N"].m_as("kN") == pytest.approx(120 - 30, rel=1e-12)
    assert r.values["q"].fields["N"].m_as("kN") == pytest.approx(120, rel=1e-12)
    b = r.values["b"].fields
    assert b["N_max"].m_as("kN") == pytest.approx(120, rel=1e-12) and b["x_N_max"].m_as("m") == pytest.approx(2.0)
    m = Pynite.FEModel3D()
    m.add_material("steel", E, 77e9, 0.3, 0.0)
    m.add_section("sec", 1.0, 1e-4, I, 1e-4)
    for i, x in enumerate((0.0, 2.0, 4.0, 7.0)):
        m.add_node(f"N{i}", x, 0, 0)
    m.def_support("N0", True, True, True, True, True, False)
    m.def_support("N2", False, True, True, True, False, False)
    m.def_support("N3", False, True, True, True, False, False)
    m.def_support("N1", False, False, True, False, False, False)
    for e in range(3):
        m.add_member(f"M{e}", f"N{e}", f"N{e + 1}", "steel", "sec")
        m.add_member_dist_load(f"M{e}", "Fy", -6e3, -6e3)
    m.add_node_load("N3", "FX", -120e3)
    m.add_node_load("N1", "FX", 30e3)
    m.analyze_linear()
    # PyNite's member axial force comes out positive here, where statics above says compression: the same sign
    # convention as ours for this member
    assert r.values["p"].fields["N"].m_as("N") == pytest.approx(m.members["M0"].axial(1.0, "Combo 1"), rel=1e-6)
    assert r.values["q"].fields["N"].m_as("N") == pytest.approx(m.members["M2"].axial(1.0, "Combo 1"), rel=1e-6)
    # the bending is untouched by the axial loads (first-order analysis)
    assert b["R_B"].m_as("N") == pytest.approx(m.nodes["N2"].RxnFY["Combo 1"], rel=1e-6)


def test_two_supports_holding_the_axis_is_a_clear_error():
    r = calcsheet.run(HEAD + 'b = beam.solve(spans=[4 m], supports="pinned, fixed", E=200 GPa, I=1e8 mm^4, '
                             'loads=[beam.axial(F=10 kN, x=2 m)])\n')
    msgs = [d.message for d in r.diagnostics if d.severity == "error"]
    assert msgs and "statically indeterminate" in msgs[0] and "A, B" in msgs[0]
