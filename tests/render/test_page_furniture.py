"""What a reviewer looks for first: contents, design basis, inputs near the front, sign-off, revision."""
import re
import textwrap

import calcsheet
from calcsheet.render.page import PackageDocument, standards_used

SHEET = """
---
project: Heron Quay
subject: Purlin P-3
by: R. Tamm
date: 2026-11-02
checked: S. Veit
checked_date: 2026-11-05
approved: L. Ngata
approved_date: 2026-11-06
rev: A                 // stale: the revisions list is the record
revisions:
  - A | 2026-11-02 | R.T. | First issue
  - B | 2026-11-20 | R.T. | Span revised   // after the client's comment
standards:
  - EN 1990:2002
---
# Loads
L = 4.80 m       -- span
w = 1.25 kN/m    -- line load
M [kN*m] = w*L^2/8
joist = section.rectangle(b=75 mm, h=250 mm)
check M <= 9.5 kN*m
"""


def page(text=SHEET):
    r = calcsheet.run(textwrap.dedent(text).lstrip())
    assert r.ok, r.format_diagnostics()
    return r, str(PackageDocument(r).html())


def text_of(html):
    return re.sub(r"\s+", " ", re.sub(r"<[^>]+>", " ", html).replace("&#8239;", " "))


def test_title_block_takes_rev_and_date_from_the_latest_revision_entry():
    _, h = page()
    block = text_of(h.split('<header class="titleblock">')[1].split("</header>")[0])
    assert "Date 2026-11-20" in block and "Rev B" in block
    assert "rev: A in the front matter, B in the latest revision entry" in text_of(h)  # the stale key is named


def test_signoff_lists_prepared_checked_approved_with_dates():
    _, h = page()
    sign = text_of(h.split("<table class='signoff'>")[1].split("</table>")[0])
    assert "Prepared R. Tamm 2026-11-02" in sign
    assert "Checked S. Veit 2026-11-05" in sign
    assert "Approved L. Ngata 2026-11-06" in sign


def test_contents_lists_headings_with_page_targets_and_comes_before_the_working():
    _, h = page()
    nav = h.split("<nav class='contents'>")[1].split("</nav>")[0]
    assert "href='#s-1'" in nav and "Loads" in nav and "href='#inputs'" in nav
    assert h.index("<nav class='contents'>") < h.index("<section class='inputs'") < h.index('<section class="calc">')


def test_inputs_table_shows_inputs_as_written_and_plugin_inputs():
    _, h = page()
    inputs = text_of(h.split("<section class='inputs'")[1].split("</section>")[0])
    assert "4.80 m" in inputs and "1.25 kN/m" in inputs  # the sheet's own digits
    assert "75 mm" in inputs and "250 mm" in inputs and "section.rectangle" in inputs


def test_design_basis_names_the_sheets_standards_and_each_plugins():
    r, h = page()
    basis = text_of(h.split("Design basis")[1].split("</ul>")[0])
    assert "EN 1990:2002 (this sheet)" in basis

    class FakeNs:
        standards = ("AISC 360-16",)

    class FakeRegistry:
        def namespace(self, name):
            return FakeNs()

    assert ("AISC 360-16", f"plugin section {r.plugin_versions['section']}") in standards_used(r, FakeRegistry())


def test_a_check_without_description_shows_its_condition_in_the_summary():
    _, h = page()
    row = h.split("<table class='summary'>")[1].split("</tr>")[1]
    cells = re.findall(r"<td[^>]*>(.*?)</td>", row, re.S)
    assert text_of(cells[1]).strip() != "" and text_of(cells[1]) == text_of(cells[2])


def test_front_matter_comment_and_warning_line():
    r = calcsheet.run("---\nproject: X   // the client's name\nunits: metric\n---\nx = 1 m\n")
    assert r.meta["project"] == "X"
    (d,) = [d for d in r.diagnostics if d.code == "front-matter"]
    assert d.span.line == 3


def test_readme_example_builds_without_warnings():
    from pathlib import Path

    readme = (Path(__file__).parents[2] / "README.md").read_text(encoding="utf-8")
    example = re.search(r"## Writing a sheet.*?```text\n(.*?)```", readme, re.S).group(1)
    r = calcsheet.run(example)
    assert [d for d in r.diagnostics if not d.suppressed] == [], r.format_diagnostics()


def test_a_sections_second_method_check_moves_to_the_appendix_referenced_from_its_working():
    _, h = page("---\nsubject: plate\n---\np = section.rectangle(b=100 mm, h=200 mm)\n")
    body = h.split('<section class="calc">')[1].split("</section>")[0]
    appendix = h.split("<section class='appendix'>")[1]
    assert "Green" in appendix and "<table" in appendix  # the second method's table is kept
    assert "Outline integral" not in body and "href=\"#cross-1\"" in body  # referenced, not inline
