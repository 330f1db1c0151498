"""What ``--uncertainty`` adds to ``rate``, ``check``, ``compare`` and ``lot``: its options, the Monte Carlo run, its tables."""

import math
import sys

import click

from .common import Failure, fmt


def uncertainty_option(fn):
    """``--uncertainty MODEL.toml``."""
    return click.option(
        "--uncertainty", "uncertainty", type=click.Path(exists=True, dir_okay=False), default=None, metavar="MODEL.toml",
        help="Measurement model of the spectra (TOML, docs/uncertainty.md): every rating gets its standard "
        "uncertainty and 95 % interval by Monte Carlo.",
    )(fn)


def decision_options(fn):
    """``--decision-rule`` and ``--guard-band-k`` (with ``--uncertainty``)."""
    fn = click.option(
        "--guard-band-k", type=click.FloatRange(min=0), default=None, metavar="K",
        help="Guarded acceptance: the guard band is K times the margin's standard uncertainty (default 2).",
    )(fn)
    return click.option(
        "--decision-rule", type=click.Choice(["simple", "guarded"]), default=None,
        help="With --uncertainty: ILAC-G8 simple acceptance (default) or guarded acceptance with a guard band.",
    )(fn)


def load_model(path):
    """The measurement model of ``--uncertainty``, or None."""
    from ..rating.measurement_model import read_measurement_model

    return None if path is None else read_measurement_model(path)


def rule_from_options(uncertainty, name, k):
    """The DecisionRule of the options; a Failure when they are given without ``--uncertainty`` or do not fit."""
    from ..verdicts.decision_rules import DecisionRule

    if uncertainty is None:
        if name or k is not None:
            raise Failure("--decision-rule and --guard-band-k need --uncertainty MODEL.toml (the measurement model)")
        return None
    if k is not None and name != "guarded":
        raise Failure("--guard-band-k applies to --decision-rule guarded")
    return DecisionRule(name or "simple", 2.0 if k is None else k)


def rate_with_model(batches, model, interpolation, nominal=None, sets=None, on_draws=None, **kept):
    """Rate the batches (as read) with the model's uncertainty; a progress bar on a terminal.

    ``nominal``: claimed nominal CCTs keyed by casefolded lamp name; ``sets``: (bin set, ellipse set);
    ``kept``: ``keep`` and ``stream`` of rate_with_uncertainty.
    """
    from ..rating.uncertainty import rate_with_uncertainty

    names = [name for b in batches for name in b.names]
    bin_set, ellipse_set = sets or (None, None)
    options = {
        "interpolation": interpolation,
        "nominal_cct_K": None if nominal is None else [nominal.get(name.casefold(), math.nan) for name in names],
        "bin_set": bin_set,
        "ellipse_set": ellipse_set,
        "on_draws": on_draws,
        **kept,
    }
    if sys.stderr.isatty():
        label = f"Monte Carlo, {model.draws} draws a lamp"
        with click.progressbar(length=len(names), label=label, file=sys.stderr) as bar:
            return rate_with_uncertainty(batches, model, progress=bar.update, **options)
    return rate_with_uncertainty(batches, model, **options)


# Terminal column: (header, key, format); the interval of the key is shown.
_COLUMNS = (
    ("x", "x", ".4f"), ("y", "y", ".4f"), ("CCT K", "cct_K", ".0f"), ("Duv", "duv", "+.4f"), ("Ra", "ra", ".1f"),
    ("R9", ("ri", 8), ".1f"), ("Rf", "rf", ".1f"), ("Rg", "rg", ".1f"), ("LER lm/W", "ler_lm_per_W", ".1f"),
    ("lamp lm/W", "efficacy_lm_per_W", ".1f"),
)


def _interval(interval, spec, doubtful):
    if interval is None or any(v is None for v in interval):
        return "-"
    text = f"[{fmt(interval[0], spec)}, {fmt(interval[1], spec)}]"
    return f"({text})" if doubtful else text


