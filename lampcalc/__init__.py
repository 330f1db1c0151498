"""lampcalc: rate measured lamp spectra.

Chromaticity, CCT and Duv, colour rendering, photometric ratios, and checks against
supplier claims and standard bins, computed for whole batches of spectra.

The public names below are loaded on first use, so ``import lampcalc`` costs almost
nothing and the command line starts quickly; ``dir(lampcalc)`` lists them all.
"""

import importlib

__version__ = "0.1.0"

# public name -> submodule that defines it
_EXPORTS = {
    "InputError": "errors",
    "SpectralBatch": "spectra",
    "QUANTITY_UNITS": "spectra",
    "read_spectra": "spectrum_files",
    "read_spectra_text": "spectrum_files",
    "write_spectra_csv": "spectrum_files",
    "write_spectra_json": "spectrum_files",
    "GRID_NM": "resampling",
    "resample": "resampling",
    "spectral_radiance": "blackbody",
    "spectral_radiance_frequency": "blackbody",
    "blackbody_spectrum": "blackbody",
    "rayleigh_jeans_radiance": "blackbody",
    "wien_radiance": "blackbody",
    "approximation_error": "blackbody",
    "radiant_exitance": "blackbody",
    "total_radiance": "blackbody",
    "total_energy_density": "blackbody",
    "band_exitance": "blackbody",
    "band_fraction": "blackbody",
    "planck_integral": "blackbody",
    "peak_wavelength_nm": "blackbody",
    "peak_frequency_Hz": "blackbody",
    "luminous_efficacy_of_blackbody": "blackbody",
    "tristimulus": "colorimetry",
    "relative_XYZ": "colorimetry",
    "XYZ_to_xy": "colorimetry",
    "xy_to_XYZ": "colorimetry",
    "xy_to_uv": "colorimetry",
    "uv_to_xy": "colorimetry",
    "xy_to_upvp": "colorimetry",
    "upvp_to_xy": "colorimetry",
    "uv_to_upvp": "colorimetry",
    "upvp_to_uv": "colorimetry",
    "luminous_quantity": "colorimetry",
    "radiant_quantity": "colorimetry",
    "luminous_efficacy_of_radiation": "colorimetry",
    "rate_spectra": "rating",
    "Ratings": "rating",
    "cct_duv": "locus",
    "xy_to_cct_duv": "locus",
    "upvp_to_cct_duv": "locus",
    "cct_duv_to_uv": "locus",
    "cct_duv_to_xy": "locus",
    "locate": "locus",
    "planckian_uv": "locus",
    "isotemperature_lines": "locus",
    "LocusRangeWarning": "locus",
    "daylight_locus_xy": "daylight",
    "daylight_spectrum": "daylight",
    "summarise_blackbody": "blackbody_summary",
    "colour_rendering": "rendering",
    "cie13_rendering": "rendering",
    "cie224_fidelity": "rendering",
    "scotopic_photopic_ratio": "photoreceptors",
    "alpha_opic_elr": "photoreceptors",
    "alpha_opic_der": "photoreceptors",
    "melanopic_edi_lx": "photoreceptors",
    "category": "bins",
    "classify": "bins",
    "quadrangle_margin": "bins",
    "steps_from_nominal": "steps",
    "ellipse_steps": "steps",
    "circle_steps": "steps",
    "read_claims": "claims",
    "check_claims": "claims",
    "write_report": "report",
}

__all__ = sorted(_EXPORTS)


def __getattr__(name):
    module = _EXPORTS.get(name)
    if module is None:
        raise AttributeError(f"module 'lampcalc' has no attribute {name!r}")
    value = getattr(importlib.import_module(f".{module}", __name__), name)
    globals()[name] = value
    return value


def __dir__():
    return sorted(set(globals()) | set(__all__))
