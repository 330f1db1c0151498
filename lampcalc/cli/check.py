"""``lampcalc check``: a supplier's claims against the spectra, one verdict per claim."""

import contextlib
import sys

import click

from ..io.formats import SPECTRUM_SUFFIXES
from ..report.caution import CAUTION
from .common import Failure, collect_files, fail_on_input_errors, read_sets, set_options, spectrum_options, workers_option
from .outputs import prepare_outputs, write_outputs
from .printouts import TABLE_NOTES, legend_of, rating_table, verdict_text
from .spectra_stream import lamp_stream


def check_and_write(files, claims_path, *, outputs=None, sets=None, centre="ansi", quiet_table=False, workers=1,
                    **reading):
    """Read claims and spectra, check, print and write. Returns the exit status (0, 1 or 2) and the ratings.

    ``sets``: (bin set, ellipse set) from :func:`~lampcalc.cli.common.read_sets`; the shipped
    ones by default. Status 2 when a spectrum file could not be read or a claimed lamp has no
    spectrum (the other lamps are still checked), 1 when a claim does not hold or cannot be
    shown to.
    """
    from ..rating.streaming import join_ratings, lamp_chunks, rate_chunks
    from ..rating.tally import RunTally
    from ..verdicts.claims import check_claims, duplicate_names, read_claims

    bin_set, ellipse_set = sets or read_sets()
    claims = read_claims(claims_path)
    nominal = {}
    for claim in claims.values():
        if "nominal_cct_K" in claim.values:
            nominal[claim.lamp.casefold()] = claim.values["nominal_cct_K"]
    errors, tally, parts = [], RunTally(), []
    # The verdicts need every lamp's ratings (not their spectra, unless the report draws them).
    with lamp_stream(files, errors, **reading) as (stream, progress), \
            contextlib.closing(rate_chunks(lamp_chunks(stream), workers=workers, nominal=nominal, bin_set=bin_set,
                                           ellipse_set=ellipse_set, keep_extras="report" in (outputs or {}))) as rated:
        for part in rated:
            parts.append(part)
            tally.add(part)
            progress.rated(len(part))
    for message in errors:
        click.echo(f"lampcalc: {message}", err=True)
    if not parts:
        raise Failure("no spectrum could be read")
    ratings = join_ratings(parts)
    verdicts = check_claims(
        claims, ratings, claims_path, ellipse_set=ellipse_set, sdcm_centre=centre, bin_set=bin_set
    )
    if not quiet_table:
        click.echo(rating_table(*tally.shown(), tally.count))
        click.echo(TABLE_NOTES)
        if legend := legend_of(tally.flags.lamps, None if tally.all_shown else tally.flags.counts):
            click.echo("Flags:\n" + legend)
        click.echo()
    click.echo(verdict_text(verdicts))
    click.echo("\n" + verdicts.summary())
    write_outputs(ratings, verdicts, outputs or {})
    click.echo(CAUTION)
    duplicates = duplicate_names(tally.repeated_names())
    if duplicates:
        click.echo(f"lampcalc: note: {duplicates}", err=True)
    for lamp in verdicts.lamps:
        for c in lamp["checks"]:
            if c["criterion"] == "spectrum":
                click.echo(f"lampcalc: {claims_path}, {c['note']}", err=True)
    if errors:
        click.echo(f"lampcalc: {len(errors)} of {len(files)} spectrum files could not be read", err=True)
    if errors or verdicts.missing:
        return 2, ratings
    return (0 if verdicts.all_hold else 1), ratings


@click.command()
@click.argument("paths", nargs=-1, required=True, type=click.Path(exists=True), metavar="SPECTRA...")
@click.option(
    "--claims", "claims_path", required=True, type=click.Path(exists=True, dir_okay=False),
    help="Table of the supplier's claims (CSV, semicolons or tabs), one row per lamp (docs/claims.md).",
)
@click.option("--json", "json_out", type=click.Path(dir_okay=False), help="Write the verdicts to this JSON file.")
@click.option("--csv", "csv_out", type=click.Path(dir_okay=False), help="Write one row per check to this CSV file.")
@click.option("--xlsx", "xlsx_out", type=click.Path(dir_okay=False),
              help="Write the ratings, their flags and the verdicts to this Excel workbook.")
@click.option("--report", "report_out", type=click.Path(dir_okay=False), help="Write a PDF report with the verdicts.")
@click.option(
    "--steps", type=click.Choice(["ellipse", "circle"]), default="ellipse", show_default=True,
    help="Colour-consistency steps: IEC 60081 ellipses or CIE TN 001 u'v' circles (shipped sets; --ellipses replaces them).",
)
@click.option(
    "--centre", type=click.Choice(["ansi", "set"]), default="ansi", show_default=True,
    help="Centre of the steps: ANSI C78.377 target of the nominal CCT, or the ellipse set's own centre (IEC 60081's F2700...).",
)
@set_options
@workers_option
@spectrum_options
@fail_on_input_errors
def check(paths, claims_path, json_out, csv_out, xlsx_out, report_out, steps, centre, recursive, bins, ellipses,
          workers, **reading):
    """Check a supplier's claims against the spectra: one verdict per claim.

    Lamps are matched to claims by name, without regard to case; the claims file is never
    read as a spectrum. Exit status 0 when every claim holds, 1 when any does not (or
    cannot be shown to), 2 for bad input (also a claimed lamp with no spectrum).
    """
    files = collect_files(paths, recursive, exclude=[claims_path])
    if not files:
        raise Failure("no spectrum files found (" + ", ".join(SPECTRUM_SUFFIXES) + ")")
    outputs = prepare_outputs([*files, claims_path], json=json_out, csv=csv_out, xlsx=xlsx_out, report=report_out)
    status, _ = check_and_write(
        files, claims_path, outputs=outputs, sets=read_sets(bins, ellipses, steps), centre=centre, workers=workers,
        **reading,
    )
    sys.exit(status)
