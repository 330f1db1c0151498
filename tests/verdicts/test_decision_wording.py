"""Claims judged with uncertainty, in words: the digits and units of the decision tables.

Sources: JCGM 100:2008 (GUM) 7.2.6, a standard uncertainty stated to at most two significant
digits (from memory); ILAC-G8:09/2019 4.2.3 for the guard band w = k·u; CIE 13.3-1995 for the
DC ≤ 5.4e-3 validity of Ra. The checks are constructed here, not computed by lampcalc.
"""

import pytest

from lampcalc.verdicts.decision_wording import NOT_DECIDED, word_decision, word_decisions
from lampcalc.verdicts.wording import format_share, format_uncertainty, word_check


def _judged(criterion, claimed, measured, margin, passed, interval, margin_u, k=2.0, share=1.0, decision="pass", note=""):
    return {"criterion": criterion, "claimed": claimed, "measured": measured, "margin": margin, "pass": passed,
            "note": note, "measured_u": None, "measured_interval95": interval, "margin_u": margin_u,
            "margin_interval95": None, "conformance_probability": share, "guard_band": k * margin_u,
            "decision": decision}


def test_an_index_claim_reads_as_in_the_verdict_table_with_two_digits_of_uncertainty():
    check = _judged("ra", 80.0, 83.915, 3.915, True, [83.48, 84.36], 0.2287)
    words, plain = word_decision(check), word_check(check)
    assert (words.claim, words.measured, words.margin) == (plain.claim, plain.measured, plain.margin)
    assert words.interval == "[83.5, 84.4]"  # Ra's one decimal, as the measured value
    assert (words.margin_u, words.guard_band) == ("0.23", "0.46")  # two significant digits; w = 2u
    assert (words.holding, words.decision) == ("100 %", "pass")


def test_a_quadrangle_margin_and_its_uncertainty_are_in_delta_uv():
    # lampcalc states a quadrangle's margin in 1e-3 of (u, v); the words give it in (u, v) itself.
    quad = _judged("ansi_quadrangle", 3000.0, 3259.2, -1.312, False, [3216.4, 3302.9], 0.741, share=0.038,
                   decision="conditional fail")
    cct = _judged("ansi_cct_K", 3045.0, 3259.2, -39.17, False, [3216.4, 3302.9], 22.46, share=0.039,
                  decision="conditional fail")
    words = word_decisions({"lamp": "a", "checks": [quad, cct]})
    assert words[0].margin == "-0.0013 Δuv" and words[0].margin_u == "0.00074 Δuv" and words[0].guard_band == "0.0015 Δuv"
    assert words[0].interval == "[3216, 3303] K"
    assert words[1].claim.startswith("nominal 3000 K: CCT")  # read against the claimed nominal, as the verdicts are
    assert (words[1].margin, words[1].margin_u, words[1].guard_band) == ("-39 K", "22 K", "45 K")
    assert words[1].holding == "3.9 %" and words[1].decision == "conditional fail"


def test_doubtful_intervals_in_parentheses_and_undecided_checks_in_words():
    check = _judged("ra", 80.0, 83.9, 3.9, True, [83.5, 84.4], 0.2)
    # CIE 13.3-1995: beyond DC = 5.4e-3 Ra is outside its validity; in part of the draws that puts the interval in doubt.
    assert word_decision(check, draw_flags=["cri_outside_validity: 40 % of draws"]).interval == "([83.5, 84.4])"
    assert word_decision(check, flags=("cri_outside_validity",)).measured == "(83.9)"
    undecided = _judged("ra", 80.0, 83.9, 3.9, True, None, float("nan"), share=None, decision=None)
    words = word_decision(undecided)
    assert (words.interval, words.margin_u, words.holding, words.decision) == ("–", "–", "–", NOT_DECIDED)


@pytest.mark.parametrize("u, unit, text", [(0.000741, "", "0.00074"), (22.46, "K", "22 K"), (1.96, "", "2.0"),
                                           (0.0, "K", "0 K"), (1234.0, "lm", "1200 lm"),
                                           (0.0999, "", "0.10")])
def test_uncertainties_keep_two_significant_digits(u, unit, text):
    # JCGM 100:2008 7.2.6 (from memory): at most two significant digits; never in e-notation.
    assert format_uncertainty(u, unit) == text


def test_a_share_of_draws_is_never_rounded_to_certainty():
    # A claim that holds in 1999 of 2000 draws does not hold in all of them (common practice, no source).
    assert format_share(1999 / 2000) == "99.9 %" and format_share(1 / 2000) == "0.1 %"
    assert format_share(1.0) == "100 %" and format_share(0.0) == "0 %"
