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

The monosymmetry property β_x = (1/I_x)·∬y·(x² + y²) dA − 2·y_0 (x, y from the centroid, y_0 the shear centre
above the centroid) is integrated over the outline by Green's theorem (exact for a polygon: a 3-point
Gauss–Legendre rule on each edge integrates the degree-4 line integrand exactly).
"""
from __future__ import annotations

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
