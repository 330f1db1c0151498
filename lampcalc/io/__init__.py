"""Files: reading spectra and chromaticity tables, writing them atomically, serialising values.

May import :mod:`lampcalc.spectra` and :mod:`lampcalc.errors`. Submodules are imported by
name; this package imports nothing at start-up.
"""
