"""The uncertainty the measurement adds to a lot's statistics, against direct computations on invented lots.

Sources: JCGM 100:2008 (GUM) 5.1.2, first order: the mean of n independent values has
u² = Σ uᵢ² / n²; JCGM 101:2008 7.6 (the standard deviation of the draws), from memory. The Monte
Carlo's own precision: a standard deviation of M draws is known to 1/√(2(M − 1)) of itself (from
memory). The samples are physical models of white LEDs (a blue die and a phosphor), not products.
"""

import math

import numpy as np
import pytest

from lampcalc.rating.measurement_model import MeasurementModel
from lampcalc.rating.uncertainty import rate_with_uncertainty
from lampcalc.spectra.batch import SpectralBatch
from lampcalc.spectra.resampling import GRID_NM
from lampcalc.verdicts import lot_uncertainty as module
from lampcalc.verdicts.lot import lot_statistics
from lampcalc.verdicts.lot_uncertainty import KEPT, lot_uncertainty
from lampcalc.verdicts.spread import farthest_pair

DRAWS = 1200
TOLERANCE = 5.0 / math.sqrt(2.0 * (DRAWS - 1))


def _lot(n, draws=DRAWS, **model):
    """n white LEDs whose phosphor peaks spread over a few nm, rated with uncertainty."""
    peaks = np.linspace(562.0, 568.0, n)
    blue = 0.9 * np.exp(-0.5 * ((GRID_NM - 452.0) / 9.0) ** 2)
    values = np.array([blue + np.exp(-0.5 * ((GRID_NM - p) / 48.0) ** 2) for p in peaks])
    batch = SpectralBatch(GRID_NM, values, tuple(f"s{k}" for k in range(n)))
    ratings = rate_with_uncertainty(batch, MeasurementModel(draws=draws, **(model or {"noise_percent": 1.0})), keep=KEPT)
    return ratings, lot_uncertainty(lot_statistics(ratings, nominal_cct_K=4000), ratings)


@pytest.fixture(scope="module")
def six():
    return _lot(6)


def test_the_mean_of_independent_samples_has_the_first_order_uncertainty(six):
    ratings, lot = six
    n = len(ratings)
    for key in ("ra", "cct_K", "ler_lm_per_W"):
        expected = math.sqrt(np.sum(np.asarray(ratings[f"{key}_u"]) ** 2)) / n
        assert lot[f"{key}_mean_u"] == pytest.approx(expected, rel=TOLERANCE), key
    assert lot["mean_x_u"] == pytest.approx(math.sqrt(np.sum(ratings["x_u"] ** 2)) / n, rel=TOLERANCE)


def test_each_statistic_is_the_statistic_of_each_draw_of_the_lot(six):
    # Directly: draw m of the lot is every sample's draw m; the statistic of each, then their spread.
    ratings, lot = six
    kept = ratings.extras["uncertainty"].kept
    per_draw = {"ra_max": kept["ra"].max(axis=0), "cct_K_sd": kept["cct_K"].std(axis=0, ddof=1),
                "r9_min": kept["ri"][..., 8].min(axis=0), "mean_v_prime": kept["v_prime"].mean(axis=0)}
    for key, values in per_draw.items():
        assert lot[f"{key}_u"] == pytest.approx(np.std(values, ddof=1), rel=1e-9), key
        low, high = lot[f"{key}_interval95"]
        assert np.mean((values >= low) & (values <= high)) == pytest.approx(0.95, abs=1.5 / DRAWS + 1e-9), key
    # The measured statistics are those of the lot as measured, untouched.
    plain = lot_statistics(ratings, nominal_cct_K=4000)
    np.testing.assert_equal({k: lot[k] for k in plain}, plain)


def test_the_largest_pairwise_distance_is_the_same_by_blocks_and_draw_by_draw(six, monkeypatch):
    ratings, lot = six
    kept = ratings.extras["uncertainty"].kept
    upvp = np.stack([kept["u_prime"], kept["v_prime"]], axis=-1)
    direct = np.array([farthest_pair(upvp[:, m])[0] for m in range(DRAWS)])
    np.testing.assert_allclose(module._largest_pairwise(upvp), direct, rtol=1e-12)
    monkeypatch.setattr(module, "_PAIRS_AT_ONCE", 100)  # a few draws at a time
    np.testing.assert_allclose(module._largest_pairwise(upvp), direct, rtol=1e-12)
    monkeypatch.setattr(module, "_VECTORISED_UP_TO", 2)  # the path of large lots: each draw's hull
    np.testing.assert_allclose(module._largest_pairwise(upvp), direct, rtol=1e-12)
    assert lot["max_pairwise_delta_uv_prime_u"] == pytest.approx(np.std(direct, ddof=1), rel=1e-9)


def test_a_spread_has_an_interval_and_one_sample_has_none():
    # A sample standard deviation needs two samples, a covariance ellipse three (lampcalc.verdicts.spread).
    _, lot = _lot(3, draws=400, noise_percent=3.0)
    low, high = lot["cct_K_sd_interval95"]
    assert low < high and lot["cct_K_sd_u"] > 0
    _, alone = _lot(1, draws=200)
    assert math.isnan(alone["cct_K_sd_u"]) and math.isnan(alone["max_pairwise_delta_uv_prime_u"])
    assert alone["cct_K_mean_u"] > 0 and "ellipse_semi_major_xy_u" not in alone
