"""One page per lamp, read top to bottom as an engineer reads it.

1. **Claims**: the verdict in a line, then each claim as the supplier stated it, the
   measured value, the margin, the verdict and why (:mod:`lampcalc.verdicts.wording`).
2. **Flags** in words: what qualifies the numbers below (values in parentheses).
3. **Colour point**: chromaticity, CCT, Duv, ANSI C78.377 category and steps, and the
   light: LER, efficacy, the absolute quantities the spectrum allows, S/P, mel-DER; beside
   them a diagram holding the lamp's category quadrangle whole with the step ellipses. A
   source with no CCT shows its dominant wavelength, purity, peak and width instead, on the
   whole diagram.
4. **Colour rendering**: Ra and R1–R15, Rf and Rg, the 16 hue bins (local fidelity, chroma
   and hue shift) as numbers, then the hue-bin graphic and bars on fixed scales.
5. **Spectrum** against its reference, with the α-opic ratios beside it.

With measurement uncertainty (:mod:`lampcalc.report.uncertainty_pages`) a lamp takes two pages:
the first adds, after the claims, the claims judged with uncertainty and, after the flags, the
main ratings with u and 95 % interval, and its diagram shows the lamp's 95 % region; colour
rendering and the spectrum follow on the second.

The axes are made once and moved to each page's layout; only the lamp's data change.
"""

import numpy as np
from matplotlib.ticker import MaxNLocator, MultipleLocator

from ..plots.diagram import ChromaticityDiagram, window_around
from ..plots.hue import BAR_SCALES, HueBars, HueGraphic
from ..plots.spectrum import SpectrumPanel, reference_at_equal_luminance
from ..plots.style import INK, LAMP, MUTED, pin_axis_labels
from ..rating.flags import doubtful_keys, draw_flag_lines, explain
from ..rendering.reference import reference_cie224
from ..spectra.batch import QUANTITY_UNITS
from ..standards.ansi_bins import ansi_bin_set
from ..verdicts.wording import INTERPOLATION_WORDS, MISSING, QUALIFIED, format_value, lamp_line, lamp_status, word_checks
from .markers import quote
from .tables import HEADING_MM, Column, Table, heading, key_values, key_values_height, line_mm, paragraph
from .uncertainty_pages import DECISIONS_NOTE, RATINGS_NOTE, decision_table, draws_of, rating_table, regions
from .verdict_tables import verdict_table

ALPHA_OPIC = ("s_cone", "m_cone", "l_cone", "rhodopic", "melanopic")
_BIN_KEYS = ("rf_hue_bins", "chroma_shift_hue_bins_percent", "hue_shift_hue_bins_rad")
SPECTRUM_MIN_MM = 54.0  # heading, plot (at least 33 mm) and caption
SPECTRUM_MAX_MM = 90.0
CLAIMS_NOTE = (
    f"Margin: distance from the claim's limit, negative when short of it (quadrangle: from its nearest edge in (u, v)). "
    f"{QUALIFIED} qualified, see Methods."
)
HUE_NOTE = "Reference dashed, lamp solid; bars on fixed scales (Methods)."
SPECTRUM_NOTE = "Lamp solid; CIE 224 reference dashed; V(λ) dotted; melanopic action spectrum dash-dotted."


def _white(record):
    """Near the Planckian locus: a CCT worth quoting (CIE 015: within 0.05 in Duv), so a category and steps."""
    flags = record.get("flags") or ()
    return record.get("cct_K") is not None and "duv_beyond_0.05" not in flags and "rendering_not_meaningful" not in flags


def _rendered(record):
    """Colour rendering indices were computed (a reference illuminant exists)."""
    return record.get("ra") is not None or record.get("rf") is not None


def _category_words(r):
    margin = r.get("ansi_margin_uv")
    if r.get("ansi_nominal_cct_K") is not None:
        return f"{quote(r, 'ansi_nominal_cct_K')} K, inside by {format_value('ansi_margin_uv', margin)}"
    if r.get("ansi_nearest_nominal_cct_K") is not None and margin is not None:
        return f"none; nearest {r['ansi_nearest_nominal_cct_K']:g} K, {format_value('ansi_margin_uv', abs(margin))} out"
    return MISSING


