"""Reading a member schedule: a CSV or TOML table whose columns are a sheet's inputs.

The file is read once through ``calcsheet.reading`` (at most the ``SCHEDULE_BYTES``
cap, strict UTF-8: a bad byte or a NUL is an error at its line and column);
rows are then made lazily (a row object per member is never held for the
whole table), each with the place it came from, so a bad value is reported as
``file:row:column`` and the other rows still build.
"""
from __future__ import annotations

import csv
import hashlib
import io
import re
from dataclasses import dataclass, field
from pathlib import Path
from typing import Iterator

from .. import reading
from ..errors import CalcError
from ..suggest import did_you_mean

MEMBER = "member"
MAX_MEMBER = 64
# A member name becomes a file name: letters, digits, '-', '_' and inner dots only.
_SAFE = re.compile(r"[A-Za-z0-9](?:[A-Za-z0-9._-]{0,%d}[A-Za-z0-9_-])?" % (MAX_MEMBER - 2))
_RESERVED = {"con", "prn", "aux", "nul", *(f"com{i}" for i in range(10)), *(f"lpt{i}" for i in range(10))}
# names the schedule package itself uses in the output folder
RESERVED_STEMS = {"schedule"}


class ScheduleError(Exception):
    """A problem with the schedule file as a whole (nothing is built): carries its location."""

    def __init__(self, where: str, message: str):
        super().__init__(f"{where}: error: {message}")
        self.where = where
        self.message = message


@dataclass(frozen=True)
class Cell:
    column: str
    text: str
    where: str  # file:row:column


@dataclass(frozen=True)
class Row:
    number: int  # 1-based position among the members
    member: str
    where: str  # file:row
    cells: tuple[Cell, ...] = ()
    errors: tuple[str, ...] = ()  # located messages found while reading; the row is not built

    @property
    def overrides(self) -> dict[str, str]:
        return {c.column: c.text for c in self.cells}


def member_name_problem(name: str) -> str | None:
    """Why ``name`` cannot be a member's file name, or None when it can."""
    if not name:
        return "the member name is empty"
    if len(name) > MAX_MEMBER:
        return f"the member name is longer than {MAX_MEMBER} characters"
    if not _SAFE.fullmatch(name):
        return (f"member name {name!r} is not a safe file name: use letters, digits, '-', '_' and inner '.' "
                "(it names the member's package files)")
    stem = name.split(".")[0].lower()
    if stem in _RESERVED:
        return f"member name {name!r} is a reserved device name on some systems"
    if name.lower() in RESERVED_STEMS:
        return f"member name {name!r} is the name of the schedule package itself"
    return None


@dataclass
class Schedule:
    """A schedule file: its columns (validated against the sheet's inputs) and its rows, read on demand."""

    path: Path
    columns: list[str]
    _rows: object = field(repr=False, default=None)
    sha256: str = ""  # of the bytes read

    def rows(self) -> Iterator[Row]:
        return self._rows()


CAP = "SCHEDULE_BYTES"


def read_schedule(path: Path) -> tuple[str, str]:
    """The schedule's text (bounded, strict UTF-8, a leading BOM dropped) and the sha256 of its bytes; a
    failure is a ScheduleError at ``file:line:col`` (line 1, column 1 when the fault is the whole file)."""
    try:
        data = reading.read_bytes(path, CAP, "the schedule")
        text = reading.decode_utf8(data, "the schedule")
    except CalcError as exc:
        span = exc.span
        where = f"{path}:{span.line}:{span.col}" if span is not None else str(path)
        raise ScheduleError(where, exc.message + (f" ({exc.hint})" if exc.hint else "")) from None
    return text, hashlib.sha256(data).hexdigest()


def open_schedule(path: Path, inputs: list[str], defined: list[str] | None = None) -> Schedule:
    """Validate the columns of ``path`` against the sheet's ``inputs`` and return a lazy row reader."""
    path = Path(path)
    suffix = path.suffix.lower()
    if suffix not in (".csv", ".toml"):
        raise ScheduleError(str(path), "a schedule is a .csv or .toml file")
    text, sha = read_schedule(path)
    opened = (_open_csv if suffix == ".csv" else _open_toml)(path, text, inputs, defined or [])
    opened.sha256 = sha
    return opened


def _check_columns(path: Path, columns: list[tuple[str, str]], inputs: list[str], defined: list[str]) -> None:
    """columns: (name, where). Every column but 'member' must be an input of the sheet, once."""
    seen = set()
    for name, where in columns:
        if name == MEMBER:
            continue
        if name in seen:
            raise ScheduleError(where, f"column {name!r} appears twice")
        seen.add(name)
        if name in inputs:
            continue
        if name in defined:
            raise ScheduleError(where, f"column {name!r} is calculated by the sheet, not an input; "
                                       "a schedule sets inputs only")
        hint = did_you_mean(name, inputs)
        hint = f" ({hint})" if hint else f"; inputs: {', '.join(inputs) or 'none'}"
        raise ScheduleError(where, f"column {name!r} names no input of the sheet{hint}")


class _Members:
    """Member names seen so far: duplicates (also differing only in case) are refused."""

    def __init__(self):
        self.seen: dict[str, str] = {}

    def problem(self, name: str, where: str) -> str | None:
        bad = member_name_problem(name)
        if bad:
            return bad
        key = name.lower()
        if key in self.seen:
            return f"member {name!r} repeats the member on {self.seen[key]} (names are compared ignoring case)"
        self.seen[key] = where
        return None


# ------------------------------------------------------------ CSV


