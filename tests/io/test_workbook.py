"""Workbooks written: numbers as numbers, nulls empty, text never a formula. Internal checks."""

import math

import openpyxl

from lampcalc.io.workbook import write_workbook


def test_values_and_text(tmp_path):
    path = tmp_path / "out.xlsx"
    write_workbook(path, [("ratings", ["name", "cct_K", "flags"], [["=HYPERLINK(\"x\")", 2700.5, ["a", "b"]],
                                                                   ["QF\x07B", math.nan, None]])])
    sheet = openpyxl.load_workbook(path)["ratings"]
    assert [c.value for c in sheet[1]] == ["name", "cct_K", "flags"]
    assert sheet["A2"].data_type == "s" and sheet["A2"].value == '=HYPERLINK("x")'
    assert sheet["B2"].value == 2700.5 and sheet["C2"].value == "a; b"
    assert sheet["A3"].value == "QFB" and sheet["B3"].value is None
    assert sheet.freeze_panes == "A2"
    assert not list(tmp_path.glob(".*"))