def _colour_items(r):
    """(label, value) of the colour point: chromaticity, CCT and category for a white lamp, else its hue."""
    items = [("x, y", f"{quote(r, 'x')}, {quote(r, 'y')}"), ("u′, v′", f"{quote(r, 'u_prime')}, {quote(r, 'v_prime')}")]
    if r.get("cct_K") is not None:
        items += [("CCT", quote(r, "cct_K", unit=True)), ("Duv", quote(r, "duv"))]
    if _white(r):
        centre = format_value("sdcm_centre_nominal_cct_K", r.get("sdcm_centre_nominal_cct_K"), unit=True)
        items += [
            ("ANSI C78.377", _category_words(r)),
            ("to its target", f"ΔCCT {format_value('ansi_delta_cct_K', r.get('ansi_delta_cct_K'), unit=True, signed=True)}"
                              f", ΔDuv {quote(r, 'ansi_delta_duv')}"),
        ]
        if r.get("bin_set") and r.get("bin_set") != ansi_bin_set().name:  # a user's bin set
            bin_name = r.get("bin") or "none"
            items.append(("bin", f"({bin_name})" if "bin" in doubtful_keys(r.get("flags") or ()) else bin_name))
        items += [
            ("steps", f"{quote(r, 'sdcm_steps')} from the {centre} centre" if r.get("sdcm_steps") is not None else MISSING),
            ("step set", r.get("sdcm_ellipse_set") or MISSING),
            ("peak", quote(r, "peak_nm", unit=True)),
        ]
    else:
        hue = (("complementary λ", "complementary_wavelength_nm") if r.get("complementary_wavelength_nm") is not None
               else ("dominant λ", "dominant_wavelength_nm"))
        items += [(label, quote(r, key, unit=True)) for label, key in (
            hue, ("purity", "excitation_purity"), ("peak", "peak_nm"), ("centroid", "centroid_nm"), ("FWHM", "fwhm_nm"))]
    return items


def _ellipse_set(record):
    """The shipped ellipse set the lamp's steps were counted with; None for a set supplied by the user."""
    from ..standards.ellipse_sets import SHIPPED, shipped_ellipse_set

    name = record.get("sdcm_ellipse_set")
    sets = [shipped_ellipse_set(kind) for kind in SHIPPED]
    if not name:
        return sets[0]
    return next((s for s in sets if s.name == name), None)


def _light_items(r):
    items = [("LER", f"{quote(r, 'ler_lm_per_W', unit=True)}"),
             ("lamp efficacy", quote(r, "efficacy_lm_per_W", unit=True))]
    absolute = [(label, quote(r, key, unit=True)) for label, key in (
        ("luminous flux", "luminous_flux_lm"), ("radiant flux", "radiant_flux_W"), ("electrical power", "electrical_W"),
        ("illuminance", "illuminance_lx"), ("luminance", "luminance_cd_per_m2"), ("melanopic EDI", "melanopic_edi_lx"),
    ) if r.get(key) is not None]
    items += absolute or [("absolute", "none: the spectrum is relative")]
    items += [("S/P", quote(r, "sp_ratio")), ("mel-DER", quote(r, "melanopic_der"))]
    return items


def _subtitle(r):
    def nm(key):
        value = r.get(key)
        return MISSING if value is None else f"{value:g}"

    unit = QUANTITY_UNITS.get(r.get("quantity"), "")
    method = INTERPOLATION_WORDS.get(r.get("interpolation"), r.get("interpolation") or MISSING)
    data = (f"{r.get('quantity')} spectrum ({unit}) · {nm('range_start_nm')}–{nm('range_end_nm')} nm in "
            f"{nm('step_nm')} nm steps · onto the 1 nm grid: {method}")
    return f"{r.get('source') or ''}\n{data}"


def _rendering_tables(record):
    """The two tables of the rendering section, read down: the indices, then the 16 hue bins."""
    names = ["Ra", *(f"R{k}" for k in range(1, 16)), "Rf", "Rg"]
    values = [quote(record, "ra"), *(quote(record, "ri", index=k) for k in range(15)), quote(record, "rf"),
              quote(record, "rg")]
    indices = Table([Column("index", 11, "left"), Column("value", 12)], list(zip(names, values)), size=6.0, spacing=1.2)
    bins = Table([Column("hue\nbin", 9), Column("Rf,h", 10), Column("Rcs,h\n%", 12), Column("Rhs,h\nrad", 12)],
                 [[str(k + 1), *(quote(record, key, index=k) for key in _BIN_KEYS)] for k in range(16)], size=6.0,
                 spacing=1.2)
    return indices, bins


