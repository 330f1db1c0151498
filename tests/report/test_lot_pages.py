"""The lot's pages: claims in the shared verdict words, the colour of the lot, statistics against NumPy.

Sources: NumPy directly on the samples' ratings (mean, ddof=1 standard deviation, linear
percentiles); the verdict words of lampcalc.verdicts.wording; the chi-square quantile of 95 % with
two degrees of freedom, −2·ln 0.05 = 5.991 (any statistics table, e.g. NIST/SEMATECH e-Handbook,
from memory); the demo supplier's planted false claim (95 % within 3 steps) of spectra_demo/lot.
"""

import numpy as np
import pytest

from lampcalc.rating.flags import explain
from lampcalc.report.document import Report
from lampcalc.verdicts.wording import format_value

from .conftest import builder, pdf_pages


def _flat(text):
    return " ".join(text.split())


@pytest.fixture(scope="module")
def lot_report(tmp_path_factory, demo_lot):
    ratings, lot, verdicts = demo_lot
    path = tmp_path_factory.mktemp("lot") / "lot.pdf"
    report = Report(ratings, lot=lot, lot_verdicts=verdicts, pages=[builder("summary_pages"), builder("lot_pages")])
    assert report.write(path) == report.n_pages
    return pdf_pages(path)


def test_no_lot_no_page(two_lamps):
    assert builder("lot_pages").count(Report(two_lamps)) == 0
    with pytest.raises(ValueError, match="lot_verdicts needs the lot"):
        Report(two_lamps, lot_verdicts=object())


def test_claims_first_in_the_shared_words(lot_report, demo_lot):
    _, lot, verdicts = demo_lot
    summary, colour, ratings_page = lot_report
    # the first page says the lot's verdict in a sentence
    assert "The lot of 12 samples (QF-SPOT-3000) does not meet 1 of 4 claims." in _flat(summary)
    text = _flat(colour)
    assert text.index("Claims on the lot") < text.index("Colour of the lot")
    assert "The lot does not meet 1 of 4 claims." in text
    assert "does not meet †" in text and text.count("meets") == 3  # the shared words, qualified by the steps' metric
    for word in ("holds", "FAILS", "not shown"):
        assert word not in text
    # the share within 3 steps, counted directly from the samples' steps
    steps = np.asarray(lot["samples"]["sdcm_steps"])
    assert f"{100 * np.mean(steps <= 3):.1f} %" in text
    assert "95 % of the lamps within 3 steps of 3000 K" in text  # the supplier's words
    assert "The IEC 60081 ellipse metric is not confirmed" in text


def test_colour_of_the_lot(lot_report, demo_lot):
    ratings, lot, _ = demo_lot
    text = _flat(lot_report[1])
    xy = np.stack([ratings["x"], ratings["y"]], -1)
    assert f"{xy[:, 0].mean():.4f}, {xy[:, 1].mean():.4f}" in text  # the mean point: NumPy on the samples' x, y
    assert "5.991" in text  # χ²₂(0.95)
    assert "no promise for the next lamp" in text
    assert "3000 K: 12" in text  # every sample in the ANSI 3000 K quadrangle (spectra_demo/lot)
    for flag in lot["flags"]:
        assert _flat(explain(flag))[:60] in text  # the lot's flags in words


