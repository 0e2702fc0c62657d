"""The package's PDF and HTML against plain documents with the same content, measured in the same run.

1. PDF seconds per page: the package PDF of a generated sheet (formulas with fractions, radicals and
   subscripts, checks, a plugin's parts table and a beam's figures) against a plain WeasyPrint document
   made from the same page: the same title block and stamp on every page, the same text, the same tables
   and the same SVG figures, but each formula one run of text and a minimal stylesheet. Goal ≤ 1.5×. Then
   the same with the plain document also laid out with the package's few garbage collections: the cost of
   the markup alone (same goal).
2. PDF peak memory of a 1,000-line sheet, measured in a child process (``ru_maxrss``). Goal ≤ 300 MB.
3. HTML of a 1,000-line sheet: the package page against the same page printed by a math printer that
   builds its markup with ``html.escape`` and ``str.join`` only (no typed markup): the cost of the
   guarantee that sheet text is always escaped. Goal ≤ 1.25×.

Run from the repository root: ``.venv/bin/python benchmarks/bench_pdf.py`` (``--quick`` for fewer lines).
"""
from __future__ import annotations

import gc
import html
import io
import re
import subprocess
import sys
from html.parser import HTMLParser
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))

import calcsheet  # noqa: E402
from calcsheet.render.page import PackageDocument  # noqa: E402
from timing import paired, report  # noqa: E402

ROOT = Path(__file__).resolve().parent.parent


def make_sheet(n_lines: int, plugins: bool = True) -> str:
    """Groups of ten lines per member (inputs, a load, a moment, a modulus, a stress, a radical, a check);
    every 100 lines a built-up section (a parts table) and, once, a two-span beam (figures)."""
    lines = ["---", "project: PDF benchmark", "job: B-1", "subject: generated members", "by: bench",
             "rev: A", "---"]
    i = 0
    while len(lines) < n_lines:
        if i % 5 == 0:
            lines.append(f"# Members {i + 1} to {i + 5}")
        lines += [
            f"L_{i} = {3 + i % 7} m          -- span",
            f"b_{i} = {100 + 10 * (i % 5)} mm   -- width",
            f"h_{i} = {200 + 20 * (i % 4)} mm   -- depth",
            f"w_{i} [kN/m] = 1.2*{1 + i % 5} kPa*0.6 m + 1.5 kN/m   -- factored line load",
            f"M_{i} [kN*m] = w_{i}*L_{i}^2/8   -- midspan moment",
            f"Z_{i} [mm^3] = b_{i}*h_{i}^2/6   -- elastic section modulus",
            f"sigma_{i} [MPa] = M_{i}/Z_{i}   -- bending stress",
            f"r_{i} [mm] = sqrt(h_{i}^2/12)   -- radius of gyration",
            f"check sigma_{i} <= 250 MPa  -- bending",
        ]
        if plugins and i % 10 == 9:
            k = i // 10
            lines += [
                f"pa_{k} = section.rectangle(b=180 mm, h=12 mm, detail=\"brief\")",
                f"pb_{k} = section.rectangle(b=10 mm, h=300 mm, detail=\"brief\")",
                f"qa_{k} = section.part(shape=pa_{k}, x=0 mm, y=0 mm, anchor=\"bottom-centre\", name=\"flange\")",
                f"qb_{k} = section.part(shape=pb_{k}, x=0 mm, y=12 mm, anchor=\"bottom-centre\", name=\"web\")",
                f"bu_{k} = section.built_up(parts=[qa_{k}, qb_{k}])   -- built-up tee",
            ]
        if plugins and i == 3:
            lines.append("bm = beam.solve(spans=[5 m, 4 m], supports=\"pinned, pinned, roller\", E=200 GPa, "
                         "I=8e7 mm^4, loads=[beam.udl(w=4 kN/m, case=\"G\")], "
                         "combos=[beam.combo(name=\"C1\", factors=\"1.35 G\")])   -- two-span beam")
        i += 1
    return "\n".join(lines[:n_lines]) + "\n"


# ------------------------------------------------------------------ the plain documents

