"""Ratings on the safe side at the edges: the design-file and sweep keys (vswr,
solar_irradiance_w_per_m2, surface_emissivity, solar_absorption), their one-line errors, and
what they change in ``cablefam inspect --json``."""

from __future__ import annotations

import json

import numpy as np
import pytest

from cablefam.optimizer.errors import InputError
from cablefam.optimizer.inputs.sweep_spec import demo_sweep_path, load_sweep
from cablefam.physics.standing_wave import voltage_maximum_factor
from cablefam.physics.stranding import stranded_crown_field_factor
from tests.optimizer.conftest import DATA

NO_JACKET = (DATA / "inline_no_jacket.toml").read_text()
#: the no-jacket fixture with a CW power (thermal quantities) and a PE jacket
JACKETED = NO_JACKET.replace("jacket_thickness_m = 0.0", "jacket_thickness_m = 1.0e-3").replace(
    "[operating]", "[jacket]\nthermal_resistivity_k_m_per_w = 3.5\nmax_temperature_c = 70\n"
    "density_kg_per_m3 = 920\nprice_per_kg = 2.0\n\n[operating]\npower_w = 100.0")


def write(tmp_path, text, name="design.toml"):
    path = tmp_path / name
    path.write_text(text)
    return path


def inspect(cli, path):
    code, out, err = cli("inspect", "--json", path)
    assert code == 0, err
    return json.loads(out)


def with_operating(text, extra):
    return text.replace("[operating]", "[operating]\n" + extra)


@pytest.mark.parametrize("edit, needles", [
    (lambda t: with_operating(t, "vswr = 0.9"), ["[operating]", "vswr = 0.9"]),
    (lambda t: with_operating(t, "solar_irradiance_w_per_m2 = -5.0"),
     ["[operating]", "solar_irradiance_w_per_m2 = -5.0"]),
    (lambda t: t.replace("[operating]", "[operating]").replace(
        "max_temperature_c = 70\ndensity_kg_per_m3 = 920\nprice_per_kg = 2.0\n",
        "max_temperature_c = 70\ndensity_kg_per_m3 = 920\nprice_per_kg = 2.0\n"
        "surface_emissivity = 0.0\n"), ["[jacket]", "surface_emissivity = 0.0"]),
    (lambda t: t.replace("[shield]\n", "[shield]\nsurface_emissivity = 1.5\n"),
     ["[shield]", "surface_emissivity = 1.5"]),
    (lambda t: t.replace("[shield]\n", "[shield]\nsolar_absorption = 1.2\n"),
     ["[shield]", "solar_absorption = 1.2"]),
])
def test_bad_values_are_one_line_errors_with_exit_2(cli, tmp_path, edit, needles):
    text = edit(JACKETED)
    assert text != JACKETED
    path = write(tmp_path, text)
    code, out, err = cli("inspect", path)
    assert code == 2 and out == "" and err.count("\n") == 1 and "Traceback" not in err
    for needle in [str(path), *needles]:
        assert needle in err, (needle, err)


def test_sweep_member_vswr_below_one(tmp_path):
    text = demo_sweep_path().read_text()
    text = "\n".join(line for line in text.splitlines() if not line.startswith("vswr"))
    text = text.replace("[[member]]", "[[member]]\nvswr = 0.5", 1)
    catalogs = demo_sweep_path().parent
    path = tmp_path / "sweep.toml"
    path.write_text(text.replace('"../../catalogs/', f'"{catalogs.parent.parent}/catalogs/'))
    with pytest.raises(InputError, match=r"vswr = 0\.5"):
        load_sweep(path)


def test_defaults_keep_the_numbers(cli, tmp_path):
    # vswr 1, no sun, no emissivity: exactly the numbers of a file without the keys
    base = inspect(cli, write(tmp_path, JACKETED))
    explicit = inspect(cli, write(tmp_path, with_operating(
        JACKETED, "vswr = 1.0\nsolar_irradiance_w_per_m2 = 0.0"), "explicit.toml"))
    assert base == {**explicit, "name": base["name"]}


def test_vswr_raises_heat_and_lowers_voltage_and_power(cli, tmp_path):
    base = inspect(cli, write(tmp_path, JACKETED))
    mismatched = inspect(cli, write(tmp_path, with_operating(JACKETED, "vswr = 2.0"), "v.toml"))
    factor = float(voltage_maximum_factor(2.0))  # 1 + 1/3: the voltage maximum
    # Source: Pozar, Microwave Engineering, 4th ed., Sec. 2.3: |V|max = (1 + |G|) |V+|
    assert mismatched["peak_e_field_v_per_m"] == pytest.approx(
        factor * base["peak_e_field_v_per_m"], rel=1e-12)
    assert mismatched["max_peak_voltage_v"] == pytest.approx(
        base["max_peak_voltage_v"] / factor, rel=1e-12)
    assert mismatched["heat_w_per_m"] > 1.2 * base["heat_w_per_m"]
    assert mismatched["conductor_temperature_c"] > base["conductor_temperature_c"]
    assert mismatched["max_power_w"] < base["max_power_w"] / 1.2


def test_stranded_peak_field_has_the_crown_factor(cli, tmp_path):
    text = JACKETED.replace("jacket_thickness_m = 1.0e-3",
                            "jacket_thickness_m = 1.0e-3\ninner_strands = 7")
    smooth = inspect(cli, write(tmp_path, text))
    # the same electrical radius, concentric and solid: the smooth reference
    assert smooth["peak_e_field_v_per_m"] > 0
    a_eff = 0.5e-3 * 0.9387505988
    expected = 100.0 / (a_eff * np.log(1.75e-3 / a_eff)) * stranded_crown_field_factor(7)
    assert smooth["peak_e_field_v_per_m"] == pytest.approx(expected, rel=1e-8)


def test_bare_bright_shield_and_sun_run_hotter(cli, tmp_path):
    bare = NO_JACKET.replace("[operating]", "[operating]\npower_w = 100.0")
    black = inspect(cli, write(tmp_path, bare))
    bright = inspect(cli, write(tmp_path, bare.replace(
        "[shield]\n", "[shield]\nsurface_emissivity = 0.03\n"), "bright.toml"))
    assert bright["surface_temperature_c"] - 20 > 1.3 * (black["surface_temperature_c"] - 20)
    assert bright["max_power_w"] < black["max_power_w"]
    sunny = inspect(cli, write(tmp_path, with_operating(
        JACKETED, "solar_irradiance_w_per_m2 = 1000.0"), "sun.toml"))
    shade = inspect(cli, write(tmp_path, JACKETED, "shade.toml"))
    assert sunny["conductor_temperature_c"] > shade["conductor_temperature_c"] + 3.0
    assert sunny["max_power_w"] < shade["max_power_w"]
