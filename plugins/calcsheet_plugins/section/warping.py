"""Warping constants and shear centres of thin-walled open shapes, as traced formulas.

Closed forms (thin-walled theory; each formula names its source):

* doubly symmetric I: C_w = I_y·h_o²/4, h_o = h − t_f (AISC 360-16 User Note to F2; Timoshenko & Gere);
* unequal-flange I: C_w = h_o²·I_t·I_b/(I_t + I_b), the shear centre h_o·I_t/(I_t + I_b) above the bottom
  flange's mid-thickness, I_t, I_b the flanges' own second moments about the web axis (AISC Design Guide 9,
  Seaburg & Carter 1997, Appendix C);
* channel: e_o = 3·t_f·b'²/(6·t_f·b' + t_w·h') from the web mid-line, C_w = t_f·b'³·h'²/12·(3·b'·t_f + 2·h'·t_w)/
  (6·b'·t_f + h'·t_w), b' = b − t_w/2, h' = h − t_f (Design Guide 9, Appendix C);
* tee: C_w = t_f³·b³/144 + t_w³·(h − t_f/2)³/36, the shear centre where flange and stem mid-lines meet (ibid.);
* angle: C_w = t³·(b'³ + h'³)/36, b' = b − t/2, h' = h − t/2, the shear centre where the legs' mid-lines meet
  (ibid.).

* tapered-flange channel (UPN, AISC C and MC): no closed form fits (the closed form above, with the flanges at
  their mean thickness, overstates C_w by 9-16 % against a finite-element warping analysis, because the taper moves
  material toward the web where the sectorial coordinate is small). ``sectorial`` integrates the thin-walled theory
  numerically instead (Vlasov's sectorial coordinate; e.g. Trahair, *Flexural-Torsional Buckling of Structures*,
  ch. 10 / Timoshenko & Gere, *Theory of Elastic Stability*, 5.4): the wall's centre line as straight segments
  whose thickness varies linearly (the flange's inner face slopes, so its centre line slopes at half that slope),
  the root fillets and toe radii as lumped areas at their centroids, and the thick-wall term ∫t³·ρ_t²/12 ds
  (each wall warping about its own centre line; for a tee this term alone is t_f³·b³/144) added to ∫ω²·t ds.

The monosymmetry property β_x = (1/I_x)·∬y·(x² + y²) dA − 2·y_0 (x, y from the centroid, y_0 the shear centre
above the centroid) is integrated over the outline by Green's theorem (exact for a polygon: a 3-point
Gauss–Legendre rule on each edge integrates the degree-4 line integrand exactly).
"""
from __future__ import annotations

from dataclasses import dataclass

import numpy as np


def Step(*args):
    from .shapes import Step as _Step  # shapes imports this module

    return _Step(*args)

_GL_T = (np.array([-np.sqrt(0.6), 0.0, np.sqrt(0.6)]) + 1) / 2
_GL_W = np.array([5 / 9, 8 / 9, 5 / 9]) / 2


def cubic_moment(rings, x_c: float, y_c: float) -> float:
    """∬ y·(x² + y²) dA about the centroid, over the (signed) rings: ∮ (x³·y/3 + x·y³) dy."""
    total = 0.0
    for r in rings:
        x0, y0 = r.x - x_c, r.y - y_c
        x1, y1 = np.roll(x0, -1), np.roll(y0, -1)
        acc = 0.0
        for t, w in zip(_GL_T, _GL_W):
            x = x0 + t * (x1 - x0)
            y = y0 + t * (y1 - y0)
            acc += w * float(np.sum((x**3 * y / 3 + x * y**3) * (y1 - y0)))
        total += r.weight * acc
    return total


def doubly_symmetric_I() -> list[Step]:
    return [Step("h_o", "h - t_f", "mm", "distance between the flange centroids"),
            Step("C_w", "I_y*h_o^2/4", "mm^6", "warping constant, doubly symmetric I (C_w = I_y·h_o²/4)"),
            Step("x_s", "b/2", "mm", "shear centre, x (on both axes of symmetry)"),
            Step("y_s", "h/2", "mm", "shear centre, y")]


def unequal_I() -> list[Step]:
    return [Step("h_o", "h - t_f/2 - t_fb/2", "mm", "distance between the flange centroids"),
            Step("I_top", "t_f*b^3/12", "mm^4", "top flange about the web axis"),
            Step("I_bot", "t_fb*b_bot^3/12", "mm^4", "bottom flange about the web axis"),
            Step("C_w", "h_o^2*I_top*I_bot/(I_top + I_bot)", "mm^6", "warping constant, unequal flanges"),
            Step("x_s", "max(b, b_bot)/2", "mm", "shear centre, x (on the web axis)"),
            Step("y_s", "t_fb/2 + h_o*I_top/(I_top + I_bot)", "mm", "shear centre above the base")]


