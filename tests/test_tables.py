"""Tables in the sheet and lookup: interpolation against numpy.interp and scipy's regular-grid interpolator,
never extrapolating, every mistake of form a located error; tables from CSV files read like includes."""
import hashlib
import json

import numpy as np
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st
from scipy.interpolate import RegularGridInterpolator

import calcsheet
from calcsheet import nodes as N
from calcsheet.parser import parse_sheet
from calcsheet.render.sheet import SheetPrinter
from calcsheet.render.text import TextDocument

K_H = """\
k_h =                  -- size factor by depth
| h   | k    | c    |
| mm  | 1    | kN   |
| 100 | 1.00 | 10   |
| 150 | 0.95 | 12   |
| 200 | 0.90 | 18   |
"""


def codes(result):
    return [(d.code, d.span.line, d.span.col) for d in result.errors]


def both(text):
    return codes(calcsheet.run(text, evaluate=False)), codes(calcsheet.run(text))


def pipe_table(name, header, units, rows):
    lines = [f"{name} ="] + ["| " + " | ".join(r) + " |" for r in [header, units, *rows]]
    return "\n".join(lines) + "\n"


# ---------------------------------------------------------------- one-way


def test_a_lookup_interpolates_linearly_between_the_two_rows_around_the_key():
    r = calcsheet.run(K_H + "k_1 = lookup(k_h.k, h=120 mm)\nc_1 = lookup(k_h.c, h=0.175 m)\n")
    assert r.ok, r.format_diagnostics()
    # y1 + (y2 - y1)(x - x1)/(x2 - x1), by hand: 1.00 + (0.95 - 1.00)*20/50 = 0.98; 12 + 6*25/50 = 15 kN
    assert r.values["k_1"].m_as("") == pytest.approx(0.98)
    assert r.values["c_1"].m_as("kN") == pytest.approx(15.0)


def test_a_key_on_a_row_gives_that_rows_value():
    r = calcsheet.run(K_H + "a = lookup(k_h.k, h=100 mm)\nb = lookup(k_h.k, h=150 mm)\nc = lookup(k_h.k, h=200 mm)\n")
    assert [r.values[k].m_as("") for k in "abc"] == pytest.approx([1.00, 0.95, 0.90])


keys = st.lists(st.floats(-1e3, 1e3, allow_nan=False), min_size=2, max_size=8, unique=True).map(sorted)


@settings(max_examples=60, deadline=None, database=None)
@given(keys, st.data())
def test_one_way_lookup_is_numpy_interp(xs, data):
    assume(min(np.diff(xs)) > 1e-6)
    ys = data.draw(st.lists(st.floats(-1e3, 1e3, allow_nan=False), min_size=len(xs), max_size=len(xs)))
    x = data.draw(st.floats(xs[0], xs[-1]))
    table = pipe_table("t", ["x", "y"], ["mm", "kN"], [[repr(a), repr(b)] for a, b in zip(xs, ys)])
    r = calcsheet.run(table + f"v = lookup(t.y, x={x!r} mm)\n")
    assert r.ok, r.format_diagnostics()
    assert r.values["v"].m_as("kN") == pytest.approx(np.interp(x, xs, ys), rel=1e-9, abs=1e-9)


@settings(max_examples=40, deadline=None, database=None)
@given(keys, st.data())
def test_two_way_lookup_is_scipys_regular_grid_interpolator(xs, data):
    assume(min(np.diff(xs)) > 1e-6)
    zs = data.draw(keys)
    assume(min(np.diff(zs)) > 1e-6)
    grid = np.array(data.draw(st.lists(st.lists(st.floats(-100, 100, allow_nan=False), min_size=len(zs),
                                                         max_size=len(zs)), min_size=len(xs), max_size=len(xs))))
    x = data.draw(st.floats(xs[0], xs[-1]))
    z = data.draw(st.floats(zs[0], zs[-1]))
    table = pipe_table("t", ["x \\ z", *map(repr, zs)], ["m \\ s", *["kPa"] * len(zs)],
                       [[repr(a), *map(repr, row)] for a, row in zip(xs, grid.tolist())])
    r = calcsheet.run(table + f"v = lookup(t, x={x!r} m, z={z!r} s)\n")
    assert r.ok, r.format_diagnostics()
    expected = RegularGridInterpolator((xs, zs), grid, method="linear")([[x, z]])[0]
    assert r.values["v"].m_as("kPa") == pytest.approx(expected, rel=1e-9, abs=1e-9)


# ---------------------------------------------------------------- outside the table


