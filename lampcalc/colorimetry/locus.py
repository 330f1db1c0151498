"""The Planckian locus, correlated colour temperature and Duv.

Definitions (CIE 015:2018, clause 9.5; ANSI C78.377-2017 for the sign of Duv):

* The Planckian locus is the chromaticity of Planck's radiator with
  c2 = 1.4388e-2 m·K, summed with the CIE 1931 2° colour-matching functions over
  360–830 nm at 1 nm, in the CIE 1960 UCS (u, v). The CIE 1964 10° observer is an option.
* The correlated colour temperature (CCT) of a chromaticity is the temperature of the
  point of the locus nearest to it in (u, v); Duv is that distance, positive above the
  locus (towards green), negative below (towards pink).

Method. The locus is tabulated in reciprocal temperature (mired, m = 10⁶/T) with
values, first and second derivatives computed exactly from Planck's law, and read
between nodes by quintic Hermite interpolation; its error is below 1e-13 in u, v. A
point is placed between two nodes by bisection on the sign of (p − L)·L′ and the foot
of the perpendicular is then found by Newton's method on the same function. Work is
done in chunks, so memory stays O(chunk) whatever the batch.

CIE 015:2018 says the CCT is not to be used far from the locus; lampcalc computes it
up to any distance but flags |Duv| > 0.05. CCTs outside 1000–100 000 K are NaN, with
the reason in the status code: never a clamped value.
"""

import functools
import warnings

import numpy as np

from ..physics.constants import C1L_Wm2_per_sr, C2_CIE_mK
from ..spectra.resampling import GRID_NM
from ..spectra.tables import colour_matching_functions
from .tristimulus import upvp_to_uv, uv_to_xy, xy_to_uv

#: The range of temperatures in which a CCT is given, K.
CCT_RANGE_K = (1000.0, 100000.0)
#: Beyond this |Duv| the CCT is computed but flagged (CIE 015:2018).
DUV_LIMIT = 0.05

#: Status bits of :func:`locate`.
STATUS_OK = 0
STATUS_BELOW_RANGE = 1
STATUS_ABOVE_RANGE = 2
STATUS_FAR_FROM_LOCUS = 4
STATUS_NOT_A_CHROMATICITY = 8

#: Words for each status bit, as the command line prints them.
STATUS_TEXT = {
    STATUS_BELOW_RANGE: "cct_below_1000K",
    STATUS_ABOVE_RANGE: "cct_above_100000K",
    STATUS_FAR_FROM_LOCUS: "duv_beyond_0.05",
    STATUS_NOT_A_CHROMATICITY: "not_a_chromaticity",
}

# Table: uniform in mired, a little beyond the CCT range on both sides.
_MIRED_LO = 1e6 / 110000.0
_MIRED_HI = 1e6 / 900.0
_NODES = 1200
_NEWTON_STEPS = 3
_GRID_STEP = 0.002
_CHUNK = 1 << 14
_NO_CCT = STATUS_BELOW_RANGE | STATUS_ABOVE_RANGE | STATUS_NOT_A_CHROMATICITY


class LocusRangeWarning(UserWarning):
    """Some chromaticities have no CCT in range, or lie far from the locus."""


def _planck_mired(mired, order):
    """Planck radiance (any scale) and its derivatives in mired, shape (3, ..., 471).

    With a = c2/(λ·10⁶), L = c1·λ⁻⁵/(e^(am) − 1), so
    dL/dm = −a·e^(am)·L/(e^(am) − 1) and d²L/dm² = a²·e^(am)(e^(am) + 1)·L/(e^(am) − 1)².
    """
    wl = GRID_NM * 1e-9
    a = C2_CIE_mK / (wl * 1e6)
    am = a * np.asarray(mired, dtype=float)[..., None]
    em1 = np.expm1(am)
    e = em1 + 1.0
    L = C1L_Wm2_per_sr * wl**-5 / em1
    out = [L]
    if order >= 1:
        out.append(-a * e / em1 * L)
    if order >= 2:
        out.append(a**2 * e * (e + 1.0) / em1**2 * L)
    return out


def _uv_from_tristimulus(T, dT=None, d2T=None):
    """u, v (and derivatives by the quotient rule) from XYZ and its derivatives."""
    W = np.array([[4.0, 0.0, 0.0], [0.0, 6.0, 0.0]])  # numerators of u, v
    d = np.array([1.0, 15.0, 3.0])  # denominator X + 15Y + 3Z
    N, D = T @ W.T, (T @ d)[..., None]
    uv = N / D
    if dT is None:
        return (uv,)
    N1, D1 = dT @ W.T, (dT @ d)[..., None]
    duv = (N1 - uv * D1) / D
    if d2T is None:
        return uv, duv
    N2, D2 = d2T @ W.T, (d2T @ d)[..., None]
    d2uv = (N2 - uv * D2 - 2 * duv * D1) / D
    return uv, duv, d2uv


