"""Monte Carlo uncertainty of the ratings against the analytic GUM propagation and the laws it must obey.

Sources: JCGM 100:2008 (GUM) 5.1.2, the law of propagation of uncertainty, first order, for the
analytic comparison; JCGM 101:2008 7.6 (standard uncertainty of the draws) and 7.7.2 (the
probabilistically symmetric interval, from memory); the CIE 1931 colour-matching functions
from colour-science (reference library) as the sensitivity coefficients. The Monte Carlo's own
uncertainty: the standard deviation of M normal draws is known to 1/√(2(M − 1)) of itself
(a textbook sampling result, from memory).
"""

import numpy as np
import pytest

from lampcalc.rating.measurement_model import MeasurementModel
from lampcalc.rating.rate import rate_spectra
from lampcalc.rating.uncertainty import (
    NOT_PROPAGATED,
    coverage_interval,
    propagated_keys,
    rate_with_uncertainty,
    slit_convolution,
)
from lampcalc.spectra.batch import SpectralBatch
from lampcalc.spectra.resampling import GRID_NM

KM = 683.0  # lm/W (CIE 015:2018)


def _led(wl):
    """A phosphor-converted white LED, W/nm: a blue die and a broad phosphor (physical shapes, not a product)."""
    wl = np.asarray(wl, dtype=float)
    blue = 0.9 * np.exp(-0.5 * ((wl - 452.0) / 9.0) ** 2)
    phosphor = 1.0 * np.exp(-0.5 * ((wl - 565.0) / 48.0) ** 2) + 0.35 * np.exp(-0.5 * ((wl - 625.0) / 30.0) ** 2)
    return 0.01 * (blue + phosphor)


def _batch(wl, values, names=("led",)):
    return SpectralBatch(wl, np.atleast_2d(values), names, quantity="flux")


def _tolerance(draws, sigmas=4.0):
    return sigmas / np.sqrt(2.0 * (draws - 1))


def _cmfs():
    import colour

    return colour.MSDS_CMFS["CIE 1931 2 Degree Standard Observer"][GRID_NM]  # (471, 3), 1 nm


def _xyz_draws(batch, model, **options):
    """X, Y, Z of every draw, from each draw's x, y and luminous flux (Y = Φ / Km)."""
    parts = []
    ratings = rate_with_uncertainty(batch, model, on_draws=lambda i, d: parts.append(d), **options)
    x, y = (np.concatenate([p[k] for p in parts]) for k in ("x", "y"))
    Y = np.concatenate([p["luminous_flux_lm"] for p in parts]) / KM
    return ratings, np.stack([x * Y / y, Y, (1.0 - x - y) * Y / y], axis=-1)


def _gum(values, sensitivity, noise):
    """First-order GUM for uncorrelated relative noise: u(X_k) and u(x), u(y) from ∂X_k/∂S_j."""
    u_s = noise * values  # standard uncertainty of each measured value
    XYZ = sensitivity.T @ values
    total = XYZ.sum()
    u_XYZ = np.sqrt(((sensitivity * u_s[:, None]) ** 2).sum(axis=0))
    u_xy = [np.sqrt(np.sum(((sensitivity[:, k] * total - XYZ[k] * sensitivity.sum(axis=1)) / total**2 * u_s) ** 2))
            for k in (0, 1)]
    return u_XYZ, np.array(u_xy)


@pytest.mark.parametrize("step", [1, 5])
def test_noise_matches_the_analytic_gum_propagation(step):
    # JCGM 100 5.1.2: u²(X) = Σ (∂X/∂S_j)² u²(S_j). On the 1 nm grid ∂X/∂S_j = x̄_j·Δλ; from 5 nm data
    # resampled linearly, ∂X/∂S_j = Σ_g x̄_g·L_gj with L the linear interpolation (np.interp of unit
    # vectors). Perturbing the 1 nm values instead of the measured ones would give a ~2x smaller u at 5 nm.
    wl = np.arange(360.0, 831.0, step)
    values = _led(wl)
    model = MeasurementModel(noise_percent=1.0, draws=4000, seed=11)
    ratings, draws = _xyz_draws(_batch(wl, values), model, interpolation="linear")
    L = np.stack([np.interp(GRID_NM, wl, np.eye(wl.size)[j]) for j in range(wl.size)], axis=1)
    u_XYZ, u_xy = _gum(values, L.T @ _cmfs(), 0.01)
    tol = _tolerance(model.draws)
    np.testing.assert_allclose(draws.std(axis=0, ddof=1), u_XYZ, rtol=tol)
    np.testing.assert_allclose([ratings["x_u"][0], ratings["y_u"][0]], u_xy, rtol=tol)
    # The reported u is the draws' standard deviation (JCGM 101 7.6), Y's relative u that of the flux.
    assert ratings["luminous_flux_lm_u"][0] / ratings["luminous_flux_lm"][0] == pytest.approx(u_XYZ[1] / (_cmfs()[:, 1] @ (L @ values)), rel=tol)


