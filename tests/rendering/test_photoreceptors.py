"""S/P ratio and CIE S 026 α-opic quantities."""

import numpy as np
import pytest

from lampcalc.rendering.photoreceptors import (
    D65_ELR_mW_per_lm,
    alpha_opic_der,
    alpha_opic_elr,
    melanopic_edi_lx,
    scotopic_photopic_ratio,
)
from lampcalc.spectra.resampling import GRID_NM, linear


def _d65():
    import colour

    sd = colour.SDS_ILLUMINANTS["D65"]  # colour-science's copy of the CIE D65 table
    return linear(sd.wavelengths, sd.values)


def test_d65_alpha_opic_efficacies():
    # CIE S 026:2018: D65 α-opic ELR 0.8173, 1.4558, 1.6289, 1.4497, 1.3262 mW/lm (4 decimals).
    np.testing.assert_allclose(alpha_opic_elr(_d65()), [0.8173, 1.4558, 1.6289, 1.4497, 1.3262], atol=5e-5)
    np.testing.assert_array_equal(D65_ELR_mW_per_lm, [0.8173, 1.4558, 1.6289, 1.4497, 1.3262])


def test_d65_der_is_one():
    # CIE S 026:2018: DER is relative to D65, so D65's is 1 (to the 4-decimal rounding of the table).
    np.testing.assert_allclose(alpha_opic_der(_d65()), 1.0, atol=1e-4)


def test_sp_ratios():
    import colour

    # Common practice (shared/REFERENCE_VALUES.md): S/P of illuminant A ≈ 1.41 and of D65 ≈ 2.47;
    # colour-science gives 1.412 and 2.465.
    a = colour.SDS_ILLUMINANTS["A"]
    assert scotopic_photopic_ratio(linear(a.wavelengths, a.values)) == pytest.approx(1.41, abs=0.005)
    assert scotopic_photopic_ratio(_d65()) == pytest.approx(2.465, abs=0.005)


def test_melanopic_edi():
    # CIE S 026:2018, clause 3.12: mEDI = E_v × melanopic DER; for D65 itself mEDI = E_v.
    assert melanopic_edi_lx(_d65(), 500.0) == pytest.approx(500.0, rel=1e-4)
    warm = np.exp(-((GRID_NM - 600.0) / 40.0) ** 2)
    assert melanopic_edi_lx(warm, 500.0) < 200.0


def test_batches():
    batch = np.stack([_d65(), 2 * _d65(), np.exp(-((GRID_NM - 600.0) / 40.0) ** 2)])
    elr = alpha_opic_elr(batch)
    assert elr.shape == (3, 5)
    np.testing.assert_allclose(elr[0], elr[1], rtol=1e-14)  # independent of scale
    assert scotopic_photopic_ratio(batch).shape == (3,)
