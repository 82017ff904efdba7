"""``cablefam inspect``: report, ``--json``, ``--profile`` and the one-line input errors."""

from __future__ import annotations

import json
import math

import numpy as np
import pandas as pd
import pytest
from scipy.constants import mu_0

from cablefam.optimizer.cautions import CAUTION_LINES
from cablefam.optimizer.review.inspection import REPORT_LAYOUT, engineering, inspect_design, to_json_object
from cablefam.optimizer.inputs.sweep_spec import demo_design_path
from tests.optimizer.conftest import CATALOG_DIR, DATA, run_subprocess

DEMO = demo_design_path()

#: Keys every ``--json`` of a fully specified design carries (a contract of the CLI).
REQUIRED_KEYS = (
    "z0_ohm", "z0_real_ohm", "z0_imag_ohm", "z0_lossless_ohm", "r_ohm_per_m", "l_h_per_m",
    "g_s_per_m", "c_f_per_m", "attenuation_db_per_100m", "conductor_attenuation_db_per_100m",
    "dielectric_attenuation_db_per_100m", "velocity_factor", "delay_s_per_m",
    "skin_depth_inner_m", "skin_depth_shield_m", "dc_resistance_inner_ohm_per_m",
    "dc_resistance_shield_ohm_per_m", "te11_cutoff_hz", "te11_cutoff_approx_hz",
    "peak_e_field_v_per_m", "max_peak_voltage_v", "outer_diameter_m", "mass_kg_per_km",
    "cost_per_km", "dc_loop_resistance_ohm_per_km", "conductor_temperature_c",
    "shield_temperature_c", "surface_temperature_c", "temperature_rise_k", "max_power_w",
    "heat_w_per_m",
)
#: Keys that need a power_w (the operating temperatures).
POWER_KEYS = ("conductor_temperature_c", "shield_temperature_c", "surface_temperature_c",
              "temperature_rise_k", "heat_w_per_m", "thermal_converged")
#: Keys that need densities, prices, thermal properties or a peak voltage.
MASS_KEYS = ("mass_kg_per_km", "cost_per_km")
ELECTRIC_KEYS = ("z0_ohm", "z0_real_ohm", "z0_imag_ohm", "z0_lossless_ohm", "r_ohm_per_m",
                 "l_h_per_m", "g_s_per_m", "c_f_per_m", "attenuation_db_per_100m",
                 "velocity_factor", "delay_s_per_m", "skin_depth_inner_m",
                 "skin_depth_shield_m", "te11_cutoff_hz", "outer_diameter_m",
                 "dc_loop_resistance_ohm_per_km")


def inspect_json(cli, path):
    code, out, err = cli("inspect", "--json", path)
    assert code == 0, err
    return json.loads(out)


def assert_all_finite_numbers(obj):
    for key, value in obj.items():
        if key in ("name",) or key.endswith("_id"):
            assert isinstance(value, str)
        elif key == "thermal_converged":
            assert value is True
        else:
            assert isinstance(value, float) and math.isfinite(value), (key, value)


# ------------------------------------------------------------------------------ report, JSON


def test_report_has_sections_values_and_caution(cli):
    code, out, err = cli("inspect", DEMO)
    assert code == 0, err
    assert out.startswith("cablefam inspect: larkspur-mast-feeder")
    for title, _ in REPORT_LAYOUT:
        assert f"\n{title}\n" in out
    for word in ("catalog", "geometry", "operating"):
        assert f"\n{word} " in out
    assert "CAUTION:" in out
    assert "\n".join(CAUTION_LINES) in out
    assert "Verify every design by prototype tests and measurement before use." in " ".join(
        out.split())
    # the printed numbers are the library's, with engineering prefixes
    values = inspect_design(DEMO).values
    for key, unit in (("z0_ohm", "ohm"), ("attenuation_db_per_100m", "dB/100 m"),
                      ("te11_cutoff_hz", "Hz"), ("max_power_w", "W")):
        assert engineering(values[key], unit) in out


def test_json_has_every_required_key_finite(cli):
    obj = inspect_json(cli, DEMO)
    missing = [k for k in REQUIRED_KEYS if k not in obj]
    assert not missing
    assert_all_finite_numbers(obj)
    assert obj["name"] == "larkspur-mast-feeder"
    assert obj["conductor_id"] == "copper" and obj["dielectric_id"] == "solid-pe"


def test_json_equals_library_call(cli):
    obj = inspect_json(cli, DEMO)
    assert obj == to_json_object(inspect_design(DEMO))


