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
    # One lamp's verdicts with the fictional laboratory's measurement uncertainty (ILAC-G8 guarded acceptance).
    assert "How sure is the verdict? QF-A60-3000" in result.stdout and "decision rule: guarded acceptance" in result.stdout
    judged = json.loads((out / "checks_uncertainty.json").read_text())
    assert [lamp["lamp"] for lamp in judged] == ["QF-A60-3000"]
    assert all(c["decision"] in ("pass", "conditional pass", "conditional fail", "fail") for c in judged[0]["checks"])


# --- lampcalc cct ---
