"""Generate the tables that lampcalc ships in ``lampcalc/data/``.

Every table is written from colour-science's datasets (or, for the CIE S 026 action
spectra, from the CIE data file kept in ``shared/data``) exactly as published there,
without interpolation: lampcalc interpolates on load where a table is tabulated more
coarsely than 1 nm, and says how. ``tests/test_tables.py`` regenerates every table
with :func:`render_tables` and checks the shipped files are identical.

Run from the repository root::

    python scripts/make_tables.py [--s026 PATH/TO/cie_s026_alpha_opic_1nm.csv]
"""

import argparse
import csv
import pathlib

import numpy as np

DATA_DIR = pathlib.Path(__file__).resolve().parents[1] / "lampcalc" / "data"
S026_FILE = "cie_s026_alpha_opic_1nm.csv"

S026_ATTRIBUTION = (
    "CIE S 026/E:2018, Table 2; CIE data table 'CIE alpha-opic action spectra', "
    "DOI 10.25039/CIE.DS.vqqhzp5a, published by the CIE under CC BY-SA 4.0. "
    "Copied unchanged apart from the column names."
)


def _format_table(source, columns, wavelength_nm, values):
    """CSV text: ``# source`` lines, a header row, one row per wavelength."""
    lines = [f"# {line}" for line in source.splitlines()]
    lines.append(",".join(["wavelength_nm", *columns]))
    values = np.asarray(values, dtype=float).reshape(len(wavelength_nm), -1)
    for wl, row in zip(wavelength_nm, values):
        lines.append(",".join([f"{float(wl):g}", *(repr(float(v)) for v in row)]))
    return "\n".join(lines) + "\n"


def _from_sd(source, columns, *sds):
    wl = sds[0].wavelengths
    for sd in sds[1:]:
        assert np.array_equal(sd.wavelengths, wl)
    return _format_table(source, columns, wl, np.stack([sd.values for sd in sds], -1))


def _s026_table(path):
    with open(path, newline="", encoding="utf-8") as handle:
        rows = [row for row in csv.reader(handle) if row]
    body = np.array([[float(v) for v in row] for row in rows[1:]])
    return _format_table(
        S026_ATTRIBUTION,
        ["s_cone", "m_cone", "l_cone", "rhodopic", "melanopic"],
        body[:, 0],
        body[:, 1:],
    )


def render_tables(s026_path):
    """Return ``{file name: CSV text}`` for every shipped table."""
    import colour
    from colour.colorimetry import (
        SDS_BASIS_FUNCTIONS_CIE_ILLUMINANT_D_SERIES as daylight,
        SDS_LEFS_PHOTOPIC,
        SDS_LEFS_SCOTOPIC,
    )
    from colour.quality.datasets import SDS_TCS
    from colour.quality.cfi2017 import load_TCS_CIE2017

    version = f"colour-science {colour.__version__}"
    tables = {}
    for name, key, observer in (
        ("cmf_1931_2deg.csv", "CIE 1931 2 Degree Standard Observer", "CIE 1931 2°"),
        ("cmf_1964_10deg.csv", "CIE 1964 10 Degree Standard Observer", "CIE 1964 10°"),
    ):
        cmfs = colour.MSDS_CMFS[key]
        tables[name] = _format_table(
            f"{observer} standard observer colour-matching functions, 1 nm "
            f"(CIE 015:2018, Table 1 / CIE 018:2019).\nFrom {version}, dataset '{key}'.",
            ["x_bar", "y_bar", "z_bar"],
            cmfs.wavelengths,
            cmfs.values,
        )
    tables["luminous_efficiency.csv"] = _from_sd(
        "CIE 1924 photopic luminous efficiency function V(λ), 1 nm (CIE 015:2018; ISO 23539/CIE S 010).\n"
        f"From {version}, dataset 'CIE 1924 Photopic Standard Observer'.",
        ["v"],
        SDS_LEFS_PHOTOPIC["CIE 1924 Photopic Standard Observer"],
    )
    tables["scotopic_luminous_efficiency.csv"] = _from_sd(
        "CIE 1951 scotopic luminous efficiency function V'(λ), 1 nm, tabulated 380-780 nm "
        "(ISO 23539/CIE S 010).\n"
        f"From {version}, dataset 'CIE 1951 Scotopic Standard Observer'.",
        ["v_prime"],
        SDS_LEFS_SCOTOPIC["CIE 1951 Scotopic Standard Observer"],
    )
    tables["daylight_components.csv"] = _from_sd(
        "CIE daylight components S0, S1, S2 at 5 nm, 300-830 nm (CIE 015:2018, Table 6).\n"
        f"From {version}, dataset SDS_BASIS_FUNCTIONS_CIE_ILLUMINANT_D_SERIES.",
        ["s0", "s1", "s2"],
        daylight["S0"],
        daylight["S1"],
        daylight["S2"],
    )
    tcs = SDS_TCS["CIE 1995"]
    names = sorted(tcs)
    tables["cie13_test_colour_samples.csv"] = _from_sd(
        "CIE 13.3-1995 test colour samples TCS01-TCS14, spectral radiance factors, 5 nm, "
        f"360-830 nm.\nFrom {version}, dataset SDS_TCS['CIE 1995'].",
        [n.lower() for n in names],
        *(tcs[n] for n in names),
    )
    tcs15 = SDS_TCS["CIE 2024"]["TCS15"]
    tables["cie13_tcs15.csv"] = _from_sd(
        "Test colour sample 15 (Japanese skin complexion, JIS Z 8726, used for R15), spectral radiance "
        "factors, 5 nm, 380-780 nm. CIE data set 'Spectral radiance factors of test-colour sample #15 of "
        "the Japanese skin complexion' (2024), DOI 10.25039/CIE.DS.7chm7z5h, CC BY-SA 4.0.\n"
        f"From {version}, dataset SDS_TCS['CIE 2024']['TCS15'].",
        ["tcs15"],
        tcs15,
    )
    from colour import SpectralShape

    ces = load_TCS_CIE2017(SpectralShape(380, 780, 1))
    tables["cie224_colour_evaluation_samples.csv"] = _format_table(
        "CIE 224:2017 / ANSI/IES TM-30 colour evaluation samples CES01-CES99, spectral "
        f"radiance factors, 1 nm, 380-780 nm.\nFrom {version}, load_TCS_CIE2017 (1 nm file).",
        [f"ces{i + 1:02d}" for i in range(99)],
        ces.wavelengths,
        ces.values,
    )
    tables["cie_s026_action_spectra.csv"] = _s026_table(s026_path)
    return tables


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument(
        "--s026",
        default=str(pathlib.Path(__file__).resolve().parents[2] / "shared" / "data" / S026_FILE),
        help="path of the CIE S 026 action spectra CSV",
    )
    args = parser.parse_args()
    DATA_DIR.mkdir(parents=True, exist_ok=True)
    for name, text in render_tables(args.s026).items():
        (DATA_DIR / name).write_text(text, encoding="utf-8")
        print(f"wrote {DATA_DIR / name}")


if __name__ == "__main__":
    main()
