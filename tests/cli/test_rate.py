"""``lampcalc rate``: ratings written to files, bad files reported, options honoured."""

import json

import pytest


def test_rate_json_keys_and_values(run, write, bb_table, tmp_path):
    from lampcalc.colorimetry import tristimulus as cm

    path = write("bb.csv", bb_table([2856.0, 6500.0], 360, 830, 1))
    out = tmp_path / "r.json"
    result = run("rate", path, "--json", out)
    assert result.exit_code == 0, result.output
    records = json.loads(out.read_text())
    assert [r["name"] for r in records] == ["bb2856", "bb6500"]
    for key in ("name", "source", "x", "y", "u", "v", "u_prime", "v_prime", "ler_lm_per_W", "flags", "cct_K", "duv"):
        assert key in records[0]
    r = records[0]
    assert r["source"] == f"{path}, column 2"
    # A 2856 K Planck spectrum (CODATA c2): its x, y equal the colorimetry of the same spectrum.
    assert r["u"] == pytest.approx(cm.xy_to_uv([r["x"], r["y"]])[0], rel=1e-12)
    assert r["v_prime"] == pytest.approx(1.5 * r["v"], rel=1e-12)
    assert r["cct_K"] == pytest.approx(2856 * 1.4388e-2 / 1.438776877e-2, rel=2e-6)
    # 1 nm data are taken as they are; a 2856 K radiator still rises at 830 nm (Wien: peak near 1015 nm),
    # so its FWHM is open and its LER depends on the range; the shipped steps metric is unconfirmed.
    assert r["interpolation"] == "none"
    assert r["flags"] == ["steps_metric_unconfirmed", "fwhm_at_range_end", "ler_depends_on_range"]
    assert "ler_depends_on_range: the spectrum carries 5 %" in result.stdout
    assert "not a photometric test report" in result.stdout


def test_rate_carries_on_past_a_bad_file(run, write, bb_table, tmp_path):
    good = write("good.csv", bb_table([3000.0]))
    bad = write("bad.csv", "nm,a\n380,1\n385,x\n")
    out = tmp_path / "r.csv"
    result = run("rate", good, bad, "--csv", out)
    assert result.exit_code == 2
    assert "bad.csv, line 3, column 2 ('a'): 'x' is not a number" in result.stderr
    assert "1 of 2 files could not be rated" in result.stderr
    assert "bb3000" in out.read_text()
    assert "Traceback" not in result.output


def test_rate_strict_stops_at_first(run, write, bb_table, tmp_path):
    bad = write("a_bad.csv", b"", mode="wb")
    good = write("b_good.csv", bb_table([3000.0]))
    out = tmp_path / "r.json"
    result = run("rate", bad, good, "--strict", "--json", out)
    assert result.exit_code == 2 and "the file is empty" in result.stderr
    assert not out.exists()


def test_rate_folder_needs_recursive(run, write, bb_table, tmp_path):
    write("one.csv", bb_table([3000.0]))
    (tmp_path / "sub").mkdir()
    (tmp_path / "sub" / "two.tsv").write_text(bb_table([4000.0], delimiter="\t"))
    result = run("rate", tmp_path)
    assert result.exit_code == 2 and "pass -r" in result.stderr
    out = tmp_path / "r.json"
    result = run("rate", "-r", tmp_path, "--json", out)
    assert result.exit_code == 0
    assert sorted(r["name"] for r in json.loads(out.read_text())) == ["bb3000", "bb4000"]


def test_rate_bad_input_exit_2_one_line(run, write, bad_input):
    case, content, fragment = bad_input
    result = run("rate", write(f"{case}.csv", content, mode="wb"))
    assert result.exit_code == 2
    assert fragment in result.stderr
    assert "Traceback" not in result.output


