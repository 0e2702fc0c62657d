"""A list of 10⁵ spans through a ten-line calculation ÷ the same calculation written directly in numpy + pint.

The sheet's list is one pint quantity over a numpy array, so every line is one vectorised operation; a loop
over scalar quantities would be thousands of times slower (docs: PITFALLS, "Speed"). The sheet is run whole
(parse, resolve, check, evaluate, trace, the check's table of the elements with the highest utilisation),
with the 10⁵ spans given as an override of its list input. Goal: ≤ 3× the plain numpy + pint code.

Run from the repository root: ``python benchmarks/bench_lists.py``.
"""
from __future__ import annotations

import sys
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parent))

from timing import paired, report  # noqa: E402

import calcsheet  # noqa: E402
from calcsheet import units as U  # noqa: E402

N_SPANS = 100_000

SHEET = """\
L = [3.6 m, 4.2 m]
w = 5 kN/m
E = 200 GPa
I = 8000 cm^4
M [kN*m] = w*L^2/8
V [kN] = w*L/2
delta [mm] = 5*w*L^4/(384*E*I)
sigma [MPa] = M*150 mm/I
u = sigma/(275 MPa)
r = sqrt(u^2 + (V/(500 kN))^2)
check delta <= L/250
"""


def main() -> None:
    reg = U.registry()
    rng = np.random.default_rng(7)
    spans = reg.Quantity(rng.uniform(2.0, 8.0, N_SPANS), "m")

    def ours():
        r = calcsheet.run(SHEET, overrides={"L": spans})
        assert r.ok, r.format_diagnostics()
        return r

    w, E, I = reg.Quantity(5, "kN/m"), reg.Quantity(200, "GPa"), reg.Quantity(8000, "cm^4")
    c, sy, vr = reg.Quantity(150, "mm"), reg.Quantity(275, "MPa"), reg.Quantity(500, "kN")

    def baseline():
        L = spans
        M = (w * L**2 / 8).to("kN*m")
        V = (w * L / 2).to("kN")
        delta = (5 * w * L**4 / (384 * E * I)).to("mm")
        sigma = (M * c / I).to("MPa")
        u = (sigma / sy).to("")
        r = np.sqrt(u**2 + (V / vr).to("") ** 2)
        limit = (L / 250).to("mm")
        ok = bool(np.all(delta.magnitude <= limit.magnitude))
        return r, ok

    # the two compute the same numbers (the sheet is not timed doing less)
    res = ours()
    r_base, ok_base = baseline()
    np.testing.assert_allclose(res.values["r"].m_as(""), r_base.m_as(""), rtol=1e-12)
    assert res.checks[0].ok == ok_base

    t_ours, t_base = paired(ours, baseline, repeat=5)
    print(f"bench_lists: {N_SPANS:,} spans, ten lines: sheet {t_ours * 1e3:.1f} ms, numpy+pint {t_base * 1e3:.1f} ms")
    report("list of 1e5 through ten lines / numpy+pint", t_ours / t_base, 3.0,
           note=f"sheet {t_ours * 1e3:.0f} ms, baseline {t_base * 1e3:.0f} ms")


if __name__ == "__main__":
    main()
