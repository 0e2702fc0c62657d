"""Static check against a full run of the same sheets, and the cold start of `calcsheet check`.

1. ``check`` ÷ full run on plain arithmetic, 10⁴ lines (goal ≤ 0.33): `run(..., evaluate=False)` (what
   `calcsheet check` does) against `run(...)` (parse, check, evaluate with tracing) of the *same* sheet —
   the plain-arithmetic sheet of bench_engine, no plugin calls inflating the run. Also each demo sheet in
   sheets/ (worst ratio reported). Both sides timed by ``timing.paired`` (same repetitions, both warm,
   alternating order).
2. ``check`` ÷ plain pint script, 10⁴ lines (goal ≤ 0.8): the same `run(..., evaluate=False)` against
   bench_engine's plain pint baseline (the same values computed with pint directly), so the cost of
   parse + resolve + check is held to an absolute yardstick that a faster evaluation does not move (the
   ratio to a full run above grows worse as evaluation gets cheaper). Timed by ``timing.paired``.
   For scale, CPython's own ``compile()`` of the same arithmetic written as a Python script (its parser and
   compiler are C) is timed the same way and printed beside it, per line: the floor a pure-Python reader
   and checker is measured against. ``check`` ÷ full run ≤ ⅓ asks parse + resolve + check to cost half
   of evaluation + trace, which is now cheaper than pint itself; this line shows what that would ask.
3. Cold start: `calcsheet check` of a small sheet in a fresh process against `python -c "import pint;
   pint.UnitRegistry(cache_folder=':auto:')"` — the same pint disk cache our registry uses, warmed for both
   by one untimed run each (which also fills one bytecode cache for both), then timed alternately the same
   number of times (goal ≤ 1.5×). Also lists which
   heavy modules the check process imported (never weasyprint).

Run: .venv/bin/python benchmarks/bench_check.py
"""
from __future__ import annotations

import os
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

from bench_engine import make_sheet, plain_pint
from bench_evaluation import evaluation_of, rotating
from calcsheet.engine import run
from timing import paired, report

REPO = Path(__file__).resolve().parents[1]


def python_script(n: int) -> str:
    """make_sheet's arithmetic as Python: the same names, literals, operators and comparisons, a unit as a
    name multiplied in (what Python's compiler must read of it), the check as an assertion."""
    lines = []
    for i in range(n // 5):
        lines += [
            f"L_{i} = {3 + i % 7} * m",
            f"w_{i} = 1.2*{1 + i % 5} * kPa * 0.6 * m + 1.5 * kN/m",
            f"M_{i} = w_{i}*L_{i}**2/8",
            f"s_{i} = M_{i} / (2.5e5 * mm**3)",
            f"assert s_{i} <= 250 * MPa",
        ]
    return "\n".join(lines) + "\n"


def ratio(source, repeat: int) -> tuple[float, float, float]:
    checked = run(source, evaluate=False)
    assert not [d for d in checked.diagnostics if not d.suppressed], checked.format_diagnostics()
    t_check, t_run = paired(lambda: run(source, evaluate=False), lambda: run(source), repeat=repeat)
    return t_check / t_run, t_check, t_run


def cold_pair(cmd_a: list[str], cmd_b: list[str], bytecode: str, repeat: int = 7) -> tuple[float, float]:
    """Both commands in fresh processes, with one bytecode cache folder for both (``bytecode``): pint's
    modules come precompiled from site-packages, ours would be compiled from source on every start where the
    environment forbids writing bytecode (PYTHONDONTWRITEBYTECODE), which is not the same state."""
    env = {k: v for k, v in os.environ.items() if k != "PYTHONDONTWRITEBYTECODE"}
    env["PYTHONPYCACHEPREFIX"] = bytecode

    def go(cmd):
        return lambda: subprocess.run(cmd, check=True, capture_output=True, env=env)
    return paired(go(cmd_a), go(cmd_b), repeat=repeat)  # the warm-up run fills both disk and bytecode caches


def main() -> None:
    run("x = 1 m\ncheck x <= 2 m\n")  # warm the registry and the grammar in this process
    print("static check vs full run, same sheets, same run")
    r, tc, tr = ratio(make_sheet(10_000), repeat=3)
    report("check ÷ full run, plain arithmetic, 10,000 lines", r, 0.33, note=f"{tc:.2f} s vs {tr:.2f} s")
    text = make_sheet(10_000)
    t_check, t_pint = paired(lambda: run(text, evaluate=False), lambda: plain_pint(10_000), repeat=5)
    report("check ÷ plain pint script, 10,000 lines", t_check / t_pint, 0.8,
           note=f"{t_check:.3f} s vs {t_pint:.3f} s, {t_check / 10_000 * 1e6:.1f} µs/line")
    script = python_script(10_000)
    # check, CPython's compile() and what a run adds to a check (evaluation + trace, timed alone), one method
    t_check, t_compile, t_eval = rotating([lambda: run(text, evaluate=False),
                                           lambda: compile(script, "<bench>", "exec"), evaluation_of(text)], 5)
    print(f"    for scale, per line: check {t_check / 10_000 * 1e6:.1f} µs; CPython's C compile() of the same "
          f"arithmetic as Python {t_compile / 10_000 * 1e6:.1f} µs; a full run's evaluation + trace "
          f"{t_eval / 10_000 * 1e6:.1f} µs, so check ≤ ⅓ of a run asks ≤ {t_eval / 2 / 10_000 * 1e6:.1f} µs")
    worst = (0.0, "")
    for sheet in sorted((REPO / "sheets").glob("*.calc")):
        r, _, _ = ratio(sheet, repeat=3)
        print(f"    {sheet.name:<34} check ÷ run {r:.2f}")
        worst = max(worst, (r, sheet.name))
    report("check ÷ full run, worst demo sheet", worst[0], 0.33, note=worst[1])

    with tempfile.TemporaryDirectory() as tmp:
        sheet = Path(tmp) / "s.calc"
        sheet.write_text(make_sheet(50), encoding="utf-8")
        probe = ("import sys; sys.argv = ['calcsheet', 'check', sys.argv[1]]\n"
                 "from calcsheet.cli import main\nmain(sys.argv[1:])\n"
                 "print(sorted({m.split('.')[0] for m in sys.modules} & {'weasyprint', 'numpy', 'scipy', 'sympy', "
                 "'shapely', 'calcsheet_plugins'}))\n")
        out = subprocess.run([sys.executable, "-c", probe, str(sheet)], capture_output=True, text=True, check=True)
        cmd_check = [sys.executable, "-m", "calcsheet", "check", str(sheet)]
        cmd_pint = [sys.executable, "-c", "import pint; pint.UnitRegistry(cache_folder=':auto:')"]
        t_check, t_pint = cold_pair(cmd_check, cmd_pint, bytecode=str(Path(tmp) / "pycache"))
        report("cold start: calcsheet check ÷ import pint + UnitRegistry (both disk-cached)", t_check / t_pint, 1.5,
               note=f"{t_check:.3f} s vs {t_pint:.3f} s")
        heavy = out.stdout.strip().splitlines()[-1]
        print(f"    heavy modules imported by check: {heavy} (numpy comes with pint; plugins only those called)")
        report("weasyprint imported by calcsheet check (0 = no)", float("weasyprint" in heavy), 0, unit="")


if __name__ == "__main__":
    main()
