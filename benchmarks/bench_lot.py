"""Lot statistics at scale: the farthest pair (convex hull and blocks against every pair) and a whole lot.

    python benchmarks/bench_lot.py

Prints, in one run on the same seeded points: the farthest-pair time with the hull and with
every pair compared in blocks, their ratio and whether they agree; then lot_statistics on
invented lots of 1,000 to 1,000,000 samples with the time and the peak memory the call
allocates (tracemalloc). Not a test: the machine is noisy, run it twice.
"""

import time
import tracemalloc

import numpy as np

import lampcalc.verdicts.spread as spread
from lampcalc.colorimetry.tristimulus import xy_to_upvp
from lampcalc.rating.ratings import Ratings
from lampcalc.verdicts.lot import lot_statistics


def invented(n, rng):
    """Ratings of an invented lot around the ANSI 3000 K centre (only what lot_statistics reads)."""
    xy = np.array([0.4339, 0.4033]) + rng.normal(0.0, 0.002, (n, 2))
    upvp = xy_to_upvp(xy)
    nan = np.full(n, np.nan)
    cols = {"name": tuple(f"S{k}" for k in range(n)), "source": ("",) * n, "quantity": ("relative",) * n,
            "x": xy[:, 0], "y": xy[:, 1], "u_prime": upvp[:, 0], "v_prime": upvp[:, 1],
            "cct_K": rng.normal(3000, 40, n), "duv": rng.normal(0.001, 0.001, n), "ra": rng.normal(84, 1, n),
            "ri": rng.normal(60, 10, (n, 15)), "rf": rng.normal(83, 1, n), "rg": rng.normal(101, 1, n),
            "ler_lm_per_W": rng.normal(320, 3, n), "sp_ratio": rng.normal(1.3, 0.01, n),
            "melanopic_der": rng.normal(0.42, 0.004, n), "flags": ((),) * n}
    for key in ("luminous_flux_lm", "radiant_flux_W", "illuminance_lx", "luminance_cd_per_m2", "efficacy_lm_per_W",
                "melanopic_edi_lx"):
        cols[key] = nan
    return Ratings(cols)


def farthest_pair_side_by_side(n=20_000):
    points = np.random.default_rng(1).normal(0.0, 1.0, (n, 2))
    spread.hull_vertices(points[:10])  # import SciPy's Qhull before timing
    start = time.perf_counter()
    hull = spread.farthest_pair(points)
    t_hull = time.perf_counter() - start
    kept = spread._HULL_ABOVE
    spread._HULL_ABOVE = n + 1  # every pair, in blocks
    try:
        start = time.perf_counter()
        every = spread.farthest_pair(points)
        t_every = time.perf_counter() - start
    finally:
        spread._HULL_ABOVE = kept
    print(f"farthest pair of {n} points: hull {t_hull * 1e3:.1f} ms, every pair {t_every:.2f} s, "
          f"ratio {t_every / t_hull:.0f}x, same pair: {hull == every}")


def lots():
    rng = np.random.default_rng(14)
    lot_statistics(invented(100, rng), nominal_cct_K=3000)  # imports and cached tables before timing
    print(f"{'samples':>9}  {'time':>7}  {'peak memory':>11}")
    for n in (1_000, 10_000, 100_000, 1_000_000):
        ratings = invented(n, rng)
        tracemalloc.start()
        start = time.perf_counter()
        lot_statistics(ratings, nominal_cct_K=3000)
        elapsed = time.perf_counter() - start
        peak = tracemalloc.get_traced_memory()[1]
        tracemalloc.stop()
        print(f"{n:>9}  {elapsed:>6.2f}s  {peak / 2**20:>8.0f} MB")


if __name__ == "__main__":
    farthest_pair_side_by_side()
    lots()
