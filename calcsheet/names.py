"""Name helpers, once: dotted names of symbols, literal stripping, "did you mean" suggestions.

Every stage that prints a symbol's name (``sec.A``), looks through brackets
and signs for a literal, or suggests the closest known name reads it here.
"""
from __future__ import annotations

import difflib
from typing import Iterable

from . import nodes as N


def dotted(node) -> str | None:
    """'L' for a name, 'sec.A' for a field of a named record; None for anything else."""
    if isinstance(node, N.Name):
        return node.id
    if isinstance(node, N.FieldAccess):
        inner = dotted(node.obj)
        return f"{inner}.{node.field_name}" if inner else None
    return None


def unparen(node):
    """One level of written brackets off (a printed formula keeps the rest)."""
    return node.inner if isinstance(node, N.Paren) else node


def strip_parens(node):
    """Every level of brackets off."""
    while isinstance(node, N.Paren):
        node = node.inner
    return node


def strip_sign(node):
    """Brackets and unary minuses off: what a signed literal ``-(2 kN)`` is written as."""
    while isinstance(node, (N.Neg, N.Paren)):
        node = node.operand if isinstance(node, N.Neg) else node.inner
    return node


def unit_literal(node) -> N.Number | None:
    """The literal with a unit under any brackets (``(150 mm)``), else None."""
    node = strip_parens(node)
    return node if isinstance(node, N.Number) and node.unit else None


def operand(node, fallback: str = "the expression") -> str:
    """How a message names an operand: 'L', 'sec.A', '30 deg', or ``fallback``."""
    node = strip_parens(node)
    if isinstance(node, N.Name):
        return node.id
    if isinstance(node, N.FieldAccess):
        inner = operand(node.obj, "")
        return f"{inner}.{node.field_name}" if inner else node.field_name
    if isinstance(node, N.Number):
        return f"{node.text} {node.unit_text}".strip()
    return fallback


def closest(name: str, options: Iterable[str]) -> str | None:
    """The known name ``name`` most likely meant, if one is close."""
    close = difflib.get_close_matches(name, list(options), n=1)
    return close[0] if close else None


def did_you_mean(name: str, options: Iterable[str], quote: str = "'", prefix: str = "") -> str | None:
    """"did you mean 'x'?" for the closest option, else None."""
    hit = closest(name, options)
    return f"did you mean {quote}{prefix}{hit}{quote}?" if hit else None
