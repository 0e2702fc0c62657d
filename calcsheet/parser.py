"""Sheet text -> AST. The only module that knows lark exists.

The sheet is first split into logical lines (front matter, headings, prose,
comments, statements continuing inside open brackets); each statement is
then parsed on its own by an LALR grammar, so one bad line gives one error
and the rest of the sheet is still read.
"""
from __future__ import annotations

import re
from functools import lru_cache
from importlib import resources

from lark import Lark, Token, Transformer
from lark.exceptions import UnexpectedCharacters, UnexpectedEOF, UnexpectedInput, UnexpectedToken, VisitError

from . import nodes as N
from .errors import CalcError, Diagnostic, FrontMatterError, SheetErrors, SheetSyntaxError, Span, TooComplexError

MAX_SHEET_BYTES = 2_000_000
MAX_STATEMENT_CHARS = 20_000
MAX_DEPTH = 200
MAX_NUMBER_CHARS = 40


@lru_cache(maxsize=1)
def _lark() -> Lark:
    """The parser, with our transformer applied during parsing: no parse tree is built."""
    grammar = resources.files("calcsheet").joinpath("grammar.lark").read_text(encoding="utf-8")
    from .units import VOCABULARY

    names = sorted((n for n in VOCABULARY if re.fullmatch(r"[^\W\d]\w*", n)), key=len, reverse=True)
    grammar = grammar.replace("{unit_names}", "|".join(re.escape(n) for n in names))
    return Lark(grammar, parser="lalr", lexer="contextual", maybe_placeholders=True, transformer=_TRANSFORMER)


# ------------------------------------------------------------ parse tree -> AST


def _tok_span(tok: Token, line_offset: int) -> Span:
    return Span(tok.line + line_offset, tok.column, tok.end_line + line_offset, tok.end_column)


_SUPER = str.maketrans("²³⁴", "234")


def split_unit(text: str) -> tuple[tuple[str, float], ...]:
    """'kN/m^2' -> (('kN', 1), ('m', -2)). The grammar has already vetted the shape."""
    factors: list[tuple[str, float]] = []
    sign = 1
    for piece in re.split(r"([*/·])", text.replace(" ", "")):
        if piece in ("*", "·"):
            sign = 1
            continue
        if piece == "/":
            sign = -1
            continue
        if not piece:
            continue
        m = re.fullmatch(r"(.+?)(?:\^(-?[0-9]+(?:\.[0-9]+)?)|([²³⁴]))?", piece)
        name, exp, sup = m.group(1), m.group(2), m.group(3)
        power = float(exp) if exp else float(sup.translate(_SUPER)) if sup else 1.0
        factors.append((name, sign * power))
    return tuple(factors)


_UNIT_TEXT = re.compile(
    r"\s*(?:[^\W\d]\w*|%|°)(?:\^-?[0-9]+|[²³⁴])?(?:\s*[*/·]\s*(?:[^\W\d]\w*)(?:\^-?[0-9]+|[²³⁴])?)*\s*"
)


def parse_unit_text(text: str, span: Span | None = None) -> tuple[tuple[str, float], ...]:
    """A declared unit ``[kN*m]`` (or a plugin's ``unit=`` string); '1' and '-' mean dimensionless."""
    stripped = text.strip()
    if stripped in ("1", "-", ""):
        return ()
    if not _UNIT_TEXT.fullmatch(stripped):
        raise SheetSyntaxError(
            f"'{stripped}' is not a unit", span, hint="write units like kN*m, N/mm^2, mm^4 (no numbers or brackets)"
        )
    return split_unit(stripped)


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
        return _tok_span(part, _TRANSFORMER.off)
    if isinstance(part, (list, tuple)):
        return _span_of(*part)
    return getattr(part, "span", None)


def _is_bracket(part) -> bool:
    return isinstance(part, Token) and part.type in ("LPAR", "RPAR", "LSQB", "RSQB")


