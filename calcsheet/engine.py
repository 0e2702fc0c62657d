"""The pipeline in one place: parse -> resolve -> check -> evaluate -> trace.

``run`` never raises for a problem in the sheet: every problem becomes a
diagnostic on the result, and statements downstream of a broken one are
skipped rather than reported again.
"""
from __future__ import annotations

import hashlib
import os
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any

import pint

from . import __version__, collector
from . import nodes as N
from . import trace as TR
from . import units as U
from .checker import Checker
from .display import DisplayPolicy, pint_unit_string
from .errors import CalcError, Diagnostic, OverrideError, SheetErrors, Span
from .parser import parse_sheet, parse_statement
from .plugin import PluginRegistry, Record, default_registry
from .resolver import Resolution, check_key, resolve
from .suggest import closest

MAX_SIGFIGS = 8


@dataclass
class Result:
    """Everything a printer or a test needs from one run of a sheet."""

    path: str
    source: str
    meta: dict[str, Any]
    items: list[Any] = field(default_factory=list)  # trace: Heading | Prose | Step | CheckResult
    values: dict[str, Any] = field(default_factory=dict)
    steps: dict[str, TR.Step] = field(default_factory=dict)
    checks: list[TR.CheckResult] = field(default_factory=list)
    diagnostics: list[Diagnostic] = field(default_factory=list)
    resolution: Resolution | None = None
    policy: DisplayPolicy = field(default_factory=DisplayPolicy)
    overrides: dict[str, Any] = field(default_factory=dict)
    plugin_versions: dict[str, str] = field(default_factory=dict)
    sheet: N.Sheet | None = None

    @property
    def errors(self) -> list[Diagnostic]:
        return [d for d in self.diagnostics if d.severity == "error"]

    @property
    def ok(self) -> bool:
        """No errors (checks may still be NG)."""
        return not self.errors

    @property
    def all_checks_ok(self) -> bool:
        return all(c.ok for c in self.checks)

    @property
    def sha256(self) -> str:
        return hashlib.sha256(self.source.encode("utf-8")).hexdigest()

    @property
    def engine_version(self) -> str:
        return __version__

    @property
    def precedents(self) -> dict[str, list[str]]:
        return self.resolution.precedents if self.resolution else {}

    @property
    def dependents(self) -> dict[str, list[str]]:
        return self.resolution.dependents if self.resolution else {}

    @property
    def inputs(self) -> list[str]:
        return self.resolution.inputs if self.resolution else []

    def to_json(self) -> dict:
        from .render.json import JsonPrinter

        return JsonPrinter().result(self)

    @property
    def includes(self) -> list[tuple[str, str]]:
        """(path, text) of every included sheet, in the order first included."""
        return list(self.sheet.includes) if self.sheet is not None else []

    def source_for(self, diagnostic: Diagnostic) -> str:
        """The text a diagnostic points into: the sheet's own, or an included file's."""
        for path, text in self.includes:
            if diagnostic.path == path:
                return text
        return self.source

    def format_diagnostics(self) -> str:
        """The findings for the console; one allowed with a reason (``// allow``) is not among them."""
        return "\n".join(d.format(self.source_for(d)) for d in self.diagnostics if not d.suppressed)


def _policy(meta: dict, diags: list[Diagnostic], path: str, lines: dict | None = None) -> DisplayPolicy:
    system = str(meta.get("units", "SI")).strip().upper()
    if system not in ("SI", "US"):
        diags.append(Diagnostic("warning", "front-matter", f"units: {meta.get('units')!r} is not SI or US; using SI",
                                _key_span(lines, "units"), path=path))
        system = "SI"
    sig = meta.get("sigfigs", 3)
    try:
        sig = int(sig)
        if not 1 <= sig <= MAX_SIGFIGS:
            raise ValueError
    except (TypeError, ValueError):
        diags.append(Diagnostic("warning", "front-matter", f"sigfigs must be a whole number 1–{MAX_SIGFIGS}; using 3",
                                _key_span(lines, "sigfigs"), path=path))
        sig = 3
    return DisplayPolicy(system=system, sigfigs=sig)


