"""Measurement uncertainty in the report: its own page, and the sections it adds to each lamp's page.

When the ratings carry measurement uncertainty (:func:`~lampcalc.rating.uncertainty.rate_with_uncertainty`),
the report gains, after the summary, a page that states the measurement model in words, the
draws and the seed, the method (JCGM 101:2008 Monte Carlo; CIE 198:2011 for spectral data),
the decision rule and its outcomes, each lamp's decision beside its verdict, that the verdicts
and the exit status are unchanged, and the caution that the uncertainties are those of the
model given. The lamp pages take from here the table of their main ratings with u and 95 %
interval, the claims judged with uncertainty, and the lamps' 95 % regions in (x, y)
(:func:`~lampcalc.rating.coverage_region.coverage_region`).
"""

import math
from pathlib import Path

from ..plots.style import INK, LAMP, MUTED
from ..rating.flags import doubtful_interval_keys, doubtful_keys
from ..verdicts.decision_rules import OUTCOMES, RULES, SIMPLE_OUTCOMES
from ..verdicts.decision_wording import NOT_DECIDED, word_decisions
from ..verdicts.wording import MISSING, format_uncertainty, format_value, short_status
from .tables import Cell, Column, Table, headed_pages, headed_paragraph, line_mm, paragraph

HEAD_MM = 38.0
TEXT_PT = 6.8
GAP_MM = 2.0
#: The main ratings of the lamp page's uncertainty table: (header, output key, index in a list key).
MAIN_RATINGS = (
    ("x", "x", None), ("y", "y", None), ("CCT\nK", "cct_K", None), ("Duv", "duv", None), ("Ra", "ra", None),
    ("R9", "ri", 8), ("Rf", "rf", None), ("Rg", "rg", None), ("LER\nlm/W", "ler_lm_per_W", None),
    ("S/P", "sp_ratio", None), ("mel-\nDER", "melanopic_der", None), ("flux\nlm", "luminous_flux_lm", None),
    ("E\nlx", "illuminance_lx", None), ("L\ncd/m²", "luminance_cd_per_m2", None),
    ("lamp\nlm/W", "efficacy_lm_per_W", None),
)
#: Beside them for a source without a CCT: its hue.
HUE_RATINGS = (("dominant\nλ nm", "dominant_wavelength_nm", None), ("comple-\nmentary λ", "complementary_wavelength_nm", None),
               ("purity", "excitation_purity", None))
#: Decision -> (weight, colour) in the claims tables.
DECISION_LOOK = {"pass": ("normal", INK), "conditional pass": ("normal", INK), "conditional fail": ("normal", LAMP),
                 "fail": ("bold", LAMP), None: ("normal", MUTED)}
_DECISION_COLUMNS = (("claim", 0.27, "left", True), ("measured", 0.09, "right", False),
                     ("95 % interval", 0.15, "right", False), ("margin", 0.10, "right", False),
                     ("u(margin)", 0.10, "right", False), ("guard band", 0.10, "right", False),
                     ("draws\nholding", 0.07, "right", False), ("decision", 0.12, "left", False))
DECISIONS_NOTE = (
    "95 % interval of the measured value and u(margin), the margin's standard uncertainty, over the Monte Carlo "
    "draws; guard band w of the decision rule; draws holding: share of the draws in which the claim holds. "
    "The verdict above is unchanged (see Measurement uncertainty)."
)
RATINGS_NOTE = (
    "Value: of the spectrum as measured; u: standard uncertainty (JCGM 101:2008 7.6); 95 % from–to: probabilistically "
    "symmetric coverage interval of the draws (7.7.2), which need not be centred on the value. ( ): in doubt, see the flags."
)
CAUTION_WORDS = (
    "The uncertainties are those of the measurement model given: they say how sure each verdict is if the model "
    "describes the instrument and the measurement. Effects it leaves out (noise correlated between neighbouring "
    "wavelengths, the lamp's own drift and warm-up, temperature, the geometry of the measurement, errors of the "
    "laboratory's standards beyond the stated scale) are not in them. They are not a laboratory's uncertainty budget "
    "and this is not a photometric test report; local codes and licensed practice govern lighting design decisions."
)


def draws_of(report):
    """The Monte Carlo draws of the report's ratings (a MonteCarloDraws), or None without uncertainty."""
    return report.ratings.extras.get("uncertainty")


def regions(report):
    """Each lamp's 95 % region in CIE 1931 (x, y), in the ratings' order; None without uncertainty."""
    if "regions" not in report.cache:
        from ..rating.coverage_region import coverage_region

        draws = draws_of(report)
        report.cache["regions"] = None if draws is None else coverage_region(draws.xy, draws.coverage)
    return report.cache["regions"]


