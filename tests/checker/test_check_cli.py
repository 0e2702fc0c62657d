"""`calcsheet check`: every finding at once, in three formats, with exit statuses 0 / 1 / 3."""
from __future__ import annotations

import json
import subprocess
import sys

import pytest

from calcsheet.cli import main

TWO_MISTAKES = (
    "q = 2 kPa          -- floor load\n"
    "s = 0.6 m          -- joist spacing\n"
    "w [kN/m] = q\n"
    "post = section.rectangle(b=150, h=150 mm)\n"
)
WARNING_ONLY = "E_s = 200 MPa\nA = 100 mm^2\nk = E_s*A\ncheck k <= 1 MN\n"
INFO_ONLY = "P = 6 kN\na = 1.2 m\nM [kJ] = P*a\ncheck M <= 10 kN*m\n"
CLEAN = "L = 6 m\nw = 5 kN/m\nM [kN*m] = w*L^2/8\ncheck M <= 30 kN*m\n"


def test_human_output_shows_line_caret_hint_and_code(sheet, capsys):
    p = sheet(TWO_MISTAKES)
    assert main(["check", str(p)]) == 1
    out = capsys.readouterr().out
    assert f"{p}:3:4: error: w is declared [kN/m]" in out and "[declared-unit-mismatch]" in out
    assert "     3 | w [kN/m] = q\n       |    ^~~~\n" in out
    assert "did you forget the tributary width?" in out
    assert f"{p}:4:28: error: section.rectangle: 'b' needs length" in out
    assert "       |                            ^~~\n" in out
    assert out.rstrip().endswith(f"{p}: 2 errors, 1 warning")


def test_line_format_is_one_line_per_finding_in_line_order(sheet, capsys):
    p = sheet(TWO_MISTAKES)
    assert main(["check", "--format", "line", str(p)]) == 1
    assert capsys.readouterr().out.splitlines() == [
        f"{p}:2:1: warning unused-input: input 's' is defined but nothing uses it",
        f"{p}:3:4: error declared-unit-mismatch: w is declared [kN/m] (force/length (line load)) but the "
        "expression gives pressure (stress, area load)",
        f"{p}:4:28: error plugin-argument: section.rectangle: 'b' needs length, got dimensionless (a bare number)",
    ]


def test_json_has_the_design_shape_plus_code_and_hint(sheet, capsys):
    p = sheet(TWO_MISTAKES)
    assert main(["check", "--format", "json", str(p)]) == 1
    doc = json.loads(capsys.readouterr().out)
    assert doc["path"] == str(p)
    first = doc["diagnostics"][1]
    assert {"severity", "line", "col", "message", "code", "hint"} <= set(first)
    assert (first["severity"], first["code"], first["line"], first["col"]) == ("error", "declared-unit-mismatch", 3, 4)


def test_json_lists_allowed_findings_apart_with_their_reasons(sheet, capsys):
    p = sheet("E_s = 45 MPa  // allow implausible-value: soil modulus\nx = E_s*2\ncheck x <= 1 GPa\n")
    assert main(["check", "--format", "json", str(p)]) == 0
    doc = json.loads(capsys.readouterr().out)
    assert doc["diagnostics"] == []
    assert [(s["code"], s["reason"]) for s in doc["suppressed"]] == [("implausible-value", "soil modulus")]


def test_several_sheets_give_a_json_list(sheet, capsys):
    a, b = sheet(CLEAN, "a.calc"), sheet(TWO_MISTAKES, "b.calc")
    assert main(["check", "--format", "json", str(a), str(b)]) == 1
    doc = json.loads(capsys.readouterr().out)
    assert [d["path"] for d in doc] == [str(a), str(b)] and doc[0]["diagnostics"] == []


@pytest.mark.parametrize("text, plain, strict", [
    (CLEAN, 0, 0), (WARNING_ONLY, 0, 3), (INFO_ONLY, 0, 0), (TWO_MISTAKES, 1, 1),
])
def test_exit_status(sheet, text, plain, strict, capsys):
    p = sheet(text)
    assert main(["check", str(p)]) == plain
    assert main(["check", "--strict", str(p)]) == strict


def test_errors_in_any_sheet_outrank_warnings_in_another(sheet, capsys):
    assert main(["check", "--strict", str(sheet(WARNING_ONLY, "w.calc")), str(sheet(TWO_MISTAKES, "e.calc"))]) == 1


def test_a_missing_sheet_is_a_usage_error(tmp_path, capsys):
    assert main(["check", str(tmp_path / "nope.calc")]) == 2


def test_check_imports_no_pdf_engine_and_no_plugin_it_does_not_call(sheet):
    p = sheet(CLEAN)
    code = ("import sys\nfrom calcsheet.cli import main\nrc = main(['check', sys.argv[1]])\n"
            "bad = [m for m in sys.modules if m.startswith(('weasyprint', 'calcsheet_plugins', 'calcsheet.render.',"
            " 'calcsheet.package')) and m != 'calcsheet.render.check']\nprint(rc, bad)\n")  # its own printer only
    out = subprocess.run([sys.executable, "-c", code, str(p)], capture_output=True, text=True, check=True).stdout
    assert out.strip().splitlines()[-1] == "0 []"
