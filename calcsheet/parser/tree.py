"""lark tokens -> our nodes. Runs inside the LALR parser, so no parse tree is built.

The callbacks keep no state: every span comes from the tokens, whose line
numbers already count from the top of the file (``grammar.parse`` starts the
lexer's line counter at the statement's first line).
"""
from __future__ import annotations

import math

from lark import Token, Transformer

from .. import nodes as N
from ..errors import NumericError, SheetSyntaxError, Span, TooComplexError
from ..units import parse_unit_text, split_unit
from .fast import flags_of  # noqa: F401  (one builder of flags for both readers)

MAX_NUMBER_CHARS = 40

_CMP = {"≤": "<=", "≥": ">="}


def tok_span(tok: Token) -> Span:
    return Span(tok.line, tok.column, tok.end_line, tok.end_column)


def _span_of(*parts) -> Span | None:
    """From the first part's start to the last part's end (tokens or nodes)."""
    first = last = None
    for part in parts:
        sp = _part_span(part)
        if sp is not None:
            first = first or sp
            last = sp
    if first is None:
        return None
    return Span(first.line, first.col, last.end_line, last.end_col)


def _part_span(part) -> Span | None:
    if isinstance(part, Token):
        return tok_span(part)
    if isinstance(part, (list, tuple)):
        return _span_of(*part)
    return getattr(part, "span", None)


def _join(a: Span, b: Span | None) -> Span:
    return Span(a.line, a.col, b.end_line, b.end_col) if b is not None else a


def _is_bracket(part) -> bool:
    return isinstance(part, Token) and part.type in ("LPAR", "RPAR", "LSQB", "RSQB")


def _bin(cls):
    """One builder for the five binary operators."""

    def build(self, children):
        left, right = children[0], children[-1]
        return cls(left=left, right=right, span=_span_of(left, right))

    return build


class ToNodes(Transformer):
    """Builds our nodes while lark parses; spans come from the tokens (brackets included)."""

    def definition(self, children):
        name_tok, decl, expr = children
        unit = unit_text = unit_span = None
        if decl is not None:
            unit_text, unit_span = decl
            unit = parse_unit_text(unit_text, unit_span)
        return N.Definition(
            name=str(name_tok), expr=expr, unit=unit, unit_text=unit_text.strip() if unit_text else None,
            span=_span_of(name_tok, expr), name_span=tok_span(name_tok), unit_span=unit_span,
        )

    def function_def(self, children):
        name_tok, _lpar, *rest = children
        expr = rest[-1]
        decl = rest[-2]
        params = tuple(c for c in rest[:-3] if isinstance(c, N.Param))
        unit = unit_text = unit_span = None
        if decl is not None:
            unit_text, unit_span = decl
            unit = parse_unit_text(unit_text, unit_span)
        return N.FunctionDef(
            name=str(name_tok), params=params, expr=expr, unit=unit,
            unit_text=unit_text.strip() if unit_text else None,
            span=_span_of(name_tok, expr), name_span=tok_span(name_tok), unit_span=unit_span,
        )

    def param(self, children):
        name_tok, decl = children
        unit = unit_text = unit_span = None
        if decl is not None:
            unit_text, unit_span = decl
            unit = parse_unit_text(unit_text, unit_span)
        return N.Param(name=str(name_tok), unit=unit, unit_text=unit_text.strip() if unit_text else None,
                       span=_join(tok_span(name_tok), unit_span), unit_span=unit_span)

    def unit_decl(self, children):
        tok = children[1]
        return str(tok), tok_span(tok)

    def check(self, children):
        left, op, right = children
        span = _span_of(left, right)
        span = Span(span.line, 1, span.end_line, span.end_col) if span else None
        return N.Check(left=left, op=_CMP.get(str(op), str(op)), right=right, span=span)

    add = _bin(N.Add)
    sub = _bin(N.Sub)
    mul = _bin(N.Mul)
    div = _bin(N.Div)
    pow = _bin(N.Pow)

    def neg(self, children):
        operand = children[-1]
        sp = operand.span
        span = Span(sp.line, sp.col - 1, sp.end_line, sp.end_col) if sp else None
        return N.Neg(operand=operand, span=span)

    def pos(self, children):
        return children[-1]

    def number(self, children):
        num_tok, unit_tok = children
        text = str(num_tok)
        if len(text) > MAX_NUMBER_CHARS:
            raise TooComplexError("number literal is too long", tok_span(num_tok))
        value = float(text)
        if not math.isfinite(value):  # the finiteness rule, for literals (evaluator._finite: every result)
            raise NumericError(f"the number {text} is too large: beyond ±1.8e308, it would be infinite",
                               tok_span(num_tok), hint="write it in a larger unit, or check the exponent")
        if value == 0 and any(c in "123456789" for c in text.lower().partition("e")[0]):
            raise NumericError(f"the number {text} is too small: below 5e-324 it would silently become 0",
                               tok_span(num_tok), hint="write it in a smaller unit, or check the exponent")
        unit = split_unit(str(unit_tok)) if unit_tok is not None else ()
        return N.Number(
            value=value, text=text, unit=unit, unit_text=str(unit_tok) if unit_tok is not None else "",
            span=_span_of(num_tok, unit_tok),
        )

    def name(self, children):
        return N.Name(id=str(children[0]), span=_span_of(children[0]))

    def text(self, children):
        return N.Text(value=str(children[0])[1:-1], span=_span_of(children[0]))

    def paren(self, children):
        inner = children[1]
        return N.Paren(inner=inner, span=_span_of(children[0], children[-1]))

    def tuple(self, children):
        items = tuple(c for c in children if c is not None and not _is_bracket(c))
        return N.TupleExpr(items=items, span=_span_of(children[0], children[-1]))

    def list(self, children):
        items = tuple(c for c in children if c is not None and not isinstance(c, Token))
        return N.ListExpr(items=items, span=_span_of(children[0], children[-1]))

    def field(self, children):
        obj, name_tok = children
        return N.FieldAccess(obj=obj, field_name=str(name_tok), span=_span_of(obj, name_tok),
                             field_span=tok_span(name_tok))

    def compare(self, children):
        left, op, right = children
        return N.Compare(left=left, op=_CMP.get(str(op), str(op)), right=right, span=_span_of(left, right))

    def kwarg(self, children):
        name_tok, value = children
        return N.Keyword(name=str(name_tok), value=value, span=_span_of(name_tok, value))

    def arguments(self, children):
        return [c for c in children if c is not None and not isinstance(c, Token)]

    def call(self, children):
        callee, _lpar, args, rpar = children
        args = args or []
        positional = tuple(a for a in args if not isinstance(a, N.Keyword))
        keywords = tuple(a for a in args if isinstance(a, N.Keyword))
        span = _span_of(callee, rpar)
        if isinstance(callee, N.Name):
            positional = flags_of(callee.id, positional)
            return N.Call(func=callee.id, args=positional, kwargs=keywords, span=span, func_span=callee.span)
        if isinstance(callee, N.FieldAccess) and isinstance(callee.obj, N.Name):
            return N.PluginCall(namespace=callee.obj.id, func=callee.field_name, kwargs=keywords, args=positional,
                                span=span, func_span=callee.span)
        raise SheetSyntaxError("only a function name or plugin.function can be called", span)