def _key_span(lines: dict | None, key: str) -> Span:
    """The front-matter line of ``key`` (line 1 when not known)."""
    line = (lines or {}).get(key, 1)
    return Span(line, 1, line, len(key) + 1)


def read_source(path_or_text, path: str | None = None) -> tuple[str, str]:
    """A path to a .calc file, or the sheet text itself."""
    if isinstance(path_or_text, Path) or (
        isinstance(path_or_text, str) and "\n" not in path_or_text and path_or_text.endswith(".calc")
    ):
        from .parser.sheet import read_sheet  # bounded, strict UTF-8; a failure is located SheetErrors

        p = Path(path_or_text)
        return read_sheet(p), path or str(p)
    return str(path_or_text), path or "<sheet>"


def parse_override(name: str, text: str) -> N.Expr:
    """A --set value: a constant expression such as '7.5 m' or '2*150 mm'."""
    try:
        stmt = parse_statement(f"{name} = {text}")
    except CalcError as exc:
        raise OverrideError(f"--set {name}={text}: {exc.message}") from None
    if any(isinstance(n, (N.Name, N.PluginCall, N.FieldAccess)) for n in N.walk(stmt.expr)):
        raise OverrideError(f"--set {name}={text}: an override must be a value, not refer to other names")
    return stmt.expr


def run(path_or_text, overrides: dict[str, Any] | None = None, *, path: str | None = None,
        plugins: PluginRegistry | None = None, evaluate: bool = True) -> Result:
    with collector.run_pause():
        return _run(path_or_text, overrides, path=path, plugins=plugins, evaluate=evaluate)


def _run(path_or_text, overrides: dict[str, Any] | None = None, *, path: str | None = None,
         plugins: PluginRegistry | None = None, evaluate: bool = True) -> Result:
    plugins = plugins or default_registry()
    source = ""
    try:
        source, path = read_source(path_or_text, path)
        sheet, diags = parse_sheet(source, path)
    except SheetErrors as exc:
        path = path or str(path_or_text)
        return Result(path=path, source=source, meta={}, diagnostics=list(exc.diagnostics))
    meta = sheet.meta_dict
    policy = _policy(meta, diags, path, dict(sheet.meta_lines))
    result = Result(path=path, source=sheet.source, meta=meta, diagnostics=diags, policy=policy, sheet=sheet)

    res = resolve(sheet, plugins)
    result.resolution = res
    result.diagnostics.extend(res.diagnostics)
    override_exprs = _prepare_overrides(overrides or {}, res, result)
    checker = Checker(plugins, path)
    result.diagnostics.extend(checker.check_sheet(sheet, res))
    for name, expr in override_exprs.items():
        _check_override_dim(name, expr, checker, result)
    if evaluate:
        _evaluate(sheet, res, result, plugins, override_exprs)
    result.diagnostics.sort(key=lambda d: (d.path != path, d.path, d.span.line, d.span.col))
    from .suppress import apply_suppressions  # `// allow <code>: <reason>` on a statement

    result.diagnostics = apply_suppressions(sheet, result.diagnostics, path, evaluated=evaluate)
    return result


def _prepare_overrides(overrides: dict[str, Any], res: Resolution, result: Result) -> dict[str, N.Expr]:
    out = {}
    for name, value in overrides.items():
        if name not in res.defined_at:
            close = [c for c in [closest(name, res.defined_at)] if c]
            result.diagnostics.append(OverrideError(
                f"--set {name}: the sheet defines no '{name}'", Span(1, 1, 1, 2),
                hint=f"did you mean '{close[0]}'?" if close else None).diagnostic(result.path))
            continue
        if name not in res.inputs:
            stmt = res.statements[name]
            result.diagnostics.append(OverrideError(
                f"--set {name}: '{name}' is calculated on line {stmt.span.line}, not an input",
                stmt.span, hint="override one of the inputs it depends on").diagnostic(result.path))
            continue
        try:
            if isinstance(value, pint.Quantity):
                out[name] = value
            else:
                out[name] = parse_override(name, str(value))
        except CalcError as exc:
            result.diagnostics.append(exc.with_span(res.statements[name].span).diagnostic(result.path))
    return out


