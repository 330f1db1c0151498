"""``lampcalc demo``: rate and check the bundled demo lamps of a fictional supplier."""

import sys
from pathlib import Path

import click

from .check import check_and_write
from .common import fail_on_input_errors
from .outputs import prepare_outputs
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
    from ..io.demo_data import demo_claims, demo_files, demo_report_info
    from ..report.report_info import read_report_info

    out = Path(out_dir)
    out.mkdir(parents=True, exist_ok=True)
    files = demo_files()
    click.echo(f"Demo: {len(files)} spectrum files of a fictional supplier (lampcalc's spectra_demo/)\n")
    rate_outputs = prepare_outputs(files, json=out / "ratings.json", csv=out / "ratings.csv", xlsx=out / "ratings.xlsx")
    check_outputs = prepare_outputs(files, json=out / "checks.json", csv=out / "checks.csv", report=out / "report.pdf")
    if rate_and_write(files, outputs=rate_outputs):
        sys.exit(2)
    click.echo(f"\nChecking the supplier's claims ({demo_claims().name}):\n")
    status, ratings = check_and_write(
        files, demo_claims(), outputs=check_outputs, quiet_table=True,
        report_options={"report_info": read_report_info(demo_report_info())},
    )
    if status == 2:
        sys.exit(2)
    demo_uncertainty(out)
    demo_figures(ratings, out)
    if demo_sets(out) == 2:
        sys.exit(2)
    click.echo(f"\nResults in {out}/")


def demo_uncertainty(out):
    """One lamp's verdicts with the measurement uncertainty of the supplier's own laboratory."""
    from ..io.demo_data import demo_claims, demo_folder, demo_measurement_model, demo_report_info
    from ..report.report_info import read_report_info
    from ..verdicts.decision_rules import DecisionRule

    lamp, model = "QF-A60-3000", demo_measurement_model()
    click.echo(
        f"\nHow sure is the verdict? {lamp} as the supplier's quality-control spectrometer measures it "
        f"({model.name}), with guarded acceptance:\n"
    )
    files = [demo_folder() / "quillfen_led_range_1nm.csv"]
    outputs = prepare_outputs(files, json=out / "checks_uncertainty.json", report=out / "report_uncertainty.pdf")
    status, _ = check_and_write(
        files, demo_claims(), outputs=outputs, quiet_table=True, uncertainty=model, rule=DecisionRule("guarded"),
        lamps=(lamp,), report_options={"report_info": read_report_info(demo_report_info())},
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


def demo_sets(out):
    """A lot with its claims, one source over angle, a sample against its data sheet, each with its report.

    Returns 2 on bad input.
    """
    import dataclasses

    from ..io.demo_data import demo_folder, demo_lot_claims, demo_report_info, demo_set
    from ..report.report_info import read_report_info
    from .compare import compare_and_write
    from .lot import lot_and_write

    info = read_report_info(demo_report_info())

    def report_options(number, title):
        return {"report_info": dataclasses.replace(info, report_number=number, title=title)}

    click.echo("\nA delivery of 12 lamps QF-SPOT-3000 (spectra_demo/lot/), with the supplier's claims on it:\n")
    lot = demo_set("lot")
    outputs = prepare_outputs([*lot, demo_lot_claims()], json=out / "lot.json", csv=out / "lot.csv",
                              xlsx=out / "lot.xlsx", report=out / "lot_report.pdf")
    statuses = [lot_and_write(lot, claims_path=demo_lot_claims(), outputs=outputs, figures_dir=out / "lot",
                              report_options=report_options("QF-DEMO-002", "Quillfen Lighting: a delivery of QF-SPOT-3000"))]
    click.echo("\nOne downlight QF-DL-4000 from 0 to 80° (spectra_demo/angles/), against a limit of 0.004 Δu'v':\n")
    angles = demo_set("angles")
    outputs = prepare_outputs(angles, json=out / "angles.json", report=out / "angles_report.pdf")
    statuses.append(lot_and_write(angles, limit=0.004, outputs=outputs, figures_dir=out / "angles",
                                  report_options=report_options("QF-DEMO-003", "Quillfen Lighting: QF-DL-4000 over angle")))
    click.echo("\nA lamp QF-A60-2700-R9 from a delivery against its data-sheet spectrum (spectra_demo/datasheet/), "
               "limit 0.003 Δu'v':\n")
    folder = demo_folder() / "datasheet"
    sides = [folder / "quillfen_a60_2700_r9_datasheet.csv"], [folder / "quillfen_a60_2700_r9_sample.csv"]
    outputs = prepare_outputs(sides[0] + sides[1], json=out / "compare.json", report=out / "compare_report.pdf")
    statuses.append(compare_and_write(*sides, limit=0.003, outputs=outputs, figure_out=out / "compare_datasheet.png",
                                      report_options=report_options("QF-DEMO-004",
                                                                    "Quillfen Lighting: QF-A60-2700-R9 against its data sheet")))
    return 2 if 2 in statuses else 0
