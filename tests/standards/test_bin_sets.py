"""Bin set files: read, refused with the line at fault, and the same bins in any coordinate system.

The format is lampcalc's own (docs/standard-sets.md); the bins in these tests are made up, and the
geometry is checked against the ANSI C78.377 corner table (shared/REFERENCE_VALUES.md).
"""

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from lampcalc.colorimetry.tristimulus import xy_to_upvp, xy_to_uv
from lampcalc.errors import InputError
from lampcalc.standards.ansi_bins import ansi_bin_set
from lampcalc.standards.bin_sets import classify, margins, read_bin_set

HEAD = "# name: Quillfen sub-bins\n# source: Quillfen Lighting binning sheet\n# edition: 2024\n# confirmed: yes\n# space: {space}\n"
# Two sub-bins splitting the published 4000 K quadrangle (ANSI C78.377 corner table) at its mid-CCT line.
Q4000 = np.array([(0.4003, 0.4035), (0.3737, 0.3880), (0.3671, 0.3583), (0.3895, 0.3709)])
MID = 0.5 * (Q4000[[0, 3]] + Q4000[[1, 2]])  # top and bottom midpoints
HALVES = {"4A": [Q4000[0], MID[0], MID[1], Q4000[3]], "4B": [MID[0], Q4000[1], Q4000[2], MID[1]]}


def _text(space="xy", convert=lambda c: np.asarray(c)):
    rows = [
        ",".join([name, "4000", *(f"{v!r}" for v in np.ravel(convert(np.array(corners))).tolist())])
        for name, corners in HALVES.items()
    ]
    return HEAD.format(space=space) + "bin,nominal_cct_K,x1,y1,x2,y2,x3,y3,x4,y4\n" + "\n".join(rows) + "\n"


def test_read_and_classify(write):
    bins = read_bin_set(write("q.csv", _text()))
    assert bins.name == "Quillfen sub-bins" and bins.edition == "2024" and bins.confirmed
    assert bins.names == ("4A", "4B") and bins.bins_of_nominal(4000).tolist() == [0, 1]
    np.testing.assert_array_equal(bins.corners(0), HALVES["4A"])
    # The halves tile the published quadrangle: its centre's neighbours fall in one half each.
    centre = Q4000.mean(axis=0)
    found = classify(np.array([centre + (0.003, 0.0), centre - (0.003, 0.0), (0.30, 0.30)]), bins)
    assert found["index"].tolist() == [0, 1, -1]
    assert found["nearest"][2] >= 0 and found["margin_uv"][2] < 0


@settings(max_examples=60, deadline=None)
@given(st.floats(0.36, 0.41), st.floats(0.35, 0.41))
def test_the_same_bins_in_uv_and_upvp(write_bins, x, y):
    # Straight edges in x, y are straight in u, v and u', v' (projective maps, CIE 015): the same bins
    # given in any of the three systems hold the same points.
    sets = write_bins
    point = np.array([x, y])
    expected = margins(point, sets["xy"])
    for space in ("uv", "upvp"):
        np.testing.assert_allclose(margins(point, sets[space]), expected, atol=1e-12)


@pytest.fixture(scope="module")
def write_bins(tmp_path_factory):
    folder = tmp_path_factory.mktemp("bins")
    sets = {}
    for space, convert in (("xy", np.asarray), ("uv", xy_to_uv), ("upvp", xy_to_upvp)):
        path = folder / f"{space}.csv"
        path.write_text(_text(space, convert), encoding="utf-8")
        sets[space] = read_bin_set(path)
    return sets


def test_polygons_of_other_sizes(write):
    # A triangle and a hexagon in one file; a point is inside the triangle by geometry alone.
    text = HEAD.format(space="xy") + (
        "bin,x1,y1,x2,y2,x3,y3,x4,y4,x5,y5,x6,y6\n"
        "tri,0.30,0.30,0.34,0.30,0.32,0.34,,,,,,\n"
        "hex,0.40,0.38,0.42,0.38,0.43,0.40,0.42,0.42,0.40,0.42,0.39,0.40\n"
    )
    bins = read_bin_set(write("poly.csv", text))
    assert bins.n_corners.tolist() == [3, 6]
    found = classify(np.array([(0.32, 0.31), (0.41, 0.40), (0.35, 0.35)]), bins)
    assert found["index"].tolist() == [0, 1, -1]
    assert np.isnan(bins.nominal_cct_K).all()


