"""The mistake corpus: each sheet is a slip engineers make, with the exact diagnostics expected.

Beside every ``NN_name.calc`` sits ``NN_name.expect``: one ``line:col severity
code [~ fragment]`` per diagnostic (``#`` lines are notes), the fragment being
text the message or hint must contain (the likely fix). ``NN_name.fixed.calc``
is the same calculation corrected: it must check clean (no diagnostic at all)
and evaluate without errors.
"""
from __future__ import annotations

import re
from pathlib import Path

import pytest

from calcsheet.engine import run

CORPUS = Path(__file__).parent / "corpus"
SHEETS = sorted(p for p in CORPUS.glob("*.calc") if not p.name.endswith(".fixed.calc"))
LINE = re.compile(r"(?P<line>\d+):(?P<col>\d+)\s+(?P<sev>error|warning|info)\s+(?P<code>[a-z0-9-]+)"
                  r"(?:\s+~\s+(?P<frag>.+))?$")


def expected(sheet: Path) -> list[tuple]:
    out = []
    for raw in sheet.with_suffix(".expect").read_text(encoding="utf-8").splitlines():
        raw = raw.strip()
        if not raw or raw.startswith("#"):
            continue
        m = LINE.match(raw)
        assert m, f"{sheet.name}.expect: cannot read {raw!r}"
        out.append((int(m["line"]), int(m["col"]), m["sev"], m["code"], (m["frag"] or "").strip()))
    return out


def active(result):
    return [d for d in result.diagnostics if not d.suppressed]


def test_the_corpus_is_big_enough():
    assert len(SHEETS) >= 30
    assert all(s.with_suffix(".expect").is_file() for s in SHEETS)
    assert all(s.with_name(s.stem + ".fixed.calc").is_file() for s in SHEETS)


@pytest.mark.parametrize("sheet", SHEETS, ids=[s.stem for s in SHEETS])
def test_mistake_gives_exactly_the_expected_diagnostics(sheet):
    result = run(sheet, evaluate=False)
    got = [(d.span.line, d.span.col, d.severity, d.code) for d in active(result)]
    want = [e[:4] for e in expected(sheet)]
    assert got == want, "\n" + "\n".join(d.one_line() + (f"  | hint: {d.hint}" if d.hint else "")
                                         for d in result.diagnostics)
    for d, (*_, frag) in zip(active(result), expected(sheet)):
        if frag:
            assert frag in d.message or frag in (d.hint or ""), (d.message, d.hint)


@pytest.mark.parametrize("sheet", SHEETS, ids=[s.stem for s in SHEETS])
def test_the_corrected_sheet_checks_clean_and_evaluates(sheet):
    fixed = sheet.with_name(sheet.stem + ".fixed.calc")
    checked = run(fixed, evaluate=False)
    assert active(checked) == [], checked.format_diagnostics()
    evaluated = run(fixed)
    assert evaluated.ok, evaluated.format_diagnostics()
    # plugins may warn while evaluating (a recalled library value); the checker itself must stay silent
    assert not [d for d in evaluated.diagnostics if d.severity == "warning" and not d.suppressed
                and d.code != "plugin-warning"], evaluated.format_diagnostics()
