"""The rating report: one PDF with a summary, a page per lamp, and the methods and cautions.

Pages, on A4 portrait:

1. Summary (one page per 28 lamps): every lamp's key numbers, the check verdict when claims
   were checked, the flags, and a white-region chromaticity diagram of all lamps.
2. One page per lamp: its numbers, a zoomed diagram with its ANSI quadrangle and
   colour-consistency ellipses, its spectrum against the reference illuminant, the TM-30
   hue-bin graphic and bars, and its check results.
3. Methods (standards and editions, observer, interpolation, Duv sign, rounding) and cautions.

So a report of n ≤ 28 lamps has n + 2 pages. The file is vector PDF with embedded TrueType
fonts (its text can be searched and read back) and no creation date, so that the same
input gives the same bytes.
"""

import math

import numpy as np

from .. import __version__
from ..plots.diagram import draw_chromaticity_diagram
from ..plots.hue import draw_hue_bars, draw_hue_graphic
from ..plots.spectrum import draw_spectrum
from ..plots.style import A4_PORTRAIT_IN, INK, LAMP, MUTED, figure_style, new_figure
from ..standards.ansi_bins import EDITION
from .caution import CAUTION

LAMPS_PER_SUMMARY_PAGE = 28

METHODS = [
    ("Grid and sums", "CIE 015:2018: 360–830 nm at 1 nm; every weighted integral is Σ S(λ)·w(λ)·Δλ. Spectra are "
     "resampled once as CIE 015 and CIE 167 prescribe (Sprague for uniform data coarser than 1 nm, linear for "
     "uneven data, finer data integrated; per lamp in the files); zero outside the measured range, never extrapolated."),
    ("Observer", "CIE 1931 2° for chromaticity, CCT, Duv and CIE 13.3; CIE 1964 10° for CIE 224 / TM-30-18."),
    ("CCT and Duv", "Exact nearest point of the Planckian locus (c2 = 1.4388e-2 m·K) in CIE 1960 (u, v); Duv is "
     "positive above the locus (towards green), as ANSI C78.377. No CCT outside 1000–100 000 K; flagged beyond "
     "|Duv| = 0.05."),
    ("Colour rendering", "CIE 13.3-1995: Ra and R1–R15 (R15: JIS Z 8726 skin tone), unrounded; valid for "
     "DC ≤ 5.4e-3. CIE tables publish Ra from Rᵢ rounded first, which can differ in the last digit."),
    ("Fidelity and gamut", "CIE 224:2017 Rf and ANSI/IES TM-30-18 Rf, Rg and 16 hue bins (CIECAM02, CAM02-UCS, "
     "99 samples); later TM-30 editions are not claimed."),
    ("Efficacy", "LER = 683·ΣV·S/ΣS over the measured part of 360–830 nm: the efficacy of the radiation, not of "
     "the lamp. Lamp efficacy = luminous flux of a spectrum in W/nm / electrical power."),
    ("Photoreceptors", "S/P with the CIE 1951 V′(λ) (K′m = 1700 lm/W); CIE S 026/E:2018 α-opic ELR and DER "
     "(D65), melanopic EDI for irradiance spectra."),
    ("Categories and steps", f"{EDITION}: Table 1 targets, the published corner table's quadrangles (2200 and 2500 K built by its "
     "construction: flag bin_corners_unconfirmed); flexible CCTs: centre-line Duv only, no quadrangle or CCT "
     "tolerance (not evaluated). "
     "Colour-consistency steps with IEC 60081 Annex D ellipse metrics (not confirmed from the published text: "
     "flag steps_metric_unconfirmed; supply them with --ellipses), "
     "from the centre of the claimed nominal CCT, else of the nearest category."),
]


def _fmt(value, spec, missing="–"):
    if value is None or (isinstance(value, float) and not math.isfinite(value)):
        return missing
    return format(value, spec)


def _summary_rows(records, verdicts):
    verdict = {v["lamp"]: v for v in verdicts.lamps} if verdicts else {}
    rows = []
    for r in records:
        v = verdict.get(r["name"])
        status = "–" if v is None else ("holds" if v["pass"] else f"{sum(c['pass'] is not True for c in v['checks'])} fail")
        r9 = r["ri"][8] if r["ri"] else None
        rows.append(
            [r["name"], _fmt(r["cct_K"], ".0f"), _fmt(r["duv"], "+.4f"), _fmt(r["ansi_nominal_cct_K"], ".0f"),
             _fmt(r["sdcm_steps"], ".1f"), _fmt(r["ra"], ".1f"), _fmt(r9, ".1f"), _fmt(r["rf"], ".1f"),
             _fmt(r["rg"], ".1f"), _fmt(r["ler_lm_per_W"], ".0f"), _fmt(r["sp_ratio"], ".2f"),
             _fmt(r["melanopic_der"], ".3f"), status]
        )
    return rows


