"""Planckian locus, CCT and Duv: exactness, published values, reference libraries, edge cases."""

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.optimize import brentq

from lampcalc.colorimetry import tristimulus as cm
from lampcalc.colorimetry import locus as lo
from lampcalc.physics.blackbody import spectral_radiance
from lampcalc.physics.constants import C2_CIE_mK
from lampcalc.spectra.resampling import GRID_NM, sprague
from lampcalc.spectra.tables import colour_matching_functions


# --- The slow reference: root of d|p − L(T)|²/dT on the full Planck sum, one point at a time. ---
def _exact_locus(mired, observer="1931_2deg"):
    """u, v and du/dm, dv/dm straight from Planck's law (c2 = 1.4388e-2) and the CMFs, no table."""
    cmf = colour_matching_functions(observer)
    t = 1e6 / mired
    wl = GRID_NM * 1e-9
    x = C2_CIE_mK / (wl * t)
    L = spectral_radiance(t, GRID_NM, c2_mK=C2_CIE_mK)
    dL_dm = -L * x * np.exp(x) / np.expm1(x) / mired  # dL/dm = dL/dT · dT/dm
    X, dX = L @ cmf, dL_dm @ cmf
    D, dD = X @ [1, 15, 3], dX @ [1, 15, 3]
    uv = np.array([4 * X[0], 6 * X[1]]) / D
    duv = (np.array([4 * dX[0], 6 * dX[1]]) - uv * dD) / D
    return uv, duv


def reference_cct_duv(p, observer="1931_2deg"):
    def f(m):
        uv, duv = _exact_locus(m, observer)
        return float(np.dot(uv - p, duv))

    m = brentq(f, 1e6 / 101000, 1e6 / 990, xtol=1e-13, rtol=1e-15, maxiter=500)
    uv, duv = _exact_locus(m, observer)
    r = p - uv
    return 1e6 / m, (duv[0] * r[1] - duv[1] * r[0]) / np.hypot(*duv)


def _points(n, seed, duv_max=0.05):
    rng = np.random.default_rng(seed)
    t = np.exp(rng.uniform(np.log(1000), np.log(100000), n))
    d = rng.uniform(-duv_max, duv_max, n)
    # Points built from the exact locus and its exact normal, not from lampcalc's inverse.
    uv = np.empty((n, 2))
    for i in range(n):
        base, tangent = _exact_locus(1e6 / t[i])
        normal = np.array([-tangent[1], tangent[0]]) / np.hypot(*tangent)
        uv[i] = base + d[i] * normal
    return uv, t, d


def test_accuracy_claim_against_exact_reference():
    # The claim (docs/cct.md): relative CCT error ≤ 1e-7 and |ΔDuv| ≤ 1e-9 over 1000–100 000 K, |Duv| ≤ 0.05.
    uv, t, d = _points(150, seed=11)
    cct, duv, status = lo.locate(uv)
    ref = np.array([reference_cct_duv(p) for p in uv])
    assert np.all(status == 0)
    assert np.max(np.abs(cct / ref[:, 0] - 1)) <= 1e-7
    assert np.max(np.abs(duv - ref[:, 1])) <= 1e-9
    # And the points were built at (t, d): the reference finds them back.
    assert np.max(np.abs(ref[:, 0] / t - 1)) <= 1e-9 and np.max(np.abs(ref[:, 1] - d)) <= 1e-12


def test_accuracy_10_degree_observer():
    rng = np.random.default_rng(2)
    t = np.exp(rng.uniform(np.log(1000), np.log(100000), 20))
    d = rng.uniform(-0.05, 0.05, 20)
    uv = lo.cct_duv_to_uv(np.stack([t, d], -1), observer="1964_10deg")
    cct, duv, _ = lo.locate(uv, observer="1964_10deg")
    ref = np.array([reference_cct_duv(p, "1964_10deg") for p in uv])
    assert np.max(np.abs(cct / ref[:, 0] - 1)) <= 1e-7 and np.max(np.abs(duv - ref[:, 1])) <= 1e-9


