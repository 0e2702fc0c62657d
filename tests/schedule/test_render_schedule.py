"""The schedule package's HTML: the sorter script sorts by the escaped data-v attributes and writes no markup."""
import re
import shutil
import subprocess

import pytest

from calcsheet.cli import main
from calcsheet.render.schedule import SORT_SCRIPT

CHROMIUM = shutil.which("chromium") or shutil.which("chromium-browser")

BEAM = """---
subject: Floor beam
date: 2026-01-05
---
w = 2 kN/m
L = 3 m
M [kN*m] = w*L^2/8
V [kN] = w*L/2
check M <= 5 kN*m   -- bending
check V <= 6 kN     -- shear
"""


def test_the_sorter_only_reads_attributes_and_moves_rows():
    for forbidden in ("innerHTML", "outerHTML", "insertAdjacentHTML", "document.write", "eval(", "Function(",
                      "textContent ="):
        assert forbidden not in SORT_SCRIPT


@pytest.mark.skipif(CHROMIUM is None, reason="chromium is not installed (CI installs it via .ci/system-deps)")
def test_clicking_the_utilisation_heading_sorts_members_most_utilised_first(tmp_path):
    sheet = tmp_path / "beam.calc"
    sheet.write_text(BEAM)
    spans = {"B-1": 3.0, "B-2": 5.0, "B-3": 2.0, "B-4": 4.0}
    table = tmp_path / "m.csv"
    table.write_text("member,L\n" + "".join(f"{m},{L} m\n" for m, L in spans.items()))
    out = tmp_path / "o"
    main(["build", str(sheet), "--schedule", str(table), "-o", str(out), "--format", "html", "-j", "1"])
    html = (out / "schedule.html").read_text()
    heads = re.findall(r"<th[^>]*>([^<]*)</th>", html.split('id="members"', 1)[1].split("</thead>", 1)[0])
    col = heads.index("Utilisation")
    click = f"<script>document.querySelectorAll('#members thead th')[{col}].click();</script></body>"
    page = tmp_path / "clicked.html"
    page.write_text(html.replace("</body>", click))
    dom = subprocess.run([CHROMIUM, "--headless", "--no-sandbox", "--disable-gpu", f"--user-data-dir={tmp_path / 'p'}",
                          "--dump-dom", page.as_uri()], capture_output=True, text=True, timeout=120).stdout
    body = dom.split('id="members"', 1)[1].split("</tbody>", 1)[0]
    order = re.findall(r'<tr class="\w+" data-i="\d+"><td data-v="\d+">\d+</td><td data-v="([^"]+)"', body)
    # governing utilisation: max(wL²/8 / 5, wL/2 / 6) with w = 2 kN/m (common practice)
    expected = sorted(spans, key=lambda m: -max(2 * spans[m] ** 2 / 8 / 5, 2 * spans[m] / 2 / 6))
    assert order == expected
    assert 'aria-sort="descending"' in dom


def test_the_title_blocks_file_name_wraps_after_an_underscore_not_inside_a_word_and_stays_escaped():
    from calcsheet.render.schedule import page_start
    h = str(page_start({}, "t", "boardwalk_joist<x>.calc", None, ""))
    assert "boardwalk_<wbr>joist&lt;x&gt;.calc" in h
