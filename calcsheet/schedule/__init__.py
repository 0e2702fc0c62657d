"""Many members from one sheet: schedules, sweeps, every core and a cluster.

``calcsheet build SHEET --schedule members.csv`` runs the sheet once per row
of the table (its columns are the sheet's inputs, a ``member`` column names
each row), writes one package per member and a schedule package listing every
member's utilisations. Rows run serially (``-j 1``), on a process pool
(``-j N``) or on a Dask cluster (``--cluster``); the outputs are the same
byte for byte whichever ran them. A member whose content hash (sheet,
includes, values, plugin versions) is unchanged is not rebuilt.
"""
from __future__ import annotations

import sys
from dataclasses import dataclass, field
from pathlib import Path
from typing import Callable, Iterable, Iterator

from .table import Row, ScheduleError, open_schedule
from .work import Outcome, Task, content_hash, sheet_fingerprint, stamp_of

__all__ = ["ScheduleError", "build_schedule", "SheetInfo", "load_sheet"]


@dataclass
class SheetInfo:
    path: str
    source: str
    inputs: list[str]
    defined: list[str]
    meta: dict
    fingerprint: dict
    errors: str = ""  # formatted errors: the sheet itself does not build
    text_inputs: list[str] = field(default_factory=list)  # inputs written as text ("W18X50")


def load_sheet(path: Path) -> SheetInfo:
    """Read, parse and check the sheet once in the calling process (its inputs, its fingerprint)."""
    from .. import nodes as N
    from ..engine import run

    result = run(Path(path), path=str(path), evaluate=False)  # read bounded and strictly; errors located
    source = result.source
    errors = result.format_diagnostics() if result.errors else ""
    res = result.resolution
    texts = [n for n in result.inputs if res is not None and isinstance(getattr(res.statements.get(n), "expr", None),
                                                                        N.Text)]
    return SheetInfo(str(path), source, list(result.inputs), list(res.defined_at) if res else [], dict(result.meta),
                     sheet_fingerprint(str(path), source), errors, texts)


@dataclass
class Summary:
    members: int = 0
    ok: int = 0
    ng: int = 0
    errors: int = 0
    built: int = 0
    unchanged: int = 0
    files: int = 0  # member files written (counted, not kept: a long schedule stays in flat memory)
    schedule_files: list[Path] = field(default_factory=list)


class Progress:
    """A progress bar on a terminal (tqdm), silent otherwise; messages go above the bar."""

    def __init__(self, total: int | None, desc: str, enabled: bool | None = None):
        enabled = sys.stderr.isatty() if enabled is None else enabled
        self.bar = None
        if enabled:
            from tqdm import tqdm

            tqdm.monitor_interval = 0  # no monitor thread: the pool may then fork safely
            self.bar = tqdm(total=total, desc=desc, unit="member", file=sys.stderr, leave=False, dynamic_ncols=True)

    def log(self, message: str) -> None:
        if self.bar is not None:
            self.bar.write(message, file=sys.stderr)
        else:
            print(message, file=sys.stderr)

    def step(self) -> None:
        if self.bar is not None:
            self.bar.update(1)

    def close(self) -> None:
        if self.bar is not None:
            self.bar.close()


def executor(jobs: int, cluster: str | None, pdf: bool, log: Callable[[str], None]):
    """The runner for this build: a function items -> outcomes in order."""
    from . import runner

    if cluster:
        from .cluster import run_cluster

        return lambda items: run_cluster(items, cluster, pdf=pdf, log=log)
    if jobs <= 1:
        return lambda items: runner.run_serial(items, pdf=pdf, log=log)
    return lambda items: runner.run_pool(items, jobs, pdf=pdf, log=log)


