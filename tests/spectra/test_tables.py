"""The shipped tables equal what scripts/make_tables.py writes from colour-science's datasets."""

import importlib.util
from pathlib import Path

import numpy as np
import pytest

from lampcalc.spectra import tables

ROOT = Path(__file__).resolve().parents[2]
SHARED_S026 = ROOT.parent / "shared" / "data" / "cie_s026_alpha_opic_1nm.csv"


def _script():
    spec = importlib.util.spec_from_file_location("make_tables", ROOT / "scripts" / "make_tables.py")
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


def test_shipped_tables_equal_generated():
    # Source: colour-science's datasets (reference library) and the CIE S 026 file in shared/data.
    if not SHARED_S026.exists():
        pytest.skip("shared/data is not beside this checkout")
    rendered = _script().render_tables(SHARED_S026)
    data = ROOT / "lampcalc" / "data"
    for name, text in rendered.items():
        assert (data / name).read_text(encoding="utf-8") == text, name
    shipped = {p.name for p in data.glob("*.csv")}
    assert shipped == set(rendered)


def test_every_table_has_a_source_line():
    for path in (ROOT / "lampcalc" / "data").glob("*.csv"):
        first = path.read_text(encoding="utf-8").splitlines()[0]
        assert first.startswith("# ") and len(first) > 20, path.name


def test_tables_on_grid_match_colour_science():
    import colour
    from colour.colorimetry import SDS_LEFS_PHOTOPIC

    # Source: colour-science 0.4.x datasets (reference library).
    cmfs = colour.MSDS_CMFS["CIE 1931 2 Degree Standard Observer"]
    np.testing.assert_array_equal(tables.colour_matching_functions("1931_2deg"), cmfs.values)
    v = SDS_LEFS_PHOTOPIC["CIE 1924 Photopic Standard Observer"]
    np.testing.assert_array_equal(tables.luminous_efficiency(), v.values)
    # V(λ) = ȳ(λ) for the 1931 observer (CIE 015:2018).
    np.testing.assert_allclose(tables.luminous_efficiency(), cmfs.values[:, 1], atol=1e-9)


def test_tables_zero_outside_their_range():
    # CIE 1951 V'(λ) is tabulated 380–780 nm (ISO 23539/CIE S 010); zero outside, never extrapolated.
    vp = tables.scotopic_luminous_efficiency()
    assert vp.shape == (471,)
    assert np.all(vp[:20] == 0) and np.all(vp[421:] == 0) and vp[20] > 0
    # V'(507 nm) = 1 (peak of the scotopic function, ISO 23539).
    assert vp[507 - 360] == pytest.approx(1.0, abs=1e-6)
    s026 = tables.action_spectra_s026()
    assert s026.shape == (471, 5)
    # Melanopic peak near 490 nm (CIE S 026:2018).
    assert 485 <= 360 + int(np.argmax(s026[:, 4])) <= 495


def test_daylight_components_linear_on_the_1nm_grid():
    from colour.colorimetry import SDS_BASIS_FUNCTIONS_CIE_ILLUMINANT_D_SERIES as basis

    # CIE 015: the components are interpolated linearly; at the 5 nm nodes they are the table itself
    # (colour-science's copy, reference library).
    s = tables.daylight_components()
    for k, key in enumerate(("S0", "S1", "S2")):
        sel = basis[key].wavelengths >= 360
        np.testing.assert_array_equal(s[::5, k], basis[key].values[sel])
        np.testing.assert_allclose(s[1:-1:5, k], 0.8 * s[:-5:5, k] + 0.2 * s[5::5, k], atol=1e-12)


def test_unknown_observer_lists_the_valid_ones():
    with pytest.raises(ValueError, match="1931_2deg, 1964_10deg"):
        tables.colour_matching_functions("2deg")


def test_tables_are_read_only():
    with pytest.raises(ValueError):
        tables.luminous_efficiency()[0] = 1.0
