"""Lamp pages: R1–R15 and the hue bins, validity markers, flags in words, claims in words, non-white sources."""

import pytest

from lampcalc.rating.flags import FLAG_MEANINGS
from lampcalc.verdicts.wording import format_value



def _page_of(pages, name):
    """The lamp page whose title is ``name`` (lamp pages have a "Colour point" section)."""
    found = [p for p in pages if "Colour point" in p and name in (line.strip() for line in p.splitlines())]
    assert len(found) == 1, name
    return found[0]


def test_r1_to_r15_ra_rf_rg_and_hue_bins_of_a_blackbody(odd_report, odd_lamps):
    # CIE 13.3-1995 and CIE 224:2017: a lamp identical to its reference illuminant (a Planckian radiator
    # below 4000 K, c2 = 1.4388e-2 m·K) scores 100 in every index; its hue bins shift by nothing.
    _, pages = odd_report
    page = _page_of(pages, "blackbody 3000 K")
    lines = [line.strip() for line in page.splitlines()]
    for k in range(1, 16):
        assert f"R{k}" in lines
    assert "Ra" in lines and "Rf" in lines and "Rg" in lines
    assert lines.count("100.0") >= 18  # Ra, R1–R15, Rf, Rg
    record = next(r for r in odd_lamps.records() if r["name"] == "blackbody 3000 K")
    for key, expected in (("rf_hue_bins", "100"), ("chroma_shift_hue_bins_percent", "0.0"),
                          ("hue_shift_hue_bins_rad", "0.00")):
        assert {format_value(key, v) for v in record[key]} == {expected}
    assert lines.count("100") >= 16 and lines.count("0.00") >= 8  # the bins table (pypdf may join a few lines)


def test_every_index_on_the_page_is_the_rated_one(demo_report, demo_check):
    # The page shows each rated value with the digits of its quantity (internal consistency of two outputs).
    ratings, _ = demo_check
    _, pages = demo_report
    for record in ratings.records():
        page = _page_of(pages, record["name"])
        lines = {line.strip() for line in page.splitlines()}
        for k, ri in enumerate(record["ri"]):
            assert format_value("ri", ri) in lines, (record["name"], k + 1)
        for k, value in enumerate(record["chroma_shift_hue_bins_percent"]):
            assert format_value("chroma_shift_hue_bins_percent", value) in lines


def test_doubtful_values_in_parentheses_with_the_flag_in_words(odd_report, odd_lamps):
    # CIE 13.3-1995 limits its method to DC ≤ 5.4e-3; the narrow-band RGB lamp lies beyond.
    _, pages = odd_report
    record = next(r for r in odd_lamps.records() if r["name"] == "narrow RGB")
    assert "cri_outside_validity" in record["flags"]
    page = _page_of(pages, "narrow RGB")
    assert f"({format_value('ra', record['ra'])})" in page
    assert f"({format_value('ri', record['ri'][8])})" in page
    assert FLAG_MEANINGS["cri_outside_validity"] in page
    assert "cri_outside_validity" not in page  # words, never the programmer's key
    summary = pages[0]
    assert f"({format_value('ra', record['ra'])})" in summary and FLAG_MEANINGS["cri_outside_validity"] in summary


def test_a_coloured_source_shows_no_ellipses_and_no_rendering(odd_report):
    _, pages = odd_report
    page = _page_of(pages, "red LED 630 nm")
    assert "Colour point" in page and "ellipses" not in page
    assert "Not evaluated: " + FLAG_MEANINGS["rendering_not_meaningful"] in page
    for label in ("dominant λ", "purity", "peak", "FWHM"):
        assert label in page
    assert "630 nm" in page  # its peak, on the 1 nm grid


def test_names_are_plain_text_and_missing_glyphs_are_replaced(odd_report):
    # "$\foo$" would be math text to matplotlib; a character the font lacks would warn (warnings are errors).
    _, pages = odd_report
    assert _page_of(pages, r"$\foo$ lamp")
    assert _page_of(pages, "\ufffd lamp")


def test_claims_in_words_on_the_lamp_page(demo_report):
    # The demo supplier claims 4000 K for QF-DL-4000: ANSI C78.377-2017 Table 1 gives 3985 ± 275 K.
    _, pages = demo_report
    page = _page_of(pages, "QF-DL-4000")
    assert "Does not meet 1 of 9 claims." in page
    assert "nominal 4000 K: CCT 3710–4260 K" in page and "nominal 3985" not in page
    assert "lamp efficacy ≥ 130 lm/W" in page and "does not meet" in page
    assert "R9 ≥ 20" in page and "meets" in page
    assert "efficacy_lm_per_W" not in page and "ansi_cct_K" not in page
    unclaimed = _page_of(pages, "QF-RGB-5600")
    assert "No claims of this lamp were checked." in unclaimed


def test_lamp_page_quotes_absolute_quantities_where_the_data_allow(demo_report, demo_check):
    ratings, _ = demo_check
    _, pages = demo_report
    absolute = next(r for r in ratings.records() if r["luminous_flux_lm"] is not None)
    page = _page_of(pages, absolute["name"])
    assert format_value("luminous_flux_lm", absolute["luminous_flux_lm"], unit=True) in page
    assert format_value("electrical_W", absolute["electrical_W"], unit=True) in page
    relative = next(r for r in ratings.records() if r["quantity"] == "relative")
    assert "none: the spectrum is relative" in _page_of(pages, relative["name"])


@pytest.mark.parametrize("key", ["s_cone_der", "melanopic_elr_mW_per_lm"])
def test_alpha_opic_ratios_are_on_the_page(demo_report, demo_check, key):
    ratings, _ = demo_check
    _, pages = demo_report
    for record in ratings.records():
        assert format_value(key, record[key]) in _page_of(pages, record["name"])


def test_a_cct_far_from_the_locus_is_in_parentheses_with_its_hue_bins(odd_report, odd_lamps):
    # CIE 015:2018 advises against a CCT beyond |Duv| = 0.05: a green LED's CCT, and the CIE 224 values
    # built on its reference (Rf, Rg, every hue bin), are printed as doubtful, never as ordinary numbers.
    _, pages = odd_report
    record = next(r for r in odd_lamps.records() if r["name"] == "green LED 525 nm")
    assert "duv_beyond_0.05" in record["flags"] and abs(record["duv"]) > 0.05
    page = _page_of(pages, "green LED 525 nm")
    assert f"({format_value('cct_K', record['cct_K'], unit=True)})" in page
    assert f"({format_value('rf', record['rf'])})" in page
    for key in ("rf_hue_bins", "chroma_shift_hue_bins_percent"):
        assert all(f"({format_value(key, v)})" in page for v in record[key])
    assert f"({format_value('cct_K', record['cct_K'])})" in pages[0]  # the summary table too


def test_the_data_line_of_every_lamp_page_is_whole(demo_report, demo_check):
    # The source and the resampling method head each lamp page, never shortened ("Sprague (CIE 167:2…").
    from lampcalc.verdicts.wording import INTERPOLATION_WORDS

    ratings, _ = demo_check
    _, pages = demo_report
    for record in ratings.records():
        page = _page_of(pages, record["name"])
        assert f"onto the 1 nm grid: {INTERPOLATION_WORDS[record['interpolation']]}" in page, record["name"]
