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
