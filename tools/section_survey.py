"""Survey: every catalogue row's geometric model against its table row, per family and property.

    .venv/bin/python tools/section_survey.py [FAMILY ...] [--rows]

For each family: how many rows exceed the package's tolerance (1 %; 2 % for J, C_w and r_o) on each property,
and the spread of the deviation (model − table)/table. ``--rows`` lists every row over tolerance. The models
are the package's own (functions._model_shape); C_w and the shear centre are evaluated from the same steps the
working traces. A development tool, not part of the package.
"""
from __future__ import annotations

import math
import sys
from collections import defaultdict

import numpy as np

from calcsheet_plugins.section import catalogue as C
from calcsheet_plugins.section import functions as F
from calcsheet_plugins.section.properties import properties
from calcsheet_plugins.section.warping import Given

TOL = {name: tol for name, _, tol in F.COMPARED}


class _Work:
    def __init__(self):
        self.scope = {}


def _eval(formula, scope):
    return eval(formula.replace("^", "**"), {"sqrt": math.sqrt, "max": max, "min": min, "pi": math.pi}, scope)


def model_values(entry) -> dict[str, float]:
    g = entry.dims
    shape = F._model_shape(_Work(), entry, g, lambda *a, **k: None, [])
    v = properties(shape)
    scope = {k: val for k, val in g.items() if isinstance(val, float)} | dict(v)
    for st in shape.warping:
        scope[st.name] = st.value if isinstance(st, Given) else _eval(st.formula, scope)
    v["C_w"] = scope.get("C_w", float("nan"))
    if "x_s" in scope:
        v["r_o"] = math.sqrt((scope["x_s"] - v["x_c"]) ** 2 + (scope["y_s"] - v["y_c"]) ** 2
                             + (v["I_x"] + v["I_y"]) / v["A"])
    return v


def survey(families, show_rows=False):
    table = C.entries()
    by_family = defaultdict(list)
    for e in table.values():
        if e.family in families:
            by_family[e.family].append(e)
    for fam in families:
        rows = by_family.get(fam, [])
        if not rows:
            continue
        devs = defaultdict(list)
        over = defaultdict(list)
        for e in rows:
            mv = model_values(e)
            for name, tol in TOL.items():
                tv = e.values.get(name)
                if not tv or name not in mv or not math.isfinite(mv[name]):
                    continue
                d = (mv[name] - tv) / tv
                devs[name].append(d)
                if abs(d) > tol:
                    over[name].append((e.designation, d))
        warned = {d for lst in over.values() for d, _ in lst}
        print(f"{fam}: {len(rows)} rows, {len(warned)} with a warning")
        for name in TOL:
            if name not in devs:
                continue
            a = np.array(devs[name])
            print(f"  {name:4s} over {TOL[name]:.0%}: {len(over[name]):3d}   min {a.min():+7.2%}  median "
                  f"{np.median(a):+7.2%}  max {a.max():+7.2%}")
            if show_rows and over[name]:
                print("       " + ", ".join(f"{d} {x:+.1%}" for d, x in over[name]))


if __name__ == "__main__":
    args = [a for a in sys.argv[1:] if not a.startswith("--")]
    survey([a.upper() for a in args] or ["W", "M", "S", "HP", "C", "MC", "WT", "MT", "ST", "L", "2L", "HSS",
                                        "HSS_R", "PIPE", "IPE", "HEA", "HEB", "HEM", "RHS", "SHS", "CHS"],
           "--rows" in sys.argv)
