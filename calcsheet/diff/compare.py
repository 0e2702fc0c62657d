"""Comparing two snapshots by name and by dependency, never by line number."""
from __future__ import annotations

import math
import re
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import pint

from .. import units as U
from .model import CheckEntry, Entry, Snapshot
from .sources import load_side, snapshot_of_result

REL_TOL = 1e-9  # values closer than this are the same value (float noise, unit round trips)


@dataclass
class ValueChange:
    name: str
    old: Entry | None
    new: Entry | None
    pct: float | None = None  # % change, when both are comparable non-zero numbers
    caused_by: list[str] = field(default_factory=list)
    formula_changed: bool = False


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
