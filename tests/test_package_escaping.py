"""Every piece of sheet text in the package is escaped, in every table and block that shows it.

A sheet is untrusted text. Each free-text slot of the sheet below carries its
own marker tag (``<p1>``, ``<d1>``…) together with ``&`` and quotes; the package
must show each marker escaped at least once (so the slot really is printed) and
never as markup. A slot that stopped escaping — the check descriptions of the
summary table, the inputs table, a plugin's table cells — fails by name.
"""
import re

import pytest

import calcsheet
from calcsheet.package import PackageDocument

SHEET = """---
project: <p1> & "double" 'single'
job: <p2>
subject: <p3>
by: <p4>
checked: <p5>
date: <p6>
rev: <p7>
revisions:
  - <p8> | <p9> | <p10> | <p11> & more
---
# <hd1> heading & "q"
## <hd2> subheading
> <pr1> prose & "quotes" 'apostrophes'

L = 2 m   -- <d1> input description
t = "<str1> & text"  -- <d2> text description
sq = section.rectangle(b=100 mm, h=10 mm, detail="brief")
pl = section.part(shape=sq, name="<n1> & plate")  -- <d3> part description
ho = section.hole(shape=section.rectangle(b=10 mm, h=5 mm), x=50 mm, y=5 mm, name="<n2> hole")
bu = section.built_up(parts=[pl, ho])
mat = material.custom(name="<n3> alloy", E=200 GPa, f_y=250 MPa)
mn = mat.name
bm = beam.solve(spans=[4 m], supports="pinned, roller", E=200 GPa, I=8e7 mm^4,
    loads=[beam.udl(w=2 kN/m, case="G")], combos=[beam.combo(name="<cb1> & co", factors="1.35 G")])
check L <= 3 m  -- <c1> check description & "q"
check 2*L >= 3 m  -- <c2> second check
u = 1 m // allow unused-input: <sup1> reason
y = 2 m <diag1>
"""

SLOTS = {
    "p1": "title block and front page: project", "p2": "title block: job", "p3": "title block: subject",
    "p4": "title block: by", "p5": "title block: checked", "p6": "title block: date", "p7": "title block: rev",
    "p8": "revisions table: rev", "p9": "revisions table: date", "p10": "revisions table: by",
    "p11": "revisions table: description", "hd1": "heading", "hd2": "subheading", "pr1": "prose",
    "d1": "step and inputs-table description", "d2": "description of a text value", "str1": "a text value",
    "d3": "description of a plugin call", "n1": "plugin note and parts-table cell (part name)",
    "n2": "plugin note and parts-table cell (hole name)", "n3": "text field of a plugin record",
    "cb1": "plugin table cells and notes (combination name)", "c1": "summary table and check step: description",
    "c2": "summary table: second check", "sup1": "suppressed-warnings list: reason",
}


@pytest.fixture(scope="module")
def html():
    r = calcsheet.run(SHEET, path='<f1> & "name".calc')
    assert any("'<'" in d.message for d in r.errors)  # the last line is a syntax error that quotes the sheet
    return PackageDocument(r).html()


@pytest.mark.parametrize("tag", sorted(SLOTS), ids=[f"{k}: {v}" for k, v in sorted(SLOTS.items())])
def test_each_slot_is_printed_escaped_and_never_as_markup(html, tag):
    assert f"&lt;{tag}&gt;" in html, f"{SLOTS[tag]}: not printed at all"
    assert f"<{tag}>" not in html and f"<{tag} " not in html, f"{SLOTS[tag]}: printed as markup"


def test_the_summary_table_escapes_every_check_description(html):
    summary = html[html.index("<table class='summary'>"):html.index("</table>", html.index("<table class='summary'>"))]
    assert "&lt;c1&gt; check description &amp; &quot;q&quot;" in summary
    assert "&lt;c2&gt; second check" in summary


def test_the_inputs_table_escapes_descriptions(html):
    inputs = html[html.index("<table class='inputs'>"):]
    inputs = inputs[:inputs.index("</table>")]
    assert "&lt;d1&gt; input description" in inputs


def test_the_file_name_in_the_footer_is_escaped(html):
    footer = html[html.index('<footer class="stamp">'):html.index("</footer>")]
    assert "&lt;f1&gt; &amp; &quot;name&quot;.calc" in footer and "<f1>" not in html


def test_diagnostics_quote_sheet_text_escaped(html):
    diags = html[html.index("<section class='diagnostics'>"):]
    assert "&#x27;&lt;&#x27;" in diags  # the message quotes the unexpected '<'


def test_every_ampersand_is_an_entity_and_quotes_never_break_out(html):
    stray = re.findall(r"&(?!(?:[a-zA-Z]+|#\d+|#x[0-9a-fA-F]+);).{0,20}", html)
    assert not stray, stray[:5]
    assert "&quot;double&quot; &#x27;single&#x27;" in html
    # nothing from the sheet inside an attribute: every attribute value is one of ours
    for value in re.findall(r'=\s*"([^"]*)"', html) + re.findall(r"=\s*'([^']*)'", html):
        assert "&lt;" not in value and "double" not in value, value


def test_no_tag_in_the_document_comes_from_the_sheet(html):
    tags = set(re.findall(r"<([a-zA-Z][\w-]*)", html))
    assert not tags & (set(SLOTS) | {"f1", "diag1"})
    assert not tags & {"script", "img", "iframe", "object", "embed", "base"}
