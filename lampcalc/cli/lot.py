"""``lampcalc lot``: many samples of one product, summarised; colour over angle; claims on a lot."""

import math
import sys
from pathlib import Path

import click

from ..io.formats import SPECTRUM_SUFFIXES
from ..report.caution import CAUTION
from .common import (
    Failure,
    collect_files,
    fail_on_input_errors,
    rate_batches,
    read_report_options,
    read_sets,
    read_some,
    report_options,
    set_options,
    spectrum_options,
)
from .outputs import prepare_outputs, writable, write_documents
from .uncertainty import uncertainty_option


def _centre(centre_cct, claims):
    """The nominal CCT of the lot's centre: --centre-cct, else the claims file's, else None."""
    claimed = claims.nominal_cct_K if claims is not None and math.isfinite(claims.nominal_cct_K) else None
    if centre_cct is not None and claimed is not None and centre_cct != claimed:
        raise Failure(f"--centre-cct {centre_cct:g} K and the claims file's nominal_cct_K {claimed:g} K differ; give one")
    return centre_cct if centre_cct is not None else claimed


def figures_folder(folder):
    """The folder of ``--figures``, created and shown writable before the work."""
    return writable(Path(folder) / "figure.png", "--figures").parent


def write_lot_figures(folder, lot, angles):
    """The lot's diagram and histograms, or for one source over angle the figure of colour over angle."""
    from ..plots.angles import angle_figure
    from ..plots.lot import lot_diagram_figure, lot_histograms_figure
    from ..plots.style import figure_style, save_figure

    folder = Path(folder)
    folder.mkdir(parents=True, exist_ok=True)
    if angles is None:
        jobs = [("lot_locus.png", lot_diagram_figure, lot), ("lot_histograms.png", lot_histograms_figure, lot)]
    else:
        jobs = [("colour_over_angle.png", angle_figure, angles)]
    with figure_style():
        for name, make, data in jobs:
            save_figure(make(data), folder / name)
            click.echo(f"wrote {folder / name}", err=True)


def lot_and_write(files, *, claims_path=None, centre_cct=None, steps="ellipse", sets=None, centre="ansi", limit=None,
                  outputs=None, report_options=None, figures_dir=None, uncertainty=None, **reading):
    """Read, rate, summarise, check, print and write. Returns the exit status (0, 1 or 2).

    ``steps``: "ellipse", "circle" or a user's EllipseSet; ``sets``: (bin set, ellipse set)
    the samples are rated with (:func:`~lampcalc.cli.common.read_sets`); ``outputs``: from
    :func:`~lampcalc.cli.outputs.prepare_outputs` (json, csv, xlsx, report), written together;
    ``uncertainty``: a measurement-model file; the lot's statistics then gain the uncertainty the
    measurement adds to them (lampcalc.verdicts.lot_uncertainty).
    """
    from ..verdicts.angles import angles_of, colour_over_angle
    from ..verdicts.lot import lot_statistics
    from ..verdicts.lot_claims import check_lot_claims, read_lot_claims
    from .lot_printouts import angle_text, lot_claims_text, lot_text, statistics_table
    from .set_outputs import json_text, lot_csv, lot_document, lot_sheets
    from .uncertainty import load_model, lot_uncertainty_text, rate_with_model

    claims = read_lot_claims(claims_path) if claims_path else None
    nominal = _centre(centre_cct, claims)
    model = load_model(uncertainty)
    batches, errors = read_some(files, as_read=model is not None, **reading)
    claimed = None if nominal is None else {name.casefold(): nominal for b in batches for name in b.names}
    if model is None:
        ratings = rate_batches(batches, claimed, sets)
    else:
        from ..verdicts.lot_uncertainty import KEPT

        ratings = rate_with_model(batches, model, reading.get("interpolation"), claimed, sets, keep=KEPT)
    lot = lot_statistics(ratings, nominal_cct_K=nominal, steps=steps, centre=centre)
    if model is not None:
        from ..verdicts.lot_uncertainty import lot_uncertainty

        lot = lot_uncertainty(lot, ratings, steps=steps, centre=centre)
    with_angle = sum(math.isfinite(a) for a in angles_of(ratings))
    if limit is not None and with_angle < len(ratings):
        raise Failure(f"--limit-delta-uv-prime needs an angle for every spectrum; {len(ratings) - with_angle} of "
                      f"{len(ratings)} have none (angle_deg in the file)")
    angles = colour_over_angle(ratings, limit_delta_uv_prime=limit) if with_angle == len(ratings) else None
    verdicts = check_lot_claims(claims, lot) if claims else None
    click.echo(lot_text(lot, over_angle=angles is not None) + "\n")
    click.echo(statistics_table(lot))
    if model is not None:
        click.echo("\n" + lot_uncertainty_text(lot))
    if 0 < with_angle < len(ratings):
        click.echo(f"\n{len(ratings) - with_angle} of {len(ratings)} spectra carry no angle: no colour over angle")
    if angles is not None:
        click.echo("\n" + angle_text(angles))
    if verdicts is not None:
        click.echo("\n" + lot_claims_text(verdicts))
    # One source over angle is no lot: its report shows the lot's pages only for claims made on it.
    shown_lot = lot if angles is None or verdicts is not None else None
    title = "Colour over angle" if angles is not None else "Lot review"
    write_documents(
        outputs or {}, json=lambda: json_text(lot_document(lot, angles, verdicts)), csv=lambda: lot_csv(lot, angles),
        sheets=lambda: lot_sheets(lot, angles, verdicts),
        report=lambda: {"ratings": ratings, "lot": shown_lot, "lot_verdicts": verdicts if shown_lot else None,
                        "angles": angles, "title": title, **(report_options or {})},
    )
    if figures_dir:
        write_lot_figures(figures_dir, lot, angles)
    click.echo("\n" + CAUTION)
    if errors:
        click.echo(f"lampcalc: {len(errors)} of {len(files)} spectrum files could not be read", err=True)
        return 2
    failed = (verdicts is not None and not verdicts.all_hold) or (angles is not None and angles["angle_pass"] is False)
    return 1 if failed else 0


