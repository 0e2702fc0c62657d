"""material.concrete at the edges of what its rules cover: each edge itself in, the smallest step past it out.

EN 1992-1-1 Table 3.1 lists strength classes C12/15 to C90/105 (from memory), and its tensile strength
f_ctm = 0.30·f_ck^(2/3) holds up to C50/60 (from memory); the plugin's refusal message and warning say so.
"""
import pytest

import calcsheet


def concrete(f_c):
    return calcsheet.run(f"m = material.concrete(f_c={f_c})\n")


@pytest.mark.parametrize("f_c, accepted", [
    ("11.9 MPa", False), ("12 MPa", True), ("12.1 MPa", True),
    ("89.9 MPa", True), ("90 MPa", True), ("90.1 MPa", False),
])
def test_the_classes_of_en_1992_are_accepted_up_to_their_edges_and_no_further(f_c, accepted):
    r = concrete(f_c)
    assert r.ok is accepted, r.diagnostics
    if not accepted:
        (err,) = r.errors
        assert err.code == "plugin-input" and "outside the range the rules cover (12–90 MPa)" in err.message


@pytest.mark.parametrize("f_c, warns", [("50 MPa", False), ("50.1 MPa", True), ("51 MPa", True)])
def test_the_tensile_formula_warning_starts_just_above_c50(f_c, warns):
    r = concrete(f_c)
    assert r.ok, r.diagnostics
    assert any("C50/60" in d.message for d in r.diagnostics if d.severity == "warning") is warns


# EN 10025-2 Table 7 (as tabulated in readle.co.uk's "Steel Grades to Eurocodes"): S355, minimum yield strength
# for nominal thickness ≤ 16, > 16 ≤ 40, …, > 100 ≤ 150 mm: 355, 345, 335, 325, 315, 295 MPa; tensile strength
# for < 3, ≥ 3 ≤ 100, > 100 ≤ 150 mm: 510, 470, 450 MPa (the lower bound of each range)
S355 = [  # t (mm), f_y, f_u, the band its yield strength is read in
    ("0.5 mm", 355, 510, "0 < t ≤ 16"),
    ("2.9 mm", 355, 510, "0 < t ≤ 16"),
    ("3 mm", 355, 470, "0 < t ≤ 16"),
    ("16 mm", 355, 470, "0 < t ≤ 16"),
    ("16.5 mm", 345, 470, "16 < t ≤ 40"),
    ("40 mm", 345, 470, "16 < t ≤ 40"),
    ("100 mm", 315, 470, "80 < t ≤ 100"),
    ("100.5 mm", 295, 450, "100 < t ≤ 150"),
    ("150 mm", 295, 450, "100 < t ≤ 150"),
]


def steel(t):
    return calcsheet.run(f'm = material.steel(grade="S355", t={t})\n')


@pytest.mark.parametrize("t, f_y, f_u, band", S355)
def test_steel_strengths_follow_the_thickness_bands_of_en_10025_2_to_their_edges(t, f_y, f_u, band):
    r = steel(t)
    assert r.ok, r.diagnostics
    m = r.values["m"]
    assert (m.fields["f_y"].m_as("MPa"), m.fields["f_u"].m_as("MPa")) == (f_y, f_u)
    (step,) = [s for s in m.working.items if getattr(s, "name", None) == "f_y"]
    assert f"for {band} mm" in step.description


@pytest.mark.parametrize("t, words", [("0 mm", "t must be greater than zero"), ("-2 mm", "greater than zero"),
                                      ("150.5 mm", "thicker than the last band"), ("200 mm", "(150 mm)")])
def test_a_thickness_outside_the_bands_is_refused(t, words):
    (err,) = steel(t).errors
    assert words in err.message
