"""A plugin's table never runs off the page: one wider than the text block is split into column groups."""
import re

import calcsheet
from calcsheet.render.page import TABLE_WIDTH_PT, PackageDocument, column_groups
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
