"""Outer conductors as built in design files, the evaluation, the sweep and the export."""

from __future__ import annotations

import json
import math

import numpy as np
import pyarrow.parquet as pq
import pytest

from cablefam.optimizer.batch.sweep import run_sweep
from cablefam.optimizer.inputs.design_file import design_arrays, load_design
from cablefam.optimizer.inputs.sweep_spec import load_sweep
from cablefam.optimizer.model.evaluate import evaluate
from cablefam.physics import braid
from tests.optimizer.conftest import CATALOG_DIR, DATA

BASE = (DATA / "inline_minimal.toml").read_text()
BRAID_KEYS = ('shield_construction = "braid"\nbraid_carriers = 16\nbraid_ends = 7\n'
              'braid_wire_diameter_m = 0.127e-3\nbraid_angle_deg = 30\n')
BRAID = BASE.replace("shield_thickness_m = 0.2e-3\n", BRAID_KEYS)
NEW_KEYS = ("shield_construction", "braid_fill_factor", "braid_optical_coverage",
            "transfer_impedance_ohm_per_m", "transfer_impedance_max_ohm_per_m")


def _write(tmp_path, text, name="d.toml"):
    path = tmp_path / name
    path.write_text(text)
    return path


def _values(path):
    return evaluate(*design_arrays(load_design(path)))


def test_explicit_tube_gives_todays_numbers_bit_for_bit(tmp_path):
    old = _values(_write(tmp_path, BASE, "old.toml"))
    tube = _values(_write(tmp_path, BASE.replace(
        "shield_thickness_m = 0.2e-3\n",
        'shield_thickness_m = 0.2e-3\nshield_construction = "tube"\n'), "tube.toml"))
    assert not any(k in old for k in NEW_KEYS)  # a file without the key: no new keys
    for key, value in old.items():
        assert np.array_equal(value, tube[key]), key
    assert tube["shield_construction"][0] == 0.0
    assert tube["braid_fill_factor"][0] == 0.0
    # the tube's transfer impedance at 100 MHz through 0.2 mm of copper is tiny but finite
    assert 0.0 < tube["transfer_impedance_ohm_per_m"][0] < 1e-6


def test_braid_design_evaluates_every_key_finite(tmp_path, cli):
    path = _write(tmp_path, BRAID)
    code, out, err = cli("inspect", "--json", path)
    assert code == 0, err
    obj = json.loads(out)
    for key in NEW_KEYS + ("dc_resistance_shield_ohm_per_m", "attenuation_db_per_100m"):
        assert isinstance(obj[key], float) and math.isfinite(obj[key]), key
    r_dc = braid.braid_dc_resistance(16, 7, 0.127e-3, math.radians(30.0), 1.7241e-8)
    assert obj["dc_resistance_shield_ohm_per_m"] == pytest.approx(float(r_dc), rel=1e-12)
    assert obj["shield_construction"] == 2.0
    assert 0.0 < obj["braid_optical_coverage"] < 1.0


def test_braid_loses_more_than_the_tube_and_weighs_the_lay(tmp_path):
    tube = _values(_write(tmp_path, BASE.replace(
        "shield_thickness_m = 0.2e-3", "shield_thickness_m = 0.254e-3"), "t.toml"))
    braided = _values(_write(tmp_path, BRAID, "b.toml"))
    assert braided["attenuation_db_per_100m"][0] > tube["attenuation_db_per_100m"][0]
    assert braided["outer_diameter_m"][0] == pytest.approx(tube["outer_diameter_m"][0])


def test_screening_band_max_is_at_least_the_value_at_f(tmp_path):
    text = BRAID.replace("frequency_hz = 100e6",
                         "frequency_hz = 100e6\nscreening_band_hz = [1e5, 1e9]")
    v = _values(_write(tmp_path, text))
    assert v["transfer_impedance_max_ohm_per_m"][0] > v["transfer_impedance_ohm_per_m"][0]


BAD = {
    "angle-90": (BRAID.replace("braid_angle_deg = 30", "braid_angle_deg = 90"),
                 ["[geometry] braid_angle_deg = 90", "less than 90"]),
    "angle-0": (BRAID.replace("braid_angle_deg = 30", "braid_angle_deg = 0"),
                ["[geometry] braid_angle_deg = 0", "greater than 0"]),
    "fill-above-1": (BRAID.replace("braid_ends = 7", "braid_ends = 30"),
                     ["[geometry] braid_angle_deg = 30", "fill factor", "> 1"]),
    "carriers-not-integer": (BRAID.replace("braid_carriers = 16", "braid_carriers = 16.5"),
                             ["[geometry] braid_carriers = 16.5", "integer"]),
    "braid-key-on-tube": (BASE.replace("shield_thickness_m = 0.2e-3",
                                       "shield_thickness_m = 0.2e-3\nbraid_carriers = 16"),
                          ["[geometry] braid_carriers = 16", "does not apply", "'tube'"]),
    "thickness-on-braid": (BRAID + "", None),
    "missing-braid-key": (BRAID.replace("braid_ends = 7\n", ""),
                          ["[geometry] braid_ends", "required key is missing", "'braid'"]),
    "foil-without-thickness": (BASE.replace("shield_thickness_m = 0.2e-3",
                                            'shield_construction = "foil"'),
                               ["[geometry] foil_thickness_m", "required key is missing"]),
}
BAD["thickness-on-braid"] = (
    BRAID.replace('shield_construction = "braid"',
                  'shield_construction = "braid"\nshield_thickness_m = 0.2e-3'),
    ["[geometry] shield_thickness_m = 0.0002", "does not apply", "'braid'"])


