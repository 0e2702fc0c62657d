"""Shared parts of the steel checks: data files, the section and material a check reads, units."""
from __future__ import annotations

import math
import tomllib
from functools import lru_cache
from pathlib import Path

HERE = Path(__file__).parent

# the section record's names a check accepts for each property, first match wins
ALIASES = {
    "A": ("A",), "d": ("d", "h", "depth"), "b_f": ("b_f", "b", "width"), "t_f": ("t_f",), "t_w": ("t_w",),
    "r": ("r", "r_root"), "k_des": ("k_des", "k"), "h_w": ("h_w",),
    "I_x": ("I_x", "I_y_major"), "I_y": ("I_y",), "S_x": ("S_x", "W_el_y"), "Z_x": ("Z_x", "W_pl_y"),
    "S_y": ("S_y", "W_el_z"), "Z_y": ("Z_y", "W_pl_z"), "r_x": ("r_x", "i_y"), "r_y": ("r_y", "i_z"),
    "J": ("J", "I_t"), "C_w": ("C_w", "I_w"), "h_o": ("h_o",), "r_ts": ("r_ts",),
    "B": ("B", "b", "width"), "H": ("H", "h", "d", "depth"), "t": ("t", "t_des"), "D": ("D", "d", "depth"),
    "r_i": ("r_i", "r_z_single"),
    "b_f_bot": ("b_f_bot", "b_bot"), "t_f_bot": ("t_f_bot", "t_fb"),
    "x_0": ("x_0",), "y_0": ("y_0",), "I_1": ("I_1",), "I_2": ("I_2",), "theta_p": ("theta_p",),
}


@lru_cache(maxsize=None)
def data(name: str) -> dict:
    with (HERE / name).open("rb") as fh:
        return tomllib.load(fh)


def aisc() -> dict:
    return data("aisc360_16.toml")


def ec3() -> dict:
    return data("en1993_1_1.toml")


def moment_factors() -> dict:
    return data("ltb_moment_factors.toml")


def field(rec, name):
    """The section record's value for ``name`` (by its aliases), or None."""
    if rec is None:
        return None
    for alias in ALIASES.get(name, (name,)):
        if alias in rec.fields:
            return rec.fields[alias]
    return None


FORMS = ("I", "C", "T", "L", "RHS", "CHS")
# forms a sheet may name but no check is built for: each refused with the clauses it would need
REFUSED_FORMS = {}
# forms built for some checks only: the message for the checks that refuse them
PARTIAL_FORMS = {
    "2L": "flexure and shear of double angles are not built: AISC 360-16 F9 (2L: F9.2(b) lateral-torsional "
          "buckling with the web legs in compression, F9.4(b) web-leg local buckling) and G3 for 2L are outside "
          "what is implemented; double angles in compression are checked by aisc_column (E3, E4, E6)",
}
_WORDS = {"I-shape": "I", "channel": "C", "tee": "T", "angle": "L", "box": "RHS", "tube": "CHS"}
_PREFIX = (("MC", "C"), ("WT", "T"), ("MT", "T"), ("ST", "T"), ("HSS", None), ("HP", "I"), ("W", "I"), ("M", "I"),
           ("S", "I"), ("C", "C"), ("L", "L"), ("IPE", "I"), ("HE", "I"))


def _small(rec, name, scale):
    v = rec.fields.get(name)
    return v is None or abs(v.m_as("mm")) <= 1e-6 * max(scale, 1.0)


def form_of(rec, given: str | None) -> str:
    """'I', 'C', 'T', 'L', 'RHS' or 'CHS': given, else the record's own form word (steel_design.shape, the section
    functions' description, a catalogue designation), else its fields and shear centre."""
    if given:
        return given
    if rec is None:
        return ""
    shape = str(rec.fields.get("shape", ""))
    if shape in FORMS or shape in REFUSED_FORMS or shape in PARTIAL_FORMS:
        return shape
    first = shape.split(" ")[0] if shape else ""
    if first in _WORDS:
        return _WORDS[first]
    f = rec.fields
    desig = str(f.get("designation", "")).upper()
    if desig.startswith("2L") or str(f.get("name", "")).upper().startswith("2L"):
        return "2L"
    if desig:
        for prefix, form in _PREFIX:
            if desig.startswith(prefix) and prefix != "HSS" and (len(desig) == len(prefix) or
                                                                  not desig[len(prefix)].isalpha()):
                return form
    if "t_f" in f and "t_w" in f:
        depth = f["d"].m_as("mm") if "d" in f else 1.0
        if not _small(rec, "x_0", depth):
            return "C"
        return "I"
    if "t" in f and ("b_f" in f or "B" in f or "b" in f) and not (f.get("I_xy") is not None and
                                                                  abs(f["I_xy"].magnitude) > 0):
        if "t" in f and not _small(rec, "x_0", 1.0) and not _small(rec, "y_0", 1.0):
            return "L"
        return "RHS"
    if "t" in f and ("D" in f or "d" in f):
        return "CHS"
    if "t" in f and ("h" in f or "b" in f):
        return "L"
    return ""


def units(work):
    """Display units: (stress, force, moment, length, area) for the sheet's system."""
    us = str(work.settings.get("system", "SI")).upper() == "US"
    if us:
        return {"st": "ksi", "fo": "kip", "mo": "kip*ft", "ln": "in", "ar": "in^2", "L": "ft", "i4": "in^4",
                "i3": "in^3", "i6": "in^6", "mod": "ksi", "us": True}
    return {"st": "MPa", "fo": "kN", "mo": "kN*m", "ln": "mm", "ar": "mm^2", "L": "m", "i4": "mm^4",
            "i3": "mm^3", "i6": "mm^6", "mod": "MPa", "us": False}


def num(q) -> float:
    """A dimensionless quantity (or number) as a float."""
    try:
        return float(q.m_as(""))
    except AttributeError:
        return float(q)


def interp(xs, ys, x):
    """Linear interpolation in a table whose xs run monotonically (either direction)."""
    pts = sorted(zip(xs, ys))
    if x <= pts[0][0]:
        return pts[0][1]
    if x >= pts[-1][0]:
        return pts[-1][1]
    for (x0, y0), (x1, y1) in zip(pts, pts[1:]):
        if x0 <= x <= x1:
            return y0 + (y1 - y0) * (x - x0) / (x1 - x0)
    return pts[-1][1]


def positive(work, name, q):
    if q is not None and (not math.isfinite(q.magnitude) or q.magnitude <= 0):
        work.fail(f"{name} must be greater than zero", param=name)


def tidy(out: dict, u: dict) -> dict:
    """Express each quantity of a result in the sheet's display units (force, moment, stress, length, area)."""
    res = {}
    for k, v in out.items():
        if hasattr(v, "dimensionality") and not v.dimensionless:
            for key in ("fo", "mo", "st", "L", "ar"):
                try:
                    if v.dimensionality == v._REGISTRY.Quantity(1.0, u[key]).dimensionality:
                        v = v.to(u[key])
                        break
                except Exception:
                    pass
        res[k] = v
    return res
