"""``build SHEET --size NAME --from FAMILY``: the lightest catalogue section with every check OK.

NAME is a text input of the sheet holding a designation (``desig = "W18X50"``,
used as ``section.rolled(designation=desig)``). Every section of the family is
tried from the lightest up (mass per length, then designation), on the same
runners as a schedule; the first whose run has no error and every check OK is
chosen. Its package is built with a selection page that shows it beside the
next lighter section and the check(s) that section fails, or the error it
gives. The search stops as soon as the answer is known.
"""
from __future__ import annotations

import json
import sys
from pathlib import Path

from .table import ScheduleError
from ..suggest import did_you_mean
from .work import Task, build_task, content_hash


def family_sections(family: str) -> list[tuple[str, float, str]]:
    """(designation, mass in kg/m, source) of every section of ``family``, lightest first."""
    try:
        from calcsheet_plugins.section import catalogue
    except ImportError:
        raise ScheduleError("--from", "the section catalogue is not installed (section.rolled)") from None
    entries = list(catalogue.entries().values())
    families = sorted({e.family for e in entries})
    wanted = family.strip().upper()
    chosen = [e for e in entries if e.family.upper() == wanted]
    if not chosen:
        hint = did_you_mean(wanted, families, quote="") or "families: " + ", ".join(families)
        raise ScheduleError("--from", f"no catalogue family {family!r} ({hint})")
    missing = [e.designation for e in chosen if e.values.get("mass") is None]
    if missing:
        raise ScheduleError("--from", f"{family}: no mass per length for {', '.join(missing[:3])}; cannot rank")
    out = [(e.designation, float(e.values["mass"]), e.source) for e in chosen]
    out.sort(key=lambda t: (t[1], t[0]))
    return out


def _quoted(designation: str) -> str:
    if '"' in designation or "\n" in designation:
        raise ScheduleError("--from", f"designation {designation!r} cannot be written as sheet text")
    return f'"{designation}"'


def selection_page(name: str, family: str, source: str, chosen: tuple, lighter: tuple | None,
                   lighter_outcome, chosen_outcome, tried: int, total: int):
    """The package's selection page: the chosen section beside the next lighter one and what it fails."""
    from ..render.markup import Html

    def ratio(r):
        return "—" if r is None else f"{r:.2f}"

    gov = chosen_outcome.governing()
    row = Html("<tr class='{}'><td>{}</td><td class='numcol'>{:.1f}</td><td>{}</td><td class='numcol'>{}</td>"
               "<td class='status'>{}</td></tr>")
    rows = [row.format("ok", chosen[0], chosen[1], gov.label if gov else "no checks",
                       ratio(gov.ratio if gov else None), "OK")]
    if lighter is not None:
        what, worst = failure(lighter_outcome)
        rows.append(row.format("ng", lighter[0], lighter[1], what, ratio(worst), "NG"))
        lead = (f"{chosen[0]} is the lightest {family} section for which every check of this sheet is OK. "
                f"The next lighter section, {lighter[0]}, fails: {what}.")
    else:
        lead = f"{chosen[0]} is the lightest {family} section in the catalogue, and every check is OK."
    note = (f"Sections tried from the lightest up, by mass per length: {tried} of the {total} {family} sections "
            f"in {source}. Every section lighter than {chosen[0]} failed a check or could not be used by the sheet.")
    return Html("<section class='changes sizing'><h2 class='front-h'>Section selection: {}</h2><p>{}</p>"
                "<table class='summary'><thead><tr><th>Section</th><th>Mass [kg/m]</th>"
                "<th>Governing / failing check</th><th>Utilisation</th><th></th></tr></thead><tbody>{}</tbody>"
                "</table><p class='note'>{}</p></section>").format(name, lead, Html("").join(rows), note)


def failure(outcome) -> tuple[str, float | None]:
    """What a section fails: its NG checks with their utilisations, or why the sheet cannot use it."""
    if outcome.ok:
        failing = [c for c in outcome.checks if not c.ok]
        what = "; ".join(f"{c.label} ({'—' if c.ratio is None else f'{c.ratio:.2f}'})" for c in failing)
        return what, max((c.ratio for c in failing if c.ratio is not None), default=None)
    return "the sheet does not run with it: " + outcome.errors[0].split("\n")[0].split(": error: ", 1)[-1], None


