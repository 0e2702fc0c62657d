"""Caps on statements, problems, output size and pages, each a clear error naming the cap and how to
raise it (docs/limits.md); diagnostics formatting that is linear in the sheet (issue 16, part 4)."""
from __future__ import annotations

import re
from pathlib import Path

import pytest

import calcsheet
from calcsheet import reading
from calcsheet.cli import main

DOC = (Path(__file__).parents[1] / "docs" / "limits.md").read_text(encoding="utf-8")


def test_every_cap_is_documented_with_its_default():
    for name, (default, _) in reading.LIMITS.items():
        assert re.search(rf"`{name}` \| {default:,} \|", DOC), name


def test_a_cap_is_raised_by_its_environment_variable(monkeypatch):
    monkeypatch.setenv("CALCSHEET_LIMIT_PROBLEMS", "5_000")
    assert reading.limit("PROBLEMS") == 5000
    monkeypatch.setenv("CALCSHEET_LIMIT_PROBLEMS", "nonsense")
    assert reading.limit("PROBLEMS") == reading.LIMITS["PROBLEMS"][0]


class CountedText(str):
    """A sheet's text that counts how often it is split into lines and compared with another text."""
    splits = 0
    comparisons = 0

    def splitlines(self, *args):
        CountedText.splits += 1
        return super().splitlines(*args)

    def __eq__(self, other):
        CountedText.comparisons += 1
        return super().__eq__(other)

    __hash__ = str.__hash__


def test_formatting_many_diagnostics_splits_the_source_once():
    source = "x =\n" * 5_000
    r = calcsheet.run(source, evaluate=False)
    assert len(r.errors) == 1_001  # 1,000 problems, then the PROBLEMS cap
    CountedText.splits = CountedText.comparisons = 0
    counted = CountedText(r.source)
    text = "\n".join(d.format(counted) for d in r.diagnostics)
    assert CountedText.splits == 1
    assert text.count("\n   ") >= 1_000


def test_an_equal_text_read_again_is_never_compared_with_the_kept_one():
    # a long-lived process (the live preview, a schedule, the benchmarks) checks the same file again: the
    # new text equals the kept one but is another string; comparing them at every diagnostic cost O(sheet)
    r = calcsheet.run("x =\n" * 2_000, evaluate=False)
    first, again = CountedText(r.source), CountedText(r.source)
    CountedText.splits = CountedText.comparisons = 0
    for text in (first, again, first):
        for d in r.diagnostics[:50]:
            d.format(text)
    assert CountedText.splits == 2 and CountedText.comparisons == 0


def test_a_sheet_of_900000_hashes_stops_at_the_problems_cap_and_says_so(tmp_path, capsys):
    p = tmp_path / "h.calc"
    p.write_text("#\n" * 900_000)
    assert main(["check", str(p)]) == 1
    out = capsys.readouterr().out
    assert f"{p}:1001:1: error: stopped reading at line 1001: 1,000 problems already" in out
    assert "CALCSHEET_LIMIT_PROBLEMS" in out and out.count("heading needs a space") == 1_000


def test_the_statements_cap(monkeypatch):
    monkeypatch.setenv("CALCSHEET_LIMIT_STATEMENTS", "50")
    r = calcsheet.run("".join(f"x{i} = {i} m\n" for i in range(200)), evaluate=False)
    assert [(d.code, d.span.line) for d in r.errors] == [("too-complex", 51)]
    assert "cap STATEMENTS" in r.errors[0].hint and "CALCSHEET_LIMIT_STATEMENTS" in r.errors[0].hint


def test_the_nesting_cap_says_how_to_write_the_sheet_instead():
    r = calcsheet.run("x = " + "(" * 300 + "1" + ")" * 300 + "\n", evaluate=False)
    assert [d.code for d in r.errors] == ["too-complex"] and "named intermediate" in r.errors[0].hint


def test_the_output_cap_refuses_the_package_and_keeps_the_old_one(tmp_path, capsys, monkeypatch):
    p = tmp_path / "s.calc"
    p.write_text("x = 2 m\n")
    out = tmp_path / "out"
    assert main(["build", str(p), "-o", str(out), "--format", "html,json"]) == 0
    before = {f: (out / f).read_bytes() for f in ("s.html", "s.json")}
    monkeypatch.setenv("CALCSHEET_LIMIT_OUTPUT_BYTES", "2000")
    p.write_text("x = 3 m\n")
    assert main(["build", str(p), "-o", str(out), "--format", "html,json"]) == 1
    err = capsys.readouterr().err
    assert f"{p}:1:1: error: cannot write the package" in err and "CALCSHEET_LIMIT_OUTPUT_BYTES" in err
    assert {f: (out / f).read_bytes() for f in ("s.html", "s.json")} == before


def test_the_pdf_pages_cap(tmp_path, capsys, monkeypatch):
    pytest.importorskip("weasyprint")
    p = tmp_path / "s.calc"
    p.write_text("".join(f"# Part {i}\nx{i} = {i + 1} m\n" for i in range(80)))
    monkeypatch.setenv("CALCSHEET_LIMIT_PDF_PAGES", "1")
    assert main(["build", str(p), "-o", str(tmp_path / "out"), "--format", "pdf"]) == 1
    err = capsys.readouterr().err
    assert "pages" in err and "CALCSHEET_LIMIT_PDF_PAGES" in err
    assert not (tmp_path / "out" / "s.pdf").exists()
