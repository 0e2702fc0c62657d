"""Caps on statements, problems, output size and pages, each a clear error naming the cap and how to
raise it (docs/limits.md); diagnostics formatting that is linear in the sheet (issue 16, part 4)."""
from __future__ import annotations

import re
from pathlib import Path

import pytest

import calcsheet
from calcsheet import errors, reading
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


def test_formatting_many_diagnostics_splits_the_source_once():
    source = "x =\n" * 5_000
    r = calcsheet.run(source, evaluate=False)
    assert len(r.errors) == 1_001  # 1,000 problems, then the PROBLEMS cap
    errors.source_lines.cache_clear()
    text = r.format_diagnostics()
    info = errors.source_lines.cache_info()
    assert info.misses == 1 and info.hits == len(r.diagnostics) - 1
    assert text.count("\n   ") >= 1_000


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