def test_outside_the_table_is_an_error_at_the_key_never_an_extrapolation():
    text = K_H + "k_1 = lookup(k_h.k, h=250 mm)\n"
    assert codes(calcsheet.run(text)) == [("out-of-range", 7, 23)]
    d = calcsheet.run(text).errors[0]
    assert "h = 250 mm is outside table k_h, which runs from 100 mm to 200 mm" in d.message
    assert "clamp" in d.hint


@pytest.mark.parametrize("h, end", [("250 mm", 0.90), ("50 mm", 1.00)])
def test_clamp_takes_the_end_value_and_says_so(h, end):
    r = calcsheet.run(K_H + f"k_1 = lookup(k_h.k, h={h}, clamp)\n")
    assert r.ok, r.format_diagnostics()
    assert r.values["k_1"].m_as("") == pytest.approx(np.interp(float(h.split()[0]), [100, 150, 200],
                                                               [1.0, 0.95, 0.9]))  # numpy.interp clamps too
    assert r.values["k_1"].m_as("") == pytest.approx(end)
    assert "clamp takes the end value" in TextDocument().items(r.items)


# ---------------------------------------------------------------- what the package shows


def test_the_table_prints_once_and_each_lookup_its_bracketing_rows_and_formula():
    r = calcsheet.run(K_H + "k_1 = lookup(k_h.k, h=120 mm)\n")
    text = TextDocument().items(r.items)
    assert text.count("table k_h") == 1
    assert "rows of k_h around h = 120 mm" in text
    assert "k = k_1 + (k_2 − k_1)·(h − h_1)/(h_2 − h_1) = 1.00 + (0.950 − 1.00) · (120 mm − 100 mm) / " \
           "(150 mm − 100 mm) = 0.980" in text


def test_the_package_page_shows_the_table_and_the_lookup_working():
    from calcsheet.render.page import PackageDocument

    page = str(PackageDocument(calcsheet.run(K_H + "k_1 = lookup(k_h.k, h=120 mm)\n")).html())
    assert "<caption>table k_h</caption>" in page
    assert "rows of k_h around h = 120 mm" in page


def test_sheet_text_in_a_table_is_escaped_in_html():
    from calcsheet.render.page import PackageDocument

    r = calcsheet.run(K_H.replace("size factor by depth", "<script>alert(1)</script>"))
    assert "<script>alert" not in str(PackageDocument(r).html())


def test_a_column_is_a_list():
    r = calcsheet.run(K_H + "hs = k_h.h\nc_max = max(k_h.c)\n")
    np.testing.assert_allclose(r.values["hs"].m_as("mm"), [100, 150, 200])
    assert r.values["c_max"].m_as("kN") == 18


def test_json_carries_the_table():
    data = json.loads(json.dumps(calcsheet.run(K_H).to_json()))
    assert data["values"]["k_h"]["table"]["columns"] == ["h", "k", "c"]
    assert data["values"]["k_h"]["table"]["rows"][1] == [150, 0.95, 12]


# ---------------------------------------------------------------- mistakes, located


@pytest.mark.parametrize("text, code, line, col", [
    ("t =\n| h | k |\n| mm | 1 |\n| 100 | 1.0 | 3 |\n| 200 | 0.9 |\n", "syntax", 4, 3),       # ragged
    ("t =\n| h | k |\n| mm | 1 |\n| 200 | 1.0 |\n| 100 | 0.9 |\n", "syntax", 5, 3),         # unsorted keys
    ("t =\n| h | k |\n| mm | 1 |\n| 100 | 1.0 |\n| 100 | 0.9 |\n", "syntax", 5, 3),         # a key twice
    ("t =\n| h | k |\n| 100 | 1.0 |\n| 200 | 0.9 |\n", "syntax", 3, 3),                     # no units row
    ("t =\n| h | k |\n| mm | 1 |\n| 100 | 1,0 |\n| 200 | 0.9 |\n", "syntax", 4, 9),         # not a number
    ("t =\n| h | h |\n| mm | 1 |\n| 100 | 1.0 |\n| 200 | 0.9 |\n", "syntax", 2, 7),         # a column twice
    ("t =\n| h | k |\n| mm | 1 |\n| 100 | 1.0 |\n", "syntax", 1, 1),                         # one row only
    ("t =\n| h | k |\n| mx | 1 |\n| 100 | 1.0 |\n| 200 | 0.9 |\n", "unknown-unit", 3, 3),   # unknown unit
    ("t =\n| h \\ b | 1 | 2 |\n| mm \\ mm | 1 | kN |\n| 1 | 1 | 2 |\n| 2 | 3 | 4 |\n", "syntax", 3, 17),
])
def test_bad_tables_are_located_errors(text, code, line, col):
    assert both(text) == ([(code, line, col)], [(code, line, col)])


