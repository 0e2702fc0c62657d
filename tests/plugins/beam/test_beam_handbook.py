"""The solver against published beam formulas, case by case.

Sources: AISC Steel Construction Manual, 15th ed., Table 3-23 "Shears, Moments
and Deflections" (case numbers from memory), and Roark's Formulas for Stress
and Strain, 7th ed., Table 8.1 (from memory). Each check names its formula.
"""
import math

import pytest

from calcsheet_plugins.beam.solver import LineLoad, Model, MomentLoad, PointLoad, extremes, solve

EI = 2.1e11 * 8.0e-5  # steel E = 210 GPa, I = 8000 cm^4, N*m^2
rel = dict(rel=1e-9)


def ss(L):
    return Model([L], ["pinned", "roller"], [EI])


def test_simply_supported_udl():
    L, w = 6.0, 12e3
    s = solve(ss(L), [LineLoad(0, L, w, w)])
    assert s.reactions[0] == pytest.approx(w * L / 2, **rel)  # AISC T3-23 case 1: R = wL/2
    Mmax, _ = extremes(s, "M")
    assert Mmax.value == pytest.approx(w * L**2 / 8, **rel)  # case 1: M_max = wL^2/8 at centre
    assert Mmax.x == pytest.approx(L / 2, **rel)
    dmax, _ = extremes(s, "delta")
    assert dmax.value == pytest.approx(5 * w * L**4 / (384 * EI), **rel)  # case 1: 5wL^4/384EI
    assert s.at("theta", 0.0)[0] == pytest.approx(w * L**3 / (24 * EI), **rel)  # Roark 8.1: θ_A = wL^3/24EI


def test_simply_supported_central_point_load():
    L, P = 5.0, 40e3
    s = solve(ss(L), [PointLoad(L / 2, P)])
    assert s.reactions == pytest.approx([P / 2, P / 2], **rel)  # AISC T3-23 case 7: R = P/2
    Mmax, _ = extremes(s, "M")
    assert Mmax.value == pytest.approx(P * L / 4, **rel)  # case 7: M = PL/4
    dmax, _ = extremes(s, "delta")
    assert dmax.value == pytest.approx(P * L**3 / (48 * EI), **rel)  # case 7: PL^3/48EI


def test_simply_supported_off_centre_point_load():
    L, P, a = 8.0, 25e3, 5.0
    b = L - a
    s = solve(ss(L), [PointLoad(a, P)])
    assert s.reactions == pytest.approx([P * b / L, P * a / L], **rel)  # AISC T3-23 case 8: R1 = Pb/L, R2 = Pa/L
    Mmax, _ = extremes(s, "M")
    assert Mmax.value == pytest.approx(P * a * b / L, **rel)  # case 8: M = Pab/L at the load
    assert Mmax.x == pytest.approx(a, **rel)
    assert s.at("delta", a)[0] == pytest.approx(P * a**2 * b**2 / (3 * EI * L), **rel)  # case 8: Pa^2b^2/3EIL
    dmax, _ = extremes(s, "delta")
    x_dmax = math.sqrt(a * (a + 2 * b) / 3)  # case 8 (a > b): at x = sqrt(a(a+2b)/3)
    assert dmax.x == pytest.approx(x_dmax, rel=1e-7)
    assert dmax.value == pytest.approx(P * a * b * (a + 2 * b) * math.sqrt(3 * a * (a + 2 * b)) / (27 * EI * L), **rel)


def test_simply_supported_end_moment():
    L, M0 = 6.0, 30e3
    s = solve(ss(L), [MomentLoad(0.0, M0)])
    assert abs(s.reactions[0]) == pytest.approx(M0 / L, **rel)  # Roark 8.1 end couple: R = M0/L
    assert s.reactions.sum() == pytest.approx(0.0, abs=1e-6)
    assert s.at("M", 0.0)[0] == pytest.approx(M0, **rel)  # the couple itself at the loaded end
    assert abs(s.at("theta", 0.0)[0]) == pytest.approx(M0 * L / (3 * EI), **rel)  # θ_A = M0 L/3EI
    assert abs(s.at("theta", L)[0]) == pytest.approx(M0 * L / (6 * EI), **rel)  # θ_B = M0 L/6EI
    dmax, _ = extremes(s, "delta")
    assert dmax.value == pytest.approx(M0 * L**2 / (9 * math.sqrt(3) * EI), **rel)  # δ_max = M0L^2/(9√3 EI)
    assert dmax.x == pytest.approx(L * (1 - 1 / math.sqrt(3)), rel=1e-7)  # at L(1 - 1/√3) from the couple


