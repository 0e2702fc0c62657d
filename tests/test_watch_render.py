"""The live preview renders each save's page once, and prints again only the steps an edit changed.

The oracle is the package page itself: the preview's page must be byte-identical to rendering the result
afresh with ``PackageDocument`` (the refresh script included), however many saves came before.
"""
from pathlib import Path

import pytest

import calcsheet
from calcsheet.incremental import rebuild
from calcsheet.render.page import PackageDocument
from calcsheet.render.preview import refresh_script
from calcsheet.watch import PartsMemo, Preview, preview_document, with_script

REPO = Path(__file__).parents[1]
DEMOS = sorted((REPO / "sheets").glob("*.calc"))

SHEET = """---
project: Heron Quay Boathouse
subject: Floor joists
---
# Joists
gamma_G = 1.35       -- shared factor
b = 100 mm
h = 200 mm
L_1 = 4 m
L_2 = 3 m
w_1 [kN/m] = gamma_G*5 kN/m
w_2 [kN/m] = gamma_G*4 kN/m
M_1 [kN*m] = w_1*L_1^2/8
M_2 [kN*m] = w_2*L_2^2/8
S [mm^3] = b*h^2/6
s_1 [MPa] = M_1/S
s_2 [MPa] = M_2/S
f = 12 MPa
check s_1 <= f  -- joist 1
check s_2 <= f  -- joist 2
check max(s_1, s_2) <= if(L_1 > 3.5 m, f, 2*f)
"""


def test_the_page_with_the_refresh_script_is_the_page_rendered_with_it():
    result = calcsheet.run(SHEET)
    script = refresh_script(7, "n0nce")
    assert with_script(PackageDocument(result).html(), script) == PackageDocument(result, watch_script=script).html()


def test_with_script_refuses_what_is_not_a_package_page():
    with pytest.raises(ValueError):
        with_script("<p>hello</p>", "<script></script>")


@pytest.mark.parametrize("sheet", DEMOS, ids=[p.name for p in DEMOS])
def test_a_memo_never_changes_a_demo_page(sheet):
    result = calcsheet.run(sheet)
    memo = PartsMemo()
    first = preview_document(result, memo).html()
    memo.next_page()
    second = preview_document(result, memo).html()
    assert first == second == PackageDocument(result).html()


@pytest.mark.parametrize("old, new", [("gamma_G = 1.35 ", "gamma_G = 1.5 "), ("L_1 = 4 m", "L_1 = 3 m"),
                                      ("b = 100 mm", "b = 100.0 mm"), ("f = 12 MPa", "f = 2 MPa")])
def test_after_an_edit_the_page_is_what_a_fresh_render_gives(old, new):
    memo = PartsMemo()
    before = calcsheet.run(SHEET)
    preview_document(before, memo).html()
    memo.next_page()
    after = rebuild(before, SHEET.replace(old, new)).result
    assert preview_document(after, memo).html() == PackageDocument(after).html()


def test_only_the_steps_an_edit_reached_are_printed_again():
    memo = PartsMemo()
    before = calcsheet.run(SHEET)
    preview_document(before, memo).html()
    printed = len(memo.current)
    memo.next_page()
    after = rebuild(before, SHEET.replace("L_2 = 3 m", "L_2 = 3.5 m")).result
    preview_document(after, memo).html()
    fresh = [k for k in memo.current if k not in memo.previous]
    # L_2's own step, M_2, s_2, and the two checks reading s_2 (each in the summary and in the body)
    assert 0 < len(fresh) < printed / 2, (len(fresh), printed)


def test_the_preview_writes_the_page_it_serves(tmp_path):
    sheet = tmp_path / "joists.calc"
    sheet.write_text(SHEET, encoding="utf-8")
    preview = Preview(sheet, tmp_path / "out")
    preview.build()
    sheet.write_text(SHEET.replace("L_1 = 4 m", "L_1 = 4.5 m"), encoding="utf-8")
    preview.build()
    version, page = preview.snapshot()
    on_disk = preview.last_good_path.read_text(encoding="utf-8")
    assert page.decode("utf-8") == with_script(on_disk, refresh_script(version, preview.nonce))
    assert on_disk == PackageDocument(preview.last_good).html()


def test_a_full_run_of_the_same_sheet_reuses_every_printed_block():
    # a full run parses afresh: new formula and value objects, equal to the old ones
    memo = PartsMemo()
    preview_document(calcsheet.run(SHEET), memo).html()
    memo.next_page()
    again = calcsheet.run(SHEET)
    assert preview_document(again, memo).html() == PackageDocument(again).html()
    blocks = [k for k in memo.current if getattr(k, "key", ("",))[0] in ("step-block", "check-block")]
    assert blocks and all(k in memo.previous for k in blocks)


def test_saves_back_and_forth_always_give_the_fresh_page():
    memo = PartsMemo()
    result = calcsheet.run(SHEET)
    preview_document(result, memo).html()
    for text in [SHEET.replace("L_1 = 4 m", "L_1 = 3 m"), SHEET, SHEET.replace("gamma_G = 1.35 ", "gamma_G = 1.2 "),
                 SHEET.replace("gamma_G = 1.35 ", "gamma_G = 1.2 ").replace("f = 12 MPa", "f = 3 MPa"), SHEET]:
        memo.next_page()
        result = rebuild(result, text).result
        assert preview_document(result, memo).html() == PackageDocument(result).html()
