"""The package document: one self-contained HTML page, paged for print (the PDF is made from it).

Styles are inlined and figures are inline SVG, so the PDF renderer never
needs to fetch anything. Every piece is ``Html`` (see ``markup``): sheet text
is escaped wherever it enters, and the trace records print through the
document printer's dispatch (``_print_Heading``, ``_print_Step`` ...).
"""
from __future__ import annotations

import datetime as _dt
import hashlib
import re
from pathlib import Path

import pint

from .. import __version__, collector
from ..display import split_number, unit_text
from ..trace import CheckResult, Figure, Heading, Note, Prose, Step, Table, Working
from .base import split_name
from .document import DocumentPrinter, exact_inputs, number_items
from .. import nodes as N
from .html import EQ, HtmlMathPrinter
from .math import is_literal
from .markup import Html, anchor_id, esc, piece, wrap

ASSETS = Path(__file__).resolve().parent.parent / "assets"

CAUTION = (
    "This calculation package was prepared with calcsheet. It is an aid to, not a substitute for, the "
    "judgement of a licensed engineer: every input, assumption and result must be checked by a qualified "
    "person against the governing local codes and standards before it is relied on."
)

TITLE_FIELDS = [("project", "Project"), ("job", "Job"), ("subject", "Subject"), ("by", "By"),
                ("checked", "Checked"), ("date", "Date"), ("rev", "Rev")]

_TITLE_BLOCK = Html("""<header class="titleblock"><table>
<tr><th>Project</th><td colspan="3" class="project">{project}</td><th>Job</th><td>{job}</td>
<th>Sheet</th><td class="pageno"><span class="pn-screen">—</span></td></tr>
<tr><th>Subject</th><td colspan="3">{subject}</td><th>By</th><td>{by}</td>
<th>Date</th><td>{date}</td></tr>
<tr><th>Checked</th><td colspan="3">{checked}</td><th>Rev</th><td>{rev}</td>
<th>Units</th><td>{units}</td></tr>
</table></header>""")

_FRONT = Html("""<section class="front">
<h1 class="doc-title">{title}</h1>
<p class="doc-project">{project}</p>
<div class="overall {cls}">{status}</div>
{signoff}
<h2 class="front-h">Summary of checks</h2>
{table}
{revs}
{basis}
<div class="caution"><strong>Caution.</strong> {caution}</div>
</section>""")

# front-matter keys of the sign-off lines: (role, name key, date key)
SIGNOFF = [("Prepared", "by", "date"), ("Checked", "checked", "checked_date"),
           ("Approved", "approved", "approved_date")]


def latest_revision(meta: dict) -> tuple[str, str] | None:
    """(rev, date) of the last entry of ``revisions:``, or None when there is none."""
    revs = meta.get("revisions")
    if not isinstance(revs, list) or not revs:
        return None
    cells = [c.strip() for c in str(revs[-1]).split("|", 3)] + ["", ""]
    return cells[0], cells[1]


def functions_called(result) -> dict[str, list[str]]:
    """Namespace -> the plugin functions a run called (in order of first call), read from the records in
    its trace (values of steps, lists of records, and calls inside a plugin's own working)."""
    from ..plugin import Record

    out: dict[str, list[str]] = {}

    def note(value, depth=0):
        if isinstance(value, Record) and value.source and "." in value.source:
            ns, fn = value.source.split(".", 1)
            if fn not in out.setdefault(ns, []):
                out[ns].append(fn)
        elif isinstance(value, (list, tuple)) and depth < 3:
            for v in value:
                note(v, depth + 1)

    def walk(items):
        for item in items:
            note(getattr(item, "value", None))
            working = getattr(item, "working", None)
            if working is not None:
                walk(working.items)

    walk(result.items)
    return out


