"""``lampcalc demo``: the bundled demo runs and writes its results."""

import json

import pytest


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
    # The lot, the downlight over angle and the sample against its data sheet (spectra_demo/ subfolders).
    lot = json.loads((out / "lot.json").read_text())
    assert lot["lot"]["n_samples"] == 12 and lot["claims"]["all_hold"] is False
    angles = json.loads((out / "angles.json").read_text())["colour_over_angle"]
    assert angles["n_angles"] == 9 and angles["limit_delta_uv_prime"] == 0.004
    (pair,) = json.loads((out / "compare.json").read_text())["pairs"]
    assert pair["reference_name"] == "QF-A60-2700-R9 data sheet" and pair["test_name"] == "QF-A60-2700-R9 sample 7"
    for figure in ("lot/lot_locus.png", "lot/lot_histograms.png", "angles/colour_over_angle.png", "compare_datasheet.png"):
        assert (out / figure).stat().st_size > 20_000, figure
    assert sorted(p.name for p in (out / "angles").iterdir()) == ["colour_over_angle.png"]  # no lot figures for angles
    # A report each for the lot, the downlight over angle and the comparison, with their own report numbers.
    from ..report.conftest import pdf_pages

    for name, number, heading in (("lot_report.pdf", "QF-DEMO-002", "Claims on the lot"),
                                  ("angles_report.pdf", "QF-DEMO-003", "By angle"),
                                  ("compare_report.pdf", "QF-DEMO-004", "Spectra and ratings")):
        pages = pdf_pages(out / name)
        assert f"report {number}" in pages[0] and any(heading in p for p in pages), name
        assert any("Colour of the lot" in p for p in pages) is (name == "lot_report.pdf")  # angles: no lot pages
    assert (out / "lot.xlsx").stat().st_size > 5_000
    # Rated alone, the top folder is what it was: the subfolders are not part of the first demo rating.
    assert len(records) == 9
    # One lamp's verdicts with the fictional laboratory's measurement uncertainty (ILAC-G8 guarded acceptance).
    assert "How sure is the verdict? QF-A60-3000" in result.stdout and "decision rule: guarded acceptance" in result.stdout
    judged = json.loads((out / "checks_uncertainty.json").read_text())
    assert [lamp["lamp"] for lamp in judged] == ["QF-A60-3000"]
    assert all(c["decision"] in ("pass", "conditional pass", "conditional fail", "fail") for c in judged[0]["checks"])
    # Its report shows the lamp's intervals and decisions, and the model in words.
    from pypdf import PdfReader

    from lampcalc.verdicts.wording import format_value

    text = " ".join(" ".join(page.extract_text().split()) for page in PdfReader(out / "report_uncertainty.pdf").pages)
    assert "Measurement uncertainty" in text and "quillfen_qc_lab_model.toml" in text
    assert f"Decision: {judged[0]['decision']} (guarded acceptance" in text
    cct = next(c for c in judged[0]["checks"] if c["criterion"] == "ansi_cct_K")
    assert "[{}, {}] K".format(*(format_value("cct_K", v) for v in cct["measured_interval95"])) in text
    # What a client reads says things in words: no output key, no command-line option, no e-notation,
    # nothing "from memory" (the project's rules for client-facing text; no published source).
    import re

    from lampcalc.rating.ratings import FIELDS

    keys = {k for k in FIELDS if "_" in k} | {"doubtful_ratings", "partial_ratings", "ler_range_nm", "ra_mean", "ra_min"}
    for name in ("report.pdf", "report_uncertainty.pdf", "lot_report.pdf", "angles_report.pdf", "compare_report.pdf"):
        words = " ".join(" ".join(page.extract_text().split()) for page in PdfReader(out / name).pages)
        assert not re.search(r"\d(\.\d+)?e[-+]?\d", words), name
        assert not re.search(r"(^|\s)--[a-z]", words), name
        assert "from memory" not in words.lower(), name
        assert not {k for k in keys if re.search(rf"(?<![\w.-]){re.escape(k)}(?![\w.-])", words)}, name


# --- lampcalc cct ---
