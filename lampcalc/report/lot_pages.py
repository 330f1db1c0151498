"""The lot's pages: its claims and its colour, then the spread of its ratings.

1. **Claims on the lot** (when a lot claims file was checked): the verdict in a line, then
   each claim in the supplier's words, as checked, the measured value, the margin, the
   verdict and why (:mod:`lampcalc.verdicts.lot_wording`).
2. **Colour of the lot**: the mean point, the centre the steps count from, the share of
   samples within 1 … 7 steps, the 95 % covariance ellipse, the largest Δu′v′, the ANSI
   categories and the bins of a user's set; beside them the samples on the chromaticity
   diagram with the ellipse and rings of steps (:func:`lampcalc.plots.lot.draw_lot_diagram`).
   The lot's flags in words.
3. **Ratings over the lot**: histograms of CCT, Duv, Ra and Rf, and the statistics of every
   rating (n, mean, sample standard deviation, minimum, 5th and 95th percentiles, maximum),
   a statistic that includes doubtful values in parentheses.

A claims table too long for the page with the colour goes on pages of its own before it.
"""

import numpy as np

from ..plots.lot import HISTOGRAMS, draw_lot_diagram, draw_lot_histogram
from ..plots.style import INK, LAMP, MUTED, pin_axis_labels
from ..rating.flags import explain
from ..standards.ansi_bins import ansi_bin_set
from ..verdicts.lot import LOT_RATINGS, STEP_COUNTS
from ..verdicts.lot_wording import RATING_WORDS, word_lot_checks
from ..verdicts.spread import chi_square_2dof
from ..verdicts.wording import DIGITS, MISSING, QUALIFIED, format_value, lamp_line, lamp_status
from .figure_panels import panel, small_type
from .tables import HEADING_MM, Column, Table, heading, key_values, key_values_height, paragraph, paragraph_height
from .verdict_tables import verdict_table

COLOUR_MM = 96.0  # the colour section at least: heading, then the list beside the diagram
COLOUR_MAX_MM = 128.0  # and at most, when the page has room
LIST_MM = 80.0  # width of the list beside the diagram
CLAIMS_NOTE = (
    "Margin: how far the value lies on the claim's side of its limit, negative when short of it; shares in "
    "percentage points. The verdicts concern the samples supplied: whether the production complies with a claim is a "
    "question of sampling these numbers alone do not answer."
)
STATISTICS_NOTE = (
    "sd: sample standard deviation (divisor n − 1). p05, p95: 5th and 95th percentiles, linear between the sorted "
    "samples (NumPy's default; definition 7 of Hyndman and Fan, 1996): for a dozen samples they lie close to the "
    "lowest and highest. ( ): the statistic includes samples whose value is outside its method's validity, or rests "
    f"on values no published source confirms (see the flags). {MISSING}: none."
)
def _number(key, value, doubtful=False, signed=None):
    """A lot number with the digits of its rating (R9 those of the Ri)."""
    return format_value("ri" if key == "r9" else key, value, doubtful=doubtful, signed=signed)


def _doubtful(lot, rating):
    return rating in lot["doubtful_ratings"]


def _steps(lot, value):
    return format_value("sdcm_steps", value, doubtful=_doubtful(lot, "sdcm_steps"))


def _span(lot):
    names = lot["samples"]["name"]
    return f"{names[0]} … {names[-1]}" if len(names) > 1 else names[0]


