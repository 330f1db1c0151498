"""Claims with measurement uncertainty: each check followed through the draws, and the decision rules on real draws.

The margins over the draws come from lampcalc's own check_lamp, run on every draw with the ordinary
check's options; here they are compared with the ratings' own uncertainties of the same draws (an
internal consistency check). The decisions follow ILAC-G8:09/2019 4.2.3 (see test_decision_rules.py);
the share of draws beyond a margin of half a standard uncertainty is compared with the normal
distribution, Φ(0.5) = 0.6915 (scipy.stats.norm, reference library).
"""

import json

import pytest

from lampcalc.io.demo_data import demo_claims, demo_files
from lampcalc.io.spectrum_files import read_spectra
from lampcalc.rating.measurement_model import MeasurementModel
from lampcalc.rating.uncertainty import rate_with_uncertainty
from lampcalc.standards.ellipse_sets import shipped_ellipse_set
from lampcalc.verdicts.claim_uncertainty import UNCERTAINTY_CHECK_KEYS, ClaimDraws, judge_with_uncertainty
from lampcalc.verdicts.claims import Claim, check_claims, read_claims
from lampcalc.verdicts.decision_rules import DecisionRule

MODEL = MeasurementModel(noise_percent=1.0, scale_percent=2.0, wavelength_shift_nm=0.5, stray_light_percent=0.1,
                         bandwidth_nm=5.0, draws=100, seed=4)


def _demo_batches(*names):
    batches = [read_spectra(f) for f in demo_files()]
    return [b[[i for i, n in enumerate(b.names) if n in names]] for b in batches if set(b.names) & set(names)]


def test_checks_over_the_draws_use_the_ordinary_checks_options():
    # The demo downlight claims nominal CCT, steps, Ra, R9, Rf, LER and lamp efficacy. With the CIE TN 001
    # circles as the step metric, the steps margin over the draws is the ratings' steps over the same draws.
    claims = read_claims(demo_claims())
    lamp = "QF-DL-4000"
    options = {"ellipse_set": shipped_ellipse_set("circle"), "sdcm_centre": "ansi", "bin_set": None}
    collected = ClaimDraws({lamp.lower(): Claim(lamp.lower(), 2, claims[lamp].values)}, **options)  # names match without case
    ratings = rate_with_uncertainty(_demo_batches(lamp), MODEL, nominal_cct_K=[claims[lamp].values["nominal_cct_K"]],
                                    ellipse_set=options["ellipse_set"], on_draws=collected)
    verdicts = judge_with_uncertainty(check_claims(claims, ratings, **options), collected, DecisionRule("guarded"))
    checks = {c["criterion"]: c for c in verdicts.lamps[0]["checks"]}
    assert set(checks) == {"ansi_quadrangle", "ansi_cct_K", "ansi_duv", "sdcm_steps", "ra", "r9", "rf", "ler_lm_per_W",
                           "efficacy_lm_per_W"}
    assert checks["sdcm_steps"]["margin_u"] == pytest.approx(ratings["sdcm_steps_u"][0], rel=1e-9)
    assert checks["r9"]["margin_u"] == pytest.approx(ratings["ri_u"][0][8], rel=1e-9)
    assert checks["ansi_quadrangle"]["measured_u"] == pytest.approx(ratings["cct_K_u"][0], rel=1e-9)
    # Lamp efficacy = flux / 10 W: its uncertainty is the flux's over 10 W.
    assert checks["efficacy_lm_per_W"]["measured_u"] == pytest.approx(ratings["luminous_flux_lm_u"][0] / 10.0, rel=1e-9)


