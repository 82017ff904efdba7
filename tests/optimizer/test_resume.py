"""Checkpoint and resume: real sweep processes killed at several points, clean stops on SIGINT
and SIGTERM, refusal when inputs changed, no recomputation, plain-data run folders.

The reference for every comparison is an uninterrupted in-process run of the same sweep file:
the front must come back byte-identical, whatever happened in between. The sweep is the demo
sweep cut down to 2 members x 2 catalogs, population 16, 25 generations (under a second a task).
"""

from __future__ import annotations

import json
import os
import re
import shutil
import signal
import subprocess
import sys
import time
import tomllib
import warnings
from pathlib import Path

import pyarrow.parquet as pq
import pytest

import cablefam.catalogs as catalogs
import cablefam.optimizer
from cablefam.optimizer.batch import workers as execution
from cablefam.optimizer.batch.task_store import TaskStore
from cablefam.optimizer.batch.sweep import SweepInterrupted, resume_run, run_sweep
from cablefam.optimizer.inputs.sweep_spec import demo_sweep_path, load_sweep

CATALOG_DIR = Path(catalogs.__file__).resolve().parent
SWEEP_NAME = "resume-small"
MEMBERS = ("mast-feeder-50", "pier-link-50")
#: Task folders in the order a serial run takes them (member-major).
TASKS = ("mast-feeder-50__baseline", "mast-feeder-50__lightweight",
         "pier-link-50__baseline", "pier-link-50__lightweight")
GENERATIONS = 25
#: Generations of the signal tests: tasks long enough (~1.5 s) that a stop request reaches a
#: task of a worker process (the parent polls every 0.5 s) before it ends.
LONG_GENERATIONS = 100
POLL_S = 0.002


def small_sweep_text(catalog_dir: Path = CATALOG_DIR, name: str = SWEEP_NAME,
                     members: tuple[str, ...] = MEMBERS) -> str:
    """The demo sweep's text cut down: members ``members``, the baseline and lightweight
    catalogs as absolute paths under ``catalog_dir``, population 16, 25 generations. Everything
    else (objectives, bounds, tolerance, member settings) stays as in the demo."""
    text = demo_sweep_path().read_text(encoding="utf-8")
    head, *blocks = text.split("\n[[member]]\n")
    blocks = [b for b in blocks
              if re.search(r'(?m)^name = "([^"]+)"', b).group(1) in members]
    assert len(blocks) == len(members), f"demo sweep lacks a member of {members}"
    paths = ", ".join(f'"{catalog_dir / c}"' for c in ("baseline.toml", "lightweight.toml"))
    edits = [
        (r'(?m)^name = "[^"]+"$', f'name = "{name}"'),
        (r"(?ms)^catalogs = \[.*?\]", f"catalogs = [{paths}]"),
        (r"(?m)^population = \d+", "population = 16"),
        (r"(?m)^generations = \d+", f"generations = {GENERATIONS}"),
        (r"(?m)^evaluations_per_task = \d+", "evaluations_per_task = 6000"),
    ]
    for pattern, new in edits:
        head, n = re.subn(pattern, lambda _m, new=new: new, head, count=1)
        assert n == 1, f"demo sweep no longer matches {pattern!r}; update this test helper"
    return "\n[[member]]\n".join([head, *blocks]).rstrip() + "\n"


@pytest.fixture(scope="module")
def reference(tmp_path_factory):
    """(sweep file, bytes of front.parquet of an uninterrupted in-process run)."""
    base = tmp_path_factory.mktemp("resume-reference")
    sweep_file = base / "small.toml"
    sweep_file.write_text(small_sweep_text(), encoding="utf-8")
    run_dir = run_sweep(load_sweep(sweep_file), base / "runs")
    return sweep_file, (run_dir / "front.parquet").read_bytes(), run_dir


@pytest.fixture(scope="module")
def reference_long(reference, tmp_path_factory):
    """Bytes of front.parquet of an uninterrupted run with ``--generations 100``."""
    run_dir = run_sweep(load_sweep(reference[0]), tmp_path_factory.mktemp("resume-long"),
                        generations=LONG_GENERATIONS)
    return (run_dir / "front.parquet").read_bytes()


