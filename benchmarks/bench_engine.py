"""Parse + check + evaluate (tracing on) against a plain pint script doing the same arithmetic, and growth.

1. Traced evaluation ÷ plain pint script at 10⁴ and 3·10⁴ lines (goal ≤ 2.5×). The sheet is plain
   arithmetic in groups of five lines (a span, a load, a moment, a stress, a check); the baseline computes
   the same quantities with pint directly, with the same unit conversions, in the same process. Both sides
   are timed by ``timing.paired``: same repetitions, both warm, alternating order.
2. Growth exponent of ``check`` and of a JSON build from 10⁴ to 10⁵ lines (goal ≤ 1.05; 1.0 is linear):
   log(t(10⁵)/t(10⁴)) / log(10), the two sizes timed alternately, the same number of times each.
   ``--quick`` measures 10⁴ → 3·10⁴ instead (the figure's name says which).

Ratios are what hold from machine to machine, not seconds.
Run: .venv/bin/python benchmarks/bench_engine.py [--quick]
"""
from __future__ import annotations

import math
import os
import sys

import calcsheet
from calcsheet import units as U
from calcsheet.render.json import JsonPrinter, dumps
from timing import paired, report

# a 10⁵-line sheet is past the default caps (docs/limits.md): raise them for this process only
os.environ.setdefault("CALCSHEET_LIMIT_STATEMENTS", "1000000")
os.environ.setdefault("CALCSHEET_LIMIT_SHEET_BYTES", "100000000")


def make_sheet(n: int) -> str:
    """n lines in groups of five: an input, a load, a moment, a stress, a check."""
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
    """The same values with pint directly (the baseline): the same literals, operations and conversions."""
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


def json_build(text: str) -> str:
    result = calcsheet.run(text)
    return dumps(JsonPrinter().result(result))


def evaluation_ratio(n: int, repeat: int) -> None:
    text = make_sheet(n)
    result = calcsheet.run(text)
    assert result.ok and len(result.checks) == n // 5, result.format_diagnostics()[:400]
    ours, base = paired(lambda: calcsheet.run(text), lambda: plain_pint(n), repeat=repeat)
    report(f"traced evaluation ÷ plain pint script, {n:,} lines", ours / base, 2.5,
           note=f"{ours:.2f} s vs {base:.2f} s, {ours / n * 1e6:.0f} µs/line")


def growth(label: str, fn, small: int, large: int, repeat: int) -> None:
    a, b = make_sheet(small), make_sheet(large)
    fn(make_sheet(1000))  # warm the registry, the grammar and the unit caches once for both sizes
    t_small, t_large = paired(lambda: fn(a), lambda: fn(b), repeat=repeat, warm=False)
    exponent = math.log(t_large / t_small) / math.log(large / small)
    report(f"growth exponent of {label}, {small:,} → {large:,} lines", exponent, 1.05, unit="",
           note=f"{t_small:.2f} s → {t_large:.2f} s")


def main(argv: list[str]) -> int:
    quick = "--quick" in argv
    calcsheet.run("x = 1 m\ncheck x <= 2 m\n")  # warm the registry and the grammar in this process
    print("parse + check + evaluate (tracing on) vs plain pint, same values, same run")
    evaluation_ratio(10_000, repeat=3)
    evaluation_ratio(30_000, repeat=1 if quick else 2)
    large = 30_000 if quick else 100_000
    growth("check", lambda t: calcsheet.run(t, evaluate=False), 10_000, large, repeat=1 if quick else 2)
    growth("a JSON build", json_build, 10_000, large, repeat=1 if quick else 2)
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