@pytest.mark.parametrize("case", sorted(BAD))
def test_bad_outer_conductor_is_one_line_exit_2(cli, tmp_path, case):
    text, needles = BAD[case]
    path = _write(tmp_path, text, f"{case}.toml")
    code, out, err = cli("inspect", path)
    assert code == 2 and out == ""
    assert err.startswith("cablefam: error: ") and err.count("\n") == 1, err
    for needle in [str(path), *needles]:
        assert needle in err, (needle, err)


SWEEP = f"""\
name = "screened"
seed = 2
catalogs = ["{CATALOG_DIR / 'baseline.toml'}"]

[search]
objectives = ["attenuation", "mass"]
population = 16
generations = 2
evaluations_per_task = 3000
inner_radius_m = [0.3e-3, 1.5e-3]
dielectric_radius_m = [1.0e-3, 5e-3]
shield_thickness_m = [0.1e-3, 0.3e-3]
jacket_thickness_m = [0.5e-3, 0.5e-3]
shield_constructions = {{constructions}}
braid_wire_diameter_m = [0.1e-3, 0.2e-3]
braid_angle_deg = [15, 40]
braid_carriers = [16, 24]
braid_ends = [4, 10]
conductors = ["copper"]
shields = ["copper"]
dielectrics = ["solid-pe"]
jackets = ["pvc"]

[[member]]
name = "m50"
impedance_ohm = 50
impedance_tolerance_ohm = 2
frequency_hz = 100e6
screening_band_hz = [1e6, 1e9]
max_transfer_impedance_ohm_per_m = {{limit}}
min_braid_optical_coverage = 0.85
"""


def _sweep(tmp_path, constructions, limit):
    path = _write(tmp_path, SWEEP.format(constructions=constructions, limit=limit), "s.toml")
    run_dir = run_sweep(load_sweep(path), tmp_path / "runs")
    return run_dir, pq.read_table(run_dir / "front.parquet").to_pandas()


def test_braid_only_sweep_meets_screening_limits_and_exports(tmp_path, cli):
    run_dir, df = _sweep(tmp_path, '["braid", "double-braid"]', 2.0)
    assert len(df) > 0 and df["feasible"].all()
    assert set(df["shield_construction"]) <= {2.0, 4.0}
    assert (df["transfer_impedance_max_ohm_per_m"] <= 2.0).all()
    single = df["shield_construction"] == 2.0
    assert (df.loc[single, "braid_optical_coverage"] >= 0.85).all()
    assert (df["braid_fill_factor"] <= 1.0).all()
    for key in ("margin_transfer_impedance", "margin_braid_coverage"):
        assert (df[key] >= 0.0).all()
    code, out, err = cli("design", run_dir, "--member", "m50", "--index", "0")
    assert code == 0, err
    assert "shield_thickness_m" not in out and "braid_carriers = " in out
    path = _write(tmp_path, out, "exported.toml")
    code, out2, err = cli("inspect", "--json", path)
    assert code == 0, err
    again = json.loads(out2)
    row = df.iloc[0]
    for key in ("attenuation_db_per_100m", "transfer_impedance_ohm_per_m",
                "transfer_impedance_max_ohm_per_m", "braid_optical_coverage", "mass_kg_per_km"):
        assert again[key] == pytest.approx(row[key], rel=1e-9), key


def test_sweep_bad_bounds_name_the_key(tmp_path):
    from cablefam.optimizer.errors import InputError
    text = SWEEP.format(constructions='["braid"]', limit=1.0).replace(
        "braid_angle_deg = [15, 40]", "braid_angle_deg = [15, 95]")
    with pytest.raises(InputError, match=r"braid_angle_deg.*\(0, 90\)"):
        load_sweep(_write(tmp_path, text, "bad.toml"))
    text = SWEEP.format(constructions='["tube"]', limit=1.0)
    with pytest.raises(InputError, match=r"braid_wire_diameter_m.*does not apply"):
        load_sweep(_write(tmp_path, text, "bad2.toml"))


