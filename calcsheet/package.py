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

from . import reading
from .atomic import publish_package
from .render.json import JsonPrinter, dumps
from .render.page import ASSETS, PackageDocument

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


def pdf_bytes(html: str) -> bytes:
    import weasyprint  # imported here: ~0.5 s, needed only when a PDF is written

    doc = weasyprint.HTML(string=str(html), base_url=str(ASSETS) + os.sep, url_fetcher=make_fetcher())
    rendered = doc.render()
    pages = reading.limit("PDF_PAGES")
    if len(rendered.pages) > pages:
        raise PackageTooLarge(f"the PDF would have {len(rendered.pages):,} pages; "
                              + reading.how_to_raise("PDF_PAGES"))
    return rendered.write_pdf()


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
