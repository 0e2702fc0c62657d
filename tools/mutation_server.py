"""A forking test runner for tools/mutation.py: pay the third-party imports once, not once per mutant.

Started by mutation.py inside the scratch copy's environment. It imports the heavy libraries the tests use
(numpy, pint, scipy, sympy, hypothesis, pytest …) but nothing of the project, then reads one request per line
on stdin — ``{"args": [pytest arguments], "timeout": seconds}`` — and for each forks a child that runs
``pytest.main(args)`` in a fresh copy of this process. The child imports the project's modules from disk, so
it sees the mutant mutation.py has just written; nothing the child does reaches the next one. The answer, one
line of JSON on stdout: ``{"status": "passed" | "failed" | "timeout", "seconds": …, "output": "…"}``.
"""
from __future__ import annotations

import importlib
import json
import os
import signal
import sys
import tempfile
import time

PRELOAD = ("numpy", "scipy", "scipy.linalg", "sympy", "pint", "lark", "markupsafe", "hypothesis", "pytest",
           "_pytest.python", "Pynite")


def _preload() -> None:
    for name in PRELOAD:
        try:
            importlib.import_module(name)
        except Exception:  # an optional library: the child imports it itself if a test needs it
            pass
    for name in list(sys.modules):  # the project must come from disk in each child, never from here
        if name.split(".")[0] in ("calcsheet", "calcsheet_plugins"):
            del sys.modules[name]


def _child(args: list[str], out_path: str) -> None:
    os.setsid()
    fd = os.open(out_path, os.O_WRONLY | os.O_CREAT | os.O_TRUNC, 0o600)
    os.dup2(fd, 1)
    os.dup2(fd, 2)
    code = 3
    try:
        import pytest

        code = int(pytest.main(args))
    finally:
        sys.stdout.flush()
        sys.stderr.flush()
        os._exit(code)


_running: list[int] = []  # the child now running, killed with its group if this server is stopped


def _stop(*_):
    for pid in _running:
        try:
            os.killpg(pid, signal.SIGKILL)
        except ProcessLookupError:
            pass
    os._exit(143)


def run(args: list[str], timeout: float) -> dict:
    fd, out_path = tempfile.mkstemp(prefix="mutation-run-", suffix=".txt")
    os.close(fd)
    t0 = time.monotonic()
    pid = os.fork()
    if pid == 0:  # pragma: no cover - the child
        _child(args, out_path)
    _running[:] = [pid]
    status = None
    while time.monotonic() - t0 < timeout:
        done, code = os.waitpid(pid, os.WNOHANG)
        if done:
            status = "passed" if os.waitstatus_to_exitcode(code) == 0 else "failed"
            break
        time.sleep(0.05)
    if status is None:
        try:
            os.killpg(pid, signal.SIGKILL)
        except ProcessLookupError:
            pass
        os.waitpid(pid, 0)
        status = "timeout"
    _running.clear()
    seconds = time.monotonic() - t0
    with open(out_path, encoding="utf-8", errors="replace") as fh:
        output = fh.read()
    os.unlink(out_path)
    return {"status": status, "seconds": seconds, "output": output[-20000:]}


def main() -> None:
    signal.signal(signal.SIGTERM, _stop)
    signal.signal(signal.SIGPIPE, signal.SIG_DFL)
    _preload()
    print(json.dumps({"ready": True}), flush=True)
    for line in sys.stdin:
        if not line.strip():
            continue
        req = json.loads(line)
        print(json.dumps(run(req["args"], float(req["timeout"]))), flush=True)


if __name__ == "__main__":
    main()
