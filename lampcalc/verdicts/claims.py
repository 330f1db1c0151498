"""Supplier claims: reading a claims file and checking each claim against the ratings.

A claims file is a CSV with one row per lamp, matched to the spectra by the ``lamp``
column (the lamp name); a blank cell means no claim. Columns (``docs/claims.md``):

===========================  ====================================================
column                       claim
===========================  ====================================================
lamp                         lamp name (required)
nominal_cct_K                nominal CCT: the lamp is inside its ANSI C78.377-2017 quadrangle
max_sdcm_steps               colour consistency: at most this many steps from the nominal centre
min_ra, min_r9               CIE 13.3 Ra and R9 at least
min_rf, min_rg, max_rg       TM-30-18 Rf at least, Rg within [min, max]
min_ler_lm_per_W             luminous efficacy of radiation at least
electrical_W                 the lamp's electrical power (used for the efficacy claim)
min_efficacy_lm_per_W        lamp luminous efficacy at least (needs a spectrum in W/nm)
===========================  ====================================================
"""

import csv
import io
import json
import math
from dataclasses import dataclass, field

import numpy as np

from ..errors import InputError
from ..io.serialise import plain
from ..standards.ansi_bins import DUV_TOLERANCE, FLEXIBLE_NOTE, ansi_bin_set, category, quadrangle_margin
from ..standards.bin_sets import margins
from ..standards.ellipse_sets import shipped_ellipse_set
from ..standards.steps import steps_from_nominal

#: Claim columns and their meaning; every other column is refused.
CLAIM_COLUMNS = {
    "lamp": "lamp name, matching a spectrum's name",
    "nominal_cct_K": "nominal CCT, K",
    "max_sdcm_steps": "maximum colour-consistency steps from the nominal centre",
    "min_ra": "minimum CIE 13.3 Ra",
    "min_r9": "minimum CIE 13.3 R9",
    "min_rf": "minimum TM-30-18 Rf",
    "min_rg": "minimum TM-30-18 Rg",
    "max_rg": "maximum TM-30-18 Rg",
    "min_ler_lm_per_W": "minimum luminous efficacy of radiation, lm/W",
    "electrical_W": "electrical power, W",
    "min_efficacy_lm_per_W": "minimum lamp luminous efficacy, lm/W",
}


@dataclass
class Claim:
    """The claims of one lamp, as read (None where the cell is blank)."""

    lamp: str
    line: int
    values: dict = field(default_factory=dict)


def read_claims(path):
    """Read a claims CSV: ``{lamp name: Claim}``.

    Raises
    ------
    InputError
        For a missing ``lamp`` column, an unknown column, a malformed or negative number,
        a blank lamp name or a lamp named twice; the message names the line and column.
    """
    try:
        with open(path, encoding="utf-8-sig", newline="") as handle:
            text = handle.read()
    except (OSError, UnicodeDecodeError) as err:
        raise InputError(f"{path}: cannot be read as a text CSV file ({err})") from None
    lines = [(i + 1, line) for i, line in enumerate(text.splitlines()) if line.strip() and not line.lstrip().startswith("#")]
    if not lines:
        raise InputError(f"{path}: the claims file is empty")
    rows = list(csv.reader([line for _, line in lines]))
    header = [h.strip() for h in rows[0]]
    first_line = lines[0][0]
    if "lamp" not in header:
        raise InputError(f"{path}, line {first_line}: no 'lamp' column (columns: {', '.join(header)})")
    unknown = [h for h in header if h not in CLAIM_COLUMNS]
    if unknown:
        raise InputError(
            f"{path}, line {first_line}: unknown column {unknown[0]!r}; the columns are {', '.join(CLAIM_COLUMNS)}"
        )
    if len(set(header)) != len(header):
        twice = next(h for h in header if header.count(h) > 1)
        raise InputError(f"{path}, line {first_line}: column {twice!r} appears twice")
    claims = {}
    for (number, _), row in zip(lines[1:], rows[1:]):
        if len(row) != len(header):
            raise InputError(f"{path}, line {number}: {len(row)} fields where the header has {len(header)}")
        cells = dict(zip(header, (c.strip() for c in row)))
        lamp = cells.pop("lamp")
        if not lamp:
            raise InputError(f"{path}, line {number}: the lamp name is blank")
        if lamp in claims:
            raise InputError(f"{path}, line {number}: lamp {lamp!r} is claimed twice (also line {claims[lamp].line})")
        values = {}
        for column, cell in cells.items():
            if not cell:
                continue
            try:
                value = float(cell)
            except ValueError:
                value = math.nan
            if not math.isfinite(value) or value < 0:
                raise InputError(
                    f"{path}, line {number}, column {column!r}: {cell!r} is not a non-negative number"
                )
            values[column] = value
        if "nominal_cct_K" in values:
            try:
                category(values["nominal_cct_K"])
            except InputError as err:
                raise InputError(f"{path}, line {number}, column 'nominal_cct_K': {err}") from None
        claims[lamp] = Claim(lamp, number, values)
    return claims