def test_zero_uncertainty_gives_zero_spread():
    model = MeasurementModel(draws=100)
    r = rate_with_uncertainty(_batch(GRID_NM, _led(GRID_NM)), model)
    for key in propagated_keys(r):
        value = np.asarray(r[key][0])
        scale = np.maximum(np.abs(np.nan_to_num(value)), 1.0)
        assert np.all(np.nan_to_num(r[f"{key}_u"][0]) <= 1e-9 * scale), key
        interval = np.nan_to_num(r[f"{key}_interval95"][0])
        assert np.all(np.abs(interval - np.nan_to_num(value)[..., None]) <= 1e-9 * scale[..., None]), key


def test_pure_scale_uncertainty_leaves_chromaticity_untouched():
    # A common factor cancels in every ratio (CIE 015: x = X/(X+Y+Z)); the flux's relative u is the scale's.
    model = MeasurementModel(scale_percent=2.0, draws=2000, seed=3)
    r = rate_with_uncertainty(_batch(GRID_NM, _led(GRID_NM)), model)
    for key in ("x", "y", "u_prime", "v_prime", "cct_K", "duv", "ra", "rf", "rg", "ler_lm_per_W", "sp_ratio", "melanopic_der"):
        assert r[f"{key}_u"][0] <= 1e-9 * max(1.0, abs(r[key][0])), key
    assert r["luminous_flux_lm_u"][0] / r["luminous_flux_lm"][0] == pytest.approx(0.02, rel=_tolerance(2000))


def test_doubling_the_noise_doubles_the_spread():
    # JCGM 100 5.1.2: to first order u(y) is proportional to the inputs' u. The same seed draws the same
    # normal numbers, so the ratio is 2 up to second-order terms (exactly 2 for the flux, which is linear).
    batch = _batch(GRID_NM, _led(GRID_NM))
    small, large = (rate_with_uncertainty(batch, MeasurementModel(noise_percent=p, draws=300, seed=5)) for p in (0.05, 0.1))
    assert large["luminous_flux_lm_u"][0] / small["luminous_flux_lm_u"][0] == pytest.approx(2.0, rel=1e-9)
    for key in ("x", "y", "cct_K", "duv", "ra", "rf", "rg", "ler_lm_per_W", "sp_ratio", "sdcm_steps"):
        assert large[f"{key}_u"][0] / small[f"{key}_u"][0] == pytest.approx(2.0, rel=0.02), key


def test_same_seed_same_output_whatever_the_chunks_and_the_batch():
    wl = np.arange(380.0, 781.0, 5.0)
    a, b = _led(wl), _led(wl + 6.0)
    model = MeasurementModel(noise_percent=0.5, scale_percent=1.0, wavelength_shift_nm=0.3, stray_light_percent=0.1,
                             bandwidth_nm=4.0, draws=120, seed=9)
    both = _batch(wl, np.stack([a, b]), ("a", "b"))
    first = rate_with_uncertainty(both, model)
    assert rate_with_uncertainty(both, model).to_json() == first.to_json()
    # Other chunks and another batch draw the same numbers; sums over other batch sizes round differently.
    chunked = rate_with_uncertainty(both, model, chunk_spectra=37)
    alone = rate_with_uncertainty(_batch(wl, b, ("b",)), model)
    for key in ("x_u", "cct_K_u", "ra_u", "rf_interval95", "luminous_flux_lm_u"):
        np.testing.assert_allclose(chunked[key], first[key], rtol=1e-9, err_msg=key)
        np.testing.assert_allclose(alone[key][0], first[key][1], rtol=1e-9, err_msg=key)
    other = rate_with_uncertainty(both, MeasurementModel(**{**model.as_dict(), "seed": 10}))
    assert other["cct_K_u"][0] != first["cct_K_u"][0]


