"""A sheet's own functions: ``M_ss(w [kN/m], L [m]) [kN*m] = w*L^2/8``, called like a built-in.

The beam formulas below are facts of statics (# common practice): a simply supported span under a uniform
line load w has the midspan moment w·L²/8 and end reactions w·L/2; a cantilever has the root moment w·L²/2.
"""
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calcsheet import nodes as N
from calcsheet.parser import parse_sheet
from calcsheet.render.html import HtmlMathPrinter
from calcsheet.render.sheet import SheetPrinter
from calcsheet.render.text import TextDocument
from calcsheet.trace import FunctionStep

BEAMS = """\
M_ss(w [kN/m], L [m]) [kN*m] = w*L^2/8   -- simply supported, midspan
R(w, L) = w*L/2   -- end reaction
w_1 = 5 kN/m
L_1 = 6 m
M_1 = M_ss(w_1, L_1)   -- roof beam
R_1 = R(w_1, L_1)
M_2 = 2*M_ss(3 kN/m, 4000 mm)
check M_ss(w_1, L_1) <= 30 kN*m
"""


def codes(result):
    return [(d.code, d.span.line, d.span.col) for d in result.errors]


# ---------------------------------------------------------------- parsing


def test_a_function_definition_parses_with_its_parameters_units_and_description():
    sheet, diags = parse_sheet(BEAMS)
    assert not diags
    fd = sheet.body[0]
    assert isinstance(fd, N.FunctionDef)
    assert fd.name == "M_ss" and fd.param_names == ("w", "L")
    assert [p.unit_text for p in fd.params] == ["kN/m", "m"]
    assert fd.unit_text == "kN*m"
    assert fd.description == "simply supported, midspan"
    untyped = sheet.body[1]
    assert [p.unit for p in untyped.params] == [None, None] and untyped.unit is None


def test_function_definitions_print_back_as_sheet_syntax_and_parse_to_the_same_tree():
    sheet, _ = parse_sheet(BEAMS)
    printer = SheetPrinter()
    for stmt in sheet.body:
        again, diags = parse_sheet(printer.statement(stmt) + "\n")
        assert not diags
        assert again.body[0] == stmt


@settings(max_examples=60, deadline=None, derandomize=True)
@given(st.lists(st.tuples(st.sampled_from(["a", "b", "w", "L_0", "h"]), st.sampled_from([None, "m", "kN/m", "1"])),
                min_size=1, max_size=4, unique_by=lambda t: t[0]),
       st.sampled_from([None, "kN*m", "mm"]), st.sampled_from(["a*b", "w + 1", "sqrt(h)", "max(a, b)/2"]))
def test_round_trip_of_any_function_definition(params, result_unit, body):
    decl = lambda u: "" if u is None else f" [{u}]"  # noqa: E731
    text = f"F({', '.join(n + decl(u) for n, u in params)}){decl(result_unit)} = {body}\n"
    stmt = parse_sheet(text)[0].body[0]
    again = parse_sheet(SheetPrinter().statement(stmt) + "\n")[0].body[0]
    assert again == stmt


# ---------------------------------------------------------------- evaluation


def test_calls_give_the_beam_formulas(run):
    r = run(BEAMS)
    assert r.ok, r.format_diagnostics()
    assert r.values["M_1"].to("kN*m").magnitude == pytest.approx(5 * 6 ** 2 / 8)  # w·L²/8
    assert r.values["R_1"].to("kN").magnitude == pytest.approx(5 * 6 / 2)  # w·L/2
    assert r.values["M_2"].to("kN*m").magnitude == pytest.approx(2 * 3 * 4 ** 2 / 8)  # mm converted to m
    assert r.checks[0].ok and r.checks[0].ratio == pytest.approx(22.5 / 30)
    assert "M_ss" not in r.values  # a function is not a value


def test_a_declared_result_unit_is_the_unit_shown(run):
    r = run("M_c(w [kN/m], L [m]) [kN*m] = w*L^2/2\nM = M_c(2000 N/m, 3000 mm)\n")  # cantilever w·L²/2
    assert str(r.values["M"].units) == "kN * m"
    assert r.values["M"].magnitude == pytest.approx(9.0)


