"""Every CLI command over a corpus of bad files -- one of each class issue 16 found -- answers with a
located message and an exit status: never a Python traceback, never an internal error."""
from __future__ import annotations

import html
import json
import re

import pytest

from .harness import LOCATED, run_cli, unlocated_lines

GOOD = "w = 2 kN/m\nL = 3 m\nM [kN*m] = w*L^2/8\ncheck M <= 5 kN*m\n"

# name: (bytes of the main sheet, {other file: bytes}, the line:col the message must name)
SHEETS = {
    "latin1": (b"w = 2 kN/m\n// f\xe6rdig\n", {}, "2:5"),
    "nul-in-sheet": (b"w = 2 kN/m\nL = 3\x00 m\n", {}, "2:6"),
    "nul-in-include-path": (b'w = 2 kN/m\ninclude "a\x00b.calc"\n', {}, "2:11"),
    "latin1-include": (b'include "loads.calc"\nx = q\n', {"loads.calc": b"q = 2 kN/m \xff\n"}, "1:1"),
    "ceil-overflow": (b"x = ceil(1e999)\ncheck x <= 1\n", {}, "1:10"),
    "floor-overflow": (b"x = floor(-1e999)\ncheck x <= 1\n", {}, "1:12"),
    "underflow": (b"x = 1e-999 m\ncheck x <= 1 m\n", {}, "1:5"),
    "inf-check": (b"check 1e999 <= 1e999\n", {}, "1:7"),
    "inf-capacity": (b"x = 2 m\ncheck x <= 1e999 m\n", {}, "2:12"),
    "inf-in-max": (b"x = 2\ncheck max(x, 1e999) <= 3\n", {}, "2:14"),
    "overflow-intermediate": (b"a = 1e300\nb = a * a\ncheck b <= 1\n", {}, "2:5"),
    "hashes": (b"#\n" * 900_000, {}, "1:1"),
    "deep-parens": (b"x = " + b"(" * 5000 + b"1" + b")" * 5000 + b"\n", {}, "1:1"),
    "long-sum": (b"x = " + b" + ".join([b"1"] * 6000) + b"\n", {}, "1:1"),
    "unclosed": (b"x = (1 + 2\n# Heading\ny = 3\n", {}, "1:"),
    "front-matter": (b"---\ntitle: t\nnot a key line\n", {}, "3:1"),
    "too-large": (b"x = 1 m\n" * 300_000, {}, "1:1"),
}


@pytest.fixture
def corpus(tmp_path):
    def make(name):
        main, others, where = SHEETS[name]
        for fname, data in others.items():
            (tmp_path / fname).write_bytes(data)
        p = tmp_path / "bad.calc"
        p.write_bytes(main)
        good = tmp_path / "good.calc"
        good.write_text(GOOD)
        return p, good, where
    return make


def assert_located(outcome, path, where):
    assert outcome.kind in ("located", "clean") and outcome.kind != "clean", str(outcome)
    assert not unlocated_lines(outcome.text)
    assert f"{path}:{where}" in outcome.text, str(outcome)


COMMANDS = {
    "check": lambda p, g, out: ["check", p],
    "check-line": lambda p, g, out: ["check", p, "--format", "line"],
    "build-json": lambda p, g, out: ["build", p, "-o", out, "--format", "json"],
    "build-html": lambda p, g, out: ["build", p, "-o", out, "--format", "html"],
    "build-set": lambda p, g, out: ["build", p, "-o", out, "--format", "json", "--set", "w=3 kN/m"],
    "build-since": lambda p, g, out: ["build", g, "-o", out, "--format", "json", "--since", p],
    "diff-old": lambda p, g, out: ["diff", p, g],
    "diff-new": lambda p, g, out: ["diff", g, p, "--format", "json"],
}


