"""lint: warnings for statements that type-check but look wrong, and the one constant folder they use."""
from __future__ import annotations

import pytest

from calcsheet.engine import run


def findings(text):
    return [(d.span.line, d.code) for d in run(text, evaluate=False).diagnostics]


def test_a_capacity_folded_from_constants_and_names_is_judged():
    # 0.6*F_y - F_y is folded through the name F_y to a negative capacity
    text = "F_y = 250 MPa\nsigma = 100 MPa\ncheck sigma <= 0.6*F_y - F_y\n"
    assert (3, "no-utilisation") in findings(text)
    assert (3, "no-utilisation") not in findings(text.replace("0.6*F_y - F_y", "0.6*F_y"))


def test_a_negative_demand_from_inputs_is_judged():
    assert (2, "no-utilisation") in findings("M = -5 kN*m\ncheck M <= 10 kN*m\n")


def test_a_modulus_a_thousand_times_too_small_suggests_the_unit_step():
    # structural steel E ≈ 200 GPa  # common practice
    out = run("E = 200 MPa\nx = E*2\ncheck x <= 1 TPa\n".replace("1 TPa", "1000 GPa"), evaluate=False)
    (warn,) = [d for d in out.diagnostics if d.code == "implausible-value"]
    assert warn.hint == "did you mean 200 GPa?"


def test_a_value_folded_through_a_declared_unit_is_judged_in_that_unit():
    out = run("E_s [MPa] = 200*1000 kPa\nx = E_s*2\ncheck x <= 1000 GPa\n", evaluate=False)
    assert "implausible-value" in [d.code for d in out.diagnostics]


@pytest.mark.parametrize("text", [
    "E = 2000 GPa*max(1, 1)\nx = E*2\ncheck x <= 1000 GPa\n",  # a function call is not folded (only literals)
    "E = 200 GPa + 1 s\n",                                                     # broken: never folded
])
def test_what_cannot_be_folded_is_not_judged(text):
    assert "implausible-value" not in [d.code for d in run(text, evaluate=False).diagnostics]


def test_unit_shadowing_a_variable_is_a_warning_with_the_product_to_write():
    out = run("L = 6 m\nV = 2 L\nx = V*2\ncheck x <= 10 L\n", evaluate=False)
    shadow = [d for d in out.diagnostics if d.code == "unit-shadows-variable"]
    assert shadow and "write 2*L" in shadow[0].hint


def test_an_input_nothing_reads_is_reported_but_not_one_a_misspelling_meant():
    assert findings("a = 2 m\nb = 3 m\nx = a*2\ncheck x <= 5 m\n") == [(2, "unused-input")]
    assert "unused-input" not in [c for _, c in findings("span = 2 m\nx = spam*2\n")]
