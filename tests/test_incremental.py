"""Incremental recompute: after an input change only its dependents are evaluated again, and the result
is the one a full run gives."""
import textwrap

import pytest

import calcsheet
from calcsheet import evaluator
from calcsheet.evaluator import Evaluator
from calcsheet.incremental import rebuild, recompute
from calcsheet.render.page import PackageDocument
from calcsheet.trace import CheckResult, Step

SHEET = textwrap.dedent("""\
    ---
    project: Heron Quay Boathouse
    subject: Floor joist J-4
    rev: C
    ---
    # Joist
    b = 100 mm        -- joist breadth
    h = 200 mm        -- joist depth
    L = 4 m           -- span
    w = 5 kN/m
    M [kN*m] = w*L^2/8
    V [kN] = w*L/2
    sec = section.rectangle(b=b, h=h)
    S [mm^3] = b*h^2/6
    sigma [MPa] = M/S
    f = 12 MPa
    check sigma <= f  -- bending
    # Trimmer
    b_2 = 150 mm
    h_2 = 300 mm
    tri = section.rectangle(b=b_2, h=h_2)
    I_2 [mm^4] = tri.I_x
    check V <= 30 kN  -- shear force
    """)


@pytest.fixture
def calls(monkeypatch):
    """Every definition, check and plugin call the evaluator makes, by name."""
    seen = {"definitions": [], "checks": [], "plugins": []}
    real_def, real_check, real_plugin = (Evaluator.evaluate_definition, Evaluator.evaluate_check,
                                         Evaluator._eval_PluginCall)

    def definition(self, stmt, env, display):
        seen["definitions"].append(stmt.name)
        return real_def(self, stmt, env, display)

    def check(self, stmt, env, unit_of=None):
        seen["checks"].append(stmt.span.line)
        return real_check(self, stmt, env, unit_of)

    def plugin(self, node, env, used):
        seen["plugins"].append(node.func)
        return real_plugin(self, node, env, used)

    monkeypatch.setattr(Evaluator, "evaluate_definition", definition)
    monkeypatch.setattr(Evaluator, "evaluate_check", check)
    monkeypatch.setattr(Evaluator, "_eval_PluginCall", plugin)
    monkeypatch.setattr(evaluator, "_DISPATCH", {})  # the evaluator caches its dispatch table
    return seen


def _clear(seen):
    for v in seen.values():
        v.clear()


def test_an_edited_input_line_recomputes_only_its_dependents(calls):
    first = calcsheet.run(SHEET, path="j.calc")
    _clear(calls)
    out = rebuild(first, SHEET.replace("h = 200 mm", "h = 250 mm"))
    assert not out.full, out.reason
    assert calls["definitions"] == ["h", "sec", "S", "sigma"]
    assert calls["checks"] == [17]  # the bending check; the shear check reads only V
    assert calls["plugins"] == ["rectangle"]  # sec again; tri is untouched
    assert out.recomputed == ["h", "sec", "S", "sigma", "check@17"]


def test_values_are_right_after_an_incremental_rebuild():
    out = rebuild(calcsheet.run(SHEET), SHEET.replace("h = 200 mm", "h = 250 mm")).result
    # M = w L^2 / 8 — common practice; S = b h^2 / 6 — Roark's Formulas for Stress and Strain, Table A.1
    assert out.values["sigma"].m_as("MPa") == pytest.approx(5 * 4**2 / 8 * 1e6 / (100 * 250**2 / 6))
    # I_x = b h^3 / 12 — Roark's Formulas for Stress and Strain, Table A.1
    assert out.values["sec"].fields["I_x"].m_as("mm^4") == pytest.approx(100 * 250**3 / 12)
    assert [c.ok for c in out.checks] == [True, True]  # 9.6 MPa <= 12 MPa now


def test_an_incremental_rebuild_renders_exactly_like_a_full_run():
    edited = SHEET.replace("L = 4 m ", "L = 3.6 m ").replace("b_2 = 150 mm", "b_2 = 175 mm")
    fast = rebuild(calcsheet.run(SHEET, path="j.calc"), edited)
    full = calcsheet.run(edited, path="j.calc")
    assert not fast.full
    assert set(fast.recomputed) >= {"L", "M", "V", "sigma", "b_2", "tri", "I_2"}
    assert PackageDocument(fast.result).html() == PackageDocument(full).html()
    assert fast.result.to_json() == full.to_json()


