"""Supplier claims: reading a claims file and checking each claim against the ratings.

A claims file is a table (comma, semicolon or tab separated) with one row per lamp, matched
to the spectra by the ``lamp`` column (the lamp name, without regard to case); a blank cell
means no claim. Columns (``docs/claims.md``):

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
import difflib
import io
import json
import math
from dataclasses import dataclass, field

import numpy as np

from ..errors import InputError
from ..io.serialise import cell, plain
from ..standards.ansi_bins import DUV_TOLERANCE, FLEXIBLE_NOTE, ansi_bin_set, category, quadrangle_margin
from ..standards.bin_sets import margins
from ..standards.ellipse_sets import shipped_ellipse_set
from ..standards.steps import steps_from_nominal
from .wording import format_value

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


#: Lowest valid value of each claim column, and whether the bound itself is allowed. Indices
#: (Ra, R9, Rf) may be negative: "R9 at least -10" is a claim. Columns not listed have no bound.
_LOWEST = {
    "nominal_cct_K": (0.0, False),
    "max_sdcm_steps": (0.0, True),
    "min_rg": (0.0, True),
    "max_rg": (0.0, True),
    "min_ler_lm_per_W": (0.0, True),
    "electrical_W": (0.0, False),
    "min_efficacy_lm_per_W": (0.0, True),
}


@dataclass
class Claim:
    """The claims of one lamp, as read (None where the cell is blank)."""

    lamp: str
    line: int
    values: dict = field(default_factory=dict)


def _claims_rows(path):
    """The file's :class:`Where` and ``[(line number, cells), …]`` of its non-blank, non-comment lines."""
    from ..io.spectrum_checks import Where
    from ..io.text_cells import decode_text, split_cells

    where = Where(path)
    try:
        with open(path, "rb") as handle:
            raw = handle.read()
    except OSError as err:
        raise where(f"cannot be read ({err.strerror or err})") from None
    text = decode_text(raw, where)
    lines = [(n, line.strip()) for n, line in enumerate(text.splitlines(), start=1)]
    lines = [(n, line) for n, line in lines if line and not line.startswith("#")]
    if not lines:
        raise where("the claims file is empty")
    head = lines[0][1]
    delimiter = next((d for d in ("\t", ";") if d in head), ",")
    rows = []
    for number, line in lines:
        try:
            cells = split_cells(line, delimiter)
        except ValueError as err:
            raise where(f"cannot be split into cells ({err})", f"line {number}") from None
        if line.endswith(delimiter):
            cells.append("")  # split_cells drops a trailing empty cell; a claims row keeps it
        rows.append((number, cells))
    return where, rows


def _claim_value(column, text, where, place):
    from ..io.text_cells import parse_number, show

    try:
        value = parse_number(text, "," in text)
    except ValueError as err:
        raise where(f"{show(text)} {err}", place) from None
    lowest, allowed = _LOWEST.get(column, (-math.inf, True))
    if value < lowest or (value == lowest and not allowed):
        bound = f"{'at least' if allowed else 'above'} {lowest:g}"
        raise where(f"{show(text)} is not a valid {CLAIM_COLUMNS[column]}: it must be {bound}", place)
    return value


def read_claims(path):
    """Read a claims file: ``{lamp name: Claim}``.

    Comma-, semicolon- or tab-separated, UTF-8 or UTF-16, decimal commas where the separator
    allows them (or in quoted cells); column names are matched without regard to case.

    Raises
    ------
    InputError
        One line naming the file, the line and column: a missing ``lamp`` column, an unknown
        or repeated column, a ragged row, a cell that is not a valid number (of any size),
        a blank lamp name, a lamp claimed twice, and a file that claims nothing (a header and
        no rows, or rows with no claim: a truncated file must not look like a pass).
    """
    where, rows = _claims_rows(path)
    canonical = {c.lower(): c for c in CLAIM_COLUMNS}
    first_line, header = rows[0]
    while len(header) > 1 and header[-1] == "":
        header.pop()
    shown = ", ".join(h[:40] for h in header[:12])
    header = [canonical.get(h.strip().lower(), h.strip()) for h in header]
    if "lamp" not in header:
        raise where(f"no 'lamp' column (columns: {shown})", f"line {first_line}")
    unknown = [h for h in header if h not in CLAIM_COLUMNS]
    if unknown:
        raise where(f"unknown column {unknown[0][:40]!r}; the columns are {', '.join(CLAIM_COLUMNS)}", f"line {first_line}")
    twice = next((h for h in header if header.count(h) > 1), None)
    if twice:
        raise where(f"column {twice!r} appears twice", f"line {first_line}")
    claims = {}
    for number, row in rows[1:]:
        while len(row) > len(header) and row[-1] == "":
            row.pop()
        if len(row) != len(header):
            raise where(f"{len(row)} fields where the header has {len(header)}", f"line {number}")
        cells = dict(zip(header, row))
        lamp = cells.pop("lamp")
        if not lamp:
            raise where("the lamp name is blank", f"line {number}")
        key = lamp.casefold()
        if key in claims:
            raise where(f"lamp {lamp[:60]!r} is claimed twice (also line {claims[key].line})", f"line {number}")
        values = {
            column: _claim_value(column, text, where, f"line {number}, column {column!r}")
            for column, text in cells.items()
            if text
        }
        if "nominal_cct_K" in values:
            try:
                category(values["nominal_cct_K"])
            except InputError as err:
                raise where(str(err), f"line {number}, column 'nominal_cct_K'") from None
        claims[key] = Claim(lamp, number, values)
    if not claims:
        raise where("has a header but no lamps: nothing is claimed (a truncated file?)", f"line {first_line}")
    if not any(c.values for c in claims.values()):
        raise where("names lamps but claims nothing: every claim cell is blank (a truncated file?)")
    return {c.lamp: c for c in claims.values()}


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
            f"not evaluated: radiant flux {format_value('radiant_flux_W', radiant, unit=True)} exceeds the electrical "
            f"power {format_value('electrical_W', watts, unit=True)}, which is "
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


