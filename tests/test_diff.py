"""Revision diff: changed inputs and results by name and dependency, flipped checks, git and JSON sides,
the "changes since" page, --set-file overrides, and the revision history in the package."""
import io
import json
import re
import subprocess
import textwrap
from pathlib import Path

import pytest

import calcsheet
from calcsheet.cli import main
from calcsheet.diff import DiffSourceError, diff_results, diff_specs, git_show, load_side
from calcsheet.render.diff import text as to_text
from calcsheet.package import PackageDocument, write_package

# A simply supported timber joist under a uniform load, rectangular section.
BEAM = textwrap.dedent("""\
    ---
    project: Heron Quay Boathouse
    job: 26-418
    subject: Floor joist J-4
    by: R.T.
    rev: B
    revisions:
      - A | 2026-11-02 | R.T. | First issue
      - B | 2026-11-20 | R.T. | Joist depth revised | see note 3
    ---
    # Loads and section
    b = 100 mm        -- joist breadth
    h = 200 mm        -- joist depth
    L = 4 m           -- span
    w = 5 kN/m        -- line load
    M [kN*m] = w*L^2/8
    V [kN] = w*L/2
    S [mm^3] = b*h^2/6
    A [mm^2] = b*h
    sigma [MPa] = M/S
    f = 12 MPa        -- bending strength
    check sigma <= f  -- bending
    check V <= 30 kN  -- shear force
    """)


def deeper(text: str, h: str = "250 mm") -> str:
    return text.replace("h = 200 mm", f"h = {h}")


@pytest.fixture(scope="module")
def depth_change():
    return diff_results(calcsheet.run(BEAM, path="joist.calc"), calcsheet.run(deeper(BEAM), path="joist.calc"))


def test_a_changed_dimension_reports_exactly_its_dependents(depth_change):
    d = depth_change
    assert [c.name for c in d.inputs] == ["h"]
    # b, L, w, M, V and f do not read h: they must not appear
    assert {c.name for c in d.results} == {"S", "A", "sigma"}
    assert not d.added and not d.removed


def test_old_and_new_values_and_percent_change_are_right(depth_change):
    by = {c.name: c for c in depth_change.inputs + depth_change.results}
    # section modulus of a rectangle b*h^2/6 — Roark's Formulas for Stress and Strain, Table A.1
    assert by["S"].old.quantity.m_as("mm^3") == pytest.approx(100 * 200**2 / 6)
    assert by["S"].new.quantity.m_as("mm^3") == pytest.approx(100 * 250**2 / 6)
    assert by["S"].pct == pytest.approx((250**2 / 200**2 - 1) * 100)  # S grows with h^2: +56.25 %
    # M = w L^2 / 8 for a simply supported span under a uniform load — common practice
    m = 5 * 4**2 / 8 * 1e6  # N*mm
    assert by["sigma"].old.quantity.m_as("MPa") == pytest.approx(m / (100 * 200**2 / 6))  # 15 MPa
    assert by["sigma"].new.quantity.m_as("MPa") == pytest.approx(m / (100 * 250**2 / 6))  # 9.6 MPa
    assert by["h"].old.quantity.m_as("mm") == 200 and by["h"].new.quantity.m_as("mm") == 250
    assert by["A"].pct == pytest.approx(25.0)
    assert by["sigma"].caused_by == ["h"]


def test_a_check_that_flips_is_reported_as_flipped(depth_change):
    (flip,) = depth_change.flipped
    assert flip.text == "sigma <= f"
    assert (flip.old.ok, flip.new.ok) == (False, True)  # 15 MPa > 12 MPa, then 9.6 MPa <= 12 MPa
    assert flip.old.ratio == pytest.approx(15 / 12) and flip.new.ratio == pytest.approx(9.6 / 12)
    assert not depth_change.moved  # the shear check does not read h