def _tasks(sheet: SheetInfo, rows: Iterable[Row], out_dir: Path, formats: list[str], paper: str | None,
           base: dict[str, str], force: bool, previous: dict, labels: dict) -> Iterator[tuple[Row, object]]:
    """Each row as a Task to build, or an Outcome already known (a bad row, an unchanged member)."""
    from .output import checks_from_record

    for index, row in enumerate(rows):
        label = f"row {row.number} ({row.member})"
        if row.errors:
            yield row, Outcome(index, row.member, ok=False, errors=list(row.errors))
            continue
        cells = [(k, v, "--set") for k, v in base.items() if k not in row.overrides]
        cells += [(c.column, c.text, c.where) for c in row.cells]
        overrides = {k: v for k, v, _ in cells}
        h = content_hash(sheet.fingerprint, row.member, overrides, paper)
        prev = previous.get(row.member)
        if not force and prev and prev.get("content_hash") == h and prev.get("status") in ("OK", "NG") \
                and _unchanged_files(out_dir, row.member, formats, h):
            out = Outcome(index, row.member, ok=True, checks=checks_from_record(prev, labels), skipped=True,
                          values=overrides, content_hash=h)
            yield row, out
            continue
        yield row, Task(index=index, sheet=sheet.path, source=sheet.source, member=row.member, cells=tuple(cells),
                        formats=tuple(formats), paper=paper, content_hash=h, label=label, where=row.where,
                        subject_suffix=f"member {row.member}", write_to=str(out_dir), stage=True)


def _unchanged_files(out_dir: Path, member: str, formats: list[str], h: str) -> bool:
    """Every requested file is there, and the ones that carry a stamp carry this hash."""
    for fmt in formats:
        p = out_dir / f"{member}.{fmt}"
        if not p.is_file():
            return False
        if fmt in ("json", "html") and stamp_of(p) != h:
            return False
    return True


def build_schedule(sheet_path: Path, table: Path, out_dir: Path, formats: list[str], *, jobs: int = 1,
                   cluster: str | None = None, force: bool = False, paper: str | None = None,
                   overrides: dict[str, str] | None = None, progress: bool | None = None,
                   out=print, runner: Callable | None = None) -> tuple[int, Summary]:
    """Build every member of ``table``; returns (exit status, summary). Exit 1 if any row failed.

    ``runner(log)`` may supply the function that turns items into outcomes (embedding, tests).
    """
    from ..atomic import STALE_SECONDS, sweep_staged
    from .output import ScheduleWriter, load_previous, write_member
    from .work import commit_member

    sheet = load_sheet(sheet_path)
    if sheet.errors:
        print(sheet.errors, file=sys.stderr)
        print(f"{sheet_path}: the sheet has errors; no member built", file=sys.stderr)
        return 1, Summary()
    schedule = open_schedule(table, sheet.inputs, sheet.defined)  # ScheduleError: caller reports, exit 1
    base = dict(overrides or {})
    for name in base:
        if name not in sheet.inputs:
            raise ScheduleError("--set", f"{name!r} is not an input of the sheet")
    out_dir.mkdir(parents=True, exist_ok=True)
    sweep_staged(out_dir, older_than=STALE_SECONDS)  # left by a build that was killed
    previous, labels = ({}, {}) if force else load_previous(out_dir)
    total = None
    bar_on = sys.stderr.isatty() if progress is None else progress
    if bar_on:
        total = sum(1 for _ in schedule.rows())
    bar = Progress(total, Path(table).name, enabled=bar_on)
    info = {"sheet": sheet.path, "table": str(table), "sheet_sha256": sheet.fingerprint["sheet"],
            "table_sha256": schedule.sha256, "plugins": sheet.fingerprint["plugins"], "meta": sheet.meta,
            "paper": paper, "columns": schedule.columns}
    writer = ScheduleWriter(out_dir, formats, info)
    summary = Summary()
    rows_by_index: dict[int, Row] = {}

    def items():
        for row, item in _tasks(sheet, schedule.rows(), out_dir, formats, paper, base, force, previous, labels):
            rows_by_index[item.index] = row
            yield item

    run = runner(bar.log) if runner else executor(jobs, cluster, "pdf" in formats, bar.log)
    outcomes = run(items())
    try:
        for outcome in outcomes:
            row = rows_by_index.pop(outcome.index)
            for w in outcome.warnings:
                if "built on attempt" in w or "worker died" in w:
                    bar.log(w)
            if outcome.staged:  # staged by the worker (serial runs and the pool): fsynced and renamed here
                try:
                    summary.files += commit_member(outcome.staged)
                except OSError as exc:
                    outcome.ok = False
                    outcome.errors.append(f"{row.where}: error: cannot write the package of {row.member}: {exc}")
                outcome.staged = []
            for e in outcome.errors:
                bar.log(e)
            summary.files += outcome.written  # written by the worker itself
            if outcome.ok and not outcome.skipped and outcome.files:  # returned as bytes (a cluster's workers)
                try:
                    summary.files += len(write_member(out_dir, outcome, sync_folder=False))  # synced at the end
                except OSError as exc:
                    outcome.ok = False
                    outcome.errors.append(f"{row.where}: error: cannot write the package of {row.member}: {exc}")
                    bar.log(outcome.errors[-1])
            outcome.files = {}
            rec = writer.add(outcome, row.number, row.where)
            summary.members += 1
            if rec["status"] == "ERROR":
                summary.errors += 1
            else:
                summary.ok += rec["status"] == "OK"
                summary.ng += rec["status"] == "NG"
                if outcome.skipped:
                    summary.unchanged += 1
                else:
                    summary.built += 1
            bar.step()
    except BaseException:
        close = getattr(outcomes, "close", None)
        if close is not None:
            close()  # the runner stops its workers; then nothing is left half-way
        sweep_staged(out_dir)
        raise
    finally:
        bar.close()
    summary.schedule_files = writer.close()
    out(f"{table}: {summary.members} members: {summary.ok} OK, {summary.ng} NG, {summary.errors} not built; "
        f"{summary.built} built, {summary.unchanged} unchanged -> {out_dir / 'schedule.html' if 'html' in formats else out_dir / 'schedule.json'}")
    return (1 if summary.errors else 0), summary


