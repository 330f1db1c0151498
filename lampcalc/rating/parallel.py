"""Chunks of lamps rated side by side in local processes, with dask's local scheduler.

``lampcalc rate --workers N`` hands windows of chunks to dask (``dask.delayed`` over the
chunks, computed with its ``processes`` scheduler on one pool of N processes kept for the
whole run) while this process reads the next window and writes the last one. Results
come back in order and are the same, byte for byte, as with one process: each lamp's
ratings depend on its spectrum alone (:mod:`~lampcalc.spectra.row_products`).

dask is optional (``pip install 'lampcalc[dask]'``) and imported only here.
"""

#: Chunks in flight per worker: one being rated, one waiting, so that no worker idles.
CHUNKS_PER_WORKER = 2


def _windows(chunks, size):
    window = []
    for chunk in chunks:
        window.append(chunk)
        if len(window) == size:
            yield window
            window = []
    if window:
        yield window


def rate_in_processes(chunks, workers, rate, **options):
    """``rate(chunk, **options)`` for each chunk, computed by ``workers`` local processes; results in order.

    Raises
    ------
    ImportError
        When dask is not installed, naming the extra that installs it.
    """
    import multiprocessing
    from concurrent.futures import ProcessPoolExecutor, ThreadPoolExecutor

    from .optional import optional_import

    dask = optional_import("dask", "dask", "rating in several processes")

    # "spawn": fresh interpreters, safe whatever threads this process runs (BLAS, the progress bar).
    pool = ProcessPoolExecutor(workers, mp_context=multiprocessing.get_context("spawn"))
    waiter = ThreadPoolExecutor(1)  # waits for dask while this thread reads and writes
    try:
        pending = None
        for window in _windows(chunks, CHUNKS_PER_WORKER * workers):
            tasks = [dask.delayed(rate)(chunk, **options) for chunk in window]
            submitted = waiter.submit(dask.compute, *tasks, scheduler="processes", pool=pool, num_workers=workers)
            if pending is not None:
                yield from pending.result()
            pending = submitted
        if pending is not None:
            yield from pending.result()
    finally:
        waiter.shutdown(wait=True, cancel_futures=True)
        pool.shutdown(wait=True, cancel_futures=True)
