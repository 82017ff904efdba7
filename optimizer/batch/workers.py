"""Where tasks run: in this process, in N local processes, or on a Dask distributed cluster.

Whole tasks (one member x catalog search) are distributed, never single evaluations: one
vectorized generation costs far less than a scheduler round trip per design. A task is a pure
function of its payload (sweep and catalog texts), names and settings, so results do not depend
on where or in which order tasks ran. Local tasks checkpoint into the run folder; tasks on a
cluster run without checkpoints (a lost worker's task is recomputed by Dask) and the client
stores each finished task at once.
"""

from __future__ import annotations

import contextlib
import multiprocessing
import os
import signal
import sys
import threading
import time
from concurrent.futures import FIRST_COMPLETED, ProcessPoolExecutor, wait
from dataclasses import dataclass
from functools import lru_cache

from cablefam.optimizer.batch.assemble import front_frame
from cablefam.optimizer.batch.task_store import TaskStore
from cablefam.optimizer.search.problem import MemberProblem
from cablefam.optimizer.errors import InputError
from cablefam.optimizer.search.task import TaskInterrupted, TaskResult, run_task, task_seed


@dataclass(frozen=True)
class TaskSpec:
    """One unit of work: names, settings and where to checkpoint (None: no checkpoints)."""

    member: str
    catalog: str
    seed: int
    generations: int
    population: int
    record_evaluated: bool
    run_dir: str | None
    checkpoint_every: int | None
    checkpoint_seconds: float
    time_share_s: float | None = None
    """Wall-clock seconds of this task's share of a time budget (None: run the budget)."""
    evaluations_per_task: int | None = None


def make_task_specs(sweep, settings, run_dir, checkpoint_every, checkpoint_seconds):
    return [TaskSpec(m.name, c.name, task_seed(settings.seed, m.name, c.name),
                     settings.generations, settings.population, settings.record_evaluated,
                     str(run_dir), checkpoint_every, checkpoint_seconds,
                     evaluations_per_task=settings.evaluations_per_task)
            for m in sweep.spec.member for c in sweep.catalogs]


@lru_cache(maxsize=4)
def _sweep_from_json(payload_json: str):
    import json

    from cablefam.optimizer.inputs.sweep_spec import sweep_from_payload
    return sweep_from_payload(json.loads(payload_json))


def execute_task(payload_json: str, spec: TaskSpec, progress=None, stop=None) -> TaskResult:
    """Run a task from its payload (works in any process that has the package)."""
    sweep = _sweep_from_json(payload_json)
    member = next(m for m in sweep.spec.member if m.name == spec.member)
    store = TaskStore(spec.run_dir, spec.member, spec.catalog) if spec.run_dir else None
    result = run_task(sweep, member, spec.catalog, spec.seed, spec.generations,
                      spec.population, spec.record_evaluated, progress=progress, store=store,
                      checkpoint_every=spec.checkpoint_every,
                      checkpoint_seconds=spec.checkpoint_seconds, stop=stop,
                      evaluations_per_task=spec.evaluations_per_task,
                      deadline=None if spec.time_share_s is None
                      else time.perf_counter() + spec.time_share_s)
    # the task's front rows are assembled here, in parallel, not by the collecting process
    result.front = front_frame(MemberProblem(sweep, member, spec.catalog, seed=spec.seed),
                               result.x_front)
    if store is not None:
        store.write_result(result)
    return result


# ------------------------------------------------------------------------- local processes

_WORKER_STOP = None


def _exit_when_orphaned(parent_pid: int, interval_s: float = 0.5):
    """A worker whose parent died (SIGKILL) must not run on, writing into the run folder."""
    while True:
        time.sleep(interval_s)
        if os.getppid() != parent_pid:
            os._exit(1)


def _die_with_parent():
    """Linux: ask the kernel to SIGKILL this worker when its parent dies (prctl
    PR_SET_PDEATHSIG), which works even while the worker is inside a long numerical call; the
    polling thread below covers other systems."""
    try:
        import ctypes

        libc = ctypes.CDLL(None, use_errno=True)
        libc.prctl(1, int(signal.SIGKILL), 0, 0, 0)  # 1 = PR_SET_PDEATHSIG
    except (OSError, AttributeError):
        pass


def _worker_init(stop_event, parent_pid):
    """``parent_pid`` comes from the parent: a worker still importing when its parent was
    killed would otherwise read the adopting process's pid from ``os.getppid()`` and never
    notice (seen once in CI on a loaded machine)."""
    global _WORKER_STOP  # the process-wide stop flag of a worker process, set once
    _WORKER_STOP = stop_event
    signal.signal(signal.SIGINT, signal.SIG_IGN)  # the parent decides; workers checkpoint
    signal.signal(signal.SIGTERM, signal.SIG_IGN)
    if sys.platform.startswith("linux"):
        _die_with_parent()
    if os.getppid() != parent_pid:  # died before the kernel was asked to tell us
        os._exit(1)
    threading.Thread(target=_exit_when_orphaned, args=(parent_pid,), daemon=True).start()


