"""Validity markers on report values: parentheses for doubtful values, letters for flags.

A value that one of its lamp's flags makes doubtful (:func:`lampcalc.rating.flags.doubtful_keys`)
is printed in parentheses, as in the terminal, never as an ordinary number; a value that
cannot be computed is "–". In the summary table each flag is a letter, the same letter for
the same flag on every page, and each page's legend says in words what its letters mean
(:data:`lampcalc.rating.flags.FLAG_MEANINGS`).
"""

from string import ascii_lowercase

from ..rating.flags import FLAG_MEANINGS, doubtful_keys, explain
from ..verdicts.wording import MISSING, format_value

VALIDITY_LEGEND = (
    "( ) a value in doubt: outside its method's validity, or computed with values not confirmed from a published "
    f"source (see the flags); not to be quoted as an ordinary value. {MISSING} not computable for this lamp, or not given."
)


def quote(record, key, *, unit=False, index=None):
    """``record[key]`` (or its ``index``-th item) as text, in parentheses when a flag makes it doubtful.

    Keys a record does not hold (added by a later lampcalc) print as "–".
    """
    value = record.get(key)
    if index is not None:
        value = value[index] if isinstance(value, (list, tuple)) and len(value) > index else None
    return format_value(key, value, doubtful=key in doubtful_keys(record.get("flags") or ()), unit=unit)


def flag_letters(records):
    """Flag -> letter for every flag in ``records``, in the order of the flag table (unknown flags last)."""
    present = {flag for r in records for flag in r.get("flags") or ()}
    ordered = [f for f in FLAG_MEANINGS if f in present] + sorted(present - set(FLAG_MEANINGS))
    return {flag: _letter(k) for k, flag in enumerate(ordered)}


def _letter(k):
    return ascii_lowercase[k] if k < 26 else ascii_lowercase[k // 26 - 1] + ascii_lowercase[k % 26]


def letters_of(letters, flags):
    """The letters of ``flags`` in legend order, "a, c, d" ("" for none)."""
    return ", ".join(sorted((letters[f] for f in flags or ()), key=lambda k: (len(k), k)))


def flag_legend(letters, flags):
    """Legend lines "a  words" for the ``flags`` present, in letter order."""
    shown = sorted(set(flags), key=lambda f: (len(letters[f]), letters[f]))
    return [f"{letters[f]}  {explain(f)}" for f in shown]