def test_design_sheet_of_a_braided_row_has_the_transfer_impedance_figure(tmp_path, cli):
    run_dir, df = _sweep(tmp_path, '["braid"]', 2.0)
    code, out, err = cli("pick", run_dir, "--top", "1", "--out", tmp_path / "sheets")
    assert code == 0, err
    pages = list((tmp_path / "sheets").glob("*.md"))
    assert len(pages) == 1
    text = pages[0].read_text()
    assert "Transfer impedance versus frequency" in text
    assert "Re-evaluation differs" not in text
    assert list((tmp_path / "sheets").glob("*-screening.png"))


def test_skin_depth_margin_at_the_lowest_band_frequency_and_fill_above_one():
    from types import SimpleNamespace

    from cablefam.optimizer.model.constraints import constraint_margins
    from cablefam.optimizer.model.evaluate import Designs

    d = Designs(np.array([0.5e-3, 0.5e-3]), np.array([1.75e-3, 1.75e-3]),
                np.array([0.2e-3, 0.2e-3]), np.zeros(2), {}, {}, {}, None)
    values = {"z0_ohm": np.full(2, 50.0), "te11_cutoff_hz": np.full(2, 1e12),
              "outer_diameter_m": np.full(2, 5e-3), "skin_depth_shield_m": np.full(2, 10e-6),
              "braid_fill_factor": np.array([0.0, 1.1]),
              "braid_optical_coverage": np.array([0.0, 0.99])}
    member = SimpleNamespace(impedance_ohm=50.0, impedance_tolerance_ohm=2.0, peak_voltage_v=None,
                             power_w=None, single_mode_margin=0.0, frequency_hz=100e6,
                             max_outer_diameter_m=None, min_shield_skin_depths=2.0,
                             min_impedance_yield=None, screening_band_hz=[25e6, 1e9],
                             max_transfer_impedance_ohm_per_m=None,
                             min_braid_optical_coverage=None)
    m = constraint_margins(values, d, member, None, None)
    # the skin depth at 25 MHz is twice that at 100 MHz: need = 2 * 2 * 10 um = 40 um
    assert m["shield_skin_depths"][0] == pytest.approx((0.2e-3 - 40e-6) / 40e-6)
    # a tube has no braid; a braid with F = 1.1 violates by 0.1
    assert m["braid_coverage"][0] == 1.0
    assert m["braid_coverage"][1] == pytest.approx(-0.1)


@pytest.mark.parametrize("construction", ["braid", "double-braid"])
def test_heat_of_a_braid_matches_its_attenuation(tmp_path, construction):
    # identity: the heat per metre at power P is 2 alpha P (alpha in Np/m) for a matched
    # line; the thermal model sees the braid through an equivalent tube resistivity, so this
    # holds to the few per cent of the temperature rise along the iteration
    text = BRAID.replace('"braid"', f'"{construction}"').replace(
        "frequency_hz = 100e6", "frequency_hz = 100e6\npower_w = 20")
    text = text.replace("[dielectric]", "[dielectric]\nthermal_resistivity_k_m_per_w = 3.5")
    text = text.replace("[conductor]", "[conductor]\ntemperature_coefficient_per_k = 0.00393")
    text = text.replace("[shield]", "[shield]\ntemperature_coefficient_per_k = 0.00393")
    v = _values(_write(tmp_path, text))
    alpha_np = v["attenuation_db_per_100m"][0] / 100.0 / (20.0 / math.log(10.0))
    assert v["heat_w_per_m"][0] == pytest.approx(2.0 * alpha_np * 20.0, rel=0.03)


def test_tube_only_sweep_checks_a_transfer_impedance_limit(tmp_path):
    """No `shield_constructions`, but a member's screening limit: the tubes get their
    transfer impedance computed and the limit binds (it is not passed over)."""
    text = "\n".join(line for line in SWEEP.format(constructions="", limit=1e-3).splitlines()
                     if not line.startswith(("shield_constructions", "braid_")))
    path = _write(tmp_path, text, "tubes.toml")
    run_dir = run_sweep(load_sweep(path), tmp_path / "runs")
    df = pq.read_table(run_dir / "front.parquet").to_pandas()
    assert len(df) > 0 and set(df["shield_construction"]) == {0.0}
    # Source: Schelkunoff's tube, Z_T(f -> 0) = R_dc: the largest |Z_T| of a tube over a band
    # is at its lowest frequency, at most its DC resistance
    assert (df["transfer_impedance_max_ohm_per_m"]
            <= df["dc_resistance_shield_ohm_per_m"] * (1 + 1e-9)).all()
    assert (df["transfer_impedance_max_ohm_per_m"] <= 1e-3).all()
    assert (df["margin_transfer_impedance"] >= 0.0).all()
