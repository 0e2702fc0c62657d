"""Lists of quantities: one quantity over a numpy array, element by element, checked like any value.

The oracle for every value is numpy itself, on the same arrays (an independent computation of the same
formula, not the program's own output).
"""
import json

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import calcsheet
import calcsheet.units
from calcsheet import builtins as B
from calcsheet import nodes as N
from calcsheet.parser import parse_sheet
from calcsheet.render.sheet import SheetPrinter
from calcsheet.render.text import TextDocument


def codes(result):
    return [(d.code, d.span.line, d.span.col) for d in result.errors]


def both(text):
    """The errors `check` finds and the errors `build` finds."""
    return codes(calcsheet.run(text, evaluate=False)), codes(calcsheet.run(text))


# ---------------------------------------------------------------- what a list is


def test_a_list_is_one_quantity_over_an_array_in_its_first_elements_unit():
    r = calcsheet.run("L = [3.6 m, 4200 mm, 4.8 m]\n")
    assert r.ok, r.format_diagnostics()
    L = r.values["L"]
    assert isinstance(L.magnitude, np.ndarray)
    assert L.units == calcsheet.units.registry().Unit("m")
    np.testing.assert_allclose(L.magnitude, [3.6, 4.2, 4.8])  # 4200 mm = 4.2 m (common practice)


def test_an_element_of_another_dimension_is_an_error_at_that_element_in_check_and_build():
    text = "L = [3.6 m, 4.2 kN, 4.8 m]\n"
    assert both(text) == ([("dimension-mismatch", 1, 13)], [("dimension-mismatch", 1, 13)])
    (d,) = calcsheet.run(text).errors
    assert "element 2 of the list is force" in d.message and "element 1 is length" in d.message


def test_a_list_inside_a_list_is_refused():
    text = "L = [3 m, 4 m]\nX = [L, 5 m]\n"
    assert both(text) == ([("type-mismatch", 2, 6)], [("type-mismatch", 2, 6)])


# ---------------------------------------------------------------- arithmetic against numpy

floats = st.floats(0.1, 50.0, allow_nan=False, allow_infinity=False)


@settings(max_examples=40, deadline=None, database=None)
@given(st.lists(floats, min_size=1, max_size=12), floats, floats)
def test_a_formula_over_a_list_is_numpy_on_the_same_array(spans, w, h):
    L = np.array(spans)
    text = (f"L = [{', '.join(f'{x!r} m' for x in spans)}]\n"
            f"w = {w!r} kN/m\n"
            f"h = {h!r} mm\n"
            "M [kN*m] = w*L^2/8\n"
            "V [kN] = w*L/2\n"
            "r = sqrt(L*h)/(L + h)\n"
            "a = atan2(h, L)\n"
            "s = -M + 2*V*L\n"
            "c = cos(a)^2 + sin(a)^2\n")
    r = calcsheet.run(text)
    assert r.ok, r.format_diagnostics()
    hm = h / 1000
    np.testing.assert_allclose(r.values["M"].m_as("kN*m"), w * L**2 / 8, rtol=1e-12)
    np.testing.assert_allclose(r.values["V"].m_as("kN"), w * L / 2, rtol=1e-12)
    np.testing.assert_allclose(r.values["r"].m_as(""), np.sqrt(L * hm) / (L + hm), rtol=1e-12)
    np.testing.assert_allclose(r.values["a"].m_as("rad"), np.arctan2(hm, L), rtol=1e-12)
    np.testing.assert_allclose(r.values["s"].m_as("kN*m"), -w * L**2 / 8 + 2 * (w * L / 2) * L, rtol=1e-12)
    np.testing.assert_allclose(r.values["c"].m_as(""), 1.0, rtol=1e-12)  # sin² + cos² = 1


