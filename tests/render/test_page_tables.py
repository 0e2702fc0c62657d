"""A plugin's table never runs off the page: one wider than the text block is split into column groups, or, when
it is name–value pairs side by side, reflowed with fewer pairs a row; a long table may continue on the next page."""
import io
import re

import pytest

import calcsheet
from calcsheet.package import ASSETS
from calcsheet.render.page import LONG_TABLE_ROWS, TABLE_WIDTH_PT, PackageDocument, column_groups
from calcsheet.trace import Table


def test_a_narrow_table_stays_whole():
    rows = [["Support", "x", "Type"], ["A", "0", "pinned"]]
    assert column_groups(rows, TABLE_WIDTH_PT) == [[0, 1, 2]]


def test_a_wide_table_splits_into_groups_that_repeat_the_row_label_and_cover_every_column_once():
    rows = [["Support"] + [f"R_{i}" for i in range(30)], ["A"] + ["−10.8"] * 30]
    groups = column_groups(rows, TABLE_WIDTH_PT)
    assert len(groups) > 1
    assert all(g[0] == 0 for g in groups)
    assert sorted(i for g in groups for i in g[1:]) == list(range(1, 31))
    # each group fits: at the widest glyph of the table's font (0.63 em of 7.8 pt) plus a cell's padding
    assert all(sum(5 * 4.9 + 8.5 for _ in g) <= TABLE_WIDTH_PT for g in groups)


def test_the_package_prints_a_wide_table_as_continued_tables():
    r = calcsheet.run("x = 1 m\n")
    doc = PackageDocument(r)
    t = Table(title="Reactions", columns=["Support"] + [f"R_{i}" for i in range(24)],
              rows=[["A"] + [f"{i}.25" for i in range(24)], ["B"] + [f"−{i}.5" for i in range(24)]])
    html = str(doc.record(t))
    captions = re.findall(r"<caption>(.*?)</caption>", html)
    assert captions[0] == "Reactions" and captions[1].startswith("Reactions (continued, 2 of")
    assert html.count("<td>A</td>") == len(captions)  # the row label heads every group
    assert all(f"<td>{i}.25</td>" in html for i in range(24))  # no cell lost


def _cells(html: str) -> list[list[str]]:
    """The body rows' cells (the head row has none)."""
    return [cells for row in re.findall(r"<tr>(.*?)</tr>", html) if (cells := re.findall(r"<td>(.*?)</td>", row))]


def test_name_value_pairs_too_wide_for_the_block_are_reflowed_with_fewer_pairs_a_row_never_mislabelled():
    # four pairs a row of long names and values would need column groups; a group repeating the first column
    # would put the first pair's names beside the last pair's values. The pairs are reflowed instead, in
    # reading order, each value staying beside its own name.
    r = calcsheet.run("x = 1 m\n")
    doc = PackageDocument(r)
    pairs = [(f"name_number_{i:02d}", f"{i}.123456789×10⁵ mm⁴") for i in range(14)]
    rows = [sum(map(list, pairs[k:k + 4]), []) for k in range(0, 14, 4)]
    rows[-1] += ["", ""] * (4 - len(pairs[12:]))
    t = Table(title="Further properties", columns=["Property", "Value"] * 4, rows=rows)
    assert len(column_groups([t.columns, *rows], TABLE_WIDTH_PT)) > 1  # as laid out, it would not fit
    html = str(doc.record(t))
    assert "continued" not in html and html.count("<table") == 1
    cells = _cells(html)
    per = len(re.findall(r"<th>", html)) // 2
    assert 1 <= per < 4 and all(len(row) == 2 * per for row in cells)
    flat = [c for row in cells for c in row]
    shown = [(flat[i], flat[i + 1]) for i in range(0, len(flat), 2) if flat[i]]
    assert shown == pairs  # every pair once, in order, name beside its value
    assert len(column_groups([["Property", "Value"] * per, *cells], TABLE_WIDTH_PT)) == 1


def test_a_table_that_is_not_pairs_still_splits_into_column_groups():
    r = calcsheet.run("x = 1 m\n")
    t = Table(title="Reactions", columns=["Support"] + [f"R_{i}" for i in range(24)],
              rows=[["A"] + [f"{i}.25" for i in range(24)]])
    assert "continued" in str(PackageDocument(r).record(t))


def test_a_long_table_may_break_across_pages_a_short_one_stays_whole():
    r = calcsheet.run("x = 1 m\n")
    doc = PackageDocument(r)

    def table(n):
        return str(doc.record(Table(title="T", columns=["Combination", "M"], rows=[[f"C{i}", "1"] for i in range(n)])))

    assert "class='parts'" in table(LONG_TABLE_ROWS) and "class='parts long'" in table(LONG_TABLE_ROWS + 1)
    css = (ASSETS / "package.css").read_text(encoding="utf-8")
    assert re.search(r"table\.parts\s*\{[^}]*page-break-inside:\s*avoid", css)
    assert re.search(r"table\.parts\.long\s*\{[^}]*page-break-inside:\s*auto", css)
    assert re.search(r"table\.parts tr\s*\{[^}]*page-break-inside:\s*avoid", css)  # a row is never split


def test_the_sums_of_a_long_table_print_once_after_its_last_row_not_on_every_page():
    # a footer group repeats at the foot of every page a table spans (CSS 2.1 17.2); sums printed under the
    # first page's rows would read as the total of those rows
    pdfplumber = pytest.importorskip("pdfplumber")
    pytest.importorskip("weasyprint")
    from calcsheet.package import pdf_bytes

    r = calcsheet.run("x = 1 m\n")
    t = Table(title="Parts", columns=["Part", "A"], rows=[[f"p{i}", f"{i}"] for i in range(90)],
              footer=[["TOTALSUM", "4005"]])
    css = (ASSETS / "package.css").read_text(encoding="utf-8")
    html = "<html><head><style>{}</style></head><body>{}</body></html>".format(css, PackageDocument(r).record(t))
    with pdfplumber.open(io.BytesIO(pdf_bytes(html))) as pdf:
        counts = [page.extract_text().count("TOTALSUM") for page in pdf.pages]
    assert len(counts) > 1 and counts[-1] == 1 and sum(counts) == 1
