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
    """``markupsafe.Markup`` with the standard library's escaping, and a ``format`` and ``join`` that do the same
    as Markup's (escape every argument that is not markup, keep markup) without its per-call formatter object:
    the package page makes tens of thousands of these."""

    __slots__ = ()

    def __new__(cls, object="", encoding=None, errors="strict"):
        if type(object) is str and encoding is None:  # a template or trusted markup: no checks needed
            return str.__new__(cls, object)
        return super().__new__(cls, object, encoding, errors)

    @classmethod
    def escape(cls, s) -> "Html":
        if isinstance(s, cls):
            return s
        if hasattr(s, "__html__"):
            return _new(cls, s.__html__())
        return _new(cls, _escape(str(s), True))

    def format(self, *args, **kwargs) -> "Html":
        if kwargs:
            return _new(Html, str.format(self, *map(_safe, args), **{k: _safe(v) for k, v in kwargs.items()}))
        return _new(Html, str.format(self, *[a if type(a) is Html else _safe(a) for a in args]))

    def join(self, iterable) -> "Html":
        return _new(Html, str.join(self, [a if type(a) is Html else _safe_str(a) for a in iterable]))


_new = str.__new__  # an escaped or already-markup str becomes Html without Markup.__new__'s checks
_escape = html.escape


def _safe(value):
    """An argument for a template: markup as it is, numbers as they are (format specs still apply), the rest
    escaped."""
    if isinstance(value, str):
        return value if isinstance(value, Markup) else _escape(value, True)
    if isinstance(value, (int, float)) and not isinstance(value, bool):
        return value
    return _safe_str(value)


def _safe_str(value) -> str:
    if isinstance(value, Markup):
        return value
    if hasattr(value, "__html__"):
        return value.__html__()
    return html.escape(str(value), quote=True)


def piece(value) -> str:
    """One piece of a page being joined by hand (a printer's hot path): markup as it is, anything else
    escaped, as a plain ``str``. Join the pieces and make the whole ``Html`` once with ``wrap``."""
    if isinstance(value, Markup):
        return value
    return _escape(str(value), True)


def wrap(joined: str) -> Html:
    """Pieces joined by hand (each one through ``piece``, or a literal of our own) as ``Html``, without
    escaping them again."""
    return _new(Html, joined)


def esc(text) -> Html:
    """Text as HTML: escaped, unless it is already ``Html``."""
    return Html.escape(text)


_ANCHOR_SAFE = re.compile(r"[^A-Za-z0-9_.\-]")


def anchor_id(text: str) -> str:
    """An id/href fragment from a name; anything unexpected is replaced (the result needs no escaping)."""
    return _ANCHOR_SAFE.sub("-", str(text))