def test_the_previous_result_is_left_as_it_was():
    first = calcsheet.run(SHEET)
    rebuild(first, SHEET.replace("h = 200 mm", "h = 250 mm"))
    assert first.values["h"].m_as("mm") == 200
    assert first.checks[0].ok is False


def test_a_new_override_recomputes_only_downstream_of_it(calls):
    first = calcsheet.run(SHEET)
    _clear(calls)
    out = recompute(first, {"b_2": "200 mm"})
    assert not out.full
    # the overridden input is evaluated twice (the sheet's value is kept beside the override)
    assert calls["definitions"] == ["b_2", "b_2", "tri", "I_2"]
    assert calls["plugins"] == ["rectangle"]
    assert out.result.overrides["b_2"][1].m_as("mm") == 200
    assert out.result.steps["b_2"].overridden.m_as("mm") == 150
    assert out.result.values["I_2"].m_as("mm^4") == pytest.approx(200 * 300**3 / 12)  # Roark, Table A.1
    back = recompute(out.result, {})
    assert back.result.values["I_2"].m_as("mm^4") == pytest.approx(150 * 300**3 / 12)
    assert back.result.overrides == {} and back.result.steps["b_2"].overridden is None


def test_an_override_matches_a_full_run_with_the_same_override():
    out = recompute(calcsheet.run(SHEET, path="j.calc"), {"w": "7 kN/m"})
    full = calcsheet.run(SHEET, overrides={"w": "7 kN/m"}, path="j.calc")
    assert PackageDocument(out.result).html() == PackageDocument(full).html()


@pytest.mark.parametrize("edit, reason", [
    (("h = 200 mm", "h = 200 mm\nh_x = 1 m"), "lines were added"),
    (("M [kN*m] = w*L^2/8", "M [kN*m] = w*L^2/10"), "not an input"),
    (("h = 200 mm", "h = 2*b  "), "defines something else"),
    (("h = 200 mm", "h = 200 kN"), "changed dimension"),
    (("# Joist", "# Beam "), "not an input"),
])
def test_changes_the_fast_path_cannot_vouch_for_fall_back_to_a_full_run(edit, reason):
    edited = SHEET.replace(*edit)
    out = rebuild(calcsheet.run(SHEET, path="j.calc"), edited)
    assert out.full and reason in out.reason
    full = calcsheet.run(edited, path="j.calc")
    assert [d.one_line() for d in out.result.diagnostics] == [d.one_line() for d in full.diagnostics]
    assert out.result.ok == full.ok


def test_an_edit_that_breaks_a_downstream_value_is_reported_as_a_full_run_would():
    sheet = "a = 2 m\nb = 1 m\nc = sqrt(a - b)\n"
    out = rebuild(calcsheet.run(sheet), sheet.replace("b = 1 m", "b = 3 m"))
    assert out.full and not out.result.ok  # the square root of a negative length
    assert out.result.errors[0].span.line == 3


def test_an_unchanged_sheet_recomputes_nothing(calls):
    first = calcsheet.run(SHEET)
    _clear(calls)
    out = rebuild(first, SHEET)
    assert not out.full and out.recomputed == [] and calls["definitions"] == []


def test_a_new_input_value_gets_the_same_findings_as_a_full_check():
    # 200 MPa where a steel modulus (about 200–210 GPa, common practice) belongs: whatever the checker says
    # about the edited line, the rebuild says too
    sheet = "E_s = 210 GPa     -- steel modulus\nA = 100 mm^2\nk = E_s*A\n"
    edited = sheet.replace("210 GPa", "200 MPa")
    out = rebuild(calcsheet.run(sheet), edited)
    full = calcsheet.run(edited)
    assert [d.one_line() for d in out.result.diagnostics] == [d.one_line() for d in full.diagnostics]
    assert out.result.values["k"].m_as("kN") == pytest.approx(200 * 100 / 1000)


