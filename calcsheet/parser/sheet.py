"""A whole sheet: front matter, headings, prose, includes and statements, in order."""
from __future__ import annotations

import dataclasses

from .. import nodes as N
from ..errors import CalcError, Diagnostic, SheetErrors, SheetSyntaxError, Span, TooComplexError
from .includes import INCLUDE, IncludeState, include
from . import fast, grammar
from .lines import HEADING, bracket_delta, front_matter, statement_lines
from .statement import MAX_DEPTH, parse_statement
from .tables import FILE_TABLE, file_table, pipe_table, starts_table
from .lines import strip_trailing
from .. import reading

MAX_SHEET_BYTES = reading.LIMITS["SHEET_BYTES"][0]  # the default; reading.limit("SHEET_BYTES") is the cap
_MARKS = ("", "/")  # the first characters of a line that is blank or a comment


def read_sheet(path) -> str:
    """A sheet file's text: at most the SHEET_BYTES cap, strict UTF-8; else ``SheetErrors`` located in it."""
    try:
        return reading.read_text(path, "SHEET_BYTES", "sheet")
    except CalcError as exc:
        raise SheetErrors([exc.diagnostic(str(path))], "") from None


def parse_sheet(source: str, path: str = "<sheet>", collect: bool = True, *,
                _includes: IncludeState | None = None) -> tuple[N.Sheet, list[Diagnostic]]:
    """The whole sheet. With ``collect`` every syntax error is returned; otherwise the first is raised.

    ``include "file.calc"`` lines splice another sheet's body in at that point (see ``includes``).
    """
    state = _includes or IncludeState.for_sheet(path)
    max_bytes = reading.limit("SHEET_BYTES")
    if len(source) > max_bytes or len(source.encode("utf-8", "surrogatepass")) > max_bytes:
        err = TooComplexError(f"sheet is larger than {max_bytes:,} bytes", Span(1, 1, 1, 2),
                              hint=reading.how_to_raise("SHEET_BYTES"))
        raise SheetErrors([err.diagnostic(path)], "")
    if "\x00" in source:
        try:
            reading.decode_utf8(source.encode("utf-8", "surrogatepass"), "the sheet")
        except CalcError as exc:
            raise SheetErrors([exc.diagnostic(path)], source) from None
    source = source.replace("\r\n", "\n").replace("\r", "\n")
    if source.startswith("\ufeff"):
        source = source[1:]
    lines = source.split("\n")
    meta, i, diags = front_matter(lines, path)
    body: list[N.Statement] = []
    prose_buf: list[str] = []
    prose_start = 0

    def flush_prose():
        nonlocal prose_buf
        if prose_buf:
            text = "\n".join(prose_buf).strip("\n")
            body.append(N.Prose(text=text, span=Span(prose_start, 1, prose_start + len(prose_buf) - 1, 2)))
            prose_buf = []

    max_items, max_problems = reading.limit("STATEMENTS"), reading.limit("PROBLEMS")
    if not fast.decided():
        grammar.prepare_fast()
    quick = fast.parse
    n_lines = len(lines)
    while i < n_lines:
        if len(diags) >= max_problems or len(body) >= max_items:
            cap = "PROBLEMS" if len(diags) >= max_problems else "STATEMENTS"
            what = (f"{len(diags):,} problems" if cap == "PROBLEMS" else f"{len(body):,} statements")
            diags.append(TooComplexError(f"stopped reading at line {i + 1}: {what} already",
                                         Span(i + 1, 1, i + 1, 2), hint=reading.how_to_raise(cap)
                                         ).diagnostic(path))
            break
        raw = lines[i]
        lineno = i + 1
        text = raw.strip()
        first = text[:1]
        if first == ">":
            if not prose_buf:
                prose_start = lineno
            prose_buf.append(text[1:].strip())
            i += 1
            continue
        if prose_buf:
            flush_prose()
        if first in _MARKS and (not text or text.startswith("//")):
            i += 1
            continue
        inc = INCLUDE.match(text) if first == "i" and text.startswith("include") else None
        if inc:
            span = Span(lineno, 1, lineno, len(raw) + 1)
            stmts, sub_diags = include(inc.group(1), span, path, state, parse_sheet)
            body.extend(stmts)
            diags.extend(sub_diags)
            i += 1
            continue
        m = HEADING.match(text) if first == "#" else None
        if m:
            body.append(N.Heading(level=len(m.group(1)), text=m.group(2).strip(),
                                  span=Span(lineno, 1, lineno, len(raw) + 1)))
            i += 1
            continue
        if first == "#":
            diags.append(SheetSyntaxError("a heading needs a space after '#'", Span(lineno, 1, lineno, 2),
                                          hint="write '# Loads'").diagnostic(path))
            i += 1
            continue
        pipe = i + 1 < n_lines and "|" in lines[i + 1] and lines[i + 1].lstrip().startswith("|") and \
            starts_table(lines, i)
        if pipe or ("table" in raw and FILE_TABLE.fullmatch(strip_trailing(raw)[0])):  # a table bound to a name
            try:
                if pipe:
                    i, table = pipe_table(lines, i, path)
                else:
                    table = file_table(lines, i, path, state)
                    i += 1
            except CalcError as exc:
                if not collect:
                    raise SheetErrors([exc.diagnostic(path)], source) from None
                diags.append(exc.diagnostic(path))
                i += 1
                while i < len(lines) and lines[i].lstrip().startswith("|"):
                    i += 1
                continue
            body.append(table)
            continue
        # a statement, continuing over lines while brackets are open
        if "--" in raw or "//" in raw:
            code, desc, comment = strip_trailing(raw)
        else:
            code, desc, comment = raw, None, None
        if (code.count("(") + code.count("[") <= code.count(")") + code.count("]") if '"' not in code
                else bracket_delta(code) <= 0):  # a statement on one line: statement_lines' answer, directly
            i += 1
            stmt_text = code
        else:
            i, stmt_text, descs, comments = statement_lines(lines, i)
            desc = " ".join(descs) if descs else None
            comment = " ".join(comments) if comments else None
        # a short statement the quick reader reads is what parse_statement gives (no size or depth limit
        # reaches it); anything else, and every error, goes through parse_statement
        stmt = quick(stmt_text, lineno - 1, desc, comment) if len(stmt_text) <= MAX_DEPTH else None
        if stmt is None:
            try:
                stmt = parse_statement(stmt_text, line_offset=lineno - 1)
            except CalcError as exc:
                if not collect:
                    raise SheetErrors([exc.diagnostic(path)], source) from None
                diags.append(exc.diagnostic(path))
                continue
            if desc is not None or comment is not None:
                extra = {}
                if desc is not None:
                    extra["description"] = desc
                if comment is not None:
                    extra["comment"] = comment
                stmt = dataclasses.replace(stmt, **extra)
        body.append(stmt)
    flush_prose()
    sheet = N.Sheet(meta=tuple(meta.items()), body=tuple(body), path=path, source=source,
                    meta_lines=tuple(getattr(meta, "lines", {}).items()),
                    includes=tuple(state.sources) if _includes is None else ())
    return sheet, diags