def build_sizing(sheet_path: Path, name: str, family: str, out_dir: Path, formats: list[str], *, jobs: int = 1,
                 cluster: str | None = None, paper: str | None = None, overrides: dict | None = None,
                 out=print) -> int:
    from . import Progress, executor, load_sheet
    from .output import write_member

    sheet = load_sheet(sheet_path)
    if sheet.errors:
        print(sheet.errors, file=sys.stderr)
        return 1
    if name not in sheet.inputs:
        raise ScheduleError("--size", f"{name!r} is not an input of the sheet")
    if name not in sheet.text_inputs:
        raise ScheduleError("--size", f"{name!r} must be a text input holding a designation, e.g. "
                                      f"{name} = \"W18X50\" used as section.rolled(designation={name})")
    sections = family_sections(family)
    base = {k: v for k, v in (overrides or {}).items() if k != name}
    bar = Progress(len(sections), f"sizing {name} from {family}")

    def items():
        for i, (desig, _, _) in enumerate(sections):
            cells = tuple((k, t, "--set") for k, t in base.items()) + ((name, _quoted(desig), "--size"),)
            yield Task(index=i, sheet=sheet.path, source=sheet.source, member=f"c{i}", cells=cells, formats=(),
                       paper=paper, label=f"{name} = {desig}", where="--size")

    chosen = None
    previous = None
    tried = 0
    gen = executor(jobs, cluster, False, lambda m: None)(items())
    try:
        for o in gen:
            tried += 1
            bar.step()
            if o.ok and o.checks and all(c.ok for c in o.checks):
                chosen = (o, previous)
                break
            previous = o
    finally:
        gen.close()  # stops the workers: the rest of the family is not needed
        bar.close()
    if chosen is None:
        print(f"calcsheet: no {family} section satisfies every check of {sheet_path} "
              f"({len(sections)} tried; the heaviest, {sections[-1][0]}, "
              + ("fails " + ", ".join(c.label for c in previous.checks if not c.ok) if previous and previous.ok
                 else "cannot be used: " + (previous.errors[0].split(chr(10))[0] if previous else "")) + ")",
              file=sys.stderr)
        return 1
    found, lighter_o = chosen
    pick = sections[found.index]
    lighter = sections[found.index - 1] if found.index > 0 else None
    page = selection_page(name, family, pick[2], pick, lighter, lighter_o, found, tried, len(sections))
    cells = tuple((k, t, "--set") for k, t in base.items()) + ((name, _quoted(pick[0]), "--size"),)
    overrides_all = {k: t for k, t, _ in cells}
    stem = sheet_path.stem
    info = {"input": name, "family": family, "chosen": {"designation": pick[0], "mass_kg_per_m": pick[1]},
            "next_lighter": None, "tried": tried, "sections_in_family": len(sections), "source": pick[2]}
    if lighter is not None:
        info["next_lighter"] = {
            "designation": lighter[0], "mass_kg_per_m": lighter[1],
            "fails": [{"check": c.label, "utilisation": c.ratio} for c in lighter_o.checks if not c.ok]
            if lighter_o.ok else [],
            "error": None if lighter_o.ok else lighter_o.errors[0].split("\n")[0]}
    task = Task(index=0, sheet=sheet.path, source=sheet.source, member=stem, cells=cells, formats=tuple(formats),
                paper=paper, content_hash=content_hash(sheet.fingerprint, stem, overrides_all, paper),
                label=f"{name} = {pick[0]}", where="--size", subject_suffix=f"{name} = {pick[0]}",
                extra_front=page, extra_json=(("sizing", info),))
    result = build_task(task)
    if not result.ok:
        for e in result.errors:
            print(e, file=sys.stderr)
        return 1
    out_dir.mkdir(parents=True, exist_ok=True)
    written = write_member(out_dir, result)
    json.dumps(info, allow_nan=False)
    tail = ""
    if lighter is not None:
        fails = info["next_lighter"]["fails"]
        tail = (f"; the next lighter, {lighter[0]} ({lighter[1]:.1f} kg/m), fails "
                + (", ".join(f"{f['check']} ({f['utilisation']:.2f})" if f["utilisation"] is not None
                             else f["check"] for f in fails) if fails else "to run: " + str(info["next_lighter"]["error"])))
    out(f"{sheet_path}: {name} = {pick[0]} ({pick[1]:.1f} kg/m), the lightest {family} section with every check OK"
        f"{tail} -> " + ", ".join(str(p) for p in written))
    return 0
