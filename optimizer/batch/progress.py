"""Progress of a sweep on stderr: member, catalog, generation, feasible count, best values, ETA.

stdout stays clean for machine-readable output.
"""

from __future__ import annotations

import sys
import time


from cablefam.optimizer.model.objectives import OBJECTIVES


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

    def generation(self, member, catalog, gen, generations, problem, task_seconds):
        now = time.perf_counter()
        if now - self._last < self.interval_s and gen < generations:
            return
        self._last = now
        best = []
        arch = problem.archive
        for j, name in enumerate(problem.objectives):
            if len(arch.f):
                o = OBJECTIVES[name]
                v = arch.f[:, j].min()
                best.append(f"{name} {(-v if o.maximise else v):.4g}")
        per_gen = task_seconds / gen
        remaining_task = per_gen * (generations - gen)
        remaining = remaining_task + per_gen * generations * (self.n_tasks - self.done - 1)
        self._print(
            f"[{self.done + 1}/{self.n_tasks}] {member} x {catalog}: gen {gen}/{generations}, "
            f"feasible {problem.last_feasible}/{problem.pop_size_hint}, front {len(arch.f)}, "
            f"best {'; '.join(best) or 'none feasible yet'}, ETA {_clock(remaining)}")

    def task_done(self, result, front_rows):
        self.done += 1
        self._print(f"[{self.done}/{self.n_tasks}] {result.member} x {result.catalog}: done in "
                    f"{result.seconds:.1f} s, {result.evaluations} evaluations, "
                    f"{front_rows} designs on the front")
