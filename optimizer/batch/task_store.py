"""Checkpoints and finished-task results, as plain data (Parquet + JSON, never pickle).

Layout inside a run folder::

    tasks/<member>__<catalog>/result.parquet      finished task: archive decision vectors
    tasks/<member>__<catalog>/result.json         its counters and timings (written last)
    tasks/<member>__<catalog>/checkpoint.json     last checkpoint: counters, generator state,
                                                  the names of its Parquet files (written last)
    tasks/<member>__<catalog>/ckpt-<gen>-*.parquet  population, archive, evaluated rows

A JSON file is the commit point of what it names: it is renamed into place after its Parquet
files are complete, so a process killed at any moment leaves either the previous or the new
state visible, never half of one. Restoring a checkpoint into a freshly set-up pymoo algorithm
reproduces the uninterrupted run exactly (population with every attribute the survival set,
the generator's bit state, iteration and evaluation counters, NSGA-III's normalisation; see
:mod:`cablefam.optimizer.search.pymoo_state`).
"""

from __future__ import annotations

import json
from pathlib import Path

import numpy as np
import pyarrow as pa
import pyarrow.parquet as pq

from cablefam.optimizer.atomic import atomic_path, write_text_atomic
from cablefam.optimizer.search.pymoo_state import TaskState
from cablefam.optimizer.search.task import TaskResult

FORMAT = "cablefam-checkpoint/1"
#: The finished task's front rows, assembled by the process that ran it.
FRONT_ROWS = "front-rows.parquet"


def task_id(member: str, catalog: str) -> str:
    """Folder name of a task (member and catalog names are restricted to safe characters)."""
    return f"{member}__{catalog}"


def _matrix_table(named: dict[str, np.ndarray]) -> pa.Table:
    cols = {}
    for name, m in named.items():
        m = np.asarray(m, dtype=float)
        if m.ndim == 1:
            m = m[:, None]
        for j in range(m.shape[1]):
            cols[f"{name}{j}"] = m[:, j]
    return pa.table(cols) if cols else pa.table({"_empty": np.zeros(0)})


def _write_matrices(path: Path, named: dict[str, np.ndarray]) -> None:
    with atomic_path(path) as tmp:
        pq.write_table(_matrix_table(named), tmp)


def _read_matrices(path: Path, widths: dict[str, int]) -> dict[str, np.ndarray]:
    table = pq.read_table(path)
    out = {}
    for name, width in widths.items():
        cols = [table.column(f"{name}{j}").to_numpy() for j in range(width)]
        out[name] = np.column_stack(cols) if cols else np.empty((table.num_rows, 0))
    return out


