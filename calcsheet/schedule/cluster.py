"""Rows on a Dask distributed cluster (the optional ``cluster`` extra).

The client sends each row's Task to an existing scheduler; a worker runs it
with ``build_task`` and returns the rendered bytes, which the client writes
into its own output folder, so workers write nothing anywhere. Workers need
calcsheet (with the same plugins) installed; a sheet's includes are read by
the worker from the sheet's path, so a sheet with includes needs that folder
at the same path on the workers.

When a worker dies while running a row, the scheduler runs the row again on
another worker; the client asks the scheduler how often that happened and
reports each such row. A row whose workers keep dying is submitted again by
the client (``RETRIES``) and then reported as not built.
"""
from __future__ import annotations

import uuid
from dataclasses import replace
from collections import deque
from typing import Callable, Iterable, Iterator

from .runner import RETRIES, _died, fill_window
from .table import ScheduleError
from .work import Outcome, build_task, init_worker

CONNECT_TIMEOUT = "20s"
REPORT_EVERY = 8  # chunks between two questions to the scheduler about retried rows
CHUNK = 4  # rows per cluster task

try:  # the extra may be absent; the class is only needed when it is there
    from distributed.diagnostics.plugin import WorkerPlugin as _Base
except ImportError:  # pragma: no cover - exercised only without the extra
    _Base = object


class WorkerSetup(_Base):
    """Import pint, lark and (for PDFs) WeasyPrint once on each worker, before its first row."""

    name = "calcsheet-setup"

    def __init__(self, pdf: bool):
        self.pdf = pdf

    def setup(self, worker=None):
        init_worker(self.pdf)


def _suspicious(dask_scheduler=None, keys=()):
    """Runs on the scheduler: how many times each task's worker died under it."""
    out = {}
    for k in keys:
        ts = dask_scheduler.tasks.get(k)
        if ts is not None and ts.suspicious:
            out[k] = ts.suspicious
    return out


def connect(address: str):
    try:
        from distributed import Client
    except ImportError:
        raise ScheduleError("--cluster", "needs the 'cluster' extra: pip install 'calcsheet[cluster]'") from None
    try:
        return Client(address, timeout=CONNECT_TIMEOUT, set_as_default=False)
    except (OSError, TimeoutError, ValueError) as exc:
        raise ScheduleError("--cluster", f"cannot reach the scheduler at {address}: {exc}") from None


def run_chunk(task_fn, tasks):
    """Runs on a worker: several consecutive rows in one task (fewer round trips through the scheduler)."""
    return [task_fn(t) for t in tasks]


def run_cluster(items: Iterable, address: str | None = None, *, pdf: bool = False,
                log: Callable[[str], None] = lambda m: None, client=None, task_fn=build_task,
                window: int | None = None, chunk: int = CHUNK) -> Iterator[Outcome]:
    """Yield one Outcome per item, in order; rows go in chunks of ``chunk``, at most ``window`` chunks in flight."""
    from distributed import KilledWorker

    own = client is None
    if own:
        client = connect(address)
    try:
        register = getattr(client, "register_plugin", None) or client.register_worker_plugin
        register(WorkerSetup(pdf), name=WorkerSetup.name)
        n_workers = max(1, len(client.scheduler_info().get("workers", {})))
        window = window or max(4, 2 * n_workers)
        run_id = uuid.uuid4().hex[:12]
        pending: deque = deque()  # [Outcome] or [tasks, future, attempts]
        to_ask: list = []  # (future, tasks) finished, not yet asked about
        refused = []
        it = iter(items)

        def submit(tasks, attempt):
            tasks = [replace(t, write_to="") if t.write_to else t for t in tasks]  # workers write nothing
            return client.submit(run_chunk, task_fn, tasks, key=f"calcsheet-{run_id}-{tasks[0].index}-{attempt}",
                                 pure=False)

        def ask(final=False):
            if not to_ask or (len(to_ask) < REPORT_EVERY and not final):
                return
            keys = [f.key for f, _ in to_ask]
            counts = {}
            if not refused:
                try:
                    counts = client.run_on_scheduler(_suspicious, keys=keys)
                except Exception as exc:  # a scheduler that refuses to run our function: say so once
                    refused.append(exc)
                    log(f"--cluster: cannot ask the scheduler which rows were retried ({type(exc).__name__})")
            for fut, tasks in to_ask:
                n = counts.get(fut.key)
                for task in tasks if n else ():
                    log(f"{task.where}: {task.label}: its worker died; the scheduler ran the row again "
                        f"({n} time(s))")
            to_ask.clear()

        while True:
            fill_window(pending, it, window, chunk, lambda batch: submit(batch, 1))
            if not pending:
                break
            head = pending[0]
            if len(head) == 1:
                pending.popleft()
                yield head[0]
                continue
            tasks, fut, attempts = head
            try:
                outs = fut.result()
            except KilledWorker:
                if attempts > RETRIES:
                    pending.popleft()
                    for t in tasks:
                        yield _died(t, attempts)
                    continue
                for t in tasks:
                    log(f"{t.where}: {t.label}: workers died running this row; submitting it again "
                        f"(attempt {attempts + 1})")
                head[1] = submit(tasks, attempts + 1)
                head[2] = attempts + 1
                continue
            pending.popleft()
            to_ask.append((fut, tasks))
            ask()
            yield from outs
        ask(final=True)
    finally:
        if own:
            client.close()
