"""Verdicts: a supplier's claims checked against the ratings.

May import :mod:`lampcalc.rating` and the layers below it.
"""
