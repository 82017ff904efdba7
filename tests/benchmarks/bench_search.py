"""Search benchmark: does the answer depend on the seed, and how close is it to the true front?

For every member x catalog task of the bundled demo sweep, the search (``run_task``, the
sweep's own budget) runs with 5 seeds. A *reference front* per task is the non-dominated union
of a dense stage 20x the task budget (another seed) and every seed's front. Each front's
hypervolume is taken in the reference front's normalisation (ideal 0, nadir 1, reference point
1.1 in every objective; moocore's exact hypervolume) and reported as a share of the
reference's. Printed per task: the 5 shares, their spread (max - min) / max, evaluations per
second of the search loop and task seconds; then the medians, and one JSON line.

Targets (from the search issue): every share >= 0.999, spread <= 0.2 %, >= 200,000 evaluations
per second.

Run from the repository root (one thread, a quiet machine gives the cleanest figures)::

    .venv/bin/python tests/benchmarks/bench_search.py [--seeds 5] [--reference-factor 20]

The file name does not start with ``test_``: pytest does not collect it.
"""

from __future__ import annotations

import os

for _var in ("OMP_NUM_THREADS", "OPENBLAS_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ[_var] = "1"

import argparse  # noqa: E402
import json  # noqa: E402
import statistics  # noqa: E402
import time  # noqa: E402
from dataclasses import replace  # noqa: E402

import moocore  # noqa: E402
import numpy as np  # noqa: E402

from cablefam.optimizer.inputs.sweep_spec import demo_sweep_path, load_sweep  # noqa: E402
from cablefam.optimizer.search.budget import task_budget  # noqa: E402
from cablefam.optimizer.search.task import (RecordingProblem, run_dense_stage,  # noqa: E402
                                            run_task, task_seed)


def front_objectives(sweep, member, catalog, x):
    """Objective matrix (minimised) of decision vectors, re-evaluated exactly."""
    problem = RecordingProblem(sweep, member, catalog, seed=0)
    f, g, known = problem.evaluate_search(x)
    return f


def hv_share(f, ideal, nadir, ref_hv):
    span = np.where(nadir > ideal, nadir - ideal, 1.0)
    z = (f - ideal) / span
    ref = np.full(z.shape[1], 1.1)
    z = z[np.all(z < ref, axis=1)]
    return float(moocore.hypervolume(z, ref=ref)) / ref_hv if len(z) else 0.0


def reference_front(sweep, member, catalog, total, fronts):
    problem = RecordingProblem(sweep, member, catalog, seed=99)
    budget = task_budget(sweep.spec.search.population, sweep.spec.search.generations, total)
    run_dense_stage(problem, budget, seed=987654321)
    f = np.vstack([problem.archive.f] + fronts)
    return f[moocore.is_nondominated(f)]


def main(argv=None):
    ap = argparse.ArgumentParser()
    ap.add_argument("--seeds", type=int, default=5)
    ap.add_argument("--reference-factor", type=int, default=20)
    ap.add_argument("--member", default=None)
    ap.add_argument("--sweep", default=None,
                    help="a sweep file instead of the bundled demo (e.g. with braid and foam)")
    ap.add_argument("--generations", type=int, default=None,
                    help="genetic generations instead of the sweep file's")
    ap.add_argument("--evaluations", type=int, default=None,
                    help="evaluations per task instead of the sweep file's")
    args = ap.parse_args(argv)
    sweep = load_sweep(args.sweep or demo_sweep_path())
    s = sweep.spec.search
    generations = args.generations or s.generations
    if args.evaluations:
        sweep = replace(sweep, spec=sweep.spec.model_copy(update={
            "search": s.model_copy(update={"evaluations_per_task": args.evaluations})}))
        s = sweep.spec.search
    budget = task_budget(s.population, generations, s.evaluations_per_task)
    print(f"bench_search: demo sweep, budget {budget.total} evaluations per task "
          f"({budget.dense} dense + {budget.population} x {budget.generations} genetic), "
          f"{args.seeds} seeds; load average {os.getloadavg()[0]:.2f}")
    rows = []
    for member in sweep.spec.member:
        if args.member and member.name != args.member:
            continue
        for catalog in (c.name for c in sweep.catalogs):
            fronts, rates, secs = [], [], []
            for k in range(args.seeds):
                seed = task_seed(k + 1, member.name, catalog)
                t0 = time.perf_counter()
                r = run_task(sweep, member, catalog, seed, generations, s.population)
                dt = time.perf_counter() - t0
                fronts.append(front_objectives(sweep, member, catalog, r.x_front))
                rates.append(r.evaluations / dt)
                secs.append(dt)
            ref = reference_front(sweep, member, catalog, args.reference_factor * budget.total,
                                  fronts)
            ideal, nadir = ref.min(axis=0), ref.max(axis=0)
            ref_hv = hv_share(ref, ideal, nadir, 1.0)
            shares = [hv_share(f, ideal, nadir, ref_hv) for f in fronts]
            spread = (max(shares) - min(shares)) / max(shares)
            rows.append({"task": f"{member.name} x {catalog}", "shares": shares,
                         "spread": spread, "rate": statistics.median(rates),
                         "seconds": statistics.median(secs),
                         "front_rows": [len(f) for f in fronts]})
            print(f"{member.name:>16} x {catalog:<17} HV/ref " + " ".join(
                f"{v:.5f}" for v in shares) + f"  spread {100 * spread:.3f} %  "
                f"{statistics.median(rates):>9,.0f} eval/s  {statistics.median(secs):.2f} s  "
                f"rows {min(len(f) for f in fronts)}-{max(len(f) for f in fronts)}", flush=True)
    worst = min(min(r["shares"]) for r in rows)
    print(f"worst share {worst:.5f} (target >= 0.999); largest spread "
          f"{100 * max(r['spread'] for r in rows):.3f} % (target <= 0.2 %); median rate "
          f"{statistics.median(r['rate'] for r in rows):,.0f} evaluations/s (goal >= 200,000)")
    print(json.dumps({"rows": rows, "worst_share": worst}))


if __name__ == "__main__":
    main()
