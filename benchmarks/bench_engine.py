"""Parse + evaluate generated sheets against a plain pint script doing the same work.

Reports the ratio (goal: within 3x of plain pint with tracing on) and how the
cost grows with lines (goal: linear), then the cold start of `calcsheet check`
against `python -c "import pint; pint.UnitRegistry()"`.
"""
from __future__ import annotations

import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

import calcsheet
from calcsheet import units as U
from timing import best


def make_sheet(n: int) -> str:
    """n lines in groups of five: inputs, a load, a moment, a stress, a check."""
    lines = ["---", "project: Benchmark", "---"]
    for i in range(n // 5):
        lines += [
            f"L_{i} = {3 + i % 7} m",
            f"w_{i} [kN/m] = 1.2*{1 + i % 5} kPa * 0.6 m + 1.5 kN/m",
            f"M_{i} [kN*m] = w_{i}*L_{i}^2/8",
            f"s_{i} [MPa] = M_{i} / 2.5e5 mm^3",
            f"check s_{i} <= 250 MPa",
        ]
    return "\n".join(lines) + "\n"


def plain_pint(n: int):
    """The same values with pint directly (the baseline)."""
    ureg = U.registry()
    Q = ureg.Quantity
    m, kPa, kN_m, kNm, MPa, mm3 = (ureg.Unit(u) for u in ("m", "kPa", "kN/m", "kN*m", "MPa", "mm**3"))
    out = {}
    for i in range(n // 5):
        L = Q(3 + i % 7, m)
        w = (1.2 * Q(1 + i % 5, kPa) * Q(0.6, m) + Q(1.5, kN_m)).to(kN_m)
        M = (w * L**2 / 8).to(kNm)
        s = (M / Q(2.5e5, mm3)).to(MPa)
        out[i] = (L, w, M, s, s <= Q(250, MPa))
    return out



def main() -> None:
    calcsheet.run("x = 1 m\n")  # warm the registry and grammar
    print("parse + evaluate (tracing on) vs plain pint, same values, same run")
    print(f"{'lines':>7} {'calcsheet s':>12} {'pint s':>9} {'ratio':>6} {'µs/line':>8}")
    per_line = []
    for n in (100, 1000, 10000):
        text = make_sheet(n)
        t_cs = best(lambda: calcsheet.run(text), repeat=3 if n < 10000 else 1)
        t_pp = best(lambda: plain_pint(n), repeat=3 if n < 10000 else 1)
        per_line.append(t_cs / n * 1e6)
        print(f"{n:>7} {t_cs:>12.3f} {t_pp:>9.3f} {t_cs / t_pp:>6.2f} {t_cs / n * 1e6:>8.1f}")
    print(f"growth: cost per line at 10,000 lines is {per_line[-1] / per_line[0]:.2f}x that at 100 (1.0 = linear)")

    with tempfile.TemporaryDirectory() as tmp:
        sheet = Path(tmp) / "s.calc"
        sheet.write_text(make_sheet(50))
        cmd_check = [sys.executable, "-m", "calcsheet", "check", str(sheet)]
        cmd_pint = [sys.executable, "-c", "import pint; pint.UnitRegistry()"]

        def cold(cmd):
            samples = []
            for _ in range(5):
                t = time.perf_counter()
                subprocess.run(cmd, check=True, capture_output=True)
                samples.append(time.perf_counter() - t)
            return statistics.median(samples)

        t_check, t_pint = cold(cmd_check), cold(cmd_pint)
        print(f"cold start: calcsheet check {t_check:.3f} s, import pint + UnitRegistry() {t_pint:.3f} s, "
              f"ratio {t_check / t_pint:.2f}")


if __name__ == "__main__":
    main()
