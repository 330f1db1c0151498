"""A large fuzz of the command line: thousands of malformed files, each through `lampcalc rate`.

Files are generated with the strategies of ``tests/io/test_fuzz_readers.py`` (mutated text
tables, lampcalc JSON, TM-27-14 documents, workbooks with odd cells) and claims files for
`lampcalc check`. Each file is one run of the command (in this process, through click's test
runner, with a 30 s alarm against hangs); printed are the runs that rated, the runs refused
in one line, any traceback, the runs over 5 s and the slowest. Then one `lampcalc rate -r`
over the whole folder in a process of its own, which must carry on past every bad file.
Not a test; run by hand:

    python benchmarks/fuzz_cli.py [--files 3200] [--keep FOLDER]
"""

import argparse
import importlib.util
import signal
import subprocess
import sys
import tempfile
import time
from collections import Counter
from pathlib import Path

from click.testing import CliRunner
from hypothesis import HealthCheck, Phase, given, settings
from hypothesis import strategies as st

from lampcalc.cli import cli
from lampcalc.io.demo_data import demo_files

ROOT = Path(__file__).resolve().parents[1]


def _fuzz_module():
    spec = importlib.util.spec_from_file_location("fuzz_readers", ROOT / "tests" / "io" / "test_fuzz_readers.py")
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


def generate(folder, n_files):
    """Write ``n_files`` generated files into ``folder``; returns [(path, command)]."""
    fuzz = _fuzz_module()
    spdx_seed = (ROOT / "tests" / "io" / "corpus" / "quillfen.spdx").read_bytes()
    share = {"text": 0.4, "json": 0.2, "spdx": 0.15, "xlsx": 0.15, "claims": 0.1}
    files = []

    def collect(kind, strategy, count):
        @settings(max_examples=count, database=None, phases=[Phase.generate], deadline=None,
                  suppress_health_check=list(HealthCheck))
        @given(strategy)
        def write(content):
            suffix, raw = content
            path = folder / f"{kind}_{len(files):05d}{suffix}"
            path.write_bytes(raw)
            files.append((path, "check" if kind == "claims" else "rate"))

        write()

    def rows_to_xlsx(edits):
        rows = [["quantity", "flux"], ["nm", "QF-A [mW/nm]", "QF-B"], *([w, a, b] for w, a, b in fuzz.ROWS)]
        for r, c, value in edits:
            row = rows[min(r, len(rows) - 1)]
            row[min(c, len(row) - 1)] = value
        return fuzz._workbook(rows)

    xlsx = st.lists(st.tuples(st.integers(0, len(fuzz.WL)), st.integers(0, 3), fuzz.CELLS), max_size=4)
    strategies = {
        "text": st.tuples(st.sampled_from([".csv", ".txt", ".tsv", ".dat"]), fuzz.mutated(fuzz.TEXT_SEEDS)),
        "json": st.tuples(st.just(".json"), fuzz.mutated([fuzz.JSON_SEED])),
        "spdx": st.tuples(st.sampled_from([".spdx", ".xml"]), fuzz.mutated([spdx_seed])),
        "xlsx": st.tuples(st.just(".xlsx"), st.one_of(xlsx.map(rows_to_xlsx), fuzz.mutated([rows_to_xlsx([])]))),
        "claims": st.tuples(st.just(".csv"), fuzz.mutated(fuzz.CLAIMS_SEEDS)),
    }
    for kind, strategy in strategies.items():
        collect(kind, strategy, int(n_files * share[kind]) + 1)
    return files


class Hang(Exception):
    pass


def _alarm(signum, frame):
    raise Hang


def run_each(files):
    runner = CliRunner()
    outcome, slowest, tracebacks = Counter(), (0.0, None), []
    signal.signal(signal.SIGALRM, _alarm)
    demo = [str(f) for f in demo_files()]
    for path, command in files:
        args = ["rate", str(path)] if command == "rate" else ["check", *demo, "--claims", str(path)]
        start = time.perf_counter()
        signal.alarm(30)
        try:
            result = runner.invoke(cli, args)
        except Hang:
            outcome["hang (over 30 s)"] += 1
            continue
        finally:
            signal.alarm(0)
        elapsed = time.perf_counter() - start
        slowest = max(slowest, (elapsed, path))
        if elapsed > 5:
            outcome["runs over 5 s"] += 1
        if result.exception is not None and not isinstance(result.exception, SystemExit):
            tracebacks.append((path, repr(result.exception)))
            outcome["traceback"] += 1
        elif result.exit_code == 0 or (command == "check" and result.exit_code == 1):
            outcome[f"{command}: read and done"] += 1
        else:
            lines = [line for line in result.stderr.splitlines() if line.startswith("lampcalc: ")]
            outcome[f"{command}: refused in one line" if len(lines) in (1, 2) else f"{command}: other"] += 1
    return outcome, slowest, tracebacks


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--files", type=int, default=3200)
    parser.add_argument("--keep", type=Path, help="Write the files here and keep them.")
    args = parser.parse_args()
    with tempfile.TemporaryDirectory() as scratch:
        folder = args.keep or Path(scratch)
        folder.mkdir(parents=True, exist_ok=True)
        start = time.perf_counter()
        files = generate(folder, args.files)
        print(f"generated {len(files)} files in {time.perf_counter() - start:.0f} s "
              f"({Counter(p.suffix for p, _ in files)})")
        start = time.perf_counter()
        outcome, (worst, worst_path), tracebacks = run_each(files)
        print(f"{len(files)} runs in {time.perf_counter() - start:.0f} s; slowest {worst:.2f} s ({worst_path.name})")
        for key, count in sorted(outcome.items()):
            print(f"  {key}: {count}")
        for path, error in tracebacks[:20]:
            print(f"  traceback: {path.name}: {error}")
        spectra = [str(p) for p, command in files if command == "rate"]
        start = time.perf_counter()
        batch = subprocess.run([sys.executable, "-m", "lampcalc", "rate", "-r", str(folder), "--json",
                                str(Path(scratch) / "all.json")], capture_output=True, text=True)
        told = [line for line in batch.stderr.splitlines() if line.startswith("lampcalc: ")]
        print(f"one `lampcalc rate -r` over the folder ({len(spectra)} spectrum files and the claims files): "
              f"exit {batch.returncode} in {time.perf_counter() - start:.0f} s, {len(told)} lines told, "
              f"traceback: {'Traceback' in batch.stderr}; last line: {told[-1] if told else ''}")


if __name__ == "__main__":
    main()
