"""Syntax errors: located at the mistake, worded for an engineer, with a hint."""
import pytest

from calcsheet.parser import parse_sheet


def body(text):
    sheet, diags = parse_sheet(text)
    assert diags == [], [d.message for d in diags]
    return sheet.body


def diags_of(text):
    return parse_sheet(text)[1]


@pytest.mark.parametrize("text, line, col, fragment", [
    ("Deck boards span between stringers\n", 1, 6, "not a calculation"),
    ("x = 3 +\n", 1, 7, "ends too early"),
    ("x = (1 + 2\ny = 2\n", 1, 10, "not closed"),
    ("check a = b\n", 1, 9, "compares with"),
    ("x = 3 m m\n", 1, 9, "operator is missing"),
    ("x = 2 $ 3\n", 1, 7, "unexpected character"),
    ("#Loads\n", 1, 1, "space after"),
])
def test_syntax_errors_point_at_the_mistake(text, line, col, fragment):
    d = diags_of(text)
    assert d, "expected an error"
    assert (d[0].span.line, d[0].span.col) == (line, col)
    assert fragment in d[0].message
    assert d[0].code in ("syntax", "front-matter")


def test_a_syntax_error_deep_in_a_sheet_points_at_its_own_line():
    d = diags_of("x = 1\n" * 40 + "y = (2 +\n  3 3)\n")
    assert d and (d[0].span.line, d[0].span.col) == (42, 5)
