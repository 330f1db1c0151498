"""The frame of lampcalc's set files: metadata lines, comments, then a CSV table (docs/standard-sets.md).

The format is lampcalc's own; these checks are of its rules, with no published source involved.
"""

import pytest

from lampcalc.errors import InputError
from lampcalc.standards.set_files import number, read_set_table, row_confirmed

TEXT = (
    "\ufeff# name: Lab copy\n# source: the lab's copy of the standard\n# edition: 2017\n"
    "# Transcribed by hand (a comment: its key has a space)\n# confirmed: no\n# space: xy\n# note: checked twice\n"
    "\n"
    "name,value,confirmed\n"
    "# a comment inside the table\n"
    "a,1.5,yes\n"
    "b,,\n"
)


def test_metadata_comments_and_rows(write):
    table = read_set_table(write("s.csv", TEXT), ("name", "value", "confirmed"), ("name",))
    assert table.metadata == {
        "name": "Lab copy", "source": "the lab's copy of the standard", "edition": "2017", "confirmed": "no",
        "space": "xy", "note": "checked twice",
    }
    assert not table.confirmed
    assert [line for line, _ in table.rows] == [11, 12]
    (la, a), (lb, b) = table.rows
    assert number(table, la, a, "value") == 1.5 and row_confirmed(table, la, a) is True
    assert row_confirmed(table, lb, b) is False  # blank: the file's '# confirmed: no'
    with pytest.raises(InputError, match="s.csv, line 12: column 'value' is blank"):
        number(table, lb, b, "value")


@pytest.mark.parametrize(
    "text, fragment",
    [
        ("# name: a\n# name: b\n", "line 2: metadata key 'name' is given twice"),
        (TEXT.replace("name,value,confirmed", "value,confirmed"), "line 9: no 'name' column"),
        (TEXT.replace("name,value,confirmed", "name,value,value"), "line 9: column 'value' appears twice"),
        (TEXT.replace("# space: xy", "# space:"), "metadata '# space: ...' is missing or empty"),
        ("", "line 1: metadata '# name: ...' is missing"),
        (TEXT.replace("name,value,confirmed", "name;value").replace("a,1.5,yes", "a;1,5"), "line 9: the table is separated by ';'"),
    ],
)
def test_bad_frames_refused_with_the_line(write, text, fragment):
    with pytest.raises(InputError) as err:
        read_set_table(write("bad.csv", text), ("name", "value", "confirmed"), ("name",))
    assert fragment in str(err.value) and "bad.csv" in str(err.value)
