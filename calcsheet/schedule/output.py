"""Writing outputs: member packages as they arrive, and the schedule package from a spool of small records.

Per-member records are appended to a spool file in the output folder as rows
finish, so memory does not grow with the number of rows; the schedule's HTML,
JSON and CSV are then streamed from the spool into temporary files and renamed
into place.
"""
from __future__ import annotations

import csv
import heapq
import io
import json
import os
import tempfile
from pathlib import Path

from .. import __version__
from ..atomic import atomic_stream, write_atomic
from ..atomic import sync_folder as sync_out_dir
from ..render import schedule as RS
from .work import CheckLine, Outcome

TOP_RANKED = 100
BIN_WIDTH = 0.1
N_BINS = 16  # 0.0–1.5 and ≥ 1.5
MAX_ERRORS_LISTED = 50


def write_member(out_dir: Path, outcome: Outcome, sync_folder: bool = True) -> list[Path]:
    """Write the rendered files an outcome carries (a cluster's, or sizing's), each atomically
    (``sync_folder=False``: the caller syncs ``out_dir`` at the end, as ``ScheduleWriter.close`` does)."""
    from .work import write_member as write

    return write(out_dir, outcome.member, outcome.files, sync_folder)


def record_of(outcome: Outcome, row: int, where: str, formats: list[str]) -> dict:
    gov = outcome.governing() if outcome.ok else None
    if not outcome.ok:
        status = "ERROR"
    else:
        status = "OK" if outcome.all_ok else "NG"
    return {
        "row": row,
        "member": outcome.member,
        "where": where,
        "status": status,
        "values": outcome.values,
        "utilisation": {c.key: c.ratio for c in outcome.checks},
        "ng": [c.key for c in outcome.checks if not c.ok],
        "governing": gov.key if gov else None,
        "governing_ratio": gov.ratio if gov else None,
        "content_hash": outcome.content_hash,
        "files": [f"{outcome.member}.{f}" for f in ("html", "pdf", "json") if f in formats] if outcome.ok else [],
        "errors": [e.split("\n")[0] for e in outcome.errors],
    }


def checks_from_record(rec: dict, labels: dict[str, dict]) -> list[CheckLine]:
    """A skipped member's check lines, as its previous build recorded them."""
    ng = set(rec.get("ng", []))
    out = []
    for key, ratio in rec.get("utilisation", {}).items():
        meta = labels.get(key, {"label": key, "text": ""})
        out.append(CheckLine(key, meta["label"], meta["text"], ratio, key not in ng))
    return out