def uncertainty_table(ratings):
    """The 95 % intervals of the main ratings, one row per lamp, and what they mean."""
    from ..rating.flags import doubtful_interval_keys, draw_flag_lines
    from .text_table import format_table

    model = ratings.extras["uncertainty"].model
    rows = []
    for r in ratings.records():
        doubt = doubtful_interval_keys(r["flags"], r["uncertainty_flags_in_draws"])
        row = [r["name"]]
        for _, key, spec in _COLUMNS:
            column, index = key if isinstance(key, tuple) else (key, None)
            interval = r[f"{column}_interval95"]
            if index is not None and interval:
                interval = interval[index]
            row.append(_interval(interval, spec, column in doubt))
        rows.append(row)
    headers = ["lamp", *(h for h, _, _ in _COLUMNS)]
    keep = [j for j in range(len(headers)) if j == 0 or any(row[j] != "-" for row in rows)]
    table = format_table([headers[j] for j in keep], [[row[j] for j in keep] for row in rows], "l" + "r" * (len(keep) - 1))
    where = f" ({model.source})" if model.source else ""
    precision = 100.0 / math.sqrt(2.0 * (model.draws - 1))
    crossed = [f"{r['name']}: {line}" for r in ratings.records() for line in draw_flag_lines(r["uncertainty_flags_in_draws"])]
    if crossed:
        table += "\n(interval): in doubt, in part of the draws or all (see the flags):\n" + "\n".join("  " + c for c in crossed)
    return (
        f"Measurement uncertainty{where}: {model.describe()}\n{table}\n"
        "[low, high]: 95 % coverage interval over the Monte Carlo draws (JCGM 101:2008 7.7.2, probabilistically\n"
        "symmetric); the ratings above are those of the spectra as measured. Standard uncertainties: the <key>_u\n"
        f"fields of --json/--csv; with {model.draws} draws each is known to about {precision:.1f} % of itself."
    )


def decision_text(verdicts, rule, ratings=None):
    """Each claimed lamp's checks with the measured value's interval, the margin's uncertainty and the rule's outcome.

    The claims, values and margins read as in the verdict table (lampcalc.verdicts.wording); ``ratings``
    gives the flags that put values and intervals in parentheses.
    """
    from ..verdicts.decision_rules import OUTCOMES
    from ..verdicts.decision_wording import NOT_DECIDED, word_decisions
    from ..verdicts.wording import pair_verdicts
    from .text_table import format_table

    records = ratings.records() if ratings is not None else []
    flags = {id(lamp): (r["flags"], r.get("uncertainty_flags_in_draws")) for r, lamp in
             zip(records, pair_verdicts([r["name"] for r in records], verdicts)) if lamp is not None}
    blocks = [f"With measurement uncertainty; decision rule: {rule.describe()}"]
    seen = set()
    for lamp in verdicts.lamps:
        if lamp["lamp"] in verdicts.missing:
            continue  # no spectrum: said with the verdicts
        words = word_decisions(lamp, *flags.get(id(lamp), ((), ())))
        rows = [[w.claim, w.measured, w.interval, w.margin, w.margin_u, w.guard_band, w.holding, w.decision] for w in words]
        seen.update(w.outcome for w in words)
        table = format_table(
            ["claim", "measured", "95 % interval", "margin", "u(margin)", "guard band", "draws holding", "decision"],
            rows, "lrrrrrrl",
        )
        blocks.append(f"{lamp['lamp']}: {lamp['decision'] or NOT_DECIDED}\n" + "\n".join("  " + line for line in table.splitlines()))
    legend = [f"{o}: {rule.explain(o)}" for o in OUTCOMES if o in seen]
    if None in seen:
        legend.append(f"{NOT_DECIDED}: no measured value, or its uncertainty is unknown (a draw gave none)")
    legend.append("draws holding: share of the Monte Carlo draws in which the claim holds; guard band: w of the rule; "
                  "(interval): in doubt, see the flags")
    legend.append("The exit status follows the verdicts above (simple comparison with the claim), not these decisions.")
    return "\n\n".join(blocks) + "\n" + "\n".join(legend)


#: The differences of the comparison's uncertainty table: (label, output key of the difference, key of its digits).
_DIFFERENCES = (
    ("Δu'v'", "delta_uv_prime", "u_prime"), ("ΔCCT K", "delta_cct_K", "cct_K"), ("ΔDuv", "delta_duv", "duv"),
    ("ΔRa", "delta_ra", "ra"), ("ΔR9", "delta_r9", "ri"), ("ΔRf", "delta_rf", "rf"), ("ΔRg", "delta_rg", "rg"),
    ("ΔLER lm/W", "delta_ler_lm_per_W", "ler_lm_per_W"),
)


