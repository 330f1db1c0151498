"""Generate the demo spectra in ``spectra_demo/`` from physical models.

The lamps belong to Quillfen Lighting, a supplier invented for lampcalc's demo; no
real product, brand or measurement is behind any of them. Each spectrum is built from
a physical model of its emitters, mixed to a target chromaticity, sampled the way a
spectroradiometer export would be and given seeded measurement noise. The files are
committed; run this script (from the repository root) only to regenerate them:

    python scripts/make_demo_spectra.py

Models
------
* InGaN and AlInGaP LED dies: band-to-band emission in photon energy E,
  I(E) ∝ √(E − Eg)·exp(−(E − Eg)/kTj), broadened by a Gaussian (alloy disorder).
* Phosphors (Ce³⁺ garnets, Eu²⁺ nitrides and aluminates): Gaussian bands in photon
  energy, as the configurational-coordinate model gives; Ce³⁺ has two bands 0.25 eV
  apart (5d → ²F₅/₂ and ²F₇/₂).
* Fluorescent lamp: mercury lines and rare-earth phosphor lines seen through a 4 nm
  triangular instrument bandpass, plus the broad Eu²⁺ blue band.
* Halogen lamp: a graybody filament with a tungsten-like emissivity that falls
  slowly with wavelength (an approximate linear fit, from memory).

Sets in subfolders (``lampcalc lot`` and ``lampcalc compare``):

* ``lot/``: twelve samples of one spot lamp. Each sample's blue die has its own peak
  wavelength and junction temperature (the supplier's die bin), and its phosphor layer its
  own load of garnet and nitride (dispensing variation), drawn from normal distributions.
* ``angles/``: one downlight on a goniometer, 0–80°. Light leaving the package at an angle
  θ crosses more phosphor: the path length grows as 1 + β·(1/cos θ − 1) (β < 1: scattering
  mixes directions), the blue that gets through falls as exp(−α·path) and the phosphors
  emit what the blue loses. Intensity falls as cos θ to a power; the spectra are the
  irradiance at the detector.
* ``datasheet/``: the data-sheet spectrum of one lamp (the supplier's smooth, nominal
  model at 5 nm) and one measured sample of it (another die bin and phosphor load, 1 nm,
  with noise).
"""

import json
import pathlib

import numpy as np

import lampcalc
from lampcalc.physics.blackbody import spectral_radiance
from lampcalc.colorimetry.tristimulus import tristimulus
from lampcalc.colorimetry.locus import cct_duv_to_xy
from lampcalc.spectra.resampling import GRID_NM

OUT = pathlib.Path(__file__).resolve().parents[1] / "spectra_demo"
HC_eV_nm = 1239.841984  # h·c in eV·nm
K_B_eV = 8.617333262e-5  # Boltzmann constant, eV/K
SUPPLIER = "Quillfen Lighting (a fictional supplier for lampcalc's demo)"

FINE_NM = np.arange(340.0, 1000.25, 0.25)  # models are built finely, then sampled


def die(peak_nm, junction_K=350.0, disorder_eV=0.035, wl=FINE_NM):
    """LED die emission per nm: √(E − Eg)·exp(−(E − Eg)/kT) ⊗ Gaussian, peak normalised to 1."""
    e_grid = np.linspace(1.0, 4.0, 6001)
    kt = K_B_eV * junction_K
    eg = HC_eV_nm / peak_nm - 0.5 * kt  # the band-edge model peaks at Eg + kT/2
    joint = np.sqrt(np.clip(e_grid - eg, 0.0, None)) * np.exp(-np.clip(e_grid - eg, 0.0, None) / kt)
    step = e_grid[1] - e_grid[0]
    kernel_e = np.arange(-5 * disorder_eV, 5 * disorder_eV + step, step)
    kernel = np.exp(-0.5 * (kernel_e / disorder_eV) ** 2)
    per_e = np.convolve(joint, kernel / kernel.sum(), mode="same")
    energy = HC_eV_nm / wl
    per_nm = np.interp(energy, e_grid, per_e) * energy / wl  # |dE/dλ| = E/λ
    return per_nm / per_nm.max()


