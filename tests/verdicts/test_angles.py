"""Colour over angle, on Planckian spectra given angles of emission.

Sources: Planck's law for the spectra (their CCTs are their temperatures, CIE 015);
colour-science's xy_to_Luv_uv for u′, v′ and its CIE 1924 photopic V(λ) for the weights
(reference library); the weighted mean and the distances computed directly with NumPy.
"""

import numpy as np
import pytest

from lampcalc.errors import InputError
from lampcalc.verdicts.angles import colour_over_angle, has_angles

ANGLES = np.array([60.0, 0.0, 30.0, 80.0, 45.0])
TEMPS = np.array([3150.0, 3000.0, 3040.0, 3300.0, 3080.0])
SCALE = np.array([0.5, 1.0, 0.9, 0.15, 0.7])


def _rated(quantity="irradiance", angles=ANGLES):
    from lampcalc.physics.blackbody import spectral_radiance
    from lampcalc.rating.rate import rate_spectra
    from lampcalc.spectra.batch import SpectralBatch
    from lampcalc.spectra.resampling import GRID_NM

    values = SCALE[:, None] * spectral_radiance(TEMPS, GRID_NM) * 1e-12
    names = [f"L_{a:g}" for a in angles]
    batch = SpectralBatch(GRID_NM, values, names=names, quantity=quantity, angle_deg=angles,
                          sources=[f"gonio.csv, column {k + 2}" for k in range(len(names))])
    return rate_spectra(batch), values


def _upvp(ratings):
    import colour

    return colour.xy_to_Luv_uv(np.stack([ratings["x"], ratings["y"]], axis=-1))  # colour-science


def test_weighted_by_illuminance_for_absolute_spectra():
    import colour

    ratings, values = _rated("irradiance")
    result = colour_over_angle(ratings, limit_delta_uv_prime=0.01)
    v = colour.colorimetry.SDS_LEFS_PHOTOPIC["CIE 1924 Photopic Standard Observer"]
    weights = 683.0 * values @ v.copy().align(colour.SpectralShape(360, 830, 1)).values  # Km·ΣV·E·Δλ, lx
    upvp = _upvp(ratings)
    mean = weights @ upvp / weights.sum()
    assert result["angle_weighting"] == "illuminance_lx"
    assert (result["angle_mean_u_prime"], result["angle_mean_v_prime"]) == pytest.approx(tuple(mean), rel=1e-9)
    order = np.argsort(ANGLES)
    np.testing.assert_array_equal(result["angles"]["angle_deg"], ANGLES[order])
    np.testing.assert_allclose(result["angles"]["delta_uv_prime"], np.hypot(*(upvp - mean).T)[order], rtol=1e-7)
    np.testing.assert_allclose(result["angles"]["weight"], weights[order], rtol=1e-6)
    worst = int(np.argmax(np.hypot(*(upvp - mean).T)))
    assert result["max_delta_uv_prime_over_angle"] == pytest.approx(np.hypot(*(upvp[worst] - mean)), rel=1e-7)
    assert result["angle_of_max_delta_uv_prime_deg"] == ANGLES[worst] == 80.0
    # CCT over angle is the temperatures of Planck's law, on the locus's scale: the spectra use CODATA's
    # c2 = 1.438776877e-2 m·K, the locus CIE 015's 1.4388e-2 (REFERENCE_VALUES.md), so T scales by their ratio.
    on_locus = TEMPS * 1.4388e-2 / 1.438776877e-2
    np.testing.assert_allclose(result["angles"]["cct_K"], on_locus[order], atol=0.005)
    assert result["cct_min_over_angle_K"] == pytest.approx(on_locus.min(), abs=0.005)
    assert result["cct_max_over_angle_K"] == pytest.approx(on_locus.max(), abs=0.005)
    assert result["limit_delta_uv_prime"] == 0.01
    assert result["angle_pass"] is bool(result["max_delta_uv_prime_over_angle"] <= 0.01)


def test_relative_spectra_weigh_every_angle_alike():
    ratings, _ = _rated("relative")
    result = colour_over_angle(ratings)
    mean = _upvp(ratings).mean(axis=0)
    assert result["angle_weighting"] == "none"
    assert (result["angle_mean_u_prime"], result["angle_mean_v_prime"]) == pytest.approx(tuple(mean), rel=1e-9)
    assert result["angle_pass"] is None and result["limit_delta_uv_prime"] is None and np.isnan(result["angle_margin_delta_uv_prime"])


@pytest.mark.parametrize("above", [True, False])
def test_verdict_against_the_users_limit(above):
    ratings, _ = _rated()
    largest = colour_over_angle(ratings)["max_delta_uv_prime_over_angle"]
    limit = largest * (1.01 if above else 0.99)
    result = colour_over_angle(ratings, limit_delta_uv_prime=limit)
    assert result["angle_pass"] is above
    assert result["angle_margin_delta_uv_prime"] == pytest.approx(limit - largest)


def test_spectra_without_angle_are_refused():
    ratings, _ = _rated(angles=np.array([0.0, 10.0, np.nan, 30.0, 40.0]))
    assert not has_angles(ratings)
    with pytest.raises(InputError, match=r"gonio.csv, column 4: no angle of emission"):
        colour_over_angle(ratings)
    ratings, _ = _rated()
    assert has_angles(ratings)
    with pytest.raises(InputError, match="non-negative"):
        colour_over_angle(ratings, limit_delta_uv_prime=-0.001)


def test_every_output_key_is_documented():
    import re
    from pathlib import Path

    doc = (Path(__file__).resolve().parents[2] / "docs" / "output-fields.md").read_text(encoding="utf-8")
    named = set(re.findall(r"`([A-Za-z_0-9]+)`", doc))
    result = colour_over_angle(_rated()[0], limit_delta_uv_prime=0.01)
    assert set(result) - named == set() and set(result["angles"]) - named == set()
