"""TOML files of lampcalc's own formats: syntax errors with their line, keys found by line.

TOML syntax is the TOML 1.0 specification (toml.io) as Python's tomllib reads it; no other
published source is involved.
"""

import pytest

from lampcalc.errors import InputError
from lampcalc.io.toml_files import key_line, read_toml


def test_read_and_refuse_with_the_line(write):
    data, text = read_toml(write("a.toml", '\ufeffa = "x"\n[b]\nc = 2\n'))
    assert data == {"a": "x", "b": {"c": 2}} and text.startswith("a =")
    with pytest.raises(InputError) as err:
        read_toml(write("b.toml", 'a = 1\nb = \n'))
    assert str(err.value).startswith(f"{write('c.toml', '').parent / 'b.toml'}, line 2: not a valid TOML file (")
    with pytest.raises(InputError, match="cannot be read as a text file"):
        read_toml(write("d.toml", b"\xff\xfe\x00", mode="wb"))


@pytest.mark.parametrize("text, key, line", [
    ('x = 1\ny = 2\n', "y", 2), ('x = 1\n\n[y]\nz = 1\n', "y", 3), ('x = 1\ny.z = 2\n', "y", 2),
    ('"y" = 1\n', "y", 1), ('[[y]]\n', "y", 1), ('yy = 1\n', "y", None),
])
def test_key_line(text, key, line):
    assert key_line(text, key) == line
