"""The schedule and sweep charts: no label is cut by the edge of its drawing, none covers another, and the
members table names checks briefly (its legend gives them in full), so no column wraps word by word."""
import re
import xml.etree.ElementTree as ET

import pytest

from calcsheet.cli import main
from calcsheet.render import schedule as RS

SVG = "{http://www.w3.org/2000/svg}"


def _em(ch: str) -> float:
    """Width of a character as a share of the font size, from above: the widest glyph of its class in DejaVu
    Sans, the charts' font (from memory: m and W about 0.97, capitals up to 0.79, digits 0.64, lower case
    up to 0.63, a space 0.32), written here independently of the renderer's own estimate."""
    if ch in "mwMW%…—≥≤×":
        return 0.98
    if ch == " ":
        return 0.32
    if ch.isupper():
        return 0.79
    if ch.isdigit():
        return 0.64
    return 0.64 if ch.isascii() else 0.84


def text_boxes(svg_text: str):
    """(text, (x0, y0, x1, y1)) of every <text>, and the viewBox (width, height)."""
    root = ET.fromstring(svg_text)
    _, _, vw, vh = (float(v) for v in root.get("viewBox").split())
    out = []
    for t in root.iter(f"{SVG}text"):
        content = "".join(t.itertext())
        size = float(t.get("font-size"))
        w = sum(_em(c) for c in content) * size
        x, y = float(t.get("x")), float(t.get("y"))
        anchor = t.get("text-anchor", "start")
        x0 = {"start": x, "middle": x - w / 2, "end": x - w}[anchor]
        out.append((content, (x0, y - 0.8 * size, x0 + w, y + 0.25 * size)))
    return out, (vw, vh)


def assert_inside_and_apart(svg_text: str):
    boxes, (vw, vh) = text_boxes(svg_text)
    assert boxes
    for content, (x0, y0, x1, y1) in boxes:
        assert 0 <= x0 and x1 <= vw and 0 <= y0 and y1 <= vh, (content, (x0, y0, x1, y1), (vw, vh))
    for i, (a, (ax0, ay0, ax1, ay1)) in enumerate(boxes):
        for b, (bx0, by0, bx1, by1) in boxes[i + 1:]:
            apart = ax1 <= bx0 or bx1 <= ax0 or ay1 <= by0 or by1 <= ay0
            assert apart, f"{a!r} and {b!r} overlap"


LONG = [
    "bending with lateral torsional stability, 6.3.3 (6.33)",
    "shear with k_cr, 6.1.7 (6.13)",
    "instantaneous deflection, span/300 (client limit)",
    "final deflection with creep k_def, span/200",
    "bearing across the grain, 6.1.5 (6.3)",
    "WWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWWW",
    "combined axial compression and bending about both axes with the interaction factors of Annex B",
    "web crippling",
]


def _checks(n):
    return RS.with_codes([{"key": f"check-{i + 1}", "label": LONG[i], "text": f"u_{i} <= 1"} for i in range(n)])


@pytest.mark.parametrize("n_checks", [1, 2, 5, 8])
def test_every_label_of_the_member_chart_lies_inside_it(n_checks):
    checks = _checks(n_checks)
    names = ["J-1", "M" * 64, "B-2.a_long-but-valid_member-name", "X"]
    records = []
    for i, m in enumerate(names):
        util = {c["key"]: 0.3 + 0.25 * ((i + k) % 5) for k, c in enumerate(checks)}
        gov = max(util, key=util.get)
        records.append({"member": m, "status": "OK" if util[gov] <= 1 else "NG", "utilisation": util,
                        "governing": gov, "governing_ratio": util[gov]})
    records.append({"member": "E-1", "status": "ERROR", "utilisation": {}, "governing": None,
                    "governing_ratio": None})
    svg = RS.member_chart(records, checks)
    assert_inside_and_apart(svg)
    texts = [t for t, _ in text_boxes(svg)[0]]
    assert "M" * 64 in texts  # member names whole, not cut
    legend = "".join(texts).replace(" ", "")
    for c in checks:  # each check's code and full name are in the legend, wrapped, never shortened
        assert f"{c['code']}{c['label']}".replace(" ", "") in legend


