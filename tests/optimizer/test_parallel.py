"""Parallel and distributed execution: the front does not depend on the number of workers or on
where tasks ran (local processes, a Dask LocalCluster on 127.0.0.1); bad --workers values.

The reference is a single-process in-process run of the cut-down demo sweep of test_resume.
"""

from __future__ import annotations

import json
import os
import shutil
import signal
import subprocess
import sys
import time
from pathlib import Path

import pytest

from cablefam.optimizer.batch.sweep import resume_run, run_sweep
from cablefam.optimizer.inputs.sweep_spec import load_sweep
from tests.optimizer.test_resume import SWEEP_NAME, TASKS, small_sweep_text


@pytest.fixture(scope="module")
def reference(tmp_path_factory):
    """(sweep file, bytes of the single-process front.parquet, its run folder)."""
    base = tmp_path_factory.mktemp("parallel-reference")
    sweep_file = base / "small.toml"
    sweep_file.write_text(small_sweep_text(), encoding="utf-8")
    run_dir = run_sweep(load_sweep(sweep_file), base / "serial", workers=1)
    return sweep_file, (run_dir / "front.parquet").read_bytes(), run_dir


@pytest.fixture(scope="module")
def cluster():
    """A Dask LocalCluster on 127.0.0.1: two worker processes, one thread each."""
    distributed = pytest.importorskip("dask.distributed")
    with distributed.LocalCluster(n_workers=2, threads_per_worker=1, processes=True,
                                  host="127.0.0.1", dashboard_address=None) as c:
        yield c


def test_two_workers_same_bytes_as_one(reference, tmp_path, cli):
    sweep_file, reference_front, _ = reference
    code, out, err = cli("sweep", sweep_file, "--out", tmp_path, "--workers", "2")
    assert code == 0, err
    run_dir = tmp_path / SWEEP_NAME
    assert out.strip() == str(run_dir)
    assert (run_dir / "front.parquet").read_bytes() == reference_front
    # progress across workers: tasks done / running / queued
    summary = [line for line in err.splitlines() if line.startswith("tasks: ")]
    assert summary and all("running" in s and "queued" in s for s in summary), err
    assert f"tasks: {len(TASKS)}/{len(TASKS)} done" in summary[-1]
    info = json.loads((run_dir / "run.json").read_text(encoding="utf-8"))
    assert [f"{t['member']}__{t['catalog']}" for t in info["tasks"]] == list(TASKS)


def test_workers_auto_same_bytes(reference, tmp_path, cli):
    sweep_file, reference_front, _ = reference
    code, _, err = cli("sweep", sweep_file, "--out", tmp_path, "--workers", "auto", "--quiet")
    assert code == 0, err
    assert (tmp_path / SWEEP_NAME / "front.parquet").read_bytes() == reference_front


@pytest.mark.parametrize("value", ["0", "x", "-1", "1.5", "", "auto2"])
@pytest.mark.parametrize("command", ["sweep", "resume"])
def test_invalid_workers_is_one_line(value, command, reference, tmp_path, cli):
    args = (["sweep", reference[0], "--out", tmp_path] if command == "sweep"
            else ["resume", reference[2]])
    code, out, err = cli(*args, "--workers", value, "--quiet")
    assert code == 2
    assert out == ""
    assert err.strip().splitlines() == [f"cablefam: error: --workers = {value!r}: give a "
                                        "number >= 1 or 'auto'"]
    assert not (tmp_path / SWEEP_NAME).exists()


def test_resume_with_two_workers_same_bytes(reference, tmp_path, cli):
    """Half of the tasks finished in a serial session, the rest in two worker processes."""
    _, reference_front, reference_dir = reference
    run_dir = tmp_path / SWEEP_NAME
    shutil.copytree(reference_dir, run_dir)
    for name in ("front.parquet", "run.json"):
        (run_dir / name).unlink()
    for t in TASKS[1::2]:
        shutil.rmtree(run_dir / "tasks" / t)
    code, _, err = cli("resume", run_dir, "--workers", "2", "--quiet")
    assert code == 0, err
    assert (run_dir / "front.parquet").read_bytes() == reference_front
    info = json.loads((run_dir / "run.json").read_text(encoding="utf-8"))
    assert info["tasks_taken_from_earlier_session"] == len(TASKS) // 2


def test_local_cluster_same_bytes(reference, cluster, tmp_path):
    sweep_file, reference_front, _ = reference
    run_dir = run_sweep(load_sweep(sweep_file), tmp_path, scheduler=cluster.scheduler_address)
    assert (run_dir / "front.parquet").read_bytes() == reference_front
    # the client stored every task at once, as a local run does
    assert sorted(os.listdir(run_dir / "tasks")) == sorted(TASKS)
    for t in TASKS:
        assert (run_dir / "tasks" / t / "result.json").is_file()
        assert not (run_dir / "tasks" / t / "checkpoint.json").exists()