@settings(max_examples=40, deadline=None, database=None)
@given(st.lists(st.floats(-100, 100, allow_nan=False), min_size=1, max_size=12))
def test_reductions_over_a_list_are_numpys(xs):
    x = np.array(xs)
    text = (f"F = [{', '.join(f'{v!r} kN' for v in xs)}]\n"
            "a = max(F)\nb = min(F)\nc = sum(F)\nd = argmax(F)\ne = argmin(F)\nn = count(F)\n")
    r = calcsheet.run(text)
    assert r.ok, r.format_diagnostics()
    v = {k: r.values[k] for k in "abcden"}
    assert v["a"].m_as("kN") == pytest.approx(np.max(x))
    assert v["b"].m_as("kN") == pytest.approx(np.min(x))
    assert v["c"].m_as("kN") == pytest.approx(np.sum(x), abs=1e-9)
    assert v["d"].m_as("") == np.argmax(x) + 1  # positions count from 1, as the package numbers elements
    assert v["e"].m_as("") == np.argmin(x) + 1
    assert v["n"].m_as("") == len(x)


def test_reductions_have_their_dimension_rules_in_the_builtins_table():
    for name in ("sum", "argmax", "argmin", "count"):
        assert B.FUNCTIONS[name].shape == "reduce"
    assert B.shape_of_call(B.FUNCTIONS["max"], [True]) is False  # max of one list: one value
    assert B.shape_of_call(B.FUNCTIONS["max"], [True, False]) is True  # element by element
    assert B.shape_of_call(B.FUNCTIONS["sqrt"], [True]) is True


def test_max_of_a_list_and_a_value_is_element_by_element():
    r = calcsheet.run("L = [1 m, 3 m, 5 m]\nx = max(L, 2500 mm)\n")
    np.testing.assert_allclose(r.values["x"].m_as("m"), np.maximum([1, 3, 5], 2.5))


def test_sum_of_temperatures_on_the_celsius_scale_is_refused():
    assert both("T = [20 degC, 30 degC]\nx = sum(T)\n")[0] == [("offset-temperature", 2, 9)]


@pytest.mark.parametrize("text, code, line, col", [
    ("n = [1, 2]\nx = 2^n\n", "type-mismatch", 2, 7),          # an exponent is one value
    ("L = [1 m, 2 m]\nx = if(L <= 1.5 m, 1, 2)\n", "type-mismatch", 2, 8),      # so is a condition's side
    ("L = [1 m, 2 m]\nx = if(1 m <= 1.5 m, L, 2 m)\n", "type-mismatch", 2, 5),  # both outcomes lists or neither
    ("L = [1 m, 2 m]\nF = [1 kN, 2 kN]\nx = L + F\n", "dimension-mismatch", 3, 5),
])
def test_lists_where_one_value_belongs_are_located_errors_in_check_and_build(text, code, line, col):
    assert both(text) == ([(code, line, col)], [(code, line, col)])


def test_lists_of_different_lengths_are_a_located_error():
    r = calcsheet.run("L = [1 m, 2 m]\nK = [1 m, 2 m, 3 m]\nx = L + K\n")
    assert codes(r) == [("type-mismatch", 3, 5)]
    assert "2 and 3 elements" in r.errors[0].message


# ---------------------------------------------------------------- checks over a list


SPANS = """\
L = [3.6 m, 4.2 m, 4.8 m]
w = 5 kN/m
M = w*L^2/8
check M <= 12 kN*m  -- bending
"""


def test_a_check_over_a_list_passes_only_if_every_element_passes_and_names_the_governing_one():
    r = calcsheet.run(SPANS)
    (c,) = r.checks
    M = 5 * np.array([3.6, 4.2, 4.8]) ** 2 / 8  # w L² / 8, simply supported span (common practice)
    assert not c.ok  # 14.4 kN·m > 12 kN·m at the third span
    assert c.governing == int(np.argmax(M / 12)) + 1 == 3
    assert c.demand.m_as("kN*m") == pytest.approx(M[2])
    assert c.ratio == pytest.approx(M[2] / 12)
    ok = calcsheet.run(SPANS.replace("12 kN*m", "15 kN*m"))
    assert ok.checks[0].ok and ok.checks[0].governing == 3


