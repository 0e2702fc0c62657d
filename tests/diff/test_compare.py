"""Comparing two sides by name and dependency: changed inputs and results, flipped and moved checks."""
from pathlib import Path

import pytest

import calcsheet
from calcsheet.diff import diff_results

BEAM = (Path(__file__).parent / "joist.calc").read_text(encoding="utf-8")  # a simply supported timber joist


def deeper(text: str, h: str = "250 mm") -> str:
    return text.replace("h = 200 mm", f"h = {h}")


def _write(path: Path, text: str) -> str:
    path.write_text(text, encoding="utf-8")
    return str(path)


def test_a_changed_dimension_reports_exactly_its_dependents(depth_change):
    d = depth_change
    assert [c.name for c in d.inputs] == ["h"]
    # b, L, w, M, V and f do not read h: they must not appear
    assert {c.name for c in d.results} == {"S", "A", "sigma"}
    assert not d.added and not d.removed


def test_old_and_new_values_and_percent_change_are_right(depth_change):
    by = {c.name: c for c in depth_change.inputs + depth_change.results}
    # section modulus of a rectangle b*h^2/6 — Roark's Formulas for Stress and Strain, Table A.1
    assert by["S"].old.quantity.m_as("mm^3") == pytest.approx(100 * 200**2 / 6)
    assert by["S"].new.quantity.m_as("mm^3") == pytest.approx(100 * 250**2 / 6)
    assert by["S"].pct == pytest.approx((250**2 / 200**2 - 1) * 100)  # S grows with h^2: +56.25 %
    # M = w L^2 / 8 for a simply supported span under a uniform load — common practice
    m = 5 * 4**2 / 8 * 1e6  # N*mm
    assert by["sigma"].old.quantity.m_as("MPa") == pytest.approx(m / (100 * 200**2 / 6))  # 15 MPa
    assert by["sigma"].new.quantity.m_as("MPa") == pytest.approx(m / (100 * 250**2 / 6))  # 9.6 MPa
    assert by["h"].old.quantity.m_as("mm") == 200 and by["h"].new.quantity.m_as("mm") == 250
    assert by["A"].pct == pytest.approx(25.0)
    assert by["sigma"].caused_by == ["h"]


def test_a_check_that_flips_is_reported_as_flipped(depth_change):
    (flip,) = depth_change.flipped
    assert flip.text == "sigma <= f"
    assert (flip.old.ok, flip.new.ok) == (False, True)  # 15 MPa > 12 MPa, then 9.6 MPa <= 12 MPa
    assert flip.old.ratio == pytest.approx(15 / 12) and flip.new.ratio == pytest.approx(9.6 / 12)
    assert not depth_change.moved  # the shear check does not read h


def test_utilisation_that_moves_without_flipping_is_reported():
    d = diff_results(calcsheet.run(BEAM), calcsheet.run(BEAM.replace("w = 5 kN/m", "w = 6 kN/m")))
    moved = {c.text: c for c in d.moved}
    # V = w L / 2 — common practice: 10 kN of 30 kN, then 12 kN of 30 kN
    assert moved["V <= 30 kN"].old.ratio == pytest.approx(10 / 30)
    assert moved["V <= 30 kN"].new.ratio == pytest.approx(12 / 30)
    # sigma = 15 MPa, then 18 MPa, against 12 MPa: NG both times, so it moved and did not flip
    assert not d.flipped and moved["sigma <= f"].new.ratio == pytest.approx(18 / 12)


def test_an_inserted_unrelated_line_yields_no_spurious_changes():
    inserted = BEAM.replace("# Loads and section\n", "# Loads and section\n> Joists at 400 mm centres.\n"
                                                     "s = 400 mm        -- joist spacing\n\n")
    d = diff_results(calcsheet.run(BEAM), calcsheet.run(inserted))
    assert d.added == ["s"]
    assert not (d.inputs or d.results or d.removed or d.flipped or d.moved or d.edited_checks
                or d.checks_added or d.checks_removed)
    assert d.changed_names == {"s"}


def test_reordered_checks_are_matched_by_text_not_line():
    lines = BEAM.rstrip("\n").split("\n")
    swapped = "\n".join(lines[:-2] + [lines[-1], lines[-2]]) + "\n"
    d = diff_results(calcsheet.run(BEAM), calcsheet.run(swapped))
    assert d.empty


def test_an_edited_check_is_matched_by_the_names_it_reads():
    d = diff_results(calcsheet.run(BEAM), calcsheet.run(BEAM.replace("check sigma <= f ", "check sigma <= 1.3*f ")))
    assert not d.checks_added and not d.checks_removed
    (flip,) = d.flipped  # 15 MPa against 15.6 MPa: now OK
    assert (flip.old.text, flip.new.text) == ("sigma <= f", "sigma <= 1.3*f")


def test_a_changed_formula_is_reported_even_where_the_value_moves_with_it():
    d = diff_results(calcsheet.run(BEAM), calcsheet.run(BEAM.replace("M [kN*m] = w*L^2/8", "M [kN*m] = w*L^2/10")))
    m = next(c for c in d.results if c.name == "M")
    assert m.formula_changed and m.pct == pytest.approx(-20.0)
    assert next(c for c in d.results if c.name == "sigma").caused_by == ["M"]


def test_removed_and_added_steps_are_listed():
    text = BEAM.replace("A [mm^2] = b*h\n", "").replace("check V <= 30 kN  -- shear force\n",
                                                        "tau [MPa] = 1.5*V/(b*h)\n")
    d = diff_results(calcsheet.run(BEAM), calcsheet.run(text))
    assert d.removed == ["A"] and d.added == ["tau"]
    assert [c.text for c in d.checks_removed] == ["V <= 30 kN"]


def test_record_fields_are_compared_one_by_one():
    sheet = "b = 100 mm\nh = 200 mm\nsec = section.rectangle(b=b, h=h)\nI = sec.I_x\n"
    d = diff_results(calcsheet.run(sheet), calcsheet.run(sheet.replace("h = 200 mm", "h = 300 mm")))
    names = {c.name for c in d.results}
    assert "sec.I_x" in names and "I" in names and "sec.A" in names
    i = next(c for c in d.results if c.name == "I")
    # I_x = b h^3 / 12 — Roark's Formulas for Stress and Strain, Table A.1
    assert i.new.quantity.m_as("mm^4") == pytest.approx(100 * 300**3 / 12)
    assert i.pct == pytest.approx((1.5**3 - 1) * 100)
    assert "sec" in d.changed_names and "sec.I_x" not in d.changed_names


def test_float_noise_on_a_zero_record_field_is_not_a_change():
    from calcsheet import units as U
    from calcsheet.diff import Entry, Snapshot, diff_snapshots

    mm4 = U.unit_named("mm") ** 4
    Q = U.registry().Quantity

    def snap(i_xy):
        s = Snapshot("x")
        s.values["fb"] = Entry("fb", text="built-up result")
        s.values["fb.I_x"] = Entry("fb.I_x", quantity=Q(7.1e8, mm4), parent="fb")
        s.values["fb.I_xy"] = Entry("fb.I_xy", quantity=Q(i_xy, mm4), parent="fb")
        return s

    # a symmetric section's product of inertia is zero — common practice; 8e-9 mm^4 beside 7e8 is round-off
    assert diff_snapshots(snap(0.0), snap(8.4e-9)).empty
    assert [c.name for c in diff_snapshots(snap(0.0), snap(2.0e3)).results] == ["fb.I_xy"]
