"""The methods page: editions and sources, unconfirmed values named, cautions, nothing said to be from memory."""

from lampcalc.verdicts.wording import UNCONFIRMED_BASES


def test_methods_name_editions_cautions_and_unconfirmed_values(demo_report):
    _, pages = demo_report
    text = " ".join(pages[-1].split())
    for edition in ("CIE 015:2018", "CIE 13.3-1995", "CIE 224:2017", "TM-30-18", "CIE S 026/E:2018",
                    "ANSI C78.377-2017", "IEC 60081:1997"):
        assert edition in text
    assert "IEC 62471" in text and "licensed" in text and "local codes" in text
    for words in UNCONFIRMED_BASES.values():
        assert " ".join(words.split()) in text
    assert "Interpolation used" in text


def test_nothing_client_facing_says_from_memory(demo_report):
    _, pages = demo_report
    assert not any("memory" in page.lower() for page in pages)
