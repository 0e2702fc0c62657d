"""``build SHEET --sweep NAME=START:STOP:STEP`` (or ``NAME=v1,v2,…``): one input over a range.

Each point runs the sheet with the input set to that value (the same text a
``--set`` takes), on the same runners as a schedule; the package draws every
check's utilisation against the input and marks where each check turns NG
(or back to OK), found by linear interpolation of the utilisation to 1.0
between the two points that straddle it.
"""
from __future__ import annotations

import json
import math
import re
import sys
from dataclasses import dataclass
from pathlib import Path

from .table import ScheduleError
from .work import Task, caution

MAX_POINTS = 2001
_NUM = re.compile(r"\s*([-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")


@dataclass
class SweepSpec:
    name: str
    unit: str
    values: list[float]

    def text(self, v: float) -> str:
        number = repr(float(v))
        if number.endswith(".0"):
            number = number[:-2]
        return f"{number} {self.unit}".strip()


def parse_sweep(spec: str) -> SweepSpec:
    """NAME=START:STOP:STEP or NAME=v1,v2,…; a unit written on any value applies to the bare ones."""
    name, sep, rest = spec.partition("=")
    name = name.strip()
    if not sep or not name or not rest.strip():
        raise ScheduleError("--sweep", f"expects NAME=START:STOP:STEP or NAME=v1,v2,…, got {spec!r}")
    if ":" in rest and "," in rest:
        raise ScheduleError("--sweep", "use START:STOP:STEP or a list v1,v2,…, not both")
    parts = rest.split(":") if ":" in rest else rest.split(",")
    nums, units = [], []
    for part in parts:
        m = _NUM.fullmatch(part)
        if not m:
            raise ScheduleError("--sweep", f"{name}: {part.strip()!r} is not a number with an optional unit")
        nums.append(float(m.group(1)))
        if m.group(2):
            units.append(m.group(2))
    if len(set(units)) > 1:
        raise ScheduleError("--sweep", f"{name}: write every value in one unit (got {', '.join(sorted(set(units)))})")
    unit = units[0] if units else ""
    if not all(math.isfinite(v) for v in nums):
        raise ScheduleError("--sweep", f"{name}: values must be finite")
    if ":" in rest:
        if len(nums) != 3:
            raise ScheduleError("--sweep", f"{name}: a range is START:STOP:STEP")
        start, stop, step = nums
        if step == 0 or (stop - start) * step < 0:
            raise ScheduleError("--sweep", f"{name}: STEP must be non-zero and lead from START to STOP")
        n = int(math.floor((stop - start) / step + 1e-9)) + 1
        if n > MAX_POINTS:
            raise ScheduleError("--sweep", f"{name}: {n} points; at most {MAX_POINTS}")
        values = [float(f"{start + i * step:.12g}") for i in range(n)]
    else:
        values = nums
        if len(values) > MAX_POINTS:
            raise ScheduleError("--sweep", f"{name}: at most {MAX_POINTS} values")
    return SweepSpec(name, unit, values)


def _sig4(v: float) -> float:
    return float(f"{v:.4g}")


def find_flips(xs: list[float], checks: list[dict], ratios: dict[str, list], oks: dict[str, list]) -> list[dict]:
    """Where each check changes between OK and NG along the sweep."""
    flips = []
    for c in checks:
        key = c["key"]
        prev = None
        for i, ok in enumerate(oks[key]):
            if ok is None:
                prev = None
                continue
            if prev is not None and oks[key][prev] != ok:
                x0, x1 = xs[prev], xs[i]
                r0, r1 = ratios[key][prev], ratios[key][i]
                at = (x0 + x1) / 2
                if r0 is not None and r1 is not None and r1 != r0 and (r0 - 1) * (r1 - 1) <= 0:
                    at = x0 + (1 - r0) * (x1 - x0) / (r1 - r0)
                flips.append({"check": key, "label": c["label"], "to": "OK" if ok else "NG", "at": at,
                              "between": [x0, x1]})
            prev = i
    return flips


