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
from ..io.serialise import cell, plain
from ..standards.ansi_bins import DUV_TOLERANCE, category, quadrangle_margin
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


def check_lamp(claim, ratings, i, sdcm_method="ellipse", sdcm_centre="ansi"):
    """All checks of one lamp's claims against row ``i`` of ``ratings``: a list of dicts."""
    r = {k: plain(ratings[k][i]) for k in ratings.columns}
    v = claim.values
    checks = []
    flags = set(r["flags"])
    if "nominal_cct_K" in v:
        cat = category(v["nominal_cct_K"])
        xy = np.array([r["x"], r["y"]])
        cct, duv = r["cct_K"], r["duv"]
        checks.append(
            _check(
                "ansi_quadrangle",
                cat.nominal_cct_K,
                cct,
                float(quadrangle_margin(xy, cat.nominal_cct_K)) * 1e3,
                cat.label(),
            )
        )
        cct_margin = None if cct is None else cat.cct_tolerance_K - abs(cct - cat.target_cct_K)
        duv_margin = None if duv is None else DUV_TOLERANCE - abs(duv - cat.target_duv)
        checks.append(
            _check("ansi_cct_K", cat.target_cct_K, cct, cct_margin, f"target {cat.target_cct_K:g} ± {cat.cct_tolerance_K:g} K")
        )
        checks.append(_check("ansi_duv", cat.target_duv, duv, duv_margin, f"target {cat.target_duv:+.4f} ± {DUV_TOLERANCE}"))
    if "max_sdcm_steps" in v:
        if "nominal_cct_K" not in v:
            checks.append(_check("sdcm_steps", v["max_sdcm_steps"], None, None, "needs nominal_cct_K for the centre"))
        else:
            steps, outside = steps_from_nominal([[r["x"], r["y"]]], [v["nominal_cct_K"]], sdcm_method, sdcm_centre)
            note = f"{sdcm_method} steps from the {sdcm_centre.upper()} centre of {v['nominal_cct_K']:g} K"
            if outside[0]:
                note += "; metric of the nearest IEC 60081 centre"
            checks.append(_check("sdcm_steps", v["max_sdcm_steps"], float(steps[0]), v["max_sdcm_steps"] - float(steps[0]), note))
    cri_note = "outside CIE 13.3 validity (DC > 5.4e-3)" if "cri_outside_validity" in flags else ""
    r9 = r["ri"][8] if r["ri"] else None
    for key, measured, criterion, note in (
        ("min_ra", r["ra"], "ra", cri_note),
        ("min_r9", r9, "r9", cri_note),
        ("min_rf", r["rf"], "rf", ""),
        ("min_rg", r["rg"], "rg_min", ""),
        ("min_ler_lm_per_W", r["ler_lm_per_W"], "ler_lm_per_W", "luminous efficacy of the radiation"),
    ):
        if key in v:
            margin = None if measured is None else measured - v[key]
            checks.append(_check(criterion, v[key], measured, margin, note or ("not computable" if measured is None else "")))
    if "max_rg" in v:
        margin = None if r["rg"] is None else v["max_rg"] - r["rg"]
        checks.append(_check("rg_max", v["max_rg"], r["rg"], margin))
    if "min_efficacy_lm_per_W" in v:
        watts = v.get("electrical_W", r["electrical_W"])
        flux = r["luminous_flux_lm"]
        if flux is None:
            checks.append(
                _check("efficacy_lm_per_W", v["min_efficacy_lm_per_W"], None, None, "cannot be checked: the spectrum is not in W/nm")
            )
        elif not watts:
            checks.append(_check("efficacy_lm_per_W", v["min_efficacy_lm_per_W"], None, None, "cannot be checked: no electrical power"))
        else:
            efficacy = flux / watts
            checks.append(
                _check(
                    "efficacy_lm_per_W",
                    v["min_efficacy_lm_per_W"],
                    efficacy,
                    efficacy - v["min_efficacy_lm_per_W"],
                    f"{flux:.1f} lm / {watts:g} W",
                )
            )
    return checks


_CHECK_KEYS = ("criterion", "claimed", "measured", "margin", "pass", "note")


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

    def _extra_keys(self):
        """Keys a layer on top (the measurement uncertainty) added to the checks, in order."""
        keys = [k for lamp in self.lamps for c in lamp["checks"] for k in c if k not in _CHECK_KEYS]
        return list(dict.fromkeys(keys))

    def to_json(self):
        keys = _CHECK_KEYS + tuple(self._extra_keys())
        out = [
            {
                "lamp": lamp["lamp"],
                "pass": lamp["pass"],
                **({"decision": lamp["decision"]} if "decision" in lamp else {}),
                "checks": [{k: plain(c.get(k)) for k in keys} for c in lamp["checks"]],
            }
            for lamp in self.lamps
        ]
        return json.dumps(out, indent=1, allow_nan=False) + "\n"

    def to_csv(self):
        extra = self._extra_keys()
        buffer = io.StringIO()
        writer = csv.writer(buffer, lineterminator="\n")
        writer.writerow(["lamp", "criterion", "claimed", "measured", "margin", "pass", "note", *extra])
        for lamp in self.lamps:
            for c in lamp["checks"]:
                writer.writerow(
                    [lamp["lamp"], c["criterion"], *("" if c[k] is None else repr(float(c[k])) for k in ("claimed", "measured", "margin")),
                     {True: "pass", False: "fail", None: "cannot check"}[c["pass"]], c["note"],
                     *(cell(plain(c.get(k))) for k in extra)]
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

