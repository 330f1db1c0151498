"""What ``lampcalc compare`` shows: the colour shift of each pair, and every rating of one pair."""

from ..rating.flags import doubtful_keys
from ..verdicts.lot_wording import limit_line
from ..verdicts.wording import VERDICT_WORDS
from .common import flagged, fmt
from .lot_printouts import RATING_LABELS, flag_lines, is_doubtful
from .text_table import format_table

#: Ratings in the detailed table of one pair, in order (labels from :data:`RATING_LABELS`).
DETAIL_KEYS = ("x", "y", "u_prime", "v_prime", "cct_K", "duv", "peak_nm", "ra", "r9", "rf", "rg", "ler_lm_per_W",
               "luminous_flux_lm", "illuminance_lx", "luminance_cd_per_m2", "efficacy_lm_per_W", "sp_ratio",
               "melanopic_der", "melanopic_edi_lx")


def pairs_table(comparison):
    """One row per pair: Δu'v', ΔCCT, ΔDuv, ΔRa, ΔR9, ΔRf, ΔRg, luminous ratio, and the verdict against the limit."""
    p = comparison["pairs"]
    limit = p["limit_delta_uv_prime"][0] if len(p["test_name"]) else float("nan")
    given = limit == limit
    rows = []
    for k in range(len(p["test_name"])):
        doubt = doubtful_keys(p["reference_flags"][k]) | doubtful_keys(p["test_flags"][k])
        rows.append([
            p["reference_name"][k], p["test_name"][k], fmt(p["delta_uv_prime"][k], ".5f"),
            fmt(p["delta_cct_K"][k], "+.0f"), fmt(p["delta_duv"][k], "+.4f"),
            *(flagged(p[f"delta_{key}"][k], "+.1f", is_doubtful(key, doubt)) for key in ("ra", "r9", "rf", "rg")),
            fmt(p["luminous_ratio"][k], ".3f"), *([VERDICT_WORDS[p["pass"][k]]] if given else []),
        ])
    headers = ["reference", "test", "Δu'v'", "ΔCCT K", "ΔDuv", "ΔRa", "ΔR9", "ΔRf", "ΔRg", "luminous ratio"]
    lines = [format_table(headers + (["verdict"] if given else []), rows, "llrrrrrrrrl")]
    if given:
        lines.append(f"verdict: Δu'v' against your limit {limit:g}")
    else:
        lines.append(f"no limit given (--limit-delta-uv-prime), so {VERDICT_WORDS[None]}")
    lines.append("Δ: test - reference; luminous ratio: test / reference luminous quantity (absolute spectra in the "
                 "same quantity); (values): outside the method's validity.")
    for side in ("reference", "test"):
        lone = comparison[f"unmatched_{side}"]
        if lone:
            lines.append(f"no partner among the other spectra for these {side} lamps: {', '.join(lone)}")
    return "\n".join(lines)


def pair_detail(comparison, k=0):
    """Every compared rating of pair ``k``: reference, test and difference, with the flags in words."""
    p = comparison["pairs"]
    doubt = doubtful_keys(p["reference_flags"][k]) | doubtful_keys(p["test_flags"][k])
    rows = []
    for key in DETAIL_KEYS:
        label, unit, spec = RATING_LABELS[key]
        ref, test = p[f"reference_{key}"][k], p[f"test_{key}"][k]
        if ref != ref and test != test:  # NaN on both sides: not a rating of these spectra
            continue
        bad = is_doubtful(key, doubt)
        delta_spec = spec if spec.startswith("+") else "+" + spec
        rows.append([label, unit, flagged(ref, spec, bad), flagged(test, spec, bad), flagged(p[f"delta_{key}"][k], delta_spec, bad)])
    limit = p["limit_delta_uv_prime"][k]
    shift = limit_line(p["delta_uv_prime"][k], limit if limit == limit else None, p["pass"][k])
    head = f"{p['reference_name'][k]} (reference) and {p['test_name'][k]} (test): Δu'v' {shift}"
    lines = [head, format_table(["rating", "unit", "reference", "test", "difference"], rows, "llrrr")]
    for side, flags in (("reference", p["reference_flags"][k]), ("test", p["test_flags"][k]), ("pair", p["flags"][k])):
        if flags:
            lines.append(f"{side} flags:\n" + flag_lines(flags))
    return "\n".join(lines)