class _ToAst(Transformer):
    """Builds our nodes while lark parses; spans come from the tokens (brackets included)."""

    def __init__(self):
        super().__init__()
        self.off = 0  # line offset of the statement being parsed; set by parse_statement

    def definition(self, children):
        name_tok, decl, expr = children
        unit = unit_text = unit_span = None
        if decl is not None:
            unit_text, unit_span = decl
            unit = parse_unit_text(unit_text, unit_span)
        return N.Definition(
            name=str(name_tok), expr=expr, unit=unit, unit_text=unit_text.strip() if unit_text else None,
            span=_span_of(name_tok, expr), name_span=_tok_span(name_tok, self.off), unit_span=unit_span,
        )

    def unit_decl(self, children):
        tok = children[1]
        return str(tok), _tok_span(tok, self.off)

    def check(self, children):
        left, op, right = children
        op = {"≤": "<=", "≥": ">="}.get(str(op), str(op))
        span = _span_of(left, right)
        span = Span(span.line, 1, span.end_line, span.end_col) if span else None
        return N.Check(left=left, op=op, right=right, span=span)

    def _bin(cls):  # noqa: N805 - a small factory for the five operators
        def build(self, children):
            left, right = children[0], children[-1]
            return cls(left=left, right=right, span=_span_of(left, right))

        return build

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
            raise TooComplexError("number literal is too long", _tok_span(num_tok, self.off))
        unit = split_unit(str(unit_tok)) if unit_tok is not None else ()
        return N.Number(
            value=float(text), text=text, unit=unit, unit_text=str(unit_tok) if unit_tok is not None else "",
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
                             field_span=_tok_span(name_tok, self.off))

    def compare(self, children):
        left, op, right = children
        op = {"≤": "<=", "≥": ">="}.get(str(op), str(op))
        return N.Compare(left=left, op=op, right=right, span=_span_of(left, right))

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
            return N.Call(func=callee.id, args=positional, kwargs=keywords, span=span, func_span=callee.span)
        if isinstance(callee, N.FieldAccess) and isinstance(callee.obj, N.Name):
            return N.PluginCall(namespace=callee.obj.id, func=callee.field_name, kwargs=keywords, args=positional,
                                span=span, func_span=callee.span)
        raise SheetSyntaxError("only a function name or plugin.function can be called", span)


_TRANSFORMER = _ToAst()


# ------------------------------------------------------------ friendly syntax errors

_TOKEN_WORDS = {
    "NAME": "a name", "NUMBER": "a number", "UNIT": "a unit", "STRING": "a text in quotes",
    "LPAR": "'('", "RPAR": "')'", "LSQB": "'['", "RSQB": "']'", "COMMA": "','", "EQUAL": "'='",
    "PLUS": "'+'", "MINUS": "'-'", "SLASH": "'/'", "CIRCUMFLEX": "'^'", "MULOP": "'*'", "COMPARE": "a comparison",
    "DOT": "'.'", "$END": "the end of the line",
}


def _friendly(exc: UnexpectedInput, text: str, line_offset: int) -> SheetSyntaxError:
    line = exc.line + line_offset if exc.line and exc.line > 0 else line_offset + 1
    col = exc.column if exc.column and exc.column > 0 else 1
    stripped = text.strip()
    hint = None
    if isinstance(exc, UnexpectedCharacters):
        ch = text[exc.pos_in_stream] if exc.pos_in_stream < len(text) else ""
        msg = f"unexpected character {ch!r}"
        if ch == "=" and stripped.startswith("check"):
            msg, hint = "a check compares with <=, <, >= or >", "write check a <= b"
        elif ch == "=":
            msg = "unexpected '='"
            hint = "a definition is name = expression; a check is check a <= b"
        return SheetSyntaxError(msg, Span(line, col, line, col + 1), hint=hint)
    if isinstance(exc, UnexpectedEOF):
        end = text.rstrip("\n ").splitlines() or [""]
        lines = text.rstrip("\n ").count("\n")
        return SheetSyntaxError("the statement ends too early", Span(line_offset + lines + 1, len(end[-1]) + 1,
                                                                     line_offset + lines + 1, len(end[-1]) + 2),
                                hint="is an operand or a closing bracket missing?")
    tok = exc.token
    expected = getattr(exc, "expected", set()) or set()
    width = max(1, len(str(tok))) if tok.type != "$END" else 1
    span = Span(line, col, line, col + width)
    if tok.type == "$END":
        if "RPAR" in expected or "RSQB" in expected:
            return SheetSyntaxError("a bracket is not closed", span, hint="close every '(' and '['")
        return SheetSyntaxError("the statement ends too early", span, hint="is an operand missing?")
    if "EQUAL" in expected and tok.type in ("NAME", "UNIT", "NUMBER", "STRING", "LPAR"):
        hint = "start prose lines with '>' and headings with '#'; a calculation line is name = expression"
        return SheetSyntaxError(f"this line is not a calculation: unexpected {str(tok)!r}", span, hint=hint)
    if tok.type == "EQUAL" and text.lstrip().startswith("check"):
        return SheetSyntaxError("a check compares with <=, <, >= or >", span, hint="write check a <= b")
    if tok.type in ("NAME", "UNIT", "NUMBER", "LPAR", "STRING"):
        if tok.type in ("NAME", "UNIT") and any(e in expected for e in ("PLUS", "MULOP", "$END")):
            hint = "put an operator between values (a unit follows a number directly: 5 kN/m)"
        return SheetSyntaxError(f"unexpected {str(tok)!r}: an operator is missing", span, hint=hint)
    words = sorted({_TOKEN_WORDS.get(e, e) for e in expected if not e.startswith("__")})
    wanted = ", ".join(words[:6])
    return SheetSyntaxError(f"unexpected {str(tok)!r}" + (f"; expected {wanted}" if wanted else ""), span, hint=hint)


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
    parser = _lark()
    _TRANSFORMER.off = line_offset
    try:
        node = parser.parse(text)
    except UnexpectedInput as exc:
        raise _friendly(exc, text, line_offset) from None
    except VisitError as exc:
        if isinstance(exc.orig_exc, CalcError):
            raise exc.orig_exc from None
        raise
    if _depth(node) > MAX_DEPTH:
        raise TooComplexError(f"expression is nested more than {MAX_DEPTH} levels deep", node.span,
                              hint="split it into named intermediate values")
    return node


