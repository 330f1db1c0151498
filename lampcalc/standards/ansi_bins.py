"""Nominal CCT categories of ANSI C78.377-2017 and their quadrangles.

ANSI C78.377-2017 ("Specifications for the chromaticity of solid-state lighting
products"), Table 1, defines ten nominal CCT categories by a target CCT with a tolerance
and a target Duv with a tolerance of ±0.006; the targets give each lamp its ΔCCT and ΔDuv.
Each category's quadrangle in the CIE 1931 (x, y) diagram is given by the standard's
corner table; neighbouring quadrangles share their corners. lampcalc ships that table as
a bin set (``data/sets/ansi_c78377_2017_bins.csv``, :mod:`.bin_sets`): the corners for
2700–6500 K as published (2015 and 2017 editions), and for 2200 and 2500 K corners built
by the same construction (:func:`quadrangle_by_construction`), marked as not read from the
published table.

For a nominal CCT between the categories (the standard's flexible CCTs, 2200–6500 K) the
target CCT is the nominal value and the target Duv follows the centre line
Duv = 57700/T² − 44.6/T + 0.00854. The standard also gives a CCT tolerance for flexible
CCTs, but lampcalc holds no confirmed copy of it, so for a flexible nominal CCT it checks
neither a quadrangle nor a CCT tolerance (a laboratory with the standard supplies its
quadrangles as a bin set).
"""

from dataclasses import dataclass

import numpy as np

from ..colorimetry.locus import COORDINATE_SYSTEMS, cct_duv_to_xy
from ..colorimetry.tristimulus import uv_to_xy
from ..errors import InputError
from .bin_sets import classify as classify_in_set
from .bin_sets import margins, shipped_bin_set

EDITION = "ANSI C78.377-2017"
DUV_TOLERANCE = 0.006
FLEXIBLE_RANGE_K = (2200.0, 6500.0)
#: The shipped bin set of the standard's quadrangles (in ``lampcalc/data/sets``).
BIN_SET_FILE = "ansi_c78377_2017_bins.csv"
#: Below this CCT the quadrangles' corners sit on the Planckian locus' Duv of zero.
ZERO_DUV_BELOW_K = 2780.0

#: Table 1: nominal CCT -> (target CCT K, CCT tolerance K, target Duv).
TABLE_1 = {
    2200: (2238.0, 102.0, 0.0000),
    2500: (2460.0, 120.0, 0.0000),
    2700: (2725.0, 145.0, 0.0000),
    3000: (3045.0, 175.0, 0.0001),
    3500: (3465.0, 245.0, 0.0005),
    4000: (3985.0, 275.0, 0.0010),
    4500: (4503.0, 243.0, 0.0015),
    5000: (5029.0, 283.0, 0.0020),
    5700: (5667.0, 355.0, 0.0025),
    6500: (6532.0, 510.0, 0.0031),
}
NOMINAL_CCTS_K = tuple(TABLE_1)
FLEXIBLE_NOTE = (
    f"{EDITION} flexible CCT: tolerance not confirmed from a published source; supply a bin set with --bins"
)


def flexible_duv_centre(cct_K):
    """Target Duv of a flexible nominal CCT: 57700/T² − 44.6/T + 0.00854 (ANSI C78.377)."""
    t = np.asarray(cct_K, dtype=float)
    return 57700.0 / t**2 - 44.6 / t + 0.00854


def quadrangle_by_construction(low_cct_K, high_cct_K):
    """Quadrangle corners (x, y) built as ANSI C78.377's corner table is.

    Each corner lies at its own CCT (the category's lower or upper limit) and at the
    centre-line Duv of that CCT (zero below 2780 K) ± 0.006. For 2700–6500 K this
    reproduces the published corners within 1.6e-4 (``shared/REFERENCE_VALUES.md``);
    lampcalc uses it for the 2200 and 2500 K quadrangles.

    Returns
    -------
    ndarray, shape (4, 2)
        (low T, +Duv), (high T, +Duv), (high T, −Duv), (low T, −Duv).
    """
    t = np.array([low_cct_K, high_cct_K], dtype=float)
    centre = np.where(t < ZERO_DUV_BELOW_K, 0.0, flexible_duv_centre(t))
    return cct_duv_to_xy(
        np.array(
            [[t[0], centre[0] + DUV_TOLERANCE], [t[1], centre[1] + DUV_TOLERANCE],
             [t[1], centre[1] - DUV_TOLERANCE], [t[0], centre[0] - DUV_TOLERANCE]]
        )
    )


def ansi_bin_set():
    """The standard's quadrangles as a :class:`~lampcalc.standards.bin_sets.BinSet` (shipped)."""
    return shipped_bin_set(BIN_SET_FILE)