def planckian_uv(temperature_K, observer="1931_2deg"):
    """Exact Planckian locus in CIE 1960 (u, v), shape ``(..., 2)``.

    Summed directly from Planck's law (c2 = 1.4388e-2 m·K) and the observer's CMFs on
    the 1 nm grid, with no table. Slower than :func:`cct_duv_to_uv` at ``Duv = 0``.

    Examples
    --------
    >>> [round(float(c), 5) for c in planckian_uv(2856.0)]
    [0.25595, 0.34952]
    """
    cmf = colour_matching_functions(observer)
    (L,) = _planck_mired(1e6 / np.asarray(temperature_K, dtype=float), 0)
    return _uv_from_tristimulus(L @ cmf)[0]


class _LocusTable:
    """The locus in mired, ready for fast evaluation, and a grid of starting values.

    ``coef[k, c, i]`` is the coefficient of tᵏ of the quintic Hermite polynomial of
    component c (u or v) on interval i, with t = (m − mᵢ)/h in [0, 1]. ``grid`` holds
    the exact CCT (in mired) at the points of a regular (u, v) grid around the locus;
    read bilinearly, it starts Newton's method close to the answer.
    """

    def __init__(self, observer):
        cmf = colour_matching_functions(observer)
        self.nodes = np.linspace(_MIRED_LO, _MIRED_HI, _NODES)
        self.h = h = self.nodes[1] - self.nodes[0]
        L, dL, d2L = _planck_mired(self.nodes, 2)
        f, f1, f2 = _uv_from_tristimulus(L @ cmf, dL @ cmf, d2L @ cmf)
        p0, p1 = f[:-1], f[1:]
        d0, d1 = f1[:-1] * h, f1[1:] * h
        s0, s1 = f2[:-1] * h * h, f2[1:] * h * h
        coef = [
            p0,
            d0,
            0.5 * s0,
            10 * (p1 - p0) - 6 * d0 - 4 * d1 - 1.5 * s0 + 0.5 * s1,
            -15 * (p1 - p0) + 8 * d0 + 7 * d1 + 1.5 * s0 - s1,
            6 * (p1 - p0) - 3 * d0 - 3 * d1 - 0.5 * s0 + 0.5 * s1,
        ]
        self.coef = np.ascontiguousarray(np.stack(coef).transpose(0, 2, 1))  # (6, 2, K-1)
        self.f, self.f1 = f, f1
        self._make_grid()

    def evaluate(self, mired, order=2):
        """Locus point and derivatives at ``mired`` (shape (n,)): arrays of shape (2, n)."""
        pos = (mired - self.nodes[0]) / self.h
        i = np.clip(pos.astype(np.intp), 0, self.nodes.size - 2)
        t = pos - i
        c = np.take(self.coef, i, axis=2)
        val = c[0] + t * (c[1] + t * (c[2] + t * (c[3] + t * (c[4] + t * c[5]))))
        der = (c[1] + t * (2 * c[2] + t * (3 * c[3] + t * (4 * c[4] + t * 5 * c[5])))) / self.h
        if order == 1:
            return val, der
        der2 = (2 * c[2] + t * (6 * c[3] + t * (12 * c[4] + t * 20 * c[5]))) / (self.h * self.h)
        return val, der, der2

    def _g(self, i, pu, pv):
        return (pu - self.f[i, 0]) * self.f1[i, 0] + (pv - self.f[i, 1]) * self.f1[i, 1]

    def bracket(self, pu, pv):
        """Bisection on the sign of (p − L)·L′ over the nodes: a first guess, range status."""
        n = pu.size
        lo = np.zeros(n, dtype=np.intp)
        hi = np.full(n, self.nodes.size - 1, dtype=np.intp)
        status = np.zeros(n, dtype=np.int8)
        # g > 0: the foot lies at larger mired (lower T) than the node.
        status[self._g(lo, pu, pv) < 0] |= STATUS_ABOVE_RANGE
        status[self._g(hi, pu, pv) > 0] |= STATUS_BELOW_RANGE
        for _ in range(int(np.ceil(np.log2(self.nodes.size - 1)))):
            mid = (lo + hi) >> 1
            pos = self._g(mid, pu, pv) >= 0
            lo = np.where(pos, mid, lo)
            hi = np.where(pos, hi, mid)
        g_lo, g_hi = self._g(lo, pu, pv), self._g(hi, pu, pv)
        denom = np.where(g_lo != g_hi, g_lo - g_hi, 1.0)
        return self.nodes[lo] + self.h * np.clip(g_lo / denom, 0.0, 1.0), status

    def _make_grid(self):
        """Exact mired of the foot on a regular (u, v) grid covering |Duv| ≤ 0.06."""
        normal = np.stack([-self.f1[:, 1], self.f1[:, 0]], -1) / np.hypot(*self.f1.T)[:, None]
        edge = np.concatenate([self.f + 0.06 * normal, self.f - 0.06 * normal])
        self.grid_lo = edge.min(axis=0)
        n = np.ceil((edge.max(axis=0) - self.grid_lo) / _GRID_STEP).astype(int) + 1
        gu, gv = np.meshgrid(*(self.grid_lo[k] + _GRID_STEP * np.arange(n[k]) for k in range(2)), indexing="ij")
        m, _ = self.bracket(gu.ravel(), gv.ravel())
        self.grid = self.newton(m, gu.ravel(), gv.ravel(), 3).reshape(gu.shape)

    def start(self, pu, pv):
        """Bilinear first guess (mired) from the grid; NaN outside it."""
        gu = (pu - self.grid_lo[0]) / _GRID_STEP
        gv = (pv - self.grid_lo[1]) / _GRID_STEP
        nu, nv = self.grid.shape
        inside = (gu >= 0) & (gu < nu - 1) & (gv >= 0) & (gv < nv - 1)
        iu = np.clip(gu.astype(np.intp), 0, nu - 2)
        iv = np.clip(gv.astype(np.intp), 0, nv - 2)
        a, b = gu - iu, gv - iv
        g = self.grid
        m = (1 - a) * ((1 - b) * g[iu, iv] + b * g[iu, iv + 1]) + a * ((1 - b) * g[iu + 1, iv] + b * g[iu + 1, iv + 1])
        return np.where(inside, m, np.nan)

    def newton(self, m, pu, pv, steps):
        """Newton's method on f(m) = (L(m) − p)·L′(m): the foot of the perpendicular."""
        for _ in range(steps):
            L, dL, d2L = self.evaluate(m)
            ru, rv = L[0] - pu, L[1] - pv
            fm = ru * dL[0] + rv * dL[1]
            fp = dL[0] * dL[0] + dL[1] * dL[1] + ru * d2L[0] + rv * d2L[1]
            m = np.clip(m - fm / fp, self.nodes[0], self.nodes[-1])
        return m


