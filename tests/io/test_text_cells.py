"""Text as cells: encodings, quoted cells, strict numbers. Facts of the encodings and of IEEE 754."""

import sys

import pytest

from lampcalc.errors import InputError
from lampcalc.io.spectrum_checks import Where
from lampcalc.io.text_cells import choose_delimiter, decode_text, parse_number, show, split_cells

TEXT = "nm;Lampe A\n380;0,5\n"


@pytest.mark.parametrize("encoding", ["utf-8", "utf-8-sig", "utf-16", "utf-16-le", "utf-16-be", "utf-32", "latin-1"])
def test_decodes_the_usual_encodings(encoding):
    # UTF-16 without a byte-order mark is what some instrument software writes (common practice, no source).
    assert decode_text(TEXT.encode(encoding), Where("f.csv")) == TEXT


@pytest.mark.parametrize(
    "raw, fragment",
    [(b"", "empty"), (b"PK\x03\x04rest", "zip archive"), (b"\x89PNG\x00\x00\x01", "binary file"),
     (b"\xff\xfe" + b"\x00\xd8", "not valid UTF-16-LE text")],
)
def test_refuses_what_is_not_text(raw, fragment):
    with pytest.raises(InputError, match=fragment):
        decode_text(raw, Where("f.csv"))


def test_quoted_cells_and_trailing_separator():
    assert split_cells('380,"0,5","Lamp, A",', ",") == ["380", "0,5", "Lamp, A"]
    assert split_cells("380   0,5 ", None) == ["380", "0,5"]
    with pytest.raises(ValueError, match="field larger than field limit"):
        split_cells('1,"' + "9" * 200_000 + '"', ",")


@pytest.mark.parametrize(
    "line, expected",
    [("380,1.5", (",", False)), ("380;1,5", (";", True)), ("380\t1.5", ("\t", False)), ("380  1,5", (None, True)),
     ('380,"1,5"', (",", True)), ('380,"1.5"', (",", False)), ("380 1.5", (None, False))],
)
def test_separator_and_decimal_comma(line, expected):
    assert choose_delimiter(line) == expected


@pytest.mark.parametrize(
    "cell, decimal_comma, problem",
    [
        ("1e400", False, "beyond the range of a float"),  # IEEE 754 double: largest finite about 1.8e308
        ("-" + "9" * 400, False, "beyond the range of a float"),
        ("nan", False, "not finite"),
        ("-Infinity", False, "not finite"),
        ("1_000", False, "not a number"),  # Python's float() would take it; a spectrum file does not mean it
        ("0x10", False, "not a number"),
        ("\u0661\u0662", False, "not a number"),  # Arabic-Indic digits: float() takes them
        ("1.234,5", True, "thousands separator"),
        ("1.5", True, "decimal point where the file uses decimal commas"),
        ("", False, "not a number"),
    ],
)
def test_strict_numbers(cell, decimal_comma, problem):
    with pytest.raises(ValueError, match=problem):
        parse_number(cell, decimal_comma)


def test_numbers_read():
    assert parse_number("0,0123", True) == 0.0123
    assert parse_number("-.5e-3") == -0.0005
    assert parse_number(repr(sys.float_info.max)) == sys.float_info.max


def test_show_keeps_messages_short():
    assert show("x" * 10_000) == "'" + "x" * 40 + "'… (10,000 characters)"
