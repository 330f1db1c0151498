"""rate_spectra: every rating for a batch at once, the flags, and batch = loop."""

import numpy as np
import pytest

from lampcalc.physics.blackbody import spectral_radiance
from lampcalc.rating.ratings import FIELDS
from lampcalc.rating.rate import rate_spectra
from lampcalc.spectra.resampling import GRID_NM
from lampcalc.spectra.batch import SpectralBatch


def _led(peak_nm, width_nm):
    return np.exp(-0.5 * ((GRID_NM - peak_nm) / width_nm) ** 2)


def _white_led():
    return 1.0 * _led(450, 10) + 1.6 * _led(560, 45) + 0.5 * _led(630, 30)


def _batch(values, names, **kw):
    return SpectralBatch(GRID_NM, np.atleast_2d(values), names, **kw)


def test_batch_equals_loop():
    # The requirement: a batch of n gives the n single results (to rounding in BLAS sums).
    values = np.stack([spectral_radiance(2700.0, GRID_NM), _white_led(), _led(630, 10) + 0.01, 2.0 * _white_led()])
    names = ("bb", "led", "red", "led2")
    together = rate_spectra(_batch(values, names))
    for i, name in enumerate(names):
        alone = rate_spectra(_batch(values[i], (name,)))
        for key in FIELDS:
            a, b = together[key][i], alone[key][0]
            if a is None or isinstance(a, (str, tuple)):
                assert a == b, key
            else:
                np.testing.assert_allclose(a, b, rtol=1e-12, atol=1e-12, equal_nan=True, err_msg=key)


def test_scale_does_not_change_relative_ratings():
    r = rate_spectra(_batch(np.stack([_white_led(), 7.0 * _white_led()]), ("a", "b")))
    for key in ("cct_K", "duv", "ra", "rf", "rg", "ler_lm_per_W", "sp_ratio", "melanopic_der"):
        assert r[key][0] == pytest.approx(r[key][1], rel=1e-12), key


def test_blackbody_rates_like_its_own_reference():
    # CIE 13.3: a Planckian source below 5000 K is its own reference, so every Ri is 100.
    r = rate_spectra(_batch(spectral_radiance(3000.0, GRID_NM, c2_mK=1.4388e-2), ("bb",)))
    np.testing.assert_allclose(r["ri"][0], 100.0, atol=1e-9)
    assert r["cct_K"][0] == pytest.approx(3000.0, rel=1e-10)
    # Nothing wrong with the rendering; the shipped steps metric is unconfirmed, and a 3000 K radiator
    # still rises at 830 nm (Wien: peak near 966 nm), so its FWHM is open and its LER range-bound.
    assert r["flags"][0] == ("steps_metric_unconfirmed", "fwhm_at_range_end", "ler_depends_on_range")


def test_red_led_not_meaningful():
    # PITFALLS: a red LED has no meaningful Ra or Rf; lampcalc gives none and says why.
    r = rate_spectra(_batch(_led(630, 10), ("red",)))
    assert np.isnan(r["cct_K"][0]) and np.isnan(r["ra"][0]) and np.isnan(r["rf"][0])
    assert "rendering_not_meaningful" in r["flags"][0] and "cct_below_1000K" in r["flags"][0]


def test_greenish_source_outside_cri_validity():
    # CIE 13.3: DC > 5.4e-3 puts the result outside the method's validity: computed and flagged.
    values = _white_led() + 0.6 * _led(530, 20)
    r = rate_spectra(_batch(values, ("green",)))
    assert r["cri_dc"][0] > 5.4e-3 and np.isfinite(r["ra"][0])
    assert "cri_outside_validity" in r["flags"][0]


def test_absolute_quantities_and_efficacy():
    # 683 lm/W at 555 nm (CIE 015): a 2 W line at 555 nm gives 1366 lm; with 10 W electrical, 136.6 lm/W.
    line = np.zeros(471)
    line[555 - 360] = 2.0
    values = np.stack([line + 1e-6, line + 1e-6])
    r = rate_spectra(_batch(values, ("f", "e"), quantity=("flux", "irradiance"), electrical_W=[10.0, np.nan]))
    assert r["luminous_flux_lm"][0] == pytest.approx(1366.0, rel=1e-3)
    assert r["efficacy_lm_per_W"][0] == pytest.approx(136.6, rel=1e-3)
    assert np.isnan(r["luminous_flux_lm"][1]) and r["illuminance_lx"][1] == pytest.approx(1366.0, rel=1e-3)
    assert np.isfinite(r["melanopic_edi_lx"][1]) and np.isnan(r["melanopic_edi_lx"][0])


def test_records_are_json_ready_and_documented():
    import json
    from pathlib import Path

    r = rate_spectra(_batch(np.stack([_white_led(), _led(630, 10)]), ("w", "red")))
    records = json.loads(r.to_json())
    assert records[1]["ra"] is None and len(records[0]["ri"]) == 15 and len(records[0]["rf_hue_bins"]) == 16
    doc = (Path(__file__).resolve().parents[2] / "docs" / "output-fields.md").read_text(encoding="utf-8")
    for key in FIELDS:
        assert f"`{key}`" in doc, f"{key} is not documented in docs/output-fields.md"
    header = r.to_csv().splitlines()[0].split(",")
    assert header == [k for k in FIELDS if k in r.columns]


def test_non_white_source_has_no_steps_or_category():
    # A red LED is no white light: no ANSI category and no colour-consistency steps are given.
    r = rate_spectra(_batch(_led(630, 10), ("red",)))
    assert np.isnan(r["ansi_nominal_cct_K"][0]) and np.isnan(r["sdcm_steps"][0])
    assert "steps_metric_outside_set_range" not in r["flags"][0]


def test_ten_degree_observer_changes_chromaticity_not_the_2_degree_methods():
    # CIE 13.3 and ANSI C78.377 are defined with the CIE 1931 2° observer whatever is reported.
    values = _white_led()
    two = rate_spectra(_batch(values, ("w",)))
    ten = rate_spectra(_batch(values, ("w",)), observer="1964_10deg")
    assert ten["x"][0] != two["x"][0] and ten["cct_K"][0] != two["cct_K"][0]
    for key in ("ra", "rf", "sdcm_steps", "ansi_nominal_cct_K", "ansi_delta_cct_K"):
        np.testing.assert_array_equal(ten[key], two[key], err_msg=key)
