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

from .work import Outcome, Task, build_task, init_worker

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


def run_pool(items: Iterable, jobs: int, *, pdf: bool = False, log: Callable[[str], None] = lambda m: None,
             window: int | None = None) -> Iterator[Outcome]:
    """A process pool whose workers import pint, lark and (for PDFs) WeasyPrint once, before the first row."""
    import multiprocessing as mp
    from concurrent.futures import ProcessPoolExecutor
    from concurrent.futures.process import BrokenProcessPool

    window = window or max(4, 4 * jobs)
    ctx = pool_context()

    def new_pool():
        return ProcessPoolExecutor(max_workers=jobs, mp_context=ctx, initializer=init_worker, initargs=(pdf,))

    pool = new_pool()
    pending: deque = deque()  # [item, future|None, attempts]
    it = iter(items)
    exhausted = False
    try:
        while True:
            while not exhausted and len(pending) < window:
                try:
                    item = next(it)
                except StopIteration:
                    exhausted = True
                    break
                fut = None if isinstance(item, Outcome) else pool.submit(build_task, item)
                pending.append([item, fut, 1])
            if not pending:
                return
            item, fut, attempts = pending[0]
            if fut is None:
                pending.popleft()
                yield item
                continue
            try:
                out = fut.result()
            except BrokenProcessPool:
                # a worker died (killed, out of memory): restart the pool and run the unfinished rows again
                pool.shutdown(wait=False, cancel_futures=True)
                pool = new_pool()
                for entry in pending:
                    if entry[1] is None:
                        continue
                    if entry[1].done() and entry[1].exception() is None:
                        continue
                    entry[2] += 1
                    t = entry[0]
                    if entry[2] > RETRIES + 1:
                        entry[1] = None
                        entry[0] = _died(t, entry[2] - 1)
                    else:
                        log(f"{t.where}: {t.label}: a worker process died; running the row again "
                            f"(attempt {entry[2]})")
                        entry[1] = pool.submit(build_task, t)
                continue
            pending.popleft()
            if attempts > 1:
                out.warnings.append(f"{item.where}: {item.label}: built on attempt {attempts} after a worker "
                                    "process died")
            yield out
    finally:
        pool.shutdown(wait=True, cancel_futures=True)


def _died(task: Task, times: int) -> Outcome:
    return Outcome(task.index, task.member, ok=False, content_hash=task.content_hash,
                   errors=[f"{task.where}: error: {task.label}: the worker running this row died {times} time(s); "
                           "the row was not built"])
