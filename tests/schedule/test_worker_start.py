"""How a pool worker starts: a forked worker inherits what the calling process made ready and does nothing
more before its first row; a fresh interpreter (spawned, or a cluster worker) makes everything ready itself,
every plugin included. Each case runs in a fresh interpreter, so no earlier test's imports count."""
import json
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]
BOARDWALK = ROOT / "sheets" / "boardwalk_joist.calc"

PROBE = """
import json, sys
from pathlib import Path
from calcsheet.plugin import default_registry
from calcsheet.schedule import work
{before}
work.init_worker(False, forked={forked})
print(json.dumps({{"loaded": sorted(default_registry()._loaded), "beam": "calcsheet_plugins.beam" in sys.modules,
                   "ready": work._WORKER_READY}}))
"""


def probe(forked: bool, before: str = "") -> dict:
    res = subprocess.run([sys.executable, "-c", PROBE.format(forked=forked, before=before)], capture_output=True,
                         text=True, cwd=ROOT, timeout=120)
    assert res.returncode == 0, res.stderr
    return json.loads(res.stdout.strip().splitlines()[-1])


def test_a_fresh_worker_loads_every_plugin_before_its_first_row():
    got = probe(forked=False)
    assert got["ready"] and got["beam"] and {"beam", "section"} <= set(got["loaded"])


def test_a_forked_worker_starts_with_what_its_parent_has_and_loads_nothing_more():
    # the parent checked the sheet (which loads the plugins it calls: section and timber_design) and prepared
    got = probe(forked=True, before=f"from calcsheet.schedule import load_sheet\nload_sheet(Path({str(BOARDWALK)!r}))\n"
                                   "work.prepare(False)")
    assert got["ready"]
    assert "section" in got["loaded"] and not got["beam"] and "beam" not in got["loaded"]


@pytest.mark.skipif(not sys.platform.startswith("linux"), reason="forks the test process")
def test_a_forking_pool_prepares_the_calling_process_once_before_its_workers_start(monkeypatch):
    import multiprocessing as mp

    from calcsheet.schedule import runner

    calls = []
    monkeypatch.setattr(runner, "pool_context", lambda: mp.get_context("fork"))
    monkeypatch.setattr(runner, "prepare", lambda pdf: calls.append(pdf))
    assert list(runner.run_pool(iter(()), 2, pdf=True)) == []
    assert calls == [True]
