"""`make bench` ends with one table of every figure: what timing.report records, summary.py prints."""
import importlib.util
import sys
from pathlib import Path

BENCH = Path(__file__).parents[2] / "benchmarks"


def _load(name):
    spec = importlib.util.spec_from_file_location(f"bench_{name}_under_test", BENCH / f"{name}.py")
    module = importlib.util.module_from_spec(spec)
    sys.modules[spec.name] = module
    spec.loader.exec_module(module)
    return module


def test_every_reported_figure_reaches_the_table_with_its_verdict(tmp_path, monkeypatch, capsys):
    timing, summary = _load("timing"), _load("summary")
    path = tmp_path / "figures.jsonl"
    monkeypatch.setenv("CALCSHEET_BENCH_SUMMARY", str(path))
    assert timing.report("ratio at 10⁴ lines", 2.0, 2.5) is True
    assert timing.report("growth exponent", 1.2, 1.05, unit="") is False
    assert timing.report("speed-up", 1.5, 1.8, better="higher") is False
    printed = capsys.readouterr().out
    assert "goal ≤ 2.5×  PASS" in printed and "goal ≥ 1.8×  MISS" in printed
    table = summary.table(summary.rows(str(path)))
    lines = table.splitlines()
    assert [ln.split()[-1] for ln in lines[2:5]] == ["PASS", "MISS", "MISS"]
    assert lines[-1] == "3 figures: 1 PASS, 2 MISS"


def test_paired_times_both_sides_equally_often_alternating_who_goes_first():
    timing = _load("timing")
    calls = []
    a, b = timing.paired(lambda: calls.append("a"), lambda: calls.append("b"), repeat=4)
    assert calls == ["a", "b"] + ["a", "b", "b", "a", "a", "b", "b", "a"]  # one warm run each, then alternating
    assert a >= 0 and b >= 0
