"""Measurement uncertainty of every rating, by Monte Carlo propagation of a measurement model.

JCGM 101:2008 (Supplement 1 to the GUM) propagates distributions: draw the input quantities
from their distributions, evaluate the measurement model for each draw, and summarise the
values the output takes (clauses 5.9, 7). Here the inputs are the measured spectral values on
the file's own wavelengths, perturbed as a :class:`~lampcalc.rating.measurement_model.MeasurementModel`
says *before* they are interpolated onto the 1 nm grid (as CIE 198:2011 treats spectral
quantities, from memory), and the measurement model is the whole rating: each draw is resampled
by :meth:`SpectralBatch.on_grid` with the interpolation of the ordinary rating, and all draws go
through one batched :func:`~lampcalc.rating.rate.rate_spectra` call (in chunks, so that memory
stays flat however many lamps there are).

For a lamp with measured values M(λᵢ), one draw is::

    P(λᵢ) = (1 + s·η) · [ M(λᵢ)·(1 + a·εᵢ) + c·max M + t·(M⊛T − M)(λᵢ) ]   on wavelengths λᵢ + δ

noise
    εᵢ independent standard normal per wavelength and draw; a = noise_percent/100.
stray light
    c normal with mean 0 and standard deviation stray_light_percent/100, one per draw, added
    over the measured range: the uncertainty of the floor's subtraction. The data are taken
    as the laboratory's best estimate, so the floor is zero on average.
slit
    T is the triangular slit of full width at half maximum bandwidth_nm (area 1), M⊛T the
    measured values seen through it once more, and t uniform on [−1, 1], one per draw. To first
    order in the slit's variance, t > 0 is a further triangular convolution of width √t·bandwidth_nm
    and t < 0 its removal (a first-order deconvolution): the slit's effect is uncertain by up to
    its whole size either way, because the data are rated as measured, with no bandwidth correction.
scale
    η standard normal, one per draw; s = scale_percent/100.
wavelength shift
    δ normal with mean 0 and standard deviation wavelength_shift_nm, one per draw.

The output of every numeric rating is summarised as its standard uncertainty (the standard
deviation of the draws, JCGM 101:2008 7.6) and its probabilistically symmetric 95 % coverage
interval (7.7.2). The rating itself stays the rating of the spectrum as measured.

Each lamp's random numbers come from its own streams, one per effect, seeded by the model's
seed and the lamp's name: the same seed gives the same output, and a lamp gets the same draws
alone or in a batch, whatever the chunk size (the results then differ only by rounding).
"""

import hashlib
from dataclasses import dataclass, replace

import numpy as np

from ..spectra.batch import SpectralBatch
from ..spectra.resampling import linear
from .flags import VALIDITY_FLAGS
from .rate import rate_spectra
from .ratings import FIELDS, Ratings

#: Coverage probability of the intervals (the ``_interval95`` keys).
COVERAGE = 0.95
#: Numeric output keys that are inputs or categories, not measured results: no uncertainty.
NOT_PROPAGATED = frozenset(
    {"range_start_nm", "range_end_nm", "step_nm", "electrical_W", "ler_range_nm", "ansi_nominal_cct_K",
     "ansi_nearest_nominal_cct_K", "sdcm_centre_nominal_cct_K"}
)
#: Spectra rated per batched call: about 0.3 GB at the peak.
CHUNK_SPECTRA = 4000
_EFFECTS = ("noise", "stray_light", "slit", "scale", "shift")


def coverage_interval(draws, coverage=COVERAGE):
    """Probabilistically symmetric coverage interval of Monte Carlo draws (JCGM 101:2008, 7.7.2).

    With the M draws sorted, y₍₁₎ ≤ … ≤ y₍M₎, and q = pM rounded to the nearest whole number,
    the interval is [y₍r₎, y₍r+q₎] with r = (M − q)/2, or (M − q + 1)/2 when M − q is odd.

    Parameters
    ----------
    draws : array_like, shape (M, ...)
        Values of the output quantity, the draws on the first axis.
    coverage : float
        Coverage probability p.

    Returns
    -------
    low, high : ndarray, shape (...)

    Examples
    --------
    >>> [float(v) for v in coverage_interval(np.arange(1.0, 2001.0))]
    [50.0, 1950.0]
    """
    values = np.sort(np.asarray(draws, dtype=float), axis=0)
    m = values.shape[0]
    q = int(np.floor(coverage * m + 0.5))
    r = (m - q + 1) // 2
    if r < 1:
        raise ValueError(f"{m} draws are too few for a {100 * coverage:g} % coverage interval")
    return values[r - 1], values[r + q - 1]


