"""Run a whole sweep (every member x catalog) and write its run folder.

``runs/<name>/`` receives ``front.parquet`` (the feasible Pareto set of every task, every
quantity of ``cablefam inspect --json`` plus the constraint margins), ``evaluated.parquet`` when
asked for, ``run.json`` (provenance, timings, counts) and ``inputs/`` (copies of the sweep file
and catalogs, so that a run folder explains itself). Every file is written to a temporary name
and renamed.
"""

from __future__ import annotations

import json
import platform
import sys
import time
from dataclasses import dataclass
from datetime import datetime, timezone
from importlib import metadata
from pathlib import Path

import numpy as np
import pandas as pd
import pyarrow as pa
import pyarrow.parquet as pq

from optimizer.atomic import atomic_path, write_text_atomic
from optimizer.cautions import CAUTION_LINES
from optimizer.constraints import CONSTRAINTS
from optimizer.errors import InputError
from optimizer.objectives import OBJECTIVES, objective_matrix
from optimizer.problem import MATERIAL_TABLES, MemberProblem
from optimizer.search import TaskResult, run_task, task_seed
from optimizer.sweep_spec import GEOMETRY_KEYS, Sweep

FRONT_FILE = "front.parquet"
EVALUATED_FILE = "evaluated.parquet"
RUN_FILE = "run.json"
#: Parquet key-value metadata key holding the provenance JSON.
METADATA_KEY = b"cablefam"
_PACKAGES = ("cablefam", "numpy", "scipy", "pymoo", "pandas", "pyarrow", "pydantic")
#: Operating-point columns copied from the member into every row.
MEMBER_COLUMNS = ("impedance_ohm", "impedance_tolerance_ohm", "frequency_hz", "power_w",
                  "peak_voltage_v", "ambient_c", "field_safety_factor")


@dataclass(frozen=True)
class SweepSettings:
    """Effective settings of a run: the sweep file's, with command-line overrides."""

    seed: int
    generations: int
    population: int
    record_evaluated: bool = False


def package_versions() -> dict[str, str]:
    out = {"python": platform.python_version()}
    for name in _PACKAGES:
        try:
            out[name] = metadata.version(name)
        except metadata.PackageNotFoundError:
            out[name] = "unknown"
    return out


def front_frame(problem: MemberProblem, x: np.ndarray) -> pd.DataFrame:
    """Rows of a task's front: ids, geometry, operating point, every quantity, margins."""
    values, margins, idx = problem.evaluate_designs(x, include_max_power=True)
    geometry, _ = problem.layout.decode(x)
    n = len(x)
    cols: dict[str, object] = {"member": [problem.member.name] * n,
                               "catalog": [problem.catalog.name] * n}
    for table in MATERIAL_TABLES:
        ids = problem.layout.material_ids.get(table, ())
        cols[table] = [ids[i] for i in idx[table]] if ids else [""] * n
    for key in GEOMETRY_KEYS:
        cols[key] = geometry[key]
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
    geometry, idx = problem.layout.decode(x)
    cols: dict[str, object] = {"member": [problem.member.name] * len(x),
                               "catalog": [problem.catalog.name] * len(x)}
    for table in MATERIAL_TABLES:
        ids = problem.layout.material_ids.get(table, ())
        cols[table] = [ids[i] for i in idx[table]] if ids else [""] * len(x)
    for key in GEOMETRY_KEYS:
        cols[key] = geometry[key]
    for j, name in enumerate(problem.objectives):
        o = OBJECTIVES[name]
        cols[o.column] = -f[:, j] if o.maximise else f[:, j]
    for j, c in enumerate(CONSTRAINTS):
        cols[f"margin_{c}"] = -g[:, j]
    cols["feasible"] = np.all(g <= 0.0, axis=1)
    return pd.DataFrame(cols)


def write_parquet(df: pd.DataFrame, path: Path, provenance: dict) -> None:
    """Write a frame with the provenance as Parquet key-value metadata, atomically."""
    table = pa.Table.from_pandas(df, preserve_index=False)
    meta = dict(table.schema.metadata or {})
    meta[METADATA_KEY] = json.dumps(provenance, sort_keys=True).encode()
    table = table.replace_schema_metadata(meta)
    with atomic_path(path) as tmp:
        pq.write_table(table, tmp)


def read_provenance(path) -> dict:
    """The provenance stored in a cablefam Parquet file."""
    meta = pq.read_schema(path).metadata or {}
    if METADATA_KEY not in meta:
        raise InputError(f"{path}: not a cablefam Parquet file (no provenance metadata)")
    return json.loads(meta[METADATA_KEY])


