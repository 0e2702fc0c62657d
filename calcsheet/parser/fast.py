"""A quick reader for the everyday statement, giving exactly the nodes the LALR grammar gives.

Large sheets spent most of their parse in the general LALR machinery, one token at a time. Most statements
are short definitions and checks (``w [kN/m] = 1.2*g + 1.5*q``, ``check s <= 250 MPa``); this module reads
those with a small hand-written precedence parser over the *same* terminal patterns the grammar uses (taken
from the built LALR parser, so the two cannot drift apart on what a number, a unit or a name is).

The contract is one-sided: ``parse`` returns either ``None`` or the very node the grammar would build, spans
included. Anything it does not know, anything unusual and every error (a syntax error, a unit that does not
read, a number too long) gives ``None``, and the statement goes through the grammar, which owns every
diagnostic and its location. Lists and tuples always take that road.
``tests/parser/test_fast.py`` holds the two readers to agreement on generated and real statements.
"""
from __future__ import annotations

import bisect
import re

from .. import nodes as N
from ..errors import Span
from ..units import parse_unit_text, split_unit

_CMP = {"≤": "<=", "≥": ">="}
_MAX_NESTING = 60  # deeper text goes through the grammar (it also enforces the depth limit)
_CACHE_LIMIT = 4096

_WS_CHARS = " \t\f\r\n"  # the first characters the grammar's WS can match (checked in enable)
_BINOPS = {"+": N.Add, "-": N.Sub, "*": N.Mul, "·": N.Mul, "×": N.Mul, "/": N.Div}


class _Bail(Exception):
    """This statement is not one the quick reader vouches for: the grammar reads it."""


def terminal_table(lark_parser) -> dict:
    """The terminals of a built grammar as plain data: name -> (kind of pattern, regexp, literal text).

    What ``_Patterns`` reads; ``grammar`` keeps a copy on disk (``terminals.json``) so a process whose
    statements the quick reader reads never has to build (or import) the LALR parser."""
    return {t.name: [type(t.pattern).__name__, t.pattern.to_regexp(), t.pattern.value]
            for t in lark_parser.terminals}


class _Patterns:
    """The terminals of the built grammar, compiled once."""

    def __init__(self, table: dict):
        terms = {name: _Terminal(*row) for name, row in table.items()}
        regex = {name: re.compile(t.regexp) for name, t in terms.items()}
        self.ws = regex["WS"]
        self.number = regex["NUMBER"]
        self.unit = regex["UNIT"]
        self.name = regex["NAME"]
        self.string = regex["STRING"]
        self.compare = regex["COMPARE"]
        # a word the grammar spells out ("check", and any keyword a later grammar adds) is not a plain name
        # wherever the grammar may expect it; only "check" at the start is read here, any other means bail
        self.keywords = frozenset(t.value for t in terms.values()
                                  if t.kind == "PatternStr" and self.name.fullmatch(t.value))
        extra = set(terms) - _KNOWN_TERMINALS
        # terminals this reader does not know: plain strings are fine (it never makes them, so text holding
        # them bails); a new pattern terminal could read known text differently, so the reader stays off
        self.usable = _KNOWN_TERMINALS <= set(terms) and all(
            bool(self.ws.match(c)) == (c in _WS_CHARS) for c in map(chr, range(0x3000))) and all(
            terms[name].kind == "PatternStr" for name in extra)


_KNOWN_TERMINALS = frozenset({"WS", "LPAR", "RPAR", "LSQB", "RSQB", "COMPARE", "MULOP", "NUMBER", "UNIT", "NAME",
                              "STRING", "CHECK", "EQUAL", "COMMA", "PLUS", "MINUS", "SLASH", "CIRCUMFLEX", "DOT"})
_patterns: _Patterns | None = None
_split_cache: dict[str, tuple] = {}
_decl_cache: dict[str, tuple] = {}


class _Terminal:
    __slots__ = ("kind", "regexp", "value")

    def __init__(self, kind: str, regexp: str, value: str):
        self.kind, self.regexp, self.value = kind, regexp, value


_set = False  # whether enable/disable has decided (until then ``grammar`` supplies the patterns on first use)


def enable(lark_parser) -> bool:
    """Take the terminal patterns from the built grammar; False (quick reader off) if it has unknown kinds."""
    return enable_table(terminal_table(lark_parser))


