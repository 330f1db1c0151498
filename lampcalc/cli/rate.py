"""``lampcalc rate``: rate every spectrum in the files given."""

import sys

import click

from ..io.formats import SPECTRUM_SUFFIXES
from ..report.caution import CAUTION
from .common import (
    Failure,
    collect_files,
    fail_on_input_errors,
    rate_batches,
    read_files,
    spectrum_options,
    write_outputs,
)
from .printouts import TABLE_NOTES, rating_table
from .uncertainty import load_model, rate_with_model, uncertainty_option, uncertainty_table


def rate_and_write(files, *, json_out=None, csv_out=None, report_out=None, uncertainty=None, **reading):
    """Read, rate, print and write; returns the number of files that failed. ``reading``: see read_files.

    ``uncertainty``: a measurement-model file; every rating then gets its uncertainty.
    """
    model = load_model(uncertainty)
    batches, errors = read_files(files, as_read=model is not None, **reading)
    if batches:
        if model is None:
            ratings = rate_batches(batches)
        else:
            ratings = rate_with_model(batches, model, reading.get("interpolation"))
        click.echo(rating_table(ratings))
        click.echo(TABLE_NOTES)
        if model is not None:
            click.echo("\n" + uncertainty_table(ratings))
        write_outputs(ratings, None, json_out, csv_out, report_out)
        click.echo(CAUTION)
    for message in errors:
        click.echo(f"lampcalc: {message}", err=True)
    if errors:
        click.echo(f"lampcalc: {len(errors)} of {len(files)} files could not be rated", err=True)
    return len(errors)


@click.command()
@click.argument("paths", nargs=-1, required=True, type=click.Path(exists=True), metavar="PATH...")
@click.option("--json", "json_out", type=click.Path(dir_okay=False), help="Write every rating to this JSON file.")
@click.option("--csv", "csv_out", type=click.Path(dir_okay=False), help="Write every rating to this CSV file.")
@click.option("--report", "report_out", type=click.Path(dir_okay=False), help="Write a PDF report of every lamp.")
@uncertainty_option
@spectrum_options
@fail_on_input_errors
def rate(paths, json_out, csv_out, report_out, recursive, uncertainty, **reading):
    """Rate every spectrum in the files (and with -r, folders) given.

    Each file holds a wavelength column and one column per lamp (or lampcalc JSON).
    Files that cannot be read are reported at the end; the others are still rated.
    """
    files = collect_files(paths, recursive)
    if not files:
        raise Failure("no spectrum files found (" + ", ".join(SPECTRUM_SUFFIXES) + ")")
    failed = rate_and_write(
        files, json_out=json_out, csv_out=csv_out, report_out=report_out, uncertainty=uncertainty, **reading
    )
    if failed:
        sys.exit(2)
