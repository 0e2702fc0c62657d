"""The engineering values of each demo sheet, recomputed by hand in the test with their sources named.

The golden renderings in tests/golden/ pin the *printing*; a regeneration would
accept a wrong number. Here every key value of each demo — section properties,
loads, moments, reactions, stresses, deflections, buckling loads — is computed
independently (closed-form section properties, the three-moment equation,
numerical integration of the curvature) and compared with what the sheet gives.
"""
import math
from pathlib import Path

import numpy as np
import pytest

import calcsheet

SHEETS = Path(__file__).resolve().parents[1] / "sheets"


def run(name):
    r = calcsheet.run(SHEETS / name)
    assert r.ok, r.format_diagnostics()
    return r


def val(r, name, unit):
    return r.values[name].m_as(unit)


def field(r, rec, name, unit):
    return r.values[rec].fields[name].m_as(unit)


def built_up(parts):
    """(A, y_c, I_x) of rectangles (b, h, y_bottom, n) by the parallel-axis theorem; n < 0 is a hole."""
    A = sum(n * b * h for b, h, y, n in parts)
    yc = sum(n * b * h * (y + h / 2) for b, h, y, n in parts) / A
    I = sum(n * (b * h**3 / 12 + b * h * (y + h / 2 - yc) ** 2) for b, h, y, n in parts)
    return A, yc, I


def first_moment_above(parts, yc):
    """Q of the transformed area above y = yc, for rectangles (b, h, y_bottom, n)."""
    Q = 0.0
    for b, h, y, n in parts:
        lo, hi = max(y, yc), y + h
        if hi > lo:
            Q += n * b * (hi - lo) * ((hi + lo) / 2 - yc)
    return Q


# ---------------------------------------------------------------- boardwalk joist (simply supported, timber)


@pytest.fixture(scope="module")
def joist():
    return run("boardwalk_joist.calc")


def test_boardwalk_joist(joist):
    r = joist
    L, s = 3.6, 0.45
    w = 1.35 * 0.55 * s + 1.5 * 4.0 * s  # kN/m, EN 1990 STR factors as the sheet states them
    w_g, w_q = 0.55 * s, 4.0 * s  # characteristic line loads, kN/m
    b, h = 75.0, 250.0
    # rectangle: A = bh, S = bh²/6, I = bh³/12 (any section handbook — common practice)
    A, S, I = b * h, b * h**2 / 6, b * h**3 / 12
    assert field(r, "joist", "A", "mm^2") == pytest.approx(A, rel=1e-12)
    assert field(r, "joist", "S_x", "mm^3") == pytest.approx(S, rel=1e-12)
    assert field(r, "joist", "I_x", "mm^4") == pytest.approx(I, rel=1e-12)
    # simply supported beam, uniform load: M = wL²/8, V = wL/2, δ = 5wL⁴/(384EI)
    # (Roark's Formulas for Stress and Strain, Table 8.1 case 2e — from memory)
    M, V = w * L**2 / 8, w * L / 2
    assert val(r, "M_max", "kN*m") == pytest.approx(M, rel=1e-12)
    assert val(r, "V_max", "kN") == pytest.approx(V, rel=1e-12)

    # EN 1995-1-1, C16 (EN 338:2009 Table 1: f_m,k 16, f_v,k 3.2, f_c,90,k 2.2, E_0,mean 8000, E_0,05 5400 MPa),
    # service class 3, medium-term: k_mod 0.65 (Table 3.1), γ_M 1.3 (Table 2.3), k_def 2.0 (Table 3.2);
    # k_h = 1 for h ≥ 150 mm (3.2) — all from memory
    k_mod, gamma_M, k_def = 0.65, 1.3, 2.0
    f_m_d, f_v_d, f_c90_d = k_mod * 16 / gamma_M, k_mod * 3.2 / gamma_M, k_mod * 2.2 / gamma_M
    sigma_m = M * 1e6 / S
    assert val(r, "sigma_m", "MPa") == pytest.approx(sigma_m, rel=1e-12)
    # 6.3.3: l_ef = 0.9 L + 2h (Table 6.1, uniform load on the compression edge), σ_m,crit (6.32),
    # λ_rel,m (6.30), k_crit = 1.56 − 0.75 λ_rel,m for 0.75 < λ_rel,m ≤ 1.4 (6.34)
    l_ef = 0.9 * L * 1e3 + 2 * h
    sigma_crit = 0.78 * b**2 * 5400 / (h * l_ef)
    lam = (16 / sigma_crit) ** 0.5
    assert 0.75 < lam <= 1.4
    k_crit = 1.56 - 0.75 * lam
    # shear with k_cr = 0.67 (6.1.7(2), A1:2008): τ_d = 1.5 V/(k_cr b h) (6.13)
    tau_d = 1.5 * V * 1e3 / (0.67 * b * h)
    # deflections (2.2.3, 2.3.2.2): u_fin = u_G (1 + k_def) + u_Q (1 + ψ_2 k_def), ψ_2 = 0
    u_g = 5 * w_g * (L * 1e3) ** 4 / (384 * 8000 * I)
    u_q = 5 * w_q * (L * 1e3) ** 4 / (384 * 8000 * I)
    u_inst, u_fin = u_g + u_q, u_g * (1 + k_def) + u_q * (1 + 0.0 * k_def)
    assert val(r, "delta", "mm") == pytest.approx(u_inst, rel=1e-12)
    # bearing at an end support (6.1.5, A1:2008): contact length 50 mm + 30 mm into the span, k_c,90 = 1.5
    # for solid softwood on discrete supports
    sigma_c90 = V * 1e3 / (b * (50 + 30))
    demands = [sigma_m / (k_crit * f_m_d), tau_d / f_v_d, u_inst / (L * 1e3 / 300), u_fin / (L * 1e3 / 200),
               sigma_c90 / (1.5 * f_c90_d)]
    assert [c.ok for c in r.checks] == [d <= 1 for d in demands]
    assert [c.ratio for c in r.checks] == pytest.approx(demands, rel=1e-9)


