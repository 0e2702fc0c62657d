"""Schedules on every core and on a cluster, and a long schedule in flat memory.

1. 200 rows of the boardwalk joist sheet, HTML+JSON: ``-j 2`` against ``-j 1`` in the same run
   (goal ≥ 1.8× on two free cores). ``--pdf N`` adds the same with PDFs for N rows. Beside it, in CPU
   seconds (which a busy machine disturbs far less than wall time): the calling process's CPU per row under
   ``-j 2`` (goal ≤ 2 ms) and the CPU of the calling process and its workers under ``-j 2`` against ``-j 1``'s
   for the same rows (goal ≤ 1.05×: the pool adds no work of its own, such as worker start-up).
2. The same rows on a Dask LocalCluster of two worker processes against the process pool
   (goal: cluster time ≤ 1.2× pool time, i.e. per-row overhead within 20 %; the cluster is
   started before timing, as an existing scheduler would be).
3. A schedule of 1,000 and of 10,000 rows, JSON only, each in a fresh process on two workers: peak RSS of
   the building process (goal: flat — the 10,000-row peak within 1.25× the 1,000-row peak) and the
   wall time (goal: a few minutes, ≤ 300 s for 10,000 rows).

Run from the repo root: ``.venv/bin/python benchmarks/bench_schedule.py [--rows 200] [--large 10000]
[--pdf 0] [--repeat 3] [--skip-cluster] [--only-memory]``. The machine may be shared: the load average is printed beside the figures.
"""
from __future__ import annotations

import argparse
import os
import resource
import shutil
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

from timing import paired, report

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
    return measured_build(table, out, formats, jobs, cluster)[0]


def measured_build(table: Path, out: Path, formats, jobs=1, cluster=None) -> tuple[float, float, float]:
    """(wall seconds, CPU seconds of this process, CPU seconds of its finished child processes)."""
    from calcsheet.schedule import build_schedule

    shutil.rmtree(out, ignore_errors=True)
    c0 = resource.getrusage(resource.RUSAGE_CHILDREN)
    p0 = time.process_time()
    t = time.perf_counter()
    status, summary = build_schedule(SHEET, table, out, formats, jobs=jobs, cluster=cluster, force=True,
                                     progress=False, out=lambda m: None)
    elapsed = time.perf_counter() - t
    own = time.process_time() - p0
    c1 = resource.getrusage(resource.RUSAGE_CHILDREN)
    assert status == 0 and summary.built == summary.members, (status, summary)
    return elapsed, own, (c1.ru_utime + c1.ru_stime) - (c0.ru_utime + c0.ru_stime)


def load() -> str:
    try:
        return "load average " + " ".join(f"{x:.1f}" for x in os.getloadavg()) + f" on {os.cpu_count()} cores"
    except OSError:
        return ""


def verdict(ok: bool) -> str:
    return "PASS" if ok else "MISS"


def bench_pool(tmp: Path, rows: int, formats, label: str, repeat: int) -> tuple[bool, float]:
    """-j 2 against -j 1, alternating which runs first (timing.paired), both warm."""
    table = make_table(tmp / f"t{rows}.csv", rows)
    warm = make_table(tmp / "warm.csv", 4)
    print(f"{rows} schedule rows, {label} ({load()} before)")
    timed_build(warm, tmp / "warm", formats, jobs=1)  # imports, plugins and the grammar, as a running tool has
    cpu = {}
    runs: dict[int, list] = {1: [], 2: []}

    def run(jobs):
        def go():
            cpu[jobs] = measured_build(table, tmp / f"j{jobs}", formats, jobs=jobs)
            runs[jobs].append(cpu[jobs])
        return go

    pool, serial = paired(run(2), run(1), repeat=repeat, warm=False)
    speed = serial / pool
    same = _tree(tmp / "j1") == _tree(tmp / "j2")
    print(f"  -j 1  {serial:8.2f} s   {serial / rows * 1000:7.1f} ms/row (median of {repeat})")
    print(f"  -j 2  {pool:8.2f} s   {pool / rows * 1000:7.1f} ms/row   outputs identical: {same}")
    _, own, children = cpu[2]
    ok = report(f"schedule -j 2 vs -j 1 speed-up, {rows} rows {label}", speed, 1.8, better="higher",
                note=f"{load()} after; outputs identical: {same}")
    # the calling process's share of the work under -j 2 (reading rows, the schedule package, round trips)
    report(f"schedule -j 2 calling process CPU per row, {label}", own / rows * 1000, 2.0, unit=" ms",
           note=f"workers {children / rows * 1000:.1f} ms/row")
    # the work the pool adds: CPU of the calling process and its workers under -j 2 against the CPU of -j 1
    # doing the same rows (worker start-up, round trips); CPU seconds, so it holds on a busy machine too
    total = statistics.median(o + c for _, o, c in runs[2]) / statistics.median(o + c for _, o, c in runs[1])
    report(f"schedule -j 2 CPU (calling process + workers) ÷ -j 1 CPU, {rows} rows {label}", total, 1.05,
           note=f"medians of {repeat}; {load()}")
    return ok and same, pool


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
    print(f"  Dask LocalCluster (2 worker processes) {t:8.2f} s   {t / rows * 1000:7.1f} ms/row")
    return report(f"Dask LocalCluster vs process pool time, {rows} rows HTML+JSON", ratio, 1.2,
                  note=f"{load()}; outputs identical: {same}") and same


