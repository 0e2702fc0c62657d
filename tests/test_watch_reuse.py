"""The live preview takes a block from the last page only when it prints exactly what a fresh render prints.

A block is reused by its place when the record there is the very record that printed it (a fast rebuild keeps
the records an edit did not reach), under the same number, and no name it shows has a new link, literal or
"changed" mark; otherwise it is found by what it prints from, or printed. The oracle throughout is the package
page rendered afresh by ``PackageDocument``: after every save the preview's page must equal it byte for byte.
Each edit below is one that a stale block would get wrong.
"""
import copy
import dataclasses
import re

import pytest

import calcsheet
from calcsheet.incremental import rebuild
from calcsheet.render.page import PackageDocument
from calcsheet.errors import Diagnostic
from calcsheet.trace import Heading, Note, Step
from calcsheet.watch import PartsMemo, _stale_names, preview_document

SHEET = """---
project: Heron Quay Boathouse
subject: Floor joists
---
# Joists
k = 1.1              -- shared factor
L_1 = 4 m            -- span 1
L_2 = 3 m            -- span 2
w_1 [kN/m] = k*5 kN/m
w_2 [kN/m] = 4 kN/m
M_1 [kN*m] = w_1*L_1^2/8
M_2 [kN*m] = w_2*L_2^2/8
S = 6.67e5 mm^3
s_1 [MPa] = M_1/S
s_2 [MPa] = M_2/S
check s_1 <= 12 MPa  -- joist 1
check s_2 <= 12 MPa  -- joist 2
# Trimmer
L_3 = 2 m
M_3 [kN*m] = w_2*L_3^2/8
check M_3/S <= 12 MPa
"""


class Saves:
    """A preview's memo across saves; each page is held to the page rendered afresh."""

    def __init__(self, text):
        self.memo = PartsMemo()
        self.result = calcsheet.run(text, path="joists.calc")
        self.page(self.result)

    def page(self, result, **options):
        got = preview_document(result, self.memo, **options).html()
        assert got == PackageDocument(result, **options).html()
        self.memo.next_page()
        return got

    def save(self, text):
        out = rebuild(self.result, text)
        self.result = out.result
        page = self.page(self.result)
        assert page == PackageDocument(calcsheet.run(text, path="joists.calc")).html()  # a first build's page
        return out


EDITS = [
    pytest.param(("k = 1.1 ", "k = 1.35 "), True, id="a value read by one group (the benchmark's worst edit)"),
    pytest.param(("L_1 = 4 m ", "L_1 = 4.5 m "), True, id="one span (the best edit)"),
    pytest.param(("L_1 = 4 m ", "L_1 = 4000 mm "), True, id="only the unit: the same length written in mm"),
    pytest.param(("S = 6.67e5 mm^3", "S = 667 cm^3  "), True, id="only the unit of a value many steps read"),
    pytest.param(("L_2 = 3 m ", "L_2 = 3.0 m "), True, id="only the literal: the same value written otherwise"),
    pytest.param(("L_3", "L_t"), False, id="only a name"),
    pytest.param(("w_2 [kN/m] = 4 kN/m\n", "w_2 [kN/m] = 4 kN/m\nw_9 = 2 kN/m\n"), False,
                 id="a line added: the later steps renumber"),
    pytest.param(("L_2 = 3 m            -- span 2\n", ""), False, id="a line removed"),
    pytest.param(("# Trimmer\n", ""), False, id="a heading removed: the trimmer's steps renumber"),
    pytest.param(("# Trimmer\n", "L_9 = 1 m\n"), False, id="a heading become a step: as many records, renumbered"),
    pytest.param(("# Trimmer\n", "> Trimmer notes\n"), False, id="a heading become prose"),
    pytest.param(("# Trimmer\n", "## Trimmer\n"), False, id="a heading one level down"),
    pytest.param(("check s_2 <= 12 MPa", "check s_2 <= 10 MPa"), False, id="a check's limit"),
    pytest.param(("-- joist 1", "-- joist one"), False, id="only a description"),
]


@pytest.mark.parametrize("edit, fast", EDITS)
def test_after_each_edit_and_back_every_page_is_the_fresh_page(edit, fast):
    saves = Saves(SHEET)
    edited = SHEET.replace(*edit)
    assert edited != SHEET
    assert saves.save(edited).full is not fast
    saves.save(SHEET)  # and back: blocks of the page before last must not come back stale
    saves.save(edited)