# ---------------------------------------------------------------- flitch beam (transformed section)


@pytest.fixture(scope="module")
def flitch():
    return run("section_flitch_beam.calc")


def test_flitch_beam_transformed_section(flitch):
    r = flitch
    n = 210 / 11  # modular ratio E_s/E_t (transformed-section method — common practice)
    # (b, h, y_bottom, n): two plies, the plate raised 10 mm, and the bolt holes through each (a hole removes
    # material at the modular ratio of the part it cuts)
    parts = [(75, 300, 0, 1), (12, 280, 10, n), (75, 300, 0, 1),
             (75, 18, 221, -1), (12, 18, 221, -n), (75, 18, 221, -1)]
    A, yc, I = built_up(parts)
    assert field(r, "fb", "A", "mm^2") == pytest.approx(A, rel=1e-12)
    assert field(r, "fb", "y_c", "mm") == pytest.approx(yc, rel=1e-12)
    assert field(r, "fb", "I_x", "mm^4") == pytest.approx(I, rel=1e-12)
    assert field(r, "fb", "S_x_top", "mm^3") == pytest.approx(I / (300 - yc), rel=1e-12)
    Q = first_moment_above(parts, yc)
    assert field(r, "fb", "Q_x", "mm^3") == pytest.approx(Q, rel=1e-9)
    t = 75 + 75 + n * 12  # width at the neutral axis (below the bolt row), plate at n times its width
    assert field(r, "fb", "t_x", "mm") == pytest.approx(t, rel=1e-12)
    # mass: Σ ρ·A over the actual areas, holes negative
    mass = 420 * 2 * (75 * 300 - 75 * 18) * 1e-6 + 7850 * (12 * 280 - 12 * 18) * 1e-6
    assert field(r, "fb", "mass", "kg/m") == pytest.approx(mass, rel=1e-12)

    w, L = 1.35 * 2.1 + 1.5 * 5.6, 4.2
    M = w * L**2 / 8  # kN·m, simply supported (Roark Table 8.1 case 2e — from memory)
    assert val(r, "sigma_t", "MPa") == pytest.approx(M * 1e6 * (300 - yc) / I, rel=1e-12)
    # stress in the steel = n × the transformed-section stress at its level (common practice)
    assert val(r, "sigma_s", "MPa") == pytest.approx(n * M * 1e6 * (290 - yc) / I, rel=1e-12)
    V = w * L / 2
    assert val(r, "tau", "MPa") == pytest.approx(V * 1e3 * Q / (I * t), rel=1e-9)
    delta = 5 * (2.1 + 5.6) * (L * 1e3) ** 4 / (384 * 11000 * I)
    assert val(r, "delta", "mm") == pytest.approx(delta, rel=1e-12)


# ---------------------------------------------------------------- US roof beam (simple span, kip-ft)


@pytest.fixture(scope="module")
def roof():
    return run("us_roof_beam.calc")


