"""``python -m lampcalc`` runs the command line."""

from .cli import main

main()