_PLAIN_CSS = """
@page { size: A4; margin: 34mm 14mm 20mm 16mm;
  @top-center { content: element(titleblock); width: 100%; vertical-align: bottom; }
  @bottom-center { content: element(stamp); width: 100%; vertical-align: top; } }
html { font-family: "DejaVu Sans", sans-serif; font-size: 9.5pt; }
header { position: running(titleblock); }
footer { position: running(stamp); font-size: 6.8pt; }
header table { width: 100%; border-collapse: collapse; font-size: 8pt; }
header td, header th { border: 0.6pt solid #333; }
table { border-collapse: collapse; width: 100%; font-size: 8pt; }
td, th { border-bottom: 0.5pt solid #bbb; }
p { margin: 1mm 0; }
svg { max-width: 100%; max-height: 75mm; }
"""

_BLOCKS = {"div", "p", "h1", "h2", "h3", "h4", "h5", "li", "figcaption", "caption", "section", "nav", "ol",
           "ul", "figure", "main", "body"}
_TABLE = {"table", "thead", "tbody", "tfoot", "tr", "th", "td"}


class _Plain(HTMLParser):
    """The package page with every formula one run of text: tables and SVG kept, inline markup dropped."""

    def __init__(self):
        super().__init__(convert_charrefs=False)
        self.out: list[str] = []
        self.text: list[str] = []
        self.svg = 0
        self.keep = 0  # inside the title block or the stamp: kept as it is

    def flush(self):
        t = "".join(self.text).strip()
        if t:
            self.out.append("<p>" + t + "</p>")
        self.text = []

    def handle_starttag(self, tag, attrs):
        raw = self.get_starttag_text()
        if tag in ("header", "footer") or self.keep:
            self.keep += tag in ("header", "footer")
            self.out.append(raw)
        elif tag == "svg" or self.svg:
            self.svg += tag == "svg"
            self.out.append(raw)
        elif tag in _TABLE:
            self.flush() if tag == "table" else None
            self.out.append(("<" + tag + ">") if tag not in ("td", "th") else "<" + tag + ">" + "".join(self.text))
            self.text = []
        elif tag in _BLOCKS:
            self.flush()

    def handle_endtag(self, tag):
        if self.keep:
            self.out.append("</" + tag + ">")
            self.keep -= tag in ("header", "footer")
        elif self.svg:
            self.out.append("</" + tag + ">")
            self.svg -= tag == "svg"
        elif tag in _TABLE:
            if tag in ("td", "th"):
                self.out.append("".join(self.text).strip())
                self.text = []
            self.out.append("</" + tag + ">")
        elif tag in _BLOCKS:
            self.flush()

    def handle_startendtag(self, tag, attrs):
        if self.keep or self.svg:
            self.out.append(self.get_starttag_text())

    def handle_data(self, data):
        if self.keep or self.svg:
            self.out.append(data)
        else:
            self.text.append(data)

    def handle_entityref(self, name):
        self.handle_data("&" + name + ";")

    def handle_charref(self, name):
        self.handle_data("&#" + name + ";")


def plain_document(page: str) -> str:
    body = page[page.index("<body>") + len("<body>"):page.rindex("</body>")]
    body = re.sub(r"<script\b.*?</script>", "", body, flags=re.S)
    parser = _Plain()
    parser.feed(body)
    parser.flush()
    return ('<!DOCTYPE html><html lang="en"><head><meta charset="utf-8"><style>' + _PLAIN_CSS
            + "</style></head><body>" + "".join(parser.out) + "</body></html>")


def _pages(pdf: bytes) -> int:
    import pypdf

    return len(pypdf.PdfReader(io.BytesIO(pdf)).pages)


# ------------------------------------------------------------------ 1. seconds per page

