"""A batch of lamp spectra: the one container every lampcalc computation reads.

A :class:`SpectralBatch` holds ``n_lamps`` spectra on a shared wavelength axis, with the
radiometric quantity they are in, a name and provenance per lamp, the lamp's electrical
power where known and flags that travel with each lamp to the final report.
"""

from dataclasses import dataclass, replace

import numpy as np

from ..errors import InputError
from .resampling import GRID_NM, resample

#: Radiometric quantities a spectrum may be in, with the units of its values.
QUANTITY_UNITS = {
    "relative": "arbitrary units",
    "flux": "W/nm",
    "irradiance": "W/(m2 nm)",
    "radiance": "W/(sr m2 nm)",
}

#: The range a spectrum must cover to be used at all, nm.
REQUIRED_RANGE_NM = (400.0, 700.0)
#: The range below which a spectrum is flagged ``range_truncated``, nm.
FULL_RANGE_NM = (380.0, 780.0)


def _tuple(values, n, what):
    values = tuple(values)
    if len(values) != n:
        raise ValueError(f"{what}: expected {n} entries, got {len(values)}")
    return values


@dataclass(frozen=True, eq=False)
class SpectralBatch:
    """Spectra of ``n_lamps`` lamps on a shared, strictly increasing wavelength axis.

    Parameters
    ----------
    wavelength_nm : array_like, shape (n_wavelengths,)
    values : array_like, shape (n_lamps, n_wavelengths)
        Finite and non-negative, in the units of ``quantity``.
    names : sequence of str, length n_lamps
    quantity : str or sequence of str
        ``"relative"``, ``"flux"``, ``"irradiance"`` or ``"radiance"`` (see
        :data:`QUANTITY_UNITS`), for all lamps or one per lamp; stored as a tuple.
    sources : sequence of str
        Provenance per lamp, e.g. ``"lamps.csv, column 3"``; defaults to ``""``.
    electrical_W : array_like, shape (n_lamps,)
        Electrical power per lamp, NaN where unknown.
    flags : sequence of tuple of str
        Per-lamp flags gathered on the way (``range_truncated`` …).
    measured_range_nm : array_like, shape (n_lamps, 2)
        First and last measured wavelength per lamp; by default the axis ends. Kept
        when a batch is resampled, so that results can state the range they cover.
    measured_step_nm : array_like, shape (n_lamps,)
        Median measurement interval per lamp; by default that of the axis.
    angle_deg : array_like, shape (n_lamps,)
        Direction of emission each spectrum was measured at (a goniometer's angle), degrees;
        NaN where not known.
    interpolation : sequence of str
        How each spectrum was brought onto the grid (:func:`~lampcalc.spectra.resampling.method_for`):
        set by :meth:`on_grid`; ``""`` before.
    """

    wavelength_nm: np.ndarray
    values: np.ndarray
    names: tuple
    quantity: tuple = "relative"
    sources: tuple = None
    electrical_W: np.ndarray = None
    flags: tuple = None
    measured_range_nm: np.ndarray = None
    measured_step_nm: np.ndarray = None
    angle_deg: np.ndarray = None
    interpolation: tuple = None

    def __post_init__(self):
        wl = np.asarray(self.wavelength_nm, dtype=float)
        # Row-major: a lamp's sums then run in the same order whatever batch or slice holds it.
        values = np.ascontiguousarray(np.atleast_2d(np.asarray(self.values, dtype=float)))
        if wl.ndim != 1 or wl.size < 2 or not np.all(np.diff(wl) > 0):
            raise ValueError("wavelength_nm must be a strictly increasing 1-D array of at least 2 values")
        if values.ndim != 2 or values.shape[1] != wl.size:
            raise ValueError(f"values must have shape (n_lamps, {wl.size}), got {values.shape}")
        n = values.shape[0]
        quantity = (self.quantity,) * n if isinstance(self.quantity, str) else _tuple(self.quantity, n, "quantity")
        for q in quantity:
            if q not in QUANTITY_UNITS:
                raise ValueError(f"unknown quantity {q!r}; choose one of {', '.join(QUANTITY_UNITS)}")
        names = _tuple(self.names, n, "names")
        sources = ("",) * n if self.sources is None else _tuple(self.sources, n, "sources")
        flags = ((),) * n if self.flags is None else tuple(tuple(f) for f in _tuple(self.flags, n, "flags"))
        watts = np.full(n, np.nan) if self.electrical_W is None else np.asarray(self.electrical_W, dtype=float)
        if watts.shape != (n,):
            raise ValueError(f"electrical_W must have shape ({n},), got {watts.shape}")
        ranges = (
            np.tile([wl[0], wl[-1]], (n, 1))
            if self.measured_range_nm is None
            else np.asarray(self.measured_range_nm, dtype=float).reshape(n, 2)
        )
        steps = (
            np.full(n, float(np.median(np.diff(wl))))
            if self.measured_step_nm is None
            else np.asarray(self.measured_step_nm, dtype=float).reshape(n)
        )
        interpolation = ("",) * n if self.interpolation is None else _tuple(self.interpolation, n, "interpolation")
        angles = np.full(n, np.nan) if self.angle_deg is None else np.asarray(self.angle_deg, dtype=float)
        if angles.shape != (n,):
            raise ValueError(f"angle_deg must have shape ({n},), got {angles.shape}")
        for arr in (wl, values, watts, ranges, steps, angles):
            arr.flags.writeable = False
        for name, value in (
            ("wavelength_nm", wl),
            ("values", values),
            ("names", names),
            ("quantity", quantity),
            ("sources", sources),
            ("flags", flags),
            ("electrical_W", watts),
            ("measured_range_nm", ranges),
            ("measured_step_nm", steps),
            ("angle_deg", angles),
            ("interpolation", interpolation),
        ):
            object.__setattr__(self, name, value)

    @property
    def n_lamps(self):
        """Number of spectra in the batch."""
        return self.values.shape[0]

    @property
    def units(self):
        """Units of each lamp's :attr:`values`."""
        return tuple(QUANTITY_UNITS[q] for q in self.quantity)

    def on_grid(self, method="auto"):
        """This batch resampled onto the CIE 015:2018 grid (360–830 nm, 1 nm).

        Values outside each lamp's measured range are zero: never extrapolated. A lamp
        whose data do not cover 380–780 nm is flagged ``range_truncated``; one that does
        not cover 400–700 nm is refused. Each lamp records the method used in
        :attr:`interpolation`.

        Parameters
        ----------
        method : {"auto", "linear", "sprague"}
            See :mod:`lampcalc.spectra.resampling` (CIE 015:2018, clause 7.2; CIE 167:2005).
            Sprague values below zero (ringing at narrow lines) are flagged
            ``interpolation_undershoot`` and kept.

        Raises
        ------
        InputError
            For a lamp that does not cover 400–700 nm, or ``"sprague"`` asked for data
            that are not uniformly spaced or have fewer than six points.
        """
        lo, hi = self.measured_range_nm[:, 0], self.measured_range_nm[:, 1]
        short = (lo > REQUIRED_RANGE_NM[0]) | (hi < REQUIRED_RANGE_NM[1])
        if np.any(short):
            i = int(np.flatnonzero(short)[0])
            raise InputError(
                f"{self._where(i)}: data cover {lo[i]:g}-{hi[i]:g} nm; at least "
                f"{REQUIRED_RANGE_NM[0]:g}-{REQUIRED_RANGE_NM[1]:g} nm are needed"
            )
        if np.array_equal(self.wavelength_nm, GRID_NM) and all(self.interpolation):
            return self
        try:
            values, used = resample(self.wavelength_nm, self.values, method)
        except ValueError as err:
            # The wavelengths are shared by every lamp of the batch (one file): name the file.
            raise InputError(f"{self._where(0).split(', column')[0]}: {err}") from None
        truncated = (lo > FULL_RANGE_NM[0]) | (hi < FULL_RANGE_NM[1])
        if used == "integrated":
            # The data are non-negative, so is every integral of them: a value below zero here is
            # rounding in the differences of the antiderivatives (~1e-13 of the total), not a result.
            values = np.maximum(values, 0.0)
        # Only Sprague's polynomial can ring below zero; linear and integrated values of
        # non-negative data cannot.
        undershoot = np.any(values < 0, axis=1) if used == "sprague" else np.zeros(self.n_lamps, dtype=bool)
        flags = tuple(
            f + (("range_truncated",) if t else ()) + (("interpolation_undershoot",) if u else ())
            for f, t, u in zip(self.flags, truncated, undershoot)
        )
        return replace(self, wavelength_nm=GRID_NM, values=values, flags=flags, interpolation=(used,) * self.n_lamps)

    def with_electrical_power(self, watts):
        """This batch with ``watts`` as the electrical power of every lamp that has none."""
        return replace(self, electrical_W=np.where(np.isfinite(self.electrical_W), self.electrical_W, float(watts)))

    def _where(self, i):
        return self.sources[i] or self.names[i]

    def __getitem__(self, index):
        """A sub-batch: ``batch[2:5]``, ``batch[[0, 3]]`` or a boolean mask."""
        idx = np.arange(self.n_lamps)[index]
        idx = np.atleast_1d(idx)
        return replace(
            self,
            values=self.values[idx],
            names=tuple(self.names[i] for i in idx),
            quantity=tuple(self.quantity[i] for i in idx),
            sources=tuple(self.sources[i] for i in idx),
            flags=tuple(self.flags[i] for i in idx),
            electrical_W=self.electrical_W[idx],
            measured_range_nm=self.measured_range_nm[idx],
            measured_step_nm=self.measured_step_nm[idx],
            angle_deg=self.angle_deg[idx],
            interpolation=tuple(self.interpolation[i] for i in idx),
        )

    @classmethod
    def concatenate(cls, batches):
        """Join batches that share a wavelength axis into one.

        Batches read from different files are first brought onto the grid with
        :meth:`on_grid`.
        """
        batches = list(batches)
        if not batches:
            raise ValueError("no spectra to join")
        first = batches[0]
        for b in batches[1:]:
            if not np.array_equal(b.wavelength_nm, first.wavelength_nm):
                raise ValueError("batches have different wavelength axes; resample them with on_grid() first")
        return cls(
            wavelength_nm=first.wavelength_nm,
            values=np.concatenate([b.values for b in batches]),
            names=sum((b.names for b in batches), ()),
            quantity=sum((b.quantity for b in batches), ()),
            sources=sum((b.sources for b in batches), ()),
            electrical_W=np.concatenate([b.electrical_W for b in batches]),
            flags=sum((b.flags for b in batches), ()),
            measured_range_nm=np.concatenate([b.measured_range_nm for b in batches]),
            measured_step_nm=np.concatenate([b.measured_step_nm for b in batches]),
            angle_deg=np.concatenate([b.angle_deg for b in batches]),
            interpolation=sum((b.interpolation for b in batches), ()),
        )
