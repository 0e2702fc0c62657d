"""A long package page laid out in chunks, so the memory of a PDF is bounded by a chunk, not the document.

WeasyPrint keeps every laid-out page of a document until it has written the PDF (a few MB a page). A page
longer than two ``CHUNK_CHARS`` (a figure's SVG counted at a flat rate) is therefore cut into its blocks
(the children of ``<main>``, and of the calculation's ``<section class="calc">``), and laid out a chunk at a
time: each chunk is written to PDF bytes and freed before the next is laid out. The chunks are joined with
pypdf. What crosses chunks is put back by this module, from WeasyPrint's own record of each page
(``Page.anchors``, ``links``, ``bookmarks``):

- **Pagination as one document.** A chunk's last page is not kept: the blocks on it (from the first block
  that reaches it, found by its anchor) are laid out again at the start of the next chunk, so every page
  break falls where a continuous layout would put it (the blocks carry an ``id``; a block without one gets
  one in the chunk only).
- **Title block, stamp and "Sheet N of M".** The chunks are laid out without the running header and foot;
  once the page count M is known, one light document of M empty pages carries them (the page's own title
  block and stamp, with ``counter(page)`` and ``counter(pages)``), and each of its pages is drawn over the
  same page of the body.
- **Contents page numbers.** The front page and the contents are laid out last, with each entry's page
  number written in (``data-page``), read from where its heading landed.
- **Links and outline.** Internal links (to any chunk) and the outline of headings are made again on the
  joined PDF, at the positions WeasyPrint laid them out.

The one difference from a single layout: what follows the contents (the inputs) starts on a new page.
A page that is short, or not a calculation package (no ``<section class="calc">``: a schedule's or a sweep's
page), is laid out in one piece as before.
"""
from __future__ import annotations

import gc
import html as _html
import io
import re

__all__ = ["CHUNK_CHARS", "blocks", "render_chunked"]

# About 20 pages of a calculation: the chunk size that bounds the memory (a laid-out page holds 3–4 MB).
# A page of less than two chunks is laid out in one piece.
CHUNK_CHARS = 150_000

_TAG = re.compile(r"<!--.*?-->|<(/?)([a-zA-Z][a-zA-Z0-9:-]*)\b(?:[^>\"']|\"[^\"]*\"|'[^']*')*?(/?)>", re.S)
_VOID = {"area", "base", "br", "col", "embed", "hr", "img", "input", "link", "meta", "source", "track", "wbr"}
_ID = re.compile(r"""\sid=(?:"([^"]*)"|'([^']*)')""")
_START = re.compile(r"<([a-zA-Z][a-zA-Z0-9]*)")
_OWN = "calcsheet-chunk-block-"  # the id given to a block that has none (never written to the PDF)

# The chunks of the body: laid out without the running title block and stamp (drawn by the overlay).
CHUNK_CSS = """
@page { @top-center { content: none; } @bottom-center { content: none; } }
header.titleblock, footer.stamp { display: none; }
section.calc.cs-top { margin-top: 0; }
"""
# The front page and contents: the contents' page numbers are written in.
FRONT_CSS = CHUNK_CSS + """
nav.contents a::after { content: leader("..") attr(data-page); }
"""
# The overlay: the running title block and stamp on M empty pages.
OVERLAY_CSS = """
main > .cs-page + .cs-page { break-before: page; }
"""


class _Unsplittable(Exception):
    """The page is not in the shape this module cuts (it is then laid out in one piece)."""


def _children(text: str, start: int, end: int) -> list[tuple[int, int]]:
    """The (start, end) offsets of the elements directly inside ``text[start:end]``."""
    out: list[tuple[int, int]] = []
    depth, begin, pos = 0, start, start
    for m in _TAG.finditer(text, start, end):
        if m.group(0).startswith("<!--"):
            continue
        if depth == 0 and text[pos:m.start()].strip():
            raise _Unsplittable("text between blocks")
        close, name, selfclose = m.group(1), m.group(2).lower(), m.group(3)
        if close:
            depth -= 1
            if depth < 0:
                raise _Unsplittable("unbalanced tags")
            if depth == 0:
                out.append((begin, m.end()))
        elif name in _VOID or selfclose:
            if depth == 0:
                out.append((m.start(), m.end()))
        else:
            if depth == 0:
                begin = m.start()
            depth += 1
        pos = m.end()
    if depth or text[pos:end].strip():
        raise _Unsplittable("unbalanced tags")
    return out


_SVG = re.compile(r"<svg\b.*?</svg>", re.S)
_SVG_WEIGHT = 4_000  # a figure's SVG counts as this many characters: its paths are long text but a small box


