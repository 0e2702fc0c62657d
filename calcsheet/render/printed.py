"""The package page as the PDF is made from it: the same print, with fewer character references to parse.

The spaces a formula is set with (no-break, narrow, thin, en: ``html.NNBSP`` …) are written in the page as
character references; the PDF's page has them as the characters themselves, which WeasyPrint's HTML parser
reads in one go rather than one reference at a time (the benchmark's page: 2,200 references, parsed in
0.21–0.37 s of CPU instead of 0.28–0.42 s).

A formula's symbols stay ``<var>`` elements in the PDF too. Writing them as Unicode's mathematical italic
letters (U+1D434 …) would print the same with one element less each, a few per cent of a page's time, but
the PDF's text would then hold those code points: a reviewer searching the PDF for ``M`` or ``σ``, or
copying a formula out of it, would find nothing or get ``𝑀``, ``𝜎``. The PDF's text stays the sheet's own.
"""
from __future__ import annotations

import re

__all__ = ["for_print"]

# the spaces html.py sets a formula with, and the no-break space: characters that need no escaping anywhere
_SPACES = {"&#8239;": "\u202f", "&#160;": "\u00a0", "&#8194;": "\u2002", "&#8201;": "\u2009"}
_SPACE = re.compile("|".join(_SPACES))


def for_print(page: str) -> str:
    """The package page as the PDF is made from it: the references of its spaces written as the characters."""
    return _SPACE.sub(lambda m: _SPACES[m.group(0)], page)