def test_a_failing_element_governs_even_when_another_has_no_ratio():
    r = calcsheet.run("d = [2 mm, 0 mm, 9 mm]\nlim = [10 mm, 0 mm, 8 mm]\ncheck d <= lim\n")
    (c,) = r.checks
    assert not c.ok and c.governing == 3


def test_the_list_check_prints_its_governing_element_and_a_table_of_all():
    r = calcsheet.run(SPANS)
    text = TextDocument().items(r.items)
    assert "[3.60, 4.20, 4.80] m" in text
    assert "14.4 kN·m ≤ 12 kN·m  →  NG  ratio 1.20  (element 3 governs)" in text
    rows = [line.split("|") for line in text.splitlines() if line.strip().startswith(("1 |", "2 |", "3 |"))]
    assert [r_[-1].strip() for r_ in rows] == ["OK", "OK", "NG"]


def test_the_package_shows_every_element_of_a_list_check():
    from calcsheet.render.page import PackageDocument

    page = str(PackageDocument(calcsheet.run(SPANS)).html())
    assert "each element of the check (element 3 governs)" in page
    assert page.count("<td>NG</td>") == 1 and page.count("<td>OK</td>") == 2


def test_json_carries_the_list():
    data = json.loads(json.dumps(calcsheet.run(SPANS).to_json()))
    assert data["values"]["L"]["value"] == [3.6, 4.2, 4.8]
    assert data["values"]["M"]["unit"] == "kN * m"
    assert data["checks"][0]["ok"] is False
    assert data["checks"][0]["governing"] == 3


# ---------------------------------------------------------------- plugins and functions


def test_a_plugin_takes_a_list_only_where_it_declares_one():
    text = "sec = section.rectangle(b=[100 mm, 200 mm], h=200 mm)\n"
    assert both(text) == ([("plugin-argument", 1, 27)], [("plugin-argument", 1, 27)])
    assert "takes one value, not a list" in calcsheet.run(text).errors[0].message
    spans = calcsheet.run("b = beam.solve(spans=[6.0 m, 4800 mm], supports=\"pinned, pinned, roller\", "
                          "E=200 GPa, I=8000 cm^4, loads=[beam.udl(w=5 kN/m)])\n")
    assert spans.ok, spans.format_diagnostics()  # a list where the plugin declares one: one value per span


def test_a_sheet_function_applies_to_a_list_element_by_element():
    r = calcsheet.run("M_ss(w [kN/m], L [m]) [kN*m] = w*L^2/8\nL = [4 m, 6 m]\nM = M_ss(5 kN/m, L)\n")
    assert r.ok, r.format_diagnostics()
    np.testing.assert_allclose(r.values["M"].m_as("kN*m"), 5 * np.array([4.0, 6.0]) ** 2 / 8)


# ---------------------------------------------------------------- round trip


@settings(max_examples=30, deadline=None, database=None)
@given(st.lists(st.tuples(st.integers(1, 999), st.sampled_from(["m", "mm", "kN", ""])), min_size=1, max_size=6))
def test_a_list_prints_back_as_sheet_syntax_and_parses_to_the_same_tree(items):
    text = "x = [" + ", ".join(f"{v} {u}".strip() for v, u in items) + "]\n"
    sheet, diags = parse_sheet(text)
    assert not diags
    printed = SheetPrinter().statement(sheet.body[0])
    again, _ = parse_sheet(printed + "\n")
    assert again.body[0] == sheet.body[0]
    assert isinstance(again.body[0].expr, N.ListExpr)


def test_an_edited_list_input_rebuilds_incrementally_to_what_a_full_run_gives():
    from calcsheet.incremental import rebuild

    r = calcsheet.run(SPANS)
    edited = SPANS.replace("4.8 m]", "5.1 m]")
    rb = rebuild(r, edited)
    assert not rb.full
    assert TextDocument().items(rb.result.items) == TextDocument().items(calcsheet.run(edited).items)
