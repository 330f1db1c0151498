"""Ellipse sets: colour-consistency metrics (one-step ellipses) around colour centres.

An ellipse set is a file in lampcalc's set format (:mod:`.set_files`,
``docs/standard-sets.md``) with one row per colour centre: ``name``, ``nominal_cct_K``,
the centre ``x, y`` (in the coordinates the file's ``# space`` names: x, y; u, v; or
u′, v′), an optional ``confirmed`` (yes/no per row), and the one-step ellipse either as a
metric ``g11, g12, g22`` (in units of 1e4, IEC 60081 Annex D's convention:
n² = 1e4·(g11·Δ₁² + 2·g12·Δ₁·Δ₂ + g22·Δ₂²)) or as semi-axes ``a, b`` and the angle
``theta_deg`` of ``a`` from the first coordinate axis, counter-clockwise. A set of a single
row without ``nominal_cct_K`` applies to every nominal CCT (a uniform metric such as u′v′
circles); its centre may then be blank.

Between centres the metric is interpolated linearly in reciprocal nominal CCT (mired);
outside the set's range the nearest centre's metric is used and the caller is told.

Shipped: ``data/sets/iec_60081_ellipses.csv`` and ``data/sets/cie_tn001_circles.csv``
(sources and editions in ``data/SOURCES.md``; both marked ``confirmed: no``).
"""

import functools
from dataclasses import dataclass
from importlib import resources

import numpy as np

from ..colorimetry.tristimulus import xy_to_upvp, xy_to_uv
from ..errors import InputError
from .bin_sets import TO_XY
from .set_files import number, read_set_table, row_confirmed

COLUMNS = ("name", "nominal_cct_K", "confirmed", "x", "y", "g11", "g12", "g22", "a", "b", "theta_deg")
#: Converts CIE 1931 (x, y) to a set file's coordinates.
FROM_XY = {"xy": lambda c: np.asarray(c, dtype=float), "uv": xy_to_uv, "upvp": xy_to_upvp}
#: The shipped sets, by the name ``--steps`` uses.
SHIPPED = {"ellipse": "iec_60081_ellipses.csv", "circle": "cie_tn001_circles.csv"}


@dataclass(frozen=True, eq=False)
class EllipseSet:
    """One-step ellipses around colour centres.

    Attributes
    ----------
    name, source, edition : str
    confirmed : bool
        ``# confirmed`` of the file.
    space : {"xy", "uv", "upvp"}
        The coordinates the metric works in.
    names : tuple of str, length n
    nominal_cct_K : ndarray, shape (n,)
        Ascending; a single NaN for a uniform set.
    centres : ndarray, shape (n, 2)
        In ``space``; NaN where not given.
    g : ndarray, shape (n, 3)
        The metric (g11, g12, g22) in units of 1e4, in ``space``.
    row_confirmed : ndarray of bool, shape (n,)
    """

    name: str
    source: str
    edition: str
    confirmed: bool
    space: str
    names: tuple
    nominal_cct_K: np.ndarray
    centres: np.ndarray
    g: np.ndarray
    row_confirmed: np.ndarray

    @property
    def uniform(self):
        """True for a single metric that applies to every nominal CCT."""
        return self.nominal_cct_K.size == 1 and np.isnan(self.nominal_cct_K[0])

    def metric(self, nominal_cct_K):
        """Metric (g11, g12, g22) in units of 1e4 for nominal CCTs, interpolated in mired.

        Returns
        -------
        g : ndarray, shape (..., 3)
        outside : ndarray of bool, shape (...)
            The nominal CCT lies outside the set's centres (nearest metric used).
        unconfirmed : ndarray of bool, shape (...)
            A row whose values are not confirmed entered the metric.
        """
        t = np.asarray(nominal_cct_K, dtype=float)
        if self.uniform:
            shape = t.shape
            return np.broadcast_to(self.g[0], shape + (3,)).copy(), np.zeros(shape, bool), np.full(shape, not self.row_confirmed[0])
        mired = 1e6 / self.nominal_cct_K[::-1]
        g = self.g[::-1]
        m = 1e6 / t
        out = np.stack([np.interp(m, mired, g[:, k]) for k in range(3)], axis=-1)
        # The rows that enter: the lower neighbour in mired (the nearest one below the range),
        # and the upper one when the point lies strictly between the two.
        confirmed = self.row_confirmed[::-1]
        lower = np.searchsorted(mired, m, side="right") - 1
        low = np.clip(lower, 0, mired.size - 1)
        between = (lower >= 0) & (lower < mired.size - 1) & (m > mired[low])
        unconfirmed = ~confirmed[low] | (between & ~confirmed[np.clip(lower + 1, 0, mired.size - 1)])
        outside = (t < self.nominal_cct_K[0]) | (t > self.nominal_cct_K[-1])
        return out, outside, unconfirmed & np.isfinite(t)

    def centre_xy(self, nominal_cct_K):
        """The set's own colour centre of a nominal CCT, CIE 1931 (x, y).

        Raises
        ------
        InputError
            When the set has no centre at that nominal CCT.
        """
        k = np.flatnonzero(self.nominal_cct_K == float(nominal_cct_K))
        if k.size == 0 or not np.all(np.isfinite(self.centres[k[0]])):
            listed = ", ".join(f"{c:g}" for c in self.nominal_cct_K if np.isfinite(c)) or "none"
            raise InputError(
                f"the ellipse set {self.name!r} has no centre for {float(nominal_cct_K):g} K "
                f"(centres: {listed}); use the ANSI centre"
            )
        return TO_XY[self.space](self.centres[k[0]])


