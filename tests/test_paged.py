"""A long package PDF is laid out a chunk at a time (calcsheet/paged.py) and reads as one document: every
block once and in order, "Sheet N of M" on every page, the contents' page numbers where the headings land,
links and outline that lead to their targets, and nothing written when a chunk fails."""
import io
import re
import textwrap

import pytest

import calcsheet
from calcsheet import package, paged
from calcsheet.render.page import PackageDocument

pypdf = pytest.importorskip("pypdf")

# Invented members: a heading every eight steps, so the page cuts into many blocks.
SHEET = textwrap.dedent("""\
    ---
    project: Harrow Lane Store
    job: 27-118
    subject: Floor joists J-1 to J-9
    by: A.K.
    rev: B
    ---
    """) + "".join(textwrap.dedent(f"""\
    # Joist J-{i}
    > Simply supported joist, uniform load.
    L_{i} = {3 + i % 4} m   -- span
    w_{i} [kN/m] = 1.35*{1 + i % 3} kPa*0.4 m + 0.2 kN/m   -- factored line load
    M_{i} [kN*m] = w_{i}*L_{i}^2/8   -- midspan moment
    b_{i} = 47 mm   -- width
    h_{i} = {170 + 25 * (i % 3)} mm   -- depth
    Z_{i} [mm^3] = b_{i}*h_{i}^2/6   -- elastic section modulus
    s_{i} [MPa] = M_{i}/Z_{i}   -- bending stress
    check s_{i} <= 24 MPa   -- bending
    """) for i in range(1, 10))

CHUNK = 6_000  # characters: small enough that this sheet makes several chunks
JOINS = {"chunks": 0}


@pytest.fixture(scope="module")
def page():
    r = calcsheet.run(SHEET, path="joists.calc")
    assert r.ok, r.format_diagnostics()
    return str(PackageDocument(r).html())


@pytest.fixture(scope="module")
def pdfs(page):
    """(the PDF laid out in chunks, the same page laid out in one piece)."""
    saved, join = paged.CHUNK_CHARS, paged._join

    def counted(chunk, top):
        JOINS["chunks"] += 1
        return join(chunk, top)

    try:
        paged.CHUNK_CHARS, paged._join = CHUNK, counted
        chunked = package.pdf_bytes(page)
        paged.CHUNK_CHARS, paged._join = 10 ** 9, join
        whole = package.pdf_bytes(page)
    finally:
        paged.CHUNK_CHARS, paged._join = saved, join
    return pypdf.PdfReader(io.BytesIO(chunked)), pypdf.PdfReader(io.BytesIO(whole))


def _texts(reader):
    return [p.extract_text() for p in reader.pages]


_STEP_ID = re.compile(r'<div\b[^>]*\bclass="step[^"]*"[^>]*><span class="stepno" id="(v-[^"]*)"')


def test_a_package_page_is_cut_into_its_front_and_its_blocks(page):
    head, front, body, tail = paged.blocks(page)
    assert head.endswith("<main>") and tail.startswith("</main>")
    assert [b.html[:4] for b in front] == ["<sec", "<nav"]  # the front page and the contents
    anchors = [b.anchor for b in body]
    assert len(anchors) == len(set(anchors))
    # every step and heading of the calculation is a block of its own, in the sheet's order
    # (a step's anchor is on its number, the block's first element: see render/page.py _number)
    steps = [m.group(1) for b in body if (m := _STEP_ID.match(b.html))]
    assert steps[:3] == ["v-L_1", "v-w_1", "v-M_1"] and "v-s_9" in steps
    # nothing is lost: the blocks hold every id of the page's <main>
    ids = set(re.findall(r"""\sid=["']([^"']+)""", page[page.index("<main>"):]))
    inside = set()
    for b in front + body:
        inside |= set(re.findall(r"""\sid=["']([^"']+)""", b.html))
    assert ids <= inside


def test_a_page_that_is_not_a_package_page_is_laid_out_in_one_piece():
    calls = []
    text = "<html><body>" + "<p>x</p>" * 100_000 + "</body></html>"
    assert paged.render_chunked(text, lambda *a: calls.append(a), lambda t: t, 10, ValueError) is None
    assert calls == []


