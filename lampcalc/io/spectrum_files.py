"""Reading and writing spectrum files: the entry point for every form lampcalc reads.

Delimited text (:mod:`~lampcalc.io.delimited_text`), Excel workbooks
(:mod:`~lampcalc.io.xlsx_spectra`), IES TM-27-14 documents (:mod:`~lampcalc.io.spdx`) and
lampcalc's own JSON form (:mod:`~lampcalc.io.lampcalc_json`), all described in
``docs/spectrum-files.md``. Every problem raises :class:`~lampcalc.errors.InputError` with
one line naming the file by its path as given, the place in it and what is wrong; no other
exception leaves :func:`read_spectra` on bad input.
"""

from pathlib import Path

import numpy as np

from .atomic import write_atomic
from .delimited_text import read_spectra_text
from .formats import JSON_SUFFIXES, SPDX_SUFFIXES, UNREAD_SPREADSHEETS, XLSX_SUFFIXES
from .lampcalc_json import read_spectra_json, spectra_to_json
from .radiometric_units import unit_in_header
from .spectrum_checks import Where, single_quantity
from .text_cells import decode_text


def read_spectra(path, *, wavelength_unit=None, quantity=None):
    """Read a spectrum file, by its suffix: ``.json``, ``.xlsx``, ``.spdx``/``.xml`` or delimited text.

    Parameters
    ----------
    path : str or Path
    wavelength_unit : {"nm", "um"}, optional
        For tables whose wavelengths are in micrometres (text and workbooks).
    quantity : str, optional
        Radiometric quantity, overriding what the file says.

    Returns
    -------
    SpectralBatch
        On the file's own wavelengths; call :meth:`SpectralBatch.on_grid` to compute. Each
        lamp's ``source`` is the path as given and its place in the file.

    Raises
    ------
    InputError
        One line naming the file, the place in it and the problem.
    """
    with open_spectra(path, wavelength_unit=wavelength_unit, quantity=quantity) as spectra:
        return spectra.whole()


def _read_whole(path, *, wavelength_unit=None, quantity=None):
    where = Where(path)
    suffix = Path(str(path)).suffix.lower()
    if suffix in UNREAD_SPREADSHEETS:
        raise where(f"{UNREAD_SPREADSHEETS[suffix]} is not read; save it as .xlsx or CSV")
    try:
        if Path(path).exists() and not Path(path).is_dir() and not Path(path).is_file():
            raise where("is not a regular file (a device or a pipe); not read")
        raw = Path(path).read_bytes()
    except IsADirectoryError:
        raise where("is a folder; pass -r to read the spectrum files inside it") from None
    except OSError as err:
        raise where(f"cannot be read ({err.strerror or err})") from None
    if suffix in XLSX_SUFFIXES:
        from .xlsx_spectra import read_spectra_xlsx

        return read_spectra_xlsx(raw, path, wavelength_unit=wavelength_unit, quantity=quantity)
    if suffix in SPDX_SUFFIXES:
        from .spdx import read_spectra_spdx

        if not raw.strip():
            raise where("the file is empty")
        return read_spectra_spdx(raw, path, quantity=quantity)
    text = decode_text(raw, where)
    if suffix in JSON_SUFFIXES:
        return read_spectra_json(text, path, quantity=quantity)
    return read_spectra_text(text, path, wavelength_unit=wavelength_unit, quantity=quantity)


class WholeFile:
    """The spectra of a file read at once, handed out in chunks as a :class:`~lampcalc.io.large_tables.LargeText`."""

    def __init__(self, batch):
        self.batch = batch
        self.n_lamps = batch.n_lamps

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        return False

    def close(self):
        """Nothing to remove: the spectra are in memory."""

    def whole(self):
        """Every lamp in one batch."""
        return self.batch

    def chunks(self, n_lamps):
        """The batch in pieces of at most ``n_lamps`` lamps, in order."""
        if self.n_lamps <= n_lamps:
            yield self.batch
            return
        for a in range(0, self.n_lamps, n_lamps):
            yield self.batch[a : a + n_lamps]


def open_spectra(path, *, wavelength_unit=None, quantity=None):
    """A file's spectra, read and checked, to be handed out in chunks (``with`` block, ``.chunks(n)``).

    A large plain text table (:mod:`~lampcalc.io.large_tables`) keeps its values in a
    temporary file until closed; every other file is read at once (:class:`WholeFile`).
    Options and errors as :func:`read_spectra`: a file is refused whole, before any lamp
    is handed out.
    """
    suffix = Path(str(path)).suffix.lower()
    if suffix not in (*UNREAD_SPREADSHEETS, *XLSX_SUFFIXES, *SPDX_SUFFIXES, *JSON_SUFFIXES):
        from .large_tables import open_large_text

        large = open_large_text(path, wavelength_unit=wavelength_unit, quantity=quantity)
        if large is not None:
            return large
    return WholeFile(_read_whole(path, wavelength_unit=wavelength_unit, quantity=quantity))


def spectra_to_csv(batch):
    """CSV text for a batch: metadata lines, a header row, one row per wavelength."""
    lines = [f"# quantity: {single_quantity(batch)}"]
    if np.any(np.isfinite(batch.electrical_W)):
        if not np.all(np.isfinite(batch.electrical_W)):
            raise ValueError("electrical_W is known for some lamps only; the CSV form needs all or none")
        lines.append("# electrical_W: " + " ".join(repr(float(w)) for w in batch.electrical_W))
    if np.any(np.isfinite(batch.angle_deg)):
        if not np.all(np.isfinite(batch.angle_deg)):
            raise ValueError("angle_deg is known for some lamps only; the CSV form needs all or none")
        lines.append("# angle_deg: " + " ".join(repr(float(a)) for a in batch.angle_deg))
    for name in batch.names:
        if any(ch in name for ch in ',"\n') or unit_in_header(name) != (name.strip(), None) or name != name.strip():
            raise ValueError(f"lamp name {name!r} cannot be written to CSV (comma, quote, newline, or read as a unit)")
    lines.append(",".join(["wavelength_nm", *batch.names]))
    for wl, row in zip(batch.wavelength_nm, batch.values.T):
        lines.append(",".join([repr(float(wl)), *(repr(float(v)) for v in row)]))
    return "\n".join(lines) + "\n"


def write_spectra_csv(batch, path):
    """Write a batch as CSV (readable by :func:`read_spectra`), atomically."""
    write_atomic(path, spectra_to_csv(batch))


def write_spectra_json(batch, path):
    """Write a batch as lampcalc JSON (readable by :func:`read_spectra`), atomically."""
    write_atomic(path, spectra_to_json(batch))
