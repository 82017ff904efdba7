"""One search task: a family member with one catalog, run with pymoo generation by generation."""

from __future__ import annotations

import hashlib
import time
from dataclasses import dataclass, field

import numpy as np
from pymoo.algorithms.moo.nsga2 import NSGA2
from pymoo.algorithms.moo.nsga3 import NSGA3
from pymoo.algorithms.soo.nonconvex.ga import GA
from pymoo.util.nds.non_dominated_sorting import NonDominatedSorting
from pymoo.util.ref_dirs import get_reference_directions

from cablefam.optimizer.search.problem import ImpedanceSeededSampling, MemberProblem
from cablefam.optimizer.search.pymoo_state import capture, restore
from cablefam.optimizer.inputs.sweep_spec import MemberSpec, Sweep


def task_seed(run_seed: int, member: str, catalog: str) -> int:
    """Seed of one member x catalog task, derived from the run seed (independent of order)."""
    digest = hashlib.sha256(f"{run_seed}\0{member}\0{catalog}".encode()).digest()
    return int.from_bytes(digest[:4], "little")


def make_algorithm(problem: MemberProblem, population: int, seed: int):
    """GA for one objective, NSGA-II for two or three, NSGA-III (reference directions) beyond."""
    repair = problem.make_repair()
    sampling = ImpedanceSeededSampling()
    n_obj = problem.n_obj
    if n_obj == 1:
        return GA(pop_size=population, sampling=sampling, repair=repair,
                  eliminate_duplicates=True)
    if n_obj <= 3:
        return NSGA2(pop_size=population, sampling=sampling, repair=repair,
                     eliminate_duplicates=True)
    ref_dirs = get_reference_directions("energy", n_obj, population, seed=seed)
    return NSGA3(ref_dirs=ref_dirs, pop_size=population, sampling=sampling, repair=repair,
                 eliminate_duplicates=True)


@dataclass
class FeasibleArchive:
    """Every feasible non-dominated design evaluated so far (decision vectors and objectives)."""

    n_var: int
    n_obj: int
    x: np.ndarray = field(init=False)
    f: np.ndarray = field(init=False)

    def __post_init__(self):
        self.x = np.empty((0, self.n_var))
        self.f = np.empty((0, self.n_obj))

    def update(self, x, f, g):
        ok = np.all(g <= 0.0, axis=1)
        if not ok.any():
            return
        xs = np.vstack([self.x, x[ok]])
        fs = np.vstack([self.f, f[ok]])
        xs, first = np.unique(xs, axis=0, return_index=True)
        fs = fs[first]
        if self.n_obj == 1:
            keep = fs[:, 0] == fs[:, 0].min()
            keep = np.flatnonzero(keep)
        else:
            keep = NonDominatedSorting().do(fs, only_non_dominated_front=True)
            keep = np.sort(keep)
        self.x, self.f = xs[keep], fs[keep]


@dataclass
class TaskResult:
    member: str
    catalog: str
    seed: int
    x_front: np.ndarray
    evaluations: int
    generations: int
    seconds: float
    physics_seconds: float
    feasible_evaluated: int
    evaluated: np.ndarray | None


class _RecordingProblem(MemberProblem):
    """The member problem, also feeding the archive and timing the physics."""

    def __init__(self, *args, **kwargs):
        super().__init__(*args, **kwargs)
        self.archive = FeasibleArchive(self.n_var, self.n_obj)
        self.physics_seconds = 0.0
        self.n_evaluations = 0
        self.n_feasible = 0
        self.last_feasible = 0
        self.pop_size_hint = 0

    def _evaluate(self, x, out, *args, **kwargs):
        t0 = time.perf_counter()
        super()._evaluate(x, out, *args, **kwargs)
        self.physics_seconds += time.perf_counter() - t0
        feasible = np.all(out["G"] <= 0.0, axis=1)
        self.n_evaluations += len(x)
        self.n_feasible += int(feasible.sum())
        self.last_feasible = int(feasible.sum())
        self.pop_size_hint = len(x)
        self.archive.update(np.asarray(x, dtype=float), out["F"], out["G"])


class TaskInterrupted(Exception):
    """A task stopped on request (SIGINT/SIGTERM) after writing its checkpoint."""


def run_task(sweep: Sweep, member: MemberSpec, catalog_name: str, seed: int, generations: int,
             population: int, record_evaluated: bool = False, progress=None, store=None,
             checkpoint_every: int | None = None, checkpoint_seconds: float = 30.0,
             stop=None) -> TaskResult:
    """Run one member x catalog search and return its feasible non-dominated archive.

    With a task store (:class:`cablefam.optimizer.batch.task_store.TaskStore`), the task starts from its last checkpoint
    if there is one, and writes a checkpoint every ``checkpoint_every`` generations (or, when
    that is None, after every ``checkpoint_seconds`` of work). When ``stop`` (an object with
    ``is_set()``) becomes set, the task writes a checkpoint and raises :class:`TaskInterrupted`.
    """
    t_start = time.perf_counter()
    problem = _RecordingProblem(sweep, member, catalog_name, record_evaluated=record_evaluated,
                                seed=seed)
    algorithm = make_algorithm(problem, population, seed)
    algorithm.setup(problem, termination=("n_gen", generations), seed=seed, verbose=False)
    gen = 0
    seconds_before = 0.0
    if store is not None:
        state = store.read_checkpoint()
        if state is not None:
            restore(algorithm, problem, state)
            gen = state.generation
            seconds_before = state.counters.get("seconds", 0.0)
    last_checkpoint = time.perf_counter()
    while algorithm.has_next():
        algorithm.next()
        gen += 1
        now = time.perf_counter()
        if progress is not None:
            progress.generation(member.name, catalog_name, gen, generations, problem,
                                seconds_before + now - t_start)
        if store is None:
            continue
        stopping = stop is not None and stop.is_set()
        due = (gen % checkpoint_every == 0) if checkpoint_every else (
            now - last_checkpoint >= checkpoint_seconds)
        if (due or stopping) and algorithm.has_next():
            state = capture(algorithm, problem, gen)
            state.counters["seconds"] = seconds_before + now - t_start
            store.write_checkpoint(state)
            last_checkpoint = time.perf_counter()
        if stopping and algorithm.has_next():
            raise TaskInterrupted(f"{member.name} x {catalog_name} at generation {gen}")
    evaluated = np.vstack(problem.evaluated) if record_evaluated and problem.evaluated else None
    return TaskResult(member=member.name, catalog=catalog_name, seed=seed,
                      x_front=problem.archive.x, evaluations=problem.n_evaluations,
                      generations=gen, seconds=seconds_before + time.perf_counter() - t_start,
                      physics_seconds=problem.physics_seconds,
                      feasible_evaluated=problem.n_feasible, evaluated=evaluated)
