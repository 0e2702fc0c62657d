"""Per-span results and support names.

AISC Steel Construction Manual Table 3-23 (from memory), continuous beam of two equal spans, uniform load w on
both: R_A = 3wL/8, largest sagging moment 9wL²/128 at 3L/8 from each end support, hogging −wL²/8 over the
middle support; with the load on one span only, that span's sagging moment is 49wL²/512 at 7L/16, and the
unloaded span has no sagging moment (its moment runs linearly from −wL²/16 over the support to zero).
"""
import pytest

import calcsheet
from calcsheet_plugins.beam.model import letters

w, L = 10.0, 6.0  # kN/m, m


def fields(loads):
    r = calcsheet.run(f'b = beam.solve(spans=[6 m, 6 m], supports="pinned, roller, roller", E=200 GPa, '
                      f'I=1e8 mm^4, loads=[{loads}])\n')
    assert r.ok, r.diagnostics
    return {k: v.m_as("kN*m") if hasattr(v, "m_as") and v.check("[force]*[length]") else v
            for k, v in r.values["b"].fields.items()}


def test_two_equal_spans_each_carry_their_own_sagging_and_share_the_hogging():
    b = fields("beam.udl(w=10 kN/m)")
    for k in (1, 2):
        assert b[f"M_max_{k}"] == pytest.approx(9 * w * L**2 / 128, rel=1e-9)
        assert b[f"M_min_{k}"] == pytest.approx(-w * L**2 / 8, rel=1e-9)


def test_one_loaded_span_of_two():
    b = fields("beam.udl(w=10 kN/m, span=1)")
    assert b["M_max_1"] == pytest.approx(49 * w * L**2 / 512, rel=1e-9)
    assert b["M_min_1"] == pytest.approx(-w * L**2 / 16, rel=1e-9)
    assert b["M_max_2"] == pytest.approx(0.0, abs=1e-9)
    assert b["M_min_2"] == pytest.approx(-w * L**2 / 16, rel=1e-9)


def test_supports_are_lettered_a_to_z_then_aa_ab_and_on():
    names = letters(26 * 27 + 2)
    assert names[:3] == ["A", "B", "C"] and names[25] == "Z"
    assert names[26:29] == ["AA", "AB", "AC"] and names[51] == "AZ" and names[52] == "BA"
    assert names[26 * 27 - 1] == "ZZ" and names[26 * 27] == "AAA" and names[26 * 27 + 1] == "AAB"
    assert len(set(names)) == len(names)


def test_a_case_no_combination_uses_is_warned_about():
    r = calcsheet.run('b = beam.solve(spans=[6 m], supports="pinned, roller", E=200 GPa, I=1e8 mm^4, '
                      'loads=[beam.udl(w=2 kN/m, case="D"), beam.udl(w=3 kN/m, case="L"), '
                      'beam.point(P=1 kN, x=2 m, case="W")], combos=[beam.combo(name="U", factors="1.4 D + 1.6 L")])\n')
    assert r.ok, r.diagnostics
    warnings = [d.message for d in r.diagnostics if d.severity == "warning"]
    assert [m for m in warnings if "no combination uses" in m] == [
        "no combination uses the loads of case 'W'"]
