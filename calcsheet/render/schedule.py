"""The schedule package (one line per member) and the sweep package: HTML pieces and SVG charts.

Every piece of sheet or schedule text passes through ``esc``; the only script
is a fixed sorter that reorders table rows by their escaped ``data-v``
attributes and never writes markup. The PDF (no scripts) carries a pre-sorted
view instead: the members ranked by governing utilisation.
"""
from __future__ import annotations

import datetime as _dt
import math
import re
from pathlib import Path

from ..svg import Svg
from .markup import Html, esc

OK_COLOUR, NG_COLOUR, ERR_COLOUR, AXIS = "#2f7d4a", "#b42318", "#6b7280", "#333"
MARKERS = ["circle", "square", "diamond", "triangle", "cross"]
PALETTE = ["#1f4e9c", "#c2410c", "#6d28d9", "#0f766e", "#a16207", "#be185d", "#4d7c0f", "#0e7490"]
BAR_CHART_MAX = 60  # more members than this: a histogram of governing utilisations instead

EXTRA_CSS = """
table.members { border-collapse: collapse; width: 100%; font-size: 7.8pt; }
table.members th, table.members td { border-bottom: 0.5pt solid #bbb; padding: 0.8mm 1.2mm; text-align: left; }
table.members thead th { border-bottom: 1pt solid #333; background: #f3f4f6; font-size: 7.2pt; }
table.members td.v { white-space: nowrap; }
table.members td.u { text-align: right; white-space: nowrap; font-variant-numeric: tabular-nums; }
table.members td.u.ng { color: #fff; background: #a11d1d; font-weight: bold; }
table.members td.u.gov { font-weight: bold; text-decoration: underline; }
table.members tr { page-break-inside: avoid; }
table.members tr.err td { color: #555; font-style: italic; }
table.members td.st { font-weight: bold; text-align: center; }
table.members th.u, table.members td.gv { text-align: right; white-space: nowrap; }
table.check-legend { border-collapse: collapse; font-size: 7.4pt; margin: 1mm 0 2mm; }
table.check-legend caption { text-align: left; font-weight: bold; font-size: 7.8pt; }
table.check-legend th { text-align: left; padding: 0.3mm 2mm 0.3mm 0; white-space: nowrap; vertical-align: top; }
table.check-legend td { padding: 0.3mm 3mm 0.3mm 0; vertical-align: top; }
table.check-legend td.as-written { font-family: "DejaVu Sans Mono", monospace; color: #444; }
table.members tr.ok td.st { color: #14532d; }
table.members tr.ng td.st { color: #fff; background: #a11d1d; }
th.sortable { cursor: pointer; }
th[aria-sort="ascending"]::after { content: " \\25B2"; }
th[aria-sort="descending"]::after { content: " \\25BC"; }
figure.chart { margin: 3mm 0; page-break-inside: avoid; }
figure.chart svg { max-width: 100%; height: auto; }
.sched-errors li { font-family: "DejaVu Sans Mono", monospace; font-size: 7pt; white-space: pre-wrap; }
section.ranked { page-break-before: always; }
@media print { .screen-only { display: none; } }
"""

# Reorders rows by the cell's data-v attribute; reads attributes and moves nodes, never writes markup.
SORT_SCRIPT = """<script>
(function () {
  var t = document.getElementById("members"); if (!t) return;
  var body = t.tBodies[0], heads = t.tHead.rows[0].cells;
  Array.prototype.forEach.call(heads, function (th, col) {
    th.className += " sortable"; th.tabIndex = 0;
    var go = function () {
      var num = th.getAttribute("data-num") === "1";
      var dir = th.getAttribute("aria-sort") === "descending" ? 1 : -1;
      if (!num) dir = -dir;
      Array.prototype.forEach.call(heads, function (h) { h.removeAttribute("aria-sort"); });
      th.setAttribute("aria-sort", dir > 0 ? "ascending" : "descending");
      var rows = Array.prototype.slice.call(body.rows);
      rows.sort(function (a, b) {
        var x = a.cells[col].getAttribute("data-v") || "", y = b.cells[col].getAttribute("data-v") || "";
        if (num) { x = x === "" ? -Infinity : parseFloat(x); y = y === "" ? -Infinity : parseFloat(y); }
        var c = x < y ? -1 : x > y ? 1 : 0;
        return c ? c * dir : (+a.getAttribute("data-i")) - (+b.getAttribute("data-i"));
      });
      rows.forEach(function (r) { body.appendChild(r); });
    };
    th.addEventListener("click", go);
    th.addEventListener("keydown", function (e) { if (e.key === "Enter") go(); });
  });
})();
</script>"""


