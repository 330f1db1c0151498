"""A test spectrum beside a reference: a spectrum against itself, scaled copies, blackbodies, pairing.

Sources: colour-science's xy_to_Luv_uv and CIE 1924 photopic V(λ) (reference library); Planck's
law for the spectra, with CIE 015's c2 for the locus (REFERENCE_VALUES.md); luminous quantities
are linear in the spectrum (common practice, no source).
"""

import numpy as np
import pytest

from lampcalc.errors import InputError
from lampcalc.verdicts.comparison import COMPARED, compare_ratings, match_lamps, normalised_spectra

C2_RATIO = 1.4388e-2 / 1.438776877e-2  # CIE 015 c2 over CODATA c2: a Planck spectrum's CCT is T times this


def _rate(temps, names, quantity="flux", scale=1.0):
    from lampcalc.physics.blackbody import spectral_radiance
    from lampcalc.rating.rate import rate_spectra
    from lampcalc.spectra.batch import SpectralBatch
    from lampcalc.spectra.resampling import GRID_NM

    values = scale * spectral_radiance(np.asarray(temps, dtype=float), GRID_NM) * 1e-12
    return rate_spectra(SpectralBatch(GRID_NM, values, names=names, quantity=quantity))


def test_a_spectrum_against_itself_differs_in_nothing():
    ratings = _rate([2700.0, 4000.0], ["a", "b"])
    result = compare_ratings(ratings, ratings, limit_delta_uv_prime=0.0)
    p = result["pairs"]
    assert p["reference_name"] == ("a", "b") and result["unmatched_reference"] == []
    np.testing.assert_array_equal(p["delta_uv_prime"], 0.0)
    for key in COMPARED:
        delta = p[f"delta_{key}"]
        assert np.all((delta == 0) | np.isnan(delta)), key
    np.testing.assert_array_equal(p["delta_ri"], 0.0)
    np.testing.assert_array_equal(p["luminous_ratio"], 1.0)
    assert p["pass"] == (True, True)  # a shift of zero is within a limit of zero


def test_twice_the_light_has_the_same_colour_and_twice_the_lumens():
    # Luminous flux is linear in the spectral flux (common practice, no source); chromaticity is scale-free.
    ref, test = _rate([3000.0], ["lamp"]), _rate([3000.0], ["lamp"], scale=2.0)
    p = compare_ratings(ref, test)["pairs"]
    assert p["luminous_ratio"][0] == pytest.approx(2.0, rel=1e-12)
    assert p["delta_uv_prime"][0] == pytest.approx(0.0, abs=1e-15)
    assert p["delta_luminous_flux_lm"][0] == pytest.approx(p["reference_luminous_flux_lm"][0], rel=1e-12)
    assert p["pass"] == (None,) and p["flags"] == ((),)


def test_blackbodies_2700_and_3000_K():
    import colour

    ref, test = _rate([2700.0], ["old"]), _rate([3000.0], ["new"])  # one on each side: a pair whatever the names
    p = compare_ratings(ref, test, limit_delta_uv_prime=0.01)["pairs"]
    upvp = [colour.xy_to_Luv_uv(np.array([r["x"][0], r["y"][0]])) for r in (ref, test)]  # colour-science
    assert p["delta_uv_prime"][0] == pytest.approx(np.hypot(*(upvp[1] - upvp[0])), rel=1e-9)
    assert (p["delta_u_prime"][0], p["delta_v_prime"][0]) == pytest.approx(tuple(upvp[1] - upvp[0]), rel=1e-9)
    assert p["delta_cct_K"][0] == pytest.approx(300.0 * C2_RATIO, abs=0.005)  # Planck's law
    assert abs(p["delta_duv"][0]) < 1e-6
    assert p["reference_cct_K"][0] == pytest.approx(2700.0 * C2_RATIO, abs=0.005)
    assert p["pass"][0] is bool(p["delta_uv_prime"][0] <= 0.01)
    assert p["margin_delta_uv_prime"][0] == pytest.approx(0.01 - p["delta_uv_prime"][0])


def test_relative_against_absolute_gives_no_luminous_ratio():
    p = compare_ratings(_rate([3000.0], ["a"], "relative"), _rate([3000.0], ["a"]))["pairs"]
    assert np.isnan(p["luminous_ratio"][0]) and p["flags"][0] == ("luminous_ratio_needs_absolute_spectra",)


def test_pairs_by_name():
    pairs, lone_ref, lone_test = match_lamps(["a", "b", "c"], ["c", "x", "a"])
    assert pairs == [(0, 2), (2, 0)] and lone_ref == ["b"] and lone_test == ["x"]
    assert match_lamps(["sheet"], ["sample 7"]) == ([(0, 0)], [], [])
    with pytest.raises(InputError, match=r"no lamp name is common .* \(reference: a, b; test: c, d\)"):
        match_lamps(["a", "b"], ["c", "d"])
    with pytest.raises(InputError, match="the test spectra name lamp 'c' twice"):
        match_lamps(["a", "c"], ["c", "c"])
    with pytest.raises(InputError, match="non-negative"):
        ratings = _rate([3000.0], ["a"])
        compare_ratings(ratings, ratings, limit_delta_uv_prime=-1.0)


def test_normalised_spectra_have_equal_luminous_quantity_and_their_ratio():
    import colour

    from lampcalc.physics.blackbody import spectral_radiance
    from lampcalc.spectra.resampling import GRID_NM

    ref, test = spectral_radiance(np.array([2700.0, 5000.0]), GRID_NM)
    a, b, ratio = normalised_spectra(ref, 3.0 * test, reference_range_nm=[380.0, 780.0])
    v = colour.colorimetry.SDS_LEFS_PHOTOPIC["CIE 1924 Photopic Standard Observer"]
    v = v.copy().align(colour.SpectralShape(360, 830, 1)).values  # colour-science V(λ)
    assert a @ v == pytest.approx(b @ v, rel=1e-12) and a.max() == pytest.approx(1.0)
    valid = np.isfinite(ratio)
    assert not valid[GRID_NM < 380].any() and not valid[GRID_NM > 780].any()  # outside the measured range: no ratio
    np.testing.assert_allclose(ratio[valid], (b / a)[valid], rtol=1e-12)
    same = normalised_spectra(ref, 5.0 * ref)[2]
    np.testing.assert_allclose(same[np.isfinite(same)], 1.0, rtol=1e-12)


def test_every_output_key_is_documented():
    import re
    from pathlib import Path

    doc = (Path(__file__).resolve().parents[2] / "docs" / "output-fields.md").read_text(encoding="utf-8")
    named = set(re.findall(r"`([A-Za-z_0-9]+)`", doc))
    ratings = _rate([3000.0], ["a"])
    keys = set(compare_ratings(ratings, ratings)["pairs"])
    per_rating = {f"{side}_{key}" for key in COMPARED for side in ("reference", "test", "delta")}
    assert set(COMPARED) - named == set()
    assert keys - per_rating - named == set()
