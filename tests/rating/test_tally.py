"""What a run keeps of its ratings: the same note, flags and rows as the whole table would give.

The reference is lampcalc's whole-table functions (duplicate_names, ratings_sheets) on all
lamps at once; internal checks, no published source.
"""

import numpy as np
from hypothesis import given, settings
from hypothesis import strategies as st

from lampcalc.rating import tally as tally_module
from lampcalc.rating.ratings import Ratings
from lampcalc.rating.streaming import take_ratings
from lampcalc.rating.tally import RunTally
from lampcalc.rating.wide_columns import ratings_sheets
from lampcalc.verdicts.claims import duplicate_names

FLAGS = ("range_truncated", "cri_outside_validity", "duv_beyond_0.05")


def _ratings(names, flags):
    n = len(names)
    return Ratings({"name": tuple(names), "source": tuple(f"f{k % 3}.csv, column {k + 2}" for k in range(n)),
                    "cct_K": np.arange(n, dtype=float), "flags": tuple(flags)})


@settings(max_examples=60, deadline=None)
@given(names=st.lists(st.sampled_from(["QF-A", "qf-a", "QF-B", "QF-C\x00", "Qf-b", "QF-D", "QF-E"]), min_size=1,
                      max_size=30),
       picks=st.lists(st.lists(st.sampled_from(FLAGS), max_size=2, unique=True), min_size=30, max_size=30),
       chunk=st.integers(1, 7))
def test_tally_of_chunks_matches_the_whole_table(names, picks, chunk):
    whole = _ratings(names, picks[: len(names)])
    tally = RunTally()
    for a in range(0, len(names), chunk):
        tally.add(take_ratings(whole, a, a + chunk))
    assert tally.count == len(names)
    assert duplicate_names(tally.repeated_names()) == duplicate_names(whole)
    assert tally.flags.rows() == ratings_sheets(whole)[1][2]


def test_only_the_first_and_last_lamps_are_shown(monkeypatch):
    monkeypatch.setattr(tally_module, "SHOWN", 6)
    names = [f"QF-{k:02d}" for k in range(20)]
    whole = _ratings(names, [()] * 20)
    tally = RunTally()
    for a in range(0, 20, 4):
        tally.add(take_ratings(whole, a, a + 4))
    first, last = tally.shown()
    assert first["name"] == tuple(names[:3]) and last["name"] == tuple(names[-3:])
    assert not tally.all_shown
    small = RunTally()
    small.add(take_ratings(whole, 0, 5))
    assert small.all_shown and small.shown()[0]["name"] == tuple(names[:5]) and small.shown()[1] is None


def test_a_flags_cell_is_cut_as_a_workbook_cell_would_be():
    # Excel holds 32,767 characters in a cell (Microsoft's specifications, common practice, no source);
    # the names kept for a flag raised on every lamp stop once they fill several cells
    from lampcalc.io.workbook import MAX_CELL_CHARACTERS

    names = [f"QF-LONG-NAME-{k:06d}" for k in range(20000)]
    whole = _ratings(names, [("range_truncated",)] * len(names))
    tally = RunTally()
    for a in range(0, len(names), 5000):
        tally.add(take_ratings(whole, a, a + 5000))
    kept = tally.flags.rows()[0][2]
    full = ", ".join(names)
    assert MAX_CELL_CHARACTERS < len(kept) < len(full)
    assert full.startswith(kept)  # the cell shows the first 32,766 characters and "…" either way
    assert ratings_sheets(whole)[1][2][0][2] == kept
