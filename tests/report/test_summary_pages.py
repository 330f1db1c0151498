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
