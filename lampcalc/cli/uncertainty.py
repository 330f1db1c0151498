"""What ``--uncertainty`` adds to ``rate`` and ``check``: its options, the Monte Carlo run and its tables."""

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


def rate_with_model(batches, model, interpolation, nominal=None, sets=None, on_draws=None):
    """Rate the batches (as read) with the model's uncertainty; a progress bar on a terminal.

    ``nominal``: claimed nominal CCTs keyed by casefolded lamp name; ``sets``: (bin set, ellipse set).
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
    }
    if sys.stderr.isatty():
        label = f"Monte Carlo, {model.draws} draws a lamp"
        with click.progressbar(length=len(names), label=label, file=sys.stderr) as bar:
            return rate_with_uncertainty(batches, model, progress=bar.update, **options)
    return rate_with_uncertainty(batches, model, **options)


# Terminal column: (header, key, format); the interval of the key is shown.
_COLUMNS = (
    ("x", "x", ".4f"), ("y", "y", ".4f"), ("CCT K", "cct_K", ".0f"), ("Duv", "duv", "+.4f"), ("Ra", "ra", ".2f"),
    ("R9", ("ri", 8), ".2f"), ("Rf", "rf", ".2f"), ("Rg", "rg", ".2f"), ("LER lm/W", "ler_lm_per_W", ".1f"),
    ("lamp lm/W", "efficacy_lm_per_W", ".1f"),
)


def _interval(interval, spec, doubtful):
    if interval is None or any(v is None for v in interval):
        return "-"
    text = f"[{fmt(interval[0], spec)}, {fmt(interval[1], spec)}]"
    return f"({text})" if doubtful else text


def uncertainty_table(ratings):
    """The 95 % intervals of the main ratings, one row per lamp, and what they mean."""
    from ..rating.flags import doubtful_keys
    from .text_table import format_table

    model = ratings.extras["uncertainty"].model
    rows = []
    for r in ratings.records():
        doubt = doubtful_keys(r["flags"])
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
    return (
        f"Measurement uncertainty{where}: {model.describe()}\n{table}\n"
        "[low, high]: 95 % coverage interval over the Monte Carlo draws (JCGM 101:2008 7.7.2, probabilistically\n"
        "symmetric); the ratings above are those of the spectra as measured. Standard uncertainties: the <key>_u\n"
        f"fields of --json/--csv; with {model.draws} draws each is known to about {precision:.1f} % of itself."
    )


def _share(p):
    """A share of draws in %, rounded away from 0 % and 100 % unless it is exactly that."""
    if p is None:
        return "-"
    if p in (0.0, 1.0):
        return f"{100 * p:.0f} %"
    tenths = math.floor(1000 * p) if p > 0.5 else math.ceil(1000 * p)
    return f"{tenths / 10:.1f} %"


def decision_text(verdicts, rule):
    """Each claimed lamp's checks with the measured value's interval, the margin's uncertainty and the rule's outcome."""
    from ..verdicts.decision_rules import OUTCOMES
    from .printouts import CRITERIA
    from .text_table import format_table

    def number(value, spec, unit):
        return "-" if value is None or not math.isfinite(value) else f"{value:{spec}} {unit}".strip()

    blocks = [f"With measurement uncertainty; decision rule: {rule.describe()}"]
    seen = set()
    for lamp in verdicts.lamps:
        if lamp["lamp"] in verdicts.missing:
            continue  # no spectrum: said with the verdicts
        rows = []
        for c in lamp["checks"]:
            label, _, value_fmt, unit = CRITERIA[c["criterion"]]
            interval = c["measured_interval95"]
            shown = "-" if interval is None else "[" + ", ".join(value_fmt.format(v) for v in interval) + "]"
            rows.append([
                label, "-" if c["measured"] is None else value_fmt.format(c["measured"]), shown,
                number(c["margin"], "+.4g", unit), number(c["margin_u"], ".3g", unit), number(c["guard_band"], ".3g", unit),
                _share(c["conformance_probability"]), c["decision"] or "not decided",
            ])
            seen.add(c["decision"])
        table = format_table(
            ["claim", "measured", "95 % interval", "margin", "u(margin)", "guard band", "draws holding", "decision"],
            rows, "llrrrrrl",
        )
        blocks.append(f"{lamp['lamp']}: {lamp['decision'] or 'not decided'}\n" + "\n".join("  " + line for line in table.splitlines()))
    legend = [f"{o}: {rule.explain(o)}" for o in OUTCOMES if o in seen]
    if None in seen:
        legend.append("not decided: no measured value, or its uncertainty is unknown (a draw gave none)")
    legend.append("draws holding: share of the Monte Carlo draws in which the claim holds; guard band: w of the rule")
    legend.append("The exit status follows the verdicts above (simple comparison with the claim), not these decisions.")
    return "\n\n".join(blocks) + "\n" + "\n".join(legend)
