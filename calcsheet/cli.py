"""The ``calcsheet`` command: build, check, diff, watch, plugins.

Exit status: 0 done; 1 a sheet has errors; 2 usage error (including an argument or file
that cannot be read); 3 checks NG under --fail-on-ng (or warnings under --strict for
``check``); 4 an internal error (a bug in calcsheet: never a Python traceback).
"""
from __future__ import annotations

import argparse
import sys
from pathlib import Path

EXIT_OK, EXIT_ERRORS, EXIT_USAGE, EXIT_NG, EXIT_INTERNAL = 0, 1, 2, 3, 4
MAX_SET_TEXT = 1_000  # characters of one override value
MAX_SET_NAMES = 10_000
FORMATS = ("html", "pdf", "json")


class _Parser(argparse.ArgumentParser):
    def error(self, message):  # usage errors exit 2 with a short message
        self.print_usage(sys.stderr)
        print(f"calcsheet: error: {message}", file=sys.stderr)
        raise SystemExit(EXIT_USAGE)


def _parser() -> argparse.ArgumentParser:
    p = _Parser(prog="calcsheet", description="Checkable engineering calculation sheets.")
    p.add_argument("--version", action="store_true", help="print the version")
    sub = p.add_subparsers(dest="command")

    b = sub.add_parser("build", help="evaluate sheets and write their packages")
    b.add_argument("sheets", nargs="+", type=Path)
    b.add_argument("-o", "--out", type=Path, default=Path("out"), help="output folder (default: out)")
    b.add_argument("--format", default="html,pdf", help="comma-separated: html,pdf,json (default html,pdf)")
    b.add_argument("--set", dest="overrides", action="append", default=[], metavar="NAME=QUANTITY",
                   help="replace an input value for this build, e.g. --set L=7.5m")
    b.add_argument("--set-file", dest="set_files", action="append", default=[], type=Path, metavar="FILE",
                   help="a TOML table of overrides (NAME = \"QUANTITY\"); --set wins over it")
    b.add_argument("--since", metavar="OLD",
                   help="put a 'changes since' page at the front and mark changed values: a git revision "
                        "(the same sheet at REV), REV:path, an older sheet file or a saved JSON result")
    b.add_argument("--fail-on-ng", action="store_true", help="exit 3 when any check is NG")
    b.add_argument("--paper", choices=["A4", "Letter"], help="paper size (default: front matter, else A4)")
    b.add_argument("--schedule", type=Path, metavar="TABLE",
                   help="run the sheet once per row of a .csv/.toml table (columns: inputs, and 'member')")
    b.add_argument("--sweep", metavar="NAME=START:STOP:STEP",
                   help="run the sheet over one input (or NAME=v1,v2,…) and chart each check's utilisation")
    b.add_argument("-j", "--jobs", type=int, metavar="N", help="worker processes (default: the number of cores)")
    b.add_argument("--cluster", metavar="tcp://HOST:PORT", help="send rows to a Dask scheduler (extra 'cluster')")
    b.add_argument("--force", action="store_true", help="rebuild members whose content hash has not changed")
    b.add_argument("--size", metavar="NAME", help="pick the lightest catalogue section with every check OK for "
                                                  "the text input NAME (with --from FAMILY)")
    b.add_argument("--from", dest="family", metavar="FAMILY", help="catalogue family for --size (W, IPE, HEA…)")

    c = sub.add_parser("check", help="parse, resolve and dimension-check sheets without rendering")
    c.add_argument("sheets", nargs="+", type=Path)
    c.add_argument("--format", choices=["human", "json", "line"], default="human")
    c.add_argument("--strict", action="store_true", help="warnings fail the check (exit 3)")

    d = sub.add_parser("diff", help="what changed between two revisions of a sheet")
    d.add_argument("old", help="sheet file, REV:path (read with git) or saved JSON result")
    d.add_argument("new", help="sheet file, REV:path (read with git) or saved JSON result")
    d.add_argument("--format", choices=["text", "json"], default="text")

    w = sub.add_parser("watch", help="rebuild the HTML package on every save and serve it on 127.0.0.1")
    w.add_argument("sheet", type=Path)
    w.add_argument("--port", type=int, default=8321, help="port on 127.0.0.1 (default 8321; 0 picks a free one)")
    w.add_argument("-o", "--out", type=Path, default=Path("out"), help="output folder (default: out)")
    w.add_argument("--set", dest="overrides", action="append", default=[], metavar="NAME=QUANTITY")
    w.add_argument("--set-file", dest="set_files", action="append", default=[], type=Path, metavar="FILE")
    w.add_argument("--paper", choices=["A4", "Letter"])

    sub.add_parser("plugins", help="list plugin functions with their parameters and result fields")
    return p


