"""Claims and values in words a client reads: the terminal and the report share them.

Every check of :func:`lampcalc.verdicts.claims.check_lamp` is turned into a
:class:`ClaimWording`: the claim as the supplier stated it (operator and unit, the
supplier's nominal CCT rather than the standard's target), the measured value with the
digits its quantity deserves, the margin with its unit, a verdict in one of three words
(:data:`VERDICT_WORDS`) and one line of why. The terminal's verdict table and the PDF report
both print these objects, so the two never disagree.

Numbers are written with a fixed number of decimals per quantity (:data:`DIGITS`), never in
``1e-7`` notation; absolute quantities, whose size depends on the measurement, keep four
significant figures. Near a claim's limit a value gets more decimals, up to three more,
until its side of the limit shows. A value that a flag makes doubtful is written in
parentheses, and a verdict that rests on such a value, or on a value its check says is not
confirmed from a published source, carries the mark :data:`QUALIFIED`.
"""

import math
from dataclasses import dataclass

from ..rating.flags import doubtful_keys
from ..standards.ansi_bins import DUV_TOLERANCE, EDITION, category

#: The three verdicts, by a check's ``pass`` value.
VERDICT_WORDS = {True: "meets", False: "does not meet", None: "not evaluated"}
#: The mark of a verdict that is qualified: its why line says how.
QUALIFIED = "†"

#: Output key -> (decimals, unit). ``None`` decimals: four significant figures (absolute quantities).
DIGITS = {
    "x": (4, ""), "y": (4, ""), "u": (4, ""), "v": (4, ""), "u_prime": (4, ""), "v_prime": (4, ""),
    "cct_K": (0, "K"), "duv": (4, ""), "ansi_nominal_cct_K": (0, "K"), "ansi_nearest_nominal_cct_K": (0, "K"),
    "ansi_margin_uv": (4, ""), "ansi_delta_cct_K": (0, "K"), "ansi_delta_duv": (4, ""),
    "sdcm_centre_nominal_cct_K": (0, "K"), "sdcm_steps": (1, "steps"),
    "ra": (1, ""), "ri": (1, ""), "cri_dc": (4, ""), "rf": (1, ""), "rg": (1, ""), "rf_hue_bins": (0, ""),
    "chroma_shift_hue_bins_percent": (1, "%"), "hue_shift_hue_bins_rad": (2, "rad"),
    "ler_lm_per_W": (1, "lm/W"), "efficacy_lm_per_W": (1, "lm/W"), "sp_ratio": (2, ""),
    "luminous_flux_lm": (None, "lm"), "radiant_flux_W": (None, "W"), "electrical_W": (None, "W"),
    "illuminance_lx": (None, "lx"), "luminance_cd_per_m2": (None, "cd/m²"), "melanopic_edi_lx": (None, "lx"),
    "delta_uv_prime": (5, ""), "peak_nm": (0, "nm"), "dominant_wavelength_nm": (1, "nm"), "centroid_nm": (1, "nm"), "fwhm_nm": (1, "nm"),
    "excitation_purity": (3, ""), "range_start_nm": (None, "nm"), "range_end_nm": (None, "nm"),
    "step_nm": (None, "nm"),
    **{f"{c}_elr_mW_per_lm": (3, "mW/lm") for c in ("s_cone", "m_cone", "l_cone", "rhodopic", "melanopic")},
    **{f"{c}_der": (3, "") for c in ("s_cone", "m_cone", "l_cone", "rhodopic", "melanopic")},
}
MISSING = "–"
#: How a spectrum came onto the 1 nm grid (the ``interpolation`` key), in words.
INTERPOLATION_WORDS = {
    "none": "none needed (1 nm data)", "linear": "linear", "sprague": "Sprague (CIE 167:2005)",
    "integrated": "integrated (data finer than 1 nm)",
}

