"""What changed between two revisions of a sheet, so a reviewer re-checks only what moved.

Each side is a sheet file, a git revision of one (``REV:path``) or a saved
JSON result. Both are reduced to a ``Snapshot`` (values by name, checks with
the names they read) and compared by name and by dependency, never by line
number: inserting a line elsewhere changes nothing that did not move.
"""
from __future__ import annotations

import json
import math
import os
import re
import subprocess
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import pint

from . import units as U
from .display import plain_number, unit_text
from .render.html import esc

REL_TOL = 1e-9  # values closer than this are the same value (float noise, unit round trips)
SIGFIGS = 4  # the diff shows one more figure than the package, so small moves are visible


class DiffSourceError(Exception):
    """A side of the diff cannot be read; the message names it."""


# ---------------------------------------------------------------- snapshots


@dataclass
class Entry:
    """One value of a sheet (a record's fields are entries ``rec.field``)."""

    name: str
    quantity: Any = None  # pint Quantity (magnitude float or array) when the value is a number
    text: str | None = None  # the value when it is not a quantity, as a comparable string
    is_input: bool = False
    line: int | None = None
    description: str | None = None
    formula: str | None = None  # the right-hand side as written, when the side is a sheet
    reads: tuple[str, ...] | None = None  # names it reads, when known
    parent: str | None = None  # the record a field belongs to

    def shown(self) -> str:
        if self.quantity is not None:
            return show_quantity(self.quantity)
        return self.text if self.text is not None else "—"


@dataclass
class CheckEntry:
    text: str
    ok: bool
    ratio: float | None
    description: str | None = None
    reads: tuple[str, ...] | None = None
    line: int | None = None


@dataclass
class Snapshot:
    label: str
    meta: dict = field(default_factory=dict)
    values: dict[str, Entry] = field(default_factory=dict)  # in sheet order
    checks: list[CheckEntry] = field(default_factory=list)
    errors: int = 0

    @property
    def rev(self) -> str:
        return str(self.meta.get("rev", "") or "")


def show_quantity(q) -> str:
    mag = q.magnitude
    try:
        text = plain_number(float(mag), SIGFIGS)
    except TypeError:
        text = "[" + ", ".join(plain_number(float(x), SIGFIGS) for x in list(mag)[:4]) + (", …]" if len(mag) > 4 else "]")
    unit = unit_text(q.units) if not q.dimensionless or q.units != U.registry().Unit("") else ""
    return f"{text} {unit}".strip()


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
    from .plugin import Record
    from .resolver import check_key

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


# ---------------------------------------------------------------- reading a side


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
    from .engine import run

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


# ---------------------------------------------------------------- comparing


@dataclass
class ValueChange:
    name: str
    old: Entry | None
    new: Entry | None
    pct: float | None = None  # % change, when both are comparable non-zero numbers
    caused_by: list[str] = field(default_factory=list)
    formula_changed: bool = False

    def to_json(self) -> dict:
        return {"name": self.name, "old": _entry_json(self.old), "new": _entry_json(self.new),
                "percent": self.pct, "caused_by": self.caused_by, "formula_changed": self.formula_changed}


@dataclass
class CheckChange:
    old: CheckEntry | None
    new: CheckEntry | None

    @property
    def flipped(self) -> bool:
        return self.old is not None and self.new is not None and self.old.ok != self.new.ok

    @property
    def text(self) -> str:
        return (self.new or self.old).text

    def to_json(self) -> dict:
        def side(c):
            return None if c is None else {"text": c.text, "ok": c.ok, "status": "OK" if c.ok else "NG",
                                           "ratio": c.ratio, "line": c.line, "description": c.description}
        return {"text": self.text, "old": side(self.old), "new": side(self.new), "flipped": self.flipped}