def enable_table(table: dict) -> bool:
    """Take the terminal patterns from ``terminal_table``'s data; False (quick reader off) if it has unknown
    kinds."""
    global _patterns, _set
    p = _Patterns(table)
    _patterns = p if p.usable else None
    _set = True
    return _patterns is not None


def disable() -> None:
    """Every statement through the grammar (tests compare the two readers this way)."""
    global _patterns, _set
    _patterns = None
    _set = True


def decided() -> bool:
    """Whether the reader has been switched on or off (by ``enable``/``enable_table``/``disable``)."""
    return _set


def flags_of(func: str, positional) -> tuple:
    """The words a built-in reads as flags, not names: ``lookup(tab.k, h=…, clamp)``. Both readers (the LALR
    tree builder and this one) call this, so they build the same nodes."""
    if func != "lookup":
        return tuple(positional)
    return tuple(N.Flag(name=a.id, span=a.span) if isinstance(a, N.Name) and a.id == "clamp" and i > 0 else a
                 for i, a in enumerate(positional))


def _split(text: str) -> tuple:
    hit = _split_cache.get(text)
    if hit is None:
        hit = split_unit(text)
        if len(_split_cache) < _CACHE_LIMIT:
            _split_cache[text] = hit
    return hit


def _declared(text: str) -> tuple:
    hit = _decl_cache.get(text)
    if hit is None:
        hit = parse_unit_text(text, None)  # raises for a bad unit: the grammar then reports it, located
        if len(_decl_cache) < _CACHE_LIMIT:
            _decl_cache[text] = hit
    return hit


def parse(text: str, line_offset: int = 0) -> N.Statement | None:
    """The statement's node, exactly as the grammar builds it, or None to let the grammar read it."""
    if _patterns is None:
        return None
    try:
        return _Reader(text, line_offset).statement()
    except (_Bail, RecursionError):
        return None
    except Exception:  # a callback's error (unit, number): the grammar raises it, in its own order
        return None


