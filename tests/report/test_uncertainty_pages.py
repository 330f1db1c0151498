"""The report with measurement uncertainty: the intervals, the decisions and the model's words, read back with pypdf.

The lamps are blackbodies from Planck's law (c2 = 1.4388e-2 m·K); the decision rules and their words
are ILAC-G8:09/2019 4.2 (lampcalc.verdicts.decision_rules); JCGM 101:2008 and CIE 198:2011 are the
methods the page must name. The numbers on the pages are checked against the JSON of the same run:
the report and the files must say the same (internal consistency, no published value).
"""

import json

import pytest
from click.testing import CliRunner

from lampcalc.cli import cli
from lampcalc.rating.flags import FLAG_MEANINGS, draw_flag_lines
from lampcalc.verdicts.decision_rules import OUTCOMES
from lampcalc.verdicts.wording import format_share, format_uncertainty, format_value

from ..conftest import blackbody_table
from .conftest import pdf_pages

MODEL = "noise_percent = 0.5\nwavelength_shift_nm = 0.2\nbandwidth_nm = 4\ndraws = 200\nseed = 2\n"
# ANSI C78.377-2017 Table 1: 3000 K is 3045 ± 175 K, so a 2950 K blackbody is in it; CIE 13.3-1995:
# Ri = 100 − 4.6·ΔE ≤ 100, so no spectrum, and no draw, reaches Ra 101.
CLAIMS = "lamp,nominal_cct_K,min_ra\nbb2950,3000,99\nbb3500,3500,101\n"


@pytest.fixture(scope="module")
def judged(tmp_path_factory):
    """``check --uncertainty --decision-rule guarded --guard-band-k 3 --report``: (JSON of the checks, ratings, pages)."""
    folder = tmp_path_factory.mktemp("uncertainty_report")
    for name, text in (("bb.csv", blackbody_table([2950.0, 3500.0])), ("lab.toml", MODEL), ("claims.csv", CLAIMS)):
        (folder / name).write_text(text, encoding="utf-8")
    runner = CliRunner()
    args = ["check", folder / "bb.csv", "--claims", folder / "claims.csv", "--uncertainty", folder / "lab.toml",
            "--decision-rule", "guarded", "--guard-band-k", "3", "--json", folder / "c.json", "--report", folder / "r.pdf"]
    result = runner.invoke(cli, [str(a) for a in args], catch_exceptions=False)
    assert result.exit_code == 1, result.output  # Ra ≥ 101 cannot hold
    rated = runner.invoke(cli, [str(a) for a in ["rate", folder / "bb.csv", "--uncertainty", folder / "lab.toml",
                                                 "--json", folder / "r.json"]], catch_exceptions=False)
    assert rated.exit_code == 0, rated.output
    return (json.loads((folder / "c.json").read_text()), json.loads((folder / "r.json").read_text()),
            pdf_pages(folder / "r.pdf"))


def _lamp_pages(pages, name):
    first = [p for p in pages if name in (line.strip() for line in p.splitlines())
             and "Claims with measurement uncertainty" in p]
    rest = [p for p in pages if f"{name}, continued" in p]
    assert len(first) == 1 and len(rest) == 1, name
    return first[0], rest[0]


def test_the_uncertainty_page_gives_the_model_method_rule_outcomes_and_caution(judged):
    _, _, pages = judged
    (page,) = [p for p in pages if p.startswith("Measurement uncertainty") or "\nMeasurement uncertainty\n" in p[:200]]
    flat = " ".join(page.split())
    for words in ("noise: 0.5 % of each measured value, independent between wavelengths",
                  "wavelength offset: 0.2 nm", "slit: triangular, 4 nm full width at half maximum",
                  "File lab.toml", "200 Monte Carlo draws of every lamp, seed 2",
                  "JCGM 101:2008", "CIE 198:2011", "7.7.2", "not a coverage region of JCGM 102",
                  "guarded acceptance, w = 3·u (ILAC-G8:09/2019 4.2.3)",
                  "the decisions are stated beside them and change neither",
                  "The uncertainties are those of the measurement model given"):
        assert words in flat, words
    for outcome, meaning in OUTCOMES.items():
        assert f"{outcome}: {meaning}." in flat, outcome
    assert "bb3500" in page and "fail" in page  # each lamp's decision beside its verdicts


