"""Checking claims: the demo supplier's planted false claims, and every bad claims file."""

import json

import pytest

from lampcalc.io.demo_data import demo_claims, demo_files

HEADER = "lamp,nominal_cct_K,max_sdcm_steps,min_ra,min_r9,min_rf,min_rg,max_rg,min_ler_lm_per_W,electrical_W,min_efficacy_lm_per_W"


@pytest.fixture(scope="module")
def demo_run(tmp_path_factory):
    from click.testing import CliRunner

    from lampcalc.cli import cli

    out = tmp_path_factory.mktemp("check")
    result = CliRunner().invoke(
        cli, ["check", *map(str, demo_files()), "--claims", str(demo_claims()), "--json", str(out / "v.json"),
              "--csv", str(out / "v.csv")], catch_exceptions=False,
    )
    rate = CliRunner().invoke(cli, ["rate", *map(str, demo_files()), "--json", str(out / "r.json")])
    assert rate.exit_code == 0, rate.output
    return result, json.loads((out / "v.json").read_text()), {r["name"]: r for r in json.loads((out / "r.json").read_text())}


def _check(verdicts, lamp, criterion):
    entry = next(v for v in verdicts if v["lamp"] == lamp)
    return next(c for c in entry["checks"] if c["criterion"] == criterion)


def test_planted_false_claims_fail_with_the_right_margins(demo_run):
    result, verdicts, ratings = demo_run
    assert result.exit_code == 1
    # "3000 K" lamp measured at 3259 K: outside ANSI C78.377-2017's 3045 ± 175 K.
    cct = ratings["QF-A60-3000"]["cct_K"]
    quad = _check(verdicts, "QF-A60-3000", "ansi_quadrangle")
    assert quad["pass"] is False and quad["margin"] < 0
    cct_check = _check(verdicts, "QF-A60-3000", "ansi_cct_K")
    assert cct_check["pass"] is False and cct_check["margin"] == pytest.approx(175 - abs(cct - 3045))
    # R9 below its claim of 80.
    r9 = _check(verdicts, "QF-A60-2700-R9", "r9")
    assert r9["pass"] is False and r9["margin"] == pytest.approx(ratings["QF-A60-2700-R9"]["ri"][8] - 80)
    # Efficacy claimed 130 lm/W at 10 W; measured from the absolute spectrum.
    eff = _check(verdicts, "QF-DL-4000", "efficacy_lm_per_W")
    flux = ratings["QF-DL-4000"]["luminous_flux_lm"]
    assert eff["pass"] is False and eff["measured"] == pytest.approx(flux / 10) and eff["margin"] == pytest.approx(flux / 10 - 130)


def test_true_claims_pass_and_unclaimed_listed(demo_run):
    result, verdicts, ratings = demo_run
    for lamp in ("QF-HAL-2900", "QF-PNL-5000", "QF-HB-6500", "QF-T5-840", "QF-VS-3500"):
        entry = next(v for v in verdicts if v["lamp"] == lamp)
        assert entry["pass"] is True and all(c["pass"] for c in entry["checks"])
    assert _check(verdicts, "QF-DL-4000", "ra")["pass"] is True
    assert "no claims for QF-RGB-5600" in result.stdout
    assert "QF-RGB-5600" not in {v["lamp"] for v in verdicts}
    assert "not a photometric test report" in result.stdout


def test_every_claim_holds_exit_0(run, write):
    claims = write("c.csv", HEADER + "\nQF-HAL-2900,3000,,95,,,,,,,\n")
    result = run("check", *demo_files(), "--claims", claims)
    assert result.exit_code == 0, result.output


BAD_CLAIMS = {
    "no_lamp_column": ("name,min_ra\nQF-HAL-2900,90\n", "line 1: no 'lamp' column"),
    "unknown_column": ("lamp,min_cri\nQF-HAL-2900,90\n", "line 1: unknown column 'min_cri'"),
    "malformed": (HEADER + "\nQF-HAL-2900,3000,,ninety,,,,,,,\n", "line 2, column 'min_ra': 'ninety' is not a number"),
    # Steps and watts cannot be negative (common practice, no source); indices can (see below).
    "negative_steps": (HEADER + "\nQF-HAL-2900,3000,-5,,,,,,,,\n", "line 2, column 'max_sdcm_steps': '-5' is not a valid"),
    "zero_watts": (HEADER + "\nQF-HAL-2900,3000,,,,,,,,0,\n", "line 2, column 'electrical_W': '0' is not a valid"),
    "beyond_float": (HEADER + "\nQF-HAL-2900,3000,,1e999,,,,,,,\n", "'1e999' is beyond the range of a float"),
    "huge_cell": (HEADER + '\nQF-HAL-2900,"' + "9" * 200_000 + '",,,,,,,,,\n', "line 2: cannot be split into cells"),
    "header_only": (HEADER + "\n", "line 1: has a header but no lamps"),
    "claims_nothing": (HEADER + "\nQF-HAL-2900,,,,,,,,,,\n", "names lamps but claims nothing"),
    "duplicate": (HEADER + "\nQF-HAL-2900,3000,,,,,,,,,\n# note\nQF-HAL-2900,,,90,,,,,,,\n",
                  "line 4: lamp 'QF-HAL-2900' is claimed twice (also line 2)"),
    "nominal_range": (HEADER + "\nQF-HAL-2900,1800,,,,,,,,,\n", "line 2, column 'nominal_cct_K'"),
    "ragged": (HEADER + "\nQF-HAL-2900,3000\n", "line 2: 2 fields where the header has 11"),
    "empty": ("# nothing\n", "the claims file is empty"),
}


