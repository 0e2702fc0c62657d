"""One statement into our nodes: every form, precedence, positions, and the limits that keep a parse bounded."""
import time

from calcsheet import nodes as N
from calcsheet.parser import parse_expression, parse_sheet


def body(text):
    sheet, diags = parse_sheet(text)
    assert diags == [], [d.message for d in diags]
    return sheet.body


def diags_of(text):
    return parse_sheet(text)[1]


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


def test_check_forms():
    ops = [s.op for s in body("check a <= b\ncheck a < b\ncheck a >= b\ncheck a > b\ncheck a ≤ b\n")]
    assert ops == ["<=", "<", ">=", ">", "<="]


def test_greek_and_unicode_names():
    (d,) = body("σ_b = 2\n")
    assert d.name == "σ_b"


def test_no_lark_objects_leave_the_parser():
    sheet, _ = parse_sheet("x = sqrt(2 m^2) + a.b\ncheck x <= 3 m\n")
    for n in N.walk(sheet):
        for value in vars(n).values():
            assert "lark" not in type(value).__module__


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
