"""Reading and writing spectrum files: the forms instruments export, and every bad input."""

import json

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from lampcalc.errors import InputError
from lampcalc.spectra.batch import SpectralBatch
from lampcalc.io.spectrum_files import read_spectra, spectra_to_csv, spectra_to_json
from lampcalc.io.delimited_text import read_spectra_text

GOOD_ROWS = "\n".join(f"{w},{1 + w / 1000:.4f},{2 - w / 1000:.4f}" for w in range(380, 785, 5))


def test_comma_with_header(write):
    path = write("a.csv", "wavelength,Lamp A,Lamp B\n" + GOOD_ROWS)
    batch = read_spectra(path)
    assert batch.names == ("Lamp A", "Lamp B")
    assert batch.values.shape == (2, 81)
    assert batch.sources == (f"{path}, column 2", f"{path}, column 3")
    assert batch.quantity == ("relative", "relative")
    assert batch.values[0, 0] == pytest.approx(1.38)


def test_no_header_names_from_file(write):
    batch = read_spectra(write("lamps.csv", GOOD_ROWS))
    assert batch.names == ("lamps_1", "lamps_2")


@pytest.mark.parametrize("delimiter", ["\t", " ", "   ", ";"])
def test_other_delimiters(write, delimiter):
    text = "\n".join(r.replace(",", delimiter) for r in GOOD_ROWS.splitlines())
    batch = read_spectra(write("t.txt", "nm" + delimiter + "a" + delimiter + "b\n" + text))
    assert batch.values.shape == (2, 81) and batch.names == ("a", "b")


def test_semicolon_decimal_comma_with_metadata(write):
    # A spreadsheet export as in continental Europe: semicolons, decimal commas, metadata first.
    text = "Messung;Kugel 2\nDatum;2026-11-30\nquantity;relative\nWellenlaenge;L1\n" + "\n".join(
        f"{w};{0.5 + w / 10000:.4f}".replace(".", ",") for w in range(380, 781, 1)
    )
    batch = read_spectra(write("eu.csv", text))
    assert batch.names == ("L1",)
    assert batch.values[0, 0] == pytest.approx(0.538)
    assert batch.wavelength_nm[1] == 381


def test_whitespace_decimal_comma(write):
    text = "\n".join(f"{w}  {0.5 + w / 10000:.4f}".replace(".", ",") for w in range(380, 781, 2))
    batch = read_spectra(write("ws.txt", text))
    assert batch.values[0, 1] == pytest.approx(0.5382)


def test_comments_and_metadata_quantity_and_power(write):
    text = "# instrument export\n% exported by hand\n// x\n# quantity: flux\n# electrical_W: 9.5 12\nnm,a,b\n" + GOOD_ROWS
    batch = read_spectra(write("abs.csv", text))
    assert batch.quantity == ("flux", "flux")
    np.testing.assert_array_equal(batch.electrical_W, [9.5, 12.0])


def test_trailing_delimiter_and_quotes(write):
    text = '"nm","a",\n' + "\n".join(f'{w},"{1 + w / 1000:.3f}",' for w in range(380, 781, 10))
    batch = read_spectra(write("q.csv", text))
    assert batch.names == ("a",) and batch.values.shape == (1, 41)


def test_micrometres_accepted_with_option_refused_without(write):
    text = "um,a\n" + "\n".join(f"{w / 1000:.3f},{1.0}" for w in range(380, 781, 5))
    path = write("um.csv", text)
    with pytest.raises(InputError, match="micrometres.*--wavelength-unit um"):
        read_spectra(path)
    batch = read_spectra(path, wavelength_unit="um")
    assert batch.wavelength_nm[0] == pytest.approx(380.0) and batch.wavelength_nm[-1] == pytest.approx(780.0)


def test_micrometre_metadata_line(write):
    text = "wavelength_unit: um\n" + "\n".join(f"{w / 1000:.3f},1.0" for w in range(380, 781, 5))
    assert read_spectra(write("um2.csv", text)).wavelength_nm[-1] == pytest.approx(780.0)


def test_negative_noise_clipped_and_noted(write):
    rows = [f"{w},{1.0 if w != 500 else -0.004}" for w in range(380, 781, 5)]
    batch = read_spectra(write("n.csv", "\n".join(rows)))
    assert batch.values.min() == 0.0
    assert batch.flags == (("negative_noise_clipped",),)


def test_bad_input_one_clear_line(write, bad_input):
    case, content, fragment = bad_input
    path = write(f"{case}.csv", content, mode="wb")
    with pytest.raises(InputError) as info:
        read_spectra(path)
    message = str(info.value)
    assert message.startswith(str(path)), message
    assert fragment in message, message
    assert "\n" not in message


def test_refuses_spectra_narrower_than_400_700(write):
    batch = read_spectra(write("short.csv", "\n".join(f"{w},1" for w in range(410, 701, 5))))
    with pytest.raises(InputError, match="data cover 410-700 nm; at least 400-700 nm"):
        batch.on_grid()


