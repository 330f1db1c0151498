"""The report document: paper, the frame of every page, the order of the pages, the PDF.

A report is an ordered list of *page builders*. Each builder is an object with

``order``
    a number that places its pages: the summary is 100, the lamp pages 300, the methods 900;
``count(report)``
    how many pages it will draw for a :class:`Report` (so every page can say "page N of M");
``draw(report, sheet)``
    draws exactly that many pages, each inside ``with sheet.page(key, title, subtitle) as page:``;
``overview(report)`` (optional)
    the verdict of its part in a few sentences, ``[(text, alarm), ...]``, which the summary
    prints on the first page (``alarm``: a verdict not met or not evaluated, printed in the
    lamp colour).

The builders are found, not listed: every module of this package whose name ends in
``_pages`` or ``_page`` and that defines ``PAGES`` (a builder) takes part: the summary (100),
a lot (150), colour over angle (160), a comparison (170), the measurement uncertainty (200),
the lamps (300), the methods (900). The data a builder draws come with the :class:`Report`
(``lot=``, ``angles=``, ``comparison=``); without them it counts no page. To add pages,
write ``lampcalc/report/<name>_pages.py`` with ``PAGES = YourBuilder()`` and an ``order``
between its neighbours; no other module changes. A caller can also pass its own list:
``write_report(..., pages=[...])``.

A page is drawn in millimetres from the paper's top-left corner (:class:`Page`). The
:class:`Sheet` keeps one matplotlib figure per page ``key`` and reuses it: axes and fixed
artists made for the first page of a kind are kept, and only what a page adds through
:meth:`Page.text`, :meth:`Page.rule`, :meth:`Page.band` or :meth:`Page.keep` is taken away
after it is saved. Every page carries the report's title and number at the top, the
caution and "page N of M" at the bottom. Paper: A4 or US Letter with 16 mm margins. The
PDF embeds its fonts (TrueType) and carries no date, so the same inputs give the same bytes.
"""

import contextlib
import dataclasses
import importlib
import pkgutil
from dataclasses import dataclass

from .. import __version__
from ..plots.style import INK, MUTED, figure_style, plain_text
from .caution import CAUTION
from .report_info import ReportInfo, read_report_info, report_info_from


@dataclass(frozen=True)
class Paper:
    """A paper size, mm."""

    name: str
    width_mm: float
    height_mm: float

    @property
    def content_mm(self):
        """(width, height) of a page's content: inside the margins, below the title, above the footer, mm."""
        return self.width_mm - 2 * MARGIN_MM, self.height_mm - 2 * MARGIN_MM - HEADER_MM - FOOTER_MM


#: Paper sizes by the name ``--paper`` takes.
PAPERS = {"a4": Paper("A4", 210.0, 297.0), "letter": Paper("US Letter", 215.9, 279.4)}
MARGIN_MM = 16.0
HEADER_MM = 15.5  # the page title and two lines of subtitle
FOOTER_MM = 9.0  # the caution and the page number


def page_builders():
    """Every builder found in this package (modules ``*_pages`` / ``*_page`` defining ``PAGES``), in order."""
    from . import __path__ as here

    found = []
    for module in sorted(m.name for m in pkgutil.iter_modules(here)):
        if module.endswith(("_pages", "_page")):
            builder = getattr(importlib.import_module(f"{__package__}.{module}"), "PAGES", None)
            if builder is not None:
                found.append((builder.order, module, builder))
    return [builder for _, _, builder in sorted(found, key=lambda item: item[:2])]


