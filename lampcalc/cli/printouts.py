"""The tables the commands print: ratings and claim verdicts, with their notes."""

from ..rating.flags import doubtful_keys, explain
from .common import flagged, fmt


def _rating_rows(ratings):
    rows = []
    for r in ratings.records():
        doubt = doubtful_keys(r["flags"])
        r9 = r["ri"][8] if r["ri"] else None
        rows.append(
            [
                r["name"],
                fmt(r["cct_K"], ".0f"),
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


def flag_legend(ratings):
    """The words of every flag the lamps carry, one per line (empty when none)."""
    return legend_of(flag for flags in ratings["flags"] for flag in flags)


def legend_of(flags, counts=None):
    """The words of each of ``flags``, one per line in alphabetical order (empty when none).

    ``counts``: lamps per flag, said for each flag (for a run whose table shows only some lamps).
    """
    def count(flag):
        return "" if counts is None else f" ({counts[flag]:,} lamp{'s' if counts[flag] != 1 else ''})"

    return "\n".join(f"  {flag}{count(flag)}: {explain(flag)}" for flag in sorted(set(flags)))


CRITERIA = {
    # criterion: (label, claimed format, value format, unit)
    "ansi_quadrangle": ("ANSI quadrangle", "{:g} K", "{:.0f} K", "e-3 uv"),
    "bin": ("bin", "{:g} K", "{:.0f} K", "e-3 uv"),
    "ansi_cct_K": ("ANSI target CCT", "{:g} K", "{:.0f} K", "K"),
    "ansi_duv": ("ANSI target Duv", "{:+.4f}", "{:+.4f}", ""),
    "sdcm_steps": ("colour consistency", "<= {:g} steps", "{:.2f} steps", "steps"),
    "ra": ("Ra", ">= {:g}", "{:.1f}", ""),
    "r9": ("R9", ">= {:g}", "{:.1f}", ""),
    "rf": ("Rf", ">= {:g}", "{:.1f}", ""),
    "rg_min": ("Rg", ">= {:g}", "{:.1f}", ""),
    "rg_max": ("Rg", "<= {:g}", "{:.1f}", ""),
    "ler_lm_per_W": ("LER", ">= {:g} lm/W", "{:.1f} lm/W", "lm/W"),
    "efficacy_lm_per_W": ("lamp efficacy", ">= {:g} lm/W", "{:.1f} lm/W", "lm/W"),
    "spectrum": ("spectrum", "{}", "{}", ""),
}
RESULT = {True: "holds", False: "FAILS", None: "not shown"}


def verdict_text(verdicts):
    import math

    from .text_table import format_table

    blocks = []
    for lamp in verdicts.lamps:
        rows = []
        for c in lamp["checks"]:
            label, claimed_fmt, value_fmt, unit = CRITERIA[c["criterion"]]
            claimed = claimed_fmt.format(c["claimed"]) if c["claimed"] is not None else "-"
            measured = value_fmt.format(c["measured"]) if c["measured"] is not None else "-"
            margin = "-" if c["margin"] is None or not math.isfinite(c["margin"]) else f"{c['margin']:+.4g} {unit}".strip()
            rows.append([label, claimed, measured, margin, RESULT[c["pass"]], c["note"]])
        failing = sum(c["pass"] is not True for c in lamp["checks"])
        if [c["criterion"] for c in lamp["checks"]] == ["spectrum"]:
            head = f"{lamp['lamp']}: no spectrum among the files given; its claims are not checked"
        else:
            head = f"{lamp['lamp']}: " + ("every claim holds" if lamp["pass"] else f"{failing} of {len(lamp['checks'])} checks do not hold")
        table = format_table(["claim", "claimed", "measured", "margin", "result", "note"], rows, "lllrll")
        blocks.append(head + "\n" + "\n".join("  " + line for line in table.splitlines()))
    blocks.append(
        "margin: how far the measurement is on the right side of the claim (negative: it fails by that much);\n"
        "for the ANSI quadrangle or a bin, the distance from its nearest edge in CIE 1960 u,v (x 1e-3)."
    )
    return "\n\n".join(blocks)
