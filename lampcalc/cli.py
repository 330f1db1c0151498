"""The ``lampcalc`` command line: a thin layer over the library.

Only click is imported at start-up; each command imports what it needs, so that
``lampcalc --help`` answers at once. Bad input ends a command with one line on stderr
and exit status 2, never a traceback.
"""

import sys
from pathlib import Path

import click

from .caution import CAUTION

SPECTRUM_SUFFIXES = (".csv", ".tsv", ".txt", ".dat", ".json")


class Failure(click.ClickException):
    """A one-line error that ends the command with status 2."""

    exit_code = 2

    def show(self, file=None):
        click.echo(f"lampcalc: {self.format_message()}", err=True)


def _fail_on_input_errors(fn):
    """Turn an InputError raised by a command into a one-line Failure (exit status 2)."""
    import functools

    @functools.wraps(fn)
    def wrapper(*args, **kwargs):
        from .errors import InputError

        try:
            return fn(*args, **kwargs)
        except InputError as err:
            raise Failure(str(err)) from None

    return wrapper


def _progress(items, label):
    """A progress bar on a terminal, nothing when stderr is piped."""
    items = list(items)
    if sys.stderr.isatty() and len(items) > 1:
        return click.progressbar(items, label=label, file=sys.stderr)
    return _Quiet(items)


class _Quiet:
    def __init__(self, items):
        self.items = items

    def __enter__(self):
        return iter(self.items)

    def __exit__(self, *exc):
        return False


def _write(path, text):
    from .atomic import write_atomic

    try:
        write_atomic(path, text)
    except OSError as err:
        raise Failure(f"{path}: cannot write ({err.strerror or err})") from None


@click.group(context_settings={"help_option_names": ["-h", "--help"]})
@click.version_option(package_name="lampcalc")
def cli():
    """Rate lamp spectra: chromaticity, CCT/Duv, rendering, efficacy, claims.

    Start with `lampcalc demo`, or `lampcalc rate FILE...` on your own spectra.
    """


def _fmt(value, spec):
    import math

    if value is None or (isinstance(value, float) and not math.isfinite(value)):
        return "-"
    text = format(value, spec)
    return format(0.0, spec) if float(text) == 0 else text