@pytest.mark.parametrize("n_checks", [1, 3, 5, 8])
def test_every_label_of_the_sweep_chart_lies_inside_it(n_checks):
    checks = _checks(n_checks)
    xs = [2.4 + 0.1 * i for i in range(25)]
    series = {c["key"]: [0.2 + (k + 1) * 0.05 * (x - 2) for x in xs] for k, c in enumerate(checks)}
    flips = [{"check": c["key"], "label": c["label"], "to": "NG", "at": (1 - 0.2) / ((k + 1) * 0.05) + 2,
              "between": [0, 0]} for k, c in enumerate(checks) if max(series[c["key"]]) > 1]
    flips.append({"check": checks[0]["key"], "label": "", "to": "NG", "at": xs[-1] - 0.01, "between": [0, 0]})
    svg = RS.sweep_chart("L_between_the_supports", "m", xs, checks, series, flips)
    assert_inside_and_apart(svg)
    legend = "".join(t for t, _ in text_boxes(svg)[0]).replace(" ", "")
    assert all(f"{c['code']}{c['label']}".replace(" ", "") in legend for c in checks)


def test_the_histogram_labels_lie_inside_it():
    assert_inside_and_apart(RS.histogram_chart([0, 3, 40, 1200, 5, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 2],
                                               [0] * 15 + [17], 0.1))


def test_a_label_wider_than_the_legend_is_wrapped_not_cut():
    lines = RS.wrap_text(LONG[6], 150, 8.5)
    assert " ".join(lines) == LONG[6] and len(lines) > 1
    assert all(sum(_em(c) for c in line) * 8.5 <= 150 for line in lines)
    assert "".join(RS.wrap_text(LONG[5], 150, 8.5)) == LONG[5]  # one word longer than a line: broken inside


BEAM = """---
subject: Floor beam
date: 2026-01-05
---
w = 2 kN/m
L = 3 m
M [kN*m] = w*L^2/8
V [kN] = w*L/2
check M <= 5 kN*m   -- bending about the major axis with lateral torsional buckling, clause 6.3.2.1 (6.54)
check V <= 6 kN     -- shear resistance of the web without stiffeners, clause 6.2.6 (6.17)
"""


def test_the_schedule_names_checks_briefly_in_its_table_and_in_full_in_its_legend(tmp_path):
    sheet = tmp_path / "beam.calc"
    sheet.write_text(BEAM)
    table = tmp_path / "m.csv"
    table.write_text("member,L\nB-1,3 m\nB-2,5.5 m\nB-3,2 m\n")
    out = tmp_path / "o"
    assert main(["build", str(sheet), "--schedule", str(table), "-o", str(out), "--format", "html", "-j", "1"]) == 0
    html = (out / "schedule.html").read_text()
    head = html.split('id="members"', 1)[1].split("</thead>", 1)[0]
    assert re.findall(r'<th class="u" data-num="1" title="([^"]*)">(C\d)</th>', head) == [
        ("bending about the major axis with lateral torsional buckling, clause 6.3.2.1 (6.54)", "C1"),
        ("shear resistance of the web without stiffeners, clause 6.2.6 (6.17)", "C2")]
    # governing: M = wL²/8 against 5 kN·m and V = wL/2 against 6 kN with w = 2 kN/m (common practice):
    # bending governs from L = 10/3 m up (wL²/40 ≥ wL/12): shear at 3 m and 2 m, bending at 5.5 m
    assert re.findall(r'<td class="gv" data-v="(C\d)"', html) == ["C2", "C1", "C2"]
    legend = html.split('class="check-legend"', 1)[1].split("</table>", 1)[0]
    assert "<th scope=\"row\">C1</th><td>bending about the major axis" in legend
    assert "M &lt;= 5 kN*m" in legend  # the check as the sheet writes it (escaped)
    for svg in re.findall(r"<svg.*?</svg>", html, re.S):
        assert_inside_and_apart(svg)


def test_the_sweep_package_charts_fit_and_its_table_uses_the_short_names(tmp_path):
    sheet = tmp_path / "beam.calc"
    sheet.write_text(BEAM)
    out = tmp_path / "o"
    assert main(["build", str(sheet), "--sweep", "L=2:6:0.25 m", "-o", str(out), "--format", "html,json"]) == 0
    html = (out / "beam-sweep-L.html").read_text()
    svgs = re.findall(r"<svg.*?</svg>", html, re.S)
    assert len(svgs) == 1
    assert_inside_and_apart(svgs[0])
    assert "<th>C1</th><th>C2</th>" in html and "check-legend" in html