@lru_cache(maxsize=4096)
def parse_expression(text: str) -> N.Expr:
    """A plugin's formula (trusted text): ``b*h^3/12``."""
    stmt = parse_statement(f"_ = {text}")
    return stmt.expr


# ------------------------------------------------------------ the sheet splitter

_HEADING = re.compile(r"(#{1,4})\s+(.*\S)\s*$")


def _strip_trailing(line: str) -> tuple[str, str | None, str | None]:
    """Blank out ``-- description`` and ``// comment`` outside strings; keep columns."""
    if "--" not in line and "//" not in line:
        return line, None, None
    in_str = False
    desc_at = comment_at = None
    i = 0
    while i < len(line):
        ch = line[i]
        if ch == '"':
            in_str = not in_str
        elif not in_str and line.startswith("//", i) and comment_at is None:
            comment_at = i
            break
        elif not in_str and line.startswith("--", i) and desc_at is None:
            desc_at = i
            # a description runs to a comment marker or the end
            j = line.find("//", i + 2)
            comment_at = j if j >= 0 else None
            break
        i += 1
    code_end = min(x for x in (desc_at, comment_at, len(line)) if x is not None)
    desc = None
    comment = None
    if desc_at is not None:
        end = comment_at if comment_at is not None else len(line)
        desc = line[desc_at + 2:end].strip() or None
    if comment_at is not None:
        comment = line[comment_at + 2:].strip() or None
    return line[:code_end] + " " * (len(line) - code_end), desc, comment


def _bracket_delta(code: str) -> int:
    depth = 0
    in_str = False
    for ch in code:
        if ch == '"':
            in_str = not in_str
        elif not in_str:
            if ch in "([":
                depth += 1
            elif ch in ")]":
                depth -= 1
    return depth


_NEW_STATEMENT = re.compile(r"(check\s|[^\W\d]\w*\s*(\[[^\]]*\])?\s*=(?!=))")


def _ends_open_statement(next_line: str) -> bool:
    """An unclosed bracket must not swallow the sheet: a heading, prose or an
    unindented new definition ends the statement (and the parser reports it)."""
    stripped = next_line.strip()
    if stripped.startswith(("#", ">", "//")):
        return True
    return next_line[:1] not in (" ", "\t") and bool(_NEW_STATEMENT.match(next_line))


