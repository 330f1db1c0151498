"""The ratings as a wide table: every list field spread into columns of its own.

Spreadsheets and DataFrames want one number per cell. The list fields of
:data:`~lampcalc.rating.ratings.FIELDS` become numbered columns (``docs/output-fields.md``):

==================================  ==============================================
list field                          columns
==================================  ==============================================
``ri``                              ``r1`` … ``r15``
``rf_hue_bins``                     ``rf_h01`` … ``rf_h16``
``chroma_shift_hue_bins_percent``   ``chroma_shift_h01_percent`` … ``_h16_percent``
``hue_shift_hue_bins_rad``          ``hue_shift_h01_rad`` … ``hue_shift_h16_rad``
``ler_range_nm``                    ``ler_range_start_nm``, ``ler_range_end_nm``
``flags``                           ``flags``: the flags joined with ``"; "``
``uncertainty_flags_in_draws``      the same, joined with ``"; "``
==================================  ==============================================

With ``--uncertainty`` each key's ``_u`` columns follow its columns and each ``_interval95``
becomes two, ``_interval95_low`` and ``_interval95_high`` (``cct_K_u``, ``r9_interval95_low`` …).
"""

from ..io.serialise import plain
from ..io.workbook import MAX_CELL_CHARACTERS

# Names kept per flag: beyond a cell's length (with room for characters a workbook cannot hold).
_KEEP_CHARACTERS = 4 * MAX_CELL_CHARACTERS

#: List field -> the names of the columns it is spread into.
SPREAD = {
    "ri": tuple(f"r{k}" for k in range(1, 16)),
    "rf_hue_bins": tuple(f"rf_h{k:02d}" for k in range(1, 17)),
    "chroma_shift_hue_bins_percent": tuple(f"chroma_shift_h{k:02d}_percent" for k in range(1, 17)),
    "hue_shift_hue_bins_rad": tuple(f"hue_shift_h{k:02d}_rad" for k in range(1, 17)),
    "ler_range_nm": ("ler_range_start_nm", "ler_range_end_nm"),
}

#: Lists of words, joined into one cell.
JOINED = ("flags", "uncertainty_flags_in_draws")


def wide_columns(ratings):
    """``{column name: [value per lamp]}`` with plain Python values (None for NaN), lists spread.

    Examples
    --------
    >>> from lampcalc.rating.ratings import Ratings
    >>> table = wide_columns(Ratings({"name": ("A",), "ler_range_nm": [[380.0, 780.0]], "flags": (("range_truncated",),)}))
    >>> table["ler_range_start_nm"], table["flags"]
    ([380.0], ['range_truncated'])
    """
    out = {}
    for key in ratings.keys():
        column = [plain(v) for v in ratings.columns[key]]
        base, suffix = _companion(key, ratings)
        if key in JOINED:
            out[key] = ["; ".join(f) for f in column]
        elif base in SPREAD:
            for j, name in enumerate(SPREAD[base]):
                _put(out, name + suffix, [v[j] if v and j < len(v) else None for v in column])
        else:
            _put(out, key, column)
    return out


def _companion(key, ratings):
    """(rating, suffix) of an uncertainty key (``cct_K_u`` -> ("cct_K", "_u")); (key, "") for others."""
    for suffix in ("_u", "_interval95"):
        if key.endswith(suffix) and key[: -len(suffix)] in ratings.columns:
            return key[: -len(suffix)], suffix
    return key, ""


def _put(out, name, column):
    """One column, or a 95 % interval as two: ``<name>_low`` and ``<name>_high``."""
    if name.endswith("_interval95"):
        out[f"{name}_low"] = [v[0] if v else None for v in column]
        out[f"{name}_high"] = [v[1] if v else None for v in column]
    else:
        out[name] = column


def to_pandas(ratings):
    """The ratings as a pandas DataFrame, one row per lamp, list fields spread into columns.

    Raises
    ------
    ImportError
        When pandas is not installed, naming the extra that installs it.
    """
    from .optional import optional_import

    return optional_import("pandas", "pandas", "Ratings.to_pandas").DataFrame(wide_columns(ratings))


class FlagLamps:
    """Every flag raised in a run, in the order first met, with the lamps it qualifies.

    The list of lamps is what the workbook's ``flags`` sheet shows in one cell; a cell holds
    :data:`~lampcalc.io.workbook.MAX_CELL_CHARACTERS` at most, so names stop being kept once
    they fill several cells' worth (the cell is cut there the same way).
    """

    def __init__(self):
        self.lamps = {}  # flag -> [names kept, length of their text]
        self.counts = {}  # flag -> lamps it qualifies

    def add(self, names, flags):
        for name, lamp_flags in zip(names, flags):
            for flag in lamp_flags:
                self.counts[flag] = self.counts.get(flag, 0) + 1
                kept = self.lamps.setdefault(flag, [[], -2])
                if kept[1] <= _KEEP_CHARACTERS:
                    kept[0].append(name)
                    kept[1] += len(name) + 2

    def rows(self):
        """``[flag, meaning, lamps]`` per flag, then the note on empty cells."""
        from .flags import explain

        rows = [[flag, explain(flag), ", ".join(names)] for flag, (names, _) in self.lamps.items()]
        rows.append(["(empty cell)", "not computable for this lamp; a flag above says why", ""])
        return rows


def ratings_rows(ratings):
    """The header and rows of the ``ratings`` sheet: the wide table, one row per lamp."""
    table = wide_columns(ratings)
    return list(table), [list(row) for row in zip(*table.values())]


def ratings_sheets(ratings):
    """The sheets of a ratings workbook: ``[(title, header, rows), …]``.

    ``ratings``: the wide table, one row per lamp. ``flags``: every flag raised, what it
    means and the lamps it qualifies, so that no flagged number reaches a reader unexplained.
    """
    flags = FlagLamps()
    flags.add(ratings["name"], ratings["flags"])
    return [
        ("ratings", *ratings_rows(ratings)),
        ("flags", ["flag", "meaning", "lamps"], flags.rows()),
    ]
