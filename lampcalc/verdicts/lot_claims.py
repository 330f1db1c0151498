"""Claims on a lot: a supplier's statements about many samples, read and checked.

A lot claims file is TOML (``docs/lots.md``)::

    lampcalc_lot_claims = 1
    product = "QF-A60-3000"       # optional, shown with the verdicts
    nominal_cct_K = 3000          # optional: the centre the steps count from

    [[claim]]
    text = "95 % within 3 steps"  # optional: the supplier's words
    within_steps = 3
    share_at_least_percent = 95

    [[claim]]
    quantity = "ra_mean"          # any number of the lot's output (docs/output-fields.md)
    at_least = 80                 # or at_most

    [[claim]]
    inside_nominal_cct_K = 3000   # inside that ANSI C78.377-2017 quadrangle
    share_at_least_percent = 100

Each claim gives the measured value, the margin (how far on the right side of the claim;
negative when it is not met) and a verdict in the shared words of
:mod:`lampcalc.verdicts.wording`: meets, does not meet, or not evaluated (when the lot
cannot decide it). The verdicts concern the samples supplied, not the whole production.
"""

import math
import re
from dataclasses import dataclass

import numpy as np

from ..errors import InputError
from ..standards.ansi_bins import category, quadrangle_margin
from .lot import LOT_RATINGS, SPREAD_KEYS
from .spread import STATISTICS

FORMAT_KEY = "lampcalc_lot_claims"
TOP_KEYS = (FORMAT_KEY, "product", "nominal_cct_K", "claim")
#: The three kinds of claim: the key that marks each, the keys it needs, the keys of which it needs one.
KINDS = {
    "quantity": ("quantity", {"quantity"}, {"at_least", "at_most"}),
    "within_steps": ("within_steps", {"within_steps", "share_at_least_percent"}, set()),
    "inside_quadrangle": ("inside_nominal_cct_K", {"inside_nominal_cct_K", "share_at_least_percent"}, set()),
}
#: Lot numbers a ``quantity`` claim may name.
CLAIMABLE = frozenset(SPREAD_KEYS) | {f"{r}_{s}" for r in LOT_RATINGS for s in STATISTICS}
#: What a steps verdict rests on that no published table here confirms, by steps method.
STEPS_NOTES = {
    "ellipse": "the IEC 60081 ellipse metric is not confirmed against the published table: confirm it before a dispute",
    "circle": "the CIE TN 001 step (0.0011 in u′v′) is not confirmed against the published note: confirm it before a dispute",
    "set": "the ellipse set's metric is not confirmed against a published table: confirm it before a dispute",
}


def _steps_note(lot):
    """What a steps verdict rests on that is not confirmed, or "" when its metric is."""
    return "" if lot["steps_metric_confirmed"] else STEPS_NOTES[lot["steps_method"]]


@dataclass(frozen=True)
class LotClaim:
    """One claim as read: its kind, its values, the line of its ``[[claim]]`` header."""

    kind: str
    values: dict
    line: int


@dataclass(frozen=True)
class LotClaims:
    """A lot claims file as read."""

    path: str
    product: str
    nominal_cct_K: float
    claims: tuple


def _number(value, where, key, low=None, high=None):
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value):
        raise InputError(f"{where}: {key} must be a finite number, got {value!r}")
    if (low is not None and value < low) or (high is not None and value > high):
        raise InputError(f"{where}: {key} = {value!r} is outside {low:g}–{high:g}")
    return float(value)