@functools.lru_cache(maxsize=None)
def _table(observer):
    return _LocusTable(observer)


@functools.lru_cache(maxsize=None)
def _spectrum_locus_edges(observer):
    """The convex hull of the spectrum locus and purple line in (u, v): edge starts and inward normals.

    Every real spectrum is a non-negative mix of monochromatic stimuli, so its chromaticity
    lies in this hull (CIE 015:2018, clause 8.1: the spectrum locus and the purple line
    enclose all real colours); a point outside it is not the chromaticity of any light.
    """
    from scipy.spatial import ConvexHull

    XYZ = colour_matching_functions(observer)
    XYZ = XYZ[XYZ.sum(axis=-1) > 0]
    uv = xy_to_uv(XYZ[:, :2] / XYZ.sum(axis=-1, keepdims=True))
    corners = uv[ConvexHull(uv).vertices]  # counter-clockwise
    edge = np.roll(corners, -1, axis=0) - corners
    inward = np.stack([-edge[:, 1], edge[:, 0]], axis=-1) / np.hypot(edge[:, 0], edge[:, 1])[:, None]
    return corners, inward


def outside_spectrum_locus(uv, observer="1931_2deg"):
    """True where (u, v), shape (n, 2), lies outside the spectrum locus and purple line.

    By more than 1e-4 in (u, v): coordinates rounded to four decimals, as data sheets print them,
    still count when they lie on the locus itself."""
    corners, inward = _spectrum_locus_edges(observer)
    distance = np.einsum("nkj,kj->nk", uv[:, None, :] - corners[None], inward)
    return np.any(distance < -1e-4, axis=-1)


