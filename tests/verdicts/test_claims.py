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
    "malformed": (HEADER + "\nQF-HAL-2900,3000,,ninety,,,,,,,\n", "line 2, column 'min_ra': 'ninety' is not a non-negative number"),
    "negative": (HEADER + "\nQF-HAL-2900,3000,,-5,,,,,,,\n", "line 2, column 'min_ra': '-5'"),
    "duplicate": (HEADER + "\nQF-HAL-2900,3000,,,,,,,,,\n# note\nQF-HAL-2900,,,90,,,,,,,\n",
                  "line 4: lamp 'QF-HAL-2900' is claimed twice (also line 2)"),
    "no_spectrum": (HEADER + "\nQF-HAL-2900,3000,,,,,,,,,\nQF-GHOST,3000,,,,,,,,,\n",
                    "line 3: lamp 'QF-GHOST' has no spectrum among the files given"),
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
