"""The pages of a comparison: a test spectrum beside its reference.

With several pairs, a first page lists them all (the colour shift, the differences of CCT,
Duv, Ra, R9, Rf, Rg, the verdict) and the lamps without a partner. Then one page per pair:

1. **Colour shift**: Δu′v′ against the limit the user gave, in the words of a claim
   (:func:`lampcalc.verdicts.lot_wording.limit_wording`); without a limit, "not evaluated".
2. **Spectra**: both at equal luminous quantity, and their ratio where the reference has
   light (:mod:`lampcalc.plots.comparison`); beside them every rating of the reference and
   the test and the difference test − reference, a value in doubt in parentheses.
3. **Flags** of the reference, of the test and of the pair, in words.
"""

import numpy as np

from ..plots.comparison import draw_normalised_spectra, draw_spectral_ratio
from ..plots.style import INK, LAMP, MUTED, pin_axis_labels
from ..rating.flags import doubtful_keys, explain
from ..verdicts.comparison import RATIO_FLOOR
from ..verdicts.lot_wording import limit_line, limit_wording
from ..verdicts.wording import DIGITS, MISSING, VERDICT_WORDS, format_value
from .figure_panels import panel, small_type
from .tables import Cell, Column, Table, heading, paragraph
from .verdict_tables import LOOK, verdict_table

#: Ratings of a pair's table, with their labels (R9 has the digits of the Ri).
RATINGS = {"x": "x", "y": "y", "u_prime": "u′", "v_prime": "v′", "cct_K": "CCT", "duv": "Duv", "peak_nm": "peak",
           "ra": "Ra", "r9": "R9", "rf": "Rf", "rg": "Rg", "ler_lm_per_W": "LER", "luminous_flux_lm": "luminous flux",
           "illuminance_lx": "illuminance", "luminance_cd_per_m2": "luminance", "efficacy_lm_per_W": "lamp efficacy",
           "sp_ratio": "S/P", "melanopic_der": "mel-DER", "melanopic_edi_lx": "mel-EDI"}
SPECTRA_MM = 128.0  # the figures beside the ratings table
SPECTRUM_MM = 70.0  # the upper figure: both spectra
TABLE_MM = 80.0  # width of the ratings table
NOTE = (f"Spectra scaled to the same luminous quantity (Σ V(λ)·S(λ)), the reference's peak at 1; the ratio test / "
        f"reference only where the reference is above {100 * RATIO_FLOOR:g} % of its peak and both were measured. "
        "Difference: test − reference.")
_OVERVIEW = (("reference", 0.19, "left"), ("test", 0.19, "left"), ("Δu′v′", 0.08, "right"), ("ΔCCT\nK", 0.07, "right"),
             ("ΔDuv", 0.08, "right"), ("ΔRa", 0.06, "right"), ("ΔR9", 0.06, "right"), ("ΔRf", 0.06, "right"),
             ("ΔRg", 0.06, "right"), ("verdict", 0.15, "left"))


def _digits_key(key):
    return "ri" if key == "r9" else key


def _pairs(report):
    return report.comparison[2]["pairs"]


def pair_limit(pairs, k):
    """The colour shift of pair ``k`` against the user's limit, as a claim in words."""
    limit = pairs["limit_delta_uv_prime"][k]
    return limit_wording(pairs["delta_uv_prime"][k], limit if np.isfinite(limit) else None, pairs["pass"][k],
                         what="Δu′v′ between test and reference", basis="distance in the CIE 1976 u′v′ diagram")


def _lead(pairs, k):
    limit = pairs["limit_delta_uv_prime"][k]
    line = limit_line(pairs["delta_uv_prime"][k], limit if np.isfinite(limit) else None, pairs["pass"][k])
    return f"Colour shift Δu′v′ {line}."


def uncertainty_line(pairs, k):
    """The colour shift's measurement uncertainty and the decision against the limit, in a sentence (``--uncertainty``)."""
    low, high = pairs["delta_uv_prime_interval95"][k]
    text = (f"With measurement uncertainty: Δu′v′ {format_value('delta_uv_prime', pairs['delta_uv_prime'][k])}, "
            f"u {format_value('delta_uv_prime', pairs['delta_uv_prime_u'][k])}, 95 % interval "
            f"{format_value('delta_uv_prime', low)} to {format_value('delta_uv_prime', high)}")
    if "decision" in pairs and pairs["decision"][k] is not None:
        text += (f"; the limit is met in {100 * pairs['conformance_probability'][k]:.1f} % of the draws; decision: "
                 f"{pairs['decision'][k]} ({pairs['decision_rule'][k]})")
    return text + ". The verdict above follows the measured value."


