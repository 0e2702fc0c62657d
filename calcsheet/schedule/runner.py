"""Running tasks serially, on a process pool, or on a Dask cluster, with results in input order.

Each runner takes an iterable of items (a ``Task`` to build, or an ``Outcome``
already known: a row that failed to read or an unchanged member) and yields
one ``Outcome`` per item in the same order. Only a bounded window of tasks is
in flight, so a schedule of any length runs in constant memory.
"""
from __future__ import annotations

import os
import sys
from collections import deque
from typing import Callable, Iterable, Iterator

from .work import Outcome, Task, build_task, init_worker, prepare

CHUNK = 2  # rows per round trip to a pool worker (small: the last round trips leave a worker idle)
RETRIES = 2  # a row whose worker process died is run again this many times before it is reported as failed


def default_jobs() -> int:
    try:
        return max(1, len(os.sched_getaffinity(0)))
    except (AttributeError, OSError):
        return max(1, os.cpu_count() or 1)


def pool_context():
    """Fork when it is safe (Linux, and this process runs no other thread): workers start at once with the
    modules already imported. Otherwise spawn fresh interpreters (they import pint, lark and WeasyPrint once,
    in the initializer); forking a process that holds threads can deadlock on a lock held at the fork."""
    import multiprocessing as mp
    import threading

    if sys.platform.startswith("linux") and threading.active_count() == 1 and \
            "fork" in mp.get_all_start_methods():
        return mp.get_context("fork")
    return mp.get_context("spawn")


def run_serial(items: Iterable, *, pdf: bool = False, log: Callable[[str], None] = lambda m: None
               ) -> Iterator[Outcome]:
    for item in items:
        yield item if isinstance(item, Outcome) else build_task(item)


def run_chunk(tasks: list) -> list[Outcome]:
    """Runs in a pool worker: several consecutive rows for one round trip (``build_task`` looked up here, at
    call time)."""
    return [build_task(t) for t in tasks]


def run_pool(items: Iterable, jobs: int, *, pdf: bool = False, log: Callable[[str], None] = lambda m: None,
             window: int | None = None, chunk: int = CHUNK) -> Iterator[Outcome]:
    """A process pool whose workers import pint, lark and (for PDFs) WeasyPrint once, before the first row.

    Consecutive rows go to a worker ``chunk`` at a time (one round trip, one result message for several rows);
    at most ``window`` chunks are in flight. When a worker dies, the pool is restarted and each unfinished row
    is run again on its own (so a row that kills its worker takes no other row with it), up to ``RETRIES``
    times.
    """
    from concurrent.futures import ProcessPoolExecutor
    from concurrent.futures.process import BrokenProcessPool

    window = window or 2 * jobs + 2
    chunk = max(1, chunk)
    ctx = pool_context()
    forked = ctx.get_start_method() == "fork"
    if forked:
        prepare(pdf)  # once, here: the workers inherit it and start at once

    def new_pool():
        return ProcessPoolExecutor(max_workers=jobs, mp_context=ctx, initializer=init_worker,
                                   initargs=(pdf, forked))

    pool = new_pool()
    pending: deque = deque()  # [Outcome] (known already) or [tasks, future, attempts]
    it = iter(items)

    try:
        while True:
            fill_window(pending, it, window, chunk, lambda batch: pool.submit(run_chunk, batch))
            if not pending:
                return
            head = pending[0]
            if len(head) == 1:
                pending.popleft()
                yield head[0]
                continue
            tasks, fut, attempts = head
            try:
                outs = fut.result()
            except BrokenProcessPool:
                # a worker died (killed, out of memory): restart the pool and run the unfinished rows again
                pool.shutdown(wait=False, cancel_futures=True)
                pool = new_pool()
                entries = list(pending)
                pending.clear()
                for entry in entries:
                    if len(entry) == 1 or (entry[1].done() and not entry[1].cancelled()
                                           and entry[1].exception() is None):
                        pending.append(entry)
                        continue
                    for t in entry[0]:
                        n = entry[2] + 1
                        if n > RETRIES + 1:
                            pending.append([_died(t, n - 1)])
                        else:
                            log(f"{t.where}: {t.label}: a worker process died; running the row again "
                                f"(attempt {n})")
                            pending.append([[t], pool.submit(run_chunk, [t]), n])
                continue
            pending.popleft()
            for t, out in zip(tasks, outs):
                if attempts > 1:
                    out.warnings.append(f"{t.where}: {t.label}: built on attempt {attempts} after a worker "
                                        "process died")
                yield out
    finally:
        pool.shutdown(wait=True, cancel_futures=True)


def _died(task: Task, times: int) -> Outcome:
    return Outcome(task.index, task.member, ok=False, content_hash=task.content_hash,
                   errors=[f"{task.where}: error: {task.label}: the worker running this row died {times} time(s); "
                           "the row was not built"])


def fill_window(pending: deque, rows: Iterator, window: int, chunk: int, submit: Callable) -> None:
    """Top ``pending`` up to ``window`` entries from ``rows``, in order: rows go ``chunk`` at a time as
    ``[batch, submit(batch), 1]`` (batch, future, attempt), an outcome already known as ``[outcome]``.
    The process pool and the Dask cluster feed their windows alike through this."""
    batch: list = []
    while len(pending) < window:
        item = next(rows, _END)
        if item is _END:
            break
        if isinstance(item, Outcome):
            if batch:
                pending.append([batch, submit(batch), 1])
                batch = []
            pending.append([item])
            continue
        batch.append(item)
        if len(batch) >= chunk:
            pending.append([batch, submit(batch), 1])
            batch = []
    if batch:
        pending.append([batch, submit(batch), 1])


_END = object()  # the end of the rows (next's default)
