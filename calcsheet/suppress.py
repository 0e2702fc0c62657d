"""Inline suppression: ``// allow <code>[, <code>...]: <reason>`` on a statement.

A reviewer must see every warning someone chose to silence, so a suppression
needs a reason, covers only the statement it is written on, never hides an
error, and is itself reported when it allows nothing. Suppressed diagnostics
stay in the result with ``suppressed = reason``; the package lists them in
its inputs section.

Several clauses may share one comment: ``// allow a: why; allow b: why``.
"""
from __future__ import annotations

import re
from dataclasses import dataclass

from . import errors as E
from . import nodes as N
from .errors import Diagnostic, Span
from .suggest import did_you_mean

# Codes that only arise while evaluating; an allow for one is not "unused" in a check-only run.
EVALUATION_ONLY = {"plugin-warning", "plugin-input", "not-finite", "division-by-zero"}
OTHER_CODES = {"plugin-warning", "front-matter"}
_CLAUSE = re.compile(r"allow\b(?P<body>.*?)(?=;\s*allow\b|$)", re.S)
_CODES = re.compile(r"\s*(?P<codes>[a-z][a-z0-9-]*(?:\s*,\s*[a-z][a-z0-9-]*)*)\s*:\s*(?P<reason>.*?)\s*;?\s*$", re.S)


def known_codes() -> set[str]:
    out = set(OTHER_CODES)
    stack = [E.CalcError]
    while stack:
        cls = stack.pop()
        out.add(cls.code)
        stack.extend(cls.__subclasses__())
    out.discard("error")
    return out


@dataclass
class Allow:
    codes: tuple[str, ...]
    reason: str
    lines: tuple[int, int]  # first and last line of the statement
    span: Span  # where the comment sits
    used: set


def _comment_span(stmt, source_lines: list[str]) -> Span:
    first, last = stmt.span.line, stmt.span.end_line
    for ln in range(first, last + 1):
        if ln - 1 < len(source_lines):
            m = re.search(r"//\s*allow\b", source_lines[ln - 1])
            if m:
                return Span(ln, m.start() + 1, ln, len(source_lines[ln - 1]) + 1)
    return Span(first, 1, first, 2)


def parse_allows(sheet: N.Sheet, path: str) -> tuple[list[Allow], list[Diagnostic]]:
    """Every ``// allow`` on a statement, and diagnostics for malformed ones."""
    allows: list[Allow] = []
    diags: list[Diagnostic] = []
    lines = sheet.source.split("\n")
    codes_known = None
    for stmt in sheet.body:
        comment = getattr(stmt, "comment", None)
        if not comment or not comment.lstrip().startswith("allow") or stmt.span is None:
            continue
        span = _comment_span(stmt, lines)
        for clause in _CLAUSE.finditer(comment.strip()):
            m = _CODES.fullmatch(clause.group("body"))
            if m is None or not m.group("reason").strip():
                diags.append(E.SuppressionError(
                    "a suppression is written '// allow <code>: <reason>'", span,
                    hint="name the code and say why, e.g. // allow unused-input: kept for the next revision"
                ).diagnostic(path))
                continue
            codes = tuple(c.strip() for c in m.group("codes").split(","))
            codes_known = codes_known or known_codes()
            unknown = [c for c in codes if c not in codes_known]
            if unknown:
                diags.append(E.SuppressionError(
                    f"'{unknown[0]}' is not a diagnostic code", span,
                    hint=did_you_mean(unknown[0], sorted(codes_known)) or "see docs/diagnostics.md for the codes"
                ).diagnostic(path))
                codes = tuple(c for c in codes if c in codes_known)
                if not codes:
                    continue
            allows.append(Allow(codes, m.group("reason").strip(), (stmt.span.line, stmt.span.end_line), span,
                                set()))
    return allows, diags


def apply_suppressions(sheet: N.Sheet | None, diagnostics: list[Diagnostic], path: str,
                       evaluated: bool = True) -> list[Diagnostic]:
    """Mark suppressed diagnostics; add diagnostics about the suppressions themselves. Returns the new list."""
    if sheet is None:
        return diagnostics
    allows, extra = parse_allows(sheet, path)
    if not allows and not extra:
        return diagnostics
    own = {"bad-suppression", "unused-suppression"}
    for d in diagnostics:
        if d.code in own or d.suppressed:
            continue
        for a in allows:
            if d.code in a.codes and a.lines[0] <= d.span.line <= a.lines[1]:
                if d.severity == "error":
                    a.used.add(d.code)
                    extra.append(E.SuppressionError(
                        f"'{d.code}' here is an error; errors cannot be allowed", a.span,
                        hint="fix the error: an allow comment is for warnings and infos only").diagnostic(path))
                else:
                    d.suppressed = a.reason
                    a.used.add(d.code)
                break
    for a in allows:
        for code in a.codes:
            if code in a.used or (not evaluated and code in EVALUATION_ONLY):
                continue
            extra.append(E.UnusedSuppressionWarning(
                f"'// allow {code}' allows nothing on this line", a.span,
                hint="remove it, so the remaining allows still mean something").diagnostic(path))
    out = diagnostics + extra
    out.sort(key=lambda d: (d.span.line, d.span.col))
    return out
