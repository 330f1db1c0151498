"""Ellipse set files: read, refused with the line at fault, and the shipped sets' bookkeeping.

The format is lampcalc's own (docs/standard-sets.md). Values of the shipped sets are from memory
(shared/REFERENCE_VALUES.md: IEC 60081 Annex D, medium confidence; CIE TN 001 radius 0.0011).
"""

import numpy as np
import pytest

from lampcalc.errors import InputError
from lampcalc.standards.ellipse_sets import read_ellipse_set, shipped_ellipse_set

HEAD = "# name: lab ellipses\n# source: lab copy\n# edition: 1997\n# confirmed: yes\n# space: xy\n"


def test_shipped_iec_set_holds_the_recalled_values_marked_unconfirmed():
    # IEC 60081 Annex D as recalled in shared/REFERENCE_VALUES.md (from memory): centres and g in 1e4.
    recalled = {
        6500: ((0.313, 0.337), (86, -40, 45)), 5000: ((0.346, 0.359), (56, -25, 28)),
        4000: ((0.380, 0.380), (39.5, -21.5, 26)), 3500: ((0.409, 0.394), (38, -20, 25)),
        3000: ((0.440, 0.403), (39, -19.5, 27.5)), 2700: ((0.463, 0.420), (44, -18.6, 27)),
    }
    iec = shipped_ellipse_set("ellipse")
    assert iec.nominal_cct_K.tolist() == sorted(recalled)
    for k, nominal in enumerate(iec.nominal_cct_K):
        centre, g = recalled[int(nominal)]
        np.testing.assert_array_equal(iec.centres[k], centre)
        np.testing.assert_array_equal(iec.g[k], g)
    assert not iec.confirmed and not iec.row_confirmed.any()
    assert iec.name == "IEC 60081:1997 Annex D ellipses" and iec.edition.startswith("IEC 60081:1997")


def test_rows_sorted_by_nominal_and_centre_in_other_spaces(write):
    from lampcalc.colorimetry.tristimulus import upvp_to_xy

    text = HEAD.replace("space: xy", "space: upvp") + (
        "name,nominal_cct_K,x,y,g11,g12,g22\nB,5000,0.21,0.48,300,0,300\nA,3000,0.25,0.52,300,0,300\n"
    )
    ellipses = read_ellipse_set(write("e.csv", text))
    assert ellipses.names == ("A", "B") and ellipses.space == "upvp"
    np.testing.assert_allclose(ellipses.centre_xy(3000), upvp_to_xy([0.25, 0.52]), atol=1e-15)


BAD = {
    "both metric forms": ("name,nominal_cct_K,x,y,g11,g12,g22,a,b,theta_deg\nA,3000,0.44,0.40,39,-19.5,27.5,0.002,0.001,50\n", "line 7: give the ellipse either as g11, g12, g22 or as a, b, theta_deg"),
    "no metric": ("name,nominal_cct_K,x,y\nA,3000,0.44,0.40\n", "line 7: give the ellipse either"),
    "not an ellipse": ("name,nominal_cct_K,x,y,g11,g12,g22\nA,3000,0.44,0.40,10,20,10\n", "line 7: the metric is not an ellipse"),
    "zero axis": ("name,nominal_cct_K,x,y,a,b,theta_deg\nA,3000,0.44,0.40,0,0.001,10\n", "line 7: column 'a': '0' must be positive"),
    "half a centre": ("name,nominal_cct_K,x,y,a,b,theta_deg\nA,3000,0.44,,0.002,0.001,10\n", "line 7: column 'y' is blank: give the centre's x and y, or neither"),
    "missing nominal": ("name,nominal_cct_K,x,y,a,b,theta_deg\nA,,0.44,0.40,0.002,0.001,10\nB,4000,0.38,0.38,0.002,0.001,10\n", "line 7: column 'nominal_cct_K' is blank"),
    "repeated nominal": ("name,nominal_cct_K,x,y,a,b,theta_deg\nA,3000,0.44,0.40,0.002,0.001,10\nB,3000,0.38,0.38,0.002,0.001,10\n", "line 8: nominal_cct_K 3000 is given twice"),
    "repeated name": ("name,nominal_cct_K,x,y,a,b,theta_deg\nA,3000,0.44,0.40,0.002,0.001,10\nA,4000,0.38,0.38,0.002,0.001,10\n", "line 8: name 'A' is given twice"),
    "blank name": ("name,nominal_cct_K,x,y,a,b,theta_deg\n,3000,0.44,0.40,0.002,0.001,10\n", "line 7: the name is blank"),
    "no name column": ("nominal_cct_K,x,y,a,b,theta_deg\n3000,0.44,0.40,0.002,0.001,10\n", "line 6: no 'name' column"),
}


@pytest.mark.parametrize("case", sorted(BAD))
def test_bad_ellipse_set_refused_with_the_line(write, case):
    table, fragment = BAD[case]
    with pytest.raises(InputError, match="bad_ellipses.csv") as err:
        read_ellipse_set(write("bad_ellipses.csv", HEAD + table))
    assert fragment in str(err.value) and "\n" not in str(err.value)


def test_a_single_row_without_nominal_is_uniform(write):
    ellipses = read_ellipse_set(write("u.csv", HEAD + "name,nominal_cct_K,x,y,a,b,theta_deg\nall,,,,0.002,0.001,30\n"))
    assert ellipses.uniform
    g, outside, unconfirmed = ellipses.metric([2200.0, 6500.0, 20000.0])
    np.testing.assert_array_equal(g[0], g[2])
    assert not outside.any() and not unconfirmed.any()
    with pytest.raises(InputError, match="has no centre for 4000 K"):
        ellipses.centre_xy(4000)
