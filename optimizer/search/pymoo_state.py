"""The one module that reads and writes pymoo's internal state (checkpoint capture and restore).

pymoo has no public API for pausing a genetic algorithm and continuing it bit-for-bit in
another process. :func:`capture` and :func:`restore` reach into the algorithm's population,
survival normalisation, random generator, counters and termination; every such access lives
here, and pyproject.toml pins pymoo to the minor version they were written against. Restoring
a captured state into a freshly set-up algorithm reproduces the uninterrupted run exactly.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from pymoo.core.population import Population

_NORMALISATION = ("ideal_point", "worst_point", "nadir_point", "extreme_points")


@dataclass
class TaskState:
    """What a checkpoint holds, in memory."""

    generation: int
    counters: dict
    rng_state: dict
    population: dict[str, np.ndarray]
    population_data: dict[str, np.ndarray]
    normalisation: dict[str, list | None]
    archive_x: np.ndarray
    archive_f: np.ndarray
    evaluated: np.ndarray | None


def capture(algorithm, problem, generation: int) -> TaskState:
    """Snapshot a pymoo genetic algorithm and the recording problem after a generation."""
    pop = algorithm.pop
    keys = sorted({k for ind in pop for k in ind.data})
    data = {k: np.array([ind.data.get(k, np.nan) for ind in pop]) for k in keys}
    norm = {}
    survival_norm = getattr(algorithm.survival, "norm", None)
    if survival_norm is not None:
        for k in _NORMALISATION:
            v = getattr(survival_norm, k, None)
            norm[k] = None if v is None else np.asarray(v, dtype=float).tolist()
    evaluated = np.vstack(problem.evaluated) if problem.evaluated else None
    return TaskState(
        generation=generation,
        counters={"n_iter": int(algorithm.n_iter), "n_eval": int(algorithm.evaluator.n_eval),
                  "n_evaluations": problem.n_evaluations, "n_feasible": problem.n_feasible,
                  "last_feasible": problem.last_feasible,
                  "physics_seconds": problem.physics_seconds},
        rng_state=algorithm.random_state.bit_generator.state,
        population={"X": pop.get("X"), "F": pop.get("F"), "G": pop.get("G"),
                    "CV": pop.get("CV")},
        population_data=data, normalisation=norm,
        archive_x=problem.archive.x.copy(), archive_f=problem.archive.f.copy(),
        evaluated=evaluated)


def restore(algorithm, problem, state: TaskState) -> None:
    """Put a captured state into an algorithm that was just set up with the same settings."""
    p = state.population
    pop = Population.new("X", p["X"], "F", p["F"], "G", p["G"], "CV", p["CV"])
    for k, v in state.population_data.items():
        pop.set(k, v)
    algorithm.pop = pop
    algorithm.is_initialized = True
    algorithm.start_time = 0.0
    algorithm.n_iter = state.counters["n_iter"]
    algorithm.evaluator.n_eval = state.counters["n_eval"]
    algorithm.random_state.bit_generator.state = state.rng_state
    survival_norm = getattr(algorithm.survival, "norm", None)
    if survival_norm is not None:
        for k, v in state.normalisation.items():
            setattr(survival_norm, k, None if v is None else np.asarray(v, dtype=float))
    if hasattr(algorithm.survival, "opt"):
        rank = pop.get("rank")
        algorithm.survival.opt = pop[np.flatnonzero(rank == 0)] if rank is not None else pop
    algorithm._set_optimum()
    # the termination was last updated before _post_advance incremented the iteration counter
    algorithm.n_iter -= 1
    algorithm.termination.update(algorithm)
    algorithm.n_iter += 1
    problem.archive.x = state.archive_x
    problem.archive.f = state.archive_f
    c = state.counters
    problem.n_evaluations, problem.n_feasible = c["n_evaluations"], c["n_feasible"]
    problem.last_feasible, problem.physics_seconds = c["last_feasible"], c["physics_seconds"]
    problem.evaluated = [] if state.evaluated is None else [state.evaluated]