# criterion -> (claim words, operator, output key of the measured value, basis of the comparison)
_CRITERIA = {
    "sdcm_steps": ("colour consistency", "≤", "sdcm_steps", ""),
    "ra": ("Ra", "≥", "ra", "CIE 13.3-1995, unrounded"),
    "r9": ("R9", "≥", "ri", "CIE 13.3-1995, saturated red sample"),
    "rf": ("Rf", "≥", "rf", "CIE 224:2017 / ANSI/IES TM-30-18"),
    "rg_min": ("Rg", "≥", "rg", "ANSI/IES TM-30-18"),
    "rg_max": ("Rg", "≤", "rg", "ANSI/IES TM-30-18"),
    "ler_lm_per_W": ("LER", "≥", "ler_lm_per_W", "efficacy of the radiation, not of the lamp"),
    "efficacy_lm_per_W": ("lamp efficacy", "≥", "efficacy_lm_per_W", ""),
}


def _finite(value):
    return value is not None and isinstance(value, (int, float)) and math.isfinite(value)


_SUPERSCRIPT = str.maketrans("-0123456789", "⁻⁰¹²³⁴⁵⁶⁷⁸⁹")


def _plain_number(value, decimals, signed=False):
    """``value`` with ``decimals`` decimals; ``None``: four significant figures, × 10ⁿ outside 0.01–1e6."""
    sign = "+" if signed else ""
    if decimals is None:
        magnitude = abs(value)
        if magnitude and (magnitude < 0.01 or magnitude >= 1e6):
            mantissa, exponent = f"{value:{sign}.3e}".split("e")  # Python's rounding, subnormals included
            return f"{mantissa} × 10{str(int(exponent)).translate(_SUPERSCRIPT)}"
        decimals = max(0, 3 - math.floor(math.log10(magnitude))) if magnitude else 0
    text = f"{value:{sign}.{decimals}f}"
    if float(text) == 0:  # no "-0.0"
        text = f"{0.0:{sign}.{decimals}f}"
    return text


def format_value(key, value, *, doubtful=False, unit=False, signed=None, decimals=None):
    """``value`` of output ``key`` as text: the key's digits, "–" when missing, "(…)" when doubtful.

    Examples
    --------
    >>> format_value("duv", 0.0011790279)
    '+0.0012'
    >>> format_value("ra", 81.3, doubtful=True)
    '(81.3)'
    >>> format_value("luminous_flux_lm", 4.787e-07, unit=True)
    '4.787 × 10⁻⁷ lm'
    >>> format_value("cct_K", None)
    '–'
    """
    if not _finite(value):
        return MISSING
    places, unit_text = DIGITS.get(key, (None, ""))
    if decimals is not None:
        places = decimals
    text = _plain_number(value, places, key in ("duv", "ansi_delta_duv") if signed is None else signed)
    if unit and unit_text:
        text += ("" if unit_text == "%" else " ") + unit_text
    return f"({text})" if doubtful else text


@dataclass(frozen=True)
class ClaimWording:
    """One check in words: the columns a reader sees, and the marks behind them."""

    claim: str
    measured: str
    margin: str
    verdict: str
    why: str
    passed: object  # True, False or None, as the check's ``pass``
    qualified: bool = False

    @property
    def verdict_text(self):
        """The verdict with the qualified mark where it applies."""
        return f"{self.verdict} {QUALIFIED}" if self.qualified else self.verdict


def side_decimals(value, limit, operator, passed, decimals):
    """Decimals that show on which side of ``limit`` the value lies (at most 3 more)."""
    if not (_finite(value) and _finite(limit) and passed is not None and decimals is not None) or value == limit:
        return decimals
    for extra in range(4):
        shown = float(_plain_number(value, decimals + extra))
        if (shown >= limit if operator == "≥" else shown <= limit) == passed and shown != limit:
            return decimals + extra
    return decimals + 3


def margin_text(margin, decimals, unit, passed):
    """A margin with its sign and unit; one below the shown digits keeps its side ("+<0.1")."""
    if not _finite(margin):
        return MISSING
    decimals = 0 if decimals is None else decimals
    text = _plain_number(margin, decimals, signed=True)
    if float(text) == 0 and margin != 0 and passed is not None:  # a margin below the shown digits keeps its side
        text = ("+" if passed else "-") + "<" + _plain_number(10.0**-decimals, decimals)
    return f"{text} {unit}".strip()


