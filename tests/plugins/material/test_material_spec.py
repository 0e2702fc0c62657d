"""material as a specification: the ranges the concrete rules accept, and custom materials' limits."""
import pytest

import calcsheet


def make(call):
    return calcsheet.run(f"m = {call}\n")


@pytest.mark.parametrize("f_c", ["12 MPa", "30 MPa", "50 MPa", "90 MPa"])
def test_concrete_inside_the_classes_of_en_1992_is_accepted(f_c):
    # EN 1992-1-1 Table 3.1 covers C12/15 … C90/105 (from memory)
    assert make(f"material.concrete(f_c={f_c})").ok


@pytest.mark.parametrize("f_c", ["5 MPa", "150 MPa", "0 MPa", "-30 MPa"])
def test_concrete_far_outside_the_rules_is_refused(f_c):
    r = make(f"material.concrete(f_c={f_c})")
    assert not r.ok and "f_c" in r.errors[0].message


# EN 1992-1-1 Table 3.1 runs from C12/15 to C90/105 (from memory), as the refusal message says
@pytest.mark.parametrize("f_c", ["10 MPa", "100 MPa"])
def test_concrete_outside_the_range_the_message_states_is_refused(f_c):
    assert not make(f"material.concrete(f_c={f_c})").ok


def test_a_strength_above_c50_warns_that_the_tensile_formula_changes():
    # f_ctm = 0.30·f_ck^(2/3) only up to C50/60 (EN 1992-1-1 Table 3.1 — from memory)
    warn = [d for d in make("material.concrete(f_c=60 MPa)").diagnostics if d.severity == "warning"]
    assert any("C50/60" in d.message for d in warn)
    at_50 = [d for d in make("material.concrete(f_c=50 MPa)").diagnostics if d.severity == "warning"]
    assert not any("C50/60" in d.message for d in at_50)


@pytest.mark.parametrize("nu, ok", [("0.3", True), ("0.49", True), ("-0.5", True), ("0.5", False), ("-1", False),
                                    ("0.6", False)])
def test_poissons_ratio_must_lie_strictly_between_minus_one_and_a_half(nu, ok):
    # isotropic elasticity needs −1 < ν < 0.5 for positive bulk and shear moduli (common practice)
    assert make(f'material.custom(name="x", E=200 GPa, f_y=300 MPa, nu={nu})').ok is ok


@pytest.mark.parametrize("nu", ["-1", "-1.5", "0.5"])
def test_an_impossible_poissons_ratio_is_refused_even_when_G_is_given(nu):
    r = make(f'material.custom(name="x", E=200 GPa, f_y=300 MPa, G=80 GPa, nu={nu})')
    assert not r.ok and "Poisson" in r.errors[0].message


@pytest.mark.parametrize("arg", ["E=0 GPa, f_y=300 MPa", "E=200 GPa, f_y=0 MPa", "E=-1 GPa, f_y=300 MPa"])
def test_custom_material_needs_positive_stiffness_and_strength(arg):
    assert not make(f'material.custom(name="x", {arg})').ok


def test_a_small_but_positive_modulus_written_in_large_units_is_accepted():
    m = make('material.custom(name="foam", E=0.05 GPa, f_y=0.5 MPa)')
    assert m.ok, m.format_diagnostics()
    # G = E/(2(1+ν)) with the default ν = 0.3 (isotropic elasticity — common practice)
    assert m.values["m"].fields["G"].m_as("MPa") == pytest.approx(50 / 2.6, rel=1e-12)
    G_step = next(i for i in m.values["m"].working.items if getattr(i, "name", None) == "G")
    assert str(G_step.display_unit) == "GPa"  # shown in GPa like every modulus, however small


def test_aci_rule_gives_4700_root_fc():
    # ACI 318-19 19.2.1.3: E_c = 4700·√f'c MPa, normal weight (from memory); f_r = 0.62·√f'c (19.2.3.1)
    m = make('material.concrete(f_c=28 MPa, rule="ACI 318")').values["m"].fields
    assert m["E"].m_as("MPa") == pytest.approx(4700 * 28**0.5, rel=1e-12)
    assert m["f_u"].m_as("MPa") == pytest.approx(0.62 * 28**0.5, rel=1e-12)


def test_the_c50_warning_starts_just_above_50_mpa():
    warn = [d for d in make("material.concrete(f_c=51 MPa)").diagnostics if d.severity == "warning"]
    assert any("C50/60" in d.message for d in warn)
