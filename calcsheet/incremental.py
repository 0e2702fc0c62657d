"""Recompute only what an input change touches.

After a changed dimension (an edited input line, or a new ``--set``) the
values that do not depend on it are kept from the previous run; only the
changed inputs and ``Resolution.downstream`` of them are evaluated again,
statement by statement, with the engine's own ``Evaluator``. Anything the
fast path cannot vouch for (a new name, a changed formula, a dimension that
moved, an error) falls back to a full ``engine.run``, so the result is always
the one a full run would give.
"""
from __future__ import annotations

import bisect
import copy
import dataclasses
from dataclasses import dataclass, field
from typing import Any

import pint

from . import nodes as N
from . import units as U
from .checker import Checker
from . import collector
from .engine import Result, _check_text, parse_override, run
from .errors import CalcError, Diagnostic
from .builtins import CONSTANTS
from .evaluator import Evaluator, SheetFunction, evaluate_statement
from .parser import parse_sheet
from .plugin import Record
from .trace import CheckResult, FunctionStep, Step


@dataclass
class Rebuild:
    """A rebuilt result and how it was reached (for tests, the watcher and the benchmark)."""

    result: Result
    recomputed: list[str] = field(default_factory=list)  # keys evaluated again, in sheet order
    full: bool = False  # True when the fast path gave way to a full run
    reason: str = ""  # why a full run was needed


class _FullRun(Exception):
    """The fast path cannot vouch for this change."""


# ---------------------------------------------------------------- public entry points


def recompute(previous: Result, overrides: dict[str, Any] | None, *, plugins=None) -> Rebuild:
    """The previous run with a new set of overrides, re-evaluating only what they reach."""
    with collector.run_pause():  # as a full run: no collection walks the heap meanwhile
        return _recompute(previous, overrides, plugins)


def _recompute(previous: Result, overrides: dict[str, Any] | None, plugins) -> Rebuild:
    overrides = dict(overrides or {})
    try:
        if not _clean(previous):
            raise _FullRun("the previous run had errors")
        if previous.includes:
            raise _FullRun("the sheet includes other files (they may have changed)")
        exprs = _override_exprs(previous, overrides)
        roots = set(exprs) | set(previous.overrides)
        result, keys = _reevaluate(previous, {}, exprs, roots, previous.source, previous.sheet, plugins)
        return Rebuild(result, keys)
    except _FullRun as why:
        return Rebuild(run(previous.source, overrides=overrides, path=previous.path, plugins=plugins), full=True,
                       reason=str(why))


def rebuild(previous: Result | None, source: str, *, overrides: dict[str, Any] | None = None,
            plugins=None) -> Rebuild:
    """The sheet after an edit; when only input lines changed, only their dependents are evaluated."""
    with collector.run_pause():  # as a full run: no collection walks the heap meanwhile
        return _rebuild(previous, source, overrides, plugins)


def _rebuild(previous: Result | None, source: str, overrides: dict[str, Any] | None, plugins) -> Rebuild:
    overrides = dict(overrides or {})
    source = source.replace("\r\n", "\n").replace("\r", "\n")
    if source.startswith("\ufeff"):
        source = source[1:]
    path = previous.path if previous is not None else "<sheet>"
    try:
        if previous is None:
            raise _FullRun("no previous run")
        if not _clean(previous):
            raise _FullRun("the previous run had errors")
        if previous.includes:
            raise _FullRun("the sheet includes other files (they may have changed)")
        new_stmts, sheet = _edited_inputs(previous, source, plugins)
        exprs = _override_exprs(previous, overrides)
        roots = set(new_stmts) | set(exprs) | set(previous.overrides)
        result, keys = _reevaluate(previous, new_stmts, exprs, roots, source, sheet, plugins)
        return Rebuild(result, keys)
    except _FullRun as why:
        return Rebuild(run(source, overrides=overrides, path=path, plugins=plugins), full=True, reason=str(why))


# ---------------------------------------------------------------- what changed


