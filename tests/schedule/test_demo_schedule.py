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
        L, s, q_k, f_m, l_b = _q(row["L"]), _q(row["s"]), _q(row["q_k"]), _q(row["f_m"]), _q(row["l_b"])
        w = 1.35 * 0.55 * s + 1.5 * q_k * s  # kN/m, factored as the sheet states
        M = w * L ** 2 / 8  # kN·m, simply supported (common practice)
        sigma = M * 1e6 / (75 * 250 ** 2 / 6)  # MPa, elastic modulus bh²/6 of a 75×250 rectangle (common practice)
        V = w * L / 2
        bearing = V * 1e3 / (75 * l_b)  # MPa over the bearing area
        assert rec["utilisation"]["check-1"] == pytest.approx(sigma / (0.8 * f_m / 1.3), rel=1e-9)
        assert rec["utilisation"]["check-4"] == pytest.approx(bearing / (0.8 * 2.2 / 1.3), rel=1e-9)
        assert f'>{row["member"]}</a>' in html
    assert {r["status"] for r in data["members"]} == {"OK", "NG"}  # the demo shows both
