"""``--uncertainty`` on ``rate`` and ``check``: the files gain the keys, the terminal the intervals, bad use one line.

The spectra are blackbodies from Planck's law; the decision rules are ILAC-G8:09/2019 4.2 (see
tests/verdicts/test_decision_rules.py). Everything else checked here is lampcalc's own interface.
"""

import json

import pytest

MODEL = "noise_percent = 0.5\nwavelength_shift_nm = 0.2\nbandwidth_nm = 4\ndraws = 100\nseed = 2\n"
CLAIMS = "lamp,nominal_cct_K,min_ra\nbb2950,3000,99\nbb3500,3500,101\n"


@pytest.fixture
def files(write, bb_table):
    return write("bb.csv", bb_table([2950.0, 3500.0])), write("lab.toml", MODEL), write("claims.csv", CLAIMS)


def test_rate_writes_uncertainty_keys_and_shows_intervals(run, files, tmp_path):
    spectra, model, _ = files
    out_json, out_csv = tmp_path / "r.json", tmp_path / "r.csv"
    result = run("rate", spectra, "--uncertainty", model, "--json", out_json, "--csv", out_csv)
    assert result.exit_code == 0, result.output
    record = json.loads(out_json.read_text())[0]
    for key in ("x", "y", "cct_K", "duv", "ra", "rf", "ler_lm_per_W"):
        assert record[f"{key}_u"] > 0, key
        low, high = record[f"{key}_interval95"]
        assert low <= high, key
    assert record["cct_K_interval95"][0] < record["cct_K"] < record["cct_K_interval95"][1]
    header = out_csv.read_text().splitlines()[0].split(",")
    assert header[header.index("cct_K") + 1: header.index("cct_K") + 3] == ["cct_K_u", "cct_K_interval95"]
    assert "Measurement uncertainty" in result.stdout and "noise 0.5 %, wavelength shift 0.2 nm, slit 4 nm; 100 draws" in result.stdout
    assert f"[{record['cct_K_interval95'][0]:.0f}, {record['cct_K_interval95'][1]:.0f}]" in result.stdout
    assert "lamp lm/W" not in result.stdout.split("Measurement uncertainty")[1]  # no absolute spectra: column left out


def test_check_workbook_spreads_the_intervals(run, files, tmp_path):
    from openpyxl import load_workbook

    spectra, model, claims = files
    out = tmp_path / "c.xlsx"
    assert run("check", spectra, "--claims", claims, "--uncertainty", model, "--xlsx", out).exit_code == 1
    book = load_workbook(out, read_only=True)
    ratings_header = next(book["ratings"].iter_rows(max_row=1, values_only=True))
    checks_header = next(book["checks"].iter_rows(max_row=1, values_only=True))
    assert "cct_K_interval95_low" in ratings_header and "r9_u" in ratings_header
    assert checks_header[-3:] == ("decision_rule", "guard_band", "decision") and "margin_interval95_high" in checks_header


def test_rate_without_model_is_unchanged(run, files, tmp_path):
    spectra, _, _ = files
    out = tmp_path / "r.json"
    assert run("rate", spectra, "--json", out).exit_code == 0
    assert not any(key.endswith(("_u", "_interval95")) for key in json.loads(out.read_text())[0])


def test_check_adds_decisions_beside_the_verdicts(run, files, tmp_path):
    spectra, model, claims = files
    plain, judged = tmp_path / "plain.json", tmp_path / "judged.json"
    before = run("check", spectra, "--claims", claims, "--json", plain)
    after = run("check", spectra, "--claims", claims, "--uncertainty", model, "--decision-rule", "guarded",
                "--guard-band-k", "3", "--json", judged)
    # The exit status follows the verdicts, which the uncertainty does not change (a Ra of 101 cannot hold).
    assert before.exit_code == after.exit_code == 1
    old, new = json.loads(plain.read_text()), json.loads(judged.read_text())
    for lamp_old, lamp_new in zip(old, new):
        assert lamp_new["pass"] == lamp_old["pass"]
        for c_old, c_new in zip(lamp_old["checks"], lamp_new["checks"]):
            assert {k: c_new[k] for k in c_old} == c_old
            assert c_new["decision_rule"] == "guarded acceptance, w = 3·u (ILAC-G8:09/2019 4.2.3)"
    ra = next(c for c in new[1]["checks"] if c["criterion"] == "ra")
    assert ra["decision"] == "fail" and ra["conformance_probability"] == 0.0  # CIE 13.3: Ri = 100 − 4.6·ΔE ≤ 100, so no draw reaches Ra 101
    assert "decision rule: guarded acceptance, w = 3·u" in after.stdout and "draws holding" in after.stdout
    # The decision table words its claims as the verdict table does (lampcalc.verdicts.wording), margins in Δuv.
    verdict_part, decision_part = after.stdout.split("With measurement uncertainty")
    for claim in ("nominal 3000 K: in its quadrangle", "Ra ≥ 99", "Ra ≥ 101"):
        assert claim in verdict_part and claim in decision_part
    assert "Δuv" in decision_part and "e-3 uv" not in decision_part