def weight(html: str) -> int:
    """What a piece of the page costs to lay out, in characters of text (a figure's SVG at a flat rate)."""
    if "<svg" not in html:
        return len(html)
    return len(_SVG.sub("", html)) + _SVG_WEIGHT * html.count("<svg")


class _Block:
    """One block of the page: its HTML, the anchor that finds it on a laid-out page, and the containers it
    sits in (``wrap``: (a number for each container, its start tag), outermost first)."""
    __slots__ = ("html", "anchor", "wrap", "weight")

    def __init__(self, html: str, anchor: str, wrap: tuple = ()):
        self.html, self.anchor, self.wrap = html, anchor, wrap
        self.weight = weight(html)


def _block(fragment: str, n: int, wrap: tuple = ()) -> _Block:
    start = _START.match(fragment)
    if start is None:
        raise _Unsplittable("a block that is not an element")
    head_end = fragment.index(">")
    found = _ID.search(fragment, 0, head_end)
    if found:
        return _Block(fragment, _html.unescape(found.group(1) if found.group(1) is not None else found.group(2)),
                      wrap)
    anchor = f"{_OWN}{n}"
    return _Block(fragment[:start.end()] + f' id="{anchor}"' + fragment[start.end():], anchor, wrap)


# The containers whose children are blocks of their own (a working can run to several pages): their start
# tag exactly as the package page prints it, and their end tag.
_CONTAINERS = {'<section class="calc">': "</section>", '<div class="working">': "</div>"}


def blocks(page: str) -> tuple[str, list[_Block], list[_Block], str]:
    """The page cut into (head up to ``<main>``, the front blocks, the body blocks, the tail from ``</main>``).
    Front: the front page and the contents; body: every other block, the calculation's (and its workings')
    one by one."""
    try:
        main_start = page.index("<main>") + len("<main>")
        main_end = page.rindex("</main>")
    except ValueError:
        raise _Unsplittable("no <main>") from None
    front: list[_Block] = []
    body: list[_Block] = []
    count = [0]

    def expand(s: int, e: int, wrap: tuple) -> None:
        for open_tag, close_tag in _CONTAINERS.items():
            if page.startswith(open_tag, s):
                count[0] += 1
                inner = (count[0], open_tag)
                for cs, ce in _children(page, s + len(open_tag), page.rindex(close_tag, s, e)):
                    expand(cs, ce, wrap + (inner,))
                return
        count[0] += 1
        body.append(_block(page[s:e], count[0], wrap))

    for s, e in _children(page, main_start, main_end):
        if (page.startswith('<section class="front">', s) or page.startswith("<nav class='contents'>", s)) \
                and not body:
            count[0] += 1
            front.append(_block(page[s:e], count[0]))
        else:
            expand(s, e, ())
    if not any(b.wrap for b in body):  # not a calculation package (a schedule's or a sweep's page)
        raise _Unsplittable("no calculation")
    return page[:main_start], front, body, page[main_end:]


def _join(chunk: list[_Block], top: bool) -> str:
    """The blocks of a chunk as HTML, each in its containers again (a container cut between chunks is opened
    again in the next; ``top``: the chunk continues the calculation, which then has no top margin)."""
    out: list[str] = []
    open_now: list = []
    for b in chunk:
        same = 0
        while same < min(len(open_now), len(b.wrap)) and open_now[same] == b.wrap[same]:
            same += 1
        while len(open_now) > same:
            out.append(_CONTAINERS[open_now.pop()[1]])
        for container in b.wrap[same:]:
            tag = container[1]
            if top and not out and tag == '<section class="calc">':
                tag = '<section class="calc cs-top">'
            out.append(tag)
            open_now.append(container)
        out.append(b.html)
    while open_now:
        out.append(_CONTAINERS[open_now.pop()[1]])
    return "\n".join(out)


class _Kept:
    """What the join needs of a page once its layout is freed."""
    __slots__ = ("width", "height", "anchors", "links", "bookmarks")

    def __init__(self, page):
        self.width, self.height = page.width, page.height
        self.anchors = {name: (pos[0], pos[1]) for name, pos in page.anchors.items()}
        self.links = [(target, rect) for kind, target, rect, _box in page.links if kind == "internal"]
        self.bookmarks = [(level, label, pos[0], pos[1]) for level, label, pos, _state in page.bookmarks]
        # the chunk's PDF has none of these: the joined PDF gets them all, wherever their target is
        page.links = [link for link in page.links if link[0] != "internal"]
        page.bookmarks = []
        page.anchors = {name: pos for name, pos in page.anchors.items() if not name.startswith(_OWN)}


