"""Benchmark: formatting diagnostics is linear in the sheet, and a hostile sheet is refused quickly.

Case A: a sheet of n short bad lines (`x =`), all its diagnostics formatted with their source lines,
for n and 4n (PROBLEMS cap raised so every line is reported). Linear: the 4n run costs about 4x
(goal: ratio < 6); the old code re-split the source per diagnostic (ratio ~16, 615 s at 100,000 lines).
Case B: `check` of 900,000 lines of `#` against `check` of the 20-line demo joist, same run
(goal: the hostile sheet stops at the PROBLEMS cap; ratio reported).

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
from timing import best  # noqa: E402

import calcsheet  # noqa: E402
from calcsheet.cli import main  # noqa: E402


def formatting(n: int) -> float:
    os.environ["CALCSHEET_LIMIT_PROBLEMS"] = str(n + 10)
    r = calcsheet.run("x =\n" * n, evaluate=False)
    assert len(r.errors) == n
    return best(r.format_diagnostics, repeat=3)


def quiet_check(path) -> float:
    def go():
        with contextlib.redirect_stdout(io.StringIO()), contextlib.redirect_stderr(io.StringIO()):
            main(["check", str(path)])
    return best(go, repeat=2)


if __name__ == "__main__":
    n = 20_000
    a, b = formatting(n), formatting(4 * n)
    ratio = b / a
    print(f"A: format {n:,} diagnostics {a:.3f} s, {4 * n:,}: {b:.3f} s, ratio {ratio:.1f} (goal < 6): "
          + ("PASS" if ratio < 6 else "MISS"))
    os.environ.pop("CALCSHEET_LIMIT_PROBLEMS")
    with tempfile.TemporaryDirectory() as d:
        hostile = Path(d) / "h.calc"
        hostile.write_text("#\n" * 900_000)
        demo = Path(__file__).parents[1] / "tests" / "diff" / "joist.calc"
        h, j = quiet_check(hostile), quiet_check(demo)
        print(f"B: check 900,000 '#' lines {h:.2f} s, demo joist {j:.2f} s, ratio {h / j:.0f} "
              f"(goal: stops at the cap, < 50x a small sheet): " + ("PASS" if h / j < 50 else "MISS"))
