"""Run one CLI command in-process on fuzzed input and classify what happened.

A case is a *crash* if the command raised, printed a Python traceback or reported an internal error
(exit 4); a *hang* if it spent more than its budget of CPU time; *stalled* if it made almost no progress
(it used next to no CPU) for a long stretch of wall time, i.e. it waits on something that never comes;
otherwise it is *clean* (exit 0/3) or a *located error*: every line that reports an error names file:line:col.

The budget is CPU time (ITIMER_PROF: user + system time of this process), not wall time: on a loaded
machine a case waits for a core without spending its budget, so load alone cannot make a case a hang.
The limit interrupts the command with ``Hang``; the CLI's last line of defence catches even that and
reports an internal error (exit 4), so the harness records that its own limit fired and classifies the
case by that record, never by the exit status: a limit reached is a hang, never a crash.
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

# CPU seconds a case may spend (a generated sheet costs well under a second)
CASE_SECONDS = float(os.environ.get("CALCSHEET_FUZZ_CASE_SECONDS", "20"))
# the wall-time watchdog: every STALL_SECONDS it looks at the CPU time spent since its last look; a case
# that spent less than STALL_CPU_SHARE of that stretch is waiting, not computing (even at load 15 on two
# cores a runnable process gets more than a tenth of a core)
STALL_SECONDS = float(os.environ.get("CALCSHEET_FUZZ_STALL_SECONDS", "60"))
STALL_CPU_SHARE = 0.01
COUNTS: Counter = Counter()  # cases, located, clean, crashes, hangs, stalled, unlocated -- whole session
SLOWEST: list[float] = [0.0]  # the most CPU seconds one case took this session: the budget's margin

# a line that reports an error: "...: error: ..." or "...: error <code>: ..." (check --format line)
ERROR_LINE = re.compile(r"(^|: )error( [a-z-]+)?: ")
LOCATED = re.compile(r"^(calcsheet: error: )?[^\n]*?:\d+:\d+: ")


class Hang(BaseException):
    """Raised by a limit inside the command (a BaseException; the CLI's catch-all may still swallow it,
    which is why the limit's own record, not the exception, decides the classification)."""


@dataclass
class Outcome:
    kind: str  # "clean" | "located" | "crash" | "hang" | "stalled" | "unlocated"
    status: int | None
    text: str

    def __str__(self):
        return f"{self.kind} (exit {self.status}):\n{self.text[-3000:]}"


def _cpu() -> float:
    t = os.times()
    return t.user + t.system


class _Limits:
    """The CPU budget (SIGPROF) and the stall watchdog (SIGALRM) of one case; ``fired`` says which one
    interrupted it (None: neither)."""

    def __init__(self):
        self.fired: str | None = None
        self._last = _cpu()

    def _budget(self, signum, frame):
        self.fired = "hang"
        raise Hang()

    def _watchdog(self, signum, frame):
        now = _cpu()
        spent, self._last = now - self._last, now
        if spent < STALL_CPU_SHARE * STALL_SECONDS:
            self.fired = "stalled"
            raise Hang()

    @contextlib.contextmanager
    def armed(self):
        old_prof = signal.signal(signal.SIGPROF, self._budget)
        old_alrm = signal.signal(signal.SIGALRM, self._watchdog)
        # once spent, the budget fires again every CPU second: a command that swallows one Hang gets another
        signal.setitimer(signal.ITIMER_PROF, CASE_SECONDS, 1.0)
        signal.setitimer(signal.ITIMER_REAL, STALL_SECONDS, STALL_SECONDS)
        try:
            yield self
        finally:
            signal.setitimer(signal.ITIMER_PROF, 0)
            signal.setitimer(signal.ITIMER_REAL, 0)
            signal.signal(signal.SIGPROF, old_prof)
            signal.signal(signal.SIGALRM, old_alrm)


def unlocated_lines(text: str) -> list[str]:
    return [line for line in text.splitlines() if ERROR_LINE.search(line) and not LOCATED.match(line)]


def run_cli(argv: list[str]) -> Outcome:
    out, err = io.StringIO(), io.StringIO()
    status = None
    limits = _Limits()
    cpu0 = _cpu()
    try:
        with limits.armed(), contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
            status = main([str(a) for a in argv])
        kind = None
    except Hang:
        kind = None  # classified below, by which limit fired
    except SystemExit as exc:  # argparse usage errors
        status = exc.code if isinstance(exc.code, int) else 2
        kind = None
    except BaseException as exc:  # noqa: BLE001 -- what the fuzzer is looking for
        import traceback

        kind = "crash"
        err.write("".join(traceback.format_exception(exc)))
    SLOWEST[0] = max(SLOWEST[0], _cpu() - cpu0)
    text = out.getvalue() + err.getvalue()
    if limits.fired:  # first: the CLI reports a Hang it caught as an internal error, which it is not
        kind = limits.fired
        why = (f"spent its CPU budget of {CASE_SECONDS:g} s" if kind == "hang"
               else f"used under {STALL_CPU_SHARE:.0%} of a core for {STALL_SECONDS:g} s of wall time")
        text += f"\n[fuzz harness: the case {why}]"
    elif kind is None:
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
    """The fuzzer's oracle: no crash, no hang, no stall, every error located."""
    assert outcome.kind in ("clean", "located"), str(outcome)