def test_interval_covers_the_truth_95_percent_of_the_time():
    # JCGM 101 7.7: a 95 % coverage interval holds the measurand's value with probability 0.95. Simulate
    # 80 measurements of one true spectrum with the model's effects (numpy, independently of lampcalc),
    # give each its Monte Carlo interval, and count how often the true ratings fall inside.
    rng = np.random.default_rng(2024)
    wl = np.arange(380.0, 781.0, 2.0)
    truth = _led(wl)
    model = MeasurementModel(noise_percent=1.0, wavelength_shift_nm=0.3, stray_light_percent=0.2, draws=100, seed=1)
    measured = [
        _batch(wl + 0.3 * rng.standard_normal(), truth * (1 + 0.01 * rng.standard_normal(wl.size))
               + 0.002 * truth.max() * rng.standard_normal(), (f"m{k}",))
        for k in range(80)
    ]
    r = rate_with_uncertainty(measured, model)
    true = rate_spectra(_batch(wl, truth))
    keys = ("x", "y", "cct_K", "ra", "rf", "ler_lm_per_W")
    inside = np.array([(r[f"{k}_interval95"][:, 0] <= true[k][0]) & (true[k][0] <= r[f"{k}_interval95"][:, 1]) for k in keys])
    assert np.all(inside.mean(axis=1) >= 0.85), dict(zip(keys, inside.mean(axis=1)))
    assert 0.9 <= inside.mean() <= 0.99


def test_coverage_interval_by_the_order_statistics():
    # JCGM 101 7.7.2 (from memory): M = 2000, q = 1900, r = 50: [y(50), y(1950)]; M = 101: q = 96, r = 3.
    assert [float(v) for v in coverage_interval(np.arange(2000.0, 0.0, -1.0))] == [50.0, 1950.0]
    assert [float(v) for v in coverage_interval(np.arange(1.0, 102.0))] == [3.0, 99.0]
    # A large normal sample: the 2.5 % and 97.5 % points, ±1.959964σ (scipy.stats.norm, reference library).
    from scipy.stats import norm

    low, high = coverage_interval(np.random.default_rng(0).standard_normal((200_000, 2)))
    np.testing.assert_allclose([low, high], [[-norm.ppf(0.975)] * 2, [norm.ppf(0.975)] * 2], atol=0.02)
    with pytest.raises(ValueError, match="too few"):
        coverage_interval(np.arange(5.0))


@pytest.mark.parametrize("bandwidth", [1.0, 3.0, 7.5])
def test_slit_turns_a_line_into_its_triangle(bandwidth):
    # A triangular slit of FWHM b (base 2b) spreads a narrow line into a triangle of that FWHM and keeps
    # its area (definition of a convolution with a unit-area kernel); a straight line stays straight.
    wl = np.arange(400.0, 500.01, 0.25)
    line = np.where(np.isclose(wl, 450.0), 1.0, 0.0)
    seen = slit_convolution(wl, line, bandwidth)
    above_half = wl[seen >= 0.5 * seen.max()]
    assert above_half[-1] - above_half[0] == pytest.approx(bandwidth, abs=0.26)
    assert np.trapezoid(seen, wl) == pytest.approx(np.trapezoid(line, wl), rel=1e-3)
    ramp = 2.0 * wl + 1.0
    middle = (wl > 400 + bandwidth) & (wl < 500 - bandwidth)
    np.testing.assert_allclose(slit_convolution(wl, ramp, bandwidth)[middle], ramp[middle], rtol=1e-9)


def test_a_draw_without_a_value_nulls_the_uncertainty_and_flags_it():
    # A blackbody just above 1000 K: draws below it have no CCT (CIE 015 range), so u(CCT) is not stated.
    from lampcalc.physics.blackbody import spectral_radiance

    hot = spectral_radiance(1000.5, GRID_NM, c2_mK=1.4388e-2)
    r = rate_with_uncertainty(SpectralBatch(GRID_NM, hot[None], ("bb",)), MeasurementModel(noise_percent=2.0, draws=100))
    assert np.isfinite(r["cct_K"][0]) and np.isnan(r["cct_K_u"][0]) and np.all(np.isnan(r["cct_K_interval95"][0]))
    assert "uncertainty_incomplete" in r["flags"][0] and np.isfinite(r["x_u"][0])