@dataclass
class SheetDiff:
    old: Snapshot
    new: Snapshot
    inputs: list[ValueChange] = field(default_factory=list)
    results: list[ValueChange] = field(default_factory=list)
    added: list[str] = field(default_factory=list)
    removed: list[str] = field(default_factory=list)
    flipped: list[CheckChange] = field(default_factory=list)
    moved: list[CheckChange] = field(default_factory=list)  # same status, utilisation moved
    edited_checks: list[CheckChange] = field(default_factory=list)  # matched by dependency, text differs
    checks_added: list[CheckEntry] = field(default_factory=list)
    checks_removed: list[CheckEntry] = field(default_factory=list)
    meta: dict[str, tuple[Any, Any]] = field(default_factory=dict)

    @property
    def empty(self) -> bool:
        return not (self.inputs or self.results or self.added or self.removed or self.flipped or self.moved
                    or self.edited_checks or self.checks_added or self.checks_removed)

    @property
    def changed_names(self) -> set[str]:
        """Top-level names whose value moved or that are new: the package marks these."""
        out = set(self.added)
        for ch in self.inputs + self.results:
            out.add(ch.name.split(".", 1)[0])
        return {n for n in out if "." not in n}

    def to_json(self) -> dict:
        return {
            "old": {"source": self.old.label, "rev": self.old.rev, "errors": self.old.errors},
            "new": {"source": self.new.label, "rev": self.new.rev, "errors": self.new.errors},
            "inputs": [c.to_json() for c in self.inputs],
            "results": [c.to_json() for c in self.results],
            "added": self.added,
            "removed": self.removed,
            "checks": {"flipped": [c.to_json() for c in self.flipped],
                       "moved": [c.to_json() for c in self.moved],
                       "edited": [c.to_json() for c in self.edited_checks],
                       "added": [CheckChange(None, c).to_json() for c in self.checks_added],
                       "removed": [CheckChange(c, None).to_json() for c in self.checks_removed]},
            "meta": {k: {"old": a, "new": b} for k, (a, b) in self.meta.items()},
        }


def _entry_json(e: Entry | None):
    if e is None:
        return None
    out: dict[str, Any] = {"shown": e.shown(), "line": e.line}
    if e.quantity is not None:
        try:
            out["value"] = float(e.quantity.magnitude)
        except TypeError:
            out["value"] = [float(x) for x in e.quantity.magnitude]
        from .display import pint_unit_string

        out["unit"] = pint_unit_string(e.quantity.units) if e.quantity.units._units else ""
    else:
        out["text"] = e.text
    if e.formula is not None:
        out["formula"] = e.formula
    return out


def _same_value(a: Entry, b: Entry, scale: float = 0.0) -> tuple[bool, float | None]:
    """(equal?, % change) — quantities compare in the old side's unit; ``scale`` is the size of the
    neighbouring values of the same dimension, so float noise on a zero (a product of inertia of a
    symmetric section) is not a change."""
    if a.quantity is None or b.quantity is None:
        return (a.quantity is None and b.quantity is None and a.text == b.text), None
    qa, qb = a.quantity, b.quantity
    if U.dim_of(qa) != U.dim_of(qb):
        return False, None
    try:
        vb = qb.to(qa.units).magnitude
    except pint.DimensionalityError:
        return False, None
    va = qa.magnitude
    try:
        fa, fb = float(va), float(vb)
    except TypeError:
        import numpy as np

        va, vb = np.asarray(va, float), np.asarray(vb, float)
        if va.shape != vb.shape:
            return False, None
        return bool(np.allclose(va, vb, rtol=REL_TOL, atol=0)), None
    tol = 1e-300
    if scale:
        tol = REL_TOL * scale / float(U.registry().Quantity(1.0, qa.units).to_base_units().magnitude)
    if math.isclose(fa, fb, rel_tol=REL_TOL, abs_tol=tol):
        return True, None
    return False, ((fb - fa) / abs(fa) * 100.0) if fa != 0 else None


def _dim_key(e: Entry):
    return U.dim_of(e.quantity) if e.quantity is not None else None


def _record_scales(*snaps: Snapshot) -> dict:
    """(record, dimension) -> the largest magnitude among its fields of that dimension, in base units."""
    out: dict = {}
    for snap in snaps:
        for e in snap.values.values():
            if e.parent and e.quantity is not None:
                try:
                    m = abs(float(e.quantity.to_base_units().magnitude))
                except TypeError:
                    continue
                key = (e.parent, _dim_key(e))
                out[key] = max(out.get(key, 0.0), m)
    return out


def _norm(text: str) -> str:
    return re.sub(r"\s+", "", text or "")