def test_lamp_pages_show_intervals_decisions_and_the_main_ratings_uncertainty(judged):
    checks, ratings, pages = judged
    for lamp, record in zip(checks, ratings):
        first, rest = _lamp_pages(pages, lamp["lamp"])
        flat = " ".join(first.split())
        assert f"Decision: {lamp['decision']} (guarded acceptance, w = 3·u" in flat
        for check in lamp["checks"]:
            key = {"ansi_quadrangle": "cct_K", "ansi_cct_K": "cct_K", "ansi_duv": "duv"}.get(check["criterion"], check["criterion"])
            low, high = (format_value(key, v) for v in check["measured_interval95"])
            assert f"[{low}, {high}]" in flat, check["criterion"]
            assert format_share(check["conformance_probability"]) in flat
            assert check["decision"] in flat
        # The main ratings: value, u (two significant digits) and the 95 % interval, as in the ratings file.
        assert "95 % from" in first and "95 % to" in first
        for key in ("x", "cct_K", "ra", "rf"):
            assert format_uncertainty(record[f"{key}_u"]) in flat, key
            assert all(format_value(key, v) in flat for v in record[f"{key}_interval95"]), key
        assert "Colour rendering" in rest and "Spectrum" in rest and "Colour rendering" not in first
    ra = next(c for c in checks[1]["checks"] if c["criterion"] == "ra")
    assert ra["decision"] == "fail" and ra["conformance_probability"] == 0.0


def test_the_summary_diagram_and_lamp_diagrams_say_what_is_shaded(judged):
    _, _, pages = judged
    assert "Shaded: each lamp's 95 % region over the Monte Carlo draws." in " ".join(pages[0].split())
    first, _ = _lamp_pages(pages, "bb2950")
    assert "Shaded: the lamp's 95 % region over the Monte Carlo draws." in " ".join(first.split())


def test_rate_with_uncertainty_and_report_has_the_page_without_decisions(run, write, tmp_path):
    spectra, model = write("bb.csv", blackbody_table([2950.0])), write("lab.toml", MODEL)
    out = tmp_path / "r.pdf"
    assert run("rate", spectra, "--uncertainty", model, "--report", out).exit_code == 0
    pages = pdf_pages(out)
    flat = " ".join(" ".join(pages).split())
    assert "Measurement uncertainty" in flat and "Decision rule" not in flat and "Claims with measurement" not in flat
    assert len(pages) == 1 + 1 + 2 + 1  # summary, uncertainty, the lamp on two pages, methods


def test_a_lamp_whose_draws_cross_limits_says_which_and_how_often(tmp_path):
    # ANSI C78.377-2017 Table 1: 3220 K is the edge between the 3000 K and 3500 K categories; a blackbody
    # there is above half its peak at 830 nm, so a wavelength offset moves the end of its FWHM in some draws.
    import lampcalc
    from lampcalc.physics.blackbody import spectral_radiance
    from lampcalc.spectra.resampling import GRID_NM

    lamp = lampcalc.SpectralBatch(GRID_NM, spectral_radiance([3220.0], GRID_NM), ("edge",))
    ratings = lampcalc.rate_with_uncertainty(lamp, lampcalc.MeasurementModel(noise_percent=1.0, wavelength_shift_nm=0.5,
                                                                             draws=200))
    record = ratings.records()[0]
    assert {"uncertainty_crosses_validity", "uncertainty_category_varies"} <= set(record["flags"])
    lampcalc.write_report(tmp_path / "edge.pdf", ratings)
    first = " ".join(pdf_pages(tmp_path / "edge.pdf")[2].split())
    assert FLAG_MEANINGS["uncertainty_category_varies"] in first
    lines = draw_flag_lines(record["uncertainty_flags_in_draws"])
    assert lines and all(line in first for line in lines)


def test_a_report_without_uncertainty_has_no_uncertainty_page(demo_report):
    _, pages = demo_report
    assert not any("Measurement uncertainty" in p or "95 % region" in p for p in pages)