_CHECK_KEYS = ("criterion", "claimed", "measured", "margin", "pass", "note")


@dataclass
class Verdicts:
    """Results of checking a claims file against a batch's ratings."""

    lamps: list  # [{"lamp", "pass", "checks": [...]}] for claimed lamps, in ratings order, then claims without a spectrum
    unclaimed: list  # names of rated lamps with no claim
    missing: list = field(default_factory=list)  # lamps claimed that have no spectrum

    @property
    def all_hold(self):
        """True when every check of every claimed lamp passed (a check that cannot be decided does not)."""
        return all(lamp["pass"] for lamp in self.lamps)

    def summary(self):
        """The counts in one line, in the words of :mod:`lampcalc.verdicts.wording`."""
        from .wording import count_line

        return count_line(self)

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

    def table(self):
        """Header and rows of the verdicts, one row per check (numbers as floats, None when absent).

        Keys a layer on top added to the checks follow, an interval as two columns (``_low``, ``_high``).
        """
        extra = self._extra_keys()
        header = ["lamp", "criterion", "claimed", "measured", "margin", "pass", "note"]
        header += [c for k in extra for c in ((f"{k}_low", f"{k}_high") if k.endswith("_interval95") else (k,))]
        result = {True: "pass", False: "fail", None: "cannot check"}
        rows = [
            [lamp["lamp"], c["criterion"], *(None if c[k] is None else float(c[k]) for k in ("claimed", "measured", "margin")),
             result[c["pass"]], c["note"], *_extra_cells(c, extra)]
            for lamp in self.lamps
            for c in lamp["checks"]
        ]
        return header, rows

    def to_csv(self):
        buffer = io.StringIO()
        writer = csv.writer(buffer, lineterminator="\n")
        header, rows = self.table()
        writer.writerow(header)
        writer.writerows([cell(v) for v in row] for row in rows)
        return buffer.getvalue()


def _extra_cells(check, keys):
    """The cells of the extra keys of one check: plain values, an interval as its two ends."""
    values = [(key, plain(check.get(key))) for key in keys]
    return [c for key, v in values for c in ((v or [None, None]) if key.endswith("_interval95") else [v])]


def _suggestion(name, names):
    """ "; did you mean 'X'?" for the spectrum name closest to ``name``, or ""."""
    folded = {n.casefold(): n for n in names}
    close = difflib.get_close_matches(name.casefold(), list(folded), n=1, cutoff=0.6)
    return f"; did you mean {folded[close[0]]!r}?" if close else ""


def duplicate_names(ratings):
    """One line telling lamp names that more than one spectrum carries, or None."""
    where = {}
    for name, source in zip(ratings["name"], ratings["source"]):
        where.setdefault(name.casefold(), []).append((name, source))
    twice = [found for found in where.values() if len(found) > 1]
    if not twice:
        return None
    shown = "; ".join(f"{found[0][0]!r} ({', '.join(s for _, s in found[:3])})" for found in twice[:3])
    more = f"; and {len(twice) - 3} more" if len(twice) > 3 else ""
    return f"{len(twice)} lamp name(s) belong to more than one spectrum: {shown}{more}"


def check_claims(claims, ratings, claims_path="claims", **options):
    """Check every claim against the ratings.

    A claim names its lamp without regard to case. A claim whose lamp has no spectrum is
    kept as a lamp whose one check, ``spectrum``, cannot be decided (with the closest name
    suggested), and the other claims are still checked.

    Raises
    ------
    InputError
        When a claim matches more than one spectrum (the message names both sources).
    """
    names, sources = list(ratings["name"]), list(ratings["source"])
    index = {}
    for i, name in enumerate(names):
        index.setdefault(name.casefold(), []).append(i)
    matched, missing = {}, []
    for claim in claims.values():
        found = index.get(claim.lamp.casefold(), [])
        if len(found) > 1:
            raise InputError(
                f"{claims_path}, line {claim.line}: lamp {claim.lamp!r} matches more than one spectrum: "
                f"{sources[found[0]]} and {sources[found[1]]}; rename one of them"
            )
        if found:
            matched[found[0]] = claim
        else:
            missing.append(claim)
    lamps, unclaimed = [], []
    for i, name in enumerate(names):
        if i not in matched or not matched[i].values:
            unclaimed.append(name)
            continue
        checks = check_lamp(matched[i], ratings, i, **options)
        lamps.append({"lamp": name, "pass": all(c["pass"] is True for c in checks), "checks": checks})
    for claim in missing:
        note = f"line {claim.line}: no spectrum named {claim.lamp!r} among the files given{_suggestion(claim.lamp, names)}"
        lamps.append({"lamp": claim.lamp, "pass": False, "checks": [_check("spectrum", None, None, None, note)]})
    return Verdicts(lamps, unclaimed, [c.lamp for c in missing])
