"""The C_1 values in ltb_moment_factors.toml against an independent oracle: the elastic critical moment of a
simply supported (fork-ended) doubly symmetric I-beam found by the Rayleigh–Ritz method (sine series for the
lateral deflection u and the twist φ, solved as a symmetric eigenproblem with numpy; total potential ½∫EI_z u''² + GI_t φ'² + EI_w φ''² dx + ∫M_y φ u'' dx;
Timoshenko & Gere, Theory of Elastic Stability, ch. 6 — from memory).

The C_1 for transverse loads (NCCI SN003a, computed with a finite-element program) hold for k = k_w = 1 and loads
at the shear centre and vary a little with the torsion parameter κ = √(π²EI_w/(GI_tL²)): 3 % allowed. For end
moments the plugin uses the quarter-point formula of Serna et al. (2006); the exact C_1 of reverse curvature
depends on κ more strongly, so the test sweeps κ and bounds the formula's error.
"""
import math

import numpy as np
import pytest

from calcsheet_plugins.steel.common import moment_factors

from .conftest import IPE300, call, f

E, G = 210000.0, 81000.0
IZ, IT, IW = 603.8e4, 20.12e4, 125.9e9  # IPE 300, mm⁴, mm⁴, mm⁶
L = 6000.0


def ritz_Mcr(moment_shape, terms=16, L=L):
    """Scale factor λ on the moment diagram M(x) (peak |M| = 1) at elastic lateral-torsional buckling."""
    x, w = np.polynomial.legendre.leggauss(160)
    x = (x + 1) * L / 2
    w = w * L / 2
    M = moment_shape(x / L)
    n = np.arange(1, terms + 1)
    k = n * math.pi / L
    S = np.sin(np.outer(n, x) * math.pi / L)                 # sin(nπx/L) at the quadrature points
    K = np.zeros((2 * terms, 2 * terms))
    K[:terms, :terms] = np.diag(E * IZ * k**4 * L / 2)
    K[terms:, terms:] = np.diag((G * IT * k**2 + E * IW * k**4) * L / 2)
    # ∫ M φ u'' dx with u'' = −Σ a_n k_n² sin, φ = Σ b_m sin: coupling G[m, n]
    Gc = -(S * (M * w)) @ S.T * (k**2)[None, :]
    Sg = np.zeros_like(K)
    Sg[terms:, :terms] = Gc
    Sg[:terms, terms:] = Gc.T
    # K z = −λ S z with K diagonal and positive: the symmetric form K^-½ S K^-½ has eigenvalues μ = −1/λ
    d = 1 / np.sqrt(np.diag(K))
    mu = np.linalg.eigvalsh(d[:, None] * Sg * d[None, :])
    return 1.0 / np.max(np.abs(mu))


def Mcr0():
    return math.pi**2 * E * IZ / L**2 * math.sqrt(IW / IZ + L**2 * G * IT / (math.pi**2 * E * IZ))


def test_ritz_reproduces_the_uniform_moment_closed_form():
    assert ritz_Mcr(lambda s: np.ones_like(s)) == pytest.approx(Mcr0(), rel=1e-6)


def serna(psi):
    q = [abs(1 - (1 - psi) * s) for s in (0.25, 0.5, 0.75)]
    return math.sqrt(35 / (1 + 9 * q[0] ** 2 + 16 * q[1] ** 2 + 9 * q[2] ** 2))


@pytest.mark.parametrize("psi", [0.5, 0.0, -0.5, -0.75, -1.0])
@pytest.mark.parametrize("L_m", [2.0, 6.0, 15.0])   # κ from 2.0 to 0.27 for an IPE 300
def test_linear_moment_C1_formula_is_within_a_few_percent_of_ritz(psi, L_m):
    C1_ritz = ritz_Mcr(lambda s: 1 - (1 - psi) * s, L=L_m * 1e3) / (
        math.pi**2 * E * IZ / (L_m * 1e3) ** 2 * math.sqrt(IW / IZ + (L_m * 1e3) ** 2 * G * IT / (math.pi**2 * E * IZ)))
    C1 = serna(psi)
    assert C1 <= C1_ritz * 1.04          # never more than 4 % unconservative (reverse curvature, low κ)
    assert C1 >= C1_ritz * 0.90          # and not wastefully low


def test_plugin_C1_for_end_moments_is_the_formula():
    out = call(IPE300, "ec3_beam", 'f_y=235 MPa, L_LT=6 m, moment_shape="end_moments", psi=-0.5, M_y_Ed=10 kN*m',
               units="SI")
    assert f(out["M_cr"], "N*mm") == pytest.approx(serna(-0.5) * Mcr0(), rel=1e-9)


@pytest.mark.parametrize("shape, M", [
    ("udl", lambda s: 4 * s * (1 - s)),
    ("point_mid", lambda s: np.where(s < 0.5, 2 * s, 2 * (1 - s))),
])
def test_tabulated_C1_for_transverse_loads_agrees_with_ritz(shape, M):
    C1_ritz = ritz_Mcr(M) / Mcr0()
    assert moment_factors()[shape]["C1"] == pytest.approx(C1_ritz, rel=0.03)


def test_plugin_Mcr_for_a_udl_at_the_shear_centre_matches_ritz():
    out = call(IPE300, "ec3_beam", 'f_y=235 MPa, L_LT=6 m, moment_shape="udl", M_y_Ed=10 kN*m', units="SI")
    assert f(out["M_cr"], "N*mm") == pytest.approx(ritz_Mcr(lambda s: 4 * s * (1 - s)), rel=0.03)
