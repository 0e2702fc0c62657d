"""The sides of a diff: a sheet file, a git revision of one (REV:path), a saved JSON result."""
from pathlib import Path

import pytest

import calcsheet
from calcsheet.diff import DiffSourceError, diff_specs, git_show, load_side
from calcsheet.package import write_package

BEAM = (Path(__file__).parent / "joist.calc").read_text(encoding="utf-8")  # a simply supported timber joist


def deeper(text: str, h: str = "250 mm") -> str:
    return text.replace("h = 200 mm", f"h = {h}")


def _write(path: Path, text: str) -> str:
    path.write_text(text, encoding="utf-8")
    return str(path)


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
