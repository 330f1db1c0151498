"""What ``lampcalc lot`` and ``lampcalc compare`` write: JSON documents, CSV rows, workbook sheets.

The keys are those of ``docs/output-fields.md``; the workbooks hold the same numbers, one
number per cell (lists spread into numbered columns), with the flags in words.
"""

from ..io.serialise import csv_text, plain, records


def json_text(doc):
    """A JSON document as lampcalc writes it: indented, no NaN (nulls instead), a final newline."""
    import json

    return json.dumps(doc, indent=1, allow_nan=False) + "\n"


def _summary(table, *exclude):
    return {k: v for k, v in table.items() if k not in exclude}


def lot_document(lot, angles=None, verdicts=None):
    """The lot's JSON document: the summary, the samples, colour over angle and the claims' verdicts."""
    from ..verdicts.lot import NOT_SUMMARY

    doc = {"lot": plain(_summary(lot, *NOT_SUMMARY)), "samples": records(lot["samples"])}
    if angles is not None:
        doc["colour_over_angle"] = plain(_summary(angles, "angles"))
        doc["colour_over_angle"]["angles"] = records(angles["angles"])
    if verdicts is not None:
        doc["claims"] = {"product": verdicts.product, "all_hold": verdicts.all_hold, "checks": plain(verdicts.checks)}
    return doc


def lot_csv(lot, angles=None):
    """One CSV row: the lot's summary keys, then the colour-over-angle keys."""
    from ..verdicts.lot import NOT_SUMMARY

    row = _summary(lot, *NOT_SUMMARY)
    if angles is not None:
        row |= _summary(angles, "angles")
    return csv_text([plain(row)])


def _key_values(title, table):
    return title, ["key", "value"], [[k, v] for k, v in plain(table).items()]


def _rows(title, columns):
    rows = records(columns)
    header = list(columns)
    return title, header, [[row[k] for k in header] for row in rows]


def _flag_sheet(raised):
    """The flags raised, in words, and what each concerns: ``raised`` maps a flag to names."""
    from ..rating.flags import explain

    return ("flags", ["flag", "meaning", "concerns"],
            [[flag, explain(flag), ", ".join(names)] for flag, names in raised.items()])


def lot_sheets(lot, angles=None, verdicts=None):
    """The sheets of a lot's workbook: summary, statistics, samples, colour over angle, claims, flags."""
    from ..verdicts.lot import LOT_RATINGS, NOT_SUMMARY
    from ..verdicts.spread import STATISTICS

    summary = _summary(lot, *NOT_SUMMARY, *(f"{r}_{s}" for r in LOT_RATINGS for s in STATISTICS))
    statistics = [[rating, *(plain(lot[f"{rating}_{s}"]) for s in STATISTICS)] for rating in LOT_RATINGS]
    sheets = [_key_values("lot", summary), ("statistics", ["rating", *STATISTICS], statistics),
              _rows("samples", lot["samples"])]
    raised = {flag: ["the lot"] for flag in lot["flags"]}
    for name, flags in zip(lot["samples"]["name"], lot["samples"]["flags"]):
        for flag in flags:
            raised.setdefault(flag, []).append(name)
    if angles is not None:
        sheets += [_key_values("colour_over_angle", _summary(angles, "angles")), _rows("angles", angles["angles"])]
    if verdicts is not None:
        from ..verdicts.wording import VERDICT_WORDS

        header = ["kind", "text", "claim", "claimed", "measured", "margin", "pass", "verdict", "note", "line"]
        rows = [[*(plain(c[k]) for k in header[:7]), VERDICT_WORDS[c["pass"]], c["note"], c["line"]] for c in verdicts.checks]
        sheets.append(("claims", header, rows))
    return [*sheets, _flag_sheet(raised)]


def comparison_document(comparison):
    """The comparison's JSON document: one object per pair, and the names without a partner."""
    return {"pairs": records(comparison["pairs"]), **plain(_summary(comparison, "pairs"))}


def comparison_csv(comparison):
    """One CSV row per pair (lists joined with ';')."""
    return csv_text(records(comparison["pairs"]))


def comparison_sheets(comparison):
    """The sheets of a comparison's workbook: the pairs (lists spread into columns), the unpaired lamps, the flags."""
    from ..rating.wide_columns import SPREAD

    pairs = comparison["pairs"]
    wide = {}
    for key, column in pairs.items():
        base = key.removeprefix("delta_")
        if key.startswith("delta_") and base in SPREAD:
            for j, name in enumerate(SPREAD[base]):
                wide[f"delta_{name}"] = [row[j] for row in column]
        else:
            wide[key] = column
    raised = {}
    for k in range(len(pairs["test_name"])):
        for side in ("reference", "test"):
            for flag in pairs[f"{side}_flags"][k]:
                raised.setdefault(flag, []).append(f"{pairs[f'{side}_name'][k]} ({side})")
        for flag in pairs["flags"][k]:
            raised.setdefault(flag, []).append(f"{pairs['test_name'][k]} against {pairs['reference_name'][k]}")
    unpaired = [[side, name] for side in ("reference", "test") for name in comparison[f"unmatched_{side}"]]
    return [_rows("pairs", wide), ("unpaired", ["side", "name"], unpaired), _flag_sheet(raised)]
