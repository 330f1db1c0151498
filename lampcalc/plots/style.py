"""lampcalc's figure style: fonts, sizes, colours, and deterministic output files."""

import contextlib
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
}


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
