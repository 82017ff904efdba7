"""One search task: a family member with one catalog, in two stages.

1. **Dense stage** (:mod:`cablefam.optimizer.search.dense`): scrambled Sobol points of the
   reduced space (impedance target by construction) for every material combination, evaluated
   in chunks, filtered into the epsilon archive.
2. **Genetic stage**: pymoo's NSGA-II (GA for one objective, NSGA-III for four or more) for
   ``generations`` generations of ``population``, seeded from the dense stage's front, feeding
   the same archive.

The evaluation counts are fixed before the task starts (:mod:`cablefam.optimizer.search.budget`),
so the same seed gives the same front. Checkpoints are written in the genetic stage; the dense
stage takes seconds and is recomputed when a task is resumed before its first checkpoint.
"""

from __future__ import annotations

import hashlib
import time
from dataclasses import dataclass

import numpy as np
from pymoo.algorithms.moo.nsga2 import NSGA2
from pymoo.algorithms.moo.nsga3 import NSGA3
from pymoo.algorithms.soo.nonconvex.ga import GA
from pymoo.util.ref_dirs import get_reference_directions

from cablefam.optimizer.inputs.sweep_spec import MemberSpec, Sweep
from cablefam.optimizer.model.objectives import resolutions
from cablefam.optimizer.search.archive import EpsilonArchive
from cablefam.optimizer.search.budget import Budget, task_budget
from cablefam.optimizer.search.dense import chunks, dense_points
from cablefam.optimizer.search.problem import MemberProblem
from cablefam.optimizer.search.pymoo_state import capture, restore
from cablefam.optimizer.search.refine import run_refine_stage


def task_seed(run_seed: int, member: str, catalog: str) -> int:
    """Seed of one member x catalog task, derived from the run seed (independent of order)."""
    digest = hashlib.sha256(f"{run_seed}\0{member}\0{catalog}".encode()).digest()
    return int.from_bytes(digest[:4], "little")


def make_algorithm(problem: MemberProblem, population: int, seed: int, sampling):
    """GA for one objective, NSGA-II for two or three, NSGA-III (reference directions) beyond."""
    repair = problem.make_repair()
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
    front: object | None = None
    """The task's front rows (a DataFrame), when the process that ran it assembled them."""


class RecordingProblem(MemberProblem):
    """The member problem, also feeding the archive, counting and timing the physics."""

    def __init__(self, *args, **kwargs):
        super().__init__(*args, **kwargs)
        overrides = self.sweep.spec.search.resolution
        self.archive = EpsilonArchive(self.n_var, resolutions(self.objectives, overrides))
        self.physics_seconds = 0.0
        self.n_evaluations = 0
        self.n_feasible = 0
        self.last_feasible = 0
        self.pop_size_hint = 0
        self.reserve_x = np.empty((0, self.n_var))
        self.reserve_cv = np.empty(0)

    def evaluate_batch(self, x):
        """F and G of a batch; the feasible designs go to the archive."""
        x = np.asarray(x, dtype=float)
        t0 = time.perf_counter()
        f, g, known = self.evaluate_search(x, self.archive.may_enter)
        self.physics_seconds += time.perf_counter() - t0
        feasible = np.all(g <= 0.0, axis=1) & known
        self.n_evaluations += len(x)
        self.n_feasible += int(feasible.sum())
        self.last_feasible = int(feasible.sum())
        self.pop_size_hint = len(x)
        self.archive.update(x[feasible], f[feasible])
        if self.record_evaluated:
            g_rec = np.where(known[:, None] | (g > 0.0), g, np.nan)
            self.evaluated.append(np.column_stack([x, f, g_rec]))
        return f, g, feasible

    def keep_reserve(self, x, g, size):
        """The ``size`` least-violating infeasible designs seen (to fill a first population)."""
        cv = np.maximum(g, 0.0).sum(axis=1)
        bad = cv > 0.0
        xs = np.vstack([self.reserve_x, x[bad]])
        cvs = np.concatenate([self.reserve_cv, cv[bad]])
        order = np.argsort(cvs, kind="stable")[:size]
        self.reserve_x, self.reserve_cv = xs[order], cvs[order]

    def _evaluate(self, x, out, *args, **kwargs):
        f, g, _ = self.evaluate_batch(x)
        out["F"] = f
        out["G"] = g


class TaskInterrupted(Exception):
    """A task stopped on request (SIGINT/SIGTERM) after writing its checkpoint."""


