"""The calculation package: one HTML document, paged for print, and its PDF.

The HTML is self-contained (styles inlined, figures inline SVG), so the PDF
renderer never needs to fetch anything; its URL fetcher refuses all but
``data:`` URLs and our own bundled assets.
"""
from __future__ import annotations

import datetime as _dt
import os
from pathlib import Path

import pint

from . import __version__
from .atomic import write_atomic
from .display import split_number, unit_text
from .engine import Result
from .render.html import HtmlMathPrinter, anchor_id, esc
from .trace import CheckResult, Figure, Heading, Note, Prose, Step, Table, Working

ASSETS = Path(__file__).parent / "assets"

CAUTION = (
    "This calculation package was prepared with calcsheet. It is an aid to, not a substitute for, the "
    "judgement of a licensed engineer: every input, assumption and result must be checked by a qualified "
    "person against the governing local codes and standards before it is relied on."
)

TITLE_FIELDS = [("project", "Project"), ("job", "Job"), ("subject", "Subject"), ("by", "By"),
                ("checked", "Checked"), ("date", "Date"), ("rev", "Rev")]


def number_items(result: Result) -> None:
    """Give headings section numbers (1, 1.1) and steps/checks step numbers (1.3)."""
    counters = [0, 0, 0, 0]
    step_no = 0
    current = "0"
    for item in result.items:
        if isinstance(item, Heading):
            level = min(max(item.level, 1), 4)
            counters[level - 1] += 1
            for i in range(level, 4):
                counters[i] = 0
            item.number = ".".join(str(c) for c in counters[:level])
            item.anchor = "s-" + item.number
            current = item.number
            step_no = 0
        elif isinstance(item, (Step, CheckResult)):
            step_no += 1
            item.number = f"{current}.{step_no}" if current != "0" else str(step_no)