# ----------------------------------------------------------------------------- helpers

def task_states(run_dir: Path) -> dict[str, str]:
    """Task folder -> 'done' (result.json), 'checkpoint' (checkpoint.json only) or 'none'."""
    out = {}
    for t in TASKS:
        d = run_dir / "tasks" / t
        if (d / "result.json").exists():
            out[t] = "done"
        elif (d / "checkpoint.json").exists():
            out[t] = "checkpoint"
        else:
            out[t] = "none"
    return out


def n_done(states: dict[str, str]) -> int:
    return sum(s == "done" for s in states.values())


def assert_no_half_written_file(run_dir: Path) -> None:
    """Every visible file parses; temporary files are dot-prefixed ``.*.tmp``; every JSON commit
    point names complete files."""
    for path in sorted(run_dir.rglob("*")):
        if path.is_dir():
            continue
        if path.name.startswith("."):
            assert re.fullmatch(r"\..+\.tmp", path.name), f"unexpected hidden file {path}"
            continue
        if path.suffix == ".json":
            json.loads(path.read_text(encoding="utf-8"))
        elif path.suffix == ".parquet":
            pq.read_table(path)
        elif path.suffix == ".toml":
            tomllib.loads(path.read_text(encoding="utf-8"))
        else:
            pytest.fail(f"{path}: neither JSON, TOML nor Parquet")
    for t in TASKS:
        member, catalog = t.split("__")
        store = TaskStore(run_dir, member, catalog)
        if (store.dir / "result.json").exists():
            assert store.read_result() is not None
        elif (store.dir / "checkpoint.json").exists():
            assert store.read_checkpoint() is not None


def assert_plain_data(run_dir: Path) -> None:
    """Only JSON, TOML and Parquet files; no pickle anywhere (nothing starts with a pickle
    protocol header, Parquet files carry their magic at both ends, text files are UTF-8)."""
    files = [p for p in run_dir.rglob("*") if p.is_file() and not p.name.startswith(".")]
    assert files
    for path in files:
        raw = path.read_bytes()
        assert not raw.startswith(b"\x80"), f"{path} looks like a pickle"
        if path.suffix == ".parquet":
            assert raw[:4] == b"PAR1" and raw[-4:] == b"PAR1", path
            pq.read_table(path)
        elif path.suffix == ".json":
            json.loads(raw.decode("utf-8"))
        elif path.suffix == ".toml":
            tomllib.loads(raw.decode("utf-8"))
        else:
            pytest.fail(f"{path}: neither JSON, TOML nor Parquet")


def finished_task_files(run_dir: Path) -> dict[str, tuple[bytes, int, bytes]]:
    """Finished task -> (result.json bytes, its mtime [ns], result.parquet bytes)."""
    out = {}
    for t, s in task_states(run_dir).items():
        if s == "done":
            d = run_dir / "tasks" / t
            out[t] = ((d / "result.json").read_bytes(), (d / "result.json").stat().st_mtime_ns,
                      (d / "result.parquet").read_bytes())
    return out


def start_sweep(sweep_file: Path, out: Path, *extra: str, log: Path) -> subprocess.Popen:
    """A real ``cablefam sweep`` process (fresh interpreter), stderr into ``log``."""
    with open(log, "w") as fh:
        return subprocess.Popen(
            [sys.executable, "-m", "cablefam", "sweep", str(sweep_file), "--out", str(out),
             *extra], stdout=subprocess.DEVNULL, stderr=fh)


def wait_until(proc: subprocess.Popen, condition, timeout: float = 120.0) -> bool:
    """Poll until ``condition()`` holds (True) or the process ends / time runs out (False)."""
    t_end = time.monotonic() + timeout
    while proc.poll() is None and time.monotonic() < t_end:
        if condition():
            return True
        time.sleep(POLL_S)
    return False