def test_a_run_of_saves_mixing_fast_rebuilds_and_full_runs_stays_fresh():
    saves = Saves(SHEET)
    texts = [SHEET.replace("k = 1.1 ", "k = 1.2 "), SHEET.replace("k = 1.1 ", "k = 1.3 "),
             SHEET.replace("k = 1.1 ", "k = 1.3 ").replace("# Trimmer\n", "# Trimmer\nL_0 = 1 m\n"),
             SHEET.replace("k = 1.1 ", "k = 1.3 "), SHEET, SHEET.replace("L_3 = 2 m", "L_3 = 2.5 m")]
    for text in texts:
        saves.save(text)


def test_the_changed_marks_of_a_diff_are_never_taken_from_the_last_page():
    saves = Saves(SHEET)
    result = saves.result
    for changed in [{"M_1"}, {"M_1", "L_3"}, set(), {"s_2"}]:
        saves.page(result, changed=changed)


def test_new_settings_reprint_every_block():
    saves = Saves(SHEET)
    again = copy.copy(saves.result)  # the very records, printed to five figures
    again.policy = dataclasses.replace(saves.result.policy, sigfigs=5)
    page = saves.page(again)
    assert page != PackageDocument(saves.result).html() and "12.000" in page  # the figures did change


def _with_items(result, items):
    out = copy.copy(result)
    out.items = items
    out.steps = {i.name: i for i in items if isinstance(i, Step)}
    return out


def test_a_record_kept_under_a_new_number_is_printed_with_it():
    # the same record objects behind one more heading: every number after it moves
    saves = Saves(SHEET)
    items = list(saves.result.items)
    moved = _with_items(saves.result, [items[0], Heading("Loads", 1), *items[1:]])
    page = saves.page(moved)
    assert re.search(r'<span class="stepno" id="[^"]+">2.1</span>', str(page))


def test_a_kept_record_that_shows_an_input_written_anew_is_printed_with_the_new_literal():
    # a rebuild that kept s_1's and M_1's records while L_1's literal changed (the same value written as
    # 4000 mm) would leave the substitution showing "4 m"; the preview must not trust the record alone
    saves = Saves(SHEET)
    items = list(saves.result.items)
    at = next(i for i, r in enumerate(items) if isinstance(r, Step) and r.name == "L_1")
    old = items[at]
    items[at] = dataclasses.replace(old, expr=calcsheet.run("L_1 = 4000 mm").steps["L_1"].expr)
    page = saves.page(_with_items(saves.result, items))
    assert "4000" in page


def test_stale_names_are_the_names_whose_link_literal_or_mark_moved():
    a, b = (calcsheet.run(f"L = {text}").steps["L"].expr for text in ("4 m", "4000 mm"))
    settings = (("sigfigs", 3),)
    before = (settings, {"L": "v-L", "M": "v-M", "x": "v-x"}, {"L": a}, frozenset({"M"}))
    assert _stale_names(before, before) == set()
    after = (settings, {"L": "v-L", "M": "v-M2", "y": "v-y"}, {"L": b}, frozenset({"x"}))
    assert _stale_names(before, after) == {"L", "M", "x", "y"}
    assert _stale_names(before, ((("sigfigs", 4),), *before[1:])) is None  # nothing may be reused
    assert _stale_names(None, before) is None


def test_only_the_records_an_edit_reached_are_printed_again(monkeypatch):
    saves = Saves(SHEET)
    printed = []
    real = PackageDocument._print_Step

    def spy(self, step, inner=False):
        if type(self) is not PackageDocument:  # the preview's page, not the fresh page it is held to
            printed.append(step.name)
        return real(self, step, inner)

    monkeypatch.setattr(PackageDocument, "_print_Step", spy)
    out = saves.save(SHEET.replace("L_1 = 4 m ", "L_1 = 4.5 m "))
    assert not out.full
    assert sorted(printed) == ["L_1", "M_1", "s_1"]


def test_the_memo_holds_one_page_however_many_saves():
    saves = Saves(SHEET)
    sizes = []
    for n in range(6):
        saves.save(SHEET.replace("k = 1.1 ", f"k = 1.{2 + n} "))
        sizes.append(len(saves.memo.previous))
    assert max(sizes) <= min(sizes) + 2, sizes


def test_a_kept_record_whose_print_depends_on_the_page_is_printed_again():
    # a plugin's warning note prints unless the sheet allows that warning with a reason: the same note
    # record, with and without the allowance, must print as a fresh page prints it
    saves = Saves(SHEET)
    note = Note("the bearing length is short", kind="warning")
    shown = _with_items(saves.result, [*saves.result.items, note])
    allowed = copy.copy(shown)
    allowed.diagnostics = [Diagnostic("warning", "plugin-warning", note.text, suppressed="checked on site")]
    assert note.text in saves.page(shown)
    assert "checked on site" in saves.page(allowed)
    saves.page(shown)