def ratio_text(r) -> str:
    return "—" if r is None else f"{r:.2f}"


def _num(r) -> str:
    """A sortable number for a data-v attribute (empty when there is none)."""
    return "" if r is None else repr(float(r))


_PAGE_START = Html("""<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8">
<title>{title}</title>
<meta name="generator" content="calcsheet">
<style>@page {{ size: {size}; }}
{css}
{extra}</style>
</head><body>
<header class="titleblock"><table>
<tr><th>Project</th><td colspan="3" class="project">{project}</td><th>Job</th><td>{job}</td>
<th>Sheet</th><td class="pageno"><span class="pn-screen">—</span></td></tr>
<tr><th>Subject</th><td colspan="3">{title}</td><th>By</th><td>{by}</td>
<th>Date</th><td>{date}</td></tr>
<tr><th>Checked</th><td colspan="3">{checked}</td><th>Rev</th><td>{rev}</td>
<th>Of</th><td>{subtitle}</td></tr>
</table></header>""")


def _breakable(name: str) -> Html:
    """A file name that may wrap after "_" or "-" (in a narrow title-block cell), never inside a word."""
    return Html("<wbr>").join(esc(part) for part in re.split(r"(?<=[_-])", str(name)))


def page_start(meta: dict, title: str, subtitle: str, paper: str | None, css: str) -> Html:
    """Document head and the title block, from the sheet's front matter."""
    size = "letter" if str(paper or meta.get("paper", "A4")).lower() in ("letter", "us-letter") else "A4"
    date = meta.get("date") or _dt.date.today().isoformat()
    return _PAGE_START.format(title=title, size=size, css=Html(css), extra=Html(EXTRA_CSS),  # our own CSS
                              subtitle=_breakable(subtitle), date=date,
                              **{k: meta.get(k, "") for k in ("project", "job", "by", "checked", "rev")})


def footer(sheet_name: str, sheet_sha: str, table_name: str, table_sha: str, version: str,
           plugins: dict[str, str]) -> Html:
    plug = Html(", ").join(Html("{} {}").format(n, v) for n, v in sorted(plugins.items())) or "none"
    table = (Html('<div>Schedule {} · sha256 <span class="hash">{}</span></div>').format(table_name, table_sha)
             if table_name else Html())
    return Html('<footer class="stamp"><div>Source {} · sha256 <span class="hash">{}</span></div>{}'
                '<div>calcsheet {} · plugins: {}</div>'
                '<div class="caution-short">An aid to, not a substitute for, a licensed engineer\'s judgement; '
                'check against the governing local codes.</div></footer>').format(
        sheet_name, sheet_sha, table, version, plug)


def overall(totals: dict) -> Html:
    n, ng, err = totals["members"], totals["ng"], totals["errors"]
    if err:
        cls, text = "ng", f"{err} of {n} members not built (errors)" + (f"; {ng} NG" if ng else "")
    elif ng:
        cls, text = "ng", f"NG — {ng} of {n} members have a check not satisfied"
    elif n:
        cls, text = "ok", f"OK — all checks of all {n} members satisfied"
    else:
        cls, text = "none", "The schedule has no members"
    return Html('<div class="overall {}">{}</div>').format(cls, text)


