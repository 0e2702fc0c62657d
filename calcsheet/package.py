"""The calculation package as files: the HTML page, its PDF and the JSON result, written atomically.

The documents are printed by ``calcsheet.render`` (``render.page`` for the
HTML, ``render.json`` for the JSON). This module only assembles the files:
the PDF comes from the same HTML through WeasyPrint with a URL fetcher that
refuses all but ``data:`` URLs and our own bundled assets, and nothing is
written until every format has rendered.
"""
from __future__ import annotations

import json
import os
from pathlib import Path

from .atomic import write_atomic
from .render.json import JsonPrinter
from .render.page import ASSETS, PackageDocument

__all__ = ["ASSETS", "PackageDocument", "make_fetcher", "pdf_bytes", "write_package"]


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
    return doc.write_pdf()


def write_package(result, out_dir: Path, formats: list[str], stem: str | None = None,
                  **doc_options) -> list[Path]:
    """Render every format first, then write each atomically; nothing half-written is left."""
    stem = stem or Path(result.path).stem or "sheet"
    out_dir.mkdir(parents=True, exist_ok=True)
    rendered: dict[str, bytes] = {}
    html = None
    if "html" in formats or "pdf" in formats:
        html = PackageDocument(result, **doc_options).html()
    if "html" in formats:
        rendered["html"] = html.encode("utf-8")
    if "pdf" in formats:
        rendered["pdf"] = pdf_bytes(html)
    if "json" in formats:
        rendered["json"] = (json.dumps(JsonPrinter().result(result), indent=2, ensure_ascii=False) + "\n"
                            ).encode("utf-8")
    written = []
    for fmt in ("html", "pdf", "json"):
        if fmt in rendered:
            path = out_dir / f"{stem}.{fmt}"
            write_atomic(path, rendered[fmt])
            written.append(path)
    return written