def _claim(table, where):
    if not isinstance(table, dict):
        raise InputError(f"{where}: a claim must be a table of keys")
    keys = set(table) - {"text"}
    kinds = [k for k, (marker, _, _) in KINDS.items() if marker in keys]
    if len(kinds) != 1:
        raise InputError(f"{where}: a claim needs exactly one of 'quantity', 'within_steps' or 'inside_nominal_cct_K'")
    kind = kinds[0]
    _, needed, one_of = KINDS[kind]
    allowed = needed | one_of | {"text"}
    unknown = sorted(set(table) - allowed)
    if unknown:
        raise InputError(f"{where}: unknown key {unknown[0]!r} in a {kind} claim; its keys are {', '.join(sorted(allowed))}")
    missing = sorted(needed - keys)
    if missing:
        raise InputError(f"{where}: the {kind} claim has no {missing[0]!r}")
    if one_of and len(one_of & keys) != 1:
        raise InputError(f"{where}: give exactly one of {', '.join(sorted(one_of))}")
    values = {"text": table.get("text", "")}
    if not isinstance(values["text"], str):
        raise InputError(f"{where}: text must be a string")
    if kind == "quantity":
        name = table["quantity"]
        if name not in CLAIMABLE:
            import difflib

            near = difflib.get_close_matches(str(name), sorted(CLAIMABLE), n=1)
            hint = f"; did you mean {near[0]!r}?" if near else " (see docs/output-fields.md)"
            raise InputError(f"{where}: {name!r} is not a number of the lot's output{hint}")
        bound = (one_of & keys).pop()
        values |= {"quantity": name, "bound": bound, "claimed": _number(table[bound], where, bound)}
    else:
        values["share_at_least_percent"] = _number(table["share_at_least_percent"], where, "share_at_least_percent", 0, 100)
    if kind == "within_steps":
        values["within_steps"] = _number(table["within_steps"], where, "within_steps", 0, 100)
    if kind == "inside_quadrangle":
        nominal = _number(table["inside_nominal_cct_K"], where, "inside_nominal_cct_K")
        try:
            category(nominal)
        except InputError as err:
            raise InputError(f"{where}: {err}") from None
        values["inside_nominal_cct_K"] = nominal
    return values, kind


def read_lot_claims(path):
    """Read a lot claims file (TOML).

    Raises
    ------
    InputError
        One line naming the file and the line at fault: not TOML, not a lot claims file, an
        unknown or missing key, a number that is not finite or out of range, a quantity that
        is not a number of the lot's output, no claim at all.
    """
    import tomllib

    try:
        with open(path, "rb") as handle:
            raw = handle.read()
        text = raw.decode("utf-8-sig")
    except (OSError, UnicodeDecodeError) as err:
        raise InputError(f"{path}: cannot be read as a UTF-8 text file ({err})") from None
    try:
        doc = tomllib.loads(text)
    except tomllib.TOMLDecodeError as err:
        raise InputError(f"{path}: not a valid TOML lot claims file: {err}") from None
    if doc.get(FORMAT_KEY) != 1:
        raise InputError(f"{path}: not a lampcalc lot claims file (its first setting must be '{FORMAT_KEY} = 1')")
    unknown = sorted(set(doc) - set(TOP_KEYS))
    if unknown:
        raise InputError(f"{path}: unknown setting {unknown[0]!r}; the settings are {', '.join(TOP_KEYS)}")
    product = doc.get("product", "")
    if not isinstance(product, str):
        raise InputError(f"{path}: product must be a string")
    nominal = float("nan")
    if "nominal_cct_K" in doc:
        nominal = _number(doc["nominal_cct_K"], path, "nominal_cct_K")
        try:
            category(nominal)
        except InputError as err:
            raise InputError(f"{path}: nominal_cct_K: {err}") from None
    tables = doc.get("claim", [])
    if not isinstance(tables, list) or not tables:
        raise InputError(f"{path}: no claim: add at least one [[claim]] table")
    headers = [n + 1 for n, line in enumerate(text.splitlines()) if re.match(r"\s*\[\[\s*claim\s*\]\]", line)]
    if len(headers) != len(tables):
        headers = [0] * len(tables)
    claims = []
    for k, (table, line) in enumerate(zip(tables, headers), start=1):
        where = f"{path}, line {line} (claim {k})" if line else f"{path}, claim {k}"
        values, kind = _claim(table, where)
        claims.append(LotClaim(kind, values, line))
    return LotClaims(str(path), product, nominal, tuple(claims))


def _result(claim, label, claimed, measured, margin, note="", undecided=""):
    """One verdict; ``undecided`` gives the reason it cannot be evaluated (the margin is then kept, not used)."""
    decided = not undecided and margin is not None and np.isfinite(margin)
    note = "; ".join(t for t in (f"not evaluated: {undecided}" if undecided else "", note) if t)
    return {
        "kind": claim.kind,
        "claim": label,
        "text": claim.values["text"],
        "line": claim.line,
        "claimed": claimed,
        "measured": measured,
        "margin": margin if margin is not None and np.isfinite(margin) else None,
        "pass": bool(margin >= 0) if decided else None,
        "note": note,
    }