def check_code(check: dict, position: int) -> str:
    """The short name of a check in tables and legends: C and its number in the sheet (``check-3`` -> C3, the
    anchor of that check in each member's package), else its position among the schedule's checks."""
    key = str(check.get("key", ""))
    number = key[len("check-"):] if key.startswith("check-") else ""
    return f"C{number}" if number.isdigit() else f"C{position}"


def with_codes(checks: list[dict]) -> list[dict]:
    """The checks, each with its short ``code`` (unique: a clash falls back to the position)."""
    out, seen = [], set()
    for i, c in enumerate(checks, 1):
        code = check_code(c, i)
        if code in seen:
            code = f"C{i}"
            while code in seen:
                code += "'"
        seen.add(code)
        out.append({**c, "code": code})
    return out


def check_legend(checks: list[dict]) -> Html:
    """What each short check name stands for: the check's description and the check as the sheet writes it."""
    rows = Html("").join(
        Html('<tr><th scope="row">{}</th><td>{}</td><td class="as-written">{}</td></tr>').format(
            c["code"], c["label"], c["text"] if c["text"] != c["label"] else "") for c in checks)
    return Html('<table class="check-legend"><caption>Checks</caption><tbody>{}</tbody></table>').format(rows)


def table_head(checks: list[dict], columns: list[str]) -> Html:
    """The members table's head; each check is headed by its short name (``with_codes``), its full name in the
    legend above the table and in the heading's tooltip."""
    cols = Html("").join(Html("<th>{}</th>").format(c) for c in columns)
    utils = Html("").join(Html('<th class="u" data-num="1" title="{}">{}</th>').format(c["label"], c["code"])
                          for c in checks)
    return Html('<table class="members" id="members"><thead><tr><th data-num="1">Row</th><th>Member</th>'
                '{}{}<th title="the check with the highest utilisation">Governing</th>'
                '<th class="u" data-num="1">Utilisation</th><th>Status</th></tr></thead><tbody>'
                ).format(cols, utils)


def table_row(rec: dict, checks: list[dict], columns: list[str]) -> Html:
    status = rec["status"]
    cls = {"OK": "ok", "NG": "ng"}.get(status, "err")
    values = rec.get("values", {})
    cells = [Html('<td data-v="{0}">{0}</td>').format(rec["row"]),
             Html('<td data-v="{}">{}</td>').format(rec["member"], _member_link(rec))]
    for c in columns:
        cells.append(Html('<td class="v" data-v="{0}">{0}</td>').format(values.get(c, "")))
    util = rec.get("utilisation", {})
    gov = rec.get("governing")
    for c in checks:
        r = util.get(c["key"])
        klass = "u" + (" ng" if c["key"] in rec.get("ng", []) else "") + (" gov" if c["key"] == gov else "")
        cells.append(Html('<td class="{}" data-v="{}">{}</td>').format(klass, _num(r), ratio_text(r)))
    code = next((c["code"] for c in checks if c["key"] == gov), "")
    label = next((c["label"] for c in checks if c["key"] == gov), "")
    g = rec.get("governing_ratio")
    cells.append(Html('<td class="gv" data-v="{0}" title="{1}">{0}</td>').format(code, label))
    cells.append(Html('<td class="u" data-v="{}">{}</td>').format(_num(g), ratio_text(g)))
    cells.append(Html('<td class="st" data-v="{0}">{0}</td>').format(status))
    return Html('<tr class="{}" data-i="{}">{}</tr>\n').format(cls, rec["row"], Html("").join(cells))


def _member_link(rec: dict) -> Html:
    link = rec.get("link")
    if link and rec["status"] != "ERROR":
        return Html('<a href="{}">{}</a>').format(link, rec["member"])
    return esc(rec["member"])


def table_end() -> Html:
    return Html("</tbody></table>")


