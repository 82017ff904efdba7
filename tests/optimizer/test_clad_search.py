"""Clad conductors as material choices of a search: per-design arrays, the impedance
construction, and a front row exported back as a design file."""

from __future__ import annotations

import numpy as np
import pytest

from cablefam.optimizer.inputs.sweep_spec import load_sweep
from cablefam.optimizer.model.evaluate import evaluate
from cablefam.optimizer.search.problem import MemberProblem
from cablefam.physics.layered_conductor import clad_dc_resistance
from tests.optimizer.test_clad_conductors import CLAD, inspect_values

SWEEP = """\
name = "clad-search"
seed = 3
catalogs = ["{catalog}"]

[search]
objectives = ["attenuation", "cost"]
population = 20
generations = 2
evaluations_per_task = 2000
inner_radius_m = [0.3e-3, 1.5e-3]
dielectric_radius_m = [1.0e-3, 6.0e-3]
shield_thickness_m = [0.2e-3, 0.2e-3]
conductors = ["copper", "ccs-21", "cca-15", "tinned-copper"]
shields = ["copper", "tinned-copper"]
dielectrics = ["solid-pe"]

[[member]]
name = "drop-75"
impedance_ohm = 75
impedance_tolerance_ohm = 3
frequency_hz = 1e9
"""


def test_clad_records_are_material_choices_in_the_search(tmp_path):
    path = tmp_path / "sweep.toml"
    path.write_text(SWEEP.format(catalog=CLAD))
    sweep = load_sweep(path)
    problem = MemberProblem(sweep, sweep.spec.member[0], sweep.catalogs[0].name)
    lo, hi = problem.layout.lower_upper()
    x = np.random.default_rng(5).uniform(lo, hi, size=(400, len(lo)))
    computed, _, idx = problem.designs(x)
    values = evaluate(computed, problem.operating_point())
    assert all(np.isfinite(v).all() for v in values.values())
    ids = problem.layout.material_ids["conductor"]
    # each row equals the same design evaluated alone (per-design arrays, no mixing)
    for row in np.flatnonzero(np.diff(idx["conductor"], prepend=-1) != 0)[:8]:
        one = type(computed)(
            computed.inner_radius[row:row + 1], computed.dielectric_radius[row:row + 1],
            computed.shield_thickness[row:row + 1], computed.jacket_thickness[row:row + 1],
            {k: v[row:row + 1] for k, v in computed.inner.items()},
            {k: v[row:row + 1] for k, v in computed.shield.items()},
            {k: v[row:row + 1] for k, v in computed.dielectric.items()}, None)
        alone = evaluate(one, problem.operating_point())
        assert alone["attenuation_db_per_100m"][0] == values["attenuation_db_per_100m"][row]
        if ids[idx["conductor"][row]] == "ccs-21":
            assert alone["dc_resistance_inner_ohm_per_m"][0] == pytest.approx(float(
                clad_dc_resistance(computed.inner_radius[row], 1.43e-7, 1.7241e-8, 0.1017)),
                rel=1e-14)
    # copper rows are the homogeneous wire: the cladding keys are neutral there
    cu = idx["conductor"] == ids.index("copper")
    assert (computed.inner["cladding_area_fraction"][cu] == 0).all()
    assert (computed.inner["cladding_thickness_m"][cu] == 0).all()


def test_impedance_construction_sees_the_cladding(tmp_path):
    # the solved dielectric radius puts clad designs inside the band as well as copper ones
    path = tmp_path / "sweep.toml"
    path.write_text(SWEEP.format(catalog=CLAD))
    sweep = load_sweep(path)
    problem = MemberProblem(sweep, sweep.spec.member[0], sweep.catalogs[0].name)
    lo, hi = problem.layout.lower_upper()
    x = np.random.default_rng(6).uniform(lo, hi, size=(400, len(lo)))
    computed, _, idx = problem.designs(x)
    z0 = evaluate(computed, problem.operating_point())["z0_ohm"]
    inside = np.abs(z0 - 75.0) <= 3.0
    ids = problem.layout.material_ids["conductor"]
    ccs = idx["conductor"] == ids.index("ccs-21")
    assert ccs.any() and inside[ccs].mean() > 0.95


def test_sweep_front_row_of_a_clad_conductor_round_trips(cli, tmp_path):
    # a small sweep over the clad catalog; a clad row exported as a design file (layer inline)
    # gives the front's numbers again
    import pyarrow.parquet as pq

    from cablefam.optimizer.batch.sweep import run_sweep

    path = tmp_path / "sweep.toml"
    path.write_text(SWEEP.format(catalog=CLAD).replace("frequency_hz = 1e9",
                                                       "frequency_hz = 1e8\npower_w = 50"))
    run_dir = run_sweep(load_sweep(path), tmp_path / "runs")
    df = pq.read_table(run_dir / "front.parquet").to_pandas()
    clad = df[df["conductor"].isin(["ccs-21", "cca-15", "tinned-copper"])]
    assert len(clad) > 0
    index = int(clad.index[0])
    code, text, err = cli("design", run_dir, "--member", "drop-75", "--index", index)
    assert code == 0, err
    assert "[conductor.cladding]" in text
    design = tmp_path / "row.toml"
    design.write_text(text)
    values = inspect_values(design)
    row = df.loc[index]
    for key in ("attenuation_db_per_100m", "cost_per_km", "dc_resistance_inner_ohm_per_m",
                "cladding_thickness_inner_m"):
        assert values[key] == pytest.approx(float(row[key]), rel=1e-12), key
