"""IES TM-27-14 spectral documents (``.spdx``, also ``.xml``), through colour-science.

colour-science's :class:`colour.SpectralDistribution_IESTM2714` reads the header and writes
the document; lampcalc reads the ``SpectralData`` elements itself as well, in the order the
document gives them, so that a repeated or decreasing wavelength is refused where it stands
(``SpectralData 12``) instead of being sorted away. The header is mapped onto lampcalc's
metadata:

========================  =====================================================
TM-27-14                  lampcalc
========================  =====================================================
``SpectralQuantity``      ``quantity`` (relative, flux, irradiance, radiance)
``CatalogNumber``         the lamp's name (else ``Description``, else the file name)
``Manufacturer``          named in the lamp's ``source``
========================  =====================================================

Other spectral quantities (reflectance, intensity …) are refused unless ``--quantity``
says how to read the values. TM-27-14 has no place for the electrical power or the
angle of emission.
"""

import math
import warnings
from pathlib import Path
from xml.etree import ElementTree

import numpy as np

from ..spectra.batch import QUANTITY_UNITS
from .atomic import atomic_path
from .spectrum_checks import Where, build_batch, check_wavelengths, single_quantity, to_nm
from .text_cells import parse_number, show

ROOT_ELEMENT = "IESTM2714"


def _header(path, where):
    """colour-science's reading of the document's header (and its spectral quantity)."""
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")  # colour-science's notes on optional packages
        from colour import SpectralDistribution_IESTM2714

        try:
            return SpectralDistribution_IESTM2714(str(path)).read()
        except Exception as err:  # noqa: BLE001 - any failure of the third-party reader is a bad file
            detail = (str(err).splitlines() or [""])[0][:80]
            raise where(f"not a readable IES TM-27-14 document ({type(err).__name__}: {detail})") from None


def _data(root, namespace, where):
    """Wavelengths and values of the ``SpectralData`` elements, in document order."""
    wl, values = [], []
    for i, element in enumerate(root.iter(f"{{{namespace}}}SpectralData"), start=1):
        place = f"SpectralData {i}"
        text = element.attrib.get("wavelength")
        if text is None:
            raise where("has no wavelength attribute", place)
        for cell, out, what in ((text.strip(), wl, "wavelength"), ((element.text or "").strip(), values, "value")):
            try:
                out.append(parse_number(cell))
            except ValueError as err:
                raise where(f"{what} {show(cell)} {err}", place) from None
    if not wl:
        raise where("has no SpectralData elements")
    return np.array(wl), np.array(values)


def read_spectra_spdx(raw, path="<spdx>", *, quantity=None):
    """Read an IES TM-27-14 spectral document into a :class:`SpectralBatch` of one lamp.

    Parameters
    ----------
    raw : bytes
        The document's bytes (read from ``path``).
    path : str
        The path as given; colour-science reads the header from it.
    quantity : str, optional
        How to read the values whatever ``SpectralQuantity`` says.

    Raises
    ------
    InputError

    References
    ----------
    ANSI/IES TM-27-14, IES Standard Format for the Electronic Transfer of Spectral Data.
    """
    where = Where(path)
    try:
        root = ElementTree.fromstring(raw)
    except ElementTree.ParseError as err:
        line, column = err.position
        raise where(f"not well-formed XML ({str(err).split(':')[0]})", f"line {line}, column {column + 1}") from None
    namespace, _, tag = root.tag[1:].partition("}") if root.tag.startswith("{") else ("", "", root.tag)
    if tag != ROOT_ELEMENT or not namespace:
        raise where(f"not an IES TM-27-14 spectral document (its root element is <{show(tag)[1:-1]}>)")
    wl, values = _data(root, namespace, where)
    places = [f"SpectralData {i + 1}" for i in range(wl.size)]
    check_wavelengths(wl, places, where)
    wl = to_nm(wl, "nm", None, where)
    sd = _header(path, where)
    said = (sd.spectral_quantity or "").strip()
    if quantity is None:
        if said.lower() not in QUANTITY_UNITS:
            raise where(
                f"SpectralQuantity {show(said or 'missing')} is not one lampcalc computes with "
                f"({', '.join(QUANTITY_UNITS)}); read the values' shape only with --quantity relative"
            )
        quantity = said.lower()
    header = sd.header
    name = next((v.strip() for v in (header.catalog_number, header.description) if _given(v)), Path(str(path)).stem)
    maker = header.manufacturer.strip() if _given(header.manufacturer) else ""
    return build_batch(
        wl, values[None, :], (name,), quantity, where=where,
        lamp_places=[f"spectral distribution{' of ' + maker if maker else ''}"],
        value_place=lambda k, i: places[i],
    )


def _given(text):
    """True for a header field that says something ("N/A" and the like say nothing)."""
    return bool(text) and text.strip().lower() not in ("", "n/a", "na", "none", "-", "unknown")


def write_spectra_spdx(batch, path, *, manufacturer=None, description=None):
    """Write a batch of one lamp as an IES TM-27-14 document (colour-science's writer), atomically.

    The lamp's name becomes ``CatalogNumber``, its quantity ``SpectralQuantity``;
    :func:`~lampcalc.io.spectrum_files.read_spectra` reads the file back exactly.

    Raises
    ------
    ValueError
        For a batch of more than one lamp: a TM-27-14 document holds one spectrum.
    """
    if batch.n_lamps != 1:
        raise ValueError(
            f"an IES TM-27-14 document holds one spectrum; this batch has {batch.n_lamps}: write batch[k] for each"
        )
    quantity = single_quantity(batch)
    if not all(math.isfinite(v) for v in batch.values[0]):
        raise ValueError("the spectrum has values that are not finite")
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        from colour import SpectralDistribution_IESTM2714
        from colour.io.tm2714 import Header_IESTM2714

        header = Header_IESTM2714(
            manufacturer=manufacturer, catalog_number=batch.names[0], description=description,
            document_creator="lampcalc",
        )
        sd = SpectralDistribution_IESTM2714(
            header=header, spectral_quantity=quantity, data=batch.values[0], domain=batch.wavelength_nm,
        )
        # colour-science sets NumPy's 1.13 print style, whose str() keeps 12 digits: write every digit.
        with atomic_path(path) as tmp, np.printoptions(legacy=False):
            sd.path = tmp
            sd.write()