def cli_build(args, formats: list[str], overrides: dict[str, str]) -> int:
    """The ``build`` command with --schedule / --sweep / -j / --cluster / --force."""
    from .runner import default_jobs

    jobs = args.jobs if args.jobs is not None else default_jobs()
    if jobs < 1:
        print("calcsheet: error: -j needs a whole number of at least 1", file=sys.stderr)
        return 2
    if args.size or args.family:
        if not (args.size and args.family) or args.schedule or args.sweep or len(args.sheets) != 1:
            print("calcsheet: error: --size NAME needs --from FAMILY and one sheet (no --schedule/--sweep)",
                  file=sys.stderr)
            return 2
        from .sizing import build_sizing

        try:
            return build_sizing(args.sheets[0], args.size, args.family, args.out, formats, jobs=jobs,
                                cluster=args.cluster, paper=args.paper, overrides=overrides)
        except ScheduleError as exc:
            print(str(exc), file=sys.stderr)
            return 1
    if not (args.schedule or args.sweep):
        from .sheets import build_sheets

        return build_sheets(args, formats, overrides, jobs)
    if len(args.sheets) != 1:
        print("calcsheet: error: --schedule and --sweep take one sheet", file=sys.stderr)
        return 2
    if args.schedule and args.sweep:
        print("calcsheet: error: choose --schedule or --sweep, not both", file=sys.stderr)
        return 2
    sheet = args.sheets[0]
    try:
        if args.sweep:
            from .sweep import build_sweep

            return build_sweep(sheet, args.sweep, args.out, formats, jobs=jobs, cluster=args.cluster,
                               paper=args.paper, overrides=overrides)
        if not args.schedule.is_file():
            print(f"calcsheet: error: no such schedule: {args.schedule}", file=sys.stderr)
            return 2
        status, summary = build_schedule(sheet, args.schedule, args.out, formats, jobs=jobs, cluster=args.cluster,
                                         force=args.force, paper=args.paper, overrides=overrides)
    except ScheduleError as exc:
        print(str(exc), file=sys.stderr)
        return 1
    except OSError as exc:
        print(f"calcsheet: error: {exc}", file=sys.stderr)
        return 1
    if status == 0 and args.fail_on_ng and summary.ng:
        return 3
    return status
