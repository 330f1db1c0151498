"""Summary statistics, the covariance ellipse and the farthest pair, against direct computations.

Sources: NumPy's own mean, standard deviation (ddof=1) and percentile (method "linear",
Hyndman and Fan's definition 7) computed directly on the same invented data; SciPy's
chi-square quantile and pairwise distances (reference library); for the ellipse, the
definition of the quadratic form and the probability a normal distribution puts inside it.
"""

import itertools

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from hypothesis.extra.numpy import arrays

from lampcalc.verdicts.spread import (
    chi_square_2dof,
    covariance_ellipse,
    describe,
    ellipse_boundary,
    farthest_pair,
)


def _direct(column):
    """The statistics of one column computed directly with NumPy on its finite values."""
    v = column[np.isfinite(column)]
    if v.size == 0:
        return {"n": 0, "mean": np.nan, "sd": np.nan, "min": np.nan, "max": np.nan, "p05": np.nan, "p95": np.nan}
    return {
        "n": v.size,
        "mean": np.mean(v),
        "sd": np.std(v, ddof=1) if v.size > 1 else np.nan,
        "min": np.min(v),
        "max": np.max(v),
        "p05": np.percentile(v, 5.0),
        "p95": np.percentile(v, 95.0),
    }


def test_describe_matches_numpy_column_by_column():
    rng = np.random.default_rng(14)
    values = rng.normal(3000.0, 40.0, (25, 6))
    values[rng.random(values.shape) < 0.2] = np.nan  # missing values are left out, never zeros
    values[:, 4] = np.nan  # a rating no sample has
    values[1:, 5] = np.nan  # a rating one sample has
    stats = describe(values)
    for k in range(values.shape[1]):
        expected = _direct(values[:, k])
        for key, value in expected.items():
            np.testing.assert_allclose(stats[key][k], value, rtol=1e-12, equal_nan=True, err_msg=f"{key}, column {k}")


@settings(max_examples=60, deadline=None)
@given(arrays(np.float64, st.integers(1, 40), elements=st.floats(-1e6, 1e6) | st.just(np.nan)))
def test_describe_matches_numpy_on_any_column(column):
    stats = describe(column)
    for key, value in _direct(column).items():
        np.testing.assert_allclose(stats[key], value, rtol=1e-9, atol=1e-9, equal_nan=True, err_msg=key)


def test_describe_keeps_leading_dimensions():
    values = np.arange(24.0).reshape(4, 3, 2)
    stats = describe(values)
    assert stats["mean"].shape == (3, 2)
    np.testing.assert_allclose(stats["p95"], np.percentile(values, 95, axis=0))  # NumPy, linear method


@pytest.mark.parametrize("probability", [0.5, 0.9, 0.95, 0.99])
def test_chi_square_quantile_matches_scipy(probability):
    from scipy.stats import chi2

    # SciPy's chi-square distribution with 2 degrees of freedom (reference library).
    assert chi_square_2dof(probability) == pytest.approx(chi2.ppf(probability, 2), rel=1e-12)


def test_ellipse_boundary_is_the_quantile_of_the_quadratic_form():
    rng = np.random.default_rng(1)
    points = rng.multivariate_normal([0.44, 0.40], [[4e-6, 1.5e-6], [1.5e-6, 2e-6]], 30)
    e = covariance_ellipse(points, 0.95)
    np.testing.assert_allclose(e["mean"], points.mean(axis=0), rtol=1e-14)
    np.testing.assert_allclose(e["covariance"], np.cov(points.T, ddof=1), rtol=1e-12)  # NumPy, divisor n - 1
    boundary = ellipse_boundary(e["mean"], e["covariance"], e["chi2"], 360)
    d = boundary - e["mean"]
    form = np.einsum("ni,ij,nj->n", d, np.linalg.inv(np.cov(points.T)), d)
    np.testing.assert_allclose(form, 5.991464547107979, rtol=1e-9)  # chi-square 95 % quantile, 2 dof (SciPy)
    # the semi-axes are the farthest and nearest boundary points; the angle points to the farthest
    r = np.hypot(d[:, 0], d[:, 1])
    assert e["semi_axes"][0] == pytest.approx(r.max(), rel=1e-4)
    assert e["semi_axes"][1] == pytest.approx(r.min(), rel=1e-4)
    far = d[np.argmax(r)]
    assert np.degrees(np.arctan2(far[1], far[0])) % 180.0 == pytest.approx(e["angle_deg"], abs=0.6)


