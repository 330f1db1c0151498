"""The summary: who the report is for, the verdict in a sentence, every lamp in a table, a diagram.

The first page opens with the report information and the verdict of the claims check
(lamps that meet every claim, that do not meet one or more, whose claims could not all be
evaluated), and of the lot, colour over angle or comparison the report holds. Then one row per lamp: its key numbers with validity markers, its flags as
letters and its claims in a few words, with a legend in words under the table. The rest
of the page is a white-region chromaticity diagram of the lamps in the table, marked by
their row numbers. Lamps that do not fit flow onto further summary pages, each with its
own table and diagram: rows never run into the diagram.
"""

import numpy as np

from ..plots.diagram import ChromaticityDiagram, near_white
from ..plots.style import INK, LAMP, MUTED, pin_axis_labels
from ..verdicts.wording import count_line, lamp_status, short_status
from .markers import VALIDITY_LEGEND, flag_legend, flag_letters, letters_of, quote
from .tables import Cell, Column, Table, key_values, wrap, key_values_height, line_mm, paragraph, paragraph_height
from .uncertainty_pages import regions

#: The least height left for the diagram under the table, mm.
DIAGRAM_MIN_MM = 84.0
#: At most this many lamps in one page's table (and diagram).
MAX_ROWS = 24
_COLUMNS = [  # header, share of the width, alignment
    ("#", 6.5, "right"), ("lamp", 25.0, "left"), ("CCT\nK", 9.5, "right"), ("Duv", 13.0, "right"),
    ("ANSI\nK", 11.0, "right"), ("steps", 10.0, "right"), ("Ra", 11.0, "right"), ("R9", 11.0, "right"),
    ("Rf", 10.0, "right"), ("Rg", 10.0, "right"), ("LER\nlm/W", 10.5, "right"), ("S/P", 7.5, "right"),
    ("mel-\nDER", 9.5, "right"), ("flags", 9.0, "left"), ("claims", 22.5, "left"),
]
#: Columns whose cells wrap onto more lines rather than being shortened.
_WRAPPED = ("lamp", "flags", "claims")
TABLE_PT = 6.4
COLUMN_NOTES = (
    "CCT and Duv: exact, CIE 015:2018, 2° observer. ANSI: the ANSI C78.377-2017 category whose quadrangle holds "
    "the lamp. Steps: colour-consistency steps from the claimed nominal CCT's centre, else the nearest category's. "
    "Ra, R9: CIE 13.3-1995. Rf, Rg: CIE 224:2017 / ANSI/IES TM-30-18. LER: luminous efficacy of the radiation over "
    "the measured part of 360–830 nm, not of the lamp. mel-DER: CIE S 026 melanopic daylight efficacy ratio. "
    "Claims: how many of the lamp's claims are met, not met or not evaluated (see its page)."
)
DIAGRAM_NOTE = (
    "Lamps by their number in the table. Quadrangles: ANSI C78.377-2017 categories; solid curve: Planckian locus; "
    "dashed: CIE daylight locus; thin lines: isotemperature lines from −0.02 to +0.02 Duv."
)


def _row(number, record, verdict, letters):
    status = lamp_status(verdict) if verdict is not None else True
    claims = Cell(short_status(verdict), weight="bold" if status is False else "normal",
                  color=LAMP if status is False else INK)
    flags = letters_of(letters, record.get("flags"))
    return [str(number), record["name"], quote(record, "cct_K"), quote(record, "duv"), quote(record, "ansi_nominal_cct_K"),
            quote(record, "sdcm_steps"), quote(record, "ra"), quote(record, "ri", index=8), quote(record, "rf"),
            quote(record, "rg"), quote(record, "ler_lm_per_W"), quote(record, "sp_ratio"),
            quote(record, "melanopic_der"), flags or "–", claims]


