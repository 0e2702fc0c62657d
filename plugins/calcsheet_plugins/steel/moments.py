"""The moments of an unbraced segment read from a solved beam (beam.solve): M_max and the quarter-point moments
M_A, M_B, M_C, for AISC 360-16 Eq. F1-1 (C_b) and the equivalent-moment C_1 of EN 1993-1-1 6.3.2.

M_max is the largest |M| over the segment, found exactly from the solution's piecewise polynomials (their ends
and the roots of their derivatives inside the segment); the quarter points are evaluated on the same
polynomials. Each value is traced with where it was read.
"""
from __future__ import annotations

import numpy as np

from .common import units


def segment_max(M, pieces, a: float, b: float) -> tuple[float, float]:
    """(largest |M|, where) over a ≤ x ≤ b, exactly from the pieces' polynomials."""
    starts, lengths, coeffs = pieces
    best, where = -1.0, a
    tol = 1e-12 * max(b - a, 1e-9)
    for s, h, C in zip(starts, lengths, coeffs):
        lo, hi = max(a, s), min(b, s + h)
        if hi < lo - tol:
            continue
        ts = [lo - s, hi - s]
        dC = np.array([k * C[k] for k in range(1, len(C))])
        if np.any(dC != 0):
            for r in np.atleast_1d(np.roots(dC[::-1])):
                if abs(r.imag) <= 1e-9 * max(h, 1.0) and lo - s - tol <= r.real <= hi - s + tol:
                    ts.append(float(r.real))
        for t in ts:
            v = abs(float(np.polyval(C[::-1], t)))
            if v > best:
                best, where = v, s + t
    for x in (a, b):  # the diagram's own value at the ends (a couple applied at an end)
        v = abs(M(x))
        if v > best:
            best, where = v, x
    return best, where


def from_beam(work, beam, combo, start, end, unit):
    """Trace M_max, M_A, M_B, M_C of the segment [start, end] of ``beam`` (default: the whole beam) in ``unit``."""
    from calcsheet_plugins.beam.query import moment_diagram  # the beam plugin's accessor (read-only)

    M, L, name, pieces = moment_diagram(work, beam, combo)
    a = 0.0 if start is None else float(start.m_as("m"))
    b = L if end is None else float(end.m_as("m"))
    if not (0 <= a < b <= L * (1 + 1e-9)):
        work.fail(f"the unbraced segment must lie on the beam with its start before its end (0 ≤ x_start < x_end ≤ "
                  f"{L:g} m); got {a:g} m to {b:g} m", param="x_start" if start is not None else "x_end")
    b = min(b, L)
    lu = units(work)["L"]
    at = lambda x: f"{work.q(x, 'm').m_as(lu):.4g} {lu}"  # noqa: E731
    m_max, x_max = segment_max(M, pieces, a, b)
    if m_max <= 0:
        work.fail(f"the moment of combination {name!r} is zero over the segment {a:g}–{b:g} m: nothing to take "
                  f"C_b from", param="beam")
    q = lambda v: work.q(v, "N*m").to(unit)  # noqa: E731
    src = f"beam.solve, combination {name}, segment x = {at(a)} to {at(b)}"
    work.let("M_max", q(m_max), unit=unit, desc="largest |M| in the unbraced segment",
             note=f"{src}: exact, from the piecewise polynomials, at x = {at(x_max)}")
    for nm, frac, where in (("M_A", 0.25, "quarter point"), ("M_B", 0.5, "centreline"),
                            ("M_C", 0.75, "three-quarter point")):
        x = a + frac * (b - a)
        work.let(nm, q(abs(M(x))), unit=unit, desc=f"|M| at the {where} of the segment", note=f"{src}, at x = {at(x)}")
    return name


def segment_sign(work, beam, combo, start, end) -> float:
    """+1 if the moment where |M| is largest over the segment is sagging, −1 if hogging (the beam's convention)."""
    from calcsheet_plugins.beam.query import moment_diagram

    M, L, _name, pieces = moment_diagram(work, beam, combo)
    a = 0.0 if start is None else float(start.m_as("m"))
    b = L if end is None else min(float(end.m_as("m")), L)
    _m, x = segment_max(M, pieces, a, b)
    return 1.0 if M(x) >= 0 else -1.0
