"""The pages of colour over angle: one source measured at several angles of emission.

1. **Your limit**: the largest Δu′v′ from the mean point against the limit the user gave, in
   the words of a claim (:func:`lampcalc.verdicts.lot_wording.limit_wording`); without a
   limit, the verdict is "not evaluated": lampcalc applies none of its own.
2. **The mean point** and how it was weighted (by the angles' luminous quantity when the
   spectra are absolute, else alike), the ranges of CCT and Duv.
3. **Figures**: Δu′v′ from the mean point over angle with the limit, CCT and Duv over angle
   (:mod:`lampcalc.plots.angles`).
4. **By angle**: u′, v′, CCT, Duv, Δu′v′ and the weight of every angle, with its spectrum's
   flags as the summary's letters and a legend in words. A long table continues on pages
   of its own.
"""

import numpy as np

from ..plots.angles import WEIGHTING_WORDS, draw_cct_duv_over_angle, draw_delta_uv_over_angle
from ..plots.style import INK, LAMP, MUTED, pin_axis_labels
from ..rating.flags import doubtful_keys
from ..verdicts.angles import angles_of
from ..verdicts.lot_wording import limit_line, limit_wording
from ..verdicts.wording import format_value
from .figure_panels import panel, small_type
from .markers import flag_legend, flag_letters, letters_of
from .tables import HEADING_MM, Column, Table, heading, key_values, key_values_height, paragraph, paragraph_height
from .verdict_tables import verdict_table

FIGURES_MM = 115.0  # both figures with their heading
WEIGHTING_NOTE = {
    "none": "The spectra are relative: every angle counts alike in the mean point.",
    "weighted": ("The mean point weights each angle's u′, v′ by its {quantity} (Km·Σ V(λ)·S(λ)·Δλ), so that it is the "
                 "colour where the light is."),
}
ANGLE_NOTE = ("The angles count as measured: no solid-angle (zonal) weighting. lampcalc applies no limit of its own; "
              "some public programme specifications set limits on colour over angle: the limit is the one of the "
              "specification that applies.")
_COLUMNS = (("angle\n°", 0.07, "right"), ("spectrum", 0.25, "left"), ("u′", 0.09, "right"), ("v′", 0.09, "right"),
            ("CCT\nK", 0.08, "right"), ("Duv", 0.09, "right"), ("Δu′v′ from\nthe mean", 0.11, "right"),
            ("weight\n%", 0.09, "right"), ("flags", 0.13, "left"))


def _order(report):
    """Row of the ratings of each angle of the table (sorted by angle, as colour_over_angle sorts them)."""
    order = np.argsort(angles_of(report.ratings), kind="stable")
    if [report.records[k]["name"] for k in order] != list(report.angles["angles"]["name"]):
        raise ValueError("the colour over angle does not belong to the report's ratings")
    return order


def _where(angles):
    return f"at {angles['angle_of_max_delta_uv_prime_deg']:g}°"


def _limit(angles):
    return limit_wording(angles["max_delta_uv_prime_over_angle"], angles["limit_delta_uv_prime"], angles["angle_pass"],
                         what="largest Δu′v′ from the mean point", where=_where(angles),
                         basis="Δu′v′ in the CIE 1976 u′v′ diagram, from the mean point")


def _items(angles):
    a = angles
    weighting = WEIGHTING_WORDS.get(a["angle_weighting"], a["angle_weighting"])
    return [
        ("angles", f"{a['n_angles']}, {a['angle_min_deg']:g}–{a['angle_max_deg']:g}°"),
        ("mean point u′, v′", f"{format_value('u_prime', a['angle_mean_u_prime'])}, "
                              f"{format_value('v_prime', a['angle_mean_v_prime'])} ({weighting})"),
        ("mean point", f"CCT {format_value('cct_K', a['angle_mean_point_cct_K'], unit=True)}, "
                       f"Duv {format_value('duv', a['angle_mean_point_duv'])}"),
        ("CCT over angle", f"{format_value('cct_K', a['cct_min_over_angle_K'])}–"
                           f"{format_value('cct_K', a['cct_max_over_angle_K'], unit=True)}"),
        ("Duv over angle", f"{format_value('duv', a['duv_min_over_angle'])} to {format_value('duv', a['duv_max_over_angle'])}"),
    ]


def weighting_note(angles):
    """How the mean point was weighted, in words."""
    weighting = angles["angle_weighting"]
    if weighting == "none":
        return WEIGHTING_NOTE["none"]
    quantity = WEIGHTING_WORDS.get(weighting, weighting).replace("weighted by ", "")
    return WEIGHTING_NOTE["weighted"].format(quantity=quantity)


def _rows(report, letters):
    t, records = report.angles["angles"], report.records
    total = float(np.sum(t["weight"]))
    rows = []
    for k, i in enumerate(_order(report)):
        record = records[i]
        doubt = doubtful_keys(record.get("flags") or ())
        rows.append([f"{t['angle_deg'][k]:g}", t["name"][k], format_value("u_prime", t["u_prime"][k]),
                     format_value("v_prime", t["v_prime"][k]), format_value("cct_K", t["cct_K"][k], doubtful="cct_K" in doubt),
                     format_value("duv", t["duv"][k], doubtful="duv" in doubt),
                     format_value("delta_uv_prime", t["delta_uv_prime"][k]),
                     format_value("percent", 100 * t["weight"][k] / total, decimals=1),
                     letters_of(letters, record.get("flags")) or "–"])
    return rows


