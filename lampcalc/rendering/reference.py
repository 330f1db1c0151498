"""Reference illuminants of the colour rendering methods, built for a batch of CCTs.

Both CIE 13.3 and CIE 224 compare a lamp with a reference illuminant of the same
correlated colour temperature: Planck's radiator (c2 = 1.4388e-2 m·K) at low CCT and CIE
daylight (CIE 015:2018) at high CCT. They differ in the switch:

* CIE 13.3-1995: Planckian below 5000 K, CIE daylight from 5000 K.
* CIE 224:2017 and ANSI/IES TM-30-18: Planckian below 4000 K, daylight above 5000 K, and
  between them a mixture of the two, each normalised to equal luminance (Y, CIE 1931 2°),
  with weight (T − 4000)/1000 on daylight.

CIE daylight is only defined for 4000–25 000 K, so no reference exists for a CCT that is
NaN or above 25 000 K; those rows are NaN.
"""

import numpy as np

from ..colorimetry.daylight import DAYLIGHT_RANGE_K, daylight_spectrum
from ..physics.blackbody import spectral_radiance
from ..physics.constants import C2_CIE_mK
from ..spectra.resampling import GRID_NM
from ..spectra.row_products import row_dot
from ..spectra.tables import colour_matching_functions


def _planckian(cct, band=slice(None)):
    t = np.where(np.isfinite(cct), cct, 5000.0)
    return spectral_radiance(t, GRID_NM[band], c2_mK=C2_CIE_mK)


def _daylight(cct, interpolation="linear", band=slice(None)):
    t = np.clip(np.where(np.isfinite(cct), cct, 6500.0), *DAYLIGHT_RANGE_K)
    return daylight_spectrum(t, interpolation)[..., band]


def reference_available(cct_K):
    """Where a reference illuminant exists: finite CCT not above 25 000 K."""
    cct = np.asarray(cct_K, dtype=float)
    return np.isfinite(cct) & (cct <= DAYLIGHT_RANGE_K[1])


def reference_cie13(cct_K):
    """CIE 13.3 reference spectra on the grid, shape ``(n, 471)``; NaN rows where none exists."""
    cct = np.asarray(cct_K, dtype=float)
    ref = np.full((cct.size, GRID_NM.size), np.nan)
    low, high = cct < 5000.0, (cct >= 5000.0) & reference_available(cct)
    ref[low] = _planckian(cct[low])
    ref[high] = _daylight(cct[high])
    return ref


def reference_cie224(cct_K, band=slice(None), daylight_interpolation="linear"):
    """CIE 224 / TM-30 reference spectra on the grid (or a ``band`` of it); NaN rows where none exists.

    The luminance normalisation of the 4000–5000 K mixture uses the same band.
    ``daylight_interpolation`` is passed to :func:`~lampcalc.colorimetry.daylight.daylight_spectrum`.
    """
    cct = np.asarray(cct_K, dtype=float)
    ybar = colour_matching_functions("1931_2deg")[band, 1]
    available = reference_available(cct)
    need_planck = cct <= 5000.0
    need_day = (cct >= 4000.0) & available
    planck = np.zeros((cct.size, ybar.size))
    day = np.zeros((cct.size, ybar.size))
    planck[need_planck] = _planckian(cct[need_planck], band)
    day[need_day] = _daylight(cct[need_day], daylight_interpolation, band)
    w = np.clip((cct - 4000.0) / 1000.0, 0.0, 1.0)[:, None]
    with np.errstate(invalid="ignore", divide="ignore"):
        mixed = (1 - w) * planck / row_dot(planck, ybar)[:, None] + w * day / row_dot(day, ybar)[:, None]
    ref = np.where((cct < 4000.0)[:, None], planck, np.where((cct > 5000.0)[:, None], day, mixed))
    ref[~available] = np.nan
    return ref
