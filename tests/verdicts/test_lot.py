"""Lot statistics against direct computations on invented lots, and on rated Planckian spectra.

Sources: NumPy directly on the same invented columns (mean, ddof=1 standard deviation, linear
percentiles); colour-science's xy_to_Luv_uv for u′, v′ (reference library); ANSI C78.377-2017
Table 1 centres as copied in shared/REFERENCE_VALUES.md (3000 K: 0.4339, 0.4033; 4000 K:
0.3818, 0.3797, 4 decimals); the IEC 60081 Annex D metric for F3000 (g = 39, −19.5, 27.5 ×1e4),
from memory; the CIE TN 001 step of 0.0011 in u′v′, from memory; Planck's law for the spectra.
"""

import itertools

import numpy as np
import pytest

from lampcalc.verdicts.lot import LOT_RATINGS, NOT_SUMMARY, SPREAD_KEYS, lot_statistics, steps_between, steps_ring_xy

ANSI_3000 = (0.4339, 0.4033)  # REFERENCE_VALUES.md, ANSI C78.377-2017 3000 K centre (4 decimals)
ANSI_4000 = (0.3818, 0.3797)  # REFERENCE_VALUES.md, 4000 K centre
F3000 = 1e4 * np.array([[39.0, -19.5], [-19.5, 27.5]])  # IEC 60081 Annex D, F3000 metric (from memory)


def test_issue_keys_and_rating_statistics(invent, around):
    xy = around(ANSI_3000)
    ratings = invent(xy)
    lot = lot_statistics(ratings, nominal_cct_K=3000)
    for key in ("n_samples", "mean_x", "mean_y", "mean_u_prime", "mean_v_prime", "max_pairwise_delta_uv_prime"):
        assert key in lot
    assert set(SPREAD_KEYS) <= set(lot)
    assert lot["n_samples"] == 12
    for rating in ("cct_K", "ra", "rf", "ler_lm_per_W", "sp_ratio"):
        v = np.asarray(ratings[rating])  # NumPy directly on the invented column
        assert lot[f"{rating}_n"] == 12
        assert lot[f"{rating}_mean"] == pytest.approx(np.mean(v), rel=1e-13)
        assert lot[f"{rating}_sd"] == pytest.approx(np.std(v, ddof=1), rel=1e-12)
        assert (lot[f"{rating}_min"], lot[f"{rating}_max"]) == (np.min(v), np.max(v))
        assert lot[f"{rating}_p05"] == pytest.approx(np.percentile(v, 5), rel=1e-13)
        assert lot[f"{rating}_p95"] == pytest.approx(np.percentile(v, 95), rel=1e-13)
    r9 = np.asarray(ratings["ri"])[:, 8]  # R9 is the ninth special index
    assert lot["r9_mean"] == pytest.approx(np.mean(r9), rel=1e-13)
    for rating in ("luminous_flux_lm", "efficacy_lm_per_W"):  # relative spectra: no value, no statistic
        assert lot[f"{rating}_n"] == 0 and np.isnan(lot[f"{rating}_mean"])
    assert set(f"{r}_{s}" for r in LOT_RATINGS for s in ("n", "mean", "sd", "min", "max", "p05", "p95")) <= set(lot)


def test_mean_point_in_xy_and_in_upvp(invent, around):
    import colour

    xy = around(ANSI_4000, n=9, spread=0.004)
    lot = lot_statistics(invent(xy))
    assert (lot["mean_x"], lot["mean_y"]) == pytest.approx(tuple(xy.mean(axis=0)), rel=1e-14)
    upvp = colour.xy_to_Luv_uv(xy)  # colour-science (reference library)
    assert (lot["mean_u_prime"], lot["mean_v_prime"]) == pytest.approx(tuple(upvp.mean(axis=0)), rel=1e-14)
    # the mean of u', v' is not the u', v' of the mean x, y
    assert lot["mean_u_prime"] != pytest.approx(colour.xy_to_Luv_uv(xy.mean(axis=0))[0], rel=1e-9)
    deltas = np.hypot(*(upvp - upvp.mean(axis=0)).T)
    np.testing.assert_allclose(lot["samples"]["delta_uv_prime_from_mean"], deltas, rtol=1e-9)
    assert lot["max_delta_uv_prime_from_mean"] == pytest.approx(deltas.max(), rel=1e-9)


