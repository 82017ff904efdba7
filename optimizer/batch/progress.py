"""Progress of a sweep on stderr: task, stage, evaluations per second, front size, hypervolume, ETA.

stdout stays clean for machine-readable output.
"""

from __future__ import annotations

import sys
import time


from cablefam.optimizer.model.objectives import OBJECTIVES
from cablefam.optimizer.search.archive import front_hypervolume


def _clock(seconds: float) -> str:
    seconds = max(0, int(round(seconds)))
    return f"{seconds // 3600}:{seconds % 3600 // 60:02d}:{seconds % 60:02d}"


class StderrProgress:
    """Prints a line at most every ``interval_s`` seconds and one line per finished task."""

    def __init__(self, stream=None, interval_s: float = 2.0):
        self.stream = stream or sys.stderr
        self.interval_s = interval_s
        self.n_tasks = 0
        self.done = 0
        self.t_start = time.perf_counter()
        self._last = 0.0
        self._box = {}

    def _print(self, text):
        print(text, file=self.stream, flush=True)

    def start(self, n_tasks: int, already_done: int = 0):
        self.n_tasks = n_tasks
        self.done = already_done
        self.t_start = time.perf_counter()
        if already_done:
            self._print(f"{already_done}/{n_tasks} tasks already finished in this run folder; "
                        "continuing the rest")

    def tasks(self, running: int, queued: int):
        """A summary line across workers."""
        elapsed = time.perf_counter() - self.t_start
        self._print(f"tasks: {self.done}/{self.n_tasks} done, {running} running, {queued} "
                    f"queued, elapsed {_clock(elapsed)}")

    def task_progress(self, member, catalog, problem, budget, gen, task_seconds):
        """A task's state: stage, evaluations per second, front size and hypervolume."""
        now = time.perf_counter()
        done = problem.n_evaluations
        final = gen is not None and gen >= budget.generations
        if now - self._last < self.interval_s and not final:
            return
        self._last = now
        rate = done / task_seconds if task_seconds > 0 else 0.0
        arch = problem.archive
        best = []
        for j, name in enumerate(problem.objectives):
            if len(arch.f):
                o = OBJECTIVES[name]
                v = arch.f[:, j].min()
                best.append(f"{name} {(-v if o.maximise else v):.4g}")
        hv = front_hypervolume(arch.f, self._box.get((member, catalog)))
        if gen is not None and (member, catalog) not in self._box and len(arch.f):
            self._box[(member, catalog)] = (arch.f.min(axis=0), arch.f.max(axis=0))
        stage = "dense" if gen is None else f"gen {gen}/{budget.generations}"
        remaining = (budget.total - done) / rate if rate > 0 else 0.0
        remaining += budget.total / rate * (self.n_tasks - self.done - 1) if rate > 0 else 0.0
        self._print(
            f"[{self.done + 1}/{self.n_tasks}] {member} x {catalog}: {stage}, "
            f"{done}/{budget.total} evaluations ({rate:,.0f}/s), front {len(arch.f)}"
            + (f", HV {hv:.4f}" if hv is not None else "")
            + f", best {'; '.join(best) or 'none feasible yet'}, ETA {_clock(remaining)}")

    def task_done(self, result, front_rows):
        self.done += 1
        self._print(f"[{self.done}/{self.n_tasks}] {result.member} x {result.catalog}: done in "
                    f"{result.seconds:.1f} s, {result.evaluations} evaluations, "
                    f"{front_rows} designs on the front")
