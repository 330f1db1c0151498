"""``lampcalc cct``: CCT and Duv of chromaticities given as options or in a CSV file."""

import sys
from pathlib import Path

import click

from .common import Failure, fail_on_input_errors, fmt


def convert_file(csv_file, observer, writer, problems, shown):
    """Stream a chromaticity CSV through the converter, with a progress bar on a terminal."""
    import os

    from ..colorimetry.locus import locate_with_flags
    from ..io.chromaticity_files import COORDINATE_COLUMNS, iter_chunks
    from ..standards.ansi_bins import nominal_cct_of

    size = os.path.getsize(csv_file)
    bar = click.progressbar(length=size, label="converting", file=sys.stderr) if sys.stderr.isatty() else None
    done = 0
    for header, kind, rows, coords, bad, fraction in iter_chunks(csv_file):
        c, d, flags = locate_with_flags(coords, COORDINATE_COLUMNS[kind], observer)
        nominal = nominal_cct_of(coords, COORDINATE_COLUMNS[kind], observer)
        problems += bad
        if writer:
            writer.write(header, rows, c, d, nominal, flags)
        else:
            shown += [(", ".join(r), ci, di, ni, f) for r, ci, di, ni, f in zip(rows, c, d, nominal, flags)]
        if bar:
            bar.update(int(fraction * size) - done)
            done = int(fraction * size)
    if bar:
        bar.render_finish()


@click.command()
@click.argument("csv_file", required=False, type=click.Path(exists=True, dir_okay=False), metavar="[FILE.csv]")
@click.option("--xy", "xy", type=(float, float), multiple=True, metavar="X Y", help="CIE 1931 x, y (repeatable).")
@click.option("--uv", "uv", type=(float, float), multiple=True, metavar="U V", help="CIE 1960 u, v (repeatable).")
@click.option(
    "--upvp", "upvp", type=(float, float), multiple=True, metavar="U' V'", help="CIE 1976 u', v' (repeatable)."
)
@click.option(
    "--csv", "csv_out", type=click.Path(dir_okay=False), help="Write the rows with cct_K, duv, ansi_nominal_cct_K, flag to CSV."
)
@click.option(
    "--json", "json_out", type=click.Path(dir_okay=False),
    help="Write the rows with cct_K, duv, ansi_nominal_cct_K, flag to JSON.",
)
@click.option(
    "--observer",
    type=click.Choice(["1931_2deg", "1964_10deg"]),
    default="1931_2deg",
    show_default=True,
    help="Observer of the Planckian locus.",
)
@fail_on_input_errors
def cct(csv_file, xy, uv, upvp, csv_out, json_out, observer):
    """CCT and Duv of chromaticities: given as options, or a CSV FILE with columns x,y or u,v
    or u_prime,v_prime.

    CCT is the temperature of the nearest point of the Planckian locus in CIE 1960 u, v
    (CIE 015:2018); Duv is the distance, positive above the locus. Outside 1000-100000 K
    there is no CCT; beyond |Duv| = 0.05 it is flagged.
    """
    import contextlib

    from ..colorimetry.locus import locate_with_flags
    from ..io.chromaticity_files import COORDINATE_COLUMNS, open_rows
    from ..standards.ansi_bins import nominal_cct_of

    if csv_out and json_out:
        raise Failure("choose one of --csv and --json")
    if csv_file and (xy or uv or upvp):
        raise Failure("give either a FILE or --xy/--uv/--upvp points, not both")
    if not csv_file and not (xy or uv or upvp):
        raise Failure("nothing to convert: give a FILE.csv or points with --xy, --uv or --upvp")
    out_path, form = (csv_out, "csv") if csv_out else (json_out, "json") if json_out else (None, None)
    if out_path:
        from .outputs import writable

        if csv_file and Path(out_path).resolve() == Path(csv_file).resolve():
            raise Failure(f"{out_path}: is the input file; choose another name for --{form}")
        writable(out_path, f"--{form}")
    problems, shown = [], []
    with open_rows(out_path, form) if out_path else contextlib.nullcontext() as writer:
        if csv_file:
            convert_file(csv_file, observer, writer, problems, shown)
        else:
            import numpy as np

            for option, values in (("x,y", xy), ("u,v", uv), ("u_prime,v_prime", upvp)):
                if not values:
                    continue
                kind = tuple(option.split(","))
                coords = np.array(values, dtype=float)
                c, d, flags = locate_with_flags(coords, COORDINATE_COLUMNS[kind], observer)
                nominal = nominal_cct_of(coords, COORDINATE_COLUMNS[kind], observer)
                if writer:
                    writer.write(list(kind), [[repr(a), repr(b)] for a, b in values], c, d, nominal, flags)
                label = option.replace("_prime", "'")
                shown += [
                    (f"{label} = {a:g}, {b:g}", ci, di, ni, f) for (a, b), ci, di, ni, f in zip(values, c, d, nominal, flags)
                ]
    if writer:
        click.echo(f"wrote {writer.count} rows to {out_path}", err=True)
    if shown:
        from .text_table import format_table

        rows = [[p, fmt(c, ".2f"), fmt(d, "+.6f"), fmt(n, ".0f"), f or "-"] for p, c, d, n, f in shown]
        click.echo(format_table(["input", "CCT K", "Duv", "ANSI", "flag"], rows, "lrrrl"))
        click.echo(
            "ANSI: the ANSI C78.377-2017 nominal CCT category whose published quadrangle holds the point "
            "('-': in none; the categories are defined for the CIE 1931 2 deg observer only)."
        )
        raised = sorted({flag for *_, f in shown for flag in f.split(";") if flag})
        if raised:
            from ..rating.flags import explain

            click.echo("Flags:\n" + "\n".join(f"  {flag}: {explain(flag)}" for flag in raised))
    for message in problems:
        click.echo(f"lampcalc: {message}", err=True)
    if problems:
        click.echo(f"lampcalc: {len(problems)} rows could not be read; the others were converted", err=True)
        sys.exit(2)
