"""Claims checked with measurement uncertainty: each check's margin followed through the Monte Carlo draws.

:func:`~lampcalc.verdicts.claims.check_lamp` states each claim as a margin: how far the measured
value is on the right side of the claimed limit. A :class:`ClaimDraws`, handed the draws of each
lamp by :func:`~lampcalc.rating.uncertainty.rate_with_uncertainty`, runs ``check_lamp`` itself on
every draw, with the same options as the ordinary check, and keeps each check's measured value
and margin; the logic of a claim lives in one place. :func:`judge_with_uncertainty` then adds to
each check of the ordinary verdicts, without changing them:

- ``measured_u``, ``measured_interval95``: standard uncertainty and 95 % coverage interval of
  the measured value (JCGM 101:2008 7.6, 7.7.2);
- ``margin_u``, ``margin_interval95``: the same for the margin;
- ``conformance_probability``: the share of draws in which the claim holds (the probability of
  conformity of JCGM 106:2012 for a flat prior, from memory);
- ``decision_rule``, ``guard_band``, ``decision``: the outcome of the chosen ILAC-G8:09/2019 rule
  (:mod:`lampcalc.verdicts.decision_rules`).
"""

import math
from dataclasses import replace

import numpy as np

from ..rating.uncertainty import coverage_interval
from .claims import check_lamp

#: Keys each check gains, in order (documented in docs/uncertainty.md).
UNCERTAINTY_CHECK_KEYS = (
    "measured_u", "measured_interval95", "margin_u", "margin_interval95", "conformance_probability",
    "decision_rule", "guard_band", "decision",
)


def _number(value):
    return math.nan if value is None else float(value)


class ClaimDraws:
    """Each claimed lamp's checks over the Monte Carlo draws: measured value and margin per draw.

    Pass an instance as ``on_draws`` to :func:`~lampcalc.rating.uncertainty.rate_with_uncertainty`.
    A lamp is matched to its claim as :func:`~lampcalc.verdicts.claims.check_claims` matches
    them: by name, without regard to case.

    Parameters
    ----------
    claims : dict
        ``{lamp name: Claim}`` as read by :func:`~lampcalc.verdicts.claims.read_claims`.
    **options
        The options of :func:`~lampcalc.verdicts.claims.check_lamp` (``ellipse_set``,
        ``sdcm_centre``, ``bin_set``), the same as the ordinary check's.
    """

    def __init__(self, claims, **options):
        self.claims = {claim.lamp.casefold(): claim for claim in claims.values() if claim.values}
        self.options = options
        self.parts = {}  # lamp index -> (name, {criterion: [(measured, margin) of each draw]})

    def __call__(self, lamp_index, draws):
        name = draws["name"][0]
        claim = self.claims.get(name.casefold())
        if claim is None:
            return
        found = self.parts.setdefault(lamp_index, (name, {}))[1]
        for row in range(len(draws)):
            for check in check_lamp(claim, draws, row, **self.options):
                found.setdefault(check["criterion"], []).append((_number(check["measured"]), _number(check["margin"])))

    def lamps(self):
        """(lamp index, name) of every claimed lamp collected, in the ratings' order."""
        return [(i, self.parts[i][0]) for i in sorted(self.parts)]

    def draws(self, lamp_index, criterion):
        """(measured, margin), arrays over every draw of a lamp for ``criterion``; None if it has none."""
        found = self.parts[lamp_index][1].get(criterion)
        if not found:
            return None
        values = np.array(found)
        return values[:, 0], values[:, 1]


def _spread(values, nominal):
    """Standard uncertainty and 95 % interval of draws; None where the value or any draw is missing."""
    if nominal is None or not math.isfinite(nominal) or not np.all(np.isfinite(values)):
        return None, None
    low, high = coverage_interval(values)
    return float(np.std(values, ddof=1)), [float(low), float(high)]


def judge_with_uncertainty(verdicts, claim_draws, rule):
    """The verdicts with each check's uncertainty and the decision rule's outcome beside it.

    Parameters
    ----------
    verdicts : Verdicts
        From :func:`~lampcalc.verdicts.claims.check_claims`; left unchanged.
    claim_draws : ClaimDraws
        Filled by the Monte Carlo run that rated the same lamps.
    rule : DecisionRule

    Returns
    -------
    Verdicts
        A copy; each check gains the keys of :data:`UNCERTAINTY_CHECK_KEYS`, each lamp a
        ``decision``: the least favourable of its checks' outcomes (None if any is undecided).
    """
    from .decision_rules import worst

    collected = claim_draws.lamps()
    rated = verdicts.lamps[: len(collected)]  # then the claims without a spectrum, which have no draws
    if [name for _, name in collected] != [lamp["lamp"] for lamp in rated]:
        raise ValueError("the Monte Carlo draws were not collected for the lamps of these verdicts")
    indices = [index for index, _ in collected] + [None] * (len(verdicts.lamps) - len(collected))
    lamps = []
    for index, lamp in zip(indices, verdicts.lamps):
        checks = []
        for check in lamp["checks"]:
            found = None if index is None else claim_draws.draws(index, check["criterion"])
            measured, margin = found if found else (np.array([np.nan]), np.array([np.nan]))
            measured_u, measured_interval = _spread(measured, check["measured"])
            margin_u, margin_interval = _spread(margin, check["margin"])
            probability = None if margin_u is None else float(np.mean(margin >= 0))
            checks.append({
                **check,
                "measured_u": measured_u,
                "measured_interval95": measured_interval,
                "margin_u": margin_u,
                "margin_interval95": margin_interval,
                "conformance_probability": probability,
                "decision_rule": rule.describe(),
                "guard_band": rule.guard_band(margin_u),
                "decision": rule.decide(check["margin"], margin_u),
            })
        lamps.append({**lamp, "checks": checks, "decision": worst(c["decision"] for c in checks)})
    return replace(verdicts, lamps=lamps)
