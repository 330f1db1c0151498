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