class _Axes:
    """The lamp page's axes, made once per report and moved to each page's layout."""

    def __init__(self, fig):
        self.white = ChromaticityDiagram(fig.add_axes([0, 0, 0.1, 0.1]), zoom=True, legend=False)
        self.full = ChromaticityDiagram(fig.add_axes([0, 0, 0.1, 0.1]), zoom=False, legend=False, quadrangles=False,
                                        isotherm_labels=False)
        self.graphic = HueGraphic(fig.add_axes([0, 0, 0.1, 0.1]), title="", legend=False, axis_labels=False)
        short = {"fidelity": "Rf,h", "chroma": "Rcs,h (%)", "hue": "Rhs,h (rad)"}
        self.bars = [HueBars(fig.add_axes([0, 0, 0.1, 0.1]), kind, xlabel=kind == "hue", ylabel=short[kind])
                     for kind in BAR_SCALES]
        self.spectrum = SpectrumPanel(fig.add_axes([0, 0, 0.1, 0.1]))
        self.spectrum.ax.set_ylabel("relative")
        for ax in (self.white.ax, self.full.ax, self.spectrum.ax, *(b.ax for b in self.bars)):
            ax.tick_params(labelsize=6)
            ax.xaxis.label.set_size(6.5)
            ax.yaxis.label.set_size(6.5)
        for bar in self.bars:
            bar.ax.tick_params(labelsize=5.5, pad=1.5)
            bar.ax.yaxis.label.set_size(6)
            pin_axis_labels(bar.ax, 10, 20)
        for ax in (self.white.ax, self.full.ax):
            pin_axis_labels(ax, 12, 26)
            ax.xaxis.set_major_locator(MaxNLocator(4))
            ax.yaxis.set_major_locator(MaxNLocator(4))
        pin_axis_labels(self.spectrum.ax, 12, 20)
        self.spectrum.ax.yaxis.set_major_locator(MultipleLocator(0.5))
        for bar in self.bars:
            bar.ax.grid(False)

    def hide(self):
        for ax in (self.white.ax, self.full.ax, self.graphic.ax, self.spectrum.ax, *(b.ax for b in self.bars)):
            ax.set_visible(False)


