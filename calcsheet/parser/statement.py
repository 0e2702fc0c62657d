"""One statement (a definition or a check) and a plugin's formula, with the size limits."""
from __future__ import annotations

from functools import lru_cache

from .. import nodes as N
from ..errors import Span, TooComplexError
from . import grammar

MAX_STATEMENT_CHARS = 20_000
MAX_DEPTH = 200


def _depth(node: N.Node) -> int:
    best = 0
    stack = [(node, 1)]
    while stack:
        n, d = stack.pop()
        best = max(best, d)
        stack.extend((c, d + 1) for c in n.children())
    return best


def parse_statement(text: str, line_offset: int = 0) -> N.Statement:
    """Parse one logical statement (text may span lines); line_offset maps to the file."""
    if len(text) > MAX_STATEMENT_CHARS:
        raise TooComplexError(f"statement is longer than {MAX_STATEMENT_CHARS} characters",
                              Span(line_offset + 1, 1, line_offset + 1, 2))
    node = grammar.parse(text, line_offset)
    # every node of a nesting chain takes at least one character of its own, so a short text is shallow
    if len(text) > MAX_DEPTH and _depth(node) > MAX_DEPTH:
        raise TooComplexError(f"expression is nested more than {MAX_DEPTH} levels deep", node.span,
                              hint="split it into named intermediate values")
    return node


@lru_cache(maxsize=4096)
def parse_expression(text: str) -> N.Expr:
    """A plugin's formula (trusted text): ``b*h^3/12``. Nodes are frozen, so a cached one is shared safely."""
    return parse_statement(f"_ = {text}").expr
