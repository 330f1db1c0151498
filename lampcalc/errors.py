"""The exception lampcalc raises for bad input."""


class InputError(ValueError):
    """Bad input from a user: a file, a row, a cell or a value that cannot be used.

    ``str(error)`` is one line that names where the problem is (file, line, column or
    value) and what it is. The command line prints that line and exits with status 2.
    """
