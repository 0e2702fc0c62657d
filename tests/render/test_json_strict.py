"""Strict JSON everywhere: the JSON result and ``diff --format json`` never contain NaN or Infinity
(RFC 8259 section 6: "Numeric values that cannot be represented ... such as Infinity and NaN are not
permitted"), and the one writer refuses them (issue 16, part 3)."""
from __future__ import annotations

import json

import pytest

import calcsheet
from calcsheet.cli import main
from calcsheet.render import diff as diff_printers
from calcsheet.render.json import JsonPrinter, dumps


def strict_loads(text: str):
    def refuse(name):
        raise AssertionError(f"non-standard JSON constant {name}")

    return json.loads(text, parse_constant=refuse)


SHEET = ("w = 2 kN/m\nL = 3 m\nM [kN*m] = w*L^2/8\ncheck M <= 5 kN*m\n"
         "check M <= 0 kN*m\nr = M / (1 kN*m)\n")


def test_the_one_writer_refuses_nan_and_infinity():
    for bad in (float("nan"), float("inf"), -float("inf")):
        with pytest.raises(ValueError):
            dumps({"ratio": bad})
    assert strict_loads(dumps({"ratio": None, "v": 1.5})) == {"ratio": None, "v": 1.5}


def test_the_diff_printer_writes_through_the_strict_writer():
    assert diff_printers.dumps is dumps


def test_the_json_result_file_is_strict_json(tmp_path):
    p = tmp_path / "s.calc"
    p.write_text(SHEET)
    assert main(["build", str(p), "-o", str(tmp_path / "out"), "--format", "json"]) == 0
    data = strict_loads((tmp_path / "out" / "s.json").read_text())
    assert [c["ratio"] for c in data["checks"]] == [pytest.approx(2.25 / 5), None]


def test_diff_format_json_is_strict_json(tmp_path, capsys):
    old, new = tmp_path / "a.calc", tmp_path / "b.calc"
    old.write_text(SHEET)
    new.write_text(SHEET.replace("L = 3 m", "L = 4 m"))
    main(["diff", str(old), str(new), "--format", "json"])
    data = strict_loads(capsys.readouterr().out)
    assert data["inputs"][0]["name"] == "L"


def test_check_format_json_is_strict_json(tmp_path, capsys):
    p = tmp_path / "s.calc"
    p.write_text(SHEET)
    main(["check", str(p), "--format", "json"])
    strict_loads(capsys.readouterr().out)


def test_a_non_finite_value_that_slipped_past_evaluation_is_an_internal_error_not_bad_json(tmp_path):
    r = calcsheet.run(SHEET)
    data = JsonPrinter().result(r)
    data["checks"][0]["ratio"] = float("nan")
    with pytest.raises(ValueError):
        dumps(data)
