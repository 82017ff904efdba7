"""Foamed dielectrics by void fraction and dielectric dispersion, through design files, the
evaluation, the sweep's void-fraction variable and the member limits."""

from __future__ import annotations

import dataclasses

import numpy as np
import pyarrow.parquet as pq
import pytest

from cablefam.optimizer.errors import InputError
from cablefam.optimizer.inputs.design_file import design_arrays, load_design
from cablefam.optimizer.inputs.sweep_spec import load_sweep
from cablefam.optimizer.model.effective_dielectric import resolve_table
from cablefam.optimizer.model.evaluate import evaluate
from cablefam.optimizer.search.problem import MemberProblem
from cablefam.physics import dispersion, foam
from tests.optimizer.conftest import DATA

#: Solid PE as in catalogs/baseline.toml (see the per-value sources there), foamable and given
#: at 1 GHz; PTFE as in catalogs/high-temperature.toml with a fixed void fraction.
FOAM_CATALOG = """\
[catalog]
name = "foam-test"
description = "Test fixture: a foamable PE and a fixed expanded PTFE"

[conductor.copper]
resistivity_ohm_m = 1.7241e-8
temperature_coefficient_per_k = 0.00393
relative_permeability = 1.0
density_kg_per_m3 = 8890
price_per_kg = 9.0
source = "IEC 60028; price made up"

[dielectric.pe]
relative_permittivity = 2.25
loss_tangent = 2e-4
reference_frequency_hz = 1e9
foamable = true
dielectric_strength_v_per_m = 2.0e7
max_temperature_c = 70
thermal_resistivity_k_m_per_w = 3.5
density_kg_per_m3 = 920
price_per_kg = 2.0
source = "as catalogs/baseline.toml, dielectric.solid-pe"

[dielectric.eptfe]
relative_permittivity = 2.1
loss_tangent = 2e-4
void_fraction = 0.5
dielectric_strength_v_per_m = 2.0e7
max_temperature_c = 260
thermal_resistivity_k_m_per_w = 4.0
density_kg_per_m3 = 2170
price_per_kg = 20.0
source = "as catalogs/high-temperature.toml, dielectric.ptfe"
"""

SWEEP = """\
name = "foam"
seed = 5
catalogs = ["foam.toml"]

[search]
objectives = ["attenuation", "mass"]
evaluations_per_task = 4096
population = 16
generations = 2
inner_radius_m = [0.3e-3, 1.5e-3]
dielectric_radius_m = [0.6e-3, 8e-3]
shield_thickness_m = [0.2e-3, 0.2e-3]
void_fraction = {bounds}

[[member]]
name = "m50"
impedance_ohm = 50
impedance_tolerance_ohm = 1.5
frequency_hz = 2e9
single_mode_margin = 0
{limits}
"""


def write_sweep(tmp_path, bounds="[0.0, 0.7]", limits=""):
    (tmp_path / "foam.toml").write_text(FOAM_CATALOG)
    path = tmp_path / "sweep.toml"
    path.write_text(SWEEP.format(bounds=bounds, limits=limits))
    return path


def design_file(tmp_path, extra):
    text = (DATA / "inline_minimal.toml").read_text().replace(
        "loss_tangent = 2e-4", "loss_tangent = 2e-4\n" + extra)
    path = tmp_path / "design.toml"
    path.write_text(text)
    return path


def evaluated(path):
    designs, op = design_arrays(load_design(path))
    return {k: float(v[0]) for k, v in evaluate(designs, op).items()}


def test_plain_record_gives_the_old_numbers(tmp_path):
    plain = evaluated(DATA / "inline_minimal.toml")
    zero = evaluated(design_file(tmp_path, "void_fraction = 0.0"))
    assert plain == zero  # bit for bit
    assert plain["void_fraction"] == 0.0 and plain["effective_relative_permittivity"] == 2.25


def test_foamed_record_uses_the_foam_permittivity(tmp_path):
    v = evaluated(design_file(tmp_path, "void_fraction = 0.5"))
    eps, _ = foam.foam_permittivity_loss_tangent(2.25, 2e-4, 0.5)
    assert v["void_fraction"] == 0.5
    np.testing.assert_allclose(v["effective_relative_permittivity"], eps, rtol=1e-15)
    np.testing.assert_allclose(v["c_f_per_m"], 2 * np.pi * 8.8541878128e-12 * eps
                               / np.log(1.75 / 0.5), rtol=1e-9)