def test_us_roof_beam(roof):
    r = roof
    h, b, tf, tw = 16.0, 7.0, 0.5, 0.3  # in
    # doubly symmetric I (no fillets): I = (b·h³ − (b − t_w)(h − 2t_f)³)/12, S = 2I/h (common practice)
    A = 2 * b * tf + (h - 2 * tf) * tw
    I = (b * h**3 - (b - tw) * (h - 2 * tf) ** 3) / 12
    assert field(r, "sec", "A", "in^2") == pytest.approx(A, rel=1e-12)
    assert field(r, "sec", "I_x", "in^4") == pytest.approx(I, rel=1e-12)
    assert field(r, "sec", "S_x", "in^3") == pytest.approx(2 * I / h, rel=1e-12)
    Q = b * tf * (h / 2 - tf / 2) + tw * (h / 2 - tf) ** 2 / 2
    assert field(r, "sec", "Q_x", "in^3") == pytest.approx(Q, rel=1e-12)

    w_D = 18 * 8 / 1000 + 0.035  # kip/ft
    w = w_D + 30 * 8 / 1000
    L = 32.0
    # simple span, uniform load (AISC Manual Table 3-23 case 1 — from memory): M = wL²/8, V = wL/2,
    # δ = 5wL⁴/(384EI), E = 29,000 ksi (AISC 360-16 — from memory)
    M, V = w * L**2 / 8, w * L / 2
    assert field(r, "rb", "M_max", "kip*ft") == pytest.approx(M, rel=1e-9)
    assert field(r, "rb", "V_max", "kip") == pytest.approx(V, rel=1e-9)
    assert field(r, "rb", "R_1", "kip") == pytest.approx(V, rel=1e-9)
    assert field(r, "rb", "R_2", "kip") == pytest.approx(V, rel=1e-9)
    delta = 5 * (w / 12) * (L * 12) ** 4 / (384 * 29000 * I)  # kip/in, in, ksi
    assert field(r, "rb", "delta_gov", "in") == pytest.approx(delta, rel=1e-9)
    assert field(r, "rb", "delta_allow", "in") == pytest.approx(L * 12 / 240, rel=1e-12)
    assert field(r, "st", "sigma_max", "ksi") == pytest.approx(M * 12 * (h / 2) / I, rel=1e-9)
    assert field(r, "st", "tau_max", "ksi") == pytest.approx(V * Q / (I * tw), rel=1e-9)


# ---------------------------------------------------------------- mezzanine: continuous beam and column

WG = 0.85 * 3.0 + 0.55  # kN/m
WQ = 7.5 * 3.0
L1, L2, P, A_P = 6.0, 4.8, 12.0, 1.5  # m, m, kN, m into span 2
COMBOS = {"ULS both": (1.35, 1.5, 1.5), "ULS span 1": (1.35, 1.5, 0.0), "ULS span 2": (1.35, 0.0, 1.5),
          "SLS": (1.0, 1.0, 1.0)}


def two_span(gG, gQ1, gQ2):
    """Support moment and reactions of the two-span beam by the three-moment equation.

    Clapeyron: M_A·L1 + 2·M_B·(L1 + L2) + M_C·L2 = −w1·L1³/4 − w2·L2³/4 − P·b·(L2² − b²)/L2, with M_A = M_C = 0 and
    b the distance from the point load to the far support C (Timoshenko, Strength of Materials Part I,
    continuous beams — from memory). Hogging M_B is negative.
    """
    w1, w2, p = gG * WG + gQ1 * WQ, gG * WG + gQ2 * WQ, gQ2 * P
    b = L2 - A_P
    MB = (-w1 * L1**3 / 4 - w2 * L2**3 / 4 - p * b * (L2**2 - b**2) / L2) / (2 * (L1 + L2))
    RA = w1 * L1 / 2 + MB / L1
    RC = w2 * L2 / 2 + p * A_P / L2 + MB / L2
    RB = w1 * L1 + w2 * L2 + p - RA - RC
    return w1, w2, p, MB, RA, RB, RC


def moment(x, combo):
    w1, w2, p, MB, RA, RB, RC = two_span(*combo)
    M = RA * x + RB * np.clip(x - L1, 0, None) - p * np.clip(x - L1 - A_P, 0, None)
    x1 = np.minimum(x, L1)
    M -= w1 * x1 * (x - x1 / 2)
    x2 = np.clip(x - L1, 0, L2)
    M -= w2 * x2 * (x - L1 - x2 / 2)
    return M


def span_deflection(a, b, combo, EI):
    """Largest deflection between supports at a and b: v'' = −M/EI, v(a) = v(b) = 0 (trapezoid rule, fine grid)."""
    x = np.linspace(a, b, 200_001)
    k = -moment(x, combo) / EI
    h = x[1] - x[0]
    slope = np.concatenate([[0.0], np.cumsum((k[1:] + k[:-1]) / 2) * h])
    v = np.concatenate([[0.0], np.cumsum((slope[1:] + slope[:-1]) / 2) * h])
    v -= (x - a) / (b - a) * v[-1]
    return np.max(np.abs(v))


