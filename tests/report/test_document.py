"""The document: page numbering and report number on every page, paper and margins, fonts, same bytes, page builders.

Checks of the report's own requirements; the paper sizes are ISO 216 (A4, 210 × 297 mm) and
ANSI/ASME Y14.1 (US Letter, 8.5 × 11 in).
"""

import io
import re

import pytest

from .conftest import INFO, pdf_pages

MM = 72 / 25.4  # PDF points per millimetre


def test_every_page_says_page_n_of_m_and_the_report_number(demo_report):
    path, pages = demo_report
    n = len(pages)
    for k, text in enumerate(pages, start=1):
        assert f"page {k} of {n}" in text
        assert f"report {INFO['report_number']}" in text
        assert "not a photometric test report" in text  # the caution on every page


def test_report_information_is_printed_as_given(demo_report):
    _, pages = demo_report
    first = pages[0]
    for key in ("client", "project", "laboratory", "date", "prepared_by", "notes"):
        assert INFO[key] in first, key
    assert INFO["title"] in first
    assert "prepared by" in pages[-1] and INFO["prepared_by"] in pages[-1]  # the sign-off


def test_no_date_is_invented(tmp_path, two_lamps):
    # Without a date in the report information, no date appears, and the PDF has no creation date.
    import lampcalc
    from pypdf import PdfReader

    path = tmp_path / "r.pdf"
    lampcalc.write_report(path, two_lamps, report_info={"client": "Q"})
    text = "\n".join(pdf_pages(path))
    assert "Q" in text and not re.search(r"\b(19|20)\d\d-\d\d-\d\d\b", text)
    meta = PdfReader(io.BytesIO(path.read_bytes())).metadata
    assert "/CreationDate" not in meta and "/ModDate" not in meta


def test_same_inputs_give_the_same_bytes(run, tmp_path, write):
    from .conftest import line, planck

    rows = "\n".join(f"{w},{a!r},{b!r}" for w, a, b in zip(range(360, 831), planck(3000.0), line(630, 9)))
    spectra = write("two.csv", "nm,bb3000,red\n" + rows + "\n")
    claims = write("claims.csv", "lamp,nominal_cct_K,min_ra\nbb3000,3000,80\nred,,80\n")
    info = write("info.toml", 'client = "Quillfen"\nreport_number = "R-1"\n')
    first, second = tmp_path / "a.pdf", tmp_path / "b.pdf"
    for out in (first, second):
        result = run("check", spectra, "--claims", claims, "--report", out, "--report-info", info)
        assert result.exit_code == 1, result.output  # the red LED's Ra cannot be evaluated
    assert first.read_bytes() == second.read_bytes()


@pytest.mark.parametrize("paper, size_mm", [("a4", (210.0, 297.0)), ("letter", (215.9, 279.4))])
def test_paper_margins_and_embedded_fonts(tmp_path, two_lamps, paper, size_mm):
    import lampcalc
    from pypdf import PdfReader

    path = tmp_path / f"{paper}.pdf"
    lampcalc.write_report(path, two_lamps, paper=paper)
    reader = PdfReader(io.BytesIO(path.read_bytes()))
    for page in reader.pages:
        box = page.mediabox
        assert float(box.width) == pytest.approx(size_mm[0] * MM, abs=0.6)
        assert float(box.height) == pytest.approx(size_mm[1] * MM, abs=0.6)
        xs, ys = [], []

        def visit(text, cm, tm, font, size):
            if text.strip():
                xs.append(cm[4] + tm[4] * cm[0])
                ys.append(cm[5] + tm[5] * cm[3])

        page.extract_text(visitor_text=visit)
        # Every line of text starts at least 15 mm inside the paper's edges (the margin).
        assert min(xs) >= 15 * MM and max(xs) <= float(box.width) - 15 * MM
        assert min(ys) >= 15 * MM and max(ys) <= float(box.height) - 15 * MM
        for font in page["/Resources"]["/Font"].values():
            descendant = font.get_object()["/DescendantFonts"][0].get_object()
            assert "/FontFile2" in descendant["/FontDescriptor"]  # TrueType, embedded


def test_unknown_paper_is_refused(two_lamps, tmp_path):
    import lampcalc

    with pytest.raises(ValueError, match="unknown paper 'a5'; choose one of a4, letter"):
        lampcalc.write_report(tmp_path / "x.pdf", two_lamps, paper="a5")
    assert not (tmp_path / "x.pdf").exists()


