"""lampcalc's own JSON form of spectra: reading and writing.

``{"lampcalc_spectra": 1, "quantity": ..., "wavelength_nm": [...],
"lamps": [{"name": ..., "values": [...], "electrical_W": ..., "angle_deg": ...}, ...]}``
(``docs/spectrum-files.md``). Places in messages are JSON paths (``lamps[2].values[14]``).
Anything JSON allows but a spectrum cannot be (nesting, integers beyond the range of a
float, nulls, NaN) is refused where it stands.
"""

import json
import math

import numpy as np

from ..spectra.batch import QUANTITY_UNITS
from .spectrum_checks import Where, build_batch, check_wavelengths, single_quantity, to_nm
from .text_cells import show

JSON_FORMAT_KEY = "lampcalc_spectra"
JSON_FORMAT_VERSION = 1


def _finite(value):
    """``value`` as a finite float, or None if it is not a number (booleans are not) or not finite."""
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        return None
    try:
        number = float(value)
    except OverflowError:  # an integer beyond the range of a float
        return None
    return number if math.isfinite(number) else None


def _describe(value):
    """A JSON value in a few words, safe for any size or depth."""
    if value is None:
        return "null"
    if isinstance(value, bool):
        return str(value).lower()
    if isinstance(value, str):
        return show(value)
    if isinstance(value, list):
        return f"a list of {len(value)}"
    if isinstance(value, dict):
        return "an object"
    return str(value)[:40]


def _json_numbers(values, label, where):
    if not isinstance(values, list) or not values:
        raise where(f"must be a non-empty list of numbers, not {_describe(values)}", label)
    out = np.empty(len(values))
    for i, v in enumerate(values):
        number = _finite(v)
        if number is None:
            if isinstance(v, (int, float)) and not isinstance(v, bool):
                problem = "is beyond the range of a float" if isinstance(v, int) or math.isinf(v) else "is not finite"
            else:
                problem = f"is {_describe(v)}, not a number"
            raise where(problem, f"{label}[{i}]")
        out[i] = number
    return out


def _optional(lamp, key, label, where, positive):
    value = lamp.get(key)
    if value is None:
        return np.nan
    number = _finite(value)
    if number is None or (positive and not number > 0):
        kind = "a positive number of watts" if positive else "a finite number of degrees"
        raise where(f"must be {kind}, not {_describe(value)}", f"{label}.{key}")
    return number


def _parse(text, where):
    try:
        return json.loads(text)
    except json.JSONDecodeError as err:
        raise where(f"not valid JSON ({err.msg})", f"line {err.lineno}, column {err.colno}") from None
    except RecursionError:
        raise where("not a lampcalc spectra file: nested too deeply") from None
    except ValueError:  # an integer of more digits than Python converts (4300)
        raise where("not a lampcalc spectra file: holds an integer of thousands of digits") from None


def read_spectra_json(text, path="<json>", *, quantity=None):
    """Parse lampcalc's JSON form (``docs/spectrum-files.md``) into a :class:`SpectralBatch`.

    Raises
    ------
    InputError
        Naming the file by its path as given and the JSON path of the value at fault.
    """
    where = Where(path)
    doc = _parse(text, where)
    if not isinstance(doc, dict) or doc.get(JSON_FORMAT_KEY) != JSON_FORMAT_VERSION:
        raise where(f'not a lampcalc spectra file: expected "{JSON_FORMAT_KEY}": {JSON_FORMAT_VERSION}')
    wl = _json_numbers(doc.get("wavelength_nm"), "wavelength_nm", where)
    lamps = doc.get("lamps")
    if not isinstance(lamps, list) or not lamps:
        raise where("must be a non-empty list of lamps", "lamps")
    wl_places = [f"wavelength_nm[{i}]" for i in range(wl.size)]
    check_wavelengths(wl, wl_places, where)
    wl = to_nm(wl, "nm", None, where)
    q = quantity or doc.get("quantity", "relative")
    if not isinstance(q, str) or q not in QUANTITY_UNITS:
        raise where(f"unknown quantity {_describe(q)}; use one of {', '.join(QUANTITY_UNITS)}", "quantity")
    values = np.empty((len(lamps), wl.size))
    names, watts, angles = [], [], []
    for k, lamp in enumerate(lamps):
        label = f"lamps[{k}]"
        if not isinstance(lamp, dict) or not isinstance(lamp.get("name"), str) or not lamp["name"].strip():
            raise where("needs a non-empty string 'name'", label)
        v = _json_numbers(lamp.get("values"), f"{label}.values", where)
        if v.size != wl.size:
            raise where(f"has {v.size} numbers for {wl.size} wavelengths", f"{label}.values")
        values[k] = v
        names.append(lamp["name"].strip())
        watts.append(_optional(lamp, "electrical_W", label, where, positive=True))
        angles.append(_optional(lamp, "angle_deg", label, where, positive=False))
    return build_batch(
        wl, values, tuple(names), q, where=where, lamp_places=[f"lamps[{k}]" for k in range(len(lamps))],
        value_place=lambda k, i: f"lamps[{k}].values[{i}]", watts=np.array(watts), angles=np.array(angles),
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