def _worker_task(payload_json, spec):
    return execute_task(payload_json, spec, stop=_WORKER_STOP)


class StopFlag:
    """Set by SIGINT/SIGTERM while a sweep runs; tasks poll it once per generation."""

    def __init__(self, event=None):
        self.event = event if event is not None else threading.Event()
        self.signal_name = None

    def is_set(self):
        return self.event.is_set()

    def install(self):
        self._previous = {}
        if threading.current_thread() is not threading.main_thread():
            return self

        def handler(signum, frame):
            self.signal_name = signal.Signals(signum).name
            self.event.set()

        for sig in (signal.SIGINT, signal.SIGTERM):
            self._previous[sig] = signal.signal(sig, handler)
        return self

    def uninstall(self):
        for sig, prev in getattr(self, "_previous", {}).items():
            signal.signal(sig, prev)


def run_serial(payload_json, specs, on_result, progress, stop):
    for spec in specs:
        if stop.is_set():
            raise TaskInterrupted("before " + f"{spec.member} x {spec.catalog}")
        on_result(execute_task(payload_json, spec, progress=progress, stop=stop))


_THREAD_VARIABLES = ("OMP_NUM_THREADS", "OPENBLAS_NUM_THREADS", "MKL_NUM_THREADS")


@contextlib.contextmanager
def _single_threaded_children():
    """Spawned workers inherit the environment at start: one BLAS/OpenMP thread each, so two
    workers on two cores do not oversubscribe (measured: 17 % slower tasks otherwise)."""
    saved = {v: os.environ.get(v) for v in _THREAD_VARIABLES}
    for v in _THREAD_VARIABLES:
        os.environ.setdefault(v, "1")
    try:
        yield
    finally:
        for v, old in saved.items():
            if old is None:
                os.environ.pop(v, None)
            else:
                os.environ[v] = old


def run_local_processes(payload_json, specs, on_result, progress, stop, workers):
    with _single_threaded_children():
        _run_local_processes(payload_json, specs, on_result, progress, stop, workers)


def _run_local_processes(payload_json, specs, on_result, progress, stop, workers):
    ctx = multiprocessing.get_context("spawn")
    event = ctx.Event()
    pending = {}
    queue = list(specs)
    interrupted = False
    with ProcessPoolExecutor(max_workers=workers, mp_context=ctx, initializer=_worker_init,
                             initargs=(event, os.getpid())) as pool:
        while queue and len(pending) < workers:
            spec = queue.pop(0)
            pending[pool.submit(_worker_task, payload_json, spec)] = spec
        while pending:
            done, _ = wait(pending, timeout=0.5, return_when=FIRST_COMPLETED)
            if stop.is_set() and not event.is_set():
                event.set()
                queue.clear()
            for fut in done:
                pending.pop(fut)
                try:
                    on_result(fut.result())
                except TaskInterrupted:
                    interrupted = True
                if queue and not event.is_set():
                    spec = queue.pop(0)
                    pending[pool.submit(_worker_task, payload_json, spec)] = spec
            if progress is not None and done:
                progress.tasks(running=len(pending), queued=len(queue))
    if interrupted or stop.is_set():
        raise TaskInterrupted("stopped on request")


def run_dask(payload_json, specs, on_result, progress, stop, scheduler):
    try:
        from dask.distributed import Client
    except ImportError:  # pragma: no cover - dask is a dependency
        raise InputError(f"scheduler = {scheduler!r}: dask[distributed] is not installed")
    remote = [TaskSpec(**{**s.__dict__, "run_dir": None}) for s in specs]
    try:
        client = Client(scheduler, timeout="20s")
    except OSError as exc:
        raise InputError(f"scheduler = {scheduler!r}: cannot connect ({exc})") from None
    try:
        futures = [client.submit(execute_task, payload_json, s, pure=False,
                                 key=f"cablefam-{s.member}__{s.catalog}-{s.seed}")
                   for s in remote]
        by_key = {f.key: s for f, s in zip(futures, specs)}
        pending = set(futures)
        while pending:
            finished = [f for f in futures if f in pending and f.done()]  # task order
            if not finished:
                time.sleep(0.2)  # poll, so that a stop request is seen within a moment
            for fut in finished:
                pending.discard(fut)
                result = fut.result()
                spec = by_key[fut.key]
                TaskStore(spec.run_dir, spec.member, spec.catalog).write_result(result)
                on_result(result)
            if finished and progress is not None:
                n_workers = len(client.nthreads())
                progress.tasks(running=min(len(pending), n_workers),
                               queued=max(0, len(pending) - n_workers))
            if stop.is_set() and pending:
                client.cancel(list(pending))
                raise TaskInterrupted("stopped on request")
    finally:
        client.close()
