"""Bin sets: named chromaticity bins, each a convex polygon given by its corners.

A bin set is a file in lampcalc's set format (:mod:`.set_files`, ``docs/standard-sets.md``)
with the columns ``bin`` (the bin's name), optional ``nominal_cct_K`` (the nominal CCT the
bin belongs to, for claims) and ``confirmed`` (``yes``/``no`` per bin, else the file's
``# confirmed``), and the corners ``x1,y1,x2,y2,...`` in order around the bin, at least
three; the coordinates are those the file's ``# space`` names (x, y; u, v; or u′, v′). A
row may leave its last corner pairs blank when the bin has fewer corners than the table
has columns. Edges are straight in the CIE 1931 (x, y) diagram, as in ANSI C78.377; the
CIE 1960 and 1976 diagrams are projective maps of it, so they are straight there too and
a file may give the corners in any of the three.

The shipped ANSI C78.377-2017 set is ``data/sets/ansi_c78377_2017_bins.csv`` (its source
and edition in ``data/SOURCES.md``); laboratories and manufacturers supply their own.
"""

import functools
import math
from dataclasses import dataclass
from importlib import resources

import numpy as np

from ..colorimetry.tristimulus import upvp_to_xy, uv_to_xy, xy_to_uv
from .set_files import number, read_set_table, row_confirmed

#: Most corners a bin may have in a set file.
MAX_CORNERS = 12
_CORNER_COLUMNS = tuple(f"{axis}{k}" for k in range(1, MAX_CORNERS + 1) for axis in "xy")
COLUMNS = ("bin", "nominal_cct_K", "confirmed") + _CORNER_COLUMNS
#: Converts a set file's coordinates to CIE 1931 (x, y).
TO_XY = {"xy": lambda c: np.asarray(c, dtype=float), "uv": uv_to_xy, "upvp": upvp_to_xy}


@dataclass(frozen=True, eq=False)
class BinSet:
    """A set of chromaticity bins.

    Attributes
    ----------
    name, source, edition : str
        From the file's metadata.
    confirmed : bool
        ``# confirmed`` of the file.
    names : tuple of str, length n_bins
    nominal_cct_K : ndarray, shape (n_bins,)
        NaN where a bin names none.
    bin_confirmed : ndarray of bool, shape (n_bins,)
    corners_xy : ndarray, shape (n_bins, k, 2)
        Corners in CIE 1931 (x, y), in order; ``k`` is the most corners of any bin, and
        the rows are NaN beyond each bin's ``n_corners``.
    n_corners : ndarray of int, shape (n_bins,)
    """

    name: str
    source: str
    edition: str
    confirmed: bool
    names: tuple
    nominal_cct_K: np.ndarray
    bin_confirmed: np.ndarray
    corners_xy: np.ndarray
    n_corners: np.ndarray

    def corners(self, k):
        """The corners (x, y) of bin ``k``, shape (n_corners, 2)."""
        return self.corners_xy[k, : self.n_corners[k]]

    def bins_of_nominal(self, nominal_cct_K):
        """Indices of the bins whose ``nominal_cct_K`` equals the one given."""
        return np.flatnonzero(self.nominal_cct_K == float(nominal_cct_K))


def _corners(table, line, row, space):
    pairs = []
    for k in range(1, MAX_CORNERS + 1):
        x, y = row.get(f"x{k}", ""), row.get(f"y{k}", "")
        if not x and not y:
            continue
        if pairs and len(pairs) != k - 1:
            raise table.fail(line, f"corner {k} follows a blank corner; give the corners in order without gaps")
        pairs.append((number(table, line, row, f"x{k}"), number(table, line, row, f"y{k}")))
    if len(pairs) < 3:
        raise table.fail(line, f"a bin needs at least 3 corners, got {len(pairs)}")
    corners = TO_XY[space](np.array(pairs))
    if not np.all(np.isfinite(corners)) or np.any(corners <= 0) or np.any(corners.sum(axis=-1) >= 1):
        raise table.fail(line, "a corner is not a chromaticity (x, y > 0 and x + y < 1)")
    # Convex and in order: every turn the same way, none straight back.
    edge = np.roll(corners, -1, axis=0) - corners
    turn = edge[:, 0] * np.roll(edge, -1, axis=0)[:, 1] - edge[:, 1] * np.roll(edge, -1, axis=0)[:, 0]
    winding = np.sum(np.arctan2(turn, np.sum(edge * np.roll(edge, -1, axis=0), axis=-1)))
    if not (np.all(turn > 0) or np.all(turn < 0)) or not math.isclose(abs(winding), 2 * np.pi, abs_tol=1e-6):
        raise table.fail(line, "the corners do not go once around a convex polygon (give them in order around the bin)")
    return corners


