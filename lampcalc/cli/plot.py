"""``lampcalc plot``: one figure of the lamps (locus, spectrum, efficacy, hue)."""

import sys
from pathlib import Path

import click

from .common import (
    Failure,
    collect_files,
    fail_on_input_errors,
    rate_batches,
    read_some,
    spectrum_options,
)
from .outputs import writable


@click.command()
@click.argument("kind", type=click.Choice(["locus", "spectrum", "efficacy", "hue"]))
@click.argument("paths", nargs=-1, required=True, type=click.Path(exists=True), metavar="SPECTRA...")
@click.option("-o", "--output", "out", required=True, type=click.Path(dir_okay=False),
              help="Figure file: .png, .svg or .pdf.")
@click.option("--lamp", "lamps", multiple=True, metavar="NAME", help="Lamp(s) to draw (repeatable; default all, or the first).")
@click.option("--diagram", type=click.Choice(["xy", "upvp", "uv"]), default="xy", show_default=True,
              help="Chromaticity diagram: CIE 1931 x,y; CIE 1976 u',v'; CIE 1960 u,v.")
@click.option("--zoom", is_flag=True, help="Locus: the white region only.")
@click.option("--duv-span", type=click.FloatRange(0.001, 0.1), default=0.02, show_default=True,
              help="Locus: isotemperature lines from -SPAN to +SPAN in Duv.")
@click.option("--ellipses-around", "nominal", type=float, default=None, metavar="NOMINAL_K",
              help="Locus: colour-consistency ellipses (1-7 steps) around this nominal CCT's centre.")
@spectrum_options
@fail_on_input_errors
def plot(kind, paths, out, lamps, diagram, zoom, duv_span, nominal, recursive, **reading):
    """Draw a figure of the lamps: locus, spectrum, efficacy or hue (TM-30 bins)."""
    from ..plots.figures import FIGURES
    from ..plots.style import figure_style, save_figure

    files = collect_files(paths, recursive)
    if Path(out).resolve() in {f.resolve() for f in files}:
        raise Failure(f"{out}: is one of the input files; choose another name for -o")
    writable(out, "-o")
    batches, errors = read_some(files, **reading)
    ratings = rate_batches(batches)
    options = {"locus": {"space": diagram, "zoom": zoom, "duv_span": duv_span, "nominal_cct_K": nominal}}.get(kind, {})
    if kind in ("spectrum", "hue") and len(lamps) != 1 and len(ratings) > 1:
        click.echo(f"drawing {lamps[0] if lamps else ratings['name'][0]}; choose another with --lamp NAME", err=True)
    with figure_style():
        fig = FIGURES[kind](ratings, lamps, **options)
        save_figure(fig, out)
    click.echo(f"wrote {out}", err=True)
    if errors:
        sys.exit(2)