def test_largest_pairwise_delta_uv_prime_against_every_pair(invent, around):
    import colour

    xy = around(ANSI_3000, n=15, spread=0.003, seed=7)
    lot = lot_statistics(invent(xy))
    upvp = colour.xy_to_Luv_uv(xy)  # colour-science (reference library)
    best, pair = max((float(np.hypot(*(upvp[i] - upvp[j]))), (i, j)) for i, j in itertools.combinations(range(15), 2))
    assert lot["max_pairwise_delta_uv_prime"] == pytest.approx(best, rel=1e-9)
    assert lot["max_pairwise_samples"] == [f"S{pair[0] + 1:02d}", f"S{pair[1] + 1:02d}"]


def test_steps_from_the_claimed_centre_and_the_share_within(invent, around):
    xy = around(ANSI_3000, spread=0.002, seed=3)
    lot = lot_statistics(invent(xy), nominal_cct_K=3000)
    d = xy - np.array(ANSI_3000)
    expected = np.sqrt(np.einsum("ni,ij,nj->n", d, F3000, d))  # IEC 60081 Annex D definition of steps
    np.testing.assert_allclose(lot["samples"]["sdcm_steps"], expected, atol=0.05)  # centre given to 4 decimals
    steps = np.asarray(lot["samples"]["sdcm_steps"])
    for k in range(1, 8):
        assert lot[f"within_{k}_steps_percent"] == pytest.approx(100.0 * np.count_nonzero(steps <= k) / 12)
    assert lot["sdcm_steps_mean"] == pytest.approx(steps.mean(), rel=1e-13)
    assert lot["steps_centre_chosen"] == "claimed" and lot["steps_centre_nominal_cct_K"] == 3000
    assert (lot["steps_centre_x"], lot["steps_centre_y"]) == pytest.approx(ANSI_3000, abs=6e-5)


def test_centre_defaults_to_the_category_nearest_the_mean(invent, around):
    lot = lot_statistics(invent(around(ANSI_4000, spread=0.001)))
    assert lot["steps_centre_nominal_cct_K"] == 4000 and lot["steps_centre_chosen"] == "nearest category"


def test_circle_steps_are_upvp_distance_over_0_0011(invent, around):
    import colour

    xy = around(ANSI_3000, seed=4)
    lot = lot_statistics(invent(xy), nominal_cct_K=3000, steps="circle")
    d = colour.xy_to_Luv_uv(xy) - colour.xy_to_Luv_uv(np.array([lot["steps_centre_x"], lot["steps_centre_y"]]))
    np.testing.assert_allclose(lot["samples"]["sdcm_steps"], np.hypot(*d.T) / 0.0011, rtol=1e-9)  # CIE TN 001, from memory