def channel() -> list[Step]:
    return [Step("h_o", "h - t_f", "mm", "distance between the flange centroids h'"),
            Step("b_m", "b - t_w/2", "mm", "flange width to the web mid-line b'"),
            Step("e_o", "3*t_f*b_m^2/(6*t_f*b_m + t_w*h_o)", "mm", "shear centre from the web mid-line"),
            Step("C_w", "t_f*b_m^3*h_o^2/12*(3*b_m*t_f + 2*h_o*t_w)/(6*b_m*t_f + h_o*t_w)", "mm^6",
                 "warping constant, channel"),
            Step("x_s", "t_w/2 - e_o", "mm", "shear centre, x (outside the web, behind its back)"),
            Step("y_s", "h/2", "mm", "shear centre, y (on the axis of symmetry)")]


def tee() -> list[Step]:
    return [Step("h_o", "h - t_f/2", "mm", "flange mid-thickness to the stem tip"),
            Step("C_w", "t_f^3*b^3/144 + t_w^3*h_o^3/36", "mm^6", "warping constant, tee"),
            Step("x_s", "b/2", "mm", "shear centre, x (on the stem axis)"),
            Step("y_s", "h - t_f/2", "mm", "shear centre at the flange mid-thickness")]


def angle() -> list[Step]:
    return [Step("C_w", "t^3*((b - t/2)^3 + (h - t/2)^3)/36", "mm^6", "warping constant, angle"),
            Step("x_s", "t/2", "mm", "shear centre, x (where the legs' mid-lines meet)"),
            Step("y_s", "t/2", "mm", "shear centre, y")]


# ---------------------------------------------------------------- numerical sectorial integration (thin-walled)

@dataclass(frozen=True)
class Given:
    """A warping value found numerically (not one formula): shown as a value with the method beside it."""

    name: str
    value: float
    unit: str
    desc: str
    note: str


@dataclass(frozen=True)
class Wall:
    """A straight piece of the wall's centre line from node ``start`` to node ``end``, thickness t0 → t1 (linear)."""

    name: str
    start: str
    end: str
    p0: tuple[float, float]
    p1: tuple[float, float]
    t0: float
    t1: float


@dataclass(frozen=True)
class Lump:
    """An area concentrated at its centroid (x, y) (a fillet: positive; a rounded toe: negative), its sectorial
    coordinate taken from the wall ``wall`` (index) it lies on: along that wall to the foot of the perpendicular, then
    across the wall to the point."""

    name: str
    x: float
    y: float
    A: float
    wall: int


@dataclass(frozen=True)
class Sectorial:
    A: float
    x_c: float
    y_c: float
    x_s: float
    y_s: float
    C_w1: float  # ∫ω_n²·t ds + Σ A·ω_n² (ω_n about the shear centre, normalised so that ∫ω_n dA = 0)
    C_w2: float  # ∫t³·ρ_t²/12 ds: each wall warping through its own thickness
    omega: dict  # node -> ω_n at that node


def _gauss(wall: Wall):
    p0, p1 = np.array(wall.p0, float), np.array(wall.p1, float)
    L = float(np.hypot(*(p1 - p0)))
    pts = p0[None, :] + _GL_T[:, None] * (p1 - p0)[None, :]
    t = wall.t0 + _GL_T * (wall.t1 - wall.t0)
    return p0, p1, L, pts, t, _GL_W * L


def _sectorial_moments(walls, lumps, pole, x_c, y_c):
    """∫ over the walls (3-point Gauss–Legendre: exact, ω·t·x is at most cubic on a straight wall) and the lumps of
    y², x², x·y (about the centroid), and of ω, ω·y, ω·x, ω² with ω about ``pole``, starting at 0 at the first wall's
    start node."""
    om = {walls[0].start: 0.0}
    acc = np.zeros(7)  # Ix, Iy, Ixy, Iw, Iwx, Iwy, Iww
    for w in walls:
        p0, p1, L, pts, t, wt = _gauss(w)
        r = (p0[0] - pole[0]) * (p1[1] - p0[1]) - (p0[1] - pole[1]) * (p1[0] - p0[0])  # 2 × swept area
        o = om[w.start] + _GL_T * r
        om[w.end] = om[w.start] + r
        x, y = pts[:, 0] - x_c, pts[:, 1] - y_c
        acc += [wt @ (t * y * y), wt @ (t * x * x), wt @ (t * x * y), wt @ (t * o), wt @ (t * o * y),
                wt @ (t * o * x), wt @ (t * o * o)]
    for lp in lumps:
        o = _lump_omega(walls[lp.wall], om, lp, pole)
        x, y = lp.x - x_c, lp.y - y_c
        acc += lp.A * np.array([y * y, x * x, x * y, o, o * y, o * x, o * o])
    return acc, om


def _lump_omega(w: Wall, om, lp: Lump, pole) -> float:
    p0, p1 = np.array(w.p0, float), np.array(w.p1, float)
    u = (p1 - p0) / float(np.hypot(*(p1 - p0)))
    foot = p0 + float(np.dot(np.array([lp.x, lp.y]) - p0, u)) * u
    along = (p0[0] - pole[0]) * (foot[1] - p0[1]) - (p0[1] - pole[1]) * (foot[0] - p0[0])
    across = (foot[0] - pole[0]) * (lp.y - foot[1]) - (foot[1] - pole[1]) * (lp.x - foot[0])
    return om[w.start] + along + across


