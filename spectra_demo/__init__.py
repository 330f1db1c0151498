"""Demo spectra of a fictional supplier, shipped as package data."""
