"""The flags that qualify ratings, in words, and the values each one makes doubtful.

A flag travels with a lamp from the moment it is read to the report. Every flag lampcalc
can raise is listed here with one sentence for a reader; the terminal, the files' docs
(``docs/output-fields.md``) and the report all take their words from this table, so a
flag never reaches a user without its explanation.
"""

#: Flag -> what it means, in one sentence a client can read.
FLAG_MEANINGS = {
    "range_truncated": "the data do not cover 380–780 nm; zero was used outside the data",
    "negative_noise_clipped": "negative values within 0.5 % of the peak were set to zero",
    "interpolation_undershoot": "Sprague interpolation rang below zero (narrow lines)",
    "cct_below_1000K": "no CCT: the chromaticity is below 1000 K, so CCT and Duv are null",
    "cct_above_100000K": "no CCT: the chromaticity is above 100 000 K, so CCT and Duv are null",
    "duv_beyond_0.05": "CCT computed, but CIE 015 advises against using a CCT this far from the locus",
    "not_a_chromaticity": (
        "the values are not the chromaticity of any light (not numbers, or outside the spectrum locus), "
        "so CCT and Duv are null"
    ),
    "efficacy_needs_flux_spectrum": "electrical power given, but the spectrum is not in W/nm, so no lamp efficacy",
    "efficacy_impossible_flux_exceeds_power": (
        "the radiant flux exceeds the electrical power, which no lamp can do (a unit error such as mW/nm "
        "read as W/nm, or a wrong power): no lamp efficacy, and efficacy claims are not evaluated"
    ),
    "ler_depends_on_range": (
        "the spectrum carries 5 % or more of its peak at an end of the range LER is computed over "
        "(the measured part of 360–830 nm): LER would change with a wider measured range"
    ),
    "cri_outside_validity": "DC > 0.0054: Ra and Ri computed outside CIE 13.3's validity",
    "rendering_not_meaningful": "no CCT, hence no reference illuminant: Ra, Ri, Rf, Rg are null",
    "no_reference_above_25000K": (
        "CCT above 25 000 K: CIE 13.3 and CIE 224 define no reference illuminant there (CIE daylight "
        "ends at 25 000 K), so Ra, Ri, Rf, Rg are null"
    ),
    "tm30_hue_bin_empty": (
        "a TM-30 hue bin holds none of the 99 samples under this reference (very low CCT): Rg and that "
        "bin's values are null"
    ),
    "bin_corners_unconfirmed": (
        "the quadrangle or bin the lamp is in, or within 0.001 in (u, v) of, has corners not read from a published "
        "table (ANSI 2200 and 2500 K: built by the standard's construction); supply the published corners as a bin set file"
    ),
    "steps_metric_outside_set_range": (
        "steps counted with the metric of the ellipse set's nearest centre (nominal CCT outside the set's centres)"
    ),
    "steps_metric_unconfirmed": (
        "the steps use metric values not confirmed from a published source (the shipped IEC 60081 Annex D "
        "ellipses and CIE TN 001 circle radius); supply the published values as an ellipse set file"
    ),
    "purple_complementary_wavelength": (
        "the chromaticity lies towards the purple line: no dominant wavelength; its complementary "
        "wavelength is given instead"
    ),
    "at_equal_energy_point": "the chromaticity is the equal-energy point: no dominant wavelength (purity 0)",
    "fwhm_at_range_end": "the highest peak stays above half its height up to an end of the measured range: no FWHM",
    "fwhm_below_grid_resolution": (
        "the highest peak is under 3 nm wide on the 1 nm computation grid, which cannot resolve it: "
        "the line itself may be narrower than the FWHM given"
    ),
    "uncertainty_incomplete": "some Monte Carlo draws gave no value for a rating (e.g. no CCT): its uncertainty is null",
    "uncertainty_crosses_validity": (
        "in part of the Monte Carlo draws a validity limit is crossed (e.g. DC > 0.0054, |Duv| > 0.05) that the "
        "spectrum as measured does not cross, or the reverse: the intervals of the ratings it concerns mix valid and "
        "doubtful values and are in parentheses"
    ),
    "uncertainty_category_varies": (
        "the lamp's ANSI C78.377 category (or its bin in the set given) differs between Monte Carlo draws: "
        "the measurement does not settle which category the lamp is in"
    ),
    # Lots, angles and comparisons (lampcalc.verdicts): flags of a whole lot or pair.
    "lot_too_small_for_sd": "fewer than 2 samples: no standard deviation and no pairwise Δu′v′",
    "lot_too_small_for_ellipse": "fewer than 3 samples: no covariance ellipse",
    "lot_not_white": "the lot's mean point has no CCT or lies beyond 0.05 in Duv, hence no centre: no colour-consistency steps",
    "lot_doubtful_values": "some samples have values outside their method's validity; the statistics of the ratings named include them",
    "lot_partial_values": "some samples lack some ratings; the statistics of the ratings named cover fewer samples than the lot",
    "luminous_ratio_needs_absolute_spectra": "no luminous ratio: it needs both spectra absolute and in the same quantity",
}

