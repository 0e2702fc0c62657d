"""Timing helpers shared by the benchmarks (run them as scripts from the repo root)."""
from __future__ import annotations

import time


def best(fn, repeat: int = 3) -> float:
    """The fastest of ``repeat`` runs, in seconds: the least disturbed by other load."""
    times = []
    for _ in range(repeat):
        t = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t)
    return min(times)
