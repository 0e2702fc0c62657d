"""Every section property, from a Shape's rows and its outline.

``tabular`` is the parallel-axis method over the rows (what the package
shows); ``green`` integrates the outline (the independent check). The rest —
principal axes, fibre distances, moduli, plastic and shear properties — are
computed from the outline, because they need the region itself, not only its
moments. All values in mm, mm², mm³, mm⁴, radians, kg/m.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from . import polygon as P


@dataclass(frozen=True)
class Basic:
    A: float
    x_c: float
    y_c: float
    I_x: float
    I_y: float
    I_xy: float

    def as_tuple(self):
        return (self.A, self.x_c, self.y_c, self.I_x, self.I_y, self.I_xy)


def tabular(rows) -> Basic:
    """Σ n·A, ΣA·x/ΣA, Σ(I_o + A·d²) over the parts-table rows (holes negative).

    Plain float sums: a parts table has a handful of rows, where building arrays would cost more than
    the arithmetic (a built-up section asks for many small tables while it checks its parts).
    """
    At = Sx = Sy = Io_x = Io_y = Io_xy = 0.0
    for r in rows:
        w = r.sign * r.n
        wA = w * r.A
        At += wA
        Sy += wA * r.x
        Sx += wA * r.y
        Io_x += w * r.Iox
        Io_y += w * r.Ioy
        Io_xy += w * r.Ioxy
    xc, yc = Sy / At, Sx / At
    Ix, Iy, Ixy = Io_x, Io_y, Io_xy
    for r in rows:
        wA = r.sign * r.n * r.A
        dx, dy = r.x - xc, r.y - yc
        Ix += wA * dy * dy
        Iy += wA * dx * dx
        Ixy += wA * dx * dy
    return Basic(float(At), float(xc), float(yc), float(Ix), float(Iy), float(Ixy))


def green(rings) -> Basic:
    c = P.centroidal(P.region_moments(rings))
    return Basic(c.A, c.x_c, c.y_c, c.I_x, c.I_y, c.I_xy)


def disagreement(a: Basic, b: Basic) -> dict[str, float]:
    """Relative differences, each against the section's own scale (so a zero I_xy compares fairly)."""
    size = max(abs(a.I_x) + abs(a.I_y), 1e-300)
    L = math.sqrt(max(a.A, 1e-300))
    return {
        "A": abs(a.A - b.A) / max(abs(a.A), 1e-300),
        "x_c": abs(a.x_c - b.x_c) / L,
        "y_c": abs(a.y_c - b.y_c) / L,
        "I_x": abs(a.I_x - b.I_x) / size,
        "I_y": abs(a.I_y - b.I_y) / size,
        "I_xy": abs(a.I_xy - b.I_xy) / size,
    }


def principal(I_x: float, I_y: float, I_xy: float, scale: float) -> tuple[float, float, float]:
    """(I_1, I_2, θ_p): θ_p anticlockwise from the x axis to the I_1 (major) axis, in radians."""
    mean = (I_x + I_y) / 2
    R = math.hypot((I_x - I_y) / 2, I_xy)
    if abs(I_xy) <= 1e-12 * scale:
        theta = 0.0 if I_x >= I_y else math.pi / 2
    else:
        theta = 0.5 * math.atan2(-2 * I_xy, I_x - I_y)
    return mean + R, mean - R, theta


def mass_per_length(rows) -> float:
    """kg/m from the rows' densities (kg/mm³) and actual areas (mm²)."""
    total = 0.0
    for r in rows:
        if r.rho:
            total += r.sign * r.rho * r.A
    return total * 1000.0


def properties(shape, x_ref: float | None = None, y_ref: float | None = None) -> dict[str, float]:
    """The standard field set as floats (see fields.STANDARD_FIELDS)."""
    b = tabular(shape.rows)
    rings = shape.rings
    solid = [r for r in rings if r.sign > 0]
    ys = np.concatenate([r.y for r in solid])
    xs = np.concatenate([r.x for r in solid])
    y_min, y_max, x_min, x_max = float(ys.min()), float(ys.max()), float(xs.min()), float(xs.max())
    I1, I2, th = principal(b.I_x, b.I_y, b.I_xy, abs(b.I_x) + abs(b.I_y))
    y_top, y_bot = y_max - b.y_c, b.y_c - y_min
    x_left, x_right = b.x_c - x_min, x_max - b.x_c
    Zx, y_p = P.plastic_modulus(rings)
    swapped = P._swap(rings)  # x and y exchanged: the y-axis properties as the x-axis ones of this (mirrored once)
    Zy, x_p = P.plastic_modulus(swapped)  # P.plastic_modulus_y
    out = dict(
        A=b.A, x_c=b.x_c, y_c=b.y_c, I_x=b.I_x, I_y=b.I_y, I_xy=b.I_xy, I_1=I1, I_2=I2, theta_p=th,
        y_top=y_top, y_bot=y_bot, x_left=x_left, x_right=x_right, y_min=y_min, y_max=y_max, x_min=x_min,
        x_max=x_max,
        S_x_top=b.I_x / y_top, S_x_bot=b.I_x / y_bot, S_y_left=b.I_y / x_left, S_y_right=b.I_y / x_right,
        Z_x=Zx, Z_y=Zy, y_p=y_p, x_p=x_p,
        r_x=math.sqrt(b.I_x / b.A), r_y=math.sqrt(b.I_y / b.A), r_min=math.sqrt(max(I2, 0.0) / b.A),
        Q_x=P.first_moment_above(rings, b.y_c), t_x=P.width_at(rings, b.y_c, weighted=True),
        Q_y=P.first_moment_above(swapped, b.x_c), t_y=P.width_at(swapped, b.x_c, weighted=True),  # _y, _at_x
        J=shape.J, depth=y_max - y_min, width=x_max - x_min, mass=mass_per_length(shape.rows),
    )
    out["S_x"] = min(out["S_x_top"], out["S_x_bot"])
    out["S_y"] = min(out["S_y_left"], out["S_y_right"])
    out["I_x_ref"] = b.I_x + b.A * (b.y_c - y_ref) ** 2 if y_ref is not None else b.I_x
    out["I_y_ref"] = b.I_y + b.A * (b.x_c - x_ref) ** 2 if x_ref is not None else b.I_y
    return out
