"""Parallel benchmark: wall time of sweeps serially, in 2 local worker processes and on a
2-worker Dask LocalCluster; checkpoint overhead; time to resume a killed run.

Two sweeps:

* ``demo``: the bundled demo sweep as it is;
* ``large``: a larger family written into a temporary folder, 8 members (the demo's three and
  five of our own) x 3 bundled catalogs (baseline, lightweight, high-temperature), with the
  demo's search bounds and tolerance, population and generations chosen so that a task takes a
  few seconds.

For each: wall time with 1 worker, with 2 local workers (``--workers 2``) and on a LocalCluster
(127.0.0.1, two worker processes, one thread each; started before the clock runs), the speed-up
ratios, and whether every front is byte-identical to the serial one. For ``large`` also:

* checkpoint overhead, with 2 workers: no checkpoints at all (``checkpoint_seconds = inf``),
  a checkpoint every generation (``--checkpoint-every 1``) and the default (every ~30 s of work:
  the 2-worker run above);
  plus, serially on two tasks, the measured cost of one checkpoint write (``TaskStore.
  write_checkpoint`` wrapped in a timer), which gives the overhead of the 30 s default for tasks
  longer than 30 s: cost / 30 s;
* resume: a real ``cablefam sweep --workers 2`` process is killed with SIGKILL once half of
  the tasks are finished, then ``cablefam resume RUN --workers 2`` is timed (a fresh interpreter,
  as a user would run it) and its front compared with the uninterrupted one.

Run from the repository root (about 7-8 minutes on 2 cores)::

    .venv/bin/python tests/benchmarks/bench_parallel.py

The table goes to stdout; the last line printed is one JSON object with the figures.
The file name does not start with ``test_``: pytest does not collect it.
"""

from __future__ import annotations

import os

# One thread per process (each worker is one core), set before numpy is imported.
for _var in ("OMP_NUM_THREADS", "OPENBLAS_NUM_THREADS", "MKL_NUM_THREADS",
             "VECLIB_MAXIMUM_THREADS", "NUMEXPR_NUM_THREADS", "BLIS_NUM_THREADS"):
    os.environ[_var] = "1"

import argparse  # noqa: E402
import json  # noqa: E402
import math  # noqa: E402
import platform  # noqa: E402
import re  # noqa: E402
import signal  # noqa: E402
import subprocess  # noqa: E402
import sys  # noqa: E402
import tempfile  # noqa: E402
import time  # noqa: E402
from pathlib import Path  # noqa: E402

import cablefam.catalogs as catalogs  # noqa: E402
from cablefam.optimizer.batch.task_store import TaskStore  # noqa: E402
from cablefam.optimizer.search.task import run_task, task_seed  # noqa: E402
from cablefam.optimizer.batch.sweep import run_sweep  # noqa: E402
from cablefam.optimizer.run_folder.files import RUN_FILE  # noqa: E402
from cablefam.optimizer.inputs.sweep_spec import demo_sweep_path, load_sweep  # noqa: E402

CATALOG_DIR = Path(catalogs.__file__).resolve().parent
LARGE_CATALOGS = ("baseline.toml", "lightweight.toml", "high-temperature.toml")

#: Five members of our own added to the demo's three (fictional operating points).
EXTRA_MEMBERS = """
[[member]]
name = "quay-crane-50"
impedance_ohm = 50
impedance_tolerance_ohm = 1.5
frequency_hz = 150e6
power_w = 500
peak_voltage_v = 1000
ambient_c = 45
max_outer_diameter_m = 16e-3
field_safety_factor = 3.0
single_mode_margin = 1.2

[[member]]
name = "buoy-telemetry-50"
impedance_ohm = 50
impedance_tolerance_ohm = 2.0
frequency_hz = 868e6
power_w = 5
peak_voltage_v = 100
ambient_c = 25
max_outer_diameter_m = 6e-3
single_mode_margin = 1.3

[[member]]
name = "camera-75"
impedance_ohm = 75
impedance_tolerance_ohm = 3.0
frequency_hz = 3.0e9
power_w = 1
peak_voltage_v = 60
ambient_c = 30
max_outer_diameter_m = 6e-3
single_mode_margin = 1.2

[[member]]
name = "radar-50"
impedance_ohm = 50
impedance_tolerance_ohm = 1.5
frequency_hz = 9.4e9
power_w = 50
peak_voltage_v = 500
ambient_c = 30
max_outer_diameter_m = 8e-3
field_safety_factor = 2.0
single_mode_margin = 1.2

[[member]]
name = "distribution-75"
impedance_ohm = 75
impedance_tolerance_ohm = 3.0
frequency_hz = 600e6
power_w = 10
peak_voltage_v = 100
ambient_c = 35
max_outer_diameter_m = 10e-3
single_mode_margin = 1.3
"""


