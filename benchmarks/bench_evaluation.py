"""Evaluation and tracing alone against a plain pint script doing the same arithmetic.

``bench_engine`` times a whole run (parse, resolve, check, evaluate, trace) against the plain pint script;
this times the evaluation and the trace alone: the sheet is parsed, resolved and checked once, untimed
(``run(text, evaluate=False)``), then the engine's evaluation step (``engine._evaluate``, what a run does
after its check, under the same ``collector.run_pause``) is timed on that checked sheet into a fresh
result, against the plain pint script (``bench_engine.plain_pint``: the same literals, operations and
conversions). It is timed directly, not as a run minus a check: the difference of two noisy medians once
came out negative on a busy machine. Goal ≤ 1.5×:
evaluating a sheet with its rules, finiteness checks and trace records costs at most half again what pint
costs for the bare arithmetic.

The two are timed the same number of times each, all warm, in rotating order (each goes first and second
alike), so a slow patch of the machine hits both alike.

Ratios are what hold from machine to machine, not seconds.
Run: .venv/bin/python benchmarks/bench_evaluation.py [--quick]
"""
from __future__ import annotations

import statistics
import sys
import time

import calcsheet
from calcsheet import collector, engine
from calcsheet.plugin import default_registry
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


def evaluation_of(text: str):
    """A callable doing what a run of ``text`` does after its check: the engine's evaluation and trace of the
    sheet, checked here once (untimed), into a fresh result each call (which it returns)."""
    checked = calcsheet.run(text, evaluate=False)
    assert checked.ok, checked.format_diagnostics()[:400]
    plugins = default_registry()

    def evaluate_only():
        fresh = engine.Result(path=checked.path, source=checked.source, meta=checked.meta, policy=checked.policy,
                              sheet=checked.sheet, resolution=checked.resolution)
        with collector.run_pause():
            engine._evaluate(checked.sheet, checked.resolution, fresh, plugins, {})
        return fresh
    return evaluate_only


def evaluation_alone(n: int, repeat: int) -> None:
    text = make_sheet(n)
    result = calcsheet.run(text)
    assert result.ok and len(result.checks) == n // 5, result.format_diagnostics()[:400]
    evaluate_only = evaluation_of(text)
    ours, base = rotating([evaluate_only, lambda: plain_pint(n)], repeat)
    report(f"evaluation + trace alone ÷ plain pint script, {n:,} lines", ours / base, 1.5,
           note=f"{ours:.2f} s vs {base:.2f} s, {ours / n * 1e6:.0f} vs {base / n * 1e6:.0f} µs/line")


def main(argv: list[str]) -> int:
    quick = "--quick" in argv
    calcsheet.run("x = 1 m\ncheck x <= 2 m\n")  # warm the registry and the grammar in this process
    print("evaluate + trace (the engine's evaluation of a checked sheet) vs plain pint, same values, same run")
    evaluation_alone(10_000, repeat=3 if quick else 5)
    evaluation_alone(30_000, repeat=3)
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