@dataclass(frozen=True)
class Category:
    """One nominal CCT category: its targets and, for Table 1, its quadrangle."""

    nominal_cct_K: float
    target_cct_K: float
    cct_tolerance_K: float  # NaN for a flexible CCT: no confirmed tolerance
    target_duv: float
    flexible: bool

    @property
    def bin_index(self):
        """Index of the category's quadrangle in :func:`ansi_bin_set`; None for a flexible CCT."""
        if self.flexible:
            return None
        return int(ansi_bin_set().bins_of_nominal(self.nominal_cct_K)[0])

    @property
    def corners_xy(self):
        """Quadrangle corners (x, y) from the corner table, shape (4, 2); None for a flexible CCT.

        In the table's order: (low T, +Duv), (high T, +Duv), (high T, −Duv), (low T, −Duv).
        """
        return None if self.flexible else ansi_bin_set().corners(self.bin_index)

    @property
    def centre_xy(self):
        """The target chromaticity (target CCT, target Duv), (x, y)."""
        return cct_duv_to_xy([self.target_cct_K, self.target_duv])

    def label(self):
        kind = "flexible" if self.flexible else "Table 1"
        return f"{self.nominal_cct_K:g} K ({EDITION}, {kind})"


def category(nominal_cct_K):
    """The category of a nominal CCT: a Table 1 category, or a flexible one.

    Raises
    ------
    InputError
        For a nominal CCT outside 2200–6500 K.
    """
    nominal = float(nominal_cct_K)
    if round(nominal) in TABLE_1 and nominal == round(nominal):
        target, tol, duv = TABLE_1[round(nominal)]
        return Category(nominal, target, tol, duv, False)
    if not FLEXIBLE_RANGE_K[0] <= nominal <= FLEXIBLE_RANGE_K[1]:
        raise InputError(
            f"nominal CCT {nominal:g} K: {EDITION} defines categories from 2200 to 6500 K only"
        )
    return Category(nominal, nominal, float("nan"), float(flexible_duv_centre(nominal)), True)


def quadrangle_margin(xy, nominal_cct_K):
    """Signed edge distance of chromaticities from a Table 1 category's quadrangle, CIE 1960 (u, v).

    Positive inside, zero on the boundary, negative outside.

    Raises
    ------
    InputError
        For a flexible nominal CCT, which has no published quadrangle in lampcalc.
    """
    cat = category(nominal_cct_K)
    if cat.flexible:
        raise InputError(f"{nominal_cct_K:g} K: {FLEXIBLE_NOTE}")
    return margins(xy, ansi_bin_set())[..., cat.bin_index]


def classify(xy):
    """The Table 1 category each chromaticity falls in (the published quadrangles).

    Parameters
    ----------
    xy : array_like, shape (..., 2)

    Returns
    -------
    dict of arrays, shape (...)
        ``nominal_cct_K``: the category whose quadrangle holds the point (NaN if none;
        inside two, the one it is deepest inside; on a shared edge, the lower nominal
        CCT); ``nearest_nominal_cct_K``: the category whose quadrangle holds or is nearest
        to the point; ``margin_uv``: the signed edge distance from that quadrangle in
        CIE 1960 (u, v); ``bin_confirmed``: whether that quadrangle's corners are read
        from the published table.
    """
    bins = ansi_bin_set()
    found = classify_in_set(xy, bins)
    nominal = np.append(bins.nominal_cct_K, np.nan)  # index −1 → NaN
    confirmed = np.append(bins.bin_confirmed, True)
    return {
        "nominal_cct_K": nominal[found["index"]],
        "nearest_nominal_cct_K": nominal[found["nearest"]],
        "margin_uv": found["margin_uv"],
        "bin_confirmed": confirmed[found["nearest"]],
    }


def nominal_cct_of(coords, system="xy", observer="1931_2deg"):
    """The Table 1 category holding each chromaticity, K (NaN if none), for ``lampcalc cct``.

    Parameters
    ----------
    coords : array_like, shape (..., 2)
    system : {"xy", "uv", "upvp"}
        CIE 1931 (x, y), CIE 1960 (u, v) or CIE 1976 (u′, v′).
    observer : {"1931_2deg", "1964_10deg"}
        The observer of the coordinates. The categories are defined with the 2° observer,
        so coordinates of the 10° observer fall in none (NaN).
    """
    coords = np.asarray(coords, dtype=float)
    if observer != "1931_2deg":
        return np.full(coords.shape[:-1], np.nan)
    return classify(uv_to_xy(COORDINATE_SYSTEMS[system](coords)))["nominal_cct_K"]