def large_sweep_text(population: int, generations: int) -> str:
    """The demo sweep with 8 members, 3 catalogs (absolute paths), the given search size."""
    text = demo_sweep_path().read_text(encoding="utf-8")
    paths = ", ".join(f'"{CATALOG_DIR / c}"' for c in LARGE_CATALOGS)
    for pattern, new in [(r'(?m)^name = "larkspur-harbour"', 'name = "bench-large"'),
                         (r"(?ms)^catalogs = \[.*?\]", f"catalogs = [{paths}]"),
                         (r"(?m)^population = \d+", f"population = {population}"),
                         (r"(?m)^generations = \d+", f"generations = {generations}")]:
        text, n = re.subn(pattern, lambda _m, new=new: new, text, count=1)
        if n != 1:
            raise SystemExit(f"demo sweep no longer matches {pattern!r}; update this script")
    return text.rstrip() + "\n" + EXTRA_MEMBERS


def demo_sweep_file(folder: Path) -> Path:
    """A copy of the demo sweep with absolute catalog paths (same front as the bundled one
    up to the provenance's file name)."""
    text = demo_sweep_path().read_text(encoding="utf-8")
    text = re.sub(r'"\.\./\.\./catalogs/', f'"{CATALOG_DIR}/', text)
    path = folder / "demo.toml"
    path.write_text(text, encoding="utf-8")
    return path


def timed_run(sweep_file: Path, out: Path, **kwargs) -> tuple[float, bytes, dict]:
    """Wall time of an in-process ``run_sweep``, the front's bytes, run.json."""
    sweep = load_sweep(sweep_file)
    t0 = time.perf_counter()
    run_dir = run_sweep(sweep, out, **kwargs)
    wall = time.perf_counter() - t0
    info = json.loads((run_dir / RUN_FILE).read_text(encoding="utf-8"))
    return wall, (run_dir / "front.parquet").read_bytes(), info


def checkpoint_cost(sweep_file: Path, out: Path, n_tasks: int = 2) -> dict:
    """Serially, with a checkpoint every generation: seconds per checkpoint write and the share
    of task time spent writing checkpoints."""
    sweep = load_sweep(sweep_file)
    spent, calls = [0.0], [0]
    original = TaskStore.write_checkpoint

    def timed(self, state):
        t0 = time.perf_counter()
        original(self, state)
        spent[0] += time.perf_counter() - t0
        calls[0] += 1

    TaskStore.write_checkpoint = timed
    try:
        task_s = 0.0
        pairs = [(m, c.name) for m in sweep.spec.member for c in sweep.catalogs][:n_tasks]
        for member, catalog in pairs:
            store = TaskStore(out, member.name, catalog)
            t0 = time.perf_counter()
            run_task(sweep, member, catalog, task_seed(sweep.spec.seed, member.name, catalog),
                     sweep.spec.search.generations, sweep.spec.search.population,
                     store=store, checkpoint_every=1)
            task_s += time.perf_counter() - t0
    finally:
        TaskStore.write_checkpoint = original
    per = spent[0] / calls[0]
    return {"checkpoints": calls[0], "seconds_per_checkpoint": per,
            "share_every_generation": spent[0] / task_s,
            "share_every_30s_estimate": per / 30.0}


def session_pids(sid: int) -> list[int]:
    """Processes of session ``sid`` (Linux /proc), e.g. a killed sweep's worker processes."""
    out = []
    for stat in Path("/proc").glob("[0-9]*/stat"):
        try:
            fields = stat.read_text().rsplit(")", 1)[1].split()
        except OSError:
            continue
        if int(fields[3]) == sid:  # fields after the command: state ppid pgrp session ...
            out.append(int(stat.parent.name))
    return out


