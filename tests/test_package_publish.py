"""The package is published as one unit (issue 16, part 5): every file written into a new build folder,
then one rename swaps it in. A failure at any step -- including a kill -- leaves the previous package
byte-identical, and nothing temporary is left behind."""
from __future__ import annotations

import os
import subprocess
import sys
import time
from pathlib import Path

import pytest

import calcsheet
from calcsheet import atomic
from calcsheet.atomic import STORE, publish_package
from calcsheet.package import write_package

FORMATS = ["html", "json"]


def package(out: Path, stem="s") -> dict[str, bytes]:
    return {p.name: p.read_bytes() for p in sorted(out.glob(f"{stem}.*"))}


def leftovers(out: Path, stem="s") -> list[str]:
    """Anything in the output folder that is not the package: temp files, stray build folders."""
    store = out / STORE / stem
    keep = {"current", os.readlink(store / "current")}
    stray = sorted(p.name for p in store.iterdir() if p.name not in keep)
    return stray + sorted(p.name for p in out.iterdir() if p.name.endswith(".tmp"))


@pytest.fixture
def built(tmp_path):
    src = tmp_path / "s.calc"
    src.write_text("x = 2 m\ncheck x <= 3 m\n")
    out = tmp_path / "out"
    write_package(calcsheet.run(src), out, FORMATS)
    src.write_text("x = 2.5 m\ncheck x <= 3 m\n")
    return src, out, package(out)


def test_the_paths_users_open_are_unchanged_and_come_from_one_build(built):
    src, out, before = built
    assert set(before) == {"s.html", "s.json"} and b"2.5" not in before["s.json"]
    write_package(calcsheet.run(src), out, FORMATS)
    after = package(out)
    assert b"2.5" in after["s.json"] and after != before
    folders = {(out / name).resolve().parent for name in after}
    assert len(folders) == 1 and folders.pop().name.startswith("build-")
    assert leftovers(out) == []


# every file-system step of a publish, and the call of it that fails: the first, and the last one before
# the swap (os.replace is the swap itself: failing it must also leave the old package)
# (the folder's fsync is best effort: some file systems refuse it, and that is not a failed build)
STEPS = [("fdopen", 1), ("fdopen", 2), ("fsync", 1), ("fsync", 2), ("chmod", 1), ("chmod", 3),
         ("mkdtemp", 1), ("symlink", 1), ("replace", 1)]


@pytest.mark.parametrize("error", [OSError(28, "No space left on device"), KeyboardInterrupt()],
                         ids=["disk-full", "interrupted"])
@pytest.mark.parametrize("step, nth", STEPS, ids=[f"{s}{n}" for s, n in STEPS])
def test_a_failure_at_any_step_leaves_the_old_package_byte_identical(built, monkeypatch, step, nth, error):
    import tempfile

    src, out, before = built
    owner, name = {"mkdtemp": (tempfile, "mkdtemp")}.get(step, (os, step))
    real = getattr(owner, name)
    calls = {"n": 0}

    def failing(*args, **kwargs):
        calls["n"] += 1
        if calls["n"] == nth:
            raise error
        return real(*args, **kwargs)

    monkeypatch.setattr(owner, name, failing, raising=False)
    with pytest.raises(type(error)):
        write_package(calcsheet.run(src), out, FORMATS)
    monkeypatch.undo()
    assert calls["n"] >= nth, "the step was not reached: the test would prove nothing"
    assert package(out) == before
    assert leftovers(out) == []


def test_a_folder_in_the_way_is_found_before_anything_changes(built):
    src, out, before = built
    (out / "s.pdf").mkdir()
    with pytest.raises(IsADirectoryError):
        publish_package(out, "s", {"s.html": b"new", "s.json": b"new", "s.pdf": b"new"})
    assert {p.name: p.read_bytes() for p in out.glob("s.*") if p.is_file()} == before
    assert (out / "s.pdf").is_dir() and leftovers(out) == []


KILLER = """
import os, signal, sys
from pathlib import Path
import calcsheet
from calcsheet.package import write_package
real = os.replace
def replace(a, b):
    if str(b).endswith("current"):
        os.kill(os.getpid(), signal.SIGKILL)   # killed at the worst moment: just before the swap
    return real(a, b)
os.replace = replace
write_package(calcsheet.run(Path(sys.argv[1])), Path(sys.argv[2]), ["html", "json"])
"""


def test_a_kill_just_before_the_swap_leaves_the_old_package_and_the_next_build_cleans_up(built):
    src, out, before = built
    proc = subprocess.run([sys.executable, "-c", KILLER, str(src), str(out)], capture_output=True)
    assert proc.returncode == -9, proc.stderr.decode()
    assert package(out) == before
    left = leftovers(out)  # what the kill left: one unfinished build and the new link that was not swapped in
    assert len(left) == 2 and left[0].startswith(".current.") and left[1].startswith("build-")
    stale = time.time() - atomic.STALE_SECONDS - 1
    for name in left:
        os.utime(out / STORE / "s" / name, (stale, stale), follow_symlinks=False)
    write_package(calcsheet.run(src), out, FORMATS)
    assert b"2.5" in package(out)["s.json"] and leftovers(out) == []


def test_a_format_the_new_build_did_not_make_is_no_longer_offered(built):
    src, out, before = built
    write_package(calcsheet.run(src), out, ["html"])
    assert set(package(out)) == {"s.html"} and leftovers(out) == []


def test_a_package_of_the_old_layout_plain_files_is_taken_over(tmp_path):
    out = tmp_path / "out"
    out.mkdir()
    (out / "s.html").write_bytes(b"old plain file")
    publish_package(out, "s", {"s.html": b"new"})
    assert (out / "s.html").is_symlink() and (out / "s.html").read_bytes() == b"new"
    assert leftovers(out) == []


def test_files_are_readable_by_others(tmp_path):
    (path,) = publish_package(tmp_path, "s", {"s.json": b"{}"})
    assert (path.resolve().stat().st_mode & 0o777) == 0o644