def kill_when(sweep_file, out, condition, log) -> Path:
    """Start a sweep with a checkpoint every generation; SIGKILL it as soon as ``condition``
    holds for its run folder. Returns the run folder."""
    run_dir = out / SWEEP_NAME
    proc = start_sweep(sweep_file, out, "--quiet", "--checkpoint-every", "1", log=log)
    try:
        hit = wait_until(proc, lambda: condition(run_dir))
        if proc.poll() is None:
            proc.send_signal(signal.SIGKILL)
    finally:
        proc.wait(timeout=60)
    if not hit:
        assert proc.returncode == 0, log.read_text()
    return run_dir


def resume_and_compare(cli, run_dir: Path, reference_front: bytes, finished_before: dict):
    code, out, err = cli("resume", run_dir, "--quiet")
    assert code == 0, err
    assert out.strip() == str(run_dir)
    assert (run_dir / "front.parquet").read_bytes() == reference_front
    # finished tasks were not recomputed: their files are untouched (bytes and mtime)
    after = finished_task_files(run_dir)
    for t, files in finished_before.items():
        assert after[t] == files, t
    info = json.loads((run_dir / "run.json").read_text(encoding="utf-8"))
    assert info["tasks_taken_from_earlier_session"] == len(finished_before)
    assert info["resumed_with_force"] is False
    assert_no_half_written_file(run_dir)


# ----------------------------------------------------------------------------- SIGKILL

#: Kill point -> (condition to kill at, check that the killed folder shows that point).
KILL_POINTS = {
    # before the first task finishes: as soon as the run has started
    "early": (lambda d: (d / "run-state.json").exists(),
              lambda s: n_done(s) == 0),
    # mid-task: a task has a checkpoint but no result (after one finished task)
    "mid-task": (lambda d: n_done(task_states(d)) == 1
                 and list(task_states(d).values()).count("checkpoint") == 1,
                 lambda s: n_done(s) == 1 and list(s.values()).count("checkpoint") == 1),
    # between tasks: two finished, the third not yet checkpointed
    "between-tasks": (lambda d: n_done(s := task_states(d)) == 2 and "checkpoint" not in
                      s.values(), lambda s: n_done(s) == 2 and "checkpoint" not in s.values()),
    # during the final write: every task finished, run.json not yet written
    "final-write": (lambda d: n_done(task_states(d)) == len(TASKS)
                    and not (d / "run.json").exists(),
                    lambda s: n_done(s) == len(TASKS)),
}


@pytest.mark.slow
@pytest.mark.parametrize("point", list(KILL_POINTS))
def test_sigkill_then_resume_gives_identical_front(point, reference, tmp_path, cli,
                                                  record_property):
    sweep_file, reference_front, reference_dir = reference
    condition, shows_point = KILL_POINTS[point]
    for attempt in range(3):
        out = tmp_path / f"attempt{attempt}"
        run_dir = kill_when(sweep_file, out, condition, tmp_path / f"attempt{attempt}.log")
        states = task_states(run_dir)
        hit = shows_point(states) and not (run_dir / "run.json").exists()
        if hit:
            record_property("hit_by_timing_in_attempt", attempt + 1)
            break
    else:
        warnings.warn(f"kill point {point!r} missed 3 times by timing; state built instead",
                      stacklevel=1)
        if point not in ("between-tasks", "final-write"):
            pytest.fail(f"could not kill the sweep at point {point!r} in 3 attempts: {states}")
        # the window is too short to hit by timing here: build the killed state instead from
        # the finished reference run (what a kill at that point leaves behind)
        out = tmp_path / "constructed"
        run_dir = out / SWEEP_NAME
        shutil.copytree(reference_dir, run_dir)
        (run_dir / "run.json").unlink()
        if point == "between-tasks":
            (run_dir / "front.parquet").unlink()
            for t in TASKS[2:]:
                shutil.rmtree(run_dir / "tasks" / t)
    assert not (run_dir / "run.json").exists()
    assert_no_half_written_file(run_dir)
    assert_plain_data(run_dir)
    before = finished_task_files(run_dir)
    if point == "final-write":
        assert len(before) == len(TASKS)
    time.sleep(0.01)  # a rewrite of a finished task's files would show in its mtime
    resume_and_compare(cli, run_dir, reference_front, before)


