"""Every flag a rating can carry is explained in words, and the docs show those words.

Internal consistency of the project's own flag table (no published source is involved);
the lamps that raise the flags are blackbodies from Planck's law and the demo spectra.
"""

import re
from pathlib import Path

import numpy as np
import pytest

from lampcalc.io.demo_data import demo_files
from lampcalc.io.spectrum_files import read_spectra
from lampcalc.physics.blackbody import spectral_radiance
from lampcalc.rating.flags import DOUBTFUL_KEYS, FLAG_MEANINGS, doubtful_keys, explain
from lampcalc.rating.rate import rate_spectra
from lampcalc.rating.ratings import FIELDS
from lampcalc.spectra.batch import SpectralBatch

DOCS = Path(__file__).resolve().parents[2] / "docs" / "output-fields.md"


def test_docs_list_every_flag_with_its_words():
    doc = DOCS.read_text(encoding="utf-8")
    section = doc[doc.index("### Flags"):]
    section = section[: section.index("\n## ")]
    rows = dict(re.findall(r"^\| `([\w.]+)` \| (.+?) \|$", section, re.M))
    assert rows == FLAG_MEANINGS


def test_flags_raised_by_real_lamps_all_have_words():
    # Blackbodies from 800 K (no CCT) to 150 000 K (none either), a narrow green line (far from the
    # locus, no rendering), and the demo spectra: every flag they raise must have words.
    wl = np.arange(360.0, 831.0, 5.0)
    temps = [800.0, 2700.0, 6500.0, 150000.0]
    values = np.vstack([spectral_radiance(temps, wl), np.exp(-0.5 * ((wl - 530.0) / 8.0) ** 2)])
    bb = SpectralBatch(wl, values, names=[f"T{t:g}" for t in temps] + ["green"])
    ratings = rate_spectra([bb] + [read_spectra(f) for f in demo_files()])
    raised = {flag for flags in ratings["flags"] for flag in flags}
    assert {"cct_below_1000K", "cct_above_100000K", "rendering_not_meaningful", "duv_beyond_0.05"} <= raised
    assert raised <= set(FLAG_MEANINGS)
    for flag in raised:
        assert explain(flag)


def test_doubtful_keys_are_output_keys():
    assert {key for keys in DOUBTFUL_KEYS.values() for key in keys} <= set(FIELDS)
    assert doubtful_keys(["cri_outside_validity", "range_truncated"]) == {"ra", "ri"}
    with pytest.raises(KeyError):
        explain("no_such_flag")
