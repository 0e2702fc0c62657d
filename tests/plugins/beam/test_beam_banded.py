"""The banded Cholesky solve against numpy's dense solver, and its mechanism detection."""
import numpy as np
import pytest

from calcsheet_plugins.beam.solver import Mechanism, banded_cholesky_solve


def banded_spd(n, p, seed):
    rng = np.random.default_rng(seed)
    B = np.zeros((n, n))
    for d in range(p + 1):
        B += np.diag(rng.uniform(-1, 1, n - d), -d)
    K = B @ B.T + n * np.eye(n) * 0.1  # SPD, half-bandwidth 2p
    return K, 2 * p


def to_band(K, p):
    n = len(K)
    band = np.zeros((n, p + 1))
    for i in range(n):
        for d in range(p + 1):
            if i - d >= 0:
                band[i, d] = K[i, i - d]
    return band


@pytest.mark.parametrize("n, p, seed", [(1, 0, 0), (7, 1, 1), (40, 2, 2), (200, 2, 3)])
def test_matches_numpy_dense_solve(n, p, seed):
    K, bw = banded_spd(n, p, seed)
    f = np.random.default_rng(seed + 10).normal(size=n)
    x = banded_cholesky_solve(to_band(K, bw), f, np.diag(K).copy())
    assert np.allclose(x, np.linalg.solve(K, f), rtol=1e-10, atol=1e-12)


def test_singular_matrix_is_a_mechanism():
    K = np.array([[1.0, -1.0], [-1.0, 1.0]])  # a rigid-body mode
    with pytest.raises(Mechanism):
        banded_cholesky_solve(to_band(K, 1), np.ones(2), np.diag(K).copy())