def _overview(report):
    """The verdict in a sentence (bold), the counts behind it, and whether it is an alarm.

    The verdicts of the other parts of the report (a lot, colour over angle, a comparison)
    come from their builders' ``overview``.
    """
    n = len(report.records)
    parts = [item for b in report.builders if hasattr(b, "overview") for item in b.overview(report)]
    alarm = any(a for _, a in parts)
    if report.verdicts is None:
        rated = f"{n} lamp{'s' if n != 1 else ''} rated; no claims were checked"
        if parts:
            return " ".join(t for t, _ in parts), rated.replace("no claims", "no claims of single lamps") + ".", alarm
        return rated + ".", "", alarm
    status = [lamp_status(v) for v in report.verdicts.lamps]
    claimed, failed, open_ = len(status), status.count(False), status.count(None)
    lamps = f"lamp{'s' if claimed != 1 else ''} with claims"
    if failed:
        lead = f"{failed} of {claimed} {lamps} {'do' if failed != 1 else 'does'} not meet every claim."
    elif open_:
        lead = (f"No claim is shown to fail, but {open_} of {claimed} {lamps} "
                f"{'have' if open_ != 1 else 'has'} claims that could not be evaluated.")
    elif claimed == 1:
        lead = "The lamp with claims meets every claim."
    else:
        lead = f"All {claimed} lamps with claims meet every claim."
    return " ".join([lead, *(t for t, _ in parts)]), count_line(report.verdicts) + ".", alarm or bool(failed or open_)


#: The notes of the report information are printed up to this many lines.
NOTES_MAX_LINES = 40


def _notes(report, width):
    lines = wrap(report.info.notes, width, 7.0)
    if len(lines) <= NOTES_MAX_LINES:
        return report.info.notes
    return "\n".join(lines[:NOTES_MAX_LINES - 1] + ["… (the notes go on: shortened to fit the page)"])