def band(peak_nm, fwhm_eV, wl=FINE_NM):
    """Gaussian band in photon energy, expressed per nm, peak normalised to 1."""
    energy = HC_eV_nm / wl
    sigma = fwhm_eV / 2.3548
    per_nm = np.exp(-0.5 * ((energy - HC_eV_nm / peak_nm) / sigma) ** 2) * energy / wl
    return per_nm / per_nm.max()


def cerium_garnet(peak_nm, fwhm_eV=0.32, wl=FINE_NM):
    """Ce³⁺ garnet phosphor: two Gaussian bands 0.25 eV apart, the lower-energy one weaker."""
    e0 = HC_eV_nm / peak_nm + 0.08
    bands = band(HC_eV_nm / e0, fwhm_eV, wl) + 0.55 * band(HC_eV_nm / (e0 - 0.25), fwhm_eV, wl)
    return bands / bands.max()


def lines(centres_nm, strengths, bandpass_nm=4.0, wl=FINE_NM):
    """Emission lines seen through a triangular instrument bandpass (FWHM ``bandpass_nm``)."""
    out = np.zeros_like(wl)
    for c, s in zip(centres_nm, strengths):
        out += s * np.clip(1.0 - np.abs(wl - c) / bandpass_nm, 0.0, None)
    return out


def mix_weights(parts, fixed, free, cct, duv):
    """Weights of ``parts`` whose sum lies at the chromaticity (cct, duv).

    ``fixed`` maps part index to weight; the two ``free`` weights solve the linear
    conditions Σ wᵢ·(Xᵢ − x·Sᵢ) = 0 and Σ wᵢ·(Yᵢ − y·Sᵢ) = 0, Sᵢ = Xᵢ + Yᵢ + Zᵢ.
    """
    x, y = cct_duv_to_xy([cct, duv])
    XYZ = np.array([tristimulus(np.interp(GRID_NM, FINE_NM, p)) for p in parts])
    s = XYZ.sum(axis=1)
    rows = np.stack([XYZ[:, 0] - x * s, XYZ[:, 1] - y * s])
    weights = np.zeros(len(parts))
    for i, w in fixed.items():
        weights[i] = w
    weights[list(free)] = np.linalg.solve(rows[:, list(free)], -rows @ weights)
    if np.any(weights < 0):
        raise ValueError(f"no physical mixture reaches {cct} K, Duv {duv}: weights {weights}")
    return weights


def mix(parts, fixed, free, cct, duv):
    """Sum of ``parts`` at the chromaticity (cct, duv), peak normalised to 1 (see :func:`mix_weights`)."""
    spectrum = mix_weights(parts, fixed, free, cct, duv) @ np.array(parts)
    return spectrum / spectrum.max()


def sample(spectrum, start, stop, step, rng, noise=0.001, digits=5):
    """Sample as an instrument export: at the grid, with noise of ``noise``·peak, rounded."""
    wl = np.arange(start, stop + step / 2, step)
    values = np.interp(wl, FINE_NM, spectrum)
    values = values / values.max()
    values = values + rng.normal(0.0, noise, wl.size)
    return wl, np.array([float(f"{v:.{digits}g}") for v in values])