class Report:
    """What the page builders read: the ratings, the verdicts, the report information, the paper.

    Parameters
    ----------
    ratings : Ratings or None
        The lamps of the report (every lamp gets its page); None with ``comparison``: the
        lamps of both sides (:func:`~lampcalc.verdicts.comparison.both_sides`).
    verdicts : Verdicts, optional
    info : ReportInfo, mapping or path of a TOML file, optional
    paper : {"a4", "letter"}
    pages : sequence of page builders, optional
        Default: :func:`page_builders`.
    lot : dict, optional
        :func:`~lampcalc.verdicts.lot.lot_statistics` of the lamps: the lot's pages.
    lot_verdicts : LotVerdicts, optional
        :func:`~lampcalc.verdicts.lot_claims.check_lot_claims` of that lot.
    angles : dict, optional
        :func:`~lampcalc.verdicts.angles.colour_over_angle` of the lamps: the pages of colour over angle.
    comparison : (Ratings, Ratings, dict), optional
        The reference's and the test's ratings and :func:`~lampcalc.verdicts.comparison.compare_ratings`
        of the two: the comparison's pages.

    Each builder counts no page for the data it is not given.
    """

    def __init__(self, ratings, verdicts=None, *, info=None, paper="a4", pages=None, title=None, lot=None,
                 lot_verdicts=None, angles=None, comparison=None):
        from ..verdicts.wording import pair_verdicts

        if paper not in PAPERS:
            raise ValueError(f"unknown paper {paper!r}; choose one of {', '.join(PAPERS)}")
        if lot_verdicts is not None and lot is None:
            raise ValueError("lot_verdicts needs the lot they were checked against (lot=)")
        if ratings is None:
            if comparison is None:
                raise ValueError("a report needs ratings (or a comparison, whose two sides it shows)")
            from ..verdicts.comparison import both_sides

            ratings = both_sides(*comparison[:2])
        self.lot, self.lot_verdicts, self.angles, self.comparison = lot, lot_verdicts, angles, comparison
        if info is None:
            info = ReportInfo()
        elif not isinstance(info, ReportInfo):
            info = report_info_from(info) if hasattr(info, "items") else read_report_info(info)
        if title and not info.title:
            info = dataclasses.replace(info, title=title)
        self.ratings, self.verdicts, self.info, self.paper = ratings, verdicts, info, PAPERS[paper]
        self.records = ratings.records()
        self.lamp_verdicts = pair_verdicts([r["name"] for r in self.records], verdicts)
        self.cache = {}  # what builders compute once and share between count() and draw()
        self.builders = list(page_builders() if pages is None else pages)
        self.counts = [builder.count(self) for builder in self.builders]

    @property
    def n_pages(self):
        return sum(self.counts)

    def write(self, path, progress=None):
        """Write the PDF to ``path`` (a temporary file, then a rename); returns the number of pages."""
        from matplotlib.backends.backend_pdf import PdfPages

        from ..io.atomic import atomic_path

        metadata = {"Title": plain_text(self.info.heading), "Creator": f"lampcalc {__version__}", "Producer": "lampcalc",
                    "CreationDate": None}
        with atomic_path(path) as tmp, figure_style(), PdfPages(tmp, metadata=metadata) as pdf:
            sheet = Sheet(pdf, self, progress)
            for builder, count in zip(self.builders, self.counts):
                before = sheet.page_number
                builder.draw(self, sheet)
                if sheet.page_number - before != count:
                    raise RuntimeError(f"{type(builder).__name__} drew {sheet.page_number - before} pages, planned {count}")
        return self.n_pages


class Sheet:
    """The pages as they are written: one reusable figure per kind of page, and the frame."""

    def __init__(self, pdf, report, progress=None):
        self.pdf, self.report, self.paper = pdf, report, report.paper
        self.progress = progress or (lambda n: None)
        self.page_number = 0
        self._figures = {}

    @property
    def left(self):
        return MARGIN_MM

    @property
    def right(self):
        return self.paper.width_mm - MARGIN_MM

    @property
    def width(self):
        return self.paper.width_mm - 2 * MARGIN_MM

    @property
    def top(self):
        """Where a page's content starts, below its title, mm from the top edge."""
        return MARGIN_MM + HEADER_MM

    @property
    def bottom(self):
        """Where a page's content must end, above the footer, mm from the top edge."""
        return self.paper.height_mm - MARGIN_MM - FOOTER_MM

    def _figure(self, key):
        if key not in self._figures:
            from matplotlib.backends.backend_agg import FigureCanvasAgg
            from matplotlib.figure import Figure

            # An Agg canvas measures text while a page is laid out; PdfPages prints the figure.
            fig = Figure(figsize=(self.paper.width_mm / 25.4, self.paper.height_mm / 25.4))
            FigureCanvasAgg(fig)
            self._figures[key] = fig
        return self._figures[key]

    @contextlib.contextmanager
    def page(self, key, title, subtitle=""):
        """Draw one page on the figure kept for ``key``; saved and cleared of its page's artists on exit.

        ``subtitle`` may have two lines.
        """
        page = Page(self, self._figure(key))
        self.page_number += 1
        self._frame(page, title, subtitle)
        yield page
        self.pdf.savefig(page.fig)
        page.clear()
        self.progress(1)

    def _frame(self, page, title, subtitle):
        info, n = self.report.info, self.report.n_pages
        from .tables import text_width_mm

        room = self.width * 0.64
        size = next((s for s in (12.5, 11.0, 10.0, 9.0) if text_width_mm(plain_text(title), s, "bold") <= room), 9.0)
        page.text(self.left, MARGIN_MM + (12.5 - size) * 0.2, title, size=size, weight="bold", fit_mm=room)
        if text_width_mm(plain_text(title), size, "bold") > room:  # shortened: the whole of it under the title
            subtitle = title + ("\n" + subtitle.split("\n")[-1] if subtitle else "")
        for k, line in enumerate(subtitle.split("\n")[:2] if subtitle else ()):
            # Below the report's title and number on the right: the whole width is free.
            page.text(self.left, MARGIN_MM + 6.4 + 3.1 * k, line, size=7, color=MUTED, fit_mm=self.width)
        if title != info.heading:  # the report's title on every page that has a title of its own
            page.text(self.right, MARGIN_MM + 0.4, info.heading, size=7, color=MUTED, ha="right", fit_mm=self.width * 0.34)
        if info.report_number:
            page.text(self.right, MARGIN_MM + 3.8, f"report {info.report_number}", size=7, color=INK, ha="right",
                      weight="bold", fit_mm=self.width * 0.34)
        foot = self.paper.height_mm - MARGIN_MM - FOOTER_MM + 2.0
        page.rule(self.left, self.right, foot - 1.2, lw=0.4, color=MUTED)
        from .tables import wrap

        page.text(self.left, foot, "\n".join(wrap(CAUTION, self.width - 30, 5.8)), size=5.8, color=MUTED, linespacing=1.25)
        page.text(self.right, foot, f"page {self.page_number} of {n}", size=7, color=INK, ha="right")


