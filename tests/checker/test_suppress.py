"""Inline suppression: '// allow <code>: <reason>' silences one warning on one statement, visibly."""
from __future__ import annotations

import calcsheet
from calcsheet.suppress import known_codes, parse_allows
from calcsheet.parser import parse_sheet

SOIL = (
    "E_s = 45 MPa    // allow implausible-value: soil modulus from the site investigation\n"
    "B = 2 m\n"
    "k [MPa/m] = E_s/B\n"
    "check k <= 30 MPa/m\n"
)


def active(result):
    return [d for d in result.diagnostics if not d.suppressed]


def test_an_allowed_warning_is_kept_with_its_reason_but_not_active():
    r = calcsheet.run(SOIL)
    assert active(r) == []
    (d,) = [d for d in r.diagnostics if d.suppressed]
    assert d.code == "implausible-value" and d.suppressed == "soil modulus from the site investigation"


def test_the_reason_is_printed_in_the_package_inputs_list():
    from calcsheet.render.page import PackageDocument

    html = PackageDocument(calcsheet.run(SOIL)).inputs_list()
    assert "implausible-value" in html and "soil modulus from the site investigation" in html


def test_an_allow_covers_only_its_own_statement():
    r = calcsheet.run("E_1 = 45 MPa  // allow implausible-value: soil\nE_2 = 45 MPa\nx = E_1 + E_2\n"
                      "check x <= 1 GPa\n", evaluate=False)
    assert [(d.span.line, d.code) for d in active(r)] == [(2, "implausible-value")]


def test_an_allow_on_a_continued_statement_covers_all_its_lines():
    text = ("s = section.part(shape=section.rectangle(b=10 mm, h=10 mm),\n"
            "    E=45 MPa)  // allow implausible-value: rubber pad\n"
            "g = section.built_up(parts=[s])\nA = g.A\ncheck A <= 1 m^2\n")
    assert active(calcsheet.run(text, evaluate=False)) == []


def test_several_codes_and_clauses_in_one_comment():
    text = ("E_s = 45 MPa  // allow implausible-value, unused-input: soil layer kept for the record\n"
            "E_c = 3 MPa  // allow implausible-value: grout; allow unused-input: shown for reference\n")
    r = calcsheet.run(text, evaluate=False)
    assert active(r) == [] and len([d for d in r.diagnostics if d.suppressed]) == 4


def test_errors_cannot_be_allowed():
    r = calcsheet.run("M = 5 kN*m\ns [MPa] = M  // allow declared-unit-mismatch: trust me\n", evaluate=False)
    assert [d.code for d in active(r)] == ["declared-unit-mismatch", "bad-suppression"]


def test_a_reason_is_required_and_codes_are_checked():
    sheet, _ = parse_sheet("a = 1 m  // allow unused-input\nb = 1 m  // allow unused-inputs: x\n")
    allows, diags = parse_allows(sheet, "s.calc")
    assert allows == [] and [d.code for d in diags] == ["bad-suppression", "bad-suppression"]
    assert "did you mean 'unused-input'" in diags[1].hint


def test_an_allow_that_allows_nothing_is_reported():
    r = calcsheet.run("a = 1 m  // allow unit-slip: nothing slips here\ncheck a <= 2 m\n", evaluate=False)
    assert [d.code for d in active(r)] == ["unused-suppression"]


def test_allowing_an_evaluation_warning_is_not_unused_in_a_check_only_run():
    r = calcsheet.run('m = material.steel(grade="S355")  // allow plugin-warning: values checked by hand\n'
                      "f = m.f_y\ncheck f <= 400 MPa\n", evaluate=False)
    assert active(r) == []


def test_an_ordinary_comment_mentioning_allow_is_not_a_suppression():
    r = calcsheet.run("a = 1 m  // we allow for a 10 mm tolerance here\ncheck a <= 2 m\n", evaluate=False)
    assert active(r) == []


def test_known_codes_cover_every_documented_code():
    from pathlib import Path
    import re

    doc = (Path(__file__).parents[2] / "docs" / "diagnostics.md").read_text(encoding="utf-8")
    documented = set(re.findall(r"^## `([a-z0-9-]+)`", doc, re.M))
    assert documented == known_codes()


def test_a_check_can_carry_an_allow_too():
    r = calcsheet.run("W = 22 kN\ncheck W <= 0 kN  // allow no-utilisation: uplift must be zero; shown NG on purpose\n",
                      evaluate=False)
    assert active(r) == [] and [d.code for d in r.diagnostics if d.suppressed] == ["no-utilisation"]
