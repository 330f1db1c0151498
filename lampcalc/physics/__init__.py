"""Physics: constants and blackbody radiation (Planck's law, Stefan–Boltzmann, Wien).

The lowest layer: imports nothing from lampcalc but :mod:`lampcalc.errors`.
"""