def _locate_chunk(observer, uv):
    table = _table(observer)
    good = np.all(np.isfinite(uv), axis=-1)
    pu = np.where(good, uv[:, 0], table.f[_NODES // 2, 0])
    pv = np.where(good, uv[:, 1], table.f[_NODES // 2, 1])
    m = table.start(pu, pv)
    status = np.zeros(pu.size, dtype=np.int8)
    far = np.isnan(m)
    if np.any(far):
        m[far], status[far] = table.bracket(pu[far], pv[far])
    m = table.newton(m, pu, pv, _NEWTON_STEPS)
    L, dL = table.evaluate(m, order=1)
    duv = (dL[0] * (pv - L[1]) - dL[1] * (pu - L[0])) / np.hypot(dL[0], dL[1])
    cct = 1e6 / m
    # The range ends are inclusive; 1e-12 allows for rounding in 1e6/m.
    status[cct < CCT_RANGE_K[0] * (1 - 1e-12)] |= STATUS_BELOW_RANGE
    status[cct > CCT_RANGE_K[1] * (1 + 1e-12)] |= STATUS_ABOVE_RANGE
    status[np.abs(duv) > DUV_LIMIT] |= STATUS_FAR_FROM_LOCUS
    status[~good] = STATUS_NOT_A_CHROMATICITY
    out_of_range = (status & _NO_CCT) != 0
    cct[out_of_range] = np.nan
    duv[out_of_range] = np.nan
    return cct, duv, status


def locate(uv, observer="1931_2deg"):
    """CCT, Duv and a status code for CIE 1960 (u, v) chromaticities, without warnings.

    Parameters
    ----------
    uv : array_like, shape (..., 2)
    observer : {"1931_2deg", "1964_10deg"}

    Returns
    -------
    cct_K, duv : ndarray, shape (...)
        NaN where the CCT falls outside 1000–100 000 K or the input is not finite.
    status : ndarray of int8, shape (...)
        Bit flags: :data:`STATUS_BELOW_RANGE`, :data:`STATUS_ABOVE_RANGE`,
        :data:`STATUS_FAR_FROM_LOCUS` (computed, but |Duv| > 0.05) and
        :data:`STATUS_NOT_A_CHROMATICITY`; 0 when all is well. See :func:`status_words`.
    """
    uv = np.asarray(uv, dtype=float)
    if uv.shape[-1:] != (2,):
        raise ValueError(f"chromaticities need shape (..., 2), got {uv.shape}")
    flat = uv.reshape(-1, 2)
    cct = np.empty(flat.shape[0])
    duv = np.empty(flat.shape[0])
    status = np.empty(flat.shape[0], dtype=np.int8)
    for start in range(0, flat.shape[0], _CHUNK):
        sl = slice(start, start + _CHUNK)
        cct[sl], duv[sl], status[sl] = _locate_chunk(observer, flat[sl])
    shape = uv.shape[:-1]
    return cct.reshape(shape), duv.reshape(shape), status.reshape(shape)


def status_words(status):
    """The flags of one status code as words, e.g. ``["duv_beyond_0.05"]``."""
    return [word for bit, word in STATUS_TEXT.items() if int(status) & bit]


#: Chromaticity coordinate systems by name, with their conversion to CIE 1960 (u, v).
COORDINATE_SYSTEMS = {"xy": xy_to_uv, "uv": lambda uv: uv, "upvp": upvp_to_uv}


def flag_text(status):
    """The flags of one status code joined by ';', empty when all is well."""
    return ";".join(status_words(status))


def locate_with_flags(coords, system, observer="1931_2deg"):
    """CCT, Duv and flag text for an ``(n, 2)`` array of coordinates.

    ``system`` names the coordinates, a key of :data:`COORDINATE_SYSTEMS`: ``"xy"``
    (CIE 1931), ``"uv"`` (CIE 1960) or ``"upvp"`` (CIE 1976 u′, v′). These are coordinates a
    user typed or read from a table, not computed from a spectrum: a point outside the
    spectrum locus is the chromaticity of no light, so it gets no CCT and the flag
    ``not_a_chromaticity`` (:func:`locate` itself computes CCT and Duv anywhere).
    """
    uv = np.asarray(COORDINATE_SYSTEMS[system](coords), dtype=float).reshape(-1, 2)
    cct, duv, status = locate(uv, observer)
    finite = np.all(np.isfinite(uv), axis=-1)
    unreal = np.zeros(finite.shape, dtype=bool)
    unreal[finite] = outside_spectrum_locus(uv[finite], observer)
    status[unreal] = STATUS_NOT_A_CHROMATICITY
    cct[unreal], duv[unreal] = np.nan, np.nan
    text = {code: flag_text(code) for code in np.unique(status).tolist()}
    return cct, duv, [text[code] for code in status.tolist()]


def _warn(status, what):
    bad = status != 0
    if np.any(bad):
        words = sorted({w for s in np.unique(status[bad]) for w in status_words(s)})
        warnings.warn(
            f"{int(np.count_nonzero(bad))} of {status.size} {what}: {', '.join(words)} "
            "(NaN where out of range; use lampcalc.locate for the status per point)",
            LocusRangeWarning,
            stacklevel=3,
        )


def cct_duv(uv, observer="1931_2deg"):
    """CCT (K) and Duv from CIE 1960 (u, v), shape ``(..., 2)`` → ``(..., 2)``.

    The exact nearest point on the Planckian locus (module docstring). NaN in gives NaN
    out; a CCT outside 1000–100 000 K is NaN. One :class:`LocusRangeWarning` per call
    reports points out of range or with |Duv| > 0.05.

    Examples
    --------
    >>> [round(float(c), 4) for c in cct_duv([0.1978, 0.3122])]
    [6507.5024, 0.0032]
    """
    cct, duv, status = locate(uv, observer)
    _warn(status, "chromaticities")
    return np.stack([cct, duv], axis=-1)


def xy_to_cct_duv(xy, observer="1931_2deg"):
    """CCT (K) and Duv from CIE 1931 (x, y), ``(..., 2)`` → ``(..., 2)``; see :func:`cct_duv`."""
    cct, duv, status = locate(xy_to_uv(xy), observer)
    _warn(status, "chromaticities")
    return np.stack([cct, duv], axis=-1)


def upvp_to_cct_duv(upvp, observer="1931_2deg"):
    """CCT (K) and Duv from CIE 1976 (u′, v′), ``(..., 2)`` → ``(..., 2)``; see :func:`cct_duv`."""
    cct, duv, status = locate(upvp_to_uv(upvp), observer)
    _warn(status, "chromaticities")
    return np.stack([cct, duv], axis=-1)


def cct_duv_to_uv(cct_duv_values, observer="1931_2deg"):
    """CIE 1960 (u, v) from (CCT in K, Duv), ``(..., 2)`` → ``(..., 2)``.

    The point at distance Duv from the locus along its normal at CCT (positive
    towards green). A CCT outside 1000–100 000 K gives NaN and a warning.

    Examples
    --------
    >>> [round(float(c), 6) for c in cct_duv_to_uv([6507.502429, 0.003223678])]
    [0.1978, 0.3122]
    """
    values = np.asarray(cct_duv_values, dtype=float)
    if values.shape[-1:] != (2,):
        raise ValueError(f"(CCT, Duv) pairs need shape (..., 2), got {values.shape}")
    cct, duv = values[..., 0], values[..., 1]
    status = np.zeros(cct.shape, dtype=np.int8)
    status[~(cct >= CCT_RANGE_K[0])] |= STATUS_BELOW_RANGE
    status[~(cct <= CCT_RANGE_K[1])] |= STATUS_ABOVE_RANGE
    status[np.isnan(cct) | np.isnan(duv)] = STATUS_NOT_A_CHROMATICITY
    status[np.abs(duv) > DUV_LIMIT] |= STATUS_FAR_FROM_LOCUS
    _warn(status, "(CCT, Duv) pairs")
    bad = (status & _NO_CCT) != 0
    with np.errstate(invalid="ignore", divide="ignore"):
        m = np.where(bad, (_MIRED_LO + _MIRED_HI) / 2, 1e6 / cct).ravel()
    L, dL = _table(observer).evaluate(m, order=1)
    scale = duv.ravel() / np.hypot(dL[0], dL[1])
    uv = np.stack([L[0] - scale * dL[1], L[1] + scale * dL[0]], axis=-1).reshape(cct.shape + (2,))
    uv[bad] = np.nan
    return uv


def cct_duv_to_xy(cct_duv_values, observer="1931_2deg"):
    """CIE 1931 (x, y) from (CCT in K, Duv), ``(..., 2)`` → ``(..., 2)``."""
    return uv_to_xy(cct_duv_to_uv(cct_duv_values, observer))


def isotemperature_lines(temperature_K, duv_range=(-0.02, 0.02), n_points=2, observer="1931_2deg"):
    """Points along the isotemperature lines at the given CCTs, in (u, v).

    An isotemperature line is the normal to the Planckian locus at that temperature
    (CIE 015:2018, clause 9.5). Returns shape ``(..., n_points, 2)`` spanning
    ``duv_range``.
    """
    t = np.asarray(temperature_K, dtype=float)
    duv = np.linspace(duv_range[0], duv_range[1], n_points)
    pairs = np.stack(np.broadcast_arrays(t[..., None], duv), axis=-1)
    return cct_duv_to_uv(pairs, observer)