def comparison_text(comparison, model):
    """Each pair's differences with u and 95 % interval, and the decision against the limit."""
    from ..verdicts.wording import format_share, format_uncertainty, format_value
    from .text_table import format_table

    from ..rating.flags import doubtful_keys

    p = comparison["pairs"]
    decided = "decision" in p
    blocks = [f"With measurement uncertainty ({model.describe()}); reference and test drawn independently"]
    for k in range(len(p["test_name"])):
        rows = []
        doubt = doubtful_keys(p["reference_flags"][k]) | doubtful_keys(p["test_flags"][k])
        for label, key, digits in _DIFFERENCES:
            if not math.isfinite(p[key][k]):
                continue
            decimals = 5 if digits == "u_prime" else None
            low, high = p[f"{key}_interval95"][k]
            shown = [format_value(digits, v, decimals=decimals, signed=key != "delta_uv_prime") for v in (p[key][k], low, high)]
            row = [shown[0], format_uncertainty(p[f"{key}_u"][k]), f"[{shown[1]}, {shown[2]}]"]
            rows.append([label, *(f"({text})" if digits in doubt else text for text in row)])
        table = format_table(["difference", "measured", "u", "95 % interval"], rows, "lrrr")
        lines = [f"{p['reference_name'][k]} -> {p['test_name'][k]}", *("  " + line for line in table.splitlines())]
        if decided:
            lines.append(
                f"  limit {p['limit_delta_uv_prime'][k]:g}: margin {format_value('u_prime', p['margin_delta_uv_prime'][k], decimals=5, signed=True)}, "
                f"u(margin) {format_uncertainty(p['margin_delta_uv_prime_u'][k])}, guard band "
                f"{format_uncertainty(p['guard_band'][k])}, draws holding {format_share(float(p['conformance_probability'][k]))}: "
                f"{p['decision'][k] or 'not decided'} ({p['decision_rule'][k]})"
            )
        blocks.append("\n".join(lines))
    blocks.append(
        "Δ: test - reference; u and the 95 % interval over the Monte Carlo draws (JCGM 101:2008). Δu'v' is a distance:\n"
        "near zero its draws lie above the measured value. Effects both measurements share (one calibration) would\n"
        "cancel in the differences; drawn independently they count twice. (values): outside the method's validity\n"
        "for one side. The result above follows the measured values, not the decision."
    )
    return "\n\n".join(blocks)


#: Rows of the lot's colour in the uncertainty table: (label, key, digits key, decimals).
_LOT_COLOUR = (
    ("mean x", "mean_x", "x", 5), ("mean y", "mean_y", "y", 5), ("mean u'", "mean_u_prime", "u_prime", 5),
    ("mean v'", "mean_v_prime", "v_prime", 5), ("CCT of the mean point K", "mean_point_cct_K", "cct_K", None),
    ("Duv of the mean point", "mean_point_duv", "duv", None),
    *((f"within {k} steps %", f"within_{k}_steps_percent", "chroma_shift_hue_bins_percent", 1) for k in range(1, 8)),
    ("ellipse semi-major (x, y)", "ellipse_semi_major_xy", "x", 5), ("ellipse semi-minor (x, y)", "ellipse_semi_minor_xy", "x", 5),
    ("largest Δu'v' between samples", "max_pairwise_delta_uv_prime", "u_prime", 5),
    ("largest Δu'v' from the mean", "max_delta_uv_prime_from_mean", "u_prime", 5),
)


def lot_uncertainty_text(lot):
    """The lot's statistics with the uncertainty the measurement adds: the ratings' mean, sd, min, max, then its colour."""
    from ..verdicts.lot import LOT_RATINGS
    from ..verdicts.wording import format_uncertainty, format_value
    from .lot_printouts import RATING_LABELS
    from .text_table import format_table

    def shown(key, digits, decimals):
        if lot.get(f"{key}_u") is None or not math.isfinite(lot[f"{key}_u"]):
            return None
        low, high = lot[f"{key}_interval95"]
        signed = False if key.endswith("_sd") else None  # a spread has no sign
        value, low, high = (format_value(digits, v, decimals=decimals, signed=signed) for v in (lot[key], low, high))
        return [value, format_uncertainty(lot[f"{key}_u"]), f"[{low}, {high}]"]

    rows = []
    for key in LOT_RATINGS:
        label, unit, spec = RATING_LABELS[key]
        decimals = int(spec.lstrip("+.")[0]) if spec.lstrip("+").startswith(".") and spec.endswith("f") else None
        stats = [shown(f"{key}_{s}", key, decimals) for s in ("mean", "sd", "min", "max")]
        if any(stats):
            rows.append([label, unit, *(cell for stat in stats for cell in (stat or ["-", "-", "-"])[:2])])
    table = format_table(["rating", "unit", "mean", "u", "sd", "u", "min", "u", "max", "u"], rows, "llrrrrrrrr")
    colour = [[label, *found] for label, key, digits, decimals in _LOT_COLOUR if (found := shown(key, digits, decimals))]
    colour_table = format_table(["lot's colour", "value", "u", "95 % interval"], colour, "lrrr")
    return (
        f"Uncertainty the measurement adds to the lot's statistics ({lot['measurement_model']}):\n{table}\n\n"
        f"{colour_table}\n"
        "u: standard uncertainty over the Monte Carlo draws of every sample (JCGM 101:2008); the 95 % intervals of\n"
        "all the statistics are in --json/--csv. Each sample is drawn independently: effects common to the whole lot\n"
        "(one calibration) are understated in the means. This is how far the statistics of these samples could move\n"
        "through the measurement, not the lot's sampling uncertainty (how far another delivery may lie)."
    )
