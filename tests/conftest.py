"""Shared fixtures: a command-line runner, small spectrum files, invented lots."""

import numpy as np
import pytest
from click.testing import CliRunner

from lampcalc.cli import cli
from lampcalc.spectra.resampling import GRID_NM


# Each bad spectrum file: (content, fragment of the expected message). Tests that take the
# ``bad_input`` fixture run once per case; the reader tests check the message, the CLI tests exit code 2.
BAD_INPUTS = {
    "empty": (b"", "the file is empty"),
    "blank": (b"\n\n  \n", "the file is empty"),
    "binary": (b"\x89PNG\r\n\x1a\n\x00\x00\x00\rIHDR", "binary file"),
    "non_numeric": (b"nm,a\n380,1\n385,abc\n390,1\n", "line 3, column 2 ('a'): 'abc' is not a number"),
    "ragged": (b"nm,a,b\n380,1,1\n385,1\n390,1,1\n", "line 3: ragged row: 2 fields where the table has 3"),
    "decreasing": (b"380,1\n390,1\n385,1\n", "line 3, column 1: wavelength 385 is below the previous one, 390"),
    "duplicate": (b"380,1\n385,1\n385,1\n", "line 3, column 1: duplicate wavelength 385 (also at line 2, column 1)"),
    "nan": (b"nm,a\n380,1\n385,nan\n", "line 3, column 2 ('a'): 'nan' is not finite"),
    "inf": (b"nm,a\n380,1\n385,inf\n", "'inf' is not finite"),
    "all_zero": (b"nm,a\n380,0\n385,0\n390,0\n", "column 2 ('a'): the spectrum is zero"),
    "negative": (b"nm,a\n380,1\n385,-0.2\n390,1\n", "line 3, column 2 ('a'): value -0.2 at 385 nm is negative, 20 %"),
    "no_table": (b"just some words\nand more\n", "no numeric table found"),
    "one_row": (b"nm,a\n380,1\n", "fewer than two rows"),
    "one_column": (b"380\n385\n390\n", "no numeric table found"),
    "not_optical": (b"1,1\n2,1\n3,1\n", "look like micrometres"),
    "duplicate_names": (b"nm,a,a\n380,1,1\n385,1,1\n", "lamp name 'a' is used twice"),
    "bad_quantity": (b"quantity: lumens\n380,1\n385,1\n", "line 1: unknown quantity 'lumens'"),
    "bad_power": (b"electrical_W: -3\n380,1\n385,1\n", "line 1: electrical_W needs one positive value"),
}




def pytest_generate_tests(metafunc):
    if "bad_input" in metafunc.fixturenames:
        cases = sorted(BAD_INPUTS)
        metafunc.parametrize("bad_input", [(c, *BAD_INPUTS[c]) for c in cases], ids=cases)


@pytest.fixture
def run():
    """Run ``lampcalc ARGS...`` in-process; returns click's Result (exit_code, stdout, stderr)."""
    runner = CliRunner()

    def invoke(*args):
        return runner.invoke(cli, [str(a) for a in args], catch_exceptions=False)

    return invoke


@pytest.fixture
def write(tmp_path):
    """Write text to a file in a temporary folder and return its path."""

    def make(name, text, mode="w"):
        path = tmp_path / name
        if mode == "wb":
            path.write_bytes(text)
        else:
            path.write_text(text, encoding="utf-8")
        return path

    return make


def blackbody_table(temperature_K, start=380, stop=780, step=5, delimiter=","):
    """Text table of blackbody spectra (relative), one column per temperature."""
    from lampcalc.physics.blackbody import spectral_radiance

    wl = np.arange(start, stop + step / 2, step, dtype=float)
    values = spectral_radiance(np.atleast_1d(temperature_K), wl)
    values = values / values.max(axis=1, keepdims=True)
    header = delimiter.join(["wavelength", *(f"bb{t:g}" for t in np.atleast_1d(temperature_K))])
    rows = [delimiter.join([f"{w:g}", *(repr(float(v)) for v in col)]) for w, col in zip(wl, values.T)]
    return header + "\n" + "\n".join(rows) + "\n"


@pytest.fixture
def bb_table():
    return blackbody_table


@pytest.fixture
def grid():
    return GRID_NM


# --- invented lots (lampcalc lot, angles, compare) ---


def invented_ratings(xy, *, seed=0, **columns):
    """A Ratings table of invented samples at chromaticities ``xy``; other ratings drawn at random.

    u′, v′ come from colour-science's xy_to_Luv_uv (reference library). Any column can be
    given instead (``ra=...``, ``flags=...``).
    """
    import colour

    from lampcalc.rating.ratings import Ratings

    xy = np.asarray(xy, dtype=float)
    n = xy.shape[0]
    rng = np.random.default_rng(seed)
    upvp = colour.xy_to_Luv_uv(xy)
    nan = np.full(n, np.nan)
    cols = {
        "name": tuple(f"S{k + 1:02d}" for k in range(n)),
        "source": tuple(f"lot.csv, column {k + 2}" for k in range(n)),
        "quantity": ("relative",) * n,
        "x": xy[:, 0],
        "y": xy[:, 1],
        "u_prime": upvp[:, 0],
        "v_prime": upvp[:, 1],
        "cct_K": rng.normal(3000.0, 40.0, n),
        "duv": rng.normal(0.001, 0.001, n),
        "ra": rng.normal(84.0, 1.0, n),
        "ri": rng.normal(60.0, 10.0, (n, 15)),
        "rf": rng.normal(83.0, 1.0, n),
        "rg": rng.normal(101.0, 1.0, n),
        "ler_lm_per_W": rng.normal(320.0, 3.0, n),
        "luminous_flux_lm": nan,
        "radiant_flux_W": nan,
        "illuminance_lx": nan,
        "luminance_cd_per_m2": nan,
        "efficacy_lm_per_W": nan,
        "sp_ratio": rng.normal(1.3, 0.01, n),
        "melanopic_der": rng.normal(0.42, 0.004, n),
        "melanopic_edi_lx": nan,
        "bin_set": ("ANSI C78.377-2017 nominal CCT quadrangles",) * n,  # the shipped set's name (data/sets)
        "bin": (None,) * n,
        "flags": ((),) * n,
    }
    cols.update(columns)
    return Ratings(cols)


@pytest.fixture
def invent():
    return invented_ratings


def lot_around(centre_xy, n=12, spread=0.0015, seed=1):
    """Chromaticities of a lot: a normal scatter around ``centre_xy``."""
    rng = np.random.default_rng(seed)
    return np.asarray(centre_xy) + rng.normal(0.0, spread, (n, 2))


@pytest.fixture
def around():
    return lot_around
