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
    read_report_options,
    read_sets,
    report_options,
    set_options,
    spectrum_options,
)
from .outputs import prepare_outputs, write_outputs
from .printouts import TABLE_NOTES, flag_legend, rating_table
from .uncertainty import load_model, rate_with_model, uncertainty_option, uncertainty_table


def rate_and_write(files, *, outputs=None, sets=None, uncertainty=None, report_options=None, **reading):
    """Read, rate, print and write; returns the number of files that failed.

    ``outputs``: from :func:`~lampcalc.cli.outputs.prepare_outputs`; ``sets``: (bin set,
    ellipse set) from :func:`~lampcalc.cli.common.read_sets`; ``uncertainty``: a
    measurement-model file, giving every rating its uncertainty; ``report_options``: the
    report's information and paper; ``reading``: see read_files.
    """
    from ..verdicts.claims import duplicate_names

    model = load_model(uncertainty)
    batches, errors = read_files(files, as_read=model is not None, **reading)
    if batches:
        if model is None:
            ratings = rate_batches(batches, sets=sets)
        else:
            ratings = rate_with_model(batches, model, reading.get("interpolation"), sets=sets)
        click.echo(rating_table(ratings))
        click.echo(TABLE_NOTES)
        if legend := flag_legend(ratings):
            click.echo("Flags:\n" + legend)
        if model is not None:
            click.echo("\n" + uncertainty_table(ratings))
        write_outputs(ratings, None, outputs or {}, report_options)
        click.echo(CAUTION)
        duplicates = duplicate_names(ratings)
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
@spectrum_options
@fail_on_input_errors
def rate(paths, json_out, csv_out, xlsx_out, report_out, report_info, paper, recursive, bins, ellipses, uncertainty,
         **reading):
    """Rate every spectrum in the files (and with -r, folders) given.

    Text tables (one lamp per column or per row), Excel workbooks, IES TM-27-14 documents
    and lampcalc JSON (docs/spectrum-files.md). Files that cannot be read are reported at
    the end; the others are still rated. Output folders are created.
    """
    info = read_report_options(report_out, report_info, paper)
    sets = read_sets(bins, ellipses)
    files = collect_files(paths, recursive)
    if not files:
        raise Failure("no spectrum files found (" + ", ".join(SPECTRUM_SUFFIXES) + ")")
    outputs = prepare_outputs(files, json=json_out, csv=csv_out, xlsx=xlsx_out, report=report_out)
    failed = rate_and_write(files, outputs=outputs, sets=sets, uncertainty=uncertainty,
                            report_options={"report_info": info, "paper": paper}, **reading)
    if failed:
        sys.exit(2)