@pytest.mark.parametrize("command", list(COMMANDS))
@pytest.mark.parametrize("name", list(SHEETS))
def test_every_command_locates_every_bad_sheet(corpus, tmp_path, monkeypatch, name, command):
    if name == "too-large":
        monkeypatch.setenv("CALCSHEET_LIMIT_SHEET_BYTES", "1000000")
    p, good, where = corpus(name)
    outcome = run_cli(COMMANDS[command](p, good, tmp_path / "out"))
    if name == "overflow-intermediate" and command.startswith("check"):
        assert outcome.kind == "clean"  # `check` does not evaluate: the overflow is found by build, below
        return
    if command == "diff-old" or command == "diff-new" or command == "build-since":
        # a sheet that reads but has errors is a side with errors (noted); one that cannot be read is refused
        assert outcome.kind in ("located", "clean"), str(outcome)
        assert not unlocated_lines(outcome.text)
        return
    assert_located(outcome, p, where)
    assert not list((tmp_path / "out").glob("bad.*")) if (tmp_path / "out").exists() else True


@pytest.mark.parametrize("name", list(SHEETS))
def test_the_live_preview_shows_every_bad_sheet_located(corpus, tmp_path, monkeypatch, name):
    from calcsheet.watch import Preview

    if name == "too-large":
        monkeypatch.setenv("CALCSHEET_LIMIT_SHEET_BYTES", "1000000")
    p, good, where = corpus(name)
    preview = Preview(p, tmp_path / "out")
    preview.build()
    page = html.unescape(preview.page.decode("utf-8"))
    assert "Traceback" not in page and re.search(rf"{re.escape(str(p))}:{where}", page), page[-2000:]


SAVED = {
    "meta-not-a-table": json.dumps({"values": {}, "meta": 5}),
    "fields-not-a-table": json.dumps({"values": {"b": {"record": "x", "fields": "no"}}}),
    "checks-not-a-list": json.dumps({"values": {}, "checks": 1}),
    "deep": "[" * 200_000 + "]" * 200_000,
    "huge-integer": '{"values": {"a": {"value": ' + "9" * 5000 + "}}}",
    "nan": '{"values": {"a": {"value": NaN}}}',
    "not-json": "{values: 1}",
    "latin1": b'{"values": {}, "meta": {"t": "\xe6"}}',
    "empty": "",
}


@pytest.mark.parametrize("side", ["old", "new"])
@pytest.mark.parametrize("name", list(SAVED))
def test_diff_and_since_locate_every_bad_saved_result(tmp_path, name, side):
    bad = tmp_path / "bad.json"
    data = SAVED[name]
    bad.write_bytes(data if isinstance(data, bytes) else data.encode())
    good = tmp_path / "good.calc"
    good.write_text(GOOD)
    argv = ["diff", bad, good] if side == "old" else ["build", good, "-o", tmp_path / "out", "--since", bad]
    outcome = run_cli(argv)
    assert outcome.kind == "located" and outcome.status == 2, str(outcome)
    assert re.search(rf"{re.escape(str(bad))}:\d+:\d+: ", outcome.text), outcome.text


SET_FILES = {
    "deep": "a = " + "[" * 2000 + "]" * 2000 + "\n",
    "invalid": "a = = 1\n",
    "latin1": b'a = "\xe6"\n',
    "table": "[a]\nb = 1\n",
    "empty-value": 'a = ""\n',
}


@pytest.mark.parametrize("command", ["build", "watch"])
@pytest.mark.parametrize("name", list(SET_FILES) + ["dev-zero"])
def test_every_command_locates_every_bad_set_file(tmp_path, name, command):
    good = tmp_path / "good.calc"
    good.write_text(GOOD)
    if name == "dev-zero":
        t = "/dev/zero"
    else:
        t = tmp_path / "o.toml"
        data = SET_FILES[name]
        t.write_bytes(data if isinstance(data, bytes) else data.encode())
    argv = [command, good, "--set-file", t, "-o", tmp_path / "out"] + (["--port", "0"] if command == "watch" else [])
    outcome = run_cli(argv)
    assert outcome.kind == "located" and outcome.status == 2, str(outcome)
    assert LOCATED.match(outcome.text.splitlines()[0]) and str(t) in outcome.text
