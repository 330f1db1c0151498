"""Measurement-model files: the keys read, the defaults, and every bad file refused with its line.

The keys and their meaning are the project's own file format (docs/uncertainty.md); TOML syntax
is the TOML 1.0 specification as Python's tomllib reads it. No other published source is involved.
"""

import pytest

from lampcalc.errors import InputError
from lampcalc.rating.measurement_model import DEFAULT_DRAWS, MODEL_KEYS, MeasurementModel, read_measurement_model

FULL = """# a laboratory
noise_percent = 0.5
scale_percent = 2
wavelength_shift_nm = 0.2
stray_light_percent = 0.05
bandwidth_nm = 5.0
draws = 1000
seed = 7
"""


def test_full_file_is_read(write):
    model = read_measurement_model(write("lab.toml", FULL))
    assert (model.noise_percent, model.scale_percent, model.wavelength_shift_nm) == (0.5, 2.0, 0.2)
    assert (model.stray_light_percent, model.bandwidth_nm, model.draws, model.seed) == (0.05, 5.0, 1000, 7)
    assert model.source.endswith("lab.toml")
    assert set(model.as_dict()) == set(MODEL_KEYS) | {"source"}


def test_a_key_left_out_is_zero(write):
    # The rule: a key left out is zero; draws default to 2000 and the seed to 0.
    model = read_measurement_model(write("lab.toml", "noise_percent = 1\n"))
    assert model.noise_percent == 1.0
    assert model.scale_percent == model.wavelength_shift_nm == model.stray_light_percent == model.bandwidth_nm == 0
    assert model.draws == DEFAULT_DRAWS == 2000 and model.seed == 0
    assert model.describe() == "noise 1 %; 2000 draws, seed 0"


@pytest.mark.parametrize(
    "text, fragment",
    [
        ("noise_percent = 1\nnois_percent = 2\n", "line 2: unknown key 'nois_percent'; the keys are noise_percent"),
        ("noise_percent = 1\n\nscale_percent = 'two'\n", "line 3: scale_percent must be a number, got 'two'"),
        ("noise_percent = -0.5\n", "line 1: noise_percent must be a finite, non-negative number, got -0.5"),
        ("noise_percent = nan\n", "line 1: noise_percent must be a finite, non-negative number, got nan"),
        ("noise_percent = inf\n", "line 1: noise_percent must be a finite, non-negative number"),
        ("noise_percent = true\n", "line 1: noise_percent must be a number, got True"),
        ("noise_percent = 150\n", "line 1: noise_percent is a relative standard uncertainty in %; 150 is over 100 %"),
        ("noise_percent = 1\ndraws = 2000.0\n", "line 2: draws must be a whole number, got 2000.0"),
        ("noise_percent = 1\ndraws = 10\n", "line 2: draws must be from 100 to 200000, got 10"),
        ("noise_percent = 1\nseed = -1\n", "line 2: seed must not be negative, got -1"),
        ("noise_percent = 1\n[lab]\nname = 'x'\n", "line 2: unknown key 'lab'"),
        ("noise_percent = 1\nlab.name = 'x'\n", "line 2: unknown key 'lab'"),
        ("noise_percent = 1\nscale_percent = \n", "line 2: not a valid TOML file"),
        ("noise_percent = 1\nnoise_percent = 2\n", "line 2: not a valid TOML file"),
        ("draws = 500\nseed = 3\n", "the model gives no uncertainty; set at least one of noise_percent"),
        ("", "the model gives no uncertainty"),
    ],
)
def test_bad_files_refused_with_the_line(write, text, fragment):
    path = write("lab.toml", text)
    with pytest.raises(InputError) as err:
        read_measurement_model(path)
    message = str(err.value)
    assert message.startswith(str(path)) and fragment in message and "\n" not in message


def test_unreadable_file(write, tmp_path):
    with pytest.raises(InputError, match="cannot be read as a text file"):
        read_measurement_model(write("lab.toml", b"\xff\xfe\x00\x81binary", mode="wb"))
    with pytest.raises(InputError, match="cannot be read"):
        read_measurement_model(tmp_path)


def test_model_in_code_checks_its_values():
    assert MeasurementModel().is_zero and not MeasurementModel(bandwidth_nm=2).is_zero
    with pytest.raises(ValueError, match="scale_percent must be a finite, non-negative number"):
        MeasurementModel(scale_percent=-1)
    with pytest.raises(ValueError, match="draws must be from 100"):
        MeasurementModel(noise_percent=1, draws=5)


def test_bad_model_on_the_command_line(run, write, bb_table):
    spectra = write("bb.csv", bb_table([3000.0]))
    model = write("lab.toml", "noise_percent = 1\nslit_nm = 5\n")
    result = run("rate", spectra, "--uncertainty", model)
    assert result.exit_code == 2
    assert f"lampcalc: {model}, line 2: unknown key 'slit_nm'" in result.stderr
    assert "Traceback" not in result.output
