"""Schedules on every core and on a cluster, and a long schedule in flat memory.

1. 200 rows of the boardwalk joist sheet, HTML+JSON: ``-j 2`` against ``-j 1`` in the same run
   (goal ≥ 1.8× on two free cores). ``--pdf N`` adds the same with PDFs for N rows.
2. The same rows on a Dask LocalCluster of two worker processes against the process pool
   (goal: cluster time ≤ 1.2× pool time, i.e. per-row overhead within 20 %; the cluster is
   started before timing, as an existing scheduler would be).
3. A schedule of 1,000 and of 10,000 rows without PDF, each in a fresh process: peak RSS of the
   building process (goal: flat — the 10,000-row peak within 1.25× the 1,000-row peak).

Run from the repo root: ``.venv/bin/python benchmarks/bench_schedule.py [--rows 200] [--large 10000]
[--pdf 0] [--skip-cluster]``. The machine may be shared: the load average is printed beside the figures.
"""
from __future__ import annotations

import argparse
import os
import shutil
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
SHEET = ROOT / "sheets" / "boardwalk_joist.calc"


def make_table(path: Path, n: int) -> Path:
    """Invented joists: spans, spacings and crowd loads varying row to row."""
    with path.open("w", encoding="utf-8") as fh:
        fh.write("member,L,s,q_k\n")
        for i in range(n):
            fh.write(f"J-{i + 1:05d},{3.0 + (i % 25) * 0.05:.2f} m,{0.35 + (i % 7) * 0.05:.2f} m,"
                     f"{3.0 + (i % 5) * 0.5} kPa\n")
    return path


def timed_build(table: Path, out: Path, formats, jobs=1, cluster=None) -> float:
    from calcsheet.schedule import build_schedule

    shutil.rmtree(out, ignore_errors=True)
    t = time.perf_counter()
    status, summary = build_schedule(SHEET, table, out, formats, jobs=jobs, cluster=cluster, force=True,
                                     progress=False, out=lambda m: None)
    elapsed = time.perf_counter() - t
    assert status == 0 and summary.built == summary.members, (status, summary)
    return elapsed


def load() -> str:
    try:
        return "load average " + " ".join(f"{x:.1f}" for x in os.getloadavg()) + f" on {os.cpu_count()} cores"
    except OSError:
        return ""


def verdict(ok: bool) -> str:
    return "PASS" if ok else "MISS"


def bench_pool(tmp: Path, rows: int, formats, label: str) -> tuple[bool, float]:
    table = make_table(tmp / f"t{rows}.csv", rows)
    print(f"{rows} schedule rows, {label} ({load()})")
    serial = timed_build(table, tmp / "j1", formats, jobs=1)
    pool = timed_build(table, tmp / "j2", formats, jobs=2)
    speed = serial / pool
    same = _tree(tmp / "j1") == _tree(tmp / "j2")
    print(f"  -j 1  {serial:8.2f} s   {serial / rows * 1000:7.1f} ms/row")
    print(f"  -j 2  {pool:8.2f} s   {pool / rows * 1000:7.1f} ms/row   speed-up {speed:.2f}x (goal >= 1.8x)  "
          f"{verdict(speed >= 1.8)}   outputs identical: {same}")
    return speed >= 1.8, pool


def _tree(folder: Path) -> dict:
    return {p.name: p.read_bytes() for p in folder.iterdir()}


