"""Metadata before a table of spectra: ``key: value`` lines, comment lines and key cells.

A metadata row is ``key: value`` (or ``key = value``) in one cell, or the key in the first
cell and the value(s) in the cells after it. The keys lampcalc reads (``docs/spectrum-files.md``):

===================  ===========================================================
key                  value
===================  ===========================================================
``quantity``         relative, flux, irradiance or radiance
``unit``             the unit of every lamp column without one in its header
``electrical_W``     electrical power, W: one value, or one per lamp
``angle_deg``        angle of emission, degrees: one value, or one per lamp
``wavelength_unit``  nm or um
===================  ===========================================================

Keys are matched without regard to case; other rows (an instrument's name, a date) are
kept out of the way. A key given twice with different values is refused.
"""

import math
import re

from ..spectra.batch import QUANTITY_UNITS
from .text_cells import parse_number, show

KEYS = ("quantity", "unit", "electrical_w", "angle_deg", "wavelength_unit")
_ALIASES = {"units": "unit", "wavelength_units": "wavelength_unit"}
_LONGEST_KEY = 40


def _key_and_values(cells):
    first = cells[0]
    if not isinstance(first, str):
        return None, []
    cut = min((i for i in (first.find(":"), first.find("=")) if i >= 0), default=-1)
    if cut >= 0:
        key, values = first[:cut], [first[cut + 1 :]] + list(cells[1:])
    else:
        key, values = first, list(cells[1:])
    key = key.strip()
    if not key or len(key) > _LONGEST_KEY:
        return None, []
    key = key.lower().replace(" ", "_")
    return _ALIASES.get(key, key), [v.strip() if isinstance(v, str) else v for v in values]


class Metadata:
    """The known keys found before a table: ``{key: (place, [value cells])}``."""

    def __init__(self, found, decimal_comma, where):
        self.found = found
        self.decimal_comma = decimal_comma
        self.where = where

    @classmethod
    def from_rows(cls, rows, decimal_comma, where):
        """From ``[(place, cells), …]``: the rows before the table and the comment lines."""
        found = {}
        for place, cells in rows:
            if not cells:
                continue
            key, values = _key_and_values(cells)
            if key not in KEYS:
                continue
            values = [v for v in values if v != ""]
            if key in found and found[key][1] != values:
                raise where(f"{key} is given twice, differently (also at {found[key][0]})", place)
            found[key] = (place, values)
        return cls(found, decimal_comma, where)

    def text(self, key):
        """The value of ``key`` as text, or None if absent."""
        if key not in self.found:
            return None
        place, values = self.found[key]
        if not values:
            raise self.where(f"{key} has no value", place)
        return " ".join(str(v) for v in values)

    def quantity(self):
        value = self.text("quantity")
        if value is None:
            return None
        if value.lower() not in QUANTITY_UNITS:
            raise self.where(
                f"unknown quantity {show(value)}; use one of {', '.join(QUANTITY_UNITS)}", self.found["quantity"][0]
            )
        return value.lower()

    def wavelength_unit(self):
        value = self.text("wavelength_unit")
        if value is None:
            return None
        unit = value.lower().replace("µ", "u").replace("μ", "u")
        if unit not in ("nm", "um"):
            raise self.where(f"unknown wavelength unit {show(value)}; use nm or um", self.found["wavelength_unit"][0])
        return unit

    def per_lamp(self, key, label, n_lamps, positive):
        """One number for every lamp, or one per lamp (None if absent)."""
        if key not in self.found:
            return None
        place, values = self.found[key]
        separators = r"[;\t ]+" if self.decimal_comma else r"[,;\t ]+"
        numbers = []
        for value in values:
            if isinstance(value, str):
                for cell in re.split(separators, value):
                    if cell:
                        try:
                            numbers.append(parse_number(cell, self.decimal_comma))
                        except ValueError as err:
                            raise self.where(f"{label} {show(cell)} {err}", place) from None
            elif isinstance(value, float) and math.isfinite(value):
                numbers.append(value)
            else:
                raise self.where(f"{label} {show(value)} is not a number", place)
        if len(numbers) == 1:
            numbers = numbers * n_lamps
        if len(numbers) != n_lamps or (positive and any(not (w > 0) for w in numbers)):
            kind = "positive value" if positive else "value"
            shown = show(" ".join(str(v) for v in values))
            raise self.where(f"{label} needs one {kind} or one per lamp ({n_lamps}), got {shown}", place)
        return numbers