def ranked(top: list[dict], checks: list[dict], total: int) -> Html:
    """The PDF's sorted view: members by governing utilisation, highest first."""
    labels = {c["key"]: f"{c['code']} {c['label']}" if c.get("code") else c["label"] for c in checks}
    rows = Html("").join(
        Html('<tr class="{}"><td>{}</td><td>{}</td><td>{}</td><td class="u">{}</td><td class="st">{}</td></tr>').format(
            {"OK": "ok", "NG": "ng"}.get(r["status"], "err"), i, r["member"], labels.get(r.get("governing"), ""),
            ratio_text(r.get("governing_ratio")), r["status"]) for i, r in enumerate(top, 1))
    more = (Html("<p>The {} most utilised of {} members are shown; the full list is in the table above and in "
                 "schedule.csv.</p>").format(len(top), total) if total > len(top) else Html())
    return Html('<section class="ranked"><h2 class="sec">Members by governing utilisation</h2>'
                '<table class="members ranked"><thead><tr><th>Rank</th><th>Member</th><th>Governing check</th>'
                '<th>Utilisation</th><th>Status</th></tr></thead><tbody>{}</tbody></table>{}</section>'
                ).format(rows, more)


def errors_list(errors: list[str], more: int) -> Html:
    if not errors:
        return Html()
    tail = Html("<li>… and {} more (see the build's messages)</li>").format(more) if more else Html()
    items = Html("").join(Html("<li>{}</li>").format(e) for e in errors)
    return Html("<section class='sched-errors'><h2 class='sec'>Rows not built</h2><ul>{}{}</ul></section>"
                ).format(items, tail)


def page_end(script: bool = True) -> Html:
    return Html("\n{}\n</body></html>\n").format(Html(SORT_SCRIPT) if script else Html())  # our fixed script


def section(title: str, body: Html) -> Html:
    return Html("<h2 class='front-h'>{}</h2>{}").format(title, body)


def figure(svg: str, caption: str) -> Html:
    """A chart drawn with calcsheet.svg (its text escaped there) and its caption."""
    return Html("<figure class='chart'>{}<figcaption>{}</figcaption></figure>").format(Html(svg), caption)


def caution_box(text: str) -> Html:
    return Html("<div class='caution'><strong>Caution.</strong> {}</div>").format(text)


def title(heading: str, sub: str) -> Html:
    return Html("<h1 class='doc-title'>{}</h1><p class='doc-project'>{}</p>").format(heading, sub)


def simple_table(head: list[str], rows: list[list], row_classes: list[str] | None = None,
                 cell_classes: list[list[str]] | None = None) -> Html:
    """A plain table of text cells (escaped)."""
    thead = Html("").join(Html("<th>{}</th>").format(h) for h in head)
    body = []
    for i, r in enumerate(rows):
        cc = cell_classes[i] if cell_classes else [""] * len(r)
        cells = Html("").join(Html('<td class="{}">{}</td>').format(k, v) for v, k in zip(r, cc))
        body.append(Html('<tr class="{}">{}</tr>').format(row_classes[i] if row_classes else "", cells))
    return Html("<table class='members'><thead><tr>{}</tr></thead><tbody>{}</tbody></table>").format(
        thead, Html("").join(body))


# ------------------------------------------------------------ charts


def _marker(svg: Svg, shape: str, x: float, y: float, colour: str, r: float = 3.2):
    if shape == "circle":
        svg.circle(x, y, r, fill=colour)
    elif shape == "square":
        svg.rect(x - r, y - r, 2 * r, 2 * r, fill=colour)
    elif shape == "diamond":
        svg.polygon([(x, y - r * 1.3), (x + r * 1.3, y), (x, y + r * 1.3), (x - r * 1.3, y)], fill=colour)
    elif shape == "triangle":
        svg.polygon([(x, y - r * 1.3), (x + r * 1.2, y + r), (x - r * 1.2, y + r)], fill=colour)
    else:
        svg.line(x - r, y - r, x + r, y + r, stroke=colour, stroke_width=1.6)
        svg.line(x - r, y + r, x + r, y - r, stroke=colour, stroke_width=1.6)


def _u_max(values) -> float:
    top = max([v for v in values if v is not None and math.isfinite(v)] + [1.0])
    return max(1.2, math.ceil(top * 10 + 1e-9) / 10)