def _nominal_words(criterion, nominal):
    """Claim and basis of the three ANSI C78.377 checks of a claimed nominal CCT."""
    cat = category(nominal)
    table = "flexible CCT" if cat.flexible else "Table 1"
    name = f"nominal {nominal:g} K"
    if criterion == "ansi_quadrangle":
        return f"{name}: in its quadrangle", f"the quadrangle of {EDITION}, {table}"
    if criterion == "ansi_cct_K":
        if cat.flexible:
            return f"{name}: CCT in its category", f"{EDITION}, flexible CCT"
        low, high = cat.target_cct_K - cat.cct_tolerance_K, cat.target_cct_K + cat.cct_tolerance_K
        return f"{name}: CCT {low:.0f}–{high:.0f} K", f"target {cat.target_cct_K:.0f} ± {cat.cct_tolerance_K:.0f} K ({table})"
    low, high = cat.target_duv - DUV_TOLERANCE, cat.target_duv + DUV_TOLERANCE
    source = "centre-line formula" if cat.flexible else table
    return f"{name}: Duv {low:+.4f} to {high:+.4f}", f"target {cat.target_duv:+.4f} ± {DUV_TOLERANCE} ({source})"


def _steps_basis(note):
    """Words for the steps check's note: the set and the centre the steps count from."""
    head = note.split(";")[0]
    name, _, rest = head.partition(" from the ")
    where, _, nominal = rest.partition(" of ")
    if not nominal:
        return head
    centre = "" if where.startswith("ANSI") else " (the set's own centre)"
    nearest = "; nearest centre's metric" if "nearest centre" in note else ""
    return f"{name} around {nominal}{centre}{nearest}"


_NOMINAL_CRITERIA = {"ansi_quadrangle": "cct_K", "bin": "cct_K", "ansi_cct_K": "cct_K", "ansi_duv": "duv"}


def _nominal_columns(check, nominal, passed):
    """(claim, basis, key, margin text) of a check of a claimed nominal CCT."""
    criterion, margin, note = check["criterion"], check["margin"], check["note"]
    key = _NOMINAL_CRITERIA[criterion]
    if not _finite(nominal):
        return criterion, note, key, margin_text(margin, 4, "", passed)
    if criterion == "bin":
        claim, basis = f"nominal {nominal:g} K: in its bin", note.split(";")[0].replace(": bin", ", bin")
    else:
        claim, basis = _nominal_words(criterion, nominal)
    if passed is None:
        basis = note.split(";")[0] if note else basis
    if criterion in ("ansi_quadrangle", "bin"):  # the check's margin is in 1e-3 of (u, v)
        margin_words = margin_text(None if margin is None else margin / 1e3, 4, "Δuv", passed)
        if passed is not None:
            basis = ("inside " if passed else "outside ") + basis
    else:
        margin_words = margin_text(margin, DIGITS[key][0], DIGITS[key][1], passed)
    return claim, basis, key, margin_words


def word_check(check, *, nominal=None, flags=()):
    """One check of :func:`~lampcalc.verdicts.claims.check_lamp` in words.

    Parameters
    ----------
    check : dict
        ``criterion``, ``claimed``, ``measured``, ``margin``, ``pass``, ``note``.
    nominal : float, optional
        The supplier's nominal CCT, K, for the ``ansi_cct_K`` and ``ansi_duv`` checks (their
        ``claimed`` holds the standard's targets, not what the supplier stated).
    flags : sequence of str
        The lamp's flags: a value they make doubtful is shown in parentheses and qualifies
        the verdict.

    A verdict is qualified (:data:`QUALIFIED`) when it rests on a value in doubt or on a value
    the check's note says is not confirmed from a published source.
    """
    return worded_check(check, nominal, flags)[0]


