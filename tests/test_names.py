"""Name helpers: dotted names, literal stripping and suggestions, used by every stage."""
from calcsheet.names import did_you_mean, dotted, operand, strip_sign, unit_literal, unparen
from calcsheet.parser import parse_expression as E


def test_dotted_names_of_symbols_and_fields():
    assert dotted(E("L")) == "L"
    assert dotted(E("sec.S_x")) == "sec.S_x"
    assert dotted(E("2*L")) is None


def test_operands_are_named_as_written():
    assert operand(E("((sec.A))")) == "sec.A"
    assert operand(E("150 mm")) == "150 mm"
    assert operand(E("a + b"), "the sum") == "the sum"


def test_literals_under_brackets_and_signs():
    assert unit_literal(E("(150 mm)")).unit_text == "mm"
    assert unit_literal(E("2")) is None
    assert strip_sign(E("-(2 kN)")).text == "2"
    assert unparen(E("((a))")) == E("(a)")


def test_suggestions():
    assert did_you_mean("lenght", ["length", "width"]) == "did you mean 'length'?"
    assert did_you_mean("xyz", ["length"]) is None
    assert did_you_mean("rectangel", ["rectangle"], prefix="section.") == "did you mean 'section.rectangle'?"
