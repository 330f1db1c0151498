"""``lampcalc check``: a supplier's claims against the spectra, one verdict per claim."""

import sys

import click

from ..io.formats import SPECTRUM_SUFFIXES
from ..report.caution import CAUTION
from .common import (
    Failure,
    collect_files,
    fail_on_input_errors,
    rate_batches,
    read_some,
    spectrum_options,
    write_outputs,
)
from .printouts import TABLE_NOTES, rating_table, verdict_text
from .uncertainty import (
    decision_options,
    decision_text,
    load_model,
    rate_with_model,
    rule_from_options,
    uncertainty_option,
    uncertainty_table,
)


def check_and_write(files, claims_path, *, json_out=None, csv_out=None, report_out=None, steps="ellipse",
                    centre="ansi", quiet_table=False, uncertainty=None, rule=None, lamps=None, **reading):
    """Read claims and spectra, check, print and write. Returns the exit status (0, 1 or 2) and the ratings.

    ``uncertainty``: a measurement-model file, and ``rule`` the DecisionRule applied with it.
    ``lamps``: check only the claims of these lamps.
    """
    from ..verdicts.claim_uncertainty import ClaimDraws, judge_with_uncertainty
    from ..verdicts.claims import check_claims, read_claims
    from ..verdicts.decision_rules import DecisionRule

    model = load_model(uncertainty)
    claims = read_claims(claims_path)
    if lamps is not None:
        claims = {name: claim for name, claim in claims.items() if name in lamps}
    batches, errors = read_some(files, as_read=model is not None, **reading)
    nominal = {c.lamp: c.values["nominal_cct_K"] for c in claims.values() if "nominal_cct_K" in c.values}
    if model is None:
        ratings = rate_batches(batches, nominal)
    else:
        claim_draws = ClaimDraws(claims, sdcm_method=steps, sdcm_centre=centre)
        ratings = rate_with_model(batches, model, reading.get("interpolation"), nominal, on_draws=claim_draws)
    verdicts = check_claims(claims, ratings, claims_path, sdcm_method=steps, sdcm_centre=centre)
    if not quiet_table:
        click.echo(rating_table(ratings))
        click.echo(TABLE_NOTES + "\n")
    click.echo(verdict_text(verdicts))
    click.echo("\n" + verdicts.summary())
    if model is not None:
        rule = rule or DecisionRule()
        verdicts = judge_with_uncertainty(verdicts, claim_draws, rule)
        click.echo("\n" + uncertainty_table(ratings) + "\n\n" + decision_text(verdicts, rule))
    write_outputs(ratings, verdicts, json_out, csv_out, report_out)
    click.echo(CAUTION)
    if errors:
        click.echo(f"lampcalc: {len(errors)} of {len(files)} spectrum files could not be read", err=True)
        return 2, ratings
    return (0 if verdicts.all_hold else 1), ratings


@click.command()
@click.argument("paths", nargs=-1, required=True, type=click.Path(exists=True), metavar="SPECTRA...")
@click.option(
    "--claims", "claims_path", required=True, type=click.Path(exists=True, dir_okay=False),
    help="CSV of the supplier's claims, one row per lamp (docs/claims.md).",
)
@click.option("--json", "json_out", type=click.Path(dir_okay=False), help="Write the verdicts to this JSON file.")
@click.option("--csv", "csv_out", type=click.Path(dir_okay=False), help="Write one row per check to this CSV file.")
@click.option("--report", "report_out", type=click.Path(dir_okay=False), help="Write a PDF report with the verdicts.")
@click.option(
    "--steps", type=click.Choice(["ellipse", "circle"]), default="ellipse", show_default=True,
    help="Colour-consistency steps: IEC 60081 ellipses or CIE TN 001 u'v' circles.",
)
@click.option(
    "--centre", type=click.Choice(["ansi", "iec"]), default="ansi", show_default=True,
    help="Centre of the steps: ANSI C78.377 target of the nominal CCT, or the IEC 60081 colour centre.",
)
@uncertainty_option
@decision_options
@spectrum_options
@fail_on_input_errors
def check(paths, claims_path, json_out, csv_out, report_out, steps, centre, recursive, uncertainty, decision_rule,
          guard_band_k, **reading):
    """Check a supplier's claims against the spectra: one verdict per claim.

    Exit status 0 when every claim holds, 1 when any does not (or cannot be shown to),
    2 for bad input.
    """
    rule = rule_from_options(uncertainty, decision_rule, guard_band_k)
    files = collect_files(paths, recursive)
    if not files:
        raise Failure("no spectrum files found (" + ", ".join(SPECTRUM_SUFFIXES) + ")")
    status, _ = check_and_write(
        files, claims_path, json_out=json_out, csv_out=csv_out, report_out=report_out, steps=steps, centre=centre,
        uncertainty=uncertainty, rule=rule, **reading,
    )
    sys.exit(status)