def test_statistics_against_numpy(lot_report, demo_lot):
    ratings, lot, _ = demo_lot
    text = _flat(lot_report[2])
    assert "Ratings over the lot" in text and "Statistics of the samples" in text
    # the table is read back a column at a time: each statistic's column holds CCT, Duv, Ra … in order
    cct, duv, ra = (np.asarray(ratings[k]) for k in ("cct_K", "duv", "ra"))
    assert f"{cct.mean():.0f} {duv.mean():+.4f} {ra.mean():.1f}" in text
    assert f"{cct.std(ddof=1):.0f} {duv.std(ddof=1):.4f} {ra.std(ddof=1):.1f}" in text
    for q in (5, 95):  # Duv printed with its sign, and no "-0.0000" (lampcalc's number format)
        shown = format_value("duv", np.percentile(duv, q))
        assert f"{np.percentile(cct, q):.0f} {shown} {np.percentile(ra, q):.1f}" in text
    assert f"{cct.min():.0f} {duv.min():+.4f} {ra.min():.1f}" in text and f"{cct.max():.0f} {duv.max():+.4f}" in text
    # the steps rest on the unconfirmed IEC 60081 metric: their statistics in parentheses
    steps, mel = np.asarray(lot["samples"]["sdcm_steps"]), np.asarray(ratings["melanopic_der"])
    assert f"{mel.mean():.3f} ({steps.mean():.1f})" in text and f"{mel.max():.3f} ({steps.max():.1f})" in text
    assert "divisor n − 1" in text and "Hyndman and Fan" in text


def test_many_claims_flow_onto_pages_of_their_own(tmp_path, write, demo_lot):
    # Internal layout rule (no published source): a long claims table never runs into the colour section.
    from lampcalc.verdicts.lot_claims import check_lot_claims, read_lot_claims

    ratings, lot, _ = demo_lot
    claims = "lampcalc_lot_claims = 1\nnominal_cct_K = 3000\n" + "".join(
        f"[[claim]]\ntext = 'claim number {k:03d}'\nquantity = 'ra_min'\nat_least = {70 + k / 10}\n" for k in range(150))
    verdicts = check_lot_claims(read_lot_claims(write("many.toml", claims)), lot)
    report = Report(ratings, lot=lot, lot_verdicts=verdicts, pages=[builder("lot_pages")])
    path = tmp_path / "many.pdf"
    assert report.write(path) == report.n_pages >= 4
    pages = pdf_pages(path)
    for k in range(150):
        assert sum(f"claim number {k:03d}" in p for p in pages) == 1
    assert "Colour of the lot" in pages[-2] and "Statistics of the samples" in pages[-1]


def test_a_lot_of_two_without_claims(tmp_path, demo_lot):
    import lampcalc
    from lampcalc.verdicts.lot import lot_statistics

    ratings, _, _ = demo_lot
    batch = ratings.extras["batch"]
    two = lampcalc.rate_spectra(batch[:2])
    lot = lot_statistics(two)
    path = tmp_path / "two.pdf"
    Report(two, lot=lot, pages=[builder("lot_pages")]).write(path)
    text = _flat(" ".join(pdf_pages(path)))
    assert "No claims on the lot were checked" in text
    assert "none: it needs 3 samples or more" in text and _flat(explain("lot_too_small_for_ellipse")) in text


def test_a_users_bins_are_listed_with_the_ansi_categories(invent, around):
    # Samples counted in a supplier's sub-bins (invented names); a sample whose bin has corners not read from a
    # published table (flag bin_corners_unconfirmed) puts the counts in parentheses.
    from lampcalc.report.lot_pages import colour_items
    from lampcalc.verdicts.lot import lot_statistics

    xy = around((0.4339, 0.4033))  # REFERENCE_VALUES.md, ANSI C78.377-2017 3000 K centre
    names = ("3A",) * 5 + ("3B",) * 6 + (None,)
    lot = lot_statistics(invent(xy, bin_set=("sub-bins",) * 12, bin=names), nominal_cct_K=3000)
    items = dict(colour_items(lot))
    assert items["bins (sub-bins)"] == "3A: 5, 3B: 6, none: 1"
    flags = (("bin_corners_unconfirmed",),) + ((),) * 11
    lot = lot_statistics(invent(xy, bin_set=("sub-bins",) * 12, bin=names, flags=flags), nominal_cct_K=3000)
    assert dict(colour_items(lot))["bins (sub-bins)"] == "(3A: 5, 3B: 6, none: 1)"
    default = dict(colour_items(lot_statistics(invent(xy), nominal_cct_K=3000)))  # the ANSI set: listed once, as categories
    assert "ANSI C78.377" in default and not any(label.startswith("bins") for label in default)