def _table(ax, headers, rows, col_widths=None, fontsize=6.8, max_rows=None):
    """A table filling the top of ``ax``: ``max_rows`` rows (and the header) fill its height."""
    ax.set_axis_off()
    if not rows:
        return
    share = min(1.0, (len(rows) + 1) / ((max_rows or len(rows)) + 1))
    table = ax.table(cellText=rows, colLabels=headers, cellLoc="right", colLoc="right",
                     colWidths=col_widths, edges="horizontal", bbox=[0.0, 1.0 - share, 1.0, share])
    table.auto_set_font_size(False)
    table.set_fontsize(fontsize)
    for (row, col), cell in table.get_celld().items():
        cell.set_edgecolor("#cbd2d9")
        cell.set_linewidth(0.4)
        if col == 0:
            cell.set_text_props(ha="left")
            cell._loc = "left"
        if row == 0:
            cell.set_text_props(color=INK, weight="bold")


def _header(fig, title, subtitle):
    fig.text(0.06, 0.972, title, fontsize=13, color=INK, weight="bold", va="top")
    fig.text(0.06, 0.950, subtitle, fontsize=7.5, color=MUTED, va="top")
    fig.text(0.06, 0.018, CAUTION, fontsize=6.2, color=MUTED, wrap=True, va="bottom")


def _summary_page(pdf, records, verdicts, page_lamps, title, page_no, n_pages):
    fig = new_figure(A4_PORTRAIT_IN)
    fig.set_layout_engine(None)
    _header(fig, title, f"Summary {page_no}/{n_pages}: {len(records)} lamps · lampcalc {__version__}")
    headers = ["lamp", "CCT K", "Duv", "ANSI", "steps", "Ra", "R9", "Rf", "Rg", "LER", "S/P", "mel-DER", "claims"]
    ax = fig.add_axes([0.06, 0.50, 0.88, 0.43])
    widths = [0.20, 0.07, 0.08, 0.06, 0.06, 0.06, 0.06, 0.06, 0.06, 0.06, 0.06, 0.07, 0.08]
    _table(ax, headers, _summary_rows(page_lamps, verdicts), widths, max_rows=LAMPS_PER_SUMMARY_PAGE)
    # Grouped by flag, so that a flag most lamps carry is written once.
    by_flag = {}
    for r in page_lamps:
        for flag in r["flags"]:
            by_flag.setdefault(flag, []).append(r["name"])
    flagged = [f"{flag}: {'all lamps' if len(names) == len(page_lamps) else ', '.join(names)}" for flag, names in by_flag.items()]
    note = ("Flags — " + "; ".join(flagged)) if flagged else "No flags."
    fig.text(0.06, 0.485, note, fontsize=6.3, color=INK, wrap=True, va="top")
    fig.text(0.06, 0.455, "LER in lm/W over the measured part of 360–830 nm. Steps: IEC 60081 ellipse steps from the "
             "claimed nominal CCT's centre, else the nearest category's.", fontsize=6.3, color=MUTED, va="top")
    dax = fig.add_axes([0.10, 0.06, 0.82, 0.37])
    draw_chromaticity_diagram(dax, [(r["name"], (r["x"], r["y"])) for r in page_lamps], zoom=True)
    pdf.savefig(fig)


def _metric_lines(r):
    r9 = r["ri"][8] if r["ri"] else None
    lines = [
        ("x, y", f"{_fmt(r['x'], '.4f')}, {_fmt(r['y'], '.4f')}"),
        ("u′, v′", f"{_fmt(r['u_prime'], '.4f')}, {_fmt(r['v_prime'], '.4f')}"),
        ("CCT", f"{_fmt(r['cct_K'], '.0f')} K"),
        ("Duv", _fmt(r["duv"], "+.4f")),
        (EDITION, f"{_fmt(r['ansi_nominal_cct_K'], '.0f', 'no')} category"),
        ("steps", f"{_fmt(r['sdcm_steps'], '.2f')} from {_fmt(r['sdcm_centre_nominal_cct_K'], '.0f')} K"),
        ("Ra / R9", f"{_fmt(r['ra'], '.1f')} / {_fmt(r9, '.1f')}"),
        ("Rf / Rg", f"{_fmt(r['rf'], '.1f')} / {_fmt(r['rg'], '.1f')}"),
        ("LER", f"{_fmt(r['ler_lm_per_W'], '.1f')} lm/W"),
        ("lamp efficacy", f"{_fmt(r['efficacy_lm_per_W'], '.1f')} lm/W"),
        ("S/P", _fmt(r["sp_ratio"], ".2f")),
        ("mel-DER / mel-ELR", f"{_fmt(r['melanopic_der'], '.3f')} / {_fmt(r['melanopic_elr_mW_per_lm'], '.3f')} mW/lm"),
        ("measured", f"{_fmt(r['range_start_nm'], 'g')}–{_fmt(r['range_end_nm'], 'g')} nm, step {_fmt(r['step_nm'], 'g')} nm"),
        ("flags", ", ".join(r["flags"]) or "none"),
    ]
    return lines


