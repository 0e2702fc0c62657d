"""Benchmark: formatting diagnostics is linear in the sheet, and a hostile sheet is refused quickly.

Case A: a sheet of n short bad lines (`x =`), all its diagnostics formatted with their source lines,
for n and 4n (PROBLEMS cap raised so every line is reported). Linear: the 4n run costs about 4x
(goal: ratio ≤ 6); the old code re-split the source per diagnostic (ratio ~16, 615 s at 100,000 lines).
Case B: `check` of 900,000 lines of `#` against `check` of the 20-line demo joist, same run
(goal: the hostile sheet stops at the PROBLEMS cap, ≤ 50x the small sheet). Both sides of each ratio
are timed by ``timing.paired`` (same repetitions, both warm, alternating order).

Run: .venv/bin/python benchmarks/bench_diagnostics.py
"""
from __future__ import annotations

import contextlib
import io
import os
import sys
import tempfile
from pathlib import Path

sys.path.insert(0, str(Path(__file__).parent))
from timing import paired, report  # noqa: E402

import calcsheet  # noqa: E402
from calcsheet.cli import main  # noqa: E402


def diagnosed(n: int):
    os.environ["CALCSHEET_LIMIT_PROBLEMS"] = str(n + 10)
    try:
        r = calcsheet.run("x =\n" * n, evaluate=False)
    finally:
        os.environ.pop("CALCSHEET_LIMIT_PROBLEMS")
    assert len(r.errors) == n
    return r


def quiet_check(path):
    def go():
        with contextlib.redirect_stdout(io.StringIO()), contextlib.redirect_stderr(io.StringIO()):
            main(["check", str(path)])
    return go


if __name__ == "__main__":
    n = 20_000
    small, large = diagnosed(n), diagnosed(4 * n)
    a, b = paired(small.format_diagnostics, large.format_diagnostics, repeat=3)
    report(f"formatting {4 * n:,} diagnostics ÷ {n:,} (linear: 4)", b / a, 6,
           note=f"{a:.3f} s vs {b:.3f} s")
    with tempfile.TemporaryDirectory() as d:
        hostile = Path(d) / "h.calc"
        hostile.write_text("#\n" * 900_000)
        demo = Path(__file__).parents[1] / "tests" / "diff" / "joist.calc"
        h, j = paired(quiet_check(hostile), quiet_check(demo), repeat=5)  # the demo side is ms-scale: more repeats
        report("check of 900,000 '#' lines (stops at the cap) ÷ check of the demo joist", h / j, 50,
               note=f"{h:.2f} s vs {j:.2f} s")