class LampPages:
    """Page builder of the lamp pages (order 300): one page per lamp."""

    order = 300

    def count(self, report):
        return len(report.records) * (1 if draws_of(report) is None else 2)

    def draw(self, report, sheet):
        batch = report.ratings.extras["batch"]
        cct = np.array([np.nan if r["cct_K"] is None else r["cct_K"] for r in report.records])
        references = reference_at_equal_luminance(batch.values, reference_cie224(cct))
        shapes = regions(report)
        axes = None
        for i, record in enumerate(report.records):
            with sheet.page("lamp", record["name"], _subtitle(record)) as page:
                if axes is None or axes.spectrum.ax.figure is not page.fig:
                    axes = _Axes(page.fig)
                axes.hide()
                verdict = report.lamp_verdicts[i]
                y = self._claims(page, sheet, report, record, verdict, sheet.top)
                if shapes is not None:
                    y = self._decisions(page, sheet, record, verdict, y)
                y = self._flags(page, sheet, record, y)
                tables = _rendering_tables(record)
                if shapes is not None:  # rendering and spectrum go on the next page
                    y = self._uncertainty(page, sheet, record, y)
                    point_h = min(62.0 if _white(record) else 84.0, max(46.0, sheet.bottom - y))
                    self._colour_point(page, sheet, axes, record, y, point_h, shapes[i])
                else:  # the colour point takes what the rendering tables and the spectrum's least height leave
                    rendering_h = HEADING_MM + max(t.height() for t in tables) + 2 if _rendered(record) else 14.0
                    room = sheet.bottom - y - SPECTRUM_MIN_MM - rendering_h
                    point_h = min(62.0 if _white(record) else 84.0, max(46.0, room))
                    y = self._colour_point(page, sheet, axes, record, y, point_h)
                    y = self._rendering(page, sheet, axes, report, i, record, y, tables)
                    self._spectrum(page, sheet, axes, batch, i, record, references[i], y)
            if shapes is not None:
                with sheet.page("lamp", f"{record['name']}, continued", _subtitle(record)) as page:
                    axes.hide()
                    y = self._rendering(page, sheet, axes, report, i, record, sheet.top, tables)
                    self._spectrum(page, sheet, axes, batch, i, record, references[i], y)

    def _decisions(self, page, sheet, record, verdict, y):
        if verdict is None or "decision" not in verdict:
            return y
        y += heading(page, sheet.left, y, "Claims with measurement uncertainty", sheet.width)
        lead = f"Decision: {verdict['decision'] or 'not decided'} ({verdict['checks'][0]['decision_rule']})."
        y += paragraph(page, sheet.left, y, lead, sheet.width, size=8, weight="bold",
                       color=INK if verdict["decision"] in ("pass", "conditional pass") else LAMP) + 1
        y += decision_table(verdict, record, sheet.width).draw(page, sheet.left, y) + 1
        return y + paragraph(page, sheet.left, y, DECISIONS_NOTE, sheet.width, size=5.8, color=MUTED) + 1.5

    def _uncertainty(self, page, sheet, record, y):
        y += heading(page, sheet.left, y, "Measurement uncertainty of the main ratings", sheet.width)
        y += rating_table(record, sheet.width).draw(page, sheet.left, y) + 1
        return y + paragraph(page, sheet.left, y, RATINGS_NOTE, sheet.width, size=5.8, color=MUTED) + 1.5

    def _claims(self, page, sheet, report, record, verdict, y):
        y += heading(page, sheet.left, y, "Claims", sheet.width)
        if verdict is None:
            text = ("No claims were checked: the report was made without a claims file." if report.verdicts is None
                    else "No claims of this lamp were checked.")
            if report.verdicts is None and report.lot_verdicts is not None:
                text = "No claims of this sample alone were checked: the claims on the lot are on the lot's pages."
            return y + paragraph(page, sheet.left, y, text, sheet.width, size=7, color=MUTED) + 2
        status = lamp_status(verdict)
        lead = lamp_line(verdict)
        y += paragraph(page, sheet.left, y, lead[0].upper() + lead[1:] + ".", sheet.width, size=8, weight="bold",
                       color=INK if status else LAMP) + 1
        words = word_checks(verdict, record.get("flags") or ())
        y += verdict_table(words, sheet.width).draw(page, sheet.left, y) + 1
        return y + paragraph(page, sheet.left, y, CLAIMS_NOTE, sheet.width, size=5.8, color=MUTED) + 1.5

    def _flags(self, page, sheet, record, y):
        flags = record.get("flags") or ()
        if not flags:
            return y + paragraph(page, sheet.left, y, "Flags: none.", sheet.width,
                                 size=6.6, color=MUTED) + 1.5
        page.text(sheet.left, y, "Flags", size=6.6, weight="bold")
        for flag in flags:
            y += paragraph(page, sheet.left + 12, y, explain(flag), sheet.width - 12, size=6.6)
            if flag == "uncertainty_crosses_validity":
                for line in draw_flag_lines(record.get("uncertainty_flags_in_draws")):
                    y += paragraph(page, sheet.left + 16, y, "– " + line, sheet.width - 16, size=6.2, color=MUTED)
        return y + 1.5

    def _colour_point(self, page, sheet, axes, record, y, height, region=None):
        y += heading(page, sheet.left, y, "Colour point and category" if _white(record) else "Colour point", sheet.width)
        size = height - HEADING_MM
        list_w = sheet.width - size - 4
        half = list_w / 2
        colour, light = _colour_items(record), _light_items(record)
        key_values(page, sheet.left, y + 1, colour, 20, half - 21)
        key_values(page, sheet.left + half + 1, y + 1, light, 21, half - 22)
        diagram = axes.white if _white(record) else axes.full
        box = [sheet.right - size + 9, y + 1, size - 9, size - 12]
        diagram.ax.set_visible(True)
        diagram.ax.set_position(page.box(*box))
        name = record["name"]
        xy = (record["x"], record["y"])
        nominal = record.get("sdcm_centre_nominal_cct_K")
        ellipses = _ellipse_set(record)
        shown = {"labels": [None], "title": "", "regions": None if region is None else [region]}
        held = xy if region is None or not len(region) else np.vstack([xy, region])
        if _white(record) and nominal is not None and ellipses is not None:
            diagram.show([(name, xy)], nominal_cct_K=nominal, ellipse_set=ellipses,
                         window=window_around(held, nominal, ellipse_set=ellipses), **shown)
            note = f"ANSI C78.377-2017 quadrangles; 1–7 step contours ({ellipses.name}) around the {nominal:g} K centre."
        elif _white(record) and nominal is not None:
            diagram.show([(name, xy)], window=window_around(held, nominal), **shown)
            note = f"ANSI C78.377-2017 quadrangles; the steps' set ({record.get('sdcm_ellipse_set')}) is not drawn."
        else:
            diagram.show([(name, xy)], **shown)
            note = "CIE 1931 (x, y): the lamp lies away from the white region."
        if region is not None:
            note += " Shaded: the lamp's 95 % region over the Monte Carlo draws."
        listed = max(key_values_height(colour, half - 21), key_values_height(light, half - 22))
        paragraph(page, sheet.left, y + max(listed + 3, size - 14), note, list_w, size=5.8, color=MUTED)
        return y + size + 1

    def _rendering(self, page, sheet, axes, report, i, record, y, tables):
        y += heading(page, sheet.left, y, "Colour rendering", sheet.width)
        if not _rendered(record):
            reason = explain("rendering_not_meaningful") if "rendering_not_meaningful" in (record.get("flags") or ()) \
                else "no CCT, so no reference illuminant"
            return y + paragraph(page, sheet.left, y, f"Not evaluated: {reason}.", sheet.width, size=7, color=MUTED) + 2
        indices, bins = tables
        indices.draw(page, sheet.left, y)
        bins.draw(page, sheet.left + 27, y)
        height = max(indices.height(), bins.height())
        ref, test = report.ratings.extras["ref_ab_bins"][i], report.ratings.extras["test_ab_bins"][i]
        left = sheet.left + 27 + 43 + 4
        if not (np.all(np.isfinite(ref)) and np.all(np.isfinite(test))):
            paragraph(page, left, y, "No hue-bin graphic: no reference illuminant.", sheet.right - left, size=7, color=MUTED)
            return y + height + 2
        side = min(height, 46.0)
        axes.graphic.ax.set_visible(True)
        axes.graphic.ax.set_position(page.box(left, y, side, side))
        axes.graphic.update(ref, test)
        bars_left = left + side + 11
        panel_h = (height - 13) / 3
        for k, (bar, key) in enumerate(zip(axes.bars, _BIN_KEYS)):
            bar.ax.set_visible(True)
            bar.ax.set_position(page.box(bars_left, y + 1.5 + k * (panel_h + 2.6), sheet.right - bars_left, panel_h))
            bar.update([np.nan if v is None else v for v in (record.get(key) or [None] * 16)])
        paragraph(page, left, y + side + 1, HUE_NOTE, bars_left - left - 11, size=5.4, color=MUTED)
        return y + height + 2

    def _spectrum(self, page, sheet, axes, batch, i, record, reference, y):
        y += heading(page, sheet.left, y, "Spectrum", sheet.width)
        table_w = 50.0
        note_h = line_mm(5.8) * 2 + 1
        height = min(sheet.bottom - y - note_h, SPECTRUM_MAX_MM)
        ax = axes.spectrum.ax
        ax.set_visible(True)
        ax.set_position(page.box(sheet.left + 9, y + 1, sheet.width - table_w - 14, height - 9))
        reference = reference if np.all(np.isfinite(reference)) else None
        axes.spectrum.update(batch.values[i], reference=reference, measured_range_nm=batch.measured_range_nm[i])
        columns = [Column("α-opic\n(CIE S 026)", 19, "left"), Column("ELR\nmW/lm", 16, "right"),
                   Column("DER\n(D65)", 15, "right")]
        rows = [[name.replace("_", "-"), quote(record, f"{name}_elr_mW_per_lm"), quote(record, f"{name}_der")]
                for name in ALPHA_OPIC]
        Table(columns, rows, size=6.2).draw(page, sheet.right - table_w, y + 1)
        paragraph(page, sheet.left, y + height + 1, SPECTRUM_NOTE, sheet.width, size=5.8, color=MUTED)


PAGES = LampPages()