def standards_used(result, registry=None) -> list[tuple[str, str]]:
    """(standard with edition, who relies on it): the sheet's own ``standards:`` and, for every plugin function
    the sheet called, that function's ``standards`` (else its namespace's)."""
    out: list[tuple[str, str]] = []
    own = result.meta.get("standards")
    for entry in (own if isinstance(own, list) else [own] if own else []):
        out.append((str(entry).strip(), "this sheet"))
    if result.plugin_versions:
        from ..plugin import default_registry

        registry = registry or default_registry()
        called = functions_called(result)
        for name in sorted(result.plugin_versions):
            ns = registry.namespace(name)
            table = getattr(ns, "functions", None)
            who = f"plugin {name} {result.plugin_versions[name]}"
            if not table or not called.get(name):
                for std in getattr(ns, "standards", ()) or ():
                    out.append((str(std), who))
                continue
            per: dict[str, list[str]] = {}
            for fn in called[name]:
                pf = table.get(fn)
                stds = pf.standards if pf is not None and pf.standards is not None else ns.standards
                for std in stds or ():
                    per.setdefault(str(std), []).append(f"{name}.{fn}")
            for std, fns in per.items():
                out.append((std, f"{who}: {', '.join(fns)}"))
    return out


class PackageDocument(DocumentPrinter):
    """The package HTML of a Result; one instance per build. The Result is not changed."""

    default_settings: dict = {}
    empty = Html()

    def __init__(self, result, *, paper: str | None = None, extra_front: Html | None = None,
                 changed: set[str] | None = None, watch_script: Html | None = None):
        super().__init__()
        self.result = result
        self.meta = result.meta
        self.printer = HtmlMathPrinter(sigfigs=result.policy.sigfigs)
        self.paper = (paper or str(self.meta.get("paper", "A4"))).strip()
        self.extra_front = Html() if extra_front is None else extra_front  # the "changes since" page; a str is escaped
        self.changed = changed or set()
        self.watch_script = Html() if watch_script is None else watch_script
        self.numbered = self.number(result.items)
        self.exact = exact_inputs(result.items)
        self.appendix: list = []  # (owner, working title, records) of cross-checks, filled by body()
        # a plugin warning allowed with a reason is listed once, with the suppressed findings, not inline
        self.allowed = ({d.message for d in result.diagnostics if d.suppressed and d.code == "plugin-warning"}
                        - {d.message for d in result.diagnostics if not d.suppressed})
        self.checks = [i for i in self.numbered if isinstance(i, CheckResult)]
        self.anchors = {name: step.anchor for name, step in result.steps.items()}

    def number(self, items: list) -> list:
        """The records numbered for this package (``number_items``)."""
        return number_items(items)

    def link(self, name: str):
        return self.anchors.get(name)

    def join(self, pieces):
        return Html("").join(pieces)

    # ------------------------------------------------------------ document
    @collector.run_pause()  # printing makes many objects and no cycles: as a run, no collection meanwhile
    def html(self) -> Html:
        css = (ASSETS / "package.css").read_text(encoding="utf-8")
        size = "letter" if self.paper.lower() in ("letter", "us-letter") else "A4"
        title = self.meta.get("subject") or self.meta.get("project") or Path(self.result.path).stem
        return Html("\n").join([
            Html("<!DOCTYPE html>"),
            Html('<html lang="en"><head><meta charset="utf-8">'),
            Html("<title>{}</title>").format(title),
            Html('<meta name="generator" content="calcsheet">'),
            Html("<style>@page {{ size: {}; }}\n{}</style>").format(size, Html(css)),  # our own bundled CSS
            Html("</head><body>"),
            self.title_block(),
            self.footer(),
            Html("<main>"),
            *self._main(),
            Html("</main>"),
            self.watch_script,
            Html("</body></html>"),
        ])

    def _main(self) -> list[Html]:
        inputs, diags = self.inputs_list(), self.diagnostics()
        self._sections = {name for name, part in (("inputs", inputs), ("diagnostics", diags)) if part}
        self.appendix = []
        body = self.body()  # fills self.appendix
        appendix = self.appendix_section()
        if appendix:
            self._sections.add("appendix")
        return [self.front(), self.contents(), self.extra_front, inputs, body, diags, appendix]

    def appendix_section(self) -> Html:
        """Appendix A: each working's check by a second method, referenced from its step."""
        if not self.appendix:
            return Html()
        parts = []
        for n, (owner, title, cross) in enumerate(self.appendix, 1):
            parts.append(Html('<h3 class="sec" id="cross-{}"><span class="secno">A.{}</span> {}{}</h3>{}').format(
                n, n, title, " for " + owner if owner else "",
                Html("\n").join(self.record(i, inner=True) for i in cross if not isinstance(i, Note))))
        return Html("<section class='appendix'><h2 class='sec' id='appendix'>Appendix A — checks by a second "
                    "method</h2>{}</section>").format(Html("").join(parts))

    def title_block(self) -> Html:
        m = self.meta
        cells = {k: m.get(k, "") for k, _ in TITLE_FIELDS}
        cells["date"] = m.get("date") or _dt.date.today().isoformat()
        latest = latest_revision(m)
        if latest is not None:  # the title block states the issue the latest revision entry records
            cells["rev"] = latest[0] or cells["rev"]
            cells["date"] = latest[1] or cells["date"]
        return _TITLE_BLOCK.format(units=self.result.policy.system, **cells)

    def footer(self) -> Html:
        r = self.result
        plugins = Html(", ").join(Html("{} {}").format(n, v) for n, v in sorted(r.plugin_versions.items())) or "none"
        included = Html("").join(
            Html('<div>Includes {} · sha256 <span class="hash">{}</span></div>').format(
                p, hashlib.sha256(t.encode("utf-8")).hexdigest()) for p, t in r.includes)
        return Html('<footer class="stamp"><div>Source {} · sha256 <span class="hash">{}</span></div>{}'
                    '<div>calcsheet {} · plugins: {}</div>'
                    '<div class="caution-short">An aid to, not a substitute for, a licensed engineer\'s judgement; '
                    'check against the governing local codes.</div></footer>').format(
            Path(r.path).name, r.sha256, included, __version__, plugins)

    def front(self) -> Html:
        r = self.result
        checks = self.checks
        n_ng = sum(1 for c in checks if not c.ok)
        if r.errors:
            status, cls = f"{len(r.errors)} ERROR(S) — PACKAGE INCOMPLETE", "ng"
        elif not checks:
            status, cls = "NO CHECKS", "none"
        elif n_ng:
            status, cls = f"NG — {n_ng} of {len(checks)} checks not satisfied", "ng"
        else:
            status, cls = f"OK — all {len(checks)} checks satisfied", "ok"
        rows = self.summary_rows(checks)
        table = (Html("<table class='summary'><thead><tr><th>Step</th><th>Check</th><th>Condition</th>"
                      "<th>Demand</th><th>Capacity</th><th>Ratio</th><th></th></tr></thead><tbody>{}"
                      "</tbody></table>").format(Html("").join(rows))
                 if rows else Html("<p>This sheet states no checks.</p>"))
        return _FRONT.format(title=self.meta.get("subject") or Path(r.path).stem, project=self.meta.get("project", ""),
                             cls=cls, status=status, table=table, revs=self.revisions(), caution=CAUTION,
                             signoff=self.signoff(), basis=self.design_basis())

    def summary_rows(self, checks: list) -> list[Html]:
        """The summary's rows, one a check (a list, so the live preview can reuse the rows a save left alone)."""
        return [self.summary_row(c) for c in checks]

    def summary_row(self, c: CheckResult) -> Html:
        """One check's row of the summary table."""
        sym = self.printer.check_symbol(c, self.link)
        return Html(
            '<tr class="{}"><td><a href="#{}">{}</a></td><td>{}</td><td class=\'math\'>{}</td>'
            "<td class='numcol'>{}</td><td class='numcol'>{}</td><td class='numcol'>{}</td>"
            "<td class='status'>{}</td></tr>").format(
            "ok" if c.ok else "ng", c.anchor, c.number, c.description or sym, sym,
            self.printer.value(c.demand), self.printer.value(c.capacity, _unit(c.demand)),
            f"{c.ratio:.2f}" if c.ratio is not None else "—", "OK" if c.ok else "NG")

    def signoff(self) -> Html:
        """Prepared / checked / approved, with names and dates from the front matter."""
        rows = Html("").join(
            Html("<tr><th>{}</th><td class='who'>{}</td><td class='when'>{}</td><td class='sign'></td></tr>").format(
                role, self.meta.get(who, ""), self.meta.get(when, "") if self.meta.get(who) else "")
            for role, who, when in SIGNOFF)
        return Html("<table class='signoff'><thead><tr><th></th><th>Name</th><th>Date</th><th>Signature</th></tr>"
                    "</thead><tbody>{}</tbody></table>").format(rows)

    def design_basis(self) -> Html:
        """Every standard and edition the sheet and its plugins rely on, collected from the plugins."""
        used = standards_used(self.result)
        items = (Html("").join(Html("<li>{} <span class='by'>({})</span></li>").format(std, by) for std, by in used)
                 if used else Html("<li>No published standard is named by this sheet or the plugins it calls.</li>"))
        return Html("<h2 class='front-h'>Design basis</h2><ul class='basis'>{}</ul>").format(items)

    def contents(self) -> Html:
        """Headings with their page numbers (the PDF fills them in with target-counter)."""
        def extra(anchor, title):
            if anchor not in self._sections:
                return []
            return [Html("<li class='toc-1'><a href='#{}'>{}</a></li>").format(anchor, title)]

        entries = extra("inputs", "Inputs") + [
            Html("<li class='toc-{}'><a href='#{}'><span class='toc-no'>{}</span> {}</a></li>").format(
                i.level, i.anchor, i.number, i.text) for i in self.numbered if isinstance(i, Heading) and i.anchor
        ] + extra("diagnostics", "Diagnostics") + extra("appendix", "Appendix A — checks by a second method")
        if not entries:
            return Html()
        return Html("<nav class='contents'><h2 class='front-h'>Contents</h2><ol>{}</ol></nav>").format(
            Html("").join(entries))

    def revisions(self) -> Html:
        revs = self.meta.get("revisions")
        if not isinstance(revs, list) or not revs:
            return Html()
        rows = []
        for entry in revs:
            cells = [c.strip() for c in str(entry).split("|", 3)]  # a "|" in the description stays
            cells += [""] * (4 - len(cells))
            rows.append(Html("<tr>{}</tr>").format(Html("").join(Html("<td>{}</td>").format(c) for c in cells[:4])))
        latest = latest_revision(self.meta) or ("", "")
        stale = [Html("{}: {} in the front matter, {} in the latest revision entry").format(key, self.meta[key], new)
                 for key, new in (("rev", latest[0]), ("date", latest[1]))
                 if self.meta.get(key) and new and str(self.meta[key]).strip() != new]
        note = (Html("<p class='note warning'>The title block follows the latest revision entry; {}.</p>").format(
            Html("; ").join(stale)) if stale else Html())
        return note + Html("<h2 class='front-h'>Revisions</h2><table class='revisions'><thead><tr><th>Rev</th><th>Date</th>"
                    "<th>By</th><th>Description</th></tr></thead><tbody>{}</tbody></table>").format(Html("").join(rows))

    def body(self) -> Html:
        return Html("\n").join([Html('<section class="calc">'), *self.blocks(self.numbered), Html("</section>")])

    def blocks(self, items: list) -> list[Html]:
        """The printed records of the calculation, in order (a list, as ``summary_rows``)."""
        return [self.record(i) for i in items]

    # ------------------------------------------------------------ trace records
    def _print_Heading(self, item: Heading, inner: bool = False) -> Html:
        level = min(item.level + 1, 5)
        return Html('<h{0} id="{1}" class="sec"><span class="secno">{2}</span> {3}</h{0}>').format(
            level, item.anchor, item.number, item.text)

    def _print_Prose(self, item: Prose, inner: bool = False) -> Html:
        paras = [p for p in item.text.split("\n\n") if p.strip()]
        return Html("").join(Html('<p class="prose">{}</p>').format(p) for p in paras)

    def _print_Figure(self, item: Figure, inner: bool = False) -> Html:
        # a plugin's SVG, drawn by calcsheet.svg, which escapes every text it is given
        return Html('<figure class="fig">{}<figcaption>{}</figcaption></figure>').format(Html(item.svg), item.caption)

    def _print_Note(self, item: Note, inner: bool = False) -> Html:
        if item.kind == "warning" and item.text in self.allowed:
            return Html()
        return Html('<p class="note {}">{}</p>').format(item.kind, item.text)

    def _print_Working(self, w: Working, inner: bool = False, owner: str = "") -> Html:
        main, cross = _split_cross_checks(w.items)
        if not any(isinstance(i, Table) for i in cross):  # a one-line agreement note stays where it is
            main, cross = list(w.items), []
        items = Html("\n").join(self.record(i, inner=True) for i in main)
        if cross:  # an independent cross-check is kept, in the appendix the reader may skip
            self.appendix.append((owner, w.title, cross))
            ref = "cross-" + str(len(self.appendix))
            note = Html("").join(i.text for i in cross if isinstance(i, Note))
            items += Html('<p class="note agreement">{} <a href="#{}">Appendix A.{}</a>.</p>').format(
                note or "Checked by a second method:", ref, len(self.appendix))
        return Html('<div class="working"><div class="working-title">Working of {}{}</div>{}</div>').format(
            w.title, " for " + owner if owner else "", items)

    def _print_Step(self, step: Step, inner: bool = False) -> Html:
        parts = self.printer.step_parts(step, None if inner else self.link, None if inner else self.exact)
        chain = wrap(EQ.join(map(piece, parts)))  # one run of text: a long chain wraps after an "="
        marks = []
        if step.overridden is not None:
            marks.append(Html('<span class="mark override">set for this build; sheet value {}</span>').format(
                self.printer.value(step.overridden, step.display_unit)))
        if step.name in self.changed and not inner:
            marks.append(Html('<span class="mark changed">changed</span>'))
        note = Html('<div class="method">{}</div>').format(step.note) if step.note else Html()
        number = _number(step.number, anchor_id(step.anchor) if step.anchor and not inner else None)
        desc = Html('<div class="desc">{}</div>').format(step.description) if step.description else Html()
        out = Html('<div class="step{}">{}{}<div class="math">{}</div>{}{}</div>').format(
            " input" if step.is_input else "", number, desc, chain, note, Html("").join(marks))
        if step.working is not None:
            out += self._print_Working(step.working, owner=step.name)
        return out + self._after(step)

    def _after(self, item) -> Html:
        """What a step or check carries to print right after it (a sheet's table, a lookup's working, every
        element of a check over a list)."""
        return Html("").join(self.record(i, inner=True) for i in getattr(item, "after", ()) or ())

    def _print_CheckResult(self, c: CheckResult, inner: bool = False) -> Html:
        sym, sub = self.printer.check_parts(c, None if inner else self.link, None if inner else self.exact)
        ratio = f"ratio {c.ratio:.2f}" if c.ratio is not None else "ratio cannot be formed"
        number = _number(c.number, c.anchor if c.anchor and not inner else None)
        desc = Html('<div class="desc">{}</div>').format(c.description) if c.description else Html()
        return Html('<div class="step check {}">{}{}'
                    '<div class="math"><span class="kwd">check</span> {}&#160;: {}'
                    ' <span class="verdict">{}</span> <span class="ratio">{}</span></div></div>').format(
            "ok" if c.ok else "ng", number, desc, sym, sub, "OK" if c.ok else "NG", ratio) + self._after(c)

    def _print_Table(self, t: Table, inner: bool = False) -> Html:
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

        units = list(t.units or [None] * len(t.columns))
        units += [None] * (len(t.columns) - len(units))
        heads = [Html("<th>{}{}</th>").format(_header(c), Html("<br><span class=unit-h>{}</span>").format(unit_text(u))
                                              if u is not None else "")
                 for c, u in zip(t.columns, units)]
        body = [[Html("<td>{}</td>").format(cell(v, u)) for v, u in zip(r, units + [None] * len(r))] for r in t.rows]
        foot = [[Html("<td>{}</td>").format(cell(v, u)) for v, u in zip(r, units + [None] * len(r))]
                for r in (t.footer or [])]
        note = Html("<p class='note'>{}</p>").format(t.note) if t.note else Html()
        groups = column_groups([heads, *body, *foot], TABLE_WIDTH_PT)
        k = repeat_width(t.columns)
        if len(groups) > 1 and k and not foot and t.rows:
            # name–value pairs side by side: fewer of them a row, in reading order, never split into groups
            empty = Html("<td></td>")
            cells = [r[i:i + k] for r, raw in zip(body, t.rows) for i in range(0, len(r), k)
                     if any(v is not None and not (isinstance(v, str) and not v) for v in raw[i:i + k])]
            for per in range(len(t.columns) // k - 1, 0, -1):
                if not cells:
                    break
                heads = heads[:k * per]
                body = [sum(cells[j:j + per], []) for j in range(0, len(cells), per)]
                body[-1] += [empty] * (k * per - len(body[-1]))
                groups = column_groups([heads, *body], TABLE_WIDTH_PT)
                if len(groups) == 1:
                    break
        # a short table is kept on one page; a long one may flow on to the next (its head repeats there)
        cls = "parts long" if len(body) + len(foot) > LONG_TABLE_ROWS else "parts"
        tables = []
        for n, cols in enumerate(groups):
            def rows(rs):
                return Html("").join(Html("<tr>{}</tr>").format(Html("").join(r[i] for i in cols if i < len(r)))
                                     for r in rs)
            title = t.title if n == 0 else Html("{} (continued, {} of {})").format(t.title, n + 1, len(groups))
            tables.append(Html("<table class='{}'><caption>{}</caption><thead><tr>{}</tr></thead><tbody>{}</tbody>"
                               "{}</table>").format(cls, title, Html("").join(heads[i] for i in cols), rows(body),
                                                    Html("<tfoot>{}</tfoot>").format(rows(foot)) if foot else ""))
        return Html("").join(tables) + note

    # ------------------------------------------------------------ back matter
    def inputs_list(self) -> Html:
        r = self.result
        rows = self.input_rows([name for name in r.inputs if name in r.steps])
        for step in r.steps.values():  # the literal values a sheet passes to a plugin are inputs too
            if isinstance(step.expr, N.PluginCall):
                for kw in step.expr.kwargs:
                    if is_literal(kw.value) and kw.name != "detail":  # detail: how much working is shown
                        rows.append(Html("<tr><td><a href='#{}'>{}</a></td><td>{}</td><td class='numcol'>{}</td>"
                                         "<td></td></tr>").format(
                            anchor_id(step.anchor), self.printer.m_field(self.printer.m_name(step.name), kw.name),
                            Html("{} of {}.{}").format(kw.name, step.expr.namespace, step.expr.func),
                            self.printer.expr(kw.value)))
        suppressed = [d for d in r.diagnostics if d.suppressed]
        sup = Html()
        if suppressed:
            sup = Html("<h3>Suppressed warnings</h3><ul class='suppressed'>{}</ul>").format(Html("").join(
                Html("<li>line {}: {}: {} — reason: {}</li>").format(d.span.line, d.code, d.message, d.suppressed)
                for d in suppressed))
        if not rows and not sup:
            return Html()
        return Html("<section class='inputs'><h2 class='sec' id='inputs'>Inputs</h2><table class='inputs'><thead><tr>"
                    "<th>Symbol</th><th>Description</th><th>Value</th><th></th></tr></thead><tbody>{}"
                    "</tbody></table>{}</section>").format(Html("").join(rows), sup)

    def input_rows(self, names: list[str]) -> list[Html]:
        """The inputs table's rows, one an input (a list, as ``summary_rows``)."""
        steps = self.result.steps
        return [self.input_row(name, steps[name]) for name in names]

    def input_row(self, name: str, step: Step) -> Html:
        """One input's row of the inputs table: its value as the sheet wrote it (or as set for this build)."""
        mark = Html()
        if step.overridden is not None:
            mark = Html("<span class='mark override'>set for this build (sheet: {})</span>").format(
                self.printer.value(step.overridden, step.display_unit))
        return Html("<tr><td><a href='#{}'>{}</a></td><td>{}</td><td class='numcol'>{}</td><td>{}</td></tr>"
                    ).format(anchor_id(step.anchor), self.printer.m_name(name), step.description or "",
                             self.printer.expr(self.exact[name]) if name in self.exact
                             else self.printer.value(step.value, step.display_unit), mark)

    def diagnostics(self) -> Html:
        diags = [d for d in self.result.diagnostics if not d.suppressed]
        if not diags:
            return Html()
        items = Html("").join(
            Html("<li class='{}'><code>line {}, col {}</code> {} {}: {}{}</li>").format(
                d.severity, d.span.line, d.span.col, d.severity, d.code, d.message,
                Html(" — {}").format(d.hint) if d.hint else "")
            for d in diags)
        return Html("<section class='diagnostics'><h2 class='sec' id='diagnostics'>Diagnostics</h2><ul>{}</ul></section>").format(items)


# Beyond this many rows a table may break across pages rather than start on a fresh one.
LONG_TABLE_ROWS = 12

# The width a plugin's table may take: the text block of the narrower paper (A4: 210 mm less 30 mm of margins)
# less the indent of a working (about 17 mm), in points.
TABLE_WIDTH_PT = (210 - 30 - 17) * 72 / 25.4
_CHAR_PT = 4.9  # the widest typical advance of a digit or letter at the tables' 7.8 pt (DejaVu Sans: 0.63 em)
_CELL_PT = 8.5  # a cell's padding (1.4 mm each side) and rule
_TAGS = re.compile(r"<[^>]+>|&#?\w+;")


def _min_width(cell: str) -> float:
    """The narrowest a cell can be, in points: its longest unbreakable run of characters (text wraps at its
    spaces; a number and its unit are joined by a no-break space)."""
    text = _TAGS.sub(lambda m: "" if m.group(0).startswith("<") else "x", str(cell).replace("<br>", " "))
    longest = max((len(w) for w in text.split()), default=0)
    return longest * _CHAR_PT + _CELL_PT


def column_groups(rows: list[list[str]], width: float) -> list[list[int]]:
    """Columns of a table split into groups that each fit ``width`` points, the first column (the row's
    label) repeated in every group; one group when the whole table fits."""
    n = max((len(r) for r in rows), default=0)
    widths = [max((_min_width(r[i]) for r in rows if i < len(r)), default=0.0) for i in range(n)]
    if sum(widths) <= width or n < 3:
        return [list(range(n))]
    groups, current, used = [], [0], widths[0]
    for i in range(1, n):
        if used + widths[i] > width and len(current) > 1:
            groups.append(current)
            current, used = [0], widths[0]
        current.append(i)
        used += widths[i]
    groups.append(current)
    return groups


def repeat_width(columns: list[str]) -> int:
    """k when a table's head is the same k columns repeated (name–value pairs side by side: k = 2), else 0."""
    n = len(columns)
    for k in range(2, n // 2 + 1):
        if n % k == 0 and list(columns) == list(columns[:k]) * (n // k):
            return k
    return 0


def _number(number: str, anchor: str | None) -> Html:
    """A step's number, first in its block, carrying the step's anchor (the target of the links to it).

    The anchor is on the number, not on the step's block: WeasyPrint computes one style for all the elements
    that match the same rules under the same parent style, and an ``id`` makes its element's style (and so the
    styles of everything inside it) its own. On the block, each step's formula would be styled afresh, element
    by element; on the number, only the number is."""
    if anchor is None:
        return Html('<span class="stepno">{}</span>').format(number) if number else Html()
    return Html('<span class="stepno" id="{}">{}</span>').format(anchor, number or "")


def _split_cross_checks(items: list) -> tuple[list, list]:
    """A working's records, and its check by a second method: a note of kind "agreement" with the
    table just before it."""
    main, cross = [], []
    for item in items:
        if isinstance(item, Note) and item.kind == "agreement":
            if main and isinstance(main[-1], Table):
                cross.append(main.pop())
            cross.append(item)
        else:
            main.append(item)
    return main, cross


def _unit(q):
    return q.units if isinstance(q, pint.Quantity) else None


def _header(text: str) -> Html:
    """Table headers may name symbols (A_i, y_i): typeset the subscript."""
    if " " in text or not text:
        return esc(text)
    if "·" in text:  # a product of symbols: n·A_i·y_i
        return Html("·").join(_header(piece) for piece in text.split("·"))
    power = ""
    if text[-1] in "²³⁴":  # a squared symbol: d_y,i² (the square stays a character, as in the formulas)
        text, power = text[:-1], text[-1]
    head, subs = split_name(text)
    return Html("<var>{}</var>").format(head) + (Html("<sub>{}</sub>").format(",".join(subs)) if subs else "") + power
