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


def tridiagonal_spd(n, seed):
    rng = np.random.default_rng(seed)
    off = rng.uniform(-1, 1, n - 1)
    return np.diag(rng.uniform(2.5, 4, n)) + np.diag(off, -1) + np.diag(off, 1)  # diagonally dominant: SPD


@pytest.mark.parametrize("n, storage", [(2, 1), (50, 1), (101, 4)])
def test_a_tridiagonal_system_in_wider_storage_matches_numpy(n, storage):
    # a continuous beam whose supports hold deflection leaves only rotations free: tridiagonal,
    # though stored with the solver's full half-bandwidth
    K = tridiagonal_spd(n, n)
    f = np.random.default_rng(1).normal(size=n)
    x = banded_cholesky_solve(to_band(K, storage), f, np.diag(K).copy())
    assert np.allclose(x, np.linalg.solve(K, f), rtol=1e-10, atol=1e-12)


def test_bandwidth_is_the_last_nonzero_subdiagonal_not_the_first_zero_one():
    # sub-diagonal 1 empty, sub-diagonal 2 not: the solve must still use the full band
    n = 9
    K = 4 * np.eye(n) + np.diag(np.full(n - 2, 0.7), -2) + np.diag(np.full(n - 2, 0.7), 2)
    f = np.arange(1.0, n + 1)
    x = banded_cholesky_solve(to_band(K, 4), f, np.diag(K).copy())
    assert np.allclose(x, np.linalg.solve(K, f), rtol=1e-12)


def test_a_tridiagonal_mechanism_names_the_dof_whose_pivot_vanishes():
    # a free-free bar's stiffness (1, -1 / -1, 2, -1 / -1, 1) is singular: the last pivot is 0
    K = np.array([[1.0, -1.0, 0.0], [-1.0, 2.0, -1.0], [0.0, -1.0, 1.0]])
    with pytest.raises(Mechanism) as err:
        banded_cholesky_solve(to_band(K, 4), np.ones(3), np.diag(K).copy())
    assert err.value.dof == 2