def _parse_front_matter(lines: list[str], path: str) -> tuple[dict, int, list[Diagnostic]]:
    """``---`` block of ``key: value`` lines; list values as indented ``- item`` lines."""
    meta: dict = {}
    diags: list[Diagnostic] = []
    i = 0
    while i < len(lines) and not lines[i].strip():
        i += 1
    if i >= len(lines) or lines[i].strip() != "---":
        return meta, 0, diags
    start = i
    i += 1
    current_list: list | None = None
    while i < len(lines):
        raw = lines[i]
        text = raw.strip()
        if text == "---":
            return meta, i + 1, diags
        if not text or text.startswith("//"):
            i += 1
            continue
        if text.startswith("- ") and current_list is not None:
            current_list.append(text[2:].strip())
        elif ":" in text:
            key, _, value = text.partition(":")
            key = key.strip()
            value = value.strip()
            if not re.fullmatch(r"[A-Za-z_][\w-]*", key):
                diags.append(FrontMatterError(f"'{key}' is not a front matter key",
                                              Span(i + 1, 1, i + 1, len(raw) + 1)).diagnostic(path))
            elif value:
                meta[key] = value
                current_list = None
            else:
                current_list = meta.setdefault(key, [])
        else:
            diags.append(FrontMatterError("front matter lines are 'key: value'",
                                          Span(i + 1, 1, i + 1, len(raw) + 1)).diagnostic(path))
        i += 1
    diags.append(FrontMatterError("front matter is not closed with '---'",
                                  Span(start + 1, 1, start + 1, 4)).diagnostic(path))
    return meta, len(lines), diags


def parse_sheet(source: str, path: str = "<sheet>", collect: bool = True, *,
                _includes: "_IncludeState | None" = None) -> tuple[N.Sheet, list[Diagnostic]]:
    """The whole sheet. With ``collect`` every syntax error is returned; otherwise the first is raised.

    ``include "file.calc"`` lines splice another sheet's body in at that point; see ``_include``.
    """
    state = _includes or _IncludeState.for_sheet(path)
    if len(source.encode("utf-8", "surrogatepass")) > MAX_SHEET_BYTES:
        err = TooComplexError(f"sheet is larger than {MAX_SHEET_BYTES // 1_000_000} MB", Span(1, 1, 1, 2))
        raise SheetErrors([err.diagnostic(path)], source)
    source = source.replace("\r\n", "\n").replace("\r", "\n")
    if source.startswith("\ufeff"):
        source = source[1:]
    lines = source.split("\n")
    meta, i, diags = _parse_front_matter(lines, path)
    body: list[N.Statement] = []
    prose_buf: list[str] = []
    prose_start = 0

    def flush_prose():
        nonlocal prose_buf
        if prose_buf:
            text = "\n".join(prose_buf).strip("\n")
            body.append(N.Prose(text=text, span=Span(prose_start, 1, prose_start + len(prose_buf) - 1, 2)))
            prose_buf = []

    while i < len(lines):
        raw = lines[i]
        lineno = i + 1
        text = raw.strip()
        if text.startswith(">"):
            if not prose_buf:
                prose_start = lineno
            prose_buf.append(text[1:].strip())
            i += 1
            continue
        flush_prose()
        if not text or text.startswith("//"):
            i += 1
            continue
        inc = _INCLUDE.match(text)
        if inc:
            span = Span(lineno, 1, lineno, len(raw) + 1)
            stmts, sub_diags = _include(inc.group(1), span, path, state)
            body.extend(stmts)
            diags.extend(sub_diags)
            i += 1
            continue
        m = _HEADING.match(text)
        if m:
            body.append(N.Heading(level=len(m.group(1)), text=m.group(2).strip(),
                                  span=Span(lineno, 1, lineno, len(raw) + 1)))
            i += 1
            continue
        if text.startswith("#"):
            diags.append(SheetSyntaxError("a heading needs a space after '#'", Span(lineno, 1, lineno, 2),
                                          hint="write '# Loads'").diagnostic(path))
            i += 1
            continue
        # a statement, continuing over lines while brackets are open
        code_lines, descs, comments = [], [], []
        depth = 0
        j = i
        while j < len(lines):
            code, desc, comment = _strip_trailing(lines[j])
            code_lines.append(code)
            if desc:
                descs.append(desc)
            if comment:
                comments.append(comment)
            depth += _bracket_delta(code)
            j += 1
            if depth <= 0:
                break
            if j < len(lines) and _ends_open_statement(lines[j]):
                # a heading or prose line ends an unclosed statement; report it there
                break
        i = j
        stmt_text = "\n".join(code_lines)
        try:
            stmt = parse_statement(stmt_text, line_offset=lineno - 1)
        except CalcError as exc:
            if not collect:
                raise SheetErrors([exc.diagnostic(path)], source) from None
            diags.append(exc.diagnostic(path))
            continue
        extra = {}
        if descs:
            extra["description"] = " ".join(descs)
        if comments:
            extra["comment"] = " ".join(comments)
        if extra:
            stmt = _replace(stmt, **extra)
        body.append(stmt)
    flush_prose()
    sheet = N.Sheet(meta=tuple(meta.items()), body=tuple(body), path=path, source=source,
                    includes=tuple(state.sources) if _includes is None else ())
    return sheet, diags