def worded_check(check, nominal, flags):
    """:func:`word_check`, and how its numbers are written: the wording, the output key of the measured
    value, its decimals, and the margin's (decimals, scale from the check's unit, unit)."""
    criterion, claimed, measured, margin, passed = (check[k] for k in ("criterion", "claimed", "measured", "margin", "pass"))
    note = check.get("note") or ""
    shown = None
    if criterion in _NOMINAL_CRITERIA:
        if criterion in ("ansi_quadrangle", "bin"):
            nominal = claimed
        claim, basis, key, margin_words = _nominal_columns(check, nominal, passed)
    elif criterion == "spectrum":
        claim, basis, key, margin_words = "its spectrum", note, "spectrum", MISSING
    else:
        words, operator, key, basis = _CRITERIA.get(criterion, (criterion, "≥", criterion, ""))
        decimals, unit = DIGITS.get(key, (None, ""))
        if criterion == "sdcm_steps" and measured is not None:
            basis = _steps_basis(note)
        elif criterion == "efficacy_lm_per_W" and measured is not None and " lm / " in note:
            flux_lm, _, watts = note.partition(" lm / ")
            basis = f"{format_value('luminous_flux_lm', float(flux_lm), unit=True)} / {watts} electrical"
        elif measured is None and note:
            basis = note.replace("needs nominal_cct_K", "needs a claimed nominal CCT")
        shown = side_decimals(measured, claimed, operator, passed, decimals)
        claim = f"{words} {operator} {format_value(key, claimed, decimals=_claim_decimals(claimed))} {unit}".rstrip()
        margin_words = margin_text(margin, shown, unit, passed)
    doubtful = key in doubtful_keys(flags) and _finite(measured)
    # A quadrangle or bin is judged on the chromaticity: a CCT in doubt is shown so, but does not decide it.
    decides = doubtful and criterion not in ("ansi_quadrangle", "bin")
    if decides:
        basis = "in doubt, see the flags" + (f"; {basis}" if basis else "")
    if passed is None and not basis.startswith(("cannot", "not ", "needs", "line ")):
        basis = f"not computable for this lamp{': ' + basis if basis else ''}"
    elif basis == "not computable":
        basis = "not computable for this lamp"
    wording = ClaimWording(
        claim=claim,
        measured=format_value(key, measured, doubtful=doubtful, unit=True, decimals=shown),
        margin=margin_words,
        verdict=VERDICT_WORDS[passed],
        why=basis,
        passed=passed,
        qualified=passed is not None and (decides or "not confirmed" in note),
    )
    return wording, key, shown if shown is not None else DIGITS.get(key, (None,))[0], _margin_measure(check, key, shown)


def _margin_measure(check, key, shown):
    """(decimals, scale, unit) of a check's margin as worded: the quadrangle's in Δuv, not 1e-3 of it."""
    criterion = check["criterion"]
    if criterion in ("ansi_quadrangle", "bin"):
        return 4, 1e-3, "Δuv"
    decimals, unit = DIGITS.get(key, (None, ""))
    if criterion in _NOMINAL_CRITERIA:
        return decimals, 1.0, unit
    return (0 if shown is None else shown), 1.0, unit


def _claim_decimals(value):
    """Decimals that write a claimed limit as the supplier wrote it (80, 2.5, 0.95)."""
    return 0 if float(value).is_integer() else min(4, len(f"{value:g}".split(".")[-1]))


def with_nominal(lamp_verdict):
    """Each check of one lamp (a ``Verdicts.lamps`` entry) with the claimed nominal CCT it is read against."""
    nominal = None
    for check in lamp_verdict["checks"]:
        if check["criterion"] == "ansi_quadrangle":
            nominal = check["claimed"]
        yield check, nominal


def word_checks(lamp_verdict, flags=()):
    """Every check of one lamp (a ``Verdicts.lamps`` entry) in words, in order."""
    return [word_check(check, nominal=nominal, flags=flags) for check, nominal in with_nominal(lamp_verdict)]


def lamp_status(lamp_verdict):
    """``True`` (every claim met), ``False`` (one or more not met) or ``None`` (none failed, some not evaluated)."""
    results = [c["pass"] for c in lamp_verdict["checks"]]
    if any(r is False for r in results):
        return False
    return None if any(r is None for r in results) else True


