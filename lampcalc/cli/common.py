"""What the commands share: one-line failures, reading files, progress, writing outputs.

Only click is imported here at start-up; the library is imported inside the functions,
so that ``lampcalc --help`` answers at once.
"""

import sys
from pathlib import Path

import click

from ..io.formats import SPECTRUM_SUFFIXES


class Failure(click.ClickException):
    """A one-line error that ends the command with status 2."""

    exit_code = 2

    def show(self, file=None):
        click.echo(f"lampcalc: {self.format_message()}", err=True)


def fail_on_input_errors(fn):
    """Turn an InputError raised by a command into a one-line Failure (exit status 2)."""
    import functools

    @functools.wraps(fn)
    def wrapper(*args, **kwargs):
        from ..errors import InputError

        try:
            return fn(*args, **kwargs)
        except InputError as err:
            raise Failure(str(err)) from None

    return wrapper


def progress(items, label):
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


def write_text(path, text):
    from ..io.atomic import write_atomic

    try:
        write_atomic(path, text)
    except OSError as err:
        raise Failure(f"{path}: cannot write ({err.strerror or err})") from None


def fmt(value, spec):
    import math

    if value is None or (isinstance(value, float) and not math.isfinite(value)):
        return "-"
    text = format(value, spec)
    return format(0.0, spec) if float(text) == 0 else text


def flagged(value, spec, doubtful):
    """A number, in parentheses when a flag says it is not to be used as an ordinary value."""
    text = fmt(value, spec)
    return f"({text})" if doubtful and text != "-" else text


def collect_files(paths, recursive, exclude=()):
    """The spectrum files among ``paths``, and with -r in their folders; ``exclude`` is never read as spectra.

    Files in folders that are not spectrum files (by suffix) are passed over with one note;
    hidden files and a spreadsheet program's lock files (``~$book.xlsx``) without one.
    """
    skip = {Path(p).resolve() for p in exclude}
    files, passed_over = [], []
    for p in map(Path, paths):
        if p.is_dir():
            if not recursive:
                raise Failure(f"{p}: is a folder; pass -r to read the spectrum files inside it")
            for f in sorted(p.rglob("*")):
                if not f.is_file() or f.name.startswith((".", "~$")) or f.resolve() in skip:
                    continue
                (files if f.suffix.lower() in SPECTRUM_SUFFIXES else passed_over).append(f)
        elif p.resolve() not in skip:
            files.append(p)
    if passed_over:
        shown = ", ".join(str(f) for f in passed_over[:3]) + (" …" if len(passed_over) > 3 else "")
        click.echo(
            f"lampcalc: passed over {len(passed_over)} file(s) in folders that are not spectrum files "
            f"({', '.join(SPECTRUM_SUFFIXES)}): {shown}",
            err=True,
        )
    return files


def read_files(files, *, wavelength_unit=None, quantity=None, strict=False, interpolation="auto", watts=None,
               as_read=False):
    """Read every file onto the grid; returns ``(batches, errors)``. ``strict`` stops at the first error.

    ``watts`` is the electrical power of every lamp whose file does not give one. With ``as_read``
    the batches keep the files' own wavelengths (checked against the grid all the same), for
    ``--uncertainty``, whose draws perturb the samples before they are resampled.
    """
    from ..errors import InputError
    from ..io.spectrum_files import read_spectra

    batches, errors = [], []
    with progress(files, "reading spectra") as bar:
        for f in bar:
            try:
                batch = read_spectra(f, wavelength_unit=wavelength_unit, quantity=quantity)
                if watts is not None:
                    batch = batch.with_electrical_power(watts)
                gridded = batch.on_grid(interpolation)
                batches.append(batch if as_read else gridded)
            except InputError as err:
                if strict:
                    raise Failure(str(err)) from None
                errors.append(str(err))
    return batches, errors


def read_some(files, **reading):
    """read_files, with each error reported at once; a Failure when no file could be read."""
    batches, errors = read_files(files, **reading)
    for message in errors:
        click.echo(f"lampcalc: {message}", err=True)
    if not batches:
        raise Failure("no spectrum could be read")
    return batches, errors