class PackageDocument:
    """Builds the package HTML from a Result; one instance per build."""

    def __init__(self, result: Result, *, paper: str | None = None, extra_front: str = "",
                 changed: set[str] | None = None, watch_script: str = ""):
        self.result = result
        self.meta = result.meta
        self.printer = HtmlMathPrinter(sigfigs=result.policy.sigfigs)
        self.paper = (paper or str(self.meta.get("paper", "A4"))).strip()
        self.extra_front = extra_front  # e.g. a "changes since" page (already-escaped HTML)
        self.changed = changed or set()
        self.watch_script = watch_script
        number_items(result)
        self.anchors = {name: step.anchor for name, step in result.steps.items()}

    def link(self, name: str):
        return self.anchors.get(name)

    # ------------------------------------------------------------ document
    def html(self) -> str:
        css = (ASSETS / "package.css").read_text(encoding="utf-8")
        size = "letter" if self.paper.lower() in ("letter", "us-letter") else "A4"
        title = esc(self.meta.get("subject") or self.meta.get("project") or Path(self.result.path).stem)
        return "\n".join([
            "<!DOCTYPE html>",
            '<html lang="en"><head><meta charset="utf-8">',
            f"<title>{title}</title>",
            '<meta name="generator" content="calcsheet">',
            f"<style>@page {{ size: {size}; }}\n{css}</style>",
            "</head><body>",
            self.title_block(),
            self.footer(),
            '<main>',
            self.front(),
            self.extra_front,
            self.body(),
            self.inputs_list(),
            self.diagnostics(),
            "</main>",
            self.watch_script,
            "</body></html>",
        ])

    def title_block(self) -> str:
        m = self.meta
        date = m.get("date") or _dt.date.today().isoformat()
        cells = {k: esc(m.get(k, "")) for k, _ in TITLE_FIELDS}
        cells["date"] = esc(date)
        return f"""<header class="titleblock"><table>
<tr><th>Project</th><td colspan="3" class="project">{cells['project']}</td><th>Job</th><td>{cells['job']}</td>
<th>Sheet</th><td class="pageno"><span class="pn-screen">—</span></td></tr>
<tr><th>Subject</th><td colspan="3">{cells['subject']}</td><th>By</th><td>{cells['by']}</td>
<th>Date</th><td>{cells['date']}</td></tr>
<tr><th>Checked</th><td colspan="3">{cells['checked']}</td><th>Rev</th><td>{cells['rev']}</td>
<th>Units</th><td>{esc(self.result.policy.system)}</td></tr>
</table></header>"""

    def footer(self) -> str:
        r = self.result
        plugins = ", ".join(f"{esc(n)} {esc(v)}" for n, v in sorted(r.plugin_versions.items())) or "none"
        import hashlib

        included = "".join(
            f'<div>Includes {esc(p)} · sha256 <span class="hash">'
            f'{esc(hashlib.sha256(t.encode("utf-8")).hexdigest())}</span></div>' for p, t in r.includes)
        return (f'<footer class="stamp"><div>Source {esc(Path(r.path).name)} · sha256 '
                f'<span class="hash">{esc(r.sha256)}</span></div>{included}'
                f'<div>calcsheet {esc(__version__)} · plugins: {plugins}</div>'
                f'<div class="caution-short">An aid to, not a substitute for, a licensed engineer\'s judgement; '
                f'check against the governing local codes.</div></footer>')

    def front(self) -> str:
        r = self.result
        checks = r.checks
        n_ng = sum(1 for c in checks if not c.ok)
        errors = r.errors
        if errors:
            status, cls = f"{len(errors)} ERROR(S) — PACKAGE INCOMPLETE", "ng"
        elif not checks:
            status, cls = "NO CHECKS", "none"
        elif n_ng:
            status, cls = f"NG — {n_ng} of {len(checks)} checks not satisfied", "ng"
        else:
            status, cls = f"OK — all {len(checks)} checks satisfied", "ok"
        rows = []
        for c in checks:
            ratio = f"{c.ratio:.2f}" if c.ratio is not None else "—"
            sym, _ = self.printer.check_parts(c, self.link)
            rows.append(
                f'<tr class="{"ok" if c.ok else "ng"}"><td><a href="#{c.anchor}">{esc(c.number)}</a></td>'
                f"<td>{esc(c.description or '')}</td><td class='math'>{sym}</td>"
                f"<td class='numcol'>{self.printer.value(c.demand)}</td>"
                f"<td class='numcol'>{self.printer.value(c.capacity, _unit(c.demand))}</td>"
                f"<td class='numcol'>{ratio}</td><td class='status'>{'OK' if c.ok else 'NG'}</td></tr>")
        table = ("<table class='summary'><thead><tr><th>Step</th><th>Check</th><th>Condition</th><th>Demand</th>"
                 "<th>Capacity</th><th>Ratio</th><th></th></tr></thead><tbody>" + "".join(rows) +
                 "</tbody></table>") if rows else "<p>This sheet states no checks.</p>"
        title = esc(self.meta.get("subject") or Path(r.path).stem)
        revs = self.revisions()
        return f"""<section class="front">
<h1 class="doc-title">{title}</h1>
<p class="doc-project">{esc(self.meta.get('project', ''))}</p>
<div class="overall {cls}">{esc(status)}</div>
<h2 class="front-h">Summary of checks</h2>
{table}
{revs}
<div class="caution"><strong>Caution.</strong> {esc(CAUTION)}</div>
</section>"""

    def revisions(self) -> str:
        revs = self.meta.get("revisions")
        if not isinstance(revs, list) or not revs:
            return ""
        rows = []
        for entry in revs:
            cells = [c.strip() for c in str(entry).split("|", 3)]  # a "|" in the description stays
            cells += [""] * (4 - len(cells))
            rows.append("<tr>" + "".join(f"<td>{esc(c)}</td>" for c in cells[:4]) + "</tr>")
        return ("<h2 class='front-h'>Revisions</h2><table class='revisions'><thead><tr><th>Rev</th><th>Date</th>"
                "<th>By</th><th>Description</th></tr></thead><tbody>" + "".join(rows) + "</tbody></table>")

    def body(self) -> str:
        out = ['<section class="calc">']
        for item in self.result.items:
            out.append(self.item(item))
        out.append("</section>")
        return "\n".join(out)

    def item(self, item, inner: bool = False) -> str:
        if isinstance(item, Heading):
            level = min(item.level + 1, 5)
            return (f'<h{level} id="{item.anchor}" class="sec"><span class="secno">{esc(item.number)}</span> '
                    f"{esc(item.text)}</h{level}>")
        if isinstance(item, Prose):
            paras = [p for p in item.text.split("\n\n") if p.strip()]
            return "".join(f'<p class="prose">{esc(p)}</p>' for p in paras)
        if isinstance(item, Step):
            return self.step(item, inner)
        if isinstance(item, CheckResult):
            return self.check(item, inner)
        if isinstance(item, Table):
            return self.table(item)
        if isinstance(item, Figure):
            return f'<figure class="fig">{item.svg}<figcaption>{esc(item.caption)}</figcaption></figure>'
        if isinstance(item, Note):
            return f'<p class="note {esc(item.kind)}">{esc(item.text)}</p>'
        if isinstance(item, Working):
            return self.working(item)
        return ""

    def step(self, step: Step, inner: bool) -> str:
        link = None if inner else self.link
        parts = self.printer.step_parts(step, link)
        chain = '<span class="eq">=</span>'.join(f'<span class="term">{p}</span>' for p in parts)
        marks = []
        if step.overridden is not None:
            marks.append(f'<span class="mark override">set for this build; sheet value '
                         f'{self.printer.value(step.overridden, step.display_unit)}</span>')
        if step.name in self.changed and not inner:
            marks.append('<span class="mark changed">changed</span>')
        note = f'<div class="method">{esc(step.note)}</div>' if step.note else ""
        ident = f' id="{anchor_id(step.anchor)}"' if step.anchor and not inner else ""
        number = f'<span class="stepno">{esc(step.number)}</span>' if step.number else ""
        desc = f'<div class="desc">{esc(step.description)}</div>' if step.description else ""
        html_ = (f'<div class="step{" input" if step.is_input else ""}"{ident}>{number}'
                 f'<div class="stepbody">{desc}<div class="math">{chain}</div>{note}{"".join(marks)}</div></div>')
        if step.working is not None:
            html_ += self.working(step.working, step.name)
        return html_

    def check(self, c: CheckResult, inner: bool) -> str:
        sym, sub = self.printer.check_parts(c, None if inner else self.link)
        ratio = f"ratio {c.ratio:.2f}" if c.ratio is not None else "ratio cannot be formed"
        status = "OK" if c.ok else "NG"
        ident = f' id="{c.anchor}"' if c.anchor and not inner else ""
        number = f'<span class="stepno">{esc(c.number)}</span>' if c.number else ""
        desc = f'<div class="desc">{esc(c.description)}</div>' if c.description else ""
        return (f'<div class="step check {"ok" if c.ok else "ng"}"{ident}>{number}<div class="stepbody">{desc}'
                f'<div class="math"><span class="kwd">check</span> {sym}<span class="eq">:</span>{sub}'
                f'<span class="verdict">{status}</span><span class="ratio">{esc(ratio)}</span></div></div></div>')

    def working(self, w: Working, owner: str = "") -> str:
        items = "\n".join(self.item(i, inner=True) for i in w.items)
        return (f'<div class="working"><div class="working-title">Working of {esc(w.title)}'
                f'{" for " + esc(owner) if owner else ""}</div>{items}</div>')

    def table(self, t: Table) -> str:
        def cell(v, unit=None):
            if isinstance(v, pint.Quantity):
                if unit is not None:  # the unit is in the column head: the cell shows the number
                    try:
                        mag = float(v.to(unit).magnitude)
                    except (pint.DimensionalityError, TypeError):
                        return self.printer.value(v, unit)
                    return self.printer.m_number(*split_number(mag, self.printer.settings["sigfigs"]))
                return self.printer.value(v, unit)
            if isinstance(v, float):
                return esc(f"{v:.4g}")
            return esc(v)

        units = t.units or [None] * len(t.columns)
        head = "".join(
            f"<th>{_header(c)}{'<br><span class=unit-h>' + esc(unit_text(u)) + '</span>' if u is not None else ''}"
            f"</th>" for c, u in zip(t.columns, units + [None] * (len(t.columns) - len(units))))
        rows = "".join("<tr>" + "".join(f"<td>{cell(v, u)}</td>" for v, u in zip(r, units + [None] * len(r)))
                       + "</tr>" for r in t.rows)
        foot = "".join("<tr>" + "".join(f"<td>{cell(v, u)}</td>" for v, u in zip(r, units + [None] * len(r)))
                       + "</tr>" for r in (t.footer or []))
        note = f"<p class='note'>{esc(t.note)}</p>" if t.note else ""
        return (f"<table class='parts'><caption>{esc(t.title)}</caption><thead><tr>{head}</tr></thead>"
                f"<tbody>{rows}</tbody>{'<tfoot>' + foot + '</tfoot>' if foot else ''}</table>{note}")

    def inputs_list(self) -> str:
        r = self.result
        rows = []
        for name in r.inputs:
            step = r.steps.get(name)
            if step is None:
                continue
            mark = ""
            if step.overridden is not None:
                mark = (f"<span class='mark override'>set for this build (sheet: "
                        f"{self.printer.value(step.overridden, step.display_unit)})</span>")
            rows.append(f"<tr><td><a href='#{anchor_id(step.anchor)}'>{self.printer.m_name(name)}</a></td>"
                        f"<td>{esc(step.description or '')}</td>"
                        f"<td class='numcol'>{self.printer.value(step.value, step.display_unit)}</td>"
                        f"<td>{mark}</td></tr>")
        suppressed = [d for d in r.diagnostics if d.suppressed]
        sup = ""
        if suppressed:
            sup = ("<h3>Suppressed warnings</h3><ul class='suppressed'>" + "".join(
                f"<li>line {d.span.line}: {esc(d.code)}: {esc(d.message)} — reason: {esc(d.suppressed)}</li>"
                for d in suppressed) + "</ul>")
        if not rows and not sup:
            return ""
        return ("<section class='inputs'><h2 class='sec'>Inputs</h2><table class='inputs'><thead><tr>"
                "<th>Symbol</th><th>Description</th><th>Value</th><th></th></tr></thead><tbody>" + "".join(rows) +
                "</tbody></table>" + sup + "</section>")

    def diagnostics(self) -> str:
        diags = [d for d in self.result.diagnostics if not d.suppressed]
        if not diags:
            return ""
        items = "".join(f"<li class='{esc(d.severity)}'><code>line {d.span.line}, col {d.span.col}</code> "
                        f"{esc(d.severity)} {esc(d.code)}: {esc(d.message)}"
                        f"{' — ' + esc(d.hint) if d.hint else ''}</li>" for d in diags)
        return f"<section class='diagnostics'><h2 class='sec'>Diagnostics</h2><ul>{items}</ul></section>"


