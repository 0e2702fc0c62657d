"""The sources of a side: a sheet file, a git revision of one (``REV:path``), or a saved JSON result."""
from __future__ import annotations

import json
import math
import os
import re
import subprocess
from pathlib import Path

import pint

from .. import reading
from .. import units as U
from ..errors import CalcError
from ..plugin import Record
from ..resolver import check_key
from .model import CheckEntry, DiffSourceError, Entry, Snapshot, show_quantity


def _formula(stmt, source_lines: list[str]) -> str | None:
    span = getattr(getattr(stmt, "expr", None), "span", None)
    if span is None:
        return None
    if span.line == span.end_line:
        return source_lines[span.line - 1][span.col - 1:span.end_col - 1].strip()
    chunk = ([source_lines[span.line - 1][span.col - 1:]] + source_lines[span.line:span.end_line - 1]
             + [source_lines[span.end_line - 1][:span.end_col - 1]])
    return " ".join(part.strip() for part in chunk)


def _value_entry(name, value, **kw) -> Entry:
    if isinstance(value, pint.Quantity):
        return Entry(name, quantity=value, **kw)
    if isinstance(value, str):
        return Entry(name, text=value, **kw)
    if isinstance(value, tuple):
        return Entry(name, text="[" + ", ".join(
            show_quantity(v) if isinstance(v, pint.Quantity) else repr(v) for v in value) + "]", **kw)
    return Entry(name, text=repr(value), **kw)


def snapshot_of_result(result, label: str) -> Snapshot:
    """A Snapshot of an engine Result (a sheet that was run)."""
    lines = result.source.split("\n")
    snap = Snapshot(label=label, meta=dict(result.meta), errors=len(result.errors))
    prec = result.precedents
    for name, step in result.steps.items():
        stmt = result.resolution.statements.get(name) if result.resolution else None
        common = dict(is_input=step.is_input, line=step.span.line if step.span else None,
                      description=step.description, formula=_formula(stmt, lines) if stmt is not None else None,
                      reads=tuple(prec.get(name, ())))
        value = step.value
        if isinstance(value, Record):
            snap.values[name] = Entry(name, text=f"{value.source or value.type} result", **common)
            for fname, fval in value.fields.items():
                if isinstance(fval, (pint.Quantity, str)):
                    snap.values[f"{name}.{fname}"] = _value_entry(
                        f"{name}.{fname}", fval, line=common["line"], reads=(name,), parent=name)
        else:
            snap.values[name] = _value_entry(name, value, **common)
    for c in result.checks:
        key = None
        if result.resolution is not None and c.span is not None:
            stmt = next((s for k, s in result.resolution.statements.items()
                         if k.startswith("check@") and s.span is not None and s.span.line == c.span.line), None)
            key = check_key(stmt) if stmt is not None else None
        snap.checks.append(CheckEntry(text=c.text, ok=bool(c.ok), ratio=c.ratio, description=c.description,
                                      reads=tuple(prec.get(key, ())) if key else None,
                                      line=c.span.line if c.span else None))
    return snap


def quantity_from_json(value, unit: str):
    """Rebuild a saved quantity without pint's string parser: unit names are looked up one by one."""
    reg = U.registry()
    u = reg.Unit("")
    tokens = re.findall(r"\*\*|\*|/|[^\s*/]+", unit or "")
    sign, i = 1, 0
    while i < len(tokens):
        tok = tokens[i]
        if tok in ("*", "/"):
            sign = 1 if tok == "*" else -1
            i += 1
            continue
        base = reg.Unit("") if tok == "1" else U.unit_named(tok)
        exp = 1.0
        if i + 1 < len(tokens) and tokens[i + 1] == "**":
            if i + 2 >= len(tokens):
                raise ValueError(f"cannot read the unit {unit!r}")
            exp = float(tokens[i + 2])
            i += 2
        u = u * base ** (sign * exp)
        i += 1
    if isinstance(value, list):
        import numpy as np

        value = np.asarray(value, dtype=float)
    elif isinstance(value, (int, float)):
        value = float(value)
    else:
        raise ValueError("not a number")
    return reg.Quantity(value, u)


