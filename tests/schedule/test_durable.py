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