@cli.command()
@click.argument("temperatures", nargs=-1, required=True, metavar="T_K...")
@click.option("--json", "as_json", is_flag=True, help="Print a JSON list instead of a table.")
@click.option("--spectrum", "spectrum_out", type=click.Path(dir_okay=False), help="Write the spectra to this CSV.")
@click.option(
    "--quantity",
    type=click.Choice(["radiance", "exitance", "energy-density", "photon-radiance"]),
    default="radiance",
    show_default=True,
    help="Quantity written with --spectrum.",
)
@click.option(
    "--per",
    type=click.Choice(["wavelength", "frequency"]),
    default="wavelength",
    show_default=True,
    help="Spectral density per nm or per Hz, with --spectrum.",
)
@click.option(
    "--range",
    "wl_range",
    type=(float, float, float),
    default=(360.0, 830.0, 1.0),
    show_default=True,
    metavar="START END STEP",
    help="Wavelengths of --spectrum, nm.",
)
@_fail_on_input_errors
def planck(temperatures, as_json, spectrum_out, quantity, per, wl_range):
    """Blackbody numbers for each temperature T_K (kelvin).

    Peak wavelength and frequency, total exitance, the fraction emitted in 380-780 nm,
    the luminous efficacy of the radiation over all wavelengths, and the chromaticity
    of the Planckian radiator.
    """
    import json

    import numpy as np

    from .blackbody import SPECTRUM_UNITS, blackbody_spectrum
    from .blackbody_summary import summarise_blackbody
    from .constants import C_m_per_s

    values = []
    for text in temperatures:
        try:
            values.append(float(text))
        except ValueError:
            raise Failure(f"temperature {text!r} is not a number of kelvin") from None
    for t in values:
        if not (np.isfinite(t) and t > 0):
            raise Failure(f"temperature {t:g} K: must be a finite number above 0 K")
    from .serialise import plain

    cols = summarise_blackbody(values)
    records = [{k: plain(cols[k][i]) for k in cols} for i in range(len(values))]
    if as_json:
        click.echo(json.dumps(records, indent=1))
    else:
        from .text_table import format_table

        headers = ["T K", "peak nm", "peak THz", "exitance W/m2", "in 380-780", "LER lm/W", "x", "y", "CCT K", "Duv"]
        rows = [
            [
                _fmt(r["temperature_K"], "g"),
                _fmt(r["peak_wavelength_nm"], ".1f"),
                _fmt(r["peak_frequency_THz"], ".2f"),
                _fmt(r["radiant_exitance_W_per_m2"], ".5g"),
                _fmt(r["visible_fraction"], ".4f"),
                _fmt(r["ler_lm_per_W"], ".2f"),
                _fmt(r["x"], ".5f"),
                _fmt(r["y"], ".5f"),
                _fmt(r["cct_K"], ".1f"),
                _fmt(r["duv"], ".5f"),
            ]
            for r in records
        ]
        click.echo(format_table(headers, rows, "r" * len(headers)))
        click.echo("LER over all wavelengths (Stefan-Boltzmann total); x, y with c2 = 1.4388e-2 m K (CIE 015:2018).")
        if any(r["cct_K"] is None for r in records):
            click.echo("CCT '-': the temperature is outside 1000-100000 K, where lampcalc gives no CCT.")
    if spectrum_out:
        start, end, step = wl_range
        if not (0 < start < end and step > 0):
            raise Failure(f"--range {start:g} {end:g} {step:g}: need 0 < START < END and STEP > 0")
        wl = np.arange(start, end + step / 2, step)
        q = quantity.replace("-", "_")
        axis = wl if per == "wavelength" else C_m_per_s / (wl * 1e-9)
        spectra = blackbody_spectrum(values, axis, quantity=q, per=per)
        unit = SPECTRUM_UNITS[(q, per)]
        lines = [f"# blackbody spectral {q.replace('_', ' ')} per {per}, {unit}"]
        if per == "frequency":
            lines.append("# evaluated at the frequencies c/wavelength")
        lines.append(",".join(["wavelength_nm", *(f"T_{t:g}_K" for t in values)]))
        lines += [",".join([repr(float(w)), *(repr(float(v)) for v in row)]) for w, row in zip(wl, spectra.T)]
        _write(spectrum_out, "\n".join(lines) + "\n")
        click.echo(f"wrote {spectrum_out}", err=True)


def _convert_file(cf, csv_file, observer, writer, problems, shown):
    """Stream a chromaticity CSV through the converter, with a progress bar on a terminal."""
    import os

    size = os.path.getsize(csv_file)
    bar = click.progressbar(length=size, label="converting", file=sys.stderr) if sys.stderr.isatty() else None
    done = 0
    for header, kind, rows, coords, bad, fraction in cf.iter_chunks(csv_file):
        c, d, flags = cf.convert(coords, kind, observer)
        problems += bad
        if writer:
            writer.write(header, rows, c, d, flags)
        else:
            shown += [(", ".join(r), ci, di, f) for r, ci, di, f in zip(rows, c, d, flags)]
        if bar:
            bar.update(int(fraction * size) - done)
            done = int(fraction * size)
    if bar:
        bar.render_finish()


def _collect_files(paths, recursive):
    files = []
    for p in map(Path, paths):
        if p.is_dir():
            if not recursive:
                raise Failure(f"{p}: is a folder; pass -r to read the spectrum files inside it")
            files += sorted(f for f in p.rglob("*") if f.is_file() and f.suffix.lower() in SPECTRUM_SUFFIXES)
        else:
            files.append(p)
    return files


def read_files(files, *, wavelength_unit=None, quantity=None, strict=False, interpolation="linear", watts=None):
    """Read every file onto the grid; returns ``(batches, errors)``. ``strict`` stops at the first error.

    ``watts`` is the electrical power of every lamp whose file does not give one.
    """
    from .errors import InputError
    from .spectrum_files import read_spectra

    batches, errors = [], []
    with _progress(files, "reading spectra") as bar:
        for f in bar:
            try:
                batch = read_spectra(f, wavelength_unit=wavelength_unit, quantity=quantity)
                if watts is not None:
                    batch = batch.with_electrical_power(watts)
                batches.append(batch.on_grid(interpolation))
            except InputError as err:
                if strict:
                    raise Failure(str(err)) from None
                errors.append(str(err))
    return batches, errors