def test_the_long_page_was_laid_out_in_several_chunks(pdfs):
    chunked, whole = pdfs
    assert JOINS["chunks"] >= 3
    assert len(chunked.pages) >= len(whole.pages)


def test_every_block_is_printed_once_and_in_order(pdfs):
    chunked, whole = pdfs
    from collections import Counter

    def numbers(reader):  # every step number and value printed (a lost or doubled block changes the count)
        return Counter(re.findall(r"(?<![\d.])\d+\.\d+(?![\d.])", "\n".join(_texts(reader))))

    ours, theirs = numbers(chunked), numbers(whole)
    assert ours == theirs
    assert sum(ours[f"{i}.{k}"] for i in range(1, 10) for k in range(2, 9)) >= 9 * 7

    def headings(reader):
        return re.findall(r"(?m)^\s*\d\s+Joist (J-\d)\s*$", "\n".join(_texts(reader)))

    assert headings(chunked) == headings(whole) == [f"J-{i}" for i in range(1, 10)]


def test_every_page_has_its_title_block_and_sheet_n_of_m(pdfs):
    chunked, _ = pdfs
    texts = _texts(chunked)
    assert len(texts) >= 4
    for n, text in enumerate(texts, 1):
        assert "Harrow Lane Store" in text and "27-118" in text and "A.K." in text
        assert f"{n} of {len(texts)}" in text
        assert "sha256" in text  # the stamp


def test_the_contents_page_numbers_are_where_the_headings_land(pdfs):
    chunked, _ = pdfs
    texts = _texts(chunked)
    contents = next(t for t in texts if "Contents" in t)
    listed = {}
    for line in contents.splitlines():
        m = re.match(r"\s*(\d)\s+Joist J-(\d)\b.*?(\d+)\s*$", line)
        if m:
            listed[m.group(2)] = int(m.group(3))
    assert len(listed) == 9
    for joist, number in listed.items():
        # the heading "n Joist J-n" stands at the head of a line on that page and no earlier one
        heading = re.compile(rf"(?m)^\s*{joist}\s+Joist J-{joist}\s*$")
        pages_with = [i for i, t in enumerate(texts, 1) if heading.search(t)]
        assert pages_with and pages_with[0] == number, (joist, number, pages_with)


def _link_targets(reader):
    """For every internal link: (page it is on, page it leads to)."""
    index = {p.indirect_reference.idnum: i for i, p in enumerate(reader.pages)}
    named = reader.named_destinations
    out = []
    for i, page in enumerate(reader.pages):
        for annot in page.get("/Annots") or []:
            a = annot.get_object()
            if a.get("/Subtype") != "/Link" or "/Dest" not in a:
                continue
            dest = a["/Dest"]
            if isinstance(dest, str):
                target = named[dest].page
                target = target.idnum if hasattr(target, "idnum") else target.indirect_reference.idnum
            else:
                target = dest[0].idnum
            out.append((i, index[target]))
    return out


def test_links_lead_to_their_targets_across_chunks(pdfs):
    chunked, whole = pdfs
    ours, theirs = _link_targets(chunked), _link_targets(whole)
    assert len(ours) == len(theirs) > 50
    texts = _texts(chunked)
    # a link from the summary of checks leads to the page that shows that check
    assert any(src == 0 and dst > 2 for src, dst in ours)
    for src, dst in ours:
        assert 0 <= dst < len(texts)


def test_the_outline_has_every_heading_and_leads_to_its_page(pdfs):
    chunked, whole = pdfs

    def flat(items, reader, depth=0):
        out = []
        for item in items:
            if isinstance(item, list):
                out += flat(item, reader, depth + 1)
            else:
                out.append((depth, item.title, reader.get_destination_page_number(item)))
        return out

    ours, theirs = flat(chunked.outline, chunked), flat(whole.outline, whole)
    assert [(d, t) for d, t, _ in ours] == [(d, t) for d, t, _ in theirs]
    texts = _texts(chunked)
    for _, title, number in ours:
        if title.startswith(tuple("123456789")):
            assert title.split(" ", 1)[1] in texts[number]