def test_utilisation_that_moves_without_flipping_is_reported():
    d = diff_results(calcsheet.run(BEAM), calcsheet.run(BEAM.replace("w = 5 kN/m", "w = 6 kN/m")))
    moved = {c.text: c for c in d.moved}
    # V = w L / 2 — common practice: 10 kN of 30 kN, then 12 kN of 30 kN
    assert moved["V <= 30 kN"].old.ratio == pytest.approx(10 / 30)
    assert moved["V <= 30 kN"].new.ratio == pytest.approx(12 / 30)
    # sigma = 15 MPa, then 18 MPa, against 12 MPa: NG both times, so it moved and did not flip
    assert not d.flipped and moved["sigma <= f"].new.ratio == pytest.approx(18 / 12)


def test_an_inserted_unrelated_line_yields_no_spurious_changes():
    inserted = BEAM.replace("# Loads and section\n", "# Loads and section\n> Joists at 400 mm centres.\n"
                                                     "s = 400 mm        -- joist spacing\n\n")
    d = diff_results(calcsheet.run(BEAM), calcsheet.run(inserted))
    assert d.added == ["s"]
    assert not (d.inputs or d.results or d.removed or d.flipped or d.moved or d.edited_checks
                or d.checks_added or d.checks_removed)
    assert d.changed_names == {"s"}


def test_reordered_checks_are_matched_by_text_not_line():
    lines = BEAM.rstrip("\n").split("\n")
    swapped = "\n".join(lines[:-2] + [lines[-1], lines[-2]]) + "\n"
    d = diff_results(calcsheet.run(BEAM), calcsheet.run(swapped))
    assert d.empty


def test_an_edited_check_is_matched_by_the_names_it_reads():
    d = diff_results(calcsheet.run(BEAM), calcsheet.run(BEAM.replace("check sigma <= f ", "check sigma <= 1.3*f ")))
    assert not d.checks_added and not d.checks_removed
    (flip,) = d.flipped  # 15 MPa against 15.6 MPa: now OK
    assert (flip.old.text, flip.new.text) == ("sigma <= f", "sigma <= 1.3*f")


def test_a_changed_formula_is_reported_even_where_the_value_moves_with_it():
    d = diff_results(calcsheet.run(BEAM), calcsheet.run(BEAM.replace("M [kN*m] = w*L^2/8", "M [kN*m] = w*L^2/10")))
    m = next(c for c in d.results if c.name == "M")
    assert m.formula_changed and m.pct == pytest.approx(-20.0)
    assert next(c for c in d.results if c.name == "sigma").caused_by == ["M"]


def test_removed_and_added_steps_are_listed():
    text = BEAM.replace("A [mm^2] = b*h\n", "").replace("check V <= 30 kN  -- shear force\n",
                                                        "tau [MPa] = 1.5*V/(b*h)\n")
    d = diff_results(calcsheet.run(BEAM), calcsheet.run(text))
    assert d.removed == ["A"] and d.added == ["tau"]
    assert [c.text for c in d.checks_removed] == ["V <= 30 kN"]


def test_record_fields_are_compared_one_by_one():
    sheet = "b = 100 mm\nh = 200 mm\nsec = section.rectangle(b=b, h=h)\nI = sec.I_x\n"
    d = diff_results(calcsheet.run(sheet), calcsheet.run(sheet.replace("h = 200 mm", "h = 300 mm")))
    names = {c.name for c in d.results}
    assert "sec.I_x" in names and "I" in names and "sec.A" in names
    i = next(c for c in d.results if c.name == "I")
    # I_x = b h^3 / 12 — Roark's Formulas for Stress and Strain, Table A.1
    assert i.new.quantity.m_as("mm^4") == pytest.approx(100 * 300**3 / 12)
    assert i.pct == pytest.approx((1.5**3 - 1) * 100)
    assert "sec" in d.changed_names and "sec.I_x" not in d.changed_names


def test_the_text_report_reads_old_to_new(depth_change):
    text = to_text(depth_change)
    assert "h: 200.0 mm → 250.0 mm  +25.00 %" in text
    assert "sigma <= f: NG → OK" in text
    assert "M:" not in text


# ------------------------------------------------------------ sides: files, git, JSON


def _git(cwd, *args):
    subprocess.run(["git", "-c", "user.name=T", "-c", "user.email=t@example.invalid", *args], cwd=cwd, check=True,
                   capture_output=True)