# The widest glyph of DejaVu Sans in each class of character, as a share of the font size (from memory,
# rounded up): a label laid out with these widths is never cut, whatever its letters.
_WIDE = {**dict.fromkeys("mwMW%…—≥≤×", 1.0), " ": 0.34}
LEGEND_FONT = 8.5


def _char_w(ch: str) -> float:
    if ch in _WIDE:
        return _WIDE[ch]
    if ch.isupper():
        return 0.8
    if ch.isdigit():
        return 0.66
    return 0.65 if ch.isascii() else 0.85


def text_width(text: str, font_size: float) -> float:
    """An upper bound of the width ``text`` takes at ``font_size``."""
    return sum(_char_w(ch) for ch in text) * font_size


def wrap_text(text: str, width: float, font_size: float) -> list[str]:
    """``text`` in lines no wider than ``width`` (by ``text_width``), broken at spaces; a word longer than a
    line is broken inside it."""
    lines: list[str] = []
    line = ""
    for word in text.split():
        while text_width(word, font_size) > width and len(word) > 1:
            if line:
                lines.append(line)
                line = ""
            cut = 1
            while cut < len(word) and text_width(word[:cut + 1], font_size) <= width:
                cut += 1
            lines.append(word[:cut])
            word = word[cut:]
        if not line:
            line = word
        elif text_width(f"{line} {word}", font_size) <= width:
            line += " " + word
        else:
            lines.append(line)
            line = word
    if line or not lines:
        lines.append(line)
    return lines


def legend(svg: Svg, items: list[tuple[str, object]], x0: float, y0: float, width: float) -> float:
    """Legend entries laid out left to right and wrapped onto new rows within ``width``; a label too long
    for one row is itself wrapped. ``items`` are (label, draw) where ``draw(svg, x, y)`` draws a 14-unit key
    centred on y. Returns the height used."""
    key_w, gap, line_h = 18.0, 14.0, LEGEND_FONT * 1.35
    x, y, row_h = x0, y0, 0.0
    for label, draw in items:
        lines = wrap_text(label, width - key_w, LEGEND_FONT)
        w = key_w + max(text_width(t, LEGEND_FONT) for t in lines)
        if x > x0 and x + w > x0 + width:
            x, y, row_h = x0, y + row_h, 0.0
        draw(svg, x + 7, y + LEGEND_FONT * 0.45)
        for i, t in enumerate(lines):
            svg.text(x + key_w, y + LEGEND_FONT * 0.8 + i * line_h, t, font_size=LEGEND_FONT, fill=AXIS)
        row_h = max(row_h, len(lines) * line_h + 3)
        x += w + gap
    return y + row_h - y0


def _legend_label(c: dict) -> str:
    return f"{c['code']} {c['label']}" if c.get("code") else c["label"]