def test_a_function_body_reads_values_defined_above_it(run):
    r = run("gamma_G = 1.35\nE_d(G [kN]) [kN] = gamma_G*G\nE_1 = E_d(10 kN)\n")
    assert r.values["E_1"].to("kN").magnitude == pytest.approx(13.5)


def test_functions_call_functions_defined_above(run):
    r = run("A(b, h) = b*h\nI(b, h) = A(b, h)*h^2/12\nI_1 = I(100 mm, 200 mm)\n")  # b·h³/12 of a rectangle
    assert r.values["I_1"].to("mm^4").magnitude == pytest.approx(100 * 200 ** 3 / 12)


def test_untyped_parameters_take_the_dimensions_of_each_call(run):
    r = run("twice(x) = 2*x\na = twice(3 m)\nb = twice(4 kN)\n")
    assert r.ok
    assert r.values["a"].to("m").magnitude == 6 and r.values["b"].to("kN").magnitude == 8


# ---------------------------------------------------------------- located errors


@pytest.mark.parametrize("text, code, line, col", [
    ("M(w [kN/m], L [m]) = w*L^2/8\nx = M(5 kN, 6 m)\n", "declared-unit-mismatch", 2, 7),  # the argument
    ("A(x, y) = x + y\na = A(1 m, 2 s)\n", "dimension-mismatch", 2, 5),  # the call
    ("A(x, y) = x + y\na = A(1 m)\n", "type-mismatch", 2, 5),  # arity
    ("A(x, y) = x + y\na = A(x=1 m, y=2 m)\n", "unknown-function", 2, 7),
    ("B(x) [m] = x*2\nb = B(2 s)\n", "declared-unit-mismatch", 2, 5),
    ("B(x [m], y [m]) [kN] = x + y\n", "declared-unit-mismatch", 1, 18),  # checked though never called
    ("B(x [m], y [s]) = x + y\n", "dimension-mismatch", 1, 19),
    ("M(w) = w\nf = M\n", "undefined-name", 2, 5),
    ("G(x) = x + G(x)\n", "use-before-definition", 1, 12),
    ("H(x) = x + K(x)\nK(x) = x\n", "use-before-definition", 1, 12),
    ("a = 1 m\nF(x) = x + b\nb = 2 m\n", "use-before-definition", 2, 12),
    ("b = 3 m\nb(x) = x\n", "redefinition", 2, 1),
    ("b(x) = x\nb = 3 m\n", "redefinition", 2, 1),
    ("b = 3 m\nc = b(2)\n", "unknown-function", 2, 5),
    ("P(x, x) = x\n", "redefinition", 1, 6),
    ("P(pi) = pi\n", "redefinition", 1, 3),
    ("Q(u) = u + zz\n", "undefined-name", 1, 12),
    ("Q(u [furlongs]) = u\n", "unknown-unit", 1, 6),
])
def test_mistakes_are_located_errors(run, text, code, line, col):
    r = run(text)
    assert not r.ok
    assert codes(r)[0] == (code, line, col), r.format_diagnostics()


def test_a_wrong_argument_names_the_parameter_and_the_error_in_a_body_names_the_function(run):
    r = run("M(w [kN/m], L [m]) = w*L^2/8\nx = M(5 kN, 6 m)\nA(p, q) = p + q\ny = A(1 m, 2 s)\n")
    messages = [d.message for d in r.errors]
    assert "parameter 'w'" in messages[0]
    assert "call of A" in messages[1] and "line 3" in messages[1]


def test_statements_after_a_broken_function_are_not_reported_again(run):
    r = run("B(x [m]) [kN] = x\nb = B(2 m)\nc = b*2\n")
    assert len(r.errors) == 1


# ---------------------------------------------------------------- printing


def test_the_definition_prints_once_and_each_call_as_formula_substitution_result(run):
    r = run(BEAMS)
    defs = [i for i in r.items if isinstance(i, FunctionStep)]
    assert [d.name for d in defs] == ["M_ss", "R"]
    text = TextDocument().items(r.items)
    assert "M_ss(w [kN/m], L [m]) [kN*m] = w·L²/8   -- simply supported, midspan" in text
    # inputs are substituted exactly as the sheet wrote them (5 kN/m, 6 m), so a checker can redo the step
    assert "M_1 = M_ss(w_1, L_1) = 5 kN/m · (6 m)² / 8 = 22.5 kN·m" in text
    assert "check M_ss(w_1, L_1) ≤ 30 kN·m:  5 kN/m · (6 m)² / 8 ≤ 30 kN·m" in text
    assert "M_2 = 2·M_ss(3 kN/m, 4000 mm) = 2 · (3 kN/m · (4000 mm)² / 8) = 12.0 kN·m" in text


