"""A whole sheet: front matter, headings, prose, includes and statements, in order."""
from __future__ import annotations

import dataclasses

from .. import nodes as N
from ..errors import CalcError, Diagnostic, SheetErrors, SheetSyntaxError, Span, TooComplexError
from .includes import INCLUDE, IncludeState, include
from .lines import HEADING, front_matter, statement_lines
from .statement import parse_statement

MAX_SHEET_BYTES = 2_000_000


def parse_sheet(source: str, path: str = "<sheet>", collect: bool = True, *,
                _includes: IncludeState | None = None) -> tuple[N.Sheet, list[Diagnostic]]:
    """The whole sheet. With ``collect`` every syntax error is returned; otherwise the first is raised.

    ``include "file.calc"`` lines splice another sheet's body in at that point (see ``includes``).
    """
    state = _includes or IncludeState.for_sheet(path)
    if len(source.encode("utf-8", "surrogatepass")) > MAX_SHEET_BYTES:
        err = TooComplexError(f"sheet is larger than {MAX_SHEET_BYTES // 1_000_000} MB", Span(1, 1, 1, 2))
        raise SheetErrors([err.diagnostic(path)], source)
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
        inc = INCLUDE.match(text)
        if inc:
            span = Span(lineno, 1, lineno, len(raw) + 1)
            stmts, sub_diags = include(inc.group(1), span, path, state, parse_sheet, MAX_SHEET_BYTES)
            body.extend(stmts)
            diags.extend(sub_diags)
            i += 1
            continue
        m = HEADING.match(text)
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
        i, stmt_text, descs, comments = statement_lines(lines, i)
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
            stmt = dataclasses.replace(stmt, **extra)
        body.append(stmt)
    flush_prose()
    sheet = N.Sheet(meta=tuple(meta.items()), body=tuple(body), path=path, source=source,
                    meta_lines=tuple(getattr(meta, "lines", {}).items()),
                    includes=tuple(state.sources) if _includes is None else ())
    return sheet, diags
