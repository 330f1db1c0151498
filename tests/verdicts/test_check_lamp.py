"""Per-criterion checks of a lamp's claims: user bins, flexible CCTs, unconfirmed values, impossible efficacy.

Lamps are Planckian radiators (Planck's law, c2 of CIE 015) placed at chosen chromaticities; the
ANSI C78.377 values are those of shared/REFERENCE_VALUES.md.
"""

import numpy as np
import pytest

from lampcalc.physics.blackbody import spectral_radiance
from lampcalc.rating.rate import rate_spectra
from lampcalc.spectra.batch import SpectralBatch
from lampcalc.spectra.resampling import GRID_NM
from lampcalc.standards.bin_sets import read_bin_set
from lampcalc.standards.ellipse_sets import shipped_ellipse_set
from lampcalc.verdicts.claims import Claim, check_lamp

C2 = 1.4388e-2


def _rated(temps, **kw):
    values = spectral_radiance(np.asarray(temps, dtype=float), GRID_NM, c2_mK=C2)
    return rate_spectra(SpectralBatch(GRID_NM, values, [f"T{t:g}" for t in temps], **kw))


def _checks(ratings, i, values, **options):
    return {c["criterion"]: c for c in check_lamp(Claim("lamp", 2, values), ratings, i, **options)}


def test_flexible_nominal_cct_not_evaluated_but_duv_and_steps_are():
    # ANSI C78.377: 3200 K is a flexible CCT; its tolerance is not confirmed in lampcalc (issue 10), so
    # the quadrangle and CCT checks are not evaluated; the Duv target (centre-line formula, ±0.006) and the
    # steps are. A 3200 K Planckian radiator has Duv 0, the centre line +0.0002 at 3200 K.
    r = _rated([3200.0])
    checks = _checks(r, 0, {"nominal_cct_K": 3200.0, "max_sdcm_steps": 7.0})
    for criterion in ("ansi_quadrangle", "ansi_cct_K"):
        assert checks[criterion]["pass"] is None
        assert "flexible CCT: tolerance not confirmed from a published source; supply a bin set with --bins" in checks[criterion]["note"]
    duv = checks["ansi_duv"]
    assert duv["claimed"] == pytest.approx(57700 / 3200**2 - 44.6 / 3200 + 0.00854)
    assert duv["pass"] is True and "centre-line formula" in duv["note"]
    assert checks["sdcm_steps"]["pass"] is not None and checks["sdcm_steps"]["measured"] > 0


def test_user_bins_decide_the_nominal_claims_they_hold(write):
    # A laboratory's own bin for 3200 K (made-up corners around the 3200 K locus point) decides the
    # claim: the radiator inside passes, one at 3400 K does not.
    from lampcalc.colorimetry.locus import cct_duv_to_xy

    corners = cct_duv_to_xy([[3100.0, 0.006], [3300.0, 0.006], [3300.0, -0.006], [3100.0, -0.006]])
    text = "# name: lab 3200 K\n# source: lab\n# edition: 1\n# confirmed: yes\n# space: xy\nbin,nominal_cct_K," + ",".join(
        f"x{k},y{k}" for k in range(1, 5)) + "\n32A,3200," + ",".join(f"{v!r}" for v in corners.ravel().tolist()) + "\n"
    bins = read_bin_set(write("lab.csv", text))
    r = _rated([3200.0, 3400.0])
    inside = _checks(r, 0, {"nominal_cct_K": 3200.0}, bin_set=bins)
    outside = _checks(r, 1, {"nominal_cct_K": 3200.0}, bin_set=bins)
    assert "ansi_quadrangle" not in inside
    assert inside["bin"]["pass"] is True and "lab 3200 K: bin 32A" in inside["bin"]["note"]
    assert outside["bin"]["pass"] is False and outside["bin"]["margin"] < 0
    # A Table 1 nominal not in the lab's set still uses the published ANSI quadrangle.
    assert "ansi_quadrangle" in _checks(r, 0, {"nominal_cct_K": 3000.0}, bin_set=bins)


def test_unconfirmed_values_are_named_in_the_verdict():
    # 2200 K corners are built by the standard's construction (not read from the published table) and the
    # shipped IEC 60081 metric is from memory: each verdict says so and how to supply published values.
    r = _rated([2238.0])
    checks = _checks(r, 0, {"nominal_cct_K": 2200.0, "max_sdcm_steps": 3.0})
    assert checks["ansi_quadrangle"]["pass"] is True
    assert "corners not confirmed from a published table: supply the published ones with --bins" in checks["ansi_quadrangle"]["note"]
    steps = checks["sdcm_steps"]["note"]
    assert "metric not confirmed from a published source: supply the published one with --ellipses" in steps
    assert "nearest centre" in steps  # 2200 K lies outside the IEC centres (2700–6500 K)
    assert "from memory" not in steps + checks["ansi_quadrangle"]["note"]


def test_set_centre_missing_is_not_evaluated_not_a_crash():
    # IEC 60081 has colour centres at 2700, 3000, 3500, 4000, 5000 and 6500 K only.
    r = _rated([4500.0])
    check = _checks(r, 0, {"nominal_cct_K": 4500.0, "max_sdcm_steps": 5.0}, sdcm_centre="set")["sdcm_steps"]
    assert check["pass"] is None and "has no centre for 4500 K" in check["note"]
    circles = _checks(r, 0, {"nominal_cct_K": 4500.0, "max_sdcm_steps": 5.0}, ellipse_set=shipped_ellipse_set("circle"))
    assert "CIE TN 001" in circles["sdcm_steps"]["note"] and circles["sdcm_steps"]["pass"] is not None


def test_impossible_efficacy_claim_not_evaluated():
    # A spectrum in W/nm with more radiant power than the claimed electrical power (energy conservation):
    # the efficacy claim is not evaluated, with a note, and never "holds" (issue 10: 5342 lm/W held).
    r = _rated([3000.0], quantity="flux")
    radiant = r["radiant_flux_W"][0]
    high = _checks(r, 0, {"min_efficacy_lm_per_W": 80.0, "electrical_W": radiant / 2})["efficacy_lm_per_W"]
    assert high["pass"] is None and high["measured"] is None and "exceeds the electrical power" in high["note"]
    fine = _checks(r, 0, {"min_efficacy_lm_per_W": 1.0, "electrical_W": radiant * 10})["efficacy_lm_per_W"]
    assert fine["pass"] is True and fine["measured"] == pytest.approx(r["luminous_flux_lm"][0] / (radiant * 10))