def _match_checks(old: list[CheckEntry], new: list[CheckEntry]):
    """Pairs (old, new) by text, then by the names they read; the rest are added or removed."""
    pairs: list[tuple[CheckEntry, CheckEntry]] = []
    left = list(old)
    unmatched_new = []
    for c in new:
        hit = next((o for o in left if _norm(o.text) == _norm(c.text)), None)
        if hit is not None:
            left.remove(hit)
            pairs.append((hit, c))
        else:
            unmatched_new.append(c)
    still_new = []
    for c in unmatched_new:
        hits = [o for o in left if c.reads and o.reads and set(o.reads) == set(c.reads)]
        hits.sort(key=lambda o: (o.description != c.description,))
        if hits:
            left.remove(hits[0])
            pairs.append((hits[0], c))
        else:
            still_new.append(c)
    return pairs, left, still_new


def _upstream(name: str, reads: dict[str, tuple[str, ...] | None]) -> set[str]:
    seen: set[str] = set()
    stack = [name]
    while stack:
        for r in reads.get(stack.pop()) or ():
            if r not in seen:
                seen.add(r)
                stack.append(r)
    return seen


def diff_snapshots(old: Snapshot, new: Snapshot) -> SheetDiff:
    d = SheetDiff(old=old, new=new)
    for key in sorted(set(old.meta) | set(new.meta)):
        a, b = old.meta.get(key), new.meta.get(key)
        if a != b:
            d.meta[key] = (a, b)
    changes: list[ValueChange] = []
    scales = _record_scales(old, new)
    for name, e_new in new.values.items():
        e_old = old.values.get(name)
        if e_old is None:
            if e_new.parent is None:
                d.added.append(name)
            continue
        scale = scales.get((e_new.parent, _dim_key(e_old)), 0.0) if e_new.parent else 0.0
        same, pct = _same_value(e_old, e_new, scale)
        formula_changed = (e_old.formula is not None and e_new.formula is not None
                           and _norm(e_old.formula) != _norm(e_new.formula))
        if not same:
            changes.append(ValueChange(name, e_old, e_new, pct, formula_changed=formula_changed))
        elif formula_changed and e_new.parent is None:
            changes.append(ValueChange(name, e_old, e_new, None, formula_changed=True))
    d.removed = [n for n, e in old.values.items() if n not in new.values and e.parent is None]

    # why each result moved: the changed inputs and edited definitions upstream of it
    reads = {n: e.reads for n, e in new.values.items()}
    roots = {c.name for c in changes if c.new.is_input or c.formula_changed} | set(d.added)
    for c in changes:
        if c.new.is_input:
            d.inputs.append(c)
            continue
        c.caused_by = [n for n in new.values if n in roots and n in _upstream(c.name, reads) and n != c.name]
        d.results.append(c)

    pairs, gone, fresh = _match_checks(old.checks, new.checks)
    for a, b in pairs:
        ch = CheckChange(a, b)
        if ch.flipped:
            d.flipped.append(ch)
        elif _norm(a.text) != _norm(b.text):
            d.edited_checks.append(ch)
        elif (a.ratio is None) != (b.ratio is None) or (
                a.ratio is not None and not math.isclose(a.ratio, b.ratio, rel_tol=REL_TOL, abs_tol=1e-12)):
            d.moved.append(ch)
    d.checks_removed, d.checks_added = gone, fresh
    return d


def diff_results(old_result, new_result, old_label="old", new_label="new") -> SheetDiff:
    return diff_snapshots(snapshot_of_result(old_result, old_label), snapshot_of_result(new_result, new_label))


def diff_specs(old_spec: str, new_spec: str, cwd: Path | None = None) -> SheetDiff:
    return diff_snapshots(load_side(old_spec, cwd=cwd), load_side(new_spec, cwd=cwd))


# ---------------------------------------------------------------- printing


def _pct(p: float | None) -> str:
    if p is None:
        return ""
    return f"{p:+.2f} %" if abs(p) >= 0.005 else f"{p:+.2e} %"


def _ratio(r) -> str:
    return f"{r:.3f}" if isinstance(r, (int, float)) else "—"


def _status(c: CheckEntry) -> str:
    return "OK" if c.ok else "NG"


