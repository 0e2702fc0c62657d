"""Incremental rebuild after one edit against a full build, with and without the page the preview shows.

A generated 1,000-line sheet: groups of five lines (a span, a load, a moment, a stress, a check); every
tenth group's load reads a shared factor ``k_sh``, so an edit of ``k_sh`` reaches one group in ten — the
worst edit this sheet has — while an edit of one span reaches a single group — the best.

- rebuild incl. HTML: ``incremental.rebuild`` of the edited text plus the preview's page
  (``watch.preview_document`` with the parts memo of the page before the edit), against ``run`` of the
  edited text plus the page printed afresh — what the live preview does on a save, against a first build.
  Goal ≤ 0.15 for the worst and for the best edit.
- rebuild without HTML: the same two edits, engine only (goal ≤ 0.15).
- a ``--set`` override (``incremental.recompute``) against a full run with it (goal ≤ 0.15).

Both sides of every ratio are timed by ``timing.paired`` (same repetitions, both warm, alternating order).
Run: .venv/bin/python benchmarks/bench_rebuild.py
"""
from __future__ import annotations

import sys

import calcsheet
from calcsheet.incremental import rebuild, recompute
from calcsheet.watch import PartsMemo, preview_document
from timing import paired, report

N_LINES = 1000


def make_sheet(n_lines: int) -> str:
    """Groups of five lines; every tenth group's load reads the shared factor k_sh."""
    lines = ["---", "project: Rebuild benchmark", "rev: A", "---", "# Members",
             "k_sh = 1.1          -- shared load factor"]
    i = 0
    while len(lines) < n_lines:
        factor = "k_sh*" if i % 10 == 0 else ""
        lines += [
            f"L_{i} = {3 + i % 7} m          -- span",
            f"w_{i} [kN/m] = {factor}1.2*{1 + i % 5} kPa * 0.6 m + 1.5 kN/m",
            f"M_{i} [kN*m] = w_{i}*L_{i}^2/8",
            f"s_{i} [MPa] = M_{i} / 2.5e5 mm^3",
            f"check s_{i} <= 250 MPa  -- bending",
        ]
        i += 1
    return "\n".join(lines[:n_lines]) + "\n"


def page_memo(result) -> dict:
    memo = PartsMemo()
    preview_document(result).html()  # warm the printer's own caches like the other side
    preview_document(result, memo).html()
    return memo.current


def rebuild_with_page(base, edited: str, parts: dict):
    memo = PartsMemo()
    memo.previous = parts  # the page before the edit; read only, so every repetition starts alike
    out = rebuild(base, edited)
    preview_document(out.result, memo).html()
    return out


def full_with_page(edited: str):
    result = calcsheet.run(edited, path="bench.calc")
    preview_document(result).html()
    return result


def edit(label: str, base, text: str, old: str, new: str, parts: dict) -> None:
    assert old in text
    edited = text.replace(old, new)
    out = rebuild(base, edited)
    assert not out.full, out.reason
    share = f"{len(out.recomputed)} of {len(base.resolution.statements)} statements recomputed"
    fast, full = paired(lambda: rebuild_with_page(base, edited, parts), lambda: full_with_page(edited), repeat=3)
    report(f"incremental rebuild incl. HTML ÷ full, {label}, {N_LINES:,} lines", fast / full, 0.15,
           note=f"{share}; {fast * 1000:.0f} ms vs {full * 1000:.0f} ms")
    fast, full = paired(lambda: rebuild(base, edited), lambda: calcsheet.run(edited, path="bench.calc"), repeat=3)
    report(f"incremental rebuild ÷ full run (no HTML), {label}, {N_LINES:,} lines", fast / full, 0.15,
           note=f"{fast * 1000:.0f} ms vs {full * 1000:.0f} ms")


def main() -> int:
    text = make_sheet(N_LINES)
    base = calcsheet.run(text, path="bench.calc")
    assert base.ok, base.format_diagnostics()[:400]
    parts = page_memo(base)
    edit("worst edit: shared input read by 1 group in 10", base, text, "k_sh = 1.1 ", "k_sh = 1.25 ", parts)
    edit("best edit: one span", base, text, "L_100 = 5 m ", "L_100 = 5.5 m ", parts)
    fast, full = paired(lambda: recompute(base, {"L_100": "6 m"}),
                        lambda: calcsheet.run(text, overrides={"L_100": "6 m"}, path="bench.calc"), repeat=3)
    report(f"--set L_100 (incremental.recompute) ÷ full run with it, {N_LINES:,} lines", fast / full, 0.15,
           note=f"{fast * 1000:.0f} ms vs {full * 1000:.0f} ms")
    return 0


if __name__ == "__main__":
    sys.exit(main())