def test_html_shows_the_definition_with_units_and_the_written_out_call(run):
    r = run(BEAMS)
    html = HtmlMathPrinter()
    fd = next(i for i in r.items if isinstance(i, FunctionStep))
    head, body = (str(p) for p in html.step_parts(fd))
    assert "[kN/m]" in head and "[kN*m]" in head and "<sub>ss</sub>" in head
    parts = [str(p) for p in html.step_parts(r.steps["M_1"])]
    assert len(parts) == 4  # M_1 = M_ss(w_1, L_1) = 5 kN/m·(6 m)²/8 = 22.5 kN·m
    assert "<sub>ss</sub>" in parts[1] and "8" in parts[2] and "22.5" in parts[3]


def test_sheet_text_in_a_function_is_escaped_in_html(run):
    r = run('F(x [m]) = x  -- <script>alert(1)</script>\ny = F(2 m)\n')
    from calcsheet.render.page import PackageDocument

    assert "<script>alert" not in str(PackageDocument(r).html())


def test_functions_calling_functions_cannot_blow_up(run):
    lines = ["f_0(x) = x"] + [f"f_{i}(x) = f_{i - 1}(x) + f_{i - 1}(x)" for i in range(1, 17)]  # 2^16 calls
    r = run("\n".join(lines) + "\ny = f_16(1 m)\nz = f_3(1 m)\n")
    assert codes(r) == [("too-complex", 18, 5)], r.format_diagnostics()
    assert r.values["z"].m_as("m") == 8  # a reasonable nesting still works


def test_a_field_of_a_parameter_is_substituted_as_the_arguments_field(run):
    r = run("sec = section.rectangle(b=100 mm, h=200 mm)\nsig(M, s) = M/s.S_x\nsigma [MPa] = sig(10 kN*m, sec)\n")
    assert r.ok, r.format_diagnostics()
    assert r.values["sigma"].m_as("MPa") == pytest.approx(10e6 / (100 * 200**2 / 6))  # M/(bh²/6)
    line = TextDocument().items(r.items).splitlines()[-1]
    assert "sec.S_x" not in line.split("=")[2] and "6.67×10⁵ mm³" in line.split("=")[2]  # S_x = bh²/6


BODIES = ["u*v^2/8", "u + v", "sqrt(u*v)", "max(u, v) - min(u, v)", "(u - v)/2", "if(u <= v, u, v)", "abs(u - v)*k"]
ARGS = ["3 m", "250 mm", "a", "2*a", "(a + 1 m)", "b/2", "-a"]


@settings(max_examples=80, deadline=None, derandomize=True)
@given(st.sampled_from(BODIES), st.sampled_from(ARGS), st.sampled_from(ARGS), st.sampled_from([None, "m"]))
def test_a_call_gives_what_the_body_gives_with_the_arguments_written_in(body, x, y, unit):
    """The meaning of a call is its body with each parameter replaced by its (bracketed) argument."""
    import re

    import calcsheet

    decl = "" if unit is None else f" [{unit}]"
    written = re.sub(r"\b[uv]\b", lambda m: f"({x})" if m.group() == "u" else f"({y})", body)
    r = calcsheet.run(f"k = 1.5\na = 2 m\nb = 900 mm\nF(u{decl}, v{decl}) = {body}\n"
                      f"p = F({x}, {y})\nq = {written}\n")
    if not r.ok:  # e.g. the square root of a negative: then both ways fail, on their own lines
        assert sorted(d.span.line for d in r.errors) == [5, 6], r.format_diagnostics()
        assert {d.code for d in r.errors} == {"not-finite"}
        return
    p, q = r.values["p"], r.values["q"]
    assert p.dimensionality == q.dimensionality
    assert p.to_base_units().magnitude == pytest.approx(q.to_base_units().magnitude)
