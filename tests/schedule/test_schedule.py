"""build SHEET --schedule TABLE: one package per member, a schedule package, located row errors."""
import json
import math

import pytest

from calcsheet.cli import main
from calcsheet.schedule.table import member_name_problem

MEMBERS = """\
member,L,w
B-1,3 m,2 kN/m
B-2,5 m,2 kN/m
B-3,4 m,1.5 kN/m
"""


def _strict(text):
    def refuse(c):
        raise ValueError(f"not strict JSON: {c}")
    return json.loads(text, parse_constant=refuse)


def test_each_member_gets_a_package_and_a_line_with_its_utilisations(beam, table, tmp_path):
    out = tmp_path / "out"
    assert main(["build", str(beam), "--schedule", str(table(MEMBERS)), "-o", str(out),
                 "--format", "html,json", "-j", "1"]) == 0
    for m in ("B-1", "B-2", "B-3"):
        assert (out / f"{m}.html").is_file() and (out / f"{m}.json").is_file()
    data = _strict((out / "schedule.json").read_text())
    rows = {r["member"]: r for r in data["members"]}
    assert [r["member"] for r in data["members"]] == ["B-1", "B-2", "B-3"]
    for m, L, w in (("B-1", 3, 2), ("B-2", 5, 2), ("B-3", 4, 1.5)):
        bending = (w * L ** 2 / 8) / 5  # M = wL^2/8 against 5 kN·m (common practice)
        shear = (w * L / 2) / 6  # V = wL/2 against 6 kN (common practice)
        u = rows[m]["utilisation"]
        assert u["check-1"] == pytest.approx(bending) and u["check-2"] == pytest.approx(shear)
        governing = "check-1" if bending >= shear else "check-2"
        assert rows[m]["governing"] == governing
        assert rows[m]["governing_ratio"] == pytest.approx(max(bending, shear))
        assert rows[m]["status"] == ("OK" if max(bending, shear) <= 1 else "NG")
    assert rows["B-2"]["status"] == "NG" and rows["B-2"]["ng"] == ["check-1"]
    assert data["totals"] == {"members": 3, "ok": 2, "ng": 1, "errors": 0}
    # the member's own package ran with the row's values
    b2 = json.loads((out / "B-2.json").read_text())
    assert b2["values"]["M"]["value"] == pytest.approx(2 * 25 / 8)
    assert b2["values"]["L"]["overridden_from"]["value"] == 3
    assert "member B-2" in b2["meta"]["subject"]
    csv_lines = (out / "schedule.csv").read_text().splitlines()
    assert csv_lines[0].startswith("row,member,L,w,utilisation: bending,utilisation: shear")
    assert csv_lines[2].split(",")[-2:] == ["NG", ""]
    html = (out / "schedule.html").read_text()
    assert html.count('<tr class="') >= 3 and "<svg" in html and 'id="members"' in html
    assert '<a href="B-2.html">B-2</a>' in html


def test_a_bad_value_is_located_by_file_row_and_column_and_the_other_rows_still_build(beam, table, tmp_path, capsys):
    t = table("member,L,w\nB-1,3 m,2 kN/m\nB-2,4 kN,2 kN/m\nB-3,2 m,\nB-4,3 m,2 kN/m +\n")
    out = tmp_path / "out"
    assert main(["build", str(beam), "--schedule", str(t), "-o", str(out), "--format", "json", "-j", "1"]) == 1
    err = capsys.readouterr().err
    assert f"{t}:3:2: error: row 2 (B-2), column 'L': the sheet's L is length, the override is force" in err
    assert f"{t}:5:3: error: row 4 (B-4), column 'w'" in err
    assert (out / "B-1.json").is_file() and (out / "B-3.json").is_file()
    assert not (out / "B-2.json").exists() and not (out / "B-4.json").exists()
    data = json.loads((out / "schedule.json").read_text())
    assert [r["status"] for r in data["members"]] == ["OK", "ERROR", "OK", "ERROR"]
    # an empty cell keeps the sheet's value: B-3 uses w = 2 kN/m from the sheet
    assert data["members"][2]["utilisation"]["check-1"] == pytest.approx(2 * 4 / 8 / 5)


@pytest.mark.parametrize("name", ["../x", "a/b", "", ".hidden", "CON", "x" * 65, "schedule", "a b", "tail."])
def test_unsafe_member_names_are_refused(name):
    assert member_name_problem(name)


@pytest.mark.parametrize("name", ["B-1", "J_02", "GL3.2", "b7"])
def test_ordinary_member_names_are_safe(name):
    assert member_name_problem(name) is None


def test_a_repeated_member_is_an_error_on_its_row(beam, table, tmp_path, capsys):
    t = table("member,L\nB-1,3 m\nb-1,4 m\n")
    assert main(["build", str(beam), "--schedule", str(t), "-o", str(tmp_path / "o"), "--format", "json",
                 "-j", "1"]) == 1
    assert f"{t}:3:1: error: row 2, column 'member': member 'b-1' repeats the member on {t}:2" in \
        capsys.readouterr().err


