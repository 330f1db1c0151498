"""Claims and limits as a report table: the columns a client reads, the verdict marked by its look.

A lamp's claims, a lot's claims, and a colour shift against the user's limit are all
:class:`~lampcalc.verdicts.wording.ClaimWording` s; they are printed in one table form: the
claim, the measured value, the margin, the verdict (bold in the lamp colour when not met,
muted when not evaluated) and why. A lot's table puts the supplier's own words first.
"""

from ..plots.style import INK, LAMP, MUTED
from .tables import Cell, Column, Table

#: (header, share of the width, alignment, wraps) of the columns.
COLUMNS = (("claim", 0.285, "left", True), ("measured", 0.095, "right", False), ("margin", 0.10, "right", False),
           ("verdict", 0.13, "left", False), ("why", 0.39, "left", True))
#: The same with the supplier's words first (a lot's claims).
SUPPLIER_COLUMNS = (("the supplier says", 0.2, "left", True), ("claim", 0.2, "left", True),
                    ("measured", 0.085, "right", False), ("margin", 0.085, "right", False),
                    ("verdict", 0.13, "left", False), ("why", 0.3, "left", True))
#: A verdict's look by its ``passed``: (weight, colour).
LOOK = {True: ("normal", INK), False: ("bold", LAMP), None: ("normal", MUTED)}


def verdict_table(words, width_mm, *, said=None, size=6.4):
    """A :class:`~lampcalc.report.tables.Table` of ClaimWordings; ``said``: the supplier's words, one per row."""
    layout = COLUMNS if said is None else SUPPLIER_COLUMNS
    columns = [Column(h, share * width_mm, align, wrap, MUTED if h == "why" else INK) for h, share, align, wrap in layout]
    rows = []
    for k, w in enumerate(words):
        row = [w.claim, w.measured, w.margin, Cell(w.verdict_text, *LOOK[w.passed]), w.why]
        rows.append(row if said is None else [said[k] or "–", *row])
    return Table(columns, rows, size=size)