def test_dispersive_record_exact_at_its_reference_frequency(tmp_path):
    at_ref = evaluated(design_file(tmp_path, "reference_frequency_hz = 100e6"))
    plain = evaluated(DATA / "inline_minimal.toml")
    for key in ("c_f_per_m", "g_s_per_m", "attenuation_db_per_100m"):
        np.testing.assert_allclose(at_ref[key], plain[key], rtol=1e-12)
    away = evaluated(design_file(tmp_path, "reference_frequency_hz = 10e9"))
    e, t = dispersion.dispersive_permittivity_loss_tangent(100e6, 2.25, 2e-4, 10e9)
    np.testing.assert_allclose(away["effective_relative_permittivity"], e, rtol=1e-14)
    assert away["effective_relative_permittivity"] > 2.25  # eps' rises towards low frequency


def test_resolving_twice_changes_nothing():
    table = {"relative_permittivity": np.array([2.25]), "loss_tangent": np.array([2e-4]),
             "void_fraction": np.array([0.4]), "reference_frequency_hz": np.array([1e9])}
    once = resolve_table(table, 3e9)
    assert resolve_table(once, 3e9) is once


@pytest.mark.parametrize("extra, key", [("void_fraction = 1.0", "void_fraction = 1.0"),
                                        ("void_fraction = -0.2", "void_fraction = -0.2"),
                                        ("reference_frequency_hz = 0.0",
                                         "reference_frequency_hz = 0.0")])
def test_bad_record_values_are_one_line_exit_2(tmp_path, cli, extra, key):
    path = design_file(tmp_path, extra)
    with pytest.raises(InputError, match=key.replace(".", r"\.")):
        load_design(path)
    code, _, err = cli("inspect", path)
    assert code == 2 and str(path) in err and key in err and "Traceback" not in err


def test_bad_void_fraction_bounds(tmp_path, cli):
    code, _, err = cli("sweep", write_sweep(tmp_path, bounds="[0.2, 1.0]"), "--out", tmp_path)
    assert code == 2 and "void_fraction" in err and "[0.2, 1.0]" in err


def test_void_fraction_needs_a_foamable_dielectric(tmp_path):
    path = write_sweep(tmp_path)
    path.write_text(path.read_text().replace('void_fraction = [0.0, 0.7]',
                                             'void_fraction = [0.0, 0.7]\ndielectrics = ["eptfe"]'))
    with pytest.raises(InputError, match="foamable"):
        load_sweep(path)


def test_void_fraction_is_a_design_variable(tmp_path):
    sweep = load_sweep(write_sweep(tmp_path))
    problem = MemberProblem(sweep, sweep.spec.member[0], "foam-test")
    layout = problem.layout
    assert layout.variables[-1] == "void_fraction"
    assert layout.n_var == len(layout.variables) + 1  # and the dielectric choice
    rng = np.random.default_rng(1)
    lo, hi = problem.bounds()
    x = lo + (hi - lo) * rng.random((400, layout.n_var))
    x = problem.make_repair()._do(problem, x)
    values, margins, idx = problem.evaluate_designs(x)
    pe = idx["dielectric"] == layout.material_ids["dielectric"].index("pe")
    col = layout.variables.index("void_fraction")
    np.testing.assert_array_equal(values["void_fraction"][pe], x[pe, col])
    np.testing.assert_array_equal(values["void_fraction"][~pe], 0.5)
    # the impedance construction solved b from each design's effective permittivity
    inside = margins["geometry"] > 0
    assert np.mean(margins["impedance"][inside] >= 0) > 0.97
    # velocity factor = 1/sqrt(eps_eff) up to the conductors' internal inductance at 2 GHz
    np.testing.assert_allclose(values["velocity_factor"],
                               1 / np.sqrt(values["effective_relative_permittivity"]), rtol=3e-3)


def test_member_limits_on_velocity_and_capacitance(tmp_path):
    sweep = load_sweep(write_sweep(tmp_path, limits="min_velocity_factor = 0.8\n"
                                                    "max_capacitance_f_per_m = 85e-12"))
    problem = MemberProblem(sweep, sweep.spec.member[0], "foam-test")
    lo, hi = problem.bounds()
    x = lo + (hi - lo) * np.random.default_rng(2).random((300, problem.layout.n_var))
    values, margins, _ = problem.evaluate_designs(problem.make_repair()._do(problem, x))
    np.testing.assert_allclose(margins["velocity_factor"],
                               (values["velocity_factor"] - 0.8) / 0.8)
    np.testing.assert_allclose(margins["capacitance"],
                               (85e-12 - values["c_f_per_m"]) / 85e-12)
    assert (margins["velocity_factor"] < 0).any() and (margins["velocity_factor"] > 0).any()


