"""Every input path is read with a size cap, decoded strictly and checked by shape: a bad input is a
located message and an exit status, never a Python traceback (issue 16, part 1)."""
from __future__ import annotations

import json
import re

import pytest

from calcsheet import reading
from calcsheet.cli import EXIT_ERRORS, EXIT_INTERNAL, EXIT_USAGE, main

LOCATED = re.compile(r"(?m)^(calcsheet: error: )?\S+:\d+:\d+: ")


def cli(capsys, *argv):
    status = main([str(a) for a in argv])
    out, err = capsys.readouterr()
    text = out + err
    assert "Traceback" not in text and status != EXIT_INTERNAL, text
    return status, text


def located(text: str, path) -> bool:
    return any(m for m in LOCATED.finditer(text) if str(path) in text[m.start():m.end() + len(str(path)) + 40])


# ---------------------------------------------------------------- sheets and includes that are not UTF-8

LATIN1 = "x = 2 m\n// f\xe6rdig\ny = 3 m\n".encode("latin-1")


@pytest.mark.parametrize("command", ["check", "build", "diff"])
def test_a_main_sheet_that_is_not_utf8_is_a_located_error(command, tmp_path, capsys):
    p = tmp_path / "s.calc"
    p.write_bytes(LATIN1)
    argv = {"check": ["check", p], "build": ["build", p, "-o", tmp_path / "out", "--format", "json"],
            "diff": ["diff", p, p]}[command]
    status, text = cli(capsys, *argv)
    assert status in (EXIT_ERRORS, EXIT_USAGE)
    assert f"{p}:2:5:" in text and "not UTF-8" in text and "0xe6" in text
    assert not (tmp_path / "out").exists() or not list((tmp_path / "out").glob("s.*"))


def test_an_included_file_that_is_not_utf8_is_an_include_error_at_the_include_line(tmp_path, capsys):
    (tmp_path / "loads.calc").write_bytes(b"q = 2 kN/m\nw = \xff\n")
    p = tmp_path / "s.calc"
    p.write_text('x = 1 m\ninclude "loads.calc"\n')
    status, text = cli(capsys, "check", p)
    assert status == EXIT_ERRORS
    assert f"{p}:2:1:" in text and "'loads.calc' is not UTF-8" in text and "line 2, column 5" in text


def test_a_nul_byte_in_an_include_path_is_refused_where_it_is_written(run):
    r = run('x = 1 m\ninclude "a\x00b.calc"\n', path="<sheet>")
    assert [d.code for d in r.errors] == ["input"] and (r.errors[0].span.line, r.errors[0].span.col) == (2, 11)


def test_a_nul_in_an_include_target_is_refused_by_the_include_rule(tmp_path):
    from calcsheet.errors import Span
    from calcsheet.parser.includes import IncludeState, include

    state = IncludeState.for_sheet(str(tmp_path / "s.calc"))
    state.root = tmp_path
    stmts, diags = include("a\x00b.calc", Span(2, 1, 2, 20), str(tmp_path / "s.calc"), state, None)
    assert stmts == [] and diags[0].code == "include" and "NUL" in diags[0].message


def test_a_sheet_over_the_size_cap_says_which_cap_and_how_to_raise_it(tmp_path, capsys, monkeypatch):
    monkeypatch.setenv("CALCSHEET_LIMIT_SHEET_BYTES", "1000")
    p = tmp_path / "s.calc"
    p.write_text("x = 1 m\n" * 200)
    status, text = cli(capsys, "check", p)
    assert status == EXIT_ERRORS and f"{p}:1:1:" in text
    assert "CALCSHEET_LIMIT_SHEET_BYTES" in text and "docs/limits.md" in text


def test_the_utf8_position_counts_characters_not_bytes():
    assert reading.position("αβ\nγδx".encode(), len("αβ\nγδ".encode())) == (2, 3)


# ---------------------------------------------------------------- numbers that cannot be finite


