"""The summary: the verdict first, validity markers and flag letters with their legend."""

from lampcalc.rating.flags import FLAG_MEANINGS
from lampcalc.report.markers import flag_legend, flag_letters, quote
from lampcalc.verdicts.wording import count_line


def test_the_verdict_comes_first_and_tells_fail_from_not_evaluated(demo_report, demo_check):
    _, verdicts = demo_check
    _, pages = demo_report
    first = " ".join(pages[0].split())
    assert "3 of 8 lamps with claims do not meet every claim." in first  # the demo's planted false claims
    assert " ".join((count_line(verdicts) + ".").split()) in first
    assert "1 of 9 not met" in first  # QF-DL-4000's efficacy claim (the demo supplier's planted false claim)
    assert "fail" not in first


def test_flag_letters_are_explained_in_words():
    records = [{"flags": ["cri_outside_validity"]}, {"flags": ["range_truncated", "cri_outside_validity"]}]
    letters = flag_letters(records)
    assert letters == {"range_truncated": "a", "cri_outside_validity": "b"}  # order of the flag table
    assert flag_legend(letters, ["cri_outside_validity"]) == ["b  " + FLAG_MEANINGS["cri_outside_validity"]]


def test_quote_marks_doubtful_values_and_tolerates_missing_keys():
    record = {"ra": 81.26, "ri": [90.0] * 15, "flags": ["cri_outside_validity"]}
    assert quote(record, "ra") == "(81.3)" and quote(record, "ri", index=8) == "(90.0)"
    assert quote(record, "dominant_wavelength_nm") == "–"  # a key of a later lampcalc, absent here
    assert quote({"rf": 80.0, "flags": []}, "rf") == "80.0"


def test_long_report_information_gets_a_page_of_its_own(tmp_path, two_lamps):
    # Internal layout rule (no published source): rows never run into the report information.
    from lampcalc.report.document import Report
    from lampcalc.report.summary_pages import NOTES_MAX_LINES, PAGES as SUMMARY

    from .conftest import pdf_pages

    notes = " ".join(f"Sentence {k} about how the spectra were measured." for k in range(400))
    report = Report(two_lamps, info={"notes": notes, "report_number": "L-1"}, pages=[SUMMARY])
    path = tmp_path / "long.pdf"
    assert report.write(path) == 2
    first, second = pdf_pages(path)
    assert "Sentence 0 " in first and "shortened to fit the page" in first and "blackbody 3000 K" not in first
    assert "blackbody 3000 K" in second and "red LED 630 nm" in second
    assert NOTES_MAX_LINES >= 10
