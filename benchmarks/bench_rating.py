"""Rating speed and agreement: lampcalc's batched CRI and TM-30 against colour-science's per-spectrum functions.

1,000 spectra are made from colour-science's CIE FL, HP and LED illuminants, each with a
small seeded wavelength shift and noise. lampcalc rates all of them in one batched call;
colour-science's colour_rendering_index (CIE 13.3) and TM-30-18 functions rate a seeded
subset one spectrum at a time, in the same run. Printed: spectra per second for each, the
speed ratio, and the largest differences in Ra, Ri, Rf and Rg, both with lampcalc's
defaults and like for like (colour-science's CCT methods and conventions). Not a test:

    python benchmarks/bench_rating.py [--spectra 1000] [--subset 60]
"""

import argparse
import time
import warnings

import numpy as np

import lampcalc
from lampcalc.colorimetry.locus import locate
from lampcalc.rendering import cie13_rendering, cie224_fidelity
from lampcalc.spectra.resampling import GRID_NM, linear

SOURCES = [f"FL{i}" for i in range(1, 13)] + [f"FL3.{i}" for i in range(1, 16)] + [f"HP{i}" for i in range(1, 6)] + [
    "LED-B1", "LED-B2", "LED-B3", "LED-B4", "LED-B5", "LED-BH1", "LED-RGB1", "LED-V1", "LED-V2"]


def make_spectra(n, rng):
    import colour

    out = np.empty((n, GRID_NM.size))
    for i in range(n):
        sd = colour.SDS_ILLUMINANTS[SOURCES[i % len(SOURCES)]]
        shift = rng.uniform(-2.0, 2.0)
        values = linear(sd.wavelengths + shift, sd.values)
        noise = rng.normal(0.0, 0.002 * values.max(), GRID_NM.size) * (values > 0)
        out[i] = np.clip(values + noise, 0.0, None)
    return out


def main():
    import colour
    from colour.quality import colour_fidelity_index_ANSIIESTM3018, colour_rendering_index
    from colour.quality.cfi2017 import CCT_reference_illuminant

    parser = argparse.ArgumentParser()
    parser.add_argument("--spectra", type=int, default=1000)
    parser.add_argument("--subset", type=int, default=60)
    args = parser.parse_args()
    rng = np.random.default_rng(133)
    values = make_spectra(args.spectra, rng)
    batch = lampcalc.SpectralBatch(GRID_NM, values, tuple(f"s{i}" for i in range(args.spectra)))

    lampcalc.rate_spectra(batch[:2])  # load tables and colour-science once, outside the timing
    # Each timing includes the CCT that selects the reference, as colour-science's functions do.
    def with_cct(method):
        start = time.perf_counter()
        uv = lampcalc.xy_to_uv(lampcalc.XYZ_to_xy(lampcalc.tristimulus(values)))
        result = method(values, locate(uv)[0])
        return result, time.perf_counter() - start

    cri, t_cri = with_cct(cie13_rendering)
    fid, t_fid = with_cct(cie224_fidelity)
    start = time.perf_counter()
    lampcalc.rate_spectra(batch)
    t_all = time.perf_counter() - start

    subset = rng.choice(args.spectra, args.subset, replace=False)
    ref = {"ra": [], "ri": [], "rf": [], "rg": [], "robertson": [], "ohno": []}
    t_c_cri = t_c_fid = 0.0
    cmfs = colour.MSDS_CMFS["CIE 1931 2 Degree Standard Observer"]
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        for i in subset:
            sd = colour.SpectralDistribution(values[i], GRID_NM)
            sd_fid = colour.SpectralDistribution(values[i, 20:421], GRID_NM[20:421])
            start = time.perf_counter()
            spec = colour_rendering_index(sd, additional_data=True)
            t_c_cri += time.perf_counter() - start
            start = time.perf_counter()
            tm30 = colour_fidelity_index_ANSIIESTM3018(sd_fid, additional_data=True)
            t_c_fid += time.perf_counter() - start
            ref["ra"].append(spec.Q_a)
            ref["ri"].append([spec.Q_as[k].Q_a for k in sorted(spec.Q_as)])
            ref["rf"].append(tm30.R_f)
            ref["rg"].append(tm30.R_g)
            with colour.utilities.domain_range_scale("1"):
                uv_c = colour.UCS_to_uv(colour.XYZ_to_UCS(colour.sd_to_XYZ(sd, cmfs)))
            ref["robertson"].append(colour.temperature.uv_to_CCT_Robertson1968(uv_c)[0])
            ref["ohno"].append(CCT_reference_illuminant(sd_fid)[0])
    ref = {k: np.array(v) for k, v in ref.items()}
    like_cri = cie13_rendering(values[subset], ref["robertson"], wavelength_range_nm=(360, 780))
    like_fid = cie224_fidelity(values[subset], ref["ohno"], daylight_interpolation="sprague")

    rate_l_cri = args.spectra / t_cri
    rate_l_fid = args.spectra / t_fid
    rate_c_cri = args.subset / t_c_cri
    rate_c_fid = args.subset / t_c_fid
    print(f"colour-science {colour.__version__}; lampcalc on {args.spectra} spectra in one call, "
          f"colour-science on {args.subset} of them one at a time")
    print(f"{'':28s} {'lampcalc /s':>12s} {'colour /s':>10s} {'ratio':>7s}")
    print(f"{'CIE 13.3 (Ra, R1-R14)':28s} {rate_l_cri:12.0f} {rate_c_cri:10.1f} {rate_l_cri / rate_c_cri:6.0f}x")
    print(f"{'TM-30-18 (Rf, Rg, bins)':28s} {rate_l_fid:12.0f} {rate_c_fid:10.1f} {rate_l_fid / rate_c_fid:6.0f}x")
    print(f"{'rate_spectra, all ratings':28s} {args.spectra / t_all:12.0f}")
    print("largest difference from colour-science on the subset:")
    print(f"{'':28s} {'Ra':>8s} {'Ri':>8s} {'Rf':>8s} {'Rg':>8s}")
    for label, c, f in (("lampcalc defaults", cri, fid), ("like for like", like_cri, like_fid)):
        sel = subset if c is cri else slice(None)
        print(f"{label:28s} {np.max(np.abs(c['ra'][sel] - ref['ra'])):8.4f} "
              f"{np.max(np.abs(c['ri'][sel, :14] - ref['ri'])):8.4f} "
              f"{np.max(np.abs(f['rf'][sel] - ref['rf'])):8.4f} {np.max(np.abs(f['rg'][sel] - ref['rg'])):8.4f}")


if __name__ == "__main__":
    main()
