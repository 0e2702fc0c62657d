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
from collections import deque
from typing import Callable, Iterable, Iterator

from .runner import RETRIES, _died
from .table import ScheduleError
from .work import Outcome, build_task, init_worker

CONNECT_TIMEOUT = "20s"
REPORT_EVERY = 32  # rows between two questions to the scheduler about retried rows

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


def run_cluster(items: Iterable, address: str | None = None, *, pdf: bool = False,
                log: Callable[[str], None] = lambda m: None, client=None, task_fn=build_task,
                window: int | None = None) -> Iterator[Outcome]:
    """Yield one Outcome per item, in order; at most ``window`` rows are in flight."""
    from distributed import KilledWorker

    own = client is None
    if own:
        client = connect(address)
    try:
        register = getattr(client, "register_plugin", None) or client.register_worker_plugin
        register(WorkerSetup(pdf), name=WorkerSetup.name)
        n_workers = max(1, len(client.scheduler_info().get("workers", {})))
        window = window or max(8, 4 * n_workers)
        run_id = uuid.uuid4().hex[:12]
        pending: deque = deque()  # [item, future|None, attempts]
        to_ask: list = []  # (future, task) finished, not yet asked about
        it = iter(items)
        exhausted = False

        def submit(task, attempt):
            return client.submit(task_fn, task, key=f"calcsheet-{run_id}-{task.index}-{attempt}", pure=False)

        def ask(final=False):
            if not to_ask or (len(to_ask) < REPORT_EVERY and not final):
                return
            keys = [f.key for f, _ in to_ask]
            try:
                counts = client.run_on_scheduler(_suspicious, keys=keys)
            except Exception as exc:  # a scheduler that refuses to run our function: say so once
                log(f"--cluster: cannot ask the scheduler which rows were retried ({type(exc).__name__})")
                counts = {}
            for fut, task in to_ask:
                n = counts.get(fut.key)
                if n:
                    log(f"{task.where}: {task.label}: its worker died; the scheduler ran the row again "
                        f"({n} time(s))")
            to_ask.clear()

        while True:
            while not exhausted and len(pending) < window:
                try:
                    item = next(it)
                except StopIteration:
                    exhausted = True
                    break
                pending.append([item, None if isinstance(item, Outcome) else submit(item, 1), 1])
            if not pending:
                break
            item, fut, attempts = pending[0]
            if fut is None:
                pending.popleft()
                yield item
                continue
            try:
                out = fut.result()
            except KilledWorker:
                if attempts > RETRIES:
                    pending.popleft()
                    yield _died(item, attempts)
                    continue
                log(f"{item.where}: {item.label}: workers died running this row; submitting it again "
                    f"(attempt {attempts + 1})")
                pending[0][1] = submit(item, attempts + 1)
                pending[0][2] = attempts + 1
                continue
            pending.popleft()
            to_ask.append((fut, item))
            ask()
            yield out
        ask(final=True)
    finally:
        if own:
            client.close()
