"""The solver's model, as a specification of what it refuses: every refusal names the parameter at fault and
the span or support by its number (1, 2, … from the left), so the sheet's error points at the right place.

The solver is reached from sheets through beam.solve, which refuses some of these earlier (beam.spring wants
k > 0); the model refuses them again itself, because query, combinations and tests build models directly.
"""
import math

import pytest

from calcsheet_plugins.beam.solver import BeamInputError, Model

EI = 2.0e7  # N·m², an invented stiffness


def refused(**kw):
    args = dict(spans=[4.0, 5.0], supports=["pinned", "roller", "roller"], EI=[EI, EI])
    args.update(kw)
    with pytest.raises(BeamInputError) as exc:
        Model(**args)
    return exc.value


def test_a_sound_model_is_accepted_and_knows_its_nodes():
    m = Model([4.0, 5.0], ["pinned", "spring", "roller"], [EI, EI], springs={1: (1.0e6, 0.0)},
              settlement={0: 0.01})
    assert list(m.nodes) == [0.0, 4.0, 9.0] and m.length == 9.0


def test_no_span_is_refused():
    e = refused(spans=[], supports=["pinned"], EI=[])
    assert (str(e), e.param) == ("give at least one span", "spans")


@pytest.mark.parametrize("spans, n, shown", [([0.0, 5.0], 1, "0"), ([4.0, -2.0], 2, "-2"), ([4.0, math.inf], 2, "inf"),
                                             ([4.0, math.nan], 2, "nan")])
def test_a_span_that_is_not_longer_than_zero_is_named_by_its_number(spans, n, shown):
    e = refused(spans=spans)
    assert (str(e), e.param) == (f"span {n} has length {shown} m; every span must be longer than zero", "spans")


def test_one_support_per_span_end():
    e = refused(supports=["pinned", "roller"])
    assert (str(e), e.param) == ("2 span(s) need 3 supports (one at each end of every span), got 2", "supports")


def test_an_unknown_support_is_named_by_its_number():
    e = refused(supports=["pinned", "roler", "roller"])
    assert e.param == "supports" and str(e).startswith("support 2 is 'roler'; use one of pinned, roller, fixed")


@pytest.mark.parametrize("supports", [["hinge", "roller", "roller"], ["pinned", "roller", "hinge"]])
def test_a_hinge_at_either_end_of_the_beam_is_refused(supports):
    e = refused(supports=supports)
    assert e.param == "supports" and "a hinge at an end of the beam releases nothing" in str(e)


def test_an_internal_hinge_is_accepted():
    Model([4.0, 5.0], ["fixed", "hinge", "roller"], [EI, EI])


@pytest.mark.parametrize("at", [-1, 3])
def test_a_spring_off_the_beam_is_refused(at):
    e = refused(springs={at: (1.0e6, 0.0)}, supports=["pinned", "spring", "roller"])
    assert (str(e), e.param) == (f"a spring is at support {at + 1}, but the beam has 3", "springs")


@pytest.mark.parametrize("k, kt", [(-1.0, 0.0), (0.0, -1.0), (0.0, 0.0), (math.inf, 0.0), (0.0, math.nan),
                                   (-1.0e6, 1.0e6), (1.0e6, -1.0e6)])
def test_a_spring_needs_a_stiffness_greater_than_zero_and_neither_negative(k, kt):
    e = refused(springs={1: (k, kt)}, supports=["pinned", "spring", "roller"])
    assert (str(e), e.param) == ("the spring at support 2 needs a stiffness greater than zero", "springs")


@pytest.mark.parametrize("k, kt", [(1.0e6, 0.0), (0.0, 1.0e6), (1.0e6, 1.0e6)])
def test_a_spring_with_either_stiffness_or_both_is_accepted(k, kt):
    Model([4.0, 5.0], ["pinned", "spring", "roller"], [EI, EI], springs={1: (k, kt)})