def rating_of(quantity):
    """The rating a ``<rating>_<statistic>`` key summarises, or None for a spread key."""
    for name in LOT_RATINGS:
        if quantity.startswith(name + "_") and quantity[len(name) + 1:] in STATISTICS:
            return name
    return None


def _check_quantity(claim, lot):
    v = claim.values
    measured = lot[v["quantity"]]
    measured = float(measured) if measured is not None else float("nan")
    margin = measured - v["claimed"] if v["bound"] == "at_least" else v["claimed"] - measured
    rating = rating_of(v["quantity"])
    undecided = ""
    if not np.isfinite(measured):
        undecided = "the lot gives no value"
    elif rating in lot["doubtful_ratings"]:
        undecided = "some samples' values are outside the method's validity"
    elif rating in lot["partial_ratings"] and not v["quantity"].endswith("_n"):
        undecided = f"{rating} is missing for some samples"
    note = _steps_note(lot) if "steps" in v["quantity"] else ""
    sign = ">=" if v["bound"] == "at_least" else "<="
    return _result(claim, f"{v['quantity']} {sign} {v['claimed']:g}", v["claimed"], measured, margin, note, undecided)


def _share_result(claim, inside, what, note):
    share = 100.0 * float(np.mean(inside)) if inside.size else float("nan")
    required = claim.values["share_at_least_percent"]
    note = f"{int(np.sum(inside))} of {inside.size} samples {what}" + (f"; {note}" if note else "")
    return _result(claim, f"at least {required:g} % {what}", required, share, share - required, note)


def check_lot_claims(claims, lot):
    """Check every claim of a :class:`LotClaims` against :func:`~lampcalc.verdicts.lot.lot_statistics`.

    Raises
    ------
    InputError
        When the claims name a nominal CCT and the lot's steps count from another centre.
    """
    centre = lot["steps_centre_nominal_cct_K"]
    if np.isfinite(claims.nominal_cct_K) and centre != claims.nominal_cct_K:
        raise InputError(
            f"{claims.path}: the claims name nominal {claims.nominal_cct_K:g} K, but the lot's steps count from "
            f"{centre:g} K; give the same centre"
        )
    samples = lot["samples"]
    results = []
    for claim in claims.claims:
        v = claim.values
        if claim.kind == "quantity":
            results.append(_check_quantity(claim, lot))
        elif claim.kind == "within_steps":
            if not np.isfinite(centre):
                label = f"at least {v['share_at_least_percent']:g} % within {v['within_steps']:g} steps"
                results.append(_result(claim, label, v["share_at_least_percent"], None, None,
                                       undecided="the lot has no centre (its mean point is not white)"))
                continue
            steps = np.asarray(samples["sdcm_steps"], dtype=float)
            note = f"{lot['steps_method']} steps from the {lot['steps_centre'].upper()} centre of {centre:g} K"
            note += f"; {_steps_note(lot)}" if _steps_note(lot) else ""
            results.append(_share_result(claim, steps <= v["within_steps"], f"within {v['within_steps']:g} steps", note))
        else:
            nominal = v["inside_nominal_cct_K"]
            xy = np.stack([samples["x"], samples["y"]], axis=-1)
            flexible = category(nominal).flexible
            note = ("flexible category: its CCT tolerance is not confirmed against the published standard" if flexible
                    else "")
            results.append(_share_result(claim, quadrangle_margin(xy, nominal) >= 0, f"inside the {nominal:g} K quadrangle",
                                         note))
    return LotVerdicts(claims.product, results)


@dataclass
class LotVerdicts:
    """The verdicts on a lot's claims: one dict per claim (see :func:`check_lot_claims`)."""

    product: str
    checks: list

    @property
    def all_hold(self):
        """True when every claim is met (one not evaluated is not shown to be)."""
        return all(c["pass"] is True for c in self.checks)

    def summary(self):
        """The counts in the shared words: "4 lot claims: 3 met, 1 not met, 0 not evaluated"."""
        results = [c["pass"] for c in self.checks]
        return (f"{len(results)} lot claim{'s' if len(results) != 1 else ''}: {results.count(True)} met, "
                f"{results.count(False)} not met, {results.count(None)} not evaluated")