@pytest.fixture(scope="module")
def four_claims():
    # One lamp rated four times under four names; each claims Ra at a different distance from its
    # measured value, in units of the Ra's standard uncertainty: outside, inside and beyond the guard band.
    model = MeasurementModel(**{**MODEL.as_dict(), "draws": 1000})
    lamp = _demo_batches("QF-T5-840")[0]
    first = rate_with_uncertainty(lamp, model)
    ra, u = first["ra"][0], first["ra_u"][0]
    offsets = {"far_in": 3.0, "in_band": 0.5, "out_band": -0.5, "far_out": -3.0}
    batch = lamp[[0, 0, 0, 0]]
    batch = type(batch)(batch.wavelength_nm, batch.values, tuple(offsets), quantity=batch.quantity)
    claims = {name: Claim(name, k + 2, {"min_ra": ra - c * u, "min_efficacy_lm_per_W": 50.0})
              for k, (name, c) in enumerate(offsets.items())}
    collected = ClaimDraws(claims)
    ratings = rate_with_uncertainty(batch, model, on_draws=collected)
    verdicts = check_claims(claims, ratings)
    return ratings, verdicts, judge_with_uncertainty(verdicts, collected, DecisionRule("guarded", 2.0)), u


def _ra(verdicts, lamp):
    entry = next(v for v in verdicts.lamps if v["lamp"] == lamp)
    return entry, next(c for c in entry["checks"] if c["criterion"] == "ra")


def test_decisions_at_inside_and_outside_the_guard_band(four_claims):
    ratings, plain, judged, u = four_claims
    expected = {"far_in": "pass", "in_band": "conditional pass", "out_band": "conditional fail", "far_out": "fail"}
    for lamp, outcome in expected.items():
        entry, check = _ra(judged, lamp)
        assert check["decision"] == outcome, lamp
        i = list(ratings["name"]).index(lamp)
        assert check["margin_u"] == pytest.approx(ratings["ra_u"][i], rel=1e-9)
        assert check["measured_interval95"] == pytest.approx(list(ratings["ra_interval95"][i]), rel=1e-12)
        assert check["guard_band"] == pytest.approx(2.0 * check["margin_u"])
        # Today's verdict is kept beside the decision, unchanged.
        assert check["pass"] is _ra(plain, lamp)[1]["pass"] is bool(check["margin"] >= 0)


def test_share_of_draws_that_hold(four_claims):
    from scipy.stats import norm

    _, _, judged, _ = four_claims
    shares = {lamp: _ra(judged, lamp)[1]["conformance_probability"] for lamp in ("far_in", "in_band", "out_band", "far_out")}
    assert shares["far_in"] > 0.99 and shares["far_out"] < 0.01
    assert shares["in_band"] == pytest.approx(norm.cdf(0.5), abs=0.08)
    assert shares["out_band"] == pytest.approx(norm.cdf(-0.5), abs=0.08)


def test_a_check_without_a_value_is_not_decided(four_claims):
    # The demo T5 spectrum is relative: no luminous flux, so no lamp efficacy and no decision (and so
    # none for the lamp), while its Ra checks are decided.
    _, _, judged, _ = four_claims
    entry = next(v for v in judged.lamps if v["lamp"] == "far_in")
    efficacy = next(c for c in entry["checks"] if c["criterion"] == "efficacy_lm_per_W")
    assert efficacy["decision"] is None and efficacy["margin_u"] is None and efficacy["conformance_probability"] is None
    assert entry["decision"] is None


def test_files_carry_the_new_keys(four_claims):
    _, plain, judged, _ = four_claims
    records = json.loads(judged.to_json())
    check = records[0]["checks"][0]
    assert list(check)[-len(UNCERTAINTY_CHECK_KEYS):] == list(UNCERTAINTY_CHECK_KEYS)
    assert "decision" in records[0] and "decision" not in json.loads(plain.to_json())[0]
    header = judged.to_csv().splitlines()[0].split(",")
    spread = [c for k in UNCERTAINTY_CHECK_KEYS for c in ((f"{k}_low", f"{k}_high") if k.endswith("_interval95") else (k,))]
    assert header[:7] == plain.to_csv().splitlines()[0].split(",") and header[7:] == spread
    row = next(r for r in judged.to_csv().splitlines()[1:] if r.startswith("in_band,ra,"))
    assert row.endswith(",conditional pass")
