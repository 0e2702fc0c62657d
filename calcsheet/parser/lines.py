"""The line level of a sheet: front matter, and where one statement's text ends.

A statement's description (``-- text``) and comment (``// text``) are cut
off here with their columns kept, and a statement continues over lines only
while a bracket is open.
"""
from __future__ import annotations

import re

from ..errors import Diagnostic, FrontMatterError, Span

HEADING = re.compile(r"(#{1,4})\s+(.*\S)\s*$")
_NEW_STATEMENT = re.compile(r"(check\s|[^\W\d]\w*\s*(\[[^\]]*\])?\s*=(?!=))")
_KEY = re.compile(r"[A-Za-z_][\w-]*")


def strip_trailing(line: str) -> tuple[str, str | None, str | None]:
    """Blank out ``-- description`` and ``// comment`` outside strings; keep columns."""
    if "--" not in line and "//" not in line:
        return line, None, None
    desc_at = comment_at = None
    # the first "//" or "--" outside a string: text between an even and an odd '"' is inside one, and a
    # marker never spans a quote, so each stretch outside strings is searched whole (str.find, not a
    # character loop)
    pos = 0
    for k, part in enumerate(line.split('"') if '"' in line else (line,)):
        if k % 2 == 0:
            c, d = part.find("//"), part.find("--")
            if c >= 0 and (d < 0 or c < d):
                comment_at = pos + c
                break
            if d >= 0:
                desc_at = pos + d
                # a description runs to a comment marker or the end
                j = line.find("//", desc_at + 2)
                comment_at = j if j >= 0 else None
                break
        pos += len(part) + 1
    code_end = desc_at if desc_at is not None else comment_at if comment_at is not None else len(line)
    desc = None
    comment = None
    if desc_at is not None:
        end = comment_at if comment_at is not None else len(line)
        desc = line[desc_at + 2:end].strip() or None
    if comment_at is not None:
        comment = line[comment_at + 2:].strip() or None
    return line[:code_end] + " " * (len(line) - code_end), desc, comment


def bracket_delta(code: str) -> int:
    if '"' not in code:  # no text in quotes: count the brackets directly
        return code.count("(") + code.count("[") - code.count(")") - code.count("]")
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


def ends_open_statement(next_line: str) -> bool:
    """An unclosed bracket must not swallow the sheet: a heading, prose or an
    unindented new definition ends the statement (and the parser reports it)."""
    stripped = next_line.strip()
    if stripped.startswith(("#", ">", "//")):
        return True
    return next_line[:1] not in (" ", "\t") and bool(_NEW_STATEMENT.match(next_line))


def statement_lines(lines: list[str], i: int) -> tuple[int, str, list[str], list[str]]:
    """The statement starting at ``lines[i]``: (index after it, its code, descriptions, comments)."""
    code_lines, descs, comments = [], [], []
    depth = 0
    j = i
    while j < len(lines):
        code, desc, comment = strip_trailing(lines[j])
        code_lines.append(code)
        if desc:
            descs.append(desc)
        if comment:
            comments.append(comment)
        depth += bracket_delta(code)
        j += 1
        if depth <= 0:
            break
        if j < len(lines) and ends_open_statement(lines[j]):
            # a heading or prose line ends an unclosed statement; report it there
            break
    return j, "\n".join(code_lines), descs, comments


class FrontMatter(dict):
    """The front matter's ``key: value`` table; ``lines`` gives the sheet line of each key, so a
    warning about a value points at its own line."""

    def __init__(self, *args, **kw):
        super().__init__(*args, **kw)
        self.lines: dict[str, int] = {}

    def line_of(self, key: str) -> int:
        return self.lines.get(key, 1)


_TRAILING_COMMENT = re.compile(r"(?:^|\s)//.*$")


def front_matter(lines: list[str], path: str) -> tuple[dict, int, list[Diagnostic]]:
    """``---`` block of ``key: value`` lines; list values as indented ``- item`` lines.

    A ``//`` comment is a comment here as elsewhere, on its own line or after a value (after a space,
    so a URL's ``//`` stays). Returns the table, the index of the first body line, and any problems
    found."""
    meta = FrontMatter()
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
        text = _TRAILING_COMMENT.sub("", raw).strip()
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
            if not _KEY.fullmatch(key):
                diags.append(FrontMatterError(f"'{key}' is not a front matter key",
                                              Span(i + 1, 1, i + 1, len(raw) + 1)).diagnostic(path))
            elif value:
                meta[key] = value
                meta.lines[key] = i + 1
                current_list = None
            else:
                current_list = meta.setdefault(key, [])
                meta.lines[key] = i + 1
        else:
            diags.append(FrontMatterError("front matter lines are 'key: value'",
                                          Span(i + 1, 1, i + 1, len(raw) + 1)).diagnostic(path))
        i += 1
    diags.append(FrontMatterError("front matter is not closed with '---'",
                                  Span(start + 1, 1, start + 1, 4)).diagnostic(path))
    return meta, len(lines), diags
