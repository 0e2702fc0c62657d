"""A table bound to a name: written in the sheet as pipe rows, or read from a CSV file beside the sheet.

    k_h =                      -- size factor by depth
    | h   | k_h  |             header: the column names; the first column is the key
    | mm  | 1    |             units row: one unit per column (1 for a plain number)
    | 100 | 1.00 |             rows: numbers, the key strictly increasing
    | 150 | 0.95 |

A two-way table names its row key and column key in the first header cell (``h \\ b``), gives the column
keys in the rest of the header, and the units of both keys in the first cell of the units row (``mm \\ mm``)
and the values' unit in every other cell. ``name = table "factors.csv"`` reads the same layout from a CSV
file (comma-separated, the header and units rows first) in the sheet's folder or below, with the same
containment rules and hash stamping as ``include``.

Every mistake of form (a ragged row, a missing units row, a cell that is not a number, keys out of order)
is a located error at the cell, in the sheet or in the CSV file.
"""
from __future__ import annotations

import csv
import io
import math
import re

from .. import nodes as N
from .. import reading
from ..errors import CalcError, IncludeError, SheetSyntaxError, Span
from ..units import parse_unit_text
from .includes import IncludeState, contained
from .lines import strip_trailing

TABLE_START = re.compile(r"\s*([^\W\d]\w*)\s*=\s*$")
FILE_TABLE = re.compile(r'\s*([^\W\d]\w*)\s*=\s*table\s+"([^"\n]*)"\s*$')
_NUMBER = re.compile(r"[-+]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][-+]?[0-9]+)?")
_NAME = re.compile(r"[^\W\d]\w*")
_RULE = re.compile(r"[\s:|-]*-[\s:|-]*")  # a Markdown separator row: | --- | --- |
MAX_TABLE_ROWS = 10_000
MAX_TABLE_COLUMNS = 100


def starts_table(lines: list[str], i: int) -> bool:
    """``name =`` alone on its line, with a pipe row right under it."""
    if not (i + 1 < len(lines) and lines[i + 1].lstrip().startswith("|")):
        return False
    code, _, _ = strip_trailing(lines[i])
    return bool(TABLE_START.fullmatch(code))


def pipe_table(lines: list[str], i: int, path: str) -> tuple[int, N.TableDef]:
    """The table starting at ``lines[i]`` (``name =``) and the index after its last row."""
    code, desc, comment = strip_trailing(lines[i])
    m = TABLE_START.fullmatch(code)
    name = m.group(1)
    lineno = i + 1
    name_span = Span(lineno, m.start(1) + 1, lineno, m.end(1) + 1)
    rows: list[list[tuple[str, Span]]] = []
    j = i + 1
    while j < len(lines) and lines[j].lstrip().startswith("|"):
        if len(rows) >= MAX_TABLE_ROWS + 2:
            raise SheetSyntaxError(f"a table of more than {MAX_TABLE_ROWS:,} rows", Span(j + 1, 1, j + 1, 2))
        if not _RULE.fullmatch(lines[j].split("//")[0].strip()):  # a Markdown rule row (| --- |) is skipped
            rows.append(_cells(strip_trailing(lines[j])[0], j + 1))
        j += 1
    end = Span(j, 1, j, len(lines[j - 1]) + 1)
    span = Span(lineno, name_span.col, end.end_line, end.end_col)
    table = build(name, rows, span, name_span, desc=desc, comment=comment)
    return j, table


def _cells(code: str, lineno: int) -> list[tuple[str, Span]]:
    """The cells of ``| a | b |`` with the span of each."""
    start = code.index("|")
    body = code.rstrip()
    if body.endswith("|") and len(body) > start + 1:
        body = body[:-1]
    out = []
    col = start + 1
    for part in body[start + 1:].split("|"):
        text = part.strip()
        lead = len(part) - len(part.lstrip())
        c0 = col + lead
        out.append((text, Span(lineno, c0 + 1, lineno, c0 + max(len(text), 1) + 1)))
        col += len(part) + 1
    return out


def build(name: str, rows: list[list[tuple[str, Span]]], span: Span, name_span: Span, *,
          source: str | None = None, desc: str | None = None, comment: str | None = None) -> N.TableDef:
    """A ``TableDef`` from its rows of (text, span) cells, every rule of form checked."""
    where = f"table {name}"
    if not rows:
        raise SheetSyntaxError(f"{where} has no rows", span)
    header = rows[0]
    if len(header) < 2:
        raise SheetSyntaxError(f"{where} needs at least two columns: a key and a value", header[0][1])
    if len(header) > MAX_TABLE_COLUMNS:
        raise SheetSyntaxError(f"{where} has more than {MAX_TABLE_COLUMNS} columns", header[0][1])
    if len(rows) < 2 or _is_number_row(rows[1]):
        at = rows[1][0][1] if len(rows) > 1 else header[0][1]
        raise SheetSyntaxError(f"{where} has no units row under its header", at,
                               hint="the second row gives each column's unit (1 for a plain number): | mm | 1 |")
    for r in rows[1:]:
        if len(r) != len(header):
            raise SheetSyntaxError(f"{where}: this row has {len(r)} cells, the header has {len(header)}", r[0][1],
                                   hint="every row of a table has one cell per column (a ragged table is an error)")
    two_way = "\\" in header[0][0]
    if two_way:
        _two_way_heads(where, header, rows[1])
    else:
        seen: set[str] = set()
        for text, sp in header:
            if not _NAME.fullmatch(text):
                raise SheetSyntaxError(f"{where}: column name '{text}' is not a name", sp,
                                       hint="a column is named like a value: h, k_mod, f_y")
            if text in seen:
                raise SheetSyntaxError(f"{where}: column '{text}' is named twice", sp)
            seen.add(text)
        for text, sp in rows[1]:
            parse_unit_text(text, sp)
    data = rows[2:]
    if len(data) < 2:
        raise SheetSyntaxError(f"{where} needs at least two rows of values to interpolate between", span)
    values = []
    for r in data:
        values.append(tuple(_number(where, text, sp) for text, sp in r))
    _increasing(where, [v[0] for v in values], [r[0][1] for r in data], "key")
    if two_way:
        keys = [_number(where, t, sp) for t, sp in header[1:]]
        _increasing(where, keys, [sp for _, sp in header[1:]], "column key")
    spans = tuple(tuple(sp for _, sp in r) for r in rows)
    return N.TableDef(name=name, header=tuple(t for t, _ in header), units=tuple(t for t, _ in rows[1]),
                      rows=tuple(tuple(t for t, _ in r) for r in data), values=tuple(values), source=source,
                      description=desc, comment=comment, span=span, name_span=name_span, cell_spans=spans)