def _flagged(value, spec, doubtful):
    """A number, in parentheses when a flag says it is not to be used as an ordinary value."""
    text = _fmt(value, spec)
    return f"({text})" if doubtful and text != "-" else text


def _read_some(files, **reading):
    """read_files, with each error reported at once; a Failure when no file could be read."""
    batches, errors = read_files(files, **reading)
    for message in errors:
        click.echo(f"lampcalc: {message}", err=True)
    if not batches:
        raise Failure("no spectrum could be read")
    return batches, errors


def _rating_table(ratings):
    from .text_table import format_table

    rows = []
    for r in ratings.records():
        flags = set(r["flags"])
        cri_doubt = "cri_outside_validity" in flags
        fid_doubt = "duv_beyond_0.05" in flags
        r9 = r["ri"][8] if r["ri"] else None
        rows.append(
            [
                r["name"],
                _fmt(r["cct_K"], ".0f"),
                _fmt(r["duv"], "+.4f"),
                _fmt(r["ansi_nominal_cct_K"], ".0f"),
                _fmt(r["sdcm_steps"], ".1f"),
                _flagged(r["ra"], ".1f", cri_doubt),
                _flagged(r9, ".1f", cri_doubt),
                _flagged(r["rf"], ".1f", fid_doubt),
                _flagged(r["rg"], ".1f", fid_doubt),
                _fmt(r["ler_lm_per_W"], ".1f"),
                _fmt(r["efficacy_lm_per_W"], ".1f"),
                _fmt(r["sp_ratio"], ".2f"),
                _fmt(r["melanopic_der"], ".3f"),
                ", ".join(r["flags"]) or "-",
            ]
        )
    headers = ["lamp", "CCT K", "Duv", "ANSI", "steps", "Ra", "R9", "Rf", "Rg", "LER lm/W", "lamp lm/W", "S/P", "mel-DER", "flags"]
    return format_table(headers, rows, "lrrrrrrrrrrrrl")


_TABLE_NOTES = (
    "ANSI: the ANSI C78.377-2017 nominal CCT category the lamp is in; steps: IEC 60081 ellipse steps from the\n"
    "centre of the claimed nominal CCT, else of the nearest category. LER: efficacy of the radiation over the\n"
    "measured part of 360-830 nm; lamp lm/W: lamp efficacy (needs W/nm and the electrical power).\n"
    "Ra, R9: CIE 13.3-1995, unrounded. Rf, Rg: CIE 224:2017 / ANSI/IES TM-30-18. "
    "(values): computed outside the method's validity; '-': not computable."
)


def _write_report(path, ratings, verdicts=None):
    from .report import write_report

    n_pages = len(ratings) + 2
    if sys.stderr.isatty():
        with click.progressbar(length=n_pages, label="writing report", file=sys.stderr) as bar:
            pages = write_report(path, ratings, verdicts, progress=bar.update)
    else:
        pages = write_report(path, ratings, verdicts)
    click.echo(f"wrote {path} ({pages} pages)", err=True)


def _write_outputs(ratings, verdicts, json_out, csv_out, report_out):
    """The files a command was asked for: JSON and CSV of the verdicts (else the ratings), the report."""
    table = verdicts or ratings
    for path, text in ((json_out, table.to_json), (csv_out, table.to_csv)):
        if path:
            _write(path, text())
            click.echo(f"wrote {path}", err=True)
    if report_out:
        _write_report(report_out, ratings, verdicts)


def rate_and_write(files, *, json_out=None, csv_out=None, report_out=None, **reading):
    """Read, rate, print and write; returns the number of files that failed. ``reading``: see read_files."""
    batches, errors = read_files(files, **reading)
    if batches:
        ratings = _rate(batches)
        click.echo(_rating_table(ratings))
        click.echo(_TABLE_NOTES)
        _write_outputs(ratings, None, json_out, csv_out, report_out)
        click.echo(CAUTION)
    for message in errors:
        click.echo(f"lampcalc: {message}", err=True)
    if errors:
        click.echo(f"lampcalc: {len(errors)} of {len(files)} files could not be rated", err=True)
    return len(errors)


