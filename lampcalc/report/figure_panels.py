"""Figures on report pages: axes placed in millimetres, drawn in the report's small type.

The lot, colour-over-angle and comparison pages draw the same figures as ``lampcalc plot``
and the commands' figure files (:mod:`lampcalc.plots`), on axes of their own on the page;
each axes is taken away after its page (:meth:`~lampcalc.report.document.Page.keep`).
"""

import contextlib

#: The report's type sizes for figures (the page's text is 6–8.5 pt).
SMALL = {"font.size": 6.2, "axes.titlesize": 6.8, "axes.labelsize": 6.4, "xtick.labelsize": 5.8,
         "ytick.labelsize": 5.8, "legend.fontsize": 5.6}


@contextlib.contextmanager
def small_type():
    """Context in which figures are drawn in the report's type sizes."""
    import matplotlib

    with matplotlib.rc_context(SMALL):
        yield


def panel(page, x_mm, y_mm, w_mm, h_mm, **options):
    """New axes with their top-left corner at (x, y) mm, taken away after the page."""
    ax = page.fig.add_axes(page.box(x_mm, y_mm, w_mm, h_mm), **options)
    page.keep(ax)
    return ax