def test_flags_range_truncated_and_pads_with_zero(write):
    # PITFALLS: no silent extrapolation; data short of 380–780 nm are flagged and zero outside.
    batch = read_spectra(write("t.csv", "\n".join(f"{w},1" for w in range(400, 751, 5)))).on_grid()
    assert batch.flags == (("range_truncated",),)
    assert batch.values[0, 39] == 0 and batch.values[0, 40] == 1 and batch.values[0, 391] == 0
    np.testing.assert_array_equal(batch.measured_range_nm, [[400, 750]])


def _json_doc(**changes):
    doc = {"lampcalc_spectra": 1, "quantity": "flux", "wavelength_nm": [380, 580, 780],
           "lamps": [{"name": "L", "values": [1, 2, 1], "electrical_W": 5}]}
    doc.update(changes)
    return json.dumps(doc)


def test_json_form(write):
    path = write("s.json", _json_doc())
    batch = read_spectra(path)
    assert batch.names == ("L",) and batch.quantity == ("flux",)
    np.testing.assert_array_equal(batch.electrical_W, [5.0])
    assert batch.sources == (f"{path}, lamps[0]",)


@pytest.mark.parametrize(
    "doc, fragment",
    [
        ("{not json", "not valid JSON"),
        (json.dumps({"x": 1}), "not a lampcalc spectra file"),
        (_json_doc(wavelength_nm=[380, 380, 780]), "wavelength_nm[1]: duplicate wavelength 380"),
        (_json_doc(lamps=[{"name": "L", "values": [1, "a", 1]}]), "lamps[0].values[1]: is 'a', not a number"),
        (_json_doc(lamps=[{"name": "L", "values": [1, 1]}]), "lamps[0].values: has 2 numbers for 3 wavelengths"),
        (_json_doc(lamps=[{"name": "L", "values": [1, 1, 1], "electrical_W": 0}]), "lamps[0].electrical_W: must be a positive number of watts, not 0"),
        (_json_doc(quantity="lux"), "unknown quantity 'lux'"),
        ('{"lampcalc_spectra": 1, "wavelength_nm": [380, 780], "lamps": [{"name": "L", "values": [1, NaN]}]}',
         "lamps[0].values[1]: is not finite"),
        (_json_doc(lamps=[{"name": "L", "values": [1, -1, 1]}]), "lamps[0].values[1] ('L'): value -1 at 580 nm is negative, 100 % of the peak"),
    ],
)
def test_json_bad_input(write, doc, fragment):
    with pytest.raises(InputError) as info:
        read_spectra(write("bad.json", doc))
    assert fragment in str(info.value)


names = st.text(alphabet="ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_ .", min_size=1, max_size=12)


@settings(max_examples=30, deadline=None)
@given(
    st.lists(names.map(str.strip).filter(bool), min_size=1, max_size=4, unique=True),
    st.integers(min_value=0, max_value=2**31),
    st.sampled_from(["relative", "flux", "irradiance", "radiance"]),
    st.booleans(),
)
def test_round_trip_csv_and_json(tmp_path_factory, lamp_names, seed, quantity, with_angles):
    rng = np.random.default_rng(seed)
    wl = np.sort(rng.choice(np.arange(350.0, 1001.0, 0.5), 120, replace=False))
    values = rng.random((len(lamp_names), wl.size)) + 0.01
    watts = rng.uniform(1, 100, len(lamp_names))
    angles = rng.uniform(-90, 90, len(lamp_names)) if with_angles else None
    batch = SpectralBatch(wl, values, tuple(lamp_names), quantity, electrical_W=watts, angle_deg=angles)
    folder = tmp_path_factory.mktemp("rt")
    for name, text in (("b.csv", spectra_to_csv(batch)), ("b.json", spectra_to_json(batch))):
        (folder / name).write_text(text, encoding="utf-8")
        back = read_spectra(folder / name)
        np.testing.assert_array_equal(back.wavelength_nm, wl)
        np.testing.assert_array_equal(back.values, values)
        np.testing.assert_array_equal(back.electrical_W, watts)
        np.testing.assert_array_equal(back.angle_deg, batch.angle_deg)
        assert back.names == batch.names and back.quantity == batch.quantity


def test_text_reader_override_quantity():
    batch = read_spectra_text("quantity: flux\n380,1\n780,1\n", quantity="irradiance")
    assert batch.quantity == ("irradiance",)


def test_angle_metadata_one_per_lamp_or_one_for_all():
    batch = read_spectra_text("# angle_deg: -30 0 30\nnm,a,b,c\n380,1,2,3\n780,1,2,3\n")
    assert batch.angle_deg.tolist() == [-30.0, 0.0, 30.0]
    assert read_spectra_text("angle_deg: 45\n380,1,2\n780,1,2\n").angle_deg.tolist() == [45.0, 45.0]
    with pytest.raises(InputError, match="line 1: angle_deg needs one value or one per lamp"):
        read_spectra_text("angle_deg: 1 2\n380,1,2,3\n780,1,2,3\n")
    with pytest.raises(InputError, match="angle_deg 'up' is not a number"):
        read_spectra_text("angle_deg: up\n380,1\n780,1\n")
