"""``lampcalc lot``: the demo lot with its claims, an angle set, and every way input goes wrong.

The numbers in the files are checked against direct computations on the samples the same
command writes (NumPy mean and ddof=1 standard deviation); exit statuses are lampcalc's own
contract (docs/lots.md): 0 all hold, 1 a claim or limit does not, 2 bad input.
"""

import csv
import json

import numpy as np
import pytest

from lampcalc.io.demo_data import demo_lot_claims, demo_set

from ..report.conftest import pdf_pages


@pytest.fixture(scope="module")
def demo_lot(tmp_path_factory):
    from click.testing import CliRunner

    from lampcalc.cli import cli

    out = tmp_path_factory.mktemp("lot")
    args = ["lot", *map(str, demo_set("lot")), "--claims", str(demo_lot_claims()), "--json", str(out / "lot.json"),
            "--csv", str(out / "lot.csv"), "--figures", str(out / "figures")]
    result = CliRunner().invoke(cli, args, catch_exceptions=False)
    return result, json.loads((out / "lot.json").read_text()), out


def test_demo_lot_writes_every_key_and_a_verdict(demo_lot):
    result, doc, out = demo_lot
    assert result.exit_code == 1, result.output  # the supplier's "95 % within 3 steps" does not hold
    lot, samples = doc["lot"], doc["samples"]
    assert lot["n_samples"] == len(samples) == 12
    for key in ("mean_x", "mean_y", "mean_u_prime", "mean_v_prime", "max_pairwise_delta_uv_prime",
                "ra_mean", "ra_sd", "ra_min", "ra_max", "ra_p05", "ra_p95", "cct_K_mean"):
        assert key in lot
    ra = np.array([s["ra"] for s in samples])
    assert lot["ra_mean"] == pytest.approx(ra.mean()) and lot["ra_sd"] == pytest.approx(ra.std(ddof=1))
    assert lot["mean_x"] == pytest.approx(np.mean([s["x"] for s in samples]))
    claims = doc["claims"]
    assert claims["product"] == "QF-SPOT-3000" and claims["all_hold"] is False
    assert [c["pass"] for c in claims["checks"]] == [False, True, True, True]
    assert "colour_over_angle" not in doc
    assert "Lot claims of QF-SPOT-3000: the lot does not meet 1 of 4 claims" in result.output
    assert "does not meet †" in result.output and "FAILS" not in result.output  # the shared verdict words
    assert "4 lot claims: 3 met, 1 not met, 0 not evaluated" in result.output
    assert "† qualified: the IEC 60081 ellipse metric is not confirmed against the published table" in result.output
    # Shares within n steps rest on that unconfirmed metric: in parentheses, as in the report.
    assert f"3: ({lot['within_3_steps_percent']:.0f} %)" in result.output


def test_demo_lot_csv_is_one_row_of_the_summary(demo_lot):
    _, doc, out = demo_lot
    rows = list(csv.DictReader((out / "lot.csv").read_text().splitlines()))
    assert len(rows) == 1
    assert float(rows[0]["ra_mean"]) == doc["lot"]["ra_mean"]
    assert rows[0]["max_pairwise_samples"] == ";".join(doc["lot"]["max_pairwise_samples"])


def test_demo_lot_figures(demo_lot):
    _, _, out = demo_lot
    for name in ("lot_locus.png", "lot_histograms.png"):
        assert (out / "figures" / name).stat().st_size > 20_000


def test_angle_set_verdict_against_the_users_limit(run, tmp_path):
    files = demo_set("angles")
    tight = run("lot", *files, "--limit-delta-uv-prime", "0.004", "--json", tmp_path / "a.json")
    assert tight.exit_code == 1, tight.output
    angles = json.loads((tmp_path / "a.json").read_text())["colour_over_angle"]
    assert angles["angle_weighting"] == "illuminance_lx" and angles["angle_pass"] is False
    assert [a["angle_deg"] for a in angles["angles"]] == [0, 10, 20, 30, 40, 50, 60, 70, 80]
    loose = run("lot", *files, "--limit-delta-uv-prime", str(angles["max_delta_uv_prime_over_angle"] + 1e-4))
    assert loose.exit_code == 0, loose.output
    assert "Colour over angle: 9 spectra" in loose.output
    assert "0.004: does not meet your limit 0.004" not in tight.output and ": does not meet your limit 0.004" in tight.output
    assert ": meets your limit" in loose.output