@pytest.mark.parametrize("expr", ["ceil(1e999)", "floor(-1e999)"])
def test_ceil_and_floor_of_an_overflowing_literal_are_located_errors(expr, sheet, capsys):
    p = sheet(f"x = {expr}\ncheck x <= 5\n")
    status, text = cli(capsys, "check", p)
    assert status == EXIT_ERRORS and f"{p}:1:" in text and "too large" in text


@pytest.mark.parametrize("value", ["1e999", "-1e999"])
def test_ceil_through_set_is_a_located_override_error(value, sheet, tmp_path, capsys):
    p = sheet("x = 2\ny = ceil(x)\ncheck y <= 5\n")
    status, text = cli(capsys, "build", p, "-o", tmp_path / "out", "--format", "json", "--set", f"x={value}")
    assert status == EXIT_ERRORS and f"{p}:1:1:" in text and "too large" in text


def test_ceil_of_an_infinite_argument_is_never_an_overflow_error():
    import calcsheet

    r = calcsheet.run("a = 1e300\nb = a * 1e300\nc = ceil(b)\n")
    assert [d.code for d in r.errors] == ["not-finite"] and r.errors[0].span.line == 2


# ---------------------------------------------------------------- --set-file


def test_a_set_file_nested_2000_deep_is_a_located_error(sheet, tmp_path, capsys):
    p = sheet("x = 1\n")
    t = tmp_path / "o.toml"
    t.write_text("x = " + "[" * 2000 + "]" * 2000 + "\n")
    status, text = cli(capsys, "build", p, "--set-file", t, "-o", tmp_path / "out")
    assert status == EXIT_USAGE and f"{t}:1:1:" in text and "nested too deeply" in text


def test_a_set_file_of_dev_zero_reads_only_up_to_the_cap(sheet, tmp_path, capsys):
    p = sheet("x = 1\n")
    status, text = cli(capsys, "build", p, "--set-file", "/dev/zero", "-o", tmp_path / "out")
    assert status == EXIT_USAGE and "/dev/zero:1:1:" in text and "CALCSHEET_LIMIT_SET_FILE_BYTES" in text


def test_invalid_toml_names_its_line_and_column(sheet, tmp_path, capsys):
    p = sheet("x = 1\n")
    t = tmp_path / "o.toml"
    t.write_text('x = "2"\ny = = 3\n')
    status, text = cli(capsys, "build", p, "--set-file", t, "-o", tmp_path / "out")
    assert status == EXIT_USAGE and f"{t}:2:5:" in text


def test_a_set_file_that_is_not_utf8_is_located(sheet, tmp_path, capsys):
    p = sheet("x = 1\n")
    t = tmp_path / "o.toml"
    t.write_bytes(b'x = "2"\ny = "\xe6"\n')
    status, text = cli(capsys, "build", p, "--set-file", t, "-o", tmp_path / "out")
    assert status == EXIT_USAGE and f"{t}:2:6:" in text and "not UTF-8" in text


def test_a_wrong_typed_set_file_value_names_its_line(sheet, tmp_path, capsys):
    p = sheet("x = 1\n")
    t = tmp_path / "o.toml"
    t.write_text('y = "2"\nx = {a = 1}\n')
    status, text = cli(capsys, "build", p, "--set-file", t, "-o", tmp_path / "out")
    assert status == EXIT_USAGE and f"{t}:2:1:" in text and "must be a quantity" in text


# ---------------------------------------------------------------- --since and paths no system accepts


def test_a_100000_character_since_is_a_usage_error(sheet, tmp_path, capsys):
    p = sheet("x = 1\n")
    status, text = cli(capsys, "build", p, "--since", "x" * 100_000, "-o", tmp_path / "out")
    assert status == EXIT_USAGE and "at most 4096" in text and len(text) < 2_000


@pytest.mark.parametrize("command", ["check", "build", "watch"])
def test_a_sheet_path_too_long_for_the_system_is_no_such_sheet(command, capsys):
    status, text = cli(capsys, command, "y" * 100_000 + ".calc")
    assert status == EXIT_USAGE and "no such sheet" in text and len(text) < 2_000


