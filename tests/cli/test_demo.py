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


# --- lampcalc cct ---
