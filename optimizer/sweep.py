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
from optimizer.checkpoint import TaskStore
from optimizer.search import TaskResult
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


STATE_FILE = "run-state.json"


class SweepInterrupted(Exception):
    """The sweep stopped on SIGINT/SIGTERM; checkpoints are on disk."""

    def __init__(self, run_dir: Path, signal_name: str | None, on_cluster: bool = False):
        kept = ("finished tasks kept (cluster tasks write no checkpoints)" if on_cluster
                else "checkpoints written")
        super().__init__(f"{run_dir}: interrupted ({signal_name or 'stop requested'}); "
                         f"{kept}. Continue with: cablefam resume {run_dir}")
        self.run_dir = run_dir


def _run_state(sweep: Sweep, settings: SweepSettings) -> dict:
    return {"format": "cablefam-run-state/1",
            "sweep_path": str(sweep.path.resolve()),
            "sweep_sha256": _sha256_text(sweep.text),
            "catalogs": [{"name": c.name, "path": str(c.path.resolve()), "sha256": c.sha256}
                         for c in sweep.catalogs],
            "settings": {"seed": settings.seed, "generations": settings.generations,
                         "population": settings.population,
                         "record_evaluated": settings.record_evaluated}}


def read_json(path: Path, missing: str) -> dict:
    """A JSON file of a run folder; ``missing`` is the message when it does not exist."""
    try:
        return json.loads(path.read_text(encoding="utf-8"))
    except FileNotFoundError:
        raise InputError(missing) from None
    except (json.JSONDecodeError, UnicodeDecodeError) as exc:
        raise InputError(f"{path}: corrupt JSON ({exc})") from None


def read_run_state(run_dir) -> dict:
    return read_json(Path(run_dir) / STATE_FILE,
                     f"{run_dir}: nothing to resume (no {STATE_FILE})")


def check_unchanged(state: dict, sweep: Sweep, force: bool) -> None:
    """Refuse to resume when the sweep file or a catalog changed since the run started."""
    changed = []
    if _sha256_text(sweep.text) != state["sweep_sha256"]:
        changed.append(f"sweep file {sweep.path}")
    recorded = {c["name"]: c["sha256"] for c in state["catalogs"]}
    for c in sweep.catalogs:
        if recorded.get(c.name) != c.sha256:
            changed.append(f"catalog {c.name!r} ({c.path})")
    if set(recorded) != {c.name for c in sweep.catalogs}:
        changed.append("the list of catalogs")
    if changed and not force:
        raise InputError("cannot resume: " + ", ".join(changed) + " changed since the run "
                         "started (SHA-256 differs); pass --force to resume anyway")


def prepare_run_folder(sweep: Sweep, out_dir: Path, overwrite: bool, settings: SweepSettings,
                       resume: bool) -> Path:
    run_dir = Path(out_dir) / sweep.spec.name
    started = (run_dir / STATE_FILE).exists() or (run_dir / FRONT_FILE).exists()
    if started and not (overwrite or resume):
        raise InputError(f"run folder {run_dir} already holds a run; pass --resume to continue "
                         "it, --overwrite to replace it, or change `name` in the sweep file")
    if overwrite and not resume:
        import shutil
        for sub in ("tasks", "inputs"):
            shutil.rmtree(run_dir / sub, ignore_errors=True)
        for f in (FRONT_FILE, EVALUATED_FILE, RUN_FILE, STATE_FILE):
            (run_dir / f).unlink(missing_ok=True)
    (run_dir / "inputs").mkdir(parents=True, exist_ok=True)
    write_text_atomic(run_dir / "inputs" / "sweep.toml", sweep.text)
    for c in sweep.catalogs:
        write_text_atomic(run_dir / "inputs" / f"catalog-{c.name}.toml",
                          c.path.read_bytes().decode("utf-8"))
    if not (resume and (run_dir / STATE_FILE).exists()):
        write_text_atomic(run_dir / STATE_FILE,
                          json.dumps(_run_state(sweep, settings), indent=2) + "\n")
    return run_dir


def _settings(sweep: Sweep, seed, generations, population, record_evaluated) -> SweepSettings:
    spec = sweep.spec
    settings = SweepSettings(
        seed=spec.seed if seed is None else int(seed),
        generations=spec.search.generations if generations is None else int(generations),
        population=spec.search.population if population is None else int(population),
        record_evaluated=record_evaluated)
    if settings.generations < 1 or settings.population < 4:
        raise InputError(f"--generations = {settings.generations}, --population = "
                         f"{settings.population}: need generations >= 1 and population >= 4")
    return settings