def sectorial(walls: list[Wall], lumps: list[Lump] = ()) -> Sectorial:
    """Shear centre and warping constant of an open thin-walled section by Vlasov's sectorial coordinate.

    ω_P(s) = ∫ (x − x_P)·dy − (y − y_P)·dx along the centre line (walls in tree order: each wall starts at a node
    already reached). With ω_B about the centroid B, the shear centre S makes ω_S = ω_B − (x_S − x_B)·y +
    (y_S − y_B)·x + const orthogonal to x and y: ∫ω_B·x dA − Δx·I_xy + Δy·I_y = 0, ∫ω_B·y dA − Δx·I_x + Δy·I_xy = 0.
    Then C_w = ∫ω_S² dA − (∫ω_S dA)²/A + ∫t³·ρ_t²/12 ds, ρ_t the distance from S to the wall's centre line measured
    along the wall (the thick-wall term)."""
    A = Sx = Sy = 0.0
    for w in walls:
        _, _, _, pts, t, wt = _gauss(w)
        A += wt @ t
        Sx += wt @ (t * pts[:, 0])
        Sy += wt @ (t * pts[:, 1])
    for lp in lumps:
        A += lp.A
        Sx += lp.A * lp.x
        Sy += lp.A * lp.y
    x_c, y_c = Sx / A, Sy / A
    m, _ = _sectorial_moments(walls, lumps, (x_c, y_c), x_c, y_c)
    Ix, Iy, Ixy, _, Iwx, Iwy, _ = m
    dx, dy = np.linalg.solve(np.array([[-Ixy, Iy], [-Ix, Ixy]]), -np.array([Iwy, Iwx]))
    x_s, y_s = x_c + float(dx), y_c + float(dy)
    m, om = _sectorial_moments(walls, lumps, (x_s, y_s), x_c, y_c)
    mean = m[3] / A
    C_w1 = float(m[6] - m[3] ** 2 / A)
    C_w2 = 0.0
    for w in walls:
        p0, p1, L, pts, t, wt = _gauss(w)
        u = (p1 - p0) / L
        rho = (pts[:, 0] - x_s) * u[0] + (pts[:, 1] - y_s) * u[1]
        C_w2 += float(wt @ (t**3 / 12 * rho**2))
    return Sectorial(float(A), float(x_c), float(y_c), x_s, y_s, C_w1, C_w2,
                     {k: v - mean for k, v in om.items()})


SECTORIAL_METHOD = ("thin-walled sectorial integration (Vlasov): the wall's centre line with its linearly varying "
                    "thickness, fillets and rounded toes as lumped areas; C_w = ∫ω²·t ds + Σ A·ω² + ∫t³·ρ_t²/12 ds "
                    "about the shear centre")


def tapered_channel_walls(h, b, t_f, t_w, slope, u, corners) -> tuple[list[Wall], list[Lump]]:
    """The centre-line model of a channel (web on the left, back of the web at x = 0) whose flanges are t_f thick at
    u from the toe and whose inner faces slope at ``slope`` (0: parallel): the web's centre line x = t_w/2 between
    the flanges' centre lines, each flange's centre line from the web's to the toe, sloping at slope/2 (half-way
    between the outer face and the sloping inner face), its thickness extended linearly to the web's centre line
    (so the walls' area is the sharp-cornered channel's). ``corners``: (name, A, x, y) of each fillet (A > 0) or
    rounded toe (A < 0), lumped on its flange."""
    o = b - t_w
    t_toe = t_f - slope * u
    t_web = t_f + slope * (o - u) + slope * t_w / 2  # the flange's thickness extended to the web's centre line
    walls = [Wall("web", "bottom junction", "top junction", (t_w / 2, t_web / 2), (t_w / 2, h - t_web / 2), t_w, t_w),
             Wall("bottom flange", "bottom junction", "bottom toe", (t_w / 2, t_web / 2), (b, t_toe / 2), t_web, t_toe),
             Wall("top flange", "top junction", "top toe", (t_w / 2, h - t_web / 2), (b, h - t_toe / 2), t_web, t_toe)]
    lumps = [Lump(name, x, y, A, 2 if y > h / 2 else 1) for name, A, x, y in corners]
    return walls, lumps


def sectorial_steps(res: Sectorial, note: str) -> list:
    """The numerical warping result as traced values, and C_w as their sum."""
    return [Given("C_w1", res.C_w1, "mm^6", "∫ω²·dA about the shear centre (centre line and lumped corners)", note),
            Given("C_w2", res.C_w2, "mm^6", "thick-wall term ∫t³·ρ_t²/12 ds (each wall about its own centre line)",
                  note),
            Step("C_w", "C_w1 + C_w2", "mm^6", "warping constant"),
            Given("x_s", res.x_s, "mm", "shear centre, x (behind the back of the web when negative)", note),
            Step("y_s", "h/2", "mm", "shear centre, y (on the axis of symmetry)")]
