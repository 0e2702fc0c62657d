"""One row's run in a worker: re-evaluating only what the row's values reach gives the package a full run
gives, byte for byte; the worker writes the files itself and sends back only a small outcome."""
import pickle
from pathlib import Path

import pytest

from calcsheet.engine import run
from calcsheet.schedule import work
from calcsheet.schedule.work import Task, build_task, render_member

ROOT = Path(__file__).resolve().parents[2]
BOARDWALK = ROOT / "sheets" / "boardwalk_joist.calc"

# A sheet function, and a plugin call the row's values do not reach (its result is reused row to row).
WARNS = """\
---
subject: Purlin
date: 2026-01-05
---
w = 2 kN/m           -- line load
L = 3 m              -- span
n = 2                -- number of purlins
M_ss(q [kN/m], l [m]) [kN*m] = q*l^2/8
M [kN*m] = M_ss(w, L) / n  -- moment per purlin
sec = section.rectangle(b=50 mm, h=150 mm)
sigma [MPa] = M / sec.S_x
check sigma <= 10 MPa      -- bending
"""


def _task(sheet: Path, member: str, cells: dict, formats=("html", "json"), **kw):
    return Task(index=0, sheet=str(sheet), source=sheet.read_text(encoding="utf-8"), member=member,
                cells=tuple((k, v, f"t.csv:2:{i}") for i, (k, v) in enumerate(cells.items(), 2)),
                formats=formats, content_hash="0" * 64, label=f"row 1 ({member})", where="t.csv:2",
                subject_suffix=f"member {member}", **kw)


def _full(task: Task) -> dict:
    """The package from a full run of the sheet with the row's values (no reuse of anything)."""
    result = run(task.source, overrides={c: t for c, t, _ in task.cells}, path=task.sheet)
    assert result.ok
    return render_member(result, task)


@pytest.mark.parametrize("cells", [
    {"L": "2.4 m", "s": "0.45 m", "q_k": "4.0 kPa"},
    {"L": "4.2 m", "s": "0.6 m", "q_k": "5 kPa"},  # NG for some checks
    {"g_k": "0.8 kPa"},
    {},
])
def test_a_row_renders_exactly_as_a_full_run_of_the_sheet_with_its_values(cells):
    task = _task(BOARDWALK, "J-1", cells)
    work._BASE.clear()
    first = build_task(task)  # the worker's first row (runs the sheet once with its own values)
    again = build_task(task)  # later rows reuse that run
    assert first.ok and again.ok
    full = _full(task)
    assert first.files == full and again.files == full


def test_rows_in_any_order_render_as_full_runs(tmp_path):
    sheet = tmp_path / "purlin.calc"
    sheet.write_text(WARNS, encoding="utf-8")
    rows = [{"L": "6 m"}, {"w": "0 kN/m"}, {"n": "1", "L": "2 m"}, {"L": "3 m"}, {"w": "5 kN/m", "n": "3"}]
    work._BASE.clear()
    for i, cells in enumerate(rows):
        task = _task(sheet, f"P-{i}", cells)
        out = build_task(task)
        assert out.ok, out.errors
        assert out.files == _full(task), cells
        full = run(task.source, overrides=cells, path=task.sheet)
        assert out.warnings == [d.one_line() for d in full.diagnostics if d.severity == "warning"]


def test_a_bad_row_is_reported_as_a_full_run_reports_it(tmp_path):
    sheet = tmp_path / "purlin.calc"
    sheet.write_text(WARNS, encoding="utf-8")
    work._BASE.clear()
    build_task(_task(sheet, "P-0", {"L": "3 m"}))
    out = build_task(_task(sheet, "P-1", {"L": "3 kN"}))
    assert not out.ok
    assert out.errors == ["t.csv:2:2: error: row 1 (P-1), column 'L': the sheet's L is length, the override is "
                          "force"]


def test_a_changed_sheet_is_run_afresh(tmp_path):
    sheet = tmp_path / "purlin.calc"
    sheet.write_text(WARNS, encoding="utf-8")
    work._BASE.clear()
    a = build_task(_task(sheet, "P-0", {"L": "4 m"}))
    sheet.write_text(WARNS.replace("check sigma <= 10 MPa", "check sigma <= 1 MPa"), encoding="utf-8")
    b = build_task(_task(sheet, "P-0", {"L": "4 m"}))
    # σ = (w L²/8 / n) / (b h²/6) = (2·16/8/2 kN·m) / (50·150²/6 mm³) = 10.7 MPa (common practice)
    assert a.checks[0].ratio == pytest.approx(2e6 * 16 / 8 / 2 / (50 * 150 ** 2 / 6) / 10)
    assert b.checks[0].ratio == pytest.approx(a.checks[0].ratio * 10)


def test_the_worker_writes_the_files_and_returns_a_small_outcome(tmp_path):
    out_dir = tmp_path / "o"
    out_dir.mkdir()
    task = _task(BOARDWALK, "J-7", {"L": "3.3 m"}, write_to=str(out_dir))
    out = build_task(task)
    assert out.ok and out.written == 2 and out.files == {}
    assert (out_dir / "J-7.html").read_bytes() == _full(task)["html"]
    assert len(pickle.dumps(out)) < 4000  # what crosses back to the calling process: checks, values, no pages


def test_a_file_that_cannot_be_written_is_the_rows_located_error(tmp_path):
    blocked = tmp_path / "o"
    blocked.mkdir()
    (blocked / "J-8.json").mkdir()  # a folder where the member's JSON would go
    out = build_task(_task(BOARDWALK, "J-8", {}, formats=("json",), write_to=str(blocked)))
    assert not out.ok and out.files == {}
    assert out.errors[0].startswith("t.csv:2: error: cannot write the package of J-8:")