@pytest.mark.parametrize("remove", [("run.json",), ("run.json", "front.parquet")])
def test_kill_during_final_write_by_construction(remove, reference, tmp_path, cli):
    """Both states a kill in the final write can leave: front written but no run.json, or
    neither (temp files are dot-prefixed and never read)."""
    _, reference_front, reference_dir = reference
    run_dir = tmp_path / SWEEP_NAME
    shutil.copytree(reference_dir, run_dir)
    for name in remove:
        (run_dir / name).unlink()
    (run_dir / ".front.parquet.x1y2.tmp").write_bytes(b"half a Parquet file")
    before = finished_task_files(run_dir)
    assert len(before) == len(TASKS)
    resume_and_compare(cli, run_dir, reference_front, before)


# ----------------------------------------------------------------------------- SIGINT, SIGTERM

def checkpoint_generation(run_dir: Path, task: str) -> int | None:
    """Generation of a task's last checkpoint while a sweep may be writing (None: none)."""
    try:
        doc = json.loads((run_dir / "tasks" / task / "checkpoint.json").read_text())
    except FileNotFoundError:
        return None
    return doc["generation"]


@pytest.mark.slow
@pytest.mark.parametrize("signame, workers", [("SIGINT", "1"), ("SIGTERM", "1"),
                                               ("SIGINT", "2")])
def test_signal_stops_after_checkpoint_and_resume_is_identical(signame, workers, reference,
                                                               reference_long, tmp_path, cli):
    """The signal arrives once the first task finished and a later one checkpointed
    generation 5 (checkpoints every 5 generations); the stop must leave a checkpoint of a
    later generation, written after the signal, and exit 130."""
    sweep_file = reference[0]
    out = tmp_path / "runs"
    run_dir = out / SWEEP_NAME
    log = tmp_path / "stderr.log"
    every = 5
    seen: dict[str, int] = {}

    def ready():
        if n_done(task_states(run_dir)) < 1:
            return False
        for t in TASKS[1:]:
            g = checkpoint_generation(run_dir, t)
            if g is not None and (run_dir / "tasks" / t / "result.json").exists() is False:
                seen[t] = g
        return any(g == every for g in seen.values())

    proc = start_sweep(sweep_file, out, "--quiet", "--checkpoint-every", str(every),
                       "--workers", workers, "--generations", str(LONG_GENERATIONS), log=log)
    try:
        assert wait_until(proc, ready), log.read_text()
        proc.send_signal(getattr(signal, signame))
        code = proc.wait(timeout=120)
    finally:
        if proc.poll() is None:
            proc.kill()
            proc.wait()
    err = log.read_text()
    assert code == 130, err
    assert f"cablefam resume {run_dir}" in err
    assert err.strip().splitlines()[-1].startswith("cablefam: ")
    states = task_states(run_dir)
    assert 1 <= n_done(states) < len(TASKS), states
    signalled = next(t for t, g in seen.items() if g == every)
    assert states[signalled] == "checkpoint", states
    assert every < checkpoint_generation(run_dir, signalled) < LONG_GENERATIONS
    assert not (run_dir / "front.parquet").exists()
    assert_no_half_written_file(run_dir)
    assert_plain_data(run_dir)
    resume_and_compare(cli, run_dir, finished_before=finished_task_files(run_dir),
                       reference_front=reference_long)


# ----------------------------------------------------------------------------- in-process

class _StopAfter:
    """Stands in for the SIGINT/SIGTERM flag: reports a stop after ``n`` polls."""

    def __init__(self, n: int):
        self.n, self.calls, self.signal_name = n, 0, "SIGINT"

    def is_set(self):
        self.calls += 1
        return self.calls > self.n

    def install(self):
        return self

    def uninstall(self):
        pass


