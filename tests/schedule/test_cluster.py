"""--cluster: rows on a Dask LocalCluster of two workers on loopback give the same outputs as a serial run;
a worker that dies has its row run again, and the run says so."""
import functools
import os
import sys
from pathlib import Path

import pytest

distributed = pytest.importorskip("distributed")

from calcsheet.cli import main  # noqa: E402
from calcsheet.schedule import build_schedule  # noqa: E402
from calcsheet.schedule.work import build_task  # noqa: E402

from .conftest import tree  # noqa: E402

MEMBERS = "member,L,w\n" + "".join(f"C-{i},{2 + i * 0.5} m,{1 + i % 3} kN/m\n" for i in range(1, 6)) + \
    "C-bad,3 kN,1 kN/m\n"


@pytest.fixture(scope="module")
def cluster():
    """Two worker processes on 127.0.0.1 (processes, so a worker can really die and be restarted)."""
    with distributed.LocalCluster(n_workers=2, threads_per_worker=1, processes=True, host="127.0.0.1",
                                  dashboard_address=None, death_timeout=60) as c:
        yield c


def test_cluster_outputs_equal_the_serial_run(beam, table, tmp_path, cluster):
    t = table(MEMBERS)
    assert main(["build", str(beam), "--schedule", str(t), "-o", str(tmp_path / "serial"), "--format",
                 "html,json", "-j", "1"]) == 1
    assert main(["build", str(beam), "--schedule", str(t), "-o", str(tmp_path / "dask"), "--format",
                 "html,json", "--cluster", cluster.scheduler_address]) == 1
    serial, dask = tree(tmp_path / "serial"), tree(tmp_path / "dask")
    assert list(serial) == list(dask) and [k for k in serial if serial[k] != dask[k]] == []
    assert "C-3.html" in dask and "C-bad.json" not in dask


def _die_once(task, marker):
    """Kill the worker process the first time it runs member C-2 (test only)."""
    if task.member == "C-2" and not os.path.exists(marker):
        open(marker, "w").close()
        os._exit(3)
    return build_task(task)


def test_a_worker_that_dies_has_its_row_run_again_and_reported(beam, table, tmp_path, cluster, capsys):
    import cloudpickle

    cloudpickle.register_pickle_by_value(sys.modules[__name__])  # the workers cannot import this test module
    try:
        from calcsheet.schedule import cluster as C

        t = table(MEMBERS)
        marker = tmp_path / "died"
        task_fn = functools.partial(_die_once, marker=str(marker))
        with distributed.Client(cluster.scheduler_address) as client:
            status, summary = build_schedule(
                beam, t, tmp_path / "dask", ["html", "json"], progress=False,
                runner=lambda log: lambda items: C.run_cluster(items, client=client, task_fn=task_fn, log=log))
        assert marker.exists()
        err = capsys.readouterr().err
        assert f"{t}:3: row 2 (C-2): its worker died; the scheduler ran the row again (1 time(s))" in err
        assert status == 1 and summary.built == 5 and summary.errors == 1  # only the bad row failed
        main(["build", str(beam), "--schedule", str(t), "-o", str(tmp_path / "serial"), "--format", "html,json",
              "-j", "1"])
        assert tree(tmp_path / "serial") == tree(tmp_path / "dask")
    finally:
        cloudpickle.unregister_pickle_by_value(sys.modules[__name__])


def test_an_unreachable_scheduler_is_a_clear_error(beam, table, tmp_path, capsys):
    import socket

    with socket.socket() as s:  # a port nobody listens on
        s.bind(("127.0.0.1", 0))
        port = s.getsockname()[1]
    from calcsheet.schedule import cluster as C

    saved = C.CONNECT_TIMEOUT
    C.CONNECT_TIMEOUT = "2s"
    try:
        assert main(["build", str(beam), "--schedule", str(table(MEMBERS)), "-o", str(tmp_path / "o"),
                     "--format", "json", "--cluster", f"tcp://127.0.0.1:{port}"]) == 1
    finally:
        C.CONNECT_TIMEOUT = saved
    assert f"--cluster: error: cannot reach the scheduler at tcp://127.0.0.1:{port}" in capsys.readouterr().err
