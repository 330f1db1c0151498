"""lampcalc: rate measured lamp spectra.

Chromaticity, CCT and Duv, colour rendering, photometric ratios, checks against
supplier claims and standard bins, and the statistics of lots, angles and comparisons,
computed for whole batches of spectra.

The public names below are loaded on first use, so ``import lampcalc`` costs almost
nothing and the command line starts quickly; ``dir(lampcalc)`` lists them all.
"""

import importlib

__version__ = "0.1.0"

# public name -> submodule that defines it
_EXPORTS = {
    "InputError": "errors",
    "SpectralBatch": "spectra.batch",
    "QUANTITY_UNITS": "spectra.batch",
    "read_spectra": "io.spectrum_files",
    "open_spectra": "io.spectrum_files",
    "read_spectra_text": "io.delimited_text",
    "write_spectra_csv": "io.spectrum_files",
    "write_spectra_json": "io.spectrum_files",
    "write_spectra_spdx": "io.spdx",
    "GRID_NM": "spectra.resampling",
    "resample": "spectra.resampling",
    "spectral_radiance": "physics.blackbody",
    "spectral_radiance_frequency": "physics.blackbody",
    "blackbody_spectrum": "physics.blackbody",
    "rayleigh_jeans_radiance": "physics.blackbody",
    "wien_radiance": "physics.blackbody",
    "approximation_error": "physics.blackbody",
    "radiant_exitance": "physics.blackbody",
    "total_radiance": "physics.blackbody",
    "total_energy_density": "physics.blackbody",
    "band_exitance": "physics.blackbody",
    "band_fraction": "physics.blackbody",
    "planck_integral": "physics.blackbody",
    "peak_wavelength_nm": "physics.blackbody",
    "peak_frequency_Hz": "physics.blackbody",
    "luminous_efficacy_of_blackbody": "colorimetry.photometry",
    "tristimulus": "colorimetry.tristimulus",
    "relative_XYZ": "colorimetry.tristimulus",
    "XYZ_to_xy": "colorimetry.tristimulus",
    "xy_to_XYZ": "colorimetry.tristimulus",
    "xy_to_uv": "colorimetry.tristimulus",
    "uv_to_xy": "colorimetry.tristimulus",
    "xy_to_upvp": "colorimetry.tristimulus",
    "upvp_to_xy": "colorimetry.tristimulus",
    "uv_to_upvp": "colorimetry.tristimulus",
    "upvp_to_uv": "colorimetry.tristimulus",
    "luminous_quantity": "colorimetry.photometry",
    "radiant_quantity": "colorimetry.photometry",
    "luminous_efficacy_of_radiation": "colorimetry.photometry",
    "rate_spectra": "rating.rate",
    "rate_dask_array": "rating.dask_arrays",
    "Ratings": "rating.ratings",
    "cct_duv": "colorimetry.locus",
    "xy_to_cct_duv": "colorimetry.locus",
    "upvp_to_cct_duv": "colorimetry.locus",
    "cct_duv_to_uv": "colorimetry.locus",
    "cct_duv_to_xy": "colorimetry.locus",
    "locate": "colorimetry.locus",
    "planckian_uv": "colorimetry.locus",
    "isotemperature_lines": "colorimetry.locus",
    "LocusRangeWarning": "colorimetry.locus",
    "daylight_locus_xy": "colorimetry.daylight",
    "daylight_spectrum": "colorimetry.daylight",
    "summarise_blackbody": "colorimetry.blackbody_summary",
    "colour_rendering": "rendering",
    "cie13_rendering": "rendering",
    "cie224_fidelity": "rendering",
    "scotopic_photopic_ratio": "rendering.photoreceptors",
    "alpha_opic_elr": "rendering.photoreceptors",
    "alpha_opic_der": "rendering.photoreceptors",
    "melanopic_edi_lx": "rendering.photoreceptors",
    "category": "standards.ansi_bins",
    "classify": "standards.ansi_bins",
    "quadrangle_margin": "standards.ansi_bins",
    "steps_from_nominal": "standards.steps",
    "ellipse_steps": "standards.steps",
    "read_bin_set": "standards.bin_sets",
    "read_ellipse_set": "standards.ellipse_sets",
    "shipped_ellipse_set": "standards.ellipse_sets",
    "ansi_bin_set": "standards.ansi_bins",
    "dominant_wavelength": "colorimetry.dominant_wavelength",
    "spectral_features": "spectra.features",
    "read_claims": "verdicts.claims",
    "check_claims": "verdicts.claims",
    "lot_statistics": "verdicts.lot",
    "read_lot_claims": "verdicts.lot_claims",
    "check_lot_claims": "verdicts.lot_claims",
    "colour_over_angle": "verdicts.angles",
    "compare_ratings": "verdicts.comparison",
    "MeasurementModel": "rating.measurement_model",
    "read_measurement_model": "rating.measurement_model",
    "rate_with_uncertainty": "rating.uncertainty",
    "coverage_interval": "rating.uncertainty",
    "slit_convolution": "rating.uncertainty",
    "coverage_region": "rating.coverage_region",
    "DecisionRule": "verdicts.decision_rules",
    "ClaimDraws": "verdicts.claim_uncertainty",
    "judge_with_uncertainty": "verdicts.claim_uncertainty",
    "write_report": "report.document",
    "read_report_info": "report.report_info",
    "ReportInfo": "report.report_info",
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
