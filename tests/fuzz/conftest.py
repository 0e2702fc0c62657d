"""Print the fuzzer's counts at the end of every run that included it (CI logs keep them)."""
from __future__ import annotations


def pytest_terminal_summary(terminalreporter):
    from .harness import CASE_SECONDS, COUNTS, SLOWEST

    if COUNTS["cases"]:
        terminalreporter.write_line(
            f"calcsheet fuzz: {COUNTS['cases']} cases, {COUNTS['clean']} clean, {COUNTS['located']} located "
            f"errors, {COUNTS['crash']} crashes, {COUNTS['hang']} hangs, {COUNTS['stalled']} stalled, "
            f"{COUNTS['unlocated']} unlocated; slowest case {SLOWEST[0]:.2f} s of CPU (budget {CASE_SECONDS:g} s)")