def kill_and_resume(sweep_file: Path, out: Path, n_tasks: int, workers: int) -> dict:
    """SIGKILL a real sweep process and its workers (as a crash of the machine would) once half
    the tasks are finished; time the resume."""
    name = load_sweep(sweep_file).spec.name
    run_dir = out / name
    cmd = [sys.executable, "-m", "cablefam"]
    proc = subprocess.Popen(cmd + ["sweep", str(sweep_file), "--out", str(out), "--quiet",
                                   "--workers", str(workers)],
                            stdout=subprocess.DEVNULL, stderr=subprocess.PIPE,
                            start_new_session=True)
    t0 = time.perf_counter()
    while proc.poll() is None:
        if len(list(run_dir.glob("tasks/*/result.json"))) >= n_tasks // 2:
            proc.send_signal(signal.SIGKILL)
            break
        time.sleep(0.01)
    proc.wait()
    killed_after = time.perf_counter() - t0
    # the worker processes outlive a SIGKILLed parent (they ignore SIGINT/SIGTERM): kill them
    orphans = [pid for pid in session_pids(proc.pid) if pid != proc.pid]
    for pid in orphans:
        os.kill(pid, signal.SIGKILL)
    done = len(list(run_dir.glob("tasks/*/result.json")))
    t0 = time.perf_counter()
    res = subprocess.run(cmd + ["resume", str(run_dir), "--quiet", "--workers", str(workers)],
                         capture_output=True, text=True)
    resume_s = time.perf_counter() - t0
    if res.returncode != 0:
        raise SystemExit(f"resume failed: {res.stderr}")
    info = json.loads((run_dir / RUN_FILE).read_text(encoding="utf-8"))
    return {"killed_after_s": killed_after, "tasks_done_at_kill": done,
            "orphan_processes_after_parent_kill": len(orphans),
            "tasks_taken_from_earlier_session": info["tasks_taken_from_earlier_session"],
            "resume_s": resume_s, "front": (run_dir / "front.parquet").read_bytes()}


def bench_family(label, sweep_file, tmp, cluster, extra):
    """1 worker, 2 workers, LocalCluster; returns the figures and the serial front."""
    out = {}
    w1, front1, info = timed_run(sweep_file, tmp / f"{label}-w1", workers=1)
    w2, front2, _ = timed_run(sweep_file, tmp / f"{label}-w2", workers=2)
    wc, frontc, _ = timed_run(sweep_file, tmp / f"{label}-cluster",
                              scheduler=cluster.scheduler_address)
    n_tasks = info["counts"]["tasks"]
    task_s = [t["seconds"] for t in info["tasks"]]
    out.update(tasks=n_tasks, task_seconds_mean=sum(task_s) / n_tasks,
               task_seconds_max=max(task_s), wall_1_worker_s=w1, wall_2_workers_s=w2,
               wall_cluster_2_s=wc, speedup_2_workers=w1 / w2, speedup_cluster_2=w1 / wc,
               identical_2_workers=front2 == front1, identical_cluster=frontc == front1,
               front_rows=info["counts"]["front_rows"])
    extra[label] = front1
    return out


