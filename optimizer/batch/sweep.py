"""Run a whole sweep (every member x catalog) and write its run folder.

``runs/<name>/`` receives ``front.parquet`` (the feasible Pareto set of every task, every
quantity of ``cablefam inspect --json`` plus the constraint margins), ``evaluated.parquet`` when
asked for, ``run.json`` (provenance, timings, counts) and ``inputs/`` (copies of the sweep file
and catalogs, so that a run folder explains itself). Every file is written to a temporary name
and renamed.
"""

from __future__ import annotations

import json
import shutil
import time
from dataclasses import replace
from datetime import datetime, timezone
from pathlib import Path

from cablefam.optimizer.atomic import write_text_atomic
from cablefam.optimizer.batch.assemble import write_outputs
from cablefam.optimizer.batch.provenance import run_state, sha256_text
from cablefam.optimizer.batch.settings import SweepSettings
from cablefam.optimizer.batch.task_store import TaskStore
from cablefam.optimizer.errors import InputError
from cablefam.optimizer.inputs.sweep_spec import Sweep
from cablefam.optimizer.run_folder.files import (EVALUATED_FILE, FRONT_FILE, RUN_FILE,
                                                 STATE_FILE, read_json)
from cablefam.optimizer.search.budget import MIN_DENSE_EVALUATIONS
from cablefam.optimizer.search.task import TaskResult




class SweepInterrupted(Exception):
    """The sweep stopped on SIGINT/SIGTERM; checkpoints are on disk."""

    def __init__(self, run_dir: Path, signal_name: str | None, on_cluster: bool = False):
        kept = ("finished tasks kept (cluster tasks write no checkpoints)" if on_cluster
                else "checkpoints written")
        super().__init__(f"{run_dir}: interrupted ({signal_name or 'stop requested'}); "
                         f"{kept}. Continue with: cablefam resume {run_dir}")
        self.run_dir = run_dir


def read_run_state(run_dir) -> dict:
    return read_json(Path(run_dir) / STATE_FILE,
                     f"{run_dir}: nothing to resume (no {STATE_FILE})")


def check_unchanged(state: dict, sweep: Sweep, force: bool) -> None:
    """Refuse to resume when the sweep file or a catalog changed since the run started."""
    changed = []
    if sha256_text(sweep.text) != state["sweep_sha256"]:
        changed.append(f"sweep file {sweep.path}")
    recorded = {c["name"]: c["sha256"] for c in state["catalogs"]}
    for c in sweep.catalogs:
        if recorded.get(c.name) != c.sha256:
            changed.append(f"catalog {c.name!r} ({c.path})")
    if set(recorded) != {c.name for c in sweep.catalogs}:
        changed.append("the list of catalogs")
    if changed and not force:
        raise InputError("cannot resume: " + ", ".join(changed) + " changed since the run "
                         "started (SHA-256 differs); pass force=True to resume anyway")


def prepare_run_folder(sweep: Sweep, out_dir: Path, overwrite: bool, settings: SweepSettings,
                       resume: bool) -> Path:
    run_dir = Path(out_dir) / sweep.spec.name
    started = (run_dir / STATE_FILE).exists() or (run_dir / FRONT_FILE).exists()
    if started and not (overwrite or resume):
        raise InputError(f"run folder {run_dir} already holds a run; pass resume=True to "
                         "continue it, overwrite=True to replace it, or change `name` in the "
                         "sweep file")
    if overwrite and not resume:
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
                          json.dumps(run_state(sweep, settings), indent=2) + "\n")
    return run_dir


def _settings(sweep: Sweep, seed, generations, population, record_evaluated,
              evaluations_per_task=None) -> SweepSettings:
    spec = sweep.spec
    settings = SweepSettings(
        seed=spec.seed if seed is None else int(seed),
        generations=spec.search.generations if generations is None else int(generations),
        population=spec.search.population if population is None else int(population),
        record_evaluated=record_evaluated,
        evaluations_per_task=(spec.search.evaluations_per_task if evaluations_per_task is None
                              else int(evaluations_per_task)))
    if settings.generations < 1 or settings.population < 4:
        raise InputError(f"generations = {settings.generations}, population = "
                         f"{settings.population}: need generations >= 1 and population >= 4")
    check_budget(sweep, settings)
    return settings


def check_budget(sweep: Sweep, settings: SweepSettings) -> None:
    """The evaluation budget must leave room for the dense stage before the genetic one."""
    given = settings.evaluations_per_task
    genetic = settings.population * settings.generations
    if given is not None and given < genetic + MIN_DENSE_EVALUATIONS:
        raise InputError(f"{sweep.path}: search.evaluations_per_task = {given}: must be at "
                         f"least population x generations + {MIN_DENSE_EVALUATIONS} = "
                         f"{genetic + MIN_DENSE_EVALUATIONS} (population {settings.population}, "
                         f"generations {settings.generations})")