class _Reader:
    __slots__ = ("text", "pos", "n", "line0", "newlines", "depth", "p")

    def __init__(self, text: str, line_offset: int):
        self.text = text
        self.pos = 0
        self.n = len(text)
        self.line0 = line_offset + 1
        self.newlines = [i for i, ch in enumerate(text) if ch == "\n"] if "\n" in text else None
        self.depth = 0
        self.p = _patterns

    # ------------------------------------------------------------ positions
    def span(self, start: int, end: int) -> Span:
        """Line/column of text[start:end] as lark counts them: 1-based, end exclusive; the last character
        lies on the end line (no token holds a newline)."""
        nl = self.newlines
        if nl is None:
            return Span(self.line0, start + 1, self.line0, end + 1)
        k = bisect.bisect_left(nl, start)  # newlines before start
        j = bisect.bisect_left(nl, end - 1)  # newlines before the last character
        col = start + 1 if k == 0 else start - nl[k - 1]
        last = end if j == 0 else end - 1 - nl[j - 1]  # 1-based column of the last character
        return Span(self.line0 + k, col, self.line0 + j, last + 1)

    def skip(self):
        pos = self.pos
        if pos < self.n and self.text[pos] in _WS_CHARS:
            self.pos = self.p.ws.match(self.text, pos).end()

    def peek(self) -> str:
        pos = self.pos
        if pos < self.n and self.text[pos] in _WS_CHARS:
            pos = self.pos = self.p.ws.match(self.text, pos).end()
        return self.text[pos] if pos < self.n else ""

    def expect(self, ch: str) -> int:
        if self.peek() != ch:
            raise _Bail
        self.pos += 1
        return self.pos - 1

    def word(self, pattern) -> tuple[str, int, int]:
        self.skip()
        m = pattern.match(self.text, self.pos)
        if m is None or m.end() == self.pos:
            raise _Bail
        self.pos = m.end()
        return m.group(), m.start(), m.end()

    def plain(self, name: str) -> str:
        """A name anywhere but the start: a keyword of the grammar there is not for this reader."""
        if name in self.p.keywords:
            raise _Bail
        return name

    # ------------------------------------------------------------ statements
    def statement(self) -> N.Statement:
        name, a, b = self.word(self.p.name)
        if name in self.p.keywords and name != "check":
            raise _Bail
        if name == "check":  # the CHECK keyword (lark turns exactly this NAME into it here)
            left = self.expr()
            op = self.compare()
            right = self.expr()
            self.end()
            sp = _join(left.span, right.span)
            return N.Check(left=left, op=_CMP.get(op, op), right=right, span=Span(sp.line, 1, sp.end_line, sp.end_col))
        name_span = self.span(a, b)
        params = None
        ch = self.peek()
        if ch == "(":  # a sheet's own function: NAME ( param ("," param)* ) [unit] = expr
            self.pos += 1
            params = []
            while True:
                pname, pa, pb = self.word(self.p.name)
                self.plain(pname)
                pspan = self.span(pa, pb)
                punit, ptext, pspan_u = self.unit_decl()
                params.append(N.Param(name=pname, unit=punit, unit_text=ptext,
                                      span=_join(pspan, pspan_u) if pspan_u is not None else pspan,
                                      unit_span=pspan_u))
                ch = self.peek()
                if ch == ",":
                    self.pos += 1
                    continue
                if ch == ")":
                    self.pos += 1
                    break
                raise _Bail
        unit, unit_text, unit_span = self.unit_decl()
        if self.peek() != "=" or self.text.startswith("==", self.pos):
            raise _Bail  # not a definition: the grammar reads (and words) it
        self.pos += 1
        expr = self.expr()
        self.end()
        if params is not None:
            return N.FunctionDef(name=name, params=tuple(params), expr=expr, unit=unit, unit_text=unit_text,
                                 span=_join(name_span, expr.span), name_span=name_span, unit_span=unit_span)
        return N.Definition(name=name, expr=expr, unit=unit, unit_text=unit_text, span=_join(name_span, expr.span),
                            name_span=name_span, unit_span=unit_span)

    def unit_decl(self) -> tuple:
        """An optional declared unit ``[kN/m]`` (or ``[1]``): (factors, text, span), or three Nones."""
        if self.peek() != "[":
            return None, None, None
        self.pos += 1
        self.skip()
        c = self.text[self.pos:self.pos + 1]
        if c.isdigit():
            decl, da, db = self.word(self.p.number)
        else:
            decl, da, db = self.word(self.p.unit)
        self.expect("]")
        return _declared(decl), decl.strip(), self.span(da, db)

    def end(self):
        self.skip()
        if self.pos != self.n:
            raise _Bail

    def compare(self) -> str:
        self.skip()
        m = self.p.compare.match(self.text, self.pos)
        if m is None:
            raise _Bail
        self.pos = m.end()
        return m.group()

    # ------------------------------------------------------------ expressions
    def expr(self) -> N.Expr:
        self.depth += 1
        if self.depth > _MAX_NESTING:
            raise _Bail
        left = self.product()
        while True:
            ch = self.peek()
            if ch == "+" or ch == "-":
                self.pos += 1
                right = self.product()
                left = _BINOPS[ch](left=left, right=right, span=_join(left.span, right.span))
            else:
                break
        self.depth -= 1
        return left

    def product(self) -> N.Expr:
        left = self.unary()
        while True:
            ch = self.peek()
            if ch in ("*", "·", "×", "/"):
                self.pos += 1
                right = self.unary()
                left = _BINOPS[ch](left=left, right=right, span=_join(left.span, right.span))
            else:
                return left

    def unary(self) -> N.Expr:
        ch = self.peek()
        if ch == "-" or ch == "+":
            self.pos += 1
            self.depth += 1
            if self.depth > _MAX_NESTING:
                raise _Bail
            operand = self.unary()
            self.depth -= 1
            if ch == "+":
                return operand
            sp = operand.span
            return N.Neg(operand=operand, span=Span(sp.line, sp.col - 1, sp.end_line, sp.end_col))
        base = self.postfix()
        if self.peek() == "^":
            self.pos += 1
            self.depth += 1
            if self.depth > _MAX_NESTING:
                raise _Bail
            exponent = self.unary()
            self.depth -= 1
            return N.Pow(left=base, right=exponent, span=_join(base.span, exponent.span))
        return base

    def postfix(self) -> N.Expr:
        node = self.atom()
        while True:
            ch = self.peek()
            if ch == ".":
                self.pos += 1
                field, a, b = self.word(self.p.name)
                self.plain(field)
                fspan = self.span(a, b)
                node = N.FieldAccess(obj=node, field_name=field, span=_join(node.span, fspan), field_span=fspan)
            elif ch == "(":
                node = self.call(node)
            else:
                return node

    def call(self, callee: N.Expr) -> N.Expr:
        self.pos += 1  # "("
        positional: list[N.Expr] = []
        keywords: list[N.Keyword] = []
        if self.peek() != ")":
            while True:
                self.argument(positional, keywords)
                ch = self.peek()
                if ch == ",":
                    self.pos += 1
                    if self.peek() == ")":
                        break
                    continue
                if ch == ")":
                    break
                raise _Bail
        close = self.pos
        self.pos += 1
        span = _join(callee.span, self.span(close, close + 1))
        if isinstance(callee, N.Name):
            return N.Call(func=callee.id, args=flags_of(callee.id, positional), kwargs=tuple(keywords), span=span,
                          func_span=callee.span)
        if isinstance(callee, N.FieldAccess) and isinstance(callee.obj, N.Name):
            return N.PluginCall(namespace=callee.obj.id, func=callee.field_name, kwargs=tuple(keywords),
                                args=tuple(positional), span=span, func_span=callee.span)
        raise _Bail  # the grammar's callback words this error

    def argument(self, positional: list, keywords: list) -> None:
        self.skip()
        m = self.p.name.match(self.text, self.pos)
        if m is not None:
            after = self.p.ws.match(self.text, m.end())
            at = after.end() if after else m.end()
            if self.text.startswith("=", at) and not self.text.startswith("==", at):
                self.plain(m.group())
                self.pos = at + 1
                value = self.expr()
                nspan = self.span(m.start(), m.end())
                keywords.append(N.Keyword(name=m.group(), value=value, span=_join(nspan, value.span)))
                return
        left = self.expr()
        self.skip()
        m = self.p.compare.match(self.text, self.pos)
        if m is not None:
            self.pos = m.end()
            right = self.expr()
            op = m.group()
            positional.append(N.Compare(left=left, op=_CMP.get(op, op), right=right, span=_join(left.span, right.span)))
            return
        positional.append(left)

    def atom(self) -> N.Expr:
        ch = self.peek()
        t = self.text
        start = self.pos
        if ch.isdigit() or (ch == "." and t[start + 1:start + 2].isdigit()):
            m = self.p.number.match(t, start)
            if m is None or m.end() == start:
                raise _Bail
            num = m.group()
            if len(num) > 40:
                raise _Bail  # too long: the grammar's callback says so
            value = float(num)
            if value == 0.0 or value != value or value == _INF or value == -_INF:
                if value != 0.0 or any(c in "123456789" for c in num.lower().partition("e")[0]):
                    raise _Bail  # overflow or underflow: the grammar's callback words it
            self.pos = m.end()
            self.skip()
            u = self.p.unit.match(t, self.pos)
            if u is not None and u.end() > self.pos:
                self.pos = u.end()
                utext = u.group()
                return N.Number(value=value, text=num, unit=_split(utext), unit_text=utext,
                                span=self.span(start, u.end()))
            return N.Number(value=value, text=num, unit=(), unit_text="", span=self.span(start, m.end()))
        if ch == "(":
            self.pos += 1
            self.depth += 1
            if self.depth > _MAX_NESTING:
                raise _Bail
            inner = self.expr()
            self.depth -= 1
            if self.peek() != ")":
                raise _Bail  # a tuple (x, y), or an error: the grammar reads it
            close = self.pos
            self.pos += 1
            return N.Paren(inner=inner, span=self.span(start, close + 1))
        if ch == '"':
            m = self.p.string.match(t, start)
            if m is None:
                raise _Bail
            self.pos = m.end()
            return N.Text(value=m.group()[1:-1], span=self.span(start, m.end()))
        m = self.p.name.match(t, start)
        if m is None or m.end() == start:
            raise _Bail  # a list, or a character the grammar reports
        self.pos = m.end()
        return N.Name(id=self.plain(m.group()), span=self.span(start, m.end()))


_INF = float("inf")


def _join(a: Span, b: Span) -> Span:
    return Span(a.line, a.col, b.end_line, b.end_col)