def test_too_many_pages_is_refused_while_chunking(page, monkeypatch):
    monkeypatch.setattr(paged, "CHUNK_CHARS", CHUNK)
    monkeypatch.setenv("CALCSHEET_LIMIT_PDF_PAGES", "3")
    with pytest.raises(package.PackageTooLarge, match="pages"):
        package.pdf_bytes(page)


def test_a_chunk_that_fails_leaves_the_old_package(tmp_path, monkeypatch):
    src = tmp_path / "joists.calc"
    src.write_text(SHEET)
    package.write_package(calcsheet.run(src), tmp_path, ["html", "pdf"])
    before = {p.name: p.read_bytes() for p in tmp_path.rglob("joists.*") if p.suffix != ".calc"}
    monkeypatch.setattr(paged, "CHUNK_CHARS", CHUNK)

    def boom(*args):
        raise RuntimeError("joining died mid-way")

    monkeypatch.setattr(paged, "_assemble", boom)
    src.write_text(SHEET.replace("rev: B", "rev: C"))
    with pytest.raises(RuntimeError):
        package.write_package(calcsheet.run(src), tmp_path, ["html", "pdf"])
    after = {p.name: p.read_bytes() for p in tmp_path.rglob("joists.*") if p.suffix != ".calc"}
    assert after == before


def test_a_strict_pdf_reader_reads_every_page_of_the_joined_pdf(pdfs):
    # every content stream stays an indirect object (PDF 32000-1 7.3.8: a stream is always indirect); a
    # stream written inline in a page's /Contents array is skipped by stricter readers (pdfminer read no page)
    pdfplumber = pytest.importorskip("pdfplumber")
    chunked, _ = pdfs
    with pdfplumber.open(io.BytesIO(chunked.stream.getvalue())) as pdf:
        assert len(pdf.pages) == len(chunked.pages)
        assert all(page.chars for page in pdf.pages)


def test_a_working_cut_between_chunks_is_opened_again_in_the_next():
    """A plugin's working can run to several pages: its records are blocks of their own, and a chunk that
    starts inside it opens the working (and the calculation) again, so every tag is balanced."""
    r = calcsheet.run("plate = section.rectangle(b=180 mm, h=12 mm)   -- flange plate\nx = 2 m\n", path="w.calc")
    assert r.ok, r.format_diagnostics()
    head, front, body, tail = paged.blocks(str(PackageDocument(r).html()))
    inside = [k for k, b in enumerate(body) if any(tag == '<div class="working">' for _, tag in b.wrap)]
    assert len(inside) >= 3 and _STEP_ID.match(body[inside[0] - 1].html).group(1) == "v-plate"
    later = body[inside[1]:]  # a chunk that starts at the working's second record
    html = paged._join(later, top=True)
    assert html.startswith('<section class="calc cs-top">\n<div class="working">')
    assert html.count("<div") == html.count("</div>") and html.count("<section") == html.count("</section>")
    # the whole body joined again is the page's calculation, block for block
    assert paged._join(body, top=False).count('<div class="working">') == 1


def test_a_schedule_page_is_not_cut():
    """Only a calculation package is cut: a schedule's page (one long table in its front section) keeps its
    single layout."""
    page = ("<html><head></head><body><main><section class='front'><table>"
            + "<tr><td>member</td></tr>" * 30_000 + "</table></section></main></body></html>")
    with pytest.raises(paged._Unsplittable):
        paged.blocks(page)
    assert paged.render_chunked(page, None, None, 10, ValueError) is None


def test_a_layout_that_fails_still_puts_the_collector_back(monkeypatch):
    import gc

    before = (gc.get_threshold(), gc.get_freeze_count())

    def failing(*args, **kwargs):
        raise RuntimeError("layout failed")

    monkeypatch.setattr(paged, "render_chunked", failing)
    with pytest.raises(RuntimeError):
        package.pdf_bytes("<!DOCTYPE html><html><body><p>x</p></body></html>")
    assert (gc.get_threshold(), gc.get_freeze_count()) == before