@pytest.fixture(scope="module")
def mezz():
    return run("member_mezzanine_beam.calc")


# the built-up girder: cover plate 180×10 under a welded I 300×150×10×7 (b, h, y_bottom, n)
GIRDER = [(180, 10, 0, 1), (150, 10, 10, 1), (7, 280, 20, 1), (150, 10, 300, 1)]


def test_mezzanine_built_up_section(mezz):
    A, yc, I = built_up(GIRDER)
    r = mezz
    assert field(r, "sec", "A", "mm^2") == pytest.approx(A, rel=1e-12) == 6760
    assert field(r, "sec", "y_c", "mm") == pytest.approx(yc, rel=1e-12)
    assert field(r, "sec", "I_x", "mm^4") == pytest.approx(I, rel=1e-12)
    Iy = 180**3 * 10 / 12 + 2 * 150**3 * 10 / 12 + 7**3 * 280 / 12
    assert field(r, "sec", "I_y", "mm^4") == pytest.approx(Iy, rel=1e-12)
    assert field(r, "sec", "y_top", "mm") == pytest.approx(310 - yc, rel=1e-12)
    assert field(r, "sec", "Q_x", "mm^3") == pytest.approx(first_moment_above(GIRDER, yc), rel=1e-9)
    assert field(r, "sec", "t_x", "mm") == pytest.approx(7.0, rel=1e-12)
    assert field(r, "sec", "r_y", "mm") == pytest.approx(math.sqrt(Iy / A), rel=1e-12)


def test_mezzanine_beam_reactions_moments_and_shear(mezz):
    r = mezz
    results = {name: two_span(*c) for name, c in COMBOS.items()}
    uls = [v for k, v in results.items() if k != "SLS"]
    for i, idx in ((1, 4), (2, 5), (3, 6)):  # R_i: the largest reaction over the combinations
        assert field(r, "b", f"R_{i}", "kN") == pytest.approx(max(v[idx] for v in results.values()), rel=1e-9)
    assert field(r, "b", "M_min", "kN*m") == pytest.approx(min(v[3] for v in results.values()), rel=1e-9)
    x = np.linspace(0, L1 + L2, 1_080_001)
    sag = max(np.max(moment(x, c)) for c in COMBOS.values())
    assert field(r, "b", "M_max", "kN*m") == pytest.approx(sag, rel=1e-9)
    # the largest shear is just left of B: |R_A − w1·L1| (statics)
    V = max(abs(v[4] - v[0] * L1) for v in uls)
    V = max(V, max(abs(v[6] - v[1] * L2 - v[2]) for v in uls))
    assert field(r, "b", "V_max", "kN") == pytest.approx(V, rel=1e-9)


def test_mezzanine_beam_deflection_and_stresses(mezz):
    r = mezz
    A, yc, I = built_up(GIRDER)
    EI = 210e9 * I * 1e-12 / 1e3  # kN·m²; E = 210 GPa for S355 (EN 1993-1-1 3.2.6 — from memory)
    # characteristic combination with the imposed load patterned span by span (EN 1990 6.5.3(2)a; pattern
    # loading — common practice): the worst sag of span A–B is with Q on that span only
    d1 = max(span_deflection(0.0, L1, c, EI) for c in ((1.0, 1.0, 1.0), (1.0, 1.0, 0.0), (1.0, 0.0, 1.0)))
    assert field(r, "b", "delta_gov", "m") == pytest.approx(d1, rel=1e-6)
    assert field(r, "b", "delta_allow", "mm") == pytest.approx(6000 / 360, rel=1e-12)
    M = max(abs(field(r, "b", "M_min", "kN*m")), field(r, "b", "M_max", "kN*m"))
    assert field(r, "st", "sigma_max", "MPa") == pytest.approx(M * 1e6 * max(310 - yc, yc) / I, rel=1e-9)
    V = field(r, "b", "V_max", "kN")
    Q = first_moment_above(GIRDER, yc)
    assert field(r, "st", "tau_max", "MPa") == pytest.approx(V * 1e3 * Q / (I * 7.0), rel=1e-9)