def lamps():
    """The demo lamps: name -> relative spectrum on FINE_NM."""
    blue = die(452.0)
    yag = cerium_garnet(555.0)
    luag = cerium_garnet(530.0)
    nitride_red = band(628.0, 0.30)
    out = {
        "QF-A60-2700-R9": mix([blue, luag, nitride_red], {1: 1.0}, (0, 2), 2700, 0.0005),
        "QF-A60-3000": mix([blue, yag, nitride_red], {1: 1.0}, (0, 2), 3260, 0.0020),
        "QF-DL-4000": mix([blue, yag, nitride_red], {1: 1.0}, (0, 2), 3990, 0.0012),
        "QF-PNL-5000": mix([blue, yag, nitride_red], {1: 1.0}, (0, 2), 5050, 0.0030),
        "QF-HB-6500": mix([blue, yag, nitride_red], {1: 1.0}, (0, 2), 6480, 0.0040),
        "QF-VS-3500": mix(
            [die(410.0, disorder_eV=0.03), band(455.0, 0.38), band(525.0, 0.33), band(625.0, 0.30)],
            {0: 0.5, 1: 0.6},
            (2, 3),
            3480,
            0.0008,
        ),
        "QF-RGB-5600": mix(
            [die(458.0), die(530.0, disorder_eV=0.06), die(624.0, disorder_eV=0.02)], {0: 1.0}, (1, 2), 5600, 0.0010
        ),
    }
    mercury = lines([404.7, 435.8, 546.1, 577.0, 579.1], [0.25, 0.55, 0.70, 0.08, 0.09])
    europium_red = lines([587.6, 593.0, 599.0, 611.6, 625.0, 650.0, 707.0], [0.10, 0.10, 0.06, 1.0, 0.08, 0.04, 0.05])
    terbium_green = lines([487.0, 543.5, 585.0, 620.0], [0.18, 1.0, 0.12, 0.07])
    bam_blue = band(450.0, 0.40)
    out["QF-T5-840"] = mix([mercury, europium_red, terbium_green, bam_blue], {0: 1.0, 3: 0.3}, (1, 2), 3950, 0.0010)
    emissivity = 0.505 - 1.1e-4 * FINE_NM  # tungsten near 3000 K, approximate (from memory)
    halogen = spectral_radiance(2900.0, FINE_NM, emissivity=emissivity)
    out["QF-HAL-2900"] = halogen / halogen.max()
    return out


def die_and_phosphors(blue_peak_nm, blue_junction_K, garnet, nitride, wl=FINE_NM):
    """The three parts of a phosphor-converted white LED: blue die, garnet, nitride red."""
    return [die(blue_peak_nm, blue_junction_K, wl=wl), cerium_garnet(garnet, wl=wl), band(nitride, 0.30, wl=wl)]


def lot_spectra(rng, n=12):
    """A lot of one spot lamp (QF-SPOT-3000): name -> spectrum, each with its own die and phosphor load."""
    weights = mix_weights(die_and_phosphors(451.0, 350.0, 555.0, 628.0), {1: 1.0}, (0, 2), 3000, 0.0006)
    out = {}
    for k in range(1, n + 1):
        parts = die_and_phosphors(rng.normal(451.0, 0.8), rng.normal(350.0, 8.0), 555.0, 628.0)
        load = weights * np.array([1.0, rng.normal(1.0, 0.02), rng.normal(1.0, 0.03)])
        spectrum = load @ np.array(parts)
        out[f"QF-SPOT-3000-S{k:02d}"] = spectrum / spectrum.max()
    return out


def angle_spectra(angles_deg, beta=0.03, exponent=1.3, transmitted_0=0.35):
    """One downlight (QF-DL-4000) at each angle, peak of the on-axis spectrum = 1, shape (n_angles, n_fine).

    ``transmitted_0``: the share of blue that crosses the phosphor layer on axis.
    """
    parts = die_and_phosphors(452.0, 350.0, 555.0, 628.0)
    weights = mix_weights(parts, {1: 1.0}, (0, 2), 4000, 0.0015)  # the on-axis mixture
    alpha = -np.log(transmitted_0)
    phosphor = weights[1] * parts[1] + weights[2] * parts[2]
    out = []
    for theta in np.radians(angles_deg):
        transmitted = np.exp(-alpha * (1.0 + beta * (1.0 / np.cos(theta) - 1.0)))
        blue = weights[0] * transmitted / transmitted_0
        converted = (1.0 - transmitted) / (1.0 - transmitted_0)
        out.append(np.cos(theta) ** exponent * (blue * parts[0] + converted * phosphor))
    out = np.array(out)
    return out / out[0].max()


def datasheet_and_sample():
    """QF-A60-2700-R9: the data sheet's nominal spectrum, and one sample (another die bin and phosphor load)."""
    nominal = [die(452.0), cerium_garnet(530.0), band(628.0, 0.30)]
    weights = mix_weights(nominal, {1: 1.0}, (0, 2), 2700, 0.0005)
    sheet = weights @ np.array(nominal)
    measured = (weights * np.array([1.0, 1.0, 0.94])) @ np.array([die(453.5, 360.0), *nominal[1:]])
    return sheet / sheet.max(), measured / measured.max()