def _rate(batches, nominal=None):
    from .rating import rate_spectra
    from .spectra import SpectralBatch

    batch = SpectralBatch.concatenate(batches)
    if batch.n_lamps > 200 and sys.stderr.isatty():
        click.echo(f"rating {batch.n_lamps} lamps ...", err=True)
    names = batch.names
    nominal_cct = None if nominal is None else [nominal.get(name, float("nan")) for name in names]
    return rate_spectra(batch, nominal_cct_K=nominal_cct)


def _spectrum_options(fn):
    """Options shared by the commands that read spectrum files."""
    for option in reversed(
        [
            click.option("-r", "--recursive", is_flag=True, help="Read the spectrum files in folders and their subfolders."),
            click.option("--strict", is_flag=True, help="Stop at the first file that cannot be read."),
            click.option(
                "--wavelength-unit",
                type=click.Choice(["nm", "um"]),
                default=None,
                help="Unit of the wavelength column (default: what the file says, else nm).",
            ),
            click.option(
                "--quantity",
                type=click.Choice(["relative", "flux", "irradiance", "radiance"]),
                default=None,
                help="Radiometric quantity of the spectra (default: what the file says, else relative).",
            ),
            click.option(
                "--watts",
                type=click.FloatRange(min=0, min_open=True),
                default=None,
                metavar="W",
                help="Electrical power of every lamp whose file gives none, W (for lamp efficacy).",
            ),
            click.option(
                "--interpolation",
                type=click.Choice(["linear", "sprague"]),
                default="linear",
                show_default=True,
                help="Resampling to 1 nm: linear (measured spectra) or Sprague (uniform, smooth data; CIE 167).",
            ),
        ]
    ):
        fn = option(fn)
    return fn


@cli.command()
@click.argument("paths", nargs=-1, required=True, type=click.Path(exists=True), metavar="PATH...")
@click.option("--json", "json_out", type=click.Path(dir_okay=False), help="Write every rating to this JSON file.")
@click.option("--csv", "csv_out", type=click.Path(dir_okay=False), help="Write every rating to this CSV file.")
@click.option("--report", "report_out", type=click.Path(dir_okay=False), help="Write a PDF report of every lamp.")
@_spectrum_options
@_fail_on_input_errors
def rate(paths, json_out, csv_out, report_out, recursive, **reading):
    """Rate every spectrum in the files (and with -r, folders) given.

    Each file holds a wavelength column and one column per lamp (or lampcalc JSON).
    Files that cannot be read are reported at the end; the others are still rated.
    """
    files = _collect_files(paths, recursive)
    if not files:
        raise Failure("no spectrum files found (" + ", ".join(SPECTRUM_SUFFIXES) + ")")
    failed = rate_and_write(files, json_out=json_out, csv_out=csv_out, report_out=report_out, **reading)
    if failed:
        sys.exit(2)