def _clean(r: Result) -> bool:
    return r.ok and r.sheet is not None and r.resolution is not None and not r.resolution.broken


def _is_constant(expr: N.Expr) -> bool:
    return not any(isinstance(n, (N.PluginCall, N.FieldAccess)) or (isinstance(n, N.Name) and n.id not in CONSTANTS)
                   for n in N.walk(expr))


def _override_exprs(previous: Result, overrides: dict[str, Any]) -> dict[str, Any]:
    out = {}
    for name, value in overrides.items():
        if name not in previous.resolution.inputs:
            raise _FullRun(f"--set {name}: not an input of the sheet")  # the full run reports it
        try:
            out[name] = value if isinstance(value, pint.Quantity) else parse_override(name, str(value))
        except CalcError:
            raise _FullRun(f"--set {name}: not a value") from None
    return out


def _edited_inputs(previous: Result, source: str, plugins) -> tuple[dict[str, N.Definition], N.Sheet]:
    """The input definitions an edit rewrote, re-parsed; anything else edited means a full run."""
    old_lines = previous.source.split("\n")
    new_lines = source.split("\n")
    if len(old_lines) != len(new_lines):
        raise _FullRun("lines were added or removed")
    changed = [i + 1 for i, (a, b) in enumerate(zip(old_lines, new_lines)) if a != b]
    res = previous.resolution
    inputs = set(res.inputs)
    owners: dict[str, N.Definition] = {}
    for line in changed:
        owner = _owner(previous.sheet.body, line)
        if owner is None or owner.name not in inputs:
            raise _FullRun(f"line {line} is not an input definition")
        owners[owner.name] = owner
    new_stmts: dict[str, N.Definition] = {}
    for name, old in owners.items():
        first, last = old.span.line, old.span.end_line
        text = "\n" * (first - 1) + "\n".join(new_lines[first - 1:last])
        try:
            mini, diags = parse_sheet(text, previous.path)
        except Exception:
            raise _FullRun(f"line {first} does not parse") from None
        body = [s for s in mini.body if not isinstance(s, (N.Heading, N.Prose))]
        if diags or mini.meta or len(body) != 1 or not isinstance(body[0], N.Definition):
            raise _FullRun(f"line {first} is no longer one definition")
        new = body[0]
        if new.name != name or new.span.line != first or new.span.end_line != last or not _is_constant(new.expr):
            raise _FullRun(f"line {first} now defines something else")
        try:
            t = Checker(plugins or _registry(), previous.path).definition(new)
        except CalcError:
            raise _FullRun(f"line {first} has a dimension error") from None
        old_value = previous.values.get(name)
        if t.kind != "q" or not isinstance(old_value, pint.Quantity) or t.dim != U.dim_of(old_value):
            raise _FullRun(f"{name} changed dimension")
        if any(d.span.line <= last and d.span.end_line >= first for d in previous.diagnostics):
            raise _FullRun(f"line {first} had diagnostics")
        # the static findings a full check would make on the new line (a value implausible for its name…);
        # alone, every input is unused, so that one finding says nothing here
        alone = run(text, evaluate=False, path=previous.path, plugins=plugins)
        if any(d.code != "unused-input" for d in alone.diagnostics):
            raise _FullRun(f"line {first} has diagnostics")
        new_stmts[name] = new
    body = tuple(new_stmts.get(s.name, s) if isinstance(s, N.Definition) else s for s in previous.sheet.body)
    return new_stmts, dataclasses.replace(previous.sheet, body=body, source=source)


def _owner(body, line: int) -> N.Definition | None:
    """The definition whose lines hold ``line``, or None.

    Statements stand in the order of their lines and never overlap, so the last one starting at or before
    ``line`` is found by bisection; a body out of that order (a statement without a place) is searched whole.
    """
    def covers(s):
        return isinstance(s, N.Definition) and s.span is not None and s.span.line <= line <= s.span.end_line

    at = bisect.bisect_right(body, line, key=lambda s: s.span.line if s.span is not None else 0) - 1
    if at >= 0 and covers(body[at]):
        return body[at]
    return next((s for s in body if covers(s)), None)