def _located(path, exc) -> ValueError:
    """A usage error at ``path:line:col`` from a located ``CalcError``."""
    span = exc.span
    hint = f"\n  hint: {exc.hint}" if getattr(exc, "hint", None) else ""
    return ValueError(f"{path}:{span.line}:{span.col}: {exc.message}{hint}")


def read_set_file(path: Path) -> dict[str, str]:
    """A TOML table of overrides: ``L = "7.5 m"``; a bare number is a dimensionless value.

    Read with a size cap, decoded strictly, parsed, then checked by shape: every error names the file,
    line and column (line 1 column 1 when the fault is the whole file)."""
    import re
    import tomllib

    from . import reading
    from .errors import CalcError

    try:
        text = reading.read_text(path, "SET_FILE_BYTES", "--set-file")
    except CalcError as exc:
        raise _located(path, exc) from None
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        m = re.search(r"\(at line (\d+), column (\d+)\)", str(exc))
        line, col = (int(m.group(1)), int(m.group(2))) if m else (1, 1)
        what = re.sub(r"\s*\(at .*\)$", "", str(exc))
        raise ValueError(f"{path}:{line}:{col}: --set-file is not valid TOML: {what}") from None
    except RecursionError:
        raise ValueError(f"{path}:1:1: --set-file is nested too deeply to read; overrides are a flat table "
                         "of NAME = \"QUANTITY\"") from None
    if len(data) > MAX_SET_NAMES:
        raise ValueError(f"{path}:1:1: --set-file sets {len(data):,} names; at most {MAX_SET_NAMES:,}")
    lines = text.split("\n")
    out = {}
    for name, value in data.items():
        line = next((i for i, t in enumerate(lines, 1) if t.lstrip().startswith(str(name))), 1)
        where = f"{path}:{line}:1"
        if isinstance(value, bool) or not isinstance(value, (str, int, float)):
            raise ValueError(f"{where}: --set-file: {name[:80]} must be a quantity written as a string "
                             f"(e.g. {name[:80]} = \"7.5 m\") or a number")
        text_value = str(value).strip()
        if not text_value:
            raise ValueError(f"{where}: --set-file: {name[:80]} is empty")
        if len(text_value) > MAX_SET_TEXT:
            raise ValueError(f"{where}: --set-file: {name[:80]} is longer than {MAX_SET_TEXT} characters")
        out[str(name)] = text_value
    return out


def gather_overrides(args) -> dict[str, str]:
    """--set-file tables in order, then --set (the command line wins)."""
    out: dict[str, str] = {}
    for path in getattr(args, "set_files", []):
        out.update(read_set_file(path))
    out.update(parse_sets(args.overrides))
    return out


def parse_sets(items: list[str]) -> dict[str, str]:
    out = {}
    for item in items:
        name, sep, value = item.partition("=")
        if not sep or not name.strip() or not value.strip():
            raise ValueError(f"--set expects NAME=QUANTITY, got {item[:80]!r}")
        if len(value) > MAX_SET_TEXT or len(name) > MAX_SET_TEXT or "\x00" in item:
            raise ValueError(f"--set {name[:40]}=…: at most {MAX_SET_TEXT} characters and no NUL")
        out[name.strip()] = value.strip()
    return out


def main(argv: list[str] | None = None) -> int:
    """The command. A bug is reported as an internal error (exit 4), never as a Python traceback;
    ``CALCSHEET_DEBUG=1`` lets the traceback through for a developer."""
    import os

    try:
        return _main(argv)
    except KeyboardInterrupt:
        print("calcsheet: interrupted", file=sys.stderr)
        return 130
    except SystemExit:
        raise
    except BaseException as exc:  # noqa: BLE001 -- the last line of defence, by design
        if os.environ.get("CALCSHEET_DEBUG"):
            raise
        text = str(exc)
        text = text if len(text) <= 300 else text[:300] + "…"
        print(f"calcsheet: internal error: {type(exc).__name__}: {text}\n"
              "This is a bug in calcsheet, not a problem with your input. Please report it with the command "
              "you ran and the files it read (CALCSHEET_DEBUG=1 shows the traceback).", file=sys.stderr)
        return EXIT_INTERNAL


