"""Finding the table in text and sheets: layouts, header units and angles, metadata, footers.

Expected values are the files' own numbers in the units their headers give (SI prefixes,
common practice, no source)."""

import numpy as np
import pytest

from lampcalc.errors import InputError
from lampcalc.io.delimited_text import read_spectra_text

WL = range(380, 781, 20)


def table(header="nm,A,B", rows=None, sep=","):
    rows = rows or [f"{w}{sep}1{sep}2" for w in WL]
    return header + "\n" + "\n".join(rows) + "\n"


def test_units_row_under_the_header():
    text = "Wavelength;QF-A;QF-B\nnm;mW/nm;W/nm\n" + "\n".join(f"{w};1;2" for w in WL)
    batch = read_spectra_text(text, "u.csv")
    assert batch.names == ("QF-A", "QF-B") and batch.quantity == ("flux", "flux")
    assert batch.values[:, 0].tolist() == [1e-3, 2.0]
    assert batch.sources == ("u.csv, column 2 (in mW/nm)", "u.csv, column 3 (in W/nm)")


def test_unit_metadata_line_and_override():
    batch = read_spectra_text("unit: W/(sr m² nm)\n" + table(), "r.csv")
    assert batch.quantity == ("radiance", "radiance")
    assert read_spectra_text("unit: mW/nm\n" + table(), quantity="relative").values[0, 0] == 1.0
    with pytest.raises(InputError, match="column 2: the unit 'mW/nm' is a spectral flux, but --quantity says irradiance"):
        read_spectra_text("unit: mW/nm\n" + table(), quantity="irradiance")
    with pytest.raises(InputError, match="the unit 'mW/nm' is a spectral flux, but the file's quantity line says radiance"):
        read_spectra_text("quantity: radiance\nunit: mW/nm\n" + table())
    with pytest.raises(InputError, match=r"column 2: unknown unit 'lm'"):
        read_spectra_text(table("nm,A [lm],B"))


def test_angles_from_names_and_metadata():
    batch = read_spectra_text(table("nm,QF@-15deg,QF@15.5deg"))
    assert batch.angle_deg.tolist() == [-15.0, 15.5] and batch.names == ("QF@-15deg", "QF@15.5deg")
    assert read_spectra_text("angle_deg: 10 20\n" + table("nm,QF@10deg,QF")).angle_deg.tolist() == [10.0, 20.0]
    with pytest.raises(InputError, match="the lamp's name says 10 deg, the file's angle_deg line 20"):
        read_spectra_text("angle_deg: 20\n" + table("nm,QF@10deg,QF"))
    with pytest.raises(InputError, match="the angle in the lamp name 'QF@xdeg' is not a number"):
        read_spectra_text(table("nm,QF@xdeg,B"))


def test_one_lamp_per_row_with_a_footer():
    text = "lamp;" + ";".join(map(str, WL)) + "\nQF-A;" + ";".join("0,5" for _ in WL) + "\nQF-B;" + ";".join(
        "1" for _ in WL) + "\n\nexported 2026-11-30\n"
    batch = read_spectra_text(text, "rows.csv")
    assert batch.names == ("QF-A", "QF-B") and batch.values[:, 0].tolist() == [0.5, 1.0]
    assert batch.sources == ("rows.csv, line 2", "rows.csv, line 3")
    with pytest.raises(InputError, match=r"line 3, column 3 \('QF-B'\): 'x' is not a number"):
        read_spectra_text(text.replace("QF-B;1;1;", "QF-B;1;x;", 1))
    with pytest.raises(InputError, match="line 3: ragged row: 3 fields where the table has 22"):
        read_spectra_text(text.replace("\nQF-B;" + ";".join("1" for _ in WL), "\nQF-B;1;1"))


def test_footers_and_blank_lines_after_the_table():
    text = table() + "\n\n  \nSum,21,42\nend\n"
    assert read_spectra_text(text).values.shape == (2, len(WL))
    with pytest.raises(InputError, match="line 5: numbers after the end of the table, which ended at line 4"):
        read_spectra_text("nm,A\n380,1\n390,1\nsaturated\n400,1\n")


def test_metadata_given_twice_differently():
    with pytest.raises(InputError, match="line 2: quantity is given twice, differently"):
        read_spectra_text("quantity: flux\nquantity: radiance\n" + table())
    assert read_spectra_text("quantity: flux\n# quantity: flux\n" + table()).quantity == ("flux", "flux")


def test_empty_cell_in_the_table():
    with pytest.raises(InputError, match=r"line 3, column 2 \('A'\): is empty where the table needs a number"):
        read_spectra_text("nm;A;B\n380;1;2\n400;;2\n")


def test_wavelength_unit_in_header():
    text = table("Wavelength [µm],A,B", [f"{w / 1000},1,2" for w in WL])
    np.testing.assert_allclose(read_spectra_text(text).wavelength_nm, list(WL))
    with pytest.raises(InputError, match="these look like micrometres"):
        read_spectra_text(table("Wavelength [nm],A,B", [f"{w / 1000},1,2" for w in WL]))
