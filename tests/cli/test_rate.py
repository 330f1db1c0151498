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
