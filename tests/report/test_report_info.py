"""The report information file: TOML keys as strings, refused with the key's line otherwise.

TOML 1.0 syntax (toml.io) is read by the standard library; the keys are lampcalc's own.
"""

import pytest

from lampcalc.errors import InputError
from lampcalc.report.report_info import INFO_KEYS, ReportInfo, read_report_info, report_info_from


def test_every_key_read_as_given(write):
    text = "\n".join(f'{key} = "value of {key}"' for key in INFO_KEYS) + '\nnotes = """two\nlines"""\n'
    info = read_report_info(write("info.toml", text.replace('notes = "value of notes"\n', "")))
    assert info.client == "value of client" and info.report_number == "value of report_number"
    assert info.notes == "two\nlines"
    assert info.heading == "value of title"
    assert [label for label, _ in info.items()] == ["client", "project", "laboratory", "report number", "date",
                                                    "prepared by"]
    assert ReportInfo().heading == "Lamp rating report" and read_report_info(write("e.toml", "")) == ReportInfo()


@pytest.mark.parametrize(
    "text, message",
    [
        ('title = "X"\n\nclinet = "Q"\n', "line 3: unknown key 'clinet'; the keys are title, client"),
        ('# date of the report\ndate = 2025-04-02\n', 'line 2: date must be a string in quotes, not a date or time'),
        ("report_number = 14\n", "line 1: report_number must be a string in quotes, not a number"),
        ('title = "a"\n[client]\nname = "x"\n', "line 2: client must be a string in quotes, not a table"),
        ('title = "a"\nclient.name = "x"\n', "line 2: client must be a string in quotes, not a table"),
        ('notes = ["a", "b"]\n', "line 1: notes must be a string in quotes, not a list"),
        ('"project" = true\n', "line 1: project must be a string in quotes, not true/false"),
        ('title = "unclosed\nclient = "Q"\n', "line 1: not a valid TOML file (illegal character '\\n', column 18)"),
        ('title = "a"\ntitle = "b"\n', "line 2: not a valid TOML file (cannot overwrite a value, column 12)"),
    ],
)
def test_bad_files_name_the_line(write, text, message):
    path = write("info.toml", text)
    with pytest.raises(InputError) as err:
        read_report_info(path)
    assert str(err.value).startswith(f"{path}, {message}")
    assert "\n" not in str(err.value)


def test_unreadable_file(write):
    path = write("info.toml", b"\x89PNG\x00\xff", mode="wb")
    with pytest.raises(InputError, match=r"info\.toml: cannot be read as a text file"):
        read_report_info(path)


def test_a_mapping_is_checked_the_same_way():
    assert report_info_from({"client": "  Q  ", "date": ""}) == ReportInfo(client="Q")
    with pytest.raises(InputError, match="report information: unknown key 'colour'"):
        report_info_from({"colour": "red"})