def _open_csv(path: Path, text: str, inputs, defined) -> Schedule:
    try:
        header = next(csv.reader(io.StringIO(text, newline="")), None)
    except csv.Error as exc:
        raise ScheduleError(f"{path}:1", f"not a valid CSV header ({exc})") from None
    if not header:
        raise ScheduleError(f"{path}:1", "the schedule is empty; the first line names the columns")
    names = [h.strip() for h in header]
    for i, name in enumerate(names, 1):
        if not name:
            raise ScheduleError(f"{path}:1:{i}", f"column {i} has no name")
    if MEMBER not in names:
        raise ScheduleError(f"{path}:1", f"the schedule needs a {MEMBER!r} column naming each row")
    _check_columns(path, [(n, f"{path}:1:{i}") for i, n in enumerate(names, 1)], inputs, defined)

    def rows() -> Iterator[Row]:
        members = _Members()
        m_col = names.index(MEMBER)
        number = 0
        with io.StringIO(text, newline="") as fh:
            reader = csv.reader(fh)
            next(reader)
            line = reader.line_num + 1
            while True:
                try:
                    record = next(reader)
                except StopIteration:
                    return
                except csv.Error as exc:
                    number += 1
                    yield Row(number, f"row{number}", f"{path}:{line}",
                              errors=(f"{path}:{line}: error: not a valid CSV row ({exc})",))
                    line = reader.line_num + 1
                    continue
                start, line = line, reader.line_num + 1
                if not record or all(not v.strip() for v in record):
                    continue  # blank lines between groups of members
                number += 1
                where = f"{path}:{start}"
                member = record[m_col].strip() if m_col < len(record) else ""
                errors = []
                if len(record) != len(names):
                    errors.append(f"{where}: error: row {number} has {len(record)} values, the header "
                                  f"names {len(names)} columns")
                bad = members.problem(member, where)
                if bad:
                    errors.append(f"{where}:{m_col + 1}: error: row {number}, column {MEMBER!r}: {bad}")
                cells = tuple(Cell(n, v.strip(), f"{where}:{i}") for i, (n, v) in enumerate(zip(names, record), 1)
                              if n != MEMBER and v.strip())
                yield Row(number, member or f"row{number}", where, cells, tuple(errors))

    return Schedule(path, [n for n in names if n != MEMBER], rows)


# ------------------------------------------------------------ TOML

_TOML_HEAD = re.compile(r"^\s*\[\[\s*members\s*\]\]\s*(?:#.*)?$")


def _open_toml(path: Path, text: str, inputs, defined) -> Schedule:
    """``[[members]]`` tables: ``member = "J-1"`` and one key per input (``L = "3.6 m"``, or a bare number)."""
    import tomllib

    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        m = re.search(r"\(at line (\d+), column (\d+)\)", str(exc))
        where = f"{path}:{m.group(1)}:{m.group(2)}" if m else f"{path}:1:1"
        what = re.sub(r"\s*\(at .*\)$", "", str(exc))
        raise ScheduleError(where, f"not valid TOML: {what}") from None
    except RecursionError:
        raise ScheduleError(f"{path}:1:1", "nested too deeply to read; a schedule is a list of [[members]] "
                                           "tables of NAME = \"QUANTITY\"") from None
    members = data.get("members")
    if not isinstance(members, list) or not all(isinstance(m, dict) for m in members):
        raise ScheduleError(str(path), "a TOML schedule is a list of [[members]] tables")
    lines = text.split("\n")
    heads = [i + 1 for i, ln in enumerate(lines) if _TOML_HEAD.match(ln)]

    def locate(k: int, key: str | None = None) -> str:
        if k >= len(heads):  # written inline (members = [{…}]): the file is the best we can say
            return str(path)
        start = heads[k]
        if key is None:
            return f"{path}:{start}"
        end = heads[k + 1] if k + 1 < len(heads) else len(lines) + 1
        pat = re.compile(r"^\s*(?:%s|\"%s\")\s*=" % (re.escape(key), re.escape(key)))
        for ln in range(start + 1, end):
            m = pat.match(lines[ln - 1])
            if m:
                return f"{path}:{ln}:{len(lines[ln - 1]) - len(lines[ln - 1].lstrip()) + 1}"
        return f"{path}:{start}"

    columns: list[str] = []
    cols_where = []
    for k, m in enumerate(members):
        for key in m:
            if key not in columns:
                columns.append(key)
                cols_where.append((key, locate(k, key)))
    _check_columns(path, cols_where, inputs, defined)

    def rows() -> Iterator[Row]:
        seen = _Members()
        for k, m in enumerate(members):
            number = k + 1
            where = locate(k)
            errors = []
            member = m.get(MEMBER)
            if not isinstance(member, str):
                errors.append(f"{where}: error: member {number} needs {MEMBER} = \"NAME\"")
                member = ""
            else:
                member = member.strip()
                bad = seen.problem(member, where)
                if bad:
                    errors.append(f"{locate(k, MEMBER)}: error: row {number}, {MEMBER!r}: {bad}")
            cells = []
            for key, value in m.items():
                if key == MEMBER:
                    continue
                if isinstance(value, bool) or not isinstance(value, (str, int, float)):
                    errors.append(f"{locate(k, key)}: error: row {number}, column {key!r}: a value is a quantity "
                                  f"written as a string ({key} = \"3.6 m\") or a number")
                    continue
                text_ = str(value).strip()
                if text_:
                    cells.append(Cell(key, text_, locate(k, key)))
            yield Row(number, member or f"row{number}", where, tuple(cells), tuple(errors))

    return Schedule(path, columns, rows)
