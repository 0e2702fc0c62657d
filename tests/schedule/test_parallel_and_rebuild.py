"""-j N gives the same bytes as -j 1; an unchanged member is not rebuilt; the hash is stamped in each package."""
import json
import re

import pytest

from calcsheet.cli import main

from .conftest import tree

MEMBERS = "member,L,w\n" + "".join(f"B-{i},{2 + i * 0.5} m,{1 + i % 3} kN/m\n" for i in range(1, 7)) + \
    "B-bad,3 kN,1 kN/m\n"


def _build(beam, t, out, *extra):
    return main(["build", str(beam), "--schedule", str(t), "-o", str(out), "--format", "html,json", *extra])


def test_two_workers_write_the_same_bytes_as_one(beam, table, tmp_path):
    t = table(MEMBERS)
    assert _build(beam, t, tmp_path / "serial", "-j", "1") == 1  # the bad row fails in both
    assert _build(beam, t, tmp_path / "pool", "-j", "2") == 1
    serial, pool = tree(tmp_path / "serial"), tree(tmp_path / "pool")
    assert list(serial) == list(pool)
    assert [k for k in serial if serial[k] != pool[k]] == []
    assert len([k for k in serial if k.endswith(".json")]) == 7  # six members and schedule.json


def test_one_pdf_from_the_pool_matches_the_serial_one(beam, table, tmp_path):
    t = table("member,L\nP-1,3.5 m\n")
    for j, d in (("1", "a"), ("2", "b")):
        assert main(["build", str(beam), "--schedule", str(t), "-o", str(tmp_path / d), "--format", "pdf,json",
                     "-j", j]) == 0
    a, b = tree(tmp_path / "a"), tree(tmp_path / "b")
    assert a["P-1.pdf"].startswith(b"%PDF") and a.keys() == b.keys()
    assert [k for k in a if a[k] != b[k]] == []  # the PDFs too, byte for byte


def _hash_in(out, member):
    data = json.loads((out / f"{member}.json").read_text())
    html = (out / f"{member}.html").read_text()
    m = re.search(r'id="content-hash">([0-9a-f]{64})<', html)
    return data["build"]["content_hash"], m.group(1) if m else None


def test_the_content_hash_is_stamped_in_json_and_html(beam, table, tmp_path):
    out = tmp_path / "o"
    _build(beam, table("member,L\nB-1,3 m\nB-2,4 m\n"), out, "-j", "1")
    h1, h1_html = _hash_in(out, "B-1")
    h2, _ = _hash_in(out, "B-2")
    assert h1 == h1_html and re.fullmatch(r"[0-9a-f]{64}", h1) and h1 != h2


def test_a_rebuild_redoes_only_what_changed(beam, table, tmp_path, capsys):
    out = tmp_path / "o"
    t = table("member,L\nB-1,3 m\nB-2,4 m\nB-3,5 m\n")
    _build(beam, t, out, "-j", "1")
    assert "3 built, 0 unchanged" in capsys.readouterr().out
    first = tree(out)
    _build(beam, t, out, "-j", "1")
    assert "0 built, 3 unchanged" in capsys.readouterr().out
    assert tree(out) == first  # the schedule package is the same too
    t.write_text("member,L\nB-1,3 m\nB-2,4.5 m\nB-3,5 m\n")
    _build(beam, t, out, "-j", "1")
    assert "1 built, 2 unchanged" in capsys.readouterr().out
    assert _hash_in(out, "B-2")[0] != json.loads(first["B-2.json"])["build"]["content_hash"]
    _build(beam, t, out, "-j", "1", "--force")
    assert "3 built, 0 unchanged" in capsys.readouterr().out


def test_a_changed_sheet_or_a_deleted_file_is_rebuilt(beam, table, tmp_path, capsys):
    out = tmp_path / "o"
    t = table("member,L\nB-1,3 m\nB-2,4 m\n")
    _build(beam, t, out, "-j", "1")
    capsys.readouterr()
    (out / "B-1.html").unlink()
    _build(beam, t, out, "-j", "1")
    assert "1 built, 1 unchanged" in capsys.readouterr().out
    beam.write_text(beam.read_text().replace("check V <= 6 kN", "check V <= 7 kN"))
    _build(beam, t, out, "-j", "1")
    assert "2 built, 0 unchanged" in capsys.readouterr().out


def test_a_changed_include_is_rebuilt(tmp_path, table, capsys):
    (tmp_path / "loads.calc").write_text("w = 2 kN/m\n")
    sheet = tmp_path / "inc.calc"
    sheet.write_text('include "loads.calc"\nL = 3 m\nM [kN*m] = w*L^2/8\ncheck M <= 5 kN*m\n')
    t = table("member,L\nI-1,3 m\n")
    out = tmp_path / "o"
    _build(sheet, t, out, "-j", "1")
    _build(sheet, t, out, "-j", "1")
    assert "0 built, 1 unchanged" in capsys.readouterr().out
    (tmp_path / "loads.calc").write_text("w = 3 kN/m\n")
    _build(sheet, t, out, "-j", "1")
    assert "1 built, 0 unchanged" in capsys.readouterr().out
    assert json.loads((out / "I-1.json").read_text())["values"]["M"]["value"] == pytest.approx(3 * 9 / 8)


def test_no_progress_bar_when_stderr_is_not_a_terminal(beam, table, tmp_path, capsys):
    _build(beam, table("member,L\nB-1,3 m\n"), tmp_path / "o", "-j", "1")
    err = capsys.readouterr().err
    assert "\r" not in err and "member/s" not in err and "it/s" not in err


def test_the_progress_bar_counts_members_on_a_terminal(capsys):
    from calcsheet.schedule import Progress

    bar = Progress(3, "members.csv", enabled=True)
    for _ in range(3):
        bar.step()
    bar.log("a message above the bar")
    bar.close()
    err = capsys.readouterr().err
    assert "3/3" in err and "a message above the bar" in err


def _die_once(task):
    """Kill the pool worker the first time it runs member B-2 (test only; the marker lives beside the sheet)."""
    import os
    from pathlib import Path

    from calcsheet.schedule.work import build_task

    marker = Path(task.sheet).parent / "died"
    if task.member == "B-2" and not marker.exists():
        marker.touch()
        os._exit(3)
    return build_task(task)


@pytest.mark.skipif(not __import__("sys").platform.startswith("linux"), reason="forks the test process")
def test_a_pool_worker_that_dies_has_its_rows_run_again_and_reported(beam, table, tmp_path, capsys, monkeypatch):
    import multiprocessing as mp

    from calcsheet.schedule import runner

    t = table("member,L\nB-1,3 m\nB-2,4 m\nB-3,5 m\n")
    _build(beam, t, tmp_path / "serial", "-j", "1")
    monkeypatch.setattr(runner, "build_task", _die_once)
    monkeypatch.setattr(runner, "pool_context", lambda: mp.get_context("fork"))  # the workers see the patch
    capsys.readouterr()
    assert _build(beam, t, tmp_path / "pool", "-j", "2") == 0
    err = capsys.readouterr().err
    assert (tmp_path / "died").exists()
    assert f"{t}:3: row 2 (B-2): a worker process died; running the row again (attempt 2)" in err
    assert tree(tmp_path / "pool") == tree(tmp_path / "serial")
