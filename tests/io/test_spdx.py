"""IES TM-27-14 documents: read as colour-science reads them, written back exactly, refused where wrong."""

import warnings
from pathlib import Path

import numpy as np
import pytest

from lampcalc.errors import InputError
from lampcalc.io.spdx import write_spectra_spdx
from lampcalc.io.spectrum_files import read_spectra
from lampcalc.spectra.batch import SpectralBatch


def _colour():
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        import colour
    return colour


def test_colour_sample_document_reads_as_colour_reads_it():
    # colour-science ships a TM-27-14 sample (a rare-earth fluorescent lamp); its reader is the reference.
    colour = _colour()
    path = Path(colour.__file__).parent / "io" / "tests" / "resources" / "Fluorescent.spdx"
    reference = colour.SpectralDistribution_IESTM2714(str(path)).read()
    batch = read_spectra(path)
    np.testing.assert_array_equal(batch.wavelength_nm, reference.wavelengths)
    np.testing.assert_array_equal(batch.values[0], reference.values)
    assert batch.names == ("Rare earth fluorescent lamp",)  # CatalogNumber "N/A" says nothing
    assert batch.quantity == ("relative",)
    assert batch.sources == (f"{path}, spectral distribution",)


@pytest.mark.parametrize("quantity", ["relative", "flux", "irradiance", "radiance"])
def test_round_trip(tmp_path, quantity):
    rng = np.random.default_rng(27)
    wl = np.arange(380.0, 781.0, 2.5)
    batch = SpectralBatch(wl, rng.random((1, wl.size)) + 0.01, ("QF-PNL-5000",), quantity)
    path = tmp_path / "lamp.spdx"
    write_spectra_spdx(batch, path, manufacturer="Quillfen Lighting")
    back = read_spectra(path)
    assert back.names == ("QF-PNL-5000",) and back.quantity == (quantity,)
    assert back.sources == (f"{path}, spectral distribution of Quillfen Lighting",)
    np.testing.assert_array_equal(back.wavelength_nm, wl)
    np.testing.assert_array_equal(back.values, batch.values)
    assert not list(tmp_path.glob(".*tmp"))


def test_writer_holds_one_lamp(tmp_path):
    batch = SpectralBatch([380.0, 780.0], [[1, 1], [2, 2]], ("a", "b"))
    with pytest.raises(ValueError, match="holds one spectrum; this batch has 2"):
        write_spectra_spdx(batch, tmp_path / "two.spdx")


def test_other_quantities_need_the_option(tmp_path):
    batch = SpectralBatch(np.arange(380.0, 781.0, 5), np.ones((1, 81)), ("QF-A",))
    path = tmp_path / "a.xml"
    write_spectra_spdx(batch, path)
    path.write_text(path.read_text().replace(">relative<", ">intensity<"))
    with pytest.raises(InputError, match="SpectralQuantity 'intensity' is not one lampcalc computes with"):
        read_spectra(path)
    assert read_spectra(path, quantity="relative").quantity == ("relative",)


@pytest.mark.parametrize(
    "text, fragment",
    [
        ("<IESTM2714 xmlns='x'><SpectralData wavelength='380'>1", "line 1, column"),
        ("<a/>", "not an IES TM-27-14 spectral document"),
        ("<IESTM2714 xmlns='x'><SpectralData wavelength='380'>1</SpectralData></IESTM2714>",
         "SpectralData 1: a spectrum needs at least two wavelengths"),
        ("<IESTM2714 xmlns='x'><SpectralData wavelength='380'>1e999</SpectralData></IESTM2714>",
         "SpectralData 1: value '1e999' is beyond the range of a float"),
        ("<IESTM2714 xmlns='x'><SpectralData>1</SpectralData></IESTM2714>", "SpectralData 1: has no wavelength"),
    ],
)
def test_bad_documents(tmp_path, text, fragment):
    path = tmp_path / "bad.spdx"
    path.write_text(text)
    with pytest.raises(InputError) as info:
        read_spectra(path)
    assert str(info.value).startswith(str(path)) and fragment in str(info.value)