def _metric(table, line, row):
    """(g11, g12, g22) in units of 1e4 from a row's metric or its semi-axes and angle."""
    has_g = any(row.get(c) for c in ("g11", "g12", "g22"))
    has_axes = any(row.get(c) for c in ("a", "b", "theta_deg"))
    if has_g == has_axes:
        raise table.fail(line, "give the ellipse either as g11, g12, g22 or as a, b, theta_deg (one of the two)")
    if has_g:
        g = np.array([number(table, line, row, c) for c in ("g11", "g12", "g22")])
    else:
        a = number(table, line, row, "a", positive=True)
        b = number(table, line, row, "b", positive=True)
        theta = np.deg2rad(number(table, line, row, "theta_deg"))
        c, s = np.cos(theta), np.sin(theta)
        g = 1e-4 * np.array([c**2 / a**2 + s**2 / b**2, c * s * (1 / a**2 - 1 / b**2), s**2 / a**2 + c**2 / b**2])
    if not (g[0] > 0 and g[0] * g[2] - g[1] ** 2 > 0):
        raise table.fail(line, "the metric is not an ellipse (g11 > 0 and g11*g22 - g12^2 > 0 are needed)")
    return g


def read_ellipse_set(path):
    """Read an ellipse set file.

    Raises
    ------
    InputError
        One line naming the file and line: bad metadata or columns, a blank or repeated
        name, a repeated or missing nominal CCT (only a single-row set may leave it blank),
        a malformed number, half a centre, or a metric that is not an ellipse.
    """
    table = read_set_table(path, COLUMNS, ("name",))
    names, nominal, centres, g, confirmed = [], [], [], [], []
    single = len(table.rows) == 1
    for line, row in table.rows:
        if not row["name"]:
            raise table.fail(line, "the name is blank")
        if row["name"] in names:
            raise table.fail(line, f"name {row['name']!r} is given twice")
        names.append(row["name"])
        t = number(table, line, row, "nominal_cct_K", positive=True, blank_ok=single)
        if t in nominal:
            raise table.fail(line, f"nominal_cct_K {t:g} is given twice")
        nominal.append(t)
        blank = [c for c in ("x", "y") if not row.get(c)]
        if len(blank) == 1:
            raise table.fail(line, f"column {blank[0]!r} is blank: give the centre's x and y, or neither")
        centres.append([number(table, line, row, c, blank_ok=True) for c in ("x", "y")])
        g.append(_metric(table, line, row))
        confirmed.append(row_confirmed(table, line, row))
    order = np.argsort(nominal)
    return EllipseSet(
        name=table.metadata["name"],
        source=table.metadata["source"],
        edition=table.metadata["edition"],
        confirmed=table.confirmed,
        space=table.metadata["space"],
        names=tuple(names[k] for k in order),
        nominal_cct_K=np.array(nominal)[order],
        centres=np.array(centres)[order],
        g=np.array(g)[order],
        row_confirmed=np.array(confirmed)[order],
    )


@functools.lru_cache(maxsize=None)
def shipped_ellipse_set(kind="ellipse"):
    """A shipped set: ``"ellipse"`` (IEC 60081 Annex D) or ``"circle"`` (CIE TN 001), read once."""
    if kind not in SHIPPED:
        raise ValueError(f"unknown steps method {kind!r}; choose one of {', '.join(SHIPPED)}")
    return read_ellipse_set(resources.files("lampcalc") / "data" / "sets" / SHIPPED[kind])
