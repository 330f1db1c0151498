"""Rating any number of lamps in chunks: memory stays flat, the numbers stay the same.

Lamps arrive as batches of any size (a file each, or pieces of a large file). They are
regrouped into chunks of :data:`CHUNK_LAMPS` lamps, rated chunk by chunk (in this process,
or spread over local processes by :mod:`~lampcalc.rating.parallel`) and handed on in
order. A lamp's ratings do not depend on the lamps rated beside it
(:mod:`~lampcalc.spectra.row_products`), so the output of a stream is the same, byte for
byte, as that of one call to :func:`~lampcalc.rating.rate.rate_spectra` on every lamp.
"""

import numpy as np

from ..spectra.batch import SpectralBatch
from .rate import rate_spectra
from .ratings import Ratings

#: Lamps rated together. NumPy runs fastest with a few hundred to a thousand lamps a call (larger
#: batches leave the caches: 4,000 lamps rate about a third slower; benchmarks/bench_scale.py).
CHUNK_LAMPS = 1000


def lamp_chunks(batches, n_lamps=None):
    """Batches (on one wavelength grid) regrouped into chunks of ``n_lamps`` (:data:`CHUNK_LAMPS`), the last one smaller."""
    n_lamps = n_lamps or CHUNK_LAMPS
    pending, count = [], 0
    for batch in batches:
        start = 0
        while start < batch.n_lamps:
            take = min(n_lamps - count, batch.n_lamps - start)
            pending.append(batch if take == batch.n_lamps else batch[start : start + take])
            count += take
            start += take
            if count == n_lamps:
                yield pending[0] if len(pending) == 1 else SpectralBatch.concatenate(pending)
                pending, count = [], 0
    if pending:
        yield pending[0] if len(pending) == 1 else SpectralBatch.concatenate(pending)


def rate_chunk(batch, *, nominal=None, bin_set=None, ellipse_set=None, keep_extras=False):
    """Ratings of one chunk; ``nominal`` maps a casefolded lamp name to its claimed nominal CCT.

    Without ``keep_extras`` the ratings keep no spectra (:attr:`Ratings.extras` is empty):
    files need only the columns; figures and the report need the extras.
    """
    nominal_cct = None if not nominal else [nominal.get(name.casefold(), np.nan) for name in batch.names]
    ratings = rate_spectra(batch, nominal_cct_K=nominal_cct, bin_set=bin_set, ellipse_set=ellipse_set)
    return ratings if keep_extras else Ratings(ratings.columns)


def rate_chunks(chunks, *, workers=1, **options):
    """Ratings of each chunk, in order (see :func:`rate_chunk` for ``options``).

    ``workers`` > 1 spreads the chunks over that many local processes with dask
    (:func:`~lampcalc.rating.parallel.rate_in_processes`); the ratings are the same.
    """
    if workers > 1:
        from .parallel import rate_in_processes

        yield from rate_in_processes(chunks, workers, rate_chunk, **options)
        return
    for chunk in chunks:
        yield rate_chunk(chunk, **options)


def _join(parts):
    first = parts[0]
    if isinstance(first, np.ndarray):
        return np.concatenate(parts)
    if isinstance(first, SpectralBatch):
        return SpectralBatch.concatenate(parts)
    return tuple(v for part in parts for v in part)


def join_ratings(parts):
    """Ratings of several chunks as one table, in order (extras joined when every part has them)."""
    parts = list(parts)
    if len(parts) == 1:
        return parts[0]
    columns = {key: _join([p.columns[key] for p in parts]) for key in parts[0].columns}
    extras = {}
    if all(p.extras for p in parts):
        extras = {key: _join([p.extras[key] for p in parts]) for key in parts[0].extras}
    return Ratings(columns, extras)


def take_ratings(ratings, start, stop):
    """Lamps ``start`` to ``stop`` of a ratings table (its columns; extras sliced too)."""
    def cut(column):
        return column[start:stop]

    extras = {k: cut(v) for k, v in ratings.extras.items()}
    return Ratings({k: cut(v) for k, v in ratings.columns.items()}, extras)