@pytest.fixture
def repo(tmp_path):
    _git(tmp_path, "init", "-q")
    (tmp_path / "sheets").mkdir()
    sheet = tmp_path / "sheets" / "joist.calc"
    sheet.write_text(BEAM, encoding="utf-8")
    _git(tmp_path, "add", ".")
    _git(tmp_path, "commit", "-qm", "first issue")
    sheet.write_text(deeper(BEAM), encoding="utf-8")
    _git(tmp_path, "commit", "-qam", "deeper joist")
    sheet.write_text(deeper(BEAM, "300 mm"), encoding="utf-8")  # uncommitted
    return tmp_path


def test_git_revision_sides_are_read_with_git(repo, monkeypatch):
    monkeypatch.chdir(repo)
    d = diff_specs("HEAD~1:sheets/joist.calc", "HEAD:sheets/joist.calc")
    assert [(c.name, c.old.quantity.m_as("mm"), c.new.quantity.m_as("mm")) for c in d.inputs] == [("h", 200, 250)]
    d2 = diff_specs("HEAD:sheets/joist.calc", "sheets/joist.calc")  # committed against the working file
    assert d2.inputs[0].new.quantity.m_as("mm") == 300


def test_git_paths_resolve_from_a_subfolder_too(repo, monkeypatch):
    monkeypatch.chdir(repo / "sheets")
    assert "h = 200 mm" in git_show("HEAD~1", "joist.calc")
    assert "h = 250 mm" in git_show("HEAD", "sheets/joist.calc")


def test_bad_git_sides_are_clear_errors(repo, monkeypatch):
    monkeypatch.chdir(repo)
    with pytest.raises(DiffSourceError, match="cannot read nosuchrev:sheets/joist.calc"):
        load_side("nosuchrev:sheets/joist.calc")
    with pytest.raises(DiffSourceError, match="not a git revision"):
        git_show("--output=/tmp/x", "sheets/joist.calc")  # never taken as an option
    with pytest.raises(DiffSourceError, match="no such file"):
        load_side("missing.calc")


def test_a_saved_json_result_is_a_side(tmp_path):
    old = calcsheet.run(BEAM, path="joist.calc")
    (saved,) = write_package(old, tmp_path, ["json"])
    d = diff_specs(str(saved), _write(tmp_path / "new.calc", deeper(BEAM)))
    assert [c.name for c in d.inputs] == ["h"]
    assert {c.name for c in d.results} == {"S", "A", "sigma"}
    s = next(c for c in d.results if c.name == "S")
    assert s.old.quantity.m_as("mm^3") == pytest.approx(100 * 200**2 / 6)
    assert [c.text for c in d.flipped] == ["sigma <= f"]


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


# ------------------------------------------------------------ build --since


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


def test_changes_page_escapes_sheet_text(tmp_path):
    old = _write(tmp_path / "<b>old&.calc", BEAM.replace("rev: B", "rev: <i>B</i>"))
    d = diff_specs(old, _write(tmp_path / "new.calc", deeper(BEAM)))
    from calcsheet.render.diff import changes_page as changes_page_html

    page = changes_page_html(d)
    assert "<b>" not in page and "<i>" not in page
    assert "&lt;i&gt;B&lt;/i&gt;" in page


# ------------------------------------------------------------ --set-file


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


# ------------------------------------------------------------ revision history


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


def test_float_noise_on_a_zero_record_field_is_not_a_change():
    from calcsheet import units as U
    from calcsheet.diff import Entry, Snapshot, diff_snapshots

    mm4 = U.unit_named("mm") ** 4
    Q = U.registry().Quantity

    def snap(i_xy):
        s = Snapshot("x")
        s.values["fb"] = Entry("fb", text="built-up result")
        s.values["fb.I_x"] = Entry("fb.I_x", quantity=Q(7.1e8, mm4), parent="fb")
        s.values["fb.I_xy"] = Entry("fb.I_xy", quantity=Q(i_xy, mm4), parent="fb")
        return s

    # a symmetric section's product of inertia is zero — common practice; 8e-9 mm^4 beside 7e8 is round-off
    assert diff_snapshots(snap(0.0), snap(8.4e-9)).empty
    assert [c.name for c in diff_snapshots(snap(0.0), snap(2.0e3)).results] == ["fb.I_xy"]