def test_a_broken_table_is_reported_once_and_the_rest_of_the_sheet_is_read():
    r = calcsheet.run("t =\n| h | k |\n| mm | 1 |\n| 200 | 1.0 |\n| 100 | 0.9 |\nx = 2 m\ny = x*\n")
    assert [c for c, _, _ in codes(r)] == ["syntax", "syntax"]
    assert [ln for _, ln, _ in codes(r)] == [5, 7]


@pytest.mark.parametrize("use, code, line, col", [
    ("k_1 = lookup(k_h.k, h=12 kN)", "dimension-mismatch", 7, 23),     # a key of the wrong dimension
    ("k_1 = lookup(k_h.k, b=120 mm)", "type-mismatch", 7, 21),         # a key the table lacks
    ("k_1 = lookup(k_h.k)", "type-mismatch", 7, 7),                    # no key
    ("k_1 = lookup(k_h, h=120 mm)", "type-mismatch", 7, 14),           # which column?
    ("k_1 = lookup(k_h.q, h=120 mm)", "unknown-field", 7, 14),         # no such column
    ("k_1 = lookup(k_h.h, h=120 mm)", "type-mismatch", 7, 14),         # the key is not a value to read
    ("k_1 = lookup(k_h.k, h=[1 mm, 2 mm])", "type-mismatch", 7, 23),   # a key is one value
    ("x = 2\nk_1 = lookup(x, h=120 mm)", "type-mismatch", 8, 14),      # not a table
    ("k_1 = k_h * 2", "type-mismatch", 7, 7),                          # a table is no quantity
    ("k_h(x) = x", "redefinition", 7, 1),                              # a name is a function or a value
])
def test_bad_lookups_are_located_errors_in_check_and_build(use, code, line, col):
    assert both(K_H + use + "\n") == ([(code, line, col)], [(code, line, col)])


# ---------------------------------------------------------------- two-way


TWO_WAY = """\
c_t =
| h \\ b   | 100  | 200  | 300  |
| mm \\ mm | 1    | 1    | 1    |
| 100     | 1.00 | 0.90 | 0.80 |
| 200     | 0.95 | 0.85 | 0.70 |
"""


def test_a_two_way_lookup_is_bilinear_and_shows_both_steps():
    r = calcsheet.run(TWO_WAY + "k = lookup(c_t, h=150 mm, b=250 mm)\n")
    assert r.ok, r.format_diagnostics()
    # by hand: at b=200: 0.875, at b=300: 0.75, halfway: 0.8125
    assert r.values["k"].m_as("") == pytest.approx(0.8125)
    text = TextDocument().items(r.items)
    assert "0.900 + (0.850 − 0.900) · (150 mm − 100 mm) / (200 mm − 100 mm) = 0.875" in text
    assert "0.875 + (0.750 − 0.875) · (250 mm − 200 mm) / (300 mm − 200 mm) = 0.813" in text


def test_a_two_way_table_needs_both_keys_and_no_column():
    assert both(TWO_WAY + "k = lookup(c_t, h=150 mm)\n")[0] == [("type-mismatch", 6, 5)]
    assert both(TWO_WAY + "k = lookup(c_t.b, h=150 mm, b=200 mm)\n")[0] == [("type-mismatch", 6, 12)]


# ---------------------------------------------------------------- round trip


def test_tables_print_back_as_sheet_syntax_and_parse_to_the_same_tree():
    for text in (K_H, TWO_WAY):
        sheet, _ = parse_sheet(text)
        stmt = sheet.body[0]
        assert isinstance(stmt, N.TableDef)
        printed = SheetPrinter().statement(stmt)
        again, diags = parse_sheet(printed + "\n")
        assert again.body[0] == stmt, printed
    for use in ("k_1 = lookup(k_h.k, h=120 mm)", "k_1 = lookup(k_h.k, h=120 mm, clamp)",
                "k = lookup(c_t, h=150 mm, b=250 mm)"):
        stmt = parse_sheet(use + "\n")[0].body[0]
        assert SheetPrinter().statement(stmt) == use
        assert parse_sheet(SheetPrinter().statement(stmt) + "\n")[0].body[0] == stmt


@settings(max_examples=30, deadline=None, database=None)
@given(keys, st.data())
def test_any_table_round_trips(xs, data):
    ys = data.draw(st.lists(st.integers(-999, 999), min_size=len(xs), max_size=len(xs)))
    text = pipe_table("t", ["x", "y_1"], ["mm", "kN/m"], [[repr(a), str(b)] for a, b in zip(xs, ys)])
    sheet, diags = parse_sheet(text)
    assert not diags
    printed = SheetPrinter().statement(sheet.body[0])
    assert parse_sheet(printed + "\n")[0].body[0] == sheet.body[0]