def _check(criterion, claimed, measured, margin, note=""):
    """One check; pass is None when it cannot be decided (the claim is then not shown to hold)."""
    ok = None if margin is None or not np.isfinite(margin) else bool(margin >= 0)
    return {"criterion": criterion, "claimed": claimed, "measured": measured, "margin": margin, "pass": ok, "note": note}


_UNCONFIRMED_BINS = "corners not confirmed from a published table: supply the published ones with --bins"
_UNCONFIRMED_STEPS = "metric not confirmed from a published source: supply the published one with --ellipses"


def _quadrangle_checks(nominal, r, bin_set):
    """The nominal-CCT claim: inside its bin(s) or quadrangle, and CCT and Duv against the targets.

    A user's bin set decides the quadrangle check for the nominal CCTs it holds; the
    shipped ANSI quadrangles decide it for Table 1; a flexible CCT has no published
    quadrangle or CCT tolerance in lampcalc, so those two are not evaluated.
    """
    cat = category(nominal)
    xy = np.array([r["x"], r["y"]])
    cct, duv = r["cct_K"], r["duv"]
    in_set = bin_set.bins_of_nominal(nominal) if bin_set is not None else np.array([], dtype=int)
    checks = []
    if in_set.size:
        margin = float(np.max(margins(xy, bin_set)[in_set])) * 1e3
        note = f"{bin_set.name}: bin {' or '.join(bin_set.names[k] for k in in_set)}"
        if not np.all(bin_set.bin_confirmed[in_set]):
            note += f"; {_UNCONFIRMED_BINS}"
        checks.append(_check("bin", nominal, cct, margin, note))
    elif cat.flexible:
        checks.append(_check("ansi_quadrangle", nominal, cct, None, FLEXIBLE_NOTE))
    else:
        note = cat.label()
        if not ansi_bin_set().bin_confirmed[cat.bin_index]:
            note += f"; {_UNCONFIRMED_BINS}"
        checks.append(_check("ansi_quadrangle", nominal, cct, float(quadrangle_margin(xy, nominal)) * 1e3, note))
    if cat.flexible:
        checks.append(_check("ansi_cct_K", cat.target_cct_K, cct, None, FLEXIBLE_NOTE))
    else:
        cct_margin = None if cct is None else cat.cct_tolerance_K - abs(cct - cat.target_cct_K)
        checks.append(
            _check("ansi_cct_K", cat.target_cct_K, cct, cct_margin, f"target {cat.target_cct_K:g} ± {cat.cct_tolerance_K:g} K")
        )
    duv_margin = None if duv is None else DUV_TOLERANCE - abs(duv - cat.target_duv)
    source = "centre-line formula" if cat.flexible else "Table 1"
    checks.append(_check("ansi_duv", cat.target_duv, duv, duv_margin, f"target {cat.target_duv:+.4f} ± {DUV_TOLERANCE} ({source})"))
    return checks


def _steps_check(v, r, ellipse_set, centre):
    if "nominal_cct_K" not in v:
        return _check("sdcm_steps", v["max_sdcm_steps"], None, None, "needs nominal_cct_K for the centre")
    try:
        steps, outside, unconfirmed = steps_from_nominal([[r["x"], r["y"]]], [v["nominal_cct_K"]], ellipse_set, centre)
    except InputError as err:
        return _check("sdcm_steps", v["max_sdcm_steps"], None, None, f"not evaluated: {err}")
    where = "ANSI target" if centre == "ansi" else "set's own centre"
    note = f"{ellipse_set.name} from the {where} of {v['nominal_cct_K']:g} K"
    if outside[0]:
        note += "; metric of the set's nearest centre"
    if unconfirmed[0]:
        note += f"; {_UNCONFIRMED_STEPS}"
    return _check("sdcm_steps", v["max_sdcm_steps"], float(steps[0]), v["max_sdcm_steps"] - float(steps[0]), note)


def _efficacy_check(v, r):
    claimed = v["min_efficacy_lm_per_W"]
    watts = v.get("electrical_W", r["electrical_W"])
    flux, radiant = r["luminous_flux_lm"], r["radiant_flux_W"]
    if flux is None:
        return _check("efficacy_lm_per_W", claimed, None, None, "cannot be checked: the spectrum is not in W/nm")
    if not watts:
        return _check("efficacy_lm_per_W", claimed, None, None, "cannot be checked: no electrical power")
    if radiant > watts:
        return _check(
            "efficacy_lm_per_W", claimed, None, None,
            f"not evaluated: radiant flux {radiant:.4g} W exceeds the electrical power {watts:g} W, which is "
            "impossible (check the spectrum's unit, e.g. mW/nm read as W/nm, and the power)",
        )
    efficacy = flux / watts
    return _check("efficacy_lm_per_W", claimed, efficacy, efficacy - claimed, f"{flux:.1f} lm / {watts:g} W")


