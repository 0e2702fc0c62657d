"""The evaluation-alone benchmark times its sides by one method (equally often, each first in turn) and times the
work a run does after its check, not something else."""
import importlib.util
import os
import sys
from pathlib import Path

BENCH = Path(__file__).parents[2] / "benchmarks"


def _load():
    sys.path.insert(0, str(BENCH))  # the benchmark imports its neighbours as a script does
    environ = dict(os.environ)  # bench_engine raises the sheet caps for its own process: not for the suite's
    try:
        spec = importlib.util.spec_from_file_location("bench_evaluation_under_test", BENCH / "bench_evaluation.py")
        module = importlib.util.module_from_spec(spec)
        spec.loader.exec_module(module)
        return module
    finally:
        sys.path.remove(str(BENCH))
        os.environ.clear()
        os.environ.update(environ)


def test_rotating_times_each_side_equally_often_and_each_goes_first_in_turn():
    bench = _load()
    calls = []
    medians = bench.rotating([lambda: calls.append("a"), lambda: calls.append("b"), lambda: calls.append("c")],
                             repeat=3)
    assert calls[:3] == ["a", "b", "c"]  # one warm run each
    rounds = [calls[3 + 3 * i: 6 + 3 * i] for i in range(3)]
    assert rounds == [["a", "b", "c"], ["b", "c", "a"], ["c", "a", "b"]]
    assert len(medians) == 3 and all(m >= 0 for m in medians)


def test_the_timed_evaluation_is_the_one_a_run_does_after_its_check():
    bench = _load()
    text = bench.make_sheet(50)
    fresh = bench.evaluation_of(text)()
    full = bench.calcsheet.run(text)
    assert fresh.values.keys() == full.values.keys() and len(fresh.values) == 40
    assert all(fresh.values[k] == full.values[k] for k in full.values)
    assert [c.ok for c in fresh.checks] == [c.ok for c in full.checks] and len(full.checks) == 10
    assert len(fresh.items) == len(full.items) and not fresh.diagnostics