def test_ellipse_against_the_covariance(invent, around):
    xy = around(ANSI_3000, n=20, spread=0.0015, seed=9)
    lot = lot_statistics(invent(xy), nominal_cct_K=3000)
    cov = np.cov(xy.T, ddof=1)  # NumPy, divisor n - 1
    assert (lot["cov_xx"], lot["cov_xy"], lot["cov_yy"]) == pytest.approx((cov[0, 0], cov[0, 1], cov[1, 1]), rel=1e-12)
    chi2 = 5.991464547107979  # chi-square 95 % quantile, 2 dof (SciPy)
    eig = np.linalg.eigvalsh(cov)
    assert lot["ellipse_semi_major_xy"] == pytest.approx(np.sqrt(chi2 * eig[1]), rel=1e-12)
    # In steps: the extreme values of dᵀGd on dᵀS⁻¹d = χ² are χ² times the eigenvalues of G·S.
    ratios = np.sort(np.linalg.eigvals(F3000 @ cov).real)
    assert lot["ellipse_max_steps_from_mean"] == pytest.approx(np.sqrt(chi2 * ratios[1]), rel=1e-5)
    assert lot["ellipse_min_steps_from_mean"] == pytest.approx(np.sqrt(chi2 * ratios[0]), rel=1e-5)
    # Reach from the centre, by an independent parametrisation of the ellipse (Cholesky, 200 000 points).
    t = np.linspace(0.0, 2 * np.pi, 200_000)
    ring = xy.mean(axis=0) + np.sqrt(chi2) * np.stack([np.cos(t), np.sin(t)], -1) @ np.linalg.cholesky(cov).T
    d = ring - np.array([lot["steps_centre_x"], lot["steps_centre_y"]])
    reach = np.sqrt(np.einsum("ni,ij,nj->n", d, F3000, d)).max()
    assert lot["ellipse_max_steps_from_centre"] == pytest.approx(reach, rel=1e-6)


def test_samples_in_each_ansi_category(invent):
    # Table 1 centres lie inside their quadrangles; a point 0.02 below the locus is in none.
    xy = np.array([ANSI_3000] * 5 + [ANSI_4000] * 3 + [(0.45, 0.36)])
    lot = lot_statistics(invent(xy))
    assert list(lot["ansi_bins_nominal_cct_K"]) == [3000.0, 4000.0]
    assert lot["ansi_bins_count"] == [5, 3] and lot["ansi_bins_none_count"] == 1


def test_small_lots_are_flagged_and_give_no_spread(invent):
    one = lot_statistics(invent(np.array([ANSI_3000])))
    assert {"lot_too_small_for_sd", "lot_too_small_for_ellipse"} <= set(one["flags"])
    assert np.isnan(one["ra_sd"]) and np.isnan(one["max_pairwise_delta_uv_prime"]) and one["max_pairwise_samples"] == []
    two = lot_statistics(invent(np.array([ANSI_3000, ANSI_4000])))
    assert "lot_too_small_for_ellipse" in two["flags"] and "lot_too_small_for_sd" not in two["flags"]
    assert np.isnan(two["ellipse_semi_major_xy"]) and np.isfinite(two["ra_sd"])


def test_doubtful_and_partial_values_are_flagged(invent, around):
    xy = around(ANSI_3000, n=6)
    flags = ((), ("cri_outside_validity",), (), (), (), ())
    rf = np.array([83.0, 84.0, np.nan, 82.0, 85.0, 83.5])
    lot = lot_statistics(invent(xy, flags=flags, rf=rf))
    assert {"lot_doubtful_values", "lot_partial_values"} <= set(lot["flags"])
    assert lot["doubtful_ratings"] == ["ra", "r9"]  # the flag makes Ra and the Ri doubtful (rating/flags.py)
    assert lot["partial_ratings"] == ["rf"] and lot["rf_n"] == 5
    assert lot["rf_mean"] == pytest.approx(np.nanmean(rf))


@pytest.mark.parametrize("xy", [
    [[0.30, 0.60], [0.31, 0.61], [0.30, 0.62]],  # green, Duv far beyond 0.05: CIE 015 advises no CCT
    [[0.68, 0.31], [0.69, 0.30], [0.67, 0.32]],  # red, below 1000 K: no CCT
])
def test_a_lot_far_from_white_has_no_centre(invent, xy):
    lot = lot_statistics(invent(np.array(xy)))
    assert "lot_not_white" in lot["flags"] and lot["steps_centre_chosen"] == "none"
    assert np.all(np.isnan(lot["samples"]["sdcm_steps"])) and np.isnan(lot["within_3_steps_percent"])
    assert np.isnan(lot["ellipse_max_steps_from_mean"]) and np.isfinite(lot["ellipse_semi_major_xy"])


