"""Lot claims and colour-shift limits in the shared words: meets, does not meet, not evaluated.

Sources: the three verdict words and the qualified mark of lampcalc.verdicts.wording (the project's
own vocabulary, shared by the terminal and the report); counts and shares made directly from the
invented samples; CIE 015:2018 digits as the wording module prints them (Ra to 0.1, Δu′v′ to 1e-5).
"""

import numpy as np
import pytest

from lampcalc.verdicts.lot import lot_statistics
from lampcalc.verdicts.lot_claims import check_lot_claims, read_lot_claims
from lampcalc.verdicts.lot_wording import limit_line, limit_wording, lot_key_digits, word_lot_check, word_lot_checks
from lampcalc.verdicts.wording import QUALIFIED, VERDICT_WORDS

from .test_lot_claims import GOOD  # a supplier's claims: 95 % within 3 steps, ra_mean ≥ 90, ra_min ≥ 80, …

ANSI_3000 = (0.4339, 0.4033)  # REFERENCE_VALUES.md, ANSI C78.377-2017 3000 K centre (4 decimals)
CLAIMS = GOOD + """
[[claim]]
quantity = "luminous_flux_lm_mean"
at_least = 500
"""


@pytest.fixture
def verdicts(invent, around, write):
    ra = np.linspace(82.0, 86.0, 12)
    lot = lot_statistics(invent(around(ANSI_3000), ra=ra), nominal_cct_K=3000)
    return lot, check_lot_claims(read_lot_claims(write("c.toml", CLAIMS)), lot), ra


def test_every_claim_in_the_three_words(verdicts):
    lot, result, ra = verdicts
    words, notes = word_lot_checks(result)
    assert [w.verdict for w in words] == [VERDICT_WORDS[c["pass"]] for c in result.checks]
    share, mean, low, _, _, flux = words
    steps = np.asarray(lot["samples"]["sdcm_steps"])
    assert share.measured == f"{100 * np.mean(steps <= 3):.1f} %"  # counted directly
    assert share.qualified and share.verdict_text.endswith(QUALIFIED)  # the shipped IEC 60081 metric is unconfirmed
    assert notes == ["the IEC 60081 ellipse metric is not confirmed against the published table: confirm it before a dispute"]
    assert "confirm it" not in share.why  # said once, under the table
    assert mean.claim == "mean Ra ≥ 90" and mean.measured == f"{ra.mean():.1f}" and mean.verdict == "does not meet"
    assert mean.margin == f"{ra.mean() - 90:+.1f}" and mean.why == "mean of the samples"
    assert low.verdict == "meets" and low.measured == f"{ra.min():.1f}" and low.why == "lowest sample"
    # relative spectra have no luminous flux: the claim is not evaluated, and says why
    assert flux.verdict == "not evaluated" and flux.measured == "–" and "the lot gives no value" in flux.why
    assert not flux.qualified


def test_digits_of_lot_numbers():
    assert lot_key_digits("cct_K_sd") == (0, "K", "cct_K")
    assert lot_key_digits("r9_min") == (1, "", "ri")  # R9 is the ninth of the Ri
    assert lot_key_digits("ra_n")[:2] == (0, "") and lot_key_digits("n_samples")[:2] == (0, "")
    assert lot_key_digits("max_pairwise_delta_uv_prime")[:2] == (5, "")
    assert lot_key_digits("ellipse_max_steps_from_centre")[:2] == (1, "steps")
    assert lot_key_digits("mean_point_duv")[2] == "duv" and lot_key_digits("mean_v_prime")[2] == "v_prime"


def test_a_share_on_its_limit_meets_it():
    check = {"kind": "inside_quadrangle", "claim": "at least 100 % inside the 3000 K quadrangle", "claimed": 100.0,
             "measured": 100.0, "margin": 0.0, "pass": True, "note": "12 of 12 samples inside the 3000 K quadrangle"}
    wording, qualification = word_lot_check(check)
    assert (wording.measured, wording.margin, wording.verdict, qualification) == ("100.0 %", "+0.0 %", "meets", "")


@pytest.mark.parametrize("value, limit, passed, verdict", [(0.00389, 0.003, False, "does not meet"),
                                                          (0.00289, 0.003, True, "meets")])
def test_a_colour_shift_against_the_users_limit(value, limit, passed, verdict):
    w = limit_wording(value, limit, passed, what="Δu′v′", where="at 80°", basis="CIE 1976 u′v′")
    assert (w.claim, w.measured, w.verdict) == ("Δu′v′ ≤ 0.003 (your limit)", f"{value:.5f}", verdict)
    assert w.margin == f"{limit - value:+.5f}" and w.why == "at 80°; CIE 1976 u′v′"
    assert limit_line(value, limit, passed) == f"{value:.5f}: {verdict} your limit 0.003 (margin {limit - value:+.5f})"


def test_no_limit_is_not_evaluated():
    w = limit_wording(0.009, None, None, what="largest Δu′v′")
    assert w.verdict == "not evaluated" and w.margin == "–" and "no limit of its own" in w.why
    assert limit_line(0.009, float("nan"), None) == (
        "0.00900; no limit given, so not evaluated (lampcalc applies no limit of its own)")
    # A value just past the limit gets the digits that show its side (0.0030004 is not "0.00300 meets").
    assert limit_wording(0.0030004, 0.003, False, what="Δu′v′").measured == "0.0030004"
