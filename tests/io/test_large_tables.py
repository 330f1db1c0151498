"""Large text tables read by NumPy: the same batches and the same messages as the careful reader.

The reference is lampcalc's careful reader (read_spectra_text), whose messages and values the
reader corpus (tests/io/corpus) and tests/io/test_spectrum_table.py hold to the file forms of
docs/spectrum-files.md. The large-table path is forced on small files here (no big data in
tests): every file must give the careful reader's batch, byte for byte, or its exact message.
"""

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from lampcalc.errors import InputError
from lampcalc.io import large_tables
from lampcalc.io.delimited_text import read_spectra_text
from lampcalc.io.spectrum_files import open_spectra, read_spectra

from ..conftest import BAD_INPUTS

BATCH_FIELDS = ("wavelength_nm", "values", "names", "quantity", "sources", "electrical_W", "flags",
                "measured_range_nm", "measured_step_nm", "angle_deg")


@pytest.fixture
def forced(monkeypatch):
    """Every text file takes the large-table path, parsed a few lines at a time."""
    monkeypatch.setattr(large_tables, "FAST_MIN_BYTES", 0)
    monkeypatch.setattr(large_tables, "BLOCK_BYTES", 40)


def careful(path):
    try:
        return read_spectra_text(path.read_bytes().decode("utf-8-sig"), str(path))
    except InputError as err:
        return str(err)


def fast(path):
    try:
        return read_spectra(path)
    except InputError as err:
        return str(err)


def assert_same(got, expected):
    if isinstance(expected, str) or isinstance(got, str):
        assert got == expected
        return
    for name in BATCH_FIELDS:
        a, b = getattr(got, name), getattr(expected, name)
        assert np.array_equal(a, b, equal_nan=True) if isinstance(a, np.ndarray) else a == b, name


def _wide(n_lamps=3, rows=range(380, 781, 20), header="nm," + ",".join(f"QF-{k}" for k in range(3)), sep=","):
    lines = [header] if header else []
    for i, w in enumerate(rows):
        lines.append(sep.join([str(w)] + [repr(0.5 + 0.01 * ((i * 7 + k * 3) % 11)) for k in range(n_lamps)]))
    return lines


PLAIN = {
    "wide": "\n".join(_wide()) + "\n",
    "wide_metadata": "# Quillfen Lighting lab export\nquantity: flux\nelectrical_W: 4 5 6\n\n" + "\n".join(_wide()),
    "wide_units_angles": "\n".join(_wide(header="wavelength [nm],QF-DL@0deg [mW/nm],QF-DL@30deg [mW/nm],QF-DL@60deg [W/nm]")),
    "wide_unit_row": "nm,QF-1,QF-2,QF-3\nnm,mW/nm,mW/nm,mW/nm\n" + "\n".join(_wide(header=None)),
    "wide_tabs_crlf": "\r\n".join(_wide(header="nm\tA\tB\tC", sep="\t")) + "\r\n",
    "wide_blank_lines": "\n".join(line + ("\n" if k % 5 == 2 else "") for k, line in enumerate(_wide())),
    "wide_no_header": "\n".join(_wide(header=None)),
    "wide_blanks": "\n".join(_wide(header="nm A B C", sep=" ")),
    "long": "nm," + ",".join(str(w) for w in range(380, 781, 20)) + "\n"
    + "\n".join(f"QF-R{k}," + ",".join(repr(0.4 + 0.01 * ((k + i) % 7)) for i in range(21)) for k in range(9)),
    "long_units_angles": "nm," + ",".join(str(w) for w in range(380, 781, 20)) + "\n"
    + "\n".join(f"QF-R@{10 * k}deg [mW/nm]," + ",".join(repr(0.4 + 0.01 * ((k + i) % 7)) for i in range(21)) for k in range(4)),
    "bom": "\ufeff" + "\n".join(_wide()),
}


@pytest.mark.parametrize("case", sorted(PLAIN))
def test_plain_tables_give_the_careful_readers_batch(forced, tmp_path, case):
    path = tmp_path / f"{case}.csv"
    path.write_text(PLAIN[case], encoding="utf-8")
    with open_spectra(path) as spectra:
        assert isinstance(spectra, large_tables.LargeText)  # the large-table path was taken
        pieces = list(spectra.chunks(2))
    assert_same(fast(path), careful(path))
    assert sum(p.n_lamps for p in pieces) == careful(path).n_lamps


