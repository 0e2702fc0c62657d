"""The sheet language: every form parses into our own nodes, with positions."""
import time

import pytest

from calcsheet import nodes as N
from calcsheet.errors import SheetErrors
from calcsheet.parser import parse_expression, parse_sheet
from calcsheet.units import split_unit


def body(text):
    sheet, diags = parse_sheet(text)
    assert diags == [], [d.message for d in diags]
    return sheet.body


def diags_of(text):
    return parse_sheet(text)[1]


def test_front_matter_becomes_meta():
    sheet, _ = parse_sheet("---\nproject: Pier 4\njob: 26-1\nunits: US\n---\nx = 1\n")
    assert sheet.meta_dict == {"project": "Pier 4", "job": "26-1", "units": "US"}
    assert isinstance(sheet.body[0], N.Definition) and sheet.body[0].span.line == 6


def test_front_matter_lists():
    sheet, _ = parse_sheet("---\nrevisions:\n  - A | 2026-01-01 | X | first\n  - B | 2026-02-01 | Y | second\n---\n")
    assert sheet.meta_dict["revisions"] == ["A | 2026-01-01 | X | first", "B | 2026-02-01 | Y | second"]


def test_unclosed_front_matter_is_an_error():
    d = diags_of("---\nproject: x\n")
    assert d and d[0].code == "front-matter"


def test_headings_prose_and_hidden_comments():
    b = body("# Loads\n## Dead\n> Boards span 0.8 m.\n> Second line.\n// hidden\nx = 1\n")
    assert [type(s).__name__ for s in b] == ["Heading", "Heading", "Prose", "Definition"]
    assert (b[0].level, b[0].text) == (1, "Loads") and b[1].level == 2
    assert b[2].text == "Boards span 0.8 m.\nSecond line."


def test_definition_with_unit_description_and_comment():
    (d,) = body("w [kN/m] = 1.2*w_D  -- factored load // note to self\n".replace("w_D", "3 kN/m"))
    assert d.name == "w" and d.unit == (("kN", 1.0), ("m", -1.0)) and d.unit_text == "kN/m"
    assert d.description == "factored load" and d.comment == "note to self"
    assert (d.name_span.line, d.name_span.col) == (1, 1)
    assert (d.unit_span.col, d.unit_span.end_col) == (4, 8)


def test_dimensionless_declaration():
    (d,) = body("k [1] = 0.8\n")
    assert d.unit == ()


def test_quantity_literals():
    (d,) = body("x = 150 mm + 2.1e5 N/mm^2 + 5 kN/m + 30 deg + .5 m\n")
    nums = [n for n in N.walk(d.expr) if isinstance(n, N.Number)]
    assert [(n.value, n.unit) for n in nums] == [
        (150.0, (("mm", 1.0),)), (2.1e5, (("N", 1.0), ("mm", -2.0))), (5.0, (("kN", 1.0), ("m", -1.0))),
        (30.0, (("deg", 1.0),)), (0.5, (("m", 1.0),))]


def test_unit_needs_no_space_and_a_spaced_operator_is_an_operator():
    (d,) = body("w_D = 0.65 kPa * s\n".replace(" s", " 2"))
    assert isinstance(d.expr, N.Mul) and d.expr.left.unit == (("kPa", 1.0),)


def test_operators_and_precedence():
    e = parse_expression("-a^2 + b*c/d - e")
    assert isinstance(e, N.Sub)
    left = e.left
    assert isinstance(left, N.Add) and isinstance(left.left, N.Neg) and isinstance(left.left.operand, N.Pow)
    assert isinstance(left.right, N.Div) and isinstance(left.right.left, N.Mul)


def test_power_is_right_associative():
    e = parse_expression("a^b^c")
    assert isinstance(e, N.Pow) and isinstance(e.right, N.Pow)


def test_functions_plugin_calls_fields_lists_points_and_text():
    e = parse_expression('max(sqrt(x), 2) + section.rect(b=150 mm, h=sec.A).I_x')
    call = e.left
    assert isinstance(call, N.Call) and call.func == "max" and isinstance(call.args[0], N.Call)
    field = e.right
    assert isinstance(field, N.FieldAccess) and field.field_name == "I_x"
    pc = field.obj
    assert isinstance(pc, N.PluginCall) and (pc.namespace, pc.func) == ("section", "rect")
    assert [k.name for k in pc.kwargs] == ["b", "h"] and isinstance(pc.kwargs[1].value, N.FieldAccess)
    e = parse_expression('p.f(pts=[(0 mm, 0 mm), (1 mm, 2 mm)], kind="pinned", xs=[1, 2,])')
    pts, kind, xs = (k.value for k in e.kwargs)
    assert isinstance(pts, N.ListExpr) and all(isinstance(t, N.TupleExpr) for t in pts.items)
    assert isinstance(kind, N.Text) and kind.value == "pinned"
    assert len(xs.items) == 2


def test_statement_continues_inside_open_brackets():
    b = body("sec = section.tee(b=150 mm,  -- flange\n    h=220 mm)\ny = 2\n")
    assert isinstance(b[0].expr, N.PluginCall) and b[0].span.end_line == 2 and b[0].description == "flange"
    assert b[1].name == "y" and b[1].span.line == 3


