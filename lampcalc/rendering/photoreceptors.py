"""Scotopic and α-opic quantities of lamp spectra (CIE S 026/E:2018; CIE 1951 V′(λ)).

Spectra are on the 1 nm grid, shape ``(..., 471)``. The action spectra are tabulated
380–780 nm and zero outside, so every ratio here is over 380–780 nm.

* S/P ratio = K′m·Σ V′(λ)·S / (Km·Σ V(λ)·S), with K′m = 1700 lm/W and Km = 683 lm/W.
* α-opic efficacy of luminous radiation (ELR) K_α,v = Σ s_α(λ)·S / (Km·Σ V(λ)·S), in
  W/lm, reported in mW/lm (CIE S 026:2018, clause 3.9).
* α-opic daylight (D65) efficacy ratio (DER) = K_α,v / K_α,v(D65), and melanopic
  equivalent daylight illuminance mEDI = E_v · melanopic DER (clause 3.12).
"""

import numpy as np

from ..physics.constants import KM_lm_per_W, KM_SCOTOPIC_lm_per_W
from ..spectra.row_products import row_dot
from ..spectra.tables import (
    action_spectra_s026,
    luminous_efficiency,
    scotopic_luminous_efficiency,
)

#: The five α-opic channels of CIE S 026, in table order.
ALPHA_OPIC = ("s_cone", "m_cone", "l_cone", "rhodopic", "melanopic")
#: α-opic ELR of CIE standard illuminant D65, mW/lm, as CIE S 026:2018 tabulates them.
D65_ELR_mW_per_lm = np.array([0.8173, 1.4558, 1.6289, 1.4497, 1.3262])


def scotopic_photopic_ratio(values):
    """S/P ratio of spectra on the grid, shape ``(...)``.

    Examples
    --------
    >>> from lampcalc.physics.blackbody import spectral_radiance
    >>> from lampcalc.spectra.resampling import GRID_NM
    >>> round(float(scotopic_photopic_ratio(spectral_radiance(2856.0, GRID_NM))), 2)
    1.41
    """
    values = np.asarray(values, dtype=float)
    with np.errstate(invalid="ignore", divide="ignore"):
        return (KM_SCOTOPIC_lm_per_W * row_dot(values, scotopic_luminous_efficiency())) / (
            KM_lm_per_W * row_dot(values, luminous_efficiency())
        )


def alpha_opic_elr(values):
    """α-opic efficacies of luminous radiation, mW/lm, shape ``(..., 5)`` (order of :data:`ALPHA_OPIC`)."""
    values = np.asarray(values, dtype=float)
    with np.errstate(invalid="ignore", divide="ignore"):
        return 1000.0 * row_dot(values, action_spectra_s026()) / (KM_lm_per_W * row_dot(values, luminous_efficiency()))[..., None]


def alpha_opic_der(values):
    """α-opic daylight (D65) efficacy ratios, shape ``(..., 5)``; D65 gives 1 in every channel."""
    return alpha_opic_elr(values) / D65_ELR_mW_per_lm


def melanopic_edi_lx(values, illuminance_lx):
    """Melanopic equivalent daylight (D65) illuminance, lx: E_v × melanopic DER."""
    return np.asarray(illuminance_lx, dtype=float) * alpha_opic_der(values)[..., 4]