def read_bin_set(path):
    """Read a bin set file.

    Raises
    ------
    InputError
        One line naming the file and line: bad metadata or columns (see
        :func:`~lampcalc.standards.set_files.read_set_table`), a blank or repeated bin
        name, a malformed number, fewer than three corners, or corners that do not go
        once around a convex polygon.
    """
    table = read_set_table(path, COLUMNS, ("bin", "x1", "y1", "x2", "y2", "x3", "y3"))
    space = table.metadata["space"]
    names, nominal, confirmed, corners = [], [], [], []
    for line, row in table.rows:
        name = row["bin"]
        if not name:
            raise table.fail(line, "the bin name is blank")
        if name in names:
            raise table.fail(line, f"bin {name!r} is given twice")
        names.append(name)
        nominal.append(number(table, line, row, "nominal_cct_K", positive=True, blank_ok=True))
        confirmed.append(row_confirmed(table, line, row))
        corners.append(_corners(table, line, row, space))
    padded = np.full((len(corners), max(len(c) for c in corners), 2), np.nan)
    for k, c in enumerate(corners):
        padded[k, : len(c)] = c
    return BinSet(
        name=table.metadata["name"],
        source=table.metadata["source"],
        edition=table.metadata["edition"],
        confirmed=table.confirmed,
        names=tuple(names),
        nominal_cct_K=np.array(nominal),
        bin_confirmed=np.array(confirmed),
        corners_xy=padded,
        n_corners=np.array([len(c) for c in corners]),
    )


@functools.lru_cache(maxsize=None)
def shipped_bin_set(file_name):
    """A bin set shipped in ``lampcalc/data/sets`` (read once)."""
    return read_bin_set(resources.files("lampcalc") / "data" / "sets" / file_name)


def margins(xy, bin_set):
    """Signed edge distance of chromaticities from every bin, in CIE 1960 (u, v).

    Positive inside (the distance to the nearest edge), zero on the boundary, negative
    outside (the largest violation of any edge's line).

    Parameters
    ----------
    xy : array_like, shape (..., 2)
    bin_set : BinSet

    Returns
    -------
    ndarray, shape (..., n_bins)
        NaN for a NaN chromaticity.
    """
    p = xy_to_uv(np.asarray(xy, dtype=float))  # (..., 2)
    c = xy_to_uv(bin_set.corners_xy)  # (n_bins, k, 2)
    n_bins, k_max = c.shape[:2]
    k = np.arange(k_max)
    valid = k[None, :] < bin_set.n_corners[:, None]  # edge k runs from corner k to the next
    nxt = np.where(k[None, :] + 1 < bin_set.n_corners[:, None], k[None, :] + 1, 0)
    edge = np.take_along_axis(c, nxt[..., None], axis=1) - c
    with np.errstate(invalid="ignore", divide="ignore"):
        normal = np.stack([edge[..., 1], -edge[..., 0]], axis=-1) / np.linalg.norm(edge, axis=-1)[..., None]
    centre = np.nanmean(np.where(valid[..., None], c, np.nan), axis=1)  # inside a convex polygon
    normal *= np.sign(np.sum((centre[:, None, :] - c) * normal, axis=-1))[..., None]  # inward normals
    normal = np.where(valid[..., None], normal, 0.0)
    offset = np.where(valid, np.sum(c * normal, axis=-1), -np.inf)  # padding edges never bind
    # Signed distance of every point from every edge line, p·n − a·n, and its least over the edges
    # (a loop over the few edges keeps the arrays at (..., n_bins)).
    pu, pv = p[..., 0:1], p[..., 1:2]
    out = np.full(p.shape[:-1] + (n_bins,), np.inf)
    for j in range(k_max):
        np.minimum(out, pu * normal[:, j, 0] + pv * normal[:, j, 1] - offset[:, j], out=out)
    return out


def classify(xy, bin_set, edge_uv=1e-12):
    """The bin of ``bin_set`` each chromaticity falls in.

    A point on an edge belongs to the bin (margin ≥ −``edge_uv``, a tolerance for rounding
    in the last bits only). A point inside two bins (on a shared edge, or where a published
    table's rounding makes neighbours overlap) is given to the one it is deepest inside;
    on a tie (within ``edge_uv``), to the first in the file's order. ``xy`` and ``bin_set``
    as for :func:`margins`.

    Returns
    -------
    dict of ndarray, shape (...)
        ``index``: the bin holding the point, −1 if none; ``nearest``: the bin the point is
        inside or nearest to (−1 for a NaN chromaticity); ``margin_uv``: the signed edge
        distance from that bin (NaN for a NaN chromaticity).
    """
    m = margins(xy, bin_set)
    finite = np.where(np.isfinite(m), m, -np.inf)
    best = finite.max(axis=-1)
    # The first bin within the tie tolerance of the best margin.
    nearest = np.argmax(finite >= best[..., None] - edge_uv, axis=-1)
    known = np.isfinite(best)
    return {
        "index": np.where(known & (best >= -edge_uv), nearest, -1),
        "nearest": np.where(known, nearest, -1),
        "margin_uv": np.where(known, best, np.nan),
    }