def bench_pdf_per_page(n_lines: int) -> bool:
    import weasyprint

    from calcsheet import collector
    from calcsheet.package import make_fetcher, pdf_bytes

    result = calcsheet.run(make_sheet(n_lines), path="bench.calc")
    assert result.ok, result.format_diagnostics()[:400]
    page = str(PackageDocument(result).html())
    plain = plain_document(page)
    ours_pages = _pages(pdf_bytes(page))
    plain_pages = _pages(weasyprint.HTML(string=plain, url_fetcher=make_fetcher()).write_pdf())
    # garbage is collected (untimed) before every run: neither side pays for what the other left, and each
    # document, garbage once written, is freed outside the timing on both sides alike
    ours, base = paired(lambda: pdf_bytes(page), lambda: weasyprint.HTML(string=plain, url_fetcher=make_fetcher())
                        .write_pdf(), repeat=3, warm=False, between=gc.collect)
    print(f"{n_lines}-line sheet: package {ours_pages} pages in {ours:.2f} s; plain document {plain_pages} pages "
          f"in {base:.2f} s ({page.count('<span'):,} spans in the package page)")
    ok = report("PDF seconds per page ÷ plain WeasyPrint document", (ours / ours_pages) / (base / plain_pages),
                1.5, note=f"{ours / ours_pages:.3f} s/page against {base / plain_pages:.3f}")

    # The package lays out with few garbage collections (collector.layout_pause); the figure above compares it
    # with WeasyPrint as a plain call runs it. This one gives the plain document the same collections, so what
    # is left is the cost of the package's markup and stylesheet alone.
    def plain_few():
        with collector.layout_pause():
            return weasyprint.HTML(string=plain, url_fetcher=make_fetcher()).write_pdf()

    ours, base = paired(lambda: pdf_bytes(page), plain_few, repeat=3, warm=False, between=gc.collect)
    report("PDF seconds per page ÷ plain WeasyPrint document, both with few collections",
           (ours / ours_pages) / (base / plain_pages), 1.5,
           note=f"{ours / ours_pages:.3f} s/page against {base / plain_pages:.3f}: the markup's own cost")
    return ok


# ------------------------------------------------------------------ 2. peak memory

_CHILD = """
import resource, sys
sys.path.insert(0, {bench!r})
import calcsheet
from bench_pdf import make_sheet
from calcsheet.package import pdf_bytes
from calcsheet.render.page import PackageDocument
r = calcsheet.run(make_sheet({n}), path="bench.calc")
before = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
pdf = pdf_bytes(PackageDocument(r).html())
print(before, resource.getrusage(resource.RUSAGE_SELF).ru_maxrss, len(pdf))
"""


def bench_pdf_memory(n_lines: int) -> bool:
    code = _CHILD.format(bench=str(Path(__file__).resolve().parent), n=n_lines)
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=ROOT, check=True)
    before, peak, size = map(int, out.stdout.split())
    print(f"{n_lines}-line sheet: peak RSS {peak / 1024:.0f} MB ({before / 1024:.0f} MB before the PDF), "
          f"PDF {size / 1e6:.1f} MB")
    return report(f"PDF peak memory, {n_lines:,}-line sheet", peak / 1024, 300, unit=" MB")


# ------------------------------------------------------------------ 3. HTML printer

