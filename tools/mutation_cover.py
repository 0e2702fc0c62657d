"""A pytest plugin for tools/mutation.py: which test runs which line of the mutated files.

Loaded with ``-p mutation_cover`` (tools/ on the path) for one run of a target's tests. It traces only the
files named in ``CALCSHEET_COVER_FILES`` (a JSON list of absolute paths) and writes, to
``CALCSHEET_COVER_OUT``, for each test (pytest node id) the lines of those files it ran, in three groups:

* ``tests``: lines run while the test ran (setup, call, teardown);
* ``setup``: lines run while setting a test up, per test *file* — a module- or session-scoped fixture runs
  once, in the first test's setup, yet every later test of the file uses what it made, so a mutant on such
  a line is given every test of that file;
* ``import``: lines of module and class bodies (imports, tables, decorators, default arguments), which run
  once whichever test loads the module first: a mutant there is given every test of the target.

A mutant on a line no test runs cannot change any test's outcome; mutation.py reports it uncovered
(survived) without running anything. Tracing is plain ``sys.settrace`` (and ``threading.settrace``), so
no coverage package is needed.
"""
from __future__ import annotations

import inspect
import json
import os
import sys
import threading
import time

import pytest

_FILES: dict[str, str] = {}  # absolute path -> path as given
_IMPORT: set = set()
_TESTS: dict[str, set] = {}
_SETUP: dict[str, set] = {}
_SECONDS: dict[str, float] = {}
_ORDER: list[str] = []
_active: list[set] = []  # the sets a traced line goes into now


def _import_tracer(frame, event, arg):
    if event == "line":
        _IMPORT.add((_FILES[frame.f_code.co_filename], frame.f_lineno))
    return _import_tracer


def _test_tracer(frame, event, arg):
    if event == "line":
        key = (_FILES[frame.f_code.co_filename], frame.f_lineno)
        for s in _active:
            s.add(key)
    return _test_tracer


def _global(frame, event, arg):
    code = frame.f_code
    if code.co_filename not in _FILES:
        return None
    if not code.co_flags & inspect.CO_NEWLOCALS:  # a module or class body: runs once, at import
        return _import_tracer
    return _test_tracer


def _start() -> None:
    """Trace from the moment pytest loads this plugin (before any test module imports the target)."""
    for p in json.loads(os.environ.get("CALCSHEET_COVER_FILES", "[]")):
        rel = os.path.relpath(p, os.environ.get("CALCSHEET_COVER_ROOT", os.getcwd()))
        _FILES[os.path.realpath(p)] = rel
        _FILES[p] = rel
    threading.settrace(_global)
    sys.settrace(_global)


def pytest_configure(config):
    try:  # traced code is slower: no example may fail for its time
        from hypothesis import settings
        settings.register_profile("mutation-cover", deadline=None)
        settings.load_profile("mutation-cover")
    except ImportError:  # pragma: no cover
        pass


@pytest.hookimpl(hookwrapper=True)
def pytest_runtest_protocol(item, nextitem):
    lines = _TESTS.setdefault(item.nodeid, set())
    _ORDER.append(item.nodeid)
    _active[:] = [lines]
    t0 = time.monotonic()
    yield
    _SECONDS[item.nodeid] = time.monotonic() - t0
    _active[:] = []


@pytest.hookimpl(hookwrapper=True)
def pytest_runtest_setup(item):
    module = item.nodeid.split("::", 1)[0]
    _active.append(_SETUP.setdefault(module, set()))
    yield
    _active.pop()


def pytest_unconfigure(config):
    sys.settrace(None)
    threading.settrace(None)
    out = os.environ.get("CALCSHEET_COVER_OUT")
    if not out:
        return
    data = {"import": sorted(_IMPORT),
            "tests": {t: sorted(v) for t, v in _TESTS.items()},
            "setup": {m: sorted(v) for m, v in _SETUP.items()},
            "seconds": _SECONDS, "order": _ORDER}
    with open(out, "w", encoding="utf-8") as fh:
        json.dump(data, fh)


_start()
