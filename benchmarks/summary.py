"""The one-screen table of every figure a `make bench` run measured.

Each benchmark appends its figures (``timing.report``) as JSON lines to the file named by
``CALCSHEET_BENCH_SUMMARY``; this prints them as one table: figure, value, goal, PASS/MISS, and a count.
Run: .venv/bin/python benchmarks/summary.py SUMMARY_FILE
"""
from __future__ import annotations

import json
import sys


def rows(path: str) -> list[dict]:
    out = []
    with open(path, encoding="utf-8") as fh:
        for line in fh:
            line = line.strip()
            if line:
                out.append(json.loads(line))
    return out


def table(figures: list[dict], width: int = 100) -> str:
    name_w = min(max((len(f["figure"]) for f in figures), default=10), width - 34)
    lines = [f"{'figure':<{name_w}}  {'value':>9}  {'goal':>9}  verdict", "-" * (name_w + 32)]
    for f in figures:
        name = f["figure"] if len(f["figure"]) <= name_w else f["figure"][:name_w - 1] + "…"
        sign = "≤" if f["better"] == "lower" else "≥"
        unit = f.get("unit", "")
        lines.append(f"{name:<{name_w}}  {f['value']:>8.3g}{unit or ' '}  {sign}{f['goal']:>7g}{unit or ' '}  "
                     f"{f['verdict']}")
    missed = sum(1 for f in figures if f["verdict"] != "PASS")
    lines.append("-" * (name_w + 32))
    lines.append(f"{len(figures)} figures: {len(figures) - missed} PASS, {missed} MISS")
    return "\n".join(lines)


def main(argv: list[str]) -> int:
    if len(argv) != 1:
        print("usage: summary.py SUMMARY_FILE", file=sys.stderr)
        return 2
    print(table(rows(argv[0])))
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
