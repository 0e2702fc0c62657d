"""The demo schedule: at least twelve invented joists over the boardwalk sheet, each with its utilisations."""
import csv
import json
from pathlib import Path

import pytest

from calcsheet.cli import main

ROOT = Path(__file__).resolve().parents[2]
SHEET = ROOT / "sheets" / "boardwalk_joist.calc"
TABLE = ROOT / "sheets" / "schedules" / "boardwalk_joists.csv"


def _q(text):
    return float(text.split()[0])


def test_demo_schedule_shows_each_members_utilisations_against_a_hand_calculation(tmp_path):
    out = tmp_path / "o"
    assert main(["build", str(SHEET), "--schedule", str(TABLE), "-o", str(out), "--format", "html,json",
                 "-j", "1"]) == 0
    rows = list(csv.DictReader(TABLE.open()))
    assert len(rows) >= 12
    data = json.loads((out / "schedule.json").read_text())
    html = (out / "schedule.html").read_text()
    by_member = {r["member"]: r for r in data["members"]}
    for row in rows:
        rec = by_member[row["member"]]
        L = _q(row["L"])
        member = json.loads((out / f"{row['member']}.json").read_text())["values"]
        w = member["w"]["value"]  # kN/m, the member's factored line load
        assert member["M_max"]["value"] == pytest.approx(w * L ** 2 / 8, rel=1e-6)  # simply supported (common practice)
        assert rec["utilisation"] and rec["status"] in ("OK", "NG")
        assert f'>{row["member"]}</a>' in html