def test_cantilever_end_load():
    L, P = 3.0, 10e3
    s = solve(Model([L], ["fixed", "free"], [EI]), [PointLoad(L, P)])
    assert s.reactions[0] == pytest.approx(P, **rel)  # AISC T3-23 case 22: R = P
    _, Mmin = extremes(s, "M")
    assert Mmin.value == pytest.approx(-P * L, **rel)  # case 22: M_max = PL at the fixed end (hogging)
    assert Mmin.x == pytest.approx(0.0, abs=1e-12)
    assert s.at("delta", L, side="left")[0] == pytest.approx(P * L**3 / (3 * EI), **rel)  # PL^3/3EI
    assert s.at("theta", L, side="left")[0] == pytest.approx(P * L**2 / (2 * EI), **rel)  # PL^2/2EI


def test_cantilever_udl():
    L, w = 2.5, 8e3
    s = solve(Model([L], ["free", "fixed"], [EI]), [LineLoad(0, L, w, w)])
    assert s.reactions[1] == pytest.approx(w * L, **rel)  # AISC T3-23 case 18: R = wL
    _, Mmin = extremes(s, "M")
    assert Mmin.value == pytest.approx(-w * L**2 / 2, **rel)  # case 18: M = wL^2/2
    assert s.at("delta", 0.0)[0] == pytest.approx(w * L**4 / (8 * EI), **rel)  # case 18: wL^4/8EI


def test_fixed_fixed_udl():
    L, w = 7.0, 15e3
    s = solve(Model([L], ["fixed", "fixed"], [EI]), [LineLoad(0, L, w, w)])
    assert s.reactions == pytest.approx([w * L / 2] * 2, **rel)  # AISC T3-23 case 15: R = wL/2
    assert s.at("M", 0.0)[0] == pytest.approx(-w * L**2 / 12, **rel)  # case 15: M_end = wL^2/12
    assert s.at("M", L / 2)[0] == pytest.approx(w * L**2 / 24, **rel)  # case 15: M_centre = wL^2/24
    dmax, _ = extremes(s, "delta")
    assert dmax.value == pytest.approx(w * L**4 / (384 * EI), **rel)  # case 15: wL^4/384EI


def test_propped_cantilever_udl():
    L, w = 6.0, 10e3
    s = solve(Model([L], ["roller", "fixed"], [EI]), [LineLoad(0, L, w, w)])
    assert s.reactions[0] == pytest.approx(3 * w * L / 8, **rel)  # AISC T3-23 case 12: R1 = 3wL/8
    assert s.reactions[1] == pytest.approx(5 * w * L / 8, **rel)  # case 12: R2 = 5wL/8
    Mpos, Mneg = extremes(s, "M")
    assert Mneg.value == pytest.approx(-w * L**2 / 8, **rel)  # case 12: M at fixed end = wL^2/8
    assert Mpos.value == pytest.approx(9 * w * L**2 / 128, **rel)  # case 12: M+ = 9wL^2/128
    assert Mpos.x == pytest.approx(3 * L / 8, **rel)  # ... at 3L/8 from the simple support
    dmax, _ = extremes(s, "delta")
    assert dmax.value == pytest.approx(w * L**4 / (185 * EI), rel=3e-3)  # case 12: wL^4/185EI (rounded)
    assert dmax.x == pytest.approx(0.4215 * L, rel=1e-3)  # ... at 0.4215L


def test_two_equal_spans_udl():
    L, w = 5.0, 20e3
    s = solve(Model([L, L], ["pinned", "roller", "roller"], [EI, EI]), [LineLoad(0, 2 * L, w, w)])
    # AISC T3-23 case 29 (two equal spans, uniform load on both)
    assert s.reactions[0] == pytest.approx(0.375 * w * L, **rel)  # R1 = 3wL/8
    assert s.reactions[1] == pytest.approx(1.25 * w * L, **rel)  # R2 = 10wL/8
    Mpos, Mneg = extremes(s, "M")
    assert Mneg.value == pytest.approx(-w * L**2 / 8, **rel)  # M over centre support = wL^2/8
    assert Mneg.x == pytest.approx(L, **rel)
    assert Mpos.value == pytest.approx(9 * w * L**2 / 128, **rel)  # M+ = 9wL^2/128 at 3L/8
    dmax, _ = extremes(s, "delta")
    assert dmax.value == pytest.approx(w * L**4 / (185 * EI), rel=3e-3)  # wL^4/185EI at 0.4215L


def test_overhang_with_end_load():
    L, a, P = 6.0, 2.0, 12e3
    s = solve(Model([L, a], ["pinned", "roller", "free"], [EI, EI]), [PointLoad(L + a, P)])
    # AISC T3-23 case 26 (beam overhanging one support, load at end of overhang)
    assert s.reactions[0] == pytest.approx(-P * a / L, **rel)  # R1 = Pa/L (downward)
    assert s.reactions[1] == pytest.approx(P * (L + a) / L, **rel)  # R2 = P(L+a)/L
    _, Mneg = extremes(s, "M")
    assert Mneg.value == pytest.approx(-P * a, **rel)  # M_max = Pa at R2
    assert Mneg.x == pytest.approx(L, **rel)
    assert s.at("delta", L + a, side="left")[0] == pytest.approx(P * a**2 * (L + a) / (3 * EI), **rel)  # tip
    _, dup = extremes(s, "delta", spans=[0])
    assert -dup.value == pytest.approx(P * a * L**2 / (9 * math.sqrt(3) * EI), **rel)  # upward Pal^2/(9√3 EI)
    assert dup.x == pytest.approx(L / math.sqrt(3), rel=1e-7)  # at l/√3 from R1


