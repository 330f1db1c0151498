"""Shared fixtures of the report tests: rated lamps from physical models, written reports, their text."""

import io

import numpy as np
import pytest

INFO = {
    "title": "Range review for Quillfen Lighting",
    "client": "Quillfen Lighting (fictional)",
    "project": "Spring range",
    "laboratory": "Example photometry laboratory",
    "report_number": "QF-2025-014",
    "date": "2025-04-02",
    "prepared_by": "A. Engineer",
    "notes": "Spectra sent by the client as CSV files.",
}


def pdf_pages(path):
    """The text of each page of a PDF, as pypdf reads it back."""
    from pypdf import PdfReader

    return [page.extract_text() for page in PdfReader(io.BytesIO(path.read_bytes())).pages]


def model_batch(names_and_spectra):
    """A batch on the 1 nm grid from (name, values) pairs."""
    import lampcalc
    from lampcalc.spectra.resampling import GRID_NM

    names, values = zip(*names_and_spectra)
    return lampcalc.SpectralBatch(GRID_NM, np.array(values, dtype=float), tuple(names))


def line(centre_nm, width_nm):
    """A Gaussian emission line on the grid: a physical model of one LED die."""
    from lampcalc.spectra.resampling import GRID_NM

    return np.exp(-0.5 * ((GRID_NM - centre_nm) / width_nm) ** 2)


def planck(t_K):
    from lampcalc.physics.blackbody import spectral_radiance
    from lampcalc.spectra.resampling import GRID_NM

    return spectral_radiance([t_K], GRID_NM)[0]


@pytest.fixture(scope="session")
def demo_check():
    """The demo supplier's lamps, rated with its claims, and the verdicts."""
    import lampcalc
    from lampcalc.io.demo_data import demo_claims, demo_files

    claims = lampcalc.read_claims(demo_claims())
    batch = lampcalc.SpectralBatch.concatenate([lampcalc.read_spectra(f).on_grid() for f in demo_files()])
    nominal = [claims[n].values.get("nominal_cct_K", np.nan) if n in claims else np.nan for n in batch.names]
    ratings = lampcalc.rate_spectra(batch, nominal_cct_K=nominal)
    return ratings, lampcalc.check_claims(claims, ratings)


@pytest.fixture(scope="session")
def demo_report(tmp_path_factory, demo_check):
    """The demo check's report on A4 with report information: (path, text of each page)."""
    import lampcalc

    ratings, verdicts = demo_check
    path = tmp_path_factory.mktemp("demo_report") / "report.pdf"
    lampcalc.write_report(path, ratings, verdicts, report_info=INFO)
    return path, pdf_pages(path)


@pytest.fixture(scope="session")
def odd_lamps():
    """Lamps that test the report's edges: a blackbody, a red LED, a narrow-band RGB, odd names."""
    import lampcalc

    batch = model_batch([
        ("blackbody 3000 K", planck(3000.0)),
        ("red LED 630 nm", line(630, 9)),
        ("narrow RGB", line(450, 10) + 0.9 * line(530, 14) + 0.8 * line(615, 8)),
        (r"$\foo$ lamp", line(450, 12) + 1.6 * line(560, 50)),
        ("灯 lamp", line(450, 12) + 1.4 * line(575, 55)),
        ("green LED 525 nm", line(525, 13)),
    ])
    ratings = lampcalc.rate_spectra(batch)
    return ratings


@pytest.fixture(scope="session")
def two_lamps():
    """A white lamp and a coloured one: both kinds of lamp page, in few pages."""
    import lampcalc

    return lampcalc.rate_spectra(model_batch([("blackbody 3000 K", planck(3000.0)), ("red LED 630 nm", line(630, 9))]))


@pytest.fixture(scope="session")
def odd_report(tmp_path_factory, odd_lamps):
    import lampcalc

    path = tmp_path_factory.mktemp("odd_report") / "odd.pdf"
    lampcalc.write_report(path, odd_lamps, paper="letter")
    return path, pdf_pages(path)


@pytest.fixture(scope="session")
def demo_lot():
    """The demo supplier's delivery of 12 lamps, rated with their claimed nominal CCT, its statistics and claims."""
    import lampcalc
    from lampcalc.io.demo_data import demo_lot_claims, demo_set
    from lampcalc.verdicts.lot import lot_statistics
    from lampcalc.verdicts.lot_claims import check_lot_claims, read_lot_claims

    batch = lampcalc.SpectralBatch.concatenate([lampcalc.read_spectra(f).on_grid() for f in demo_set("lot")])
    ratings = lampcalc.rate_spectra(batch, nominal_cct_K=[3000.0] * batch.n_lamps)
    lot = lot_statistics(ratings, nominal_cct_K=3000)
    return ratings, lot, check_lot_claims(read_lot_claims(demo_lot_claims()), lot)


def builder(module):
    """The page builder of ``lampcalc.report.<module>``."""
    import importlib

    return importlib.import_module(f"lampcalc.report.{module}").PAGES
