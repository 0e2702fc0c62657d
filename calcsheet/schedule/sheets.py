"""``build A.calc B.calc … -j N``: several sheets on a process pool, reported exactly as a serial build.

Each worker runs one sheet and writes its package with ``package.write_package``
(the same function a serial build uses, so the files are the same bytes); the
messages come back to the calling process and are printed in the order the
sheets were given.
"""
from __future__ import annotations

import sys
from collections import deque
from dataclasses import dataclass, field
from pathlib import Path


@dataclass
class SheetOutcome:
    stderr: list[str] = field(default_factory=list)
    stdout: list[str] = field(default_factory=list)
    status: int = 0  # 0 built, 1 errors
    n_ng: int = 0


def build_one(sheet: str, overrides: dict, out: str, formats: list[str], paper: str | None) -> SheetOutcome:
    from ..engine import run
    from ..package import write_package

    o = SheetOutcome()
    try:
        result = run(Path(sheet), overrides=overrides)
    except (OSError, UnicodeDecodeError) as exc:
        o.stderr.append(f"calcsheet: error: cannot read {sheet}: {exc}")
        o.status = 1
        return o
    if result.diagnostics:
        o.stderr.append(result.format_diagnostics())
    if not result.ok:
        o.stderr.append(f"{sheet}: not built ({len(result.errors)} error(s)); previous package left as it was")
        o.status = 1
        return o
    for name, (old, new) in result.overrides.items():
        o.stderr.append(f"{sheet}: {name} set to {_shown(new)} (sheet: {_shown(old)})")
    try:
        written = write_package(result, Path(out), formats, paper=paper)
    except OSError as exc:
        o.stderr.append(f"calcsheet: error: cannot write the package: {exc}")
        o.status = 1
        return o
    o.n_ng = sum(1 for c in result.checks if not c.ok)
    verdict = f"{len(result.checks)} checks, {o.n_ng} NG" if result.checks else "no checks"
    o.stdout.append(f"{sheet}: {verdict} -> " + ", ".join(str(p) for p in written))
    return o


def build_sheets(args, formats: list[str], overrides: dict, jobs: int) -> int:
    """Several sheets on ``jobs`` worker processes; messages and exit status as a serial build gives them."""
    from concurrent.futures import ProcessPoolExecutor

    from .runner import pool_context
    from .work import init_worker, prepare

    sheets = [str(s) for s in args.sheets]
    if jobs <= 1:
        return _report(sheets, (build_one(s, overrides, str(args.out), formats, args.paper) for s in sheets), args)
    ctx = pool_context()
    forked = ctx.get_start_method() == "fork"
    if forked:
        prepare("pdf" in formats)  # the workers inherit it (each loads the plugins its sheets call)
    with ProcessPoolExecutor(max_workers=min(jobs, len(sheets)), mp_context=ctx,
                             initializer=init_worker, initargs=("pdf" in formats, forked)) as pool:
        futures = deque(pool.submit(build_one, s, overrides, str(args.out), formats, args.paper) for s in sheets)
        return _report(sheets, (futures.popleft().result() for _ in sheets), args)


def _report(sheets, outcomes, args) -> int:
    status = 0
    for i, (sheet, o) in enumerate(zip(sheets, outcomes), 1):
        print(f"[{i}/{len(sheets)}] {sheet}", file=sys.stderr)
        for m in o.stderr:
            print(m, file=sys.stderr)
        for m in o.stdout:
            print(m)
        if o.status:
            status = 1
        elif o.n_ng and args.fail_on_ng and status == 0:
            status = 3
    return status


def _shown(value) -> str:
    """A value as the build command prints an override."""
    import pint

    from ..diff import show_quantity

    return show_quantity(value) if isinstance(value, pint.Quantity) else str(value)