def first_population(problem: RecordingProblem, size: int) -> np.ndarray:
    """The genetic stage's first population: the archive spread along its first objective,
    filled up with the least-violating designs of the dense stage."""
    arch_x = problem.archive.x
    if len(arch_x) >= size:
        order = np.argsort(problem.archive.f[:, 0], kind="stable")
        pick = order[np.round(np.linspace(0, len(order) - 1, size)).astype(int)]
        return arch_x[np.sort(pick)]
    x = np.vstack([arch_x, problem.reserve_x[:size - len(arch_x)]])
    if len(x) < size:  # tiny dense stage: repeat what there is (pymoo removes duplicates)
        x = np.vstack([x] + [x[:1]] * (size - len(x))) if len(x) else None
    return x


def run_dense_stage(problem: RecordingProblem, budget: Budget, seed: int, stop=None,
                    progress=None, on_chunk=None):
    """Evaluate the dense stage's points chunk by chunk into the archive."""
    xl, xu = problem.bounds()
    x = dense_points(problem.layout, xl, xu, budget.dense, seed)
    x = problem.make_repair()._do(problem, x)
    for _, rows in chunks(x):
        if stop is not None and stop.is_set():
            raise TaskInterrupted("in the dense stage (no checkpoint yet)")
        _, g, _ = problem.evaluate_batch(rows)
        problem.keep_reserve(rows, g, budget.population)
        if on_chunk is not None:
            on_chunk()


def run_task(sweep: Sweep, member: MemberSpec, catalog_name: str, seed: int, generations: int,
             population: int, record_evaluated: bool = False, progress=None, store=None,
             checkpoint_every: int | None = None, checkpoint_seconds: float = 30.0,
             stop=None, deadline: float | None = None,
             evaluations_per_task: int | None = None) -> TaskResult:
    """Run one member x catalog search and return its feasible front (epsilon archive).

    With a task store (:class:`cablefam.optimizer.batch.task_store.TaskStore`), the task
    starts from its last checkpoint if there is one, and writes a checkpoint every
    ``checkpoint_every`` generations (or, when that is None, after every ``checkpoint_seconds``
    of work). When ``stop`` (an object with ``is_set()``) becomes set, the task writes a
    checkpoint and raises :class:`TaskInterrupted`. With ``deadline`` (a
    ``time.perf_counter()`` value) the genetic stage runs until then instead of for
    ``generations``. ``evaluations_per_task`` overrides the sweep file's.
    """
    t_start = time.perf_counter()
    problem = RecordingProblem(sweep, member, catalog_name, record_evaluated=record_evaluated,
                               seed=seed)
    if evaluations_per_task is None:
        evaluations_per_task = sweep.spec.search.evaluations_per_task
    budget = task_budget(population, generations, evaluations_per_task)
    state = store.read_checkpoint() if store is not None else None
    seconds_before = 0.0
    report = _Reporter(progress, member.name, catalog_name, budget, problem, t_start)
    if state is None:
        run_dense_stage(problem, budget, seed, stop=stop, on_chunk=report)
        run_refine_stage(problem, budget.refine, seed, stop=stop, on_batch=report,
                         interrupted=TaskInterrupted)
        sampling = first_population(problem, budget.population)
    else:
        sampling = np.zeros((budget.population, problem.n_var))  # replaced by the checkpoint
    n_gen = budget.generations if deadline is None else 10**9
    if sampling is None:  # nothing evaluable at all (degenerate bounds): no genetic stage
        n_gen = 0
    gen = 0
    if n_gen:
        algorithm = make_algorithm(problem, budget.population, seed, sampling)
        algorithm.setup(problem, termination=("n_gen", n_gen), seed=seed, verbose=False)
        if state is not None:
            restore(algorithm, problem, state)
            gen = state.generation
            seconds_before = state.counters.get("seconds", 0.0)
            report.seconds_before = seconds_before
        last_checkpoint = time.perf_counter()
        while algorithm.has_next():
            algorithm.next()
            gen += 1
            now = time.perf_counter()
            report(gen)
            if deadline is not None and now >= deadline:
                break
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


class _Reporter:
    """Passes a task's progress (stage, evaluations, archive) to a progress object."""

    def __init__(self, progress, member, catalog, budget, problem, t_start):
        self.progress, self.member, self.catalog = progress, member, catalog
        self.budget, self.problem, self.t_start = budget, problem, t_start
        self.seconds_before = 0.0

    def __call__(self, gen=None):
        if self.progress is None:
            return
        seconds = self.seconds_before + time.perf_counter() - self.t_start
        self.progress.task_progress(self.member, self.catalog, self.problem, self.budget,
                                    gen, seconds)
