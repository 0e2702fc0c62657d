"""Nothing in a demo package's PDF is cut off: every glyph lies inside the page's text block.

Each demo sheet in sheets/ is built to a PDF once for this module; then, page by page, every glyph box
(read back from the PDF by pdfplumber, an independent PDF reader) must lie between the left and right
margins the stylesheet's ``@page`` rule sets, and inside the page (the running title block and stamp sit in
the top and bottom margins, as they should). A formula, a plugin call, a table or a label that runs off the
page fails here with its page and text. A heading must never be the last line of a page.
"""
from __future__ import annotations

import re
from pathlib import Path

import pytest

pdfplumber = pytest.importorskip("pdfplumber")
pytest.importorskip("weasyprint")

import calcsheet  # noqa: E402
from calcsheet.package import ASSETS, pdf_bytes  # noqa: E402
from calcsheet.render.page import PackageDocument  # noqa: E402

ROOT = Path(__file__).resolve().parents[1]
SHEETS = sorted((ROOT / "sheets").glob("*.calc"))
MM = 72 / 25.4  # PDF points per millimetre
TOLERANCE = 0.75  # pt: a glyph's side bearing may touch the margin line


def page_margins() -> tuple[float, float, float, float]:
    """(top, right, bottom, left) in points, as the package stylesheet's @page rule sets them."""
    css = (ASSETS / "package.css").read_text(encoding="utf-8")
    m = re.search(r"@page\s*\{[^}]*?margin:\s*([\d.]+)mm\s+([\d.]+)mm\s+([\d.]+)mm\s+([\d.]+)mm", css)
    assert m, "the package stylesheet's @page rule states its four margins in mm"
    return tuple(float(v) * MM for v in m.groups())


def glyphs(path: Path) -> list[tuple[float, float, list[dict]]]:
    """(width, height, glyph boxes) of every page of a PDF."""
    keep = ("text", "x0", "x1", "top", "bottom", "fontname", "size")
    with pdfplumber.open(path) as pdf:
        return [(float(page.width), float(page.height), [{k: c[k] for k in keep} for c in page.chars])
                for page in pdf.pages]


@pytest.fixture(scope="module")
def demo_pages(tmp_path_factory) -> dict[str, list]:
    """Every demo sheet's PDF, built once for this module, as its pages' glyph boxes."""
    out = tmp_path_factory.mktemp("demo-pdfs")
    pages = {}
    for sheet in SHEETS:
        result = calcsheet.run(sheet.read_text(encoding="utf-8"), path=str(sheet))
        path = out / (sheet.stem + ".pdf")
        path.write_bytes(pdf_bytes(PackageDocument(result).html()))
        pages[sheet.stem] = glyphs(path)
    return pages


def outside_text_block(pages) -> list[str]:
    top, right, bottom, left = page_margins()
    found = []
    for number, (width, height, chars) in enumerate(pages, 1):
        out = [c for c in chars
               if c["x0"] < left - TOLERANCE or c["x1"] > width - right + TOLERANCE
               or c["top"] < -TOLERANCE or c["bottom"] > height + TOLERANCE]
        if out:
            text = "".join(c["text"] for c in out)
            found.append(f"page {number}: {len(out)} glyphs beyond the margins "
                         f"(x up to {max(c['x1'] for c in out):.0f} pt of {width - right:.0f}): {text[:80]!r}")
    return found


def headings_at_page_foot(pages) -> list[str]:
    top, right, bottom, left = page_margins()
    found = []
    for number, (width, height, chars) in enumerate(pages[:-1], 1):
        body = [c for c in chars if top <= c["top"] and c["bottom"] <= height - bottom]
        if not body:
            continue
        last = max(c["bottom"] for c in body)
        line = [c for c in body if abs(c["bottom"] - last) < 3]
        if all("Bold" in c["fontname"] and c["size"] >= 9.9 for c in line):
            found.append(f"page {number} ends with the heading {''.join(c['text'] for c in line)!r}")
    return found


def test_the_margins_are_read_from_the_stylesheet():
    top, right, bottom, left = page_margins()
    assert left > 10 * MM and right > 10 * MM and top > bottom  # the title block sits in the top margin


def test_the_glyph_check_finds_text_that_runs_off_the_page(tmp_path):
    # the check itself, on a page that does run off: a 300-character word in a nowrap box
    html = ('<html><head><style>@page { size: A4; margin: 34mm 14mm 20mm 16mm; }</style></head><body>'
            '<p style="white-space: nowrap">' + "W" * 300 + "</p></body></html>")
    path = tmp_path / "wide.pdf"
    path.write_bytes(pdf_bytes(html))
    found = outside_text_block(glyphs(path))
    assert len(found) == 1 and found[0].startswith("page 1:") and "WWW" in found[0]


def test_the_heading_check_finds_a_heading_at_the_foot_of_a_page(tmp_path):
    # a bold 12 pt heading forced to the foot of the first page, its text on the next
    html = ('<html><head><style>@page { size: A4; margin: 34mm 14mm 20mm 16mm; } '
            'h2 { font: bold 12pt "DejaVu Sans"; page-break-after: always; }</style></head>'
            "<body><h2>Loads</h2><p>w = 5 kN/m</p></body></html>")
    path = tmp_path / "orphan.pdf"
    path.write_bytes(pdf_bytes(html))
    assert headings_at_page_foot(glyphs(path)) == ["page 1 ends with the heading 'Loads'"]


@pytest.mark.parametrize("stem", [s.stem for s in SHEETS])
def test_every_glyph_of_a_demo_package_lies_inside_the_text_block(demo_pages, stem):
    assert outside_text_block(demo_pages[stem]) == []


@pytest.mark.parametrize("stem", [s.stem for s in SHEETS])
def test_no_page_of_a_demo_package_ends_with_a_heading(demo_pages, stem):
    assert headings_at_page_foot(demo_pages[stem]) == []


def test_the_mezzanine_package_stays_shorter_than_22_pages(demo_pages):
    # the reviewer package's length goal for its largest demo (a two-span beam over 23 combinations and a
    # column): every step is kept; long tables flow on across pages and results by combination are tabulated
    # once, so the package stays under the 22 pages it once took
    assert len(demo_pages["member_mezzanine_beam"]) < 22


def test_an_oversized_package_is_refused_before_any_layout(monkeypatch):
    import weasyprint

    from calcsheet import package

    def no_layout(*args, **kwargs):
        raise AssertionError("WeasyPrint was started")

    monkeypatch.setattr(weasyprint, "HTML", no_layout)
    monkeypatch.setenv("CALCSHEET_LIMIT_PDF_PAGES", "3")
    r = calcsheet.run("".join(f"x_{i} = {i + 1} m\n" for i in range(400)))  # 400 steps: at least 10 pages
    with pytest.raises(package.PackageTooLarge, match=r"at least \d+ pages.*CALCSHEET_LIMIT_PDF_PAGES"):
        pdf_bytes(PackageDocument(r).html())


def test_the_package_stylesheet_is_parsed_once_per_process():
    from calcsheet import package

    css = (ASSETS / "package.css").read_text(encoding="utf-8")
    assert package._stylesheet(css) is package._stylesheet(css)