def _carry(chunk: list[_Block], pages, first: dict[str, int]) -> tuple[int, int]:
    """(the first page not kept, the first block laid out again): the blocks that reach the chunk's last page,
    and every block that shares a page with them, go to the next chunk."""
    cut = len(pages) - 1
    while True:
        later = [p.anchors for p in pages[cut:]]
        k = next((k for k, b in enumerate(chunk) if any(b.anchor in a for a in later)), None)
        if k is None:  # no block starts or continues there (cannot happen: the last page holds some block)
            return 0, 0
        start_page = first.get(chunk[k].anchor, 0)
        if start_page >= cut:
            return cut, k
        cut = start_page


def render_chunked(page: str, render, stylesheet, cap: int, too_many) -> bytes | None:
    """The PDF of ``page`` laid out a chunk at a time, or None when the page is short or not cut this way.

    ``render(html, stylesheets)``: a laid-out WeasyPrint document; ``stylesheet(text)``: a parsed (cached)
    stylesheet; ``cap``: the most pages; ``too_many(pages)``: the exception when the PDF would have more."""
    if weight(page) < 2 * CHUNK_CHARS:
        return None
    try:
        head, front, body, tail = blocks(page)
    except _Unsplittable:
        return None
    chunk_css, front_css = stylesheet(CHUNK_CSS), stylesheet(FRONT_CSS)
    # what lives before the first chunk is not looked at by the collections that free each chunk
    frozen = not gc.get_freeze_count()
    if frozen:
        gc.freeze()
    try:
        return _render_chunks(page, head, front, body, tail, render, stylesheet, cap, too_many,
                              chunk_css, front_css)
    finally:
        if frozen:
            gc.unfreeze()


def _render_chunks(page, head, front, body, tail, render, stylesheet, cap, too_many, chunk_css, front_css):

    pdfs: list[bytes] = []
    kept: list[_Kept] = []
    start = 0
    while start < len(body):
        end, size = start, 0
        while end < len(body) and (size < CHUNK_CHARS or end == start):
            size += body[end].weight
            end += 1
        chunk = body[start:end]
        doc = render(head + _join(chunk, top=start > 0 and bool(chunk[0].wrap)) + tail, [chunk_css])
        pages = doc.pages
        first = {}
        for i, p in enumerate(pages):
            for name in p.anchors:
                first.setdefault(name, i)
        cut, nxt = len(pages), end
        if end < len(body) and len(pages) > 1:
            cut, first_block = _carry(chunk, pages, first)
            if cut:
                nxt = start + first_block
            else:  # one block fills the chunk: kept whole, the next chunk starts on a new page
                cut = len(pages)
        keep = pages[:cut]
        kept += [_Kept(p) for p in keep]
        if len(kept) > cap:
            raise too_many(len(kept))
        pdfs.append(doc.copy(keep).write_pdf())
        del doc, pages, keep
        gc.collect()  # a laid-out page is a web of cycles: free it before the next chunk
        start = nxt

    # the front page and contents, with the contents' page numbers written in
    front_pages: list[_Kept] = []
    front_pdf = b""
    if front:
        where: dict[str, int] = {}
        for i, k in enumerate(kept):
            for name in k.anchors:
                where.setdefault(name, i)
        offset = 1
        for _attempt in range(3):
            numbered = [_number_contents(b, where, offset) for b in front]
            doc = render(head + "\n".join(b.html for b in numbered) + tail, [front_css])
            if len(doc.pages) == offset:
                break
            offset = len(doc.pages)
        else:  # pragma: no cover - the contents' own length depends on its numbers, three times over
            return None
        front_pages = [_Kept(p) for p in doc.pages]
        front_pdf = doc.copy().write_pdf()
        del doc
        gc.collect()
    all_pages = front_pages + kept
    if len(all_pages) > cap:
        raise too_many(len(all_pages))

    overlay = render(head + '<div class="cs-page"></div>' * len(all_pages) + tail, [stylesheet(OVERLAY_CSS)])
    if len(overlay.pages) != len(all_pages):  # pragma: no cover - an empty page is one page
        return None
    overlay_pdf = overlay.write_pdf()
    del overlay
    return _assemble([front_pdf] + pdfs if front_pdf else pdfs, overlay_pdf, all_pages)


