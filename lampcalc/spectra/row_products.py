"""Weighted sums over the wavelength grid, each spectrum's computed on its own.

Every rating is a sum Σ S(λ)·w(λ)·Δλ (CIE 015:2018, clause 7) of one spectrum against
weights (CMFs, V(λ), test-colour samples). A matrix product of a whole batch gives those
sums fastest, but BLAS picks its kernels by the shape of the batch, so a lamp's last digit
would depend on how many lamps it was rated with. Here each row is its own product of the
same shape and memory layout: a lamp's numbers are the same whether it is rated alone, in a chunk of a
stream, on another core or on another machine (``docs/scale.md``).
"""

import numpy as np


def row_dot(values, weights):
    """``values @ weights`` with every row computed on its own: independent of the batch.

    Parameters
    ----------
    values : array_like, shape (..., n)
    weights : array_like, shape (n,) or (n, m)

    Returns
    -------
    ndarray, shape (...) or (..., m)

    Examples
    --------
    >>> row_dot([[1.0, 2.0], [3.0, 4.0]], [10.0, 1.0]).tolist()
    [12.0, 34.0]
    >>> row_dot([1.0, 2.0], [[1.0, 0.0], [0.0, 1.0]]).tolist()
    [1.0, 2.0]
    """
    # Row-major copies where needed: BLAS reads a strided row with other kernels than a contiguous one.
    values = np.ascontiguousarray(values, dtype=float)
    weights = np.ascontiguousarray(weights, dtype=float)
    # A stack of (1, n) @ (n, m) products: numpy runs the same small product for every row.
    out = np.matmul(values[..., None, :], weights)
    return out[..., 0] if weights.ndim == 1 else out[..., 0, :]
