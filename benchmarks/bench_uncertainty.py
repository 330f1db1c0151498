"""Monte Carlo uncertainty speed and memory: 2,000 draws of the full rating of one lamp, and of 100 lamps.

The lamps are phosphor-converted white LEDs made from physical shapes (a blue die and a broad
phosphor, 2700–6500 K), sampled at 1 nm over 380–780 nm as a spectrometer would give them. The
measurement model has every effect (noise, scale, wavelength shift, stray light, slit); the
wavelength shift needs one resampling per draw, so the same run is repeated without it, and the
plain batched rating of as many spectra is timed beside them, all in one run. Printed per case:
seconds, seconds per lamp, draws per second, and the peak memory that tracemalloc sees (a second,
separate run of each case, so that tracing does not slow the timings). Not a test:

    python benchmarks/bench_uncertainty.py [--lamps 100] [--draws 2000]

Target: at most 1 s a lamp on the project's two-core machine.
"""

import argparse
import time
import tracemalloc

import numpy as np

import lampcalc
from lampcalc.spectra.resampling import GRID_NM


def make_lamps(n, rng):
    wl = np.arange(380.0, 781.0)
    blue = rng.uniform(445.0, 460.0, (n, 1))
    phosphor = rng.uniform(545.0, 610.0, (n, 1))
    share = rng.uniform(0.15, 0.6, (n, 1))
    values = share * np.exp(-0.5 * ((wl - blue) / 9.0) ** 2) + np.exp(-0.5 * ((wl - phosphor) / 50.0) ** 2)
    values *= 1.0 + 0.002 * rng.standard_normal(values.shape)
    return lampcalc.SpectralBatch(wl, np.clip(values, 0.0, None), tuple(f"led{i}" for i in range(n)), quantity="flux")


def run_case(work):
    start = time.perf_counter()
    work()
    elapsed = time.perf_counter() - start
    tracemalloc.start()
    work()
    peak = tracemalloc.get_traced_memory()[1]
    tracemalloc.stop()
    return elapsed, peak


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--lamps", type=int, default=100)
    parser.add_argument("--draws", type=int, default=2000)
    args = parser.parse_args()
    rng = np.random.default_rng(15)
    lamps = make_lamps(args.lamps, rng)
    full = lampcalc.MeasurementModel(noise_percent=1.0, scale_percent=3.0, wavelength_shift_nm=0.8,
                                     stray_light_percent=0.2, bandwidth_nm=8.0, draws=args.draws)
    no_shift = lampcalc.MeasurementModel(**{**full.as_dict(), "wavelength_shift_nm": 0.0})
    lampcalc.rate_with_uncertainty(lamps[:1], lampcalc.MeasurementModel(**{**full.as_dict(), "draws": 100}))  # warm up

    one = lamps[:1]
    grid = lampcalc.SpectralBatch(GRID_NM, np.repeat(one.on_grid().values, args.draws, axis=0), ("led0",) * args.draws)
    cases = [
        ("1 lamp, every effect", 1, lambda: lampcalc.rate_with_uncertainty(one, full)),
        ("1 lamp, no wavelength shift", 1, lambda: lampcalc.rate_with_uncertainty(one, no_shift)),
        (f"plain rating of {args.draws} spectra", 1, lambda: lampcalc.rate_spectra(grid)),
        (f"{args.lamps} lamps, every effect", args.lamps, lambda: lampcalc.rate_with_uncertainty(lamps, full)),
        (f"{args.lamps} lamps, no wavelength shift", args.lamps, lambda: lampcalc.rate_with_uncertainty(lamps, no_shift)),
    ]
    print(f"{args.draws} draws a lamp; peak memory by tracemalloc (NumPy arrays included)")
    print(f"{'case':38s} {'s':>8s} {'s/lamp':>8s} {'draws/s':>9s} {'peak MB':>8s}")
    results = {}
    for label, n, work in cases:
        elapsed, peak = run_case(work)
        results[label] = elapsed / n
        print(f"{label:38s} {elapsed:8.2f} {elapsed / n:8.3f} {n * args.draws / elapsed:9.0f} {peak / 2**20:8.1f}")
    plain = results[f"plain rating of {args.draws} spectra"]
    print(f"Monte Carlo / plain rating of the same number of spectra, 1 lamp: "
          f"{results['1 lamp, every effect'] / plain:.2f} (every effect), {results['1 lamp, no wavelength shift'] / plain:.2f} (no shift)")


if __name__ == "__main__":
    main()