def test_rate_micrometre_option(run, write):
    text = "\n".join(f"{w / 1000:.3f},1.0" for w in range(380, 781, 5))
    path = write("um.csv", text)
    assert run("rate", path).exit_code == 2
    assert run("rate", path, "--wavelength-unit", "um").exit_code == 0


def test_write_is_atomic_existing_output_survives_failure(run, write, tmp_path):
    out = tmp_path / "r.json"
    out.write_text("previous results")
    result = run("rate", write("bad.csv", "380,1\n", ), "--json", out)
    assert result.exit_code == 2
    assert out.read_text() == "previous results"
    assert not list(tmp_path.glob(".r.json*"))


def test_rate_interpolation_options(run, write, tmp_path):
    import colour

    # CIE published the FL7 CCT (6500 K, rounded to 10 K) from its 5 nm table; Sprague reproduces
    # that computation (within 10 K), linear differs by about 5 K more (docs/spectrum-files.md). The
    # default (auto) is Sprague for uniform 5 nm data (CIE 015:2018, CIE 167:2005).
    sd = colour.SDS_ILLUMINANTS["FL7"]
    path = write("fl7.csv", "nm,FL7\n" + "\n".join(f"{w:g},{v!r}" for w, v in zip(sd.wavelengths, map(float, sd.values))))
    outs = {m: tmp_path / f"{m}.json" for m in ("auto", "sprague", "linear")}
    for method, out in outs.items():
        assert run("rate", path, "--interpolation", method, "--json", out).exit_code == 0
    got = {m: json.loads(out.read_text())[0] for m, out in outs.items()}
    assert got["sprague"]["cct_K"] == pytest.approx(6500, abs=10)
    assert got["auto"]["cct_K"] == got["sprague"]["cct_K"]
    assert got["linear"]["cct_K"] < got["sprague"]["cct_K"] - 3
    assert [got[m]["interpolation"] for m in ("auto", "sprague", "linear")] == ["sprague", "sprague", "linear"]


def test_rate_sprague_on_uneven_data_refused_in_one_line(run, write, bb_table, tmp_path):
    # CIE 167:2005: Sprague needs uniformly spaced data; asked for on uneven data, that file is refused
    # with one line and the batch carries on.
    uneven = write("uneven.csv", "nm,a\n" + "\n".join(f"{w},1" for w in [380, 385, 391, 400, 420, 500, 600, 700, 780]))
    good = write("good.csv", bb_table([3000.0]))
    out = tmp_path / "r.json"
    result = run("rate", uneven, good, "--interpolation", "sprague", "--json", out)
    assert result.exit_code == 2 and "Traceback" not in result.output
    assert "uneven.csv: Sprague interpolation needs uniformly spaced data: the steps range from 5 to 100 nm" in result.stderr
    assert [r["name"] for r in json.loads(out.read_text())] == ["bb3000"]
    # The default falls back to linear for such data, and says so per lamp.
    assert run("rate", uneven, "--json", out).exit_code == 0
    assert json.loads(out.read_text())[0]["interpolation"] == "linear"


def test_watts_option_gives_lamp_efficacy(run, write, tmp_path):
    # Lamp efficacy = luminous flux / electrical power (PITFALLS: never confuse it with LER).
    line = "\n".join(f"{w},{0.01 if w == 555 else 0}" for w in range(380, 781))
    path = write("abs.csv", "# quantity: flux\nnm,lamp\n" + line)
    out = tmp_path / "r.json"
    assert run("rate", path, "--watts", "4", "--json", out).exit_code == 0
    r = json.loads(out.read_text())[0]
    assert r["electrical_W"] == 4.0
    assert r["efficacy_lm_per_W"] == pytest.approx(r["luminous_flux_lm"] / 4.0)
    assert r["luminous_flux_lm"] == pytest.approx(683 * 0.01, rel=1e-3)  # Km = 683 lm/W at 555 nm
    assert run("rate", path, "--watts", "0").exit_code == 2


