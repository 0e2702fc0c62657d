"""The quick statement reader gives exactly what the grammar gives, or leaves the statement to it.

``parser.fast`` reads everyday statements without the LALR machinery. Its contract is one-sided: for any
text it returns None or the node the grammar builds, every span included (``repr`` shows spans, ``==`` on
nodes does not), and it never returns a node for text the grammar refuses. The oracle is the grammar
itself, run with the quick reader switched off.
"""
from __future__ import annotations

from contextlib import contextmanager
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from calcsheet.errors import CalcError
from calcsheet.parser import fast, grammar, parse_sheet
from tests.fuzz.strategies import statements

REPO = Path(__file__).parents[2]


@contextmanager
def grammar_only():
    fast.disable()
    try:
        yield
    finally:
        assert fast.enable(grammar.lalr())


def by_grammar(text: str, line_offset: int = 0):
    """The grammar's node, or the error it raises (as a comparable tuple)."""
    with grammar_only():
        try:
            return repr(grammar.parse(text, line_offset))
        except CalcError as exc:
            return ("error", type(exc).__name__, exc.message, exc.span)


def agree(text: str, line_offset: int = 0) -> bool:
    """Holds the contract for one text; True when the quick reader read it."""
    grammar.lalr()
    quick = fast.parse(text, line_offset)
    expected = by_grammar(text, line_offset)
    if quick is None:
        return False
    assert repr(quick) == expected, f"quick reader differs on {text!r}"
    return True


def test_the_quick_reader_is_on_for_this_grammar():
    assert fast.enable(grammar.lalr())


@pytest.mark.parametrize("text", [
    "x = 5 m",
    "w [kN/m] = 1.2*3 kPa * 0.6 m + 1.5 kN/m",
    "M_1 [kN*m] = w_1*L_1^2/8",
    "check s_1 <= 250 MPa",
    "check a ≥ b",
    "sec = section.rectangle(b=60 mm, h=200 mm)",
    "sigma [MPa] = M/sec.S_x",
    "y = -a^-2^3 + f(a, b <= c, k=2,)",
    "q = \"S355\"",
    "p = a / 2 · 3 × 4 - +b",
    "k [1] = 0.8",
    "r = 2.5e5 mm^3 + .5 m + 3. m",
    "t = 5 m²",
    "u = max(a, b)",
    "v = if(a <= b, 1 m, 2 m)",
    "    indented = 3 kN   ",
    "f(x [m]) [m] = 2*x",  # a sheet's own function
    "M_ss(w [kN/m], L [m]) [kN*m] = w*L^2/8",
    "g( a , b [ mm ] ) = a * b",
    "k(n [1]) = n + 1",
    "L = [3.6 m, 4.2 m, 4.5 m]",  # lists
    "s = section.built_up(parts=[web, cover], detail=\"brief\")",
    "b = beam.solve(spans=[6.0 m, 4.8 m], loads=[beam.udl(w=w_u)])",
    "e = []",
    "l = [3 m]",
    "t = [a, b,] ",
    "n = max([1 m, 2 m]) + [a, [b, c]].x",
])
def test_everyday_statements_are_read_quickly_and_identically(text):
    assert agree(text, 41)


@pytest.mark.parametrize("text", [
    "z = (a +\n  b) * 2.5e3 N/mm^2",
    "s = section.rectangle(\n    b=100 mm,\n    h=200\n mm)",
    "c = max(1 m,\n\n   2 m\n)",
])
def test_statements_over_several_lines_keep_lark_positions(text):
    assert agree(text, 7)


@pytest.mark.parametrize("text", [
    "f() = 1",  # a sheet's function needs a parameter
    "f(x,) = x",
    "f(x [2 m]) = x",
    "f(check) = 1",
    "f(x) == x",
    "p = (1 m, 2 m)",  # a point
    "l = [a]",  # a list of one item reads like a declared unit
    "l = [,]",
    "l = [a,,b]",
    "l = [a b]",
    "x = 1e999",  # overflow: the grammar's callback words it
    "x = 1e-999",
    "x = " + "9" * 45,
    "x = 5 m(2)",  # calling a number
    "x = (a)(b)",
    "check = 1",
    "x = check + 1",
    "x == 1",
    "x = ",
    "x [kN * m] = 1 kN*m",
    "x [2 m] = 1",
    "x = a b",
    "x = 1\u00a0m",
    "x = " + "(" * 80 + "1" + ")" * 80,
])
def test_anything_unusual_or_wrong_is_left_to_the_grammar(text):
    assert fast.parse(text) is None
    by_grammar(text)  # whatever the grammar makes of it (node or error) stands


