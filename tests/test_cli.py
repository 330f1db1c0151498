"""The command line: each command, its outputs and its handling of bad input."""

import json

import numpy as np
import pytest

from lampcalc.blackbody import band_fraction, peak_wavelength_nm, radiant_exitance

PLANCK_KEYS = [
    "temperature_K", "peak_wavelength_nm", "peak_frequency_THz", "radiant_exitance_W_per_m2",
    "visible_fraction", "ler_lm_per_W", "x", "y", "cct_K", "duv",
]


def test_planck_json(run):
    result = run("planck", "2856", "5772", "--json")
    assert result.exit_code == 0
    records = json.loads(result.stdout)
    assert [list(r) for r in records] == [PLANCK_KEYS, PLANCK_KEYS]
    r = records[0]
    assert r["temperature_K"] == 2856.0
    # CODATA 2018 Wien b = 2.897771955e-3 m·K; σ = 5.670374419e-8.
    assert r["peak_wavelength_nm"] == pytest.approx(2.897771955e-3 / 2856 * 1e9, rel=1e-9)
    assert r["peak_frequency_THz"] == pytest.approx(5.878925757e10 * 2856 / 1e12, rel=1e-9)
    assert r["radiant_exitance_W_per_m2"] == pytest.approx(5.670374419e-8 * 2856**4, rel=1e-9)
    # Illuminant A's Planckian radiator (CIE 015): x, y near (0.4476, 0.4074); CCT back exactly.
    assert r["x"] == pytest.approx(0.4476, abs=2e-4) and r["y"] == pytest.approx(0.4074, abs=2e-4)
    assert r["cct_K"] == pytest.approx(2856.0, rel=1e-9) and abs(r["duv"]) < 1e-9
    # Trade value (shared/REFERENCE_VALUES.md): 2856 K radiation has about 16.4 lm/W over all wavelengths.
    assert r["ler_lm_per_W"] == pytest.approx(16.4, abs=0.1)
    assert r["visible_fraction"] == pytest.approx(float(band_fraction(2856.0)), rel=1e-12)


def test_planck_table_and_out_of_range_cct(run):
    result = run("planck", "500", "3000")
    assert result.exit_code == 0
    assert "outside 1000-100000 K" in result.stdout
    assert f"{float(peak_wavelength_nm(3000.0)):.1f}" in result.stdout
    data = json.loads(run("planck", "500", "--json").stdout)
    assert data[0]["cct_K"] is None and data[0]["radiant_exitance_W_per_m2"] == pytest.approx(
        float(radiant_exitance(500.0))
    )


@pytest.mark.parametrize("arg, message", [("abc", "'abc' is not a number"), ("0", "above 0 K"), ("nan", "above 0 K")])
def test_planck_bad_temperatures(run, arg, message):
    result = run("planck", "--", arg)
    assert result.exit_code == 2
    assert message in result.stderr
    assert "Traceback" not in result.output


@pytest.mark.parametrize("quantity", ["radiance", "exitance", "energy-density", "photon-radiance"])
@pytest.mark.parametrize("per", ["wavelength", "frequency"])
def test_planck_spectrum_file(run, tmp_path, quantity, per):
    out = tmp_path / "bb.csv"
    result = run("planck", "3000", "6500", "--spectrum", out, "--quantity", quantity, "--per", per,
                 "--range", "380", "780", "5")
    assert result.exit_code == 0
    lines = [l for l in out.read_text().splitlines() if not l.startswith("#")]
    assert lines[0] == "wavelength_nm,T_3000_K,T_6500_K"
    values = np.array([[float(v) for v in l.split(",")] for l in lines[1:]])
    assert values.shape == (81, 3) and np.all(values[:, 1:] > 0)


def test_planck_radiance_file_values(run, tmp_path):
    from lampcalc.blackbody import spectral_radiance

    out = tmp_path / "bb.csv"
    run("planck", "3000", "--spectrum", out)
    lines = [l for l in out.read_text().splitlines() if not l.startswith("#")][1:]
    wl, value = (float(v) for v in lines[200].split(","))
    assert wl == 560.0 and value == pytest.approx(float(spectral_radiance(3000.0, [560.0])[0]), rel=1e-15)


def test_rate_json_keys_and_values(run, write, bb_table, tmp_path):
    from lampcalc import colorimetry as cm

    path = write("bb.csv", bb_table([2856.0, 6500.0], 360, 830, 1))
    out = tmp_path / "r.json"
    result = run("rate", path, "--json", out)
    assert result.exit_code == 0, result.output
    records = json.loads(out.read_text())
    assert [r["name"] for r in records] == ["bb2856", "bb6500"]
    for key in ("name", "source", "x", "y", "u", "v", "u_prime", "v_prime", "ler_lm_per_W", "flags", "cct_K", "duv"):
        assert key in records[0]
    r = records[0]
    assert r["source"] == "bb.csv, column 2"
    # A 2856 K Planck spectrum (CODATA c2): its x, y equal the colorimetry of the same spectrum.
    assert r["u"] == pytest.approx(cm.xy_to_uv([r["x"], r["y"]])[0], rel=1e-12)
    assert r["v_prime"] == pytest.approx(1.5 * r["v"], rel=1e-12)
    assert r["cct_K"] == pytest.approx(2856 * 1.4388e-2 / 1.438776877e-2, rel=2e-6)
    assert r["flags"] == []
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


