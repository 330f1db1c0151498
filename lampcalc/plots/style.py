"""lampcalc's figure style: fonts, sizes, colours, and deterministic output files."""

import contextlib
import functools
from pathlib import Path

#: lampcalc's palette (its own; no other program's colour codes).
INK = "#1f2933"
MUTED = "#7b8794"
FAINT = "#cbd2d9"
PLANCK = "#8a3b12"
DAYLIGHT = "#2f6f8f"
LAMP = "#b3124f"
ACCENT = "#3d7a4a"
REFERENCE = "#52606d"
LAMP_CYCLE = ("#b3124f", "#2f6f8f", "#d9822b", "#3d7a4a", "#6c4ba1", "#8a3b12", "#0f7a7a", "#a6761d")

FORMATS = (".png", ".svg", ".pdf")
A4_PORTRAIT_IN = (8.27, 11.69)

_RC = {
    "font.family": "DejaVu Sans",
    "font.size": 8.5,
    "axes.titlesize": 9.5,
    "axes.labelsize": 8.5,
    "axes.edgecolor": INK,
    "axes.labelcolor": INK,
    "axes.linewidth": 0.6,
    "xtick.color": INK,
    "ytick.color": INK,
    "xtick.labelsize": 7.5,
    "ytick.labelsize": 7.5,
    "xtick.direction": "in",
    "ytick.direction": "in",
    "legend.fontsize": 7.5,
    "legend.frameon": False,
    "lines.linewidth": 1.0,
    "grid.color": FAINT,
    "grid.linewidth": 0.4,
    "pdf.fonttype": 42,  # TrueType: text stays text, and can be read back
    "svg.fonttype": "none",
    "svg.hashsalt": "lampcalc",  # deterministic SVG ids
    "savefig.dpi": 200,
    "text.parse_math": False,  # names and labels are plain text: "$x$" prints as typed
    "text.usetex": False,
}


#: What a character the font cannot draw is printed as (U+FFFD, the replacement character).
REPLACEMENT = "\ufffd"


@functools.lru_cache(maxsize=None)
def _drawable(weight):
    from matplotlib.font_manager import FontProperties, findfont, get_font

    font = get_font(findfont(FontProperties(family=_RC["font.family"], weight=weight), fallback_to_default=True))
    return frozenset(font.get_charmap())


def plain_text(text, weight="normal"):
    """``text`` as lampcalc's font can print it: control characters become spaces, and a
    character the font has no glyph for becomes U+FFFD, so that no glyph goes missing (and
    matplotlib has nothing to warn about).

    Examples
    --------
    >>> plain_text("QF\tlamp")
    'QF lamp'
    """
    text = str(text)
    if text.isascii() and text.isprintable():
        return text
    drawable = _drawable(weight)
    return "".join(
        " " if not c.isprintable() else c if ord(c) in drawable else REPLACEMENT for c in text
    )


_SUPERSCRIPTS = str.maketrans("-0123456789", "⁻⁰¹²³⁴⁵⁶⁷⁸⁹")


def plain_number(value, powers=False):
    """A tick value as plain text: "500", "10 000", "10⁶" (no math text, which lampcalc's figures do not parse).

    A power of ten prints as one ("10⁴") with ``powers``, or when it is 10⁵ or more, or below 0.01.

    Examples
    --------
    >>> plain_number(2000.0), plain_number(20000.0), plain_number(1e8), plain_number(0.5), plain_number(1e4, powers=True)
    ('2000', '20 000', '10⁸', '0.5', '10⁴')
    """
    import math

    if value <= 0 or not math.isfinite(value):
        return f"{value:g}"
    exponent = math.log10(value)
    if abs(exponent - round(exponent)) < 1e-9 and (powers or not -2 <= exponent < 5):
        return "10" + str(round(exponent)).translate(_SUPERSCRIPTS)
    if value >= 10000:
        return f"{value:,.0f}".replace(",", " ")
    return f"{value:g}"


def plain_log_ticks(axis):
    """Label a log ``axis`` in plain text: the decades, and 2 and 5 times them when the axis spans under three decades.

    matplotlib's own log labels are math text ("$\\mathdefault{10^{3}}$"), which lampcalc's style
    prints as typed (``text.parse_math`` is off so that lamp names are never math).
    """
    import math

    from matplotlib.ticker import FuncFormatter

    def wide():
        low, high = sorted(axis.get_view_interval())
        return low <= 0 or math.log10(high / low) >= 3

    def minor(value, _pos):
        if wide():
            return ""
        mantissa = value / 10 ** math.floor(math.log10(value) + 1e-9)
        return plain_number(value) if any(abs(mantissa - m) < 1e-6 for m in (2, 5)) else ""

    axis.set_major_formatter(FuncFormatter(lambda value, _pos: plain_number(value, powers=wide())))
    axis.set_minor_formatter(FuncFormatter(minor))


def pin_axis_labels(ax, x_below_pt=15.0, y_left_pt=24.0):
    """Place the axis labels at fixed distances from the axes, so drawing needs no tick-label boxes.

    matplotlib otherwise measures every tick label on every draw to place the axis labels;
    a figure drawn many times (a report's pages) saves that work.
    """
    from matplotlib.transforms import ScaledTranslation

    scale = ax.figure.dpi_scale_trans
    ax.xaxis.set_label_coords(0.5, 0.0, transform=ax.transAxes + ScaledTranslation(0, -x_below_pt / 72, scale))
    ax.yaxis.set_label_coords(0.0, 0.5, transform=ax.transAxes + ScaledTranslation(-y_left_pt / 72, 0, scale))
    ax.xaxis.label.set_va("top")
    ax.yaxis.label.set_va("bottom")


@contextlib.contextmanager
def figure_style():
    """Context in which lampcalc's matplotlib settings apply (nothing changes outside it)."""
    import matplotlib

    with matplotlib.rc_context(_RC):
        yield


def new_figure(size_in=(6.0, 5.0)):
    """A matplotlib Figure with an Agg canvas, independent of pyplot's global state."""
    from matplotlib.backends.backend_agg import FigureCanvasAgg
    from matplotlib.figure import Figure

    fig = Figure(figsize=size_in, layout="constrained")
    FigureCanvasAgg(fig)
    return fig


def save_figure(fig, path):
    """Save a figure as PNG, SVG or PDF by the file's extension, through a temporary file.

    PDF and SVG carry no creation date, so the same figure gives the same bytes.
    """
    from ..errors import InputError
    from ..io.atomic import atomic_path

    path = Path(path)
    suffix = path.suffix.lower()
    if suffix not in FORMATS:
        raise InputError(f"{path}: unknown figure format {suffix or '(none)'}; use one of {', '.join(FORMATS)}")
    metadata = {"png": {"Software": None}, "svg": {"Date": None}, "pdf": {"CreationDate": None, "ModDate": None}}
    with atomic_path(path) as tmp:
        fig.savefig(tmp, format=suffix[1:], metadata=metadata[suffix[1:]])
