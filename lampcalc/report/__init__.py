"""The PDF report for a client, and the caution every result carries.

May import :mod:`lampcalc.plots` and every layer below. This package imports nothing at
start-up (the command line reads the caution without loading matplotlib).
"""
