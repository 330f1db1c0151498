"""Lots, colour over angle and comparisons in words: the terminal and the report share them.

The verdicts of a lot's claims (:mod:`lampcalc.verdicts.lot_claims`) and of a colour shift
against the user's limit (colour over angle, :mod:`lampcalc.verdicts.angles`; a comparison,
:mod:`lampcalc.verdicts.comparison`) are turned into the
:class:`~lampcalc.verdicts.wording.ClaimWording` of a lamp's claims: the claim, the measured
value with the digits its quantity deserves, the margin, one of the three verdicts of
:data:`~lampcalc.verdicts.wording.VERDICT_WORDS` and why. A verdict that rests on a value no
published source confirms (the shipped step metrics) carries the mark
:data:`~lampcalc.verdicts.wording.QUALIFIED`; what qualifies it is said once, under the table.
"""

import math
import re

from .lot_claims import STEPS_NOTES, rating_of
from .wording import DIGITS, MISSING, VERDICT_WORDS, ClaimWording, format_value, margin_text, side_decimals

#: Lot output keys (by pattern) -> the key whose digits and unit they take (``None``: a count).
_LOT_KEYS = (
    (r"n_samples|.*_count|.*_n", None),
    (r"within_\d+_steps_percent", "percent"),
    (r"mean_(x|y|u_prime|v_prime)", r"\1"),
    (r"mean_point_(cct_K|duv)", r"\1"),
    (r".*delta_uv_prime.*", "delta_uv_prime"),
    (r"ellipse_.*steps.*", "sdcm_steps"),
    (r"ellipse_semi_.*", "x"),
)
_PERCENT = (1, "%")
#: What each statistic of a rating is, for the why column of a lot claim.
STATISTIC_WORDS = {
    "n": "samples that have a value", "mean": "mean of the samples", "sd": "sample standard deviation (n − 1)",
    "min": "lowest sample", "max": "highest sample", "p05": "5th percentile (linear)", "p95": "95th percentile (linear)",
}

#: Rating -> its name for a reader (the lot's statistics table, lot claims).
RATING_WORDS = {"cct_K": "CCT", "duv": "Duv", "ra": "Ra", "r9": "R9", "rf": "Rf", "rg": "Rg", "ler_lm_per_W": "LER",
                "luminous_flux_lm": "luminous flux", "radiant_flux_W": "radiant flux", "illuminance_lx": "illuminance",
                "luminance_cd_per_m2": "luminance", "efficacy_lm_per_W": "lamp efficacy", "sp_ratio": "S/P",
                "melanopic_der": "mel-DER", "melanopic_edi_lx": "mel-EDI", "sdcm_steps": "steps from the centre"}
#: Statistic -> how a claim on it reads, before the rating's name.
_STATISTIC_CLAIMS = {"n": "samples with", "mean": "mean", "sd": "sd of", "min": "lowest", "max": "highest",
                     "p05": "5th percentile of", "p95": "95th percentile of"}
#: Lot numbers other than a rating's statistics, in words (the keys of lampcalc.verdicts.lot.SPREAD_KEYS).
_SPREAD_WORDS = {
    "n_samples": "samples", "mean_x": "mean x", "mean_y": "mean y",
    "mean_u_prime": "mean u′", "mean_v_prime": "mean v′",
    "mean_point_cct_K": "CCT of the mean point", "mean_point_duv": "Duv of the mean point",
    "cov_xx": "covariance of x", "cov_xy": "covariance of x and y", "cov_yy": "covariance of y",
    "ellipse_semi_major_xy": "ellipse's semi-major axis in x, y",
    "ellipse_semi_minor_xy": "ellipse's semi-minor axis in x, y",
    "ellipse_max_steps_from_mean": "ellipse's largest steps from the mean point",
    "ellipse_min_steps_from_mean": "ellipse's smallest steps from the mean point",
    "ellipse_max_steps_from_centre": "ellipse's largest steps from the centre",
    "max_pairwise_delta_uv_prime": "largest pairwise Δu′v′",
    "max_delta_uv_prime_from_mean": "largest Δu′v′ from the mean point",
    "ansi_bins_none_count": "samples in no ANSI category", "bins_none_count": "samples in no bin",
}


def quantity_words(quantity):
    """A lot number named in a claim (``ra_mean``), in words (``mean Ra``).

    Examples
    --------
    >>> quantity_words("ra_min"), quantity_words("within_3_steps_percent"), quantity_words("max_pairwise_delta_uv_prime")
    ('lowest Ra', 'share within 3 steps', 'largest pairwise Δu′v′')
    """
    rating = rating_of(quantity)
    if rating is not None:
        return f"{_STATISTIC_CLAIMS[quantity[len(rating) + 1:]]} {RATING_WORDS.get(rating, rating)}"
    within = re.fullmatch(r"within_(\d+)_steps_percent", quantity)
    if within:
        return f"share within {within.group(1)} steps"
    return _SPREAD_WORDS.get(quantity, quantity)


def lot_key_digits(quantity):
    """(decimals, unit, key) a number of the lot's output is written with.

    ``key`` is the output key whose digits it borrows (``ra`` for ``ra_mean``, ``ri`` for
    ``r9_min``), for :func:`~lampcalc.verdicts.wording.format_value`; decimals ``None``: four
    significant figures (absolute quantities, covariances).

    Examples
    --------
    >>> lot_key_digits("ra_mean"), lot_key_digits("within_3_steps_percent")
    ((1, '', 'ra'), (1, '%', 'percent'))
    """
    rating = rating_of(quantity)
    if rating is not None and not quantity.endswith("_n"):
        key = "ri" if rating == "r9" else rating
        return (*DIGITS.get(key, (None, "")), key)
    for pattern, key in _LOT_KEYS:
        match = re.fullmatch(pattern, quantity)
        if match:
            if key is None:
                return 0, "", "count"
            if key == "percent":
                return (*_PERCENT, key)
            key = match.expand(key)
            return (*DIGITS[key], key)
    return None, "", quantity


