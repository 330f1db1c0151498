"""Claims checked with measurement uncertainty: each check's margin followed through the Monte Carlo draws.

:func:`~lampcalc.verdicts.claims.check_lamp` states each claim as a margin: how far the measured
value is on the right side of the claimed limit. This module computes the same margins for
every Monte Carlo draw of a lamp (:func:`~lampcalc.rating.uncertainty.rate_with_uncertainty`
hands the draws to a :class:`ClaimDraws`), and :func:`judge_with_uncertainty` then adds to each
check of the ordinary verdicts, without changing them:

- ``measured_u``, ``measured_interval95``: standard uncertainty and 95 % coverage interval of
  the measured value (JCGM 101:2008 7.6, 7.7.2);
- ``margin_u``, ``margin_interval95``: the same for the margin;
- ``conformance_probability``: the share of draws in which the claim holds (the probability of
  conformity of JCGM 106:2012 for a flat prior, from memory);
- ``decision_rule``, ``guard_band``, ``decision``: the outcome of the chosen ILAC-G8:09/2019 rule
  (:mod:`lampcalc.verdicts.decision_rules`).

The margins over the draws are computed in batches here; ``tests/verdicts/test_claim_uncertainty.py``
checks them against ``check_lamp`` draw by draw, so the two cannot drift apart unnoticed.
"""

import math
from dataclasses import replace

import numpy as np

from ..rating.uncertainty import coverage_interval
from ..standards.ansi_bins import DUV_TOLERANCE, category, quadrangle_margin
from ..standards.steps import steps_from_nominal

#: Keys each check gains, in order (documented in docs/claims.md and docs/uncertainty.md).
UNCERTAINTY_CHECK_KEYS = (
    "measured_u", "measured_interval95", "margin_u", "margin_interval95", "conformance_probability",
    "decision_rule", "guard_band", "decision",
)
# Claims that are a limit on one rating: claim column -> (criterion, column and index, sense).
_ONE_SIDED = {
    "min_ra": ("ra", ("ra", None), 1.0),
    "min_r9": ("r9", ("ri", 8), 1.0),
    "min_rf": ("rf", ("rf", None), 1.0),
    "min_rg": ("rg_min", ("rg", None), 1.0),
    "min_ler_lm_per_W": ("ler_lm_per_W", ("ler_lm_per_W", None), 1.0),
    "max_rg": ("rg_max", ("rg", None), -1.0),
}


def criterion_draws(claim, draws, sdcm_method="ellipse", sdcm_centre="ansi"):
    """Measured value and margin of each of a lamp's checks, for every draw.

    Parameters
    ----------
    claim : Claim
    draws : Ratings
        Ratings of draws of the claimed lamp (one row per draw).
    sdcm_method, sdcm_centre
        As for :func:`~lampcalc.verdicts.claims.check_lamp`.

    Returns
    -------
    dict
        criterion -> (measured, margin), arrays of shape (n_draws,), as ``check_lamp`` states
        them (margins of the ANSI quadrangle in 1e-3 of CIE 1960 u, v).
    """
    v = claim.values
    n = len(draws)
    xy = np.stack([draws["x"], draws["y"]], axis=-1)
    out = {}
    if "nominal_cct_K" in v:
        cat = category(v["nominal_cct_K"])
        cct, duv = draws["cct_K"], draws["duv"]
        out["ansi_quadrangle"] = (cct, quadrangle_margin(xy, cat.nominal_cct_K) * 1e3)
        out["ansi_cct_K"] = (cct, cat.cct_tolerance_K - np.abs(cct - cat.target_cct_K))
        out["ansi_duv"] = (duv, DUV_TOLERANCE - np.abs(duv - cat.target_duv))
        if "max_sdcm_steps" in v:
            steps, _ = steps_from_nominal(xy, np.full(n, v["nominal_cct_K"]), sdcm_method, sdcm_centre)
            out["sdcm_steps"] = (steps, v["max_sdcm_steps"] - steps)
    for key, (criterion, (column, index), sense) in _ONE_SIDED.items():
        if key in v:
            measured = draws[column] if index is None else draws[column][:, index]
            out[criterion] = (measured, sense * (measured - v[key]))
    if "min_efficacy_lm_per_W" in v:
        watts = v.get("electrical_W", draws["electrical_W"][0])
        efficacy = draws["luminous_flux_lm"] / watts if watts else np.full(n, np.nan)
        out["efficacy_lm_per_W"] = (efficacy, efficacy - v["min_efficacy_lm_per_W"])
    return out


class ClaimDraws:
    """Collects each claimed lamp's measured values and margins over the Monte Carlo draws.

    Pass an instance as ``on_draws`` to :func:`~lampcalc.rating.uncertainty.rate_with_uncertainty`.

    Parameters
    ----------
    claims : dict
        ``{lamp name: Claim}`` as read by :func:`~lampcalc.verdicts.claims.read_claims`.
    sdcm_method, sdcm_centre
        As for :func:`~lampcalc.verdicts.claims.check_lamp`.
    """

    def __init__(self, claims, sdcm_method="ellipse", sdcm_centre="ansi"):
        self.claims = claims
        self.options = {"sdcm_method": sdcm_method, "sdcm_centre": sdcm_centre}
        self.parts = {}  # lamp index -> (name, [criterion draws of each chunk])

    def __call__(self, lamp_index, draws):
        name = draws["name"][0]
        claim = self.claims.get(name)
        if claim is not None:
            self.parts.setdefault(lamp_index, (name, []))[1].append(criterion_draws(claim, draws, **self.options))

    def lamps(self):
        """(lamp index, name) of every claimed lamp collected, in the ratings' order."""
        return [(i, self.parts[i][0]) for i in sorted(self.parts)]

    def draws(self, lamp_index, criterion):
        """(measured, margin) over every draw of a lamp for ``criterion``; None if not collected."""
        parts = self.parts[lamp_index][1]
        if criterion not in parts[0]:
            return None
        return tuple(np.concatenate([p[criterion][j] for p in parts]) for j in (0, 1))


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
    if [name for _, name in collected] != [lamp["lamp"] for lamp in verdicts.lamps]:
        raise ValueError("the Monte Carlo draws were not collected for the lamps of these verdicts")
    lamps = []
    for (index, _), lamp in zip(collected, verdicts.lamps):
        checks = []
        for check in lamp["checks"]:
            found = claim_draws.draws(index, check["criterion"])
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
