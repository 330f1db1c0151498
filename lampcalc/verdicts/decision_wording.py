"""Claims judged with measurement uncertainty, in words: the terminal's and the report's decision tables.

A check of :func:`~lampcalc.verdicts.claim_uncertainty.judge_with_uncertainty` carries, beside
its verdict, the 95 % interval of the measured value, the margin's standard uncertainty, the
guard band, the share of the Monte Carlo draws in which the claim holds and the ILAC-G8
decision. :func:`word_decisions` writes them with the digits and units of
:mod:`lampcalc.verdicts.wording`, so that the claim, the measured value and the margin read
exactly as in the verdict table beside them.
"""

from dataclasses import dataclass

from ..rating.flags import doubtful_interval_keys
from .wording import DIGITS, MISSING, format_share, format_uncertainty, format_value, with_nominal, worded_check

#: How an undecided check reads.
NOT_DECIDED = "not decided"


@dataclass(frozen=True)
class DecisionWording:
    """One check with its measurement uncertainty in words: the columns of the decision tables."""

    claim: str
    measured: str
    interval: str
    margin: str
    margin_u: str
    guard_band: str
    holding: str
    decision: str
    outcome: object  # the decision rule's outcome, None when not decided


def word_decision(check, *, nominal=None, flags=(), draw_flags=()):
    """A check judged with uncertainty (:func:`~lampcalc.verdicts.claim_uncertainty.judge_with_uncertainty`) in words.

    The claim, measured value and margin read as in :func:`word_check`; the 95 % interval has the
    measured value's digits, u(margin) and the guard band two significant digits in the margin's
    unit. An interval that a flag, or a validity flag raised in part of the draws (``draw_flags``,
    a lamp's ``uncertainty_flags_in_draws``), puts in doubt is in parentheses.
    """
    words, key, decimals, (_, scale, unit) = worded_check(check, nominal, flags)
    interval = check.get("measured_interval95")
    interval_text = MISSING
    if interval is not None and all(v is not None for v in interval):
        low, high = (format_value(key, v, decimals=decimals) for v in interval)
        unit_text = DIGITS.get(key, (None, ""))[1]
        interval_text = f"[{low}, {high}]" + ("" if not unit_text else unit_text if unit_text == "%" else f" {unit_text}")
        if key in doubtful_interval_keys(flags, draw_flags):
            interval_text = f"({interval_text})"
    outcome = check.get("decision")
    return DecisionWording(
        claim=words.claim, measured=words.measured, interval=interval_text, margin=words.margin,
        margin_u=format_uncertainty(check.get("margin_u"), unit, scale),
        guard_band=format_uncertainty(check.get("guard_band"), unit, scale),
        holding=format_share(check.get("conformance_probability")), decision=outcome or NOT_DECIDED, outcome=outcome,
    )


def word_decisions(lamp_verdict, flags=(), draw_flags=()):
    """Every check of one judged lamp in words (:class:`DecisionWording`), in order."""
    return [word_decision(check, nominal=nominal, flags=flags, draw_flags=draw_flags)
            for check, nominal in with_nominal(lamp_verdict)]
