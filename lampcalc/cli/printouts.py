"""The tables the commands print: ratings and claim verdicts, with their notes."""

from ..rating.flags import doubtful_keys, explain_with_option
from .common import flagged, fmt


def _rating_rows(ratings):
    rows = []
    for r in ratings.records():
        doubt = doubtful_keys(r["flags"])
        r9 = r["ri"][8] if r["ri"] else None
        rows.append(
            [
                r["name"],
                flagged(r["cct_K"], ".0f", "cct_K" in doubt),
                fmt(r["duv"], "+.4f"),
                flagged(r["ansi_nominal_cct_K"], ".0f", "ansi_nominal_cct_K" in doubt),
                flagged(r["sdcm_steps"], ".1f", "sdcm_steps" in doubt),
                flagged(r["ra"], ".1f", "ra" in doubt),
                flagged(r9, ".1f", "ri" in doubt),
                flagged(r["rf"], ".1f", "rf" in doubt),
                flagged(r["rg"], ".1f", "rg" in doubt),
                flagged(r["ler_lm_per_W"], ".1f", "ler_lm_per_W" in doubt),
                fmt(r["efficacy_lm_per_W"], ".1f"),
                fmt(r["sp_ratio"], ".2f"),
                fmt(r["melanopic_der"], ".3f"),
                ", ".join(r["flags"]) or "-",
            ]
        )
    return rows


def rating_table(ratings, last=None, total=None):
    """The ratings table; with ``last``, the first lamps, a row '…' and the last lamps of ``total``."""
    from .text_table import format_table

    rows = _rating_rows(ratings)
    if last is not None:
        rows += [["…"] + [""] * 13] + _rating_rows(last)
    headers = ["lamp", "CCT K", "Duv", "ANSI", "steps", "Ra", "R9", "Rf", "Rg", "LER lm/W", "lamp lm/W", "S/P", "mel-DER", "flags"]
    table = format_table(headers, rows, "lrrrrrrrrrrrrl")
    if last is not None:
        table += f"\n(the first {len(ratings)} and the last {len(last)} of {total:,} lamps are shown)"
    return table


TABLE_NOTES = (
    "ANSI: the ANSI C78.377-2017 nominal CCT category the lamp is in; steps: colour-consistency steps (with the\n"
    "ellipse set named in the output files) from the centre of the claimed nominal CCT, else of the nearest\n"
    "category. LER: efficacy of the radiation over the measured part of 360-830 nm; lamp lm/W: lamp efficacy\n"
    "(needs W/nm and the electrical power). Ra, R9: CIE 13.3-1995, unrounded. Rf, Rg: CIE 224:2017 /\n"
    "ANSI/IES TM-30-18. (values): computed outside the method's validity or with values not confirmed from a\n"
    "published source (see the flags); '-': not computable."
)


def echo_ratings(tally, outputs=()):
    """Print the ratings of a run (:class:`~lampcalc.rating.tally.RunTally`): the table, its notes, the flags' words.

    A run of more than :data:`~lampcalc.rating.tally.SHOWN` lamps shows its first and last
    lamps, and the number of lamps each flag qualifies.
    """
    import click

    click.echo(rating_table(*tally.shown(), tally.count))
    if not tally.all_shown and not {"json", "csv", "xlsx"} & set(outputs):
        click.echo("(write every lamp's ratings with --json, --csv or --xlsx)")
    click.echo(TABLE_NOTES)
    if legend := legend_of(tally.flags.lamps, None if tally.all_shown else tally.flags.counts):
        click.echo("Flags:\n" + legend)


def flag_legend(ratings):
    """The words of every flag the lamps carry, one per line (empty when none)."""
    return legend_of(flag for flags in ratings["flags"] for flag in flags)


def legend_of(flags, counts=None):
    """The words of each of ``flags``, one per line in alphabetical order (empty when none).

    ``counts``: lamps per flag, said for each flag (for a run whose table shows only some lamps).
    """
    def count(flag):
        return "" if counts is None else f" ({counts[flag]:,} lamp{'s' if counts[flag] != 1 else ''})"

    return "\n".join(f"  {flag}{count(flag)}: {explain_with_option(flag)}" for flag in sorted(set(flags)))


def verdict_text(verdicts, ratings=None):
    """The verdict table of every claimed lamp, in the words the report uses (verdicts.wording)."""
    from ..verdicts.wording import QUALIFIED, lamp_line, pair_verdicts, word_checks
    from .text_table import format_table

    flags = ratings["flags"] if ratings is not None else ()
    names = ratings["name"] if ratings is not None else [v["lamp"] for v in verdicts.lamps if v["lamp"] not in verdicts.missing]
    blocks = []
    paired = [(lamp, flags[k] if ratings is not None else ()) for k, lamp in enumerate(pair_verdicts(names, verdicts))]
    paired += [(lamp, ()) for lamp in verdicts.lamps if lamp["lamp"] in verdicts.missing]
    for lamp, lamp_flags in paired:
        if lamp is None:
            continue
        words = word_checks(lamp, lamp_flags)
        rows = [[w.claim, w.measured, w.margin, w.verdict_text, w.why] for w in words]
        table = format_table(["claim", "measured", "margin", "verdict", "why"], rows, "lrrll")
        blocks.append(f"{lamp['lamp']}: {lamp_line(lamp)}\n" + "\n".join("  " + line for line in table.splitlines()))
    blocks.append(
        "margin: how far the measured value lies on the claim's side of its limit (negative: short of it by\n"
        "that much); for a quadrangle, the distance from its nearest edge in CIE 1960 (u, v).\n"
        f"{QUALIFIED} qualified: the verdict rests on a value in parentheses (outside its method's validity) or on a\n"
        "value that no published source confirms (see the report's methods page)."
    )
    return "\n\n".join(blocks)
