"""Rating spectra held in a dask array of any shape: a spectral cube, a database's spectra, a cluster.

:func:`rate_dask_array` takes a dask array of spectra ``(..., n_wavelengths)`` on one
wavelength axis (a zarr-backed image cube, say) and returns dask arrays of the numeric
ratings with the same leading shape. Nothing is computed until the caller asks: each
chunk of spectra is rated on its own with :func:`~lampcalc.rating.rate.rate_spectra`
(``map_blocks``, chunks whole along the wavelengths), so a chunk's memory is all a worker
needs, and the same call runs on a ``dask.distributed`` cluster when a ``Client`` is
active. A lamp's numbers are the same as :func:`rate_spectra` gives for it in any batch
(:mod:`~lampcalc.spectra.row_products`). ``docs/scale.md`` shows a cluster run.

dask is optional (``pip install 'lampcalc[dask]'``) and imported only inside these functions.
"""

import numpy as np

from .flags import FLAG_MEANINGS
from .ratings import FIELDS
from .wide_columns import SPREAD

#: Flags as bits of the ``flags`` array: bit k set means the flag ``FLAG_BITS[k]``.
FLAG_BITS = tuple(FLAG_MEANINGS)
#: The numeric ratings returned, with the trailing length of list ratings (ri: 15 …).
ARRAY_FIELDS = {
    key: len(SPREAD.get(key, ())) or None
    for key in FIELDS
    if key not in ("name", "source", "quantity", "interpolation", "ansi_edition", "bin_set", "bin", "bin_nearest",
                   "sdcm_ellipse_set", "flags")
}


def _layout():
    """Where each rating sits along the packed last axis: key -> slice."""
    places, start = {}, 0
    for key, width in ARRAY_FIELDS.items():
        places[key] = slice(start, start + (width or 1))
        start += width or 1
    places["flags"] = slice(start, start + 1)
    return places, start + 1


def flag_mask(flags):
    """The bit mask of a lamp's flags (bit k: :data:`FLAG_BITS` [k]).

    Examples
    --------
    >>> flag_mask(("range_truncated", "interpolation_undershoot")) == 1 + 4
    True
    """
    return sum(1 << FLAG_BITS.index(flag) for flag in flags)


def flag_names(mask):
    """The flags a bit mask stands for, in :data:`FLAG_BITS` order."""
    return tuple(flag for k, flag in enumerate(FLAG_BITS) if int(mask) >> k & 1)


def _rate_block(block, wavelength_nm, quantity, interpolation, options):
    """Packed ratings of one block of spectra: shape block.shape[:-1] + (n_packed,)."""
    from ..spectra.batch import SpectralBatch
    from .rate import rate_spectra

    places, width = _layout()
    lead = block.shape[:-1]
    values = np.asarray(block, dtype=float).reshape(-1, block.shape[-1])
    out = np.full((values.shape[0], width), np.nan)
    if values.shape[0]:
        batch = SpectralBatch(wavelength_nm, values, names=("",) * values.shape[0], quantity=quantity)
        ratings = rate_spectra(batch.on_grid(interpolation), **options)
        for key, place in places.items():
            if key == "flags":
                out[:, place] = np.array([[flag_mask(f)] for f in ratings["flags"]], dtype=float)
            elif key in ratings:
                out[:, place] = np.asarray(ratings[key], dtype=float).reshape(values.shape[0], -1)
    return out.reshape(*lead, width)


def rate_dask_array(spectra, wavelength_nm, *, quantity="relative", interpolation="auto", **options):
    """Numeric ratings of every spectrum of a dask array, as dask arrays of the same leading shape.

    Parameters
    ----------
    spectra : dask.array.Array or array_like, shape (..., n_wavelengths)
        Spectra on ``wavelength_nm``, finite and non-negative; rechunked to be whole
        along the last axis if they are not.
    wavelength_nm : array_like, shape (n_wavelengths,)
        Strictly increasing, covering at least 400–700 nm.
    quantity : {"relative", "flux", "irradiance", "radiance"}
        Of every spectrum (:data:`~lampcalc.spectra.batch.QUANTITY_UNITS`).
    interpolation : {"auto", "linear", "sprague"}
        Resampling to the 1 nm grid, as :meth:`SpectralBatch.on_grid`.
    **options
        ``observer``, ``bin_set``, ``ellipse_set`` of :func:`~lampcalc.rating.rate.rate_spectra`.

    Returns
    -------
    dict of str to dask.array.Array
        The keys of :data:`ARRAY_FIELDS` with shape ``(...)``, or ``(..., k)`` for lists
        (``ri``: R1–R15, hue bins: 16, ``ler_range_nm``: 2), float64 with NaN where a value
        is null; and ``flags``: uint64 bit masks (:func:`flag_names` reads them). The
        arrays share one graph: computing several together rates each chunk once.

    Raises
    ------
    ImportError
        When dask is not installed.
    ValueError
        For a last axis that does not match ``wavelength_nm``.
    """
    from .optional import optional_import

    da = optional_import("dask.array", "dask", "rate_dask_array")
    wl = np.asarray(wavelength_nm, dtype=float)
    spectra = da.asarray(spectra)
    if spectra.ndim < 1 or spectra.shape[-1] != wl.size:
        raise ValueError(f"spectra must have shape (..., {wl.size}) for {wl.size} wavelengths, got {spectra.shape}")
    single = spectra.ndim == 1
    if single:
        spectra = spectra[None]
    spectra = spectra.rechunk({spectra.ndim - 1: -1})
    places, width = _layout()
    packed = spectra.map_blocks(
        _rate_block, wl, quantity, interpolation, options,
        dtype=float, chunks=spectra.chunks[:-1] + ((width,),), meta=np.empty((0,) * spectra.ndim),
    )
    out = {}
    for key, place in places.items():
        column = packed[..., place]
        if key == "flags":
            out[key] = column[..., 0].astype(np.uint64)
        else:
            out[key] = column if ARRAY_FIELDS[key] else column[..., 0]
    return {key: value[0] for key, value in out.items()} if single else out
