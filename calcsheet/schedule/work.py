"""One unit of work: run the sheet with one row's values and render its package to bytes.

This is what a pool process or a cluster worker runs. It reads the sheet (and
what the sheet may include) and writes nothing: the rendered files come back
as bytes and the caller writes them into its own output folder.
"""
from __future__ import annotations

import hashlib
import json
import math
from dataclasses import dataclass, field
from pathlib import Path

STAMP_VERSION = 1


@dataclass(frozen=True)
class Task:
    """Everything a worker needs for one member; small and picklable."""

    index: int  # 0-based position in the run (keeps outputs in input order)
    sheet: str  # path of the sheet
    source: str  # the sheet text, read once by the caller
    member: str  # output stem
    cells: tuple = ()  # (column, text, where) — the row's values and where each came from
    formats: tuple[str, ...] = ("html", "json")
    paper: str | None = None
    content_hash: str = ""
    label: str = ""  # how messages name the row, e.g. "row 3 (B-3)"
    where: str = ""  # file:row of the row
    subject_suffix: str = ""  # appended to the package's subject (the member's name)
    extra_front: str = ""  # an escaped HTML page put after the summary (auto-sizing's selection page)
    extra_json: tuple = ()  # (key, JSON-able value) pairs added to the package's JSON
    write_to: str = ""  # when set, the worker writes the member's files into this folder and returns none
    stage: bool = False  # with write_to: the worker only stages the files (Outcome.staged); the caller commits


@dataclass
class CheckLine:
    key: str  # "check-N": the check's place in the sheet
    label: str  # its description, else its text
    text: str
    ratio: float | None
    ok: bool


@dataclass
class Outcome:
    index: int
    member: str
    ok: bool  # built without errors
    files: dict[str, bytes] = field(default_factory=dict)
    checks: list[CheckLine] = field(default_factory=list)
    errors: list[str] = field(default_factory=list)  # located messages
    warnings: list[str] = field(default_factory=list)
    values: dict[str, str] = field(default_factory=dict)  # the row's values as used (text)
    skipped: bool = False  # unchanged since the last build: nothing rendered
    content_hash: str = ""
    worker: str = ""  # which worker built it (cluster runs)
    written: int = 0  # files the worker wrote itself (Task.write_to)
    staged: list = field(default_factory=list)  # (staged file, target) pairs for the caller to commit (Task.stage)

    @property
    def all_ok(self) -> bool:
        return self.ok and all(c.ok for c in self.checks)

    def governing(self) -> CheckLine | None:
        """The check with the highest utilisation (the first of equals); an NG check without a ratio governs."""
        best = None
        for c in self.checks:
            r = c.ratio if c.ratio is not None else (math.inf if not c.ok else -math.inf)
            if best is None or r > best[0]:
                best = (r, c)
        return best[1] if best else None


# ------------------------------------------------------------ content hash


def sheet_fingerprint(sheet: str, source: str) -> dict:
    """What of the sheet goes into every member's hash: its text, its includes and the plugins it calls.

    Plugin versions are those of every namespace the sheet calls (a sheet whose
    plugin is upgraded is rebuilt); the engine version covers the renderers.
    """
    from .. import __version__
    from .. import nodes as N
    from ..errors import SheetErrors
    from ..parser import parse_sheet
    from ..plugin import PluginDefinitionError, default_registry

    includes: list[tuple[str, str]] = []
    plugins: dict[str, str] = {}
    try:
        parsed, _ = parse_sheet(source, sheet)
    except SheetErrors:
        parsed = None
    if parsed is not None:
        includes = [(p, hashlib.sha256(t.encode("utf-8")).hexdigest()) for p, t in parsed.includes]
        reg = default_registry()
        for stmt in parsed.body:
            for node in N.walk(stmt) if isinstance(stmt, N.Node) else ():
                if isinstance(node, N.PluginCall) and node.namespace not in plugins:
                    try:
                        ns = reg.namespace(node.namespace)
                    except PluginDefinitionError:
                        ns = None
                    plugins[node.namespace] = ns.version if ns is not None else "missing"
    return {"stamp": STAMP_VERSION, "calcsheet": __version__,
            "sheet": hashlib.sha256(source.encode("utf-8")).hexdigest(),
            "includes": includes, "plugins": dict(sorted(plugins.items()))}


def content_hash(fingerprint: dict, member: str, overrides: dict[str, str], paper: str | None) -> str:
    """sha256 of the sheet fingerprint, the member's name, its values and the paper size."""
    blob = json.dumps({"f": fingerprint, "member": member, "set": sorted(overrides.items()), "paper": paper},
                      sort_keys=True, ensure_ascii=True, separators=(",", ":"))
    return hashlib.sha256(blob.encode("ascii")).hexdigest()


# ------------------------------------------------------------ the worker side

_WORKER_READY = False