def test_sweep_front_carries_the_foam_columns(tmp_path):
    from cablefam.optimizer.batch.sweep import run_sweep

    sweep = load_sweep(write_sweep(tmp_path, limits="min_velocity_factor = 0.8"))
    run = run_sweep(sweep, tmp_path / "runs")
    df = pq.read_table(run / "front.parquet").to_pandas()
    for col in ("void_fraction", "effective_relative_permittivity", "margin_velocity_factor",
                "margin_capacitance"):
        assert col in df.columns
    assert (df["velocity_factor"] >= 0.8 - 1e-12).all()
    # low attenuation wants foam: the foamable PE's front rows are well foamed
    pe = df[df["dielectric"] == "pe"]
    assert len(pe) and pe["void_fraction"].max() > 0.5


def test_exported_front_row_reproduces_its_values(tmp_path, cli):
    from cablefam.optimizer.batch.sweep import run_sweep

    sweep = load_sweep(write_sweep(tmp_path))
    run = run_sweep(sweep, tmp_path / "runs")
    df = pq.read_table(run / "front.parquet").to_pandas()
    i = int(np.flatnonzero((df["dielectric"] == "pe").to_numpy())[0])
    code, out, _ = cli("design", run, "--member", "m50", "--index", i)
    assert code == 0 and "void_fraction" in out
    path = tmp_path / "row.toml"
    path.write_text(out)
    v = evaluated(path)
    for key in ("void_fraction", "effective_relative_permittivity", "z0_ohm",
                "attenuation_db_per_100m", "mass_kg_per_km"):
        np.testing.assert_allclose(v[key], df[key].iloc[i], rtol=1e-9)


def test_sheet_frequency_response_uses_the_dispersive_values(tmp_path):
    from cablefam.optimizer.review.sheet import frequency_response

    plain = frequency_response(load_design(DATA / "inline_minimal.toml"), None)
    disp = frequency_response(load_design(design_file(
        tmp_path, "reference_frequency_hz = 100e6\nvoid_fraction = 0.6")), None)
    f = disp["frequency_hz"].to_numpy()
    # each point equals a one-design evaluation at that frequency with the dispersive foam
    d, op = design_arrays(load_design(tmp_path / "design.toml"))
    for i in (0, len(f) // 2, len(f) - 1):
        one = evaluate(d, dataclasses.replace(op, frequency_hz=f[i]))
        np.testing.assert_allclose(disp["attenuation_20c_db_per_100m"][i],
                                   one["attenuation_db_per_100m"][0], rtol=1e-12)
    # foam lowers the dielectric loss and the capacitance, so the loss over frequency
    assert (disp["attenuation_20c_db_per_100m"] < plain["attenuation_20c_db_per_100m"]).all()


def test_evaluated_rows_carry_the_void_fraction(tmp_path):
    from cablefam.optimizer.batch.sweep import run_sweep

    sweep = load_sweep(write_sweep(tmp_path))
    run = run_sweep(sweep, tmp_path / "runs", record_evaluated=True)
    df = pq.read_table(run / "evaluated.parquet").to_pandas()
    assert df["void_fraction"].between(0.0, 0.7).all()
    assert (df.loc[df["dielectric"] == "eptfe", "void_fraction"] == 0.5).all()


def test_bad_catalog_void_fraction_names_file_and_key(tmp_path, cli):
    path = tmp_path / "foam.toml"
    path.write_text(FOAM_CATALOG.replace("void_fraction = 0.5", "void_fraction = 1.2"))
    code, _, err = cli("catalog", "check", path)
    assert code == 2 and str(path) in err and "void_fraction = 1.2" in err
    assert "Traceback" not in err


def test_equal_bounds_fix_the_void_fraction(tmp_path):
    sweep = load_sweep(write_sweep(tmp_path, bounds="[0.4, 0.4]"))
    problem = MemberProblem(sweep, sweep.spec.member[0], "foam-test")
    assert "void_fraction" not in problem.layout.variables
    lo, hi = problem.bounds()
    x = lo + (hi - lo) * np.random.default_rng(4).random((200, problem.layout.n_var))
    values, _, idx = problem.evaluate_designs(problem.make_repair()._do(problem, x))
    pe = idx["dielectric"] == problem.layout.material_ids["dielectric"].index("pe")
    assert (values["void_fraction"][pe] == 0.4).all() and (values["void_fraction"][~pe] == 0.5).all()