def test_mezzanine_column_buckling(mezz):
    r = mezz
    h = b = 120.0
    tf, tw = 8.0, 6.0
    A = 2 * b * tf + (h - 2 * tf) * tw
    Ix = (b * h**3 - (b - tw) * (h - 2 * tf) ** 3) / 12
    Iy = 2 * tf * b**3 / 12 + (h - 2 * tf) * tw**3 / 12
    E, Fy = 210e3, 355.0  # S355 (EN 1993-1-1 3.2.6 and Table 3.1 — from memory)
    lam_x = 1.0 * 3100 / math.sqrt(Ix / A)
    lam_y = 1.0 * 1550 / math.sqrt(Iy / A)
    lam = max(lam_x, lam_y)
    assert field(r, "c", "KL_r", "") == pytest.approx(lam, rel=1e-12)
    Cc = math.sqrt(2 * math.pi**2 * E / Fy)
    assert field(r, "c", "C_c", "") == pytest.approx(Cc, rel=1e-12)  # transition slenderness √(2π²E/F_y)
    assert lam < Cc  # inelastic: Johnson's parabola (Shigley §4-14 — from memory)
    assert r.values["c"].fields["range"] == "inelastic (Johnson)"
    assert r.values["c"].fields["axis"] == ("x" if lam_x > lam_y else "y")
    sig = min(Fy - Fy**2 * l**2 / (4 * math.pi**2 * E) for l in (lam_x, lam_y))
    assert field(r, "c", "sigma_cr", "MPa") == pytest.approx(sig, rel=1e-12)
    assert field(r, "c", "P_cr", "kN") == pytest.approx(sig * A / 1e3, rel=1e-12)
    assert field(r, "c", "P_e_y", "kN") == pytest.approx(math.pi**2 * E * Iy / 1550**2 / 1e3, rel=1e-12)
    R2 = max(v[5] for v in (two_span(*c) for c in COMBOS.values()))
    assert val(r, "N_Ed", "kN") == pytest.approx(R2 + 1.35 * 0.35 * 3.1, rel=1e-9)


def test_barn_purlins():
    """sheets/barn_purlins.calc: a list of three spans, sheet functions, and a factor read from the sheet's own
    (invented) table, each value recomputed here with numpy."""
    r = run("barn_purlins.calc")
    s, g_k, q_k = 1.2, 0.35, 0.60                       # m, kPa, kPa (the demo's inputs)
    w = (1.35 * g_k + 1.5 * q_k) * s                    # kN/m, EN 1990 (6.10) partial factors 1.35 / 1.5
    w_s = (g_k + q_k) * s                               # kN/m, characteristic combination
    L = np.array([3.6, 4.2, 4.5])                       # m
    b, h = 75.0, 200.0                                  # mm
    A, W, I = b * h, b * h**2 / 6, b * h**3 / 12        # rectangle: bh, bh²/6, bh³/12 (Roark, Table A.1)
    k_h = np.interp(h, [100, 150, 250], [1.15, 1.08, 1.00])  # linear interpolation in the demo's table
    f_md = k_h * 0.8 * 14 / 1.3                         # MPa, k_h k_mod f_m / γ_M
    M = w * L**2 / 8                                    # kN·m, simply supported, uniform load (common practice)
    V = w * L / 2                                       # kN (common practice)
    sigma = M * 1e6 / W                                 # MPa
    tau = 1.5 * V * 1e3 / A                             # MPa, peak shear of a rectangle 3V/2A (common practice)
    delta = 5 * w_s * (L * 1e3) ** 4 / (384 * 11000 * I)  # mm, 5wL⁴/384EI (common practice)
    assert val(r, "w", "kN/m") == pytest.approx(w)
    assert val(r, "k_h", "") == pytest.approx(k_h) == pytest.approx(1.04)
    assert val(r, "f_md", "MPa") == pytest.approx(f_md)
    np.testing.assert_allclose(val(r, "M", "kN*m"), M, rtol=1e-12)
    np.testing.assert_allclose(val(r, "sigma_m", "MPa"), sigma, rtol=1e-12)
    np.testing.assert_allclose(val(r, "tau", "MPa"), tau, rtol=1e-12)
    np.testing.assert_allclose(val(r, "delta", "mm"), delta, rtol=1e-12)
    bending, shear, deflection, trimmer = r.checks
    assert bending.ok and bending.governing == int(np.argmax(sigma / f_md)) + 1 == 3
    assert bending.ratio == pytest.approx(sigma[2] / f_md)
    assert deflection.ratio == pytest.approx(max(delta / (L * 1e3 / 250)))
    assert shear.ratio == pytest.approx(tau[2] / (0.8 * 2.2 / 1.3))
    assert trimmer.ratio == pytest.approx(w * 2.4**2 / 8 * 1e6 / W / f_md)
