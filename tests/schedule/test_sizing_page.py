"""The selection page of auto-sizing, on its own (the catalogue itself is exercised in test_sizing.py)."""
from calcsheet.schedule.sizing import failure, selection_page
from calcsheet.schedule.work import CheckLine, Outcome


def _outcome(*checks, errors=()):
    return Outcome(0, "x", ok=not errors, checks=[CheckLine(f"check-{i}", lab, lab, r, ok)
                                                  for i, (lab, r, ok) in enumerate(checks, 1)], errors=list(errors))


def test_the_page_shows_the_choice_beside_the_next_lighter_section_and_what_it_fails():
    chosen = _outcome(("bending", 0.96, True), ("shear <b>", 0.31, True))
    lighter = _outcome(("bending", 1.23, False), ("shear <b>", 0.36, True))
    page = str(selection_page("desig", "IPE", "EN 10365 <table>", ("IPE 330", 49.1, ""), ("IPE 300", 42.2, ""),
                              lighter, chosen, 12, 18))
    assert "The next lighter section, IPE 300, fails: bending (1.23)." in page
    assert "<td>IPE 330</td><td class='numcol'>49.1</td><td>bending</td><td class='numcol'>0.96</td>" in page
    assert "EN 10365 &lt;table&gt;" in page and "<table>" not in page.replace("<table class='summary'>", "")


def test_a_section_the_sheet_cannot_use_says_why():
    broken = _outcome(errors=["--size: error: desig = HE 100 A: the sheet has 1 error(s) with this row's values:\n..."])
    what, worst = failure(broken)
    assert what.startswith("the sheet does not run with it: desig = HE 100 A") and worst is None
    assert failure(_outcome(("a", 1.5, False), ("b", 1.1, False), ("c", 0.2, True))) == ("a (1.50); b (1.10)", 1.5)


def test_the_lightest_section_of_all_has_no_lighter_neighbour():
    page = str(selection_page("desig", "W", "AISC", ("W4X13", 19.3, ""), None, None,
                              _outcome(("bending", 0.5, True)), 1, 289))
    assert "W4X13 is the lightest W section in the catalogue, and every check is OK." in page
