"""CCT/Duv: lampcalc against colour-science's Ohno 2013 and Robertson 1968, side by side.

The same 100,000 seeded points (CCT log-uniform 1000–100 000 K, Duv uniform ±0.05) go
through each method in one run. Printed: points per second, and on a subsample the max
and median relative CCT error and the max Duv error of each against the exact reference
(root finding on the full Planck sum, as in tests/test_locus.py), and the speed ratio
lampcalc / Ohno 2013. Not a test: run it by hand,

    python benchmarks/bench_cct.py [--points 100000] [--subsample 300]
"""

import argparse
import time
import warnings

import numpy as np
from scipy.optimize import brentq

import lampcalc
from lampcalc.physics.constants import C2_CIE_mK
from lampcalc.colorimetry.locus import locate
from lampcalc.spectra.resampling import GRID_NM
from lampcalc.spectra.tables import colour_matching_functions


def exact_locus(mired):
    cmf = colour_matching_functions()
    t = 1e6 / mired
    x = C2_CIE_mK / (GRID_NM * 1e-9 * t)
    L = lampcalc.spectral_radiance(t, GRID_NM, c2_mK=C2_CIE_mK)
    dL = -L * x * np.exp(x) / np.expm1(x) / mired
    X, dX = L @ cmf, dL @ cmf
    D, dD = X @ [1, 15, 3], dX @ [1, 15, 3]
    uv = np.array([4 * X[0], 6 * X[1]]) / D
    return uv, (np.array([4 * dX[0], 6 * dX[1]]) - uv * dD) / D


def reference(p):
    m = brentq(lambda m: float(np.dot(exact_locus(m)[0] - p, exact_locus(m)[1])), 9.9, 1010, xtol=1e-13, rtol=1e-15)
    uv, d = exact_locus(m)
    r = p - uv
    return 1e6 / m, (d[0] * r[1] - d[1] * r[0]) / np.hypot(*d)


def timed(fn, repeat=1):
    best = np.inf
    for _ in range(repeat):
        start = time.perf_counter()
        out = fn()
        best = min(best, time.perf_counter() - start)
    return out, best


def main():
    import colour
    from colour.temperature import uv_to_CCT_Ohno2013, uv_to_CCT_Robertson1968

    parser = argparse.ArgumentParser()
    parser.add_argument("--points", type=int, default=100_000)
    parser.add_argument("--subsample", type=int, default=300)
    args = parser.parse_args()

    rng = np.random.default_rng(1968)
    t = np.exp(rng.uniform(np.log(1000), np.log(100000), args.points))
    d = rng.uniform(-0.05, 0.05, args.points)
    uv = lampcalc.cct_duv_to_uv(np.stack([t, d], -1))
    sub = rng.choice(args.points, args.subsample, replace=False)
    ref = np.array([reference(p) for p in uv[sub]])

    rows = []
    lampcalc.cct_duv(uv[:10])  # build the table outside the timing
    (cct, duv, _), sec = timed(lambda: locate(uv), repeat=3)
    rows.append(("lampcalc (exact)", args.points / sec, np.stack([cct, duv], -1)[sub]))
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        out, sec = timed(lambda: uv_to_CCT_Robertson1968(uv))
        rows.append(("colour Robertson 1968", args.points / sec, out[sub]))
        n_ohno = min(args.points, 2000)
        _, sec = timed(lambda: uv_to_CCT_Ohno2013(uv[:n_ohno]))
        ohno_rate = n_ohno / sec
        rows.append(("colour Ohno 2013", ohno_rate, uv_to_CCT_Ohno2013(uv[sub])))

    print(f"colour-science {colour.__version__}, numpy {np.__version__}; {args.points} points, "
          f"errors on {args.subsample} against the exact reference")
    print(f"{'method':24s} {'points/s':>12s} {'max |dT/T|':>11s} {'median |dT/T|':>14s} "
          f"{'max |dT| K':>11s} {'max |dDuv|':>11s}")
    for name, rate, res in rows:
        rel = np.abs(res[:, 0] / ref[:, 0] - 1)
        print(f"{name:24s} {rate:12.0f} {np.nanmax(rel):11.2e} {np.nanmedian(rel):14.2e} "
              f"{np.nanmax(np.abs(res[:, 0] - ref[:, 0])):11.3g} {np.nanmax(np.abs(res[:, 1] - ref[:, 1])):11.2e}")
    print(f"speed ratio lampcalc / Ohno 2013: {rows[0][1] / ohno_rate:.0f}x "
          f"(Ohno timed on {n_ohno} points)")


if __name__ == "__main__":
    main()
