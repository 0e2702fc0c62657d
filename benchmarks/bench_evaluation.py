"""Evaluation and tracing alone against a plain pint script doing the same arithmetic.

``bench_engine`` times a whole run (parse, resolve, check, evaluate, trace) against the plain pint script;
this takes the evaluation and the trace out of it: the median of a full run minus the median of the same
run without evaluation (``run(text, evaluate=False)``: parse, resolve, check), against the median of the
plain pint script (``bench_engine.plain_pint``: the same literals, operations and conversions). Goal ≤ 1.5×:
evaluating a sheet with its rules, finiteness checks and trace records costs at most half again what pint
costs for the bare arithmetic.

The three are timed the same number of times each, all warm, in rotating order (each goes first, second
and third alike), so a slow patch of the machine hits all three alike.

Ratios are what hold from machine to machine, not seconds.
Run: .venv/bin/python benchmarks/bench_evaluation.py [--quick]
"""
from __future__ import annotations

import statistics
import sys
import time

import calcsheet
from bench_engine import make_sheet, plain_pint
from timing import report


def rotating(fns, repeat: int) -> list[float]:
    """Median seconds of each callable, timed ``repeat`` times each in rotating order, after one warm run."""
    for fn in fns:
        fn()
    times: list[list[float]] = [[] for _ in fns]
    order = list(range(len(fns)))
    for i in range(repeat):
        for k in order[i % len(fns):] + order[:i % len(fns)]:
            t = time.perf_counter()
            fns[k]()
            times[k].append(time.perf_counter() - t)
    return [statistics.median(t) for t in times]


def evaluation_alone(n: int, repeat: int) -> None:
    text = make_sheet(n)
    result = calcsheet.run(text)
    assert result.ok and len(result.checks) == n // 5, result.format_diagnostics()[:400]
    full, front, base = rotating([lambda: calcsheet.run(text), lambda: calcsheet.run(text, evaluate=False),
                                  lambda: plain_pint(n)], repeat)
    ours = full - front
    report(f"evaluation + trace alone ÷ plain pint script, {n:,} lines", ours / base, 1.5,
           note=f"{ours:.2f} s of a {full:.2f} s run vs {base:.2f} s, {ours / n * 1e6:.0f} vs "
                f"{base / n * 1e6:.0f} µs/line")


def main(argv: list[str]) -> int:
    quick = "--quick" in argv
    calcsheet.run("x = 1 m\ncheck x <= 2 m\n")  # warm the registry and the grammar in this process
    print("evaluate + trace (a run minus the same run without evaluation) vs plain pint, same values, same run")
    evaluation_alone(10_000, repeat=3 if quick else 5)
    evaluation_alone(30_000, repeat=3)
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
