"""``lampcalc compare``: the demo sample against its data sheet, a file against itself, bad input.

The expected numbers are the ones the two spectra's own ratings give (``lampcalc rate``), and
Δu′v′ from colour-science's xy_to_Luv_uv of the rated x, y (reference library).
"""

import csv
import json

import numpy as np
import pytest

from lampcalc.io.demo_data import demo_folder

from ..report.conftest import pdf_pages

SHEET = demo_folder() / "datasheet" / "quillfen_a60_2700_r9_datasheet.csv"
SAMPLE = demo_folder() / "datasheet" / "quillfen_a60_2700_r9_sample.csv"


def test_sample_against_its_data_sheet(run, tmp_path):
    import colour

    result = run("compare", SHEET, SAMPLE, "--limit-delta-uv-prime", "0.003", "--json", tmp_path / "c.json",
                 "--csv", tmp_path / "c.csv", "--figure", tmp_path / "c.png")
    rate = run("rate", SHEET, SAMPLE, "--json", tmp_path / "r.json")
    ref, test = json.loads((tmp_path / "r.json").read_text())
    (pair,) = json.loads((tmp_path / "c.json").read_text())["pairs"]
    upvp = [colour.xy_to_Luv_uv(np.array([r["x"], r["y"]])) for r in (ref, test)]  # colour-science
    assert pair["delta_uv_prime"] == pytest.approx(np.hypot(*(upvp[1] - upvp[0])), rel=1e-9)
    assert pair["delta_cct_K"] == pytest.approx(test["cct_K"] - ref["cct_K"], rel=1e-12)
    assert pair["delta_r9"] == pytest.approx(test["ri"][8] - ref["ri"][8], rel=1e-12)
    assert pair["delta_ri"] == pytest.approx([t - r for t, r in zip(test["ri"], ref["ri"])])
    assert pair["pass"] is (pair["delta_uv_prime"] <= 0.003)
    assert result.exit_code == (0 if pair["pass"] else 1), result.output
    assert pair["luminous_ratio"] is None and pair["flags"] == ["luminous_ratio_needs_absolute_spectra"]
    assert rate.exit_code == 0
    rows = list(csv.DictReader((tmp_path / "c.csv").read_text().splitlines()))
    assert len(rows) == 1 and float(rows[0]["delta_uv_prime"]) == pair["delta_uv_prime"]
    assert (tmp_path / "c.png").stat().st_size > 20_000
    assert "QF-A60-2700-R9 data sheet (reference) and QF-A60-2700-R9 sample 7 (test)" in result.output


def test_a_file_against_itself_is_within_any_limit(run, bb_table, write):
    path = write("bb.csv", bb_table([2700.0, 4000.0]))
    result = run("compare", path, path, "--limit-delta-uv-prime", "0")
    assert result.exit_code == 0, result.output
    assert result.output.count("0.00000") >= 2


def test_sets_paired_by_name_and_a_figure_per_pair(run, bb_table, write, tmp_path):
    ref = write("ref.csv", bb_table([2700.0, 3000.0, 4000.0]))
    test = write("test.csv", bb_table([2700.0, 4000.0, 5000.0]))
    result = run("compare", ref, test, "--figure", tmp_path / "pair.svg")
    assert result.exit_code == 0, result.output
    assert "no partner among the other spectra for these reference lamps: bb3000" in result.output
    assert "test lamps: bb5000" in result.output
    assert sorted(p.name for p in tmp_path.glob("pair_*.svg")) == ["pair_bb2700.svg", "pair_bb4000.svg"]


def test_bad_input(run, bb_table, write):
    ref = write("ref.csv", bb_table([2700.0, 3000.0]))
    other = write("other.csv", bb_table([5000.0, 6500.0]))
    result = run("compare", ref, other)
    assert result.exit_code == 2 and "no lamp name is common" in result.stderr and "Traceback" not in result.output
    broken = write("broken.csv", "nm,a\n380,1\n385,-5\n390,1\n")
    result = run("compare", ref, broken)
    assert result.exit_code == 2 and "broken.csv, line 3" in result.stderr
    result = run("compare", ref, ref, "--limit-delta-uv-prime", "-1")
    assert result.exit_code == 2


