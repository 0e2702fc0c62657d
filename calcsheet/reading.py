"""Reading what a user points calcsheet at: bounded, strictly decoded, every failure located.

Every input file (a sheet, an included sheet, a ``--set-file`` table, a saved
JSON result, a sheet read from git) goes through ``read_bytes`` (never more
than its cap in ``LIMITS`` is read, so ``/dev/zero`` or a runaway file cannot grow memory)
and ``decode_utf8`` (invalid UTF-8 or a NUL byte is an ``InputError`` naming
the line and column of the first bad byte). The caps are in docs/limits.md.
"""
from __future__ import annotations

import os
from pathlib import Path

from .errors import InputError, Span

MAX_PATH_CHARS = 4096  # longer than any file system accepts (PATH_MAX on Linux)


def position(data: bytes | str, offset: int) -> tuple[int, int]:
    """1-based (line, column) of byte or character ``offset``; the column counts characters."""
    nl = b"\n" if isinstance(data, bytes) else "\n"
    line = data.count(nl, 0, offset) + 1
    start = data.rfind(nl, 0, offset) + 1
    head = data[start:offset]
    col = (len(head.decode("utf-8", "replace")) if isinstance(head, bytes) else len(head)) + 1
    return line, col


def check_path_text(text: str, what: str) -> None:
    """A path typed by a user: refused before the OS sees it if it cannot name a file."""
    if "\x00" in text:
        raise InputError(f"{what} contains a NUL byte", Span(1, 1, 1, 2))
    if len(text) > MAX_PATH_CHARS:
        raise InputError(f"{what} is {len(text):,} characters long; a path is at most {MAX_PATH_CHARS}",
                         Span(1, 1, 1, 2))


def is_file(path) -> bool:
    """``Path.is_file`` that answers False (instead of raising) for names no file system accepts."""
    try:
        check_path_text(str(path), "path")
        return Path(path).is_file()
    except (InputError, OSError, ValueError):
        return False


def read_bytes(path, cap: str, what: str = "file", raise_as=InputError) -> bytes:
    """At most ``limit(cap)`` bytes of ``path``; more is an error that names the cap and how to raise it."""
    most = limit(cap)
    check_path_text(str(path), what)
    try:
        with open(path, "rb") as fh:
            if os.path.isdir(path):
                raise IsADirectoryError(21, "is a folder")
            data = fh.read(most + 1)
    except OSError as exc:
        raise raise_as(f"cannot read {what} {path}: {exc.strerror or exc}", Span(1, 1, 1, 2)) from None
    if len(data) > most:
        raise raise_as(f"{what} {path} is larger than {_size(most)}", Span(1, 1, 1, 2), hint=how_to_raise(cap))
    return data


def decode_utf8(data: bytes, what: str = "the file") -> str:
    """Strict UTF-8 (a leading BOM is dropped); a bad byte or a NUL is an error at its line and column."""
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError as exc:
        line, col = position(data, exc.start)
        raise InputError(f"{what} is not UTF-8 text: byte 0x{data[exc.start]:02x} at line {line}, column {col} "
                         "cannot be decoded", Span(line, col, line, col + 1),
                         hint="save the file as UTF-8") from None
    nul = text.find("\x00")
    if nul >= 0:
        line, col = position(text, nul)
        raise InputError(f"{what} contains a NUL character at line {line}, column {col}",
                         Span(line, col, line, col + 1), hint="a sheet is plain text") from None
    return text[1:] if text.startswith("\ufeff") else text


def read_text(path, cap: str, what: str = "file") -> str:
    return decode_utf8(read_bytes(path, cap, what), what)


LIMITS = {
    # name: (default, what it bounds) -- docs/limits.md lists them; CALCSHEET_LIMIT_<NAME> raises one
    "SHEET_BYTES": (2_000_000, "size in bytes of a sheet or an included sheet"),
    "SET_FILE_BYTES": (1_000_000, "size in bytes of a --set-file table"),
    "SCHEDULE_BYTES": (20_000_000, "size in bytes of a --schedule table (CSV or TOML)"),
    "TABLE_BYTES": (1_000_000, "size in bytes of a CSV file a sheet reads with table \"file.csv\""),
    "JSON_BYTES": (50_000_000, "size in bytes of a saved JSON result read by diff or --since"),
    "STATEMENTS": (20_000, "number of statements, headings and prose blocks in one sheet file"),
    "PROBLEMS": (1_000, "number of syntax problems reported before a sheet is given up on"),
    "OUTPUT_BYTES": (50_000_000, "size in bytes of one file of the package (and of the page a PDF is made from)"),
    "PDF_PAGES": (2_000, "number of pages of one PDF"),
}


def limit(name: str) -> int:
    """The cap ``name`` (see ``LIMITS``), raised by the environment variable ``CALCSHEET_LIMIT_<name>``."""
    default = LIMITS[name][0]
    raw = os.environ.get(f"CALCSHEET_LIMIT_{name}", "").strip().replace("_", "")
    try:
        value = int(raw) if raw else default
    except ValueError:
        return default
    return value if value > 0 else default


def how_to_raise(name: str) -> str:
    return f"cap {name}: the {LIMITS[name][1]} is at most {limit(name):,}; set CALCSHEET_LIMIT_{name} to " \
           "raise it (docs/limits.md)"


def _size(n: int) -> str:
    return f"{n / 1_000_000:g} MB" if n >= 1_000_000 else f"{n:,} bytes"
