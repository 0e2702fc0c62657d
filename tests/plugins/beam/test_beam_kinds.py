"""The load kinds' protocol, as a specification: which span a load belongs to when the variable load is placed
span by span (pattern loading), and what each kind contributes to a span."""
import pytest

from calcsheet_plugins.beam.kinds import KINDS, AxialLoad, LineLoad, MomentLoad, PointLoad, UniformLoad

TOL = 1e-9 * 10.0


@pytest.mark.parametrize("load", [PointLoad(5.0, 1.0), MomentLoad(5.0, 1.0), AxialLoad(5.0, 1.0)])
def test_a_load_at_an_interior_support_belongs_to_the_span_on_its_right_only(load):
    # a span owns what lies at its left support; the last span also what lies at its right end
    assert load.on_span(0.0, 5.0, False, TOL) is None
    assert load.on_span(5.0, 10.0, True, TOL) is load


@pytest.mark.parametrize("cls", [PointLoad, MomentLoad, AxialLoad])
def test_a_load_at_either_end_of_the_beam_belongs_to_the_end_span(cls):
    assert cls(0.0, 1.0).on_span(0.0, 5.0, False, TOL) is not None
    assert cls(10.0, 1.0).on_span(5.0, 10.0, True, TOL) is not None
    assert cls(10.0, 1.0).on_span(5.0, 10.0, False, TOL) is None  # not the last span: its right end is not its own
    assert cls(2.5, 1.0).on_span(5.0, 10.0, True, TOL) is None


def test_a_line_load_is_cut_at_the_supports_with_its_intensity_there():
    ld = LineLoad(2.0, 8.0, 1.0, 4.0)  # 1 → 4 N/m from 2 to 8 m: w(x) = 1 + (x − 2)/2
    left, right = ld.on_span(0.0, 5.0, False, TOL), ld.on_span(5.0, 10.0, True, TOL)
    assert (left.x1, left.x2, left.w1, left.w2) == (2.0, 5.0, 1.0, 2.5)
    assert (right.x1, right.x2, right.w1, right.w2) == (5.0, 8.0, 2.5, 4.0)
    assert left.total + right.total == pytest.approx(ld.total)  # (1 + 4)/2 · 6 = 15 N
    assert ld.on_span(8.0, 10.0, True, TOL) is None  # touching a span at one point puts nothing on it


def test_a_point_load_and_a_couple_are_one_part_each_at_their_place_in_span_coordinates():
    assert PointLoad(6.0, 3.0).parts(5.0, 10.0, TOL) == [("P", 1.0, 0.0, 3.0, 0.0)]
    assert MomentLoad(6.0, 3.0).parts(5.0, 10.0, TOL) == [("M", 1.0, 0.0, 3.0, 0.0)]
    assert AxialLoad(6.0, 3.0).parts(5.0, 10.0, TOL) == []  # it bends nothing
    assert UniformLoad(2.0, 8.0, 2.0, 2.0).parts(5.0, 10.0, TOL) == [("w", 0.0, 3.0, 2.0, 2.0)]


def test_each_kind_is_registered_under_its_sheet_name():
    assert {name: cls.__name__ for name, cls in KINDS.items()} == {
        "point": "PointLoad", "moment": "MomentLoad", "varying": "LineLoad", "udl": "UniformLoad",
        "axial": "AxialLoad"}