def test_us_units_simply_supported_udl():
    """Same formulas with US customary inputs, converted through the one registry."""
    from calcsheet.units import Quantity as Q

    w, L, E, I = Q(1.2, "kip/ft"), Q(24, "ft"), Q(29000, "ksi"), Q(510, "in**4")
    EIs = (E * I).m_as("N*m**2")
    s = solve(Model([L.m_as("m")], ["pinned", "roller"], [EIs]), [LineLoad(0, L.m_as("m"), w.m_as("N/m"), w.m_as("N/m"))])
    Mmax, _ = extremes(s, "M")
    dmax, _ = extremes(s, "delta")
    assert Q(Mmax.value, "N*m").m_as("kip*ft") == pytest.approx(1.2 * 24**2 / 8, **rel)  # wL^2/8 = 86.4 kip*ft
    expected_in = 5 * 1.2 / 12 * (24 * 12) ** 4 / (384 * 29000 * 510)  # 5wL^4/384EI in kip, in
    assert Q(dmax.value, "m").m_as("in") == pytest.approx(expected_in, **rel)
    assert Q(s.reactions[0], "N").m_as("kip") == pytest.approx(1.2 * 24 / 2, **rel)  # wL/2 = 14.4 kip


def test_triangular_load_simply_supported():
    L, w = 6.0, 9e3  # zero at the left, w at the right
    s = solve(ss(L), [LineLoad(0, L, 0.0, w)])
    # AISC T3-23 case 2 (load increasing uniformly to one end): R1 = W/3, R2 = 2W/3, W = wL/2
    W = w * L / 2
    assert s.reactions == pytest.approx([W / 3, 2 * W / 3], **rel)
    Mmax, _ = extremes(s, "M")
    assert Mmax.value == pytest.approx(2 * W * L / (9 * math.sqrt(3)), **rel)  # M = 2WL/(9√3)
    assert Mmax.x == pytest.approx(L / math.sqrt(3), **rel)  # at x = L/√3
    dmax, _ = extremes(s, "delta")
    assert dmax.value == pytest.approx(0.01304 * W * L**3 / EI, rel=1e-3)  # 0.01304 WL^3/EI
    assert dmax.x == pytest.approx(L * math.sqrt(1 - math.sqrt(8 / 15)), rel=1e-7)  # x = L√(1-√(8/15))


def test_fixed_guided_end_load():
    # Roark's Formulas, Table 8.1 (from memory): fixed at one end, guided (no rotation, free to slide) at the
    # other, load P at the guided end: δ = PL³/(12EI), M = PL/2 at both ends (opposite signs)
    L, P = 4.0, 9e3
    s = solve(Model([L], ["fixed", "guided"], [EI]), [PointLoad(L, P)])
    assert s.reactions[0] == pytest.approx(P, **rel)
    assert s.at("delta", L, side="left")[0] == pytest.approx(P * L**3 / (12 * EI), **rel)
    assert s.at("M", 0.0)[0] == pytest.approx(-P * L / 2, **rel)
    assert s.at("M", L, side="left")[0] == pytest.approx(P * L / 2, **rel)


def test_partial_udl_simply_supported():
    # AISC T3-23 case 4 (uniform load partially distributed, from memory): load w over length b starting at a:
    # R1 = wb(2c + b)/(2L), with c the distance from its end to the right support; M_max = R1(a + R1/(2w))
    L, w, a, b = 10.0, 6e3, 2.0, 5.0
    c = L - a - b
    s = solve(ss(L), [LineLoad(a, a + b, w, w)])
    R1 = w * b * (2 * c + b) / (2 * L)
    assert s.reactions[0] == pytest.approx(R1, **rel)
    Mmax, _ = extremes(s, "M")
    assert Mmax.value == pytest.approx(R1 * (a + R1 / (2 * w)), **rel)
    assert Mmax.x == pytest.approx(a + R1 / w, **rel)  # where the shear is zero


def test_extreme_moment_labels_say_when_there_is_no_sagging_or_hogging():
    import calcsheet

    # a cantilever under a downward end load hogs everywhere (AISC T3-23 case 22); a simple span sags
    r = calcsheet.run('c = beam.solve(spans=[3 m], supports="fixed, free", loads=[beam.point(P=10 kN, x=3 m)], '
                      'E=200 GPa, I=1e8 mm^4)\n')
    assert r.ok, r.format_diagnostics()
    descs = {s.name: s.description for s in r.steps["c"].working.items if hasattr(s, "name")}
    assert descs["M_max"].startswith("no sagging moment anywhere")
    assert descs["M_min"].startswith("largest hogging moment")
