"""What ``lampcalc lot`` shows: the lot's colour, its ratings' statistics, colour over angle, lot claims."""

from ..rating.flags import explain_with_option
from ..standards.ansi_bins import ansi_bin_set
from ..verdicts.lot import DOUBT_SOURCE, LOT_RATINGS
from ..verdicts.lot_wording import RATING_WORDS, limit_line, word_lot_checks
from ..verdicts.wording import QUALIFIED, lamp_line
from .common import flagged, fmt
from .text_table import format_table

#: Rating -> (label, unit, format) in the lot's and the comparison's tables.
RATING_LABELS = {
    "x": ("x", "", ".5f"),
    "y": ("y", "", ".5f"),
    "u_prime": ("u'", "", ".5f"),
    "v_prime": ("v'", "", ".5f"),
    "cct_K": ("CCT", "K", ".0f"),
    "duv": ("Duv", "", "+.4f"),
    "peak_nm": ("peak", "nm", ".0f"),
    "ra": ("Ra", "", ".1f"),
    "r9": ("R9", "", ".1f"),
    "rf": ("Rf", "", ".1f"),
    "rg": ("Rg", "", ".1f"),
    "ler_lm_per_W": ("LER", "lm/W", ".1f"),
    "luminous_flux_lm": ("luminous flux", "lm", ".1f"),
    "radiant_flux_W": ("radiant flux", "W", ".4g"),
    "illuminance_lx": ("illuminance", "lx", ".1f"),
    "luminance_cd_per_m2": ("luminance", "cd/m2", ".1f"),
    "efficacy_lm_per_W": ("lamp efficacy", "lm/W", ".1f"),
    "sp_ratio": ("S/P", "", ".2f"),
    "melanopic_der": ("mel-DER", "", ".3f"),
    "melanopic_edi_lx": ("mel-EDI", "lx", ".1f"),
    "sdcm_steps": ("steps from centre", "steps", ".2f"),
}


def is_doubtful(key, doubt):
    """Whether a rating is doubtful, given the set of doubtful output keys (R9 follows ``ri``)."""
    return DOUBT_SOURCE.get(key, key) in doubt


def flag_lines(flags, lot=None):
    """One line per flag with its words (and, for a lot, the ratings a flag concerns)."""
    lists = {"lot_doubtful_values": "doubtful_ratings", "lot_partial_values": "partial_ratings"}
    lines = []
    for flag in flags:
        named = lot[lists[flag]] if lot is not None and flag in lists else ()
        which = f" ({', '.join(RATING_WORDS.get(r, r) for r in named)})" if named else ""
        lines.append(f"  {flag}: {explain_with_option(flag)}{which}")
    return "\n".join(lines)


def lot_text(lot, over_angle=False):
    """The lot's colour: mean point, centre and steps, ellipse, pairwise distance, ANSI categories."""
    s = lot
    names = s["samples"]["name"]
    span = f"{names[0]} … {names[-1]}" if len(names) > 1 else names[0]
    if over_angle:
        head = f"{s['n_samples']} spectra of one source over angle, summarised as a lot ({span})"
    else:
        head = f"Lot of {s['n_samples']} sample{'s' if s['n_samples'] > 1 else ''} ({span})"
    lines = [head]
    rows = [
        ["mean point", f"x {fmt(s['mean_x'], '.5f')}, y {fmt(s['mean_y'], '.5f')};  u' {fmt(s['mean_u_prime'], '.5f')}, "
         f"v' {fmt(s['mean_v_prime'], '.5f')} (means of the samples');  CCT {fmt(s['mean_point_cct_K'], '.0f')} K, "
         f"Duv {fmt(s['mean_point_duv'], '+.4f')}"],
    ]
    if s["steps_centre_chosen"] != "none":
        method = s["steps_set"] + ("" if s["steps_metric_confirmed"] else " (not confirmed, see docs/claims.md)")
        rows.append(["centre", f"{s['steps_centre_nominal_cct_K']:g} K ({s['steps_centre_chosen']}), "
                     f"{s['steps_centre'].upper()} centre x {s['steps_centre_x']:.5f}, y {s['steps_centre_y']:.5f}; {method}"])
        doubt = "sdcm_steps" in s["doubtful_ratings"]  # shares counted with a doubtful metric, as in the report
        shares = "  ".join(f"{k}: " + ("({} %)" if doubt else "{} %").format(fmt(s[f"within_{k}_steps_percent"], ".0f"))
                           for k in range(1, 8))
        rows.append(["within n steps", shares])
    rows.append(["95 % ellipse", _ellipse_text(s)])
    if s["n_samples"] >= 2:
        a, b = s["max_pairwise_samples"]
        rows.append(["largest Δu'v'", f"{s['max_pairwise_delta_uv_prime']:.5f} between {a} and {b}; "
                     f"{s['max_delta_uv_prime_from_mean']:.5f} from the mean point"])
    bins = [f"{b:g} K: {c}" for b, c in zip(s["ansi_bins_nominal_cct_K"], s["ansi_bins_count"])]
    if s["ansi_bins_none_count"]:
        bins.append(f"none: {s['ansi_bins_none_count']}")
    rows.append(["ANSI categories", ", ".join(bins) + " (ANSI C78.377-2017)"])
    if s["bin_set"] != ansi_bin_set().name:  # a user's bin set
        held = [f"{b}: {c}" for b, c in zip(s["bins_name"], s["bins_count"])]
        held += [f"none: {s['bins_none_count']}"] if s["bins_none_count"] else []
        rows.append(["bins", f"{', '.join(held)} ({s['bin_set']})"])
    width = max(len(r[0]) for r in rows)
    lines += [f"  {label.ljust(width)}  {text}" for label, text in rows]
    if s["flags"]:
        lines.append("flags:\n" + flag_lines(s["flags"], s))
    return "\n".join(lines)


