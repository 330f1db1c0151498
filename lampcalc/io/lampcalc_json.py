"""lampcalc's own JSON form of spectra: reading and writing.

``{"lampcalc_spectra": 1, "quantity": ..., "wavelength_nm": [...],
"lamps": [{"name": ..., "values": [...], "electrical_W": ..., "angle_deg": ...}, ...]}``
(``docs/spectrum-files.md``).
"""

import json
import math

import numpy as np

from ..spectra.batch import QUANTITY_UNITS
from .spectrum_checks import (
    JsonWhere,
    Where,
    build_batch,
    check_wavelengths,
    single_quantity,
    to_nm,
)

JSON_FORMAT_KEY = "lampcalc_spectra"
JSON_FORMAT_VERSION = 1


def _json_numbers(values, label, where):
    if not isinstance(values, list) or not values:
        raise where(f"{label} must be a non-empty list of numbers")
    for i, v in enumerate(values):
        if isinstance(v, bool) or not isinstance(v, (int, float)):
            raise where(f"{label}[{i}] is {v!r}, not a number")
        if not math.isfinite(v):
            raise where(f"{label}[{i}] is not finite")
    return np.array(values, dtype=float)


def read_spectra_json(text, path="<json>", *, quantity=None):
    """Parse lampcalc's JSON form (``docs/spectrum-files.md``) into a :class:`SpectralBatch`."""
    where = Where(path)
    try:
        doc = json.loads(text, parse_constant=lambda c: float(c))
    except json.JSONDecodeError as err:
        raise where(f"not valid JSON ({err.msg})", err.lineno) from None
    if not isinstance(doc, dict) or doc.get(JSON_FORMAT_KEY) != JSON_FORMAT_VERSION:
        raise where(f'not a lampcalc spectra file: expected "{JSON_FORMAT_KEY}": {JSON_FORMAT_VERSION}')
    wl = _json_numbers(doc.get("wavelength_nm"), "wavelength_nm", where)
    lamps = doc.get("lamps")
    if not isinstance(lamps, list) or not lamps:
        raise where("lamps must be a non-empty list")
    index = list(range(len(wl)))
    check_wavelengths(wl, [f"wavelength_nm[{i}]" for i in index], JsonWhere(where))
    wl = to_nm(wl, "nm", None, where)
    q = quantity or doc.get("quantity", "relative")
    if q not in QUANTITY_UNITS:
        raise where(f"unknown quantity {q!r}; use one of {', '.join(QUANTITY_UNITS)}")
    values, names, watts, angles = [], [], [], []
    for k, lamp in enumerate(lamps):
        label = f"lamps[{k}]"
        if not isinstance(lamp, dict) or not isinstance(lamp.get("name"), str) or not lamp["name"]:
            raise where(f"{label} needs a non-empty string 'name'")
        v = _json_numbers(lamp.get("values"), f"{label}.values", where)
        if v.size != wl.size:
            raise where(f"{label}.values has {v.size} numbers for {wl.size} wavelengths")
        w = lamp.get("electrical_W")
        if w is not None and (isinstance(w, bool) or not isinstance(w, (int, float)) or not w > 0):
            raise where(f"{label}.electrical_W must be a positive number of watts, got {w!r}")
        a = lamp.get("angle_deg")
        if a is not None and (isinstance(a, bool) or not isinstance(a, (int, float)) or not math.isfinite(a)):
            raise where(f"{label}.angle_deg must be a finite number of degrees, got {a!r}")
        values.append(v)
        names.append(lamp["name"])
        watts.append(np.nan if w is None else float(w))
        angles.append(np.nan if a is None else float(a))
    return build_batch(
        wl, np.array(values), tuple(names), q, np.array(watts), path,
        [f"lamps[{k}]" for k in range(len(lamps))], [f"wavelength_nm[{i}]" for i in index], JsonWhere(where),
        np.array(angles),
    )


def spectra_to_json(batch):
    """lampcalc JSON text for a batch."""
    doc = {
        JSON_FORMAT_KEY: JSON_FORMAT_VERSION,
        "quantity": single_quantity(batch),
        "wavelength_nm": batch.wavelength_nm.tolist(),
        "lamps": [
            {
                "name": name,
                "values": values.tolist(),
                **({"electrical_W": float(w)} if np.isfinite(w) else {}),
                **({"angle_deg": float(a)} if np.isfinite(a) else {}),
            }
            for name, values, w, a in zip(batch.names, batch.values, batch.electrical_W, batch.angle_deg)
        ],
    }
    return json.dumps(doc, indent=1) + "\n"
