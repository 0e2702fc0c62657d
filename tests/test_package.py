"""The package: PDF pages with the title block, a locked-down fetcher, atomic writes."""
import io
import os
import textwrap

import pytest

import calcsheet
from calcsheet.package import make_fetcher, pdf_bytes, write_package
from calcsheet.render.page import PackageDocument

pypdf = pytest.importorskip("pypdf")

SHEET = textwrap.dedent("""\
    ---
    project: Kestrel Yard Canopy
    job: 26-3321
    subject: Purlin P-1
    by: T.N.
    checked: R.S.
    rev: C
    paper: A4
    ---
    # Loads
    > A purlin spanning between rafters.
    L = 5.0 m
    w = 1.8 kN/m
    M [kN*m] = w*L^2/8
    S = 1.2e5 mm^3
    s [MPa] = M/S
    check s <= 165 MPa -- bending
    """) + "".join(f"\n# Part {i}\n> Filler text for paging.\nx_{i} = {i} m\ncheck x_{i} <= 30 m\n" for i in range(30))


def pages(pdf: bytes):
    return [p.extract_text() for p in pypdf.PdfReader(io.BytesIO(pdf)).pages]


@pytest.fixture(scope="module")
def built(tmp_path_factory):
    out = tmp_path_factory.mktemp("pkg")
    src = out / "purlin.calc"
    src.write_text(SHEET)
    r = calcsheet.run(src)
    assert r.ok, r.format_diagnostics()
    write_package(r, out, ["html", "pdf", "json"])
    return r, out


def test_every_page_has_the_title_block_and_page_n_of_N(built):
    r, out = built
    texts = pages((out / "purlin.pdf").read_bytes())
    assert len(texts) >= 3
    for i, t in enumerate(texts, 1):
        assert "Kestrel Yard Canopy" in t and "26-3321" in t and "Purlin P-1" in t
        assert "T.N." in t and "R.S." in t
        assert f"{i} of {len(texts)}" in t
        assert "sha256" in t


def test_summary_of_checks_comes_first(built):
    r, out = built
    texts = pages((out / "purlin.pdf").read_bytes())
    assert "Summary of checks" in texts[0] and "OK" in texts[0]
    assert "Caution" in texts[0] + texts[1]


def test_letter_paper(tmp_path):
    r = calcsheet.run("---\npaper: Letter\n---\nx = 1 m\n")
    pdf = pypdf.PdfReader(io.BytesIO(pdf_bytes(PackageDocument(r).html())))
    box = pdf.pages[0].mediabox
    assert (round(float(box.width)), round(float(box.height))) == (612, 792)  # 8.5 × 11 in at 72 pt/in


@pytest.mark.parametrize("url", [
    "file:///etc/passwd", "http://127.0.0.1:9/x.css", "https://example.invalid/a.png", "ftp://x/y",
    "file:///dev/zero",
])
def test_fetcher_refuses_files_and_network(url):
    with pytest.raises(ValueError):
        make_fetcher().fetch(url)


def test_fetcher_allows_data_urls():
    resp = make_fetcher().fetch("data:text/plain,hello")
    assert resp is not None


def test_sheet_cannot_make_the_pdf_read_a_file(tmp_path):
    secret = tmp_path / "secret.txt"
    secret.write_text("TOPSECRET-CONTENT")
    # even if markup got through, our fetcher would refuse it; here the sheet text is escaped anyway
    html = PackageDocument(calcsheet.run(f'> <link rel="attachment" href="file://{secret}">\nx = 1\n')).html()
    html += f'<a rel="attachment" href="file://{secret}">x</a><img src="file://{secret}">'
    pdf = pdf_bytes(html)
    assert b"TOPSECRET-CONTENT" not in pdf


def test_failed_build_leaves_the_previous_package_byte_identical(tmp_path, monkeypatch):
    src = tmp_path / "s.calc"
    src.write_text("x = 2 m\n")
    write_package(calcsheet.run(src), tmp_path, ["html", "pdf"])
    before = {p.name: p.read_bytes() for p in tmp_path.glob("s.*") if p.suffix != ".calc"}

    import calcsheet.package as package

    def boom(html):
        raise RuntimeError("renderer died mid-way")

    monkeypatch.setattr(package, "pdf_bytes", boom)
    src.write_text("x = 3 m\n")
    with pytest.raises(RuntimeError):
        write_package(calcsheet.run(src), tmp_path, ["html", "pdf"])
    after = {p.name: p.read_bytes() for p in tmp_path.glob("s.*") if p.suffix != ".calc"}
    assert after == before
    assert not [p for p in tmp_path.iterdir() if p.name.endswith(".tmp")]


def test_atomic_write_sets_a_readable_mode(tmp_path):
    from calcsheet.atomic import write_atomic

    p = tmp_path / "a.txt"
    write_atomic(p, b"one")
    write_atomic(p, b"two")
    assert p.read_bytes() == b"two" and (os.stat(p).st_mode & 0o777) == 0o644
