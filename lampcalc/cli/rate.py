"""``lampcalc rate``: rate every spectrum in the files given."""

import contextlib
import sys

import click

from ..io.formats import SPECTRUM_SUFFIXES
from ..report.caution import CAUTION
from .common import Failure, collect_files, fail_on_input_errors, read_sets, set_options, spectrum_options, workers_option
from .outputs import prepare_outputs, streamed_outputs
from .printouts import TABLE_NOTES, legend_of, rating_table
from .spectra_stream import lamp_stream


def rate_and_write(files, *, outputs=None, sets=None, workers=1, **reading):
    """Read, rate and write in chunks, then print; returns the number of files that failed.

    ``outputs``: from :func:`~lampcalc.cli.outputs.prepare_outputs`; ``sets``: (bin set,
    ellipse set) from :func:`~lampcalc.cli.common.read_sets`; ``workers``: local processes
    that rate chunks side by side; ``reading``: see
    :func:`~lampcalc.cli.spectra_stream.spectra_stream`.
    """
    from ..rating.streaming import lamp_chunks, rate_chunks
    from ..rating.tally import RunTally
    from ..verdicts.claims import duplicate_names

    outputs = outputs or {}
    bin_set, ellipse_set = sets or (None, None)
    errors, tally = [], RunTally()
    with streamed_outputs(outputs) as sink, lamp_stream(files, errors, **reading) as (stream, progress), \
            contextlib.closing(rate_chunks(lamp_chunks(stream), workers=workers, bin_set=bin_set,
                                           ellipse_set=ellipse_set, keep_extras="report" in outputs)) as rated:
        for ratings in rated:  # closed on the way out: worker processes stop with the run
            sink.write(ratings)
            tally.add(ratings)
            progress.rated(len(ratings))
    if tally.count:
        click.echo(rating_table(*tally.shown(), tally.count))
        if not tally.all_shown and not {"json", "csv", "xlsx"} & set(outputs):
            click.echo("(write every lamp's ratings with --json, --csv or --xlsx)")
        click.echo(TABLE_NOTES)
        if legend := legend_of(tally.flags.lamps, None if tally.all_shown else tally.flags.counts):
            click.echo("Flags:\n" + legend)
        click.echo(CAUTION)
        duplicates = duplicate_names(tally.repeated_names())
        if duplicates:
            click.echo(f"lampcalc: note: {duplicates}", err=True)
    for message in errors:
        click.echo(f"lampcalc: {message}", err=True)
    if errors:
        click.echo(f"lampcalc: {len(errors)} of {len(files)} files could not be rated", err=True)
    return len(errors)


@click.command()
@click.argument("paths", nargs=-1, required=True, type=click.Path(exists=True), metavar="PATH...")
@click.option("--json", "json_out", type=click.Path(dir_okay=False), help="Write every rating to this JSON file.")
@click.option("--csv", "csv_out", type=click.Path(dir_okay=False), help="Write every rating to this CSV file.")
@click.option("--xlsx", "xlsx_out", type=click.Path(dir_okay=False),
              help="Write every rating to this Excel workbook (lists in columns of their own).")
@click.option("--report", "report_out", type=click.Path(dir_okay=False), help="Write a PDF report of every lamp.")
@set_options
@workers_option
@spectrum_options
@fail_on_input_errors
def rate(paths, json_out, csv_out, xlsx_out, report_out, recursive, bins, ellipses, workers, **reading):
    """Rate every spectrum in the files (and with -r, folders) given.

    Text tables (one lamp per column or per row), Excel workbooks, IES TM-27-14 documents
    and lampcalc JSON (docs/spectrum-files.md). Files that cannot be read are reported at
    the end; the others are still rated. Any number of lamps: they are read, rated and
    written in chunks (docs/scale.md). Output folders are created.
    """
    sets = read_sets(bins, ellipses)
    files = collect_files(paths, recursive)
    if not files:
        raise Failure("no spectrum files found (" + ", ".join(SPECTRUM_SUFFIXES) + ")")
    outputs = prepare_outputs(files, json=json_out, csv=csv_out, xlsx=xlsx_out, report=report_out)
    failed = rate_and_write(files, outputs=outputs, sets=sets, workers=workers, **reading)
    if failed:
        sys.exit(2)
