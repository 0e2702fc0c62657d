"""Handbook cross-checks print named symbols and short literals, as a sheet would, never a raw float."""
import re

import pytest

import calcsheet
from calcsheet.render.text import TextDocument

SHEET = ('b = beam.solve(spans=[32 ft], supports="pinned, roller", loads=[beam.udl(w=0.419 kip/ft, case="D")], '
         "E=29000 ksi, I=504.958 in^4)\n")


@pytest.fixture(scope="module")
def lines():
    r = calcsheet.run("---\nunits: US\n---\n" + SHEET)
    assert not r.errors, [d.message for d in r.errors]
    text = TextDocument(sigfigs=r.policy.sigfigs).items(r.items)
    start = text.index("Cross-check")
    return [ln for ln in text[start:].splitlines() if "_hb" in ln or "_sol" in ln or "hb" in ln][:9]


def test_no_cross_check_line_carries_more_than_six_significant_figures(lines):
    assert lines
    for ln in lines:
        for number in re.findall(r"\d[\d.]*", ln.split("--")[0]):
            digits = number.replace(".", "").lstrip("0")
            assert len(digits) <= 6, ln


def test_the_check_compares_named_values(lines):
    checks = [ln for ln in lines if ln.strip().startswith("check")]
    assert checks and all(re.search(r"\|(R|M|δ)_hb − (R|M|δ)_sol\|", ln) for ln in checks)


def test_the_handbook_deflection_is_the_closed_form():
    r = calcsheet.run("---\nunits: US\n---\n" + SHEET)
    w, L, E, I = 0.419 / 12, 32 * 12, 29000.0, 504.958  # kip/in, in, ksi, in⁴
    # simply supported, uniform load: δ = 5wL⁴/(384EI) (any mechanics text; common practice)
    step = next(i for i in r.values["b"].working.items if getattr(i, "name", "") == "delta_hb")
    assert step.value.m_as("in") == pytest.approx(5 * w * L**4 / (384 * E * I), rel=1e-5)