#: Flag -> output keys whose values it makes doubtful (shown in parentheses, never as ordinary).
DOUBTFUL_KEYS = {
    "cri_outside_validity": ("ra", "ri"),
    "duv_beyond_0.05": ("cct_K", "rf", "rg", "rf_hue_bins", "chroma_shift_hue_bins_percent", "hue_shift_hue_bins_rad"),
    "ler_depends_on_range": ("ler_lm_per_W",),
    "bin_corners_unconfirmed": ("ansi_nominal_cct_K", "bin"),
    "steps_metric_outside_set_range": ("sdcm_steps",),
    "steps_metric_unconfirmed": ("sdcm_steps",),
    "fwhm_below_grid_resolution": ("fwhm_nm",),
}

_RENDERING = ("ra", "ri", "cri_dc", "rf", "rg", "rf_hue_bins", "chroma_shift_hue_bins_percent", "hue_shift_hue_bins_rad")
_NO_CCT = ("cct_K", "duv", "ansi_delta_cct_K", "ansi_delta_duv", "sdcm_centre_nominal_cct_K", "sdcm_steps") + _RENDERING
#: Flag -> output keys it leaves null: every null value a rating can hold is explained by a flag.
NULLED_KEYS = {
    "cct_below_1000K": _NO_CCT,
    "cct_above_100000K": _NO_CCT,
    "not_a_chromaticity": _NO_CCT,
    "rendering_not_meaningful": _RENDERING,
    "no_reference_above_25000K": _RENDERING,
    "tm30_hue_bin_empty": ("rg", "rf_hue_bins", "chroma_shift_hue_bins_percent", "hue_shift_hue_bins_rad"),
    "efficacy_needs_flux_spectrum": ("efficacy_lm_per_W",),
    "efficacy_impossible_flux_exceeds_power": ("efficacy_lm_per_W",),
    "purple_complementary_wavelength": ("dominant_wavelength_nm",),
    "at_equal_energy_point": ("dominant_wavelength_nm",),
    "fwhm_at_range_end": ("fwhm_nm",),
}


#: Flag -> the command-line option that supplies what it lacks: the terminal adds it to the flag's words
#: (the report, which a client reads, does not).
FLAG_OPTIONS = {"bin_corners_unconfirmed": "--bins FILE", "steps_metric_unconfirmed": "--ellipses FILE"}


def explain(flag):
    """One sentence for ``flag``.

    Raises
    ------
    KeyError
        For a flag with no words: every flag lampcalc raises must be listed here.
    """
    return FLAG_MEANINGS[flag]


def explain_with_option(flag):
    """``explain(flag)`` and, where an option supplies what the flag lacks, that option: the terminal's words."""
    option = FLAG_OPTIONS.get(flag)
    return explain(flag) + (f" ({option})" if option else "")


def doubtful_keys(flags):
    """The set of output keys that any of ``flags`` makes doubtful."""
    return {key for flag in flags for key in DOUBTFUL_KEYS.get(flag, ())}


#: Flags whose presence may change from one Monte Carlo draw to the next: the validity limits and nulls.
VALIDITY_FLAGS = tuple(dict.fromkeys([*DOUBTFUL_KEYS, *NULLED_KEYS]))


def flags_in_draws(entries):
    """(flag, share of the draws in %) of ``uncertainty_flags_in_draws`` entries ("cri_outside_validity: 12.5 % of draws")."""
    return [(flag, float(rest.split(" %")[0])) for flag, _, rest in (entry.partition(": ") for entry in entries or ())]


def draw_flag_lines(entries):
    """Each flag raised in part of the Monte Carlo draws in words, with its share: what the terminal and report print."""
    return [f"in {percent:g} % of the draws: {explain(flag)}" for flag, percent in flags_in_draws(entries)]


def doubtful_interval_keys(flags, draw_flags=()):
    """Output keys whose uncertainty and interval are in doubt.

    Those the lamp's ``flags`` make doubtful, and those that a validity flag raised in only part of
    the Monte Carlo draws (``draw_flags``, the ``uncertainty_flags_in_draws`` entries) makes
    doubtful or null.

    Examples
    --------
    >>> sorted(doubtful_interval_keys((), ["cri_outside_validity: 12.5 % of draws"]))
    ['ra', 'ri']
    """
    crossed = [flag for flag, _ in flags_in_draws(draw_flags)]
    return doubtful_keys(flags) | doubtful_keys(crossed) | {k for f in crossed for k in NULLED_KEYS.get(f, ())}