def test_rate_with_a_bin_set_and_an_ellipse_set(run, write, bb_table, tmp_path):
    # A user's sets (format of docs/standard-sets.md, made-up values) change the bin and step columns;
    # a bad set file is refused with one line naming the file and line, before any spectrum is read.
    bins = write("bins.csv", "# name: lab bins\n# source: t\n# edition: 1\n# confirmed: yes\n# space: xy\n"
                             "bin,x1,y1,x2,y2,x3,y3\nW,0.40,0.36,0.47,0.38,0.43,0.43\n")
    ellipses = write("ell.csv", "# name: lab ellipses\n# source: t\n# edition: 1\n# confirmed: yes\n# space: upvp\n"
                                "name,nominal_cct_K,x,y,a,b,theta_deg\nall,,,,0.002,0.002,0\n")
    spectra = write("bb.csv", bb_table([3000.0]))
    out = tmp_path / "r.json"
    result = run("rate", spectra, "--bins", bins, "--ellipses", ellipses, "--json", out)
    assert result.exit_code == 0, result.output
    r = json.loads(out.read_text())[0]
    assert (r["bin_set"], r["bin"], r["sdcm_ellipse_set"]) == ("lab bins", "W", "lab ellipses")
    assert "steps_metric_unconfirmed" not in r["flags"]
    bad = write("badbins.csv", "# name: x\n# source: t\n# edition: 1\n# confirmed: yes\n# space: xy\n"
                               "bin,x1,y1,x2,y2\nW,0.40,0.36,0.47,0.38\n")
    result = run("rate", spectra, "--bins", bad)
    assert result.exit_code == 2 and "Traceback" not in result.output
    assert result.stderr.strip() == f"lampcalc: {bad}, line 6: no 'x3' column (columns: bin, x1, y1, x2, y2)"


def test_terminal_explains_every_flag_and_marks_unconfirmed_values(run, write, bb_table):
    from lampcalc.rating.flags import explain

    result = run("rate", write("bb.csv", bb_table([2200.0])))
    assert result.exit_code == 0
    for flag in ("bin_corners_unconfirmed", "steps_metric_unconfirmed", "steps_metric_outside_set_range"):
        assert f"{flag}: {explain(flag)}" in result.stdout
    assert "(2200)" in result.stdout  # the category, in parentheses: its corners are unconfirmed
    assert "from memory" not in result.stdout
    # The terminal names the option that supplies what a flag lacks (the report gives the words alone).
    assert "(--bins FILE)" in result.stdout and "(--ellipses FILE)" in result.stdout


def test_a_cct_beyond_duv_0_05_is_in_parentheses(run, write):
    # CIE 015:2018 advises against a CCT this far from the locus: a green line's CCT is printed as doubtful.
    import numpy as np

    nm = np.arange(380, 781, 5)
    green = np.exp(-0.5 * ((nm - 525) / 13.0) ** 2)
    result = run("rate", write("green.csv", "nm,green\n" + "\n".join(f"{w},{v:.6g}" for w, v in zip(nm, green))))
    assert result.exit_code == 0
    (row,) = [line for line in result.stdout.splitlines() if line.startswith("green ")]
    cct = row.split()[1]
    assert cct.startswith("(") and cct.endswith(")") and "duv_beyond_0.05" in row


# --- any number of lamps: streamed in chunks, the same bytes (docs/scale.md) ---


def _many_lamps(write, n, name="many.csv", step=5, seed=0):
    """A wide CSV of n lamps of a fictional supplier (blackbodies of random temperature, made up)."""
    import numpy as np

    from lampcalc.physics.blackbody import spectral_radiance

    temps = np.random.default_rng(seed).uniform(2200.0, 8000.0, n)
    wl = np.arange(380.0, 781.0, step)
    values = spectral_radiance(temps, wl)
    values = values / values.max(axis=1, keepdims=True)
    lines = ["nm," + ",".join(f"QF-M{seed}-{k:04d}" for k in range(n))]
    lines += [f"{w:g}," + ",".join(repr(float(v)) for v in col) for w, col in zip(wl, values.T)]
    return write(name, "\n".join(lines) + "\n")