def slit_convolution(wavelength_nm, values, bandwidth_nm):
    """Spectra seen through a triangular slit, on their own wavelengths.

    The spectra are taken as piecewise linear between their samples, convolved with a triangle
    of full width at half maximum ``bandwidth_nm`` (base 2·bandwidth_nm, area 1) on a fine grid,
    and sampled back at ``wavelength_nm``. Near the ends of the data the slit is renormalised to
    its part inside them, so nothing is extrapolated.

    Parameters
    ----------
    wavelength_nm : array_like, shape (n,)
        Strictly increasing.
    values : array_like, shape (..., n)
    bandwidth_nm : float
        Positive.

    Returns
    -------
    ndarray, shape (..., n)

    Examples
    --------
    A line of area 1 (one sample at 1 nm spacing) through a 4 nm slit: the slit's triangle,
    height 1/4, rounded at its tip by the line's own 2 nm base.

    >>> wl = np.arange(400.0, 421.0)
    >>> line = np.where(wl == 410.0, 1.0, 0.0)
    >>> slit_convolution(wl, line, 4.0)[6:15].round(3).tolist()
    [0.0, 0.062, 0.125, 0.188, 0.229, 0.188, 0.125, 0.062, 0.0]
    """
    wl = np.asarray(wavelength_nm, dtype=float)
    values = np.asarray(values, dtype=float)
    step = min(bandwidth_nm, float(np.min(np.diff(wl)))) / 20.0
    fine = np.linspace(wl[0], wl[-1], int(np.ceil((wl[-1] - wl[0]) / step)) + 1)
    step = fine[1] - fine[0]
    half = int(np.floor(bandwidth_nm / step))
    kernel = 1.0 - np.abs(np.arange(-half, half + 1)) * step / bandwidth_nm
    smooth = _convolve_same(linear(wl, values, fine), kernel)
    weight = _convolve_same(np.ones(fine.size), kernel)
    return linear(fine, smooth / weight, wl)


