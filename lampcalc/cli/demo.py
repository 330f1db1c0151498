"""``lampcalc demo``: rate and check the bundled demo lamps of a fictional supplier."""

import sys
from pathlib import Path

import click

from .check import check_and_write
from .common import fail_on_input_errors
from .rate import rate_and_write


@click.command()
@click.option(
    "--out",
    "out_dir",
    type=click.Path(file_okay=False),
    default="lampcalc-demo",
    show_default=True,
    help="Folder for the demo's output.",
)
@fail_on_input_errors
def demo(out_dir):
    """Rate and check the bundled demo lamps of a fictional supplier and write the results.

    The supplier, Quillfen Lighting, and its lamps are invented; their spectra are made
    from physical models. Some of its claims are false on purpose.
    """
    from ..io.demo_data import demo_claims, demo_files

    out = Path(out_dir)
    out.mkdir(parents=True, exist_ok=True)
    files = demo_files()
    click.echo(f"Demo: {len(files)} spectrum files of a fictional supplier (lampcalc's spectra_demo/)\n")
    if rate_and_write(files, json_out=out / "ratings.json", csv_out=out / "ratings.csv"):
        sys.exit(2)
    click.echo(f"\nChecking the supplier's claims ({demo_claims().name}):\n")
    status, ratings = check_and_write(
        files, demo_claims(), json_out=out / "checks.json", csv_out=out / "checks.csv",
        report_out=out / "report.pdf", quiet_table=True,
    )
    if status == 2:
        sys.exit(2)
    demo_uncertainty(out)
    demo_figures(ratings, out)
    click.echo(f"\nResults in {out}/")


def demo_uncertainty(out):
    """One lamp's verdicts with the measurement uncertainty of the supplier's own laboratory."""
    from ..io.demo_data import demo_claims, demo_folder, demo_measurement_model
    from ..verdicts.decision_rules import DecisionRule

    lamp, model = "QF-A60-3000", demo_measurement_model()
    click.echo(
        f"\nHow sure is the verdict? {lamp} as the supplier's quality-control spectrometer measures it "
        f"({model.name}), with guarded acceptance:\n"
    )
    status, _ = check_and_write(
        [demo_folder() / "quillfen_led_range_1nm.csv"], demo_claims(), json_out=out / "checks_uncertainty.json",
        quiet_table=True, uncertainty=model, rule=DecisionRule("guarded"), lamps=(lamp,),
    )
    if status == 2:
        sys.exit(2)


def demo_figures(ratings, out):
    from ..plots.figures import FIGURES
    from ..plots.style import figure_style, save_figure

    jobs = [
        ("locus_xy.png", "locus", (), {"space": "xy"}),
        ("locus_white_upvp.png", "locus", (), {"space": "upvp", "zoom": True}),
        ("spectrum_QF-A60-3000.png", "spectrum", ("QF-A60-3000",), {}),
        ("hue_QF-RGB-5600.png", "hue", ("QF-RGB-5600",), {}),
        ("efficacy.png", "efficacy", (), {}),
    ]
    with figure_style():
        for name, kind, lamps, options in jobs:
            save_figure(FIGURES[kind](ratings, lamps, **options), out / name)
            click.echo(f"wrote {out / name}", err=True)
