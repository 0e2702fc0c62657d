"""Sheet text -> nodes. The only package that knows lark exists.

The sheet is first split into logical lines (``lines``: front matter, headings,
prose, comments, statements continuing inside open brackets; ``includes``);
each statement is then parsed on its own by an LALR grammar (``grammar``,
building nodes as it goes with ``tree``), so one bad line gives one error
(``friendly`` words it) and the rest of the sheet is still read.
"""
from .sheet import MAX_SHEET_BYTES, parse_sheet
from .statement import MAX_DEPTH, MAX_STATEMENT_CHARS, parse_expression, parse_statement

__all__ = ["parse_sheet", "parse_statement", "parse_expression", "MAX_SHEET_BYTES", "MAX_STATEMENT_CHARS",
           "MAX_DEPTH"]