def _interrupted_run(monkeypatch, sweep_file, out):
    """Stop the serial run at generation 10 of the second task (a poll before each task, one
    per chunk of the dense stage and per batch of the refinement stage, one per generation)."""
    stages = 2  # at this budget one dense chunk and one refinement batch per task
    monkeypatch.setattr(execution, "StopFlag",
                        lambda: _StopAfter(1 + stages + GENERATIONS + 1 + stages + 9))
    with pytest.raises(SweepInterrupted, match="cablefam resume"):
        run_sweep(load_sweep(sweep_file), out)
    monkeypatch.undo()
    return out / SWEEP_NAME


def test_resume_restores_checkpoint_and_skips_finished_tasks(monkeypatch, reference, tmp_path):
    sweep_file, reference_front, _ = reference
    run_dir = _interrupted_run(monkeypatch, sweep_file, tmp_path)
    assert task_states(run_dir) == {TASKS[0]: "done", TASKS[1]: "checkpoint",
                                    TASKS[2]: "none", TASKS[3]: "none"}
    restored, executed = [], []
    original_read, original_execute = TaskStore.read_checkpoint, execution.execute_task

    def read_checkpoint(self):
        state = original_read(self)
        if state is not None:
            restored.append((self.dir.name, state.generation))
        return state

    def execute_task(payload_json, spec, progress=None, stop=None):
        executed.append(f"{spec.member}__{spec.catalog}")
        return original_execute(payload_json, spec, progress=progress, stop=stop)

    monkeypatch.setattr(TaskStore, "read_checkpoint", read_checkpoint)
    monkeypatch.setattr(execution, "execute_task", execute_task)
    before = finished_task_files(run_dir)
    resume_run(run_dir)
    assert executed == list(TASKS[1:])
    assert restored == [(TASKS[1], 10)]
    assert finished_task_files(run_dir)[TASKS[0]] == before[TASKS[0]]
    assert (run_dir / "front.parquet").read_bytes() == reference_front
    info = json.loads((run_dir / "run.json").read_text(encoding="utf-8"))
    assert info["tasks_taken_from_earlier_session"] == 1


def test_resume_of_finished_run_recomputes_nothing(monkeypatch, reference, tmp_path, cli):
    _, reference_front, reference_dir = reference
    run_dir = tmp_path / SWEEP_NAME
    shutil.copytree(reference_dir, run_dir)
    (run_dir / "run.json").unlink()

    def no_task(*args, **kwargs):
        raise AssertionError("a finished task was recomputed")

    monkeypatch.setattr(execution, "execute_task", no_task)
    code, _, err = cli("sweep", reference[0], "--out", tmp_path, "--resume", "--quiet")
    assert code == 0, err
    assert (run_dir / "front.parquet").read_bytes() == reference_front
    info = json.loads((run_dir / "run.json").read_text(encoding="utf-8"))
    assert info["tasks_taken_from_earlier_session"] == len(TASKS)


def test_checkpoints_are_plain_data(monkeypatch, reference, tmp_path):
    run_dir = _interrupted_run(monkeypatch, reference[0], tmp_path)
    ckpt_dir = run_dir / "tasks" / TASKS[1]
    names = sorted(p.name for p in ckpt_dir.iterdir())
    assert "checkpoint.json" in names
    assert all(n == "checkpoint.json" or n.endswith(".parquet") for n in names), names
    doc = json.loads((ckpt_dir / "checkpoint.json").read_text(encoding="utf-8"))
    # numpy's bit-generator state as a plain JSON dict
    assert doc["rng_state"]["bit_generator"] == "PCG64"
    assert isinstance(doc["rng_state"]["state"]["state"], int)
    assert_plain_data(run_dir)
    assert_no_half_written_file(run_dir)


def test_package_has_no_pickle():
    pattern = re.compile(r"^\s*(import|from)\s+(c?pickle|dill|cloudpickle|joblib|shelve)\b",
                         re.MULTILINE)
    for path in Path(cablefam.optimizer.__file__).parent.rglob("*.py"):
        assert not pattern.search(path.read_text(encoding="utf-8")), path
    src = "\n".join(p.read_text(encoding="utf-8")
                    for p in Path(cablefam.optimizer.__file__).parent.rglob("*.py"))
    assert "np.save(" not in src and "allow_pickle=True" not in src