@cli.command()
@click.argument("csv_file", required=False, type=click.Path(exists=True, dir_okay=False), metavar="[FILE.csv]")
@click.option("--xy", "xy", type=(float, float), multiple=True, metavar="X Y", help="CIE 1931 x, y (repeatable).")
@click.option("--uv", "uv", type=(float, float), multiple=True, metavar="U V", help="CIE 1960 u, v (repeatable).")
@click.option(
    "--upvp", "upvp", type=(float, float), multiple=True, metavar="U' V'", help="CIE 1976 u', v' (repeatable)."
)
@click.option("--csv", "csv_out", type=click.Path(dir_okay=False), help="Write the rows with cct_K, duv, flag to CSV.")
@click.option("--json", "json_out", type=click.Path(dir_okay=False), help="Write the rows with cct_K, duv, flag to JSON.")
@click.option(
    "--observer",
    type=click.Choice(["1931_2deg", "1964_10deg"]),
    default="1931_2deg",
    show_default=True,
    help="Observer of the Planckian locus.",
)
@_fail_on_input_errors
def cct(csv_file, xy, uv, upvp, csv_out, json_out, observer):
    """CCT and Duv of chromaticities: given as options, or a CSV FILE with columns x,y or u,v
    or u_prime,v_prime.

    CCT is the temperature of the nearest point of the Planckian locus in CIE 1960 u, v
    (CIE 015:2018); Duv is the distance, positive above the locus. Outside 1000-100000 K
    there is no CCT; beyond |Duv| = 0.05 it is flagged.
    """
    import contextlib

    from . import chromaticity_files as cf

    if csv_out and json_out:
        raise Failure("choose one of --csv and --json")
    if csv_file and (xy or uv or upvp):
        raise Failure("give either a FILE or --xy/--uv/--upvp points, not both")
    if not csv_file and not (xy or uv or upvp):
        raise Failure("nothing to convert: give a FILE.csv or points with --xy, --uv or --upvp")
    out_path, form = (csv_out, "csv") if csv_out else (json_out, "json") if json_out else (None, None)
    problems, shown = [], []
    with cf.open_rows(out_path, form) if out_path else contextlib.nullcontext() as writer:
        if csv_file:
            _convert_file(cf, csv_file, observer, writer, problems, shown)
        else:
            import numpy as np

            for option, values in (("x,y", xy), ("u,v", uv), ("u_prime,v_prime", upvp)):
                if not values:
                    continue
                kind = tuple(option.split(","))
                c, d, flags = cf.convert(np.array(values, dtype=float), kind, observer)
                if writer:
                    writer.write(list(kind), [[repr(a), repr(b)] for a, b in values], c, d, flags)
                label = option.replace("_prime", "'")
                shown += [(f"{label} = {a:g}, {b:g}", ci, di, f) for (a, b), ci, di, f in zip(values, c, d, flags)]
    if writer:
        click.echo(f"wrote {writer.count} rows to {out_path}", err=True)
    if shown:
        from .text_table import format_table

        rows = [[p, _fmt(c, ".2f"), _fmt(d, "+.6f"), f or "-"] for p, c, d, f in shown]
        click.echo(format_table(["input", "CCT K", "Duv", "flag"], rows, "lrrl"))
        if any(f for *_, f in shown):
            click.echo(
                "flags: cct_below_1000K / cct_above_100000K: no CCT in range (shown '-'); "
                "duv_beyond_0.05: computed, but CIE 015 advises against using a CCT this far from the locus."
            )
    for message in problems:
        click.echo(f"lampcalc: {message}", err=True)
    if problems:
        click.echo(f"lampcalc: {len(problems)} rows could not be read; the others were converted", err=True)
        sys.exit(2)


_CRITERIA = {
    # criterion: (label, claimed format, value format, unit)
    "ansi_quadrangle": ("ANSI quadrangle", "{:g} K", "{:.0f} K", "e-3 uv"),
    "ansi_cct_K": ("ANSI target CCT", "{:g} K", "{:.0f} K", "K"),
    "ansi_duv": ("ANSI target Duv", "{:+.4f}", "{:+.4f}", ""),
    "sdcm_steps": ("colour consistency", "<= {:g} steps", "{:.2f} steps", "steps"),
    "ra": ("Ra", ">= {:g}", "{:.1f}", ""),
    "r9": ("R9", ">= {:g}", "{:.1f}", ""),
    "rf": ("Rf", ">= {:g}", "{:.1f}", ""),
    "rg_min": ("Rg", ">= {:g}", "{:.1f}", ""),
    "rg_max": ("Rg", "<= {:g}", "{:.1f}", ""),
    "ler_lm_per_W": ("LER", ">= {:g} lm/W", "{:.1f} lm/W", "lm/W"),
    "efficacy_lm_per_W": ("lamp efficacy", ">= {:g} lm/W", "{:.1f} lm/W", "lm/W"),
}
_RESULT = {True: "holds", False: "FAILS", None: "not shown"}


def _verdict_text(verdicts):
    import math

    from .text_table import format_table

    blocks = []
    for lamp in verdicts.lamps:
        rows = []
        for c in lamp["checks"]:
            label, claimed_fmt, value_fmt, unit = _CRITERIA[c["criterion"]]
            claimed = claimed_fmt.format(c["claimed"]) if c["claimed"] is not None else "-"
            measured = value_fmt.format(c["measured"]) if c["measured"] is not None else "-"
            margin = "-" if c["margin"] is None or not math.isfinite(c["margin"]) else f"{c['margin']:+.4g} {unit}".strip()
            rows.append([label, claimed, measured, margin, _RESULT[c["pass"]], c["note"]])
        failing = sum(c["pass"] is not True for c in lamp["checks"])
        head = f"{lamp['lamp']}: " + ("every claim holds" if lamp["pass"] else f"{failing} of {len(lamp['checks'])} checks do not hold")
        table = format_table(["claim", "claimed", "measured", "margin", "result", "note"], rows, "lllrll")
        blocks.append(head + "\n" + "\n".join("  " + line for line in table.splitlines()))
    blocks.append(
        "margin: how far the measurement is on the right side of the claim (negative: it fails by that much);\n"
        "for the ANSI quadrangle, the distance from its nearest edge in CIE 1960 u,v (x 1e-3)."
    )
    return "\n\n".join(blocks)