def _convolve_same(signal, kernel):
    """Convolution along the last axis by FFT, the output centred on the input (odd kernel)."""
    n, k = signal.shape[-1], kernel.size
    size = 1 << int(np.ceil(np.log2(n + k - 1)))
    full = np.fft.irfft(np.fft.rfft(signal, size) * np.fft.rfft(kernel, size), size)
    return full[..., k // 2: k // 2 + n]


def propagated_keys(ratings):
    """The output keys that get an uncertainty: every numeric rating that is not an input or a category."""
    return tuple(
        k for k in FIELDS
        if k in ratings.columns and k not in NOT_PROPAGATED
        and isinstance(ratings[k], np.ndarray) and ratings[k].dtype.kind == "f"
    )


def _on_grid(batch, interpolation):
    """The ordinary rating's resampling: the default of on_grid unless a method is named."""
    return batch.on_grid() if interpolation is None else batch.on_grid(interpolation)


class _LampDraws:
    """The draws of one lamp's spectrum, as read, in consecutive blocks."""

    def __init__(self, lamp, model, stream=0):
        self.lamp, self.model = lamp, model
        wl, m = lamp.wavelength_nm, lamp.values[0]
        lo, hi = lamp.measured_range_nm[0]
        inside = (wl >= lo) & (wl <= hi)
        self.floor = np.where(inside, m[inside].max(), 0.0)
        self.slit = slit_convolution(wl, m, model.bandwidth_nm) - m if model.bandwidth_nm else None
        key = int.from_bytes(hashlib.sha256(lamp.names[0].encode("utf-8")).digest()[:8], "little")
        streams = np.random.SeedSequence([model.seed, key, *([stream] if stream else [])]).spawn(len(_EFFECTS))
        self.rng = {effect: np.random.default_rng(s) for effect, s in zip(_EFFECTS, streams)}

    def values(self, k):
        """The next ``k`` draws' values on the lamp's own wavelengths, and their wavelength shifts (or None)."""
        model, m = self.model, self.lamp.values[0]
        out = np.repeat(m[None, :], k, axis=0)
        if model.noise_percent:
            out += m * (model.noise_percent / 100.0) * self.rng["noise"].standard_normal((k, m.size))
        if model.stray_light_percent:
            out += (model.stray_light_percent / 100.0) * self.rng["stray_light"].standard_normal((k, 1)) * self.floor
        if self.slit is not None:
            out += self.rng["slit"].uniform(-1.0, 1.0, (k, 1)) * self.slit
        if model.scale_percent:
            out *= 1.0 + (model.scale_percent / 100.0) * self.rng["scale"].standard_normal((k, 1))
        shifts = model.wavelength_shift_nm * self.rng["shift"].standard_normal(k) if model.wavelength_shift_nm else None
        return out, shifts

    def on_grid(self, k, interpolation):
        """The next ``k`` draws, resampled as the ordinary rating resamples: a SpectralBatch on the grid."""
        values, shifts = self.values(k)
        if shifts is None:
            return _on_grid(replace(self.lamp[np.zeros(k, dtype=int)], values=values), interpolation)
        wl = self.lamp.wavelength_nm
        return SpectralBatch.concatenate(
            [_on_grid(replace(self.lamp, wavelength_nm=wl + d, values=v[None, :]), interpolation)
             for d, v in zip(shifts, values)]
        )


def _segments(n_lamps, draws, chunk):
    """Chunks of at most ``chunk`` draws: lists of (lamp, start, stop), lamps in order."""
    out, size = [], 0
    for lamp in range(n_lamps):
        start = 0
        while start < draws:
            stop = min(draws, start + chunk - size)
            out.append((lamp, start, stop))
            size += stop - start
            start = stop
            if size == chunk:
                yield out
                out, size = [], 0
    if out:
        yield out


def _rows(ratings, start, stop):
    return Ratings({k: v[start:stop] for k, v in ratings.columns.items()})


@dataclass
class MonteCarloDraws:
    """What a figure or report needs of the Monte Carlo beyond the output keys.

    Attributes
    ----------
    model : MeasurementModel
    interpolation : str or None
        The resampling named for the rating (None: on_grid's default).
    xy : ndarray, shape (n_lamps, draws, 2)
        Every draw's CIE 1931 x, y (of the observer rated with), for each lamp's coverage region.
    kept : dict
        Output key -> every draw's value, shape (n_lamps, draws, ...), for the keys asked to be kept.
    """

    model: object
    interpolation: object
    xy: np.ndarray
    coverage: float = COVERAGE
    kept: dict = None


def rate_with_uncertainty(spectra, model, *, observer="1931_2deg", interpolation=None, nominal_cct_K=None,
                          bin_set=None, ellipse_set=None, on_draws=None, progress=None, chunk_spectra=CHUNK_SPECTRA,
                          keep=(), stream=0):
    """Rate every lamp, and give each numeric rating its measurement uncertainty.

    Parameters
    ----------
    spectra : SpectralBatch or sequence of SpectralBatch
        The spectra **as read**, on the files' own wavelengths: the draws perturb those samples.
    model : MeasurementModel
    observer, nominal_cct_K, bin_set, ellipse_set
        As for :func:`~lampcalc.rating.rate.rate_spectra`.
    interpolation : str, optional
        The resampling onto the grid, as for ``rate_spectra``; by default that of
        :meth:`SpectralBatch.on_grid`. The draws are resampled the same way.
    on_draws : callable, optional
        Called as ``on_draws(lamp_index, draws)`` with a :class:`Ratings` of consecutive draws of
        one lamp (all of them, or a chunk; in order), e.g. to follow a claim's margin through them.
    progress : callable, optional
        Called with the number of lamps finished each time one is.
    chunk_spectra : int
        Draws rated per batched call.
    keep : sequence of str
        Output keys whose every draw is kept in ``extras["uncertainty"].kept`` (what lots and
        comparisons summarise their own statistics from).
    stream : int
        A further key of the random streams: two sets rated with the same model and different
        streams draw independently even where lamps share a name (a comparison's reference and
        test). 0, the default, gives the streams of the model's seed alone.

    Returns
    -------
    Ratings
        The ratings of the spectra as measured, plus for every key of :func:`propagated_keys`
        ``<key>_u`` (standard uncertainty, same shape as the key) and ``<key>_interval95``
        (95 % coverage interval, a trailing axis of 2: low, high). Where some draws give no
        value (a CCT outside 1000–100 000 K, say) both are NaN and the lamp is flagged
        ``uncertainty_incomplete``. ``extras["uncertainty"]`` is a :class:`MonteCarloDraws`.

    References
    ----------
    JCGM 101:2008, Evaluation of measurement data — Supplement 1 to the GUM — Propagation of
    distributions using a Monte Carlo method, clauses 5.9, 6, 7.6 and 7.7.
    CIE 198:2011, Determination of measurement uncertainties in photometry (spectral quantities).
    """
    batches = [spectra] if isinstance(spectra, SpectralBatch) else list(spectra)
    how = {} if interpolation is None else {"interpolation": interpolation}
    sets = {"observer": observer, "bin_set": bin_set, "ellipse_set": ellipse_set}
    ratings = rate_spectra(batches, nominal_cct_K=nominal_cct_K, **sets, **how)
    lamps = [b[j] for b in batches for j in range(b.n_lamps)]
    n, draws = len(lamps), model.draws
    nominal = np.full(n, np.nan) if nominal_cct_K is None else np.asarray(nominal_cct_K, dtype=float).reshape(n)
    summary = _Summary(ratings, draws, keep)
    drawers = {}
    for chunk in _segments(n, draws, chunk_spectra):
        grid = SpectralBatch.concatenate(
            [drawers.setdefault(lamp, _LampDraws(lamps[lamp], model, stream)).on_grid(stop - start, interpolation)
             for lamp, start, stop in chunk]
        )
        centres = np.concatenate([np.full(stop - start, nominal[lamp]) for lamp, start, stop in chunk])
        rated = rate_spectra(grid, nominal_cct_K=centres, **sets)
        row = 0
        for lamp, start, stop in chunk:
            part = _rows(rated, row, row + stop - start)
            row += stop - start
            summary.add(lamp, part)
            if on_draws is not None:
                on_draws(lamp, part)
            if stop == draws:
                summary.finish(lamp)
                del drawers[lamp]
                if progress is not None:
                    progress(1)
    return summary.ratings(MonteCarloDraws(model, interpolation, summary.xy, kept=summary.kept))


class _Summary:
    """Each lamp's draws of every propagated key, summarised when the lamp is finished."""

    def __init__(self, ratings, draws, keep=()):
        self.nominal = ratings
        self.keys = propagated_keys(ratings)
        self.parts = {}
        n = len(ratings)
        self.u = {k: np.full(ratings[k].shape, np.nan) for k in self.keys}
        self.interval = {k: np.full(ratings[k].shape + (2,), np.nan) for k in self.keys}
        self.incomplete = np.zeros(n, dtype=bool)
        self.xy = np.empty((n, draws, 2))
        self.kept = {k: np.full((n, draws) + np.shape(ratings[k])[1:], np.nan) for k in keep}
        self.filled = np.zeros(n, dtype=int)
        self.draws = draws
        self.flag_counts = {}  # lamp -> {validity flag: draws that carry it}
        self.categories = {}  # lamp -> the (ANSI category, bin) pairs the draws fall in
        self.in_draws = [()] * n
        self.varies = np.zeros(n, dtype=bool)

    def add(self, lamp, part):
        self.parts.setdefault(lamp, []).append({k: part[k] for k in self.keys})
        k = len(part)
        rows = slice(self.filled[lamp], self.filled[lamp] + k)
        self.xy[lamp, rows] = np.stack([part["x"], part["y"]], axis=-1)
        for key, values in self.kept.items():
            values[lamp, rows] = np.asarray(part[key], dtype=float)
        self.filled[lamp] += k
        counts = self.flag_counts.setdefault(lamp, dict.fromkeys(VALIDITY_FLAGS, 0))
        for flags in part["flags"]:
            for flag in set(flags).intersection(counts):
                counts[flag] += 1
        ansi = np.nan_to_num(np.asarray(part["ansi_nominal_cct_K"], dtype=float), nan=-1.0)
        bins = part["bin"] if "bin" in part else (None,) * k
        self.categories.setdefault(lamp, set()).update(zip(ansi.tolist(), bins))

    def finish(self, lamp):
        parts = self.parts.pop(lamp)
        measured = set(self.nominal["flags"][lamp])
        self.in_draws[lamp] = tuple(
            f"{flag}: {100.0 * count / self.draws:.4g} % of draws"
            for flag, count in self.flag_counts.pop(lamp).items() if count != (self.draws if flag in measured else 0)
        )
        self.varies[lamp] = len(self.categories.pop(lamp)) > 1
        for key in self.keys:
            draws = np.concatenate([p[key] for p in parts])
            known = np.isfinite(self.nominal[key][lamp])
            complete = np.isfinite(draws).all(axis=0)
            ok = known & complete
            self.incomplete[lamp] |= bool(np.any(known & ~complete))
            u = draws.std(axis=0, ddof=1)
            low, high = coverage_interval(draws)
            self.u[key][lamp] = np.where(ok, u, np.nan)
            self.interval[key][lamp] = np.where(ok[..., None], np.stack([low, high], axis=-1), np.nan)

    def ratings(self, extra):
        columns = dict(self.nominal.columns)
        for key in self.keys:
            columns[f"{key}_u"] = self.u[key]
            columns[f"{key}_interval95"] = self.interval[key]
        columns["uncertainty_flags_in_draws"] = tuple(self.in_draws)
        columns["flags"] = tuple(
            f + ("uncertainty_incomplete",) * bool(bad) + ("uncertainty_crosses_validity",) * bool(crossed)
            + ("uncertainty_category_varies",) * bool(varies)
            for f, bad, crossed, varies in zip(columns["flags"], self.incomplete, self.in_draws, self.varies)
        )
        return Ratings(columns, {**self.nominal.extras, "uncertainty": extra})
