"""Report information: who the report is for and by whom, from a small TOML file.

The file holds up to eight keys, every one optional and a string::

    title = "Downlight range, spring 2025"
    client = "Quillfen Lighting"
    project = "Range review"
    laboratory = "Example photometry laboratory"
    report_number = "QF-2025-014"
    date = "2025-04-02"
    prepared_by = "A. Engineer"
    notes = '''Spectra measured by the client; see the methods page.'''

lampcalc prints them as given: it invents no date and no number, so the same inputs give
the same report. The file is read with the standard library's TOML reader (TOML 1.0).
"""

from dataclasses import dataclass, fields

from ..errors import InputError
from ..io.toml_files import key_line, read_toml

#: Key -> what it is, in the order the report shows them.
INFO_KEYS = {
    "title": "the report's title (default: Lamp rating report)",
    "client": "who the report is for",
    "project": "the project or job",
    "laboratory": "who measured the spectra",
    "report_number": "the report's number, printed on every page",
    "date": "the report's date, printed as written",
    "prepared_by": "who prepared the report",
    "notes": "a paragraph printed on the first page",
}
DEFAULT_TITLE = "Lamp rating report"


@dataclass(frozen=True)
class ReportInfo:
    """The report information; ``None`` where not given."""

    title: str = None
    client: str = None
    project: str = None
    laboratory: str = None
    report_number: str = None
    date: str = None
    prepared_by: str = None
    notes: str = None

    @property
    def heading(self):
        """The title to print: the one given, else the default."""
        return self.title or DEFAULT_TITLE

    def items(self):
        """(label, value) of the keys given, title excluded, in :data:`INFO_KEYS` order."""
        labels = {"report_number": "report number", "prepared_by": "prepared by"}
        return [(labels.get(f.name, f.name), getattr(self, f.name)) for f in fields(self)
                if f.name not in ("title", "notes") and getattr(self, f.name)]


def report_info_from(values, where="report information", text=""):
    """A :class:`ReportInfo` from a mapping, refusing unknown keys and values that are not strings.

    Raises
    ------
    InputError
        One line naming ``where`` and, when ``text`` (the file's text) shows it, the key's line.
    """
    def at(key):
        line = key_line(text, key) if text else None
        return f"{where}, line {line}" if line else where

    for key, value in values.items():
        if key not in INFO_KEYS:
            raise InputError(f"{at(key)}: unknown key {key!r}; the keys are {', '.join(INFO_KEYS)}")
        if not isinstance(value, str):
            kind = ("true/false" if isinstance(value, bool) else "a number" if isinstance(value, (int, float))
                    else "a table" if isinstance(value, dict) else "a list" if isinstance(value, list) else "a date or time")
            hint = ' (write it in quotes, e.g. date = "2025-04-02")' if key == "date" else ""
            raise InputError(f"{at(key)}: {key} must be a string in quotes, not {kind}{hint}")
    return ReportInfo(**{k: v.strip() or None for k, v in values.items()})


def read_report_info(path):
    """Read a report-information TOML file (keys of :data:`INFO_KEYS`).

    Raises
    ------
    InputError
        For a file that cannot be read or is not TOML (with its line and column), an
        unknown key or a value that is not a string (with the key's line); see
        :mod:`lampcalc.io.toml_files`.

    Examples
    --------
    >>> import tempfile, pathlib
    >>> folder = pathlib.Path(tempfile.mkdtemp())
    >>> _ = (folder / "info.toml").write_text('client = "Quillfen Lighting"\\nreport_number = "QF-7"\\n')
    >>> read_report_info(folder / "info.toml").report_number
    'QF-7'
    """
    values, text = read_toml(path)
    return report_info_from(values, str(path), text)
