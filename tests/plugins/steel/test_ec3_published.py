"""EN 1993-1-1 against published worked examples.

Source: ArcelorMittal / SECEU, "Multi-Storey Steel Buildings, Part 4: Detailed Design" (Eurocode design
guide series, EN 1993-1-1 recommended values, γ_M0 = γ_M1 = 1.0), Appendix A worked examples A.1 (IPE 330 beam)
and A.5 (HE 300 B column). The printed results below were read from a public validation table that quotes
these examples; the A.5 lengths (L = 8.0 m about y–y, k_z = 0.7 about z–z) are inferred from the printed χ
values, and the section properties are the catalogue's (ArcelorMittal sections tables) — from memory.
"""
import pytest

from .conftest import call, f

IPE330 = ('name="IPE 330", form="I", A=6261 mm^2, d=330 mm, b_f=160 mm, t_w=7.5 mm, t_f=11.5 mm, r=18 mm, '
          'I_x=11770e4 mm^4, I_y=788.1e4 mm^4, S_x=713.1e3 mm^3, Z_x=804.3e3 mm^3, S_y=98.52e3 mm^3, '
          'Z_y=153.7e3 mm^3, J=28.15e4 mm^4, C_w=199.1e9 mm^6')
HEB300 = ('name="HE 300 B", form="I", A=14910 mm^2, d=300 mm, b_f=300 mm, t_w=11 mm, t_f=19 mm, r=27 mm, '
          'I_x=25170e4 mm^4, I_y=8563e4 mm^4, S_x=1678e3 mm^3, Z_x=1869e3 mm^3, S_y=570.9e3 mm^3, '
          'Z_y=870.1e3 mm^3, J=185.0e4 mm^4, C_w=1688e9 mm^6')


def test_MSB04_A1_IPE330_cross_section_resistances():
    out = call(IPE330, "ec3_beam", "f_y=235 MPa, M_y_Ed=100 kN*m, V_Ed=100 kN", units="SI")
    assert f(out["section_class"]) == 1
    assert f(out["M_c_y_Rd"], "kN*m") == pytest.approx(189.0, abs=0.05)  # M_c,Rd = W_pl,y f_y/γ_M0 = 189.0 kNm
    assert f(out["V_pl_Rd"], "kN") == pytest.approx(417.9, rel=0.001)    # V_pl,Rd = 417.9 kN


def test_MSB04_A5_HE300B_column_flexural_buckling():
    out = call(HEB300, "ec3_column", "f_y=235 MPa, L=8.0 m, L_z=5.6 m, N_Ed=2000 kN", units="SI")
    # Table 6.2: rolled, h/b = 1.0 ≤ 1.2, t_f = 19 mm ≤ 100 mm → curve b about y–y, c about z–z
    assert f(out["chi_y"]) == pytest.approx(0.808, abs=0.002)
    assert f(out["chi_z"]) == pytest.approx(0.671, abs=0.002)
    assert f(out["N_b_Rd"], "kN") == pytest.approx(2349, rel=0.003)
