"""Drawing text on report pages: measured widths, wrapped paragraphs, and tables.

Everything is placed in millimetres from the paper's top-left corner on a
:class:`~lampcalc.report.document.Page`. Widths are measured with the font itself
(DejaVu Sans, as embedded in the PDF), so that a cell never runs into the next one: text
too wide for its column is wrapped where the column allows it and shortened with "…"
where it does not.
"""

import functools
from dataclasses import dataclass

import numpy as np

from ..plots.style import FAINT, INK, LAMP, MUTED, plain_text

PT_TO_MM = 25.4 / 72.0


@functools.lru_cache(maxsize=None)
def _font_path(weight):
    from matplotlib.font_manager import FontProperties, findfont

    return findfont(FontProperties(family="DejaVu Sans", weight=weight))


@functools.lru_cache(maxsize=None)
def _no_hinting():
    try:
        from matplotlib.ft2font import LoadFlags  # matplotlib >= 3.10
    except ImportError:
        from matplotlib.ft2font import LOAD_NO_HINTING

        return LOAD_NO_HINTING
    return LoadFlags.NO_HINTING


@functools.lru_cache(maxsize=20000)
def text_width_mm(text, size_pt, weight="normal"):
    """Width of one line of ``text`` at ``size_pt`` in DejaVu Sans, mm."""
    from matplotlib.font_manager import get_font

    font = get_font(_font_path(weight))
    font.set_size(size_pt, 72)
    font.set_text(text, 0.0, flags=_no_hinting())
    return font.get_width_height()[0] / 64.0 * PT_TO_MM


def wrap(text, width_mm, size_pt, weight="normal"):
    """``text`` broken into lines no wider than ``width_mm`` (at spaces; a long word is cut)."""
    lines = []
    for paragraph in (plain_text(part) for part in str(text).split("\n")):  # each line as given, then wrapped
        line = ""
        for word in paragraph.split(" "):
            trial = f"{line} {word}" if line else word
            if text_width_mm(trial, size_pt, weight) <= width_mm or not line:
                line = trial
            else:
                lines.append(line)
                line = word
            while text_width_mm(line, size_pt, weight) > width_mm and len(line) > 1:
                cut = len(line) - 1
                while cut > 1 and text_width_mm(line[:cut], size_pt, weight) > width_mm:
                    cut -= 1
                joint = max(line.rfind(c, 0, cut) for c in "-_/.")  # a long word breaks after a joint if it can
                cut = joint + 1 if joint > 0 else cut
                lines.append(line[:cut])
                line = line[cut:]
        lines.append(line)
    return lines


def fit(text, width_mm, size_pt, weight="normal"):
    """``text`` on one line of at most ``width_mm``: shortened with "…" when it is wider."""
    text = plain_text(text)
    if text_width_mm(text, size_pt, weight) <= width_mm:
        return text
    while text and text_width_mm(text + "…", size_pt, weight) > width_mm:
        text = text[:-1]
    return text + "…"


@functools.lru_cache(maxsize=None)
def _renderer():
    from matplotlib.backends.backend_agg import RendererAgg

    return RendererAgg(1, 1, 72)


@functools.lru_cache(maxsize=20000)
def _steady(line):
    """Whether a line is no taller above its baseline than "lp": then a multi-line text keeps its pitch."""
    if not line or (line.isascii() and line.isalnum()):
        return True
    from matplotlib.font_manager import FontProperties

    prop = FontProperties(family="DejaVu Sans", size=10)
    _, h, d = _renderer().get_text_width_height_descent(line, prop, ismath=False)
    _, lp_h, lp_d = _renderer().get_text_width_height_descent("lp", prop, ismath=False)
    return h - d <= lp_h - lp_d + 1e-6


@functools.lru_cache(maxsize=None)
def _base_step_mm(size_pt):
    """The distance between the lines of a multi-line text at ``linespacing=1``, mm, as matplotlib lays it out.

    Measured rather than computed: matplotlib's rule for line spacing differs between versions.
    """
    from matplotlib.backends.backend_agg import FigureCanvasAgg
    from matplotlib.figure import Figure

    fig = Figure(dpi=72)
    renderer = FigureCanvasAgg(fig).get_renderer()
    one, two = (fig.text(0, 0, text, fontsize=size_pt, family="DejaVu Sans", linespacing=1.0) for text in ("lp", "lp\nlp"))
    return (two.get_window_extent(renderer).height - one.get_window_extent(renderer).height) * PT_TO_MM