def _two_way_heads(where: str, header, units) -> None:
    names = [x.strip() for x in header[0][0].split("\\")]
    if len(names) != 2 or not all(_NAME.fullmatch(x) for x in names) or names[0] == names[1]:
        raise SheetSyntaxError(f"{where}: a two-way table's first cell is 'row key \\ column key'", header[0][1],
                               hint="e.g. | h \\ b | 100 | 200 |")
    key_units = [x.strip() for x in units[0][0].split("\\")]
    if len(key_units) != 2:
        raise SheetSyntaxError(f"{where}: the units row of a two-way table starts with 'row unit \\ column unit'",
                               units[0][1], hint="e.g. | mm \\ mm | 1 | 1 |")
    for u in key_units:
        parse_unit_text(u, units[0][1])
    first = units[1][0]
    for text, sp in units[1:]:
        parse_unit_text(text, sp)
        if text != first:
            raise SheetSyntaxError(f"{where}: every value of a two-way table has one unit, here '{text}' and "
                                   f"'{first}'", sp)


def _is_number_row(row) -> bool:
    return all(_NUMBER.fullmatch(t) for t, _ in row) and not all(t == "1" for t, _ in row)


def _number(where: str, text: str, sp: Span) -> float:
    if not _NUMBER.fullmatch(text):
        raise SheetSyntaxError(f"{where}: '{text}' is not a number", sp,
                               hint="a cell holds a plain number; its unit is in the column's units row")
    value = float(text)
    if not math.isfinite(value) or len(text) > 40:
        raise SheetSyntaxError(f"{where}: the number {text} is out of range", sp)
    return value


def _increasing(where: str, keys: list[float], spans: list[Span], what: str) -> None:
    for k in range(1, len(keys)):
        if not keys[k] > keys[k - 1]:
            raise SheetSyntaxError(f"{where}: the {what}s must increase strictly, but {keys[k]:g} follows "
                                   f"{keys[k - 1]:g}", spans[k],
                                   hint="sort the rows by their key; a key appears once")


# ------------------------------------------------------------ a table from a CSV file


def file_table(lines: list[str], i: int, path: str, state: IncludeState) -> N.TableDef:
    """``name = table "file.csv"`` on ``lines[i]``; the file's text joins the sheet's stamped sources."""
    raw = lines[i]
    code, desc, comment = strip_trailing(raw)
    m = FILE_TABLE.fullmatch(code)
    name, target = m.group(1), m.group(2)
    lineno = i + 1
    span = Span(lineno, m.start(1) + 1, lineno, len(code.rstrip()) + 1)
    name_span = Span(lineno, m.start(1) + 1, lineno, m.end(1) + 1)
    if not target.endswith(".csv"):
        raise IncludeError(f"a table is read from a .csv file, not {target!r}", span)
    real, shown = contained(target, span, path, state, "table")
    try:
        text = reading.read_text(real, "TABLE_BYTES", f"'{target}'")
    except CalcError as exc:
        raise IncludeError(exc.message, span, hint=exc.hint) from None
    state.sources.append((shown, text))
    try:
        rows = list(csv.reader(io.StringIO(text, newline="")))
    except csv.Error as exc:
        raise IncludeError(f"'{target}' is not a CSV file: {exc}", span) from None
    src = text.split("\n")
    cells = []
    for r, row in enumerate(rows, start=1):
        if not any(c.strip() for c in row):
            continue
        cells.append(list(zip((c.strip() for c in row), _csv_spans(src[r - 1] if r <= len(src) else "", r, row,
                                                                    shown))))
    if len(cells) > MAX_TABLE_ROWS + 2:
        raise IncludeError(f"'{target}' has more than {MAX_TABLE_ROWS:,} rows", span)
    return build(name, cells, span, name_span, source=target, desc=desc, comment=comment)


def _csv_spans(line: str, r: int, row: list[str], shown: str) -> list[Span]:
    """Each cell's span in the CSV file (a quoted line: the whole line for every cell)."""
    if '"' in line or len(line.split(",")) != len(row):
        return [Span(r, 1, r, len(line) + 1, path=shown)] * len(row)
    out, pos = [], 0
    for part in line.split(","):
        lead = len(part) - len(part.lstrip())
        out.append(Span(r, pos + lead + 1, r, pos + lead + max(len(part.strip()), 1) + 1, path=shown))
        pos += len(part) + 1
    return out
