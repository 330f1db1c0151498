"""``lampcalc check``: a supplier's claims against the spectra, one verdict per claim."""

import contextlib
import sys

import click

from ..io.formats import SPECTRUM_SUFFIXES
from ..report.caution import CAUTION
from .common import (
    Failure,
    collect_files,
    fail_on_input_errors,
    read_report_options,
    read_sets,
    read_some,
    report_options,
    set_options,
    spectrum_options,
    workers_option,
)
from .outputs import prepare_outputs, write_outputs
from .printouts import echo_ratings, verdict_text
from .spectra_stream import lamp_stream
from .uncertainty import (
    decision_options,
    decision_text,
    load_model,
    rate_with_model,
    rule_from_options,
    uncertainty_option,
    uncertainty_table,
)


def _rate_streamed(files, nominal, sets, workers, keep_extras, reading):
    """Every lamp's ratings, read and rated in chunks (spectra kept only with ``keep_extras``), and the errors."""
    from ..rating.streaming import join_ratings, lamp_chunks, rate_chunks

    bin_set, ellipse_set = sets
    errors, parts = [], []
    with lamp_stream(files, errors, **reading) as (stream, progress), \
            contextlib.closing(rate_chunks(lamp_chunks(stream), workers=workers, nominal=nominal, bin_set=bin_set,
                                           ellipse_set=ellipse_set, keep_extras=keep_extras)) as rated:
        for part in rated:
            parts.append(part)
            progress.rated(len(part))
    for message in errors:
        click.echo(f"lampcalc: {message}", err=True)
    if not parts:
        raise Failure("no spectrum could be read")
    return join_ratings(parts), errors


def check_and_write(files, claims_path, *, outputs=None, sets=None, centre="ansi", quiet_table=False, uncertainty=None,
                    rule=None, lamps=None, report_options=None, workers=1, **reading):
    """Read claims and spectra, check, print and write. Returns the exit status (0, 1 or 2) and the ratings.

    ``sets``: (bin set, ellipse set) from :func:`~lampcalc.cli.common.read_sets`; the shipped
    ones by default. ``uncertainty``: a measurement-model file, and ``rule`` the DecisionRule
    applied with it (simple acceptance by default). ``lamps``: check only these lamps' claims.
    Status 2 when a spectrum file could not be read or a claimed lamp has no spectrum (the
    other lamps are still checked), 1 when a claim does not hold or cannot be shown to.
    """
    from ..rating.tally import RunTally
    from ..verdicts.claim_uncertainty import ClaimDraws, judge_with_uncertainty
    from ..verdicts.claims import check_claims, duplicate_names, read_claims
    from ..verdicts.decision_rules import DecisionRule

    bin_set, ellipse_set = sets or read_sets()
    model = load_model(uncertainty)
    claims = read_claims(claims_path)
    if lamps is not None:
        claims = {name: claim for name, claim in claims.items() if name in lamps}
    nominal = {}
    for claim in claims.values():
        if "nominal_cct_K" in claim.values:
            nominal[claim.lamp.casefold()] = claim.values["nominal_cct_K"]
    options = {"ellipse_set": ellipse_set, "sdcm_centre": centre, "bin_set": bin_set}
    if model is None:
        keep = "report" in (outputs or {})
        ratings, errors = _rate_streamed(files, nominal, (bin_set, ellipse_set), workers, keep, reading)
    else:
        batches, errors = read_some(files, as_read=True, **reading)
        claim_draws = ClaimDraws(claims, **options)
        ratings = rate_with_model(
            batches, model, reading.get("interpolation"), nominal, (bin_set, ellipse_set), on_draws=claim_draws
        )
    verdicts = check_claims(claims, ratings, claims_path, **options)
    tally = RunTally()
    tally.add(ratings)
    if not quiet_table:
        echo_ratings(tally, outputs or {})
        click.echo()
    click.echo(verdict_text(verdicts, ratings))
    click.echo("\n" + verdicts.summary())
    if model is not None:
        rule = rule or DecisionRule()
        verdicts = judge_with_uncertainty(verdicts, claim_draws, rule)
        click.echo("\n" + uncertainty_table(ratings) + "\n\n" + decision_text(verdicts, rule, ratings))
    write_outputs(ratings, verdicts, outputs or {}, report_options)
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
@report_options
@set_options
@uncertainty_option
@decision_options
@workers_option
@spectrum_options
@fail_on_input_errors
def check(paths, claims_path, json_out, csv_out, xlsx_out, report_out, steps, centre, report_info, paper, recursive,
          bins, ellipses, uncertainty, decision_rule, guard_band_k, workers, **reading):
    """Check a supplier's claims against the spectra: one verdict per claim.

    Lamps are matched to claims by name, without regard to case; the claims file is never
    read as a spectrum. Exit status 0 when every claim holds, 1 when any does not (or
    cannot be shown to), 2 for bad input (also a claimed lamp with no spectrum).
    """
    info = read_report_options(report_out, report_info, paper)
    rule = rule_from_options(uncertainty, decision_rule, guard_band_k)
    files = collect_files(paths, recursive, exclude=[claims_path])
    if not files:
        raise Failure("no spectrum files found (" + ", ".join(SPECTRUM_SUFFIXES) + ")")
    outputs = prepare_outputs([*files, claims_path], json=json_out, csv=csv_out, xlsx=xlsx_out, report=report_out)
    status, _ = check_and_write(
        files, claims_path, outputs=outputs, sets=read_sets(bins, ellipses, steps), centre=centre,
        uncertainty=uncertainty, rule=rule, report_options={"report_info": info, "paper": paper}, workers=workers,
        **reading,
    )
    sys.exit(status)