def since_label(d: SheetDiff) -> str:
    return f"rev {d.old.rev} ({d.old.label})" if d.old.rev else d.old.label


FIELDS_SHOWN = 6  # a record's changed fields shown in the text and page; JSON has them all


def grouped(changes: list[ValueChange]) -> list[tuple[ValueChange | None, list[ValueChange]]]:
    """Plain values alone; a record's changed fields together under the first of them."""
    out: list = []
    index: dict[str, int] = {}
    for c in changes:
        parent = c.new.parent if c.new is not None else None
        if parent is None:
            out.append((None, [c]))
        elif parent in index:
            out[index[parent]][1].append(c)
        else:
            index[parent] = len(out)
            out.append((ValueChange(parent, None, None, caused_by=c.caused_by), [c]))
    return out


def to_text(d: SheetDiff) -> str:
    """The terminal report."""
    out = [f"changes from {since_label(d)} to " + (f"rev {d.new.rev} ({d.new.label})" if d.new.rev else d.new.label)]
    for side in (d.old, d.new):
        if side.errors:
            out.append(f"  note: {side.label} has {side.errors} error(s); values below an error are missing")
    if d.empty and not d.meta:
        out.append("  no changes in values or checks")
        return "\n".join(out)
    for key, (a, b) in d.meta.items():
        if not isinstance(a, list) and not isinstance(b, list):
            out.append(f"  {key}: {a if a is not None else '—'} → {b if b is not None else '—'}")
    if d.inputs:
        out.append("inputs changed:")
        out += [f"  {c.name}: {c.old.shown()} → {c.new.shown()}  {_pct(c.pct)}".rstrip() for c in d.inputs]
    if d.results:
        out.append("results changed:")
        for head, group in grouped(d.results):
            if head is not None:
                why = f", via {', '.join(head.caused_by)}" if head.caused_by else ""
                out.append(f"  {head.name}: {len(group)} field(s) changed{why}")
                for c in group[:FIELDS_SHOWN]:
                    out.append(f"    .{c.name.split('.', 1)[1]}: {c.old.shown()} → {c.new.shown()}  "
                               f"{_pct(c.pct)}".rstrip())
                if len(group) > FIELDS_SHOWN:
                    out.append(f"    … and {len(group) - FIELDS_SHOWN} more (--format json lists every field)")
                continue
            c = group[0]
            why = f"  (via {', '.join(c.caused_by)})" if c.caused_by else ""
            if c.formula_changed:
                why += f"  formula: {c.old.formula} → {c.new.formula}"
            out.append(f"  {c.name}: {c.old.shown()} → {c.new.shown()}  {_pct(c.pct)}{why}".rstrip())
    if d.flipped:
        out.append("checks flipped:")
        out += [f"  {c.text}: {_status(c.old)} → {_status(c.new)}  ratio {_ratio(c.old.ratio)} → "
                f"{_ratio(c.new.ratio)}" for c in d.flipped]
    if d.moved:
        out.append("utilisation moved:")
        out += [f"  {c.text}: {_status(c.new)}  ratio {_ratio(c.old.ratio)} → {_ratio(c.new.ratio)}"
                for c in d.moved]
    if d.edited_checks:
        out.append("checks edited:")
        out += [f"  {c.old.text} → {c.new.text}: {_status(c.new)}  ratio {_ratio(c.old.ratio)} → "
                f"{_ratio(c.new.ratio)}" for c in d.edited_checks]
    if d.added or d.checks_added:
        out.append("added:")
        out += [f"  {n} = {d.new.values[n].shown()}" for n in d.added]
        out += [f"  check {c.text}: {_status(c)}  ratio {_ratio(c.ratio)}" for c in d.checks_added]
    if d.removed or d.checks_removed:
        out.append("removed:")
        out += [f"  {n} (was {d.old.values[n].shown()})" for n in d.removed]
        out += [f"  check {c.text}" for c in d.checks_removed]
    return "\n".join(out)


