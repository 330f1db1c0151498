"""Weighted sums per row: equal to NumPy's matrix product, and independent of the batch.

NumPy's ``@`` is the reference for the value (to rounding); the batch independence is an
internal property (no published source): a lamp's numbers may not depend on the lamps rated
beside it, so that streamed, parallel and cluster runs write the same bytes.
"""

import numpy as np
from hypothesis import given, settings
from hypothesis import strategies as st

from lampcalc.spectra.row_products import row_dot


@settings(max_examples=30, deadline=None)
@given(n=st.integers(1, 40), m=st.sampled_from([None, 1, 3, 16]), cut=st.integers(1, 39), seed=st.integers(0, 2**32 - 1))
def test_each_row_is_the_same_whatever_batch_holds_it(n, m, cut, seed):
    rng = np.random.default_rng(seed)
    values = rng.random((n, 471))
    weights = rng.random(471 if m is None else (471, m))
    whole = row_dot(values, weights)
    # NumPy's matrix product (reference) to rounding
    np.testing.assert_allclose(whole, values @ weights, rtol=1e-12)
    parts = np.concatenate([row_dot(values[a : a + cut], weights) for a in range(0, n, cut)])
    assert np.array_equal(whole, parts)
    # a column-major copy of the same numbers gives the same bytes
    assert np.array_equal(row_dot(np.asfortranarray(values), weights), whole)


def test_leading_dimensions_are_kept():
    values = np.arange(2 * 3 * 4, dtype=float).reshape(2, 3, 4)
    weights = np.ones((4, 5))
    assert row_dot(values, weights).shape == (2, 3, 5)
    np.testing.assert_allclose(row_dot(values, weights), values @ weights)  # NumPy (reference)
