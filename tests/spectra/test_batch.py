"""SpectralBatch keeps each lamp's own data (names, power, angle, flags) through slicing, joining and resampling.

Internal bookkeeping of the container; the values themselves come from Planck's law.
"""

import numpy as np
import pytest

from lampcalc.physics.blackbody import spectral_radiance
from lampcalc.spectra.batch import SpectralBatch
from lampcalc.spectra.resampling import GRID_NM


def _batch(temps, angles=None):
    wl = np.arange(380.0, 781.0, 5.0)
    return SpectralBatch(wl, spectral_radiance(temps, wl), names=[f"T{t:g}" for t in temps],
                         electrical_W=[10.0] * len(temps), angle_deg=angles)


def test_angle_defaults_to_unknown_and_follows_each_lamp():
    assert np.all(np.isnan(_batch([3000.0]).angle_deg))
    joined = SpectralBatch.concatenate([_batch([3000.0, 4000.0], [0.0, 30.0]), _batch([5000.0], [60.0])])
    assert joined.angle_deg.tolist() == [0.0, 30.0, 60.0]
    picked = joined[[2, 0]]
    assert picked.names == ("T5000", "T3000")
    assert picked.angle_deg.tolist() == [60.0, 0.0]
    on_grid = picked.on_grid()
    assert np.array_equal(on_grid.wavelength_nm, GRID_NM)
    assert on_grid.angle_deg.tolist() == [60.0, 0.0]


def test_angle_shape_is_checked():
    with pytest.raises(ValueError, match="angle_deg must have shape"):
        _batch([3000.0, 4000.0], [0.0])


def test_interpolation_recorded_per_lamp_through_joins_and_slices():
    # resampling.method_for decides (CIE 015:2018 clause 7.2, CIE 167:2005); the batch keeps it per lamp.
    fine = np.arange(380.0, 780.01, 0.5)
    five = _batch([3000.0, 4000.0]).on_grid()
    half = SpectralBatch(fine, spectral_radiance([5000.0], fine), names=["T5000h"]).on_grid()
    assert five.interpolation == ("sprague", "sprague") and half.interpolation == ("integrated",)
    joined = SpectralBatch.concatenate([five, half])
    assert joined.interpolation == ("sprague", "sprague", "integrated")
    assert joined[[2, 0]].interpolation == ("integrated", "sprague")
    assert joined.on_grid("linear") is joined  # already on the grid: resampled once, never twice
    assert _batch([3000.0]).interpolation == ("",)


def test_fine_narrow_lines_are_integrated_without_a_false_undershoot():
    # 0.1 nm data of lines 0.2 nm wide (sigma): integration of non-negative data cannot go below zero
    # (its rounding must not raise the Sprague flag). Internal property, no published source.
    wl = np.round(np.arange(380.0, 780.01, 0.1), 4)
    lines = sum(a * np.exp(-0.5 * ((wl - c) / 0.2) ** 2) for a, c in [(1.0, 436.03), (1.5, 546.07), (0.8, 611.3)])
    on_grid = SpectralBatch(wl, lines, names=["lines"]).on_grid()
    assert on_grid.interpolation == ("integrated",)
    assert on_grid.values.min() >= 0.0
    assert "interpolation_undershoot" not in on_grid.flags[0]
    # every watt counts once: the sum on the 1 nm grid equals the trapezoid integral of the data
    np.testing.assert_allclose(on_grid.values.sum(), np.trapezoid(lines, wl), rtol=1e-12)
