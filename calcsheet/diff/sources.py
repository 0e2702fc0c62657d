"""The sources of a side: a sheet file, a git revision of one (``REV:path``), or a saved JSON result."""
from __future__ import annotations

import json
import os
import re
import subprocess
from pathlib import Path

import pint

from .. import units as U
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


def snapshot_of_json(data: dict, label: str) -> Snapshot:
    """A Snapshot of a saved ``--format json`` result (dependencies are not saved there)."""
    if not isinstance(data, dict) or not isinstance(data.get("values"), dict):
        raise DiffSourceError(f"{label}: not a calcsheet JSON result (no 'values' table)")
    errors = sum(1 for d in data.get("diagnostics", []) if isinstance(d, dict) and d.get("severity") == "error")
    snap = Snapshot(label=label, meta=dict(data.get("meta") or {}), errors=errors)
    for name, v in data["values"].items():
        if not isinstance(v, dict):
            continue
        common = dict(is_input=bool(v.get("input")), line=v.get("line"), description=v.get("description"))
        if "record" in v:
            snap.values[name] = Entry(name, text=f"{v['record']} result", **common)
            for fname, fval in (v.get("fields") or {}).items():
                if isinstance(fval, dict):
                    snap.values[f"{name}.{fname}"] = _json_entry(f"{name}.{fname}", fval, line=common["line"],
                                                                 reads=(name,), parent=name)
        else:
            snap.values[name] = _json_entry(name, v, **common)
    for c in data.get("checks", []):
        if isinstance(c, dict):
            snap.checks.append(CheckEntry(text=str(c.get("text", "")), ok=bool(c.get("ok")), ratio=c.get("ratio"),
                                          description=c.get("description"), line=c.get("line")))
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
            try:
                return proc.stdout.decode("utf-8")
            except UnicodeDecodeError:
                raise DiffSourceError(f"{rev}:{path} is not UTF-8 text") from None
        last = proc.stderr.decode("utf-8", "replace").strip().splitlines()[-1:] or [""]
        last = last[0]
    raise DiffSourceError(f"cannot read {rev}:{path} from git: {last}")


def load_result(spec: str, *, overrides: dict | None = None, cwd: Path | None = None):
    """Run the sheet a spec names (file or REV:path); None when the spec is a saved JSON result."""
    from ..engine import run

    p = Path(spec)
    if p.is_file():
        text = p.read_text(encoding="utf-8")
        if p.suffix.lower() == ".json" or text.lstrip().startswith("{"):
            return None
        return run(text, overrides=overrides, path=str(p))
    rev, sep, path = spec.partition(":")
    if not sep or not rev or not path:
        raise DiffSourceError(f"{spec}: no such file (a git revision is written REV:path, e.g. HEAD~1:sheet.calc)")
    return run(git_show(rev, path, cwd), overrides=overrides, path=path)


def load_side(spec: str, *, cwd: Path | None = None) -> Snapshot:
    """A Snapshot of whatever ``spec`` names: a sheet file, REV:path, or a saved JSON result."""
    p = Path(spec)
    result = load_result(spec, cwd=cwd)
    if result is not None:
        return snapshot_of_result(result, spec)
    try:
        data = json.loads(p.read_text(encoding="utf-8"))
    except json.JSONDecodeError as exc:
        raise DiffSourceError(f"{spec}: not valid JSON ({exc.msg}, line {exc.lineno})") from None
    return snapshot_of_json(data, spec)
