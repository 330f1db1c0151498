"""Ratings as a table: keys, length, membership, the wide form and pandas. Internal checks of shape;
the values are compared with the ratings' own columns."""

import sys

import numpy as np
import pytest

from lampcalc.rating.rate import rate_spectra
from lampcalc.rating.wide_columns import SPREAD, ratings_sheets, wide_columns
from lampcalc.spectra.batch import SpectralBatch


@pytest.fixture(scope="module")
def ratings():
    from lampcalc.physics.blackbody import spectral_radiance

    wl = np.arange(360.0, 831.0)
    values = spectral_radiance(np.array([2700.0, 6500.0, 1500.0]), wl)
    return rate_spectra(SpectralBatch(wl, values, ("QF-A", "QF-B", "QF-C")))


def test_behaves_like_a_table(ratings):
    assert len(ratings) == 3
    assert "cct_K" in ratings and "lumens" not in ratings
    assert list(ratings) == ratings.keys() and ratings.keys()[:2] == ["name", "source"]


def test_wide_columns_spread_lists(ratings):
    table = wide_columns(ratings)
    assert "ri" not in table and "rf_hue_bins" not in table
    for i in range(3):
        ri = [None if not np.isfinite(v) else float(v) for v in ratings["ri"][i]]
        assert [table[f"r{k}"][i] for k in range(1, 16)] == ri
        assert table["rf_h16"][i] == (float(ratings["rf_hue_bins"][i][15]) if np.isfinite(ratings["rf_hue_bins"][i][15]) else None)
    assert table["ler_range_start_nm"] == [360.0] * 3
    assert all(len(column) == 3 for column in table.values())
    assert {name for names in SPREAD.values() for name in names} <= set(table)


def test_flags_sheet_explains_every_flag(ratings):
    sheets = dict((title, (header, rows)) for title, header, rows in ratings_sheets(ratings))
    flagged = {f for flags in ratings["flags"] for f in flags}
    assert flagged  # 1500 K is below the IEC 60081 ellipses' 2700-6500 K (docs/claims.md)
    explained = {row[0] for row in sheets["flags"][1]}
    assert flagged <= explained


def test_to_pandas(ratings):
    pandas = pytest.importorskip("pandas")
    frame = ratings.to_pandas()
    assert isinstance(frame, pandas.DataFrame) and len(frame) == 3
    assert frame.loc[1, "cct_K"] == pytest.approx(float(ratings["cct_K"][1]))
    assert frame.loc[0, "r9"] == pytest.approx(float(ratings["ri"][0][8]))


def test_to_pandas_without_pandas_names_the_extra(ratings, monkeypatch):
    monkeypatch.setitem(sys.modules, "pandas", None)
    with pytest.raises(ImportError, match=r"pip install 'lampcalc\[pandas\]'"):
        ratings.to_pandas()
