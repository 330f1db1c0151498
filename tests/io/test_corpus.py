"""The corpus of supplier files (tests/io/corpus/): each read right, or refused in one line.

Expected values come from the files themselves (what a cell says, in the unit its header
gives: SI prefixes, common practice, no source); messages must name the file by its path as
given, the place in it and what is wrong, and be one line.
"""

import time
from pathlib import Path

import numpy as np
import pytest

from lampcalc.errors import InputError
from lampcalc.io.spectrum_files import read_spectra
from lampcalc.verdicts.claims import read_claims

CORPUS = Path(__file__).parent / "corpus"
FIRST_2700K = 0.027407  # the corpus's 2700 K spectrum at 380 nm, as written in its files

# file -> (names, quantity, value of the first lamp at 380 nm in lampcalc's units)
GOOD = {
    "utf16_bom.csv": (("QF-A", "QF-B"), "relative", FIRST_2700K),
    "utf16_no_bom.csv": (("QF-A", "QF-B"), "relative", FIRST_2700K),
    "utf8_bom.csv": (("QF-A", "QF-B"), "relative", FIRST_2700K),
    "quoted_decimal_commas.csv": (("QF-A",), "relative", FIRST_2700K),
    "semicolon_decimal_commas.csv": (("QF-A",), "relative", FIRST_2700K),
    "footer_after_table.csv": (("QF-A", "QF-B"), "relative", FIRST_2700K),
    "one_lamp_per_row.csv": (("QF-A", "QF-B"), "relative", FIRST_2700K),
    # "[mW/nm]": flux, milli = 1e-3 (SI prefix)
    "unit_in_header_mW.csv": (("Spectral flux QF-A",), "flux", 2 * FIRST_2700K * 1e-3),
    # "[µW/nm]" in Latin-1: micro = 1e-6 (SI prefix)
    "latin1_unit.csv": (("QF-A",), "flux", FIRST_2700K * 1e-6),
    "angles_in_header.csv": (("QF-DL-4000@0deg", "QF-DL-4000@30deg"), "relative", FIRST_2700K),
    "good.json": (("QF-A",), "flux", FIRST_2700K),
    "sphere.xlsx": (("QF-A", "QF-B"), "flux", FIRST_2700K * 1e-3),
    "rows_text_decimal_commas.xlsx": (("QF-A", "QF-B"), "relative", FIRST_2700K),
    "quillfen.spdx": (("QF-A",), "relative", FIRST_2700K),
}

BAD = {
    "beyond_float.csv": "line 3, column 2 ('QF-A'): '1e400' is beyond the range of a float",
    "integer_beyond_float.csv": "line 3, column 2 ('QF-A'): '9999",
    "infinity.csv": "line 3, column 2 ('QF-A'): 'inf' is not finite",
    "text_inside_table.csv": "line 5: numbers after the end of the table, which ended at line 4",
    "huge_integer.json": "lamps[0].values[0]: is beyond the range of a float",
    "integer_5000_digits.json": "holds an integer of thousands of digits",
    "one_point.json": "wavelength_nm[0]: a spectrum needs at least two wavelengths",
    "quantity_null.json": "quantity: unknown quantity a list of 1",
    "values_null.json": "lamps[0].values[0]: is null, not a number",
    "truncated.xlsx": "not an .xlsx workbook",
    "tm27_reflectance.xml": "SpectralQuantity 'reflectance' is not one lampcalc computes with",
    "tm27_repeated_wavelength.spdx": "SpectralData 2: duplicate wavelength 380",
    "not_tm27.xml": "not an IES TM-27-14 spectral document",
}


@pytest.mark.parametrize("name", sorted(GOOD))
def test_good_files_read_right(name):
    names, quantity, first = GOOD[name]
    batch = read_spectra(CORPUS / name)
    assert batch.names == names
    assert set(batch.quantity) == {quantity}
    assert batch.wavelength_nm[0] == 380.0 and batch.wavelength_nm[-1] == 780.0
    assert batch.values[0, 0] == pytest.approx(first, rel=1e-12)
    assert all(s.startswith(str(CORPUS / name)) for s in batch.sources)


def test_corpus_angles_and_power():
    assert read_spectra(CORPUS / "angles_in_header.csv").angle_deg.tolist() == [0.0, 30.0]
    np.testing.assert_array_equal(read_spectra(CORPUS / "sphere.xlsx").electrical_W, [9.5, 12.0])


@pytest.mark.parametrize("name", sorted(BAD))
def test_bad_files_refused_in_one_line(name):
    path = CORPUS / name
    with pytest.raises(InputError) as info:
        read_spectra(path)
    message = str(info.value)
    assert message.startswith(f"{path}"), message
    assert BAD[name] in message, message
    assert "\n" not in message and len(message) < 400


@pytest.mark.parametrize(
    "name, text",
    [
        # A run of blanks made the old metadata pattern quadratic: 80,000 characters took 37 s.
        ("long_metadata_line.csv", "Operator" + " " * 200_000 + "QF\n"),
        ("long_comment_line.csv", "# note" + " " * 200_000 + "end\n"),
    ],
)
def test_long_lines_read_in_linear_time(tmp_path, name, text):
    path = tmp_path / name
    path.write_text(text + (CORPUS / "utf8_bom.csv").read_text(encoding="utf-8-sig"), encoding="utf-8")
    start = time.perf_counter()
    assert read_spectra(path).names == ("QF-A", "QF-B")
    assert time.perf_counter() - start < 1.0


def test_deep_json_refused(tmp_path):
    path = tmp_path / "deep.json"
    path.write_text("[" * 100_000 + "]" * 100_000)
    with pytest.raises(InputError, match="nested too deeply"):
        read_spectra(path)


def test_claims_corpus(tmp_path):
    claims = read_claims(CORPUS / "claims_semicolons.csv")
    assert claims["QF-A"].values == {"nominal_cct_K": 2700.0, "min_ra": 80.5, "min_r9": -10.0}
    with pytest.raises(InputError, match="line 1: has a header but no lamps"):
        read_claims(CORPUS / "claims_header_only.csv")
    huge = tmp_path / "huge.csv"
    huge.write_text('lamp,min_ra\nQF-A,"' + "8" * 200_000 + '"\n')
    with pytest.raises(InputError, match=r"huge.csv, line 2: cannot be split into cells \(field larger"):
        read_claims(huge)
