"""Rating in chunks: the same bytes as one call on every lamp, whatever the chunks or workers.

The reference is lampcalc's own one-batch path (``rate_spectra`` on all lamps at once, its
JSON), which the published checks of tests/rating/test_rate.py hold to the standards; the
property here is internal (no published source): chunking may not change a single byte.
"""

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from lampcalc.io.delimited_text import read_spectra_text
from lampcalc.rating.rate import rate_spectra
from lampcalc.rating.streaming import join_ratings, lamp_chunks, rate_chunks, take_ratings
from lampcalc.spectra.batch import SpectralBatch


def _lamps(n, step=5, seed=0):
    """n lamps of a fictional supplier made from physical models: blackbodies plus a phosphor-like hump."""
    from lampcalc.physics.blackbody import spectral_radiance

    rng = np.random.default_rng(seed)
    wl = np.arange(380.0, 781.0, step)
    temps = rng.uniform(2000.0, 9000.0, n)
    hump = np.exp(-0.5 * ((wl - rng.uniform(520, 620, (n, 1))) / rng.uniform(20, 60, (n, 1))) ** 2)
    values = spectral_radiance(temps, wl) / spectral_radiance(temps, 560.0).reshape(n, 1) + rng.uniform(0, 2, (n, 1)) * hump
    return SpectralBatch(wl, values, names=tuple(f"QF-T{k:03d}" for k in range(n)))


@pytest.fixture(scope="module")
def lamps():
    return [_lamps(7, 5, 1), _lamps(11, 1, 2), _lamps(5, 10, 3)]


@pytest.fixture(scope="module")
def whole(lamps):
    return rate_spectra(lamps)


@settings(max_examples=12, deadline=None)
@given(chunk=st.integers(1, 25))
def test_chunked_rating_writes_the_same_bytes(lamps, whole, chunk):
    grid = [b.on_grid() for b in lamps]
    parts = list(rate_chunks(lamp_chunks(grid, chunk)))
    assert [len(p) for p in parts[:-1]] == [chunk] * (len(parts) - 1)
    joined = join_ratings(parts)
    assert joined.to_json() == whole.to_json()
    assert joined.to_csv() == whole.to_csv()
    assert parts[0].extras == {}  # files need no spectra


def test_extras_kept_for_figures_when_asked(lamps, whole):
    parts = list(rate_chunks(lamp_chunks([b.on_grid() for b in lamps], 4), keep_extras=True))
    joined = join_ratings(parts)
    assert np.array_equal(joined.extras["batch"].values, whole.extras["batch"].values)
    assert np.array_equal(joined.extras["test_ab_bins"], whole.extras["test_ab_bins"], equal_nan=True)
    part = take_ratings(joined, 3, 9)
    assert part["name"] == whole["name"][3:9] and part.extras["batch"].names == whole["name"][3:9]


def test_nominal_cct_by_name_without_regard_to_case(lamps):
    nominal = {"qf-t002": 3000.0}
    (ratings,) = rate_chunks(lamp_chunks([lamps[0].on_grid()], 100), nominal=nominal)
    expected = rate_spectra(lamps[0], nominal_cct_K=[np.nan, np.nan, 3000.0] + [np.nan] * 4)
    assert ratings.to_json() == expected.to_json()
    assert ratings["sdcm_centre_nominal_cct_K"][2] == 3000.0  # the claimed centre is used


def test_two_worker_processes_give_the_same_bytes(lamps, whole):
    pytest.importorskip("dask")
    grid = [b.on_grid() for b in lamps]
    parts = list(rate_chunks(lamp_chunks(grid, 3), workers=2))
    assert join_ratings(parts).to_json() == whole.to_json()


def test_a_text_file_read_in_chunks_is_rated_as_read_whole(tmp_path, monkeypatch):
    # the same lamps through the large-table reader (forced for a small file) in chunks of 4
    from lampcalc.io import large_tables
    from lampcalc.io.spectrum_files import open_spectra, write_spectra_csv

    batch = _lamps(13, 5, 4)
    path = tmp_path / "lamps.csv"
    write_spectra_csv(batch, path)
    monkeypatch.setattr(large_tables, "FAST_MIN_BYTES", 0)
    with open_spectra(path) as spectra:
        assert isinstance(spectra, large_tables.LargeText)
        parts = list(rate_chunks(lamp_chunks((c.on_grid() for c in spectra.chunks(4)), 5)))
    careful = read_spectra_text(path.read_text(), str(path))
    assert join_ratings(parts).to_json() == rate_spectra(careful).to_json()