def test_page_builders_in_order_and_a_page_added_from_outside(tmp_path, two_lamps):
    import lampcalc
    from lampcalc.report.document import page_builders

    builders = {type(b).__name__: b for b in page_builders()}
    names = list(builders)  # other issues add builders of their own between these
    order = ["SummaryPages", "LotPages", "AnglePages", "ComparisonPages", "UncertaintyPages", "LampPages",
             "MethodsPage"]
    assert [n for n in names if n in order] == order

    class LotPage:  # what another engineer's module would define as PAGES
        order = 200

        def count(self, report):
            return 1

        def draw(self, report, sheet):
            with sheet.page("lot", "Lot statistics", f"{len(report.records)} lamps") as page:
                page.text(sheet.left, sheet.top, "spread of the lot")

    summary, methods = builders["SummaryPages"], builders["MethodsPage"]
    path = tmp_path / "lot.pdf"
    n = lampcalc.write_report(path, two_lamps, pages=sorted([methods, LotPage(), summary], key=lambda b: b.order))
    pages = pdf_pages(path)
    assert n == len(pages) == 3
    assert "spread of the lot" in pages[1] and "page 2 of 3" in pages[1] and "Methods" in pages[2]

    class Miscounted(LotPage):
        def count(self, report):
            return 2

    with pytest.raises(RuntimeError, match="drew 1 pages, planned 2"):
        lampcalc.write_report(tmp_path / "bad.pdf", two_lamps, pages=[Miscounted()])
    assert not (tmp_path / "bad.pdf").exists()  # nothing half-written


def test_thirty_lamps_flow_over_summary_pages(tmp_path):
    # 30 lamps: the summary continues on a second page, every lamp in exactly one summary table, and
    # each page's diagram marks only its own lamps.
    import lampcalc
    from lampcalc.report.document import Report
    from lampcalc.report.summary_pages import PAGES as SUMMARY

    from .conftest import line, model_batch, planck

    lamps = [(f"blackbody {t} K", planck(float(t))) for t in range(2000, 8000, 400)]
    lamps += [(f"phosphor LED {k:02d}", line(450, 10) + (1.0 + 0.05 * k) * line(565, 55)) for k in range(15)]
    ratings = lampcalc.rate_spectra(model_batch(lamps))
    report = Report(ratings, pages=[SUMMARY])
    path = tmp_path / "thirty.pdf"
    assert report.write(path) == report.n_pages == 2
    pages = pdf_pages(path)
    for name, _ in lamps:
        assert sum(name in text for text in pages) == 1, name
    (_, _, _, plan, _) = report.cache["summary"]
    assert plan[0][0] == 0 and plan[-1][1] == 30 and all(a[1] == b[0] for a, b in zip(plan, plan[1:]))


def test_a_bad_report_info_file_stops_before_anything_is_written(run, write, tmp_path):
    from lampcalc.io.demo_data import demo_files

    info = write("info.toml", 'client = "Q"\nreport_nr = "7"\n')
    out = tmp_path / "r.pdf"
    result = run("rate", *demo_files(), "--report", out, "--report-info", info, "--json", tmp_path / "r.json")
    assert result.exit_code == 2
    assert result.stderr.strip().splitlines() == [f"lampcalc: {info}, line 2: unknown key 'report_nr'; the keys are "
                                                  "title, client, project, laboratory, report_number, date, "
                                                  "prepared_by, notes"]
    assert not out.exists() and not (tmp_path / "r.json").exists()
    lonely = run("rate", *demo_files(), "--paper", "letter")
    assert lonely.exit_code == 2 and "add --report FILE" in lonely.stderr


def test_letter_paper_from_the_command_line(run, tmp_path, write):
    from pypdf import PdfReader

    from .conftest import planck

    spectrum = "\n".join(f"{w},{v!r}" for w, v in zip(range(360, 831), planck(3000.0)))
    path = write("bb.csv", "nm,bb3000\n" + spectrum + "\n")
    out = tmp_path / "letter.pdf"
    assert run("rate", path, "--report", out, "--paper", "letter").exit_code == 0
    page = PdfReader(io.BytesIO(out.read_bytes())).pages[0]
    assert float(page.mediabox.width) == pytest.approx(612.0, abs=0.5)  # 8.5 in
