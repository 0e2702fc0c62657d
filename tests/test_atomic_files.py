"""Several files written atomically together: each file as ``write_atomic`` writes one, the folder synced once
at the end (not once per file), and a failure part-way leaves the failed file's old bytes and no temporary
file, with the files already renamed made durable."""
import os
import stat

import pytest

import calcsheet.atomic as atomic
from calcsheet.atomic import write_atomic_files


def test_each_file_has_its_bytes_and_the_folder_is_synced_once(tmp_path, monkeypatch):
    synced, fsyncs = [], []
    real_sync_dir, real_fsync = atomic._fsync_dir, os.fsync
    monkeypatch.setattr(atomic, "_fsync_dir", lambda folder: (synced.append(folder), real_sync_dir(folder)))
    monkeypatch.setattr(os, "fsync", lambda fd: (fsyncs.append(fd), real_fsync(fd)))
    files = [(tmp_path / "B-1.html", b"<html>1</html>"), (tmp_path / "B-1.json", b'{"a": 1}\n')]
    write_atomic_files(files)
    assert {p.name: p.read_bytes() for p in tmp_path.iterdir()} == {p.name: d for p, d in files}  # no temp files
    assert all(stat.S_IMODE(p.stat().st_mode) == 0o644 for p, _ in files)
    assert synced == [tmp_path]  # one folder sync for both files
    assert len(fsyncs) == 2 + 1  # each file's data, then the folder (through _fsync_dir)


def test_a_failure_in_the_second_file_keeps_its_old_bytes_and_the_first_file_durable(tmp_path, monkeypatch):
    (tmp_path / "B-1.json").write_bytes(b"old\n")
    synced = []
    monkeypatch.setattr(atomic, "_fsync_dir", synced.append)
    real = os.replace

    def refuse_json(src, dst):
        if str(dst).endswith(".json"):
            raise OSError(28, "No space left on device")
        return real(src, dst)

    monkeypatch.setattr(os, "replace", refuse_json)
    with pytest.raises(OSError):
        write_atomic_files([(tmp_path / "B-1.html", b"new html"), (tmp_path / "B-1.json", b"new json")])
    assert {p.name: p.read_bytes() for p in tmp_path.iterdir()} == {"B-1.html": b"new html", "B-1.json": b"old\n"}
    assert synced == [tmp_path]


def test_a_caller_that_syncs_the_folder_itself_can_leave_it_to_the_end(tmp_path, monkeypatch):
    synced = []
    monkeypatch.setattr(atomic, "_fsync_dir", synced.append)
    write_atomic_files([(tmp_path / "B-1.html", b"1")], sync_folders=False)
    write_atomic_files([(tmp_path / "B-2.html", b"2")], sync_folders=False)
    assert synced == [] and (tmp_path / "B-2.html").read_bytes() == b"2"
    atomic.sync_folder(tmp_path)
    assert synced == [tmp_path]


def test_a_staged_file_changes_nothing_until_it_is_committed_whole(tmp_path, monkeypatch):
    target = tmp_path / "B-1.html"
    target.write_bytes(b"old")
    tmp = atomic.stage_file(target, b"new bytes")
    assert target.read_bytes() == b"old" and tmp.parent == tmp_path and tmp.name.endswith(atomic.STAGED_SUFFIX)
    fsyncs = []
    real = os.fsync
    monkeypatch.setattr(os, "fsync", lambda fd: (fsyncs.append(fd), real(fd)))
    atomic.commit_staged(tmp, target)
    assert target.read_bytes() == b"new bytes" and stat.S_IMODE(target.stat().st_mode) == 0o644
    assert len(fsyncs) == 1 and not tmp.exists()


def test_a_commit_that_fails_keeps_the_old_file_and_removes_the_staged_one(tmp_path, monkeypatch):
    target = tmp_path / "B-1.html"
    target.write_bytes(b"old")
    tmp = atomic.stage_file(target, b"new")
    monkeypatch.setattr(os, "replace", lambda a, b: (_ for _ in ()).throw(OSError(28, "No space left on device")))
    with pytest.raises(OSError):
        atomic.commit_staged(tmp, target)
    assert [p.name for p in tmp_path.iterdir()] == ["B-1.html"] and target.read_bytes() == b"old"


def test_staged_files_left_behind_are_swept_by_age(tmp_path):
    old, new = atomic.stage_file(tmp_path / "a.html", b"1"), atomic.stage_file(tmp_path / "b.html", b"2")
    os.utime(old, (1, 1))  # staged long ago, by a build that was killed
    (tmp_path / "keep.html").write_bytes(b"k")
    atomic.sweep_staged(tmp_path, older_than=600)
    assert sorted(p.name for p in tmp_path.iterdir()) == sorted(["keep.html", new.name])
    atomic.sweep_staged(tmp_path)
    assert [p.name for p in tmp_path.iterdir()] == ["keep.html"]