def colour_items(lot):
    """(label, value) of the lot's colour, as the page lists them."""
    q = lambda key: format_value(key.replace("mean_", "").replace("point_", ""), lot[key])  # noqa: E731
    items = [
        ("samples", f"{lot['n_samples']} ({_span(lot)})"),
        ("mean x, y", f"{q('mean_x')}, {q('mean_y')}"),
        ("mean u′, v′", f"{q('mean_u_prime')}, {q('mean_v_prime')} (means of the samples' u′, v′)"),
        ("mean point", f"CCT {format_value('cct_K', lot['mean_point_cct_K'], unit=True)}, "
                       f"Duv {format_value('duv', lot['mean_point_duv'])}" if np.isfinite(lot["mean_point_cct_K"])
         else "no CCT: the mean point lies away from the Planckian locus"),
    ]
    if lot["steps_centre_chosen"] != "none":
        where = "ANSI C78.377 target" if lot["steps_centre"] == "ansi" else "ellipse set's own centre"
        items += [
            ("steps from", f"the {where} of {lot['steps_centre_nominal_cct_K']:g} K ({lot['steps_centre_chosen']})"),
            ("step set", lot["steps_set"] + ("" if lot["steps_metric_confirmed"] else " (not confirmed)")),
            ("within n steps", ", ".join(f"{k}: {_share(lot, lot[f'within_{k}_steps_percent'])}" for k in STEP_COUNTS)),
        ]
    else:
        items.append(("steps", "none: the lot's mean point is not white (see the flags)"))
    items += _ellipse_items(lot)
    if lot["n_samples"] >= 2:
        a, b = lot["max_pairwise_samples"]
        items += [("largest Δu′v′", f"{format_value('delta_uv_prime', lot['max_pairwise_delta_uv_prime'])} ({a} and {b})"),
                  ("from the mean", format_value("delta_uv_prime", lot["max_delta_uv_prime_from_mean"]))]
    counts = [f"{b:g} K: {c}" for b, c in zip(lot["ansi_bins_nominal_cct_K"], lot["ansi_bins_count"])]
    items.append(("ANSI C78.377", ", ".join(counts + ([f"none: {lot['ansi_bins_none_count']}"]
                                                       if lot["ansi_bins_none_count"] else []))))
    if lot["bin_set"] != ansi_bin_set().name:
        bins = [f"{b}: {c}" for b, c in zip(lot["bins_name"], lot["bins_count"])]
        bins += [f"none: {lot['bins_none_count']}"] if lot["bins_none_count"] else []
        doubt = any("bin_corners_unconfirmed" in f for f in lot["samples"]["flags"])
        items.append((f"bins ({lot['bin_set']})", f"({', '.join(bins)})" if doubt else ", ".join(bins)))
    return items


def _share(lot, value):
    text = format_value("percent", value, decimals=0) + " %"
    return f"({text})" if _doubtful(lot, "sdcm_steps") and value == value else text


def _ellipse_items(lot):
    if not np.isfinite(lot["cov_xx"]):
        return [("95 % ellipse", "none: it needs 3 samples or more")]
    p = f"{100 * lot['ellipse_probability']:g} %"
    items = [(f"{p} ellipse", f"semi-axes {format_value('x', lot['ellipse_semi_major_xy'], decimals=5)} and "
                              f"{format_value('x', lot['ellipse_semi_minor_xy'], decimals=5)} in x, y; major axis at "
                              f"{lot['ellipse_angle_deg']:.0f}°")]
    if np.isfinite(lot["ellipse_max_steps_from_mean"]):
        items.append(("ellipse in steps", f"{_steps(lot, lot['ellipse_min_steps_from_mean'])}–"
                                          f"{_steps(lot, lot['ellipse_max_steps_from_mean'])} from the mean point; "
                                          f"reaches {_steps(lot, lot['ellipse_max_steps_from_centre'])} from the centre"))
    return items


def diagram_note(lot):
    chi2 = float(chi_square_2dof(lot["ellipse_probability"]))
    note = (f"Samples (dots), the mean point (diamond) and the {100 * lot['ellipse_probability']:g} % covariance "
            f"ellipse (dashed; χ²₂ = {chi2:.3f}): the spread of these samples, no promise for the next lamp.")
    if lot["steps_centre_chosen"] != "none":
        note += f" Thin rings: 1, 2, … steps of {lot['steps_set']} around the centre (+)."
    return note + (" Solid curve: Planckian locus; dashed: CIE daylight locus; quadrangles: ANSI C78.377-2017; "
                   "thin straight lines: isotemperature lines.")