@click.command()
@click.argument("paths", nargs=-1, required=True, type=click.Path(exists=True), metavar="SPECTRA...")
@click.option("--claims", "claims_path", type=click.Path(exists=True, dir_okay=False),
              help="TOML file of claims on the lot (docs/lots.md).")
@click.option("--centre-cct", type=click.FloatRange(2200, 6500), default=None, metavar="K",
              help="Nominal CCT whose centre the steps count from (default: the claims file's, else the ANSI "
                   "category nearest the mean point).")
@click.option("--steps", type=click.Choice(["ellipse", "circle"]), default="ellipse", show_default=True,
              help="Colour-consistency steps: IEC 60081 ellipses or CIE TN 001 u'v' circles (shipped sets; "
                   "--ellipses replaces them).")
@click.option("--centre", type=click.Choice(["ansi", "set"]), default="ansi", show_default=True,
              help="Centre of the steps: ANSI C78.377 target of the nominal CCT, or the ellipse set's own centre (IEC 60081's F2700...).")
@click.option("--limit-delta-uv-prime", "limit", type=click.FloatRange(min=0), default=None, metavar="DUV",
              help="Your limit on the largest Δu'v' from the mean point over angle (spectra with angle_deg).")
@click.option("--json", "json_out", type=click.Path(dir_okay=False), help="Write everything to this JSON file.")
@click.option("--csv", "csv_out", type=click.Path(dir_okay=False), help="Write the lot's summary as one CSV row.")
@click.option("--xlsx", "xlsx_out", type=click.Path(dir_okay=False),
              help="Write the summary, statistics, samples, claims and flags to this Excel workbook.")
@click.option("--report", "report_out", type=click.Path(dir_okay=False),
              help="Write a PDF report: the lot (or colour over angle), then every sample.")
@click.option("--figures", "figures_dir", type=click.Path(file_okay=False),
              help="Write the lot's figures (PNG) into this folder.")
@report_options
@set_options
@uncertainty_option
@spectrum_options
@fail_on_input_errors
def lot(paths, claims_path, centre_cct, steps, centre, limit, json_out, csv_out, xlsx_out, report_out, figures_dir,
        report_info, paper, recursive, bins, ellipses, uncertainty, **reading):
    """Summarise many samples of one product: statistics, colour spread, bins, claims.

    When every spectrum carries an angle of emission (angle_deg), also the colour over
    angle of one source. Exit status 0 when every claim (and the angle limit) is met, 1 when
    one is not met or not evaluated, 2 for bad input.
    """
    info = read_report_options(report_out, report_info, paper)
    sets = read_sets(bins, ellipses, steps)
    files = collect_files(paths, recursive)
    if not files:
        raise Failure("no spectrum files found (" + ", ".join(SPECTRUM_SUFFIXES) + ")")
    inputs = [*files, *(p for p in (claims_path, bins, ellipses, uncertainty) if p)]
    outputs = prepare_outputs(inputs, json=json_out, csv=csv_out, xlsx=xlsx_out, report=report_out)
    folder = figures_folder(figures_dir) if figures_dir else None
    sys.exit(lot_and_write(files, claims_path=claims_path, centre_cct=centre_cct, steps=sets[1] if ellipses else steps,
                           sets=sets, centre=centre, limit=limit, outputs=outputs, figures_dir=folder,
                           report_options={"report_info": info, "paper": paper}, uncertainty=uncertainty, **reading))
