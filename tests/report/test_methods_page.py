"""The methods page: editions and sources, unconfirmed values named, cautions, nothing said to be from memory."""


def _methods(pages):
    return " ".join(" ".join(p.split()) for p in pages if "Methods and cautions" in p)


def test_methods_name_editions_cautions_and_unconfirmed_values(demo_report):
    # The shipped sets mark their own values as confirmed or not (lampcalc/data/sets, "# confirmed: no"):
    # the page names every unconfirmed one.
    from lampcalc.standards.ansi_bins import ansi_bin_set
    from lampcalc.standards.ellipse_sets import SHIPPED, shipped_ellipse_set

    _, pages = demo_report
    text = _methods(pages)
    for edition in ("CIE 015:2018", "CIE 13.3-1995", "CIE 224:2017", "TM-30-18", "CIE S 026/E:2018",
                    "ANSI C78.377-2017", "IEC 60081:1997", "CIE 167:2005"):
        assert edition in text
    assert "IEC 62471" in text and "licensed" in text and "local codes" in text
    for kind in SHIPPED:
        ellipses = shipped_ellipse_set(kind)
        assert ellipses.confirmed or ellipses.name in text
    bins = ansi_bin_set()
    built = text.split(f"not yet checked against the published text: {bins.name}: those of ")[1].split(" K ")[0]
    for name, confirmed in zip(bins.names, bins.bin_confirmed):
        assert confirmed or name in built.replace(" and ", ", ").split(", ")


def test_interpolation_per_lamp(demo_report, demo_check):
    ratings, _ = demo_check
    _, pages = demo_report
    text = _methods(pages)
    from lampcalc.verdicts.wording import INTERPOLATION_WORDS

    for method in set(ratings["interpolation"]):
        assert INTERPOLATION_WORDS[method] in text.split("Interpolation used")[1]


def test_nothing_client_facing_says_from_memory(demo_report):
    _, pages = demo_report
    assert not any("memory" in page.lower() for page in pages)


def test_methods_of_a_lot_of_angles_and_of_a_comparison(tmp_path, demo_lot, demo_report):
    # What the lot, angle and comparison pages rest on is stated where the report holds them, and only there:
    # ddof = 1, the percentile method (Hyndman and Fan 1996, definition 7), χ²₂(0.95) = −2·ln 0.05 = 5.991,
    # the weighting of the mean point over angle, the ratio floor of the comparison figure (5 % of the peak).
    import numpy as np

    import lampcalc
    from lampcalc.report.document import Report
    from lampcalc.verdicts.angles import colour_over_angle
    from lampcalc.verdicts.comparison import compare_ratings

    from .conftest import builder, pdf_pages

    ratings, lot, verdicts = demo_lot
    batch = ratings.extras["batch"]
    angled = lampcalc.rate_spectra(lampcalc.SpectralBatch(batch.wavelength_nm, batch.values[:3], batch.names[:3],
                                                          angle_deg=[0.0, 30.0, 60.0]))
    report = Report(None, lot=lot, lot_verdicts=verdicts,
                    comparison=(ratings, ratings, compare_ratings(ratings, ratings)), pages=[builder("methods_page")])
    path = tmp_path / "methods.pdf"
    report.write(path)
    text = _methods(pdf_pages(path))
    assert "ddof = 1" in text and "Hyndman and Fan, 1996" in text and f"{-2 * np.log(0.05):.3f}" in text
    assert "no promise for the next lamp" in text and "above 5 % of its peak" not in text
    assert "at least 5 % of its peak" in text and "Colour over angle" not in text
    Report(angled, angles=colour_over_angle(angled), pages=[builder("methods_page")]).write(path)
    text = _methods(pdf_pages(path))
    assert "no solid-angle (zonal) weighting" in text and "No limit is applied by default" in text
    assert "ddof" not in _methods(demo_report[1])  # a report of lamps alone says nothing of lots
