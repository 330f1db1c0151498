"""Colour rendering and fidelity: one module per published method, and a small registry;
photoreceptor ratios (S/P, CIE S 026 α-opic) in :mod:`~lampcalc.rendering.photoreceptors`.

========  ==================================================  =========================
name      method                                              function
========  ==================================================  =========================
cie13.3   CIE 13.3-1995 colour rendering index Ra, R1–R15     :func:`cie13_rendering`
cie224    CIE 224:2017 Rf / ANSI/IES TM-30-18 Rf, Rg, bins    :func:`cie224_fidelity`
========  ==================================================  =========================

May import :mod:`lampcalc.colorimetry` and the layers below it.
"""

from .cie13 import cie13_rendering
from .cie224 import cie224_fidelity

#: Registered methods by name.
METHODS = {"cie13.3": cie13_rendering, "cie224": cie224_fidelity}


def colour_rendering(values, cct_K, method="cie13.3", **options):
    """Run a registered colour rendering method on spectra on the grid.

    Parameters
    ----------
    values : array_like, shape (n, 471)
    cct_K : array_like, shape (n,)
        The lamps' CCTs, which select the reference illuminants.
    method : {"cie13.3", "cie224"}
    **options
        Passed to the method's function.

    Raises
    ------
    ValueError
        For an unknown method; the message lists the valid ones.
    """
    if method not in METHODS:
        raise ValueError(f"unknown colour rendering method {method!r}; choose one of {', '.join(METHODS)}")
    return METHODS[method](values, cct_K, **options)
