"""The spectra of the files given, as one stream of lamps on the grid, with a progress bar.

``rate`` and ``check`` read the files one after the other and hand their lamps on in
pieces (a large table a chunk at a time: :func:`lampcalc.io.spectrum_files.open_spectra`).
A file that cannot be read is noted and passed over (or, with ``--strict``, ends the run);
a file is handed on whole or not at all. On a terminal a progress bar counts the lamps;
piped, nothing is shown.
"""

import contextlib
import sys
from pathlib import Path

import click

from .common import Failure


class LampProgress:
    """A progress bar over the bytes of the files, moved as their lamps are rated and labelled with the count.

    Shown on a terminal only. A file's bytes count as done when its lamps are rated (or at
    once, for a file that could not be read).
    """

    def __init__(self, files):
        self.bar = None
        self.lamps = 0
        self.read_bytes = self.read_lamps = self.failed_bytes = self.shown = 0
        if sys.stderr.isatty():
            total = sum(_size(f) for f in files)
            self.bar = click.progressbar(
                length=max(total, 1), label="rating spectra", file=sys.stderr,
                item_show_func=lambda lamps: None if lamps is None else f"{lamps:,} lamps",
            )

    def __enter__(self):
        if self.bar is not None:
            self.bar.__enter__()
        return self

    def __exit__(self, *exc):
        if self.bar is not None:
            self.bar.__exit__(*exc)
        return False

    def _move(self):
        if self.bar is not None:
            per_lamp = self.read_bytes / self.read_lamps if self.read_lamps else 0.0
            done = round(self.failed_bytes + per_lamp * self.lamps)
            self.bar.update(max(done - self.shown, 0), self.lamps)
            self.shown = max(done, self.shown)

    def read(self, n_bytes, n_lamps):
        """``n_bytes`` more of the input were read, holding ``n_lamps`` lamps (0: a file refused)."""
        if n_lamps:
            self.read_bytes += n_bytes
            self.read_lamps += n_lamps
        else:
            self.failed_bytes += n_bytes
            self._move()

    def rated(self, n_lamps):
        """``n_lamps`` more lamps were rated."""
        self.lamps += n_lamps
        self._move()


def _size(path):
    try:
        return Path(path).stat().st_size
    except OSError:
        return 0


def spectra_stream(files, errors, *, progress=None, piece_lamps=None, strict=False, wavelength_unit=None,
                   quantity=None, interpolation="auto", watts=None):
    """Batches on the grid, file after file; the message of each file that cannot be read goes to ``errors``.

    ``piece_lamps``: a file with more lamps is handed on in pieces of that many.
    ``watts`` is the electrical power of every lamp whose file gives none. Close the
    generator (``contextlib.closing``) so that a large file's temporary values are removed
    when the run ends early.
    """
    from ..errors import InputError
    from ..io.spectrum_files import open_spectra
    from ..rating.streaming import CHUNK_LAMPS

    piece_lamps = piece_lamps or CHUNK_LAMPS

    def refused(path, err):
        if strict:
            raise Failure(str(err)) from None
        errors.append(str(err))
        if progress:
            progress.read(_size(path), 0)

    for path in files:
        try:
            spectra = open_spectra(path, wavelength_unit=wavelength_unit, quantity=quantity)
        except InputError as err:
            refused(path, err)
            continue
        with spectra:
            pieces = [spectra.whole()] if spectra.n_lamps <= piece_lamps else spectra.chunks(piece_lamps)
            share = _size(path) / max(spectra.n_lamps, 1)
            for k, piece in enumerate(pieces):
                try:
                    if watts is not None:
                        piece = piece.with_electrical_power(watts)
                    piece = piece.on_grid(interpolation)
                except InputError as err:  # the file's wavelengths: met with its first piece, before any lamp
                    if k:
                        raise Failure(str(err)) from None
                    refused(path, err)
                    break
                if progress:
                    progress.read(share * piece.n_lamps, piece.n_lamps)
                yield piece


@contextlib.contextmanager
def lamp_stream(files, errors, **reading):
    """:func:`spectra_stream` with its progress bar, closed when the block ends; yields (stream, progress)."""
    with LampProgress(files) as progress, contextlib.closing(spectra_stream(files, errors, progress=progress,
                                                                            **reading)) as stream:
        yield stream, progress