# ---------------------------------------------------------------- from a CSV file

CSV = "h,k\nmm,1\n100,1.00\n150,0.95\n200,0.90\n"


def test_a_table_is_read_from_a_csv_file_beside_the_sheet_and_stamped(tmp_path):
    (tmp_path / "factors.csv").write_text(CSV, encoding="utf-8")
    sheet = tmp_path / "s.calc"
    sheet.write_text('k_h = table "factors.csv"  -- from the supplier\nk = lookup(k_h.k, h=120 mm)\n')
    r = calcsheet.run(sheet)
    assert r.ok, r.format_diagnostics()
    assert r.values["k"].m_as("") == pytest.approx(np.interp(120, [100, 150, 200], [1.0, 0.95, 0.9]))
    assert SheetPrinter().statement(r.sheet.body[0]) == 'k_h = table "factors.csv"  -- from the supplier'
    stamped = r.to_json()["source"]["includes"]
    assert stamped == [{"path": str(tmp_path / "factors.csv"),
                        "sha256": hashlib.sha256(CSV.encode()).hexdigest()}]


def test_an_error_in_a_csv_table_is_located_in_the_csv_file(tmp_path):
    (tmp_path / "factors.csv").write_text("h,k\nmm,1\n200,1.00\n150,0.95\n", encoding="utf-8")
    sheet = tmp_path / "s.calc"
    sheet.write_text('k_h = table "factors.csv"\n')
    (d,) = calcsheet.run(sheet).errors
    assert (d.code, d.path, d.span.line, d.span.col) == ("syntax", str(tmp_path / "factors.csv"), 4, 1)
    assert "must increase strictly" in d.message


@pytest.mark.parametrize("target, message", [
    ("../outside.csv", "outside the sheet's folder"),
    ("missing.csv", "no such table file"),
    ("/etc/passwd.csv", "relative to the sheet's folder"),
    ("factors.txt", "a table is read from a .csv file"),
])
def test_a_csv_table_obeys_the_include_containment_rules(tmp_path, target, message):
    (tmp_path / "outside.csv").write_text(CSV)
    folder = tmp_path / "sheets"
    folder.mkdir()
    (folder / "factors.txt").write_text(CSV)
    sheet = folder / "s.calc"
    sheet.write_text(f'k_h = table "{target}"\n')
    (d,) = calcsheet.run(sheet).errors
    assert d.code == "include" and message in d.message and d.span.line == 1


def test_a_csv_table_is_read_through_the_size_cap_and_strict_utf8(tmp_path, monkeypatch):
    (tmp_path / "bad.csv").write_bytes(b"h,k\nmm,1\n100,\xff\n")
    sheet = tmp_path / "s.calc"
    sheet.write_text('k_h = table "bad.csv"\n')
    (d,) = calcsheet.run(sheet).errors
    assert "not UTF-8" in d.message
    monkeypatch.setenv("CALCSHEET_LIMIT_TABLE_BYTES", "10")
    (tmp_path / "big.csv").write_text(CSV)
    sheet.write_text('k_h = table "big.csv"\n')
    (d,) = calcsheet.run(sheet).errors
    assert "TABLE_BYTES" in (d.hint or "")


@pytest.mark.parametrize("units, col", [
    ("| mx \\ mm | 1 | 1 |", 3),    # the row key's unit: its cell, the first of the row
    ("| mm \\ mx | 1 | 1 |", 3),    # the column key's unit shares that cell
    ("| mm \\ mm | kx | kx |", 13),  # the values' unit: the first value column's cell
])
def test_an_unknown_unit_of_a_two_way_table_is_located_at_its_own_cell(units, col):
    text = "t =\n| h \\ b | 1 | 2 |\n" + units + "\n| 1 | 1 | 2 |\n| 2 | 3 | 4 |\n"
    assert both(text) == ([("unknown-unit", 3, col)], [("unknown-unit", 3, col)])


def test_a_two_way_tables_keys_read_as_lists_are_its_row_keys_and_its_column_keys():
    r = calcsheet.run(TWO_WAY + "hs = c_t.h\nbs = c_t.b\n")
    assert r.ok, r.format_diagnostics()
    assert list(r.values["hs"].m_as("mm")) == [100, 200]       # the first column, down
    assert list(r.values["bs"].m_as("mm")) == [100, 200, 300]  # the header row, across
