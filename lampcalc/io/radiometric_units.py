"""Units of spectral values as exports write them, and the quantity and scale they mean.

``mW/nm`` is a spectral flux in milliwatts per nanometre: lampcalc reads it as ``flux`` and
multiplies by 1e-3 to have W/nm. Accepted: a watt with prefix n, µ (u), m or k; per nm or
per µm; per m², cm² or mm² (irradiance) and per sr as well (radiance); written with a slash
(``W/(m² nm)``, ``W/m2/nm``) or negative exponents (``W·m⁻²·nm⁻¹``, ``W m-2 nm-1``). Words
for values without a unit (``a.u.``, ``counts``, ``relative`` …) mean ``relative``.
"""

import re

from ..spectra.batch import QUANTITY_UNITS

#: Words for spectra without an absolute unit.
RELATIVE_WORDS = frozenset(
    {"a.u.", "a.u", "au", "arb.", "arb", "arb. units", "arbitrary units", "arbitrary", "rel.", "rel", "relative",
     "%", "counts", "count", "normalised", "normalized", "norm.", "-", "1"}
)
# Powers of ten to SI, summed and raised once so that the scales are exact (µW/cm² → 1e-2 W/m²).
_PREFIX = {"": 0, "n": -9, "u": -6, "m": -3, "k": 3}
_PER_AREA = {"m": 0, "cm": 4, "mm": 6}
_PER_WAVELENGTH = {"nm": 0, "um": -3}
_TOKEN = re.compile(r"[A-Za-z]+|-?\d+|/|\(|\)")
_SUPERSCRIPT = str.maketrans({"²": "2", "¹": "1", "⁻": "-", "µ": "u", "μ": "u", "·": " ", "*": " ", "^": "", "⋅": " "})
#: Longest text taken for a unit; anything longer is a name.
MAX_UNIT_LENGTH = 40


def _factors(tokens):
    """``[(unit, exponent), …]`` after the watt; units after a slash count as divided by."""
    factors, divided, k = [], False, 0
    while k < len(tokens):
        token = tokens[k]
        k += 1
        if token == "/":
            divided = True
            continue
        if token in "()":
            continue
        if not token.isalpha():
            raise ValueError
        exponent = 1
        if k < len(tokens) and tokens[k].lstrip("-").isdigit():
            exponent = int(tokens[k])
            k += 1
        factors.append((token, -abs(exponent) if divided else exponent))
    return factors


def parse_unit(text):
    """The quantity and scale to SI of a unit of spectral values.

    Parameters
    ----------
    text : str
        ``"mW/nm"``, ``"W/(m² nm)"``, ``"a.u."`` …

    Returns
    -------
    (str, float) or None
        ``(quantity, scale)``: values times ``scale`` are in the units of
        :data:`~lampcalc.spectra.batch.QUANTITY_UNITS` for ``quantity``. None when the text
        is not a unit at all.

    Raises
    ------
    ValueError
        For a unit of power that is not one lampcalc computes with (radiant intensity, a
        unit not per wavelength), with the reason in words.

    Examples
    --------
    >>> parse_unit("mW/nm")
    ('flux', 0.001)
    >>> parse_unit("µW/(cm² nm)")
    ('irradiance', 0.01)
    >>> parse_unit("W·sr⁻¹·m⁻²·nm⁻¹")
    ('radiance', 1.0)
    """
    text = text.strip()
    if len(text) > MAX_UNIT_LENGTH:
        return None
    if text.lower() in RELATIVE_WORDS:
        return "relative", 1.0
    tokens = _TOKEN.findall(text.translate(_SUPERSCRIPT))
    match = re.fullmatch(r"([numk]?)[Ww]", tokens[0]) if tokens else None
    if match is None:
        return None
    try:
        factors = _factors(tokens[1:])
    except ValueError:
        return None
    per_wavelength = [f for f in factors if f[0] in _PER_WAVELENGTH]
    area = [f for f in factors if f[0] in _PER_AREA]
    steradian = [f for f in factors if f[0] == "sr"]
    if len(per_wavelength) + len(area) + len(steradian) != len(factors) or not factors:
        return None
    if len(per_wavelength) != 1 or per_wavelength[0][1] != -1:
        raise ValueError(f"{text!r} is not a spectral unit (power per nm)")
    if len(area) > 1 or (area and area[0][1] != -2) or len(steradian) > 1 or (steradian and steradian[0][1] != -1):
        raise ValueError(f"{text!r} is not a unit lampcalc knows")
    if steradian and not area:
        raise ValueError(
            f"{text!r} is a radiant intensity; lampcalc computes with flux, irradiance or radiance "
            "(read its shape only with --quantity relative)"
        )
    quantity = "radiance" if steradian else "irradiance" if area else "flux"
    power = _PREFIX[match.group(1)] + _PER_WAVELENGTH[per_wavelength[0][0]] + (_PER_AREA[area[0][0]] if area else 0)
    return quantity, 10.0**power


def unit_in_header(cell):
    """Split a header cell into a name and a unit: ``"Lamp A [mW/nm]"`` → ``("Lamp A", "mW/nm")``.

    A unit is the text in square brackets or parentheses at the end of the cell, or the
    whole cell when it is a unit of power (``mW/nm``). Parentheses that do not hold a unit
    stay part of the name; words such as ``counts`` are units only in brackets.

    Returns
    -------
    (str, str or None)
    """
    text = cell.strip()
    for opening, closing in (("[", "]"), ("(", ")")):
        if text.endswith(closing) and opening in text:
            name, _, unit = text[:-1].rpartition(opening)
            if opening == "[" or _is_unit(unit):
                return name.strip(), unit.strip()
    if text and _is_unit(text, words=False):
        return "", text
    return text, None


def _is_unit(text, words=True):
    try:
        found = parse_unit(text)
    except ValueError:
        return True
    return found is not None and (words or found[0] != "relative")


def base_unit(quantity):
    """The unit lampcalc holds ``quantity`` in (``"W/nm"`` for flux)."""
    return QUANTITY_UNITS[quantity]
