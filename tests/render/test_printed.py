"""The page as the PDF prints it: a formula's symbols as italic letters, everything else as it is."""
import io
import unicodedata

import pypdf

import calcsheet
from calcsheet.package import pdf_bytes
from calcsheet.render.page import PackageDocument
from calcsheet.render.printed import for_print, italic_letters, print_spaces, print_symbols


def test_letters_become_their_mathematical_italic_forms():
    assert [unicodedata.name(c) for c in italic_letters("Mh")] == ["MATHEMATICAL ITALIC CAPITAL M", "PLANCK CONSTANT"]
    assert unicodedata.name(italic_letters("σ")) == "MATHEMATICAL ITALIC SMALL SIGMA"
    assert italic_letters("2,y") == "2,y".replace("y", italic_letters("y"))  # digits and commas as they are


def test_only_a_formulas_symbols_change_and_only_their_var():
    page = ('<table><tr><th><var>A</var><sub>i</sub></th></tr></table>'
            '<div class="math"><var>M</var><sub>Ed</sub> = <a href="#v-w"><var>w</var></a>·<var>ϕ</var></div>'
            "<td class='math'><var>σ</var> ≤ 3</td>")
    out = print_symbols(page)
    assert out.startswith('<table><tr><th><var>A</var><sub>i</sub></th>')  # a table's head: DejaVu Sans, kept
    assert (f'<div class="math">{italic_letters("M")}<sub>Ed</sub> = <a href="#v-w">{italic_letters("w")}</a>'
            '·<var>ϕ</var></div>') in out  # the subscript stays upright text; a variant letter stays a <var>
    assert f"<td class='math'>{italic_letters('σ')} ≤ 3</td>" in out
    assert print_symbols("<p>no symbols</p>") == "<p>no symbols</p>"


def test_the_pdf_prints_a_symbol_in_italic_letters_and_the_html_keeps_its_var():
    r = calcsheet.run("M_Ed = 3 kN*m   -- moment\nsigma = M_Ed / (2 cm^3)\n", path="s.calc")
    assert r.ok, r.format_diagnostics()
    html = str(PackageDocument(r).html())
    assert "<var>M</var><sub>Ed</sub>" in html and "<var>σ</var>" in html
    text = "".join(p.extract_text() for p in pypdf.PdfReader(io.BytesIO(pdf_bytes(html))).pages)
    assert italic_letters("M") + "Ed" in text.replace(" ", "") and italic_letters("σ") in text


def test_a_formulas_spaces_are_printed_as_characters_and_markup_references_stay():
    page = '<div class="math">2&#8239;m&#8239;&#160;=&#8194;<var>a</var>&#8239;+&#8201;b &amp; &lt;c&gt;</div>'
    out = for_print(page)
    assert out == ('<div class="math">2\u202fm\u202f\u00a0=\u2002' + italic_letters("a")
                   + '\u202f+\u2009b &amp; &lt;c&gt;</div>')
    assert print_spaces("&#8239;&#160;&#8194;&#8201;") == "\u202f\u00a0\u2002\u2009"
