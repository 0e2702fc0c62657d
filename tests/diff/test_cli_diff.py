"""The diff from the command line: `calcsheet diff`, `build --since`, `--set-file`, and the revision history."""
import io
import json
import re
from pathlib import Path

import pytest

import calcsheet
from calcsheet.cli import main
from calcsheet.render.page import PackageDocument

BEAM = (Path(__file__).parent / "joist.calc").read_text(encoding="utf-8")  # a simply supported timber joist


def deeper(text: str, h: str = "250 mm") -> str:
    return text.replace("h = 200 mm", f"h = {h}")


def _write(path: Path, text: str) -> str:
    path.write_text(text, encoding="utf-8")
    return str(path)


def test_cli_diff_prints_text_and_json(tmp_path, capsys):
    a, b = _write(tmp_path / "a.calc", BEAM), _write(tmp_path / "b.calc", deeper(BEAM))
    assert main(["diff", a, b]) == 0
    assert "checks flipped:" in capsys.readouterr().out
    assert main(["diff", a, b, "--format", "json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert [c["name"] for c in data["inputs"]] == ["h"]
    assert data["inputs"][0]["old"]["value"] == 200 and data["inputs"][0]["new"]["value"] == 250
    assert data["checks"]["flipped"][0]["old"]["status"] == "NG"
    assert main(["diff", a, str(tmp_path / "nope.calc")]) == 2


def test_build_since_puts_a_changes_page_first_and_marks_changed_values(repo, monkeypatch, capsys):
    monkeypatch.chdir(repo)
    assert main(["build", "sheets/joist.calc", "--since", "HEAD~1", "-o", "out", "--format", "html"]) == 0
    html = (repo / "out" / "joist.html").read_text(encoding="utf-8")
    changes = html.index("Changes since rev B (HEAD~1:sheets/joist.calc)")
    assert html.index('<section class="calc">') > changes
    assert "sigma &lt;= f" in html[changes:html.index('<section class="calc">')]
    marked = {step.split('id="v-')[1].split('"')[0] for step in re.split(r'<div class="step[ "]', html)
              if 'class="mark changed"' in step and 'id="v-' in step}
    assert marked == {"h", "S", "A", "sigma"}  # h went 200 -> 300 mm in the working file


def test_set_file_overrides_are_marked_and_listed(tmp_path, capsys):
    sheet = _write(tmp_path / "joist.calc", BEAM)
    (tmp_path / "o.toml").write_text('L = "3 m"\nh = "250 mm"\n', encoding="utf-8")
    assert main(["build", sheet, "--set-file", str(tmp_path / "o.toml"), "--set", "h=220 mm",
                 "-o", str(tmp_path / "out"), "--format", "html,json"]) == 0
    err = capsys.readouterr().err
    assert "L set to 3.000 m (sheet: 4.000 m)" in err
    assert "h set to 220.0 mm (sheet: 200.0 mm)" in err  # --set wins over the file
    data = json.loads((tmp_path / "out" / "joist.json").read_text())
    assert data["values"]["L"]["overridden_from"] == {"value": 4.0, "unit": "m"}
    # M = w L^2/8 = 5*9/8 kN*m — common practice
    assert data["values"]["M"]["value"] == pytest.approx(5 * 3**2 / 8)
    html = (tmp_path / "out" / "joist.html").read_text()
    assert html.count("set for this build") >= 4  # two steps and two rows of the inputs list


@pytest.mark.parametrize("content, message", [
    ("L = [1, 2]\n", "L must be a quantity"),
    ("L = \n", "not valid TOML"),
    ("L = true\n", "L must be a quantity"),
])
def test_a_bad_set_file_is_a_usage_error_naming_it(tmp_path, capsys, content, message):
    sheet = _write(tmp_path / "joist.calc", BEAM)
    (tmp_path / "o.toml").write_text(content, encoding="utf-8")
    assert main(["build", sheet, "--set-file", str(tmp_path / "o.toml"), "-o", str(tmp_path)]) == 2
    err = capsys.readouterr().err
    assert "o.toml" in err and message in err


def test_revisions_are_listed_in_the_package_table():
    html = PackageDocument(calcsheet.run(BEAM)).html()
    table = html[html.index("<table class='revisions'>"):]
    table = table[:table.index("</table>")]
    assert table.count("<tr>") == 3  # header and two revisions
    assert "<td>A</td><td>2026-11-02</td><td>R.T.</td><td>First issue</td>" in table
    assert "Joist depth revised | see note 3" in table  # a '|' inside a description is kept


def test_the_current_revision_is_in_every_pdf_page_title_block():
    pypdf = pytest.importorskip("pypdf")
    from calcsheet.package import pdf_bytes

    pdf = pdf_bytes(PackageDocument(calcsheet.run(BEAM)).html())
    pages = [p.extract_text() for p in pypdf.PdfReader(io.BytesIO(pdf)).pages]
    assert len(pages) >= 2
    for text in pages:
        assert "Floor joist J-4" in text
        assert re.search(r"\bREV B\b", text, re.IGNORECASE), text  # the title block row "Rev B"
    assert "First issue" in pages[0] and "Joist depth revised" in pages[0]
