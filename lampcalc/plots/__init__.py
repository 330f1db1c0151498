"""Figures for reports: chromaticity diagrams, spectra, blackbody efficacy, hue-bin graphics,
lots, colour over angle and comparisons.

matplotlib is imported by these modules only, so nothing else in lampcalc pays for it.
Every function draws into a matplotlib ``Axes`` it is given (or a new ``Figure`` from
:func:`new_figure`), and tags what it draws with a ``gid`` so that tests and users can
find the locus, the lamps and the quadrangles again.
"""

from .diagram import draw_chromaticity_diagram, ellipse_xy
from .efficacy import draw_blackbody_efficacy, draw_peak_and_exitance
from .hue import draw_hue_bars, draw_hue_graphic
from .spectrum import draw_spectrum
from .style import figure_style, new_figure, save_figure

__all__ = [
    "draw_blackbody_efficacy",
    "draw_chromaticity_diagram",
    "draw_hue_bars",
    "draw_hue_graphic",
    "draw_peak_and_exitance",
    "draw_spectrum",
    "ellipse_xy",
    "figure_style",
    "new_figure",
    "save_figure",
]