@pytest.fixture
def small_chunks(monkeypatch):
    """Chunks of 3 lamps, and every text file through the large-table reader in blocks of a few lines."""
    from lampcalc.io import large_tables
    from lampcalc.rating import streaming

    monkeypatch.setattr(streaming, "CHUNK_LAMPS", 3)
    monkeypatch.setattr(large_tables, "FAST_MIN_BYTES", 0)
    monkeypatch.setattr(large_tables, "BLOCK_BYTES", 500)


def test_streamed_outputs_are_the_bytes_of_one_batch(run, write, bb_table, tmp_path, small_chunks):
    # lampcalc's one-batch path (rate_spectra on every lamp read whole) is the reference here
    import openpyxl

    from lampcalc.io.spectrum_files import read_spectra
    from lampcalc.io.workbook import write_workbook
    from lampcalc.rating.rate import rate_spectra
    from lampcalc.rating.wide_columns import ratings_sheets

    files = [_many_lamps(write, 11), write("a.csv", bb_table([2700.0, 4000.0])), _many_lamps(write, 5, "b.csv", 1, 1)]
    outs = {k: tmp_path / f"r.{k}" for k in ("json", "csv", "xlsx")}
    result = run("rate", *files, *(a for k, p in outs.items() for a in (f"--{k}", p)))
    assert result.exit_code == 0, result.output
    whole = rate_spectra([read_spectra(f) for f in files])
    assert outs["json"].read_text() == whole.to_json()
    assert outs["csv"].read_text() == whole.to_csv()
    write_workbook(tmp_path / "whole.xlsx", ratings_sheets(whole))
    got, expected = openpyxl.load_workbook(outs["xlsx"]), openpyxl.load_workbook(tmp_path / "whole.xlsx")
    assert got.sheetnames == ["ratings", "flags", "notes"]
    for title in ("ratings", "flags"):
        assert [[c.value for c in row] for row in got[title].iter_rows()] == \
            [[c.value for c in row] for row in expected[title].iter_rows()]


def test_two_workers_write_the_same_bytes(run, write, tmp_path, small_chunks):
    pytest.importorskip("dask")
    files = [_many_lamps(write, 10), _many_lamps(write, 4, "b.csv", 5, 1)]
    one, two = tmp_path / "one.json", tmp_path / "two.json"
    assert run("rate", *files, "--json", one).exit_code == 0
    result = run("rate", *files, "--json", two, "--workers", "2")
    assert result.exit_code == 0, result.output
    assert one.read_bytes() == two.read_bytes()


def test_workers_without_dask_fail_in_one_line_naming_the_extra(run, write, bb_table, monkeypatch):
    import importlib.util

    real = importlib.util.find_spec
    monkeypatch.setattr(importlib.util, "find_spec", lambda name, *a: None if name == "dask" else real(name, *a))
    result = run("rate", write("a.csv", bb_table([3000.0])), "--workers", "2")
    assert result.exit_code == 2
    assert result.stderr.strip() == "lampcalc: --workers 2 needs dask: pip install 'lampcalc[dask]'"
    assert run("rate", write("b.csv", bb_table([3000.0])), "--workers", "1").exit_code == 0


