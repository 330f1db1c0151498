"""The numbers ``lampcalc planck`` reports for a blackbody at each temperature."""

import numpy as np

from ..physics.blackbody import (
    band_fraction,
    peak_frequency_Hz,
    peak_wavelength_nm,
    radiant_exitance,
    spectral_radiance,
    temperatures,
)
from ..physics.constants import C2_CIE_mK
from ..spectra.resampling import GRID_NM
from .locus import locate
from .photometry import luminous_efficacy_of_blackbody
from .tristimulus import XYZ_to_xy, tristimulus, xy_to_uv

#: Keys of :func:`summarise_blackbody`, with units.
BLACKBODY_FIELDS = {
    "temperature_K": "temperature, K",
    "peak_wavelength_nm": "peak of the per-wavelength spectrum (Wien), nm",
    "peak_frequency_THz": "peak of the per-frequency spectrum (Wien), THz",
    "radiant_exitance_W_per_m2": "total exitance σT⁴, W/m2",
    "visible_fraction": "fraction of the total power between 380 and 780 nm",
    "ler_lm_per_W": "luminous efficacy of the radiation over all wavelengths, lm/W",
    "x": "CIE 1931 x of the Planckian radiator (c2 = 1.4388e-2 m·K, CIE 015:2018)",
    "y": "CIE 1931 y of the Planckian radiator",
    "cct_K": "CCT of that chromaticity found back from the locus, K (null outside 1000-100000 K)",
    "duv": "its Duv (zero to rounding for a Planckian radiator)",
}


def summarise_blackbody(temperature_K):
    """Columns of :data:`BLACKBODY_FIELDS` for temperatures of shape ``(n,)``.

    Raises
    ------
    InputError
        For a temperature that is not a finite number above 0 K.
    """
    t = np.atleast_1d(temperatures(temperature_K)).astype(float)
    xy = XYZ_to_xy(tristimulus(spectral_radiance(t, GRID_NM, c2_mK=C2_CIE_mK)))
    cct, duv, _ = locate(xy_to_uv(xy))
    return {
        "temperature_K": t,
        "peak_wavelength_nm": peak_wavelength_nm(t),
        "peak_frequency_THz": peak_frequency_Hz(t) / 1e12,
        "radiant_exitance_W_per_m2": radiant_exitance(t),
        "visible_fraction": band_fraction(t, 380.0, 780.0),
        "ler_lm_per_W": luminous_efficacy_of_blackbody(t),
        "x": xy[:, 0],
        "y": xy[:, 1],
        "cct_K": cct,
        "duv": duv,
    }