def rate_batches(batches, nominal=None, sets=None):
    """Rate the batches together; ``sets`` from :func:`read_sets` (bin set, ellipse set)."""
    from ..rating.rate import rate_spectra
    from ..spectra.batch import SpectralBatch

    batch = SpectralBatch.concatenate(batches)
    if batch.n_lamps > 200 and sys.stderr.isatty():
        click.echo(f"rating {batch.n_lamps} lamps ...", err=True)
    names = batch.names
    # claims name their lamps without regard to case: ``nominal`` is keyed by casefolded name
    nominal_cct = None if nominal is None else [nominal.get(name.casefold(), float("nan")) for name in names]
    bin_set, ellipse_set = sets or (None, None)
    return rate_spectra(batch, nominal_cct_K=nominal_cct, bin_set=bin_set, ellipse_set=ellipse_set)


def read_sets(bins=None, ellipses=None, steps="ellipse"):
    """The bin set and ellipse set a command uses: the user's files, else the shipped ones.

    ``ellipses`` (a user's file) takes precedence over ``steps`` (the shipped set's name).
    """
    from ..standards.bin_sets import read_bin_set
    from ..standards.ellipse_sets import read_ellipse_set, shipped_ellipse_set

    bin_set = read_bin_set(bins) if bins else None
    ellipse_set = read_ellipse_set(ellipses) if ellipses else shipped_ellipse_set(steps)
    return bin_set, ellipse_set


def set_options(fn):
    """The ``--bins`` and ``--ellipses`` options of the commands that rate spectra."""
    for option in reversed(
        [
            click.option(
                "--bins", type=click.Path(exists=True, dir_okay=False), default=None, metavar="FILE",
                help="Bin set file (docs/standard-sets.md): the bins of the bin columns, of nominal-CCT claims and of a "
                "lot's counts.",
            ),
            click.option(
                "--ellipses", type=click.Path(exists=True, dir_okay=False), default=None, metavar="FILE",
                help="Ellipse set file (docs/standard-sets.md) for the colour-consistency steps.",
            ),
        ]
    ):
        fn = option(fn)
    return fn


def workers_option(fn):
    """The ``--workers`` option of the commands that rate any number of spectra (dask, optional)."""

    def check(ctx, param, value):
        if value > 1:
            import importlib.util

            if importlib.util.find_spec("dask") is None:
                raise Failure(f"--workers {value} needs dask: pip install 'lampcalc[dask]'")
        return value

    return click.option(
        "--workers", type=click.IntRange(min=1), default=1, show_default=True, metavar="N", callback=check,
        help="Local processes that rate chunks of lamps side by side (needs lampcalc[dask]; docs/scale.md).",
    )(fn)


def spectrum_options(fn):
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
                type=click.Choice(["auto", "linear", "sprague"]),
                default="auto",
                show_default=True,
                help="Resampling to 1 nm. auto: Sprague for uniform data coarser than 1 nm (CIE 167, CIE 015), "
                "linear for non-uniform data, integration for data finer than 1 nm.",
            ),
        ]
    ):
        fn = option(fn)
    return fn


def report_options(fn):
    """``--report-info FILE`` and ``--paper``: what a command that writes a report also takes."""
    fn = click.option(
        "--paper", type=click.Choice(["a4", "letter"]), default="a4", show_default=True,
        help="Paper of the report: A4 or US Letter.",
    )(fn)
    return click.option(
        "--report-info", "report_info", type=click.Path(exists=True, dir_okay=False), default=None, metavar="FILE",
        help="TOML file of the report's title, client, project, laboratory, report_number, date, prepared_by, notes.",
    )(fn)


def read_report_options(report_out, report_info, paper):
    """The report's information, read before any other work; refused without --report."""
    source = click.get_current_context().get_parameter_source("paper")
    if report_out is None and (report_info or source == click.core.ParameterSource.COMMANDLINE):
        raise Failure("--report-info and --paper describe the PDF report: add --report FILE")
    if report_info is None:
        return None
    from ..report.report_info import read_report_info

    return read_report_info(report_info)


def write_report_file(path, ratings, verdicts=None, shown_as=None, report_info=None, paper="a4", **data):
    """Write the PDF report to ``path`` (told as ``shown_as``, the final name, when ``path`` is temporary).

    ``data``: the report's title and its lot, colour over angle or comparison (:class:`~lampcalc.report.document.Report`).
    """
    from ..report.document import Report

    report = Report(ratings, verdicts, info=report_info, paper=paper, **data)
    if sys.stderr.isatty():
        with click.progressbar(length=report.n_pages, label="writing report", file=sys.stderr) as bar:
            pages = report.write(path, progress=bar.update)
    else:
        pages = report.write(path)
    click.echo(f"wrote {shown_as or path} ({pages} pages)", err=True)