def _json_entry(name, data: dict, **kw) -> Entry:
    if "value" in data:
        try:
            return Entry(name, quantity=quantity_from_json(data["value"], data.get("unit", "")), **kw)
        except Exception:  # an unreadable unit still compares as text
            return Entry(name, text=f"{data['value']} {data.get('unit', '')}".strip(), **kw)
    if "text" in data:
        return Entry(name, text=str(data["text"]), **kw)
    if "list" in data:
        return Entry(name, text=json.dumps(data["list"], sort_keys=True), **kw)
    return Entry(name, text=json.dumps(data, sort_keys=True), **kw)


MAX_JSON_NUMBER_CHARS = 40


def _number(text: str):
    if len(text) > MAX_JSON_NUMBER_CHARS:
        raise ValueError(f"a number of {len(text):,} digits (at most {MAX_JSON_NUMBER_CHARS})")
    value = float(text)
    if not math.isfinite(value):
        raise ValueError(f"the number {text[:20]} is not finite")
    return value


def _constant(name: str):
    raise ValueError(f"{name} is not a JSON number (calcsheet writes strict JSON)")


def parse_json(text: str, label: str):
    """Strict JSON (no NaN/Infinity, no 5,000-digit integers, bounded nesting); errors at line:col."""
    try:
        return json.loads(text, parse_int=_number, parse_float=_number, parse_constant=_constant)
    except json.JSONDecodeError as exc:
        raise DiffSourceError(f"{label}:{exc.lineno}:{exc.colno}: not valid JSON ({exc.msg})") from None
    except RecursionError:
        raise DiffSourceError(f"{label}:1:1: JSON nested too deeply; not a calcsheet JSON result") from None
    except ValueError as exc:  # raised by the hooks above, which have no position of their own
        raise DiffSourceError(f"{label}:1:1: not a calcsheet JSON result: {exc}") from None


def _shape(ok: bool, label: str, where: str, wanted: str):
    if not ok:
        raise DiffSourceError(f"{label}:1:1: not a calcsheet JSON result: {where} must be {wanted}")


def _line_of(value, label, where):
    _shape(value is None or (isinstance(value, (int, float)) and not isinstance(value, bool)
                             and float(value).is_integer() and value >= 0), label, where, "a line number or null")
    return int(value) if value is not None else None


def _text_or_none(value, label, where):
    _shape(value is None or isinstance(value, str), label, where, "text or null")
    return value


def snapshot_of_json(data: dict, label: str) -> Snapshot:
    """A Snapshot of a saved ``--format json`` result (dependencies are not saved there).

    Checked by shape before use: a value of the wrong type anywhere is a ``DiffSourceError`` naming it."""
    if not isinstance(data, dict) or not isinstance(data.get("values"), dict):
        raise DiffSourceError(f"{label}:1:1: not a calcsheet JSON result (no 'values' table)")
    meta = data.get("meta") or {}
    _shape(isinstance(meta, dict), label, "'meta'", "a table")
    for k, v in meta.items():
        _shape(isinstance(v, str) or (isinstance(v, list) and all(isinstance(x, str) for x in v)),
               label, f"meta '{k[:40]}'", "text or a list of text")
    diags = data.get("diagnostics", [])
    _shape(isinstance(diags, list), label, "'diagnostics'", "a list")
    checks = data.get("checks", [])
    _shape(isinstance(checks, list), label, "'checks'", "a list")
    errors = sum(1 for d in diags if isinstance(d, dict) and d.get("severity") == "error")
    snap = Snapshot(label=label, meta=dict(meta), errors=errors)
    for name, v in data["values"].items():
        if not isinstance(v, dict):
            continue
        where = f"value '{name[:40]}'"
        common = dict(is_input=bool(v.get("input")), line=_line_of(v.get("line"), label, f"{where} line"),
                      description=_text_or_none(v.get("description"), label, f"{where} description"))
        if "record" in v:
            fields = v.get("fields") or {}
            _shape(isinstance(fields, dict), label, f"{where} 'fields'", "a table")
            snap.values[name] = Entry(name, text=f"{str(v['record'])[:80]} result", **common)
            for fname, fval in fields.items():
                if isinstance(fval, dict):
                    snap.values[f"{name}.{fname}"] = _json_entry(f"{name}.{fname}", fval, line=common["line"],
                                                                 reads=(name,), parent=name)
        else:
            snap.values[name] = _json_entry(name, v, **common)
    for i, c in enumerate(checks, 1):
        if isinstance(c, dict):
            ratio = c.get("ratio")
            _shape(ratio is None or (isinstance(ratio, float) and math.isfinite(ratio)), label,
                   f"check {i} 'ratio'", "a finite number or null")
            snap.checks.append(CheckEntry(text=str(c.get("text", "")), ok=bool(c.get("ok")), ratio=ratio,
                                          description=_text_or_none(c.get("description"), label,
                                                                    f"check {i} description"),
                                          line=_line_of(c.get("line"), label, f"check {i} line")))
    return snap


