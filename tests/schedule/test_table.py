"""Reading a schedule table: bounded, strict UTF-8, every failure located at file:line:col; nothing built."""
import pytest

from calcsheet.cli import main
from calcsheet.schedule.table import ScheduleError, open_schedule

INPUTS = ["w", "L"]


def _open(tmp_path, data: bytes, name="m.csv"):
    p = tmp_path / name
    p.write_bytes(data)
    return p, open_schedule(p, INPUTS, ["M", "V"])


def test_a_byte_that_is_not_utf8_is_located_at_its_line_and_column(tmp_path):
    with pytest.raises(ScheduleError) as e:
        _open(tmp_path, b"member,L\nB-1,3 m\nB-2,4\xff m\n")
    p = tmp_path / "m.csv"
    assert str(e.value).startswith(f"{p}:3:6: error: the schedule is not UTF-8 text: byte 0xff at line 3, column 6")
    assert "save the file as UTF-8" in str(e.value)


def test_a_nul_character_is_refused_where_it_is(tmp_path):
    with pytest.raises(ScheduleError) as e:
        _open(tmp_path, b"member,L\nB-1,3\x00 m\n")
    assert str(e.value).startswith(f"{tmp_path / 'm.csv'}:2:6: error: the schedule contains a NUL character")


def test_a_schedule_larger_than_its_cap_is_refused_naming_the_cap(tmp_path, monkeypatch):
    monkeypatch.setenv("CALCSHEET_LIMIT_SCHEDULE_BYTES", "100")
    with pytest.raises(ScheduleError) as e:
        _open(tmp_path, b"member,L\n" + b"B-1,3 m\n" * 20)
    assert "is larger than 100 bytes" in str(e.value) and "CALCSHEET_LIMIT_SCHEDULE_BYTES" in str(e.value)


def test_no_more_than_the_cap_is_read_from_an_endless_file(tmp_path, monkeypatch):
    monkeypatch.setenv("CALCSHEET_LIMIT_SCHEDULE_BYTES", "1000")
    link = tmp_path / "zero.csv"
    link.symlink_to("/dev/zero")
    with pytest.raises(ScheduleError) as e:
        open_schedule(link, INPUTS)
    assert "larger than 1,000 bytes" in str(e.value)


def test_a_leading_byte_order_mark_is_not_part_of_the_first_column(tmp_path):
    _, sched = _open(tmp_path, "\ufeffmember,L\nB-1,3 m\n".encode("utf-8"))
    assert sched.columns == ["L"] and [r.member for r in sched.rows()] == ["B-1"]


def test_rows_are_read_from_the_bytes_checked_and_hashed(tmp_path):
    import hashlib

    data = b"member,L\r\nB-1,3 m\r\nB-2,\"4 m\"\r\n"
    p, sched = _open(tmp_path, data)
    p.write_bytes(b"member,L\nX-9,9 m\n")  # changed after opening: the rows are those that were read
    assert [(r.member, r.overrides) for r in sched.rows()] == [("B-1", {"L": "3 m"}), ("B-2", {"L": "4 m"})]
    assert sched.sha256 == hashlib.sha256(data).hexdigest()


def test_toml_that_does_not_parse_is_located(tmp_path):
    with pytest.raises(ScheduleError) as e:
        _open(tmp_path, b'[[members]]\nmember = "B-1"\nL = 3 m\n', name="m.toml")
    assert str(e.value).startswith(f"{tmp_path / 'm.toml'}:3:")
    assert "not valid TOML" in str(e.value)


def test_toml_that_is_not_utf8_is_located(tmp_path):
    with pytest.raises(ScheduleError) as e:
        _open(tmp_path, b'[[members]]\nmember = "B-\xe9"\n', name="m.toml")
    assert str(e.value).startswith(f"{tmp_path / 'm.toml'}:2:")


def test_the_command_reports_an_unreadable_schedule_and_builds_nothing(beam, tmp_path, capsys):
    t = tmp_path / "m.csv"
    t.write_bytes(b"member,L\nB-1,3\xc3 m\n")
    out = tmp_path / "o"
    assert main(["build", str(beam), "--schedule", str(t), "-o", str(out), "--format", "json", "-j", "1"]) == 1
    err = capsys.readouterr().err
    assert f"{t}:2:6: error: the schedule is not UTF-8 text" in err and "Traceback" not in err
    assert not (out / "B-1.json").exists()