# ----------------------------------------------------------------------------- refusals

@pytest.fixture
def unfinished_run(tmp_path, cli):
    """A run of a sweep whose catalogs are copies in tmp_path, with its last task unfinished
    (as after a kill): (sweep file, catalog copy, run folder)."""
    cat_dir = tmp_path / "cat"
    cat_dir.mkdir()
    for name in ("baseline.toml", "lightweight.toml"):
        shutil.copy(CATALOG_DIR / name, cat_dir / name)
    sweep_file = tmp_path / "small.toml"
    sweep_file.write_text(small_sweep_text(cat_dir), encoding="utf-8")
    out = tmp_path / "runs"
    code, _, err = cli("sweep", sweep_file, "--out", out, "--generations", "4", "--quiet")
    assert code == 0, err
    run_dir = out / SWEEP_NAME
    for name in ("front.parquet", "run.json"):
        (run_dir / name).unlink()
    (run_dir / "tasks" / TASKS[-1] / "result.json").unlink()
    return sweep_file, cat_dir / "lightweight.toml", run_dir


def _append_comment(path: Path) -> None:
    path.write_text(path.read_text(encoding="utf-8") + "# a comment added later\n",
                    encoding="utf-8")


@pytest.mark.parametrize("changed", ["sweep", "catalog"])
@pytest.mark.parametrize("how", ["resume", "sweep --resume"])
def test_resume_refuses_when_inputs_changed(changed, how, unfinished_run, cli):
    sweep_file, catalog_file, run_dir = unfinished_run
    _append_comment(sweep_file if changed == "sweep" else catalog_file)
    args = (["resume", run_dir] if how == "resume"
            else ["sweep", sweep_file, "--out", run_dir.parent, "--resume"])
    code, out, err = cli(*args, "--quiet")
    assert code == 2
    assert out == ""
    lines = err.strip().splitlines()
    assert len(lines) == 1, err
    assert lines[0].startswith("cablefam: error: cannot resume: ")
    assert "SHA-256" in lines[0] and "--force" in lines[0]
    assert ("sweep file" if changed == "sweep" else "catalog 'lightweight'") in lines[0]
    assert not (run_dir / "front.parquet").exists()
    assert not (run_dir / "tasks" / TASKS[-1] / "result.json").exists()

    code, _, err = cli(*args, "--quiet", "--force")
    assert code == 0, err
    info = json.loads((run_dir / "run.json").read_text(encoding="utf-8"))
    assert info["resumed_with_force"] is True
    assert info["tasks_taken_from_earlier_session"] == len(TASKS) - 1


def test_resume_refuses_other_settings(unfinished_run, cli):
    sweep_file, _, run_dir = unfinished_run
    code, _, err = cli("sweep", sweep_file, "--out", run_dir.parent, "--resume", "--seed", "8",
                       "--quiet")
    assert code == 2
    assert len(err.strip().splitlines()) == 1 and "differ from the run" in err


def test_resume_without_run_state_is_one_line(tmp_path, cli):
    code, _, err = cli("resume", tmp_path)
    assert code == 2
    assert err.strip().splitlines() == [f"cablefam: error: {tmp_path}: nothing to resume "
                                        "(no run-state.json)"]


def test_resume_unchanged_inputs_is_identical(unfinished_run, cli, tmp_path):
    """Resuming the unfinished run equals a fresh run of the same sweep and settings."""
    sweep_file, _, run_dir = unfinished_run
    code, _, err = cli("resume", run_dir, "--quiet")
    assert code == 0, err
    fresh = tmp_path / "fresh"
    code, _, err = cli("sweep", sweep_file, "--out", fresh, "--generations", "4", "--quiet")
    assert code == 0, err
    assert ((run_dir / "front.parquet").read_bytes()
            == (fresh / SWEEP_NAME / "front.parquet").read_bytes())


def test_no_files_other_than_plain_data_after_a_full_run(reference):
    assert_plain_data(reference[2])
    assert_no_half_written_file(reference[2])
    assert set(os.listdir(reference[2] / "tasks")) == set(TASKS)
