"""Standards' classes for white light: ANSI C78.377 nominal CCT categories and
colour-consistency steps.

May import :mod:`lampcalc.colorimetry` and the layers below it.
"""