def lamp_line(lamp_verdict):
    """One lamp's verdict in a few words: "meets all 9 claims", "does not meet 1 of 9 claims" …

    Also a lot's (``{"checks": LotVerdicts.checks}``): only each check's ``pass`` is read.
    """
    if [c.get("criterion") for c in lamp_verdict["checks"]] == ["spectrum"]:
        return "no spectrum among the files given; its claims are not checked"
    results = [c["pass"] for c in lamp_verdict["checks"]]
    n, failed, open_ = len(results), results.count(False), results.count(None)
    if not failed and not open_:
        return f"meets all {n} claims" if n != 1 else "meets its claim"
    parts = []
    if failed:
        parts.append(f"does not meet {failed} of {n} claims")
    if open_:
        parts.append(f"{open_} of {n} not evaluated")
    return "; ".join(parts)


def short_status(lamp_verdict):
    """The few words of a summary table's cell: "all 9 met", "1 of 9 not met", "1 not evaluated"."""
    if lamp_verdict is None:
        return MISSING
    results = [c["pass"] for c in lamp_verdict["checks"]]
    n, failed, open_ = len(results), results.count(False), results.count(None)
    if not failed and not open_:
        return f"all {n} met"
    parts = ([f"{failed} of {n} not met"] if failed else []) + ([f"{open_} not evaluated"] if open_ else [])
    return ", ".join(parts)


def _count(n, one, many):
    return f"{n} {one if n == 1 else many}"


def count_line(verdicts):
    """The counts of a claims check in one line, telling "does not meet" from "not evaluated"."""
    statuses = [lamp_status(lamp) for lamp in verdicts.lamps]
    checks = [c["pass"] for lamp in verdicts.lamps for c in lamp["checks"]]
    text = (
        f"{_count(len(statuses), 'lamp', 'lamps')} with claims: {_count(statuses.count(True), 'meets', 'meet')} every "
        f"claim, {_count(statuses.count(False), 'does', 'do')} not meet one or more, "
        f"{statuses.count(None)} with claims not evaluated; {_count(len(checks), 'claim', 'claims')}: "
        f"{checks.count(True)} met, {checks.count(False)} not met, {checks.count(None)} not evaluated"
    )
    if getattr(verdicts, "missing", None):
        text += f"; claimed but no spectrum: {', '.join(verdicts.missing)}"
    unclaimed = verdicts.unclaimed
    if len(unclaimed) > 5:
        text += f"; {len(unclaimed)} lamps without claims"
    elif unclaimed:
        text += f"; no claims for {', '.join(unclaimed)}"
    return text


def pair_verdicts(names, verdicts):
    """The verdict of each rated lamp, in ratings order (None for a lamp with no claims).

    ``Verdicts.lamps`` holds the claimed lamps in ratings order, so a lamp name that occurs
    twice keeps its own verdict.
    """
    lamps = list(verdicts.lamps) if verdicts is not None else []
    out, k = [], 0
    for name in names:
        if k < len(lamps) and lamps[k]["lamp"] == name:
            out.append(lamps[k])
            k += 1
        else:
            out.append(None)
    return out


def format_uncertainty(u, unit="", scale=1.0):
    """A standard uncertainty (or a guard band) to two significant digits, in ``unit``.

    Two significant digits at most, as JCGM 100:2008 7.2.6 advises (from memory); never in
    ``1e-4`` notation.

    Examples
    --------
    >>> format_uncertainty(0.000741, "Δuv"), format_uncertainty(22.46, "K"), format_uncertainty(0.229)
    ('0.00074 Δuv', '22 K', '0.23')
    """
    if not _finite(u):
        return MISSING
    u = u * scale
    digits = 1 - math.floor(math.log10(abs(u))) if u else 0
    if u and abs(round(u, digits)) >= 10.0 ** (2 - digits):  # rounded up into the next decade (0.0999 -> 0.10)
        digits -= 1
    return f"{_plain_number(round(u, digits), max(0, digits))} {unit}".strip()


def format_share(p):
    """A share of the Monte Carlo draws in %, never rounded to 0 % or 100 % unless it is exactly that.

    Examples
    --------
    >>> format_share(0.9996), format_share(1.0), format_share(0.0004), format_share(None)
    ('99.9 %', '100 %', '0.1 %', '–')
    """
    if p is None:
        return MISSING
    if p in (0.0, 1.0):
        return f"{100 * p:.0f} %"
    tenths = math.floor(1000 * p) if p > 0.5 else math.ceil(1000 * p)
    return f"{tenths / 10:.1f} %"
