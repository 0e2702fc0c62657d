"""The key values of sheets/steel_channel_tee_aisc.calc against the published examples whose data it uses.

EC-2 is the channel of AISC Design Examples v16.0, Example F.2-2B (C15×33.9, A992, 25 ft span, w_D = 0.23 and
w_L = 0.69 kip/ft, braced at the ends and fifth points); TS-4 is the strut of Example E.7 (WT7×34, A992, 20 ft,
P_D = 20 kips, P_L = 60 kips). The golden rendering (tests/golden/) pins the printing; these pin the numbers.
"""
from pathlib import Path

import pytest

import calcsheet

SHEET = Path(__file__).resolve().parents[3] / "sheets" / "steel_channel_tee_aisc.calc"


@pytest.fixture(scope="module")
def demo():
    r = calcsheet.run(SHEET)
    assert r.ok, r.format_diagnostics()
    return r


def test_edge_channel_matches_example_F_2_2B(demo):
    v, d1 = demo.values, demo.values["d1"].fields
    assert v["M_u"].m_as("kip*ft") == pytest.approx(108, abs=0.5)     # M_u = 108 kip-ft (Example F.2-1A)
    # C_b of the middle fifth of a uniform load: "almost uniform moment", C_b = 1.00 (Manual Table 3-1)
    assert d1["C_b"].m_as("") == pytest.approx(1.00, abs=0.005)
    assert d1["L_p"].m_as("ft") == pytest.approx(3.18, abs=0.005)      # L_p = 3.18 ft
    assert d1["L_r"].m_as("ft") == pytest.approx(11.2, abs=0.05)       # L_r = 11.2 ft
    assert d1["M_cx"].m_as("kip*ft") == pytest.approx(173, abs=1.0)    # φ_bM_n = 173 kip-ft
    assert d1["method"] == "LRFD"                                      # from the title block's design_method


def test_tee_strut_matches_example_E_7(demo):
    d2 = demo.values["d2"].fields
    assert demo.values["P_u"].m_as("kip") == pytest.approx(120)        # P_u = 120 kips
    assert d2["F_e_FT"].m_as("ksi") == pytest.approx(29.5, abs=0.05)   # F_e = 29.5 ksi, Eq. E4-3
    assert d2["P_c"].m_as("kip") == pytest.approx(128, abs=0.6)        # φ_cP_n = 128 kips
    assert "about x" in d2["governing_compression"]                    # F_ex = 16.2 ksi controls