@pytest.mark.parametrize("case", sorted(BAD_CLAIMS))
def test_bad_claims_files(run, write, tmp_path, case):
    text, fragment = BAD_CLAIMS[case]
    out = tmp_path / "v.json"
    result = run("check", *demo_files(), "--claims", write(f"{case}.csv", text), "--json", out)
    assert result.exit_code == 2
    assert fragment in result.stderr
    assert "Traceback" not in result.output
    assert not out.exists()


def test_relative_spectrum_cannot_show_an_efficacy_claim(run, write):
    claims = write("c.csv", HEADER + "\nQF-HAL-2900,,,,,,,,,40,15\n")
    result = run("check", *demo_files(), "--claims", claims)
    assert result.exit_code == 1
    assert "cannot be checked: the spectrum is not in W/nm" in result.stdout


def test_semicolons_decimal_commas_and_case(run, write, tmp_path):
    # A continental export of the claims: semicolons, decimal commas, names in other case.
    claims = write("c.csv", "Lamp;Nominal_CCT_K;min_ra;max_sdcm_steps\nqf-hal-2900;3000;95,5;7,5\n")
    out = tmp_path / "v.json"
    result = run("check", *demo_files(), "--claims", claims, "--json", out)
    assert result.exit_code == 0, result.output
    (entry,) = json.loads(out.read_text())
    assert entry["lamp"] == "QF-HAL-2900"
    assert {c["criterion"]: c["claimed"] for c in entry["checks"]}["ra"] == 95.5


def test_negative_minimum_is_a_claim(run, write, tmp_path):
    # CIE 13.3 special indices can be negative, so "R9 at least -10" is a valid claim (common practice, no source).
    claims = write("c.csv", "lamp,min_r9\nQF-HAL-2900,-10\n")
    out = tmp_path / "v.json"
    assert run("check", *demo_files(), "--claims", claims, "--json", out).exit_code == 0
    (entry,) = json.loads(out.read_text())
    assert entry["checks"][0]["claimed"] == -10 and entry["checks"][0]["pass"] is True


def test_unknown_lamp_suggests_and_the_others_are_checked(run, write, tmp_path):
    claims = write("c.csv", HEADER + "\nQF-HAL-2900,3000,,95,,,,,,,\nQF-HAL-2090,3000,,,,,,,,,\n")
    out = tmp_path / "v.json"
    result = run("check", *demo_files(), "--claims", claims, "--json", out)
    assert result.exit_code == 2
    assert f"{claims}, line 3: no spectrum named 'QF-HAL-2090' among the files given; did you mean 'QF-HAL-2900'?" in result.stderr
    verdicts = {v["lamp"]: v for v in json.loads(out.read_text())}
    assert verdicts["QF-HAL-2900"]["pass"] is True
    assert verdicts["QF-HAL-2090"]["checks"][0]["criterion"] == "spectrum"
    assert verdicts["QF-HAL-2090"]["checks"][0]["pass"] is None
    assert "claimed but no spectrum: QF-HAL-2090" in result.stdout
    assert "QF-HAL-2090: no spectrum among the files given; its claims are not checked" in result.stdout


def test_claim_matching_two_spectra_is_refused(run, write, tmp_path):
    from lampcalc.io.demo_data import demo_files as files

    halogen = next(f for f in files() if "halogen" in f.name)
    twin = tmp_path / "twin.tsv"
    twin.write_bytes(halogen.read_bytes())
    claims = write("c.csv", "lamp,min_ra\nQF-HAL-2900,90\n")
    result = run("check", halogen, twin, "--claims", claims)
    assert result.exit_code == 2
    assert "line 2: lamp 'QF-HAL-2900' matches more than one spectrum" in result.stderr
    assert str(halogen) in result.stderr and str(twin) in result.stderr
    other = write("d.csv", "lamp,min_ra\nQF-HAL-2900-X,90\n")
    told = run("check", halogen, twin, "--claims", other)
    assert "lamp name(s) belong to more than one spectrum: 'QF-HAL-2900'" in told.stderr


def test_claims_file_in_the_spectra_folder_is_not_a_spectrum(run, tmp_path):
    import shutil

    for f in demo_files():
        shutil.copy(f, tmp_path)
    claims = tmp_path / "claims.csv"
    claims.write_text(HEADER + "\nQF-HAL-2900,3000,,95,,,,,,,\n", encoding="utf-8")
    result = run("check", "-r", tmp_path, "--claims", claims)
    assert result.exit_code == 0, result.output
    assert "claims.csv" not in result.stderr