def build_sweep(sheet_path: Path, spec_text: str, out_dir: Path, formats: list[str], *, jobs: int = 1,
                cluster: str | None = None, paper: str | None = None, overrides: dict | None = None,
                out=print) -> int:
    from .. import __version__
    from ..atomic import write_atomic
    from ..package import ASSETS, pdf_bytes
    from ..render import schedule as RS
    from . import Progress, executor, load_sheet

    spec = parse_sweep(spec_text)
    sheet = load_sheet(sheet_path)
    if sheet.errors:
        print(sheet.errors, file=sys.stderr)
        return 1
    if spec.name not in sheet.inputs:
        hint = "it is calculated by the sheet" if spec.name in sheet.defined else \
            f"inputs: {', '.join(sheet.inputs) or 'none'}"
        raise ScheduleError("--sweep", f"{spec.name!r} is not an input of the sheet ({hint})")
    base = {k: v for k, v in (overrides or {}).items() if k != spec.name}
    bar = Progress(len(spec.values), f"sweep {spec.name}")

    def items():
        for i, v in enumerate(spec.values):
            text = spec.text(v)
            cells = tuple((k, t, "--set") for k, t in base.items()) + ((spec.name, text, "--sweep"),)
            yield Task(index=i, sheet=sheet.path, source=sheet.source, member=f"p{i + 1}", cells=cells,
                       formats=(), paper=paper, label=f"point {i + 1} ({spec.name} = {text})", where="--sweep")

    checks: dict[str, dict] = {}
    points = []
    failed = 0
    try:
        for o in executor(jobs, cluster, False, bar.log)(items()):
            for e in o.errors:
                bar.log(e)
            failed += not o.ok
            for c in o.checks:
                checks.setdefault(c.key, {"key": c.key, "label": c.label, "text": c.text})
            points.append({"value": spec.values[o.index], "text": spec.text(spec.values[o.index]),
                           "utilisation": {c.key: c.ratio for c in o.checks} if o.ok else {},
                           "ok": {c.key: c.ok for c in o.checks} if o.ok else {},
                           "error": o.errors[0].split("\n")[0] if o.errors else None})
            bar.step()
    finally:
        bar.close()
    check_list = list(checks.values())
    xs = [p["value"] for p in points]
    ratios = {c["key"]: [p["utilisation"].get(c["key"]) for p in points] for c in check_list}
    oks = {c["key"]: [p["ok"].get(c["key"]) for p in points] for c in check_list}
    flips = find_flips(xs, check_list, ratios, oks)
    stem = f"{sheet_path.stem}-sweep-{spec.name}"
    out_dir.mkdir(parents=True, exist_ok=True)
    data = {"sweep": {"sheet": sheet.path, "input": spec.name, "unit": spec.unit,
                      "sheet_sha256": sheet.fingerprint["sheet"]},
            "calcsheet": __version__, "plugins": sheet.fingerprint["plugins"], "checks": check_list,
            "points": points, "flips": flips}
    written = []
    path = out_dir / f"{stem}.json"
    write_atomic(path, (json.dumps(data, indent=2, ensure_ascii=False, allow_nan=False) + "\n").encode("utf-8"))
    written.append(path)
    if "html" in formats or "pdf" in formats:
        check_list = RS.with_codes(check_list)  # short names in the chart and table, the full ones in a legend
        title = f"Sweep of {spec.name}"
        span = f"{points[0]['text']} to {points[-1]['text']}" if points else ""
        parts = [RS.page_start(sheet.meta, title, Path(sheet.path).name, paper,
                               (ASSETS / "package.css").read_text(encoding="utf-8")),
                 RS.footer(Path(sheet.path).name, sheet.fingerprint["sheet"], "", "", __version__,
                           sheet.fingerprint["plugins"]),
                 RS.Html("<main>"),
                 RS.title(title, f"{sheet.meta.get('subject', '')} · {len(points)} points from {span}"),
                 RS.figure(RS.sweep_chart(spec.name, spec.unit, xs, check_list, ratios, flips),
                           f"Utilisation of each check against {spec.name}; dashed line: 1.0; a diamond marks where "
                           "a check changes between OK and NG (interpolated between the two points either side).")]
        if flips:
            parts.append(RS.section("Where checks change", RS.simple_table(
                ["Check", "Becomes", "At about", "Between points"],
                [[f["label"], f["to"], spec.text(_sig4(f["at"])),
                  f"{spec.text(f['between'][0])} – {spec.text(f['between'][1])}"] for f in flips])))
        else:
            parts.append(RS.Html("<p>No check changes between OK and NG over this range.</p>"))
        rows, row_cls, cell_cls = [], [], []
        for p in points:
            status = "ERROR" if p["error"] else ("OK" if all(p["ok"].values()) else "NG")
            rows.append([p["text"], *[RS.ratio_text(p["utilisation"].get(c["key"])) for c in check_list], status])
            row_cls.append({"OK": "ok", "NG": "ng"}.get(status, "err"))
            cell_cls.append(["v", *["u" + ("" if p["ok"].get(c["key"], True) else " ng") for c in check_list], "st"])
        parts.append(RS.section("Points", RS.check_legend(check_list) + RS.simple_table(
            [spec.name, *[c["code"] for c in check_list], "Status"], rows, row_cls, cell_cls)))
        parts += [RS.caution_box(caution()), RS.Html("</main>"), RS.page_end(script=False)]
        html = str(RS.Html("").join(parts))
        if "html" in formats:
            path = out_dir / f"{stem}.html"
            write_atomic(path, html.encode("utf-8"))
            written.append(path)
        if "pdf" in formats:
            path = out_dir / f"{stem}.pdf"
            write_atomic(path, pdf_bytes(html))
            written.append(path)
    for f in flips:
        out(f"{sheet_path}: {f['label']} becomes {f['to']} at {spec.name} ≈ {f['at']:.4g} {spec.unit}".rstrip())
    out(f"{sheet_path}: swept {spec.name} over {len(points)} points ({failed} failed) -> "
        + ", ".join(str(p) for p in written))
    return 1 if failed else 0
