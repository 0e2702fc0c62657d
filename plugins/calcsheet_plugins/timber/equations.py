"""The equations of EN 1995-1-1 and the NDS as plain functions of numbers.

The plugin traces these same equations as formulas the engine evaluates; these functions are used to pick a
branch before tracing it (which range of k_crit, which row of Table 3.3.3) and by callers that want a number.
"""
from __future__ import annotations

import math


# ------------------------------------------------------------------ EN 1995-1-1
def k_h_solid(h_mm: float, cap: float = 1.3) -> float:
    """3.2(3) Eq. (3.1)."""
    return 1.0 if h_mm >= 150 else min((150 / h_mm) ** 0.2, cap)


def k_h_glulam(h_mm: float, cap: float = 1.1) -> float:
    """3.3(3) Eq. (3.2)."""
    return 1.0 if h_mm >= 600 else min((600 / h_mm) ** 0.1, cap)


def lambda_rel(slenderness: float, f_c0k: float, E_005: float) -> float:
    """6.3.2(1) Eqs. (6.21), (6.22)."""
    return slenderness / math.pi * math.sqrt(f_c0k / E_005)


def k_c(lam_rel: float, beta_c: float) -> float:
    """6.3.2(3) Eqs. (6.25)-(6.28); 1 where λ_rel ≤ 0.3 (6.3.2(2))."""
    if lam_rel <= 0.3:
        return 1.0
    k = 0.5 * (1 + beta_c * (lam_rel - 0.3) + lam_rel**2)
    return 1 / (k + math.sqrt(k**2 - lam_rel**2))


def k_crit_range(lam_rel_m: float) -> str:
    if lam_rel_m <= 0.75:
        return "stocky"
    if lam_rel_m <= 1.4:
        return "intermediate"
    return "slender"


def k_crit(lam_rel_m: float) -> float:
    """6.3.3(4) Eq. (6.34)."""
    r = k_crit_range(lam_rel_m)
    if r == "stocky":
        return 1.0
    if r == "intermediate":
        return 1.56 - 0.75 * lam_rel_m
    return 1 / lam_rel_m**2


def sigma_m_crit_softwood(b: float, h: float, l_ef: float, E_005: float) -> float:
    """6.3.3(3) Eq. (6.32): solid softwood of rectangular section."""
    return 0.78 * b**2 * E_005 / (h * l_ef)


def torsion_constant_rectangle(b: float, h: float) -> float:
    """St Venant constant of a solid rectangle, b ≤ h (Roark, torsion table)."""
    b, h = min(b, h), max(b, h)
    return h * b**3 * (1 / 3 - 0.21 * (b / h) * (1 - b**4 / (12 * h**4)))


# ------------------------------------------------------------------ NDS 2018
def ylinen(ratio: float, c: float) -> float:
    """The form of NDS Eqs. (3.3-6) and (3.7-1): ratio = F_E/F*, c = 0.95 (beams) or 0.8/0.85/0.9 (columns)."""
    a = (1 + ratio) / (2 * c)
    return a - math.sqrt(a**2 - ratio / c)


def C_P(F_cE: float, F_c_star: float, c: float) -> float:
    """3.7.1 Eq. (3.7-1)."""
    return ylinen(F_cE / F_c_star, c)


def C_L(F_bE: float, F_b_star: float) -> float:
    """3.3.3.8 Eq. (3.3-6): (1 + α)/1.9 − √(((1 + α)/1.9)² − α/0.95)."""
    return ylinen(F_bE / F_b_star, 0.95)


def l_e(rows: list[list[float]], l_u: float, d: float) -> tuple[float, list[float]]:
    """Table 3.3.3: l_e = a·l_u + b·d for the row whose l_u/d limit is not exceeded."""
    r = l_u / d
    for row in rows:
        inside = r < row[0] if row is rows[0] else r <= row[0]   # "l_u/d < 7", then "7 ≤ l_u/d ≤ 14.3"
        if inside or row is rows[-1]:
            return row[1] * l_u + row[2] * d, row
    raise AssertionError  # pragma: no cover
