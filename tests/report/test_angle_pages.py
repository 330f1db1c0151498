"""The pages of colour over angle: the user's limit in the shared words, the table by angle against a direct computation.

Sources: Planck's law for the spectra of one source at five angles; colour-science's xy_to_Luv_uv for
u′, v′ and its CIE 1924 photopic V(λ) for the illuminance weights (reference library); the weighted
mean and the distances computed directly with NumPy; the verdict words of lampcalc.verdicts.wording.
"""

import numpy as np
import pytest

from lampcalc.report.document import Report
from lampcalc.verdicts.angles import colour_over_angle

from .conftest import builder, pdf_pages

ANGLES = np.array([60.0, 0.0, 30.0, 80.0, 45.0])
TEMPS = np.array([3150.0, 3000.0, 3040.0, 3300.0, 3080.0])
SCALE = np.array([0.5, 1.0, 0.9, 0.15, 0.7])


def _flat(pages):
    return " ".join(" ".join(p.split()) for p in pages)


def _source(angles=ANGLES, temps=TEMPS, scale=SCALE, quantity="irradiance"):
    import lampcalc
    from lampcalc.physics.blackbody import spectral_radiance
    from lampcalc.spectra.resampling import GRID_NM

    values = scale[:, None] * spectral_radiance(temps, GRID_NM) * 1e-12
    batch = lampcalc.SpectralBatch(GRID_NM, values, names=[f"L_{a:g}" for a in angles], quantity=quantity,
                                   angle_deg=angles)
    return lampcalc.rate_spectra(batch), values


def _write(tmp_path, ratings, angles, name="angles.pdf", summary=False):
    pages = [builder("summary_pages")] * summary + [builder("angle_pages")]
    report = Report(ratings, angles=angles, pages=pages)
    path = tmp_path / name
    assert report.write(path) == report.n_pages
    return pdf_pages(path)


def test_no_angles_no_page(two_lamps):
    assert builder("angle_pages").count(Report(two_lamps)) == 0


def test_table_by_angle_and_the_verdict(tmp_path):
    import colour

    ratings, values = _source()
    angles = colour_over_angle(ratings, limit_delta_uv_prime=0.004)
    summary, page = _write(tmp_path, ratings, angles, summary=True)
    text = _flat([page])
    v = colour.colorimetry.SDS_LEFS_PHOTOPIC["CIE 1924 Photopic Standard Observer"]
    weights = values @ v.copy().align(colour.SpectralShape(360, 830, 1)).values  # ∝ illuminance
    upvp = colour.xy_to_Luv_uv(np.stack([ratings["x"], ratings["y"]], -1))  # colour-science
    delta = np.hypot(*(upvp - weights @ upvp / weights.sum()).T)
    order = np.argsort(ANGLES)
    # the table is read back a column at a time: Δu′v′ and the weights in order of angle
    assert " ".join(f"{d:.5f}" for d in delta[order]) in text
    assert " ".join(f"{100 * w:.1f}" for w in (weights / weights.sum())[order]) in text
    assert " ".join(f"{a:g}" for a in ANGLES[order]) in text
    worst = delta.max()
    verdict = "meets" if worst <= 0.004 else "does not meet"
    assert f"Largest Δu′v′ from the mean point {worst:.5f} at 80°: {verdict} your limit 0.004" in text
    assert f"{verdict} your limit 0.004" in _flat([summary])  # the verdict on the first page too
    assert "weights each angle's u′, v′ by its illuminance" in text and "no solid-angle (zonal) weighting" in text
    for word in ("holds", "FAILS", "not shown"):
        assert word not in text


def test_no_limit_is_not_evaluated_and_relative_spectra_count_alike(tmp_path):
    ratings, _ = _source(quantity="relative")
    text = _flat(_write(tmp_path, ratings, colour_over_angle(ratings)))
    assert "no limit given, so not evaluated (lampcalc applies no limit of its own)" in text
    assert "every angle counts alike" in text
    assert "20.0 20.0 20.0 20.0 20.0" in text  # five angles, equal weights


def test_many_angles_continue_on_pages_of_their_own(tmp_path):
    # Internal layout rule (no published source): every angle in the table exactly once.
    n = 91
    angles = np.linspace(0.0, 90.0, n)
    ratings, _ = _source(angles, np.linspace(3000.0, 3400.0, n), np.linspace(1.0, 0.1, n))
    pages = _write(tmp_path, ratings, colour_over_angle(ratings))
    assert len(pages) >= 2 and "By angle, continued" in pages[-1]
    tables = [p.split("By angle")[1] + "\n" for p in pages]  # below the heading (the subtitle names the first and last)
    for name in ratings["name"]:
        assert sum(f"\n{name}\n" in t for t in tables) == 1


def test_angles_of_other_ratings_are_refused(two_lamps, tmp_path):
    ratings, _ = _source()
    with pytest.raises(ValueError, match="does not belong"):
        Report(two_lamps, angles=colour_over_angle(ratings))