class ScheduleWriter:
    """Collects one small record per member (spooled to disk) and writes the schedule package at the end."""

    def __init__(self, out_dir: Path, formats: list[str], info: dict):
        self.out_dir = out_dir
        self.formats = formats
        self.info = info  # sheet, table, sheet_sha256, table_sha256, plugins, meta, paper, columns
        out_dir.mkdir(parents=True, exist_ok=True)
        fd, self.spool_path = tempfile.mkstemp(prefix=".schedule.", suffix=".spool", dir=out_dir)
        self.spool = os.fdopen(fd, "w", encoding="utf-8")
        self.checks: dict[str, dict] = {}
        self.totals = {"members": 0, "ok": 0, "ng": 0, "errors": 0}
        self.top: list = []  # heap of (ratio, -row, record) for the ranked view
        self.hist_ok = [0] * N_BINS
        self.hist_ng = [0] * N_BINS
        self.first: list[dict] = []  # the first BAR_CHART_MAX records, for the per-member chart
        self.errors: list[str] = []
        self.more_errors = 0

    def add(self, outcome: Outcome, row: int, where: str) -> dict:
        for c in outcome.checks:
            self.checks.setdefault(c.key, {"key": c.key, "label": c.label, "text": c.text})
        rec = record_of(outcome, row, where, self.formats)
        if "html" in self.formats:
            rec_link = f"{outcome.member}.html"
        else:
            rec_link = None
        self.spool.write(json.dumps(rec, ensure_ascii=False, allow_nan=False) + "\n")
        t = self.totals
        t["members"] += 1
        t[{"OK": "ok", "NG": "ng", "ERROR": "errors"}[rec["status"]]] += 1
        if rec["status"] == "ERROR":
            for e in outcome.errors:
                if len(self.errors) < MAX_ERRORS_LISTED:
                    self.errors.append(e)
                else:
                    self.more_errors += 1
        else:
            g = rec["governing_ratio"]
            if g is not None:
                b = min(int(g / BIN_WIDTH + 1e-9), N_BINS - 1)
                (self.hist_ok if rec["status"] == "OK" else self.hist_ng)[b] += 1
            key = (g if g is not None else (float("inf") if rec["status"] == "NG" else -1.0), -row)
            small = {k: rec[k] for k in ("member", "status", "governing", "governing_ratio")}
            if len(self.top) < TOP_RANKED:
                heapq.heappush(self.top, (key, small))
            elif key > self.top[0][0]:
                heapq.heapreplace(self.top, (key, small))
        if len(self.first) <= RS.BAR_CHART_MAX:
            self.first.append({**rec, "link": rec_link})
        return rec

    def _records(self):
        with open(self.spool_path, encoding="utf-8") as fh:
            for line in fh:
                yield json.loads(line)

    def close(self) -> list[Path]:
        """Write the schedule package, then sync the output folder once: every member's files (renamed into
        it as they arrived, each whole) and the schedule's own files are then durable together."""
        self.spool.close()
        try:
            written = self._write_all()
            sync_out_dir(self.out_dir)
            return written
        finally:
            try:
                os.unlink(self.spool_path)
            except FileNotFoundError:
                pass

    # -------------------------------------------------------- outputs
    def _write_all(self) -> list[Path]:
        written = []
        checks = list(self.checks.values())
        if "html" in self.formats:
            path = self.out_dir / "schedule.html"
            with atomic_stream(path) as fh:
                self._html(fh, checks, for_pdf=False)
            written.append(path)
        if "pdf" in self.formats:
            from ..package import pdf_bytes

            buf = io.StringIO()
            self._html(buf, checks, for_pdf=True)
            path = self.out_dir / "schedule.pdf"
            write_atomic(path, pdf_bytes(buf.getvalue()))
            written.append(path)
        path = self.out_dir / "schedule.json"
        with atomic_stream(path) as fh:
            self._json(fh, checks)
        written.append(path)
        path = self.out_dir / "schedule.csv"
        with atomic_stream(path) as fh:
            self._csv(fh, checks)
        written.append(path)
        return written

    def _json(self, fh, checks):
        head = {"schedule": {k: self.info[k] for k in ("sheet", "table", "sheet_sha256", "table_sha256")},
                "calcsheet": __version__, "plugins": self.info["plugins"], "columns": self.info["columns"],
                "checks": checks}
        text = json.dumps(head, indent=2, ensure_ascii=False, allow_nan=False)
        fh.write(text[:-2] + ',\n  "members": [')
        first = True
        for rec in self._records():
            fh.write(("\n    " if first else ",\n    ") + json.dumps(rec, ensure_ascii=False, allow_nan=False))
            first = False
        fh.write(("\n  " if not first else "") + '],\n  "totals": ' +
                 json.dumps(self.totals, allow_nan=False) + "\n}\n")

    def _csv(self, fh, checks):
        w = csv.writer(fh, lineterminator="\n")
        cols = self.info["columns"]
        w.writerow(["row", "member", *cols, *[f"utilisation: {c['label']}" for c in checks],
                    "governing", "governing utilisation", "status", "error"])
        labels = {c["key"]: c["label"] for c in checks}
        for rec in self._records():
            u = rec["utilisation"]
            w.writerow([rec["row"], rec["member"], *[rec["values"].get(c, "") for c in cols],
                        *["" if u.get(c["key"]) is None else f"{u[c['key']]:.4f}" for c in checks],
                        labels.get(rec["governing"], ""),
                        "" if rec["governing_ratio"] is None else f"{rec['governing_ratio']:.4f}",
                        rec["status"], rec["errors"][0] if rec["errors"] else ""])

    def _html(self, fh, checks, for_pdf: bool):
        from ..package import ASSETS

        info = self.info
        checks = RS.with_codes(checks)  # short names in the table, the full ones in a legend above it
        css = (ASSETS / "package.css").read_text(encoding="utf-8")
        meta = info["meta"]
        title = f"Member schedule — {Path(info['table']).name}"
        subject = str(meta.get("subject") or Path(info["sheet"]).stem)
        fh.write(RS.page_start(meta, title, Path(info["sheet"]).name, info.get("paper"), css))
        fh.write(RS.footer(Path(info["sheet"]).name, info["sheet_sha256"], Path(info["table"]).name,
                           info["table_sha256"], __version__, info["plugins"]))
        fh.write("<main><section class='front'>")
        fh.write(RS.title(title, f"{subject} · {meta.get('project', '')}"))
        fh.write(RS.overall(self.totals))
        if self.totals["members"] <= RS.BAR_CHART_MAX:
            chart = RS.member_chart(self.first, checks)
            cap = "Each member's check utilisations; the bar reaches the governing one. Dashed line: 1.0."
        else:
            chart = RS.histogram_chart(self.hist_ok, self.hist_ng, BIN_WIDTH)
            cap = f"Members per band of governing utilisation ({self.totals['members']} members)."
        fh.write(RS.section("Utilisation", RS.figure(chart, cap)))
        fh.write("<h2 class='front-h'>Members</h2>")
        if not for_pdf:
            fh.write("<p class='screen-only'>Click a column heading to sort by it.</p>")
        if checks:
            fh.write(RS.check_legend(checks))
        fh.write(RS.table_head(checks, info["columns"]))
        for rec in self._records():
            if not for_pdf and "html" in self.formats:
                rec["link"] = f"{rec['member']}.html"
            fh.write(RS.table_row(rec, checks, info["columns"]))
        fh.write(RS.table_end())
        fh.write("</section>")
        ranked = [r for _, r in sorted(self.top, key=lambda t: t[0], reverse=True)]
        fh.write(RS.ranked(ranked, checks, self.totals["members"] - self.totals["errors"]))
        fh.write(RS.errors_list(self.errors, self.more_errors))
        fh.write(RS.caution_box(_caution()))
        fh.write("</main>")
        fh.write(RS.page_end(script=not for_pdf))


def _caution() -> str:
    from .work import caution

    return caution()


def load_previous(out_dir: Path) -> tuple[dict[str, dict], dict[str, dict]]:
    """The last schedule.json in ``out_dir``: records by member, and check labels by key."""
    path = out_dir / "schedule.json"
    try:
        data = json.loads(path.read_text(encoding="utf-8"))
    except (OSError, ValueError, UnicodeDecodeError):
        return {}, {}
    if not isinstance(data, dict):
        return {}, {}
    recs = {r.get("member"): r for r in data.get("members", []) if isinstance(r, dict)}
    labels = {c.get("key"): c for c in data.get("checks", []) if isinstance(c, dict)}
    return recs, labels