def _registry():
    from .plugin import default_registry

    return default_registry()


# ---------------------------------------------------------------- re-evaluation


def _reevaluate(prev: Result, new_stmts: dict[str, N.Definition], overrides: dict[str, Any], roots: set[str],
                source: str, sheet: N.Sheet, plugins) -> tuple[Result, list[str]]:
    res = copy.copy(prev.resolution)
    res.statements = {**prev.resolution.statements, **new_stmts}
    res.broken = set(prev.resolution.broken)
    dirty: set[str] = set(roots)
    for name in roots:
        dirty.update(res.downstream(name))
    dirty_order = res.in_order(dirty)

    ev = Evaluator(prev.policy, plugins or _registry(), front_matter=prev.meta)
    env: dict[str, Any] = dict(prev.values)
    env.update({name: SheetFunction(fd) for name, fd in res.functions.items()})  # the sheet's own functions
    ev.sheet_functions = bool(res.functions)
    display: dict[str, Any] = {n: s.display_unit for n, s in prev.steps.items()}
    new_steps: dict[str, Step] = {}
    new_checks: dict[str, CheckResult] = {}
    new_overrides = {k: v for k, v in prev.overrides.items() if k not in roots}
    warnings: list[Diagnostic] = []
    inputs = res.input_set()
    source_lines = source.split("\n")

    def unit_of(k, v):
        if k in display:
            return display[k]
        return prev.policy.unit_for(v) if isinstance(v, pint.Quantity) else None

    for key in dirty_order:
        stmt = res.statements[key]
        try:
            record = evaluate_statement(ev, stmt, env, display, overrides=overrides, applied=new_overrides,
                                        inputs=inputs, unit_of=unit_of)
            if isinstance(record, Step):
                old = prev.steps.get(key)
                if key in roots and old is not None and not _same_kind(old.value, record.value):
                    raise _FullRun(f"{key} changed dimension")
                new_steps[key] = record
            else:
                record.text = _check_text(stmt, source_lines)
                new_checks[key] = record
        except CalcError:
            raise _FullRun(f"{key} now raises an error") from None
        warnings.extend(ev.take_warnings(stmt.span, prev.path))

    result = Result(path=prev.path, source=source, meta=dict(prev.meta), policy=prev.policy, resolution=res,
                    sheet=sheet, overrides=new_overrides,
                    plugin_versions={**prev.plugin_versions, **ev.plugin_versions})
    # A kept record is the previous run's own object, not a copy: a record is finished when its run ends
    # (numbering copies it, no printer changes it), and the live preview knows an unchanged record by its
    # identity, so it reuses the record's printed block without working out what it prints from.
    steps, values, checks, items = result.steps, result.values, result.checks, result.items
    for item in prev.items:
        if isinstance(item, Step):
            item = new_steps.get(item.name, item)
            if not isinstance(item, FunctionStep):  # a function is not a value
                steps[item.name] = item
                values[item.name] = item.value
        elif isinstance(item, CheckResult):
            fresh = new_checks.get(f"check@{item.span.line}")  # lines do not move on the fast path
            if fresh is not None:
                fresh.anchor = item.anchor
                item = fresh
            checks.append(item)
        items.append(item)
    dirty_lines = [(res.statements[k].span.line, res.statements[k].span.end_line) for k in dirty_order]
    keep = [d for d in prev.diagnostics if not (d.code == "plugin-warning" and any(
        a <= d.span.line <= b for a, b in dirty_lines))]
    result.diagnostics = sorted(keep + warnings, key=lambda d: (d.span.line, d.span.col))
    return result, dirty_order


def _same_kind(a, b) -> bool:
    if isinstance(a, pint.Quantity) and isinstance(b, pint.Quantity):
        return U.dim_of(a) == U.dim_of(b)
    if isinstance(a, Record) and isinstance(b, Record):
        return a.type == b.type
    return type(a) is type(b)
