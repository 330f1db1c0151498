"""Import cost and the public API: `import lampcalc` stays light (STYLE.md, issue brief)."""

import subprocess
import sys
import time

import pytest

import lampcalc


def _modules_after(code):
    out = subprocess.run(
        [sys.executable, "-c", code + "; import sys; print(' '.join(sorted(sys.modules)))"],
        capture_output=True, text=True, check=True,
    )
    return set(out.stdout.split())


def test_import_lampcalc_is_light():
    mods = _modules_after("import lampcalc")
    for heavy in ("matplotlib", "colour", "scipy", "numpy"):
        assert heavy not in mods


def test_computing_a_cct_does_not_load_plotting_or_colour_science():
    mods = _modules_after("import lampcalc; lampcalc.cct_duv([0.2, 0.3]); lampcalc.read_spectra")
    assert "numpy" in mods
    for heavy in ("matplotlib", "colour", "scipy"):
        assert heavy not in mods


def test_help_is_quick():
    # Target from the issue: `lampcalc --help` under 0.3 s; measured with a margin for slow CI.
    start = time.perf_counter()
    subprocess.run([sys.executable, "-m", "lampcalc", "--help"], capture_output=True, check=True)
    assert time.perf_counter() - start < 1.0
    assert "numpy" not in _modules_after("import lampcalc.cli")


@pytest.mark.parametrize("name", lampcalc.__all__)
def test_every_public_name_resolves(name):
    assert getattr(lampcalc, name) is not None


def test_unknown_attribute():
    with pytest.raises(AttributeError, match="no attribute 'nope'"):
        lampcalc.nope  # noqa: B018


def test_every_subpackage_ships():
    # A wheel built from pyproject.toml's explicit package list must hold every subpackage and every
    # folder of data (the tables, the shipped sets, the demo's folders).
    import re
    from pathlib import Path

    root = Path(__file__).resolve().parents[1]
    block = re.search(r"^packages = \[(.*?)\]", (root / "pyproject.toml").read_text(), re.M | re.S).group(1)
    listed = {name.strip().strip('"') for name in block.split(",") if name.strip()}

    def dotted(folder, base, prefix):
        parts = folder.relative_to(base).parts
        return ".".join((prefix, *parts)) if parts else prefix

    found = set()
    for base, prefix in ((root / "lampcalc", "lampcalc"), (root / "spectra_demo", "lampcalc.spectra_demo")):
        for folder in [base, *(p for p in base.rglob("*") if p.is_dir() and p.name != "__pycache__")]:
            if any(f.is_file() and f.suffix != ".pyc" for f in folder.iterdir()):
                found.add(dotted(folder, base, prefix))
    assert found == listed
