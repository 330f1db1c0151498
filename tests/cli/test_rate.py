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
