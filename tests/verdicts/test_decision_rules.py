"""ILAC-G8:09/2019 decision rules on constructed margins: at, inside and outside the guard band.

Source: ILAC-G8:09/2019, Guidelines on Decision Rules and Statements of Conformity, clause 4.2:
4.2.1 simple acceptance (w = 0: pass at or within the limit, fail beyond it); 4.2.3 non-binary
statement with a guard band: pass beyond TL − w, conditional pass in [TL − w, TL], conditional
fail in [TL, TL + w], fail beyond TL + w. A margin is TL minus the measured value for an upper
limit, so those intervals read m > w, 0 ≤ m ≤ w, −w ≤ m < 0, m < −w.
"""

import math

import pytest

from lampcalc.verdicts.decision_rules import OUTCOMES, SIMPLE_OUTCOMES, DecisionRule, worst

GUARDED = DecisionRule("guarded", 2.0)  # w = 2u, ILAC-G8's w = U for k = 2


@pytest.mark.parametrize(
    "margin, expected",
    [
        (1.5, "pass"),  # outside the guard band, on the right side of the limit
        (1.0 + 1e-12, "pass"),
        (1.0, "conditional pass"),  # at the acceptance limit TL − w: in [TL − w, TL]
        (0.5, "conditional pass"),  # inside the guard band
        (0.0, "conditional pass"),  # at the limit itself: the measurement meets it
        (-1e-12, "conditional fail"),
        (-0.5, "conditional fail"),  # inside the band beyond the limit
        (-1.0, "conditional fail"),  # at TL + w: in [TL, TL + w]
        (-1.0 - 1e-12, "fail"),
        (-1.5, "fail"),  # outside the band beyond the limit
    ],
)
def test_guarded_acceptance_around_the_guard_band(margin, expected):
    assert GUARDED.guard_band(0.5) == 1.0
    assert GUARDED.decide(margin, 0.5) == expected


@pytest.mark.parametrize("margin, expected", [(0.3, "pass"), (0.0, "pass"), (-1e-12, "fail"), (-3.0, "fail")])
def test_simple_acceptance_is_the_limit_alone(margin, expected):
    rule = DecisionRule("simple")
    assert rule.guard_band(0.5) == 0.0
    assert rule.decide(margin, 0.5) == expected
    assert rule.decide(margin, None) == expected  # simple acceptance needs no uncertainty


def test_guard_band_scales_with_k():
    # A wider guard band (k = 3) turns the same margin from a pass into a conditional pass.
    assert DecisionRule("guarded", 2.0).decide(1.2, 0.5) == "pass"
    assert DecisionRule("guarded", 3.0).decide(1.2, 0.5) == "conditional pass"
    assert DecisionRule("guarded", 0.0).decide(1e-9, 0.5) == "pass"


def test_undecided_without_a_margin_or_its_uncertainty():
    assert GUARDED.decide(None, 0.5) is None
    assert GUARDED.decide(math.nan, 0.5) is None
    assert GUARDED.decide(2.0, None) is None and GUARDED.decide(2.0, math.nan) is None
    assert math.isnan(GUARDED.guard_band(None))


def test_rules_stated_in_words():
    assert "4.2.1" in DecisionRule("simple").describe() and "w = 0" in DecisionRule("simple").describe()
    assert DecisionRule("guarded", 2.0).describe() == "guarded acceptance, w = 2·u (ILAC-G8:09/2019 4.2.3)"
    assert set(OUTCOMES) == {"pass", "conditional pass", "conditional fail", "fail"}
    for outcome in OUTCOMES:
        assert GUARDED.explain(outcome) == OUTCOMES[outcome]
    assert "50 %" in DecisionRule("simple").explain("pass") and set(SIMPLE_OUTCOMES) == {"pass", "fail"}


def test_bad_rules_refused():
    with pytest.raises(ValueError, match="unknown decision rule 'strict'; choose one of simple, guarded"):
        DecisionRule("strict")
    with pytest.raises(ValueError, match="non-negative"):
        DecisionRule("guarded", -1.0)


def test_a_lamp_is_as_good_as_its_worst_check():
    assert worst(["pass", "pass"]) == "pass"
    assert worst(["pass", "conditional pass", "fail"]) == "fail"
    assert worst(["pass", None]) is None and worst([]) is None