CHILD = """
import resource, sys, time
from pathlib import Path
sys.path.insert(0, {bench!r})
from calcsheet.schedule import build_schedule
t = time.perf_counter()
status, s = build_schedule(Path({sheet!r}), Path({table!r}), Path({out!r}), {formats!r}, jobs={jobs}, force=True,
                           progress=False, out=lambda m: None)
assert status == 0 and s.built == s.members == {rows}, (status, s)
me, kids = resource.getrusage(resource.RUSAGE_SELF), resource.getrusage(resource.RUSAGE_CHILDREN)
print(me.ru_maxrss, kids.ru_maxrss, me.ru_utime + me.ru_stime, kids.ru_utime + kids.ru_stime, time.perf_counter() - t)
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
        main_kib, child_kib, own_cpu, workers_cpu, secs = res.stdout.split()[-5:]
        peaks.append(int(main_kib))
        print(f"  {n:>6,} rows: peak RSS {int(main_kib) / 1024:7.1f} MiB (building process), "
              f"{int(child_kib) / 1024:7.1f} MiB (largest worker); {float(secs):7.1f} s "
              f"({float(secs) / n * 1000:.1f} ms/row; {load()})")
        # CPU per row does not depend on how busy the machine is: what the wall time would be on free cores
        report(f"schedule of {n:,} rows ({'+'.join(formats)}): CPU per row, building process + workers",
               (float(own_cpu) + float(workers_cpu)) / n * 1000, 30.0, unit=" ms",
               note=f"building process {float(own_cpu) / n * 1000:.2f} ms/row")
        report(f"schedule of {n:,} rows ({'+'.join(formats)}, -j {jobs}): wall time", float(secs),
               300.0 if n >= 10_000 else 30.0, unit=" s", note=load())
        shutil.rmtree(out, ignore_errors=True)
    ratio = peaks[-1] / peaks[0]
    return report(f"peak RSS of the building process, {sizes[-1]:,} rows / {sizes[0]:,} rows", ratio, 1.25,
                  note=f"{peaks[0] / 1024:.0f} MiB and {peaks[-1] / 1024:.0f} MiB: flat in the number of rows")


def main() -> int:
    ap = argparse.ArgumentParser()
    ap.add_argument("--rows", type=int, default=200)
    ap.add_argument("--repeat", type=int, default=3, help="timed runs of each of -j 1 and -j 2 (median)")
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
            ok, pool_time = bench_pool(tmp, args.rows, ["html", "json"], "HTML+JSON", args.repeat)
            results.append(ok)
        if not args.skip_cluster and not args.only_memory:
            results.append(bench_cluster(tmp, args.rows, pool_time))
        if args.pdf and not args.only_memory:
            results.append(bench_pool(tmp, args.pdf, ["html", "pdf", "json"], "HTML+PDF+JSON", args.repeat)[0])
        if not args.skip_memory:
            sizes = sorted({max(1, args.large // 10), args.large})
            results.append(bench_memory(tmp, sizes, args.large_formats.split(","), 2))
    print("schedule benchmarks:", " ".join(verdict(r) for r in results))
    return 0


if __name__ == "__main__":
    sys.exit(main())
