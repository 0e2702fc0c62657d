"""Benchmark: section properties of large polygons, against shapely's area + centroid in the same run.

For star-shaped polygons of 10³, 10⁵ and 10⁶ vertices we time our vectorised
Green's-theorem integration (area, centroid, I_x, I_y, I_xy in one pass)
against shapely (GEOS) computing only area and centroid of the same polygon,
already built. Reported: the ratio (goal ≤ 2×) and the growth: the cost per
vertex relative to the previous size (goal: linear, i.e. ≈ 1.0 at the large end). Also: the
exact plastic axis and Z (O(n log n)), and assembling a 20-part built-up
section with holes, which must cost nothing noticeable in a build.

Run: /work/main/.venv/bin/python benchmarks/bench_section.py
"""
from __future__ import annotations

import math
import time

import numpy as np
import shapely

from calcsheet_plugins.section import builtup as B
from calcsheet_plugins.section import polygon as P
from calcsheet_plugins.section import properties as PR
from calcsheet_plugins.section import shapes as S


def star(n: int, seed: int = 7) -> np.ndarray:
    rng = np.random.default_rng(seed)
    ang = np.sort(rng.uniform(0, 2 * math.pi, n))
    r = rng.uniform(50.0, 100.0, n)
    return np.column_stack([r * np.cos(ang) + 300.0, r * np.sin(ang) - 120.0])


def best_of(fn, repeat: int) -> float:
    best = math.inf
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        best = min(best, time.perf_counter() - t0)
    return best


def twenty_parts():
    parts = []
    for k in range(10):  # a stack of 10 plates with 10 bolt holes
        parts.append(B.Placed(f"plate {k}", "part", B.place(S.rectangle(300.0, 20.0), 0.0, 20.0 * k)))
        parts.append(B.Placed(f"hole {k}", "hole", B.place(S.rectangle(22.0, 20.0), 60.0, 20.0 * k + 10.0,
                                                            "centroid")))
    return parts


def twenty_part_sheet() -> tuple[str, str]:
    lines = ['pl = section.rectangle(b=300 mm, h=20 mm, detail="brief")',
             'ct = section.rectangle(b=22 mm, h=20 mm, detail="brief")']
    names = []
    for k in range(10):
        lines.append(f"p{k} = section.part(shape=pl, y={20 * k} mm)")
        lines.append(f"h{k} = section.hole(shape=ct, x=60 mm, y={20 * k + 10} mm)")
        names += [f"p{k}", f"h{k}"]
    base = "\n".join(lines) + "\n"
    return base + f"s = section.built_up(parts=[{', '.join(names)}])\n", base


def main() -> None:
    print("polygon properties: ours (A, centroid, I_x, I_y, I_xy) vs shapely (area + centroid)")
    print(f"{'vertices':>10} {'ours ms':>10} {'shapely ms':>11} {'ratio':>7} {'growth':>8} {'Z_x ms':>9}")
    print("  (growth: our time per vertex over that at the previous size; 1.0 is linear)")
    prev = None
    ratios = []
    for n in (10**3, 10**5, 10**6):
        pts = star(n)
        x, y = pts[:, 0].copy(), pts[:, 1].copy()
        g = shapely.Polygon(pts)
        shapely.prepare(g)
        repeat = 30 if n <= 10**5 else 7
        ours = best_of(lambda: P.polygon_properties(x, y), repeat)
        theirs = best_of(lambda: (shapely.area(g), shapely.centroid(g)), repeat)
        mine, geos = P.polygon_properties(x, y), (g.area, g.centroid)
        assert abs(mine.A - geos[0]) <= 1e-9 * geos[0] and abs(mine.x_c - geos[1].x) <= 1e-9 * abs(geos[1].x)
        ring = [P.make_ring(pts)]
        z = best_of(lambda: P.plastic_modulus(ring), 3 if n >= 10**5 else 10)
        growth = f"{(ours / n) / (prev[0] / prev[1]):8.2f}" if prev else "       -"
        ratios.append(ours / theirs)
        print(f"{n:>10} {ours * 1e3:>10.3f} {theirs * 1e3:>11.3f} {ours / theirs:>6.2f}× {growth} {z * 1e3:>9.2f}")
        prev = (ours, n)
    print(f"largest ratio {max(ratios):.2f}× (goal ≤ 2×)")

    parts = twenty_parts()
    t = best_of(lambda: PR.properties(B.assemble(parts).shape), 5)
    print(f"20-part built-up section (10 plates, 10 holes): assembly checks + all properties {t * 1e3:.1f} ms")
    with_bu, without = twenty_part_sheet()
    import calcsheet

    calcsheet.run(with_bu)
    t_with = best_of(lambda: calcsheet.run(with_bu), 3)
    t_without = best_of(lambda: calcsheet.run(without), 3)
    print(f"sheet with that built-up section, traced: {t_with * 1e3:.0f} ms; the same sheet with its shapes and "
          f"parts but no built_up call: {t_without * 1e3:.0f} ms")


if __name__ == "__main__":
    main()