@pytest.mark.parametrize("kind", ["pinned", "roller", "fixed"])
def test_a_translational_spring_on_a_support_that_holds_the_beam_up_is_refused(kind):
    e = refused(springs={1: (1.0e6, 0.0)}, supports=["pinned", kind, "roller"])
    assert e.param == "springs" and str(e).startswith(f"support 2 is {kind}: it already holds the beam up")


@pytest.mark.parametrize("kind", ["fixed", "guided"])
def test_a_rotational_spring_on_a_support_that_holds_the_rotation_is_refused(kind):
    e = refused(springs={0: (0.0, 1.0e6)}, supports=[kind, "roller", "roller"])
    assert e.param == "springs" and str(e).startswith(f"support 1 is {kind}: it already holds the rotation")


@pytest.mark.parametrize("kind", ["pinned", "roller", "spring"])
def test_a_rotational_spring_on_a_support_free_to_rotate_is_accepted(kind):
    Model([4.0, 5.0], [kind, "roller", "roller"], [EI, EI], springs={0: (0.0, 1.0e6)})


def test_a_spring_on_a_hinge_is_refused():
    e = refused(springs={1: (0.0, 1.0e6)}, supports=["fixed", "hinge", "roller"])
    assert (str(e), e.param) == ("support 2 is a hinge; put the spring on a support", "springs")


@pytest.mark.parametrize("kind", ["free", "guided", "spring", "hinge"])
def test_a_settlement_needs_a_support_that_holds_the_beam_up(kind):
    supports = ["fixed", kind, "pinned"] if kind != "spring" else ["pinned", kind, "roller"]
    e = refused(settlement={1: 0.01}, supports=supports,
                springs={1: (1.0e6, 0.0)} if kind == "spring" else {})
    assert e.param == "settlement" and str(e).endswith(f"support 2 is {kind}")


@pytest.mark.parametrize("at", [-1, 3])
def test_a_settlement_off_the_beam_is_refused(at):
    e = refused(settlement={at: 0.01})
    assert e.param == "settlement" and str(e).endswith(f"support {at + 1} is missing")


@pytest.mark.parametrize("kind", ["pinned", "roller", "fixed"])
def test_a_settlement_of_a_support_that_holds_the_beam_up_is_accepted(kind):
    Model([4.0, 5.0], ["pinned", kind, "roller"], [EI, EI], settlement={1: -0.005})


def test_a_settlement_that_is_not_a_number_is_refused():
    e = refused(settlement={2: math.nan})
    assert (str(e), e.param) == ("the settlement at support 3 is not a number", "settlement")


def test_one_stiffness_per_span():
    e = refused(EI=[EI])
    assert (str(e), e.param) == ("give EI for each of the 2 spans", "I")


@pytest.mark.parametrize("EIs, n", [([0.0, EI], 1), ([EI, -EI], 2), ([EI, math.nan], 2), ([math.inf, EI], 1)])
def test_a_stiffness_that_is_not_greater_than_zero_is_named_by_its_span(EIs, n):
    e = refused(EI=EIs)
    assert e.param == "I" and str(e).startswith(f"EI of span {n} is ")
    assert str(e).endswith("N·m²; E and I must be greater than zero")


# ---------------------------------------------------------------- mechanisms: which part can move

from calcsheet_plugins.beam.solver import PointLoad, solve  # noqa: E402