def prepare(pdf: bool = False) -> None:
    """What every row needs, made ready in this process: pint and the unit registry, the statement reader
    and (when PDFs are written) WeasyPrint. A pool that forks its workers calls this first, so each worker
    starts with it all in place (shared with this process) instead of building it again."""
    import pint  # noqa: F401

    from .. import engine, units  # the engine imports the parser, the one module that imports lark

    units.registry()
    engine.parse_statement("x = 1 m")  # makes the statement reader ready
    if pdf:
        import weasyprint  # noqa: F401


def init_worker(pdf: bool = False, forked: bool = False) -> None:
    """Pool initializer, before the first row arrives.

    A worker forked from a process that ran ``prepare`` has everything already: it starts at once (the
    plugins the sheet calls were loaded by the calling process when it checked the sheet). A fresh
    interpreter (spawned, or a cluster worker) imports and builds it all here, every plugin included.
    """
    global _WORKER_READY
    if not forked:
        from ..plugin import default_registry

        prepare(pdf)
        reg = default_registry()
        for name in reg.names():
            try:
                reg.namespace(name)
            except Exception:  # reported, located, by the sheet that calls it
                pass
    _WORKER_READY = True


def _strip_set(message: str, name: str, text: str) -> str:
    for prefix in (f"--set {name}={text}: ", f"--set {name}: "):
        if message.startswith(prefix):
            return message[len(prefix):]
    return message


# The sheet run once with its own values, per process: a row re-evaluates only what its values reach
# (incremental.recompute, which falls back to a full run whenever it cannot vouch for the result), and the
# JSON of every value the row leaves unchanged (the very same object as in that run) is written once.
_BASE: dict = {}


class _Base:
    def __init__(self, result):
        from ..plugin import Record

        self.result = result
        objects = list(result.values.values())
        objects += [f for v in result.values.values() if isinstance(v, Record) for f in v.fields.values()]
        objects += [q for c in result.checks for q in (c.demand, c.capacity)]
        self.ids = {id(o) for o in objects}  # the run is kept alive, so these ids stay its objects' own
        self.json: dict = {}  # (id, display unit) -> (object, its JSON entry)


def _base_for(task: Task) -> _Base:
    from ..engine import run

    key = (task.sheet, task.source)
    base = _BASE.get(key)
    if base is None:
        base = _Base(run(task.source, path=task.sheet))
        _BASE.clear()  # one sheet at a time: a long-lived worker does not collect sheets
        _BASE[key] = base
    return base


def run_row(task: Task, overrides: dict[str, str]):
    """The sheet run with one row's values: the same Result a full ``engine.run`` gives, found by
    re-evaluating, from this process's run of the sheet with its own values, only what the row's values reach.
    """
    from ..incremental import recompute

    return recompute(_base_for(task).result, overrides).result


def member_json(result, task: Task) -> dict:
    """``result.to_json()``, reusing the entries of values the row did not change (same bytes, less work)."""
    from ..render.json import JsonPrinter

    base = _BASE.get((task.sheet, task.source))
    if base is None:
        return result.to_json()

    class Reusing(JsonPrinter):
        def value(self, value, unit=None):
            key = (id(value), unit)
            hit = base.json.get(key)
            if hit is not None and hit[0] is value:
                return dict(hit[1])  # the caller adds keys to the entry it gets: give it a copy
            entry = super().value(value, unit)
            if key[0] in base.ids:
                base.json[key] = (value, dict(entry))
            return entry

    return Reusing().result(result)


def build_task(task: Task) -> Outcome:
    """Run one row and render its package; never raises for a problem in the sheet or the row."""
    out = Outcome(task.index, task.member, ok=False, content_hash=task.content_hash)
    overrides = {c: t for c, t, _ in task.cells}
    out.values = dict(overrides)
    try:
        result = run_row(task, overrides)
    except Exception as exc:  # an engine fault must not take the other rows down
        out.errors.append(f"{task.where}: error: {task.label}: internal error while running the sheet: "
                          f"{type(exc).__name__}: {exc}")
        return out
    located = set()
    for d in result.errors:
        if d.code != "override":
            continue
        for column, text, where in task.cells:
            if d.message.startswith(f"--set {column}=") or d.message.startswith(f"--set {column}:"):
                out.errors.append(f"{where}: error: {task.label}, column {column!r}: "
                                  f"{_strip_set(d.message, column, text)}"
                                  + (f" ({d.hint})" if d.hint else ""))
                located.add(id(d))
                break
    rest = [d for d in result.errors if id(d) not in located]
    if rest:
        out.errors.append(f"{task.where}: error: {task.label}: the sheet has {len(rest)} error(s) with this "
                          "row's values:\n" + "\n".join(d.format(result.source_for(d)) for d in rest))
    for d in result.diagnostics:
        if d.severity == "warning" and not d.suppressed:
            out.warnings.append(d.one_line())
    if out.errors:
        return out
    for c in result.checks:
        ratio = c.ratio if c.ratio is not None and math.isfinite(c.ratio) else None
        out.checks.append(CheckLine(c.anchor or "", c.description or c.text, c.text, ratio, bool(c.ok)))
    if task.formats:
        try:
            out.files = render_member(result, task)
        except Exception as exc:
            out.errors.append(f"{task.where}: error: {task.label}: the package could not be rendered: "
                              f"{type(exc).__name__}: {exc}")
            return out
    if task.write_to:
        try:
            if task.stage:  # the caller commits them (fsync, rename), one process for every worker's files
                out.staged = stage_member(Path(task.write_to), task.member, out.files)
            else:  # the schedule syncs its output folder once, when it ends (ScheduleWriter.close)
                out.written = len(write_member(Path(task.write_to), task.member, out.files, sync_folder=False))
        except OSError as exc:
            out.errors.append(f"{task.where}: error: cannot write the package of {task.member}: {exc}")
            return out
        finally:
            out.files = {}  # written here, or not at all: nothing large goes back to the caller
    out.ok = True
    return out