def _main_value(record, key, index, suffix=""):
    value = record.get(key + suffix)
    if index is not None:
        value = value[index] if isinstance(value, (list, tuple)) and len(value) > index else None
    return value


def rating_table(record, width_mm):
    """The lamp's main ratings with u and 95 % interval: one column per rating, rows value, u, from, to."""
    flags = record.get("flags") or ()
    doubt, interval_doubt = doubtful_keys(flags), doubtful_interval_keys(flags, record.get("uncertainty_flags_in_draws"))
    columns, cells = [], []
    for header, key, index in MAIN_RATINGS + (HUE_RATINGS if record.get("cct_K") is None else ()):
        value, u = _main_value(record, key, index), _main_value(record, key, index, "_u")
        if value is None and u is None:
            continue
        interval = _main_value(record, key, index, "_interval95") or (None, None)
        unsure = key in interval_doubt

        def bracket(text):
            return f"({text})" if unsure and text != MISSING else text

        columns.append(header)
        cells.append([format_value(key, value, doubtful=key in doubt), bracket(format_uncertainty(u)),
                      *(bracket(format_value(key, v)) for v in interval)])
    label = 15.0
    share = (width_mm - label) / max(1, len(columns))
    table_columns = [Column("", label, "left", color=MUTED)] + [Column(h, share, "right") for h in columns]
    rows = [[name, *(c[k] for c in cells)] for k, name in enumerate(("value", "u", "95 % from", "95 % to"))]
    return Table(table_columns, rows, size=6.2, spacing=1.3)


def decision_table(verdict, record, width_mm):
    """The claims of one lamp judged with uncertainty, as a Table."""
    words = word_decisions(verdict, record.get("flags") or (), record.get("uncertainty_flags_in_draws") or ())
    rows = [[w.claim, w.measured, w.interval, w.margin, w.margin_u, w.guard_band, w.holding,
             Cell(w.decision, *DECISION_LOOK.get(w.outcome, DECISION_LOOK[None]))] for w in words]
    columns = [Column(h, share * width_mm, align, wrap) for h, share, align, wrap in _DECISION_COLUMNS]
    return Table(columns, rows, size=6.2, spacing=1.4)


def rule_of(verdicts):
    """The decision rule the verdicts were judged with, in words; None when they were not."""
    for lamp in verdicts.lamps if verdicts is not None else ():
        for check in lamp["checks"]:
            if check.get("decision_rule"):
                return check["decision_rule"]
    return None


def _outcome_words(rule):
    explained = SIMPLE_OUTCOMES if rule == RULES["simple"] else OUTCOMES
    lines = [f"{outcome}: {words}." for outcome, words in explained.items()]
    return "\n".join([*lines, f"{NOT_DECIDED}: no measured value, or a draw gave none, so its uncertainty is unknown."])


#: Each effect of a measurement model in words, with where its value goes.
EFFECT_WORDS = {
    "noise_percent": "noise: {:g} % of each measured value, independent between wavelengths",
    "scale_percent": "scale (calibration): {:g} %, common to all wavelengths",
    "wavelength_shift_nm": "wavelength offset: {:g} nm, common to all wavelengths",
    "stray_light_percent": "stray-light floor left after its subtraction: {:g} % of the peak, flat over the measured range",
    "bandwidth_nm": "slit: triangular, {:g} nm full width at half maximum; the data are rated as measured, so the "
                    "slit's effect is taken as uncertain by up to its whole size either way",
}


def _model_words(model):
    source = f"File {Path(model.source).name}: s" if model.source else "S"
    lines = [EFFECT_WORDS[key].format(getattr(model, key)) for key in EFFECT_WORDS if getattr(model, key)]
    return "\n".join([f"{source}tandard uncertainties (one standard deviation); an effect the file leaves out is zero.",
                      *(f"• {line}" for line in lines)])


