"""Uncertainty of a comparison against direct computations on invented pairs.

Sources: JCGM 100:2008 (GUM) 5.1.2 and 5.2.2, first-order propagation: the variance of a difference
of independent quantities is the sum of their variances, and u²(|d|) = eᵀ(Σ_ref + Σ_test)e with e the
unit vector of d; the normal distribution's share below a point, Φ(m/u) (textbook, from memory);
ILAC-G8:09/2019 4.2 for the decision rules. The Monte Carlo's own precision: a standard deviation of
M draws is known to 1/√(2(M − 1)) of itself (from memory). The lamps are physical models.
"""

import math

import numpy as np
import pytest

from lampcalc.rating.measurement_model import MeasurementModel
from lampcalc.rating.rate import rate_spectra
from lampcalc.rating.uncertainty import rate_with_uncertainty
from lampcalc.spectra.batch import SpectralBatch
from lampcalc.spectra.resampling import GRID_NM
from lampcalc.verdicts.comparison import compare_ratings
from lampcalc.verdicts.comparison_uncertainty import KEPT, comparison_uncertainty
from lampcalc.verdicts.decision_rules import DecisionRule

DRAWS = 1500
TOLERANCE = 5.0 / math.sqrt(2.0 * (DRAWS - 1))  # five of the Monte Carlo's own standard deviations, relative


def _led(phosphor_nm=565.0):
    """A phosphor-converted white LED: a blue die and a broad phosphor (physical shapes, not a product)."""
    blue = 0.9 * np.exp(-0.5 * ((GRID_NM - 452.0) / 9.0) ** 2)
    return blue + np.exp(-0.5 * ((GRID_NM - phosphor_nm) / 48.0) ** 2) + 0.35 * np.exp(-0.5 * ((GRID_NM - 625.0) / 30.0) ** 2)


def _sides(reference, test, model, limit=None, rule=None):
    rated = [rate_with_uncertainty(SpectralBatch(GRID_NM, values[None], ("lamp",)), model, keep=KEPT, stream=stream)
             for values, stream in ((reference, 1), (test, 2))]
    comparison = compare_ratings(*rated, limit_delta_uv_prime=limit)
    return rated, comparison_uncertainty(comparison, *rated, rule)


def test_a_spectrum_against_itself_adds_both_sides_variances():
    model = MeasurementModel(noise_percent=1.0, wavelength_shift_nm=0.3, draws=DRAWS)
    (reference, test), compared = _sides(_led(), _led(), model)
    pair = compared["pairs"]
    assert pair["delta_uv_prime"][0] == 0.0  # the same spectrum measures no shift
    for key in ("u_prime", "v_prime", "cct_K", "ra"):
        expected = math.hypot(reference[f"{key}_u"][0], test[f"{key}_u"][0])  # ≈ √2·u for one lamp
        assert pair[f"delta_{key}_u"][0] == pytest.approx(expected, rel=TOLERANCE), key
        low, high = pair[f"delta_{key}_interval95"][0]
        assert low < 0.0 < high, key
    # Δu′v′ of two identical spectra is a distance: every draw is at least the measured 0, and its
    # interval lies above it.
    assert pair["delta_uv_prime_interval95"][0][0] > 0.0


def test_a_real_shift_has_the_first_order_uncertainty_along_its_direction():
    model = MeasurementModel(noise_percent=1.0, draws=DRAWS)
    (reference, test), compared = _sides(_led(565.0), _led(580.0), model)
    pair = compared["pairs"]
    d = np.array([pair["delta_u_prime"][0], pair["delta_v_prime"][0]])
    e = d / np.hypot(*d)
    cov = sum(np.cov(np.stack([r.extras["uncertainty"].kept["u_prime"][0], r.extras["uncertainty"].kept["v_prime"][0]]))
              for r in (reference, test))
    assert pair["delta_uv_prime"][0] > 20 * math.sqrt(e @ cov @ e)  # far from zero: first order holds
    assert pair["delta_uv_prime_u"][0] == pytest.approx(math.sqrt(e @ cov @ e), rel=TOLERANCE)


@pytest.mark.parametrize("rule", [DecisionRule("simple"), DecisionRule("guarded", 2.0)])
def test_the_limit_is_decided_by_the_rule_and_holds_in_its_normal_share_of_draws(rule):
    model = MeasurementModel(noise_percent=1.5, draws=DRAWS)
    plain = compare_ratings(*(rate_spectra(SpectralBatch(GRID_NM, v[None], ("lamp",))) for v in (_led(565.0), _led(571.0))))
    limit = float(plain["pairs"]["delta_uv_prime"][0]) * 1.02  # just inside the limit
    _, compared = _sides(_led(565.0), _led(571.0), model, limit=limit, rule=rule)
    pair = compared["pairs"]
    margin, u = float(pair["margin_delta_uv_prime"][0]), float(pair["margin_delta_uv_prime_u"][0])
    assert margin > 0 and pair["pass"][0] is True
    assert pair["decision"][0] == rule.decide(margin, u)
    assert pair["decision"][0] == ("pass" if rule.name == "simple" else "conditional pass")
    assert pair["guard_band"][0] == pytest.approx(rule.guard_band(u))
    share = 0.5 * (1.0 + math.erf(margin / u / math.sqrt(2.0)))  # Φ(m/u)
    assert pair["conformance_probability"][0] == pytest.approx(share, abs=0.05)


def test_without_a_limit_there_is_no_decision():
    _, compared = _sides(_led(), _led(570.0), MeasurementModel(noise_percent=1.0, draws=200))
    assert "decision" not in compared["pairs"] and "delta_uv_prime_u" in compared["pairs"]
    assert len(compared["pairs"]["delta_ri_u"][0]) == 15 and len(compared["pairs"]["delta_rf_hue_bins_u"][0]) == 16
