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
    assert "Lot claims of QF-SPOT-3000" in result.output and "FAILS" in result.output
    assert "(*) The IEC 60081 ellipse metric is not confirmed against the published table" in result.output


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
