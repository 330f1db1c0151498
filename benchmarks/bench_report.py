"""Report speed: seconds per page of the PDF report for a batch of lamps.

The lamps are the bundled demo lamps of the fictional supplier, each tilted by a smooth
seeded factor (a physical model of a warmer or cooler batch of the same product), so that
every lamp has its own chromaticity and numbers. The report of all of them is written
twice, a claims check included, and the faster run is printed as seconds per page. Not a
test; the machine is noisy:

    python benchmarks/bench_report.py [--lamps 100] [--paper a4]
"""

import argparse
import tempfile
import time
from pathlib import Path

import numpy as np

import lampcalc
from lampcalc.io.demo_data import demo_claims, demo_files
from lampcalc.spectra.resampling import GRID_NM


def make_batch(n, rng):
    """``n`` lamps: demo spectra times exp(k·(λ − 580 nm)/100 nm) with a seeded k."""
    demo = lampcalc.SpectralBatch.concatenate([lampcalc.read_spectra(f).on_grid() for f in demo_files()])
    picks = np.arange(n) % demo.n_lamps
    tilt = np.exp(rng.uniform(-0.25, 0.25, n)[:, None] * (GRID_NM - 580.0) / 100.0)
    names = tuple(f"{demo.names[p]}#{i:03d}" for i, p in enumerate(picks))
    return lampcalc.SpectralBatch(
        GRID_NM, demo.values[picks] * tilt, names, quantity=tuple(demo.quantity[p] for p in picks),
        electrical_W=demo.electrical_W[picks],
    )


def claims_for(batch):
    """The demo supplier's claims, given to every lamp made from a claimed demo lamp."""
    claims = lampcalc.read_claims(demo_claims())
    from lampcalc.verdicts.claims import Claim

    out = {}
    for k, name in enumerate(batch.names):
        base = claims.get(name.split("#")[0])
        if base is not None:
            out[name] = Claim(name, k + 2, dict(base.values))
    return out


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--lamps", type=int, default=100)
    parser.add_argument("--paper", default="a4")
    args = parser.parse_args()
    batch = make_batch(args.lamps, np.random.default_rng(11))
    claims = claims_for(batch)
    nominal = [claims[n].values.get("nominal_cct_K", np.nan) if n in claims else np.nan for n in batch.names]
    ratings = lampcalc.rate_spectra(batch, nominal_cct_K=nominal)
    verdicts = lampcalc.check_claims(claims, ratings)
    extra = {"paper": args.paper} if "paper" in lampcalc.write_report.__code__.co_varnames else {}
    times = []
    with tempfile.TemporaryDirectory() as folder:
        for run in range(2):
            start = time.perf_counter()
            pages = lampcalc.write_report(Path(folder) / f"r{run}.pdf", ratings, verdicts, **extra)
            times.append(time.perf_counter() - start)
        size = (Path(folder) / "r0.pdf").stat().st_size
    best = min(times)
    print(f"{args.lamps} lamps, {pages} pages, {size / 1e6:.1f} MB: {best:.1f} s, {best / pages:.3f} s a page "
          f"(runs: {', '.join(f'{t:.1f} s' for t in times)})")


if __name__ == "__main__":
    main()