def test_bad_input_is_one_line_and_status_2(run, write, tmp_path, bb_table):
    lot = demo_set("lot")
    bad = write("claims.toml", "lampcalc_lot_claims = 1\n[[claim]]\nquantity = 'ra_maen'\nat_least = 80\n")
    result = run("lot", *lot, "--claims", bad, "--json", tmp_path / "x.json")
    assert result.exit_code == 2 and "did you mean 'ra_mean'" in result.stderr
    assert len(result.stderr.strip().splitlines()) == 1 and "Traceback" not in result.output
    assert not (tmp_path / "x.json").exists()
    no_angles = run("lot", *lot, "--limit-delta-uv-prime", "0.004")
    assert no_angles.exit_code == 2 and "needs an angle for every spectrum; 12 of 12 have none" in no_angles.stderr
    conflict = run("lot", *lot, "--claims", demo_lot_claims(), "--centre-cct", "3500")
    assert conflict.exit_code == 2 and "--centre-cct 3500 K and the claims file's nominal_cct_K 3000 K differ" in conflict.stderr


def test_a_bad_file_among_good_ones_is_reported_and_the_rest_summarised(run, write, bb_table):
    good = write("lot.csv", bb_table([2900.0, 3000.0, 3100.0]))
    bad = write("broken.csv", "nm,a\n380,1\n385,abc\n390,1\n")
    result = run("lot", good, bad)
    assert result.exit_code == 2
    assert "Lot of 3 samples" in result.output and "broken.csv, line 3" in result.stderr
    assert "1 of 2 spectrum files could not be read" in result.stderr


def test_outputs_written_together_with_the_report(run, tmp_path):
    # JSON, CSV, workbook and report of one run; the workbook's numbers are the JSON's (openpyxl keeps 16 digits).
    import openpyxl

    info = tmp_path / "info.toml"
    info.write_text('client = "Quillfen Lighting (fictional)"\nreport_number = "LOT-7"\n')
    out = tmp_path / "new folder"
    result = run("lot", *demo_set("lot"), "--claims", demo_lot_claims(), "--json", out / "l.json", "--csv",
                 out / "l.csv", "--xlsx", out / "l.xlsx", "--report", out / "l.pdf", "--report-info", info,
                 "--paper", "letter")
    assert result.exit_code == 1, result.output
    doc = json.loads((out / "l.json").read_text())
    book = openpyxl.load_workbook(out / "l.xlsx")
    assert book.sheetnames == ["lot", "statistics", "samples", "claims", "flags", "notes"]
    stats = {row[0].value: [c.value for c in row[1:]] for row in book["statistics"].iter_rows(min_row=2)}
    assert stats["ra"][1] == pytest.approx(doc["lot"]["ra_mean"], rel=1e-15)
    assert stats["ra"][2] == pytest.approx(np.std([s["ra"] for s in doc["samples"]], ddof=1), rel=1e-12)  # NumPy
    assert [c.value for c in book["claims"]["H"]][1:] == ["does not meet", "meets", "meets", "meets"]
    flags = {row[0].value: row[2].value for row in book["flags"].iter_rows(min_row=2)}
    assert flags["steps_metric_unconfirmed"].startswith("the lot")
    pages = pdf_pages(out / "l.pdf")
    assert "report LOT-7" in pages[0] and "Quillfen Lighting (fictional)" in pages[0]
    assert "The lot of 12 samples (QF-SPOT-3000) does not meet 1 of 4 claims." in " ".join(pages[0].split())
    assert any("Claims on the lot" in p for p in pages) and any("Statistics of the samples" in p for p in pages)
    assert len(pages) == 1 + 2 + 12 + 2  # summary, the lot, every sample, methods
    assert "wrote" in result.stderr and f"{out / 'l.pdf'} ({len(pages)} pages)" in result.stderr


def test_outputs_replaced_together_or_not_at_all(run, tmp_path, monkeypatch):
    json_out, pdf_out = tmp_path / "l.json", tmp_path / "l.pdf"
    json_out.write_text("old json")

    def broken(*args, **kwargs):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr("lampcalc.report.document.Report.write", broken)
    result = run("lot", *demo_set("lot"), "--json", json_out, "--report", pdf_out)
    assert result.exit_code == 2 and "none was changed" in result.stderr
    assert json_out.read_text() == "old json" and not pdf_out.exists()


@pytest.mark.parametrize("args, fragment", [
    (["--xlsx", "{tmp}/l.csv"], "--xlsx writes a .xlsx file"),
    (["--report", "{tmp}/l.txt"], "--report writes a .pdf file"),
    (["--report-info", "{tmp}/info.toml"], "--report-info and --paper describe the PDF report: add --report FILE"),
    (["--figures", "{tmp}/info.toml/figures"], "cannot write there"),
    (["--json", "{tmp}/same", "--csv", "{tmp}/same"], "given for both --json and --csv"),
])
def test_bad_outputs_refused_before_the_work(run, tmp_path, args, fragment):
    (tmp_path / "info.toml").write_text('client = "Q"\n')
    result = run("lot", *demo_set("lot"), *[a.format(tmp=tmp_path) for a in args])
    assert result.exit_code == 2 and fragment in result.stderr
    assert "Lot of 12" not in result.output  # nothing was read or rated