def _main(argv: list[str] | None = None) -> int:
    args = _parser().parse_args(argv)
    if args.version:
        from . import __version__

        print(f"calcsheet {__version__}")
        return EXIT_OK
    if args.command == "build":
        return cmd_build(args)
    if args.command == "check":
        return cmd_check(args)
    if args.command == "diff":
        return cmd_diff(args)
    if args.command == "watch":
        return cmd_watch(args)
    if args.command == "plugins":
        return cmd_plugins()
    _parser().print_help()
    return EXIT_USAGE


def _usage(message: str) -> int:
    """A usage error: one line on stderr, exit status 2."""
    print(f"calcsheet: error: {message}", file=sys.stderr)
    return EXIT_USAGE


def _missing(paths) -> list[Path]:
    from .reading import is_file

    return [p for p in paths if not is_file(p)]


def cmd_build(args) -> int:
    formats = [f.strip().lower() for f in args.format.split(",") if f.strip()]
    bad = [f for f in formats if f not in FORMATS]
    if bad or not formats:
        return _usage(f"unknown format(s) {', '.join(bad) or '(none)'}; choose from html, pdf, json")
    try:
        overrides = gather_overrides(args)
    except ValueError as exc:
        return _usage(str(exc))
    missing = _missing(args.sheets)
    if missing:
        return _usage(f"no such sheet: {str(missing[0])[:200]!r}")
    if args.schedule or args.sweep or args.size or args.family or (len(args.sheets) > 1 and args.jobs != 1 and not args.since):
        from .schedule import cli_build  # schedules, sweeps, and several sheets on every core

        return cli_build(args, formats, overrides)
    from .engine import run
    from .package import PackageTooLarge, write_package

    status = EXIT_OK
    many = len(args.sheets) > 1
    for i, sheet in enumerate(args.sheets, 1):
        if many:
            print(f"[{i}/{len(args.sheets)}] {sheet}", file=sys.stderr)
        result = run(sheet, overrides=overrides)
        if result.diagnostics:
            print(result.format_diagnostics(), file=sys.stderr)
        if not result.ok:
            print(f"{sheet}: not built ({len(result.errors)} error(s)); previous package left as it was",
                  file=sys.stderr)
            status = EXIT_ERRORS
            continue
        for name, (old, new) in result.overrides.items():
            print(f"{sheet}: {name} set to {_shown(new)} (sheet: {_shown(old)})", file=sys.stderr)
        doc_options = {}
        if args.since:
            try:
                doc_options = since_options(args.since, sheet, result, many)
            except ValueError as exc:
                return _usage(str(exc))
        try:
            written = write_package(result, args.out, formats, paper=args.paper, **doc_options)
        except (OSError, PackageTooLarge) as exc:
            print(f"{sheet}:1:1: error: cannot write the package: {exc}; previous package left as it was",
                  file=sys.stderr)
            status = EXIT_ERRORS
            continue
        n_ng = sum(1 for c in result.checks if not c.ok)
        verdict = f"{len(result.checks)} checks, {n_ng} NG" if result.checks else "no checks"
        print(f"{sheet}: {verdict} -> " + ", ".join(str(p) for p in written))
        if n_ng and args.fail_on_ng and status == EXIT_OK:
            status = EXIT_NG
    return status


def cmd_check(args) -> int:
    """Parse, resolve and dimension-check each sheet without evaluating; report every finding at once."""
    missing = _missing(args.sheets)
    if missing:
        return _usage(f"no such sheet: {str(missing[0])[:200]!r}")
    from .render import check as R
    from .engine import run

    status = EXIT_OK
    all_json = []
    for sheet in args.sheets:
        try:
            result = run(sheet, evaluate=False)
        except (OSError, UnicodeDecodeError) as exc:
            print(f"calcsheet: error: cannot read {sheet}: {exc}", file=sys.stderr)
            status = EXIT_ERRORS
            continue
        active, suppressed = R.split(result.diagnostics)
        if args.format == "json":
            all_json.append(R.to_json(str(sheet), active, suppressed))
        elif args.format == "line":
            for d in active:
                print(d.one_line())
        else:
            for d in active:
                print(R.human(d, result.source_for(d)))
            print(R.summary(str(sheet), active, suppressed))
        code = R.exit_status(active, args.strict)
        if code == EXIT_ERRORS or (code == EXIT_NG and status == EXIT_OK):
            status = code
    if args.format == "json":
        import json  # strict, as render.json.dumps (check imports no printer but its own)

        print(json.dumps(all_json if len(all_json) != 1 else all_json[0], indent=2, ensure_ascii=False,
                         allow_nan=False))
    return status