def flag_lines(lot):
    """The lot's flags in words, with the ratings a flag concerns."""
    lists = {"lot_doubtful_values": "doubtful_ratings", "lot_partial_values": "partial_ratings"}
    lines = []
    for flag in lot["flags"]:
        which = f" ({', '.join(RATING_WORDS.get(r, r) for r in lot[lists[flag]])})" if flag in lists else ""
        lines.append(explain(flag) + which)
    return lines


def statistics_table(lot, width_mm):
    """The statistics of every rating the samples have, a statistic with doubtful values in parentheses."""
    columns = [Column("rating", 0.2 * width_mm, "left"), Column("unit", 0.08 * width_mm, "left"),
               Column("n", 0.06 * width_mm)] + [Column(h, 0.11 * width_mm) for h in ("mean", "sd", "min", "p05", "p95", "max")]
    rows = []
    for key in LOT_RATINGS:
        if not lot[f"{key}_n"]:
            continue
        doubt = _doubtful(lot, key)
        unit = DIGITS.get("ri" if key == "r9" else key, (None, ""))[1]
        rows.append([RATING_WORDS[key], unit, str(lot[f"{key}_n"]),
                     *(_number(key, lot[f"{key}_{s}"], doubt, False if s == "sd" else None)
                       for s in ("mean", "sd", "min", "p05", "p95", "max"))])
    return Table(columns, rows, size=6.4)