def test_bad_input(invent):
    from lampcalc.errors import InputError

    with pytest.raises(InputError, match="2200 to 6500 K"):
        lot_statistics(invent(np.array([ANSI_3000] * 3)), nominal_cct_K=1800)
    with pytest.raises(InputError, match="IEC 60081.* has no centre for 4500 K"):
        lot_statistics(invent(np.array([ANSI_3000] * 3)), nominal_cct_K=4500, centre="set")


@pytest.mark.parametrize("method", ["ellipse", "circle"])
def test_step_rings_are_n_steps_from_their_centre(method):
    import colour

    ring = steps_ring_xy(ANSI_3000, 3000, 2.5, method)
    if method == "ellipse":
        d = ring - np.array(ANSI_3000)
        steps = np.sqrt(np.einsum("ni,ij,nj->n", d, F3000, d))  # IEC 60081 Annex D, F3000 (from memory)
    else:
        steps = np.hypot(*(colour.xy_to_Luv_uv(ring) - colour.xy_to_Luv_uv(np.array(ANSI_3000))).T) / 0.0011
    np.testing.assert_allclose(steps, 2.5, rtol=1e-9)
    np.testing.assert_allclose(steps_between(ring, ANSI_3000, 3000, method), 2.5, rtol=1e-9)


def test_lot_of_rated_planckian_spectra():
    # Planck's law at 2950-3050 K: the lot's CCTs are the temperatures (the locus is Planck's, CIE 015), scaled by
    # CIE 015's c2 over CODATA's (1.4388e-2 / 1.438776877e-2, REFERENCE_VALUES.md) as the spectra use CODATA's.
    import colour

    from lampcalc.physics.blackbody import spectral_radiance
    from lampcalc.rating.rate import rate_spectra
    from lampcalc.spectra.batch import SpectralBatch
    from lampcalc.spectra.resampling import GRID_NM

    temps = np.linspace(2950.0, 3050.0, 7)
    batch = SpectralBatch(GRID_NM, spectral_radiance(temps, GRID_NM), names=[f"T{t:g}" for t in temps])
    ratings = rate_spectra(batch)
    lot = lot_statistics(ratings)
    assert lot["cct_K_mean"] == pytest.approx(temps.mean() * 1.4388e-2 / 1.438776877e-2, abs=0.005)
    assert lot["cct_K_sd"] == pytest.approx(np.std(temps, ddof=1), rel=1e-3)
    assert abs(lot["duv_mean"]) < 1e-5
    upvp = colour.xy_to_Luv_uv(np.stack([ratings["x"], ratings["y"]], -1))  # colour-science
    assert lot["max_pairwise_delta_uv_prime"] == pytest.approx(np.hypot(*(upvp[0] - upvp[-1])), rel=1e-9)


def test_every_output_key_is_documented(invent, around):
    # docs/output-fields.md names every key (the per-rating keys through the list of ratings).
    import re
    from pathlib import Path

    doc = (Path(__file__).resolve().parents[2] / "docs" / "output-fields.md").read_text(encoding="utf-8")
    named = set(re.findall(r"`([A-Za-z_0-9]+)`", doc))
    lot = lot_statistics(invent(around(ANSI_3000)), nominal_cct_K=3000)
    ratings = [r for r in LOT_RATINGS if r in named]
    assert ratings == list(LOT_RATINGS)
    per_rating = {f"{r}_{s}" for r in LOT_RATINGS for s in ("n", "mean", "sd", "min", "max", "p05", "p95")}
    within = {f"within_{k}_steps_percent" for k in range(1, 8)}
    undocumented = set(lot) - named - per_rating - within - set(NOT_SUMMARY)
    assert undocumented == set()
    assert set(lot["samples"]) <= named