def _ellipse_text(s):
    if s["n_samples"] < 3:
        return "- (needs 3 samples or more)"
    text = (f"semi-axes {s['ellipse_semi_major_xy']:.5f} and {s['ellipse_semi_minor_xy']:.5f} in x, y, "
            f"major axis at {s['ellipse_angle_deg']:.0f}°")
    if s["steps_centre_chosen"] != "none":
        text += (f"; {s['ellipse_min_steps_from_mean']:.2f}-{s['ellipse_max_steps_from_mean']:.2f} steps from the mean, "
                 f"reaches {s['ellipse_max_steps_from_centre']:.2f} steps from the centre")
    return text


def statistics_table(lot):
    """One row per rating with values: n, mean, sd, min, 5th and 95th percentile, max."""
    rows = []
    for key in LOT_RATINGS:
        label, unit, spec = RATING_LABELS[key]
        if not lot[f"{key}_n"]:
            continue
        doubt = key in lot["doubtful_ratings"]
        sd_spec = spec.replace("+", "")
        rows.append([label, unit, str(lot[f"{key}_n"]), flagged(lot[f"{key}_mean"], spec, doubt),
                     flagged(lot[f"{key}_sd"], sd_spec, doubt),
                     *(flagged(lot[f"{key}_{stat}"], spec, doubt) for stat in ("min", "p05", "p95", "max"))])
    table = format_table(["rating", "unit", "n", "mean", "sd", "min", "p05", "p95", "max"], rows, "llrrrrrrr")
    return table + (
        "\nsd: sample standard deviation (n - 1); p05, p95: 5th and 95th percentiles (linear between samples);"
        "\n(values): include samples outside the method's validity."
    )


def angle_text(angles):
    """Colour over angle: one row per angle, then the largest Δu'v' and the verdict."""
    a = angles
    t = a["angles"]
    from ..plots.angles import WEIGHTING_WORDS

    w = a["angle_weighting"]
    weighting = "unweighted (relative spectra)" if w == "none" else WEIGHTING_WORDS.get(w, f"weighted by {w}")
    rows = [[fmt(t["angle_deg"][k], "g"), t["name"][k], fmt(t["u_prime"][k], ".5f"), fmt(t["v_prime"][k], ".5f"),
             fmt(t["cct_K"][k], ".0f"), fmt(t["duv"][k], "+.4f"), fmt(t["delta_uv_prime"][k], ".5f")]
            for k in range(len(t["name"]))]
    head = (f"Colour over angle: {a['n_angles']} spectra, {a['angle_min_deg']:g}-{a['angle_max_deg']:g}°; "
            f"mean point u' {a['angle_mean_u_prime']:.5f}, v' {a['angle_mean_v_prime']:.5f}, {weighting}")
    table = format_table(["angle °", "spectrum", "u'", "v'", "CCT K", "Duv", "Δu'v' from mean"], rows, "rlrrrrr")
    last = "largest Δu'v' from the mean point: " + limit_line(
        a["max_delta_uv_prime_over_angle"], a["limit_delta_uv_prime"], a["angle_pass"],
        where=f"at {a['angle_of_max_delta_uv_prime_deg']:g}°")
    return "\n".join([head, table, last])


def lot_claims_text(verdicts):
    """The lot claims' verdicts in the shared words: one row per claim, with the supplier's words; what qualifies a verdict once, below."""
    words, notes = word_lot_checks(verdicts)
    rows = [[c["text"] or "-", w.claim, w.measured, w.margin, w.verdict_text, w.why] for c, w in zip(verdicts.checks, words)]
    head = "Lot claims" + (f" of {verdicts.product}" if verdicts.product else "")
    table = format_table(["the supplier says", "claim", "measured", "margin", "verdict", "why"], rows, "llrrll")
    lines = [f"{head}: the lot {lamp_line({'checks': verdicts.checks})}", table, verdicts.summary()]
    lines += [f"{QUALIFIED} qualified: {text}." for text in notes]
    return "\n".join(lines)
