"""Reading a combination's factor text ("1.2 D + 1.6 L") without any general parser.

Why: the factors are sheet text; they are read by one small, strict rule
(optional sign, optional number, optional '*', a case name), nothing else.
"""
from __future__ import annotations

import re

CASE_NAME = re.compile(r"[A-Za-z][A-Za-z0-9]*\Z")
_TERM = re.compile(r"\s*([+-])?\s*(\d+(?:\.\d*)?(?:[eE][+-]?\d+)?|\.\d+)?\s*\*?\s*([A-Za-z][A-Za-z0-9]*)\s*")


def parse_factors(text: str) -> dict[str, float]:
    """{'D': 1.2, 'L': 1.6} from '1.2 D + 1.6 L'; raises ValueError with a reason."""
    if len(text) > 500:
        raise ValueError("the factor text is too long")
    out: dict[str, float] = {}
    pos = 0
    first = True
    while pos < len(text):
        if not text[pos:].strip():
            break
        m = _TERM.match(text, pos)
        if not m or m.end() == pos:
            raise ValueError(f"cannot read the factors at '{text[pos:pos + 12]}'; write e.g. \"1.2 D + 1.6 L\"")
        sign, num, case = m.groups()
        if sign is None and not first:
            raise ValueError(f"expected + or - before '{case}'")
        f = float(num) if num else 1.0
        if sign == "-":
            f = -f
        if case in out:
            raise ValueError(f"case '{case}' appears twice")
        out[case] = f
        pos = m.end()
        first = False
    if not out:
        raise ValueError("no factors given; write e.g. \"1.2 D + 1.6 L\"")
    return out