def changes_page_html(d: SheetDiff) -> str:
    """The "changes since revision X" page for the front of a package; all sheet text is escaped."""
    def table(head: list[str], rows: list[list[str]], cls: str) -> str:
        return (f"<table class='summary {cls}'><thead><tr>" + "".join(f"<th>{esc(h)}</th>" for h in head)
                + "</tr></thead><tbody>" + "".join("<tr>" + "".join(f"<td>{c}</td>" for c in r) + "</tr>"
                                                    for r in rows) + "</tbody></table>")

    def link(name: str) -> str:
        top = name.split(".", 1)[0]
        from .render.html import anchor_id

        return f"<a href='#{esc(anchor_id('v-' + top))}'>{esc(name)}</a>" if top in d.new.values else esc(name)

    parts = [f"<section class='changes' style='page-break-before: always'>"
             f"<h2 class='front-h'>Changes since {esc(since_label(d))}</h2>"]
    n_val = len(d.inputs) + len(d.results)
    n_results = len(grouped(d.results))
    summary = (f"{len(d.inputs)} input(s) and {n_results} result(s) changed; {len(d.flipped)} check(s) "
               f"changed status; {len(d.moved)} utilisation(s) moved; {len(d.added) + len(d.checks_added)} "
               f"step(s) added, {len(d.removed) + len(d.checks_removed)} removed.")
    parts.append(f"<p>{esc(summary)} Values that moved are marked <span class='mark changed'>changed</span> "
                 f"in the calculation; everything else is as in {esc(since_label(d))}.</p>"
                 if n_val or not d.empty else f"<p>No value or check changed since {esc(since_label(d))}.</p>")
    if d.flipped:
        parts.append("<h3>Checks that changed status</h3>" + table(
            ["Check", "Was", "Now", "Ratio was", "Ratio now"],
            [[esc(c.text), esc(_status(c.old)), f"<strong>{esc(_status(c.new))}</strong>", esc(_ratio(c.old.ratio)),
              esc(_ratio(c.new.ratio))] for c in d.flipped], "flipped"))
    if d.inputs:
        parts.append("<h3>Inputs changed</h3>" + table(
            ["Symbol", "Was", "Now", "Change"],
            [[link(c.name), esc(c.old.shown()), esc(c.new.shown()), esc(_pct(c.pct))] for c in d.inputs], "inputs"))
    if d.results:
        rows = []
        for head, group in grouped(d.results):
            if head is not None:
                rows.append([link(head.name), esc(f"{len(group)} field(s) of the result changed"), "", "",
                             esc(", ".join(head.caused_by))])
                shown = group[:FIELDS_SHOWN]
                rows += [[esc("  ." + c.name.split(".", 1)[1]), esc(c.old.shown()), esc(c.new.shown()),
                          esc(_pct(c.pct)), ""] for c in shown]
                if len(group) > len(shown):
                    rows.append(["", esc(f"… and {len(group) - len(shown)} more fields"), "", "", ""])
                continue
            c = group[0]
            rows.append([link(c.name), esc(c.old.shown()), esc(c.new.shown()), esc(_pct(c.pct)),
                         esc(", ".join(c.caused_by) + (f"; formula was {c.old.formula}" if c.formula_changed
                                                       else ""))])
        parts.append("<h3>Results changed</h3>" + table(["Symbol", "Was", "Now", "Change", "Because of"], rows,
                                                        "results"))
    if d.moved or d.edited_checks:
        parts.append("<h3>Utilisation moved</h3>" + table(
            ["Check", "Status", "Ratio was", "Ratio now"],
            [[esc(c.text if c in d.moved else f"{c.old.text} → {c.new.text}"), esc(_status(c.new)),
              esc(_ratio(c.old.ratio)), esc(_ratio(c.new.ratio))] for c in d.moved + d.edited_checks], "moved"))
    if d.added or d.removed or d.checks_added or d.checks_removed:
        rows = ([[esc("added"), link(n), esc(d.new.values[n].shown())] for n in d.added]
                + [[esc("added"), esc("check " + c.text), esc(_status(c))] for c in d.checks_added]
                + [[esc("removed"), esc(n), esc(d.old.values[n].shown())] for n in d.removed]
                + [[esc("removed"), esc("check " + c.text), ""] for c in d.checks_removed])
        parts.append("<h3>Steps added or removed</h3>" + table(["", "Step", "Value"], rows, "steps"))
    parts.append("</section>")
    return "\n".join(parts)
