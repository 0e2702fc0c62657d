"""The package page as the PDF prints it: a formula's symbol in italic letters instead of an element.

On the HTML page a symbol is ``<var>M</var><sub>0</sub>``: the ``<var>`` says what it is and makes it
italic. In the PDF the same italic can be a run of text: Unicode's mathematical italic letters (U+1D434…
for Latin, ``h`` is U+210E; U+1D6E2… for Greek), the form a printed formula uses, which DejaVu Serif (and,
for Greek, its italic face) draws with the very glyphs of its italic. The typesetter then lays out one
element less per symbol, and the letters join the text around them (WeasyPrint's cost grows with its boxes:
a few per cent of the PDF's time on a page of formulas). The printed page is the same.

Only a ``<var>`` that holds nothing but Latin or Greek letters is changed (the names of a sheet, escaped),
and only inside a formula (``.math``, set in DejaVu Serif): a symbol in a table's head or in the inputs'
list is set in DejaVu Sans, which has no such letters, and stays a ``<var>``. The HTML page keeps its
``<var>`` elements.

The spaces a formula is set with (no-break, narrow, thin, en: ``html.NNBSP`` …) are written in the page as
character references; the PDF's page has them as the characters themselves, which WeasyPrint's HTML parser
reads in one go rather than one reference at a time (the benchmark's page: 2,200 references, parsed in
0.21–0.37 s of CPU instead of 0.28–0.42 s).
"""
from __future__ import annotations

import re

__all__ = ["for_print", "italic_letters", "print_spaces", "print_symbols"]

_VAR = re.compile(r"<var>([A-Za-z\u0391-\u03a1\u03a3-\u03a9\u03b1-\u03c9]+)</var>")
_ITALIC = {**{chr(0x41 + i): chr(0x1D434 + i) for i in range(26)},   # A–Z
           **{chr(0x61 + i): chr(0x1D44E + i) for i in range(26)},   # a–z
           "h": "\u210e",                                            # (U+1D455 is reserved: Planck's h)
           **{chr(0x391 + i): chr(0x1D6E2 + i) for i in range(25)},  # Α–Ω
           **{chr(0x3B1 + i): chr(0x1D6FC + i) for i in range(25)}}  # α–ω
_TABLE = str.maketrans(_ITALIC)


def italic_letters(text: str) -> str:
    """Latin and Greek letters as mathematical italic letters (anything else as it is)."""
    return text.translate(_TABLE)


# a formula: a step's or check's (a div without a div inside) or a summary row's condition (a cell)
_MATH = re.compile(r"""<div class="math">.*?</div>|<td class='math'>.*?</td>""", re.S)


def _letters(m: re.Match) -> str:
    return m.group(1).translate(_TABLE)


def print_symbols(page: str) -> str:
    """The page with every ``<var>`` of Latin or Greek letters in a formula written as italic letters (see the
    module)."""
    if "<var>" not in page:
        return page
    return _MATH.sub(lambda m: _VAR.sub(_letters, m.group(0)), page)


# the spaces html.py sets a formula with, and the no-break space: characters that need no escaping anywhere
_SPACES = {"&#8239;": "\u202f", "&#160;": "\u00a0", "&#8194;": "\u2002", "&#8201;": "\u2009"}
_SPACE = re.compile("|".join(_SPACES))


def print_spaces(page: str) -> str:
    """The page with the character references of its spaces written as the characters (see the module)."""
    return _SPACE.sub(lambda m: _SPACES[m.group(0)], page)


def for_print(page: str) -> str:
    """The package page as the PDF is made from it: the same print, fewer elements and references."""
    return print_spaces(print_symbols(page))