def test_check_forms():
    ops = [s.op for s in body("check a <= b\ncheck a < b\ncheck a >= b\ncheck a > b\ncheck a ≤ b\n")]
    assert ops == ["<=", "<", ">=", ">", "<="]


def test_greek_and_unicode_names():
    (d,) = body("σ_b = 2\n")
    assert d.name == "σ_b"


@pytest.mark.parametrize("text, line, col, fragment", [
    ("Deck boards span between stringers\n", 1, 6, "not a calculation"),
    ("x = 3 +\n", 1, 7, "ends too early"),
    ("x = (1 + 2\ny = 2\n", 1, 10, "not closed"),
    ("check a = b\n", 1, 9, "compares with"),
    ("x = 3 m m\n", 1, 9, "operator is missing"),
    ("x = 2 $ 3\n", 1, 7, "unexpected character"),
    ("#Loads\n", 1, 1, "space after"),
])
def test_syntax_errors_point_at_the_mistake(text, line, col, fragment):
    d = diags_of(text)
    assert d, "expected an error"
    assert (d[0].span.line, d[0].span.col) == (line, col)
    assert fragment in d[0].message
    assert d[0].code in ("syntax", "front-matter")


def test_a_bad_line_does_not_hide_the_rest():
    sheet, d = parse_sheet("x = 1\ny = = 2\nz = 3\nw = 4 +\n")
    assert [s.name for s in sheet.body] == ["x", "z"]
    assert [x.span.line for x in d] == [2, 4]


def test_unclosed_bracket_does_not_swallow_the_next_definition():
    sheet, d = parse_sheet("a = (1 + 2\nb = 3\n")
    assert [s.name for s in sheet.body] == ["b"] and d[0].span.line == 1


def test_split_unit():
    assert split_unit("kN*m/s^2") == (("kN", 1.0), ("m", 1.0), ("s", -2.0))
    assert split_unit("mm⁴") == (("mm", 4.0),)


def test_no_lark_objects_leave_the_parser():
    sheet, _ = parse_sheet("x = sqrt(2 m^2) + a.b\ncheck x <= 3 m\n")
    for n in N.walk(sheet):
        for value in vars(n).values():
            assert "lark" not in type(value).__module__


# --- limits (PITFALLS: recursion, regex backtracking, huge sheets)

def test_deep_sum_is_too_complex_not_a_crash():
    d = diags_of("x = " + "+".join(["1"] * 5000) + "\n")
    assert d and d[0].code == "too-complex"


def test_many_unary_minuses_are_too_complex_not_a_crash():
    d = diags_of("x = " + "- " * 5000 + "1\n")  # "--" would start a description
    assert d and d[0].code == "too-complex"


def test_long_power_chain_is_too_complex():
    d = diags_of("x = " + "^".join(["2"] * 2000) + "\n")
    assert d and d[0].code == "too-complex"


def test_number_regex_does_not_backtrack():
    start = time.perf_counter()
    parse_sheet("x = " + "1" * 26 + "e\n")
    parse_sheet("x = " + "1" * 30 + "e" + "m" * 30 + "/" * 30 + "\n")
    assert time.perf_counter() - start < 2.0  # a runaway regex takes seconds; generous bound


def test_huge_sheet_is_refused():
    with pytest.raises(SheetErrors):
        parse_sheet("x = 1\n" * 400_000)


def test_long_number_literal_is_refused():
    d = diags_of("x = " + "9" * 100 + "\n")
    assert d and d[0].code == "too-complex"


def test_only_unit_names_continue_a_unit_after_an_operator():
    # the sheet's own names are operands: 2 kN / a, 275 MPa · sec.S_x
    e = parse_expression("2 kN/a")
    assert isinstance(e, N.Div) and e.left.unit == (("kN", 1.0),) and e.right.id == "a"
    e = parse_expression("275 MPa*sec.S_x")
    assert isinstance(e, N.Mul) and isinstance(e.right, N.FieldAccess)
    assert parse_expression("3 kN*m/rad").unit == (("kN", 1.0), ("m", 1.0), ("rad", -1.0))
    # a vocabulary name still continues the unit (the checker warns when it is also a variable)
    assert parse_expression("0.65 kPa*s").unit == (("kPa", 1.0), ("s", 1.0))


def test_parsing_keeps_no_shared_state_between_threads():
    """Each parse counts its own lines: statements parsed at once on several threads keep their own spans."""
    from concurrent.futures import ThreadPoolExecutor

    from calcsheet.parser import parse_statement

    def parse_at(offset):
        stmt = parse_statement("x = (a +\n  b) * c", line_offset=offset)
        return offset, stmt.span.line, stmt.expr.right.span.line

    with ThreadPoolExecutor(max_workers=8) as pool:
        results = list(pool.map(parse_at, range(0, 4000, 7)))
    assert all(line == offset + 1 and right == offset + 2 for offset, line, right in results)


def test_a_syntax_error_deep_in_a_sheet_points_at_its_own_line():
    d = diags_of("x = 1\n" * 40 + "y = (2 +\n  3 3)\n")
    assert d and (d[0].span.line, d[0].span.col) == (42, 5)
