"""beam.stresses on a transformed (two-material) section: per-material stresses with the modular ratio applied.

Oracle: the flexure formula of a composite beam derived from strain compatibility, not from the transformed
section: plane sections stay plane, so ε = κ·(y − ȳ) in both materials, σ_i = E_i·κ·(y − ȳ); the neutral
axis satisfies Σ E_i·A_i·(ȳ_i − ȳ) = 0 and M = κ·Σ E_i·(I_i + A_i·(ȳ_i − ȳ)²). (Gere & Goodno, Mechanics of
Materials, composite beams: σ_x1 = −M·y·E_1/(E_1·I_1 + E_2·I_2) — from memory.) Derived here with sympy.
"""
import pytest
import sympy as sp

import calcsheet

E_t, E_s = 11e3, 210e3  # MPa: timber plies, steel flitch plate
b_t, h_t, t_p, h_p, e_p = 75.0, 300.0, 12.0, 200.0, 20.0  # mm
L, w = 4.0, 10.0  # m, kN/m: simply supported, M = wL²/8


def oracle():
    """Stresses at the outer fibres of each material, from curvature compatibility (sympy, exact)."""
    yb = sp.Symbol("ybar")
    parts = [  # (E, A, centroid y, own I), two plies and the plate
        (E_t, 2 * b_t * h_t, h_t / 2, 2 * b_t * h_t**3 / 12),
        (E_s, t_p * h_p, e_p + h_p / 2, t_p * h_p**3 / 12),
    ]
    ybar = sp.solve(sum(sp.Rational(E) * sp.nsimplify(A) * (sp.nsimplify(y) - yb) for E, A, y, _ in parts), yb)[0]
    EI = sum(sp.nsimplify(E) * (sp.nsimplify(I) + sp.nsimplify(A) * (sp.nsimplify(y) - ybar) ** 2)
             for E, A, y, I in parts)  # N/mm² · mm⁴
    M = sp.nsimplify(w) * sp.nsimplify(L) ** 2 / 8 * 10**6  # kN·m → N·mm
    kappa = M / EI
    sig = {
        "timber_top": E_t * kappa * (h_t - ybar), "timber_bot": E_t * kappa * ybar,
        "steel_top": E_s * kappa * (e_p + h_p - ybar), "steel_bot": E_s * kappa * (ybar - e_p),
    }
    return {k: float(v) for k, v in sig.items()}


SHEET = f"""
E_t = {E_t} MPa
E_s = {E_s} MPa
ply = section.rectangle(b={b_t} mm, h={h_t} mm, detail="brief")
plate = section.rectangle(b={t_p} mm, h={h_p} mm, detail="brief")
left = section.part(shape=ply, x=0 mm, y=0 mm, E=E_t, name="left ply")
mid = section.part(shape=plate, x={b_t} mm, y={e_p} mm, E=E_s, name="flitch plate")
right = section.part(shape=ply, x={b_t + t_p} mm, y=0 mm, E=E_t, name="right ply")
fb = section.built_up(parts=[left, mid, right], E_ref=E_t)
b = beam.solve(spans=[{L} m], supports="pinned, roller", loads=[beam.udl(w={w} kN/m)])
st = beam.stresses(member=b, section=fb)
"""


@pytest.fixture(scope="module")
def run():
    r = calcsheet.run(SHEET)
    assert not r.errors, [d.message for d in r.errors]
    return r


def test_each_material_carries_its_own_stress(run):
    f = run.values["st"].fields
    want = oracle()
    assert f["n_materials"].m_as("") == 2
    assert f["n_1"].m_as("") == pytest.approx(1.0)
    assert f["n_2"].m_as("") == pytest.approx(E_s / E_t, rel=1e-12)
    assert f["sigma_top_1"].m_as("MPa") == pytest.approx(want["timber_top"], rel=1e-6)
    assert f["sigma_bot_1"].m_as("MPa") == pytest.approx(want["timber_bot"], rel=1e-6)
    assert f["sigma_top_2"].m_as("MPa") == pytest.approx(want["steel_top"], rel=1e-6)
    assert f["sigma_bot_2"].m_as("MPa") == pytest.approx(want["steel_bot"], rel=1e-6)
    assert f["sigma_2"].m_as("MPa") == pytest.approx(max(want["steel_top"], want["steel_bot"]), rel=1e-6)
    # the section's own outer fibres are timber
    assert f["sigma_top"].m_as("MPa") == pytest.approx(want["timber_top"], rel=1e-6)
    assert f["sigma_bot"].m_as("MPa") == pytest.approx(want["timber_bot"], rel=1e-6)