def longest_first(sweep: Sweep, specs):
    """Tasks in the order to hand them to workers: the costliest first, so that no worker
    is left with a long task at the end (results are assembled in task order regardless).
    Cost estimate: a Monte Carlo yield constraint, then the number of material combinations."""
    members = {m.name: m for m in sweep.spec.member}
    tol = sweep.spec.tolerance
    monte_carlo = tol is not None and tol.method == "monte-carlo"

    def cost(spec):
        m = members[spec.member]
        combos = 1
        for ids in sweep.materials[spec.catalog].values():
            combos *= max(1, len(ids))
        return (monte_carlo and m.min_impedance_yield is not None, combos)

    return sorted(specs, key=cost, reverse=True)


def run_sweep(sweep: Sweep, out_dir="runs", *, seed=None, generations=None, population=None,
              record_evaluated=False, overwrite=False, progress=None, resume=False,
              force=False, workers=1, scheduler=None, checkpoint_every=None,
              checkpoint_seconds=30.0, time_budget_s=None, evaluations_per_task=None) -> Path:
    """Run every member x catalog task of ``sweep`` and write the run folder; return its path.

    Finished tasks are stored at once under ``tasks/``; with ``resume`` they are not
    recomputed and unfinished ones continue from their last checkpoint. ``workers`` > 1 runs
    tasks in local processes; ``scheduler`` (``tcp://host:port``) on a Dask cluster. The
    front does not depend on either. ``time_budget_s`` spreads a wall-clock budget over the
    tasks still to run: each task's genetic stage runs until its share is used (the front then
    depends on the machine's speed and is not byte-reproducible).
    """
    from cablefam.optimizer.batch.workers import (StopFlag, make_task_specs, run_dask, run_local_processes,
                                     run_serial)
    from cablefam.optimizer.search.task import TaskInterrupted
    from cablefam.optimizer.inputs.sweep_spec import sweep_payload

    settings = _settings(sweep, seed, generations, population, record_evaluated,
                         evaluations_per_task)
    run_dir = Path(out_dir) / sweep.spec.name
    if resume and (run_dir / STATE_FILE).exists():
        state = read_run_state(run_dir)
        check_unchanged(state, sweep, force)
        recorded = SweepSettings(**state["settings"])
        asked = (seed, generations, population)
        if any(v is not None for v in asked) and recorded != settings:
            raise InputError(f"seed/generations/population: differ from the run being "
                             f"resumed ({state['settings']}); leave them out to resume")
        settings = recorded
    run_dir = prepare_run_folder(sweep, out_dir, overwrite, settings, resume)
    started = datetime.now(timezone.utc)
    t0 = time.perf_counter()
    specs = make_task_specs(sweep, settings, run_dir, checkpoint_every, checkpoint_seconds)
    n_todo = sum(TaskStore(run_dir, s.member, s.catalog).read_result() is None for s in specs)
    if time_budget_s is not None:
        if not time_budget_s > 0:
            raise InputError(f"time_budget_s = {time_budget_s!r}: must be > 0")
        lanes = max(1, workers) if not scheduler else max(1, n_todo)
        share = float(time_budget_s) * min(lanes, max(n_todo, 1)) / max(n_todo, 1)
        specs = [replace(s, time_share_s=share) for s in specs]
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
            run_local_processes(payload, longest_first(sweep, todo), on_result, progress, stop,
                                workers)
        else:
            run_serial(payload, todo, on_result, progress, stop)
    except TaskInterrupted:
        raise SweepInterrupted(run_dir, stop.signal_name, on_cluster=bool(scheduler)) from None
    finally:
        stop.uninstall()
    ordered = [results[(s.member, s.catalog)] for s in specs]
    write_outputs(sweep, settings, run_dir, ordered, started, time.perf_counter() - t0,
                  resumed=len(specs) - len(todo), forced=force, time_budget_s=time_budget_s)
    return run_dir


def resume_run(run_dir, *, force=False, progress=None, workers=1, scheduler=None,
               checkpoint_every=None, checkpoint_seconds=30.0, time_budget_s=None) -> Path:
    """Continue a killed or interrupted run from its folder (``cablefam resume RUN``)."""
    from cablefam.optimizer.inputs.sweep_spec import load_sweep

    run_dir = Path(run_dir)
    state = read_run_state(run_dir)
    sweep_path = Path(state["sweep_path"])
    if not sweep_path.is_file():
        raise InputError(f"{run_dir}: the run's sweep file {sweep_path} is gone; run the "
                         "sweep from its new place with resume=True")
    sweep = load_sweep(sweep_path)
    if Path(run_dir).resolve().name != sweep.spec.name:
        raise InputError(f"{run_dir}: folder name differs from the sweep's name "
                         f"{sweep.spec.name!r}")
    st = state["settings"]
    return run_sweep(sweep, run_dir.parent, seed=None, generations=None, population=None,
                     record_evaluated=st["record_evaluated"], progress=progress, resume=True,
                     force=force, workers=workers, scheduler=scheduler,
                     checkpoint_every=checkpoint_every, checkpoint_seconds=checkpoint_seconds,
                     time_budget_s=time_budget_s)