def run_sweep(sweep: Sweep, out_dir="runs", *, seed=None, generations=None, population=None,
              record_evaluated=False, overwrite=False, progress=None, resume=False,
              force=False, workers=1, scheduler=None, checkpoint_every=None,
              checkpoint_seconds=30.0) -> Path:
    """Run every member x catalog task of ``sweep`` and write the run folder; return its path.

    Finished tasks are stored at once under ``tasks/``; with ``resume`` they are not
    recomputed and unfinished ones continue from their last checkpoint. ``workers`` > 1 runs
    tasks in local processes; ``scheduler`` (``tcp://host:port``) on a Dask cluster. The
    front does not depend on either.
    """
    from optimizer.execution import (StopFlag, make_task_specs, run_dask, run_local_processes,
                                     run_serial)
    from optimizer.search import TaskInterrupted
    from optimizer.sweep_spec import sweep_payload

    settings = _settings(sweep, seed, generations, population, record_evaluated)
    run_dir = Path(out_dir) / sweep.spec.name
    if resume and (run_dir / STATE_FILE).exists():
        state = read_run_state(run_dir)
        check_unchanged(state, sweep, force)
        recorded = SweepSettings(**state["settings"])
        asked = (seed, generations, population)
        if any(v is not None for v in asked) and recorded != settings:
            raise InputError(f"--seed/--generations/--population differ from the run being "
                             f"resumed ({state['settings']}); leave them out to resume")
        settings = recorded
    run_dir = prepare_run_folder(sweep, out_dir, overwrite, settings, resume)
    started = datetime.now(timezone.utc)
    t0 = time.perf_counter()
    specs = make_task_specs(sweep, settings, run_dir, checkpoint_every, checkpoint_seconds)
    results: dict[tuple[str, str], TaskResult] = {}
    for spec in specs:
        stored = TaskStore(run_dir, spec.member, spec.catalog).read_result()
        if stored is not None:
            results[(spec.member, spec.catalog)] = stored
    todo = [s for s in specs if (s.member, s.catalog) not in results]
    if progress is not None:
        progress.start(len(specs), already_done=len(specs) - len(todo))

    def on_result(result):
        results[(result.member, result.catalog)] = result
        if progress is not None:
            progress.task_done(result, len(result.x_front))

    payload = json.dumps(sweep_payload(sweep), sort_keys=True)
    stop = StopFlag().install()
    try:
        if scheduler:
            run_dask(payload, todo, on_result, progress, stop, scheduler)
        elif workers > 1 and len(todo) > 1:
            run_local_processes(payload, todo, on_result, progress, stop, workers)
        else:
            run_serial(payload, todo, on_result, progress, stop)
    except TaskInterrupted:
        raise SweepInterrupted(run_dir, stop.signal_name, on_cluster=bool(scheduler)) from None
    finally:
        stop.uninstall()
    ordered = [results[(s.member, s.catalog)] for s in specs]
    write_outputs(sweep, settings, run_dir, ordered, started, time.perf_counter() - t0,
                  resumed=len(specs) - len(todo), forced=force)
    return run_dir


def write_outputs(sweep, settings, run_dir, results, started, wall, resumed=0, forced=False):
    """Assemble the front from the task results (in task order) and write the run files."""
    fronts, evaluated = [], []
    members = {m.name: m for m in sweep.spec.member}
    for r in results:
        problem = MemberProblem(sweep, members[r.member], r.catalog, seed=r.seed)
        fronts.append(front_frame(problem, r.x_front))
        if r.evaluated is not None:
            evaluated.append(evaluated_frame(problem, r.evaluated))
    front = pd.concat(fronts, ignore_index=True)
    counts = {"tasks": len(results), "evaluations": int(sum(r.evaluations for r in results)),
              "front_rows": int(len(front)),
              "front_rows_per_task": {f"{r.member}/{r.catalog}": int(len(df))
                                      for r, df in zip(results, fronts)}}
    provenance = _provenance(sweep, settings, counts)
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


def resume_run(run_dir, *, force=False, progress=None, workers=1, scheduler=None,
               checkpoint_every=None, checkpoint_seconds=30.0) -> Path:
    """Continue a killed or interrupted run from its folder (``cablefam resume RUN``)."""
    from optimizer.sweep_spec import load_sweep

    run_dir = Path(run_dir)
    state = read_run_state(run_dir)
    sweep_path = Path(state["sweep_path"])
    if not sweep_path.is_file():
        raise InputError(f"{run_dir}: the run's sweep file {sweep_path} is gone; resume with "
                         "`cablefam sweep SWEEP.toml --resume` from its new place")
    sweep = load_sweep(sweep_path)
    if Path(run_dir).resolve().name != sweep.spec.name:
        raise InputError(f"{run_dir}: folder name differs from the sweep's name "
                         f"{sweep.spec.name!r}")
    st = state["settings"]
    return run_sweep(sweep, run_dir.parent, seed=None, generations=None, population=None,
                     record_evaluated=st["record_evaluated"], progress=progress, resume=True,
                     force=force, workers=workers, scheduler=scheduler,
                     checkpoint_every=checkpoint_every, checkpoint_seconds=checkpoint_seconds)