def test_local_cluster_cli_and_resume_same_bytes(reference, cluster, tmp_path, cli):
    """Through the command line, twice on the same cluster (same task keys), the second time
    resuming a run with two finished tasks."""
    sweep_file, reference_front, reference_dir = reference
    code, _, err = cli("sweep", sweep_file, "--out", tmp_path / "a", "--scheduler",
                       cluster.scheduler_address, "--quiet")
    assert code == 0, err
    assert (tmp_path / "a" / SWEEP_NAME / "front.parquet").read_bytes() == reference_front

    run_dir = tmp_path / "b" / SWEEP_NAME
    shutil.copytree(reference_dir, run_dir)
    for name in ("front.parquet", "run.json"):
        (run_dir / name).unlink()
    for t in TASKS[:2]:
        shutil.rmtree(run_dir / "tasks" / t)
    resume_run(run_dir, scheduler=cluster.scheduler_address)
    assert (run_dir / "front.parquet").read_bytes() == reference_front
    info = json.loads((run_dir / "run.json").read_text(encoding="utf-8"))
    assert info["tasks_taken_from_earlier_session"] == 2


# ----------------------------------------------------------------------------- stopping

def session_pids(sid: int) -> list[int]:
    """Processes of session ``sid`` (Linux /proc)."""
    out = []
    for stat in Path("/proc").glob("[0-9]*/stat"):
        try:
            fields = stat.read_text().rsplit(")", 1)[1].split()
        except OSError:
            continue
        if int(fields[3]) == sid:  # after the command: state ppid pgrp session ...
            out.append(int(stat.parent.name))
    return out


def _start_sweep(sweep_file, out, *extra):
    """A real sweep process in a session of its own (so its workers can be found)."""
    return subprocess.Popen([sys.executable, "-m", "cablefam", "sweep", str(sweep_file),
                             "--out", str(out), "--quiet", *extra],
                            stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, text=True,
                            start_new_session=True)


def _cmdline(pid: int) -> bytes:
    try:
        return Path(f"/proc/{pid}/cmdline").read_bytes()
    except OSError:
        return b""


@pytest.mark.skipif(not sys.platform.startswith("linux"), reason="reads /proc")
def test_sigkill_of_parent_leaves_no_worker_processes(reference, tmp_path):
    """Worker processes of a SIGKILLed sweep end by themselves within seconds (they
    ignore SIGINT/SIGTERM, so nothing else would stop them writing into the run folder)."""
    proc = _start_sweep(reference[0], tmp_path, "--workers", "2", "--checkpoint-every", "1")
    run_dir = tmp_path / SWEEP_NAME
    try:
        t_end = time.monotonic() + 60
        while proc.poll() is None and time.monotonic() < t_end:
            if any(run_dir.glob("tasks/*/checkpoint.json")):
                break
            time.sleep(0.005)
        proc.kill()
        proc.wait()
        # they poll their parent every 0.5 s; a worker still starting up (imports) on a loaded
        # two-core machine checks only once it is up: allow 15 s
        t_end = time.monotonic() + 15.0
        while time.monotonic() < t_end and any(
                b"resource_tracker" not in _cmdline(p) for p in session_pids(proc.pid)):
            time.sleep(0.1)
        # multiprocessing's resource tracker writes nothing into the run folder and ends once
        # the last holder of its pipe is gone; the workers are what must not run on
        left = [p for p in session_pids(proc.pid) if b"resource_tracker" not in _cmdline(p)]
        cmdlines = [_cmdline(p)[:200] for p in left]
    finally:
        for pid in session_pids(proc.pid):  # only the processes this test started
            os.kill(pid, signal.SIGKILL)
    assert left == [], f"{len(left)} processes of the killed sweep still run: {cmdlines}"


@pytest.mark.slow
def test_sigint_on_cluster_stops_promptly(reference, cluster, tmp_path):
    """Tasks of ~10 s (1000 generations); SIGINT 4 s after the start must end the client
    within 4 s with exit code 130."""
    proc = _start_sweep(reference[0], tmp_path, "--generations", "1000", "--evaluations",
                        "20000", "--scheduler", cluster.scheduler_address)
    try:
        time.sleep(4.0)
        proc.send_signal(signal.SIGINT)
        t0 = time.monotonic()
        code = proc.wait(timeout=120)
        took = time.monotonic() - t0
    finally:
        if proc.poll() is None:
            proc.kill()
            proc.wait()
    assert code == 130, proc.stderr.read()
    assert took < 4.0, f"SIGINT took {took:.1f} s to stop the sweep"