def member_chart(records: list[dict], checks: list[dict]) -> str:
    """One line per member: a bar to the governing utilisation, a marker for each check, a line at 1.0."""
    right, row_h = 20, 14
    longest = max((text_width(r["member"], 8.5) for r in records), default=0)
    left = max(60.0, longest + 14)  # member names (at most 64 characters) whole: a long one widens the chart
    width = max(640.0, left + 300 + right)
    span = width - left - right
    u_max = _u_max([r.get("utilisation", {}).get(c["key"]) for r in records for c in checks])
    svg = Svg(width, 0, title="Utilisation of each check, per member", css_class="figure chart")

    def x(u):
        return left + span * min(max(u, 0.0), u_max) / u_max

    def key(k):
        return lambda s, kx, ky: _marker(s, MARKERS[k % len(MARKERS)], kx, ky, PALETTE[k % len(PALETTE)])

    used = legend(svg, [(_legend_label(c), key(k)) for k, c in enumerate(checks)], 8, 6, width - 16)
    top = 6 + used + 10
    base = top + row_h * len(records)
    svg.height = base + 30
    tick = 0.0
    while tick <= u_max + 1e-9:
        svg.line(x(tick), top - 4, x(tick), base, stroke="#ddd", stroke_width=0.6)
        svg.text(x(tick), base + 12, f"{tick:.1f}", font_size=8.5, text_anchor="middle", fill=AXIS)
        tick = round(tick + (0.2 if u_max <= 2.0 else 0.5), 6)
    for i, r in enumerate(records):
        y = top + i * row_h + row_h / 2
        svg.text(left - 6, y + 3, r["member"], font_size=8.5, text_anchor="end", fill=AXIS)
        g = r.get("governing_ratio")
        if r["status"] == "ERROR":
            svg.text(left + 4, y + 3, "not built (error)", font_size=8.5, fill=ERR_COLOUR)
            continue
        if g is not None:
            colour = OK_COLOUR if r["status"] == "OK" else NG_COLOUR
            svg.rect(left, y - row_h * 0.3, x(g) - left, row_h * 0.6, fill=colour, fill_opacity=0.25)
        for k, c in enumerate(checks):
            u = r.get("utilisation", {}).get(c["key"])
            if u is not None:
                _marker(svg, MARKERS[k % len(MARKERS)], x(u), y, PALETTE[k % len(PALETTE)])
    svg.line(x(1.0), top - 6, x(1.0), base, stroke=NG_COLOUR, stroke_width=1.2, stroke_dasharray="4 2")
    label = "utilisation 1.0"
    fits = x(1.0) + 3 + text_width(label, 8.5) <= width - 2
    svg.text(x(1.0) + 3 if fits else x(1.0) - 3, base + 24, label, font_size=8.5, fill=NG_COLOUR,
             text_anchor=None if fits else "end")
    svg.line(left, base, width - right, base, stroke=AXIS, stroke_width=0.8)
    return svg.render()


def histogram_chart(counts_ok: list[int], counts_ng: list[int], bin_width: float) -> str:
    """Members per band of governing utilisation (for schedules too long for a line per member)."""
    n_bins = len(counts_ok)
    width, height, left, bottom, top = 640, 240, 50, 34, 16
    span_w = width - left - 20
    peak = max([a + b for a, b in zip(counts_ok, counts_ng)] + [1])
    svg = Svg(width, height, title="Members per band of governing utilisation", css_class="figure chart")
    bw = span_w / n_bins
    plot_h = height - top - bottom
    for i in range(n_bins):
        x0 = left + i * bw
        h_ok = plot_h * counts_ok[i] / peak
        h_ng = plot_h * counts_ng[i] / peak
        y0 = height - bottom
        if counts_ok[i]:
            svg.rect(x0 + 1, y0 - h_ok, bw - 2, h_ok, fill=OK_COLOUR)
        if counts_ng[i]:
            svg.rect(x0 + 1, y0 - h_ok - h_ng, bw - 2, h_ng, fill=NG_COLOUR)
        total = counts_ok[i] + counts_ng[i]
        if total:
            svg.text(x0 + bw / 2, y0 - h_ok - h_ng - 3, str(total), font_size=8, text_anchor="middle", fill=AXIS)
        label = f"{i * bin_width:.1f}" if i < n_bins - 1 else f"≥{i * bin_width:.1f}"
        svg.text(x0 + bw / 2, height - bottom + 12, label, font_size=8, text_anchor="middle", fill=AXIS)
    svg.line(left, height - bottom, width - 20, height - bottom, stroke=AXIS, stroke_width=0.8)
    svg.text(left + span_w / 2, height - 6, "governing utilisation (band start); red: NG", font_size=8.5,
             text_anchor="middle", fill=AXIS)
    return svg.render()