def _number_contents(b: _Block, where: dict[str, int], offset: int) -> _Block:
    """A contents block with each entry's page number in ``data-page`` (the body starts after ``offset``
    pages of front matter)."""
    if not b.html.startswith("<nav"):
        return b

    def number(m):
        target = _html.unescape(m.group(2))
        page = where.get(target)
        return m.group(0) + (f' data-page="{page + offset + 1}"' if page is not None else ' data-page=""')

    return _Block(re.sub(r"""<a href=(['"])#(.*?)\1""", number, b.html), b.anchor)


def _assemble(pdfs: list[bytes], overlay_pdf: bytes, pages: list[_Kept]) -> bytes:
    """Join the chunks' PDFs, draw the title block and stamp over each page, and make the links and outline."""
    from pypdf import PdfReader, PdfWriter
    from pypdf.annotations import Link
    from pypdf.generic import Fit

    writer = PdfWriter()
    first = None
    for data in pdfs:
        reader = PdfReader(io.BytesIO(data))
        first = first or reader
        writer.append(reader, import_outline=False)
    if first is not None and first.metadata:
        writer.add_metadata({k: v for k, v in first.metadata.items()})
    overlay = PdfReader(io.BytesIO(overlay_pdf))
    for n, (page, over) in enumerate(zip(writer.pages, overlay.pages)):
        _draw_over(writer, page, over, n)

    px = 0.75  # a CSS px in PDF points
    where = {}
    for i, k in enumerate(pages):
        for name, pos in k.anchors.items():
            where.setdefault(name, (i, pos))

    def fit(i, pos):
        return Fit.xyz(left=pos[0] * px, top=(pages[i].height - pos[1]) * px)

    for i, k in enumerate(pages):
        for target, (x1, y1, x2, y2) in k.links:
            if target in where:
                j, pos = where[target]
                rect = (x1 * px, (k.height - y2) * px, x2 * px, (k.height - y1) * px)
                writer.add_annotation(i, Link(rect=rect, target_page_index=j, fit=fit(j, pos)))
    parents = []  # (level, outline item) from the top
    for i, k in enumerate(pages):
        for level, label, x, y in k.bookmarks:
            while parents and parents[-1][0] >= level:
                parents.pop()
            item = writer.add_outline_item(title=label, page_number=i, parent=parents[-1][1] if parents else None,
                                           fit=fit(i, (x, y)))
            parents.append((level, item))
    out = io.BytesIO()
    writer.write(out)
    return out.getvalue()


def _draw_over(writer, page, over, n: int) -> None:
    """Draw ``over`` (a page of another PDF) over ``page`` as a form XObject: its content stream is copied as
    it is (still compressed), not parsed and merged operator by operator."""
    from pypdf.generic import (ArrayObject, DecodedStreamObject, DictionaryObject, FloatObject, NameObject,
                               StreamObject)

    contents = over["/Contents"].get_object()
    if isinstance(contents, ArrayObject):  # pragma: no cover - WeasyPrint writes one stream a page
        data = b"\n".join(c.get_object().get_data() for c in contents)
        form = DecodedStreamObject()
        form.set_data(data)
    else:
        form = StreamObject()
        form._data = contents._data  # the encoded bytes, with the filter that decodes them
        if "/Filter" in contents:
            form[NameObject("/Filter")] = contents["/Filter"]
        if "/DecodeParms" in contents:
            form[NameObject("/DecodeParms")] = contents["/DecodeParms"]
    form[NameObject("/Type")] = NameObject("/XObject")
    form[NameObject("/Subtype")] = NameObject("/Form")
    form[NameObject("/BBox")] = ArrayObject([FloatObject(v) for v in over.mediabox])
    form[NameObject("/Resources")] = over["/Resources"].get_object().clone(writer)
    ref = writer._add_object(form)

    name = NameObject(f"/CsOver{n}")
    resources = DictionaryObject(page["/Resources"].get_object())  # this page's own: the name is its alone
    xobjects = DictionaryObject(resources["/XObject"].get_object()) if "/XObject" in resources else DictionaryObject()
    xobjects[name] = ref
    resources[NameObject("/XObject")] = xobjects
    page[NameObject("/Resources")] = resources

    before, after = DecodedStreamObject(), DecodedStreamObject()
    before.set_data(b"q\n")
    after.set_data(b"\nQ q " + str(name).encode("ascii") + b" Do Q\n")
    old = page.raw_get("/Contents")  # the reference as written: a stream in an array must stay indirect
    old_list = list(old.get_object()) if isinstance(old.get_object(), ArrayObject) else [old]
    page[NameObject("/Contents")] = ArrayObject([writer._add_object(before), *old_list, writer._add_object(after)])