def source_digest() -> str:
    """SHA-256 over the package sources and catalogs (to notice edits during a long run)."""
    import hashlib

    root = CATALOG_DIR.parent
    h = hashlib.sha256()
    for path in sorted([*root.glob("optimizer/**/*.py"), *root.glob("physics/**/*.py"),
                        *root.glob("optimizer/demo/*.toml"), *CATALOG_DIR.glob("*.toml")]):
        h.update(path.relative_to(root).as_posix().encode() + b"\0" + path.read_bytes())
    return h.hexdigest()


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--population", type=int, default=100, help="of the large family")
    parser.add_argument("--generations", type=int, default=150, help="of the large family")
    parser.add_argument("--skip-demo", action="store_true")
    args = parser.parse_args(argv)

    from dask.distributed import LocalCluster

    results = {"python": platform.python_version(), "cores": os.cpu_count(),
               "load_average_start": os.getloadavg()[0]}
    digest = source_digest()
    fronts = {}
    with tempfile.TemporaryDirectory(prefix="cablefam-bench-par-") as tmp_name:
        tmp = Path(tmp_name)
        large = tmp / "large.toml"
        large.write_text(large_sweep_text(args.population, args.generations), encoding="utf-8")
        t0 = time.perf_counter()
        with LocalCluster(n_workers=2, threads_per_worker=1, processes=True, host="127.0.0.1",
                          dashboard_address=None) as cluster:
            results["cluster_start_s"] = time.perf_counter() - t0
            if not args.skip_demo:
                results["demo"] = bench_family("demo", demo_sweep_file(tmp), tmp, cluster,
                                               fronts)
            results["large"] = big = bench_family("large", large, tmp, cluster, fronts)
        big["population"], big["generations"] = args.population, args.generations

        # checkpoint overhead, 2 workers
        w_none, f_none, _ = timed_run(large, tmp / "ck-none", workers=2,
                                      checkpoint_seconds=math.inf)
        w_every, f_every, _ = timed_run(large, tmp / "ck-every", workers=2, checkpoint_every=1)
        w_default = big["wall_2_workers_s"]  # the 2-worker run above: default checkpoints
        cost = checkpoint_cost(large, tmp / "ck-cost")
        results["checkpoints"] = {
            "wall_none_s": w_none, "wall_every_1_s": w_every, "wall_default_30s_s": w_default,
            "overhead_every_1": w_every / w_none - 1.0,
            "overhead_default_30s": w_default / w_none - 1.0,
            "identical": f_none == f_every == fronts["large"], **cost}

        # resume after SIGKILL, 2 workers
        kr = kill_and_resume(large, tmp / "kill", big["tasks"], workers=2)
        kr["identical"] = kr.pop("front") == fronts["large"]
        kr["resume_over_full_run"] = kr["resume_s"] / big["wall_2_workers_s"]
        results["resume"] = kr

    results["load_average_end"] = os.getloadavg()[0]
    results["sources_changed_during_run"] = source_digest() != digest
    print_table(results)
    print(json.dumps(results, sort_keys=True))


def print_table(r):
    print(f"cablefam parallel benchmark: Python {r['python']}, {r['cores']} cores, load "
          f"average {r['load_average_start']:.1f} at start, {r['load_average_end']:.1f} at end; "
          f"LocalCluster start {r['cluster_start_s']:.1f} s (not counted)")
    if r["sources_changed_during_run"]:
        print("WARNING: package sources or catalogs changed during the run; fronts of "
              "different runs may differ for that reason")
    print(f"{'sweep':<8}{'tasks':>6}{'task s':>8}{'1 worker s':>12}{'2 workers s':>13}"
          f"{'x':>6}{'cluster s':>11}{'x':>6}  identical")
    for label in ("demo", "large"):
        if label not in r:
            continue
        f = r[label]
        same = "yes" if f["identical_2_workers"] and f["identical_cluster"] else "NO"
        print(f"{label:<8}{f['tasks']:>6}{f['task_seconds_mean']:>8.2f}"
              f"{f['wall_1_worker_s']:>12.1f}{f['wall_2_workers_s']:>13.1f}"
              f"{f['speedup_2_workers']:>6.2f}{f['wall_cluster_2_s']:>11.1f}"
              f"{f['speedup_cluster_2']:>6.2f}  {same}")
    c = r["checkpoints"]
    print(f"checkpoints (large, 2 workers): none {c['wall_none_s']:.1f} s, every generation "
          f"{c['wall_every_1_s']:.1f} s ({100 * c['overhead_every_1']:+.1f} %), default 30 s "
          f"{c['wall_default_30s_s']:.1f} s ({100 * c['overhead_default_30s']:+.1f} %); "
          f"identical: {'yes' if c['identical'] else 'NO'}")
    print(f"one checkpoint write: {1000 * c['seconds_per_checkpoint']:.1f} ms "
          f"({c['checkpoints']} writes, {100 * c['share_every_generation']:.1f} % of task time "
          f"when every generation; {100 * c['share_every_30s_estimate']:.3f} % at one per 30 s)")
    k = r["resume"]
    print(f"resume (large, 2 workers): killed after {k['killed_after_s']:.1f} s with "
          f"{k['tasks_done_at_kill']} tasks done ({k['orphan_processes_after_parent_kill']} worker "
          f"processes outlived the parent, killed too); resume took {k['resume_s']:.1f} s "
          f"({100 * k['resume_over_full_run']:.0f} % of an uninterrupted run), "
          f"{k['tasks_taken_from_earlier_session']} tasks kept; identical: "
          f"{'yes' if k['identical'] else 'NO'}")


if __name__ == "__main__":
    main()
