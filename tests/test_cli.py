"""The calcsheet command: exit codes, messages, outputs."""
import json
import subprocess
import sys

import pytest

from calcsheet.cli import main

GOOD = "w = 2 kN/m\nL = 3 m\nM [kN*m] = w*L^2/8\ncheck M <= 5 kN*m\n"
NG = "w = 2 kN/m\nL = 3 m\nM [kN*m] = w*L^2/8\ncheck M <= 1 kN*m\n"
BAD = "w = 2 kN/m\nL = 3 m\nM [kN*m] = w*L\n"


def test_check_reports_line_and_column_and_exits_1(sheet, capsys):
    p = sheet(BAD)
    assert main(["check", str(p)]) == 1
    out = capsys.readouterr().out
    assert f"{p}:3:4: error: M is declared [kN*m]" in out and "^" in out


def test_check_clean_sheet_exits_0(sheet, capsys):
    assert main(["check", str(sheet(GOOD))]) == 0


def test_build_writes_three_formats(sheet, tmp_path):
    p = sheet(GOOD)
    out = tmp_path / "out"
    assert main(["build", str(p), "-o", str(out), "--format", "html,pdf,json"]) == 0
    assert {x.name for x in out.iterdir() if not x.name.startswith(".")} == {"s.html", "s.pdf", "s.json"}
    data = json.loads((out / "s.json").read_text())
    assert data["values"]["M"]["value"] == pytest.approx(2 * 9 / 8)


def test_build_with_errors_exits_1_and_writes_nothing(sheet, tmp_path):
    out = tmp_path / "out"
    assert main(["build", str(sheet(BAD)), "-o", str(out), "--format", "html"]) == 1
    assert not out.exists() or not list(out.iterdir())


def test_fail_on_ng_exits_3(sheet, tmp_path):
    p = sheet(NG)
    assert main(["build", str(p), "-o", str(tmp_path / "o"), "--format", "json"]) == 0
    assert main(["build", str(p), "-o", str(tmp_path / "o"), "--format", "json", "--fail-on-ng"]) == 3


def test_set_overrides_an_input(sheet, tmp_path):
    out = tmp_path / "o"
    assert main(["build", str(sheet(GOOD)), "-o", str(out), "--format", "json", "--set", "L=4 m"]) == 0
    data = json.loads((out / "s.json").read_text())
    assert data["values"]["M"]["value"] == pytest.approx(2 * 16 / 8)
    assert data["values"]["L"]["overridden_from"]["value"] == 3


@pytest.mark.parametrize("args", [
    ["build", "nosuch.calc"], ["build", "x.calc", "--format", "docx"], ["frobnicate"],
    ["build", "x.calc", "--set", "L"],
])
def test_usage_errors_exit_2(args, sheet):
    sheet(GOOD, "x.calc")
    import os

    cwd = os.getcwd()
    os.chdir(sheet(GOOD, "x.calc").parent)
    try:
        with pytest.raises(SystemExit) as exc:
            raise SystemExit(main(args))
    finally:
        os.chdir(cwd)
    assert exc.value.code == 2


def test_set_unknown_name_is_an_error(sheet, tmp_path, capsys):
    assert main(["build", str(sheet(GOOD)), "-o", str(tmp_path / "o"), "--set", "Q=1 m"]) == 1
    assert "defines no 'Q'" in capsys.readouterr().err


def test_progress_line_per_sheet(sheet, tmp_path, capsys):
    a, b = sheet(GOOD, "a.calc"), sheet(GOOD, "b.calc")
    main(["build", str(a), str(b), "-o", str(tmp_path / "o"), "--format", "json"])
    err = capsys.readouterr().err
    assert "[1/2]" in err and "[2/2]" in err


def test_plugins_lists_section_rectangle_with_dimensions(capsys):
    assert main(["plugins"]) == 0
    out = capsys.readouterr().out
    assert "section.rectangle" in out
    block = out.split("section.rectangle", 1)[1].split("\n  section.", 1)[0]
    assert "length" in block


def test_module_entry_and_check_does_not_import_weasyprint(sheet):
    p = sheet(GOOD)
    code = ("import sys; from calcsheet.cli import main; rc = main(['check', %r]); "
            "print('weasyprint' in sys.modules); sys.exit(rc)" % str(p))
    r = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True)
    assert r.returncode == 0 and r.stdout.strip().endswith("False")
    r = subprocess.run([sys.executable, "-m", "calcsheet", "check", str(p)], capture_output=True, text=True)
    assert r.returncode == 0


def test_plugins_into_a_closed_pipe_ends_quietly():
    import subprocess

    proc = subprocess.run(f"{sys.executable} -m calcsheet plugins | head -n 1", shell=True,
                          capture_output=True, text=True)
    assert proc.stdout.strip() and proc.stderr == ""
