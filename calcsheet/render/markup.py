"""Markup as a typed string: ``Html`` is HTML, a plain ``str`` is text.

``Html`` is a ``markupsafe.Markup``: joining, ``+``, ``%`` and ``format`` escape
every plain string they are given and keep every ``Html`` as it is, so sheet
text can reach a page only escaped. Build pages from ``Html("<td>{}</td>")
.format(value)``, never with f-strings; mark trusted markup (a plugin's SVG,
which ``calcsheet.svg`` built with its text escaped) with ``Html(...)`` where
it enters, so every such place can be found.

Escaping is the standard library's ``html.escape(quote=True)`` (``&quot;``,
``&#x27;``), so pages are byte-for-byte what the printers wrote before they
used a typed string.
"""
from __future__ import annotations

import html
import re

from markupsafe import Markup


class Html(Markup):
    __slots__ = ()

    @classmethod
    def escape(cls, s) -> "Html":
        if hasattr(s, "__html__"):
            return cls(s.__html__())
        return cls(html.escape(str(s), quote=True))


def esc(text) -> Html:
    """Text as HTML: escaped, unless it is already ``Html``."""
    return Html.escape(text)


_ANCHOR_SAFE = re.compile(r"[^A-Za-z0-9_.\-]")


def anchor_id(text: str) -> str:
    """An id/href fragment from a name; anything unexpected is replaced (the result needs no escaping)."""
    return _ANCHOR_SAFE.sub("-", str(text))