def test_demo_and_test_sheets_parse_identically_with_and_without_the_quick_reader():
    files = sorted({*REPO.glob("sheets/**/*.calc"), *REPO.glob("tests/**/*.calc")})
    assert files
    for path in files:
        text = path.read_text(encoding="utf-8")
        sheet, diags = parse_sheet(text, str(path))
        with grammar_only():
            sheet2, diags2 = parse_sheet(text, str(path))
        assert repr(sheet) == repr(sheet2), path
        assert [(d.code, d.message, d.span) for d in diags] == [(d.code, d.message, d.span) for d in diags2], path


def test_most_statements_of_the_demo_sheets_take_the_quick_road():
    read = total = 0
    for path in sorted(REPO.glob("sheets/*.calc")):
        sheet, _ = parse_sheet(path.read_text(encoding="utf-8"), str(path))
        lines = path.read_text(encoding="utf-8").split("\n")
        for stmt in sheet.body:
            if hasattr(stmt, "expr") or hasattr(stmt, "left"):
                sp = stmt.span
                text = "\n".join(lines[sp.line - 1:sp.end_line]).split("--")[0].split("//")[0]
                total += 1
                read += fast.parse(text, sp.line - 1) is not None
    assert total and read / total > 0.7, (read, total)


_PIECES = ["a", "b_2", "sec", "S_x", "check", "1", "2.5", ".5", "3.", "1e3", "2E-3", "m", "kN/m", "N/mm^2",
           "mm²", "%", "°", "+", "-", "*", "/", "^", "·", "×", "(", ")", "[", "]", ",", "=", "==", "<=", ">", "≤",
           ".", '"t"', '"', "max", "if", "section.rectangle", "φ", "²", "\n", "\n  ", " ", "\t", "\u00a0", "#"]


@settings(max_examples=400, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(st.lists(st.sampled_from(_PIECES), min_size=1, max_size=14), st.sampled_from(["", " ", "  "]),
       st.integers(0, 3))
def test_token_soup_never_reads_differently(pieces, sep, offset):
    agree(sep.join(pieces), offset)


@settings(max_examples=300, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(statements(), st.integers(0, 50))
def test_generated_statements_read_identically(text, offset):
    head = text.split("--")[0].split("//")[0]
    if head.strip() and not head.lstrip().startswith(("#", ">", "include", "---")):
        agree(head, offset)


def test_the_stored_terminal_table_is_what_the_built_grammar_gives():
    """``terminals.json`` (read so an everyday sheet needs no LALR parser) is the built parser's own table;
    regenerate it with ``grammar.write_terminals()`` after changing the grammar or the unit names."""
    import json
    from importlib import resources

    stored = json.loads(resources.files("calcsheet.parser").joinpath(grammar.TERMINALS_FILE).read_text("utf-8"))
    assert stored["grammar_sha256"] == grammar.grammar_key()
    assert stored["terminals"] == fast.terminal_table(grammar.lalr())
    assert grammar.stored_terminals() == stored["terminals"]


def test_a_stored_table_of_another_grammar_is_never_used(monkeypatch):
    monkeypatch.setattr(grammar, "grammar_key", lambda: "0" * 64)
    assert grammar.stored_terminals() is None


def test_an_everyday_sheet_is_read_without_lark_and_a_bad_line_still_gets_the_grammars_error():
    import subprocess
    import sys

    probe = ("import sys\n"
             "from calcsheet.parser import parse_sheet\n"
             "sheet, diags = parse_sheet('L = 3 m\\nw [kN/m] = 1.2*2 kPa * 0.6 m + 1.5 kN/m\\ncheck w <= 9 kN/m\\n')\n"
             "assert not diags and len(sheet.body) == 3\n"
             "print('lark' in sys.modules)\n"
             "sheet, diags = parse_sheet('L = 3 m +\\n')\n"
             "print('lark' in sys.modules, diags[0].code, diags[0].span.line)\n")
    out = subprocess.run([sys.executable, "-c", probe], capture_output=True, text=True, check=True, cwd=REPO)
    first, second = out.stdout.strip().splitlines()
    assert first == "False"
    assert second.startswith("True ") and second.endswith(" 1")
