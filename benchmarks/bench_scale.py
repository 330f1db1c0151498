"""Any number of spectra: wall time, lamps/s and peak memory of ``lampcalc rate``, side by side.

Writes, in a temporary folder, the spectra of a fictional supplier's product database (1 nm,
380–780 nm, blackbodies of random temperature plus a phosphor-like hump, seeded) as one wide
CSV (one lamp per column) and as many one-lamp files, for each size asked; then runs

- ``lampcalc rate <wide CSV> --json out.json`` (and with ``--workers 2``),
- ``lampcalc rate <folder> -r --json out.json``,

each in its own process, measuring the wall time and the peak resident memory of the
process and its children (sampled from /proc every 20 ms, summed over the process tree),
and in a process of its own ``rate_spectra`` on the same lamps, read and on the grid, in
batches of 1,000 (the in-process rating rate: NumPy's fastest batch size here). The ratio is
command-line lamps/s over in-process lamps/s. ``--source DIR`` runs another checkout's ``lampcalc`` (an earlier commit) for a
before/after table. Not a test; the machine is shared: run it when ``uptime`` is low.

    python benchmarks/bench_scale.py [--sizes 1000 10000 100000] [--files-up-to 10000] [--million]
"""

import argparse
import os
import subprocess
import sys
import tempfile
import time
from pathlib import Path

import numpy as np

WAVELENGTHS = np.arange(380, 781)


def spectra(n, seed):
    """n relative spectra (n, 401): blackbody plus a Gaussian hump, peak 1 (fictional lamps)."""
    from lampcalc.physics.blackbody import spectral_radiance

    rng = np.random.default_rng(seed)
    temps = rng.uniform(2200.0, 9000.0, n)
    body = spectral_radiance(temps, WAVELENGTHS.astype(float))
    hump = np.exp(-0.5 * ((WAVELENGTHS - rng.uniform(530, 610, (n, 1))) / rng.uniform(25, 60, (n, 1))) ** 2)
    values = body / body.max(axis=1, keepdims=True) + rng.uniform(0.0, 1.5, (n, 1)) * hump
    return values / values.max(axis=1, keepdims=True)


def write_wide(path, n, distinct=None):
    """A wide CSV of n lamps; with ``distinct``, that many spectra repeated (to write a million quickly)."""
    base = spectra(min(n, distinct or n), 7)
    cells = [[f"{v:.6g}" for v in row] for row in base.T]  # per wavelength: one cell per distinct lamp
    with open(path, "w", encoding="utf-8") as handle:
        handle.write("wavelength_nm," + ",".join(f"QF-DB-{k:07d}" for k in range(n)) + "\n")
        for w, row in zip(WAVELENGTHS, cells):
            text = ",".join(row)
            repeats, rest = divmod(n, len(row))
            handle.write(f"{w}," + ",".join([text] * repeats + ([",".join(row[:rest])] if rest else [])) + "\n")


def write_files(folder, n):
    folder.mkdir()
    for k, row in enumerate(spectra(n, 11)):
        lines = [f"wavelength_nm,QF-F-{k:06d}"] + [f"{w},{v:.6g}" for w, v in zip(WAVELENGTHS, row)]
        (folder / f"lamp_{k:06d}.csv").write_text("\n".join(lines) + "\n")


def _tree_rss_kb(pid):
    """Resident memory of a process and its descendants, kB (Linux /proc)."""
    total, todo = 0, [pid]
    while todo:
        p = todo.pop()
        try:
            with open(f"/proc/{p}/status") as status:
                total += next(int(line.split()[1]) for line in status if line.startswith("VmRSS:"))
            with open(f"/proc/{p}/task/{p}/children") as children:
                todo += [int(c) for c in children.read().split()]
        except (OSError, StopIteration):
            continue
    return total


def _importing(source):
    """Python code that makes ``import lampcalc`` load the checkout at ``source`` (else the installed one).

    An editable install answers imports before ``sys.path`` is searched: its finder is taken out.
    """
    if not source:
        return ""
    return ("import sys; sys.meta_path[:] = [f for f in sys.meta_path if 'editable' not in "
            f"getattr(f, '__module__', '')]; sys.path.insert(0, {str(source)!r})\n")