def test_locus_is_planck_itself():
    # CIE 015:2018: the locus is the chromaticity of Planck's radiator (c2 = 1.4388e-2 m·K).
    t = np.array([1000.0, 2856.0, 6504.0, 100000.0])
    xy = cm.XYZ_to_xy(cm.tristimulus(spectral_radiance(t, GRID_NM, c2_mK=C2_CIE_mK)))
    np.testing.assert_allclose(lo.planckian_uv(t), cm.xy_to_uv(xy), atol=1e-15)
    np.testing.assert_allclose(lo.cct_duv_to_uv(np.stack([t, np.zeros(4)], -1)), cm.xy_to_uv(xy), atol=1e-13)
    cct, duv, _ = lo.locate(cm.xy_to_uv(xy))
    np.testing.assert_allclose(cct, t, rtol=1e-11)
    np.testing.assert_allclose(duv, 0, atol=1e-13)


def test_illuminant_a():
    # CIE 015:2018: A is Planckian at 2848 K with c2 = 1.435e-2, i.e. 2848·1.4388/1.435 = 2855.5 K.
    a = 100 * (560 / GRID_NM) ** 5 * (np.exp(1.435e7 / (2848 * 560)) - 1) / (np.exp(1.435e7 / (2848 * GRID_NM)) - 1)
    cct, duv = lo.xy_to_cct_duv(cm.XYZ_to_xy(cm.tristimulus(a)))
    assert cct == pytest.approx(2848 * 1.4388 / 1.435, abs=0.05)
    assert cct == pytest.approx(2855.5, abs=1.0)
    assert abs(duv) < 1e-6


# CIE 015:2018 published CCTs (shared/REFERENCE_VALUES.md). The FL values are rounded to 10 K;
# CIE computed all of them from the 5 nm tables, which Sprague interpolation (CIE 167) reproduces.
PUBLISHED = {
    "D65": (6504, 1), "FL1": (6430, 10), "FL2": (4230, 10), "FL3": (3450, 10), "FL4": (2940, 10),
    "FL5": (6350, 10), "FL6": (4150, 10), "FL7": (6500, 10), "FL8": (5000, 10), "FL9": (4150, 10),
    "FL10": (5000, 10), "FL11": (4000, 10), "FL12": (3000, 10), "LED-B1": (2733, 2), "LED-B2": (2998, 2),
    "LED-B3": (4103, 2), "LED-B4": (5109, 2), "LED-B5": (6598, 2), "LED-BH1": (2851, 2),
    "LED-RGB1": (2840, 2), "LED-V1": (2724, 2), "LED-V2": (4070, 2),
}


@pytest.mark.parametrize("name", sorted(PUBLISHED))
def test_cie_published_ccts(name):
    import colour

    cct_pub, tol = PUBLISHED[name]
    sd = colour.SDS_ILLUMINANTS[name]  # data: colour-science's copy of the CIE tables
    xy = cm.XYZ_to_xy(cm.tristimulus(sprague(sd.wavelengths, sd.values)))
    cct, _ = lo.xy_to_cct_duv(xy)
    assert cct == pytest.approx(cct_pub, abs=tol)


def test_agrees_with_ohno_2013_within_its_claim():
    import colour

    # Ohno (2013, Leukos 10:47–55): within 1 K for 1000–20 000 K, |Duv| ≤ 0.03. Reference library:
    # colour-science's uv_to_CCT_Ohno2013.
    rng = np.random.default_rng(4)
    t = np.exp(rng.uniform(np.log(1000), np.log(20000), 60))
    d = rng.uniform(-0.03, 0.03, 60)
    uv = lo.cct_duv_to_uv(np.stack([t, d], -1))
    ohno = np.array([colour.temperature.uv_to_CCT_Ohno2013(p) for p in uv])
    ours = lo.cct_duv(uv)
    assert np.max(np.abs(ohno[:, 0] - ours[..., 0])) < 1.0
    assert np.max(np.abs(ohno[:, 1] - ours[..., 1])) < 1e-5


