"""Colorimetry: tristimulus values and chromaticity coordinates, photometric sums, the
Planckian locus with CCT and Duv, CIE daylight, and the numbers of a blackbody.

May import :mod:`lampcalc.physics`, :mod:`lampcalc.spectra` and :mod:`lampcalc.errors`.
"""
