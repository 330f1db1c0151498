"""Outputs of a run: checked before the work, folders created, written together, left clean when
interrupted, no warnings on the terminal. Internal checks of the command line's behaviour; the
exit statuses 130 and 143 are the shell's 128 + signal number (POSIX, common practice, no source)."""

import json
import os
import signal
import subprocess
import sys
import time

import openpyxl
import pytest

from lampcalc.io.demo_data import demo_claims, demo_files


def test_rate_xlsx_one_row_per_lamp_lists_in_columns(run, tmp_path):
    out = tmp_path / "new" / "folder" / "ratings.xlsx"
    result = run("rate", *demo_files(), "--xlsx", out, "--json", tmp_path / "r.json")
    assert result.exit_code == 0, result.output
    book = openpyxl.load_workbook(out)
    assert book.sheetnames == ["ratings", "flags", "notes"]
    header = [c.value for c in book["ratings"][1]]
    records = json.loads((tmp_path / "r.json").read_text())
    assert book["ratings"].max_row == len(records) + 1
    row = dict(zip(header, (c.value for c in book["ratings"][2])))
    # openpyxl writes numbers with 16 significant digits ("%.16g"), one short of a double's 17
    close = lambda values: pytest.approx(values, rel=1e-15)  # noqa: E731
    assert row["name"] == records[0]["name"] and row["cct_K"] == close(records[0]["cct_K"])
    assert [row[f"r{k}"] for k in range(1, 16)] == close(records[0]["ri"])
    assert [row[f"rf_h{k:02d}"] for k in range(1, 17)] == close(records[0]["rf_hue_bins"])
    assert "not a photometric test report" in book["notes"]["A2"].value


def test_check_xlsx_has_the_verdicts(run, tmp_path):
    out = tmp_path / "checks.xlsx"
    result = run("check", *demo_files(), "--claims", demo_claims(), "--xlsx", out, "--json", tmp_path / "v.json")
    assert result.exit_code == 1
    sheet = openpyxl.load_workbook(out)["checks"]
    verdicts = json.loads((tmp_path / "v.json").read_text())
    assert sheet.max_row - 1 == sum(len(v["checks"]) for v in verdicts)
    assert [c.value for c in sheet[1]] == ["lamp", "criterion", "claimed", "measured", "margin", "pass", "note"]


@pytest.mark.parametrize(
    "args, fragment",
    [
        (["--json", "{tmp}/file.txt/r.json"], "cannot write there"),
        (["--json", "{tmp}/same", "--csv", "{tmp}/same"], "given for both --json and --csv"),
        (["--xlsx", "{tmp}/r.csv"], "--xlsx writes a .xlsx file"),
        (["--report", "{tmp}/r.txt"], "--report writes a .pdf file"),
    ],
)
def test_bad_output_paths_refused_before_the_work(run, tmp_path, args, fragment):
    (tmp_path / "file.txt").write_text("a file, not a folder")
    result = run("rate", *demo_files(), *[a.format(tmp=tmp_path) for a in args])
    assert result.exit_code == 2 and fragment in result.stderr
    assert "QF-A60-3000" not in result.stdout  # nothing was rated


def test_an_input_is_never_overwritten(run, tmp_path):
    spectrum = demo_files()[0]
    result = run("rate", spectrum, "--csv", spectrum)
    assert result.exit_code == 2 and "is one of the input files" in result.stderr


def test_outputs_replaced_together(run, tmp_path, monkeypatch):
    json_out, pdf_out = tmp_path / "r.json", tmp_path / "r.pdf"
    json_out.write_text("old json")
    pdf_out.write_text("old report")

    def broken(*args, **kwargs):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr("lampcalc.report.document.Report.write", broken)
    result = run("rate", *demo_files(), "--json", json_out, "--report", pdf_out)
    assert result.exit_code == 2 and "none was changed" in result.stderr
    assert json_out.read_text() == "old json" and pdf_out.read_text() == "old report"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["r.json", "r.pdf"]