def test_a_diff_side_too_long_for_the_system_is_a_usage_error(capsys):
    status, text = cli(capsys, "diff", "z" * 100_000, "HEAD:s.calc")
    assert status == EXIT_USAGE and "at most 4096" in text


# ---------------------------------------------------------------- saved JSON results


def saved(tmp_path, data, name="old.json") -> str:
    p = tmp_path / name
    p.write_text(data if isinstance(data, str) else json.dumps(data))
    return str(p)


GOOD_JSON = {"meta": {"title": "t"}, "values": {"a": {"value": 1.0, "unit": "m", "line": 1}}, "checks": []}


@pytest.mark.parametrize("bad, says", [
    ({"values": {}, "meta": 5}, "'meta' must be a table"),
    ({"values": {}, "meta": {"title": {"x": 1}}}, "meta 'title' must be text"),
    ({"values": {"b": {"record": "x", "fields": [1, 2]}}}, "'fields' must be a table"),
    ({"values": {"b": {"value": 1.0, "line": "ten"}}}, "line must be a line number"),
    ({"values": {}, "checks": {"a": 1}}, "'checks' must be a list"),
    ({"values": {}, "checks": [{"ratio": "high"}]}, "'ratio' must be a finite number"),
    ("[" * 100_000 + "]" * 100_000, "nested too deeply"),
    ('{"values": {"a": {"value": ' + "9" * 5000 + "}}}", "5,000 digits"),
    ('{"values": {"a": {"value": NaN}}}', "NaN is not a JSON number"),
    ('{"values": {"a": {"value": Infinity}}}', "Infinity is not a JSON number"),
    ('{"values": {"a": {"value": 1e999}}}', "not finite"),
])
def test_a_malformed_saved_result_is_a_located_diff_error(bad, says, tmp_path, capsys):
    old = saved(tmp_path, bad)
    new = saved(tmp_path, GOOD_JSON, "new.json")
    status, text = cli(capsys, "diff", old, new)
    assert status == EXIT_USAGE and f"{old}:1:1:" in text and says in text


def test_invalid_json_syntax_names_line_and_column(tmp_path, capsys):
    old = saved(tmp_path, '{"values": {}\n  "checks": []}')
    status, text = cli(capsys, "diff", old, saved(tmp_path, GOOD_JSON, "new.json"))
    assert status == EXIT_USAGE and f"{old}:2:3:" in text


def test_a_saved_result_that_is_not_utf8_is_located(tmp_path, capsys):
    p = tmp_path / "old.json"
    p.write_bytes(b'{"values": {}, "meta": {"title": "\xe6"}}')
    status, text = cli(capsys, "diff", p, saved(tmp_path, GOOD_JSON, "new.json"))
    assert status == EXIT_USAGE and f"{p}:1:35:" in text


def test_a_saved_result_over_the_cap_is_refused_unread(tmp_path, capsys, monkeypatch):
    monkeypatch.setenv("CALCSHEET_LIMIT_JSON_BYTES", "100")
    old = saved(tmp_path, {**GOOD_JSON, "pad": "x" * 200})
    status, text = cli(capsys, "diff", old, saved(tmp_path, GOOD_JSON, "new.json"))
    assert status == EXIT_USAGE and "CALCSHEET_LIMIT_JSON_BYTES" in text


# ---------------------------------------------------------------- the last line of defence


def test_an_internal_error_is_reported_as_one_with_exit_status_4(sheet, capsys, monkeypatch):
    import calcsheet.engine

    def broken(*a, **k):
        raise KeyError("planted bug")

    monkeypatch.setattr(calcsheet.engine, "run", broken)
    monkeypatch.delenv("CALCSHEET_DEBUG", raising=False)
    status = main(["check", str(sheet("x = 1\n"))])
    err = capsys.readouterr().err
    assert status == EXIT_INTERNAL == 4
    assert "internal error: KeyError" in err and "please report it" in err.lower() and "Traceback" not in err


def test_readme_lists_exit_status_4():
    from pathlib import Path

    readme = (Path(__file__).parents[1] / "README.md").read_text(encoding="utf-8")
    assert re.search(r"\b4\b.*internal error", readme)
