"""Text files as rows of cells: decoding, separators, quoted cells and numbers.

What the spectrum reader and the claims reader share. Every step is linear in the size
of the text (no backtracking patterns, no repeated splitting), so a line of a megabyte
costs what a megabyte of table costs. Numbers are read strictly: ``1_000``, ``0x10``,
digits of other scripts and thousands separators are not numbers; NaN, infinity and
values beyond the range of a float are told apart so that a message can say which.
"""

import csv
import math
import re

#: Marks that start a comment line.
COMMENT_MARKS = ("#", "%", "//")

_NUMBER = re.compile(r"[+-]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][+-]?[0-9]+)?")
_NONFINITE = re.compile(r"[+-]?(?:nan|inf|infinity)", re.IGNORECASE)
_BOMS = (
    (b"\xef\xbb\xbf", "utf-8"),
    (b"\xff\xfe\x00\x00", "utf-32-le"),
    (b"\x00\x00\xfe\xff", "utf-32-be"),
    (b"\xff\xfe", "utf-16-le"),
    (b"\xfe\xff", "utf-16-be"),
)
_SAMPLE = 8192
#: Control characters other than tab, line feed, form feed and carriage return: many mean a binary file.
_CONTROL = re.compile(r"[\x00-\x08\x0b\x0e-\x1f]")


def _utf16_without_bom(raw):
    """'utf-16-le' or '-be' when every other byte of the start is zero (ASCII text in UTF-16)."""
    sample = raw[:_SAMPLE]
    if len(sample) < 4:
        return None
    even, odd = sample[0::2], sample[1::2]
    if even.count(0) > 0.4 * len(even) and odd.count(0) < 0.05 * len(odd):
        return "utf-16-be"
    if odd.count(0) > 0.4 * len(odd) and even.count(0) < 0.05 * len(even):
        return "utf-16-le"
    return None


def decode_text(raw, where):
    """The text of a file's bytes.

    UTF-8, UTF-16 and UTF-32 with a byte-order mark, UTF-16 without one (recognised by its
    zero bytes), else UTF-8, else Latin-1 (the usual 8-bit export). Binary files (images,
    zip archives such as spreadsheets) are refused.

    Raises
    ------
    InputError
    """
    if not raw.strip():
        raise where("the file is empty")
    if raw[:4] == b"PK\x03\x04":
        raise where("this is a zip archive (a spreadsheet?), not a text table; give a workbook the suffix .xlsx")
    encoding = next((enc for bom, enc in _BOMS if raw.startswith(bom)), None)
    if encoding is not None:
        raw = raw[len(next(b for b, e in _BOMS if e == encoding)) :]
    else:
        encoding = _utf16_without_bom(raw)
    if encoding is None and b"\x00" in raw[:_SAMPLE]:
        raise where("this is a binary file, not a text table of spectra")
    try:
        text = raw.decode(encoding or "utf-8")
    except UnicodeDecodeError as err:
        if encoding is not None:
            raise where(f"is not valid {encoding.upper()} text (byte {err.start})") from None
        text = raw.decode("latin-1")
    if "\x00" in text[:_SAMPLE] or len(_CONTROL.findall(text, 0, _SAMPLE)) > 8:
        raise where("this is a binary file, not a text table of spectra")
    if not text.strip():
        raise where("the file is empty")
    return text


def strip_comment(text):
    """``text`` without its comment mark, or None if it is not a comment line."""
    for mark in COMMENT_MARKS:
        if text.startswith(mark):
            return text[len(mark) :]
    return None


def split_cells(line, delimiter):
    """The cells of one line, stripped; quotes removed; a trailing separator ignored.

    ``delimiter`` None splits on runs of blanks. Quoted cells may hold the separator.

    Raises
    ------
    ValueError
        For a quote that is never closed, or a cell over the csv module's size limit.
    """
    line = line.strip()
    if delimiter is None:
        cells = line.split()
    elif '"' in line:
        try:
            cells = next(csv.reader([line], delimiter=delimiter, skipinitialspace=True, strict=True))
        except csv.Error as err:
            raise ValueError(str(err)) from None
        cells = [c.strip() for c in cells]
    else:
        cells = [c.strip() for c in line.split(delimiter)]
    if len(cells) > 1 and cells[-1] == "":
        cells.pop()
    return cells


def looks_numeric(cell, decimal_comma=False):
    """True if ``cell`` reads as a number (finite or not)."""
    if decimal_comma:
        cell = cell.replace(",", ".", 1)
    return bool(_NUMBER.fullmatch(cell) or _NONFINITE.fullmatch(cell))


def parse_number(cell, decimal_comma=False):
    """The float a cell holds.

    Raises
    ------
    ValueError
        With the reason in words: "is not a number", "is not finite (NaN or infinity)" or
        "is beyond the range of a float".
    """
    text = cell
    if decimal_comma:
        if "." in cell:
            if _NUMBER.fullmatch(cell) or _NUMBER.fullmatch(cell.replace(".", "").replace(",", ".", 1)):
                raise ValueError("has a decimal point where the file uses decimal commas (a thousands separator?)")
            raise ValueError("is not a number")
        text = cell.replace(",", ".", 1)
    if _NUMBER.fullmatch(text):
        value = float(text)
        if math.isinf(value):
            raise ValueError("is beyond the range of a float (about ±1.8e308)")
        return value
    if _NONFINITE.fullmatch(cell):
        raise ValueError("is not finite (NaN or infinity)")
    raise ValueError("is not a number")


def choose_delimiter(line):
    """The separator of a data line (None for blanks) and whether its numbers use decimal commas."""
    for delimiter in ("\t", ";"):
        if delimiter in line:
            return delimiter, "," in line
    if "," in line:
        try:
            cells = split_cells(line, ",")
        except ValueError:  # an unclosed quote: the table's reader names its line
            return ",", False
        if '"' in line:
            return ",", any("," in c for c in cells)
        if all(looks_numeric(c) for c in cells):
            return ",", False
        if all(looks_numeric(c, True) for c in split_cells(line, None)):
            return None, True
        return ",", False
    return None, False


def show(cell, limit=40):
    """A cell quoted for a message, shortened so that the message stays one readable line."""
    text = str(cell)
    return repr(text) if len(text) <= limit else repr(text[:limit]) + f"… ({len(text):,} characters)"
