"""Units of spectral values: quantity and scale to SI. Scales follow the SI prefixes and
1 cm² = 1e-4 m² (SI Brochure, 9th edition, from memory); the quantities are those of CIE S 017
(spectral flux W/nm, irradiance W/(m² nm), radiance W/(sr m² nm); from memory)."""

import pytest

from lampcalc.io.radiometric_units import parse_unit, unit_in_header


@pytest.mark.parametrize(
    "text, quantity, scale",
    [
        ("W/nm", "flux", 1.0), ("mW/nm", "flux", 1e-3), ("µW/nm", "flux", 1e-6), ("uW/nm", "flux", 1e-6),
        ("nW/nm", "flux", 1e-9), ("W/µm", "flux", 1e-3),
        ("W/(m² nm)", "irradiance", 1.0), ("W/m2/nm", "irradiance", 1.0), ("W·m⁻²·nm⁻¹", "irradiance", 1.0),
        ("W m-2 nm-1", "irradiance", 1.0), ("µW/(cm² nm)", "irradiance", 1e-2), ("mW/(m^2 nm)", "irradiance", 1e-3),
        ("W/(sr m² nm)", "radiance", 1.0), ("W/(m²·sr·nm)", "radiance", 1.0), ("mW/(sr cm2 nm)", "radiance", 10.0),
        ("a.u.", "relative", 1.0), ("counts", "relative", 1.0), ("%", "relative", 1.0),
    ],
)
def test_units(text, quantity, scale):
    assert parse_unit(text) == (quantity, scale)


@pytest.mark.parametrize("text, problem", [("W/(sr nm)", "radiant intensity"), ("W/m2", "not a spectral unit"),
                                           ("W/(nm nm)", "not a spectral unit")])
def test_units_lampcalc_does_not_compute_with(text, problem):
    with pytest.raises(ValueError, match=problem):
        parse_unit(text)


@pytest.mark.parametrize("text", ["lm", "Lamp A", "nm", "K", "x" * 100])
def test_not_units(text):
    assert parse_unit(text) is None


@pytest.mark.parametrize(
    "cell, expected",
    [("Lamp A [mW/nm]", ("Lamp A", "mW/nm")), ("Spectral flux (mW/nm)", ("Spectral flux", "mW/nm")),
     ("Lamp (sample 2)", ("Lamp (sample 2)", None)), ("W/nm", ("", "W/nm")), ("counts", ("counts", None)),
     ("x [counts]", ("x", "counts")), ("1", ("1", None))],
)
def test_unit_in_header(cell, expected):
    assert unit_in_header(cell) == expected
