"""Derive the profile dimensions the AISC Shapes Database does not tabulate, from the table's own values.

    PYTHONPATH=plugins .venv/bin/python tools/derive_aisc_profiles.py > plugins/calcsheet_plugins/section/catalogue/aisc_v16_derived.csv

S and C shapes (inner flange faces at 2 in 12, t_f the mean thickness, at the middle of the outstand), MC shapes
(a sloped inner face whose slope varies by size and is not tabulated) and M shapes (parallel flanges): the root
radius r and (MC) the slope are the values for which the geometric model's A, I_x and I_y (and, for channels, the
centroid x̄ from the back of the web) best match the table's, in the least-squares sense of the relative
deviations; S, C and MC have toe radii of half the root radius (the proportion of the DIN 1026-1 UPN channels in
en_upn.csv, r2 = r1/2; # common practice for taper-flange shapes, not tabulated by AISC). With 3 or 4 table values
for 1 or 2 unknowns the fit is over-determined;
every other property (S, Z, r, J, C_w, r_o, and the ST and MT tees cut from these shapes, which take their parent's
radii) is an independent check. k_des alone gives a root radius up to twice these fits (for these shapes the
tabulated k is in sixteenths of an inch, a rounded figure) and sharp toes, which left A and I_x 1-7 % high.
"""
from __future__ import annotations

import sys

import numpy as np
from scipy.optimize import least_squares

from calcsheet_plugins.section import catalogue as C
from calcsheet_plugins.section import fillets as FL
from calcsheet_plugins.section.fillets import root_radius_from_k
from calcsheet_plugins.section.properties import tabular

IN = C.IN
SLOPE = C.AISC_FLANGE_SLOPE
TOE = C.AISC_TOE_RATIO  # toe radius / root radius (S, C, MC)


def _build(e, slope, r, r_toe):
    g = e.dims
    if e.family == "M":
        return FL.ishape(g["h"], g["b"], g["t_f"], g["t_w"], r)
    if e.family == "S":
        return FL.tapered_ishape(g["h"], g["b"], g["t_f"], g["t_w"], r, slope, r_toe)
    return FL.tapered_channel(g["h"], g["b"], g["t_f"], g["t_w"], r, slope, r_toe)


def derive(e):
    g, v = e.dims, e.values
    channel = e.family in ("C", "MC")
    o = (g["b"] - g["t_w"]) / (1 if channel else 2)
    x_bar = float(e.raw["x"]) * IN if channel else None
    targets = [("A", v["A"]), ("I_x", v["I_x"]), ("I_y", v["I_y"])] + ([("x_c", x_bar)] if channel else [])

    def unpack(p):  # the toe radius is half the root radius (see TOE)
        if e.family == "MC":
            return p[0], p[1], TOE * p[1]
        if e.family == "M":
            return 0.0, p[0], 0.0
        return SLOPE, p[0], TOE * p[0]

    def residuals(p):
        slope, r, rt = unpack(p)
        try:
            b = tabular(_build(e, slope, r, rt).rows)
        except Exception:  # a trial outside the shape's limits
            return np.full(len(targets), 1.0)
        return np.array([getattr(b, n) / t - 1 for n, t in targets])

    if e.family == "M":
        r_k = max(v["k"] - g["t_f"], 0.0)
    else:
        r_k = root_radius_from_k(v["k"], g["t_f"] + SLOPE * o / 2, SLOPE)
    if e.family == "MC":
        smax = min(1.9 * g["t_f"] / o, 0.4)
        lo, hi = [0.0, 0.0], [smax, 2 * r_k + 1]

        def r_for(slope):  # the best root radius at this slope (the toe radius r/2 must fit the toe)
            top = min(hi[1], 2 * 0.95 * (g["t_f"] - slope * o / 2))
            one = least_squares(lambda q: residuals([slope, q[0]]), [min(0.6 * r_k, 0.9 * top)], bounds=([0.0], [top]),
                                diff_step=1e-4)
            return one.x[0], one.cost

        grid = [(sl, *r_for(sl)) for sl in np.arange(0.0, smax, 0.02)]
        sl, rr, _ = min(grid, key=lambda t: t[2])  # a coarse search first: the fit has local minima
        starts = [[sl, rr]]
    else:
        starts, lo, hi = [[r_k], [0.5 * r_k]], [0.0], [2 * r_k + 1]
    best = None
    for start in starts:
        sol = least_squares(residuals, start, bounds=(lo, hi), x_scale=[max(h, 1e-3) for h in hi], xtol=1e-12,
                            ftol=1e-12, diff_step=1e-4)
        if best is None or sol.cost < best.cost:
            best = sol
    slope, r, rt = unpack(best.x)
    res = residuals(best.x)
    return slope, r, rt, r_k, res, [n for n, _ in targets]


def main(out=sys.stdout):
    print("# Profile dimensions the AISC Shapes Database v16.0 does not tabulate, derived from the table's own values",
          file=out)
    print("# by tools/derive_aisc_profiles.py (see its docstring): r (root radius), r_toe (toe radius) and, for MC, the",
          file=out)
    print("# slope of the inner flange faces, solved so that the geometric model's A, I_x, I_y (and x-bar of channels)",
          file=out)
    print("# match the table's best (least squares of the relative deviations). r_k: the root radius k_des alone",
          file=out)
    print("# implies. fit: the largest remaining deviation of the fitted values. Lengths in inches.", file=out)
    print("shape,slope,r,r_toe,r_k,fitted,fit", file=out)
    for e in C.entries().values():
        if e.family not in ("S", "C", "MC", "M"):
            continue
        slope, r, rt, r_k, res, names = derive(e)
        print(f"{e.raw['shape']},{slope:.5f},{r / IN:.5f},{rt / IN:.5f},{r_k / IN:.5f},{' '.join(names)},"
              f"{np.max(np.abs(res)):.5f}", file=out)


if __name__ == "__main__":
    main()
