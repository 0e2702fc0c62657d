"""The resolver: names defined above their use, the dependency graph, and the names that are taken."""
from __future__ import annotations

import textwrap

from calcsheet.parser import parse_sheet
from calcsheet.plugin import default_registry
from calcsheet.resolver import check_key, resolve


def resolved(text):
    sheet, _ = parse_sheet(textwrap.dedent(text).lstrip("\n"))
    return resolve(sheet, default_registry()), sheet


def codes(res):
    return [(d.span.line, d.span.col, d.code) for d in res.diagnostics]


def test_the_graph_of_precedents_and_dependents():
    res, sheet = resolved("""
        L = 6 m
        w = 5 kN/m
        M = w*L^2/8
        V = w*L/2
        check M <= 30 kN*m
        """)
    assert res.inputs == ["L", "w"]
    assert res.precedents["M"] == ["w", "L"]
    assert res.dependents["L"] == ["M", "V"]
    key = check_key(sheet.body[-1])
    assert key == "check@5" and res.precedents[key] == ["M"]
    assert res.downstream("w") == ["M", "V", "check@5"]
    assert res.diagnostics == []


def test_a_name_used_above_its_definition_is_located_with_the_line_to_move():
    res, _ = resolved("M = w*2\nw = 5 kN/m\n")
    assert codes(res) == [(1, 5, "use-before-definition")]
    assert "line 2" in res.diagnostics[0].message
    assert res.broken == {"M"}


def test_an_undefined_name_suggests_the_closest_defined_one():
    res, _ = resolved("length = 6 m\nx = lenght*2\n")
    assert codes(res) == [(2, 5, "undefined-name")]
    assert res.diagnostics[0].hint == "did you mean 'length'?"


def test_a_broken_statement_breaks_what_reads_it_without_a_second_report():
    res, _ = resolved("a = b\nc = a*2\ncheck c <= 1\n")
    assert codes(res) == [(1, 5, "undefined-name")]
    assert res.broken == {"a", "c", "check@3"}


def test_built_in_and_plugin_names_cannot_be_redefined():
    res, _ = resolved("pi = 3\nsqrt = 2\nsection = 1\nx = 1\nx = 2\n")
    assert codes(res) == [(1, 1, "redefinition"), (2, 1, "redefinition"), (3, 1, "redefinition"),
                          (5, 1, "redefinition")]
    assert "line 4" in res.diagnostics[-1].message


def test_unknown_functions_and_plugins_are_named_with_the_closest_known():
    res, _ = resolved("x = sqr(4)\ny = section.rectangel(b=1 mm, h=1 mm)\nz = secton.rectangle(b=1 mm, h=1 mm)\n")
    assert [d.code for d in res.diagnostics] == ["unknown-function", "unknown-plugin", "unknown-plugin"]
    assert [d.hint for d in res.diagnostics] == ["did you mean 'sqrt'?", "did you mean 'section.rectangle'?",
                                                 "did you mean 'section'?"]


def test_a_plugin_call_takes_named_arguments_only():
    res, _ = resolved("r = section.rectangle(1 mm, h=2 mm)\n")
    assert codes(res) == [(1, 23, "plugin-argument")]
