"""Timing and reporting helpers shared by the benchmarks (run them as scripts from the repo root).

Every figure a benchmark measures goes through :func:`report`, which prints one line with the figure, its
value, its goal and PASS/MISS, and (when ``CALCSHEET_BENCH_SUMMARY`` names a file) appends the same as one
JSON line there, so ``make bench`` can print a one-screen summary table of every figure at the end
(``benchmarks/summary.py``).

Honest ratios: :func:`paired` times two callables the same number of times, alternating which goes first, both
warm (each is run once before timing), and compares like with like (median against median).
"""
from __future__ import annotations

import json
import os
import statistics
import time


def best(fn, repeat: int = 3) -> float:
    """The fastest of ``repeat`` runs, in seconds: the least disturbed by other load."""
    times = []
    for _ in range(repeat):
        t = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t)
    return min(times)


def paired(ours, baseline, repeat: int = 5, warm: bool = True, between=None) -> tuple[float, float]:
    """Median seconds of ``ours`` and of ``baseline``, measured by the same method in the same run.

    Both are warmed once (when ``warm``), then timed ``repeat`` times each, alternating which runs first, so
    a slow patch of the machine hits both sides alike. ``between`` (untimed) runs before every timed call of
    either side: e.g. ``gc.collect``, so neither side pays for the garbage the other left.
    """
    if warm:
        ours()
        baseline()
    a, b = [], []
    for i in range(repeat):
        pair = ((ours, a), (baseline, b)) if i % 2 == 0 else ((baseline, b), (ours, a))
        for fn, times in pair:
            if between is not None:
                between()
            t = time.perf_counter()
            fn()
            times.append(time.perf_counter() - t)
    return statistics.median(a), statistics.median(b)


def report(figure: str, value: float, goal: float, *, better: str = "lower", unit: str = "×",
           note: str = "") -> bool:
    """Print one measured figure with its goal and PASS/MISS; record it for the summary table.

    ``better`` is ``"lower"`` (the value must be ≤ goal) or ``"higher"`` (≥ goal). Returns whether it passed.
    """
    if better not in ("lower", "higher"):
        raise ValueError(f"better must be 'lower' or 'higher', not {better!r}")
    ok = value <= goal if better == "lower" else value >= goal
    sign = "≤" if better == "lower" else "≥"
    verdict = "PASS" if ok else "MISS"
    extra = f"  ({note})" if note else ""
    print(f"  {figure}: {value:.3g}{unit}  goal {sign} {goal:g}{unit}  {verdict}{extra}", flush=True)
    path = os.environ.get("CALCSHEET_BENCH_SUMMARY")
    if path:
        with open(path, "a", encoding="utf-8") as fh:
            fh.write(json.dumps({"figure": figure, "value": value, "goal": goal, "better": better,
                                 "unit": unit, "verdict": verdict, "note": note}) + "\n")
    return ok
