"""``lampcalc compare``: a test spectrum (or set) beside a reference: colour shift and every rating's difference."""

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
    read_some,
    report_options,
    spectrum_options,
)
from .outputs import prepare_outputs, writable, write_documents
from .uncertainty import decision_options, rule_from_options, uncertainty_option


def side_files(path, recursive, what):
    """The spectrum files of one side (a file, or with -r a folder); a Failure when there is none."""
    files = collect_files([path], recursive)
    if not files:
        raise Failure(f"{path}: no {what} spectrum files found (" + ", ".join(SPECTRUM_SUFFIXES) + ")")
    return files


def _side(files, reading, model=None, stream=0):
    batches, errors = read_some(files, as_read=model is not None, **reading)
    if model is None:
        return rate_batches(batches), errors
    from ..verdicts.comparison_uncertainty import KEPT
    from .uncertainty import rate_with_model

    return rate_with_model(batches, model, reading.get("interpolation"), keep=KEPT, stream=stream), errors


def figure_paths(path, names):
    """One figure file per pair: ``path`` itself for one pair, else ``<stem>_<test name><suffix>``."""
    path = Path(path)
    if len(names) == 1:
        return [path]
    safe = ["".join(ch if ch.isalnum() or ch in "-_." else "_" for ch in name) for name in names]
    return [path.with_name(f"{path.stem}_{s}{path.suffix}") for s in safe]


def figure_file(path):
    """The path of ``--figure``, its suffix and folder checked before the work."""
    from ..plots.style import FORMATS

    if Path(path).suffix.lower() not in FORMATS:
        raise Failure(f"{path}: --figure writes {', '.join(FORMATS)} files; give the name one of these suffixes")
    return writable(path, "--figure")


def write_comparison_figures(path, reference, test, comparison):
    from ..plots.comparison import comparison_figure
    from ..plots.style import figure_style, save_figure

    pairs = comparison["pairs"]
    with figure_style():
        for k, out in enumerate(figure_paths(path, pairs["test_name"])):
            save_figure(comparison_figure(reference, test, comparison, k), out)
            click.echo(f"wrote {out}", err=True)


def compare_and_write(reference_files, test_files, *, limit=None, outputs=None, report_options=None, figure_out=None,
                      uncertainty=None, rule=None, **reading):
    """Read and rate both sides, compare, print and write. Returns the exit status (0, 1 or 2).

    ``outputs``: from :func:`~lampcalc.cli.outputs.prepare_outputs` (json, csv, xlsx, report), written together;
    ``uncertainty``: a measurement-model file; both sides are then drawn independently and every
    difference gets its uncertainty, the limit a decision under ``rule`` (a DecisionRule).
    """
    from ..verdicts.comparison import compare_ratings
    from .compare_printouts import pair_detail, pairs_table
    from .set_outputs import comparison_csv, comparison_document, comparison_sheets, json_text

    from .uncertainty import comparison_text, load_model

    model = load_model(uncertainty)
    reference, errors = _side(reference_files, reading, model, stream=1)
    test, more = _side(test_files, reading, model, stream=2)
    errors += more
    comparison = compare_ratings(reference, test, limit_delta_uv_prime=limit)
    click.echo(pairs_table(comparison))
    if len(comparison["pairs"]["test_name"]) == 1:
        click.echo("\n" + pair_detail(comparison))
    if model is not None:
        from ..verdicts.comparison_uncertainty import comparison_uncertainty

        comparison = comparison_uncertainty(comparison, reference, test, rule)
        click.echo("\n" + comparison_text(comparison, model))
    write_documents(
        outputs or {}, json=lambda: json_text(comparison_document(comparison)), csv=lambda: comparison_csv(comparison),
        sheets=lambda: comparison_sheets(comparison),
        report=lambda: {"ratings": None, "comparison": (reference, test, comparison), "title": "Comparison of spectra",
                        **(report_options or {})},
    )
    if figure_out:
        write_comparison_figures(figure_out, reference, test, comparison)
    click.echo("\n" + CAUTION)
    if errors:
        click.echo(f"lampcalc: {len(errors)} spectrum files could not be read", err=True)
        return 2
    return 1 if any(ok is False for ok in comparison["pairs"]["pass"]) else 0


@click.command()
@click.argument("reference", type=click.Path(exists=True))
@click.argument("test", type=click.Path(exists=True))
@click.option("--limit-delta-uv-prime", "limit", type=click.FloatRange(min=0), default=None, metavar="DUV",
              help="Your limit on the colour shift Δu'v' between test and reference.")
@click.option("--json", "json_out", type=click.Path(dir_okay=False), help="Write every pair to this JSON file.")
@click.option("--csv", "csv_out", type=click.Path(dir_okay=False), help="Write one row per pair to this CSV file.")
@click.option("--xlsx", "xlsx_out", type=click.Path(dir_okay=False),
              help="Write every pair (lists in columns of their own) and the flags to this Excel workbook.")
@click.option("--report", "report_out", type=click.Path(dir_okay=False),
              help="Write a PDF report: every pair, then every lamp of both sides.")
@click.option("--figure", "figure_out", type=click.Path(dir_okay=False),
              help="Draw both spectra and their ratio (.png, .svg or .pdf; one file per pair).")
@report_options
@uncertainty_option
@decision_options
@spectrum_options
@fail_on_input_errors
def compare(reference, test, limit, json_out, csv_out, xlsx_out, report_out, figure_out, report_info, paper, recursive,
            uncertainty, decision_rule, guard_band_k, **reading):
    """Compare TEST spectra with REFERENCE spectra: colour shift Δu'v' and every rating's difference.

    REFERENCE and TEST are files (or, with -r, folders). One spectrum on each side is one
    pair; otherwise lamps are paired by name. Exit status 0 when every pair is within the
    limit (or no limit is given), 1 when one is not, 2 for bad input.
    """
    info = read_report_options(report_out, report_info, paper)
    rule = rule_from_options(uncertainty, decision_rule, guard_band_k)
    sides = side_files(reference, recursive, "reference"), side_files(test, recursive, "test")
    inputs = sides[0] + sides[1] + ([uncertainty] if uncertainty else [])
    outputs = prepare_outputs(inputs, json=json_out, csv=csv_out, xlsx=xlsx_out, report=report_out)
    figure = figure_file(figure_out) if figure_out else None
    sys.exit(compare_and_write(*sides, limit=limit, outputs=outputs, figure_out=figure, uncertainty=uncertainty,
                               rule=rule, report_options={"report_info": info, "paper": paper}, **reading))