class LotPages:
    """Page builder of a lot's pages (order 150): claims and colour, then the ratings."""

    order = 150

    def _layout(self, report):
        if "lot" not in report.cache:
            width, room = report.paper.content_mm
            flags = sum(paragraph_height(t, width - 12, size=6.6) for t in flag_lines(report.lot)) + 3
            pages, rows = [], []
            if report.lot_verdicts is not None:
                words, notes = word_lot_checks(report.lot_verdicts)
                said = [c["text"] for c in report.lot_verdicts.checks]
                fixed = HEADING_MM + 8 + self._note_height(notes, width)
                height = lambda a, b: verdict_table(words[a:b], width, said=said[a:b]).height()  # noqa: E731
                start = 0
                while start < len(words):  # beside the colour when the rows left fit, else a page of their own
                    if height(start, len(words)) <= room - COLOUR_MM - flags - fixed:
                        rows = (start, len(words))
                        break
                    end = len(words)
                    while end > start + 1 and height(start, end) > room - fixed:
                        end -= 1
                    pages.append(("claims", start, end))
                    start = end
            pages += [("colour", *rows) if rows else ("colour",), ("ratings",)]
            report.cache["lot"] = pages
        return report.cache["lot"]

    @staticmethod
    def _note_height(notes, width):
        return sum(paragraph_height(f"{QUALIFIED} {n}", width, size=5.8) for n in notes) + paragraph_height(
            CLAIMS_NOTE, width, size=5.8) + 1.5

    def count(self, report):
        return 0 if report.lot is None else len(self._layout(report))

    def overview(self, report):
        """The lot's verdict in a sentence, for the first page."""
        if report.lot is None:
            return []
        n, verdicts = report.lot["n_samples"], report.lot_verdicts
        what = f"The lot of {n} sample{'s' if n != 1 else ''}" + (f" ({verdicts.product})" if verdicts and verdicts.product else "")
        if verdicts is None:
            return [(f"{what}: statistics and colour spread; no claims on the lot were checked.", False)]
        checks = {"checks": verdicts.checks}
        return [(f"{what} {lamp_line(checks)}.", lamp_status(checks) is not True)]

    def draw(self, report, sheet):
        if report.lot is None:
            return
        lot = report.lot
        product = report.lot_verdicts.product if report.lot_verdicts is not None and report.lot_verdicts.product else ""
        title = f"{product + ': ' if product else ''}lot of {lot['n_samples']} sample{'s' if lot['n_samples'] != 1 else ''}"
        title = title[0].upper() + title[1:]
        for kind, *rows in self._layout(report):
            subtitle = {"claims": "The supplier's claims on the lot", "colour": "Claims on the lot and its colour",
                        "ratings": "The ratings over the lot: histograms and statistics"}[kind]
            with sheet.page("lot", title, f"{subtitle}\n{_span(lot)}") as page:
                y = sheet.top
                if kind in ("claims", "colour") and (rows or report.lot_verdicts is None):
                    y = self._claims(page, sheet, report, y, *rows)
                if kind == "colour":
                    flags = sum(paragraph_height(t, sheet.width - 12, size=6.6) for t in flag_lines(lot)) + 3
                    y = self._colour(page, sheet, lot, y, min(COLOUR_MAX_MM, max(COLOUR_MM, sheet.bottom - y - flags)))
                    self._flags(page, sheet, lot, y)
                elif kind == "ratings":
                    self._ratings(page, sheet, lot, y)

    def _claims(self, page, sheet, report, y, start=0, end=0):
        y += heading(page, sheet.left, y, "Claims on the lot", sheet.width)
        verdicts = report.lot_verdicts
        if verdicts is None:
            text = "No claims on the lot were checked: the report was made without a lot claims file."
            return y + paragraph(page, sheet.left, y, text, sheet.width, size=7, color=MUTED) + 2
        checks = {"checks": verdicts.checks}
        lead = f"The lot {lamp_line(checks)}." + ("" if start == 0 else " (continued)")
        y += paragraph(page, sheet.left, y, lead, sheet.width, size=8, weight="bold",
                       color=INK if lamp_status(checks) else LAMP) + 1
        words, notes = word_lot_checks(verdicts)
        said = [c["text"] for c in verdicts.checks]
        y += verdict_table(words[start:end], sheet.width, said=said[start:end]).draw(page, sheet.left, y) + 1
        for note in notes:
            y += paragraph(page, sheet.left, y, f"{QUALIFIED} {note[0].upper()}{note[1:]}.", sheet.width, size=5.8, color=MUTED)
        return y + paragraph(page, sheet.left, y, CLAIMS_NOTE, sheet.width, size=5.8, color=MUTED) + 2

    def _colour(self, page, sheet, lot, y, height):
        y += heading(page, sheet.left, y, "Colour of the lot", sheet.width)
        items = colour_items(lot)
        key_values(page, sheet.left, y + 1, items, 24, LIST_MM - 24)
        listed = key_values_height(items, LIST_MM - 24)
        side = height - HEADING_MM - 2
        left = sheet.left + LIST_MM + 12
        with small_type():
            ax = panel(page, left, y + 1, sheet.right - left, side - 10)
            draw_lot_diagram(ax, lot, title="")
            ax.get_legend().remove()  # the note beside says what is drawn
            pin_axis_labels(ax, 12, 26)
        paragraph(page, sheet.left, y + max(listed + 3, side - 24), diagram_note(lot), LIST_MM, size=5.8, color=MUTED)
        return y + side + 2

    def _flags(self, page, sheet, lot, y):
        lines = flag_lines(lot)
        if not lines:
            return y + paragraph(page, sheet.left, y, "Flags of the lot: none.", sheet.width, size=6.6, color=MUTED)
        page.text(sheet.left, y, "Flags", size=6.6, weight="bold")
        for line in lines:
            y += paragraph(page, sheet.left + 12, y, line, sheet.width - 12, size=6.6)
        return y

    def _ratings(self, page, sheet, lot, y):
        y += heading(page, sheet.left, y, "Ratings over the lot", sheet.width)
        cell_w, cell_h = (sheet.width - 14) / 2, 46.0
        with small_type():
            for k, key in enumerate(HISTOGRAMS):
                x = sheet.left + 12 + (k % 2) * (cell_w + 4)
                ax = panel(page, x, y + 5 + (k // 2) * (cell_h + 12), cell_w - 6, cell_h)
                draw_lot_histogram(ax, lot, key)
                pin_axis_labels(ax, 11, 18)
        y += 2 * (cell_h + 12) + 4
        y += heading(page, sheet.left, y, "Statistics of the samples", sheet.width)
        y += statistics_table(lot, sheet.width).draw(page, sheet.left, y) + 1.5
        y += paragraph(page, sheet.left, y, STATISTICS_NOTE, sheet.width, size=5.8, color=MUTED) + 1.5
        self._flags(page, sheet, lot, y)


PAGES = LotPages()
