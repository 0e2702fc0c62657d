"""Every example sheet builds clean, and its rendering is pinned.

The golden files are a regression check on *rendering* (a changed line means
the package a reviewer reads changed); the engineering numbers of the demo
are checked separately against a hand calculation below. Regenerate golden
files deliberately with CALCSHEET_UPDATE_GOLDEN=1 and review the diff; a missing golden file
is a failure, never written silently.
"""
import os
from pathlib import Path

import pytest

import calcsheet
from calcsheet.render.text import TextDocument

ROOT = Path(__file__).resolve().parents[1]
SHEETS = sorted((ROOT / "sheets").glob("*.calc"))
GOLDEN = Path(__file__).parent / "golden"


@pytest.mark.parametrize("sheet", SHEETS, ids=[s.stem for s in SHEETS])
def test_sheet_builds_without_errors_and_matches_its_golden_rendering(sheet):
    r = calcsheet.run(sheet)
    assert r.ok, r.format_diagnostics()
    text = TextDocument(sigfigs=r.policy.sigfigs).items(r.items).strip() + "\n"
    golden = GOLDEN / f"{sheet.stem}.txt"
    if os.environ.get("CALCSHEET_UPDATE_GOLDEN") == "1":
        golden.write_text(text, encoding="utf-8")
    assert golden.exists(), f"no golden rendering {golden.name}: write it with CALCSHEET_UPDATE_GOLDEN=1 and review it"
    assert text == golden.read_text(encoding="utf-8")


def test_demo_numbers_against_a_hand_calculation():
    r = calcsheet.run(ROOT / "sheets" / "boardwalk_joist.calc")
    v = {k: q for k, q in r.values.items()}
    # hand calculation, independent of the engine:
    s, L, g_k, q_k = 0.45, 3.6, 0.55, 4.0               # m, m, kPa, kPa
    w = 1.35 * g_k * s + 1.5 * q_k * s                 # kN/m
    M = w * L**2 / 8                                   # kN·m
    V = w * L / 2                                      # kN
    S = 75 * 250**2 / 6                                # mm³, rectangle bh²/6 (Roark, Table A.1)
    sigma = M * 1e6 / S                                # MPa
    I = 75 * 250**3 / 12                               # mm⁴, bh³/12 (Roark, Table A.1)
    E_mean, E_05 = 8000, 5400                          # MPa, C16 (EN 338:2009 Table 1, from memory)
    delta = 5 * (g_k + q_k) * s * (L * 1e3) ** 4 / (384 * E_mean * I)   # mm, 5wL⁴/384EI
    k_mod, gamma_M = 0.65, 1.3                         # EN 1995-1-1 Table 3.1 (SC3, medium-term), Table 2.3
    l_ef = 0.9 * L * 1e3 + 2 * 250                     # mm, EN 1995-1-1 Table 6.1, load on the compression edge
    lam = (16 / (0.78 * 75**2 * E_05 / (250 * l_ef))) ** 0.5   # (6.30) with (6.32)
    k_crit = 1.56 - 0.75 * lam                         # (6.34), 0.75 < λ ≤ 1.4
    U_m = sigma / (k_crit * k_mod * 16 / gamma_M)
    U_v = 1.5 * V * 1e3 / (0.67 * 75 * 250) / (k_mod * 3.2 / gamma_M)   # (6.13), k_cr = 0.67
    U_c90 = V * 1e3 / (75 * (50 + 30)) / (1.5 * k_mod * 2.2 / gamma_M)  # (6.3)/(6.4), k_c,90 = 1.5
    assert v["w"].m_as("kN/m") == pytest.approx(w)
    assert v["M_max"].m_as("kN*m") == pytest.approx(M)
    assert v["sigma_m"].m_as("MPa") == pytest.approx(sigma, rel=1e-9)
    assert v["delta"].m_as("mm") == pytest.approx(delta, rel=1e-9)
    jb = v["jb"].fields
    assert jb["U_bending"].m_as("") == pytest.approx(U_m, rel=1e-9)
    assert jb["U_shear"].m_as("") == pytest.approx(U_v, rel=1e-9)
    assert jb["U_bearing"].m_as("") == pytest.approx(U_c90, rel=1e-9)
    statuses = [c.ok for c in r.checks]
    assert statuses == [U_m <= 1, U_v <= 1, delta <= L * 1e3 / 300, True, U_c90 <= 1]


def test_us_demo_numbers_against_a_hand_calculation():
    r = calcsheet.run(ROOT / "sheets" / "us_roof_beam.calc")
    assert r.ok, r.format_diagnostics()
    v = r.values
    w = (18 + 30) * 8 / 1000 + 0.035                       # klf: (D + S) psf × 8 ft + self-weight
    L = 32 * 12                                            # in
    # I of the three-rectangle I-shape, parallel-axis theorem by hand (in⁴)
    I = 2 * (7 * 0.5**3 / 12 + 7 * 0.5 * 7.75**2) + 0.3 * 15**3 / 12
    M = w / 12 * L**2 / 8                                  # kip·in, wL²/8
    sigma = M / (I / 8)                                    # ksi, M/S with c = h/2
    E = 29000                                              # ksi, A992 (common practice)
    delta = 5 * (w / 12) * L**4 / (384 * E * I)            # in, 5wL⁴/384EI
    assert v["w"].m_as("klf") == pytest.approx(w)
    assert v["st"].fields["sigma_max"].m_as("ksi") == pytest.approx(sigma, rel=1e-6)
    assert v["rb"].fields["delta_gov"].m_as("in") == pytest.approx(delta, rel=1e-6)
    assert v["rb"].fields["delta_allow"].m_as("in") == pytest.approx(L / 240)
    assert all(c.ok for c in r.checks)


def test_a_missing_golden_file_fails_and_is_not_written(tmp_path, monkeypatch):
    monkeypatch.setitem(globals(), "GOLDEN", tmp_path)
    monkeypatch.delenv("CALCSHEET_UPDATE_GOLDEN", raising=False)
    with pytest.raises(AssertionError, match="no golden rendering"):
        test_sheet_builds_without_errors_and_matches_its_golden_rendering(SHEETS[0])
    assert list(tmp_path.iterdir()) == []