def _plain_printer_class():
    """The same markup as ``HtmlMathPrinter``, built with ``html.escape`` and ``str.join`` only."""
    from calcsheet.display import superscript, unit_factors
    from calcsheet.render import html as H
    from calcsheet.render.base import split_name

    esc = html.escape
    cmp = {"<=": "≤", ">=": "≥", "<": "&lt;", ">": "&gt;"}

    def power(exponent):  # a whole number as superscript characters, anything else raised
        if re.fullmatch(r"[−-]?[0-9]+", exponent):
            return superscript(int(exponent.replace("−", "-")))
        return "<sup>" + exponent + "</sup>"

    def sym(name):
        head, subs = split_name(name)
        s = "<var>" + esc(head) + "</var>"
        return s + "<sub>" + esc(",".join(subs)) + "</sub>" if subs else s

    class PlainStrPrinter(H.HtmlMathPrinter):
        def m_text(self, text): return esc(str(text))
        def m_string(self, text): return "“" + esc(text) + "”"

        def m_name(self, name, link=None):
            return '<a href="#' + H.anchor_id(link) + '">' + sym(name) + "</a>" if link else sym(name)

        def m_field(self, obj, field, link=None):
            inner = '<span class="owner">' + obj + ".</span>" + sym(field)
            return '<a href="#' + H.anchor_id(link) + '">' + inner + "</a>" if link else inner

        def m_number(self, text, exp):
            text = esc(text).replace("-", "−")
            return text if exp is None else text + "×10" + power(str(exp))

        def m_unit(self, unit):
            num, den = unit_factors(unit)

            def part(items):
                return "·".join(esc(s) + (power(H._exp(e)) if e != 1 else "") for s, e in items)

            top = part(num) or ("1" if den else "")
            if not den:
                return top
            return ('<span class="nb">' + top + ("/(" + part(den) + ")" if len(den) > 1 else "/" + part(den))
                    + "</span>")

        def m_quantity(self, number, unit):
            return number if not unit else number + (unit if unit.startswith("°") else H.NNBSP + unit)

        def m_paren(self, inner): return "(" + inner + ")"
        def m_neg(self, inner): return "−" + inner

        def m_binary(self, left, op, right):
            return left + ("·" if op == "·" else H.NNBSP + esc(op) + H.THIN) + right

        def m_frac(self, num, den):
            return '<span class="frac"><span class="fn">' + num + '</span><span class="fd">' + den + "</span></span>"

        def m_pow(self, base, exponent): return base + power(exponent)
        def m_sqrt(self, inner): return '<span class="sqrt">√<span class="radicand">' + inner + "</span></span>"
        def m_abs(self, inner): return "|" + inner + "|"

        def m_call(self, func, args, plugin=False):
            head = '<span class="plugin">' + esc(func) + "</span>" if plugin else func
            return head + "(" + ", ".join(args) + ")"

        def m_keyword(self, name, value): return self.m_name(name) + H.NNBSP + "=" + H.NNBSP + value
        def m_list(self, items): return "[" + ", ".join(items) + "]"
        def m_tuple(self, items): return "(" + ", ".join(items) + ")"
        def m_compare(self, left, op, right): return left + H.NNBSP + cmp[op] + H.THIN + right

        def check_parts(self, check, link=None, exact=None):
            c = H.NNBSP + cmp[check.op] + H.THIN
            sym = self.expr(check.left, link=link) + c + self.expr(check.right, link=link)
            sub = (self.expr(check.shown_left or check.left, values=check.used, exact=exact) + c
                   + self.expr(check.shown_right or check.right, values=check.used, exact=exact))
            return sym, sub

        def m_cases(self, then, cond, otherwise):
            return ('<span class="cases"><span class="brace">{</span><span class="rows"><span class="row">' + then
                    + '<span class="when">if</span>' + cond + '</span><span class="row">' + otherwise
                    + '<span class="when">otherwise</span></span></span></span>')

    return PlainStrPrinter


def bench_html(n_lines: int) -> bool:
    from calcsheet.render.html import HtmlMathPrinter

    result = calcsheet.run(make_sheet(n_lines, plugins=False), path="bench.calc")
    plain_cls = _plain_printer_class()
    ours_printer = HtmlMathPrinter(sigfigs=result.policy.sigfigs)
    plain_printer = plain_cls(sigfigs=result.policy.sigfigs)
    steps = [i for i in result.items if hasattr(i, "expr")]
    checks = [i for i in result.items if hasattr(i, "op")]

    def formulas(printer):
        out = [printer.step_parts(s, lambda n: "v-" + n) for s in steps]
        out += [printer.check_parts(c, lambda n: "v-" + n) for c in checks]
        return out

    a = formulas(ours_printer)
    b = formulas(plain_printer)
    assert [[str(p) for p in x] for x in a] == [[str(p) for p in x] for x in b], "the two printers disagree"

    ours, base = paired(lambda: formulas(HtmlMathPrinter(sigfigs=3)), lambda: formulas(plain_cls(sigfigs=3)),
                        repeat=5)
    page = paired(lambda: PackageDocument(result).html(), lambda: None, repeat=3)[0]
    print(f"{n_lines}-line sheet: formulas {ours * 1000:.0f} ms typed markup, {base * 1000:.0f} ms plain str; "
          f"whole package page {page * 1000:.0f} ms")
    return report("HTML math printer, typed markup ÷ html.escape + str.join", ours / base, 1.25)


def main() -> int:
    quick = "--quick" in sys.argv
    ok = bench_html(300 if quick else 1000)
    ok &= bench_pdf_per_page(60 if quick else 150)
    ok &= bench_pdf_memory(200 if quick else 1000)
    return 0


if __name__ == "__main__":
    sys.exit(main())
