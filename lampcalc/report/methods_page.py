"""The methods page: each method with its edition and source (and the methods of a lot, colour
over angle or a comparison when the report holds one), the interpolation used per lamp, the
values no published source confirms, the cautions, and a place to sign.

Written for the client: it states what was done and on what authority, and says plainly which
shipped values could not be confirmed against a published text (verdicts resting on them are
marked in the claims tables). When the text does not fit one page it continues on the next.
"""

import math

from .. import __version__
from ..plots.hue import BAR_SCALES
from ..plots.style import INK, LAMP, MUTED
from ..standards.ansi_bins import EDITION
from ..verdicts.comparison import RATIO_FLOOR
from ..verdicts.wording import INTERPOLATION_WORDS, MISSING, QUALIFIED
from .caution import CAUTION
from .tables import headed_pages, headed_paragraph, line_mm

HEAD_MM = 38.0  # width of the headings' column
TEXT_PT = 6.8
GAP_MM = 2.0

METHODS = [
    ("Spectra and sums", "CIE 015:2018: every spectrum is brought once onto 360–830 nm at 1 nm, as CIE 015 and "
     "CIE 167:2005 prescribe (Sprague for uniform data coarser than 1 nm, linear for uneven data, finer data "
     "integrated so that every watt counts once), and every weighted integral is Σ S(λ)·w(λ)·Δλ. Outside the "
     "measured range the spectrum is zero, never extrapolated; a spectrum that does not cover 380–780 nm is flagged."),
    ("Observer", "CIE 1931 2° standard observer (CIE 015:2018) for chromaticity, CCT, Duv, CIE 13.3 and the ANSI "
     "categories; CIE 1964 10° for CIE 224 / TM-30-18, as that method prescribes."),
    ("CCT and Duv", "The exact nearest point of the Planckian locus (c2 = 1.4388 × 10⁻² m·K) in the CIE 1960 (u, v) "
     "diagram, not an approximation formula. Duv is positive above the locus (towards green), as in ANSI C78.377. "
     "No CCT outside 1000–100 000 K; beyond |Duv| = 0.05 a CCT is flagged and printed in parentheses, as "
     "CIE 015:2018 advises against its use."),
    ("Colour rendering", "CIE 13.3-1995: Ra and R1–R14, with R15 the skin-tone sample of JIS Z 8726:1990; "
     "reference Planckian below 5000 K, CIE daylight from 5000 K; values unrounded (tables that round each Ri first "
     "can differ by one in Ra's last digit). Valid where the distance DC ≤ 0.0054; beyond, values are printed "
     "in parentheses."),
    ("Fidelity and gamut", "CIE 224:2017 Rf and ANSI/IES TM-30-18 Rf, Rg and the 16 hue bins (local fidelity Rf,h, "
     "chroma shift Rcs,h, hue shift Rhs,h): 99 colour samples, CIECAM02 and CAM02-UCS, reference Planckian below "
     "4000 K, CIE daylight above 5000 K and a mixture between. Later TM-30 editions are not claimed. The hue-bin bars "
     "use fixed scales, so that bars of different lamps compare."),
    ("Efficacy", "LER = 683 lm/W · Σ V(λ)·S(λ) / Σ S(λ) over the measured part of 360–830 nm: the efficacy of the "
     "radiation, not of the lamp. Lamp efficacy = luminous flux of a spectrum in W/nm divided by the electrical "
     "power given with it."),
    ("Photoreceptors", "S/P = 1700 lm/W · Σ V′(λ)·S(λ) / (683 lm/W · Σ V(λ)·S(λ)) over 380–780 nm, with the CIE 1951 "
     "scotopic V′(λ). α-opic efficacies of luminous radiation (ELR) and daylight efficacy ratios (DER, against D65) "
     "per CIE S 026/E:2018; melanopic EDI = illuminance × mel-DER, for irradiance spectra."),
    ("Categories and steps", f"{EDITION}: Table 1 targets and the quadrangles of the standard's corner table; a lamp is "
     "in a category when its chromaticity lies inside (or on) the quadrangle. For a flexible nominal CCT only the "
     "centre-line Duv is checked: no quadrangle or CCT tolerance is held from a published source, so those claims "
     "are not evaluated (a bin set supplied with the claims decides them). Colour-consistency steps are counted "
     "with an ellipse set (by default IEC 60081:1997, Annex D; between its colour centres the metric is "
     "interpolated in reciprocal CCT) from the centre of the claimed nominal CCT, else of the nearest category."),
    ("Claims", "Each claim is checked as the supplier stated it: meets, does not meet, or not evaluated (the data do "
     "not give the value, so the claim is not shown to hold). A claimed nominal CCT is checked three ways: inside its "
     f"quadrangle, CCT within the category's tolerance, Duv within ±0.006 of its target. {QUALIFIED} marks a qualified "
     "verdict (see below)."),
    ("Reading the lamp pages", "Claims come first: the claim as stated, the measured value, the margin (how far the "
     "value lies on the claim's side of its limit, negative when short of it; for a quadrangle, the distance from its "
     "nearest edge in CIE 1960 (u, v)), the verdict and why. The diagram holds the lamp's category quadrangle whole, "
     "with 1–7 step ellipses around its centre (the 6-step one heavier). Hue-bin graphic: reference the dashed unit "
     f"circle, lamp the solid polygon. Bars on fixed scales (Rf,h {BAR_SCALES['fidelity'][0]:g}–"
     f"{BAR_SCALES['fidelity'][1]:g}, Rcs,h ±{BAR_SCALES['chroma'][1]:g} %, Rhs,h ±{BAR_SCALES['hue'][1]:g} rad), "
     "filled above zero and open below; a triangle marks a value beyond its scale. Spectrum: the lamp solid (drawn "
     "only where measured), the CIE 224 reference at its CCT and equal luminance dashed, V(λ) dotted, the melanopic "
     "action spectrum dash-dotted."),
    ("Numbers as printed", "Each quantity is printed with fixed decimals (CCT to 1 K, Duv and chromaticity to 0.0001, "
     "indices to 0.1); near a claim's limit more decimals show on which side the value lies. Absolute quantities keep "
     f"four significant figures. A value in parentheses is outside its method's validity (its lamp's flags say why); "
     f"{MISSING} means not computable or not given. The JSON and CSV files carry the unrounded values."),
]


