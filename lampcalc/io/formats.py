"""The file forms lampcalc reads as spectra, by suffix.

Kept free of heavy imports: the command line reads it at start-up to find spectrum
files in folders.
"""

#: File suffixes read as spectra when a folder is given.
SPECTRUM_SUFFIXES = (".csv", ".tsv", ".txt", ".dat", ".json")