def write_text(path, text):
    path.write_text(text, encoding="utf-8", newline="")
    print(f"wrote {path}")


def main():
    rng = np.random.default_rng(20261201)
    spectra = lamps()
    OUT.mkdir(exist_ok=True)

    # 1 nm, 380-780 nm, comma separated with a header: the LED range.
    names = ["QF-A60-2700-R9", "QF-A60-3000", "QF-PNL-5000", "QF-HB-6500"]
    cols = [sample(spectra[n], 380, 780, 1, rng) for n in names]
    rows = [",".join(["wavelength_nm", *names])]
    rows += [",".join([f"{w:g}", *(f"{c[1][i]:g}" for c in cols)]) for i, w in enumerate(cols[0][0])]
    write_text(
        OUT / "quillfen_led_range_1nm.csv",
        f"# {SUPPLIER}: LED lamp range, relative spectral flux\n# quantity: relative\n" + "\n".join(rows) + "\n",
    )

    # 5 nm, 360-830 nm, tab separated: the halogen lamp.
    wl, v = sample(spectra["QF-HAL-2900"], 360, 830, 5, rng)
    body = "\n".join(f"{w:g}\t{x:g}" for w, x in zip(wl, v))
    write_text(
        OUT / "quillfen_halogen_5nm.tsv",
        f"# {SUPPLIER}: halogen lamp QF-HAL-2900\n# measured in an integrating sphere, relative\n"
        f"Wavelength (nm)\tQF-HAL-2900\n{body}\n",
    )

    # 2 nm, 350-1000 nm, whitespace separated with metadata lines: fluorescent and violet-pumped.
    names = ["QF-T5-840", "QF-VS-3500"]
    cols = [sample(spectra[n], 350, 1000, 2, rng) for n in names]
    body = "\n".join(f"{w:7.1f}  {cols[0][1][i]:10.5f}  {cols[1][1][i]:10.5f}" for i, w in enumerate(cols[0][0]))
    write_text(
        OUT / "quillfen_sphere_2nm.txt",
        "Spectral data export\nInstrument: array spectroradiometer (simulated)\n"
        f"Customer: {SUPPLIER}\nIntegration time: 120 ms\nquantity: relative\n\n"
        f"lambda  {'  '.join(names)}\n{body}\n",
    )

    # Semicolon-separated, decimal commas, 1 nm 380-780: an RGB mixture.
    wl, v = sample(spectra["QF-RGB-5600"], 380, 780, 1, rng)
    body = "\n".join(f"{w:g};{x:.5f}".replace(".", ",") for w, x in zip(wl, v))
    write_text(
        OUT / "quillfen_rgb_export.csv",
        f"Messdaten;{SUPPLIER}\nDatum;2026-11-30\nquantity;relative\nWellenlaenge [nm];QF-RGB-5600\n{body}\n",
    )

    # lampcalc JSON, absolute spectral flux in W/nm with the electrical power.
    wl, v = sample(spectra["QF-DL-4000"], 360, 830, 1, rng, noise=0.0008)
    radiant_W = 3.35
    v = np.clip(v, 0, None) * radiant_W / np.sum(np.clip(v, 0, None))
    doc = {
        "lampcalc_spectra": 1,
        "quantity": "flux",
        "comment": f"{SUPPLIER}: downlight QF-DL-4000, integrating sphere, absolute spectral flux W/nm",
        "wavelength_nm": wl.tolist(),
        "lamps": [{"name": "QF-DL-4000", "electrical_W": 10.0, "values": [float(f"{x:.5g}") for x in v]}],
    }
    write_text(OUT / "quillfen_downlight_absolute.json", json.dumps(doc, indent=1) + "\n")
    write_sets(np.random.default_rng(20261214))  # seeded apart, so the top folder stays as it was
    print(f"lampcalc {lampcalc.__version__}")


