"""The printers of a diff: the terminal text, the JSON document, and the "changes since" page of a package."""
from __future__ import annotations

from typing import Any

from ..diff import CheckChange, CheckEntry, Entry, SheetDiff, ValueChange
from ..display import pint_unit_string
from .markup import Html, anchor_id, esc


def _pct(p: float | None) -> str:
    if p is None:
        return ""
    return f"{p:+.2f} %" if abs(p) >= 0.005 else f"{p:+.2e} %"


def _ratio(r) -> str:
    return f"{r:.3f}" if isinstance(r, (int, float)) else "—"


def _status(c: CheckEntry) -> str:
    return "OK" if c.ok else "NG"


def since_label(d: SheetDiff) -> str:
    return f"rev {d.old.rev} ({d.old.label})" if d.old.rev else d.old.label


FIELDS_SHOWN = 6  # a record's changed fields shown in the text and page; JSON has them all


def grouped(changes: list[ValueChange]) -> list[tuple[ValueChange | None, list[ValueChange]]]:
    """Plain values alone; a record's changed fields together under the first of them."""
    out: list = []
    index: dict[str, int] = {}
    for c in changes:
        parent = c.new.parent if c.new is not None else None
        if parent is None:
            out.append((None, [c]))
        elif parent in index:
            out[index[parent]][1].append(c)
        else:
            index[parent] = len(out)
            out.append((ValueChange(parent, None, None, caused_by=c.caused_by), [c]))
    return out


def text(d: SheetDiff) -> str:
    """The terminal report."""
    out = [f"changes from {since_label(d)} to " + (f"rev {d.new.rev} ({d.new.label})" if d.new.rev else d.new.label)]
    for side in (d.old, d.new):
        if side.errors:
            out.append(f"  note: {side.label} has {side.errors} error(s); values below an error are missing")
    if d.empty and not d.meta:
        out.append("  no changes in values or checks")
        return "\n".join(out)
    for key, (a, b) in d.meta.items():
        if not isinstance(a, list) and not isinstance(b, list):
            out.append(f"  {key}: {a if a is not None else '—'} → {b if b is not None else '—'}")
    if d.inputs:
        out.append("inputs changed:")
        out += [f"  {c.name}: {c.old.shown()} → {c.new.shown()}  {_pct(c.pct)}".rstrip() for c in d.inputs]
    if d.results:
        out.append("results changed:")
        for head, group in grouped(d.results):
            if head is not None:
                why = f", via {', '.join(head.caused_by)}" if head.caused_by else ""
                out.append(f"  {head.name}: {len(group)} field(s) changed{why}")
                for c in group[:FIELDS_SHOWN]:
                    out.append(f"    .{c.name.split('.', 1)[1]}: {c.old.shown()} → {c.new.shown()}  "
                               f"{_pct(c.pct)}".rstrip())
                if len(group) > FIELDS_SHOWN:
                    out.append(f"    … and {len(group) - FIELDS_SHOWN} more (--format json lists every field)")
                continue
            c = group[0]
            why = f"  (via {', '.join(c.caused_by)})" if c.caused_by else ""
            if c.formula_changed:
                why += f"  formula: {c.old.formula} → {c.new.formula}"
            out.append(f"  {c.name}: {c.old.shown()} → {c.new.shown()}  {_pct(c.pct)}{why}".rstrip())
    if d.flipped:
        out.append("checks flipped:")
        out += [f"  {c.text}: {_status(c.old)} → {_status(c.new)}  ratio {_ratio(c.old.ratio)} → "
                f"{_ratio(c.new.ratio)}" for c in d.flipped]
    if d.moved:
        out.append("utilisation moved:")
        out += [f"  {c.text}: {_status(c.new)}  ratio {_ratio(c.old.ratio)} → {_ratio(c.new.ratio)}"
                for c in d.moved]
    if d.edited_checks:
        out.append("checks edited:")
        out += [f"  {c.old.text} → {c.new.text}: {_status(c.new)}  ratio {_ratio(c.old.ratio)} → "
                f"{_ratio(c.new.ratio)}" for c in d.edited_checks]
    if d.added or d.checks_added:
        out.append("added:")
        out += [f"  {n} = {d.new.values[n].shown()}" for n in d.added]
        out += [f"  check {c.text}: {_status(c)}  ratio {_ratio(c.ratio)}" for c in d.checks_added]
    if d.removed or d.checks_removed:
        out.append("removed:")
        out += [f"  {n} (was {d.old.values[n].shown()})" for n in d.removed]
        out += [f"  check {c.text}" for c in d.checks_removed]
    return "\n".join(out)