def test_json_report_and_profile_can_be_asked_together(cli, tmp_path):
    profile = tmp_path / "profile.csv"
    code, out, err = cli("inspect", "--json", "--profile", profile, DEMO)
    assert code == 0, err
    assert json.loads(out) == to_json_object(inspect_design(DEMO))
    assert profile.is_file()
    assert f"profile written to {profile}" in err


def test_inline_minimal_design_leaves_out_what_it_cannot_compute(cli):
    path = DATA / "inline_minimal.toml"
    obj = inspect_json(cli, path)
    assert_all_finite_numbers(obj)  # never NaN, never null
    for key in ELECTRIC_KEYS:
        assert key in obj
    # no densities/prices -> no mass or cost; no thermal data or power -> no temperatures and
    # no max power; no dielectric strength / peak voltage -> no voltage rating or peak field
    for key in (*MASS_KEYS, *POWER_KEYS, "max_power_w", "max_peak_voltage_v",
                "peak_e_field_v_per_m"):
        assert key not in obj, key
    assert not any(k.endswith("_id") for k in obj)
    assert obj == to_json_object(inspect_design(path))


def test_inline_design_without_jacket_or_power(cli):
    obj = inspect_json(cli, DATA / "inline_no_jacket.toml")
    assert_all_finite_numbers(obj)
    # jacket thickness 0: no jacket data needed for mass, cost and the power rating
    for key in (*ELECTRIC_KEYS, *MASS_KEYS, "max_power_w", "max_peak_voltage_v",
                "peak_e_field_v_per_m"):
        assert key in obj, key
    for key in POWER_KEYS:  # no power_w: no operating temperatures
        assert key not in obj, key
    # Source: outer diameter of a bare coax = 2 (b + shield thickness), by definition.
    assert obj["outer_diameter_m"] == pytest.approx(2.0 * (1.75e-3 + 0.2e-3), rel=1e-15)


def test_jacket_thickness_without_jacket_table_leaves_mass_and_thermal_out(cli, tmp_path):
    text = (DATA / "inline_no_jacket.toml").read_text().replace(
        "jacket_thickness_m = 0.0", "jacket_thickness_m = 1.0e-3")
    path = tmp_path / "jacketless.toml"
    path.write_text(text)
    obj = inspect_json(cli, path)
    assert_all_finite_numbers(obj)
    for key in (*MASS_KEYS, *POWER_KEYS, "max_power_w"):
        assert key not in obj, key
    assert obj["outer_diameter_m"] == pytest.approx(2.0 * (1.75e-3 + 0.2e-3 + 1.0e-3))


def test_report_of_a_partial_design_skips_empty_sections(cli):
    code, out, err = cli("inspect", DATA / "inline_minimal.toml")
    assert code == 0, err
    assert "Heat and power" not in out
    assert "Mass" not in out
    assert "n/a" not in out and "nan" not in out.lower()
    assert "CAUTION:" in out


# ----------------------------------------------------------------------------------- profile


def read_profile(cli, design, tmp_path):
    path = tmp_path / "profile.csv"
    code, _, err = cli("inspect", "--profile", path, design)
    assert code == 0, err
    df = pd.read_csv(path)
    assert list(df.columns) == ["r_m", "b_t", "j_a_per_m2", "e_v_per_m"]
    return df


def interface_rows(r, x):
    """The two rows of an interface radius ``x``: the inner side first, then the outer side.

    The profile samples each interface from both sides (one ulp apart, equal at the 9
    significant figures of the CSV), so that a plot shows the jumps of J and E.
    """
    rows = np.flatnonzero(np.isclose(r, x, rtol=1e-8, atol=0.0))
    assert len(rows) == 2 and rows[1] == rows[0] + 1, (x, rows)
    return rows


@pytest.mark.parametrize("design", [DEMO, DATA / "inline_no_jacket.toml"],
                         ids=["demo", "inline"])
