"""HTML math: fractions, radicals, Greek, and every piece of sheet text escaped."""
import textwrap

import calcsheet
from calcsheet.package import PackageDocument
from calcsheet.render.html import HtmlMathPrinter
from calcsheet.parser import parse_expression


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


def test_sheet_text_is_escaped_everywhere():
    h = html_of("""
        ---
        project: <script>alert(1)</script>
        subject: <img src=file:///etc/passwd>
        ---
        # <b>Heading</b>
        > <script>alert("prose")</script> & <img src="file:///etc/passwd">
        x = 2 m   -- <img src=x onerror=alert(1)>
        t = "<i>text</i>"
    """)
    assert "<script>" not in h and "<img" not in h and "<b>Heading" not in h and "<i>text" not in h
    assert "&lt;script&gt;alert(1)&lt;/script&gt;" in h
    assert "&lt;img src=file:///etc/passwd&gt;" in h


def test_package_carries_the_caution_hash_and_versions():
    r = calcsheet.run("x = 2 m\ncheck x <= 3 m\n")
    h = PackageDocument(r).html()
    assert "not a substitute for" in h and "governing local codes" in h
    assert r.sha256 in h and f"calcsheet {calcsheet.__version__}" in h


def test_a_conditional_is_a_brace_with_its_cases():
    h = HtmlMathPrinter().expr(parse_expression("if(h <= 150 mm, 1, 2)"))
    assert '<span class="cases">' in h and h.count('<span class="row">') == 2 and "otherwise" in h