def line_mm(size_pt, spacing=1.3):
    """Distance between the lines of a text at ``size_pt`` drawn with ``linespacing=spacing``, mm."""
    return _base_step_mm(size_pt) * spacing


def paragraph(page, x_mm, y_mm, text, width_mm, *, size=7.0, weight="normal", color=INK, spacing=1.3):
    """Draw wrapped ``text``; returns its height, mm."""
    lines = wrap(text, width_mm, size, weight)
    if lines:
        page.text(x_mm, y_mm, "\n".join(lines), size=size, weight=weight, color=color, linespacing=spacing)
    return len(lines) * line_mm(size, spacing)


def paragraph_height(text, width_mm, *, size=7.0, weight="normal", spacing=1.3):
    """The height :func:`paragraph` would draw, mm."""
    return len(wrap(text, width_mm, size, weight)) * line_mm(size, spacing)


HEAD_PT = 7.5  # the headings of headed paragraphs


def headed_height(head, text, head_mm, text_mm, *, size):
    """The height :func:`headed_paragraph` draws, mm."""
    return max(paragraph_height(text, text_mm, size=size), paragraph_height(head, head_mm - 3, size=HEAD_PT, weight="bold"))


def headed_paragraph(page, x_mm, y_mm, head, text, head_mm, text_mm, *, size, head_color=INK):
    """A bold heading in a column of ``head_mm`` and its text beside it; returns the height, mm."""
    paragraph(page, x_mm, y_mm, head, head_mm - 3, size=HEAD_PT, weight="bold", color=head_color)
    paragraph(page, x_mm + head_mm, y_mm, text, text_mm, size=size)
    return headed_height(head, text, head_mm, text_mm, size=size)


def headed_pages(blocks, head_mm, text_mm, room_mm, *, size, gap_mm):
    """Blocks ``(head, text, …)`` laid on pages of ``room_mm``: (list of pages of blocks, height used on the last)."""
    pages, used = [[]], 0.0
    for block in blocks:
        height = headed_height(block[0], block[1], head_mm, text_mm, size=size) + gap_mm
        if used + height > room_mm and pages[-1]:
            pages.append([])
            used = 0.0
        pages[-1].append(block)
        used += height
    return pages, used


@dataclass(frozen=True)
class Column:
    """A table column: header text, width (mm), alignment, whether its cells may wrap, their colour."""

    header: str
    width_mm: float
    align: str = "right"
    wrap: bool = False
    color: str = INK


@dataclass(frozen=True)
class Cell:
    """A cell with its own look; a plain string is a cell in the table's body style."""

    text: str
    weight: str = "normal"
    color: str = None  # the column's