def test_output_keys_follow_their_rating_and_are_documented():
    from pathlib import Path

    r = rate_with_uncertainty(_batch(GRID_NM, _led(GRID_NM)), MeasurementModel(noise_percent=0.5, draws=100))
    keys = r.output_keys()
    assert keys[keys.index("cct_K") + 1: keys.index("cct_K") + 3] == ["cct_K_u", "cct_K_interval95"]
    assert r.to_csv().splitlines()[0].split(",") == keys
    assert len(r.records()[0]["ri_interval95"]) == 15 and len(r.records()[0]["ri_interval95"][0]) == 2
    assert {"x", "cct_K", "ra", "ri", "rf_hue_bins", "melanopic_edi_lx"} <= set(propagated_keys(r))
    doc = (Path(__file__).resolve().parents[2] / "docs" / "uncertainty.md").read_text(encoding="utf-8")
    for key in NOT_PROPAGATED:
        assert f"`{key}`" in doc, key
    assert r.extras["uncertainty"].xy.shape == (1, 100, 2)
    # Spreadsheets: the _u columns follow their rating's, an interval is two columns (docs/output-fields.md).
    from lampcalc.rating.wide_columns import wide_columns

    wide = list(wide_columns(r))
    assert wide[wide.index("cct_K"): wide.index("cct_K") + 4] == ["cct_K", "cct_K_u", "cct_K_interval95_low", "cct_K_interval95_high"]
    assert wide.index("r15") + 1 == wide.index("r1_u") and wide.index("r15_u") + 1 == wide.index("r1_interval95_low")


def _tilted_to_dc(target_dc):
    """A 3000 K blackbody with a green hump, scaled until its CIE 13.3 DC is ``target_dc`` (a constructed lamp)."""
    from scipy.optimize import brentq

    from lampcalc.physics.blackbody import spectral_radiance

    bb, hump = spectral_radiance(3000.0, GRID_NM), np.exp(-0.5 * ((GRID_NM - 540.0) / 20.0) ** 2)

    def dc(a):
        return rate_spectra(SpectralBatch(GRID_NM, (bb * (1 + a * hump))[None], ("t",)))["cri_dc"][0] - target_dc

    return bb * (1 + brentq(dc, 0.0, 1.0, xtol=1e-9) * hump)


def test_draws_that_cross_a_validity_limit_are_flagged_with_their_share():
    # CIE 13.3-1995 limits Ra to DC ≤ 5.4e-3. A lamp at DC = 5.4e-3 under noise: part of the draws lie beyond.
    from lampcalc.rating.flags import doubtful_interval_keys, explain

    lamp = SpectralBatch(GRID_NM, _tilted_to_dc(5.4e-3)[None], ("edge",))
    r = rate_with_uncertainty(lamp, MeasurementModel(noise_percent=1.0, draws=400))
    low, high = r["cri_dc_interval95"][0]
    assert low < 5.4e-3 < high
    (entry,) = [e for e in r["uncertainty_flags_in_draws"][0] if e.startswith("cri_outside_validity")]
    share = float(entry.split(": ")[1].split(" %")[0])
    assert 2.5 < share < 97.5  # the limit lies inside the 95 % interval, so between its tails
    assert "uncertainty_crosses_validity" in r["flags"][0] and explain("uncertainty_crosses_validity")
    assert {"ra", "ri"} <= doubtful_interval_keys(r["flags"][0], r["uncertainty_flags_in_draws"][0])
    # Far inside the limit (DC = 2e-3), no draw crosses it.
    inside = rate_with_uncertainty(SpectralBatch(GRID_NM, _tilted_to_dc(2e-3)[None], ("in",)),
                                   MeasurementModel(noise_percent=1.0, draws=200))
    assert not any(e.startswith("cri_outside_validity") for e in inside["uncertainty_flags_in_draws"][0])


@pytest.mark.parametrize("t_K", [3220.0, 3000.0])
def test_a_category_that_changes_between_draws_is_flagged(t_K):
    # ANSI C78.377-2017 Table 1: the 3000 K category spans 3045 ± 175 K, so 3220 K is the edge to 3500 K;
    # a blackbody there falls on both sides under the model, one at 3000 K on one side only. The check is
    # against the categories of the draws' own (x, y), classified apart from the rating.
    from lampcalc.physics.blackbody import spectral_radiance
    from lampcalc.standards.ansi_bins import classify

    lamp = SpectralBatch(GRID_NM, spectral_radiance(t_K, GRID_NM)[None], ("bb",))
    r = rate_with_uncertainty(lamp, MeasurementModel(noise_percent=1.0, wavelength_shift_nm=0.5, draws=300))
    found = classify(r.extras["uncertainty"].xy[0])["nominal_cct_K"]
    assert len(set(np.nan_to_num(found, nan=-1.0).tolist())) == (2 if t_K == 3220.0 else 1)
    assert ("uncertainty_category_varies" in r["flags"][0]) == (t_K == 3220.0)