def _lot_number(quantity, value, decimals=None):
    places, unit, key = lot_key_digits(quantity)
    signed = key in ("duv",) and not quantity.endswith("_sd")
    text = format_value(key, value, decimals=places if decimals is None else decimals, signed=signed)
    return text if text == MISSING or not unit else text + ("" if unit == "%" else " ") + unit


def _split_note(note, lot_steps_notes=STEPS_NOTES.values()):
    """(the note without what qualifies the verdict, what qualifies it or "")."""
    for text in lot_steps_notes:
        if text in note:
            rest = "; ".join(part for part in (p.strip() for p in note.replace(text, "").split(";")) if part)
            return rest, text
    return note, ""


def word_lot_check(check):
    """One check of :func:`~lampcalc.verdicts.lot_claims.check_lot_claims` in words.

    Returns
    -------
    wording : ClaimWording
    qualification : str
        What a qualified verdict rests on ("" for none), to be said once under the table.
    """
    passed, claimed, measured, margin = (check[k] for k in ("pass", "claimed", "measured", "margin"))
    why, qualification = _split_note(check.get("note") or "")
    why = why.removeprefix(f"{VERDICT_WORDS[None]}: ")  # the verdict column says so
    if check["kind"] == "quantity":
        quantity, operator = check["claim"].split(" ")[:2]
        operator = "≥" if operator == ">=" else "≤"
        rating = rating_of(quantity)
        if rating is not None and not why:
            why = STATISTIC_WORDS[quantity[len(rating) + 1:]]
        places, unit, _ = lot_key_digits(quantity)
        shown = side_decimals(measured, claimed, operator, passed, places)
        claim = f"{quantity_words(quantity)} {operator} {claimed:g}" + (f" {unit}" if unit and unit != "%" else unit)
        measured_text = _lot_number(quantity, measured, shown)
        margin_words = margin_text(margin, shown if shown is not None else places, unit, passed)
    else:  # a share of the samples, in per cent
        shown = side_decimals(measured, claimed, "≥", passed, _PERCENT[0])
        claim = check["claim"]
        measured_text = MISSING if measured is None else f"{format_value('percent', measured, decimals=shown)} %"
        margin_words = margin_text(margin, shown, "%", passed)
    wording = ClaimWording(claim=claim, measured=measured_text, margin=margin_words, verdict=VERDICT_WORDS[passed],
                           why=why, passed=passed, qualified=bool(qualification) and passed is not None)
    return wording, qualification if wording.qualified else ""


def word_lot_checks(verdicts):
    """Every claim of a :class:`~lampcalc.verdicts.lot_claims.LotVerdicts` in words, and the distinct qualifications."""
    pairs = [word_lot_check(c) for c in verdicts.checks]
    notes = list(dict.fromkeys(q for _, q in pairs if q))
    return [w for w, _ in pairs], notes


def limit_wording(value, limit, passed, *, what, where="", basis=""):
    """A colour shift against the user's limit, as a claim in words.

    Parameters
    ----------
    value : float
        The shift measured (Δu′v′).
    limit : float or None
        The user's limit; None (or NaN) when none was given: the verdict is "not evaluated".
    passed : bool or None
    what : str
        What is limited ("largest Δu′v′ from the mean point").
    where : str
        Where the value was found ("at 80°"), first in the why column.
    basis : str
        The why column when a limit was given.

    Examples
    --------
    >>> w = limit_wording(0.00389, 0.003, False, what="Δu′v′")
    >>> w.claim, w.measured, w.margin, w.verdict
    ('Δu′v′ ≤ 0.003 (your limit)', '0.00389', '-0.00089', 'does not meet')
    """
    given = limit is not None and math.isfinite(limit)
    places = DIGITS["delta_uv_prime"][0]
    shown = side_decimals(value, limit, "≤", passed, places) if given else places
    measured = format_value("delta_uv_prime", value, decimals=shown)
    if not given:
        why = "; ".join(t for t in (where, "lampcalc applies no limit of its own") if t)
        return ClaimWording(claim=f"{what}: no limit given", measured=measured, margin=MISSING,
                            verdict=VERDICT_WORDS[None], why=why, passed=None)
    return ClaimWording(claim=f"{what} ≤ {limit:g} (your limit)", measured=measured,
                        margin=margin_text(limit - value, shown, "", passed), verdict=VERDICT_WORDS[passed],
                        why="; ".join(t for t in (where, basis) if t), passed=passed)


def limit_line(value, limit, passed, *, where=""):
    """A colour shift against the user's limit in one sentence.

    Examples
    --------
    >>> limit_line(0.00899, 0.004, False, where="at 80°")
    '0.00899 at 80°: does not meet your limit 0.004 (margin -0.00499)'
    """
    wording = limit_wording(value, limit, passed, what="")
    measured = f"{wording.measured} {where}" if where else wording.measured
    if wording.passed is None:
        return f"{measured}; no limit given, so {wording.verdict} (lampcalc applies no limit of its own)"
    return f"{measured}: {wording.verdict} your limit {limit:g} (margin {wording.margin})"
