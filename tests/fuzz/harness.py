"""Run one CLI command in-process on fuzzed input and classify what happened.

A case is a *crash* if the command raised, printed a Python traceback or reported an internal error
(exit 4); a *hang* if it ran past the per-case limit (a real-time signal alarm interrupts it); otherwise
it is *clean* (exit 0/3) or a *located error*: every line that reports an error names file:line:col.
"""
from __future__ import annotations

import contextlib
import io
import os
import re
import signal
from collections import Counter
from dataclasses import dataclass

from calcsheet.cli import EXIT_INTERNAL, main

CASE_SECONDS = float(os.environ.get("CALCSHEET_FUZZ_CASE_SECONDS", "20"))
COUNTS: Counter = Counter()  # cases, located, clean, crashes, hangs, unlocated -- over the whole session

# a line that reports an error: "...: error: ..." or "...: error <code>: ..." (check --format line)
ERROR_LINE = re.compile(r"(^|: )error( [a-z-]+)?: ")
LOCATED = re.compile(r"^(calcsheet: error: )?[^\n]*?:\d+:\d+: ")


class Hang(BaseException):
    """Raised by the alarm inside the command (a BaseException: the command must not swallow it)."""


@dataclass
class Outcome:
    kind: str  # "clean" | "located" | "crash" | "hang" | "unlocated"
    status: int | None
    text: str

    def __str__(self):
        return f"{self.kind} (exit {self.status}):\n{self.text[-3000:]}"


def _alarm(signum, frame):
    raise Hang()


def unlocated_lines(text: str) -> list[str]:
    return [line for line in text.splitlines() if ERROR_LINE.search(line) and not LOCATED.match(line)]


def run_cli(argv: list[str]) -> Outcome:
    out, err = io.StringIO(), io.StringIO()
    old = signal.signal(signal.SIGALRM, _alarm)
    signal.setitimer(signal.ITIMER_REAL, CASE_SECONDS)
    status = None
    try:
        with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
            status = main([str(a) for a in argv])
        kind = None
    except Hang:
        kind = "hang"
    except SystemExit as exc:  # argparse usage errors
        status = exc.code if isinstance(exc.code, int) else 2
        kind = None
    except BaseException as exc:  # noqa: BLE001 -- what the fuzzer is looking for
        import traceback

        kind = "crash"
        err.write("".join(traceback.format_exception(exc)))
    finally:
        signal.setitimer(signal.ITIMER_REAL, 0)
        signal.signal(signal.SIGALRM, old)
    text = out.getvalue() + err.getvalue()
    if kind is None:
        if status == EXIT_INTERNAL or "Traceback (most recent call last)" in text:
            kind = "crash"
        elif unlocated_lines(text):
            kind = "unlocated"
        elif status in (0, 3):
            kind = "clean"
        else:
            kind = "located"
    COUNTS["cases"] += 1
    COUNTS[kind] += 1
    return Outcome(kind, status, text)


def expect_sound(outcome: Outcome) -> None:
    """The fuzzer's oracle: no crash, no hang, every error located."""
    assert outcome.kind in ("clean", "located"), str(outcome)