#: Methods of the parts a report may hold, by the Report's attribute.
PART_METHODS = {
    "lot": ("Lots", "The statistics of a rating are over the samples that have it: the mean; the sample standard "
            "deviation, divisor n − 1 (ddof = 1); the lowest and highest; the 5th and 95th percentiles, interpolated "
            "linearly between the sorted values at position p·(n − 1) (NumPy's default method, definition 7 of Hyndman "
            "and Fan, 1996). The mean point is the mean of the samples' x, y; the mean u′, v′ the means of their u′, v′. "
            f"The covariance ellipse (p − m)ᵀ S⁻¹ (p − m) = χ²₂(0.95) = −2·ln 0.05 = {-2 * math.log(0.05):.3f}, with S the "
            "sample covariance of the samples' x, y, holds 95 % of a two-dimensional normal distribution of that "
            "covariance. It describes the samples measured: for a small lot S is itself uncertain, so the ellipse is no "
            "tolerance region for the production and no promise for the next lamp; it needs three samples or more. "
            "Steps count from the lot's centre as for single lamps; a share within n steps counts the samples at n steps "
            "or fewer. The verdicts on a lot's claims concern the samples supplied, not the production."),
    "angles": ("Colour over angle", "Δu′v′ of each angle from the mean point in the CIE 1976 u′v′ diagram. The mean "
               "point weights each angle's u′, v′ by its luminous quantity Km·Σ V(λ)·S(λ)·Δλ (illuminance, luminous "
               "flux or luminance) when every spectrum is absolute in the same quantity, else every angle alike; the "
               "angles count as measured, with no solid-angle (zonal) weighting. No limit is applied by default: the "
               "verdict is against the limit given for the report."),
    "comparison": ("Comparisons", "Δu′v′: the distance between the test's and the reference's u′, v′ in the CIE 1976 "
                   "UCS diagram; every other difference is test − reference. The figure scales both spectra to the same "
                   "Σ V(λ)·S(λ), the reference's peak at 1; their ratio is drawn only where the reference is at least "
                   f"{100 * RATIO_FLOOR:g} % of its peak (below, a ratio of small values is noise) and both spectra were "
                   "measured. The luminous ratio needs both spectra absolute in the same quantity. No limit is applied "
                   "by default: the verdict is against the limit given for the report."),
}


def _with_edition(name, edition):
    """A set's name with what its edition adds ("… ellipses (+A1:2000)"), the edition not said twice."""
    head, _, rest = edition.partition(" (")
    if head in name:
        return f"{name} ({rest}" if rest else name
    return f"{name} ({edition})"


