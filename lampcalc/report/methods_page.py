"""The methods page: each method with its edition and source, the interpolation used per lamp,
the values no published source confirms, the cautions, and a place to sign.

Written for the client: it states what was done and on what authority, and says plainly which
shipped values could not be confirmed against a published text (verdicts resting on them are
marked in the claims tables). When the text does not fit one page it continues on the next.
"""

from .. import __version__
from ..plots.hue import BAR_SCALES
from ..plots.style import INK, LAMP, MUTED
from ..standards.ansi_bins import EDITION
from ..verdicts.wording import MISSING, QUALIFIED, UNCONFIRMED_BASES
from .caution import CAUTION
from .tables import line_mm, paragraph, paragraph_height

HEAD_MM = 38.0  # width of the headings' column

METHODS = [
    ("Spectra and sums", "CIE 015:2018: every spectrum is brought once onto 360–830 nm at 1 nm and every weighted "
     "integral is Σ S(λ)·w(λ)·Δλ. Outside the measured range the spectrum is zero, never extrapolated; a spectrum "
     "that does not cover 380–780 nm is flagged."),
    ("Observer", "CIE 1931 2° standard observer (CIE 015:2018) for chromaticity, CCT, Duv, CIE 13.3 and the ANSI "
     "categories; CIE 1964 10° for CIE 224 / TM-30-18, as that method prescribes."),
    ("CCT and Duv", "The exact nearest point of the Planckian locus (c2 = 1.4388e-2 m·K) in the CIE 1960 (u, v) "
     "diagram, not an approximation formula. Duv is positive above the locus (towards green), as in ANSI C78.377. "
     "No CCT outside 1000–100 000 K; beyond |Duv| = 0.05 a CCT is flagged, as CIE 015:2018 advises."),
    ("Colour rendering", "CIE 13.3-1995: Ra and R1–R14, with R15 the skin-tone sample of JIS Z 8726:1990; "
     "reference Planckian below 5000 K, CIE daylight from 5000 K; values unrounded (tables that round each Ri first "
     "can differ by one in Ra's last digit). Valid where the distance DC ≤ 5.4e-3; beyond, values are printed "
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
    ("Categories and steps", f"{EDITION}, Table 1: a lamp is in a category when its chromaticity lies inside (or on) "
     "the quadrangle; other nominal CCTs from 2200 to 6500 K follow the standard's flexible-CCT rules. Colour-"
     "consistency steps are counted with the ellipses of IEC 60081:1997, Annex D (between its colour centres the "
     "metric is interpolated in reciprocal CCT), from the centre of the claimed nominal CCT, else of the nearest "
     "category."),
    ("Claims", "Each claim is checked as the supplier stated it and given one of three verdicts: meets, does not meet, "
     "or not evaluated (the value could not be computed from the data, so the claim is not shown to hold). A claimed "
     "nominal CCT is checked three ways: inside its quadrangle, CCT within the category's tolerance, Duv within ±0.006 "
     f"of its target. The margin is how far the value lies on the claim's side of its limit. {QUALIFIED} marks a "
     "qualified verdict (see the two entries below)."),
    ("Reading the lamp pages", "Claims come first: the claim as stated, the measured value, the margin (how far the "
     "value lies on the claim's side of its limit, negative when short of it; for a quadrangle, the distance from its "
     "nearest edge in CIE 1960 (u, v)), the verdict and why. The diagram holds the lamp's category quadrangle whole, "
     "with colour-consistency ellipses of 1 to 7 steps around the category's centre (the 6-step ellipse heavier). "
     "In the hue-bin graphic the reference is the dashed unit circle and the lamp the solid polygon; a line joins "
     f"each bin's reference point to the lamp's. The bars use fixed scales — Rf,h {BAR_SCALES['fidelity'][0]:g} to "
     f"{BAR_SCALES['fidelity'][1]:g}, Rcs,h ±{BAR_SCALES['chroma'][1]:g} %, Rhs,h ±{BAR_SCALES['hue'][1]:g} rad — "
     "filled above zero and open below; a triangle marks a value beyond its scale. In the spectrum the lamp is the "
     "solid line (drawn only where measured) and the CIE 224 reference at its CCT and equal luminance the dashed one; "
     "V(λ) is dotted and the melanopic action spectrum dash-dotted."),
    ("Numbers as printed", "Each quantity is printed with fixed decimals (CCT to 1 K, Duv and chromaticity to 0.0001, "
     "indices to 0.1); near a claim's limit more decimals show on which side the value lies. Absolute quantities keep "
     f"four significant figures. A value in parentheses is outside its method's validity (its lamp's flags say why); "
     f"{MISSING} means not computable or not given. The JSON and CSV files carry the unrounded values."),
]


def _unconfirmed_text():
    listed = "; ".join(UNCONFIRMED_BASES.values())
    return (f"These shipped values were reproduced without a published copy in hand and are not yet confirmed "
            f"against the standards' text: {listed}. A verdict that rests on one of them is marked {QUALIFIED}; "
            "confirm the value against your copy of the standard before relying on such a verdict in a dispute.")


def _interpolation_text(records):
    groups = {}
    for r in records:
        groups.setdefault(r.get("interpolation") or "", []).append(r["name"])
    if list(groups) == [""]:
        return "Not recorded with these ratings."
    parts = [f"{method or 'not recorded'}: " + ("all lamps" if len(groups) == 1 else ", ".join(names))
             for method, names in groups.items()]
    return "To the 1 nm grid — " + "; ".join(parts) + ". Linear interpolation adds no overshoot; Sprague " \
        "(CIE 167:2005) suits smooth data at a uniform step."


def _cautions():
    return (CAUTION + " Photobiological safety (blue-light and other hazards) needs an assessment to IEC 62471 / "
            "CIE S 009. Emergency and task lighting are governed by local codes: have decisions made or approved by a "
            "licensed lighting designer or engineer.")


def _blocks(report):
    return [
        *[(h, t, INK) for h, t in METHODS],
        ("Interpolation used", _interpolation_text(report.records), INK),
        ("Values not confirmed by a published source", _unconfirmed_text(), INK),
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
            pages, used = [[]], 0.0
            for block in _blocks(report):
                height = max(paragraph_height(block[1], width, size=7), paragraph_height(block[0], HEAD_MM - 3, size=7.5,
                                                                                           weight="bold")) + 2.6
                if used + height > room and pages[-1]:
                    pages.append([])
                    used = 0.0
                pages[-1].append(block)
                used += height
            if used + SIGN_MM > room:
                pages.append([])
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
                    paragraph(page, sheet.left, y, head, HEAD_MM - 3, size=7.5, weight="bold", color=colour)
                    height = paragraph(page, sheet.left + HEAD_MM, y, text, width, size=7)
                    y += max(height, paragraph_height(head, HEAD_MM - 3, size=7.5, weight="bold")) + 2.6
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
