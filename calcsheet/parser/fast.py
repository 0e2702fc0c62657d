"""A quick reader for the everyday statement, giving exactly the nodes the LALR grammar gives.

Large sheets spent most of their parse in the general LALR machinery, one token at a time. Most statements
are short definitions and checks (``w [kN/m] = 1.2*g + 1.5*q``, ``check s <= 250 MPa``); this module reads
those with a small hand-written precedence parser over the *same* terminal patterns the grammar uses (taken
from the built LALR parser, so the two cannot drift apart on what a number, a unit or a name is).

A statement is cut into tokens by one master pattern made of those terminals (a number with the unit that
follows it, a name, a comparison, a string, a declared ``[unit]``, one operator character), in one pass of
the regular-expression engine; the precedence parser then walks the list of token kinds. A word right after
a number is its unit and a word inside ``[…]`` a declared unit, as the grammar's contextual lexer reads them.

The contract is one-sided: ``parse`` returns either ``None`` or the very node the grammar would build, spans
included. Anything it does not know, anything unusual and every error (a syntax error, a unit that does not
read, a number too long) gives ``None``, and the statement goes through the grammar, which owns every
diagnostic and its location. Tuples and a list of one item (which reads like a declared ``[unit]``) always
take that road.
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

_WS_CHARS = " \t\f\r\n"  # the characters the grammar's WS matches (checked in _Patterns)

# token kinds: the number of the master pattern's group that matched (``Match.lastindex``)
_END = 0  # past the last token
_NUM, _NUMU, _NAME, _COMPARE, _STRING, _DNUM, _DUNIT = 1, 2, 3, 4, 5, 6, 7
_PLUS, _MINUS, _MUL, _DIV, _POW, _LPAR, _RPAR, _COMMA, _DOT, _EQ, _LSQB, _RSQB, _OTHER = range(8, 21)
_SINGLE = ((_PLUS, r"\+"), (_MINUS, "-"), (_MUL, "[*·×]"), (_DIV, "/"), (_POW, r"\^"), (_LPAR, r"\("),
           (_RPAR, r"\)"), (_COMMA, ","), (_DOT, r"\."), (_EQ, "="), (_LSQB, r"\["), (_RSQB, r"\]"))


class _Bail(Exception):
    """This statement is not one the quick reader vouches for: the grammar reads it."""


def terminal_table(lark_parser) -> dict:
    """The terminals of a built grammar as plain data: name -> (kind of pattern, regexp, literal text).

    What ``_Patterns`` reads; ``grammar`` keeps a copy on disk (``terminals.json``) so a process whose
    statements the quick reader reads never has to build (or import) the LALR parser."""
    return {t.name: [type(t.pattern).__name__, t.pattern.to_regexp(), t.pattern.value]
            for t in lark_parser.terminals}


def _master(ws: str, number: str, unit: str, name: str, compare: str, string: str) -> str:
    """The one pattern that cuts a statement into tokens; group n matches a token of kind n."""
    w = f"(?:{ws})?"
    alts = [
        f"({number})(?:{w}({unit}))?",  # 1 a number, 2 with its unit
        f"({name})",  # 3
        f"({compare})",  # 4
        f"({string})",  # 5
        rf"\[{w}(?:((?=[0-9])(?:{number}))|({unit})){w}\]",  # 6 a declared [number], 7 a declared [unit]
        *(f"({p})" for _, p in _SINGLE),  # 8 … 19 (a '[' here opens a list: a [unit] was tried first)
        r"([\s\S])",  # 20 anything else: the grammar's business
    ]
    return w + "(?:" + "|".join(alts) + ")"


class _Patterns:
    """The terminals of the built grammar, compiled once, and the master pattern made of them."""

    def __init__(self, table: dict):
        terms = {name: _Terminal(*row) for name, row in table.items()}
        regex = {name: re.compile(t.regexp) for name, t in terms.items()}
        self.ws = regex["WS"]
        # a word the grammar spells out ("check", and any keyword a later grammar adds) is not a plain name
        # wherever the grammar may expect it; only "check" at the start is read here, any other means bail
        self.keywords = frozenset(t.value for t in terms.values()
                                  if t.kind == "PatternStr" and regex["NAME"].fullmatch(t.value))
        extra = set(terms) - _KNOWN_TERMINALS
        # terminals this reader does not know: plain strings are fine (it never makes them, so text holding
        # them bails); a new pattern terminal could read known text differently, so the reader stays off.
        # The master pattern numbers its own groups: a terminal with a group of its own would shift them.
        self.usable = _KNOWN_TERMINALS <= set(terms) and all(
            bool(self.ws.match(c)) == (c in _WS_CHARS) for c in map(chr, range(0x3000))) and all(
            terms[name].kind == "PatternStr" for name in extra) and all(
            regex[name].groups == 0 for name in _KNOWN_TERMINALS)
        if self.usable:
            self.tokens = re.compile(_master(*(terms[k].regexp for k in
                                               ("WS", "NUMBER", "UNIT", "NAME", "COMPARE", "STRING"))))
            self.usable = self.tokens.groups == _OTHER


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


def parse(text: str, line_offset: int = 0, description: str | None = None,
          comment: str | None = None) -> N.Statement | None:
    """The statement's node, exactly as the grammar builds it, or None to let the grammar read it.

    ``description`` and ``comment`` (cut off the line by ``lines``) go into the node as it is made: the
    same node as ``dataclasses.replace`` of the grammar's, without making it twice."""
    if _patterns is None:
        return None
    try:
        return _Reader(text, line_offset, _patterns).statement(description, comment)
    except (_Bail, RecursionError):
        return None
    except Exception:  # a callback's error (unit, number): the grammar raises it, in its own order
        return None