@pytest.mark.parametrize("spans, supports, part", [
    # statics of each arrangement: the part named is the one a rigid-body motion moves
    ([4.0, 5.0, 3.0], ["pinned", "roller", "hinge", "free"], (9, 12)),  # C–D swings about the hinge at C
    ([4.0, 4.0], ["fixed", "hinge", "free"], (4, 8)),  # B–C swings about the hinge at B
    ([6.0, 6.0], ["pinned", "hinge", "roller"], (0, 12)),  # both spans fold at the hinge B
    ([4.0, 4.0, 4.0], ["pinned", "hinge", "hinge", "roller"], (0, 12)),
    ([6.0], ["guided", "free"], (0, 6)),  # nothing holds it up: the whole beam slides
    ([3.0, 3.0], ["free", "hinge", "free"], (0, 6)),
])
def test_a_mechanism_is_refused_naming_the_part_that_can_move(spans, supports, part):
    with pytest.raises(BeamInputError) as exc:
        solve(Model(spans, supports, [EI] * len(spans)), [PointLoad(1.0, 1.0e3)])
    assert exc.value.param == "supports"
    assert str(exc.value) == (f"the supports cannot hold the beam — it is a mechanism: the part from x = {part[0]} m "
                              f"to x = {part[1]} m can move up and down freely; add a support, fix an end, or "
                              "remove a hinge")


# ---------------------------------------------------------------- loads against the beam, and zero shear

from calcsheet_plugins.beam.kinds import LineLoad  # noqa: E402
from calcsheet_plugins.beam.solver import validate_loads, zero_shear_points  # noqa: E402


@pytest.mark.parametrize("load, words", [
    (PointLoad(9.5, 1.0), "a load at x = 9.5 m lies outside the beam (0 to 9 m)"),
    (PointLoad(-0.5, 1.0), "a load at x = -0.5 m lies outside the beam"),
    (LineLoad(-1.0, 3.0, 1.0, 1.0), "a line load from x = -1 m to 3 m runs outside the beam (0 to 9 m)"),
    (LineLoad(5.0, 9.5, 1.0, 1.0), "a line load from x = 5 m to 9.5 m runs outside the beam"),
    (LineLoad(5.0, 4.0, 1.0, 1.0), "a line load ends (x = 4 m) before it starts (x = 5 m)"),
])
def test_the_solver_refuses_a_load_off_the_beam_itself(load, words):
    # the sheet's positions are checked when the model is built; the solver checks again for direct callers
    with pytest.raises(BeamInputError) as exc:
        validate_loads(Model([4.0, 5.0], ["pinned", "roller", "roller"], [EI, EI]), [load])
    assert str(exc.value) == words or str(exc.value).startswith(words)
    assert exc.value.param == "loads"


def test_loads_at_the_very_ends_are_on_the_beam():
    validate_loads(Model([4.0, 5.0], ["pinned", "roller", "roller"], [EI, EI]),
                   [PointLoad(0.0, 1.0), PointLoad(9.0, 1.0), LineLoad(0.0, 9.0, 1.0, 2.0)])


def test_zero_shear_by_a_jump_is_found_at_that_load_and_nowhere_else():
    # 10 kN at 2 m and 5 kN at 4 m on a 6 m simple span: R_A = (10·4 + 5·2)/6 kN; V = 8.33, −1.67, −6.67 kN on
    # the three stretches (statics), so V passes through zero only by the jump at x = 2 m
    sol = solve(Model([6.0], ["pinned", "roller"], [EI]), [PointLoad(2.0, 10e3), PointLoad(4.0, 5e3)])
    assert zero_shear_points(sol) == pytest.approx([2.0])
    # and a uniform load's zero lies inside its stretch: x = L/2
    sol = solve(Model([6.0], ["pinned", "roller"], [EI]), [LineLoad(0.0, 6.0, 4e3, 4e3)])
    assert zero_shear_points(sol) == pytest.approx([3.0])


def test_a_line_load_without_resultant_has_its_lever_arm_at_its_middle():
    # +5 → −5 N/m has no resultant, so no centroid; the middle keeps the printed lever arm inside the load
    assert LineLoad(2.0, 8.0, 5.0, -5.0).centroid == 5.0
    # otherwise the centroid of a trapezoid: x₁ + L(w₁ + 2w₂)/(3(w₁ + w₂)) (common practice)
    assert LineLoad(2.0, 8.0, 1.0, 4.0).centroid == pytest.approx(2.0 + 6.0 * 9.0 / 15.0)