def sweep_chart(name: str, unit: str, xs: list[float], checks: list[dict], series: dict[str, list],
                flips: list[dict]) -> str:
    """Each check's utilisation against the swept input; a dashed line at 1.0; a tick where a check turns NG."""
    width, left, right, bottom, ph = 640, 52, 28, 42, 218
    pw = width - left - right
    u_max = _u_max([v for s in series.values() for v in s])
    lo, hi = min(xs), max(xs)
    if hi == lo:
        hi = lo + 1.0
    svg = Svg(width, 0, title=f"Utilisation against {name}", css_class="figure chart")

    def key(k):
        return lambda s, kx, ky: s.line(kx - 7, ky, kx + 7, ky, stroke=PALETTE[k % len(PALETTE)], stroke_width=2)

    top = 6 + legend(svg, [(_legend_label(c), key(k)) for k, c in enumerate(checks)], 8, 6, width - 16) + 8
    flip_rows = min(3, len(checks)) if flips else 0
    top += 10 * flip_rows  # the flips' labels sit above the plot, one row per check (up to three)
    height = top + ph + bottom
    svg.height = height

    def px(v):
        return left + pw * (v - lo) / (hi - lo)

    def py(u):
        return top + ph * (1 - min(max(u, 0.0), u_max) / u_max)

    tick = 0.0
    while tick <= u_max + 1e-9:
        svg.line(left, py(tick), width - right, py(tick), stroke="#e5e7eb", stroke_width=0.6)
        svg.text(left - 5, py(tick) + 3, f"{tick:.1f}", font_size=8.5, text_anchor="end", fill=AXIS)
        tick = round(tick + (0.2 if u_max <= 2.0 else 0.5), 6)
    for v in _nice_ticks(lo, hi):
        svg.line(px(v), top + ph, px(v), top + ph + 4, stroke=AXIS, stroke_width=0.8)
        svg.text(px(v), top + ph + 14, f"{v:g}", font_size=8.5, text_anchor="middle", fill=AXIS)
    svg.line(left, py(1.0), width - right, py(1.0), stroke=NG_COLOUR, stroke_width=1.1, stroke_dasharray="4 2")
    for k, c in enumerate(checks):
        colour = PALETTE[k % len(PALETTE)]
        seg: list[tuple[float, float]] = []
        for xv, u in list(zip(xs, series[c["key"]])) + [(None, None)]:
            if u is None:
                if len(seg) > 1:
                    svg.polyline(seg, fill="none", stroke=colour, stroke_width=1.6)
                elif seg:
                    svg.circle(seg[0][0], seg[0][1], 2, fill=colour)
                seg = []
            else:
                seg.append((px(xv), py(u)))
    for f in flips:
        k = next(i for i, c in enumerate(checks) if c["key"] == f["check"])
        colour = PALETTE[k % len(PALETTE)]
        fx = px(f["at"])
        svg.line(fx, top - 10 * flip_rows, fx, top + ph, stroke=colour, stroke_width=0.9, stroke_dasharray="2 2")
        _marker(svg, "diamond", fx, py(1.0), colour, r=3.5)
        label = f"{'NG' if f['to'] == 'NG' else 'OK'} at {f['at']:.4g}"
        fits = fx + 3 + text_width(label, 8) <= width - 2
        svg.text(fx + 3 if fits else fx - 3, top - 2 - 10 * (k % 3), label, font_size=8, fill=colour,
                 text_anchor=None if fits else "end")
    svg.line(left, top + ph, width - right, top + ph, stroke=AXIS, stroke_width=0.8)
    svg.line(left, top, left, top + ph, stroke=AXIS, stroke_width=0.8)
    svg.text(left + pw / 2, height - 8, f"{name}" + (f" [{unit}]" if unit else ""), font_size=9,
             text_anchor="middle", fill=AXIS)
    return svg.render()


def _nice_ticks(lo: float, hi: float, n: int = 6) -> list[float]:
    raw = (hi - lo) / n
    mag = 10 ** math.floor(math.log10(raw)) if raw > 0 else 1
    step = next(m * mag for m in (1, 2, 2.5, 5, 10) if m * mag >= raw)
    start = math.ceil(lo / step - 1e-9) * step
    out = []
    v = start
    while v <= hi + 1e-9 * step:
        out.append(round(v, 10))
        v += step
    return out


def sheet_name(path: str) -> str:
    return Path(path).name
