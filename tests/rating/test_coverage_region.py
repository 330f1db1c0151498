"""The 95 % region of chromaticity draws: what it holds, and that only the draws decide it.

Sources: for a bivariate normal distribution the ellipse d² ≤ χ²₂(p) holds the share p, with
χ²₂(p) = −2 ln(1 − p) (the chi-square distribution with two degrees of freedom, a textbook
closed form, from memory), and its area is π·χ²₂(p)·√det Σ; q = ⌊pM + ½⌋ as in JCGM 101:2008
7.7.2 (from memory). The region's construction itself is lampcalc's (docstring of the module).
"""

import random

import numpy as np
import pytest
from hypothesis import example, given, settings
from hypothesis import strategies as st
from hypothesis.extra.numpy import arrays

from lampcalc.rating.coverage_region import coverage_region
from lampcalc.rating.measurement_model import MeasurementModel
from lampcalc.rating.uncertainty import rate_with_uncertainty
from lampcalc.spectra.batch import SpectralBatch
from lampcalc.spectra.resampling import GRID_NM


def _inside(region, points):
    """Which points lie in the convex polygon ``region`` (vertices in order; its boundary included).

    Each point must lie on the inner side of every edge (cross products, elementary geometry), within
    a tolerance of rounding: a sliver polygon holds its own vertices too.
    """
    region, points = np.asarray(region, dtype=float), np.atleast_2d(np.asarray(points, dtype=float))
    edges = np.roll(region, -1, axis=0) - region
    to_points = points[:, None, :] - region[None, :, :]
    cross = edges[None, :, 0] * to_points[..., 1] - edges[None, :, 1] * to_points[..., 0]
    orientation = np.sign(_signed_area(region)) or 1.0
    scale = max(np.ptp(np.vstack([region, points]), axis=0).max(), 1e-300)
    return np.all(orientation * cross >= -1e-12 * scale**2, axis=1)


def _signed_area(region):
    x, y = region.T
    return 0.5 * (np.dot(x, np.roll(y, -1)) - np.dot(y, np.roll(x, -1)))


def _area(region):
    return abs(_signed_area(region))


def test_a_normal_spread_gives_the_chi_square_ellipse_from_inside():
    rng = np.random.default_rng(7)
    cov = np.array([[4e-6, 3e-6], [3e-6, 9e-6]])  # a tilted spread of chromaticity, sizes as of a sphere photometer
    draws = rng.multivariate_normal([0.42, 0.40], cov, size=20000)
    region = coverage_region(draws)
    share = np.mean(_inside(region, draws))
    assert 0.95 <= share < 0.955  # q = 19 000 kept, and the few more that fall inside their hull
    ellipse = np.pi * (-2.0 * np.log(0.05)) * np.sqrt(np.linalg.det(cov))
    assert 0.97 * ellipse < _area(region) <= 1.01 * ellipse  # a hull of points inside it, so a little smaller


def test_a_wild_draw_is_left_out_and_does_not_move_the_region():
    rng = np.random.default_rng(3)
    draws = rng.normal(0.0, 1e-3, (400, 2)) + [0.31, 0.33]
    wild = np.vstack([draws, [[0.5, 0.5]]])
    region = coverage_region(wild)
    assert not _inside(region, [[0.5, 0.5]])[0]
    assert np.mean(_inside(region, draws)) >= 0.95


@settings(max_examples=60, deadline=None)
@example(np.array([[0.0, 9.86565532e-15], [9.86565532e-15, 1.0], [9.86565532e-15, 9.86565532e-15]]), random.Random(0))
@given(arrays(np.float64, st.tuples(st.integers(3, 60), st.just(2)), elements=st.floats(0.0, 1.0, width=32)),
       st.randoms(use_true_random=False))
def test_the_region_holds_its_share_whatever_the_order_of_the_draws(points, random):
    order = list(range(points.shape[0]))
    random.shuffle(order)
    region = coverage_region(points)
    np.testing.assert_array_equal(coverage_region(points[order]), region)
    if region.shape[0] >= 3:
        q = int(np.floor(0.95 * points.shape[0] + 0.5))
        assert np.sum(_inside(region, points)) >= q


def test_same_seed_same_region_and_another_seed_another():
    from lampcalc.physics.blackbody import spectral_radiance

    lamp = SpectralBatch(GRID_NM, spectral_radiance(3000.0, GRID_NM)[None], ("bb",))
    regions = [coverage_region(rate_with_uncertainty(lamp, MeasurementModel(noise_percent=1.0, draws=300, seed=s))
                               .extras["uncertainty"].xy)[0] for s in (4, 4, 5)]
    np.testing.assert_array_equal(regions[0], regions[1])
    assert regions[0].shape != regions[2].shape or not np.array_equal(regions[0], regions[2])


@pytest.mark.parametrize("draws, vertices", [
    ([[0.3, 0.3]] * 50, 1),
    ([[0.3 + t, 0.3 + 2 * t] for t in np.linspace(0, 1e-3, 50)], 2),
    ([[np.nan, np.nan]] * 5, 0),
])
def test_degenerate_draws_give_a_point_a_segment_or_nothing(draws, vertices):
    assert coverage_region(draws).shape == (vertices, 2)


def test_lamps_on_the_leading_axis_and_bad_shapes():
    rng = np.random.default_rng(0)
    regions = coverage_region(rng.normal(size=(3, 100, 2)))
    assert len(regions) == 3 and all(r.shape[1] == 2 for r in regions)
    with pytest.raises(ValueError, match="shape"):
        coverage_region(np.zeros((10, 3)))
