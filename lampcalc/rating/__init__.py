"""Rating: every number lampcalc reports for each spectrum, as a :class:`~lampcalc.rating.ratings.Ratings` table.

May import :mod:`lampcalc.standards`, :mod:`lampcalc.rendering` and the layers below them.
"""