def _check_override_dim(name, expr, checker: Checker, result: Result):
    if isinstance(expr, pint.Quantity):
        new = U.dim_of(expr)
    else:
        try:
            t = checker.infer(expr)
        except CalcError as exc:
            result.diagnostics.append(exc.with_span(result.resolution.statements[name].span).diagnostic(result.path))
            result.resolution.broken.add(name)
            return
        new = t.dim if t.kind == "q" else None
    old = checker.types.get(name)
    if old is not None and old.kind == "q" and new is not None and new != old.dim:
        stmt = result.resolution.statements[name]
        result.diagnostics.append(OverrideError(
            f"--set {name}: the sheet's {name} is {U.describe_dim(old.dim)}, the override is {U.describe_dim(new)}",
            stmt.span).diagnostic(result.path))
        result.resolution.broken.add(name)
        for key in result.resolution.downstream(name):
            result.resolution.broken.add(key)


def _evaluate(sheet: N.Sheet, res: Resolution, result: Result, plugins, overrides: dict) -> None:
    from .evaluator import Evaluator, evaluate_statement  # here: `check` never evaluates, nor imports it

    ev = Evaluator(result.policy, plugins, front_matter=result.meta)
    ev.sheet_functions = False  # the environment starts empty; binding a sheet function sets it
    env: dict[str, Any] = {}
    display: dict[str, Any] = {}
    check_no = 0
    source_lines = result.source.split("\n")
    included_lines: dict[str, list[str]] = {}
    inputs = frozenset(res.inputs)
    broken, precedents = res.broken, res.precedents

    def unit_of(k, v):
        return display.get(k) if k in display else (result.policy.unit_for(v) if isinstance(v, pint.Quantity) else None)

    for stmt in sheet.body:
        if isinstance(stmt, N.Heading):
            result.items.append(TR.Heading(stmt.text, stmt.level))
            continue
        if isinstance(stmt, N.Prose):
            result.items.append(TR.Prose(stmt.text))
            continue
        key = stmt.name if isinstance(stmt, (N.Definition, N.FunctionDef, N.TableDef)) else check_key(stmt)
        if key in broken:
            continue
        upstream_broken = False
        for p in precedents.get(key, ()):
            if p in broken or p not in env:
                upstream_broken = True
                break
        if upstream_broken:  # downstream of a broken statement: skipped, not reported again
            broken.add(key)
            continue
        try:
            record = evaluate_statement(ev, stmt, env, display, overrides=overrides, applied=result.overrides,
                                        inputs=inputs, unit_of=unit_of)
            if isinstance(record, TR.FunctionStep):
                pass  # a sheet function: shown once, not a value
            elif isinstance(record, TR.Step):
                result.values[stmt.name] = record.value
                result.steps[stmt.name] = record
            else:
                check_no += 1
                record.anchor = f"check-{check_no}"
                lines = source_lines
                if stmt.span is not None and stmt.span.path:
                    lines = included_lines.setdefault(stmt.span.path, dict(result.includes).get(
                        stmt.span.path, "").split("\n"))
                record.text = _check_text(stmt, lines)
                result.checks.append(record)
            result.items.append(record)
            if getattr(record, "table", None) is not None:  # a check over a list, a sheet's table: shown once
                result.items.append(record.table)
        except CalcError as exc:
            res.broken.add(key)
            result.diagnostics.append(exc.with_span(stmt.span).diagnostic(result.path))
        if ev.host.warnings:
            result.diagnostics.extend(ev.take_warnings(stmt.span, result.path))
    result.plugin_versions = dict(ev.plugin_versions)


def _check_text(stmt: N.Check, lines: list[str]) -> str:
    """The check as written in the sheet, without 'check' and its description."""
    a, b = stmt.left.span, stmt.right.span
    if a is None or b is None:
        return ""
    if a.line == b.end_line:
        return lines[a.line - 1][a.col - 1:b.end_col - 1]
    chunk = [lines[a.line - 1][a.col - 1:]] + lines[a.line:b.end_line - 1] + [lines[b.end_line - 1][:b.end_col - 1]]
    return " ".join(part.strip() for part in chunk)
