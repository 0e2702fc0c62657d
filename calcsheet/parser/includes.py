"""``include "file.calc"``: what a sheet may include, and the included statements with their own path.

Only ``.calc`` files whose real path lies in the main sheet's folder (or
below) are read; cycles, depth and count are capped. An included statement's
spans name its file, so every later stage reports into the right file
without knowing includes exist.
"""
from __future__ import annotations

import dataclasses
import os
import re
from pathlib import Path

from .. import nodes as N
from .. import reading
from ..errors import CalcError, Diagnostic, IncludeError, Span

INCLUDE = re.compile(r'include\s+"([^"\n]*)"\s*(?:(?://|--).*)?$')
MAX_INCLUDE_DEPTH = 8
MAX_INCLUDES = 64


class IncludeState:
    """One parse's includes: the main sheet's folder, the chain being read (for cycles), what was read."""

    def __init__(self, root: Path | None, main: Path | None):
        self.root = root  # resolved folder of the main sheet, or None for a sheet given as text
        self.stack = [main] if main else []
        self.sources: list[tuple[str, str]] = []

    @classmethod
    def for_sheet(cls, path: str) -> "IncludeState":
        if path.startswith("<") or not Path(path).is_file():
            return cls(None, None)
        p = Path(path).resolve()
        return cls(p.parent, p)


def include(target: str, span: Span, path: str, state: IncludeState, parse_sheet):
    """Parse an included sheet with ``parse_sheet``; every span in it carries its own path."""

    def refuse(message, hint=None):
        return [], [IncludeError(message, span, hint=hint).diagnostic(path)]

    if state.root is None:
        return refuse("include needs the sheet to be a file (its folder is where includes are looked for)")
    if "\x00" in target or len(target) > 255:
        return refuse("an include path is a file name of at most 255 characters, with no NUL")
    if not target.endswith(".calc"):
        return refuse(f"only .calc sheets can be included, not {target!r}")
    try:
        real, shown = contained(target, span, path, state)
    except IncludeError as exc:
        return refuse(exc.message, exc.hint)
    if real in state.stack:
        return refuse(f"'{target}' includes itself (through {' -> '.join(p.name for p in state.stack)})")
    if len(state.stack) > MAX_INCLUDE_DEPTH or len(state.sources) >= MAX_INCLUDES:
        return refuse("includes are nested too deeply or too many")
    try:
        text = reading.read_text(real, "SHEET_BYTES", f"'{target}'")
    except CalcError as exc:
        return refuse(exc.message, exc.hint)
    state.sources.append((shown, text))
    state.stack.append(real)
    try:
        sub, sub_diags = parse_sheet(text, shown, _includes=state)
    finally:
        state.stack.pop()
    if sub.meta:
        sub_diags.append(Diagnostic("warning", "include", f"the front matter of '{target}' is ignored: the "
                                    "including sheet's title block applies", span, path=path))
    return [with_path(stmt, shown) for stmt in sub.body], sub_diags


def contained(target: str, span: Span, path: str, state: IncludeState, what: str = "include") -> tuple[Path, str]:
    """The real path of a file a sheet names (an included sheet, a table's CSV) and the path shown for it;
    ``IncludeError`` unless it is a file in the main sheet's folder or below."""
    if state.root is None:
        raise IncludeError(f"{what} needs the sheet to be a file (its folder is where "
                           f"{'includes are' if what == 'include' else 'it is'} looked for)", span)
    if "\x00" in target or len(target) > 255:
        raise IncludeError(f"an {what} path is a file name of at most 255 characters, with no NUL", span)
    if os.path.isabs(target) or target.startswith("~"):
        raise IncludeError(f"an {what} path is relative to the sheet's folder", span,
                           hint="write include \"loads.calc\"" if what == "include" else
                           "write table \"factors.csv\"")
    here = Path(path).parent if state.stack and not path.startswith("<") else state.root
    candidate = here / target
    real = candidate.resolve()
    if state.root != real.parent and state.root not in real.parents:
        raise IncludeError(f"'{target}' is outside the sheet's folder; a sheet may "
                           f"{'include' if what == 'include' else 'read'} only files in or below it", span)
    if not real.is_file():
        raise IncludeError(f"no such {'sheet to include' if what == 'include' else 'table file'}: '{target}'", span)
    return real, os.path.normpath(str(candidate))


def with_path(node, path: str):
    """A copy of an included statement whose spans all name its file."""
    changes = {}
    for f in dataclasses.fields(node):
        value = getattr(node, f.name)
        if isinstance(value, Span):
            if value.path is None:
                changes[f.name] = dataclasses.replace(value, path=path)
        elif isinstance(value, N.Node):
            changes[f.name] = with_path(value, path)
        elif isinstance(value, tuple) and value and isinstance(value[0], N.Node):
            changes[f.name] = tuple(with_path(v, path) for v in value)
    return dataclasses.replace(node, **changes) if changes else node