def cmd_plugins() -> int:
    from .plugin import PluginDefinitionError, default_registry
    from . import units as U

    try:
        return _list_plugins(default_registry(), PluginDefinitionError, U)
    except BrokenPipeError:  # `calcsheet plugins | head` closed the pipe: end quietly, as Unix tools do
        import os

        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
        return EXIT_OK


def _list_plugins(reg, PluginDefinitionError, U) -> int:
    status = EXIT_OK
    for ns_name in reg.names():
        try:
            ns = reg.namespace(ns_name)
        except PluginDefinitionError as exc:
            print(f"{ns_name}: cannot load: {exc}")
            status = EXIT_ERRORS
            continue
        print(f"{ns.name} {ns.version} — {ns.doc}".rstrip(" —"))
        for pf in ns.functions.values():
            summary = pf.doc.splitlines()[0] if pf.doc else ""
            print(f"  {pf.qualname}(…)  {summary}")
            for p in pf.params:
                print(f"      {p.name:<10} {p.describe()}" + (f" — {p.doc}" if p.doc else ""))
            if pf.fields:
                fields = ", ".join(f.name + (f" [{U.describe_dim(f.dimension)}]" if f.dim else "")
                                   for f in pf.fields)
                print(f"      → {fields}")
    sys.stdout.flush()  # a closed pipe is found here, not at exit
    return status


def _shown(value) -> str:
    from .diff import show_quantity

    import pint

    return show_quantity(value) if isinstance(value, pint.Quantity) else str(value)


def since_options(since: str, sheet: Path, result, many: bool) -> dict:
    """PackageDocument options for ``build --since``: the changes page and the changed names."""
    from .diff import DiffSourceError, diff_snapshots, load_side, snapshot_of_result
    from .render.diff import changes_page

    from .errors import CalcError
    from .reading import check_path_text

    try:
        check_path_text(since, "--since")
    except CalcError as exc:
        raise ValueError(exc.message) from None
    spec = since
    if not Path(since).exists() and ":" not in since:
        spec = f"{since}:{sheet.as_posix()}"  # a bare revision: the same sheet at that revision
    elif many:
        raise ValueError("--since with several sheets takes a git revision (each sheet is compared with itself)")
    try:
        old = load_side(spec)
    except DiffSourceError as exc:
        raise ValueError(f"--since: {exc}") from None
    d = diff_snapshots(old, snapshot_of_result(result, str(sheet)))
    return {"extra_front": changes_page(d), "changed": d.changed_names}


def cmd_diff(args) -> int:
    from .diff import DiffSourceError, diff_specs
    from .render import diff as printers

    try:
        d = diff_specs(args.old, args.new)
    except DiffSourceError as exc:
        return _usage(str(exc))
    if args.format == "json":
        print(printers.dumps(printers.to_json(d)))
    else:
        print(printers.text(d))
    return EXIT_ERRORS if d.new.errors else EXIT_OK


def cmd_watch(args) -> int:
    from .reading import is_file

    if not is_file(args.sheet):
        return _usage(f"no such sheet: {str(args.sheet)[:200]!r}")
    if not 0 <= args.port <= 65535:
        return _usage(f"--port {args.port} is not a port number")
    try:
        overrides = gather_overrides(args)
    except ValueError as exc:
        return _usage(str(exc))
    from .watch import Watcher

    try:
        watcher = Watcher(args.sheet, args.out, args.port, paper=args.paper, overrides=overrides,
                          log=lambda m: print(m, flush=True))
    except OSError as exc:
        return _usage(f"cannot listen on 127.0.0.1:{args.port}: {exc.strerror or exc}")
    watcher.serve()
    return EXIT_OK