LAB_CIRCLES = ("# name: lab circles 0.002\n# source: laboratory procedure (invented for this test)\n# edition: 1\n"
               "# confirmed: yes\n# space: upvp\nname,nominal_cct_K,x,y,a,b,theta_deg\ncircle,,,,0.002,0.002,0\n")


def test_a_users_ellipse_set_counts_the_steps(run, write, tmp_path):
    # One step of the set is a u′v′ circle of radius 0.002 (the file's own definition): each sample's steps are its
    # distance from the ANSI 3000 K centre in u′v′ (colour-science's xy_to_Luv_uv, reference library) over 0.002.
    import colour

    ellipses = write("circles.csv", LAB_CIRCLES)
    result = run("lot", *demo_set("lot"), "--claims", demo_lot_claims(), "--ellipses", ellipses, "--json",
                 tmp_path / "l.json", "--figures", tmp_path / "figures")
    doc = json.loads((tmp_path / "l.json").read_text())
    lot = doc["lot"]
    assert lot["steps_method"] == "set" and lot["steps_set"] == "lab circles 0.002" and lot["steps_metric_confirmed"]
    assert "steps_metric_unconfirmed" not in lot["flags"]
    centre = colour.xy_to_Luv_uv(np.array([lot["steps_centre_x"], lot["steps_centre_y"]]))
    upvp = colour.xy_to_Luv_uv(np.array([[s["x"], s["y"]] for s in doc["samples"]]))
    steps = np.hypot(*(upvp - centre).T) / 0.002
    np.testing.assert_allclose([s["sdcm_steps"] for s in doc["samples"]], steps, rtol=1e-9)
    share = doc["claims"]["checks"][0]
    assert share["measured"] == pytest.approx(100 * np.mean(steps <= 3)) and "†" not in result.output
    assert result.exit_code == (0 if all(c["pass"] for c in doc["claims"]["checks"]) else 1), result.output
    assert "lab circles 0.002" in result.output
    assert (tmp_path / "figures" / "lot_locus.png").stat().st_size > 20_000  # drawn with the set's rings


def test_samples_counted_in_a_users_bins(run, write, tmp_path):
    # Two bins splitting the ANSI C78.377-2017 3000 K quadrangle (its corners: lampcalc/data/sets, as published)
    # between the midpoints of its top and bottom edges; the samples are counted directly with matplotlib's Path.
    from matplotlib.path import Path as Polygon

    warm = [(0.4562, 0.4260), (0.44325, 0.42165), (0.42615, 0.3857), (0.4373, 0.3893)]
    cool = [(0.44325, 0.42165), (0.4303, 0.4173), (0.4150, 0.3821), (0.42615, 0.3857)]
    rows = "\n".join(f"{name},3000," + ",".join(f"{c:g}" for corner in bin_ for c in corner)
                     for name, bin_ in (("3W", warm), ("3C", cool)))
    bins = write("halves.csv", "# name: 3000 K halves\n# source: laboratory (invented for this test)\n# edition: 1\n"
                 "# confirmed: yes\n# space: xy\nbin,nominal_cct_K,x1,y1,x2,y2,x3,y3,x4,y4\n" + rows + "\n")
    result = run("lot", *demo_set("lot"), "--bins", bins, "--json", tmp_path / "l.json")
    assert result.exit_code == 0, result.output
    doc = json.loads((tmp_path / "l.json").read_text())
    xy = np.array([[s["x"], s["y"]] for s in doc["samples"]])
    counts = {name: int(Polygon(bin_).contains_points(xy).sum()) for name, bin_ in (("3C", cool), ("3W", warm))}
    assert counts["3C"] > 0 and counts["3W"] > 0 and sum(counts.values()) == 12
    lot = doc["lot"]
    assert lot["bin_set"] == "3000 K halves" and dict(zip(lot["bins_name"], lot["bins_count"])) == counts
    assert lot["bins_none_count"] == 0
    assert f"3C: {counts['3C']}, 3W: {counts['3W']} (3000 K halves)" in result.output


def test_an_angle_set_writes_what_an_angle_set_needs(run, tmp_path):
    result = run("lot", *demo_set("angles"), "--figures", tmp_path / "figures", "--xlsx", tmp_path / "a.xlsx")
    assert result.exit_code == 0, result.output  # no limit given, so no verdict to fail
    assert "no limit given, so not evaluated" in result.output
    assert sorted(p.name for p in (tmp_path / "figures").iterdir()) == ["colour_over_angle.png"]
    import openpyxl

    assert {"colour_over_angle", "angles"} <= set(openpyxl.load_workbook(tmp_path / "a.xlsx").sheetnames)