class TaskStore:
    """Files of one task inside a run folder."""

    def __init__(self, run_dir, member: str, catalog: str):
        self.dir = Path(run_dir) / "tasks" / task_id(member, catalog)

    # ------------------------------------------------------------------ checkpoints
    def write_checkpoint(self, state: TaskState) -> None:
        self.dir.mkdir(parents=True, exist_ok=True)
        stem = f"ckpt-{state.generation:07d}"
        files = {"population": f"{stem}-population.parquet",
                 "archive": f"{stem}-archive.parquet"}
        _write_matrices(self.dir / files["population"],
                        {**state.population, **{f"data_{k}": v
                                                for k, v in state.population_data.items()}})
        _write_matrices(self.dir / files["archive"], {"x": state.archive_x, "f": state.archive_f})
        if state.evaluated is not None:
            files["evaluated"] = f"{stem}-evaluated.parquet"
            _write_matrices(self.dir / files["evaluated"], {"e": state.evaluated})
        shapes = {k: 1 if np.ndim(v) == 1 else int(np.shape(v)[1])
                  for k, v in state.population.items()}
        doc = {"format": FORMAT, "generation": state.generation, "counters": state.counters,
               "rng_state": state.rng_state, "files": files, "population_widths": shapes,
               "population_data": {k: str(np.asarray(v).dtype)
                                   for k, v in sorted(state.population_data.items())},
               "normalisation": state.normalisation,
               "archive_widths": [int(state.archive_x.shape[1]), int(state.archive_f.shape[1])],
               "evaluated_width": None if state.evaluated is None else int(
                   state.evaluated.shape[1])}
        write_text_atomic(self.dir / "checkpoint.json", json.dumps(doc) + "\n")
        self._remove_stale({*files.values()})

    def _remove_stale(self, keep: set[str]) -> None:
        for f in self.dir.glob("ckpt-*.parquet"):
            if f.name not in keep:
                f.unlink(missing_ok=True)

    def read_checkpoint(self) -> TaskState | None:
        path = self.dir / "checkpoint.json"
        if not path.is_file():
            return None
        doc = json.loads(path.read_text(encoding="utf-8"))
        files = doc["files"]
        widths = dict(doc["population_widths"])
        widths.update({f"data_{k}": 1 for k in doc["population_data"]})
        pop = _read_matrices(self.dir / files["population"], widths)
        data = {k: pop.pop(f"data_{k}")[:, 0].astype(dtype)
                for k, dtype in doc["population_data"].items()}
        nx, nf = doc["archive_widths"]
        arch = _read_matrices(self.dir / files["archive"], {"x": nx, "f": nf})
        evaluated = None
        if "evaluated" in files:
            evaluated = _read_matrices(self.dir / files["evaluated"],
                                       {"e": doc["evaluated_width"]})["e"]
        pop["CV"] = pop["CV"].reshape(-1, 1)
        return TaskState(generation=doc["generation"], counters=doc["counters"],
                         rng_state=doc["rng_state"], population=pop, population_data=data,
                         normalisation=doc["normalisation"], archive_x=arch["x"],
                         archive_f=arch["f"], evaluated=evaluated)

    # ------------------------------------------------------------------ finished tasks
    def write_result(self, result) -> None:
        """Store a finished task at once: Parquet first, then the JSON that commits it."""
        self.dir.mkdir(parents=True, exist_ok=True)
        _write_matrices(self.dir / "result.parquet", {"x": result.x_front})
        if result.evaluated is not None:
            _write_matrices(self.dir / "result-evaluated.parquet", {"e": result.evaluated})
        if result.front is not None:
            with atomic_path(self.dir / FRONT_ROWS) as tmp:
                pq.write_table(pa.Table.from_pandas(result.front, preserve_index=False), tmp)
        doc = {"format": FORMAT, "member": result.member, "catalog": result.catalog,
               "seed": result.seed, "evaluations": result.evaluations,
               "generations": result.generations, "seconds": result.seconds,
               "physics_seconds": result.physics_seconds,
               "feasible_evaluated": result.feasible_evaluated,
               "n_var": int(result.x_front.shape[1]),
               "evaluated_width": None if result.evaluated is None else int(
                   result.evaluated.shape[1])}
        write_text_atomic(self.dir / "result.json", json.dumps(doc) + "\n")
        for f in self.dir.glob("ckpt-*.parquet"):
            f.unlink(missing_ok=True)
        (self.dir / "checkpoint.json").unlink(missing_ok=True)

    def read_result(self):
        """The stored result of a finished task, or None."""
        path = self.dir / "result.json"
        if not path.is_file():
            return None
        doc = json.loads(path.read_text(encoding="utf-8"))
        x = _read_matrices(self.dir / "result.parquet", {"x": doc["n_var"]})["x"]
        evaluated = None
        if doc["evaluated_width"] is not None:
            evaluated = _read_matrices(self.dir / "result-evaluated.parquet",
                                       {"e": doc["evaluated_width"]})["e"]
        return TaskResult(member=doc["member"], catalog=doc["catalog"], seed=doc["seed"],
                          x_front=x, evaluations=doc["evaluations"],
                          generations=doc["generations"], seconds=doc["seconds"],
                          physics_seconds=doc["physics_seconds"],
                          feasible_evaluated=doc["feasible_evaluated"], evaluated=evaluated,
                          front=(pq.read_table(self.dir / FRONT_ROWS).to_pandas()
                                 if (self.dir / FRONT_ROWS).is_file() else None))