def run_cli(args, source=None):
    """Wall time (s) and peak memory of the process tree (MB) of ``lampcalc ARGS``."""
    code = _importing(source) + "import sys; from lampcalc.cli import main; sys.argv[0] = 'lampcalc'; main(sys.argv[1:])"
    start = time.perf_counter()
    child = subprocess.Popen([sys.executable, "-c", code, *map(str, args)], stdout=subprocess.DEVNULL,
                             stderr=subprocess.PIPE)
    peak = 0
    while child.poll() is None:
        peak = max(peak, _tree_rss_kb(child.pid))
        time.sleep(0.02)
    wall = time.perf_counter() - start
    if child.returncode:
        raise SystemExit(f"lampcalc {' '.join(map(str, args))} failed: {child.stderr.read().decode()[-2000:]}")
    return wall, peak / 1024


def in_process_rate(path, source=None):
    """Lamps/s of rate_spectra on the file's lamps, read and on the grid, in batches of 1,000 (own process)."""
    code = _importing(source) + (
        "import sys, time, lampcalc\n"
        "batch = lampcalc.read_spectra(sys.argv[1]).on_grid()\n"
        "lampcalc.rate_spectra(batch[:10])  # tables loaded, caches warm\n"
        "start = time.perf_counter()\n"
        "for a in range(0, batch.n_lamps, 1000):\n"
        "    lampcalc.rate_spectra(batch[a : a + 1000])\n"
        "print(batch.n_lamps / (time.perf_counter() - start))\n"
    )
    return float(subprocess.check_output([sys.executable, "-c", code, str(path)]))


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--sizes", type=int, nargs="*", default=[1000, 10_000, 100_000])
    parser.add_argument("--files-up-to", type=int, default=10_000, help="largest size also run as many files")
    parser.add_argument("--workers-from", type=int, default=10_000, help="smallest size also run with --workers 2")
    parser.add_argument("--million", action="store_true", help="also rate a 1,000,000-lamp wide CSV (once)")
    parser.add_argument("--source", type=Path, default=None, help="run the lampcalc of this source folder")
    parser.add_argument("--dir", type=Path, default=None, help="folder for the data (default: a temporary one)")
    args = parser.parse_args()
    check = _importing(args.source) + "import lampcalc; print(lampcalc.__file__)"
    used = subprocess.check_output([sys.executable, "-c", check], text=True).strip()
    print(f"load average at start: {os.getloadavg()[0]:.2f}; lampcalc from {used}")
    print(f"{'input':<34} {'lamps':>9} {'wall s':>8} {'lamps/s':>9} {'peak MB':>8} {'in-proc/s':>9} {'ratio':>6}")
    with tempfile.TemporaryDirectory(dir=args.dir) as folder:
        folder = Path(folder)
        out = folder / "out.json"
        sizes = list(args.sizes) + ([1_000_000] if args.million else [])
        for n in sizes:
            wide = folder / f"wide_{n}.csv"
            write_wide(wide, n, distinct=1000 if n > 100_000 else None)
            size_mb = wide.stat().st_size / 1e6
            rate = in_process_rate(wide, args.source) if n <= 100_000 else float("nan")
            runs = [(f"wide CSV ({size_mb:.0f} MB)", [wide, "--json", out])]
            if n >= args.workers_from and not args.source:
                runs.append((f"wide CSV ({size_mb:.0f} MB), --workers 2", [wide, "--json", out, "--workers", "2"]))
            if n <= args.files_up_to:
                write_files(folder / f"files_{n}", n)
                runs.append((f"{n:,} files", [folder / f"files_{n}", "-r", "--json", out]))
            for label, cli_args in runs:
                wall, peak = run_cli(["rate", *cli_args], args.source)
                ratio = n / wall / rate
                print(f"{label:<34} {n:>9,} {wall:>8.1f} {n / wall:>9.0f} {peak:>8.0f} {rate:>9.0f} {ratio:>6.2f}",
                      flush=True)
            wide.unlink()
    print(f"load average at end: {os.getloadavg()[0]:.2f}")


if __name__ == "__main__":
    main()
