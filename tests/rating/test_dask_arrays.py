"""Ratings of a dask array of spectra: exactly rate_spectra's numbers, chunk by chunk, on a cluster too.

The reference is rate_spectra on the same spectra in one batch (lampcalc's main path, held to
the standards by tests/rating/test_rate.py); they must agree exactly, not to a tolerance.
"""

import numpy as np
import pytest

from lampcalc.rating.dask_arrays import ARRAY_FIELDS, FLAG_BITS, flag_mask, flag_names, rate_dask_array
from lampcalc.rating.rate import rate_spectra
from lampcalc.rating.wide_columns import SPREAD
from lampcalc.spectra.batch import SpectralBatch

da = pytest.importorskip("dask.array")


def _cube(shape, step=5, seed=3):
    """A spectral image of a fictional scene: blackbody pixels of random temperature and brightness."""
    from lampcalc.physics.blackbody import spectral_radiance

    rng = np.random.default_rng(seed)
    wl = np.arange(380.0, 781.0, step)
    n = int(np.prod(shape))
    temps = rng.uniform(1800.0, 12000.0, n)
    values = spectral_radiance(temps, wl) * rng.uniform(0.1, 2.0, (n, 1)) / spectral_radiance(5000.0, 560.0)
    return wl, values.reshape(*shape, wl.size)


def _expected(wl, values, **options):
    flat = values.reshape(-1, wl.size)
    return rate_spectra(SpectralBatch(wl, flat, names=("",) * flat.shape[0]), **options)


def _assert_exact(out, expected, shape):
    for key, width in ARRAY_FIELDS.items():
        got = out[key]
        assert got.shape == shape + ((width,) if width else ()), key
        want = np.asarray(expected[key], dtype=float).reshape(got.shape)
        assert np.array_equal(got, want, equal_nan=True), key
    # a bit mask keeps the set of flags, in FLAG_BITS order
    assert [flag_names(m) for m in out["flags"].ravel()] == [tuple(sorted(f, key=FLAG_BITS.index)) for f in expected["flags"]]


def test_a_chunked_cube_agrees_exactly_with_rate_spectra():
    wl, values = _cube((6, 7))
    values[0, 0] = 0.0  # a dark pixel: no chromaticity, flagged
    cube = da.from_array(values, chunks=(4, 3, 20))  # chunks cut across the wavelengths too
    lazy = rate_dask_array(cube, wl)
    assert lazy["cct_K"].shape == (6, 7) and lazy["ri"].shape == (6, 7, 15)
    import dask

    out = dict(zip(lazy, dask.compute(*lazy.values())))
    _assert_exact(out, _expected(wl, values), (6, 7))
    assert "not_a_chromaticity" in flag_names(out["flags"][0, 0])


def test_the_same_call_runs_on_a_local_cluster():
    distributed = pytest.importorskip("distributed")
    wl, values = _cube((300,), step=10, seed=5)
    with distributed.LocalCluster(n_workers=2, threads_per_worker=1, processes=False, dashboard_address=None) as cluster, \
            distributed.Client(cluster) as client:
        lazy = rate_dask_array(da.from_array(values, chunks=(70, wl.size)), wl, quantity="irradiance")
        out = dict(zip(lazy, client.compute(list(lazy.values()), sync=True)))
    expected = rate_spectra(SpectralBatch(wl, values, names=("",) * 300, quantity="irradiance"))
    _assert_exact(out, expected, (300,))
    assert np.all(np.isfinite(out["illuminance_lx"]))  # irradiance spectra: illuminance is given


def test_one_spectrum_and_bad_shapes():
    wl, values = _cube((1,))
    out = rate_dask_array(values[0], wl)
    assert out["cct_K"].shape == () and out["ri"].shape == (15,)
    assert float(out["cct_K"].compute()) == float(_expected(wl, values)["cct_K"][0])
    with pytest.raises(ValueError, match=r"shape \(\.\.\., 81\)"):
        rate_dask_array(values[:, :-1], wl)


def test_flag_bits_round_trip_and_every_list_has_its_width():
    for flags in [(), ("range_truncated",), FLAG_BITS[:3], FLAG_BITS[-2:]]:
        assert flag_names(flag_mask(flags)) == tuple(sorted(flags, key=FLAG_BITS.index))
    assert {k: w for k, w in ARRAY_FIELDS.items() if w} == {k: len(v) for k, v in SPREAD.items()}
