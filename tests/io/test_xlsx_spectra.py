"""Excel workbooks: sheets, layouts, metadata cells and places named by sheet and cell.

Expected values are the cells' own numbers (SI prefixes for units, common practice, no source)."""

import io

import numpy as np
import openpyxl
import pytest

from lampcalc.errors import InputError
from lampcalc.io.spectrum_files import read_spectra

WL = list(range(380, 781, 20))


def workbook(path, sheets):
    book = openpyxl.Workbook()
    book.remove(book.active)
    for title, rows in sheets.items():
        sheet = book.create_sheet(title)
        for row in rows:
            sheet.append(row)
    book.save(path)
    return path


def columns(names=("QF-A", "QF-B"), wl=WL, offset=0):
    return [[None] * offset + ["nm", *names]] + [[None] * offset + [w, *(k + 1.0 for k in range(len(names)))] for w in wl]


def test_several_sheets_with_metadata_and_layouts(tmp_path):
    path = workbook(tmp_path / "lamps.xlsx", {
        "Info": [["Quillfen Lighting"], ["sent 2026-11-30"]],
        "LED": [["quantity", "flux"], ["electrical_W", 9.5, 12], ["angle_deg: 30"], [], *columns(("QF-A [mW/nm]", "QF-B"))],
        "Rows": [["nm", *WL], ["QF-C", *[0.5] * len(WL)]],
    })
    batch = read_spectra(path)
    assert batch.names == ("QF-A", "QF-B", "QF-C")
    assert batch.quantity == ("flux", "flux", "relative")
    assert batch.values[:, 0].tolist() == [1e-3, 2.0, 0.5]
    assert batch.electrical_W[:2].tolist() == [9.5, 12.0] and np.isnan(batch.electrical_W[2])
    assert batch.angle_deg[:2].tolist() == [30.0, 30.0]
    assert batch.sources == (f"{path}, sheet 'LED', column B (in mW/nm)", f"{path}, sheet 'LED', column C",
                             f"{path}, sheet 'Rows', row 2")


def test_table_away_from_the_corner_and_cells_named(tmp_path):
    rows = [[], [], *columns(offset=2)]
    rows[5][3] = "n/a"
    path = workbook(tmp_path / "offset.xlsx", {"Sphere": rows})
    with pytest.raises(InputError) as info:
        read_spectra(path)
    assert str(info.value) == f"{path}, sheet 'Sphere', cell D6 ('QF-A'): 'n/a' is not a number"
    rows[5][3] = 1.0
    assert read_spectra(workbook(tmp_path / "ok.xlsx", {"Sphere": rows})).names == ("QF-A", "QF-B")


def test_sheets_with_other_wavelengths_and_twice_named_lamps(tmp_path):
    path = workbook(tmp_path / "two.xlsx", {"A": columns(), "B": columns(("QF-C",), wl=WL[::2])})
    with pytest.raises(InputError, match="sheet 'B' has other wavelengths than sheet 'A'"):
        read_spectra(path)
    path = workbook(tmp_path / "dup.xlsx", {"A": columns(), "B": columns(("QF-A",))})
    with pytest.raises(InputError, match="lamp name 'QF-A' is used twice"):
        read_spectra(path)


@pytest.mark.parametrize(
    "content, fragment",
    [(b"", "not an .xlsx workbook"), (b"PK\x03\x04" + b"\x00" * 100, "not an .xlsx workbook"),
     (None, "no sheet holds a table of spectra")],
)
def test_not_workbooks(tmp_path, content, fragment):
    path = tmp_path / "bad.xlsx"
    if content is None:
        workbook(path, {"Notes": [["no numbers here"]]})
    else:
        path.write_bytes(content)
    with pytest.raises(InputError, match=fragment):
        read_spectra(path)


def test_zip_that_is_not_a_workbook(tmp_path):
    import zipfile

    buffer = io.BytesIO()
    with zipfile.ZipFile(buffer, "w") as archive:
        archive.writestr("hello.txt", "not a workbook")
    path = tmp_path / "z.xlsx"
    path.write_bytes(buffer.getvalue())
    with pytest.raises(InputError, match=r"not a readable .xlsx workbook \(KeyError"):
        read_spectra(path)


@pytest.mark.parametrize("suffix", [".xls", ".ods"])
def test_other_spreadsheets_told_what_to_do(tmp_path, suffix):
    path = tmp_path / f"old{suffix}"
    path.write_bytes(b"\xd0\xcf\x11\xe0")
    with pytest.raises(InputError, match="is not read; save it as .xlsx or CSV"):
        read_spectra(path)