def test_demo_writes_results(run, tmp_path):
    out = tmp_path / "demo"
    result = run("demo", "--out", out)
    assert result.exit_code == 0, result.output
    records = json.loads((out / "ratings.json").read_text())
    names = {r["name"] for r in records}
    assert {"QF-A60-2700-R9", "QF-HAL-2900", "QF-T5-840", "QF-RGB-5600", "QF-DL-4000"} <= names
    absolute = next(r for r in records if r["name"] == "QF-DL-4000")
    assert absolute["luminous_flux_lm"] > 0 and absolute["efficacy_lm_per_W"] == pytest.approx(
        absolute["luminous_flux_lm"] / 10.0
    )
    assert (out / "ratings.csv").read_text().startswith("name,source,")


# --- lampcalc cct ---


def test_cct_points_each_form(run):
    from lampcalc.colorimetry import xy_to_upvp, xy_to_uv

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
    from lampcalc.colorimetry import uv_to_upvp, uv_to_xy
    from lampcalc.locus import cct_duv_to_uv

    uv = cct_duv_to_uv(np.array([[2700.0, 0.001], [4000.0, -0.002], [6500.0, 0.003]]))
    coords = {"x,y": uv_to_xy(uv), "u,v": uv, "u_prime,v_prime": uv_to_upvp(uv)}[columns]
    text = f"id,{columns}\n" + "\n".join(f"p{i},{float(a)!r},{float(b)!r}" for i, (a, b) in enumerate(coords))
    path = write("pts.csv", text)
    out_csv, out_json = tmp_path / "o.csv", tmp_path / "o.json"
    assert run("cct", path, "--csv", out_csv).exit_code == 0
    assert run("cct", path, "--json", out_json).exit_code == 0
    rows = [l.split(",") for l in out_csv.read_text().splitlines()]
    assert rows[0] == ["id", *columns.split(","), "cct_K", "duv", "flag"]
    assert float(rows[1][3]) == pytest.approx(2700.0, rel=1e-9) and float(rows[2][4]) == pytest.approx(-0.002, abs=1e-12)
    records = json.loads(out_json.read_text())
    assert records[2]["id"] == "p2" and records[2]["cct_K"] == pytest.approx(6500.0, rel=1e-9)
    assert records[2]["flag"] == ""


def test_cct_bad_rows_reported_rest_converted(run, write, tmp_path):
    path = write("pts.csv", "x,y\n0.3127,0.3290\nabc,0.3\n0.31\n0.44,0.40\n0.9,0.05\n")
    out = tmp_path / "o.csv"
    result = run("cct", path, "--csv", out)
    assert result.exit_code == 2
    assert "pts.csv, line 3: x, y = 'abc', '0.3' are not two finite numbers" in result.stderr
    assert "pts.csv, line 4: 1 fields where the header has 2" in result.stderr
    rows = out.read_text().splitlines()
    assert len(rows) == 6 and rows[1].split(",")[2].startswith("650")
    assert rows[2].endswith(",,,not_a_chromaticity")
    assert rows[5].endswith("cct_below_1000K") or rows[5].endswith("cct_above_100000K")


def test_cct_missing_columns_and_bad_usage(run, write):
    result = run("cct", write("p.csv", "a,b\n1,2\n"))
    assert result.exit_code == 2 and "needs x,y or u,v or u_prime,v_prime" in result.stderr
    assert run("cct").exit_code == 2
    assert run("cct", "--xy", "0.3", "abc").exit_code == 2


def test_cct_large_file_streams(run, write, tmp_path):
    from lampcalc.locus import cct_duv_to_xy

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


def test_rate_sprague_option(run, write, tmp_path):
    import colour

    # CIE published the FL7 CCT (6500 K, rounded to 10 K) from its 5 nm table; Sprague reproduces
    # that computation (within 10 K), the linear default differs by about 5 K more (docs/spectrum-files.md).
    sd = colour.SDS_ILLUMINANTS["FL7"]
    path = write("fl7.csv", "nm,FL7\n" + "\n".join(f"{w:g},{v!r}" for w, v in zip(sd.wavelengths, map(float, sd.values))))
    out_s, out_l = tmp_path / "s.json", tmp_path / "l.json"
    assert run("rate", path, "--interpolation", "sprague", "--json", out_s).exit_code == 0
    assert run("rate", path, "--json", out_l).exit_code == 0
    sprague_cct = json.loads(out_s.read_text())[0]["cct_K"]
    linear_cct = json.loads(out_l.read_text())[0]["cct_K"]
    assert sprague_cct == pytest.approx(6500, abs=10)
    assert linear_cct < sprague_cct - 3


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
