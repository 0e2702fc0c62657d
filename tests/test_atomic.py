"""A write that fails part-way leaves the old file byte-identical and no temporary file behind.

The failure is injected at each stage of a write — the data half written (a
full disk), the flush to disk, the rename over the old file — and by a folder
standing where the file should go. After each, the folder holds exactly what it
held before.
"""
import errno
import os

import pytest

import calcsheet
import calcsheet.atomic as atomic
from calcsheet.atomic import write_atomic
from calcsheet.package import write_package

OLD = b"the last good package\n" * 100
NEW = b"a new package that never arrives\n" * 1000


def snapshot(folder):
    return {p.name: (p.read_bytes() if p.is_file() else "<dir>") for p in folder.iterdir()}


@pytest.fixture
def target(tmp_path):
    p = tmp_path / "sheet.html"
    p.write_bytes(OLD)
    return p


def _disk_full(monkeypatch):
    """Every file object os.fdopen returns accepts half of what it is given, then reports a full disk."""
    real = os.fdopen

    class HalfWriter:
        def __init__(self, fh):
            self.fh = fh

        def write(self, data):
            self.fh.write(bytes(data[: len(data) // 2]))
            self.fh.flush()
            raise OSError(errno.ENOSPC, "No space left on device")

        def fileno(self):
            return self.fh.fileno()

        def flush(self):
            self.fh.flush()

        def close(self):
            self.fh.close()

        def __enter__(self):
            return self

        def __exit__(self, *exc):
            self.close()

    monkeypatch.setattr(os, "fdopen", lambda fd, *a, **k: HalfWriter(real(fd, *a, **k)))


def _fsync_fails(monkeypatch):
    def fail(fd):
        raise OSError(errno.EIO, "Input/output error")

    monkeypatch.setattr(os, "fsync", fail)


def _rename_fails(monkeypatch):
    def fail(src, dst, **kw):
        raise OSError(errno.EXDEV, "Invalid cross-device link")

    monkeypatch.setattr(os, "replace", fail)
    monkeypatch.setattr(os, "rename", fail)


FAILURES = {"the disk fills half-way": _disk_full, "fsync fails": _fsync_fails, "the rename fails": _rename_fails}


@pytest.mark.parametrize("inject", FAILURES.values(), ids=list(FAILURES))
def test_a_failed_write_keeps_the_old_file_and_leaves_no_temporary(target, monkeypatch, inject):
    before = snapshot(target.parent)
    inject(monkeypatch)
    with pytest.raises(OSError):
        write_atomic(target, NEW)
    monkeypatch.undo()
    assert snapshot(target.parent) == before
    assert target.read_bytes() == OLD


@pytest.mark.parametrize("inject", FAILURES.values(), ids=list(FAILURES))
def test_a_failed_first_write_leaves_no_file_at_all(tmp_path, monkeypatch, inject):
    inject(monkeypatch)
    with pytest.raises(OSError):
        write_atomic(tmp_path / "new.pdf", NEW)
    monkeypatch.undo()
    assert list(tmp_path.iterdir()) == []


def test_a_folder_in_the_way_is_an_error_and_stays_untouched(tmp_path):
    blocker = tmp_path / "sheet.pdf"
    blocker.mkdir()
    (blocker / "keep.txt").write_bytes(b"keep")
    with pytest.raises(OSError):
        write_atomic(blocker, NEW)
    assert blocker.is_dir() and (blocker / "keep.txt").read_bytes() == b"keep"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["sheet.pdf"]


def test_an_interrupt_during_the_write_also_cleans_up(target, monkeypatch):
    def interrupted(fd):
        raise KeyboardInterrupt

    monkeypatch.setattr(os, "fsync", interrupted)
    with pytest.raises(KeyboardInterrupt):
        write_atomic(target, NEW)
    monkeypatch.undo()
    assert snapshot(target.parent) == {"sheet.html": OLD}


def test_a_successful_write_replaces_the_whole_file_and_flushes_it(target, monkeypatch):
    synced = []
    real_fsync = os.fsync
    monkeypatch.setattr(os, "fsync", lambda fd: (synced.append(fd), real_fsync(fd)))
    write_atomic(target, NEW)
    assert target.read_bytes() == NEW
    assert len(synced) >= 2  # the data, then the folder entry
    assert snapshot(target.parent) == {"sheet.html": NEW}
    assert (os.stat(target).st_mode & 0o777) == 0o644


def test_the_temporary_file_is_written_beside_the_target(target, monkeypatch):
    # a rename is atomic only within one file system: the temporary must live in the same folder
    seen = []
    real = os.replace
    monkeypatch.setattr(os, "replace", lambda src, dst: (seen.append((str(src), str(dst))), real(src, dst)))
    write_atomic(target, NEW)
    (src, dst), = seen
    assert os.path.dirname(src) == str(target.parent) and dst == str(target)


# ---------------------------------------------------------------- the package writer


@pytest.fixture
def built(tmp_path):
    src = tmp_path / "s.calc"
    src.write_text("x = 2 m\ncheck x <= 3 m\n")
    write_package(calcsheet.run(src), tmp_path / "out", ["html", "json"])
    return src, tmp_path / "out"


@pytest.mark.parametrize("inject", FAILURES.values(), ids=list(FAILURES))
def test_a_failed_package_write_keeps_every_old_file_whole(built, monkeypatch, inject):
    src, out = built
    before = snapshot(out)
    src.write_text("x = 2.5 m\ncheck x <= 3 m\n")
    result = calcsheet.run(src)
    inject(monkeypatch)
    with pytest.raises(OSError):
        write_package(result, out, ["html", "json"])
    monkeypatch.undo()
    assert snapshot(out) == before


def test_a_folder_in_the_way_of_one_output_leaves_no_temporary_and_no_partial_file(built):
    src, out = built
    (out / "s.json").unlink()
    (out / "s.json").mkdir()
    src.write_text("x = 2.5 m\ncheck x <= 3 m\n")
    new = calcsheet.run(src)
    with pytest.raises(OSError):
        write_package(new, out, ["html", "json"])
    assert sorted(p.name for p in out.iterdir()) == ["s.html", "s.json"]
    assert (out / "s.json").is_dir()
    html = (out / "s.html").read_text()
    assert html.rstrip().endswith("</html>")  # whichever version it is, it is whole


def test_the_package_writer_writes_through_the_atomic_writer(built, monkeypatch):
    src, out = built
    calls = []
    real = atomic.write_atomic
    import calcsheet.package as package

    monkeypatch.setattr(package, "write_atomic", lambda p, data, *a, **k: (calls.append(p.name), real(p, data)))
    write_package(calcsheet.run(src), out, ["html", "json"])
    assert sorted(calls) == ["s.html", "s.json"]
