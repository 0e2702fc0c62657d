"""--sweep NAME=START:STOP:STEP: each check's utilisation against one input, and where it turns NG."""
import json
import math

import pytest

from calcsheet.cli import main
from calcsheet.schedule.sweep import parse_sweep
from calcsheet.schedule.table import ScheduleError


def test_range_and_list_forms():
    s = parse_sweep("L=3 m:4 m:0.25 m")
    assert (s.name, s.unit, s.values) == ("L", "m", [3, 3.25, 3.5, 3.75, 4])
    assert parse_sweep("L=3:4:0.5 m").values == [3, 3.5, 4]  # the unit of any value applies to the bare ones
    assert parse_sweep("w=1,2.5,4 kN/m").values == [1, 2.5, 4]
    assert parse_sweep("L=0:0.3:0.1 m").values == [0, 0.1, 0.2, 0.3]  # no 0.30000000000000004
    assert parse_sweep("k=1,2").text(2.0) == "2"


@pytest.mark.parametrize("spec", ["L", "L=", "L=3 m:4 kN:1 m", "L=3:4:0", "L=4:3:1", "L=1:2:3,4", "L=a:b:c",
                                  "L=0:1e9:1"])
def test_bad_sweeps_are_usage_errors(spec):
    with pytest.raises(ScheduleError):
        parse_sweep(spec)


def test_a_sweep_marks_where_each_check_turns_ng(beam, tmp_path, capsys):
    out = tmp_path / "o"
    assert main(["build", str(beam), "--sweep", "L=3:7:0.25 m", "-o", str(out), "--format", "html,json",
                 "-j", "1"]) == 0
    data = json.loads((out / "beam-sweep-L.json").read_text())
    assert [p["value"] for p in data["points"]] == [3 + 0.25 * i for i in range(17)]
    flips = {f["label"]: f for f in data["flips"]}
    # M = wL²/8 = 5 kN·m at L = sqrt(8·5/2) m; V = wL/2 = 6 kN at L = 6 m (common practice)
    assert flips["bending"]["to"] == "NG" and flips["bending"]["between"] == [4.25, 4.5]
    assert flips["bending"]["at"] == pytest.approx(math.sqrt(20), abs=0.01)  # linear between grid points
    assert flips["shear"]["at"] == pytest.approx(6.0) and flips["shear"]["between"] == [6.0, 6.25]
    for p in data["points"]:
        assert p["utilisation"]["check-1"] == pytest.approx(2 * p["value"] ** 2 / 8 / 5)
    html = (out / "beam-sweep-L.html").read_text()
    assert "<svg" in html and "NG at 4.471" in html
    assert "bending becomes NG at L ≈ 4.471 m" in capsys.readouterr().out


def test_sweeping_a_calculated_value_is_refused(beam, tmp_path, capsys):
    assert main(["build", str(beam), "--sweep", "M=1:2:1 kN*m", "-o", str(tmp_path / "o"), "-j", "1"]) == 1
    assert "'M' is not an input of the sheet (it is calculated by the sheet)" in capsys.readouterr().err


def test_a_point_that_fails_is_a_gap_and_the_exit_status_is_1(beam, tmp_path, capsys):
    out = tmp_path / "o"
    assert main(["build", str(beam), "--sweep", "L=1,2,3 kN", "-o", str(out), "--format", "json", "-j", "1"]) == 1
    data = json.loads((out / "beam-sweep-L.json").read_text())
    assert all(p["error"] for p in data["points"]) and data["flips"] == []
