"""HTML math: fractions, radicals, Greek, and every piece of sheet text escaped."""
import textwrap

import calcsheet
from calcsheet.render.page import PackageDocument
from calcsheet.parser import parse_expression
from calcsheet.render.html import HtmlMathPrinter


def html_of(text):
    r = calcsheet.run(textwrap.dedent(text).lstrip())
    return PackageDocument(r).html()


def test_stacked_fraction_superscript_subscript_and_greek():
    h = HtmlMathPrinter().expr(parse_expression("sigma_b*L^n/(8*E_0)"))
    assert '<span class="frac">' in h and '<span class="fd">' in h
    assert "<var>σ</var><sub>b</sub>" in h and "<sup><var>n</var></sup>" in h


def test_a_whole_number_exponent_is_superscript_characters_in_the_text():
    # common practice: m², mm⁴, 10⁻³ are typeset with the superscript digits; only other exponents are raised
    p = HtmlMathPrinter()
    assert p.expr(parse_expression("L^2/8")).count("<sup>") == 0 and "<var>L</var>²" in p.expr(
        parse_expression("L^2/8"))
    assert str(p.expr(parse_expression("h^-1"))) == "<var>h</var>⁻¹"
    assert str(p.expr(parse_expression("2.5e-3 m"))) == "2.5×10⁻³&#8239;m"
    assert "kN/m²" in p.expr(parse_expression("3 kN/m^2"))
    assert str(p.expr(parse_expression("x^0.5"))) == "<var>x</var><sup>0.5</sup>"


def test_radical_has_a_bar():
    h = HtmlMathPrinter().expr(parse_expression("sqrt(a + b)"))
    assert '<span class="radicand">' in h


def test_symbols_link_to_their_definitions():
    h = html_of("L = 2 m\nx = 2*L\n")
    assert 'id="v-L"' in h and 'href="#v-L"' in h


def test_a_conditional_is_a_brace_with_its_cases():
    h = HtmlMathPrinter().expr(parse_expression("if(h <= 150 mm, 1, 2)"))
    assert '<span class="cases">' in h and h.count('<span class="row">') == 2 and "otherwise" in h


def test_a_formula_is_mostly_text_with_elements_only_for_structure():
    # numbers, units, operators and brackets are characters; symbols, sub/superscripts and fractions are elements
    h = str(HtmlMathPrinter().expr(parse_expression("(w_d + 1.5 kN/m)*L^2/8")))
    tags = __import__("re").findall(r"<([a-z]+)", h)
    assert sorted(set(tags)) == ["span", "sub", "var"]  # L² : the square is a character
    # the fraction (its box, numerator and denominator), and a unit with "/" held as one word (no line ends "kN/")
    assert h.count("<span") == 4
    assert '1.5&#8239;<span class="nb">kN/m</span>' in h  # a number and its unit never part


def test_sheet_text_reaching_a_hook_is_escaped_once():
    p = HtmlMathPrinter()
    assert p.m_string('<b> & "q"') == "“&lt;b&gt; &amp; &quot;q&quot;”"
    assert p.m_call("ns.<x>", ["1"], plugin=True) == '<span class="plugin">ns.&lt;x&gt;</span>(1)'
    inner = p.m_string("a<b")
    assert p.m_paren(inner) == "(“a&lt;b”)"  # markup from a hook is kept, not escaped again


def test_a_long_call_can_wrap_only_at_its_argument_boundaries():
    h = str(HtmlMathPrinter().expr(parse_expression(
        'beam.solve(spans=[6.0 m, 4.8 m], supports="pinned, pinned, roller", limit=360)')))
    text = __import__("re").sub(r"<[^>]+>", "", h)
    # the only ordinary spaces (where a line may break) follow a comma; "=" and units are held by no-break spaces
    assert all(piece.endswith(",") for piece in text.split(" ")[:-1])
    assert "spans&#8239;=&#8239;[6.0&#8239;m, 4.8&#8239;m]" in text
