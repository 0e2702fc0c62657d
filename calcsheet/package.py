"""The calculation package as files: the HTML page, its PDF and the JSON result, written atomically.

The documents are printed by ``calcsheet.render`` (``render.page`` for the
HTML, ``render.json`` for the JSON). This module only assembles the files:
the PDF comes from the same HTML through WeasyPrint with a URL fetcher that
refuses all but ``data:`` URLs and our own bundled assets, and nothing is
written until every format has rendered.
"""
from __future__ import annotations

import os
from pathlib import Path

from . import collector, paged, reading
from .atomic import publish_package
from .render.json import JsonPrinter, dumps
from .render.page import ASSETS, PackageDocument
from .render.printed import for_print

__all__ = ["ASSETS", "PackageDocument", "PackageTooLarge", "make_fetcher", "pdf_bytes", "write_package"]


# ------------------------------------------------------------ PDF


def make_fetcher():
    """A URL fetcher that reads nothing from the sheet's world: only data: URLs and our assets."""
    import weasyprint

    assets = ASSETS.resolve()

    class PackageFetcher(weasyprint.URLFetcher):
        def __init__(self):
            super().__init__(allowed_protocols={"data", "file"}, allow_redirects=False, timeout=2)

        def fetch(self, url, headers=None):
            if url.startswith("data:"):
                return super().fetch(url, headers)
            if url.startswith("file://"):
                from urllib.parse import unquote, urlparse

                target = Path(unquote(urlparse(url).path)).resolve()
                if target.is_file() and assets in target.parents:
                    return super().fetch(url, headers)
            raise ValueError(f"calcsheet packages load no external resources: refused {url[:80]!r}")

    return PackageFetcher()


_STYLESHEET: dict = {}  # a stylesheet's text -> its parsed weasyprint.CSS: parsed once per process


def _stylesheet(text: str):
    import weasyprint

    css = _STYLESHEET.get(text)
    if css is None:
        if len(_STYLESHEET) > 8:
            _STYLESHEET.clear()  # the bundled stylesheet and paged's few (they change only under development)
        css = _STYLESHEET[text] = weasyprint.CSS(string=text, base_url=str(ASSETS) + os.sep,
                                                  url_fetcher=make_fetcher())
    return css


# What a page can hold at most (a page of steps, or of table rows, each at least this tall): the lower bound
# on the page count that refuses an oversized package before layout. Measured on A4 at the package's sizes
# (a step is ≥ 6 mm with its padding and line height; a table row ≥ 4 mm; a figure's box ≥ 30 mm).
_PER_PAGE = {'class="step': 40, "<tr": 60, "<figure": 8}


def estimated_pages(html: str) -> int:
    """A lower bound of the pages the PDF of ``html`` will have, counted from its blocks without laying it
    out (steps, table rows and figures, each no smaller than a typical one)."""
    return int(sum(html.count(marker) / per_page for marker, per_page in _PER_PAGE.items()))


def _too_many_pages(pages: int, what: str) -> "PackageTooLarge":
    return PackageTooLarge(f"the PDF would have {what}{pages:,} pages; " + reading.how_to_raise("PDF_PAGES"))


def pdf_bytes(html: str) -> bytes:
    """The PDF of a package page. Refused before any layout when even the lower bound of its pages is over
    the cap ``PDF_PAGES``, and again with the exact count before anything is written. A long page is laid out
    a chunk at a time (``paged``), so its memory is bounded by a chunk, not by the page count.

    The bundled stylesheet, which the page carries inline so the HTML file stands alone, is taken out of the
    page and given to WeasyPrint already parsed: it is parsed once per process, not once per PDF."""
    import weasyprint  # imported here: ~0.5 s, needed only when a PDF is written

    html = for_print(str(html))  # a formula's spaces as characters, not references (parsed faster)
    cap = reading.limit("PDF_PAGES")
    at_least = estimated_pages(html)
    if at_least > cap:
        raise _too_many_pages(at_least, "at least ")
    css = (ASSETS / "package.css").read_text(encoding="utf-8")
    stylesheets = []
    if css in html:
        html = html.replace(css, "", 1)
        stylesheets.append(_stylesheet(css))

    def render(text, extra=()):
        doc = weasyprint.HTML(string=text, base_url=str(ASSETS) + os.sep, url_fetcher=make_fetcher())
        return doc.render(stylesheets=stylesheets + list(extra))

    with collector.layout_pause():  # the layout's objects are not walked by the collector again and again
        # a long page is laid out a chunk at a time: its memory is bounded by a chunk (calcsheet/paged.py)
        chunked = paged.render_chunked(html, render, _stylesheet, cap, lambda n: _too_many_pages(n, "at least "))
        if chunked is not None:
            return chunked
        rendered = render(html)
        if len(rendered.pages) > cap:
            raise _too_many_pages(len(rendered.pages), "")
        pdf = rendered.write_pdf()
        del rendered  # collected as the block ends
    return pdf


def write_package(result, out_dir: Path, formats: list[str], stem: str | None = None, *, html=None,
                  **doc_options) -> list[Path]:
    """Render every format first, then publish them together (``atomic.publish_package``): a reader sees
    the whole old package or the whole new one; a failure anywhere leaves the old one byte-identical.
    ``html``: the page already rendered (the live preview renders it once per save)."""
    stem = stem or Path(result.path).stem or "sheet"
    rendered: dict[str, bytes] = {}
    if html is None and ("html" in formats or "pdf" in formats):
        html = PackageDocument(result, **doc_options).html()
    if "html" in formats:
        rendered["html"] = html.encode("utf-8")
    if "pdf" in formats:
        if len(html) > reading.limit("OUTPUT_BYTES"):  # before WeasyPrint spends memory on it
            raise PackageTooLarge(f"the page is {len(html):,} characters, too large to make a PDF of; "
                                  + reading.how_to_raise("OUTPUT_BYTES"))
        rendered["pdf"] = pdf_bytes(html)
    if "json" in formats:
        rendered["json"] = (dumps(JsonPrinter().result(result)) + "\n"
                            ).encode("utf-8")
    cap = reading.limit("OUTPUT_BYTES")
    for fmt, data in rendered.items():
        if len(data) > cap:
            raise PackageTooLarge(f"the {fmt.upper()} would be {len(data):,} bytes; "
                                  + reading.how_to_raise("OUTPUT_BYTES"))
    files = {f"{stem}.{fmt}": rendered[fmt] for fmt in ("html", "pdf", "json") if fmt in rendered}
    return publish_package(Path(out_dir), stem, files)


class PackageTooLarge(Exception):
    """A package file over the output cap (docs/limits.md); nothing is written."""
