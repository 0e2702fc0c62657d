"""The pre-commit hooks: the manifest is valid and its entries run ``calcsheet check`` on .calc files.

The full round trip (pre-commit installing the hook from a clone of this repository and
running it) needs PyPI and ~20 s, so it runs only when CALCSHEET_PRE_COMMIT names a
pre-commit executable, e.g. ``CALCSHEET_PRE_COMMIT=$(which pre-commit) pytest tests/checker``.
"""
from __future__ import annotations

import os
import re
import shlex
import subprocess
from pathlib import Path

import pytest

from calcsheet.cli import main

REPO = Path(__file__).parents[2]
MANIFEST = REPO / ".pre-commit-hooks.yaml"
GOOD = "L = 6 m\nw = 5 kN/m\nM [kN*m] = w*L^2/8\ncheck M <= 30 kN*m\n"
BAD = "q = 2 kPa\nw [kN/m] = q\n"
WARN = "E_s = 200 MPa\nA = 100 mm^2\nk = E_s*A\ncheck k <= 1 MN\n"


def hooks() -> list[dict]:
    """The manifest as a list of hooks (a list of flat maps: all this file may contain)."""
    out: list[dict] = []
    for raw in MANIFEST.read_text(encoding="utf-8").splitlines():
        if not raw.strip() or raw.lstrip().startswith("#"):
            continue
        m = re.fullmatch(r"(- |  )(\w+): (.*)", raw)
        assert m, f"unexpected line in the manifest: {raw!r}"
        if m[1] == "- ":
            out.append({})
        value = m[3]
        if value.startswith('"'):
            assert value.endswith('"')
            value = value[1:-1]
        out[-1][m[2]] = value
    return out


def test_the_manifest_declares_both_hooks_with_the_required_keys():
    found = {h["id"]: h for h in hooks()}
    assert set(found) == {"calcsheet-check", "calcsheet-check-strict"}
    for h in found.values():
        assert {"id", "name", "entry", "language"} <= set(h)
        assert h["language"] == "python"  # installs this package, so `calcsheet` is on the hook's PATH
        assert re.search(h["files"], "sheets/beam.calc") and not re.search(h["files"], "README.md")


def test_the_manifest_is_valid_for_pre_commit_itself():
    clientlib = pytest.importorskip("pre_commit.clientlib")
    clientlib.load_manifest(str(MANIFEST))


@pytest.mark.parametrize("hook_id, text, status", [
    ("calcsheet-check", GOOD, 0), ("calcsheet-check", BAD, 1), ("calcsheet-check", WARN, 0),
    ("calcsheet-check-strict", WARN, 3),
])
def test_each_entry_runs_the_check_on_the_files_it_is_given(tmp_path, capsys, hook_id, text, status):
    entry = shlex.split({h["id"]: h for h in hooks()}[hook_id]["entry"])
    assert entry[:2] == ["calcsheet", "check"]
    sheet = tmp_path / "s.calc"
    sheet.write_text(text, encoding="utf-8")
    assert main(entry[1:] + [str(sheet)]) == status  # pre-commit appends the staged file names


@pytest.mark.skipif(not os.environ.get("CALCSHEET_PRE_COMMIT"), reason="set CALCSHEET_PRE_COMMIT to run")
def test_the_hook_installs_and_runs_from_a_clone(tmp_path):
    pre_commit = os.environ["CALCSHEET_PRE_COMMIT"]
    clone, project = tmp_path / "clone", tmp_path / "project"
    subprocess.run(["git", "clone", "-q", str(REPO), str(clone)], check=True)
    project.mkdir()
    (project / "good.calc").write_text(GOOD, encoding="utf-8")
    (project / "bad.calc").write_text(BAD, encoding="utf-8")
    subprocess.run(["git", "init", "-q"], cwd=project, check=True)
    subprocess.run(["git", "add", "."], cwd=project, check=True)
    env = {**os.environ, "PRE_COMMIT_HOME": str(tmp_path / "home")}

    def hook(*files):
        return subprocess.run([pre_commit, "try-repo", str(clone), "calcsheet-check", "--files", *files],
                              cwd=project, env=env, capture_output=True, text=True, timeout=900)

    ok = hook("good.calc")
    assert ok.returncode == 0, ok.stdout + ok.stderr
    bad = hook("good.calc", "bad.calc")
    assert bad.returncode == 1 and "bad.calc:2:4: error declared-unit-mismatch" in bad.stdout