def git_show(rev: str, path: str, cwd: Path | None = None) -> str:
    """The sheet ``path`` as it was at ``rev``, read by git itself (argument list, no shell)."""
    if not rev or rev.startswith("-") or "\n" in rev or "\x00" in rev:
        raise DiffSourceError(f"{rev!r} is not a git revision")
    cwd = Path(cwd or Path.cwd())
    candidates = [path] if path.startswith(("./", "../")) else [f"./{path}", path]
    last = ""
    for p in candidates:
        try:
            proc = subprocess.run(["git", "show", "--no-textconv", "--end-of-options", f"{rev}:{p}"], cwd=cwd,
                                  capture_output=True, timeout=30, env={**os.environ, "GIT_TERMINAL_PROMPT": "0",
                                                                         "GIT_PAGER": "cat"})
        except FileNotFoundError:
            raise DiffSourceError("git is not installed; a REV:path side needs git") from None
        except subprocess.TimeoutExpired:
            raise DiffSourceError(f"git show {rev}:{p} took too long") from None
        if proc.returncode == 0:
            if len(proc.stdout) > reading.limit("SHEET_BYTES"):
                raise DiffSourceError(f"{rev}:{path}:1:1: larger than the sheet size cap; "
                                      + reading.how_to_raise("SHEET_BYTES"))
            try:
                return reading.decode_utf8(proc.stdout, f"{rev}:{path}")
            except CalcError as exc:
                raise DiffSourceError(f"{rev}:{path}:{exc.span.line}:{exc.span.col}: {exc.message}") from None
        last = proc.stderr.decode("utf-8", "replace").strip().splitlines()[-1:] or [""]
        last = last[0]
    raise DiffSourceError(f"cannot read {rev}:{path} from git: {last}")


def load_result(spec: str, *, overrides: dict | None = None, cwd: Path | None = None):
    """Run the sheet a spec names (file or REV:path); None when the spec is a saved JSON result."""
    from ..engine import run

    p = Path(spec)
    if reading.is_file(p):
        if p.suffix.lower() == ".json" or _starts_with_brace(p):
            return None
        return _readable(run(p, overrides=overrides, path=str(p)))  # the engine reads it: bounded, strict
    try:
        reading.check_path_text(spec, "a diff side")
    except CalcError as exc:
        raise DiffSourceError(f"{spec[:80]!r}…: {exc.message}") from None
    rev, sep, path = spec.partition(":")
    if not sep or not rev or not path:
        raise DiffSourceError(f"{spec}: no such file (a git revision is written REV:path, e.g. HEAD~1:sheet.calc)")
    return _readable(run(git_show(rev, path, cwd), overrides=overrides, path=path))


def _readable(result):
    """A sheet that could not be read at all (too large, not UTF-8) is no side of a diff: its located
    error is the answer."""
    for d in result.errors:
        if d.code in ("input", "too-complex") and not result.steps:
            raise DiffSourceError(f"{d.path}:{d.span.line}:{d.span.col}: {d.message}")
    return result


def _starts_with_brace(p: Path) -> bool:
    try:
        with open(p, "rb") as fh:
            return fh.read(4096).lstrip().startswith(b"{")
    except OSError:
        return False


def load_side(spec: str, *, cwd: Path | None = None) -> Snapshot:
    """A Snapshot of whatever ``spec`` names: a sheet file, REV:path, or a saved JSON result."""
    p = Path(spec)
    result = load_result(spec, cwd=cwd)
    if result is not None:
        return snapshot_of_result(result, spec)
    try:
        text = reading.read_text(p, "JSON_BYTES", "saved JSON result")
    except CalcError as exc:
        raise DiffSourceError(f"{spec}:{exc.span.line}:{exc.span.col}: {exc.message}"
                              + (f" ({exc.hint})" if exc.hint else "")) from None
    return snapshot_of_json(parse_json(text, spec), spec)
