"""The LALR parser of one statement, built once from ``calcsheet/grammar.lark``.

The built parser is cached and never changed afterwards; a parse keeps its
state (the line counter) in lark's own per-call lexer state, so parsing is
safe from several threads.
"""
from __future__ import annotations

from functools import lru_cache
from importlib import resources

from lark import Lark
from lark.exceptions import UnexpectedInput, VisitError

from .. import nodes as N
from ..errors import CalcError
from ..units import unit_name_alternatives
from . import fast
from .friendly import friendly
from .tree import ToNodes


@lru_cache(maxsize=1)
def lalr() -> Lark:
    """The parser, with our callbacks applied during parsing: no parse tree is built."""
    grammar = resources.files("calcsheet").joinpath("grammar.lark").read_text(encoding="utf-8")
    grammar = grammar.replace("{unit_names}", unit_name_alternatives())
    parser = Lark(grammar, parser="lalr", lexer="contextual", maybe_placeholders=True, transformer=ToNodes())
    fast.enable(parser)  # the quick reader takes its terminal patterns from this very parser
    return parser


def parse(text: str, line_offset: int = 0) -> N.Statement:
    """One statement whose first line is line ``line_offset + 1`` of its file; lark errors become ours.

    The everyday statement is read by ``fast`` (the same nodes and spans, several times quicker); anything
    else, and every error, goes through the LALR parser.
    """
    parser = lalr()
    node = fast.parse(text, line_offset)
    if node is not None:
        return node
    run = parser.parse_interactive(text)
    run.lexer_thread.state.line_ctr.line = line_offset + 1  # token lines count from the top of the file
    try:
        return run.resume_parse()
    except UnexpectedInput as exc:
        raise friendly(exc, text, line_offset) from None
    except VisitError as exc:
        if isinstance(exc.orig_exc, CalcError):
            raise exc.orig_exc from None
        raise