def _blocks(report):
    draws = draws_of(report)
    model = draws.model
    precision = 100.0 / math.sqrt(2.0 * (model.draws - 1))
    blocks = [
        ("Measurement model", _model_words(model)),
        ("Draws and seed", f"{model.draws} Monte Carlo draws of every lamp, seed {model.seed}: the same files, model and "
         f"seed give the same report. With {model.draws} draws a standard uncertainty is known to about {precision:.1f} % "
         "of itself; more draws (JCGM 101:2008 7.2.2 suggests 200 000 for a 95 % interval) narrow that."),
        ("Method", "JCGM 101:2008 (propagation of distributions by Monte Carlo): each draw perturbs the measured "
         "values on the file's own wavelengths as the model says, before they are brought onto the 1 nm grid "
         "(CIE 198:2011 for spectral quantities), and is rated by the same code as the spectrum itself. The rating "
         "printed is that of the spectrum as measured; u is the standard deviation of the draws (7.6) and the 95 % "
         "interval is probabilistically symmetric, 2.5 % of the draws below it and 2.5 % above (7.7.2)."),
        ("95 % region", "The shaded region around each lamp in the diagrams holds 95 % of its draws of (x, y): the "
         "convex hull of the 95 % of draws nearest their median, distances measured in the metric of the draws' "
         "covariance. It is lampcalc's construction for drawing, not a coverage region of JCGM 102."),
    ]
    rule = rule_of(report.verdicts)
    if rule:
        blocks += [
            ("Decision rule", f"{rule}. The margin m is how far the measured value lies on the claim's side of its "
             "limit; the guard band w is a multiple of the margin's standard uncertainty, agreed before the "
             "measurement as ILAC-G8 expects."),
            ("Outcomes", _outcome_words(rule)),
            ("Verdicts unchanged", "The verdicts (meets, does not meet, not evaluated) and lampcalc's exit status still "
             "compare the measured value with the claim; the decisions are stated beside them and change neither."),
        ]
    crossing = [r["name"] for r in report.records
                if {"uncertainty_crosses_validity", "uncertainty_category_varies"} & set(r.get("flags") or ())]
    if crossing:
        blocks.append(("Draws across a limit", "In part of the draws of " + ", ".join(crossing[:12])
                       + (", …" if len(crossing) > 12 else "") + " a validity limit or the category changes (see "
                       "their flags): those intervals mix valid and doubtful values and are shown in parentheses."))
    blocks.append(("Caution", CAUTION_WORDS))
    return [(head, text, LAMP if head == "Caution" else INK) for head, text in blocks]


def _decision_rows(report):
    rows = []
    for record, verdict in zip(report.records, report.lamp_verdicts):
        if verdict is None or "decision" not in verdict:
            continue
        counts = {}
        for check in verdict["checks"]:
            counts[check.get("decision") or NOT_DECIDED] = counts.get(check.get("decision") or NOT_DECIDED, 0) + 1
        order = [*OUTCOMES, NOT_DECIDED]
        spread = ", ".join(f"{counts[o]} {o}" for o in order if o in counts)
        rows.append([record["name"], short_status(verdict),
                     Cell(verdict["decision"] or NOT_DECIDED, *DECISION_LOOK.get(verdict["decision"], DECISION_LOOK[None])),
                     spread])
    return rows


def _decisions(rows, width_mm):
    columns = [Column("lamp", 0.26 * width_mm, "left", True), Column("verdicts", 0.2 * width_mm, "left", True),
               Column("decision", 0.16 * width_mm, "left"), Column("claims by decision", 0.38 * width_mm, "left", True)]
    return Table(columns, rows, size=6.4)


class UncertaintyPages:
    """Page builder of the measurement-uncertainty page (order 200): none without uncertainty."""

    order = 200

    def _layout(self, report):
        if "uncertainty_pages" not in report.cache:
            from .document import FOOTER_MM, HEADER_MM, MARGIN_MM

            width = report.paper.width_mm - 2 * MARGIN_MM
            room = report.paper.height_mm - 2 * MARGIN_MM - HEADER_MM - FOOTER_MM
            pages, used, rows = [], 0.0, []
            if draws_of(report) is not None:
                pages, used = headed_pages(_blocks(report), HEAD_MM, width - HEAD_MM, room, size=TEXT_PT, gap_mm=GAP_MM)
                rows = _decision_rows(report)
            heading = line_mm(8.5) + 2
            while rows:  # the decisions of the lamps, on as many pages as they need
                take = len(rows)
                while take > 1 and used + heading + _decisions(rows[:take], width).height() > room:
                    take -= 1
                if used and used + heading + _decisions(rows[:take], width).height() > room:
                    pages.append([])
                    used = 0.0
                    continue
                pages[-1].append(("decisions", rows[:take], None))
                used += heading + _decisions(rows[:take], width).height() + GAP_MM
                rows = rows[take:]
            report.cache["uncertainty_pages"] = (pages, width)
        return report.cache["uncertainty_pages"]

    def count(self, report):
        return len(self._layout(report)[0])

    def draw(self, report, sheet):
        pages, width = self._layout(report)
        for k, items in enumerate(pages):
            title = "Measurement uncertainty" + (", continued" if k else "")
            with sheet.page("uncertainty", title, "How sure the verdicts are: the model, the method, the decisions") as page:
                y = sheet.top
                for head, body, colour in items:
                    if head == "decisions":
                        y += paragraph(page, sheet.left, y, "Each lamp's decision beside its verdicts", width, size=8.5,
                                       weight="bold") + 2
                        y += _decisions(body, width).draw(page, sheet.left, y) + GAP_MM
                    else:
                        y += headed_paragraph(page, sheet.left, y, head, body, HEAD_MM, width - HEAD_MM, size=TEXT_PT,
                                              head_color=colour) + GAP_MM


PAGES = UncertaintyPages()
