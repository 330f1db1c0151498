"""``lampcalc planck``: blackbody numbers and spectra."""

import click

from .common import Failure, fail_on_input_errors, fmt, write_text


@click.command()
@click.argument("temperatures", nargs=-1, required=True, metavar="T_K...")
@click.option("--json", "as_json", is_flag=True, help="Print a JSON list instead of a table.")
@click.option("--spectrum", "spectrum_out", type=click.Path(dir_okay=False), help="Write the spectra to this CSV.")
@click.option(
    "--quantity",
    type=click.Choice(["radiance", "exitance", "energy-density", "photon-radiance"]),
    default="radiance",
    show_default=True,
    help="Quantity written with --spectrum.",
)
@click.option(
    "--per",
    type=click.Choice(["wavelength", "frequency"]),
    default="wavelength",
    show_default=True,
    help="Spectral density per nm or per Hz, with --spectrum.",
)
@click.option(
    "--range",
    "wl_range",
    type=(float, float, float),
    default=(360.0, 830.0, 1.0),
    show_default=True,
    metavar="START END STEP",
    help="Wavelengths of --spectrum, nm.",
)
@fail_on_input_errors
def planck(temperatures, as_json, spectrum_out, quantity, per, wl_range):
    """Blackbody numbers for each temperature T_K (kelvin).

    Peak wavelength and frequency, total exitance, the fraction emitted in 380-780 nm,
    the luminous efficacy of the radiation over all wavelengths, and the chromaticity
    of the Planckian radiator.
    """
    import json

    import numpy as np

    from ..colorimetry.blackbody_summary import summarise_blackbody
    from ..physics.blackbody import SPECTRUM_UNITS, blackbody_spectrum
    from ..physics.constants import C_m_per_s

    values = []
    for text in temperatures:
        try:
            values.append(float(text))
        except ValueError:
            raise Failure(f"temperature {text!r} is not a number of kelvin") from None
    for t in values:
        if not (np.isfinite(t) and t > 0):
            raise Failure(f"temperature {t:g} K: must be a finite number above 0 K")
    from ..io.serialise import plain

    cols = summarise_blackbody(values)
    records = [{k: plain(cols[k][i]) for k in cols} for i in range(len(values))]
    if as_json:
        click.echo(json.dumps(records, indent=1))
    else:
        from .text_table import format_table

        headers = ["T K", "peak nm", "peak THz", "exitance W/m2", "in 380-780", "LER lm/W", "x", "y", "CCT K", "Duv"]
        rows = [
            [
                fmt(r["temperature_K"], "g"),
                fmt(r["peak_wavelength_nm"], ".1f"),
                fmt(r["peak_frequency_THz"], ".2f"),
                fmt(r["radiant_exitance_W_per_m2"], ".5g"),
                fmt(r["visible_fraction"], ".4f"),
                fmt(r["ler_lm_per_W"], ".2f"),
                fmt(r["x"], ".5f"),
                fmt(r["y"], ".5f"),
                fmt(r["cct_K"], ".1f"),
                fmt(r["duv"], ".5f"),
            ]
            for r in records
        ]
        click.echo(format_table(headers, rows, "r" * len(headers)))
        click.echo("LER over all wavelengths (Stefan-Boltzmann total); x, y with c2 = 1.4388e-2 m K (CIE 015:2018).")
        if any(r["cct_K"] is None for r in records):
            click.echo("CCT '-': the temperature is outside 1000-100000 K, where lampcalc gives no CCT.")
    if spectrum_out:
        from .outputs import writable

        writable(spectrum_out, "--spectrum")
        start, end, step = wl_range
        if not (0 < start < end and step > 0):
            raise Failure(f"--range {start:g} {end:g} {step:g}: need 0 < START < END and STEP > 0")
        wl = np.arange(start, end + step / 2, step)
        q = quantity.replace("-", "_")
        axis = wl if per == "wavelength" else C_m_per_s / (wl * 1e-9)
        spectra = blackbody_spectrum(values, axis, quantity=q, per=per)
        unit = SPECTRUM_UNITS[(q, per)]
        lines = [f"# blackbody spectral {q.replace('_', ' ')} per {per}, {unit}"]
        if per == "frequency":
            lines.append("# evaluated at the frequencies c/wavelength")
        lines.append(",".join(["wavelength_nm", *(f"T_{t:g}_K" for t in values)]))
        lines += [",".join([repr(float(w)), *(repr(float(v)) for v in row)]) for w, row in zip(wl, spectra.T)]
        write_text(spectrum_out, "\n".join(lines) + "\n")
        click.echo(f"wrote {spectrum_out}", err=True)
