"""Assemble the run's outputs from finished tasks: front rows, evaluated rows, run.json."""

from __future__ import annotations

import json
import sys
from datetime import datetime, timezone

import numpy as np
import pandas as pd

from cablefam.optimizer.atomic import write_text_atomic
from cablefam.optimizer.batch.provenance import front_provenance
from cablefam.optimizer.cautions import CAUTION_LINES
from cablefam.optimizer.inputs.sweep_spec import GEOMETRY_KEYS
from cablefam.optimizer.model.constraints import CONSTRAINTS
from cablefam.optimizer.model.objectives import OBJECTIVES, objective_matrix
from cablefam.optimizer.model.slots import SLOT_NAMES
from cablefam.optimizer.run_folder.files import EVALUATED_FILE, FRONT_FILE, RUN_FILE, write_parquet
from cablefam.optimizer.search.problem import MemberProblem

#: Operating-point columns copied from the member into every row.
MEMBER_COLUMNS = ("impedance_ohm", "impedance_tolerance_ohm", "frequency_hz", "power_w",
                  "peak_voltage_v", "ambient_c", "field_safety_factor",
                  "vswr", "solar_irradiance_w_per_m2")


def design_geometry(designs) -> dict[str, np.ndarray]:
    """The geometry columns of designs (the dielectric radius as solved by the search)."""
    n = np.shape(designs.inner_radius)
    return {"inner_radius_m": designs.inner_radius,
            "dielectric_radius_m": np.broadcast_to(designs.dielectric_radius, n),
            "shield_thickness_m": np.broadcast_to(designs.shield_thickness, n),
            "jacket_thickness_m": np.broadcast_to(designs.jacket_thickness, n)}


def front_frame(problem: MemberProblem, x: np.ndarray) -> pd.DataFrame:
    """Rows of a task's front: ids, geometry, operating point, every quantity, margins."""
    values, margins, idx, designs = problem.evaluate_rows(x, include_max_power=True)
    geometry = design_geometry(designs)
    n = len(x)
    cols: dict[str, object] = {"member": [problem.member.name] * n,
                               "catalog": [problem.catalog.name] * n}
    for table in SLOT_NAMES:
        ids = problem.layout.material_ids.get(table, ())
        cols[table] = [ids[i] for i in idx[table]] if ids else [""] * n
    for key in GEOMETRY_KEYS:
        cols[key] = geometry[key]
    cols["inner_strands"] = np.full(n, problem.sweep.spec.search.inner_strands, dtype=np.int64)
    for key in MEMBER_COLUMNS:
        v = getattr(problem.member, key)
        cols[key] = np.full(n, np.nan if v is None else float(v))
    for key, v in values.items():
        cols[key] = np.asarray(v, dtype=float)
    for key in CONSTRAINTS:
        cols[f"margin_{key}"] = margins[key]
    cols["feasible"] = np.all(np.column_stack([margins[c] for c in CONSTRAINTS]) >= 0, axis=1)
    df = pd.DataFrame(cols)
    if n:
        f = objective_matrix(values, problem.objectives)
        order = np.lexsort(f.T[::-1])
        df = df.iloc[order].reset_index(drop=True)
    return df


def evaluated_frame(problem: MemberProblem, rows: np.ndarray) -> pd.DataFrame:
    """Every evaluated design of a task: decoded variables, objectives, margins, feasibility."""
    n_var, n_obj = problem.n_var, problem.n_obj
    x, f, g = rows[:, :n_var], rows[:, n_var:n_var + n_obj], rows[:, n_var + n_obj:]
    computed, actual, idx = problem.designs(x)
    geometry = design_geometry(actual)
    cols: dict[str, object] = {"member": [problem.member.name] * len(x),
                               "catalog": [problem.catalog.name] * len(x)}
    for table in SLOT_NAMES:
        ids = problem.layout.material_ids.get(table, ())
        cols[table] = [ids[i] for i in idx[table]] if ids else [""] * len(x)
    for key in GEOMETRY_KEYS:
        cols[key] = geometry[key]
    if "void_fraction" in computed.dielectric:  # foamed dielectric by void fraction
        cols["void_fraction"] = np.broadcast_to(computed.dielectric["void_fraction"],
                                                len(x)).astype(float)
    for j, name in enumerate(problem.objectives):
        o = OBJECTIVES[name]
        cols[o.column] = -f[:, j] if o.maximise else f[:, j]
    for j, c in enumerate(CONSTRAINTS):
        cols[f"margin_{c}"] = -g[:, j]
    cols["feasible"] = np.all(g <= 0.0, axis=1)
    return pd.DataFrame(cols)


def write_outputs(sweep, settings, run_dir, results, started, wall, resumed=0, forced=False,
                  time_budget_s=None):
    """Assemble the front from the task results (in task order) and write the run files."""
    fronts, evaluated = [], []
    members = {m.name: m for m in sweep.spec.member}
    for r in results:
        problem = MemberProblem(sweep, members[r.member], r.catalog, seed=r.seed)
        fronts.append(r.front if r.front is not None else front_frame(problem, r.x_front))
        if r.evaluated is not None:
            evaluated.append(evaluated_frame(problem, r.evaluated))
    front = pd.concat(fronts, ignore_index=True)
    counts = {"tasks": len(results), "evaluations": int(sum(r.evaluations for r in results)),
              "front_rows": int(len(front)),
              "front_rows_per_task": {f"{r.member}/{r.catalog}": int(len(df))
                                      for r, df in zip(results, fronts)}}
    provenance = front_provenance(sweep, settings, counts)
    write_parquet(front, run_dir / FRONT_FILE, provenance)
    if settings.record_evaluated:
        write_parquet(pd.concat(evaluated, ignore_index=True), run_dir / EVALUATED_FILE,
                      provenance)
    run_info = {
        **{k: v for k, v in provenance.items() if k != "sweep_text"},
        "sweep_path": str(sweep.path.resolve()),
        "catalog_paths": [str(c.path.resolve()) for c in sweep.catalogs],
        "started_utc": started.isoformat(timespec="seconds"),
        "finished_utc": datetime.now(timezone.utc).isoformat(timespec="seconds"),
        "wall_seconds": round(wall, 3),
        "tasks_taken_from_earlier_session": resumed,
        "resumed_with_force": forced,
        "time_budget_s": time_budget_s,
        "command": " ".join(["cablefam"] + sys.argv[1:]),
        "tasks": [{"member": r.member, "catalog": r.catalog, "seed": r.seed,
                   "generations": r.generations, "evaluations": r.evaluations,
                   "feasible_evaluated": r.feasible_evaluated, "front_rows": len(df),
                   "seconds": round(r.seconds, 3),
                   "physics_seconds": round(r.physics_seconds, 3)}
                  for r, df in zip(results, fronts)],
        "files": [FRONT_FILE] + ([EVALUATED_FILE] if settings.record_evaluated else []),
        "cautions": " ".join(CAUTION_LINES),
    }
    write_text_atomic(run_dir / RUN_FILE, json.dumps(run_info, indent=2) + "\n")
