"""``lampcalc planck``: blackbody numbers and spectra, checked against Planck's law."""

import json

import numpy as np
import pytest

from lampcalc.physics.blackbody import band_fraction, peak_wavelength_nm, radiant_exitance

PLANCK_KEYS = [
    "temperature_K", "peak_wavelength_nm", "peak_frequency_THz", "radiant_exitance_W_per_m2",
    "visible_fraction", "ler_lm_per_W", "x", "y", "cct_K", "duv",
]


def test_planck_json(run):
    result = run("planck", "2856", "5772", "--json")
    assert result.exit_code == 0
    records = json.loads(result.stdout)
    assert [list(r) for r in records] == [PLANCK_KEYS, PLANCK_KEYS]
    r = records[0]
    assert r["temperature_K"] == 2856.0
    # CODATA 2018 Wien b = 2.897771955e-3 m·K; σ = 5.670374419e-8.
    assert r["peak_wavelength_nm"] == pytest.approx(2.897771955e-3 / 2856 * 1e9, rel=1e-9)
    assert r["peak_frequency_THz"] == pytest.approx(5.878925757e10 * 2856 / 1e12, rel=1e-9)
    assert r["radiant_exitance_W_per_m2"] == pytest.approx(5.670374419e-8 * 2856**4, rel=1e-9)
    # Illuminant A's Planckian radiator (CIE 015): x, y near (0.4476, 0.4074); CCT back exactly.
    assert r["x"] == pytest.approx(0.4476, abs=2e-4) and r["y"] == pytest.approx(0.4074, abs=2e-4)
    assert r["cct_K"] == pytest.approx(2856.0, rel=1e-9) and abs(r["duv"]) < 1e-9
    # Trade value (shared/REFERENCE_VALUES.md): 2856 K radiation has about 16.4 lm/W over all wavelengths.
    assert r["ler_lm_per_W"] == pytest.approx(16.4, abs=0.1)
    assert r["visible_fraction"] == pytest.approx(float(band_fraction(2856.0)), rel=1e-12)


def test_planck_table_and_out_of_range_cct(run):
    result = run("planck", "500", "3000")
    assert result.exit_code == 0
    assert "outside 1000-100000 K" in result.stdout
    assert f"{float(peak_wavelength_nm(3000.0)):.1f}" in result.stdout
    data = json.loads(run("planck", "500", "--json").stdout)
    assert data[0]["cct_K"] is None and data[0]["radiant_exitance_W_per_m2"] == pytest.approx(
        float(radiant_exitance(500.0))
    )


@pytest.mark.parametrize("arg, message", [("abc", "'abc' is not a number"), ("0", "above 0 K"), ("nan", "above 0 K")])
def test_planck_bad_temperatures(run, arg, message):
    result = run("planck", "--", arg)
    assert result.exit_code == 2
    assert message in result.stderr
    assert "Traceback" not in result.output


@pytest.mark.parametrize("quantity", ["radiance", "exitance", "energy-density", "photon-radiance"])
@pytest.mark.parametrize("per", ["wavelength", "frequency"])
def test_planck_spectrum_file(run, tmp_path, quantity, per):
    out = tmp_path / "bb.csv"
    result = run("planck", "3000", "6500", "--spectrum", out, "--quantity", quantity, "--per", per,
                 "--range", "380", "780", "5")
    assert result.exit_code == 0
    lines = [l for l in out.read_text().splitlines() if not l.startswith("#")]
    assert lines[0] == "wavelength_nm,T_3000_K,T_6500_K"
    values = np.array([[float(v) for v in l.split(",")] for l in lines[1:]])
    assert values.shape == (81, 3) and np.all(values[:, 1:] > 0)


def test_planck_radiance_file_values(run, tmp_path):
    from lampcalc.physics.blackbody import spectral_radiance

    out = tmp_path / "bb.csv"
    run("planck", "3000", "--spectrum", out)
    lines = [l for l in out.read_text().splitlines() if not l.startswith("#")][1:]
    wl, value = (float(v) for v in lines[200].split(","))
    assert wl == 560.0 and value == pytest.approx(float(spectral_radiance(3000.0, [560.0])[0]), rel=1e-15)