ODD = {
    "footer": "\n".join(_wide()) + "\nend of export\n",
    "comment_inside": "\n".join(_wide()[:5] + ["# lamp warmed up"] + _wide()[5:]),
    "quoted": "\n".join(_wide()[:4] + ['400,"0.5",0.5,0.5'] + _wide()[5:]),
    "decimal_comma": "nm;A\n" + "\n".join(f"{w};0,{5 + w % 3}" for w in range(380, 781, 10)),
    "trailing_separator": "\n".join(line + "," for line in _wide()),
    "nan_deep": "\n".join(_wide()[:15] + ["680,0.5,nan,0.5"] + _wide()[16:]),
    "ragged_deep": "\n".join(_wide()[:15] + ["680,0.5,0.5"] + _wide()[16:]),
    "text_deep": "\n".join(_wide()[:15] + ["680,0.5,abc,0.5"] + _wide()[16:]),
    "negative_deep": "\n".join(_wide()[:15] + ["680,0.5,-0.2,0.5"] + _wide()[16:]),
    "noise_deep": "\n".join(_wide()[:15] + ["680,0.5,-0.0001,0.5"] + _wide()[16:]),
    "zero_lamp": "nm,A,B\n" + "\n".join(f"{w},0.5,0" for w in range(380, 781, 10)),
    "decreasing_deep": "\n".join(_wide()[:15] + ["600,0.5,0.5,0.5"] + _wide()[16:]),
    "duplicate_names": "\n".join(_wide(header="nm,A,B,A")),
    "unicode_digits": "\n".join(_wide()[:15] + ["680,0.5,٣,0.5"] + _wide()[16:]),
    "underscore": "\n".join(_wide()[:15] + ["680,0.5,1_0,0.5"] + _wide()[16:]),
    "huge": "\n".join(_wide()[:15] + ["680,0.5,1e999,0.5"] + _wide()[16:]),
    "bad_metadata": "quantity: lumens\n" + "\n".join(_wide()),
    "micrometres": "\n".join(f"{w / 1000:.3f},1.0" for w in range(380, 781, 5)),
    "long_numeric_name": "nm," + ",".join(str(w) for w in range(380, 781, 20)) + "\nQF-1," + ",".join(["1"] * 21)
    + "\n42," + ",".join(["1"] * 21),
    "long_ragged": "nm," + ",".join(str(w) for w in range(380, 781, 20)) + "\nQF-1," + ",".join(["1"] * 21)
    + "\nQF-2," + ",".join(["1"] * 20),
    "lone_cr": "\r".join(_wide()),
    "latin1": ("# Quillfen \xe9clairage\n" + "\n".join(_wide())).encode("latin-1"),
}


@pytest.mark.parametrize("case", sorted(ODD) + sorted(BAD_INPUTS))
def test_odd_tables_give_the_careful_readers_answer(forced, tmp_path, case):
    content = ODD[case] if case in ODD else BAD_INPUTS[case][0]
    path = tmp_path / f"{case}.csv"
    path.write_bytes(content if isinstance(content, bytes) else content.encode("utf-8"))
    # the careful reader for these, without the large-table path (the reference)
    with pytest.MonkeyPatch.context() as mp:
        mp.setattr(large_tables, "FAST_MIN_BYTES", 1 << 62)
        expected = fast(path)
    assert_same(fast(path), expected)


_CELLS = st.sampled_from(["0.5", "1", "2.5e-1", "0", "-0.0001", "-1", "nan", "x", "", "1,5", '"0.5"', "7e400", " 0.3 "])


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(cells=st.lists(st.tuples(st.integers(0, 20), st.integers(1, 3), _CELLS), max_size=3),
       block=st.integers(10, 400))
def test_fuzzed_tables_give_the_careful_readers_answer(forced, tmp_path, monkeypatch, cells, block):
    monkeypatch.setattr(large_tables, "BLOCK_BYTES", block)
    rows = [line.split(",") for line in _wide()]
    for r, c, cell in cells:
        rows[r + 1][c] = cell
    path = tmp_path / "fuzz.csv"
    path.write_text("\n".join(",".join(r) for r in rows) + "\n", encoding="utf-8")
    got = fast(path)
    monkeypatch.setattr(large_tables, "FAST_MIN_BYTES", 1 << 62)
    assert_same(got, fast(path))  # the careful reader (reference)


def test_the_values_on_disk_have_no_name(forced, tmp_path, monkeypatch):
    import tempfile

    spool_dir = tmp_path / "tmp"
    spool_dir.mkdir()
    monkeypatch.setattr(tempfile, "tempdir", str(spool_dir))
    path = tmp_path / "wide.csv"
    path.write_text(PLAIN["wide"])
    with open_spectra(path) as spectra:
        next(spectra.chunks(1))
        assert list(spool_dir.iterdir()) == []  # nothing to leave behind, even when killed
    assert list(spool_dir.iterdir()) == []


@pytest.mark.parametrize("case, expected", [
    ("text_deep", "line 16, column 3: 'abc' is not a number"),
    ("ragged_deep", "line 16: 3 fields where the table has 4"),
    ("nan_deep", "line 16, column 3: 'nan' is not finite (NaN or infinity)"),
    ("long_ragged", "line 3: 21 fields where the table has 22"),
])
def test_a_file_too_large_for_the_careful_reader_says_which_line_is_not_plain(forced, tmp_path, monkeypatch, case,
                                                                              expected):
    # the careful reader's words for the cell (tests/io/test_spectrum_table.py), and why the file is not read
    monkeypatch.setattr(large_tables, "CAREFUL_MAX_BYTES", 10)
    path = tmp_path / f"{case}.csv"
    path.write_text(ODD[case], encoding="utf-8")
    message = fast(path)
    assert message.startswith(f"{path}, {expected}; a file over ")
    assert message.endswith("is read only as a plain table (docs/scale.md)")
