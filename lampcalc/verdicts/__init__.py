"""Verdicts: a supplier's claims checked against the ratings; lots, colour over angle, comparisons.

May import :mod:`lampcalc.rating` and the layers below it.
"""
