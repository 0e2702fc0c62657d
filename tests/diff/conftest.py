"""Shared sides of a diff: the joist sheet before and after its depth changed, and a git history of it."""
import subprocess
from pathlib import Path

import pytest

import calcsheet
from calcsheet.diff import diff_results

BEAM = (Path(__file__).parent / "joist.calc").read_text(encoding="utf-8")


def deeper(text: str, h: str = "250 mm") -> str:
    return text.replace("h = 200 mm", f"h = {h}")


@pytest.fixture(scope="module")
def depth_change():
    return diff_results(calcsheet.run(BEAM, path="joist.calc"), calcsheet.run(deeper(BEAM), path="joist.calc"))


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
