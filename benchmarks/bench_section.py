"""Benchmark: section properties of large polygons, against shapely's area + centroid in the same run.

For star-shaped polygons of 10³, 10⁵ and 10⁶ vertices we time our vectorised
Green's-theorem integration (area, centroid, I_x, I_y, I_xy in one pass)
against shapely (GEOS) computing only area and centroid of the same polygon,
already built, both timed by ``timing.paired``. Reported: the ratio at 10⁶ vertices (goal ≤ 1.5×) and
the growth exponent 10⁵ → 10⁶ (goal ≤ 1.1). Also: the exact plastic axis and Z (O(n log n)), and a
sheet with a 20-part built-up section against the same sheet without the built_up call (goal ≤ 2×).

Run: /work/main/.venv/bin/python benchmarks/bench_section.py
"""
from __future__ import annotations

import math

import numpy as np
import shapely

from calcsheet_plugins.section import builtup as B
from calcsheet_plugins.section import polygon as P
from calcsheet_plugins.section import properties as PR
from calcsheet_plugins.section import shapes as S
from timing import paired, report


def star(n: int, seed: int = 7) -> np.ndarray:
    rng = np.random.default_rng(seed)
    ang = np.sort(rng.uniform(0, 2 * math.pi, n))
    r = rng.uniform(50.0, 100.0, n)
    return np.column_stack([r * np.cos(ang) + 300.0, r * np.sin(ang) - 120.0])


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
    print("polygon properties: ours (A, centroid, I_x, I_y, I_xy) vs shapely (area + centroid), same polygon")
    times = {}
    for n in (10**3, 10**5, 10**6):
        pts = star(n)
        x, y = pts[:, 0].copy(), pts[:, 1].copy()
        g = shapely.Polygon(pts)
        shapely.prepare(g)
        mine, geos = P.polygon_properties(x, y), (g.area, g.centroid)
        assert abs(mine.A - geos[0]) <= 1e-9 * geos[0] and abs(mine.x_c - geos[1].x) <= 1e-9 * abs(geos[1].x)
        repeat = 30 if n <= 10**5 else 9
        ours, theirs = paired(lambda: P.polygon_properties(x, y), lambda: (shapely.area(g), shapely.centroid(g)),
                              repeat=repeat)
        times[n] = ours
        z = ""
        if n <= 10**5:  # O(n log n) and slow at 10⁶: timed up to 10⁵ only
            ring = [P.make_ring(pts)]
            z = paired(lambda: P.plastic_modulus(ring), lambda: None, repeat=3 if n >= 10**5 else 10)[0]
            z = f", exact plastic Z {z * 1e3:.2f} ms"
        print(f"    {n:>9,} vertices: ours {ours * 1e3:.3f} ms, shapely {theirs * 1e3:.3f} ms{z}")
        if n == 10**6:
            report("polygon properties ÷ shapely area + centroid, 10⁶ vertices", ours / theirs, 1.5,
                   note=f"{ours * 1e3:.1f} ms vs {theirs * 1e3:.1f} ms")
    exponent = math.log(times[10**6] / times[10**5]) / math.log(10)
    report("growth exponent of polygon properties, 10⁵ → 10⁶ vertices", exponent, 1.1, unit="")

    parts = twenty_parts()
    t = paired(lambda: PR.properties(B.assemble(parts).shape), lambda: None, repeat=5)[0]
    print(f"    20-part built-up section (10 plates, 10 holes): assembly checks + all properties {t * 1e3:.1f} ms")
    with_bu, without = twenty_part_sheet()
    import calcsheet

    t_with, t_without = paired(lambda: calcsheet.run(with_bu), lambda: calcsheet.run(without), repeat=3)
    # goal set here: the built_up call should cost at most the rest of such a sheet's run again
    report("sheet with a 20-part built-up section ÷ the same sheet without the built_up call", t_with / t_without,
           2.0, note=f"{t_with * 1e3:.0f} ms vs {t_without * 1e3:.0f} ms")


if __name__ == "__main__":
    main()