@pytest.mark.parametrize("header,where,message", [
    ("member,Lx", ":1:2", "column 'Lx' names no input of the sheet (did you mean 'L'?)"),
    ("member,M", ":1:2", "column 'M' is calculated by the sheet, not an input"),
    ("L,w", ":1", "the schedule needs a 'member' column"),
    ("member,L,L", ":1:3", "column 'L' appears twice"),
])
def test_a_bad_header_builds_nothing(beam, table, tmp_path, capsys, header, where, message):
    t = table(header + "\nB-1,3 m,1\n")
    out = tmp_path / "o"
    assert main(["build", str(beam), "--schedule", str(t), "-o", str(out), "--format", "json", "-j", "1"]) == 1
    assert f"{t}{where}: error: {message}" in capsys.readouterr().err
    assert not out.exists() or not list(out.iterdir())


def test_toml_schedule_locates_its_values(beam, table, tmp_path, capsys):
    t = table('[[members]]\nmember = "B-1"\nL = "3 m"\n\n[[members]]\nmember = "B-2"\n  L = "3 kN"\n',
              name="members.toml")
    out = tmp_path / "o"
    assert main(["build", str(beam), "--schedule", str(t), "-o", str(out), "--format", "json", "-j", "1"]) == 1
    assert f"{t}:7:3: error: row 2 (B-2), column 'L'" in capsys.readouterr().err
    assert (out / "B-1.json").is_file()


def test_schedule_text_is_escaped_in_the_html(beam, table, tmp_path):
    t = table('member,L\nB-1,"<script>alert(1)</script>"\nB-2,3 m\n')
    out = tmp_path / "o"
    assert main(["build", str(beam), "--schedule", str(t), "-o", str(out), "--format", "html", "-j", "1"]) == 1
    html = (out / "schedule.html").read_text()
    assert "<script>alert(1)" not in html and "&lt;script&gt;alert(1)" in html
    assert html.count("<script>") == 1  # the fixed sorter only


def test_ratios_that_cannot_be_formed_stay_strict_json(tmp_path, table):
    sheet = tmp_path / "zero.calc"
    sheet.write_text("a = 1 kN\nb = 0 kN\ncheck a <= b -- impossible\n", encoding="utf-8")
    t = table("member,a\nZ-1,1 kN\n")
    out = tmp_path / "o"
    main(["build", str(sheet), "--schedule", str(t), "-o", str(out), "--format", "json", "-j", "1"])
    data = _strict((out / "schedule.json").read_text())
    u = data["members"][0]["utilisation"]["check-1"]
    assert u is None or math.isfinite(u)
    assert data["members"][0]["status"] == "NG"


def test_set_applies_to_every_row_and_a_row_value_wins(beam, table, tmp_path):
    t = table("member,L\nB-1,3 m\nB-2,\n")
    out = tmp_path / "o"
    assert main(["build", str(beam), "--schedule", str(t), "-o", str(out), "--format", "json", "-j", "1",
                 "--set", "L=4 m", "--set", "w=1 kN/m"]) == 0
    rows = json.loads((out / "schedule.json").read_text())["members"]
    assert rows[0]["utilisation"]["check-1"] == pytest.approx(1 * 9 / 8 / 5)
    assert rows[1]["utilisation"]["check-1"] == pytest.approx(1 * 16 / 8 / 5)


def test_a_sheet_with_errors_builds_no_member(tmp_path, table, capsys):
    sheet = tmp_path / "bad.calc"
    sheet.write_text("w = 2 kN/m\nL = 3 m\nM [kN*m] = w*L\n")
    out = tmp_path / "o"
    assert main(["build", str(sheet), "--schedule", str(table("member,L\nB-1,3 m\n")), "-o", str(out),
                 "-j", "1"]) == 1
    err = capsys.readouterr().err
    assert f"{sheet}:3:4: error: M is declared [kN*m]" in err and "no member built" in err
    assert not out.exists()


@pytest.mark.parametrize("extra,code", [
    (["--schedule", "nosuch.csv"], 2), (["--schedule", "m.csv", "--sweep", "L=1:2:1 m"], 2), (["-j", "0"], 2),
    (["--size", "L"], 2),
])
def test_option_mistakes_are_usage_errors(beam, table, tmp_path, extra, code, monkeypatch):
    monkeypatch.chdir(tmp_path)
    table("member,L\nB-1,3 m\n", name="m.csv")
    args = ["build", str(beam), "-o", str(tmp_path / "o"), *extra]
    if "--schedule" not in extra and "--size" not in extra:
        args += ["--schedule", "m.csv"]
    assert main(args) == code


from hypothesis import given, settings, strategies as st  # noqa: E402


@settings(max_examples=200, deadline=None)
@given(st.text(min_size=0, max_size=70))
def test_an_accepted_member_name_always_stays_inside_the_output_folder(name):
    from pathlib import Path

    if member_name_problem(name) is None:
        out = Path("/srv/out")
        for fmt in ("html", "pdf", "json"):
            p = out / f"{name}.{fmt}"
            assert p.parent == out and p.name == f"{name}.{fmt}" and not p.name.startswith(".")
        assert name.strip() == name and "/" not in name and "\\" not in name and ".." not in name.split(".")
