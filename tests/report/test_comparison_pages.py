"""The pages of a comparison: the colour shift against colour-science, every rating's difference, flags, verdicts.

Sources: colour-science's xy_to_Luv_uv for u′, v′ (reference library); differences computed directly
from the two sides' ratings; the verdict words of lampcalc.verdicts.wording; the demo supplier's
data-sheet spectrum and measured sample (spectra_demo/datasheet).
"""

import numpy as np
import pytest

from lampcalc.rating.flags import explain
from lampcalc.report.document import Report
from lampcalc.verdicts.comparison import compare_ratings

from .conftest import builder, line, model_batch, pdf_pages, planck


def _flat(pages):
    return " ".join(" ".join(p.split()) for p in pages)


@pytest.fixture(scope="module")
def datasheet():
    import lampcalc
    from lampcalc.io.demo_data import demo_folder

    folder = demo_folder() / "datasheet"
    rate = lambda name: lampcalc.rate_spectra(lampcalc.read_spectra(folder / name).on_grid())  # noqa: E731
    return rate("quillfen_a60_2700_r9_datasheet.csv"), rate("quillfen_a60_2700_r9_sample.csv")


def test_no_comparison_no_page(two_lamps):
    assert builder("comparison_pages").count(Report(two_lamps)) == 0
    with pytest.raises(ValueError, match="needs ratings"):
        Report(None)


def test_one_pair_against_the_limit(tmp_path, datasheet):
    import colour

    reference, test = datasheet
    comparison = compare_ratings(reference, test, limit_delta_uv_prime=0.003)
    report = Report(None, comparison=(reference, test, comparison),
                    pages=[builder("summary_pages"), builder("comparison_pages")])
    path = tmp_path / "cmp.pdf"
    assert report.write(path) == 2
    summary, page = pdf_pages(path)
    text = _flat([page])
    upvp = [colour.xy_to_Luv_uv(np.array([r["x"][0], r["y"][0]])) for r in (reference, test)]  # colour-science
    shift = float(np.hypot(*(upvp[1] - upvp[0])))
    verdict = "meets" if shift <= 0.003 else "does not meet"
    assert f"Colour shift Δu′v′ {shift:.5f}: {verdict} your limit 0.003 (margin {0.003 - shift:+.5f})" in text
    assert f"{shift:.5f}: {verdict} your limit 0.003" in _flat([summary])
    # reference, test and difference columns, read back a column at a time (CCT then Duv)
    cct = reference["cct_K"][0], test["cct_K"][0]
    assert f"{cct[0]:.0f} {reference['duv'][0]:+.4f}" in text and f"{cct[1]:.0f} {test['duv'][0]:+.4f}" in text
    assert f"{cct[1] - cct[0]:+.0f} {test['duv'][0] - reference['duv'][0]:+.4f}" in text
    r9 = reference["ri"][0][8], test["ri"][0][8]
    assert f"{r9[1] - r9[0]:+.1f}" in text
    for flags in (reference["flags"][0], test["flags"][0], comparison["pairs"]["flags"][0]):
        for flag in flags:
            assert " ".join(explain(flag).split())[:50] in text  # each side's flags in words
    assert "above 5 % of its peak" in text  # the ratio floor
    # both sides' lamps are in the report, named by their side
    assert "QF-A60-2700-R9 data sheet (reference)" in _flat([summary]) and "sample 7 (test)" in _flat([summary])


def test_sets_paired_by_name_list_every_pair(tmp_path):
    import lampcalc

    reference = lampcalc.rate_spectra(model_batch([(f"bb{t:g}", planck(t)) for t in (2700.0, 3000.0, 4000.0)]))
    test = lampcalc.rate_spectra(model_batch([("bb2700", planck(2750.0)), ("bb4000", planck(4000.0)),
                                               ("red", line(630, 9))]))
    comparison = compare_ratings(reference, test)
    report = Report(None, comparison=(reference, test, comparison), pages=[builder("comparison_pages")])
    path = tmp_path / "pairs.pdf"
    assert report.write(path) == 3  # the list of pairs, then a page per pair
    pages = pdf_pages(path)
    listed = _flat(pages[:1])
    assert "2 pairs" in listed and "bb3000" in listed and "red" in listed  # the lamps without a partner
    assert "bb2700 against bb2700" in pages[1] and "bb4000 against bb4000" in pages[2]
    assert "0.00000" in _flat(pages[2:])  # a lamp against itself: no shift
    assert "no limit given, so not evaluated" in _flat(pages[1:2])
