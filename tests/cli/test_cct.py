"""``lampcalc cct``: CCT and Duv of chromaticities given as options or in CSV files."""

import json

import numpy as np
import pytest


def test_cct_points_each_form(run):
    from lampcalc.colorimetry.tristimulus import xy_to_upvp, xy_to_uv

    xy = (0.3127, 0.3290)
    uv = tuple(float(c) for c in xy_to_uv(xy))
    upvp = tuple(float(c) for c in xy_to_upvp(xy))
    outs = [run("cct", "--xy", *xy), run("cct", "--uv", *uv), run("cct", "--upvp", *upvp)]
    for result in outs:
        assert result.exit_code == 0
        # D65's chromaticity (0.3127, 0.3290) has a CCT of about 6504 K (CIE 015).
        assert "6504." in result.stdout


@pytest.mark.parametrize("columns", ["x,y", "u,v", "u_prime,v_prime"])
def test_cct_csv_file(run, write, tmp_path, columns):
    from lampcalc.colorimetry.tristimulus import uv_to_upvp, uv_to_xy
    from lampcalc.colorimetry.locus import cct_duv_to_uv

    uv = cct_duv_to_uv(np.array([[2700.0, 0.001], [4000.0, -0.002], [6500.0, 0.003]]))
    coords = {"x,y": uv_to_xy(uv), "u,v": uv, "u_prime,v_prime": uv_to_upvp(uv)}[columns]
    text = f"id,{columns}\n" + "\n".join(f"p{i},{float(a)!r},{float(b)!r}" for i, (a, b) in enumerate(coords))
    path = write("pts.csv", text)
    out_csv, out_json = tmp_path / "o.csv", tmp_path / "o.json"
    assert run("cct", path, "--csv", out_csv).exit_code == 0
    assert run("cct", path, "--json", out_json).exit_code == 0
    rows = [l.split(",") for l in out_csv.read_text().splitlines()]
    assert rows[0] == ["id", *columns.split(","), "cct_K", "duv", "ansi_nominal_cct_K", "flag"]
    assert float(rows[1][3]) == pytest.approx(2700.0, rel=1e-9) and float(rows[2][4]) == pytest.approx(-0.002, abs=1e-12)
    # Each point lies well inside its ANSI C78.377-2017 quadrangle (corner table, shared/REFERENCE_VALUES.md).
    assert [float(r[5]) for r in rows[1:]] == [2700.0, 4000.0, 6500.0]
    records = json.loads(out_json.read_text())
    assert records[2]["id"] == "p2" and records[2]["cct_K"] == pytest.approx(6500.0, rel=1e-9)
    assert records[2]["flag"] == "" and records[2]["ansi_nominal_cct_K"] == 6500


def test_cct_bad_rows_reported_rest_converted(run, write, tmp_path):
    path = write("pts.csv", "x,y\n0.3127,0.3290\nabc,0.3\n0.31\n0.44,0.40\n0.9,0.05\n")
    out = tmp_path / "o.csv"
    result = run("cct", path, "--csv", out)
    assert result.exit_code == 2
    assert "pts.csv, line 3: x, y = 'abc', '0.3' are not two finite numbers" in result.stderr
    assert "pts.csv, line 4: 1 fields where the header has 2" in result.stderr
    rows = out.read_text().splitlines()
    assert len(rows) == 6 and rows[1].split(",")[2].startswith("650")
    assert rows[2].endswith(",,,,not_a_chromaticity")
    # x = 0.9 lies beyond the red end of the spectrum locus (CIE 015:2018, clause 8.1): no light has it
    assert rows[5].endswith(",,,,not_a_chromaticity")


def test_cct_missing_columns_and_bad_usage(run, write):
    result = run("cct", write("p.csv", "a,b\n1,2\n"))
    assert result.exit_code == 2 and "needs x,y or u,v or u_prime,v_prime" in result.stderr
    assert run("cct").exit_code == 2
    assert run("cct", "--xy", "0.3", "abc").exit_code == 2


def test_cct_large_file_streams(run, write, tmp_path):
    from lampcalc.colorimetry.locus import cct_duv_to_xy

    rng = np.random.default_rng(0)
    pairs = np.stack([rng.uniform(2000, 8000, 250_000), rng.uniform(-0.01, 0.01, 250_000)], -1)
    xy = cct_duv_to_xy(pairs)
    path = tmp_path / "big.csv"
    path.write_text("x,y\n" + "\n".join(f"{float(a)!r},{float(b)!r}" for a, b in xy) + "\n")
    out = tmp_path / "big_out.csv"
    result = run("cct", path, "--csv", out)
    assert result.exit_code == 0
    back = np.loadtxt(out, delimiter=",", skiprows=1, usecols=(2, 3))
    np.testing.assert_allclose(back, pairs, rtol=1e-9, atol=1e-12)


def test_cct_table_shows_the_ansi_category(run):
    # shared/REFERENCE_VALUES.md: the published 4000 K centre (0.3818, 0.3797) is in the 4000 K quadrangle;
    # (0.30, 0.40), far above the locus, is in none.
    result = run("cct", "--xy", "0.3818", "0.3797", "--xy", "0.30", "0.40")
    assert result.exit_code == 0
    lines = result.stdout.splitlines()
    assert lines[0].split()[-2:] == ["ANSI", "flag"]
    assert lines[2].split()[-2:] == ["4000", "-"]
    assert lines[3].split()[-2] == "-"