def test_the_steel_stress_is_not_the_reference_materials(run):
    """Without n the plate's stress would be read as M·y/I_tr, E_s/E_t ≈ 19 times too small."""
    f = run.values["st"].fields
    y = (e_p + h_p) - run.values["fb"].fields["y_c"].m_as("mm")
    unfactored = f["M"].m_as("N*mm") * y / run.values["fb"].fields["I_x"].m_as("mm^4")
    assert f["sigma_top_2"].m_as("MPa") == pytest.approx(unfactored * E_s / E_t, rel=1e-9)


def test_the_working_shows_the_modular_ratio_in_the_substitution(run):
    from calcsheet.render.text import TextDocument

    text = TextDocument(sigfigs=run.policy.sigfigs).items(run.items)
    line = next(ln for ln in text.splitlines() if ln.strip().startswith("σ_top,2 ="))
    assert line.strip().startswith("σ_top,2 = n_2·M·")
    assert "19.09 · " in line  # n = 210000/11000 = 19.09 substituted
    assert "σ_i = n_i·M·y/I_tr" in text


def test_a_one_material_section_keeps_the_plain_flexure_formula():
    r = calcsheet.run('s = section.rectangle(b=100 mm, h=200 mm, detail="brief")\n'
                      'b = beam.solve(spans=[4 m], supports="pinned, roller", loads=[beam.udl(w=10 kN/m)])\n'
                      "st = beam.stresses(member=b, section=s)\n")
    f = r.values["st"].fields
    assert f["n_materials"].m_as("") == 1 and "n_1" not in f
    # σ = M/(b·h²/6) = 20e6/(100·200²/6) = 30 MPa (rectangle section modulus, any mechanics text)
    assert f["sigma_max"].m_as("MPa") == pytest.approx(30.0, rel=1e-9)


def _n_descriptions(r):
    from calcsheet.trace import Step

    return {s.name: s.description for s in r.values["st"].working.items
            if isinstance(s, Step) and s.name.startswith("n_") and s.name[2:].isdigit()}


def test_each_materials_modular_ratio_names_the_parts_of_that_material(run):
    d = _n_descriptions(run)
    assert "(left ply, right ply)" in d["n_1"], d
    assert "(flitch plate)" in d["n_2"], d


def test_a_material_of_exactly_three_parts_names_all_three_without_an_ellipsis():
    sheet = (f"E_t = {E_t} MPa\nE_s = {E_s} MPa\n"
             f'ply = section.rectangle(b={b_t} mm, h={h_t} mm, detail="brief")\n'
             f'plate = section.rectangle(b={t_p} mm, h={h_p} mm, detail="brief")\n'
             'p1 = section.part(shape=ply, x=0 mm, y=0 mm, E=E_t, name="ply 1")\n'
             f'p2 = section.part(shape=ply, x={b_t} mm, y=0 mm, E=E_t, name="ply 2")\n'
             f'pl = section.part(shape=plate, x={2 * b_t} mm, y={e_p} mm, E=E_s, name="plate")\n'
             f'p3 = section.part(shape=ply, x={2 * b_t + t_p} mm, y=0 mm, E=E_t, name="ply 3")\n'
             "fb = section.built_up(parts=[p1, p2, pl, p3], E_ref=E_t)\n"
             f'b = beam.solve(spans=[{L} m], supports="pinned, roller", loads=[beam.udl(w={w} kN/m)])\n'
             "st = beam.stresses(member=b, section=fb)\n")
    r = calcsheet.run(sheet)
    assert not r.errors, [e.message for e in r.errors]
    d = _n_descriptions(r)
    assert "(ply 1, ply 2, ply 3)" in d["n_1"] and "…" not in d["n_1"], d
