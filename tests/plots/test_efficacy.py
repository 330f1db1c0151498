"""The efficacy figure's log axes are labelled in plain text that says the tick's value."""

import numpy as np

from lampcalc.plots import figure_style, new_figure
from lampcalc.plots.efficacy import draw_blackbody_efficacy, draw_peak_and_exitance

_DIGITS = str.maketrans("⁻⁰¹²³⁴⁵⁶⁷⁸⁹", "-0123456789")


def _value(label):
    """The number a tick label prints: "20 000", "10⁶"."""
    text = label.replace(" ", "")
    if text.startswith("10") and text[2:] and not text[2:].isascii():
        return 10.0 ** int(text[2:].translate(_DIGITS))
    return float(text)


def _labelled(axis):
    ticks = [(t.get_loc(), t.label1.get_text() or t.label2.get_text())
             for t in axis.get_major_ticks() + axis.get_minor_ticks()]
    low, high = sorted(axis.get_view_interval())
    return [(loc, text) for loc, text in ticks if text and low <= loc <= high]


def test_log_axes_print_plain_numbers_at_their_ticks():
    # Math text is off in lampcalc's style (lamp names are never math): a log axis must not print
    # matplotlib's "$\mathdefault{10^{3}}$" as typed. Each label must read back as its tick's value.
    with figure_style():
        fig = new_figure((6.3, 7.0))
        top = draw_blackbody_efficacy(fig.add_subplot(2, 1, 1), [("lamp", 3000.0, 300.0)])
        bottom, right = draw_peak_and_exitance(fig.add_subplot(2, 1, 2))
        fig.canvas.draw()
        for axis in (top.xaxis, bottom.xaxis, bottom.yaxis, right.yaxis):
            shown = _labelled(axis)
            assert len(shown) >= 2
            for loc, text in shown:
                assert "$" not in text and "e" not in text.lower()
                assert np.isclose(_value(text), loc, rtol=1e-9)
        # The temperature axis (500-20 000 K, under two decades) names 2 and 5 times its decades too.
        assert {"1000", "2000", "5000", "10 000"} <= {text for _, text in _labelled(top.xaxis)}
