"""Reading speed of spectrum files: a large wide CSV, and files with one very long line.

Writes, in a temporary folder, a wide CSV (``--lamps`` columns of relative spectra at 1 nm,
380–780 nm, seeded) and text files whose metadata line or comment line is 20,000 and 80,000
characters long, then times :func:`lampcalc.read_spectra` on each (best of ``--repeat``).
Reading must be linear in the file's size: the long-line files should take about as long
per megabyte as the table. Not a test:

    python benchmarks/bench_reading.py [--lamps 2000] [--repeat 3]
"""

import argparse
import tempfile
import time
from pathlib import Path

import numpy as np

import lampcalc


def wide_csv(path, n_lamps, rng):
    wl = np.arange(380, 781)
    values = rng.random((wl.size, n_lamps)) + 0.01
    lines = ["wavelength_nm," + ",".join(f"QF-W-{k:05d}" for k in range(n_lamps))]
    lines += [f"{w}," + ",".join(f"{v:.6g}" for v in row) for w, row in zip(wl, values)]
    path.write_text("\n".join(lines) + "\n", encoding="utf-8")


def long_line(path, length, kind):
    table = "\n".join(f"{w},{1 + w / 1000:.4f}" for w in range(380, 781, 5))
    # Runs of blanks inside a line are what made a backtracking pattern quadratic.
    line = ("# a" if kind == "comment" else "a") + " " * length + "b"
    path.write_text(line + "\n" + table + "\n", encoding="utf-8")


def best_time(path, repeat):
    best = float("inf")
    for _ in range(repeat):
        start = time.perf_counter()
        lampcalc.read_spectra(path)
        best = min(best, time.perf_counter() - start)
    return best


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--lamps", type=int, default=2000)
    parser.add_argument("--repeat", type=int, default=3)
    args = parser.parse_args()
    rng = np.random.default_rng(12)
    with tempfile.TemporaryDirectory() as folder:
        folder = Path(folder)
        wide = folder / "wide.csv"
        wide_csv(wide, args.lamps, rng)
        size = wide.stat().st_size / 1e6
        seconds = best_time(wide, args.repeat)
        print(f"wide CSV, {args.lamps} lamps x 401 rows, {size:.1f} MB: {seconds:.2f} s, {size / seconds:.1f} MB/s")
        for kind in ("metadata", "comment"):
            for length in (20_000, 80_000):
                path = folder / f"{kind}_{length}.csv"
                long_line(path, length, kind)
                seconds = best_time(path, 1)
                print(f"{kind} line of {length:,} characters: {seconds:.3f} s")


if __name__ == "__main__":
    main()