def _unconfirmed_text(records):
    """The shipped values no published source in hand confirms, from the sets' own marks; and the user's sets."""
    from ..standards.ansi_bins import ansi_bin_set
    from ..standards.ellipse_sets import SHIPPED, shipped_ellipse_set

    bins = ansi_bin_set()
    built = [name for name, confirmed in zip(bins.names, bins.bin_confirmed) if not confirmed]
    listed = " and ".join([", ".join(built[:-1]), built[-1]] if len(built) > 1 else built)
    items = [f"{bins.name}: those of {listed} K (corners built by the standard's construction, "
             "not read from its published table)"] if built else []
    shipped = {}
    for kind in SHIPPED:
        ellipses = shipped_ellipse_set(kind)
        shipped[ellipses.name] = ellipses
        if not ellipses.confirmed:
            items.append("the " + _with_edition(ellipses.name, ellipses.edition))
    text = ("These shipped values are held by lampcalc but not yet checked against the published text: "
            + "; ".join(items) + f". A verdict that rests on one of them is marked {QUALIFIED}, and so is a value "
            "that uses them (in parentheses, with its flag); confirm them against your copy of the standard, or "
            "supply the published values as set files, before relying on such a verdict in a dispute.") if items else ""
    given = sorted({str(r.get(key)) for r in records for key in ("bin_set", "sdcm_ellipse_set")
                    if r.get(key) and r.get(key) not in shipped and r.get(key) != bins.name})
    if given:
        text += f" Sets supplied for this report, used as given: {', '.join(given)}."
    return text or "None: every value used is read from its published source."


def _interpolation_text(records):
    groups = {}
    for r in records:
        method = r.get("interpolation")
        groups.setdefault(INTERPOLATION_WORDS.get(method, method or "not recorded"), []).append(r["name"])
    if len(groups) == 1:
        return f"To the 1 nm grid: {next(iter(groups))}, for every lamp."
    parts = [f"{method}: {len(names)} lamp{'s' if len(names) != 1 else ''} ({', '.join(names[:6])}"
             f"{', …' if len(names) > 6 else ''})" for method, names in sorted(groups.items())]
    return "To the 1 nm grid — " + "; ".join(parts) + "."


def _cautions():
    return (CAUTION + " Photobiological safety (blue-light and other hazards) needs an assessment to IEC 62471 / "
            "CIE S 009. Emergency and task lighting are governed by local codes: have decisions made or approved by a "
            "licensed lighting designer or engineer.")


def _blocks(report):
    return [
        *[(h, t, INK) for h, t in METHODS],
        *[(*PART_METHODS[part], INK) for part in PART_METHODS if getattr(report, part, None) is not None],
        ("Interpolation used", _interpolation_text(report.records), INK),
        ("Values not confirmed by a published source", _unconfirmed_text(report.records), INK),
        ("Cautions", _cautions(), LAMP),
        ("Software", f"lampcalc {__version__}, computed from the spectra supplied; the report is reproducible from "
         "the same files (no date is added).", INK),
    ]


def _sign_off(report):
    info = report.info
    return [("prepared by", info.prepared_by), ("date", info.date), ("signature", None)]


SIGN_MM = 16.0


class MethodsPage:
    """Page builder of the methods and cautions (order 900); continues onto more pages when needed."""

    order = 900

    def _layout(self, report):
        if "methods" not in report.cache:
            from .document import FOOTER_MM, HEADER_MM, MARGIN_MM

            width = report.paper.width_mm - 2 * MARGIN_MM - HEAD_MM
            room = report.paper.height_mm - 2 * MARGIN_MM - HEADER_MM - FOOTER_MM
            pages, used = headed_pages(_blocks(report), HEAD_MM, width, room, size=TEXT_PT, gap_mm=GAP_MM)
            if used + SIGN_MM > room:  # the cautions and the software go over with the signature, never a bare line
                moved = min(2, len(pages[-1]) - 1)
                pages.append(pages[-1][len(pages[-1]) - moved:])
                del pages[-2][len(pages[-2]) - moved:]
            report.cache["methods"] = (pages, width)
        return report.cache["methods"]

    def count(self, report):
        return len(self._layout(report)[0])

    def draw(self, report, sheet):
        pages, width = self._layout(report)
        for k, blocks in enumerate(pages):
            title = "Methods and cautions" + (", continued" if k else "")
            with sheet.page("methods", title, "What was computed, by which method and edition; what to heed") as page:
                y = sheet.top
                for head, text, colour in blocks:
                    y += headed_paragraph(page, sheet.left, y, head, text, HEAD_MM, width, size=TEXT_PT,
                                          head_color=colour) + GAP_MM
                if k == len(pages) - 1:
                    self._sign(page, sheet, report, y + 3)

    def _sign(self, page, sheet, report, y):
        column = sheet.width / 3
        for n, (label, value) in enumerate(_sign_off(report)):
            x = sheet.left + n * column
            page.text(x, y, label, size=6.5, color=MUTED)
            if value:
                page.text(x, y + line_mm(6.5) + 0.8, value, size=7.5, fit_mm=column - 6)
            page.rule(x, x + column - 6, y + 10, lw=0.5, color=INK)


PAGES = MethodsPage()