class Table:
    """A table of :class:`Column` s: header, rows, light bands on every other row.

    ``rows`` hold strings or :class:`Cell` s. Row heights follow the wrapped cells;
    :meth:`height` gives the height before drawing, so pages can be planned. When no cell
    wraps, each column's plain cells are drawn as one multi-line text (far fewer texts for
    the PDF writer to lay out); styled cells are drawn on their own.
    """

    def __init__(self, columns, rows, *, size=6.6, header_size=None, pad_mm=1.0, band=True, spacing=1.55):
        self.spacing = spacing  # line pitch of the body, in matplotlib's linespacing units
        self.columns, self.rows = list(columns), [list(r) for r in rows]
        self.size, self.header_size = size, header_size or size
        self.pad, self.band = pad_mm, band
        self._lines = [self._row_lines(r) for r in self.rows]

    @staticmethod
    def _cell(value, column=None):
        cell = value if isinstance(value, Cell) else Cell(str(value))
        return Cell(cell.text, cell.weight, column.color) if cell.color is None and column is not None else cell

    def _row_lines(self, row):
        out = []
        for column, value in zip(self.columns, row):
            cell = self._cell(value)
            room = column.width_mm - 2 * self.pad
            lines = wrap(cell.text, room, self.size, cell.weight) if column.wrap else [fit(cell.text, room, self.size, cell.weight)]
            out.append(lines)
        return out

    @property
    def line(self):
        return line_mm(self.size, self.spacing)

    def header_height(self):
        return max(len(c.header.split("\n")) for c in self.columns) * line_mm(self.header_size, 1.2) + 2.2

    def row_heights(self):
        return [max(len(lines) for lines in row) * self.line for row in self._lines]

    def height(self):
        """Height of the whole table, mm."""
        return self.header_height() + sum(self.row_heights())

    def _anchor(self, column, left):
        return {"left": left + self.pad, "right": left + column.width_mm - self.pad,
                "center": left + column.width_mm / 2}[column.align]

    def draw(self, page, x_mm, y_mm):
        """Draw at (x, y) mm, top-left; returns the height drawn, mm."""
        width = sum(c.width_mm for c in self.columns)
        head = self.header_height()
        left = x_mm
        for column in self.columns:
            page.text(self._anchor(column, left), y_mm + head - 2.1, column.header, size=self.header_size,
                      weight="bold", color=INK, ha=column.align, va="baseline", linespacing=1.2)
            left += column.width_mm
        page.rule(x_mm, x_mm + width, y_mm + head - 0.6, lw=0.7, color=INK)
        top = y_mm + head
        heights = self.row_heights()
        if self.band:
            edges = np.cumsum([top, *heights])
            page.bands([(x_mm, edges[k], width, heights[k]) for k in range(1, len(heights), 2)], color=FAINT,
                       alpha=0.35)
        left = x_mm
        text_top = top + (self.line - line_mm(self.size, 1.0)) / 2 - 0.25
        for c, column in enumerate(self.columns):
            anchor = self._anchor(column, left)
            plain, y = [], top
            for row, lines, height in zip(self.rows, self._lines, heights):
                cell, cell_lines = self._cell(row[c], column), lines[c]
                pitch_lines = round(height / self.line)
                if cell.weight == "normal" and cell.color == column.color and all(map(_steady, cell_lines)):
                    plain += cell_lines + [""] * (pitch_lines - len(cell_lines))
                else:
                    plain += [""] * pitch_lines
                    if any(cell_lines):
                        page.text(anchor, y + (text_top - top), "\n".join(cell_lines), size=self.size,
                                  weight=cell.weight, color=cell.color, ha=column.align, linespacing=self.spacing)
                y += height
            if any(plain):
                page.text(anchor, text_top, "\n".join(plain), size=self.size, color=column.color, ha=column.align,
                          linespacing=self.spacing)
            left += column.width_mm
        bottom = top + sum(heights)
        page.rule(x_mm, x_mm + width, bottom, lw=0.4, color=MUTED)
        return bottom - y_mm


def key_values(page, x_mm, y_mm, items, label_mm, value_mm, *, size=6.8, label_color=MUTED):
    """A list of (label, value) lines, drawn as two texts; values wrap within ``value_mm``. Returns the height, mm."""
    labels, values = [], []
    for label, value in items:
        lines = wrap(value, value_mm, size)
        labels += [fit(label, label_mm - 1.0, size)] + [""] * (len(lines) - 1)
        values += lines
    if labels:
        page.text(x_mm, y_mm, "\n".join(labels), size=size, color=label_color, linespacing=1.3)
        page.text(x_mm + label_mm, y_mm, "\n".join(values), size=size, color=INK, linespacing=1.3)
    return len(values) * line_mm(size, 1.3)


def key_values_height(items, value_mm, *, size=6.8):
    """The height :func:`key_values` would draw, mm."""
    return sum(len(wrap(value, value_mm, size)) for _, value in items) * line_mm(size, 1.3)


HEADING_MM = 6.0


def heading(page, x_mm, y_mm, text, width_mm):
    """A section heading: a short bar of the lamp colour, the words, a hairline across. Height :data:`HEADING_MM`."""
    page.band(x_mm, y_mm + 0.5, 1.2, 3.0, color=LAMP)
    page.text(x_mm + 2.6, y_mm + 0.3, text, size=8.5, weight="bold", color=INK)
    page.rule(x_mm + 2.6 + text_width_mm(text, 8.5, "bold") + 2.0, x_mm + width_mm, y_mm + 2.2, lw=0.3, color=FAINT)
    return HEADING_MM
