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
    built = text.split("not yet checked against the published text: the quadrangles of ")[1].split(" K in ")[0]
    for name, confirmed in zip(bins.names, bins.bin_confirmed):
        assert confirmed or name in built.split(", ")


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
