"""The factor text of a combination, as a specification: optional sign, optional number, optional '*', a case
name, terms joined by + or -; anything else is refused with a reason."""
import pytest

from calcsheet_plugins.beam.combos import CASE_NAME, parse_factors


@pytest.mark.parametrize("text, factors", [
    ("1.2 D + 1.6 L", {"D": 1.2, "L": 1.6}),
    ("D + L", {"D": 1.0, "L": 1.0}),
    ("D", {"D": 1.0}),
    ("  0.9 D - 1.0 W1  ", {"D": 0.9, "W1": -1.0}),
    ("-D + 2*L", {"D": -1.0, "L": 2.0}),
    ("+1.2*D+1.6*L", {"D": 1.2, "L": 1.6}),
    ("1.2D+.5 S", {"D": 1.2, "S": 0.5}),
    ("1e0 D + 1.5E-1 L", {"D": 1.0, "L": 0.15}),
    ("1.35 G - 0 Q", {"G": 1.35, "Q": -0.0}),
])
def test_factor_text_is_read_term_by_term(text, factors):
    got = parse_factors(text)
    assert got == factors and list(got) == list(factors)


@pytest.mark.parametrize("text, reason", [
    ("", "no factors given"),
    ("   ", "no factors given"),
    ("1.2 D 1.6 L", "expected + or - before 'L'"),
    ("1.2 D + 1.6 D", "case 'D' appears twice"),
    ("1.2 D + ", "cannot read the factors at '+ '"),
    ("1.2 + D", "cannot read the factors at '1.2 + D'"),
    ("D + 2 L)", "cannot read the factors at ')'"),
    ("1.2 D + L" + " " * 492, "too long"),
])
def test_anything_else_is_refused_with_a_reason(text, reason):
    with pytest.raises(ValueError) as exc:
        parse_factors(text)
    assert reason in str(exc.value)


def test_the_length_cap_is_500_characters():
    ok = "D + L" + " " * 495
    assert len(ok) == 500 and parse_factors(ok) == {"D": 1.0, "L": 1.0}
    with pytest.raises(ValueError, match="too long"):
        parse_factors(ok + " ")


@pytest.mark.parametrize("name, ok", [("D", True), ("W1", True), ("Lr", True), ("1L", False), ("L-1", False),
                                      ("L_r", False), ("", False), ("D ", False)])
def test_a_case_name_is_a_letter_then_letters_or_digits(name, ok):
    assert bool(CASE_NAME.match(name)) is ok
