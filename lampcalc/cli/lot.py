"""``lampcalc lot``: many samples of one product, summarised; colour over angle; claims on a lot."""

import math
import sys
from pathlib import Path

import click

from ..io.formats import SPECTRUM_SUFFIXES
from ..report.caution import CAUTION
from .common import Failure, collect_files, fail_on_input_errors, rate_batches, read_some, spectrum_options, write_text
from .uncertainty import uncertainty_option


def _centre(centre_cct, claims):
    """The nominal CCT of the lot's centre: --centre-cct, else the claims file's, else None."""
    claimed = claims.nominal_cct_K if claims is not None and math.isfinite(claims.nominal_cct_K) else None
    if centre_cct is not None and claimed is not None and centre_cct != claimed:
        raise Failure(f"--centre-cct {centre_cct:g} K and the claims file's nominal_cct_K {claimed:g} K differ; give one")
    return centre_cct if centre_cct is not None else claimed


def lot_document(lot, angles=None, verdicts=None):
    """The lot's JSON document: the summary, the samples, colour over angle and the claims' verdicts."""
    from ..io.serialise import plain, records

    summary = {k: v for k, v in lot.items() if k != "samples"}
    doc = {"lot": plain(summary), "samples": records(lot["samples"])}
    if angles is not None:
        doc["colour_over_angle"] = plain({k: v for k, v in angles.items() if k != "angles"})
        doc["colour_over_angle"]["angles"] = records(angles["angles"])
    if verdicts is not None:
        doc["claims"] = {"product": verdicts.product, "all_hold": verdicts.all_hold, "checks": plain(verdicts.checks)}
    return doc


def lot_csv(lot, angles=None):
    """One CSV row: the lot's summary keys, then the colour-over-angle keys."""
    from ..io.serialise import csv_text, plain

    row = {k: v for k, v in lot.items() if k != "samples"}
    if angles is not None:
        row |= {k: v for k, v in angles.items() if k != "angles"}
    return csv_text([plain(row)])


def write_lot_figures(folder, lot, angles):
    from ..plots.angles import angle_figure
    from ..plots.lot import lot_diagram_figure, lot_histograms_figure
    from ..plots.style import figure_style, save_figure

    folder = Path(folder)
    folder.mkdir(parents=True, exist_ok=True)
    jobs = [("lot_locus.png", lot_diagram_figure, lot), ("lot_histograms.png", lot_histograms_figure, lot)]
    if angles is not None:
        jobs.append(("colour_over_angle.png", angle_figure, angles))
    with figure_style():
        for name, make, data in jobs:
            save_figure(make(data), folder / name)
            click.echo(f"wrote {folder / name}", err=True)


def lot_and_write(files, *, claims_path=None, centre_cct=None, steps="ellipse", centre="ansi", limit=None,
                  json_out=None, csv_out=None, figures_dir=None, uncertainty=None, **reading):
    """Read, rate, summarise, check, print and write. Returns the exit status (0, 1 or 2).

    ``uncertainty``: a measurement-model file; the lot's statistics then gain the uncertainty the
    measurement adds to them (lampcalc.verdicts.lot_uncertainty).
    """
    import json

    from ..verdicts.angles import angles_of, colour_over_angle
    from ..verdicts.lot import lot_statistics
    from ..verdicts.lot_claims import check_lot_claims, read_lot_claims
    from .lot_printouts import angle_text, lot_claims_text, lot_text, statistics_table

    claims = read_lot_claims(claims_path) if claims_path else None
    nominal = _centre(centre_cct, claims)
    from .uncertainty import load_model, lot_uncertainty_text, rate_with_model

    model = load_model(uncertainty)
    batches, errors = read_some(files, as_read=model is not None, **reading)
    if model is None:
        ratings = rate_batches(batches)
    else:
        from ..verdicts.lot_uncertainty import KEPT

        ratings = rate_with_model(batches, model, reading.get("interpolation"), keep=KEPT)
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
    if json_out:
        write_text(json_out, json.dumps(lot_document(lot, angles, verdicts), indent=1, allow_nan=False) + "\n")
        click.echo(f"wrote {json_out}", err=True)
    if csv_out:
        write_text(csv_out, lot_csv(lot, angles))
        click.echo(f"wrote {csv_out}", err=True)
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
              help="Colour-consistency steps: IEC 60081 ellipses or CIE TN 001 u'v' circles.")
@click.option("--centre", type=click.Choice(["ansi", "set"]), default="ansi", show_default=True,
              help="Centre of the steps: ANSI C78.377 target of the nominal CCT, or the ellipse set's own centre (IEC 60081's F2700...).")
@click.option("--limit-delta-uv-prime", "limit", type=click.FloatRange(min=0), default=None, metavar="DUV",
              help="Your limit on the largest Δu'v' from the mean point over angle (spectra with angle_deg).")
@click.option("--json", "json_out", type=click.Path(dir_okay=False), help="Write everything to this JSON file.")
@click.option("--csv", "csv_out", type=click.Path(dir_okay=False), help="Write the lot's summary as one CSV row.")
@click.option("--figures", "figures_dir", type=click.Path(file_okay=False),
              help="Write the lot's figures (PNG) into this folder.")
@uncertainty_option
@spectrum_options
@fail_on_input_errors
def lot(paths, claims_path, centre_cct, steps, centre, limit, json_out, csv_out, figures_dir, recursive, uncertainty,
        **reading):
    """Summarise many samples of one product: statistics, colour spread, bins, claims.

    When every spectrum carries an angle of emission (angle_deg), also the colour over
    angle of one source. Exit status 0 when every claim (and the angle limit) holds, 1 when
    one does not or cannot be shown to, 2 for bad input.
    """
    files = collect_files(paths, recursive)
    if not files:
        raise Failure("no spectrum files found (" + ", ".join(SPECTRUM_SUFFIXES) + ")")
    sys.exit(lot_and_write(files, claims_path=claims_path, centre_cct=centre_cct, steps=steps, centre=centre,
                           limit=limit, json_out=json_out, csv_out=csv_out, figures_dir=figures_dir,
                           uncertainty=uncertainty, **reading))
