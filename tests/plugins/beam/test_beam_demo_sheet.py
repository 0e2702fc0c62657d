"""The member demo sheet runs clean, and its numbers agree with independent hand results."""
from pathlib import Path

import pytest

import calcsheet
from calcsheet.trace import CheckResult, Figure

SHEET = Path(__file__).resolve().parents[3] / "sheets" / "member_mezzanine_beam.calc"


@pytest.fixture(scope="module")
def result():
    return calcsheet.run(SHEET)


def test_runs_without_errors_and_all_checks_pass(result):
    assert not [d for d in result.diagnostics if d.severity == "error"]
    assert len(result.checks) == 5 and all(c.ok for c in result.checks)


def test_package_shows_the_four_diagrams_and_equilibrium_checks(result):
    items = result.values["b"].working.items
    assert sum(isinstance(i, Figure) for i in items) == 4
    inner = [i for i in items if isinstance(i, CheckResult)]
    assert len(inner) >= 8 and all(c.ok for c in inner)


def test_sls_reactions_by_the_three_moment_equation(result):
    # Clapeyron's three-moment equation for two spans on simple end supports (any strength-of-materials
    # text): 2·M_B·(L1 + L2) = -(w·L1³ + w·L2³)/4 - P·b·(L2² - b²)/L2, b measured from the far support C.
    w_G, w_Q, P = 0.85 * 3.0 + 0.55, 7.5 * 3.0, 12.0  # kN/m, kN/m, kN (SLS: G + Q1 + Q2)
    L1, L2, a = 6.0, 4.8, 1.5
    b = L2 - a
    w = w_G + w_Q
    M_B = -(w * L1**3 / 4 + w * L2**3 / 4 + P * b * (L2**2 - b**2) / L2) / (2 * (L1 + L2))
    R_A = w * L1 / 2 + M_B / L1
    rec = result.values["b"]
    sls = [i for i in rec.working.items if getattr(i, "name", "") == "R_sum_SLS"][0]
    total = w * (L1 + L2) + P
    assert sls.value.m_as("kN") == pytest.approx(total)
    tables = [i for i in rec.working.items if getattr(i, "title", "") == "Reactions (upward positive)"]
    col = tables[0].columns.index("R, SLS")
    assert tables[0].rows[0][col].m_as("kN") == pytest.approx(R_A, rel=1e-9)
