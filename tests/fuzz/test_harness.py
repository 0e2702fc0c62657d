"""The fuzz harness's own specification: how it classifies a case.

A limit reached is a hang (or a stall), never a crash, even though the CLI's last line of defence turns the
harness's interrupt into an internal error (exit 4); and the limit is CPU time, so a case that only waits
(as every case does on a loaded machine) is not a hang.
"""
from __future__ import annotations

import time

import pytest

import calcsheet.cli as cli

from . import harness


@pytest.fixture(autouse=True)
def _uncounted():
    """These planted cases are not fuzz cases: the session's counts (printed in CI logs) leave them out."""
    before, slowest = harness.COUNTS.copy(), harness.SLOWEST[0]
    yield
    harness.COUNTS.clear()
    harness.COUNTS.update(before)
    harness.SLOWEST[0] = slowest


def _spin(argv=None):
    while True:  # a command that computes forever
        pass


def test_a_command_past_its_cpu_budget_is_a_hang_not_a_crash(monkeypatch):
    monkeypatch.setattr(harness, "CASE_SECONDS", 0.2)
    monkeypatch.setattr(cli, "_main", _spin)
    outcome = harness.run_cli(["check", "x.calc"])
    # the CLI caught the interrupt and reported an internal error; the harness knows it was its own limit
    assert outcome.status == cli.EXIT_INTERNAL
    assert outcome.kind == "hang"
    assert "CPU budget" in outcome.text


def test_a_command_that_swallows_the_interrupt_is_interrupted_again(monkeypatch):
    def stubborn(argv=None):
        for _ in range(3):
            try:
                _spin()
            except harness.Hang:
                pass
        return 0

    monkeypatch.setattr(harness, "CASE_SECONDS", 0.1)
    monkeypatch.setattr(cli, "_main", stubborn)
    assert harness.run_cli(["check", "x.calc"]).kind == "hang"


def test_wall_time_spent_waiting_is_not_spent_budget(monkeypatch):
    # what load does to a case: it waits for a core; here it waits 4 × its CPU budget and is clean
    def slow_but_cheap(argv=None):
        time.sleep(0.8)
        return 0

    monkeypatch.setattr(harness, "CASE_SECONDS", 0.2)
    monkeypatch.setattr(cli, "_main", slow_but_cheap)
    outcome = harness.run_cli(["check", "x.calc"])
    assert (outcome.kind, outcome.status) == ("clean", 0)


def test_a_command_that_waits_on_nothing_for_a_long_stretch_is_stalled(monkeypatch):
    def blocked(argv=None):
        time.sleep(30)
        return 0

    monkeypatch.setattr(harness, "STALL_SECONDS", 0.3)
    monkeypatch.setattr(cli, "_main", blocked)
    t0 = time.monotonic()
    outcome = harness.run_cli(["check", "x.calc"])
    assert outcome.kind == "stalled"
    assert time.monotonic() - t0 < 10


def test_a_real_internal_error_is_still_a_crash(monkeypatch):
    def broken(argv=None):
        raise ZeroDivisionError("a bug")

    monkeypatch.setattr(cli, "_main", broken)
    outcome = harness.run_cli(["check", "x.calc"])
    assert (outcome.kind, outcome.status) == ("crash", cli.EXIT_INTERNAL)
    with pytest.raises(AssertionError):
        harness.expect_sound(outcome)


def test_the_limits_are_disarmed_after_a_case(monkeypatch):
    import signal

    monkeypatch.setattr(cli, "_main", lambda argv=None: 0)
    harness.run_cli(["check", "x.calc"])
    assert signal.getitimer(signal.ITIMER_PROF) == (0.0, 0.0)
    assert signal.getitimer(signal.ITIMER_REAL) == (0.0, 0.0)
