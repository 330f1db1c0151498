"""Spectra: the :class:`~lampcalc.spectra.batch.SpectralBatch` container, resampling onto the
CIE 015:2018 grid, and the CIE tables on that grid.

May import :mod:`lampcalc.errors` only.
"""
