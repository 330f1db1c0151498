"""The PDF report: pages, text read back, determinism."""

import io

import pytest

from lampcalc.io.demo_data import demo_files


@pytest.fixture(scope="module")
def two_lamps(tmp_path_factory):
    """A spectrum file with two demo lamps, to keep the report small."""
    import lampcalc

    led_range = next(f for f in demo_files() if f.name == "quillfen_led_range_1nm.csv")
    batch = lampcalc.read_spectra(led_range)
    folder = tmp_path_factory.mktemp("rep")
    lampcalc.write_spectra_csv(batch[[0, 1]], folder / "two.csv")
    return folder / "two.csv", batch.names[:2]


def _pdf_text(path):
    from pypdf import PdfReader

    reader = PdfReader(io.BytesIO(path.read_bytes()))
    return [page.extract_text() for page in reader.pages]


def test_report_pages_text_and_determinism(run, tmp_path, two_lamps):
    path, names = two_lamps
    first, second = tmp_path / "a.pdf", tmp_path / "b.pdf"
    out_json = tmp_path / "r.json"
    result = run("rate", path, "--report", first, "--json", out_json)
    assert result.exit_code == 0, result.output
    assert run("rate", path, "--report", second).exit_code == 0
    assert first.read_bytes() == second.read_bytes()  # two runs, same bytes (no creation date)
    pages = _pdf_text(first)
    assert len(pages) == 2 + len(names)  # summary, one page per lamp, methods
    import json

    records = json.loads(out_json.read_text())
    for r in records:
        assert r["name"] in pages[0]
        assert f"{r['cct_K']:.0f}" in pages[0]
        lamp_page = next(p for p in pages[1:-1] if r["name"] in p)
        assert f"{r['cct_K']:.0f} K" in lamp_page
    assert "Methods" in pages[-1] and "IEC 62471" in pages[-1]
    assert all("not a photometric test report" in p for p in pages)


def test_check_report_carries_verdicts(run, tmp_path, two_lamps, write):
    path, names = two_lamps
    claims = write("c.csv", f"lamp,nominal_cct_K,min_ra\n{names[0]},2700,99\n")
    report = tmp_path / "c.pdf"
    result = run("check", path, "--claims", claims, "--report", report)
    assert result.exit_code == 1
    pages = _pdf_text(report)
    assert "fail" in pages[0]
    lamp_page = next(p for p in pages[1:-1] if names[0] in p)
    assert "FAILS" in lamp_page and "ansi_quadrangle" in lamp_page