def test_a_large_batch_shows_its_first_and_last_lamps(run, write, tmp_path, monkeypatch, small_chunks):
    from lampcalc.rating import tally

    monkeypatch.setattr(tally, "SHOWN", 4)
    path = _many_lamps(write, 9)
    result = run("rate", path)
    assert result.exit_code == 0
    shown = [line.split()[0] for line in result.stdout.splitlines() if line.startswith("QF-M0-")]
    assert shown == ["QF-M0-0000", "QF-M0-0001", "QF-M0-0007", "QF-M0-0008"]
    assert "(the first 2 and the last 2 of 9 lamps are shown)" in result.stdout
    # every lamp's flags are counted in the legend: the shipped steps metric is unconfirmed for all 9
    assert "steps_metric_unconfirmed (9 lamps): " in result.stdout
    assert "write every lamp's ratings with --json, --csv or --xlsx" in result.stdout
    result = run("rate", path, "--csv", tmp_path / "r.csv")
    assert "--json, --csv or --xlsx" not in result.stdout
    assert len((tmp_path / "r.csv").read_text().splitlines()) == 10


def test_a_file_refused_deep_in_its_table_adds_no_lamp(run, write, tmp_path, small_chunks):
    good = _many_lamps(write, 7)
    lines = _many_lamps(write, 8, "bad.csv", 5, 2).read_text().splitlines()
    cells = lines[60].split(",")
    cells[6] = "-0.5"  # negative far beyond noise, in the last rows, after several chunks' worth of lamps
    lines[60] = ",".join(cells)
    bad = write("bad.csv", "\n".join(lines) + "\n")
    out = tmp_path / "r.json"
    result = run("rate", good, bad, "--json", out)
    assert result.exit_code == 2
    assert "bad.csv, line 61, column 7 ('QF-M2-0005'): value -0.5 at" in result.stderr
    assert "1 of 2 files could not be rated" in result.stderr
    assert [r["name"][:5] for r in json.loads(out.read_text())] == ["QF-M0"] * 7


def test_nothing_rated_leaves_the_outputs_as_they_were(run, write, tmp_path):
    out = tmp_path / "r.json"
    out.write_text("previous")
    result = run("rate", write("bad.csv", "nm,a\n380,x\n"), "--json", out)
    assert result.exit_code == 2 and out.read_text() == "previous"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["bad.csv", "r.json"]


def test_no_progress_bar_when_piped(run, write, small_chunks):
    result = run("rate", _many_lamps(write, 8))
    assert result.exit_code == 0 and "rating spectra" not in result.stderr and result.stderr == ""


@pytest.mark.parametrize("workers", ["1", "2"])
def test_interrupted_stream_leaves_no_temporary_file_and_no_worker(tmp_path, write, workers):
    # exit status 143 = 128 + SIGTERM (POSIX shells, common practice, no source)
    import os
    import signal
    import subprocess
    import sys
    import time

    if workers == "2":
        pytest.importorskip("dask")
    _many_lamps(write, 3000)
    (tmp_path / "out.json").write_text("old")
    code = "import sys; from lampcalc.cli import main; sys.argv[0] = 'lampcalc'; main(sys.argv[1:])"
    child = subprocess.Popen([sys.executable, "-c", code, "rate", "many.csv", "--json", "out.json", "--workers", workers],
                             cwd=tmp_path, stderr=subprocess.PIPE)
    deadline = time.monotonic() + 60
    while not list(tmp_path.glob(".out.json.*.tmp")):  # writing has begun
        assert time.monotonic() < deadline and child.poll() is None
        time.sleep(0.02)
    time.sleep(1.0)
    helpers = subprocess.run(["pgrep", "-P", str(child.pid)], capture_output=True, text=True).stdout.split()
    os.kill(child.pid, signal.SIGTERM)
    _, stderr = child.communicate(timeout=60)
    assert child.returncode == -signal.SIGTERM or child.returncode == 143, stderr
    assert b"interrupted" in stderr and b"Traceback" not in stderr
    assert sorted(p.name for p in tmp_path.iterdir()) == ["many.csv", "out.json"]
    assert (tmp_path / "out.json").read_text() == "old"
    deadline = time.monotonic() + 20
    while any(os.path.exists(f"/proc/{pid}") for pid in helpers):  # worker processes end with the run
        assert time.monotonic() < deadline, helpers
        time.sleep(0.1)