def test_profile_regions_and_continuity(cli, tmp_path, design):
    df = read_profile(cli, design, tmp_path)
    g = inspect_design(design).design.geometry
    a, b = g.inner_radius_m, g.dielectric_radius_m
    c = b + g.shield_thickness_m
    r = df["r_m"].to_numpy()
    bt, j, e = (df[k].to_numpy() for k in ("b_t", "j_a_per_m2", "e_v_per_m"))
    assert np.all(np.isfinite(df.to_numpy()))
    assert np.all(np.diff(r) >= 0)
    assert r[0] == 0.0 and r[-1] > 1.2 * c  # from the axis to beyond the shield
    assert np.all((bt >= 0) & (j >= 0) & (e >= 0))  # amplitudes
    ia, ib, ic = (interface_rows(r, x) for x in (a, b, c))

    def strictly(lo, hi):
        return (r > lo * (1 + 1e-8)) & (r < hi * (1 - 1e-8))

    wire, diel, wall = strictly(0.0, a) | (r == 0.0), strictly(a, b), strictly(b, c)
    outside = r > c * (1 + 1e-8)
    assert min(wire.sum(), diel.sum(), wall.sum(), outside.sum()) >= 5
    # B is zero outside the shield (no net current), and so is J
    assert np.all(bt[outside] == 0.0) and bt[ic[1]] == 0.0
    assert np.all(j[outside] == 0.0)
    # E only in the dielectric, a <= r <= b: zero in the wire, the wall and outside
    assert np.all(e[diel] > 0.0)
    assert np.all(e[wire] == 0.0) and np.all(e[wall] == 0.0) and np.all(e[outside] == 0.0)
    assert e[ia[0]] == 0.0 and e[ia[1]] > 0.0
    assert e[ib[0]] > 0.0
    # no conduction current in the dielectric; the surface current sits at r = a and r = b
    assert np.all(j[diel] == 0.0) and j[ia[1]] == 0.0 and j[ib[0]] == 0.0
    assert j[ia[0]] == j[wire | (np.arange(len(r)) == ia[0])].max() > 0.0
    assert j[ib[1]] > 0.0
    # Continuity of tangential H across r = a and r = b; with mu_r = 1 that is B itself.
    # rtol 1e-6: the CSV keeps 9 significant figures and the two samples lie one ulp apart.
    assert bt[ia[0]] == pytest.approx(bt[ia[1]], rel=1e-6)
    assert bt[ib[0]] == pytest.approx(bt[ib[1]], rel=1e-6)
    assert bt.max() == pytest.approx(bt[ia[1]], rel=1e-6)  # the peak is at r = a
    # and B falls to (almost) nothing across a shield many skin depths thick
    assert bt[ic[0]] < 1e-12 * bt[ib[1]]


def test_profile_dielectric_fields_match_closed_form(cli, tmp_path):
    design = DATA / "inline_no_jacket.toml"  # current_a = 2 A, peak_voltage_v = 100 V
    df = read_profile(cli, design, tmp_path)
    a, b, current, voltage = 0.5e-3, 1.75e-3, 2.0, 100.0
    r = df["r_m"].to_numpy()
    diel = (r > a) & (r < b)
    assert diel.sum() >= 10
    # Source: coax fields in the dielectric, H = I/(2 pi r) (Ampere's circuital law) and
    # E = V/(r ln(b/a)) (Gauss's law), e.g. Pozar, Microwave Engineering, 4th ed.,
    # Example 2.1 (example number from memory). rtol 1e-8: 9 significant figures in the CSV.
    np.testing.assert_allclose(df["b_t"][diel], mu_0 * current / (2 * np.pi * r[diel]),
                               rtol=1e-8)
    np.testing.assert_allclose(df["e_v_per_m"][diel], voltage / (r[diel] * np.log(b / a)),
                               rtol=1e-8)


# ------------------------------------------------------------------------------- bad input

BASE = (DATA / "inline_minimal.toml").read_text()
BASE_CATALOG = BASE.replace('name = "inline-minimal"',
                            f'name = "inline-minimal"\ncatalog = "{CATALOG_DIR / "baseline.toml"}"')


def _edit(text, old, new):
    assert old in text, old
    return text.replace(old, new, 1)


BAD_DESIGNS = {
    "missing-key": (_edit(BASE, "loss_tangent = 2e-4\n", ""),
                    ["[dielectric] loss_tangent", "required key is missing"]),
    "unknown-key": (_edit(BASE, "loss_tangent = 2e-4", "loss_tangent = 2e-4\nloss_tanget = 3"),
                    ["[dielectric] loss_tanget = 3", "unknown key"]),
    "unknown-table": (BASE + "\n[cooling]\nfan = true\n",
                      ["cooling = {'fan': True}", "unknown key", "allowed:"]),
    "negative-radius": (_edit(BASE, "inner_radius_m = 0.5e-3", "inner_radius_m = -0.5e-3"),
                        ["[geometry] inner_radius_m = -0.0005", "greater than 0"]),
    "b-equals-a": (_edit(BASE, "dielectric_radius_m = 1.75e-3", "dielectric_radius_m = 0.5e-3"),
                   ["[geometry] dielectric_radius_m = 0.0005", "inner_radius_m = 0.0005"]),
    "b-below-a": (_edit(BASE, "dielectric_radius_m = 1.75e-3", "dielectric_radius_m = 0.4e-3"),
                  ["[geometry] dielectric_radius_m = 0.0004", "greater than inner_radius_m"]),
    "string-number": (_edit(BASE, "frequency_hz = 100e6", 'frequency_hz = "100e6"'),
                      ["[operating] frequency_hz = '100e6'", "valid number"]),
    "bool-number": (_edit(BASE, "loss_tangent = 2e-4", "loss_tangent = true"),
                    ["[dielectric] loss_tangent = True", "valid number"]),
    "missing-table": (BASE[:BASE.index("[operating]")],
                      ["[operating]", "required table is missing"]),
    "not-toml": ("name = 'x'\n[geometry\ninner_radius_m = 1\n", ["not valid TOML"]),
    "unknown-catalog-id": (
        _edit(BASE_CATALOG, "[conductor]\nresistivity_ohm_m = 1.7241e-8",
              '[conductor]\nid = "unobtainium"'),
        ["[conductor]", "'unobtainium'", "not in catalog", "baseline.toml", "copper"]),
    "id-without-catalog": (_edit(BASE, "[conductor]\nresistivity_ohm_m = 1.7241e-8",
                                 '[conductor]\nid = "copper"'),
                           ["[conductor] id = 'copper'", "catalog"]),
}