def test_agrees_with_krystek_1985_within_its_fit():
    import colour

    # Krystek (1985) fits the locus over 1000–15 000 K to about 1e-4 in u, v (from memory);
    # colour-science's CCT_to_uv_Krystek1985 as reference library, measured 1.07e-4 here.
    t = np.linspace(1000, 15000, 57)
    np.testing.assert_allclose(colour.temperature.CCT_to_uv_Krystek1985(t), lo.planckian_uv(t), atol=1.5e-4)


def test_duv_sign_positive_above_the_locus():
    # ANSI C78.377: Duv > 0 above the Planckian locus (towards green), < 0 below (towards pink).
    base = lo.planckian_uv(3000.0)
    above, below = base + [0, 0.004], base - [0, 0.004]
    assert lo.cct_duv(above)[1] > 0 > lo.cct_duv(below)[1]
    # A greenish LED chromaticity (x, y) = (0.44, 0.43) sits above the locus.
    assert lo.xy_to_cct_duv([0.44, 0.43])[1] > 0.005


@settings(max_examples=200, deadline=None)
@given(st.floats(1000, 100000), st.floats(-0.05, 0.05))
def test_round_trip(t, d):
    uv = lo.cct_duv_to_uv([t, d])
    cct, duv, status = lo.locate(uv)
    assert status == 0 or (status == lo.STATUS_FAR_FROM_LOCUS and abs(d) > 0.0499999)
    assert cct == pytest.approx(t, rel=1e-9)
    assert duv == pytest.approx(d, abs=1e-12)


@settings(max_examples=60, deadline=None)
@given(st.floats(1000, 100000), st.floats(-0.0499, 0.0499))
def test_round_trip_xy_and_upvp(t, d):
    xy = lo.cct_duv_to_xy([t, d])
    np.testing.assert_allclose(lo.xy_to_cct_duv(xy), [t, d], rtol=1e-9, atol=1e-12)
    upvp = cm.xy_to_upvp(xy)
    np.testing.assert_allclose(lo.upvp_to_cct_duv(upvp), [t, d], rtol=1e-9, atol=1e-12)


def test_out_of_range_is_nan_with_reason_never_clamped():
    # PITFALLS: a table method returned its end (1666.67 K) for any input below it; lampcalc gives NaN.
    uv = lo.planckian_uv(np.array([900.0, 1000.0, 100000.0, 150000.0, 1e6]))
    cct, duv, status = lo.locate(uv)
    assert np.isnan(cct[0]) and status[0] == lo.STATUS_BELOW_RANGE
    assert cct[1] == pytest.approx(1000.0) and status[1] == 0
    assert cct[2] == pytest.approx(100000.0) and status[2] == 0
    assert np.all(np.isnan(cct[3:])) and np.all(status[3:] == lo.STATUS_ABOVE_RANGE)
    assert lo.status_words(status[0]) == ["cct_below_1000K"]
    with pytest.warns(lo.LocusRangeWarning, match="cct_above_100000K"):
        out = lo.cct_duv(uv[3])
    assert np.all(np.isnan(out))


def test_far_from_locus_computed_and_flagged():
    # CIE 015:2018: CCT is not to be used far from the locus; lampcalc flags |Duv| > 0.05.
    uv = lo.planckian_uv(4000.0) + [0.0, 0.07]
    cct, duv, status = lo.locate(uv)
    assert status == lo.STATUS_FAR_FROM_LOCUS and np.isfinite(cct) and duv > 0.05
    ref_cct, ref_duv = reference_cct_duv(uv)
    assert cct == pytest.approx(ref_cct, rel=1e-7) and duv == pytest.approx(ref_duv, abs=1e-9)
    with pytest.warns(lo.LocusRangeWarning, match="duv_beyond_0.05"):
        lo.cct_duv(uv)


