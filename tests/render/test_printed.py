"""The page as the PDF is made from it: its spaces as characters, everything else (symbols included) as it is."""
import io

import pypdf

import calcsheet
from calcsheet.package import pdf_bytes
from calcsheet.render.page import PackageDocument
from calcsheet.render.printed import for_print


def test_a_formulas_spaces_are_printed_as_characters_and_markup_references_stay():
    page = '<div class="math">2&#8239;m&#8239;&#160;=&#8194;<var>a</var>&#8239;+&#8201;b &amp; &lt;c&gt;</div>'
    assert for_print(page) == ('<div class="math">2\u202fm\u202f\u00a0=\u2002<var>a</var>\u202f+\u2009b '
                               '&amp; &lt;c&gt;</div>')
    assert for_print("<p>nothing to do</p>") == "<p>nothing to do</p>"


def test_a_reviewer_finds_a_formulas_symbols_in_the_pdfs_text():
    r = calcsheet.run("M_Ed = 3 kN*m   -- moment\nsigma = M_Ed / (2 cm^3)\n", path="s.calc")
    assert r.ok, r.format_diagnostics()
    html = str(PackageDocument(r).html())
    text = "".join(p.extract_text() for p in pypdf.PdfReader(io.BytesIO(pdf_bytes(html))).pages)
    squeezed = text.replace(" ", "").replace("\u202f", "").replace("\u00a0", "")
    assert "MEd" in squeezed and "σ=" in squeezed  # the letters of the sheet, not mathematical italic ones
    assert not any(0x1D400 <= ord(c) <= 0x1D7FF or c == "\u210e" for c in text)
