"""The LALR parser of one statement, built once from ``calcsheet/grammar.lark``.

The built parser is cached and never changed afterwards; a parse keeps its
state (the line counter) in lark's own per-call lexer state, so parsing is
safe from several threads.

The quick reader (``fast``) needs only the grammar's terminal patterns. They are kept on disk beside this
module (``terminals.json``, keyed by the SHA-256 of the grammar text it was made from), so a process whose
statements the quick reader reads (a ``check`` of an everyday sheet) neither imports lark nor builds the
parser; a stale copy is never used (the key differs), and ``tests/parser/test_fast.py`` holds the copy to
what the built parser gives. Regenerate it with
``python -c "from calcsheet.parser.grammar import write_terminals; write_terminals()"``.
"""
from __future__ import annotations

import hashlib
import json
import threading
from functools import lru_cache
from importlib import resources

from .. import nodes as N
from ..errors import CalcError
from ..units import unit_name_alternatives
from . import fast

TERMINALS_FILE = "terminals.json"
_READY = threading.Lock()


@lru_cache(maxsize=1)
def grammar_text() -> str:
    """The grammar as lark reads it (the unit names filled in)."""
    grammar = resources.files("calcsheet").joinpath("grammar.lark").read_text(encoding="utf-8")
    return grammar.replace("{unit_names}", unit_name_alternatives())


def grammar_key() -> str:
    return hashlib.sha256(grammar_text().encode("utf-8")).hexdigest()


@lru_cache(maxsize=1)
def lalr():
    """The parser, with our callbacks applied during parsing: no parse tree is built."""
    from lark import Lark

    from .tree import ToNodes

    parser = Lark(grammar_text(), parser="lalr", lexer="contextual", maybe_placeholders=True, transformer=ToNodes())
    fast.enable(parser)  # the quick reader takes its terminal patterns from this very parser
    return parser


def stored_terminals() -> dict | None:
    """The terminal table kept on disk, if it was made from this very grammar text (else None)."""
    try:
        data = json.loads(resources.files("calcsheet.parser").joinpath(TERMINALS_FILE).read_text(encoding="utf-8"))
    except (OSError, ValueError):
        return None
    if not isinstance(data, dict) or data.get("grammar_sha256") != grammar_key():
        return None
    table = data.get("terminals")
    return table if isinstance(table, dict) else None


def write_terminals() -> str:
    """Write ``terminals.json`` from the built parser; returns its path."""
    path = resources.files("calcsheet.parser").joinpath(TERMINALS_FILE)
    data = {"grammar_sha256": grammar_key(), "terminals": fast.terminal_table(lalr())}
    with open(str(path), "w", encoding="utf-8") as fh:
        json.dump(data, fh, indent=1, ensure_ascii=False, sort_keys=True)
        fh.write("\n")
    return str(path)


def prepare_fast() -> None:
    """On first use: the quick reader's patterns from the stored table, else from the built parser."""
    with _READY:
        if fast.decided():
            return
        table = stored_terminals()
        if table is None or not fast.enable_table(table):
            lalr()


def parse(text: str, line_offset: int = 0) -> N.Statement:
    """One statement whose first line is line ``line_offset + 1`` of its file; lark errors become ours.

    The everyday statement is read by ``fast`` (the same nodes and spans, several times quicker); anything
    else, and every error, goes through the LALR parser.
    """
    if not fast.decided():
        prepare_fast()
    node = fast.parse(text, line_offset)
    if node is not None:
        return node
    from lark.exceptions import UnexpectedInput, VisitError

    from .friendly import friendly

    run = lalr().parse_interactive(text)
    run.lexer_thread.state.line_ctr.line = line_offset + 1  # token lines count from the top of the file
    try:
        return run.resume_parse()
    except UnexpectedInput as exc:
        raise friendly(exc, text, line_offset) from None
    except VisitError as exc:
        if isinstance(exc.orig_exc, CalcError):
            raise exc.orig_exc from None
        raise