# ------------------------------------------------------------ includes

_INCLUDE = re.compile(r'include\s+"([^"\n]*)"\s*(?:(?://|--).*)?$')
MAX_INCLUDE_DEPTH = 8
MAX_INCLUDES = 64


class _IncludeState:
    """What a sheet may include: .calc files inside the main sheet's own folder, no cycles."""

    def __init__(self, root, main):
        self.root = root  # resolved folder of the main sheet, or None for a sheet given as text
        self.stack = [main] if main else []
        self.sources: list[tuple[str, str]] = []

    @classmethod
    def for_sheet(cls, path: str) -> "_IncludeState":
        from pathlib import Path

        if path.startswith("<") or not Path(path).is_file():
            return cls(None, None)
        p = Path(path).resolve()
        return cls(p.parent, p)


def _include(target: str, span: Span, path: str, state: _IncludeState):
    """Parse an included sheet; every span in it carries its own path."""
    import os
    from pathlib import Path

    from .errors import IncludeError

    def refuse(message, hint=None):
        return [], [IncludeError(message, span, hint=hint).diagnostic(path)]

    if state.root is None:
        return refuse("include needs the sheet to be a file (its folder is where includes are looked for)")
    if not target.endswith(".calc"):
        return refuse(f"only .calc sheets can be included, not {target!r}")
    if os.path.isabs(target) or target.startswith("~"):
        return refuse("an include path is relative to the sheet's folder", hint="write include \"loads.calc\"")
    here = Path(path).parent if state.stack and not path.startswith("<") else state.root
    candidate = (here / target)
    real = candidate.resolve()
    if state.root != real.parent and state.root not in real.parents:
        return refuse(f"'{target}' is outside the sheet's folder; a sheet may include only files in or below it")
    if not real.is_file():
        return refuse(f"no such sheet to include: '{target}'")
    if real in state.stack:
        return refuse(f"'{target}' includes itself (through {' -> '.join(p.name for p in state.stack)})")
    if len(state.stack) > MAX_INCLUDE_DEPTH or len(state.sources) >= MAX_INCLUDES:
        return refuse("includes are nested too deeply or too many")
    if real.stat().st_size > MAX_SHEET_BYTES:
        return refuse(f"'{target}' is larger than {MAX_SHEET_BYTES // 1_000_000} MB")
    shown = os.path.normpath(str(candidate))
    text = real.read_text(encoding="utf-8")
    state.sources.append((shown, text))
    state.stack.append(real)
    try:
        sub, sub_diags = parse_sheet(text, shown, _includes=state)
    finally:
        state.stack.pop()
    if sub.meta:
        sub_diags.append(Diagnostic("warning", "include", f"the front matter of '{target}' is ignored: the "
                                    "including sheet's title block applies", span, path=path))
    return [_with_path(stmt, shown) for stmt in sub.body], sub_diags


def _with_path(node, path: str):
    """A copy of an included statement whose spans all name its file."""
    import dataclasses

    changes = {}
    for f in dataclasses.fields(node):
        value = getattr(node, f.name)
        if isinstance(value, Span):
            if value.path is None:
                changes[f.name] = dataclasses.replace(value, path=path)
        elif isinstance(value, N.Node):
            changes[f.name] = _with_path(value, path)
        elif isinstance(value, tuple) and value and isinstance(value[0], N.Node):
            changes[f.name] = tuple(_with_path(v, path) for v in value)
    return dataclasses.replace(node, **changes) if changes else node


def _replace(node, **changes):
    import dataclasses

    return dataclasses.replace(node, **changes)