class Page:
    """One page being drawn: text, rules and bands placed in mm from the paper's top-left corner."""

    def __init__(self, sheet, fig):
        self.sheet, self.fig = sheet, fig
        self._added = []

    def _xy(self, x_mm, y_mm):
        return x_mm / self.sheet.paper.width_mm, 1.0 - y_mm / self.sheet.paper.height_mm

    def box(self, x_mm, y_mm, w_mm, h_mm):
        """[left, bottom, width, height] in figure fractions of a box given by its top-left corner, mm."""
        width, height = self.sheet.paper.width_mm, self.sheet.paper.height_mm
        return [x_mm / width, 1.0 - (y_mm + h_mm) / height, w_mm / width, h_mm / height]

    def text(self, x_mm, y_mm, text, *, size=7.0, weight="normal", color=INK, ha="left", va="top", fit_mm=None,
             **options):
        """A text whose top (``va="top"``) is at ``y_mm``: plain text, its lines as given, or one line shortened to ``fit_mm``."""
        from .tables import fit

        text = fit(text, fit_mm, size, weight) if fit_mm else "\n".join(plain_text(t) for t in str(text).split("\n"))
        artist = self.fig.text(*self._xy(x_mm, y_mm), text, fontsize=size, fontweight=weight, color=color, ha=ha,
                               va=va, **options)
        self._added.append(artist)
        return artist

    def rule(self, x0_mm, x1_mm, y_mm, *, lw=0.5, color=INK):
        """A horizontal line."""
        from matplotlib.lines import Line2D

        (a, y), (b, _) = self._xy(x0_mm, y_mm), self._xy(x1_mm, y_mm)
        line = Line2D([a, b], [y, y], lw=lw, color=color, transform=self.fig.transFigure)
        self.fig.add_artist(line)
        self._added.append(line)
        return line

    def band(self, x_mm, y_mm, w_mm, h_mm, *, color=MUTED, alpha=1.0):
        """A filled rectangle without an edge (top-left corner at x, y)."""
        from matplotlib.patches import Rectangle

        left, bottom, width, height = self.box(x_mm, y_mm, w_mm, h_mm)
        patch = Rectangle((left, bottom), width, height, facecolor=color, edgecolor="none", alpha=alpha,
                          transform=self.fig.transFigure, zorder=0)
        self.fig.add_artist(patch)
        self._added.append(patch)
        return patch

    def bands(self, boxes_mm, *, color=MUTED, alpha=1.0):
        """Filled rectangles (x, y, w, h in mm, top-left corners) drawn as one patch."""
        from matplotlib.patches import PathPatch
        from matplotlib.path import Path

        if not boxes_mm:
            return None
        vertices, codes = [], []
        for box in boxes_mm:
            left, bottom, width, height = self.box(*box)
            vertices += [(left, bottom), (left + width, bottom), (left + width, bottom + height), (left, bottom + height),
                         (left, bottom)]
            codes += [Path.MOVETO, Path.LINETO, Path.LINETO, Path.LINETO, Path.CLOSEPOLY]
        patch = PathPatch(Path(vertices, codes), facecolor=color, edgecolor="none", alpha=alpha,
                          transform=self.fig.transFigure, zorder=0)
        self.fig.add_artist(patch)
        self._added.append(patch)
        return patch

    def keep(self, *artists):
        """Have ``artists`` taken away after this page, like the page's own text."""
        self._added.extend(artists)

    def clear(self):
        for artist in self._added:
            artist.remove()
        self._added = []


def write_report(path, ratings, verdicts=None, title=None, progress=None, *, report_info=None, paper="a4",
                 pages=None, **data):
    """Write the PDF report for ``ratings`` (and ``verdicts`` of a claims check) to ``path``.

    Parameters
    ----------
    path : str or Path
    ratings : Ratings
    verdicts : Verdicts, optional
    title : str, optional
        The report's title when ``report_info`` gives none (default "Lamp rating report").
    progress : callable, optional
        Called with 1 after each page.
    report_info : ReportInfo, mapping or path of a TOML file, optional
        Client, project, laboratory, report number, date, prepared by, notes
        (:mod:`lampcalc.report.report_info`).
    paper : {"a4", "letter"}
    pages : sequence of page builders, optional
        Instead of the builders found in :mod:`lampcalc.report` (see this module's docstring).
    **data
        ``lot``, ``lot_verdicts``, ``angles``, ``comparison``: see :class:`Report`.

    Returns
    -------
    int
        The number of pages. The same inputs give the same bytes.
    """
    return Report(ratings, verdicts, info=report_info, paper=paper, pages=pages, title=title, **data).write(path, progress)
