"""How sure a comparison is: the measurement uncertainty of Δu′v′ and of every rating's difference.

Each side of a comparison (:func:`~lampcalc.verdicts.comparison.compare_ratings`) is rated with
the measurement model by Monte Carlo (:func:`~lampcalc.rating.uncertainty.rate_with_uncertainty`),
the reference and the test in **independent** draws (separate random streams, even for lamps
of the same name): they were measured apart, a data sheet and a sample, a lamp new and aged.
Draw m of a pair is the difference of the test's draw m and the reference's draw m, so every
difference gets its standard uncertainty (the standard deviation of its draws, JCGM 101:2008
7.6) and its probabilistically symmetric 95 % interval (7.7.2).

Effects that the two measurements share (one calibration, one wavelength scale) would cancel in
the differences; independent draws count them twice, so the uncertainty is then overstated.

Δu′v′ is a distance, never negative: where the two chromaticities are close beside their
uncertainty, its draws lie above the measured value (two identical spectra measure 0 and draw
about √(π/2)·√2·u(u′) on average, for equal u(u′) and u(v′)), and its interval need not hold
the measured value. With a limit, the margin is limit − Δu′v′ and the decision follows an ILAC-G8
rule (:mod:`lampcalc.verdicts.decision_rules`), as for a lamp's claims.
"""

import numpy as np

from ..rating.uncertainty import coverage_interval
from .comparison import COMPARED, COMPARED_LISTS, match_lamps
from .decision_rules import DecisionRule

#: Keys kept from every draw of both sides (R9 is read from ``ri``).
KEPT = ("u_prime", "v_prime", *(k for k in COMPARED if k != "r9"), *COMPARED_LISTS)
#: Differences that get an uncertainty, in output order.
DIFFERENCES = ("delta_uv_prime", "delta_u_prime", "delta_v_prime", *(f"delta_{k}" for k in COMPARED))
#: Keys a pair gains with a limit on Δu′v′ (besides ``margin_delta_uv_prime_u`` and its interval).
DECISION_KEYS = ("conformance_probability", "decision_rule", "guard_band", "decision")


def _draws(ratings, key):
    """Every draw of ``key`` (or R9), shape (n_lamps, draws)."""
    kept = ratings.extras["uncertainty"].kept
    if key == "r9":
        return kept["ri"][..., 8]
    return kept[key]


def _summary(draws):
    """Standard uncertainty and 95 % interval of draws (pairs, M); NaN where a draw is missing."""
    complete = np.all(np.isfinite(draws), axis=1)
    with np.errstate(invalid="ignore"):
        u = np.where(complete, draws.std(axis=1, ddof=1), np.nan)
    low, high = coverage_interval(draws.T)
    return u, np.where(complete[:, None], np.stack([low, high], axis=-1), np.nan)


def comparison_uncertainty(comparison, reference, test, rule=None):
    """The comparison's pairs with the uncertainty of every difference, and a decision against the limit.

    Parameters
    ----------
    comparison : dict
        From :func:`~lampcalc.verdicts.comparison.compare_ratings` of the same ``reference`` and ``test``.
    reference, test : Ratings
        From :func:`~lampcalc.rating.uncertainty.rate_with_uncertainty` with the same number of draws,
        ``keep=KEPT`` and different ``stream`` values.
    rule : DecisionRule, optional
        With a limit in the comparison: the ILAC-G8 rule of the decision (simple acceptance by default).

    Returns
    -------
    dict
        A copy of ``comparison`` whose ``pairs`` gain, after each key of :data:`DIFFERENCES`,
        ``<key>_u`` and ``<key>_interval95``; ``delta_ri_u``, ``delta_rf_hue_bins_u`` (lists, no
        intervals); and with a limit ``margin_delta_uv_prime_u``, ``margin_delta_uv_prime_interval95``
        and :data:`DECISION_KEYS`.
    """
    pairs, _, _ = match_lamps(list(reference["name"]), list(test["name"]))
    i, j = (np.array(side) for side in zip(*pairs))
    d_u, d_v = (_draws(test, k)[j] - _draws(reference, k)[i] for k in ("u_prime", "v_prime"))
    draws = {"delta_uv_prime": np.hypot(d_u, d_v), "delta_u_prime": d_u, "delta_v_prime": d_v}
    draws |= {f"delta_{k}": _draws(test, k)[j] - _draws(reference, k)[i] for k in COMPARED}
    old = comparison["pairs"]
    cols = {}
    for key, values in old.items():
        cols[key] = values
        if key in draws:
            cols[f"{key}_u"], cols[f"{key}_interval95"] = _summary(draws[key])
        elif key.removeprefix("delta_") in COMPARED_LISTS:
            lists = _draws(test, key[6:])[j] - _draws(reference, key[6:])[i]  # (pairs, M, items)
            with np.errstate(invalid="ignore"):
                cols[f"{key}_u"] = lists.std(axis=1, ddof=1)
    limit = old["limit_delta_uv_prime"]
    if len(limit) and np.isfinite(limit[0]):
        rule = rule or DecisionRule()
        margin = limit[:, None] - draws["delta_uv_prime"]
        margin_u, margin_interval = _summary(margin)
        cols |= {
            "margin_delta_uv_prime_u": margin_u,
            "margin_delta_uv_prime_interval95": margin_interval,
            "conformance_probability": np.mean(margin >= 0, axis=1),
            "decision_rule": (rule.describe(),) * len(i),
            "guard_band": np.array([rule.guard_band(float(u)) for u in margin_u]),
            "decision": tuple(rule.decide(float(m), float(u)) for m, u in zip(old["margin_delta_uv_prime"], margin_u)),
        }
    return {**comparison, "pairs": cols}