def check_lamp(claim, ratings, i, ellipse_set=None, sdcm_centre="ansi", bin_set=None):
    """All checks of one lamp's claims against row ``i`` of ``ratings``: a list of dicts.

    Parameters
    ----------
    ellipse_set : EllipseSet, optional
        Metric of the colour-consistency claim; by default the shipped IEC 60081 set.
    sdcm_centre : {"ansi", "set"}
        Centre of the steps (see :func:`lampcalc.standards.steps.centre_xy`).
    bin_set : BinSet, optional
        A user's bins: they decide the nominal-CCT claim for the nominal CCTs they hold.
    """
    r = {k: plain(ratings[k][i]) for k in ratings.columns}
    v = claim.values
    checks = []
    flags = set(r["flags"])
    if "nominal_cct_K" in v:
        checks += _quadrangle_checks(v["nominal_cct_K"], r, bin_set)
    if "max_sdcm_steps" in v:
        checks.append(_steps_check(v, r, ellipse_set or shipped_ellipse_set(), sdcm_centre))
    cri_note = "outside CIE 13.3 validity (DC > 5.4e-3)" if "cri_outside_validity" in flags else ""
    ler_note = "luminous efficacy of the radiation"
    if "ler_depends_on_range" in flags:
        ler_note += f" over {r['ler_range_nm'][0]:g}-{r['ler_range_nm'][1]:g} nm only: real power at the range's end"
    r9 = r["ri"][8] if r["ri"] else None
    for key, measured, criterion, note in (
        ("min_ra", r["ra"], "ra", cri_note),
        ("min_r9", r9, "r9", cri_note),
        ("min_rf", r["rf"], "rf", ""),
        ("min_rg", r["rg"], "rg_min", ""),
        ("min_ler_lm_per_W", r["ler_lm_per_W"], "ler_lm_per_W", ler_note),
    ):
        if key in v:
            margin = None if measured is None else measured - v[key]
            checks.append(_check(criterion, v[key], measured, margin, note or ("not computable" if measured is None else "")))
    if "max_rg" in v:
        margin = None if r["rg"] is None else v["max_rg"] - r["rg"]
        checks.append(_check("rg_max", v["max_rg"], r["rg"], margin))
    if "min_efficacy_lm_per_W" in v:
        checks.append(_efficacy_check(v, r))
    return checks


@dataclass
class Verdicts:
    """Results of checking a claims file against a batch's ratings."""

    lamps: list  # [{"lamp", "pass", "checks": [...]}] for claimed lamps, in ratings order
    unclaimed: list  # names of rated lamps with no claim

    @property
    def all_hold(self):
        """True when every check of every claimed lamp passed (a check that cannot be decided does not)."""
        return all(lamp["pass"] for lamp in self.lamps)

    def summary(self):
        checks = [c for lamp in self.lamps for c in lamp["checks"]]
        failed = sum(c["pass"] is False for c in checks)
        undecided = sum(c["pass"] is None for c in checks)
        lamps_failed = sum(not lamp["pass"] for lamp in self.lamps)
        text = (
            f"{len(self.lamps)} lamps claimed, {lamps_failed} with a claim that does not hold; "
            f"{len(checks)} checks: {len(checks) - failed - undecided} pass, {failed} fail"
        )
        if undecided:
            text += f", {undecided} cannot be checked"
        if self.unclaimed:
            text += f"; not claimed: {', '.join(self.unclaimed)}"
        return text

    def to_json(self):
        out = [
            {
                "lamp": lamp["lamp"],
                "pass": lamp["pass"],
                "checks": [{k: plain(c[k]) for k in ("criterion", "claimed", "measured", "margin", "pass", "note")} for c in lamp["checks"]],
            }
            for lamp in self.lamps
        ]
        return json.dumps(out, indent=1, allow_nan=False) + "\n"

    def to_csv(self):
        buffer = io.StringIO()
        writer = csv.writer(buffer, lineterminator="\n")
        writer.writerow(["lamp", "criterion", "claimed", "measured", "margin", "pass", "note"])
        for lamp in self.lamps:
            for c in lamp["checks"]:
                writer.writerow(
                    [lamp["lamp"], c["criterion"], *("" if c[k] is None else repr(float(c[k])) for k in ("claimed", "measured", "margin")),
                     {True: "pass", False: "fail", None: "cannot check"}[c["pass"]], c["note"]]
                )
        return buffer.getvalue()


def check_claims(claims, ratings, claims_path="claims", **options):
    """Check every claim against the ratings.

    Raises
    ------
    InputError
        When a claim names a lamp that has no spectrum (the message names its line).
    """
    names = list(ratings["name"])
    for claim in claims.values():
        if claim.lamp not in names:
            raise InputError(
                f"{claims_path}, line {claim.line}: lamp {claim.lamp!r} has no spectrum among the files given"
            )
    lamps, unclaimed = [], []
    for i, name in enumerate(names):
        if name not in claims:
            unclaimed.append(name)
            continue
        checks = check_lamp(claims[name], ratings, i, **options)
        lamps.append({"lamp": name, "pass": all(c["pass"] is True for c in checks), "checks": checks})
    return Verdicts(lamps, unclaimed)

