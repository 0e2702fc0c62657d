"""A schedule's output folder is synced once, at the end, after every member's files and the schedule's own
have been renamed into it (each file replaced whole, fsynced before its rename), serially and on a pool."""
import sys

import pytest

import calcsheet.atomic as atomic
from calcsheet.schedule import build_schedule


@pytest.mark.parametrize("jobs", [1, 2])
def test_the_output_folder_is_synced_once_after_everything_is_in_it(beam, table, tmp_path, monkeypatch, jobs):
    if jobs > 1 and not sys.platform.startswith("linux"):
        pytest.skip("the pool's workers see the patch only when forked")
    t = table("member,L\nB-1,3 m\nB-2,4 m\nB-3,5 m\n")
    out = tmp_path / "out"
    seen = []  # (folder, the member and schedule files in it at the time of the sync)
    monkeypatch.setattr(atomic, "_fsync_dir",
                        lambda folder: seen.append((folder, sorted(p.name for p in folder.iterdir()
                                                                   if not p.name.startswith(".")))))
    status, summary = build_schedule(beam, t, out, ["html", "json"], jobs=jobs, force=True, progress=False,
                                     out=lambda m: None)
    assert status == 0 and summary.built == 3
    syncs = [files for folder, files in seen if folder == out]
    assert syncs == [sorted([f"B-{k}.{x}" for k in (1, 2, 3) for x in ("html", "json")]
                            + ["schedule.csv", "schedule.html", "schedule.json"])]


def test_workers_stage_the_members_files_and_the_calling_process_commits_them(beam, table, tmp_path):
    from calcsheet.schedule.work import Task, build_task, commit_member

    out = tmp_path / "out"
    out.mkdir()
    task = Task(index=0, sheet=str(beam), source=beam.read_text(encoding="utf-8"), member="B-1",
                cells=(("L", "4 m", "t.csv:2"),), content_hash="0" * 64, label="row 1 (B-1)", where="t.csv:2",
                write_to=str(out), stage=True)
    o = build_task(task)
    assert o.ok and o.files == {} and o.written == 0
    assert sorted(target for _, target in o.staged) == [str(out / "B-1.html"), str(out / "B-1.json")]
    assert not (out / "B-1.html").exists()  # nothing at the targets until the caller commits
    assert commit_member(o.staged) == 2
    assert sorted(p.name for p in out.iterdir()) == ["B-1.html", "B-1.json"]  # and nothing staged is left


def test_a_build_that_stops_part_way_leaves_no_staged_file(beam, table, tmp_path):
    from calcsheet.schedule.runner import run_serial

    t = table("member,L\nB-1,3 m\nB-2,4 m\nB-3,5 m\n")
    out = tmp_path / "out"

    def stops_after_two(log):
        def run(items):
            for k, outcome in enumerate(run_serial(items)):
                if k == 2:  # the third row was built and its files staged; then the build is interrupted
                    assert outcome.staged
                    raise KeyboardInterrupt
                yield outcome
        return run

    with pytest.raises(KeyboardInterrupt):
        build_schedule(beam, t, out, ["html", "json"], force=True, progress=False, out=lambda m: None,
                       runner=stops_after_two)
    names = sorted(p.name for p in out.iterdir() if not p.name.startswith(".schedule."))
    assert names == ["B-1.html", "B-1.json", "B-2.html", "B-2.json"]
