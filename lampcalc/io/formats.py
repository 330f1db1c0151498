"""The file forms lampcalc reads as spectra, by suffix.

Kept free of heavy imports: the command line reads it at start-up to find spectrum
files in folders.
"""

#: Suffixes read as lampcalc JSON.
JSON_SUFFIXES = (".json",)
#: Suffixes read as Excel workbooks (openpyxl).
XLSX_SUFFIXES = (".xlsx", ".xlsm")
#: Suffixes read as IES TM-27-14 spectral documents.
SPDX_SUFFIXES = (".spdx", ".xml")
#: Suffixes read as delimited text.
TEXT_SUFFIXES = (".csv", ".tsv", ".txt", ".dat")
#: File suffixes read as spectra when a folder is given.
SPECTRUM_SUFFIXES = TEXT_SUFFIXES + JSON_SUFFIXES + XLSX_SUFFIXES + SPDX_SUFFIXES
#: Spreadsheet forms lampcalc does not read, and what to do instead.
UNREAD_SPREADSHEETS = {
    ".xls": "an Excel 97-2003 workbook",
    ".xlsb": "a binary Excel workbook",
    ".ods": "an OpenDocument spreadsheet",
}