class AnglePages:
    """Page builder of colour over angle (order 160): the verdict, the figures, the table by angle."""

    order = 160

    def _layout(self, report):
        if "angles" not in report.cache:
            width, room = report.paper.content_mm
            letters = flag_letters(report.records)
            rows = _rows(report, letters)
            columns = [Column(h, share * width, align, wrap=h == "flags") for h, share, align in _COLUMNS]
            legend = self._legend(report, letters)
            after = sum(paragraph_height(t, width, size=5.8) + 0.5 for t in legend) + 2
            first = room - self._top_height(report, width) - FIGURES_MM - HEADING_MM - after
            pages, start = [], 0
            while start < len(rows) or not pages:
                spare = first if not pages else room - HEADING_MM - after
                end = len(rows)
                while end > start + 1 and Table(columns, rows[start:end], size=6.4).height() > spare:
                    end -= 1
                pages.append((start, end))
                start = end
            report.cache["angles"] = (columns, rows, legend, pages)
        return report.cache["angles"]

    @staticmethod
    def _legend(report, letters):
        flags = {f for r in report.records for f in r.get("flags") or ()}
        return [*flag_legend(letters, flags), ANGLE_NOTE]

    def _top_height(self, report, width):
        words = _limit(report.angles)
        lead = paragraph_height(self._lead(report.angles), width, size=8, weight="bold")
        return (HEADING_MM + lead + 1 + verdict_table([words], width).height() + 3
                + key_values_height(_items(report.angles), width - 34) + 1
                + paragraph_height(weighting_note(report.angles), width, size=6.4) + 3)

    @staticmethod
    def _lead(angles):
        line = limit_line(angles["max_delta_uv_prime_over_angle"], angles["limit_delta_uv_prime"], angles["angle_pass"],
                          where=_where(angles))
        return f"Largest Δu′v′ from the mean point {line}."

    def count(self, report):
        return 0 if report.angles is None else len(self._layout(report)[3])

    def overview(self, report):
        """The verdict over angle in a sentence, for the first page."""
        if report.angles is None:
            return []
        lead = self._lead(report.angles)
        return [(f"Colour over angle: {lead[0].lower()}{lead[1:]}", report.angles["angle_pass"] is False)]

    def draw(self, report, sheet):
        if report.angles is None:
            return
        angles = report.angles
        columns, rows, legend, pages = self._layout(report)
        names = angles["angles"]["name"]
        span = f"{names[0]} … {names[-1]}" if len(names) > 1 else names[0]
        for k, (start, end) in enumerate(pages):
            title = f"Colour over angle: {angles['n_angles']} angles, {angles['angle_min_deg']:g}–{angles['angle_max_deg']:g}°"
            subtitle = ("Δu′v′ from the mean point, CCT and Duv by angle of emission" + (", continued" if k else "")
                        + f"\n{span}")
            with sheet.page("angles", title, subtitle) as page:
                y = sheet.top
                if k == 0:
                    y = self._verdict(page, sheet, angles, y)
                    y = self._figures(page, sheet, angles, y)
                y += heading(page, sheet.left, y, "By angle" + (", continued" if k else ""), sheet.width)
                y += Table(columns, rows[start:end], size=6.4).draw(page, sheet.left, y) + 2
                if k == len(pages) - 1:
                    for text in legend:
                        y += paragraph(page, sheet.left, y, text, sheet.width, size=5.8, color=MUTED) + 0.5

    def _verdict(self, page, sheet, angles, y):
        y += heading(page, sheet.left, y, "Your limit", sheet.width)
        y += paragraph(page, sheet.left, y, self._lead(angles), sheet.width, size=8, weight="bold",
                       color=LAMP if angles["angle_pass"] is False else INK) + 1
        y += verdict_table([_limit(angles)], sheet.width).draw(page, sheet.left, y) + 3
        items = _items(angles)
        key_values(page, sheet.left, y, items, 34, sheet.width - 34)
        y += key_values_height(items, sheet.width - 34) + 1
        return y + paragraph(page, sheet.left, y, weighting_note(angles), sheet.width, size=6.4, color=MUTED) + 3

    def _figures(self, page, sheet, angles, y):
        y += heading(page, sheet.left, y, "Over angle", sheet.width)
        height = (FIGURES_MM - HEADING_MM - 25) / 2
        with small_type():
            top = panel(page, sheet.left + 12, y + 4, sheet.width - 26, height)
            draw_delta_uv_over_angle(top, angles)
            bottom = panel(page, sheet.left + 12, y + 4 + height + 14, sheet.width - 26, height)
            page.keep(draw_cct_duv_over_angle(bottom, angles))
            for ax in (top, bottom):
                pin_axis_labels(ax, 11, 26)
        return y + FIGURES_MM - HEADING_MM


PAGES = AnglePages()
