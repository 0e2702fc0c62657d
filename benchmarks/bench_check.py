"""Static check against full evaluation of the same sheets, and the cold start of `calcsheet check`.

1. A generated 10,000-line sheet (inputs, loads, moments, stresses, a section call every
   fifty lines, checks) and each demo sheet in sheets/: `run(..., evaluate=False)` (what
   `calcsheet check` does) against `run(...)` (parse, check and evaluate with tracing), in
   the same run. Goal: the check costs at most a third of the evaluation.
2. Cold start: `calcsheet check` of a small sheet in a fresh process against
   `python -c "import pint; pint.UnitRegistry()"`. Goal: within 1.5x. Also lists which
   heavy modules the check process imported (it must not import weasyprint).

Ratios are what hold from machine to machine, not seconds.
Run: /work/main/.venv/bin/python benchmarks/bench_check.py
"""
from __future__ import annotations

import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

from calcsheet.engine import read_source, run
from calcsheet.parser import parse_sheet
from timing import best

REPO = Path(__file__).resolve().parents[1]


def make_sheet(n_lines: int) -> str:
    """Groups of ten lines: spacing, area loads, a line load, span, moment, shear, a section every
    fifth group, its stress and a check each."""
    lines = ["---", "project: Benchmark", "units: SI", "---"]
    i = 0
    while len(lines) < n_lines:
        sec = f"sec_{i // 5 * 5}"
        group = [
            f"s_{i} = {0.4 + (i % 5) * 0.1:.1f} m            -- spacing",
            f"g_{i} = {1 + i % 3} kPa",
            f"q_{i} = {2 + i % 4} kPa",
            f"w_{i} [kN/m] = (1.35*g_{i} + 1.5*q_{i})*s_{i}",
            f"L_{i} = {3 + i % 7} m",
            f"M_{i} [kN*m] = w_{i}*L_{i}^2/8",
            f"V_{i} [kN] = w_{i}*L_{i}/2",
            (f"{sec} = section.rectangle(b={60 + i % 40} mm, h={200 + i % 100} mm)" if i % 5 == 0
             else f"f_{i} = 24 MPa*0.8/1.3"),
            f"sigma_{i} [MPa] = M_{i}/{sec}.S_x",
            f"check sigma_{i} <= 400 MPa" if i % 5 == 0 else f"check sigma_{i} <= 20*f_{i}",
        ]
        lines += group
        i += 1
    return "\n".join(lines[:n_lines]) + "\n"



def compare(label: str, source, repeat: int) -> float:
    checked = run(source, evaluate=False)
    assert not [d for d in checked.diagnostics if not d.suppressed], checked.format_diagnostics()
    t_check = best(lambda: run(source, evaluate=False), repeat)
    t_eval = best(lambda: run(source), repeat)
    t_parse = best(lambda: parse_sheet(read_source(source)[0]), repeat)
    ratio = t_check / t_eval
    print(f"{label:<34} {t_check:>9.3f} {t_eval:>9.3f} {ratio:>7.2f} {t_parse / t_check:>10.0%}")
    return ratio


def cold(cmd: list[str], n: int = 7) -> float:
    samples = []
    for _ in range(n):
        t = time.perf_counter()
        subprocess.run(cmd, check=True, capture_output=True)
        samples.append(time.perf_counter() - t)
    return statistics.median(samples)


def main() -> None:
    run("x = 1 m\ncheck x <= 2 m\n")  # warm the registry and the grammar in this process
    print("static check vs full evaluation, same sheets, same run (goal: ratio <= 0.33)")
    print(f"{'sheet':<34} {'check s':>9} {'eval s':>9} {'ratio':>7} {'parse/check':>10}")
    ratios = [compare("generated, 10,000 lines", make_sheet(10_000), repeat=1)]
    for sheet in sorted((REPO / "sheets").glob("*.calc")):
        ratios.append(compare(sheet.name, sheet, repeat=5))
    print(f"worst ratio {max(ratios):.2f}")

    with tempfile.TemporaryDirectory() as tmp:
        sheet = Path(tmp) / "s.calc"
        sheet.write_text(make_sheet(50), encoding="utf-8")
        probe = ("import sys, runpy; sys.argv = ['calcsheet', 'check', sys.argv[1]]\n"
                 "from calcsheet.cli import main\nmain(sys.argv[1:])\n"
                 "print(sorted({m.split('.')[0] for m in sys.modules} & {'weasyprint', 'numpy', 'scipy', 'sympy', "
                 "'shapely', 'calcsheet_plugins'}))\n")
        out = subprocess.run([sys.executable, "-c", probe, str(sheet)], capture_output=True, text=True, check=True)
        cmd_check = [sys.executable, "-m", "calcsheet", "check", str(sheet)]
        cmd_pint = [sys.executable, "-c", "import pint; pint.UnitRegistry()"]
        t_check, t_pint = cold(cmd_check), cold(cmd_pint)
        print(f"cold start: calcsheet check {t_check:.3f} s, import pint + UnitRegistry() {t_pint:.3f} s, "
              f"ratio {t_check / t_pint:.2f} (goal <= 1.5)")
        print(f"heavy modules imported by check: {out.stdout.strip().splitlines()[-1]} "
              "(numpy comes with pint; plugins only those the sheet calls)")


if __name__ == "__main__":
    main()
