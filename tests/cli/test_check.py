"""``lampcalc check`` with the colour-consistency and bin options (the demo supplier's lamps)."""

import json

from lampcalc.io.demo_data import demo_claims, demo_files


def _steps(path):
    return {v["lamp"]: c for v in json.loads(path.read_text()) for c in v["checks"] if c["criterion"] == "sdcm_steps"}


def test_steps_options_change_the_metric_and_the_centre(run, tmp_path):
    # The shipped sets: IEC 60081 ellipses (default) and CIE TN 001 circles, both from memory; the verdict
    # names the set, the centre, and that the metric is unconfirmed.
    default, circles = tmp_path / "d.json", tmp_path / "c.json"
    assert run("check", *demo_files(), "--claims", demo_claims(), "--json", default).exit_code == 1
    result = run("check", *demo_files(), "--claims", demo_claims(), "--json", circles, "--steps", "circle",
                 "--centre", "set")
    assert result.exit_code == 1, result.output
    d, c = _steps(default), _steps(circles)
    assert "IEC 60081" in d["QF-A60-3000"]["note"] and "from the ANSI target of 3000 K" in d["QF-A60-3000"]["note"]
    # Circles have no centres of their own: with --centre set the steps cannot be counted, and say so.
    assert c["QF-A60-3000"]["pass"] is None and "has no centre" in c["QF-A60-3000"]["note"]
    assert "supply the published one with --ellipses" in d["QF-A60-3000"]["note"]


def test_bad_set_files_refused_before_anything_is_written(run, write, tmp_path):
    out = tmp_path / "v.json"
    bad = write("e.csv", "# name: x\n# source: t\n# edition: 1\n# confirmed: yes\n# space: xy\n"
                         "name,nominal_cct_K,x,y,g11,g12,g22\nA,3000,0.44,0.40,10,20,10\n")
    result = run("check", *demo_files(), "--claims", demo_claims(), "--ellipses", bad, "--json", out)
    assert result.exit_code == 2 and not out.exists()
    assert result.stderr.strip() == f"lampcalc: {bad}, line 7: the metric is not an ellipse (g11 > 0 and g11*g22 - g12^2 > 0 are needed)"


def test_verdicts_of_a_streamed_run_are_those_of_one_batch(run, tmp_path, monkeypatch):
    # lampcalc's one-batch path (rate_spectra on every lamp, check_claims) is the reference; chunks of 2
    # lamps, two workers when dask is there, must not change a byte of the verdicts
    import importlib.util

    import numpy as np

    from lampcalc.io.spectrum_files import read_spectra
    from lampcalc.rating import streaming
    from lampcalc.rating.rate import rate_spectra
    from lampcalc.standards.ellipse_sets import shipped_ellipse_set
    from lampcalc.verdicts.claims import check_claims, read_claims

    claims = read_claims(demo_claims())
    batches = [read_spectra(f) for f in demo_files()]
    names = [n for b in batches for n in b.names]
    nominal = {c.lamp.casefold(): c.values.get("nominal_cct_K", np.nan) for c in claims.values()}
    whole = rate_spectra(batches, nominal_cct_K=[nominal.get(n.casefold(), np.nan) for n in names])
    expected = check_claims(claims, whole, demo_claims(), ellipse_set=shipped_ellipse_set()).to_json()
    monkeypatch.setattr(streaming, "CHUNK_LAMPS", 2)
    workers = ["--workers", "2"] if importlib.util.find_spec("dask") else []
    out = tmp_path / "v.json"
    result = run("check", *demo_files(), "--claims", demo_claims(), "--json", out, *workers)
    assert result.exit_code == 1, result.output
    assert out.read_text() == expected
