"""The :class:`Ratings` table: one column per quantity, one row per lamp.

Its JSON and CSV forms use the keys of :data:`FIELDS`, documented in
``docs/output-fields.md``.
"""

from ..io.serialise import plain
from ..io.streamed_tables import csv_of_columns, json_of_columns

#: Output fields in order: key -> description (with unit). Lists are noted as such.
FIELDS = {
    "name": "lamp name, from the file's header or the file name",
    "source": "file and column the spectrum came from",
    "quantity": "radiometric quantity of the spectrum: relative, flux, irradiance or radiance",
    "range_start_nm": "first measured wavelength, nm",
    "range_end_nm": "last measured wavelength, nm",
    "step_nm": "median measurement interval, nm",
    "interpolation": "how the spectrum was brought onto the 1 nm grid: sprague, linear, integrated (finer data) or none (1 nm data)",
    "peak_nm": "wavelength of the spectrum's maximum on the 1 nm grid, nm",
    "centroid_nm": "centroid wavelength, sum of wavelength x spectrum / sum of spectrum over the measured range, nm",
    "fwhm_nm": "full width at half maximum of the highest peak, nm (null when it reaches an end of the measured range)",
    "dominant_wavelength_nm": "CIE 015:2018 dominant wavelength against the equal-energy point, nm (null for purples)",
    "complementary_wavelength_nm": "CIE 015:2018 complementary wavelength, for purple chromaticities only, nm",
    "excitation_purity": "CIE 015:2018 excitation purity against the equal-energy point (0 to 1)",
    "x": "CIE 1931 chromaticity x",
    "y": "CIE 1931 chromaticity y",
    "u": "CIE 1960 UCS u",
    "v": "CIE 1960 UCS v",
    "u_prime": "CIE 1976 UCS u'",
    "v_prime": "CIE 1976 UCS v'",
    "cct_K": "correlated colour temperature, exact nearest point on the Planckian locus, K (null outside 1000-100000 K)",
    "duv": "signed distance from the Planckian locus in CIE 1960 u, v; positive above (greenish)",
    "ra": "CIE 13.3 general colour rendering index Ra (unrounded)",
    "ri": "CIE 13.3 special indices R1..R15 in order (list; R15 is the JIS Z 8726 skin-tone sample)",
    "cri_dc": "CIE 13.3 distance DC between lamp and reference in CIE 1960 u, v (valid up to 5.4e-3)",
    "rf": "CIE 224:2017 / ANSI/IES TM-30-18 fidelity index Rf",
    "rg": "ANSI/IES TM-30-18 gamut index Rg",
    "rf_hue_bins": "TM-30-18 local fidelity Rf,h1..Rf,h16 (list)",
    "chroma_shift_hue_bins_percent": "TM-30-18 local chroma shift Rcs,h1..Rcs,h16, % (list)",
    "hue_shift_hue_bins_rad": "TM-30-18 local hue shift Rhs,h1..Rhs,h16, radians (list)",
    "ansi_edition": "edition of the nominal CCT categories: ANSI C78.377-2017",
    "ansi_nominal_cct_K": "nominal CCT category whose quadrangle holds the lamp, K (null if none)",
    "ansi_nearest_nominal_cct_K": "nominal CCT category whose quadrangle is nearest, K",
    "ansi_margin_uv": "signed edge distance from that quadrangle in CIE 1960 u, v (positive inside)",
    "ansi_delta_cct_K": "CCT minus the nearest category's target CCT, K",
    "ansi_delta_duv": "Duv minus the nearest category's target Duv",
    "bin_set": "name of the bin set of the bin keys (default: the ANSI C78.377-2017 quadrangles)",
    "bin": "bin of that set holding the lamp (null if none)",
    "bin_nearest": "bin of that set holding the lamp or nearest to it",
    "bin_margin_uv": "signed edge distance from that bin in CIE 1960 u, v (positive inside)",
    "sdcm_ellipse_set": "name of the ellipse set the steps are counted with (default: IEC 60081 Annex D)",
    "sdcm_centre_nominal_cct_K": "nominal CCT whose centre the steps are counted from (claimed, else nearest category), K",
    "sdcm_steps": "colour-consistency steps from that centre, with the metric of sdcm_ellipse_set",
    "ler_lm_per_W": "luminous efficacy of radiation over ler_range_nm, lm/W (not the lamp's efficacy)",
    "ler_range_nm": "[start, end] of the wavelengths LER is computed over, nm (list)",
    "luminous_flux_lm": "luminous flux, lm (spectra in W/nm only)",
    "illuminance_lx": "illuminance, lx (spectra in W/(m2 nm) only)",
    "luminance_cd_per_m2": "luminance, cd/m2 (spectra in W/(sr m2 nm) only)",
    "radiant_flux_W": "radiant flux over ler_range_nm, W (spectra in W/nm only)",
    "electrical_W": "electrical power from the input, W",
    "efficacy_lm_per_W": "lamp luminous efficacy, luminous flux / electrical power, lm/W (null when impossible)",
    "sp_ratio": "scotopic/photopic ratio, 1700·ΣV'S / (683·ΣVS) over 380-780 nm",
    "s_cone_elr_mW_per_lm": "CIE S 026 s-cone-opic efficacy of luminous radiation, mW/lm",
    "m_cone_elr_mW_per_lm": "CIE S 026 m-cone-opic efficacy of luminous radiation, mW/lm",
    "l_cone_elr_mW_per_lm": "CIE S 026 l-cone-opic efficacy of luminous radiation, mW/lm",
    "rhodopic_elr_mW_per_lm": "CIE S 026 rhodopic efficacy of luminous radiation, mW/lm",
    "melanopic_elr_mW_per_lm": "CIE S 026 melanopic efficacy of luminous radiation, mW/lm",
    "s_cone_der": "CIE S 026 s-cone-opic daylight (D65) efficacy ratio",
    "m_cone_der": "CIE S 026 m-cone-opic daylight (D65) efficacy ratio",
    "l_cone_der": "CIE S 026 l-cone-opic daylight (D65) efficacy ratio",
    "rhodopic_der": "CIE S 026 rhodopic daylight (D65) efficacy ratio",
    "melanopic_der": "CIE S 026 melanopic daylight (D65) efficacy ratio",
    "melanopic_edi_lx": "melanopic equivalent daylight (D65) illuminance, lx (spectra in W/(m2 nm) only)",
    "flags": "conditions that qualify the numbers (list of strings, see docs/output-fields.md)",
}
#: Output fields of some runs only, after those of FIELDS: key -> description.
RUN_FIELDS = {
    "uncertainty_flags_in_draws": "with --uncertainty: validity flags that part of the Monte Carlo draws carry and the "
    "spectrum as measured does not, or the reverse, each with its share of the draws (list of strings)",
}