def rating_rows(pairs, k):
    """Rows of every rating either lamp of pair ``k`` has: reference, test, difference (doubtful in parentheses)."""
    doubt = doubtful_keys(pairs["reference_flags"][k]) | doubtful_keys(pairs["test_flags"][k])
    rows = []
    for key, label in RATINGS.items():
        ref, test, delta = (pairs[f"{side}_{key}"][k] for side in ("reference", "test", "delta"))
        if not (np.isfinite(ref) or np.isfinite(test)):
            continue
        digits = _digits_key(key)
        bad = digits in doubt
        unit = DIGITS.get(digits, (None, ""))[1]
        rows.append([label, unit, format_value(digits, ref, doubtful=bad), format_value(digits, test, doubtful=bad),
                     format_value(digits, delta, doubtful=bad, signed=True)])
    if np.isfinite(pairs["luminous_ratio"][k]):
        rows.append(["luminous ratio", "", "", "", f"{pairs['luminous_ratio'][k]:.3f}"])
    return rows


class ComparisonPages:
    """Page builder of a comparison (order 170): a list of the pairs when there are several, one page per pair."""

    order = 170

    def _overview_pages(self, report):
        """Row ranges of the list of pairs (none for a single pair)."""
        if "comparison" not in report.cache:
            pairs, n = _pairs(report), len(_pairs(report)["test_name"])
            width, room = report.paper.content_mm
            table = self._overview_table(pairs, range(n), width)  # rows of one line each: cells are shortened
            per_page = max(1, int((room - 40 - table.header_height()) // table.line))  # 40 mm: the lead and notes
            report.cache["comparison"] = [(a, min(n, a + per_page)) for a in range(0, n, per_page)] if n > 1 else []
        return report.cache["comparison"]

    @staticmethod
    def _overview_table(pairs, rows, width):
        columns = [Column(h, share * width, align) for h, share, align in _OVERVIEW]
        body = []
        for k in rows:
            doubt = doubtful_keys(pairs["reference_flags"][k]) | doubtful_keys(pairs["test_flags"][k])
            given = np.isfinite(pairs["limit_delta_uv_prime"][k])
            verdict = Cell(VERDICT_WORDS[pairs["pass"][k]], *LOOK[pairs["pass"][k]]) if given else MISSING
            body.append([pairs["reference_name"][k], pairs["test_name"][k],
                         format_value("delta_uv_prime", pairs["delta_uv_prime"][k]),
                         format_value("cct_K", pairs["delta_cct_K"][k], signed=True),
                         format_value("duv", pairs["delta_duv"][k]),
                         *(format_value("ri" if key == "r9" else key, pairs[f"delta_{key}"][k], signed=True,
                                        doubtful=_digits_key(key) in doubt) for key in ("ra", "r9", "rf", "rg")),
                         verdict])
        return Table(columns, body, size=6.4)

    def count(self, report):
        if report.comparison is None:
            return 0
        return len(self._overview_pages(report)) + len(_pairs(report)["test_name"])

    def overview(self, report):
        """The comparison's verdict in a sentence, for the first page."""
        if report.comparison is None:
            return []
        pairs = _pairs(report)
        n = len(pairs["test_name"])
        if n == 1:
            return [(f"{pairs['test_name'][0]} against {pairs['reference_name'][0]}: {_lead(pairs, 0)[0].lower()}"
                     f"{_lead(pairs, 0)[1:]}", pairs["pass"][0] is False)]
        failed = sum(p is False for p in pairs["pass"])
        largest = format_value("delta_uv_prime", float(np.max(pairs["delta_uv_prime"])))
        limit = pairs["limit_delta_uv_prime"][0]
        if not np.isfinite(limit):
            return [(f"{n} pairs compared (largest Δu′v′ {largest}); no limit given, so not evaluated.", False)]
        return [(f"{n} pairs compared against your limit {limit:g} on Δu′v′: {failed} do{'es' if failed == 1 else ''} "
                 f"not meet it (largest {largest}).", failed > 0)]

    def draw(self, report, sheet):
        if report.comparison is None:
            return
        reference, test, comparison = report.comparison
        pairs = comparison["pairs"]
        for k, (start, end) in enumerate(self._overview_pages(report)):
            with sheet.page("comparison_list", "Comparison of spectra" + (", continued" if k else ""),
                            f"{len(pairs['test_name'])} pairs: test against reference, paired by name") as page:
                y = sheet.top
                if k == 0:
                    ((lead, alarm),) = self.overview(report)
                    y += paragraph(page, sheet.left, y, lead, sheet.width, size=8, weight="bold",
                                   color=LAMP if alarm else INK) + 2
                y += self._overview_table(pairs, range(start, end), sheet.width).draw(page, sheet.left, y)
                notes = ["Δ: test − reference; ( ) a value outside its method's validity (see the pair's page)."]
                for side in ("reference", "test"):
                    if comparison[f"unmatched_{side}"]:
                        notes.append(f"No partner among the other side's spectra for these {side} lamps: "
                                     f"{', '.join(comparison[f'unmatched_{side}'])}.")
                for note in notes:
                    y += paragraph(page, sheet.left, y + 2, note, sheet.width, size=6.4, color=MUTED)
        for k in range(len(pairs["test_name"])):
            self._pair(report, sheet, reference, test, pairs, k)

    def _pair(self, report, sheet, reference, test, pairs, k):
        title = f"{pairs['test_name'][k]} against {pairs['reference_name'][k]}"
        subtitle = f"reference: {pairs['reference_source'][k]}\ntest: {pairs['test_source'][k]}"
        with sheet.page("comparison", title, subtitle) as page:
            y = sheet.top + heading(page, sheet.left, sheet.top, "Colour shift", sheet.width)
            y += paragraph(page, sheet.left, y, _lead(pairs, k), sheet.width, size=8, weight="bold",
                           color=LAMP if pairs["pass"][k] is False else INK) + 1
            y += verdict_table([pair_limit(pairs, k)], sheet.width).draw(page, sheet.left, y) + 1
            if "delta_uv_prime_u" in pairs:
                y += paragraph(page, sheet.left, y, uncertainty_line(pairs, k), sheet.width, size=6.6) + 1
            y += 2
            y += heading(page, sheet.left, y, "Spectra and ratings", sheet.width)
            self._spectra(page, sheet, reference, test, pairs, k, y)
            # numbers wrap rather than being shortened: "1.185 × 10⁻¹⁰" must never print as "1.185 × …"
            columns = [Column("rating", 0.25 * TABLE_MM, "left"), Column("unit", 0.1 * TABLE_MM, "left"),
                       *(Column(h, 0.217 * TABLE_MM, wrap=True) for h in ("reference", "test", "difference"))]
            Table(columns, rating_rows(pairs, k), size=6.2).draw(page, sheet.right - TABLE_MM, y + 1)
            y += SPECTRA_MM + 1
            y += paragraph(page, sheet.left, y, NOTE, sheet.width, size=5.8, color=MUTED) + 2
            self._flags(page, sheet, pairs, k, y)

    def _spectra(self, page, sheet, reference, test, pairs, k, y):
        i = list(reference["name"]).index(pairs["reference_name"][k])
        j = list(test["name"]).index(pairs["test_name"][k])
        ref, tst = reference.extras["batch"], test.extras["batch"]
        ranges = {"reference_range_nm": ref.measured_range_nm[i], "test_range_nm": tst.measured_range_nm[j]}
        width = sheet.width - TABLE_MM - 16
        with small_type():
            top = panel(page, sheet.left + 11, y + 3, width, SPECTRUM_MM)
            draw_normalised_spectra(top, ref.values[i], tst.values[j], reference_name="reference",
                                    test_name="test", **ranges)
            bottom = panel(page, sheet.left + 11, y + 3 + SPECTRUM_MM + 9, width, SPECTRA_MM - SPECTRUM_MM - 22, sharex=top)
            draw_spectral_ratio(bottom, ref.values[i], tst.values[j], **ranges)
            top.tick_params(labelbottom=False)
            top.set_ylabel("relative")
            for ax in (top, bottom):
                pin_axis_labels(ax, 11, 22)

    def _flags(self, page, sheet, pairs, k, y):
        page.text(sheet.left, y, "Flags", size=6.6, weight="bold")
        for side, flags in (("reference", pairs["reference_flags"][k]), ("test", pairs["test_flags"][k]),
                            ("pair", pairs["flags"][k])):
            text = "; ".join(explain(f) for f in flags) if flags else "none"
            y += paragraph(page, sheet.left + 12, y, f"{side}: {text}", sheet.width - 12, size=6.6) + 0.4
        return y


PAGES = ComparisonPages()