def write_sets(rng):
    """The lot, the angle set and the data-sheet comparison, each in a subfolder."""
    for folder in ("lot", "angles", "datasheet"):
        (OUT / folder).mkdir(exist_ok=True)

    # A lot of twelve samples, measured one after another: 1 nm, 380-780 nm, one column each.
    lot = lot_spectra(rng)
    cols = [sample(v, 380, 780, 1, rng) for v in lot.values()]
    rows = [",".join(["wavelength_nm", *lot])]
    rows += [",".join([f"{w:g}", *(f"{c[1][i]:g}" for c in cols)]) for i, w in enumerate(cols[0][0])]
    write_text(
        OUT / "lot" / "quillfen_spot3000_lot.csv",
        f"# {SUPPLIER}: spot lamp QF-SPOT-3000, 12 samples of one delivery, relative spectral flux\n"
        "# quantity: relative\n" + "\n".join(rows) + "\n",
    )
    write_text(
        OUT / "lot" / "lot_claims_quillfen.toml",
        f"# {SUPPLIER}: what the data sheet of QF-SPOT-3000 says about a delivery\n"
        "lampcalc_lot_claims = 1\nproduct = \"QF-SPOT-3000\"\nnominal_cct_K = 3000\n\n"
        "[[claim]]\ntext = \"95 % of the lamps within 3 steps of 3000 K\"\nwithin_steps = 3\nshare_at_least_percent = 95\n\n"
        "[[claim]]\ntext = \"mean Ra at least 80\"\nquantity = \"ra_mean\"\nat_least = 80\n\n"
        "[[claim]]\ntext = \"no lamp below Ra 78\"\nquantity = \"ra_min\"\nat_least = 78\n\n"
        "[[claim]]\ntext = \"every lamp in the ANSI 3000 K quadrangle\"\ninside_nominal_cct_K = 3000\n"
        "share_at_least_percent = 100\n",
    )

    # One downlight on a goniometer, 0-80 degrees: spectral irradiance at the detector, W/(m2 nm).
    angles = np.arange(0, 81, 10)
    spectra = angle_spectra(angles) * 2.0e-3  # about 0.35 W/m2 (some 100 lx) on axis
    names = [f"QF-DL-4000_{a:02d}deg" for a in angles]
    cols = [sample(v, 380, 780, 2, rng, noise=0.0005) for v in spectra]
    scale = [v.max() for v in spectra]
    rows = [",".join(["wavelength_nm", *names])]
    rows += [",".join([f"{w:g}", *(f"{c[1][i] * m:.5g}" for c, m in zip(cols, scale))]) for i, w in enumerate(cols[0][0])]
    write_text(
        OUT / "angles" / "quillfen_dl4000_goniometer.csv",
        f"# {SUPPLIER}: downlight QF-DL-4000 on a goniometer, C0 plane, spectral irradiance at 5 m\n"
        "# quantity: irradiance\n# angle_deg: " + " ".join(f"{a:g}" for a in angles) + "\n" + "\n".join(rows) + "\n",
    )

    # The data sheet's spectrum of QF-A60-2700-R9 (5 nm, as printed) and one sample measured at 1 nm.
    sheet, measured = datasheet_and_sample()
    wl, v = sample(sheet, 380, 780, 5, rng, noise=0.0)
    write_text(
        OUT / "datasheet" / "quillfen_a60_2700_r9_datasheet.csv",
        f"# {SUPPLIER}: QF-A60-2700-R9, the spectrum printed on its data sheet\n# quantity: relative\n"
        "wavelength_nm,QF-A60-2700-R9 data sheet\n" + "\n".join(f"{w:g},{x:.4f}" for w, x in zip(wl, v)) + "\n",
    )
    wl, v = sample(measured, 360, 830, 1, rng)
    write_text(
        OUT / "datasheet" / "quillfen_a60_2700_r9_sample.csv",
        f"# {SUPPLIER}: QF-A60-2700-R9, one lamp of a delivery measured in an integrating sphere\n"
        "# quantity: relative\nwavelength_nm,QF-A60-2700-R9 sample 7\n"
        + "\n".join(f"{w:g},{x:g}" for w, x in zip(wl, v)) + "\n",
    )


if __name__ == "__main__":
    main()