def _provenance(sweep: Sweep, settings: SweepSettings, counts: dict) -> dict:
    """Provenance without timings or absolute paths: equal runs give equal bytes."""
    return {
        "format": "cablefam-front/1",
        "sweep_name": sweep.spec.name,
        "sweep_file": sweep.path.name,
        "sweep_sha256": _sha256_text(sweep.text),
        "sweep_text": sweep.text,
        "catalogs": [{"name": c.name, "file": c.path.name, "sha256": c.sha256}
                     for c in sweep.catalogs],
        "seed": settings.seed,
        "generations": settings.generations,
        "population": settings.population,
        "objectives": list(sweep.spec.search.objectives),
        "members": [m.model_dump() for m in sweep.spec.member],
        "packages": package_versions(),
        "counts": counts,
    }


def _sha256_text(text: str) -> str:
    import hashlib
    return hashlib.sha256(text.encode("utf-8")).hexdigest()


def prepare_run_folder(sweep: Sweep, out_dir: Path, overwrite: bool) -> Path:
    run_dir = Path(out_dir) / sweep.spec.name
    if (run_dir / FRONT_FILE).exists() and not overwrite:
        raise InputError(f"run folder {run_dir} already holds a run; pass --overwrite to "
                         "replace it, or change `name` in the sweep file")
    (run_dir / "inputs").mkdir(parents=True, exist_ok=True)
    write_text_atomic(run_dir / "inputs" / "sweep.toml", sweep.text)
    for c in sweep.catalogs:
        write_text_atomic(run_dir / "inputs" / f"catalog-{c.name}.toml",
                          c.path.read_text(encoding="utf-8"))
    return run_dir


def run_sweep(sweep: Sweep, out_dir="runs", *, seed=None, generations=None, population=None,
              record_evaluated=False, overwrite=False, progress=None) -> Path:
    """Run every member x catalog task of ``sweep`` and write the run folder; return its path."""
    spec = sweep.spec
    settings = SweepSettings(
        seed=spec.seed if seed is None else int(seed),
        generations=spec.search.generations if generations is None else int(generations),
        population=spec.search.population if population is None else int(population),
        record_evaluated=record_evaluated)
    if settings.generations < 1 or settings.population < 4:
        raise InputError(f"--generations = {settings.generations}, --population = "
                         f"{settings.population}: need generations >= 1 and population >= 4")
    run_dir = prepare_run_folder(sweep, out_dir, overwrite)
    started = datetime.now(timezone.utc)
    t0 = time.perf_counter()
    tasks = [(m, c.name) for m in spec.member for c in sweep.catalogs]
    if progress is not None:
        progress.start(len(tasks))
    fronts, evaluated, results = [], [], []
    for member, catalog_name in tasks:
        s = task_seed(settings.seed, member.name, catalog_name)
        result: TaskResult = run_task(sweep, member, catalog_name, s, settings.generations,
                                      settings.population, record_evaluated, progress)
        problem = MemberProblem(sweep, member, catalog_name)
        fronts.append(front_frame(problem, result.x_front))
        if result.evaluated is not None:
            evaluated.append(evaluated_frame(problem, result.evaluated))
        results.append(result)
        if progress is not None:
            progress.task_done(result, len(fronts[-1]))
    front = pd.concat(fronts, ignore_index=True)
    counts = {"tasks": len(tasks), "evaluations": int(sum(r.evaluations for r in results)),
              "front_rows": int(len(front)),
              "front_rows_per_task": {f"{r.member}/{r.catalog}": int(len(df))
                                      for r, df in zip(results, fronts)}}
    provenance = _provenance(sweep, settings, counts)
    write_parquet(front, run_dir / FRONT_FILE, provenance)
    if record_evaluated:
        write_parquet(pd.concat(evaluated, ignore_index=True), run_dir / EVALUATED_FILE,
                      provenance)
    wall = time.perf_counter() - t0
    run_info = {
        **{k: v for k, v in provenance.items() if k != "sweep_text"},
        "sweep_path": str(sweep.path.resolve()),
        "catalog_paths": [str(c.path.resolve()) for c in sweep.catalogs],
        "started_utc": started.isoformat(timespec="seconds"),
        "finished_utc": datetime.now(timezone.utc).isoformat(timespec="seconds"),
        "wall_seconds": round(wall, 3),
        "command": " ".join(["cablefam"] + sys.argv[1:]),
        "tasks": [{"member": r.member, "catalog": r.catalog, "seed": r.seed,
                   "generations": r.generations, "evaluations": r.evaluations,
                   "feasible_evaluated": r.feasible_evaluated, "front_rows": len(df),
                   "seconds": round(r.seconds, 3),
                   "physics_seconds": round(r.physics_seconds, 3)}
                  for r, df in zip(results, fronts)],
        "files": [FRONT_FILE] + ([EVALUATED_FILE] if record_evaluated else []),
        "cautions": " ".join(CAUTION_LINES),
    }
    write_text_atomic(run_dir / RUN_FILE, json.dumps(run_info, indent=2) + "\n")
    return run_dir
