"""Shared fixtures of the review tests: tiny demo runs and synthetic run folders."""

import json
import shutil

import numpy as np
import pandas as pd
import pytest

from cablefam.optimizer.batch.sweep import run_sweep

from cablefam.optimizer.run_folder.files import FRONT_FILE, RUN_FILE, read_provenance, write_parquet
from cablefam.optimizer.inputs.sweep_spec import demo_sweep_path, load_sweep

#: Tiny sweeps: enough for fronts of a few designs per task, about 2 s each.
TINY = dict(generations=5, population=12, evaluations_per_task=3000)


@pytest.fixture(scope="session")
def tiny_run(tmp_path_factory):
    """The demo sweep, seed 7, 5 generations of 12, with evaluated.parquet."""
    out = tmp_path_factory.mktemp("runs_a")
    return run_sweep(load_sweep(demo_sweep_path()), out, record_evaluated=True, **TINY)


@pytest.fixture(scope="session")
def tiny_run_b(tmp_path_factory):
    """The same sweep with another seed (same members and objectives: comparable)."""
    out = tmp_path_factory.mktemp("runs_b")
    return run_sweep(load_sweep(demo_sweep_path()), out, seed=8, **TINY)


def copy_run_with_provenance(run_dir, dest, change):
    """Copy a run folder, rewriting front.parquet's provenance with ``change(provenance)``."""
    shutil.copytree(run_dir, dest)
    prov = read_provenance(run_dir / FRONT_FILE)
    change(prov)
    df = pd.read_parquet(run_dir / FRONT_FILE)
    write_parquet(df, dest / FRONT_FILE, prov)
    return dest


MEMBER = {"name": "m1", "impedance_ohm": 50.0, "impedance_tolerance_ohm": 1.0,
          "frequency_hz": 1e9, "power_w": None, "peak_voltage_v": None, "ambient_c": 20.0,
          "max_outer_diameter_m": None, "field_safety_factor": 1.0, "single_mode_margin": 1.0,
          "min_shield_skin_depths": 2.0}


def synthetic_run(folder, rows: dict[str, np.ndarray], objectives=("attenuation", "mass"),
                  name="synthetic"):
    """A minimal run folder (front.parquet with provenance, run.json) from columns.

    ``rows`` maps front columns to arrays; member, catalog and material columns default to
    "m1", "cat-a", "copper"/"solid-pe".
    """
    n = len(next(iter(rows.values())))
    cols = {"member": ["m1"] * n, "catalog": ["cat-a"] * n, "conductor": ["copper"] * n,
            "shield": ["copper"] * n, "dielectric": ["solid-pe"] * n, "jacket": ["pe"] * n,
            "inner_radius_m": np.full(n, 1e-3), "dielectric_radius_m": np.full(n, 3.3e-3),
            "shield_thickness_m": np.full(n, 2e-4), "jacket_thickness_m": np.full(n, 5e-4),
            "z0_ohm": np.full(n, 50.0), "outer_diameter_m": np.full(n, 8e-3)}
    cols.update(rows)
    df = pd.DataFrame(cols)
    catalogs = list(dict.fromkeys(df["catalog"]))
    members = [dict(MEMBER, name=m) for m in dict.fromkeys(df["member"])]
    prov = {"format": "cablefam-front/1", "sweep_name": name, "objectives": list(objectives),
            "members": members, "catalogs": [{"name": c, "file": f"{c}.toml", "sha256": ""}
                                             for c in catalogs]}
    run_dir = folder / name
    run_dir.mkdir(parents=True)
    write_parquet(df, run_dir / FRONT_FILE, prov)
    (run_dir / RUN_FILE).write_text(json.dumps({**prov, "started_utc": "2026-01-01T00:00:00"}))
    return run_dir
