"""Rebuild after one input change against a full run, and the demo's HTML build against its PDF build.

1. A generated 1,000-line sheet: change one input that few lines depend on and
   rebuild incrementally (calcsheet.incremental.rebuild) against a full
   calcsheet.run of the edited sheet in the same process. Goal: under 20 %.
   Also a --set override (incremental.recompute) against a full run with it.
2. The demo sheet(s): rebuilding the HTML package against building the PDF.
"""
from __future__ import annotations

import statistics
import sys
import time
from pathlib import Path

import calcsheet
from calcsheet.incremental import rebuild, recompute
from calcsheet.package import pdf_bytes
from calcsheet.render.page import PackageDocument
from timing import best

ROOT = Path(__file__).resolve().parent.parent


def make_sheet(n_lines: int) -> str:
    """Groups of five lines (an input pair, a load, a moment, a check) chained lightly to their neighbours."""
    lines = ["---", "project: Rebuild benchmark", "rev: A", "---", "# Members"]
    i = 0
    while len(lines) < n_lines:
        lines += [
            f"L_{i} = {3 + i % 7} m          -- span",
            f"w_{i} [kN/m] = 1.2*{1 + i % 5} kPa * 0.6 m + 1.5 kN/m",
            f"M_{i} [kN*m] = w_{i}*L_{i}^2/8",
            f"s_{i} [MPa] = M_{i} / 2.5e5 mm^3",
            f"check s_{i} <= 250 MPa  -- bending",
        ]
        i += 1
    return "\n".join(lines[:n_lines]) + "\n"



def bench_incremental(n_lines: int = 1000) -> bool:
    text = make_sheet(n_lines)
    target = "L_100 = 5 m "
    assert target in text
    edited = text.replace(target, "L_100 = 5.5 m ")
    base = calcsheet.run(text, path="bench.calc")
    assert base.ok, base.format_diagnostics()[:400]
    out = rebuild(base, edited)
    assert not out.full, out.reason
    full = best(lambda: calcsheet.run(edited, path="bench.calc"))
    fast = best(lambda: rebuild(base, edited))
    ratio = fast / full
    print(f"{n_lines}-line sheet, one input changed ({len(out.recomputed)} statements recomputed: it and its dependents)")
    print(f"  full run       {full * 1000:8.1f} ms")
    print(f"  incremental    {fast * 1000:8.1f} ms   ratio {ratio:.3f}  (goal < 0.20)")
    full_set = best(lambda: calcsheet.run(text, overrides={"L_100": "6 m"}, path="bench.calc"))
    fast_set = best(lambda: recompute(base, {"L_100": "6 m"}))
    print(f"  --set L_100: full {full_set * 1000:.1f} ms, incremental {fast_set * 1000:.1f} ms, "
          f"ratio {fast_set / full_set:.3f}")
    return ratio < 0.20


def bench_demo_html_vs_pdf() -> None:
    for sheet in sorted((ROOT / "sheets").glob("*.calc")):
        result = calcsheet.run(sheet)
        if not result.ok:
            print(f"{sheet.name}: has errors, skipped")
            continue
        html_t = best(lambda: PackageDocument(result).html(), repeat=5)
        html = PackageDocument(result).html()
        pdf_t = best(lambda: pdf_bytes(html), repeat=2)
        rerun_t = best(lambda: calcsheet.run(sheet), repeat=3)
        print(f"{sheet.name}: HTML {html_t * 1000:.1f} ms, PDF {pdf_t * 1000:.0f} ms "
              f"(HTML/PDF {html_t / pdf_t:.3f}); run {rerun_t * 1000:.0f} ms; "
              f"watch rebuild = run + HTML: {(rerun_t + html_t) / (rerun_t + html_t + pdf_t):.2f} of run + HTML + PDF")


def main() -> int:
    ok = bench_incremental()
    bench_demo_html_vs_pdf()
    if not ok:
        print("incremental rebuild missed its goal", file=sys.stderr)
    return 0


if __name__ == "__main__":
    sys.exit(main())
