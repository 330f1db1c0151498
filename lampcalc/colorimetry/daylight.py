"""CIE daylight: the daylight locus and the D-series spectra (CIE 015:2018, clause 4.1.2).

For a correlated colour temperature T between 4000 and 25 000 K:

* x_D = −4.6070e9/T³ + 2.9678e6/T² + 0.09911e3/T + 0.244063   (4000 K ≤ T ≤ 7000 K)
* x_D = −2.0064e9/T³ + 1.9018e6/T² + 0.24748e3/T + 0.237040   (7000 K < T ≤ 25 000 K)
* y_D = −3.000·x_D² + 2.870·x_D − 0.275
* S(λ) = S0(λ) + M1·S1(λ) + M2·S2(λ) with
  M1 = (−1.3515 − 1.7703x + 5.9114y)/M, M2 = (0.0300 − 31.4424x + 30.0717y)/M,
  M = 0.0241 + 0.2562x − 0.7341y, each of M1, M2 rounded to three decimals as CIE 015
  recommends so that D65 comes out as tabulated.

The temperatures in these formulas are the CCTs of the daylight phases: D65's is
6500·1.4388/1.438 ≈ 6504 K.
"""

import numpy as np

from ..errors import InputError
from ..spectra.tables import daylight_components

#: The range of the CIE daylight formulas, K.
DAYLIGHT_RANGE_K = (4000.0, 25000.0)


def daylight_locus_xy(cct_K):
    """Chromaticity x, y of CIE daylight at the given CCTs, shape ``(..., 2)``.

    Raises
    ------
    InputError
        For a temperature outside 4000–25 000 K, where the formulas are not defined.

    Examples
    --------
    >>> [round(float(c), 5) for c in daylight_locus_xy(6504.0)]
    [0.31271, 0.32912]
    """
    t = np.asarray(cct_K, dtype=float)
    bad = ~((t >= DAYLIGHT_RANGE_K[0]) & (t <= DAYLIGHT_RANGE_K[1]))
    if np.any(bad):
        raise InputError(
            f"CIE daylight is defined for 4000-25000 K only, got {t[bad].flat[0]:g} K"
        )
    low = -4.6070e9 / t**3 + 2.9678e6 / t**2 + 0.09911e3 / t + 0.244063
    high = -2.0064e9 / t**3 + 1.9018e6 / t**2 + 0.24748e3 / t + 0.237040
    x = np.where(t <= 7000.0, low, high)
    y = -3.000 * x**2 + 2.870 * x - 0.275
    return np.stack([x, y], axis=-1)


def daylight_spectrum(cct_K, interpolation="linear"):
    """Relative spectra of CIE daylight on the grid (360–830 nm, 1 nm), shape ``(..., 471)``.

    Scaled as CIE 015 scales them (S0 + M1·S1 + M2·S2, 100 near 560 nm). The 5 nm
    components are interpolated to 1 nm linearly (CIE 015), or by ``"sprague"``.
    """
    xy = daylight_locus_xy(cct_K)
    x, y = xy[..., 0], xy[..., 1]
    m = 0.0241 + 0.2562 * x - 0.7341 * y
    m1 = np.round((-1.3515 - 1.7703 * x + 5.9114 * y) / m, 3)
    m2 = np.round((0.0300 - 31.4424 * x + 30.0717 * y) / m, 3)
    s = daylight_components(interpolation)
    return s[:, 0] + m1[..., None] * s[:, 1] + m2[..., None] * s[:, 2]
