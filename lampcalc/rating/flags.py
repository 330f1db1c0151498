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
    "not_a_chromaticity": "the values are not a chromaticity, so CCT and Duv are null",
    "efficacy_needs_flux_spectrum": "electrical power given, but the spectrum is not in W/nm, so no lamp efficacy",
    "cri_outside_validity": "DC > 5.4e-3: Ra and Ri computed outside CIE 13.3's validity",
    "rendering_not_meaningful": "no CCT in range, hence no reference illuminant: Ra, Ri, Rf, Rg are null",
    "steps_metric_outside_iec_range": "steps counted with the nearest IEC 60081 metric (nominal CCT outside 2700–6500 K)",
    "uncertainty_incomplete": "some Monte Carlo draws gave no value for a rating (e.g. no CCT): its uncertainty is null",
}

#: Flag -> output keys whose values it makes doubtful (shown in parentheses, never as ordinary).
DOUBTFUL_KEYS = {
    "cri_outside_validity": ("ra", "ri"),
    "duv_beyond_0.05": ("rf", "rg"),
}


def explain(flag):
    """One sentence for ``flag``.

    Raises
    ------
    KeyError
        For a flag with no words: every flag lampcalc raises must be listed here.
    """
    return FLAG_MEANINGS[flag]


def doubtful_keys(flags):
    """The set of output keys that any of ``flags`` makes doubtful."""
    return {key for flag in flags for key in DOUBTFUL_KEYS.get(flag, ())}
