"""The line level: front matter, headings, prose, comments, descriptions, statements over lines, sheet size."""
import pytest

from calcsheet import nodes as N
from calcsheet.errors import SheetErrors
from calcsheet.parser import parse_sheet


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


def test_statement_continues_inside_open_brackets():
    b = body("sec = section.tee(b=150 mm,  -- flange\n    h=220 mm)\ny = 2\n")
    assert isinstance(b[0].expr, N.PluginCall) and b[0].span.end_line == 2 and b[0].description == "flange"
    assert b[1].name == "y" and b[1].span.line == 3


def test_a_bad_line_does_not_hide_the_rest():
    sheet, d = parse_sheet("x = 1\ny = = 2\nz = 3\nw = 4 +\n")
    assert [s.name for s in sheet.body] == ["x", "z"]
    assert [x.span.line for x in d] == [2, 4]


def test_unclosed_bracket_does_not_swallow_the_next_definition():
    sheet, d = parse_sheet("a = (1 + 2\nb = 3\n")
    assert [s.name for s in sheet.body] == ["b"] and d[0].span.line == 1


def test_huge_sheet_is_refused():
    with pytest.raises(SheetErrors):
        parse_sheet("x = 1\n" * 400_000)


def _strip_by_characters(line: str):
    """The rule read one character at a time (the oracle): outside a string, the first ``//`` starts the
    comment; the first ``--`` starts the description, which runs to the next ``//`` (quoted or not)."""
    in_str = False
    desc_at = comment_at = None
    for i, ch in enumerate(line):
        if ch == '"':
            in_str = not in_str
        elif not in_str and line.startswith("//", i):
            comment_at = i
            break
        elif not in_str and line.startswith("--", i):
            desc_at = i
            j = line.find("//", i + 2)
            comment_at = j if j >= 0 else None
            break
    code_end = min(x for x in (desc_at, comment_at, len(line)) if x is not None)
    desc = line[desc_at + 2:comment_at if comment_at is not None else len(line)].strip() or None \
        if desc_at is not None else None
    comment = line[comment_at + 2:].strip() or None if comment_at is not None else None
    return line[:code_end] + " " * (len(line) - code_end), desc, comment


@pytest.mark.parametrize("line", [
    'x = 1 m -- span // why', 'x = "a--b" -- d', 'x = "a//b" // c', 'x = "open -- d', '-//', '--/', '/--',
    'x = "a" "b" -- d', '"--"--"//"', 'q = "x" // c -- not a description', '---', '////', 'x = 1',
])
def test_descriptions_and_comments_are_cut_where_a_character_by_character_reading_cuts_them(line):
    from calcsheet.parser.lines import strip_trailing

    assert strip_trailing(line) == _strip_by_characters(line)


def test_descriptions_and_comments_cut_alike_on_generated_lines():
    import random

    from calcsheet.parser.lines import strip_trailing

    rng = random.Random(15)
    for _ in range(20_000):
        line = "".join(rng.choice('"/- ax') for _ in range(rng.randint(0, 12)))
        assert strip_trailing(line) == _strip_by_characters(line), line
