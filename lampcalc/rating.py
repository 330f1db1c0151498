"""Rating a batch of lamps: every number lampcalc reports for each spectrum.

:func:`rate_spectra` brings the spectra onto the CIE 015:2018 grid, computes every
rating for the whole batch at once and returns a :class:`Ratings` table: one column
per quantity, one row per lamp. Its JSON and CSV forms use the keys of
:data:`FIELDS`, documented in ``docs/output-fields.md``.
"""

import csv
import io
import json

import numpy as np

from .bins import EDITION, NOMINAL_CCTS_K, category, classify
from .colorimetry import (
    XYZ_to_xy,
    luminous_efficacy_of_radiation,
    luminous_quantity,
    radiant_quantity,
    tristimulus,
    xy_to_upvp,
    xy_to_uv,
)
from .locus import locate, status_words
from .photoreceptors import ALPHA_OPIC, alpha_opic_der, alpha_opic_elr, scotopic_photopic_ratio
from .rendering.cie13 import DC_LIMIT, cie13_rendering
from .rendering.cie224 import cie224_fidelity
from .resampling import GRID_NM
from .serialise import cell, plain
from .spectra import SpectralBatch
from .steps import steps_from_nominal

#: Output fields in order: key -> description (with unit). Lists are noted as such.
FIELDS = {
    "name": "lamp name, from the file's header or the file name",
    "source": "file and column the spectrum came from",
    "quantity": "radiometric quantity of the spectrum: relative, flux, irradiance or radiance",
    "range_start_nm": "first measured wavelength, nm",
    "range_end_nm": "last measured wavelength, nm",
    "step_nm": "median measurement interval, nm",
    "peak_nm": "wavelength of the spectrum's maximum on the 1 nm grid, nm",
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
    "sdcm_centre_nominal_cct_K": "nominal CCT whose centre the steps are counted from (claimed, else nearest category), K",
    "sdcm_steps": "colour-consistency steps (IEC 60081 ellipses) from that centre",
    "ler_lm_per_W": "luminous efficacy of radiation over ler_range_nm, lm/W (not the lamp's efficacy)",
    "ler_range_nm": "[start, end] of the wavelengths LER is computed over, nm (list)",
    "luminous_flux_lm": "luminous flux, lm (spectra in W/nm only)",
    "illuminance_lx": "illuminance, lx (spectra in W/(m2 nm) only)",
    "luminance_cd_per_m2": "luminance, cd/m2 (spectra in W/(sr m2 nm) only)",
    "radiant_flux_W": "radiant flux over ler_range_nm, W (spectra in W/nm only)",
    "electrical_W": "electrical power from the input, W",
    "efficacy_lm_per_W": "lamp luminous efficacy, luminous flux / electrical power, lm/W",
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

_LUMINOUS_FIELD = {"flux": "luminous_flux_lm", "irradiance": "illuminance_lx", "radiance": "luminance_cd_per_m2"}


class Ratings:
    """Ratings of a batch of lamps: columns of :data:`FIELDS`, one row per lamp.

    ``ratings[key]`` is the column (a NumPy array, or a tuple for strings and lists);
    :meth:`records` gives one dict per lamp with JSON-ready values (NaN → None).
    ``extras`` keeps what figures need but files do not: the spectra on the grid
    (``"batch"``) and the TM-30 bin means (``"ref_ab_bins"``, ``"test_ab_bins"``).
    """

    def __init__(self, columns, extras=None):
        self.columns = dict(columns)
        self.extras = dict(extras or {})

    def __getitem__(self, key):
        return self.columns[key]

    def __len__(self):
        return len(self.columns["name"])

    def records(self):
        """One dict per lamp, keys in :data:`FIELDS` order, NaN as None."""
        keys = [k for k in FIELDS if k in self.columns]
        return [{k: plain(self.columns[k][i]) for k in keys} for i in range(len(self))]

    def to_json(self):
        """JSON text: a list with one object per lamp."""
        return json.dumps(self.records(), indent=1, allow_nan=False) + "\n"

    def to_csv(self):
        """CSV text: one row per lamp; list fields are joined with ';'."""
        records = self.records()
        keys = [k for k in FIELDS if k in self.columns]
        out = io.StringIO()
        writer = csv.writer(out, lineterminator="\n")
        writer.writerow(keys)
        for rec in records:
            writer.writerow([cell(rec[k]) for k in keys])
        return out.getvalue()


def _as_grid_batch(spectra, interpolation):
    if isinstance(spectra, SpectralBatch):
        spectra = [spectra]
    return SpectralBatch.concatenate([b.on_grid(interpolation) for b in spectra])


def _rendering(values, cct):
    """Colour rendering columns for the batch (CIE 13.3 and CIE 224 / TM-30-18), and the bin means."""
    cri = cie13_rendering(values, cct)
    fid = cie224_fidelity(values, cct)
    return fid, {
        "ra": cri["ra"],
        "ri": cri["ri"],
        "cri_dc": cri["dc"],
        "rf": fid["rf"],
        "rg": fid["rg"],
        "rf_hue_bins": fid["rf_bins"],
        "chroma_shift_hue_bins_percent": 100.0 * fid["rcs_bins"],
        "hue_shift_hue_bins_rad": fid["rhs_bins"],
    }


def _categories(xy, cct, duv, nominal):
    """ANSI C78.377 category and colour-consistency columns."""
    found = classify(xy)
    nearest = found["nearest_nominal_cct_K"]
    targets = {n: category(n) for n in NOMINAL_CCTS_K}
    target_cct = np.array([targets[n].target_cct_K if np.isfinite(n) else np.nan for n in nearest])
    target_duv = np.array([targets[n].target_duv if np.isfinite(n) else np.nan for n in nearest])
    # Steps from the claimed nominal CCT, else the nearest category; none for a non-white source.
    centre = np.where(np.isfinite(nominal), nominal, np.where(np.isfinite(cct), nearest, np.nan))
    steps, outside = steps_from_nominal(xy, centre)
    return {
        "ansi_edition": (EDITION,) * xy.shape[0],
        "ansi_nominal_cct_K": found["nominal_cct_K"],
        "ansi_nearest_nominal_cct_K": nearest,
        "ansi_margin_uv": found["margin_uv"],
        "ansi_delta_cct_K": cct - target_cct,
        "ansi_delta_duv": duv - target_duv,
        "sdcm_centre_nominal_cct_K": centre,
        "sdcm_steps": steps,
    }, outside


def rate_spectra(spectra, *, observer="1931_2deg", interpolation="linear", nominal_cct_K=None):
    """Rate every lamp in one or more batches of spectra.

    Parameters
    ----------
    spectra : SpectralBatch or sequence of SpectralBatch
        Spectra as read, on any grid; they are resampled onto 360–830 nm at 1 nm.
    observer : {"1931_2deg", "1964_10deg"}
        Observer for the reported chromaticities, CCT and Duv. The ANSI categories, the
        steps and CIE 13.3 are defined with the 2° observer and always use it (CIE 224 its
        10° observer).
    interpolation : {"linear", "sprague"}
        See :mod:`lampcalc.resampling`.
    nominal_cct_K : array_like, shape (n_lamps,), optional
        Claimed nominal CCT per lamp (NaN where none): the centre the colour-consistency
        steps are counted from. Where not given, the nearest ANSI category's centre.

    Returns
    -------
    Ratings
    """
    batch = _as_grid_batch(spectra, interpolation)
    n = batch.n_lamps
    values = batch.values
    xy = XYZ_to_xy(tristimulus(values, observer))
    uv = xy_to_uv(xy)
    upvp = xy_to_upvp(xy)
    cct, duv, status = locate(uv, observer)
    if observer == "1931_2deg":
        xy2, cct2, duv2 = xy, cct, duv
    else:
        xy2 = XYZ_to_xy(tristimulus(values))
        cct2, duv2, _ = locate(xy_to_uv(xy2))
    nominal = np.full(n, np.nan) if nominal_cct_K is None else np.asarray(nominal_cct_K, dtype=float).reshape(n)
    categories, steps_outside = _categories(xy2, cct2, duv2, nominal)
    fidelity, rendering = _rendering(values, cct2)
    lo, hi = batch.measured_range_nm[:, 0], batch.measured_range_nm[:, 1]
    cols = {
        "name": batch.names,
        "source": batch.sources,
        "quantity": batch.quantity,
        "range_start_nm": lo,
        "range_end_nm": hi,
        "step_nm": batch.measured_step_nm,
        "peak_nm": GRID_NM[np.argmax(values, axis=1)],
        "x": xy[:, 0],
        "y": xy[:, 1],
        "u": uv[:, 0],
        "v": uv[:, 1],
        "u_prime": upvp[:, 0],
        "v_prime": upvp[:, 1],
        "cct_K": cct,
        "duv": duv,
        **rendering,
        **categories,
        "ler_lm_per_W": luminous_efficacy_of_radiation(values),
        "ler_range_nm": np.stack([np.maximum(lo, GRID_NM[0]), np.minimum(hi, GRID_NM[-1])], axis=1),
    }
    luminous = luminous_quantity(values)
    radiant = radiant_quantity(values)
    quantity = np.array(batch.quantity)
    for q, key in _LUMINOUS_FIELD.items():
        cols[key] = np.where(quantity == q, luminous, np.nan)
    cols["radiant_flux_W"] = np.where(quantity == "flux", radiant, np.nan)
    cols["electrical_W"] = batch.electrical_W
    cols["efficacy_lm_per_W"] = cols["luminous_flux_lm"] / batch.electrical_W
    cols["sp_ratio"] = scotopic_photopic_ratio(values)
    elr, der = alpha_opic_elr(values), alpha_opic_der(values)
    for k, name in enumerate(ALPHA_OPIC):
        cols[f"{name}_elr_mW_per_lm"] = elr[:, k]
    for k, name in enumerate(ALPHA_OPIC):
        cols[f"{name}_der"] = der[:, k]
    cols["melanopic_edi_lx"] = cols["illuminance_lx"] * der[:, 4]
    flags = [list(f) + status_words(st) for f, st in zip(batch.flags, status)]
    for i in range(n):
        if np.isfinite(batch.electrical_W[i]) and batch.quantity[i] != "flux":
            flags[i].append("efficacy_needs_flux_spectrum")
        if steps_outside[i]:
            flags[i].append("steps_metric_outside_iec_range")
        if not np.isfinite(cols["ra"][i]):
            flags[i].append("rendering_not_meaningful")
        elif cols["cri_dc"][i] > DC_LIMIT:
            flags[i].append("cri_outside_validity")
    cols["flags"] = tuple(tuple(f) for f in flags)
    extras = {"batch": batch, "ref_ab_bins": fidelity["ref_ab_bins"], "test_ab_bins": fidelity["test_ab_bins"]}
    return Ratings(cols, extras)