def test_ellipse_holds_95_percent_of_a_large_normal_sample():
    # A two-dimensional normal distribution puts P inside the chi-square P-ellipse of its covariance.
    rng = np.random.default_rng(2026)
    cov = np.array([[9e-6, -4e-6], [-4e-6, 4e-6]])
    points = rng.multivariate_normal([0.38, 0.38], cov, 40000)
    e = covariance_ellipse(points, 0.95)
    d = points - e["mean"]
    inside = np.einsum("ni,ij,nj->n", d, np.linalg.inv(e["covariance"]), d) <= e["chi2"]
    assert inside.mean() == pytest.approx(0.95, abs=0.005)  # binomial sd 0.0011 at n = 40 000


def test_ellipse_of_many_lots_at_once():
    rng = np.random.default_rng(3)
    lots = rng.normal(0.4, 0.002, (5, 7, 12, 2))
    e = covariance_ellipse(lots)
    assert e["covariance"].shape == (5, 7, 2, 2) and e["semi_axes"].shape == (5, 7, 2)
    np.testing.assert_allclose(e["covariance"][3, 2], np.cov(lots[3, 2].T, ddof=1), rtol=1e-12)


def _brute_force(points):
    best, pair = -1.0, (-1, -1)
    for i, j in itertools.combinations(range(len(points)), 2):
        d = float(np.hypot(*(points[i] - points[j])))
        if d > best:
            best, pair = d, (i, j)
    return best, pair


def test_farthest_pair_matches_a_loop_over_every_pair():
    rng = np.random.default_rng(5)
    points = rng.normal(0.5, 0.003, (60, 2))
    distance, pair = farthest_pair(points, block=7)  # small blocks: every block boundary is crossed
    expected, expected_pair = _brute_force(points)
    assert distance == pytest.approx(expected, rel=1e-14)
    assert pair == expected_pair


def test_farthest_pair_of_a_large_set_compares_the_hull_only():
    from scipy.spatial.distance import pdist

    rng = np.random.default_rng(6)
    points = rng.normal(0.5, 0.003, (5000, 2))
    distance, (i, j) = farthest_pair(points)
    assert distance == pytest.approx(pdist(points).max(), rel=1e-13)  # SciPy, every pair
    assert np.hypot(*(points[i] - points[j])) == pytest.approx(distance, rel=1e-14)


def test_farthest_pair_of_points_on_a_line_and_repeated_points():
    from scipy.spatial.distance import pdist

    t = np.linspace(0.0, 1.0, 3000)
    line = np.stack([0.2 + 0.01 * t, 0.4 + 0.02 * t], axis=-1)  # no hull: every point is compared
    assert farthest_pair(line)[0] == pytest.approx(pdist(line).max(), rel=1e-12)
    same = np.tile([[0.3, 0.3]], (4, 1))
    assert farthest_pair(same)[0] == 0.0
    assert np.isnan(farthest_pair(same[:1])[0]) and farthest_pair(same[:1])[1] == (-1, -1)


@settings(max_examples=40, deadline=None)
@given(arrays(np.float64, st.tuples(st.integers(2, 30), st.just(2)), elements=st.floats(-1.0, 1.0)))
def test_farthest_pair_property(points):
    distance, (i, j) = farthest_pair(points, block=4)
    assert distance == pytest.approx(_brute_force(points)[0], rel=1e-12, abs=1e-15)
    assert np.hypot(*(points[i] - points[j])) == pytest.approx(distance, rel=1e-12, abs=1e-15)