FUNCTION_SHEET = """\
gamma = 1.35
M_ss(w [kN/m], L [m]) [kN*m] = gamma*w*L^2/8   -- factored midspan moment
w = 5 kN/m
L = 4 m
M = M_ss(w, L)
check M_ss(w, L) <= 40 kN*m
"""


@pytest.mark.parametrize("edit", [("w = 5 kN/m", "w = 6 kN/m"), ("gamma = 1.35", "gamma = 1.5")])
def test_a_sheet_with_functions_rebuilds_fast_and_like_a_full_run(edit):
    edited = FUNCTION_SHEET.replace(*edit)
    fast = rebuild(calcsheet.run(FUNCTION_SHEET, path="f.calc"), edited)
    full = calcsheet.run(edited, path="f.calc")
    assert not fast.full, fast.reason
    assert "M_ss" not in fast.result.values
    assert PackageDocument(fast.result).html() == PackageDocument(full).html()
    assert fast.result.to_json() == full.to_json()


def _groups(n: int) -> str:
    """Groups of a span, a load, a moment, a stress and a check; every third group's load reads k_sh."""
    lines = ["# Members", "k_sh = 1.1          -- shared load factor"]
    for i in range(n):
        factor = "k_sh*" if i % 3 == 0 else ""
        lines += [f"L_{i} = {3 + i % 4} m", f"w_{i} [kN/m] = {factor}1.2*{1 + i % 5} kPa * 0.6 m + 1.5 kN/m",
                  f"M_{i} [kN*m] = w_{i}*L_{i}^2/8", f"s_{i} [MPa] = M_{i} / 2.5e5 mm^3",
                  f"check s_{i} <= 250 MPa  -- bending"]
    return "\n".join(lines) + "\n"


@pytest.mark.parametrize("old, new", [("k_sh = 1.1 ", "k_sh = 1.35 "), ("L_4 = 3 m", "L_4 = 3.5 m")],
                         ids=["a shared input (the worst edit)", "one span (the best edit)"])
def test_the_worst_and_the_best_edit_render_exactly_like_a_full_run(old, new):
    sheet = _groups(12)
    edited = sheet.replace(old, new)
    fast = rebuild(calcsheet.run(sheet, path="g.calc"), edited)
    full = calcsheet.run(edited, path="g.calc")
    assert not fast.full, fast.reason
    assert PackageDocument(fast.result).html() == PackageDocument(full).html()
    assert fast.result.to_json() == full.to_json()


def test_a_rebuild_keeps_the_records_it_did_not_evaluate_again_and_makes_new_ones_for_the_rest():
    # the live preview knows an unchanged step by its record: a kept record must be the previous run's own
    # object, and a step evaluated again must never be
    sheet = _groups(6)
    first = calcsheet.run(sheet, path="g.calc")
    out = rebuild(first, sheet.replace("k_sh = 1.1 ", "k_sh = 1.35 "))
    again = set(out.recomputed)
    assert again == {"k_sh", "w_0", "M_0", "s_0", "w_3", "M_3", "s_3", "check@7", "check@22"}
    for old, new in zip(first.items, out.result.items, strict=True):
        if isinstance(new, Step):
            key = new.name
        elif isinstance(new, CheckResult):
            key = f"check@{new.span.line}"
        else:
            key = None  # a heading
        assert (new is old) is (key not in again), key
    assert all(out.result.steps[n] is s for n, s in first.steps.items() if n not in again)


def test_the_definition_an_edited_line_belongs_to_is_the_one_whose_lines_hold_it():
    from calcsheet import nodes as N
    from calcsheet.incremental import _owner

    sheet = calcsheet.run(SHEET + "k [kN/m] = (w +\n    1 kN/m)   -- two lines: a bracket is open\n> prose\n").sheet
    body = sheet.body
    for line in range(1, len(sheet.source.split("\n")) + 1):
        every = [s for s in body if isinstance(s, N.Definition) and s.span.line <= line <= s.span.end_line]
        assert _owner(body, line) is (every[0] if every else None), line
    assert _owner(body, SHEET.count("\n") + 2).name == "k"  # the second line of a definition
    b = next(s for s in body if getattr(s, "name", "") == "b")
    shuffled = (*(s for s in body if s is not b), b)  # out of the order of their lines: still found
    assert _owner(shuffled, b.span.line) is b