def test_nan_in_nan_out_and_shapes():
    with pytest.warns(lo.LocusRangeWarning, match="not_a_chromaticity"):
        out = lo.cct_duv([[np.nan, 0.3], [0.25, 0.35]])
    assert np.all(np.isnan(out[0])) and np.all(np.isfinite(out[1]))
    uv = lo.cct_duv_to_uv([3000.0, 0.001])
    assert uv.shape == (2,) and lo.cct_duv(uv).shape == (2,)
    many = np.tile(uv, (5, 1))
    assert lo.cct_duv(many).shape == (5, 2)
    cube = np.tile(uv, (3, 4, 1))
    assert lo.cct_duv(cube).shape == (3, 4, 2) and lo.cct_duv_to_uv(lo.cct_duv(cube)).shape == (3, 4, 2)
    with pytest.raises(ValueError, match=r"shape \(\.\.\., 2\)"):
        lo.cct_duv([0.2, 0.3, 0.4])


def test_large_batches_in_chunks():
    # More points than one chunk: the chunked result equals point-by-point results.
    uv, _, _ = _points(3, seed=1)
    many = np.tile(uv, (30000, 1))
    cct, duv, _ = lo.locate(many)
    single = [lo.locate(p) for p in uv]
    np.testing.assert_array_equal(cct.reshape(-1, 3), np.tile([s[0] for s in single], (30000, 1)))


def test_inverse_out_of_range():
    with pytest.warns(lo.LocusRangeWarning):
        uv = lo.cct_duv_to_uv([[500.0, 0.0], [3000.0, 0.0], [2e5, 0.0]])
    assert np.all(np.isnan(uv[0])) and np.all(np.isfinite(uv[1])) and np.all(np.isnan(uv[2]))


def test_isotemperature_lines_are_normal_to_the_locus():
    # CIE 015:2018: isotemperature lines are normal to the Planckian locus in the CIE 1960 diagram.
    lines = lo.isotemperature_lines([2000.0, 4000.0, 10000.0], (-0.02, 0.02), 5)
    assert lines.shape == (3, 5, 2)
    for t, line in zip([2000.0, 4000.0, 10000.0], lines):
        _, tangent = _exact_locus(1e6 / t)
        direction = line[-1] - line[0]
        assert abs(np.dot(direction, tangent)) / (np.linalg.norm(direction) * np.linalg.norm(tangent)) < 1e-10
        np.testing.assert_allclose(lo.locate(line)[0], t, rtol=1e-9)


def test_points_outside_the_spectrum_locus_are_not_chromaticities():
    # CIE 015:2018, clause 8.1: the spectrum locus and the purple line enclose every real colour.
    # Monochromatic points from colour-science's CIE 1931 CMFs (reference library) and mixes of them
    # are chromaticities; points beyond the locus (x + y > 1, negative, past the red end) are not.
    import colour

    cmfs = colour.MSDS_CMFS["CIE 1931 2 Degree Standard Observer"].copy().align(colour.SpectralShape(380, 700, 5))
    XYZ = cmfs.values
    mono = XYZ / XYZ.sum(axis=-1, keepdims=True)
    rng = np.random.default_rng(7)
    weights = rng.random((200, XYZ.shape[0])) ** 8  # mixes, many near the locus
    mixes = weights @ XYZ
    inside = np.vstack([mono[:, :2], mixes[:, :2] / mixes.sum(axis=-1, keepdims=True)])
    assert not np.any(lo.outside_spectrum_locus(cm.xy_to_uv(inside)))
    outside = np.array([[0.9, 0.9], [0.6, 0.5], [-0.01, 0.3], [0.76, 0.26], [0.3, 0.05]])
    assert np.all(lo.outside_spectrum_locus(cm.xy_to_uv(outside)))
    # coordinates given by a user get no CCT there; locate itself still computes the number
    cct, duv, flags = lo.locate_with_flags(np.vstack([outside, [[0.3127, 0.3290]]]), "xy")
    assert flags[:5] == ["not_a_chromaticity"] * 5 and flags[5] == ""
    assert np.all(np.isnan(cct[:5])) and np.all(np.isnan(duv[:5])) and np.isfinite(cct[5])
