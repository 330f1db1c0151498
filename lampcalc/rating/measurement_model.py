"""The measurement model: how uncertain a laboratory's spectra are, read from a small TOML file.

A measurement model names the effects that make a measured spectrum differ from the lamp's
true one and the size of each, as standard uncertainties (JCGM 100:2008, clause 4). Every key
is optional and a key left out is zero::

    # Quillfen Lighting's sphere spectroradiometer
    noise_percent = 0.5          # each measured value, independent between wavelengths, %
    scale_percent = 2.0          # the whole spectrum's scale (calibration), fully correlated, %
    wavelength_shift_nm = 0.2    # a common offset of the wavelength axis, nm
    stray_light_percent = 0.05   # a flat floor, as a share of the peak, %
    bandwidth_nm = 5.0           # the instrument's triangular slit (full width at half maximum), nm
    draws = 2000                 # Monte Carlo draws
    seed = 0                     # the same seed gives the same output

How each effect is drawn is :mod:`lampcalc.rating.uncertainty`'s business; ``docs/uncertainty.md``
says it in words.
"""

import math
from dataclasses import dataclass, fields

from ..errors import InputError
from ..io.toml_files import key_line, read_toml

#: Key -> what it is, with its unit. The keys of a measurement-model file, in this order.
MODEL_KEYS = {
    "noise_percent": "relative standard uncertainty of each measured value, independent between wavelengths, %",
    "scale_percent": "relative standard uncertainty of the spectrum's scale (calibration), common to all wavelengths, %",
    "wavelength_shift_nm": "standard uncertainty of a common offset of the wavelength axis, nm",
    "stray_light_percent": "standard uncertainty of a flat stray-light floor, as a share of the spectrum's peak, %",
    "bandwidth_nm": "full width at half maximum of the instrument's triangular slit, nm",
    "draws": "number of Monte Carlo draws",
    "seed": "seed of the random numbers; the same seed gives the same output",
}
DEFAULT_DRAWS = 2000
#: Fewest and most draws accepted. 200 000 is JCGM 101:2008 7.2.2's M ≥ 10⁴/(1 − p) for p = 95 %
#: (from memory); more would not keep memory flat (each lamp's draws of every rating are held at once).
DRAWS_RANGE = (100, 200_000)
_PERCENT_KEYS = ("noise_percent", "scale_percent", "stray_light_percent")
_INTEGER_KEYS = ("draws", "seed")


def _problem(key, value):
    """What is wrong with ``value`` for ``key``, in words; None when it can be used."""
    if key in _INTEGER_KEYS:
        if isinstance(value, bool) or not isinstance(value, int):
            return f"{key} must be a whole number, got {value!r}"
        if key == "draws" and not DRAWS_RANGE[0] <= value <= DRAWS_RANGE[1]:
            return f"draws must be from {DRAWS_RANGE[0]} to {DRAWS_RANGE[1]}, got {value}"
        if key == "seed" and value < 0:
            return f"seed must not be negative, got {value}"
        return None
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        return f"{key} must be a number, got {value!r}"
    if not math.isfinite(value) or value < 0:
        return f"{key} must be a finite, non-negative number, got {value!r}"
    if key in _PERCENT_KEYS and value > 100:
        return f"{key} is a relative standard uncertainty in %; {value!r} is over 100 %"
    return None


@dataclass(frozen=True)
class MeasurementModel:
    """Standard uncertainties of a measured spectrum, and how many Monte Carlo draws to take.

    Parameters
    ----------
    noise_percent : float
        Relative standard uncertainty of each measured value, independent between wavelengths, %.
    scale_percent : float
        Relative standard uncertainty of the whole spectrum's scale, %.
    wavelength_shift_nm : float
        Standard uncertainty of an offset common to all the measured wavelengths, nm.
    stray_light_percent : float
        Standard uncertainty of a flat floor over the measured range, % of the spectrum's peak.
    bandwidth_nm : float
        Full width at half maximum of the instrument's triangular slit, nm.
    draws : int
        Monte Carlo draws per lamp, 100 to 200 000 (default 2000).
    seed : int
        Seed of the random numbers (default 0).
    source : str
        Where the model came from (a file name), for the output; not part of the model.

    Raises
    ------
    ValueError
        For a negative, non-finite or mistyped value; the message names the key.

    References
    ----------
    JCGM 100:2008 (GUM), clause 4: standard uncertainties of the input quantities.
    JCGM 101:2008, clause 6: the distributions assigned to them (see :mod:`lampcalc.rating.uncertainty`).
    """

    noise_percent: float = 0.0
    scale_percent: float = 0.0
    wavelength_shift_nm: float = 0.0
    stray_light_percent: float = 0.0
    bandwidth_nm: float = 0.0
    draws: int = DEFAULT_DRAWS
    seed: int = 0
    source: str = ""

    def __post_init__(self):
        for key in MODEL_KEYS:
            problem = _problem(key, getattr(self, key))
            if problem:
                raise ValueError(problem)

    @property
    def is_zero(self):
        """True when the model has no uncertainty at all (every draw is the measured spectrum)."""
        return not any(getattr(self, key) for key in MODEL_KEYS if key not in _INTEGER_KEYS)

    def describe(self):
        """One line: the model's non-zero effects, draws and seed.

        Examples
        --------
        >>> MeasurementModel(noise_percent=0.5, bandwidth_nm=5).describe()
        'noise 0.5 %, slit 5 nm; 2000 draws, seed 0'
        """
        parts = [
            f"{label} {getattr(self, key):g}{unit}"
            for key, label, unit in (
                ("noise_percent", "noise", " %"),
                ("scale_percent", "scale", " %"),
                ("wavelength_shift_nm", "wavelength shift", " nm"),
                ("stray_light_percent", "stray light", " % of peak"),
                ("bandwidth_nm", "slit", " nm"),
            )
            if getattr(self, key)
        ]
        return f"{', '.join(parts) or 'no uncertainty'}; {self.draws} draws, seed {self.seed}"

    def as_dict(self):
        """The model's keys and values (JSON-ready), with ``source``."""
        return {f.name: getattr(self, f.name) for f in fields(self)}


def read_measurement_model(path):
    """Read a measurement-model TOML file.

    Parameters
    ----------
    path : str or Path

    Returns
    -------
    MeasurementModel

    Raises
    ------
    InputError
        For a file that cannot be read or is not TOML, an unknown key, a value of the wrong type,
        a negative or non-finite value, and a model with no uncertainty at all; one line naming
        the file and the line of the key at fault.
    """
    data, text = read_toml(path)

    def fail(key, message):
        line = key_line(text, key)
        raise InputError(f"{path}{'' if line is None else f', line {line}'}: {message}")

    for key, value in data.items():
        if key not in MODEL_KEYS:
            fail(key, f"unknown key {key!r}; the keys are {', '.join(MODEL_KEYS)}")
        problem = _problem(key, value)
        if problem:
            fail(key, problem)
    model = MeasurementModel(**data, source=str(path))
    if model.is_zero:
        raise InputError(
            f"{path}: the model gives no uncertainty; set at least one of "
            + ", ".join(k for k in MODEL_KEYS if k not in _INTEGER_KEYS)
        )
    return model