_INF = float("inf")


def _float_of(num: str) -> float:
    """A number literal's value; a literal the grammar's callback words an error for (too long, overflowing
    or underflowing) is left to the grammar."""
    if len(num) > 40:
        raise _Bail  # too long: the grammar's callback says so
    value = float(num)
    if value == 0.0 or value != value or value == _INF or value == -_INF:
        if value != 0.0 or any(c in "123456789" for c in num.lower().partition("e")[0]):
            raise _Bail  # overflow or underflow: the grammar's callback words it
    return value


class _Reader:
    """One statement's tokens (``kinds``, ``matches``) and the place ``i`` reached in them."""

    __slots__ = ("kinds", "matches", "i", "line0", "newlines", "depth", "keywords")

    def __init__(self, text: str, line_offset: int, p: _Patterns):
        matches = list(p.tokens.finditer(text.rstrip(_WS_CHARS)))
        kinds = [m.lastindex for m in matches]
        kinds.append(_END)
        self.kinds = kinds
        self.matches = matches
        self.i = 0
        self.line0 = line_offset + 1
        self.newlines = [i for i, ch in enumerate(text) if ch == "\n"] if "\n" in text else None
        self.depth = 0
        self.keywords = p.keywords

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

    def name(self) -> tuple[str, Span]:
        """A plain name (a keyword of the grammar there is not for this reader) and its span."""
        i = self.i
        if self.kinds[i] != _NAME:
            raise _Bail
        m = self.matches[i]
        word = m.group(_NAME)
        if word in self.keywords:
            raise _Bail
        self.i = i + 1
        return word, self.span(m.start(_NAME), m.end(_NAME))

    # ------------------------------------------------------------ statements
    def statement(self, description: str | None = None, comment: str | None = None) -> N.Statement:
        kinds = self.kinds
        if kinds[0] != _NAME:
            raise _Bail
        m = self.matches[0]
        name = m.group(_NAME)
        if name in self.keywords and name != "check":
            raise _Bail
        self.i = 1
        if name == "check":  # the CHECK keyword (lark turns exactly this NAME into it here)
            left = self.expr()
            i = self.i
            if kinds[i] != _COMPARE:
                raise _Bail
            op = self.matches[i].group(_COMPARE)
            self.i = i + 1
            right = self.expr()
            if kinds[self.i] != _END:
                raise _Bail
            a, b = left.span, right.span
            return N.Check(left=left, op=_CMP.get(op, op), right=right, span=Span(a.line, 1, b.end_line, b.end_col),
                           description=description, comment=comment)
        a, b = m.span(_NAME)
        line = self.line0
        name_span = Span(line, a + 1, line, b + 1) if self.newlines is None else self.span(a, b)
        params = None
        if kinds[1] == _LPAR:  # a sheet's own function: NAME ( param ("," param)* ) [unit] = expr
            self.i = 2
            params = []
            while True:
                pname, pspan = self.name()
                punit, ptext, pspan_u = self.unit_decl()
                params.append(N.Param(name=pname, unit=punit, unit_text=ptext,
                                      span=_join(pspan, pspan_u) if pspan_u is not None else pspan,
                                      unit_span=pspan_u))
                k = kinds[self.i]
                self.i += 1
                if k == _COMMA:
                    continue
                if k == _RPAR:
                    break
                raise _Bail
        unit, unit_text, unit_span = self.unit_decl()
        if kinds[self.i] != _EQ:
            raise _Bail  # not a definition (or '=='): the grammar reads (and words) it
        self.i += 1
        expr = self.expr()
        if kinds[self.i] != _END:
            raise _Bail
        es = expr.span
        if params is not None:
            return N.FunctionDef(name=name, params=tuple(params), expr=expr, unit=unit, unit_text=unit_text,
                                 span=Span(name_span.line, name_span.col, es.end_line, es.end_col),
                                 name_span=name_span, unit_span=unit_span, description=description, comment=comment)
        return N.Definition(name=name, expr=expr, unit=unit, unit_text=unit_text,
                            span=Span(name_span.line, name_span.col, es.end_line, es.end_col),
                            name_span=name_span, unit_span=unit_span, description=description, comment=comment)

    def unit_decl(self) -> tuple:
        """An optional declared unit ``[kN/m]`` (or ``[1]``): (factors, text, span), or three Nones."""
        i = self.i
        k = self.kinds[i]
        if k != _DNUM and k != _DUNIT:
            return None, None, None
        m = self.matches[i]
        decl = m.group(k)
        if k == _DUNIT and decl[0].isdigit():
            raise _Bail  # a digit the number pattern does not read (²): the grammar says what it is
        self.i = i + 1
        a, b = m.span(k)
        if self.newlines is None:
            line = self.line0
            return _decl_cache.get(decl) or _declared(decl), decl.strip(), Span(line, a + 1, line, b + 1)
        return _declared(decl), decl.strip(), self.span(a, b)

    # ------------------------------------------------------------ expressions
    def expr(self) -> N.Expr:
        """A sum of products, each operator left-associative, products binding tighter."""
        self.depth += 1
        if self.depth > _MAX_NESTING:
            raise _Bail
        kinds = self.kinds
        left = self.unary()
        while True:
            k = kinds[self.i]
            if k == _MUL or k == _DIV:
                self.i += 1
                right = self.unary()
                a, b = left.span, right.span
                left = (N.Mul if k == _MUL else N.Div)(left, right, Span(a.line, a.col, b.end_line, b.end_col))
            elif k == _PLUS or k == _MINUS:
                self.i += 1
                right = self.unary()
                k2 = kinds[self.i]
                while k2 == _MUL or k2 == _DIV:  # the product on the right of + or - first
                    self.i += 1
                    r2 = self.unary()
                    a, b = right.span, r2.span
                    right = (N.Mul if k2 == _MUL else N.Div)(right, r2, Span(a.line, a.col, b.end_line, b.end_col))
                    k2 = kinds[self.i]
                a, b = left.span, right.span
                left = (N.Add if k == _PLUS else N.Sub)(left, right, Span(a.line, a.col, b.end_line, b.end_col))
            else:
                break
        self.depth -= 1
        return left

    def unary(self) -> N.Expr:
        """A signed operand, or a postfix chain with an optional power (right-associative)."""
        kinds = self.kinds
        i = self.i
        k = kinds[i]
        if k == _MINUS or k == _PLUS:
            self.i = i + 1
            self.depth += 1
            if self.depth > _MAX_NESTING:
                raise _Bail
            operand = self.unary()
            self.depth -= 1
            if k == _PLUS:
                return operand
            sp = operand.span
            return N.Neg(operand, Span(sp.line, sp.col - 1, sp.end_line, sp.end_col))
        if k == _NAME and self.newlines is None:  # the everyday operand, on one line: atom() written out
            m = self.matches[i]
            word = m.group(_NAME)
            if word in self.keywords:
                raise _Bail
            i += 1
            self.i = i
            a, b = m.span(_NAME)
            line = self.line0
            node = N.Name(word, Span(line, a + 1, line, b + 1))
            k = kinds[i]
            if k == _MUL or k == _DIV or k == _PLUS or k == _MINUS or k == _END or k == _RPAR or k == _COMMA \
                    or k == _COMPARE:
                return node  # no field, call or power follows
        elif (k == _NUMU or k == _NUM) and self.newlines is None:  # a number on one line: atom() written out
            m = self.matches[i]
            num = m.group(_NUM)
            value = _float_of(num)
            i += 1
            self.i = i
            line = self.line0
            if k == _NUMU:
                utext = m.group(_NUMU)
                node = N.Number(value, num, _split_cache.get(utext) or _split(utext), utext,
                                Span(line, m.start(_NUM) + 1, line, m.end(_NUMU) + 1))
            else:
                a, b = m.span(_NUM)
                node = N.Number(value, num, (), "", Span(line, a + 1, line, b + 1))
            k = kinds[i]
            if k == _MUL or k == _DIV or k == _PLUS or k == _MINUS or k == _END or k == _RPAR or k == _COMMA \
                    or k == _COMPARE:
                return node  # no field, call or power follows
        else:
            node = self.atom(k, i)
            k = kinds[self.i]
        while k == _DOT or k == _LPAR:
            if k == _DOT:
                self.i += 1
                field, fspan = self.name()
                sp = node.span
                node = N.FieldAccess(obj=node, field_name=field, span=Span(sp.line, sp.col, fspan.end_line,
                                                                            fspan.end_col), field_span=fspan)
            else:
                node = self.call(node)
            k = kinds[self.i]
        if k == _POW:
            self.i += 1
            self.depth += 1
            if self.depth > _MAX_NESTING:
                raise _Bail
            exponent = self.unary()
            self.depth -= 1
            a, b = node.span, exponent.span
            return N.Pow(node, exponent, Span(a.line, a.col, b.end_line, b.end_col))
        return node

    def atom(self, k: int, i: int) -> N.Expr:
        if k == _NAME:
            m = self.matches[i]
            word = m.group(_NAME)
            if word in self.keywords:
                raise _Bail
            self.i = i + 1
            a, b = m.span(_NAME)
            if self.newlines is None:
                line = self.line0
                return N.Name(word, Span(line, a + 1, line, b + 1))
            return N.Name(word, self.span(a, b))
        if k == _NUM or k == _NUMU:
            m = self.matches[i]
            num = m.group(_NUM)
            value = _float_of(num)
            self.i = i + 1
            a = m.start(_NUM)
            if k == _NUMU:
                utext = m.group(_NUMU)
                unit = _split_cache.get(utext) or _split(utext)
                b = m.end(_NUMU)
            else:
                utext, unit, b = "", (), m.end(_NUM)
            if self.newlines is None:
                line = self.line0
                return N.Number(value, num, unit, utext, Span(line, a + 1, line, b + 1))
            return N.Number(value, num, unit, utext, self.span(a, b))
        if k == _LPAR:
            start = self.matches[i].start(_LPAR)
            self.i = i + 1
            inner = self.expr()
            i = self.i
            if self.kinds[i] != _RPAR:
                raise _Bail  # a tuple (x, y), or an error: the grammar reads it
            self.i = i + 1
            return N.Paren(inner, self.span(start, self.matches[i].end(_RPAR)))
        if k == _STRING:
            m = self.matches[i]
            self.i = i + 1
            return N.Text(m.group(_STRING)[1:-1], self.span(m.start(_STRING), m.end(_STRING)))
        if k == _LSQB:  # a list: [a, b, c], [a, b,] or []
            kinds = self.kinds
            start = self.matches[i].start(_LSQB)
            self.i = i + 1
            items = []
            if kinds[self.i] != _RSQB:
                while True:
                    items.append(self.expr())
                    k = kinds[self.i]
                    if k == _COMMA:
                        self.i += 1
                        if kinds[self.i] == _RSQB:
                            break
                        continue
                    if k == _RSQB:
                        break
                    raise _Bail
            close = self.i
            self.i = close + 1
            return N.ListExpr(tuple(items), self.span(start, self.matches[close].end(_RSQB)))
        raise _Bail  # a one-item list, the end, or a character the grammar reports

    def call(self, callee: N.Expr) -> N.Expr:
        kinds = self.kinds
        self.i += 1  # "("
        positional: list[N.Expr] = []
        keywords: list[N.Keyword] = []
        if kinds[self.i] != _RPAR:
            while True:
                self.argument(positional, keywords)
                k = kinds[self.i]
                if k == _COMMA:
                    self.i += 1
                    if kinds[self.i] == _RPAR:
                        break
                    continue
                if k == _RPAR:
                    break
                raise _Bail
        m = self.matches[self.i]
        self.i += 1
        sp = callee.span
        close = self.span(m.start(_RPAR), m.end(_RPAR))
        span = Span(sp.line, sp.col, close.end_line, close.end_col)
        if isinstance(callee, N.Name):
            return N.Call(func=callee.id, args=flags_of(callee.id, positional), kwargs=tuple(keywords), span=span,
                          func_span=callee.span)
        if isinstance(callee, N.FieldAccess) and isinstance(callee.obj, N.Name):
            return N.PluginCall(namespace=callee.obj.id, func=callee.field_name, kwargs=tuple(keywords),
                                args=tuple(positional), span=span, func_span=callee.span)
        raise _Bail  # the grammar's callback words this error

    def argument(self, positional: list, keywords: list) -> None:
        kinds = self.kinds
        i = self.i
        if kinds[i] == _NAME and kinds[i + 1] == _EQ:  # name = value ('==' bails: '=' starts no value)
            name, nspan = self.name()
            self.i += 1
            value = self.expr()
            vs = value.span
            keywords.append(N.Keyword(name=name, value=value, span=Span(nspan.line, nspan.col, vs.end_line,
                                                                         vs.end_col)))
            return
        left = self.expr()
        i = self.i
        if kinds[i] == _COMPARE:
            op = self.matches[i].group(_COMPARE)
            self.i = i + 1
            right = self.expr()
            positional.append(N.Compare(left=left, op=_CMP.get(op, op), right=right, span=_join(left.span, right.span)))
            return
        positional.append(left)


def _join(a: Span, b: Span) -> Span:
    return Span(a.line, a.col, b.end_line, b.end_col)
