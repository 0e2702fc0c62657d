"""Actions acting together: the shear reported with a moment extreme is the shear at that very place.

A cantilever with a couple at its free end carries the same moment everywhere and no shear at all (statics of
the free body between any section and the tip — common practice): the extreme moment is found at its leftmost
place, and the shear acting with it is exactly zero, also at the end of the beam.
"""
import pytest

import calcsheet


@pytest.mark.parametrize("supports", ["fixed, free", "free, fixed"])
def test_a_cantilever_with_a_tip_couple_has_no_shear_with_its_moment(supports):
    tip = "6 m" if supports == "fixed, free" else "0 m"
    r = calcsheet.run(f'b = beam.solve(spans=[6 m], supports="{supports}", E=200 GPa, I=1e8 mm^4, '
                      f'loads=[beam.moment(M=12 kN*m, x={tip})])\nres = beam.result(member=b)\n')
    assert r.ok, r.diagnostics
    res = r.values["res"].fields
    moment = "M_max" if res["M_max"].m_as("kN*m") != 0 else "M_min"
    assert abs(res[moment].m_as("kN*m")) == pytest.approx(12.0, rel=1e-12)
    assert res[f"x_{moment}"].m_as("m") == 0.0  # the same moment everywhere: the leftmost place
    assert res[f"V_at_{moment}"].m_as("N") == 0.0
    assert res["V_max"].m_as("N") == 0.0
    assert res["M_at_V_max"].m_as("kN*m") == pytest.approx(res[moment].m_as("kN*m"), rel=1e-12)
