"""Reading and writing spectrum files: the entry point for every form lampcalc reads.

Delimited text (:mod:`~lampcalc.io.delimited_text`) and lampcalc's own JSON form
(:mod:`~lampcalc.io.lampcalc_json`), both described in ``docs/spectrum-files.md``.
Every problem raises :class:`~lampcalc.errors.InputError` with one line naming the file,
the line (1-based, as an editor counts) and the column.
"""

from pathlib import Path

import numpy as np

from .atomic import write_atomic
from .delimited_text import read_spectra_text
from .lampcalc_json import read_spectra_json, spectra_to_json
from .spectrum_checks import Where, decode_text, single_quantity


def read_spectra(path, *, wavelength_unit=None, quantity=None):
    """Read a spectrum file: lampcalc JSON (``.json``) or delimited text (anything else).

    Parameters
    ----------
    path : str or Path
    wavelength_unit : {"nm", "um"}, optional
        For text files whose wavelengths are in micrometres.
    quantity : str, optional
        Radiometric quantity, overriding what the file says.

    Returns
    -------
    SpectralBatch
        On the file's own wavelengths; call :meth:`SpectralBatch.on_grid` to compute.

    Raises
    ------
    InputError
        One line naming the file, line and column.
    """
    where = Where(path)
    try:
        raw = Path(path).read_bytes()
    except IsADirectoryError:
        raise where("is a folder; pass -r to read the spectrum files inside it") from None
    except OSError as err:
        raise where(f"cannot be read ({err.strerror or err})") from None
    text = decode_text(raw, where)
    if str(path).lower().endswith(".json"):
        return read_spectra_json(text, path, quantity=quantity)
    return read_spectra_text(text, path, wavelength_unit=wavelength_unit, quantity=quantity)


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
        if any(ch in name for ch in ',"\n'):
            raise ValueError(f"lamp name {name!r} cannot be written to CSV (comma, quote or newline)")
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