@pytest.mark.parametrize("signum, status", [(signal.SIGTERM, 143), (signal.SIGINT, 130)])
def test_interrupted_run_leaves_no_temporary_file(tmp_path, signum, status):
    rows = "\n".join(f"{0.30 + (k % 1000) * 1e-4:.5f},{0.31 + (k % 700) * 1e-4:.5f}" for k in range(400_000))
    (tmp_path / "xy.csv").write_text("x,y\n" + rows + "\n")
    (tmp_path / "out.csv").write_text("old")
    code = "import sys; from lampcalc.cli import main; sys.argv[0] = 'lampcalc'; main(sys.argv[1:])"
    shell = subprocess.Popen(["sh", "-c", f'"{sys.executable}" -c "{code}" cct xy.csv --csv out.csv; echo $? > status'],
                             cwd=tmp_path, stderr=subprocess.PIPE)
    deadline = time.monotonic() + 60
    while not list(tmp_path.glob(".out.csv.*.tmp")):  # wait until it is writing
        assert time.monotonic() < deadline and shell.poll() is None
        time.sleep(0.02)
    child = int(subprocess.check_output(["pgrep", "-P", str(shell.pid)]).split()[0])
    os.kill(child, signum)
    _, stderr = shell.communicate(timeout=60)
    assert int((tmp_path / "status").read_text()) == status
    assert b"interrupted" in stderr
    assert sorted(p.name for p in tmp_path.iterdir()) == ["out.csv", "status", "xy.csv"]
    assert (tmp_path / "out.csv").read_text() == "old"


def test_no_warning_reaches_the_terminal(tmp_path):
    from lampcalc.io.spdx import write_spectra_spdx
    from lampcalc.io.spectrum_files import read_spectra

    write_spectra_spdx(read_spectra(demo_files()[0])[0], tmp_path / "lamp.spdx")
    result = subprocess.run(
        [sys.executable, "-W", "default", "-c", "import sys; from lampcalc.cli import main; main(sys.argv[1:])",
         "rate", tmp_path / "lamp.spdx", "--xlsx", tmp_path / "r.xlsx", "--report", tmp_path / "r.pdf"],
        capture_output=True, text=True, timeout=300,
    )
    assert result.returncode == 0, result.stderr
    assert "Warning:" not in result.stderr and "warnings.warn" not in result.stderr
    assert all(line.startswith("wrote ") for line in result.stderr.splitlines()), result.stderr


def test_figure_and_cct_outputs_make_their_folders(run, tmp_path):
    figure = tmp_path / "figures" / "locus.png"
    assert run("plot", "locus", *demo_files(), "-o", figure).exit_code == 0
    assert figure.exists()
    table = tmp_path / "cct" / "out.csv"
    assert run("cct", "--xy", "0.3127", "0.3290", "--csv", table).exit_code == 0
    assert "cct_K" in table.read_text()


def test_rate_tells_names_carried_by_two_files(run, tmp_path):
    twin = tmp_path / "twin.tsv"
    halogen = next(f for f in demo_files() if "halogen" in f.name)
    twin.write_bytes(halogen.read_bytes())
    result = run("rate", halogen, twin)
    assert result.exit_code == 0
    assert "note: 1 lamp name(s) belong to more than one spectrum: 'QF-HAL-2900'" in result.stderr


def test_folder_notes_files_passed_over_and_reads_workbooks(run, tmp_path):
    import shutil

    shutil.copy(next(f for f in demo_files() if "halogen" in f.name), tmp_path)
    shutil.copy(__import__("pathlib").Path(__file__).parents[1] / "io" / "corpus" / "sphere.xlsx", tmp_path)
    (tmp_path / "photo.png").write_bytes(b"\x89PNG")
    (tmp_path / "~$sphere.xlsx").write_bytes(b"lock")
    result = run("rate", "-r", tmp_path)
    assert result.exit_code == 0, result.output
    assert "passed over 1 file(s) in folders that are not spectrum files" in result.stderr and "photo.png" in result.stderr
    assert "QF-A" in result.stdout and "QF-HAL-2900" in result.stdout