def _member_paths(out_dir: Path, member: str, files: dict[str, bytes]) -> list[Path]:
    paths = []
    for fmt in ("html", "pdf", "json"):
        if files.get(fmt) is None:
            continue
        path = out_dir / f"{member}.{fmt}"
        if path.resolve().parent != out_dir.resolve():  # member names are validated; this is a second lock
            raise OSError(f"refusing to write outside the output folder: {path}")
        paths.append(path)
    return paths


def stage_member(out_dir: Path, member: str, files: dict[str, bytes]) -> list[tuple[str, str]]:
    """Stage a member's rendered files beside their targets (``atomic.stage_file``): (staged, target) pairs,
    for ``commit_member``. On failure nothing stays staged."""
    from ..atomic import discard_staged, stage_file

    staged: list[tuple[str, str]] = []
    try:
        for path in _member_paths(out_dir, member, files):
            staged.append((str(stage_file(path, files[path.suffix[1:]])), str(path)))
    except BaseException:
        discard_staged([tmp for tmp, _ in staged])
        raise
    return staged


def commit_member(staged: list[tuple[str, str]]) -> int:
    """Commit a member's staged files (fsync, rename over the target, each whole); how many. On failure the
    files not yet committed are discarded and the error raised."""
    from ..atomic import commit_staged, discard_staged

    done = 0
    try:
        for tmp, path in staged:
            commit_staged(Path(tmp), Path(path))
            done += 1
    except BaseException:
        discard_staged([tmp for tmp, _ in staged[done:]])
        raise
    return done


def write_member(out_dir: Path, member: str, files: dict[str, bytes], sync_folder: bool = True) -> list[Path]:
    """Write a member's rendered files (each atomically); only names directly in ``out_dir`` are written.
    ``sync_folder=False``: the caller syncs ``out_dir`` once it has written every member there."""
    from ..atomic import write_atomic_files

    written = _member_paths(out_dir, member, files)
    write_atomic_files([(path, files[path.suffix[1:]]) for path in written], sync_folders=sync_folder)
    return written


def render_member(result, task: Task) -> dict[str, bytes]:
    """The member's package as bytes per format, each stamped with the content hash."""
    from ..package import PackageDocument, pdf_bytes
    from ..render.markup import Html

    if task.subject_suffix:
        subject = str(result.meta.get("subject") or Path(task.sheet).stem)
        result.meta = {**result.meta, "subject": f"{subject} — {task.subject_suffix}"}

    class StampedDocument(PackageDocument):
        def footer(self) -> str:
            base = super().footer()
            stamp = Html('<div>Member {} · build sha256 <span class="hash" id="content-hash">{}</span></div>'
                         ).format(task.member, task.content_hash)
            head, sep, tail = str(base).rpartition("</footer>")
            return Html(head) + stamp + Html(sep + tail) if sep else base + stamp  # base: already-escaped markup

    files: dict[str, bytes] = {}
    html = None
    if "html" in task.formats or "pdf" in task.formats:
        html = StampedDocument(result, paper=task.paper, extra_front=markup(task.extra_front)).html()
    if "html" in task.formats:
        files["html"] = html.encode("utf-8")
    if "pdf" in task.formats:
        files["pdf"] = pdf_bytes(html)
    if "json" in task.formats:
        data = member_json(result, task)
        data["build"] = {"member": task.member, "content_hash": task.content_hash}
        for k, v in task.extra_json:
            data[k] = v
        files["json"] = (json.dumps(data, indent=2, ensure_ascii=False) + "\n").encode("utf-8")
    return files


def stamp_of(path: Path) -> str | None:
    """The content hash stamped in a written member package (its JSON, else its HTML), or None."""
    try:
        if path.suffix == ".json":
            data = json.loads(path.read_text(encoding="utf-8"))
            return (data.get("build") or {}).get("content_hash")
        if path.suffix == ".html":
            import re

            m = re.search(r'id="content-hash">([0-9a-f]{64})<', path.read_text(encoding="utf-8"))
            return m.group(1) if m else None
    except (OSError, ValueError, UnicodeDecodeError, AttributeError):
        return None
    return None


def markup(html):
    """A page built from markup templates (already escaped), as the renderer's markup type."""
    from ..render.markup import Html

    return Html(html) if html else None


def caution() -> str:
    """The package's caution sentence, wherever the renderer keeps it."""
    from ..render.page import CAUTION

    return CAUTION
