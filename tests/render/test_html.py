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
    h = HtmlMathPrinter().expr(parse_expression("sigma_b*L^2/(8*E_0)"))
    assert '<span class="frac">' in h and '<span class="fd">' in h
    assert "<var>σ</var><sub>b</sub>" in h and "<sup>" in h


def test_radical_has_a_bar():
    h = HtmlMathPrinter().expr(parse_expression("sqrt(a + b)"))
    assert '<span class="radicand">' in h


def test_symbols_link_to_their_definitions():
    h = html_of("L = 2 m\nx = 2*L\n")
    assert 'id="v-L"' in h and 'href="#v-L"' in h


def test_a_conditional_is_a_brace_with_its_cases():
    h = HtmlMathPrinter().expr(parse_expression("if(h <= 150 mm, 1, 2)"))
    assert '<span class="cases">' in h and h.count('<span class="row">') == 2 and "otherwise" in h