def _info_columns(items):
    return items[: (len(items) + 1) // 2], items[(len(items) + 1) // 2:]


class SummaryPages:
    """Page builder of the summary pages (order 100)."""

    order = 100

    def _layout(self, report):
        if "summary" in report.cache:
            return report.cache["summary"]
        from .document import FOOTER_MM, HEADER_MM, MARGIN_MM

        width = report.paper.width_mm - 2 * MARGIN_MM
        scale = width / sum(share for _, share, _ in _COLUMNS)
        columns = [Column(h, share * scale, align, wrap=h in _WRAPPED) for h, share, align in _COLUMNS]
        letters = flag_letters(report.records)
        rows = [_row(k + 1, r, v, letters) for k, (r, v) in enumerate(zip(report.records, report.lamp_verdicts))]
        avail = report.paper.height_mm - 2 * MARGIN_MM - HEADER_MM - FOOTER_MM
        first = self._opening_height(report, width)
        pages, start = [], 0
        if first + self._table_height(columns, rows[:1], report, letters, 0, width) + DIAGRAM_MIN_MM > avail:
            pages.append((0, 0))  # long report information: a first page of its own
        while start < len(rows) or not pages:
            used = first if not pages else 0.0
            end = start + 1
            while end < len(rows) and end - start < MAX_ROWS:
                trial = used + self._table_height(columns, rows[start:end + 1], report, letters, start, width)
                if trial + DIAGRAM_MIN_MM > avail:
                    break
                end += 1
            end = min(end, len(rows))
            pages.append((start, end))
            start = end
        report.cache["summary"] = (columns, rows, letters, pages, width)
        return report.cache["summary"]

    def _opening_height(self, report, width):
        half = width / 2 - 4
        info = max((key_values_height(column, half - 24) for column in _info_columns(report.info.items())), default=0)
        notes = paragraph_height(_notes(report, width), width, size=7) + 2 if report.info.notes else 0.0
        lead, counts, _ = _overview(report)
        return (info + 3 if info else 0) + notes + paragraph_height(lead, width, size=8.5, weight="bold") + 1 + (
            paragraph_height(counts, width, size=7) if counts else 0) + 3

    def _legend(self, report, letters, start, end, width):
        flags = {f for r in report.records[start:end] for f in r.get("flags") or ()}
        return [VALIDITY_LEGEND, *flag_legend(letters, flags), COLUMN_NOTES]

    def _table_height(self, columns, rows, report, letters, start, width):
        legend = self._legend(report, letters, start, start + len(rows), width)
        return Table(columns, rows, size=TABLE_PT, pad_mm=0.8).height() + 2 + sum(paragraph_height(t, width, size=6) + 0.6 for t in legend) + 3

    def count(self, report):
        return len(self._layout(report)[3])

    def draw(self, report, sheet):
        columns, rows, letters, pages, width = self._layout(report)
        for k, (start, end) in enumerate(pages):
            title = report.info.heading
            which = f"lamps {start + 1}–{end}" if end > start else "report information"
            subtitle = f"Summary of {len(rows)} lamp{'s' if len(rows) != 1 else ''}" + (
                f"{', continued' if k else ''}: {which} (summary page {k + 1} of {len(pages)})" if len(pages) > 1 else "")
            with sheet.page("summary", title, subtitle) as page:
                y = sheet.top
                if k == 0:
                    y = self._opening(page, report, sheet, y)
                if start == end:
                    continue
                y += Table(columns, rows[start:end], size=TABLE_PT, pad_mm=0.8).draw(page, sheet.left, y) + 2
                for text in self._legend(report, letters, start, end, width):
                    y += paragraph(page, sheet.left, y, text, width, size=6, color=MUTED) + 0.6
                self._diagram(page, report, sheet, y + 3, start, end)

    def _opening(self, page, report, sheet, y):
        half = sheet.width / 2 - 4
        left, right = _info_columns(report.info.items())
        height = max(key_values(page, sheet.left, y, left, 24, half - 24),
                     key_values(page, sheet.left + sheet.width / 2, y, right, 24, half - 24))
        y += height + (3 if height else 0)
        if report.info.notes:
            y += paragraph(page, sheet.left, y, _notes(report, sheet.width), sheet.width, size=7) + 2
        lead, counts, alarm = _overview(report)
        colour = LAMP if alarm else INK
        y += paragraph(page, sheet.left, y, lead, sheet.width, size=8.5, weight="bold", color=colour) + 1
        if counts:
            y += paragraph(page, sheet.left, y, counts, sheet.width, size=7)
        return y + 3

    def _diagram(self, page, report, sheet, y, start, end):
        bottom = sheet.bottom - line_mm(6) * 2 - 1
        box = page.box(sheet.left + 11, y, sheet.width - 12, bottom - y - 9)
        diagram = report.cache.get("summary_diagram")
        if diagram is None or diagram.ax.figure is not page.fig:
            ax = page.fig.add_axes(box)
            diagram = report.cache["summary_diagram"] = ChromaticityDiagram(ax, zoom=True, legend=False)
            pin_axis_labels(ax, 14, 28)
        diagram.ax.set_position(box)
        xy = np.array([(r["x"], r["y"]) for r in report.records[start:end]], dtype=float)
        shown = near_white(xy)
        lamps = [(report.records[k]["name"], xy[k - start]) for k in range(start, end) if shown[k - start]]
        shapes = regions(report)
        diagram.show(lamps, labels=[str(k + 1) for k in range(start, end) if shown[k - start]], title="",
                     regions=None if shapes is None else [shapes[k] for k in range(start, end) if shown[k - start]])
        note = DIAGRAM_NOTE + (" Shaded: each lamp's 95 % region over the Monte Carlo draws." if shapes is not None else "")
        if not shown.all():
            away = ", ".join(str(k + 1) for k in range(start, end) if not shown[k - start])
            note += f" Far from the white region, not shown: {away} (see their pages)."
        paragraph(page, sheet.left, bottom + 1, note, sheet.width, size=6, color=MUTED)


PAGES = SummaryPages()
