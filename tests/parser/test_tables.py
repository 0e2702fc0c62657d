"""Where a table starts and ends among the lines of a sheet, and what the parser keeps of it."""
from calcsheet import nodes as N
from calcsheet.parser import parse_sheet


def test_a_table_is_the_pipe_rows_right_under_name_equals():
    sheet, diags = parse_sheet("# Factors\nk =   -- by depth\n| h | k |\n| --- | --- |\n| mm | 1 |\n| 1 | 2 |\n"
                               "| 2 | 3 |\nx = 2\n")
    assert not diags
    heading, table, x = sheet.body
    assert isinstance(table, N.TableDef) and isinstance(x, N.Definition)
    assert table.header == ("h", "k") and table.units == ("mm", "1")  # the Markdown rule row is skipped
    assert table.values == ((1.0, 2.0), (2.0, 3.0))
    assert table.description == "by depth"
    assert (table.span.line, table.span.end_line) == (2, 7)


def test_name_equals_with_nothing_under_it_is_still_a_syntax_error():
    _, diags = parse_sheet("k =\nx = 2\n")
    assert [(d.code, d.span.line) for d in diags] == [("syntax", 1)]


def test_a_comment_after_a_row_is_not_a_cell():
    sheet, diags = parse_sheet("k =\n| h | k |  // from the supplier's sheet\n| mm | 1 |\n| 1 | 2 |\n| 2 | 3 |\n")
    assert not diags and sheet.body[0].header == ("h", "k")


def test_each_cell_keeps_its_place_for_errors():
    sheet, _ = parse_sheet("k =\n| h   | k |\n| mm  | 1 |\n| 100 | 2 |\n| 200 | 3 |\n")
    spans = sheet.body[0].cell_spans
    assert [(s.line, s.col, s.end_col) for s in spans[2]] == [(4, 3, 6), (4, 9, 10)]


def test_a_broken_table_is_one_error_and_the_next_statement_is_read():
    sheet, diags = parse_sheet("k =\n| h | k |\n| mm | 1 |\n| 1 | 2 | 3 |\n| 2 | 3 |\ny = 2\n")
    assert [(d.code, d.span.line) for d in diags] == [("syntax", 4)]
    assert [type(s).__name__ for s in sheet.body] == ["Definition"]


def test_lookup_reads_clamp_as_a_flag_and_other_words_as_names():
    sheet, _ = parse_sheet("k = lookup(t.k, h=1 mm, clamp)\nz = max(clamp, 2)\n")
    call = sheet.body[0].expr
    assert isinstance(call.args[1], N.Flag) and call.args[1].name == "clamp"
    assert isinstance(sheet.body[1].expr.args[0], N.Name)  # only lookup has flags