@pytest.mark.parametrize(
    "options, message",
    [
        (["--decision-rule", "guarded"], "--decision-rule and --guard-band-k need --uncertainty"),
        (["--guard-band-k", "2"], "--decision-rule and --guard-band-k need --uncertainty"),
        (["--uncertainty", "{model}", "--guard-band-k", "2"], "--guard-band-k applies to --decision-rule guarded"),
    ],
)
def test_decision_options_misused(run, files, options, message):
    spectra, model, claims = files
    result = run("check", spectra, "--claims", claims, *(o.format(model=model) for o in options))
    assert result.exit_code == 2 and message in result.stderr and "Traceback" not in result.output


def test_a_bad_spectrum_file_does_not_stop_the_others(run, files, write, tmp_path):
    spectra, model, _ = files
    bad = write("bad.csv", "nm,a\n380,1\n385,x\n")
    out = tmp_path / "r.json"
    result = run("rate", spectra, bad, "--uncertainty", model, "--json", out)
    assert result.exit_code == 2 and "bad.csv, line 3" in result.stderr
    assert [r["name"] for r in json.loads(out.read_text())] == ["bb2950", "bb3500"]


def test_compare_with_uncertainty_adds_the_differences_uncertainty_and_a_decision(run, write, bb_table, tmp_path):
    # Planck's law: blackbodies at 2950 K and 3050 K (11 mired apart) lie about 0.004 apart in u′v′ (from
    # memory), twice a 0.002 limit and far beyond what this model's noise can move.
    reference, test = write("ref.csv", bb_table([2950.0])), write("test.csv", bb_table([3050.0]))
    model = write("lab.toml", MODEL)
    plain, judged = tmp_path / "plain.json", tmp_path / "judged.json"
    before = run("compare", reference, test, "--limit-delta-uv-prime", "0.002", "--json", plain)
    after = run("compare", reference, test, "--limit-delta-uv-prime", "0.002", "--uncertainty", model,
                "--decision-rule", "guarded", "--json", judged, "--csv", tmp_path / "judged.csv")
    assert before.exit_code == after.exit_code == 1  # the result follows the measured Δu′v′, as before
    (old,), (new,) = (json.loads(path.read_text())["pairs"] for path in (plain, judged))
    same = [k for k in old if not k.endswith("flags")]  # each side's flags may gain those of its draws
    assert {k: new[k] for k in same} == {k: old[k] for k in same}
    assert new["delta_uv_prime_u"] > 0 and new["delta_cct_K_interval95"][0] < new["delta_cct_K"] < new["delta_cct_K_interval95"][1]
    assert new["decision"] == "fail" and new["conformance_probability"] == 0.0
    assert "reference and test drawn independently" in after.stdout and "u(margin)" in after.stdout
    header = (tmp_path / "judged.csv").read_text().splitlines()[0].split(",")
    assert header[header.index("delta_uv_prime") + 1] == "delta_uv_prime_u"
    refused = run("compare", reference, test, "--decision-rule", "guarded")
    assert refused.exit_code == 2 and "need --uncertainty" in refused.stderr


def test_lot_with_uncertainty_adds_it_to_the_statistics_and_says_what_it_is_not(run, write, bb_table, tmp_path):
    spectra, model = write("lot.csv", bb_table([2950.0, 2990.0, 3020.0, 3060.0])), write("lab.toml", MODEL)
    plain, judged = tmp_path / "plain.json", tmp_path / "judged.json"
    before = run("lot", spectra, "--json", plain)
    after = run("lot", spectra, "--uncertainty", model, "--json", judged, "--csv", tmp_path / "summary.csv")
    assert before.exit_code == after.exit_code == 0, after.output
    old, new = (json.loads(path.read_text())["lot"] for path in (plain, judged))
    assert {k: new[k] for k in old} == old  # the statistics themselves are those of the spectra as measured
    assert new["cct_K_mean_u"] > 0 and new["cct_K_mean_interval95"][0] < new["cct_K_mean"] < new["cct_K_mean_interval95"][1]
    assert new["measurement_model"].startswith("noise 0.5 %")
    assert "not the lot's sampling uncertainty" in after.stdout
    header = (tmp_path / "summary.csv").read_text().splitlines()[0].split(",")
    assert header[header.index("ra_mean") + 1: header.index("ra_mean") + 3] == ["ra_mean_u", "ra_mean_interval95"]
