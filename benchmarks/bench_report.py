"""Report speed: seconds per page of the PDF report of a batch of lamps, with a claims check.

The lamps are the bundled demo lamps of the fictional supplier, each tilted by a smooth
seeded factor (a physical model of a warmer or cooler batch of the same product), so that
every lamp has its own chromaticity and numbers; each inherits the demo supplier's claims.
Each run writes the whole report in a fresh process and prints wall-clock and CPU seconds per
page. With ``--baseline DIR`` (another lampcalc source tree, e.g. ``git archive main``
unpacked) the same runs alternate between that tree and this one, so the ratio is measured
side by side on the same machine at the same load. Not a test; the machine is noisy:

    python benchmarks/bench_report.py [--lamps 100] [--paper a4] [--runs 2] [--baseline DIR]
"""

import argparse
import json
import os
import subprocess
import sys
import tempfile
import time
from pathlib import Path

import numpy as np


def make_batch(n, rng):
    """``n`` lamps: demo spectra times exp(k·(λ − 580 nm)/100 nm) with a seeded k."""
    import lampcalc
    from lampcalc.io.demo_data import demo_files
    from lampcalc.spectra.resampling import GRID_NM

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
    import lampcalc
    from lampcalc.io.demo_data import demo_claims
    from lampcalc.verdicts.claims import Claim

    claims = lampcalc.read_claims(demo_claims())
    out = {}
    for k, name in enumerate(batch.names):
        base = claims.get(name.split("#")[0])
        if base is not None:
            out[name] = Claim(name, k + 2, dict(base.values))
    return out


def worker(lamps, paper):
    """One timed report in this process; prints a JSON line."""
    import lampcalc

    batch = make_batch(lamps, np.random.default_rng(11))
    claims = claims_for(batch)
    nominal = [claims[n].values.get("nominal_cct_K", np.nan) if n in claims else np.nan for n in batch.names]
    ratings = lampcalc.rate_spectra(batch, nominal_cct_K=nominal)
    verdicts = lampcalc.check_claims(claims, ratings)
    extra = {"paper": paper} if "paper" in lampcalc.write_report.__code__.co_varnames else {}
    with tempfile.TemporaryDirectory() as folder:
        wall, cpu = time.perf_counter(), time.process_time()
        pages = lampcalc.write_report(Path(folder) / "r.pdf", ratings, verdicts, **extra)
        wall, cpu = time.perf_counter() - wall, time.process_time() - cpu
        size = (Path(folder) / "r.pdf").stat().st_size
    print(json.dumps({"pages": pages, "wall": wall, "cpu": cpu, "size": size, "from": lampcalc.__file__}))


def run(source, lamps, paper):
    env = dict(os.environ)
    if source:
        env["PYTHONPATH"] = str(source) + os.pathsep + env.get("PYTHONPATH", "")
    out = subprocess.run([sys.executable, __file__, "--worker", "--lamps", str(lamps), "--paper", paper],
                         env=env, capture_output=True, text=True, check=True)
    return json.loads(out.stdout.strip().splitlines()[-1])


def main():
    parser = argparse.ArgumentParser()
    parser.add_argument("--lamps", type=int, default=100)
    parser.add_argument("--paper", default="a4")
    parser.add_argument("--runs", type=int, default=2)
    parser.add_argument("--baseline", type=Path, default=None, help="another lampcalc source tree to compare with")
    parser.add_argument("--worker", action="store_true", help=argparse.SUPPRESS)
    args = parser.parse_args()
    if args.worker:
        return worker(args.lamps, args.paper)
    sides = {"this tree": None} if args.baseline is None else {"baseline": args.baseline, "this tree": None}
    results = {name: [] for name in sides}
    for _ in range(args.runs):
        for name, source in sides.items():
            results[name].append(run(source, args.lamps, args.paper))
    best = {}
    for name, runs in results.items():
        r = min(runs, key=lambda item: item["wall"])
        best[name] = r
        walls = ", ".join(f"{x['wall']:.1f} s" for x in runs)
        cpu = min(x["cpu"] for x in runs) / r["pages"]
        print(f"{name}: {args.lamps} lamps, {r['pages']} pages, {r['size'] / 1e6:.1f} MB: "
              f"{r['wall'] / r['pages']:.3f} s a page wall-clock, {cpu:.3f} s CPU "
              f"(runs: {walls}; lampcalc from {Path(r['from']).parent})")
    if args.baseline is not None:
        ratio = (best["baseline"]["wall"] / best["baseline"]["pages"]) / (best["this tree"]["wall"] / best["this tree"]["pages"])
        print(f"this tree writes a page {ratio:.2f}× as fast as the baseline (wall-clock, same machine and load)")


if __name__ == "__main__":
    main()
