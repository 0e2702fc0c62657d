"""Axial force in a beam (beam.axial), by statics: the one support that holds the member along its axis takes
the sum of the axial forces; N at a section is the sum of the forces on one side of it (compression positive).
Common practice: a free-body of the part of the member between the section and its free end.
"""
import pytest

import calcsheet


def solve(supports, loads, extra=""):
    return calcsheet.run(f'b = beam.solve(spans=[6 m], supports="{supports}", E=200 GPa, I=1e8 mm^4, '
                         f'loads=[beam.point(P=1 kN, x=3 m), {loads}])\n{extra}')


def fields(r, name="b"):
    assert r.ok, r.diagnostics
    return {k: v for k, v in r.values[name].fields.items()}


def test_a_push_into_the_free_end_compresses_the_whole_member():
    # held at A (pinned), 20 kN pushing into B toward −x: every section carries 20 kN compression
    b = fields(solve("pinned, roller", "beam.axial(F=-20 kN, x=6 m)"))
    assert b["N_max"].m_as("kN") == pytest.approx(20.0) and b["x_N_max"].m_as("m") == pytest.approx(0.0)


def test_a_pull_puts_the_part_between_the_holding_support_and_the_force_in_tension():
    # held at A, 15 kN pulling at x = 4 m toward +x: 0–4 m in tension (−15 kN), 4–6 m carries nothing, so the
    # largest compression is 0, first reached at x = 4 m
    r = solve("pinned, roller", "beam.axial(F=15 kN, x=4 m)",
              "p = beam.at(member=b, x=2 m)\nq = beam.at(member=b, x=5 m)\ns = beam.at(member=b, x=4 m)\n")
    b = fields(r)
    assert fields(r, "s")["N"].m_as("kN") == pytest.approx(-15.0)  # at the force: the larger either side
    assert b["N_max"].m_as("kN") == pytest.approx(0.0) and b["x_N_max"].m_as("m") == pytest.approx(4.0)
    assert fields(r, "p")["N"].m_as("kN") == pytest.approx(-15.0)
    assert fields(r, "q")["N"].m_as("kN") == pytest.approx(0.0)


def test_the_support_at_the_right_end_holds_it_just_as_well():
    # held at B (x = 6 m), 10 kN toward +x at x = 2 m pushes the part 2–6 m into B: compression 10 kN there
    r = solve("roller, pinned", "beam.axial(F=10 kN, x=2 m)",
              "p = beam.at(member=b, x=1 m)\nq = beam.at(member=b, x=4 m)\ns = beam.at(member=b, x=2 m)\n")
    b = fields(r)
    assert b["N_max"].m_as("kN") == pytest.approx(10.0) and b["x_N_max"].m_as("m") == pytest.approx(2.0)
    assert fields(r, "p")["N"].m_as("kN") == pytest.approx(0.0)
    assert fields(r, "q")["N"].m_as("kN") == pytest.approx(10.0)
    assert fields(r, "s")["N"].m_as("kN") == pytest.approx(10.0)  # at the force: the larger either side


def test_two_forces_add_by_segment():
    # held at A: +30 kN at 2 m (toward +x) and −50 kN at 5 m. The part right of a section is in equilibrium with
    # the forces on it, so N = −ΣF to the right (compression positive): 0–2 m −(30 − 50) = 20 kN, 2–5 m
    # −(−50) = 50 kN, 5–6 m nothing
    r = solve("pinned, roller", "beam.axial(F=30 kN, x=2 m), beam.axial(F=-50 kN, x=5 m)",
              "p = beam.at(member=b, x=1 m)\nq = beam.at(member=b, x=3 m)\nz = beam.at(member=b, x=5.5 m)\n")
    b = fields(r)
    assert fields(r, "p")["N"].m_as("kN") == pytest.approx(20.0)
    assert fields(r, "q")["N"].m_as("kN") == pytest.approx(50.0)
    assert fields(r, "z")["N"].m_as("kN") == pytest.approx(0.0)
    assert b["N_max"].m_as("kN") == pytest.approx(50.0) and b["x_N_max"].m_as("m") == pytest.approx(2.0)


def test_no_support_that_holds_the_member_along_its_axis_is_refused():
    r = solve("roller, roller", "beam.axial(F=5 kN, x=2 m)")
    (err,) = r.errors
    assert "no support holds it along its axis; make one support pinned or fixed" in err.message


@pytest.mark.parametrize("supports, names", [("pinned, pinned", "A, B"), ("fixed, pinned", "A, B")])
def test_two_supports_holding_it_along_its_axis_make_it_indeterminate_and_are_refused(supports, names):
    r = solve(supports, "beam.axial(F=5 kN, x=2 m)")
    (err,) = r.errors
    assert f"supports {names} all hold the member along its axis" in err.message


def test_without_axial_loads_two_pinned_supports_are_fine_and_the_axial_force_is_zero():
    b = fields(solve("pinned, pinned", "beam.point(P=1 kN, x=1 m)"))
    assert b["N_max"].m_as("kN") == 0.0


@pytest.mark.parametrize("supports, held", [("pinned, roller", "A"), ("roller, pinned", "B"), ("fixed, free", "A"),
                                            ("free, fixed", "B")])
def test_the_working_names_the_support_that_holds_the_member(supports, held):
    r = calcsheet.run(f'b = beam.solve(spans=[6 m], supports="{supports}", loads=[beam.point(P=1 kN, x=3 m), '
                      'beam.axial(F=-5 kN, x=3 m)])\n')
    assert r.ok, r.diagnostics
    (step,) = [s for s in r.values["b"].working.items if getattr(s, "name", None) == "N_max"]
    assert f"support {held} holds the member" in step.note


def test_a_force_close_to_the_left_end_starts_the_compressed_stretch_where_it_acts():
    # held at B (x = 6 m), 10 kN toward +x at x = 0.5 m pushes 0.5–6 m into B: compression 10 kN there, nothing
    # on 0–0.5 m; the largest compression is first reached at the force (statics of the part left of a section)
    b = fields(solve("roller, pinned", "beam.axial(F=10 kN, x=0.5 m)"))
    assert b["N_max"].m_as("kN") == pytest.approx(10.0) and b["x_N_max"].m_as("m") == pytest.approx(0.5)


def test_a_pull_close_to_the_left_end_leaves_the_stretch_before_it_unloaded():
    # held at B, 10 kN toward −x at x = 0.5 m pulls 0.5–6 m in tension (−10 kN); 0–0.5 m carries nothing, so the
    # largest compression is 0, at the left end
    b = fields(solve("roller, pinned", "beam.axial(F=-10 kN, x=0.5 m)"))
    assert b["N_max"].m_as("kN") == pytest.approx(0.0) and b["x_N_max"].m_as("m") == pytest.approx(0.0)