def _unit(q):
    return q.units if isinstance(q, pint.Quantity) else None


def _header(text: str) -> str:
    """Table headers may name symbols (A_i, y_i): typeset the subscript."""
    from .render.base import split_name

    if " " in text or not text:
        return esc(text)
    if "·" in text:  # a product of symbols: n·A_i·y_i
        return "·".join(_header(piece) for piece in text.split("·"))
    power = ""
    if text[-1] in "²³⁴":  # a squared symbol: d_y,i²
        text, power = text[:-1], f"<sup>{'234'['²³⁴'.index(text[-1])]}</sup>"
    head, subs = split_name(text)
    return f"<var>{esc(head)}</var>" + (f"<sub>{esc(','.join(subs))}</sub>" if subs else "") + power


# ------------------------------------------------------------ PDF


def make_fetcher():
    """A URL fetcher that reads nothing from the sheet's world: only data: URLs and our assets."""
    import weasyprint

    assets = ASSETS.resolve()

    class PackageFetcher(weasyprint.URLFetcher):
        def __init__(self):
            super().__init__(allowed_protocols={"data", "file"}, allow_redirects=False, timeout=2)

        def fetch(self, url, headers=None):
            if url.startswith("data:"):
                return super().fetch(url, headers)
            if url.startswith("file://"):
                from urllib.parse import unquote, urlparse

                target = Path(unquote(urlparse(url).path)).resolve()
                if target.is_file() and assets in target.parents:
                    return super().fetch(url, headers)
            raise ValueError(f"calcsheet packages load no external resources: refused {url[:80]!r}")

    return PackageFetcher()


