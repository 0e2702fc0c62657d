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
    # many combinations: equilibrium is tabulated for every one and the worst residual checked (ΣF_y, ΣM)
    assert len(inner) == 3 and all(c.ok for c in inner)
    table = [i for i in items if getattr(i, "title", "").startswith("Equilibrium by combination")][0]
    assert len(table.rows) == result.values["b"].fields["n_combos"].m_as("") > 8


def three_moment_M_B(w1, w2, L1, L2, P=0.0, b=0.0):
    """Clapeyron's three-moment equation for two spans on simple end supports (any strength-of-materials
    text): 2·M_B·(L1 + L2) = -(w1·L1³ + w2·L2³)/4 - P·b·(L2² - b²)/L2, b measured from the far support C."""
    return -(w1 * L1**3 / 4 + w2 * L2**3 / 4 + P * b * (L2**2 - b**2) / L2) / (2 * (L1 + L2))


w_G, w_Q, P = 0.85 * 3.0 + 0.55, 7.5 * 3.0, 12.0  # kN/m, kN/m, kN (the sheet's inputs)
L1, L2, a = 6.0, 4.8, 1.5


def test_characteristic_reactions_by_the_three_moment_equation(result):
    rec = result.values["b"]
    combos = [i for i in rec.working.items if getattr(i, "title", "") == "Combinations"][0]
    assert ["C1", "G + Q + H", "Q", "long-term", "EN 1990:2002+A1:2005 6.5.3 (6.14b)"] in combos.rows
    w = w_G + w_Q
    M_B = three_moment_M_B(w, w, L1, L2, P, L2 - a)
    R_A = w * L1 / 2 + M_B / L1
    # many combinations: the reactions are tabulated a row per combination, beside the equilibrium sums
    (table,) = [i for i in rec.working.items if getattr(i, "title", "").startswith("Equilibrium by combination")]
    (row,) = [r for r in table.rows if r[0] == "C1"]
    assert row[table.columns.index("R_A")].m_as("kN") == pytest.approx(R_A, rel=1e-9)


def test_largest_span_moment_comes_from_loading_span_one_alone(result):
    # EN 1990 (6.10) with γG,sup = 1.35, γQ = 1.5 (Table A1.2(B)); imposed load on span 1 only (pattern)
    w1, w2 = 1.35 * w_G + 1.5 * w_Q, 1.35 * w_G
    M_B = three_moment_M_B(w1, w2, L1, L2)
    R_A = w1 * L1 / 2 + M_B / L1
    b = result.values["b"].fields
    assert b["M_max"].m_as("kN*m") == pytest.approx(R_A**2 / (2 * w1), rel=1e-9)  # at V = 0: x = R_A/w1
    assert b["combo_M_max"] == "U1a"
    # largest hogging over C-2: every load on both spans, 1.35 G + 1.5 Q + 1.5 H
    M_B_all = three_moment_M_B(1.35 * w_G + 1.5 * w_Q, 1.35 * w_G + 1.5 * w_Q, L1, L2, 1.5 * P, L2 - a)
    assert b["M_B"].m_as("kN*m") == pytest.approx(M_B_all, rel=1e-9)
    assert result.values["M_B"].m_as("kN*m") == pytest.approx(M_B_all, rel=1e-9)
