"""The document printers: one walk over trace records, and numbering as a pure pass."""
import re

from calcsheet.render.document import DocumentPrinter, number_items
from calcsheet.render.page import PackageDocument
from calcsheet.trace import CheckResult, Heading, Note, Step

SHEET = """
# Loads
a = 2 m
## Beam
b = a*3
check b <= 10 m
# Checks
c = b + a
"""


def test_numbering_returns_new_records_and_leaves_the_result_alone(run):
    r = run(SHEET)
    before = [(getattr(i, "number", None), getattr(i, "anchor", None)) for i in r.items]
    numbered = number_items(r.items)
    assert [(getattr(i, "number", None)) for i in numbered] == ["1", "1.1", "1.1", "1.1.1", "1.1.2", "2", "2.1"]
    assert [getattr(i, "anchor", None) for i in numbered if isinstance(i, Heading)] == ["s-1", "s-1.1", "s-2"]
    assert [(getattr(i, "number", None), getattr(i, "anchor", None)) for i in r.items] == before
    assert all(n is not o for n, o in zip(numbered, r.items) if isinstance(o, (Heading, Step, CheckResult)))


def test_building_the_page_twice_gives_the_same_page_and_does_not_number_the_result(run):
    r = run(SHEET)
    first = PackageDocument(r).html()
    assert PackageDocument(r).html() == first
    assert all(not s.number for s in r.steps.values()) and all(not c.number for c in r.checks)
    assert re.search(r'class="stepno" id="[^"]+">1.1.2</span>', str(first))


def test_dispatch_follows_the_record_class_and_an_unknown_record_prints_nothing():
    class Words(DocumentPrinter):
        empty = None

        def join(self, pieces):
            return "|".join(p for p in pieces if p is not None)

        def _print_Note(self, item):
            return f"note:{item.text}"

    class Warning_(Note):
        pass

    assert Words().items([Note("a"), Warning_("b"), object()]) == "note:a|note:b"


def test_sheet_text_reaches_the_page_only_escaped(run):
    r = run('---\nproject: <b>P</b>\n---\n# <i>H</i>\n> <script>x</script>\na = 2 m  -- "<u>d</u>"\n')
    page = PackageDocument(r).html()
    for raw in ("<b>P</b>", "<i>H</i>", "<script>x</script>", "<u>d</u>"):
        assert raw not in page
    assert "&lt;script&gt;x&lt;/script&gt;" in page and "&lt;i&gt;H&lt;/i&gt;" in page


def test_numbering_copies_each_record_as_dataclasses_replace_would():
    # number_items (and the fast rebuild) copy records without re-running __init__ (trace.copied); that equals
    # dataclasses.replace only while the trace records have no __post_init__, no init-only fields and no
    # __slots__ — held here
    import dataclasses

    from calcsheet.trace import CheckResult, FunctionStep, Heading, Step, copied

    for cls in (Step, FunctionStep, CheckResult, Heading):
        assert not hasattr(cls, "__post_init__") and not hasattr(cls, "__slots__")
        assert all(f.init and not isinstance(f.type, dataclasses.InitVar) for f in dataclasses.fields(cls))
    h = Heading(text="Beam", level=1)
    assert copied(h, number="2", anchor="s-2") == dataclasses.replace(h, number="2", anchor="s-2")
    assert h.number == ""  # the record given is not changed
    s = Step(name="M", expr=None, value=1.0)
    assert copied(s, number="2.1") == dataclasses.replace(s, number="2.1") and s.number != "2.1"