def pdf_bytes(html: str) -> bytes:
    import weasyprint  # imported here: ~0.5 s, needed only when a PDF is written

    doc = weasyprint.HTML(string=html, base_url=str(ASSETS) + os.sep, url_fetcher=make_fetcher())
    return doc.write_pdf()


def write_package(result: Result, out_dir: Path, formats: list[str], stem: str | None = None,
                  **doc_options) -> list[Path]:
    """Render every format first, then write each atomically; nothing half-written is left."""
    stem = stem or Path(result.path).stem or "sheet"
    out_dir.mkdir(parents=True, exist_ok=True)
    rendered: dict[str, bytes] = {}
    html = None
    if "html" in formats or "pdf" in formats:
        html = PackageDocument(result, **doc_options).html()
    if "html" in formats:
        rendered["html"] = html.encode("utf-8")
    if "pdf" in formats:
        rendered["pdf"] = pdf_bytes(html)
    if "json" in formats:
        import json

        rendered["json"] = (json.dumps(result.to_json(), indent=2, ensure_ascii=False) + "\n").encode("utf-8")
    written = []
    for fmt in ("html", "pdf", "json"):
        if fmt in rendered:
            path = out_dir / f"{stem}.{fmt}"
            write_atomic(path, rendered[fmt])
            written.append(path)
    return written
