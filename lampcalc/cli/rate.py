"""``lampcalc rate``: rate every spectrum in the files given."""

import contextlib
import sys

import click

from ..io.formats import SPECTRUM_SUFFIXES
from ..report.caution import CAUTION
from .common import (
    Failure,
    collect_files,
    fail_on_input_errors,
    read_files,
    read_report_options,
    read_sets,
    report_options,
    set_options,
    spectrum_options,
    workers_option,
)
from .outputs import prepare_outputs, streamed_outputs, write_outputs
from .printouts import echo_ratings
from .spectra_stream import lamp_stream
from .uncertainty import load_model, rate_with_model, uncertainty_option, uncertainty_table


def _rate_streamed(files, outputs, sets, workers, report_options, reading, tally):
    """Read, rate and write in chunks; returns the messages of the files that could not be read."""
    from ..rating.streaming import lamp_chunks, rate_chunks

    bin_set, ellipse_set = sets or (None, None)
    errors = []
    with streamed_outputs(outputs, report_options) as sink, lamp_stream(files, errors, **reading) as (stream, progress), \
            contextlib.closing(rate_chunks(lamp_chunks(stream), workers=workers, bin_set=bin_set,
                                           ellipse_set=ellipse_set, keep_extras="report" in outputs)) as rated:
        for ratings in rated:  # closed on the way out: worker processes stop with the run
            sink.write(ratings)
            tally.add(ratings)
            progress.rated(len(ratings))
    return errors


def rate_and_write(files, *, outputs=None, sets=None, uncertainty=None, report_options=None, workers=1, **reading):
    """Read, rate, write and print; returns the number of files that failed.

    ``outputs``: from :func:`~lampcalc.cli.outputs.prepare_outputs`; ``sets``: (bin set,
    ellipse set) from :func:`~lampcalc.cli.common.read_sets`; ``uncertainty``: a
    measurement-model file, giving every rating its uncertainty (its Monte Carlo run reads
    and rates every lamp at once); ``report_options``: the report's information and paper;
    ``workers``: local processes that rate chunks side by side; ``reading``: see
    :func:`~lampcalc.cli.spectra_stream.spectra_stream`. Without ``uncertainty`` the lamps
    are read, rated and written in chunks (``docs/scale.md``).
    """
    from ..rating.tally import RunTally
    from ..verdicts.claims import duplicate_names

    outputs = outputs or {}
    model = load_model(uncertainty)
    tally = RunTally()
    if model is None:
        errors = _rate_streamed(files, outputs, sets, workers, report_options, reading, tally)
    else:
        batches, errors = read_files(files, as_read=True, **reading)
        if batches:
            ratings = rate_with_model(batches, model, reading.get("interpolation"), sets=sets)
            tally.add(ratings)
            write_outputs(ratings, None, outputs, report_options)
    if tally.count:
        echo_ratings(tally, outputs)
        if model is not None:
            click.echo("\n" + uncertainty_table(ratings))
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
@report_options
@set_options
@uncertainty_option
@workers_option
@spectrum_options
@fail_on_input_errors
def rate(paths, json_out, csv_out, xlsx_out, report_out, report_info, paper, recursive, bins, ellipses, uncertainty,
         workers, **reading):
    """Rate every spectrum in the files (and with -r, folders) given.

    Text tables (one lamp per column or per row), Excel workbooks, IES TM-27-14 documents
    and lampcalc JSON (docs/spectrum-files.md). Files that cannot be read are reported at
    the end; the others are still rated. Any number of lamps: they are read, rated and
    written in chunks (docs/scale.md). Output folders are created.
    """
    info = read_report_options(report_out, report_info, paper)
    sets = read_sets(bins, ellipses)
    files = collect_files(paths, recursive)
    if not files:
        raise Failure("no spectrum files found (" + ", ".join(SPECTRUM_SUFFIXES) + ")")
    outputs = prepare_outputs(files, json=json_out, csv=csv_out, xlsx=xlsx_out, report=report_out)
    failed = rate_and_write(files, outputs=outputs, sets=sets, uncertainty=uncertainty,
                            report_options={"report_info": info, "paper": paper}, workers=workers, **reading)
    if failed:
        sys.exit(2)