class Ratings:
    """Ratings of a batch of lamps: columns of :data:`FIELDS`, one row per lamp.

    ``ratings[key]`` is the column (a NumPy array, or a tuple for strings and lists);
    :meth:`records` gives one dict per lamp with JSON-ready values (NaN → None). Like a
    DataFrame, ``"cct_K" in ratings`` and iteration go over the keys and ``len`` is the
    number of lamps; :meth:`to_pandas` gives a DataFrame with list fields spread into columns.
    ``extras`` keeps what figures need but files do not: the spectra on the grid
    (``"batch"``) and the TM-30 bin means (``"ref_ab_bins"``, ``"test_ab_bins"``); empty for
    ratings rated in a stream that draws nothing (:mod:`lampcalc.rating.streaming`).
    """

    def __init__(self, columns, extras=None):
        self.columns = dict(columns)
        self.extras = dict(extras or {})

    def __getitem__(self, key):
        return self.columns[key]

    def __len__(self):
        return len(self.columns["name"])

    def __contains__(self, key):
        return key in self.columns

    def __iter__(self):
        return iter(self.keys())

    def keys(self):
        """The output keys present (:meth:`output_keys`), then any other columns."""
        ordered = self.output_keys()
        return ordered + [k for k in self.columns if k not in set(ordered)]

    def output_keys(self):
        """The keys of the JSON and CSV files, in :data:`FIELDS` order; a key's ``_u`` and ``_interval95`` follow it."""
        keys = [k for key in FIELDS for k in (key, f"{key}_u", f"{key}_interval95") if k in self.columns]
        return keys + [k for k in RUN_FIELDS if k in self.columns]

    def to_pandas(self):
        """A pandas DataFrame, one row per lamp; list fields spread into columns (pandas optional)."""
        from .wide_columns import to_pandas

        return to_pandas(self)

    def records(self):
        """One dict per lamp, keys in :meth:`output_keys` order, NaN as None."""
        keys = self.output_keys()
        return [{k: plain(self.columns[k][i]) for k in keys} for i in range(len(self))]

    def output_columns(self):
        """The columns of :meth:`output_keys`, in order: what the JSON and CSV forms hold."""
        return {k: self.columns[k] for k in self.output_keys()}

    def to_json(self):
        """JSON text: a list with one object per lamp."""
        return json_of_columns(self.output_columns())

    def to_csv(self):
        """CSV text: one row per lamp; list fields are joined with ';'."""
        return csv_of_columns(self.output_columns())