def _lamp_page(pdf, ratings, i, verdict):
    r = ratings.records()[i]
    fig = new_figure(A4_PORTRAIT_IN)
    fig.set_layout_engine(None)
    _header(fig, r["name"], f"{r['source']} · {r['quantity']} spectrum")
    y = 0.925
    for label, text in _metric_lines(r):
        fig.text(0.06, y, label, fontsize=7, color=MUTED, va="top")
        fig.text(0.21, y, text, fontsize=7, color=INK, va="top", wrap=True)
        y -= 0.0175
    nominal = r["sdcm_centre_nominal_cct_K"]
    dax = fig.add_axes([0.53, 0.66, 0.42, 0.28])
    draw_chromaticity_diagram(dax, [(r["name"], (r["x"], r["y"]))], zoom=True, nominal_cct_K=nominal,
                              around_xy=(r["x"], r["y"]), half_width=0.03,
                              title=f"CIE 1931 (x, y); ellipses 1–7 steps around {_fmt(nominal, '.0f')} K")
    sax = fig.add_axes([0.09, 0.465, 0.86, 0.165])
    batch = ratings.extras["batch"]
    draw_spectrum(sax, batch.values[i], cct_K=r["cct_K"], name=r["name"], measured_range_nm=batch.measured_range_nm[i])
    ref, test = ratings.extras["ref_ab_bins"][i], ratings.extras["test_ab_bins"][i]
    if np.all(np.isfinite(ref)) and np.all(np.isfinite(test)):
        hax = fig.add_axes([0.06, 0.235, 0.36, 0.19])
        draw_hue_graphic(hax, ref, test)
        draw_hue_bars(fig.add_axes([0.52, 0.345, 0.43, 0.08]), fig.add_axes([0.52, 0.245, 0.43, 0.08]),
                      r["chroma_shift_hue_bins_percent"], r["hue_shift_hue_bins_rad"])
    else:
        fig.text(0.06, 0.30, "No TM-30 hue-bin graphic: no reference illuminant for this lamp.", fontsize=8, color=LAMP)
    cax = fig.add_axes([0.06, 0.05, 0.88, 0.145])
    if verdict:
        rows = [[c["criterion"], _fmt(c["claimed"], ".4g"), _fmt(c["measured"], ".4g"), _fmt(c["margin"], "+.3g"),
                 {True: "holds", False: "FAILS", None: "not shown"}[c["pass"]]] for c in verdict["checks"]]
        _table(cax, ["claim", "claimed", "measured", "margin", "result"], rows, [0.3, 0.15, 0.15, 0.15, 0.15], 6.3,
               max_rows=11)
    else:
        cax.set_axis_off()
        cax.text(0, 0.8, "No claims checked for this lamp.", fontsize=7, color=MUTED)
    pdf.savefig(fig)


def _methods_page(pdf, title):
    fig = new_figure(A4_PORTRAIT_IN)
    fig.set_layout_engine(None)
    _header(fig, "Methods", title)
    y = 0.92
    for heading, text in METHODS:
        fig.text(0.06, y, heading, fontsize=8.5, color=INK, weight="bold", va="top")
        fig.text(0.26, y, text, fontsize=7.5, color=INK, va="top", wrap=True)
        y -= 0.065
    fig.text(0.06, y - 0.01, "Cautions", fontsize=8.5, color=LAMP, weight="bold", va="top")
    fig.text(0.26, y - 0.01, CAUTION + " Photobiological safety needs an IEC 62471 assessment; emergency and task "
             "lighting decisions need the local codes and a licensed designer.", fontsize=7.5, color=INK, va="top",
             wrap=True)
    pdf.savefig(fig)


def write_report(path, ratings, verdicts=None, title="Lamp rating report", progress=None):
    """Write the PDF report for ``ratings`` (and ``verdicts`` of a claims check) to ``path``.

    Written through a temporary file and renamed, with no creation date in the metadata,
    so the same inputs give the same bytes. ``progress``, if given, is called with 1 after
    each page. Returns the number of pages.
    """
    from matplotlib.backends.backend_pdf import PdfPages

    from ..io.atomic import atomic_path

    records = ratings.records()
    verdict_of = {v["lamp"]: v for v in verdicts.lamps} if verdicts else {}
    pages = [records[k : k + LAMPS_PER_SUMMARY_PAGE] for k in range(0, len(records), LAMPS_PER_SUMMARY_PAGE)]
    metadata = {"Title": title, "Creator": f"lampcalc {__version__}", "Producer": "lampcalc", "CreationDate": None}
    with atomic_path(path) as tmp:
        with figure_style(), PdfPages(tmp, metadata=metadata) as pdf:
            step = progress or (lambda n: None)
            for k, page in enumerate(pages):
                _summary_page(pdf, records, verdicts, page, title, k + 1, len(pages))
                step(1)
            for i, r in enumerate(records):
                _lamp_page(pdf, ratings, i, verdict_of.get(r["name"]))
                step(1)
            _methods_page(pdf, title)
            step(1)
    return len(pages) + len(records) + 1