def check_and_write(files, claims_path, *, json_out=None, csv_out=None, report_out=None, steps="ellipse",
                    centre="ansi", quiet_table=False, **reading):
    """Read claims and spectra, check, print and write. Returns the exit status (0, 1 or 2) and the ratings."""
    from .claims import check_claims, read_claims

    claims = read_claims(claims_path)
    batches, errors = _read_some(files, **reading)
    nominal = {c.lamp: c.values["nominal_cct_K"] for c in claims.values() if "nominal_cct_K" in c.values}
    ratings = _rate(batches, nominal)
    verdicts = check_claims(claims, ratings, claims_path, sdcm_method=steps, sdcm_centre=centre)
    if not quiet_table:
        click.echo(_rating_table(ratings))
        click.echo(_TABLE_NOTES + "\n")
    click.echo(_verdict_text(verdicts))
    click.echo("\n" + verdicts.summary())
    _write_outputs(ratings, verdicts, json_out, csv_out, report_out)
    click.echo(CAUTION)
    if errors:
        click.echo(f"lampcalc: {len(errors)} of {len(files)} spectrum files could not be read", err=True)
        return 2, ratings
    return (0 if verdicts.all_hold else 1), ratings


@cli.command()
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
@_spectrum_options
@_fail_on_input_errors
def check(paths, claims_path, json_out, csv_out, report_out, steps, centre, recursive, **reading):
    """Check a supplier's claims against the spectra: one verdict per claim.

    Exit status 0 when every claim holds, 1 when any does not (or cannot be shown to),
    2 for bad input.
    """
    files = _collect_files(paths, recursive)
    if not files:
        raise Failure("no spectrum files found (" + ", ".join(SPECTRUM_SUFFIXES) + ")")
    status, _ = check_and_write(
        files, claims_path, json_out=json_out, csv_out=csv_out, report_out=report_out, steps=steps, centre=centre,
        **reading,
    )
    sys.exit(status)


@cli.command()
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
@_spectrum_options
@_fail_on_input_errors
def plot(kind, paths, out, lamps, diagram, zoom, duv_span, nominal, recursive, **reading):
    """Draw a figure of the lamps: locus, spectrum, efficacy or hue (TM-30 bins)."""
    from .plots.figures import FIGURES
    from .plots.style import figure_style, save_figure

    batches, errors = _read_some(_collect_files(paths, recursive), **reading)
    ratings = _rate(batches)
    options = {"locus": {"space": diagram, "zoom": zoom, "duv_span": duv_span, "nominal_cct_K": nominal}}.get(kind, {})
    if kind in ("spectrum", "hue") and len(lamps) != 1 and len(ratings) > 1:
        click.echo(f"drawing {lamps[0] if lamps else ratings['name'][0]}; choose another with --lamp NAME", err=True)
    with figure_style():
        fig = FIGURES[kind](ratings, lamps, **options)
        save_figure(fig, out)
    click.echo(f"wrote {out}", err=True)
    if errors:
        sys.exit(2)


@cli.command()
@click.option(
    "--out",
    "out_dir",
    type=click.Path(file_okay=False),
    default="lampcalc-demo",
    show_default=True,
    help="Folder for the demo's output.",
)
@_fail_on_input_errors
def demo(out_dir):
    """Rate and check the bundled demo lamps of a fictional supplier and write the results.

    The supplier, Quillfen Lighting, and its lamps are invented; their spectra are made
    from physical models. Some of its claims are false on purpose.
    """
    from .demo import demo_claims, demo_files

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
    _demo_figures(ratings, out)
    click.echo(f"\nResults in {out}/")


def _demo_figures(ratings, out):
    from .plots.figures import FIGURES
    from .plots.style import figure_style, save_figure

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


def main(argv=None):
    """Entry point of the ``lampcalc`` console script."""
    cli.main(args=argv, prog_name="lampcalc")