def test_outputs_written_together_with_the_report(run, tmp_path):
    # The workbook's numbers are the JSON's (openpyxl keeps 16 digits); the report holds the pair and both lamps.
    import openpyxl

    result = run("compare", SHEET, SAMPLE, "--limit-delta-uv-prime", "0.003", "--json", tmp_path / "c.json",
                 "--xlsx", tmp_path / "c.xlsx", "--report", tmp_path / "c.pdf")
    (pair,) = json.loads((tmp_path / "c.json").read_text())["pairs"]
    assert result.exit_code == (0 if pair["pass"] else 1), result.output
    book = openpyxl.load_workbook(tmp_path / "c.xlsx")
    assert book.sheetnames == ["pairs", "unpaired", "flags", "notes"]
    row = dict(zip([c.value for c in book["pairs"][1]], [c.value for c in book["pairs"][2]]))
    assert row["delta_uv_prime"] == pytest.approx(pair["delta_uv_prime"], rel=1e-15)
    assert [row[f"delta_r{k}"] for k in range(1, 16)] == pytest.approx(pair["delta_ri"], rel=1e-15)
    assert [row[f"delta_rf_h{k:02d}"] for k in range(1, 17)] == pytest.approx(pair["delta_rf_hue_bins"], rel=1e-15)
    pages = pdf_pages(tmp_path / "c.pdf")
    assert len(pages) == 5  # summary, the pair, the two lamps, methods (A4)
    verdict = "meets" if pair["pass"] else "does not meet"
    assert f"Colour shift Δu′v′ {pair['delta_uv_prime']:.5f}: {verdict} your limit 0.003" in " ".join(pages[1].split())
    assert "QF-A60-2700-R9 sample 7 (test)" in pages[3] + pages[2]
    assert "does not meet" in result.output and "FAILS" not in result.output  # the shared verdict words


def test_without_a_limit_no_verdict_column(run, bb_table, write):
    path = write("bb.csv", bb_table([2700.0, 4000.0]))
    result = run("compare", path, path)
    assert result.exit_code == 0 and "verdict" not in result.output.splitlines()[0]
    assert "no limit given (--limit-delta-uv-prime), so not evaluated" in result.output


@pytest.mark.parametrize("args, fragment", [
    (["--figure", "{tmp}/c.gif"], "--figure writes .png, .svg, .pdf files"),
    (["--xlsx", "{tmp}/c.pdf"], "--xlsx writes a .xlsx file"),
    (["--paper", "letter"], "add --report FILE"),
    (["--json", "{tmp}/in.csv"], "is one of the input files"),
])
def test_bad_outputs_refused_before_the_work(run, tmp_path, bb_table, args, fragment):
    ref = tmp_path / "in.csv"
    ref.write_text(bb_table([2700.0]))
    result = run("compare", ref, ref, *[a.format(tmp=tmp_path) for a in args])
    assert result.exit_code == 2 and fragment in result.stderr and result.output.count("\n") <= 1


def test_report_with_measurement_uncertainty(run, tmp_path):
    # Both sides drawn by the demo laboratory's model (spectra_demo): the report shows the lamps' draws and, beside
    # the verdict on the measured shift, the shift's u, 95 % interval and the decision of the JSON written with it.
    from lampcalc.io.demo_data import demo_measurement_model

    result = run("compare", SHEET, SAMPLE, "--limit-delta-uv-prime", "0.003", "--uncertainty", demo_measurement_model(),
                 "--decision-rule", "guarded", "--json", tmp_path / "c.json", "--report", tmp_path / "c.pdf")
    assert result.exit_code in (0, 1), result.output
    (pair,) = json.loads((tmp_path / "c.json").read_text())["pairs"]
    text = " ".join(" ".join(pdf_pages(tmp_path / "c.pdf")[1].split()).split())
    low, high = pair["delta_uv_prime_interval95"]
    assert (f"With measurement uncertainty: Δu′v′ {pair['delta_uv_prime']:.5f}, u {pair['delta_uv_prime_u']:.5f}, "
            f"95 % interval {low:.5f} to {high:.5f}") in text
    assert f"decision: {pair['decision']} (guarded acceptance" in text
