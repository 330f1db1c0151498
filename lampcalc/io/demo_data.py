"""The bundled demo: spectra of a fictional supplier's lamps (``spectra_demo/``)."""

from importlib import resources
from pathlib import Path

from .formats import SPECTRUM_SUFFIXES


def demo_folder():
    """Folder of the demo spectra inside the installed package."""
    return Path(str(resources.files("lampcalc.spectra_demo")))


def demo_files():
    """The demo spectrum files, sorted by name (claims files excluded)."""
    folder = demo_folder()
    return sorted(
        p for p in folder.iterdir() if p.suffix in SPECTRUM_SUFFIXES and not p.name.startswith(("claims", "."))
    )


def demo_claims():
    """The fictional supplier's claims file."""
    return demo_folder() / "claims_quillfen.csv"


def demo_report_info():
    """The report information of the demo's report (a TOML file)."""
    return demo_folder() / "report_info_quillfen.toml"


def demo_set(name):
    """The spectrum files of one demo set in a subfolder of the demo: ``"lot"``, ``"angles"`` or ``"datasheet"``."""
    folder = demo_folder() / name
    return sorted(p for p in folder.iterdir() if p.suffix in SPECTRUM_SUFFIXES)


def demo_lot_claims():
    """The fictional supplier's claims on its demo lot (TOML)."""
    return demo_folder() / "lot" / "lot_claims_quillfen.toml"


def demo_measurement_model():
    """The measurement model of the fictional supplier's quality-control spectrometer (TOML)."""
    return demo_folder() / "quillfen_qc_lab_model.toml"