def bench_cluster(tmp: Path, rows: int, pool_time: float) -> bool:
    try:
        from distributed import LocalCluster
    except ImportError:
        print("cluster: distributed is not installed (pip install 'calcsheet[cluster]'); skipped")
        return True
    table = tmp / f"t{rows}.csv"
    with LocalCluster(n_workers=2, threads_per_worker=1, processes=True, host="127.0.0.1",
                      dashboard_address=None) as cluster:
        timed_build(make_table(tmp / "warm.csv", 4), tmp / "warm", ["json"], cluster=cluster.scheduler_address)
        t = timed_build(table, tmp / "dask", ["html", "json"], cluster=cluster.scheduler_address)
    ratio = t / pool_time
    same = _tree(tmp / "j1") == _tree(tmp / "dask")
    print(f"  Dask LocalCluster (2 worker processes) {t:8.2f} s   {t / rows * 1000:7.1f} ms/row   "
          f"against the pool {ratio:.2f}x (goal <= 1.2x)  {verdict(ratio <= 1.2)}   outputs identical: {same}")
    return ratio <= 1.2


CHILD = """
import resource, sys, time
from pathlib import Path
sys.path.insert(0, {bench!r})
from calcsheet.schedule import build_schedule
t = time.perf_counter()
status, s = build_schedule(Path({sheet!r}), Path({table!r}), Path({out!r}), {formats!r}, jobs={jobs}, force=True,
                           progress=False, out=lambda m: None)
assert status == 0 and s.built == s.members == {rows}, (status, s)
print(resource.getrusage(resource.RUSAGE_SELF).ru_maxrss, resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss,
      time.perf_counter() - t)
"""


def bench_memory(tmp: Path, sizes, formats, jobs: int) -> bool:
    print(f"memory: schedules of {' and '.join(f'{n:,}' for n in sizes)} rows, {'+'.join(formats)}, -j {jobs} "
          f"({load()})")
    peaks = []
    for n in sizes:
        table = make_table(tmp / f"m{n}.csv", n)
        out = tmp / f"m{n}"
        code = CHILD.format(bench=str(ROOT / "benchmarks"), sheet=str(SHEET), table=str(table), out=str(out),
                            formats=list(formats), jobs=jobs, rows=n)
        res = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=ROOT)
        if res.returncode:
            print(res.stderr[-2000:])
            return False
        main_kib, child_kib, secs = res.stdout.split()[-3:]
        peaks.append(int(main_kib))
        print(f"  {n:>6,} rows: peak RSS {int(main_kib) / 1024:7.1f} MiB (building process), "
              f"{int(child_kib) / 1024:7.1f} MiB (largest worker); {float(secs):7.1f} s")
        shutil.rmtree(out, ignore_errors=True)
    ratio = peaks[-1] / peaks[0]
    print(f"  peak RSS ratio {ratio:.2f} (goal <= 1.25: flat in the number of rows)  {verdict(ratio <= 1.25)}")
    return ratio <= 1.25


def main() -> int:
    ap = argparse.ArgumentParser()
    ap.add_argument("--rows", type=int, default=200)
    ap.add_argument("--pdf", type=int, default=0, help="also time N rows with PDFs (0: skip)")
    ap.add_argument("--large", type=int, default=10000)
    ap.add_argument("--large-formats", default="json")
    ap.add_argument("--skip-cluster", action="store_true")
    ap.add_argument("--skip-memory", action="store_true")
    ap.add_argument("--only-memory", action="store_true")
    args = ap.parse_args()
    sys.path.insert(0, str(ROOT))
    results = []
    with tempfile.TemporaryDirectory() as d:
        tmp = Path(d)
        if not args.only_memory:
            ok, pool_time = bench_pool(tmp, args.rows, ["html", "json"], "HTML+JSON")
            results.append(ok)
        if not args.skip_cluster and not args.only_memory:
            results.append(bench_cluster(tmp, args.rows, pool_time))
        if args.pdf and not args.only_memory:
            results.append(bench_pool(tmp, args.pdf, ["html", "pdf", "json"], "HTML+PDF+JSON")[0])
        if not args.skip_memory:
            sizes = sorted({max(1, args.large // 10), args.large})
            results.append(bench_memory(tmp, sizes, args.large_formats.split(","), 2))
    print("schedule benchmarks:", " ".join(verdict(r) for r in results))
    return 0


if __name__ == "__main__":
    sys.exit(main())
