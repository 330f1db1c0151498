"""TOML files of lampcalc's own formats (report information, measurement models): read, or refused in one line.

Read with the standard library (TOML 1.0). A file that cannot be read or is not TOML is
refused with its line and column; :func:`key_line` finds the line of a key, so that a
reader can name it when a key is unknown or its value of the wrong type (tomllib reports
lines for syntax errors only).
"""

import re
import tomllib
from pathlib import Path

from ..errors import InputError


def read_toml(path):
    """``(data, text)`` of a TOML file.

    Raises
    ------
    InputError
        For a file that cannot be read as UTF-8 text, or is not TOML (with the line and column).
    """
    try:
        text = Path(path).read_bytes().decode("utf-8-sig")
    except (OSError, UnicodeDecodeError) as err:
        raise InputError(f"{path}: cannot be read as a text file ({getattr(err, 'strerror', None) or err})") from None
    try:
        return tomllib.loads(text), text
    except tomllib.TOMLDecodeError as err:
        found = re.search(r"\(at line (\d+), column (\d+)\)", str(err))
        reason = re.sub(r"\s*\(at (line \d+, column \d+|end of document)\)", "", str(err)).lower()
        where, column = (f", line {found[1]}", f", column {found[2]}") if found else ("", "")
        raise InputError(f"{path}{where}: not a valid TOML file ({reason}{column})") from None


def key_line(text, key):
    """Line number (1-based) where ``key`` is set, or opens a table, in TOML ``text``; None if not found.

    Examples
    --------
    >>> key_line('a = 1\\n\\n[b]\\nc = 2\\n', "b")
    3
    """
    pattern = re.compile(rf"^\s*\[*\s*[\"']?{re.escape(key)}[\"']?\s*[.=\]]")
    for number, line in enumerate(text.splitlines(), 1):
        if pattern.match(line):
            return number
    return None