def assert_one_line_error(code, out, err, *needles):
    assert code == 2
    assert out == ""
    assert err.endswith("\n") and err.count("\n") == 1, err
    assert err.startswith("cablefam: error: ")
    assert "Traceback" not in err
    for needle in needles:
        assert needle in err, (needle, err)


@pytest.mark.parametrize("case", sorted(BAD_DESIGNS))
def test_bad_design_is_one_line_naming_key_and_value(cli, tmp_path, case):
    text, needles = BAD_DESIGNS[case]
    path = tmp_path / f"{case}.toml"
    path.write_text(text)
    code, out, err = cli("inspect", path)
    assert_one_line_error(code, out, err, str(path), *needles)
    # the same for --json (no half-written JSON on stdout)
    assert_one_line_error(*cli("inspect", "--json", path), str(path), *needles)


def test_missing_design_file(cli, tmp_path):
    path = tmp_path / "no-such-design.toml"
    assert_one_line_error(*cli("inspect", path), str(path), "file not found")


def test_missing_catalog_of_a_design(cli, tmp_path):
    path = tmp_path / "d.toml"
    path.write_text(BASE.replace('name = "inline-minimal"', 'catalog = "nowhere.toml"'))
    assert_one_line_error(*cli("inspect", path), str(tmp_path / "nowhere.toml"),
                          "file not found")


def test_bad_profile_input_writes_no_profile(cli, tmp_path):
    path = tmp_path / "bad.toml"
    path.write_text(BAD_DESIGNS["negative-radius"][0])
    profile = tmp_path / "profile.csv"
    code, out, err = cli("inspect", "--profile", profile, path)
    assert code == 2 and not profile.exists()


def test_infinite_power_is_an_input_error(cli, tmp_path):
    path = tmp_path / "inf-power.toml"
    path.write_text(_edit((DATA / "inline_no_jacket.toml").read_text(), "current_a = 2.0",
                          "current_a = 2.0\npower_w = inf"))
    assert_one_line_error(*cli("inspect", path), "[operating] power_w = inf")


def test_infinite_peak_voltage_is_an_input_error(cli, tmp_path):
    path = tmp_path / "inf-voltage.toml"
    path.write_text(_edit(BASE, "frequency_hz = 100e6",
                          "frequency_hz = 100e6\npeak_voltage_v = inf"))
    assert_one_line_error(*cli("inspect", "--json", path), "[operating] peak_voltage_v = inf")


# ----------------------------------------------------- a real process: traceback or not


def test_subprocess_error_is_one_line_without_traceback(tmp_path):
    path = tmp_path / "bad.toml"
    path.write_text(BAD_DESIGNS["string-number"][0])
    proc = run_subprocess("inspect", path)
    assert proc.returncode == 2
    assert proc.stdout == ""
    assert proc.stderr.strip().splitlines() == [
        f"cablefam: error: {path}: [operating] frequency_hz = '100e6': Input should be a "
        "valid number"]


def test_subprocess_debug_shows_traceback(tmp_path):
    path = tmp_path / "bad.toml"
    path.write_text(BAD_DESIGNS["string-number"][0])
    proc = run_subprocess("--debug", "inspect", path)
    assert proc.returncode not in (0, 2)
    assert "Traceback (most recent call last)" in proc.stderr
    assert "cablefam.optimizer.errors.InputError" in proc.stderr
    assert "frequency_hz = '100e6'" in proc.stderr


def test_debug_in_process_raises_the_input_error(tmp_path):
    from cablefam.optimizer.cli.app import main
    from cablefam.optimizer.errors import InputError

    path = tmp_path / "missing.toml"
    with pytest.raises(InputError, match="file not found"):
        main(["--debug", "inspect", str(path)])