def changes_page(d: SheetDiff) -> Html:
    """The "changes since revision X" page for the front of a package; every cell is text unless it is Html."""
    def table(head: list[str], rows: list[list], cls: str) -> Html:
        return Html("<table class='summary {}'><thead><tr>{}</tr></thead><tbody>{}</tbody></table>").format(
            cls, Html("").join(Html("<th>{}</th>").format(h) for h in head),
            Html("").join(Html("<tr>{}</tr>").format(Html("").join(Html("<td>{}</td>").format(c) for c in r))
                          for r in rows))

    def link(name: str) -> Html:
        top = name.split(".", 1)[0]
        return Html("<a href='#{}'>{}</a>").format(anchor_id("v-" + top), name) if top in d.new.values else esc(name)

    since = since_label(d)
    parts = [Html("<section class='changes' style='page-break-before: always'>"
                  "<h2 class='front-h'>Changes since {}</h2>").format(since)]
    n_val = len(d.inputs) + len(d.results)
    n_results = len(grouped(d.results))
    summary = (f"{len(d.inputs)} input(s) and {n_results} result(s) changed; {len(d.flipped)} check(s) "
               f"changed status; {len(d.moved)} utilisation(s) moved; {len(d.added) + len(d.checks_added)} "
               f"step(s) added, {len(d.removed) + len(d.checks_removed)} removed.")
    parts.append(Html("<p>{} Values that moved are marked <span class='mark changed'>changed</span> "
                      "in the calculation; everything else is as in {}.</p>").format(summary, since)
                 if n_val or not d.empty else Html("<p>No value or check changed since {}.</p>").format(since))
    if d.flipped:
        parts.append(Html("<h3>Checks that changed status</h3>") + table(
            ["Check", "Was", "Now", "Ratio was", "Ratio now"],
            [[c.text, _status(c.old), Html("<strong>{}</strong>").format(_status(c.new)), _ratio(c.old.ratio),
              _ratio(c.new.ratio)] for c in d.flipped], "flipped"))
    if d.inputs:
        parts.append(Html("<h3>Inputs changed</h3>") + table(
            ["Symbol", "Was", "Now", "Change"],
            [[link(c.name), c.old.shown(), c.new.shown(), _pct(c.pct)] for c in d.inputs], "inputs"))
    if d.results:
        rows = []
        for head, group in grouped(d.results):
            if head is not None:
                rows.append([link(head.name), f"{len(group)} field(s) of the result changed", "", "",
                             ", ".join(head.caused_by)])
                shown = group[:FIELDS_SHOWN]
                rows += [["  ." + c.name.split(".", 1)[1], c.old.shown(), c.new.shown(), _pct(c.pct), ""]
                         for c in shown]
                if len(group) > len(shown):
                    rows.append(["", f"… and {len(group) - len(shown)} more fields", "", "", ""])
                continue
            c = group[0]
            rows.append([link(c.name), c.old.shown(), c.new.shown(), _pct(c.pct),
                         ", ".join(c.caused_by) + (f"; formula was {c.old.formula}" if c.formula_changed else "")])
        parts.append(Html("<h3>Results changed</h3>") + table(["Symbol", "Was", "Now", "Change", "Because of"], rows,
                                                              "results"))
    if d.moved or d.edited_checks:
        parts.append(Html("<h3>Utilisation moved</h3>") + table(
            ["Check", "Status", "Ratio was", "Ratio now"],
            [[c.text if c in d.moved else f"{c.old.text} → {c.new.text}", _status(c.new),
              _ratio(c.old.ratio), _ratio(c.new.ratio)] for c in d.moved + d.edited_checks], "moved"))
    if d.added or d.removed or d.checks_added or d.checks_removed:
        rows = ([["added", link(n), d.new.values[n].shown()] for n in d.added]
                + [["added", "check " + c.text, _status(c)] for c in d.checks_added]
                + [["removed", n, d.old.values[n].shown()] for n in d.removed]
                + [["removed", "check " + c.text, ""] for c in d.checks_removed])
        parts.append(Html("<h3>Steps added or removed</h3>") + table(["", "Step", "Value"], rows, "steps"))
    parts.append(Html("</section>"))
    return Html("\n").join(parts)


# ---------------------------------------------------------------- JSON


def to_json(d: SheetDiff) -> dict:
    """``calcsheet diff --format json``: every change, every field of a record."""
    return {
        "old": {"source": d.old.label, "rev": d.old.rev, "errors": d.old.errors},
        "new": {"source": d.new.label, "rev": d.new.rev, "errors": d.new.errors},
        "inputs": [_value_change_json(c) for c in d.inputs],
        "results": [_value_change_json(c) for c in d.results],
        "added": d.added,
        "removed": d.removed,
        "checks": {"flipped": [_check_change_json(c) for c in d.flipped],
                   "moved": [_check_change_json(c) for c in d.moved],
                   "edited": [_check_change_json(c) for c in d.edited_checks],
                   "added": [_check_change_json(CheckChange(None, c)) for c in d.checks_added],
                   "removed": [_check_change_json(CheckChange(c, None)) for c in d.checks_removed]},
        "meta": {k: {"old": a, "new": b} for k, (a, b) in d.meta.items()},
    }


def _value_change_json(c: ValueChange) -> dict:
    return {"name": c.name, "old": _entry_json(c.old), "new": _entry_json(c.new),
            "percent": c.pct, "caused_by": c.caused_by, "formula_changed": c.formula_changed}


def _check_change_json(c: CheckChange) -> dict:
    def side(e):
        return None if e is None else {"text": e.text, "ok": e.ok, "status": "OK" if e.ok else "NG",
                                       "ratio": e.ratio, "line": e.line, "description": e.description}
    return {"text": c.text, "old": side(c.old), "new": side(c.new), "flipped": c.flipped}


def _entry_json(e: Entry | None):
    if e is None:
        return None
    out: dict[str, Any] = {"shown": e.shown(), "line": e.line}
    if e.quantity is not None:
        try:
            out["value"] = float(e.quantity.magnitude)
        except TypeError:
            out["value"] = [float(x) for x in e.quantity.magnitude]
        out["unit"] = pint_unit_string(e.quantity.units) if e.quantity.units._units else ""
    else:
        out["text"] = e.text
    if e.formula is not None:
        out["formula"] = e.formula
    return out