BAD = {
    "missing metadata": ("# name: x\nbin,x1,y1,x2,y2,x3,y3\nA,0.3,0.3,0.34,0.3,0.32,0.34\n", "line 2: metadata '# source: ...' is missing"),
    "unknown key": ("# name: x\n# colour: red\n", "line 2: unknown metadata key 'colour'"),
    "bad confirmed": (HEAD.replace("yes", "maybe").format(space="xy") + "bin,x1,y1,x2,y2,x3,y3\nA,0.3,0.3,0.34,0.3,0.32,0.34\n", "confirmed: maybe' must be yes or no"),
    "bad space": (HEAD.format(space="lab") + "bin,x1,y1,x2,y2,x3,y3\nA,0.3,0.3,0.34,0.3,0.32,0.34\n", "space: lab' must be one of xy, uv, upvp"),
    "no rows": (HEAD.format(space="xy") + "bin,x1,y1,x2,y2,x3,y3\n", "line 6: the table needs a header row and at least one row"),
    "unknown column": (HEAD.format(space="xy") + "bin,x1,y1,x2,y2,x3,y3,z1\nA,0.3,0.3,0.34,0.3,0.32,0.34,1\n", "line 6: unknown column 'z1'"),
    "ragged": (HEAD.format(space="xy") + "bin,x1,y1,x2,y2,x3,y3\nA,0.3,0.3,0.34,0.3,0.32\n", "line 7: 6 fields where the header has 7"),
    "bad number": (HEAD.format(space="xy") + "bin,x1,y1,x2,y2,x3,y3\nA,0.3,0.3,0.34,0.3,0.32,0,34\n", "line 7: 8 fields"),
    "text number": (HEAD.format(space="xy") + "bin,x1,y1,x2,y2,x3,y3\nA,0.3,0.3,0.34,abc,0.32,0.34\n", "line 7: column 'y2': 'abc' is not a number"),
    "nan": (HEAD.format(space="xy") + "bin,x1,y1,x2,y2,x3,y3\nA,0.3,nan,0.34,0.3,0.32,0.34\n", "line 7: column 'y1': 'nan' is not a number"),
    "two corners": (HEAD.format(space="xy") + "bin,x1,y1,x2,y2,x3,y3\nA,0.3,0.3,0.34,0.3,,\n", "line 7: a bin needs at least 3 corners, got 2"),
    "repeated bin": (HEAD.format(space="xy") + "bin,x1,y1,x2,y2,x3,y3\nA,0.3,0.3,0.34,0.3,0.32,0.34\nA,0.3,0.3,0.34,0.3,0.32,0.34\n", "line 8: bin 'A' is given twice"),
    "blank bin": (HEAD.format(space="xy") + "bin,x1,y1,x2,y2,x3,y3\n,0.3,0.3,0.34,0.3,0.32,0.34\n", "line 7: the bin name is blank"),
    "not convex": (HEAD.format(space="xy") + "bin,x1,y1,x2,y2,x3,y3,x4,y4\nA,0.30,0.30,0.34,0.30,0.32,0.31,0.32,0.34\n", "line 7: the corners do not go once around a convex polygon"),
    "crossed": (HEAD.format(space="xy") + "bin,x1,y1,x2,y2,x3,y3,x4,y4\nA,0.30,0.30,0.34,0.34,0.34,0.30,0.30,0.34\n", "do not go once around"),
    "gap in corners": (HEAD.format(space="xy") + "bin,x1,y1,x2,y2,x3,y3,x4,y4\nA,0.30,0.30,,,0.34,0.30,0.32,0.34\n", "line 7: corner 3 follows a blank corner"),
    "not chromaticity": (HEAD.format(space="xy") + "bin,x1,y1,x2,y2,x3,y3\nA,0.3,0.3,0.84,0.3,0.32,0.34\n", "line 7: a corner is not a chromaticity"),
    "bad confirmed cell": (HEAD.format(space="xy") + "bin,confirmed,x1,y1,x2,y2,x3,y3\nA,perhaps,0.3,0.3,0.34,0.3,0.32,0.34\n", "line 7: column 'confirmed': 'perhaps'"),
    "negative nominal": (HEAD.format(space="xy") + "bin,nominal_cct_K,x1,y1,x2,y2,x3,y3\nA,-3000,0.3,0.3,0.34,0.3,0.32,0.34\n", "line 7: column 'nominal_cct_K': '-3000' must be positive"),
}


@pytest.mark.parametrize("case", sorted(BAD))
def test_bad_bin_set_refused_with_the_line(write, case):
    text, fragment = BAD[case]
    path = write("bad_bins.csv", text)
    with pytest.raises(InputError, match="bad_bins.csv") as err:
        read_bin_set(path)
    assert fragment in str(err.value) and "\n" not in str(err.value)


def test_unreadable_files(write, tmp_path):
    with pytest.raises(InputError, match="cannot be read as a UTF-8 text file"):
        read_bin_set(write("bin.csv", b"\xff\xfe\x00\x81", mode="wb"))
    with pytest.raises(InputError, match="cannot be read"):
        read_bin_set(tmp_path / "missing.csv")


def test_shipped_ansi_set_reads_as_a_user_file_would(tmp_path):
    # The shipped set is a file in the same format: copied out and read back, it is the same set.
    from importlib import resources

    copy = tmp_path / "ansi.csv"
    copy.write_bytes((resources.files("lampcalc") / "data" / "sets" / "ansi_c78377_2017_bins.csv").read_bytes())
    again, shipped = read_bin_set(copy), ansi_bin_set()
    assert again.names == shipped.names and again.edition == "ANSI C78.377-2017"
    np.testing.assert_array_equal(again.corners_xy, shipped.corners_xy)
    np.testing.assert_array_equal(again.bin_confirmed, shipped.bin_confirmed)


def test_the_documented_example_reads(tmp_path):
    from pathlib import Path

    # docs/standard-sets.md shows a bin set: it must be a valid file, and its halves tile the published
    # 4000 K quadrangle (ANSI C78.377 corner table) along the line between the edges' midpoints.
    doc = (Path(__file__).resolve().parents[2] / "docs" / "standard-sets.md").read_text(encoding="utf-8")
    block = doc[doc.index("### Bin sets"):].split("```")[1]
    (tmp_path / "example.csv").write_text(block.lstrip("\n"), encoding="utf-8")
    example = read_bin_set(tmp_path / "example.csv")
    assert example.names == ("4A", "4B") and example.bins_of_nominal(4000).tolist() == [0, 1]
    np.testing.assert_allclose(example.corners(0), HALVES["4A"], atol=1e-12)
    np.testing.assert_allclose(example.corners(1), HALVES["4B"], atol=1e-12)
