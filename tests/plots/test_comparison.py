"""The comparison figure: both spectra at equal luminous quantity, and their ratio.

Sources: colour-science's CIE 1924 photopic V(λ) (reference library); Planck's law for the spectra.
"""

import numpy as np
import pytest

from lampcalc.plots import figure_style, save_figure
from lampcalc.plots.comparison import comparison_figure
from lampcalc.spectra.resampling import GRID_NM
from lampcalc.verdicts.comparison import compare_ratings


def _rated(temps, names, scale=1.0):
    from lampcalc.physics.blackbody import spectral_radiance
    from lampcalc.rating.rate import rate_spectra
    from lampcalc.spectra.batch import SpectralBatch

    values = scale * spectral_radiance(np.asarray(temps, dtype=float), GRID_NM) * ((GRID_NM >= 380) & (GRID_NM <= 780))
    return rate_spectra(SpectralBatch(GRID_NM, values, names=names, measured_range_nm=[[380.0, 780.0]] * len(names)))


def _line(fig, gid):
    (line,) = [a for ax in fig.axes for a in ax.lines if a.get_gid() == gid]
    return line


def test_spectra_at_equal_luminous_quantity_and_their_ratio(tmp_path):
    import colour

    ref, test = _rated([2700.0, 3000.0], ["a", "b"]), _rated([3000.0, 3000.0], ["b", "a"], scale=7.0)
    comparison = compare_ratings(ref, test)
    with figure_style():
        fig = comparison_figure(ref, test, comparison, k=1)  # pair "b" with "b": the same spectrum, 7 times brighter
        save_figure(fig, tmp_path / "c.pdf")
    v = colour.colorimetry.SDS_LEFS_PHOTOPIC["CIE 1924 Photopic Standard Observer"]
    v = v.copy().align(colour.SpectralShape(360, 830, 1)).values  # colour-science
    r, t = _line(fig, "reference_spectrum").get_ydata(), _line(fig, "test_spectrum").get_ydata()
    measured = (GRID_NM >= 380) & (GRID_NM <= 780)
    assert np.all(np.isnan(r[~measured])) and np.nanmax(r) == pytest.approx(1.0)
    assert np.nansum(r * v) == pytest.approx(np.nansum(t * v), rel=1e-12)
    ratio = _line(fig, "spectral_ratio").get_ydata()
    np.testing.assert_allclose(ratio[np.isfinite(ratio)], 1.0, rtol=1e-12)
    assert "Δu′v′ 0.0000" in fig.axes[0].get_title(loc="left")
    assert (tmp_path / "c.pdf").stat().st_size > 5_000
