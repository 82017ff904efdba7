"""Sweep benchmark: wall time of the demo sweep, and how fast one search approaches the front.

Part 1 runs the bundled demo sweep (``run_sweep`` into a temporary folder, no progress output)
and splits its wall time, from ``run.json``, into the physics (the sum over tasks of
``physics_seconds``: the member problem's ``_evaluate``, i.e. decoding, ``evaluate`` and the
constraint margins), the rest of the search loop (pymoo: sampling, mating, survival,
non-dominated sorting, and the feasible archive) and the writing of the run folder (front
re-evaluation with ``max_power``, Parquet, JSON).

Part 2 takes one member x catalog task of the demo with the materials fixed (so that only the
four radii are free), runs the staged search at a series of budgets (evaluations per task), and
compares the hypervolume of its front with that of a dense brute-force grid evaluated with the same
physics (``MemberProblem.evaluate_designs``), with one shared normalization and reference point
(``pymoo.indicators.hv.HV``). The last line printed is one JSON object with the figures.

Run from the repository root::

    .venv/bin/python tests/benchmarks/bench_sweep.py

The file name does not start with ``test_``: pytest does not collect it.
"""

from __future__ import annotations

import os

# One thread everywhere, set before numpy is imported (the figures are single-core figures).
for _var in ("OMP_NUM_THREADS", "OPENBLAS_NUM_THREADS", "MKL_NUM_THREADS",
             "VECLIB_MAXIMUM_THREADS", "NUMEXPR_NUM_THREADS", "BLIS_NUM_THREADS"):
    os.environ[_var] = "1"

import argparse  # noqa: E402
import cProfile  # noqa: E402
import json  # noqa: E402
import platform  # noqa: E402
import pstats  # noqa: E402
import statistics  # noqa: E402
import tempfile  # noqa: E402
import time  # noqa: E402
from dataclasses import replace  # noqa: E402
from pathlib import Path  # noqa: E402

import numpy as np  # noqa: E402
import pymoo  # noqa: E402
from pymoo.indicators.hv import HV  # noqa: E402
from pymoo.util.nds.non_dominated_sorting import NonDominatedSorting  # noqa: E402
from scipy.constants import mu_0, speed_of_light  # noqa: E402

from cablefam.optimizer.inputs.materials import read_toml  # noqa: E402
from cablefam.optimizer.model.objectives import objective_matrix  # noqa: E402
from cablefam.optimizer.search.problem import MemberProblem  # noqa: E402
from cablefam.optimizer.search.task import RecordingProblem, run_task, task_seed  # noqa: E402
from cablefam.optimizer.batch.sweep import run_sweep  # noqa: E402
from cablefam.optimizer.run_folder.files import RUN_FILE  # noqa: E402
from cablefam.optimizer.inputs.sweep_spec import demo_sweep_path, load_sweep, parse_sweep  # noqa: E402

#: The task of part 2: a member of the demo sweep, a catalog, and one material per table.
HV_MEMBER = "mast-feeder-50"
HV_CATALOG = "baseline.toml"
HV_MATERIALS = {"conductors": ["copper"], "shields": ["copper"], "dielectrics": ["solid-pe"],
                "jackets": ["pe"]}
#: Reference point of the hypervolume in objectives normalized to [0, 1] between the ideal
#: and nadir points of the grid's front (common practice, no source).
HV_REFERENCE = 1.1


# --------------------------------------------------------------------------- part 1


def demo_sweep_timing(repeats):
    """Run the demo sweep ``repeats`` times; return the run.json figures of each run."""
    sweep = load_sweep(demo_sweep_path())
    runs = []
    for _ in range(repeats):
        with tempfile.TemporaryDirectory(prefix="cablefam-bench-") as tmp:
            t0 = time.perf_counter()
            run_dir = run_sweep(sweep, tmp, progress=None)
            wall = time.perf_counter() - t0
            info = json.loads((run_dir / RUN_FILE).read_text(encoding="utf-8"))
        tasks = info["tasks"]
        task_s = sum(t["seconds"] for t in tasks)
        physics_s = sum(t["physics_seconds"] for t in tasks)
        runs.append({"wall_s": wall, "run_json_wall_s": info["wall_seconds"],
                     "evaluations": info["counts"]["evaluations"],
                     "front_rows": info["counts"]["front_rows"], "tasks": len(tasks),
                     "task_s": task_s, "physics_s": physics_s,
                     "pymoo_s": task_s - physics_s, "output_s": wall - task_s})
    return runs


# --------------------------------------------------------------------------- part 2


def _label(file_name, line, name):
    parts = Path(file_name).parts
    for top in ("physics", "optimizer", "pymoo"):
        if top in parts:
            return "/".join(parts[len(parts) - parts[::-1].index(top) - 1:]) + f":{line}({name})"
    return f"{Path(file_name).name}:{name}" if file_name != "~" else name


def fixed_material_sweep():
    """The demo sweep restricted to one catalog and one material per table.

    A Monte Carlo impedance yield (if the sweep has a ``[tolerance]`` table) is switched to the
    analytic estimate: deterministic, so that the grid and every seed of the search see exactly
    the same problem, and cheap enough for a dense grid.
    """
    path = demo_sweep_path()
    raw = read_toml(path)
    raw["catalogs"] = [c for c in raw["catalogs"] if c.endswith(HV_CATALOG)]
    raw["search"].update(HV_MATERIALS)
    raw["name"] = raw["name"] + "-hv"
    if "tolerance" in raw:
        raw["tolerance"]["method"] = "analytic"
    return parse_sweep(raw, str(path), path.parent, path.read_text(encoding="utf-8"))


def grid_points(problem: MemberProblem, a_range, ratio_range, n_a, n_ratio, n_shield, n_jacket):
    """A grid of decision vectors: log-spaced a, b = a * ratio, shield and jacket thickness.

    The impedance constraint confines the feasible designs to a thin band of b/a, so the grid
    runs over b/a rather than over b; shield and jacket thickness run over their bounds.
    Points with b outside its bounds are dropped. Returns an (n, 4) decision matrix.
    """
    layout = problem.layout
    b_lo, b_hi = layout.bounds["dielectric_radius_m"]
    a = np.geomspace(*a_range, n_a)
    ratio = np.geomspace(*ratio_range, n_ratio)
    t_s = np.linspace(*layout.bounds["shield_thickness_m"], n_shield)
    t_j = np.linspace(*layout.bounds["jacket_thickness_m"], n_jacket)
    aa, rr, ss, jj = np.meshgrid(a, ratio, t_s, t_j, indexing="ij")
    x = np.column_stack([aa.ravel(), (aa * rr).ravel(), ss.ravel(), jj.ravel()])
    keep = (x[:, 1] >= b_lo) & (x[:, 1] <= b_hi)
    return x[keep]


def impedance_ratio_band(problem: MemberProblem, widening):
    """b/a range of the lossless impedance ``impedance_ohm +- widening * tolerance``."""
    eps = float(problem.designs(np.array([problem.xl]))[0].dielectric["relative_permittivity"][0])
    m = problem.member
    eta_0 = mu_0 * speed_of_light
    z = m.impedance_ohm + widening * m.impedance_tolerance_ohm * np.array([-1.0, 1.0])
    return tuple(np.exp(2.0 * np.pi * np.sqrt(eps) * z / eta_0))


def evaluate_grid(problem: MemberProblem, x, chunk):
    """Decision vectors and objectives of the feasible points of ``x`` (evaluated in chunks)."""
    xs, fs = [], []
    for start in range(0, len(x), chunk):
        part = x[start:start + chunk]
        values, margins, _ = problem.evaluate_designs(part)
        ok = np.all(np.column_stack(list(margins.values())) >= 0.0, axis=1)
        xs.append(part[ok])
        fs.append(objective_matrix(values, problem.objectives)[ok])
    return np.vstack(xs), np.vstack(fs)


def non_dominated(f):
    return f[NonDominatedSorting().do(f, only_non_dominated_front=True)]


def reference_front(problem: MemberProblem, coarse, dense, widening, chunk):
    """Brute-force front in two stages: a coarse grid over the whole box finds the feasible
    region, a dense grid over that region (one coarse step wider each side) resolves it."""
    layout = problem.layout
    if layout.free_geometry != ("inner_radius_m", "dielectric_radius_m", "shield_thickness_m",
                                "jacket_thickness_m") or layout.free_materials:
        raise ValueError(f"the grid expects the four radii free and no material choice, got "
                         f"{layout.free_geometry} and {layout.free_materials}")
    a_box = layout.bounds["inner_radius_m"]
    band = impedance_ratio_band(problem, widening)
    x1 = grid_points(problem, a_box, band, *coarse)
    xf, f1 = evaluate_grid(problem, x1, chunk)
    if len(xf) == 0:
        raise RuntimeError(f"no feasible point on the coarse grid {coarse}: refine it")
    step_a = (a_box[1] / a_box[0]) ** (1.0 / max(coarse[0] - 1, 1))
    step_r = (band[1] / band[0]) ** (1.0 / max(coarse[1] - 1, 1))
    ratio = xf[:, 1] / xf[:, 0]
    a_range = (max(a_box[0], xf[:, 0].min() / step_a), min(a_box[1], xf[:, 0].max() * step_a))
    r_range = (ratio.min() / step_r, ratio.max() * step_r)
    x2 = grid_points(problem, a_range, r_range, *dense)
    _, f2 = evaluate_grid(problem, x2, chunk)
    info = {"coarse_points": int(len(x1)), "coarse_feasible": int(len(xf)),
            "dense_points": int(len(x2)), "dense_feasible": int(len(f2)),
            "dense_inner_radius_m": list(a_range), "dense_radius_ratio": list(r_range)}
    return non_dominated(np.vstack([f1, f2])), info


def search_curve(sweep, member, catalog_name, population, budgets, seed):
    """Front objectives, evaluation counts and seconds of the staged search at each budget."""
    snapshots = {}
    for total in budgets:
        generations = max(1, min(20, (total - 64) // (2 * population)))
        t0 = time.perf_counter()
        r = run_task(sweep, member, catalog_name, seed, generations, population,
                     evaluations_per_task=total)
        seconds = time.perf_counter() - t0
        problem = RecordingProblem(sweep, member, catalog_name, seed=seed)
        f, _, _ = problem.evaluate_search(r.x_front)
        snapshots[total] = (r.evaluations, f, seconds)
    return snapshots


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--repeats", type=int, default=3, help="runs of the demo sweep")
    parser.add_argument("--budgets", type=int, nargs="+",
                        default=[5_000, 10_000, 20_000, 50_000, 100_000, 200_000],
                        help="evaluations per task of the staged search in part 2")
    parser.add_argument("--seeds", type=int, default=3, help="independent searches in part 2")
    parser.add_argument("--member", default=HV_MEMBER, help="member of the demo sweep for "
                        "the hypervolume curve")
    parser.add_argument("--coarse-grid", type=int, nargs=4, default=[150, 21, 4, 3],
                        metavar=("N_A", "N_RATIO", "N_SHIELD", "N_JACKET"),
                        help="grid over the whole box that finds the feasible region")
    parser.add_argument("--grid", type=int, nargs=4, default=[300, 25, 5, 3],
                        metavar=("N_A", "N_RATIO", "N_SHIELD", "N_JACKET"),
                        help="dense grid over the feasible region")
    parser.add_argument("--band-widening", type=float, default=1.3,
                        help="grid ratio band as a multiple of the impedance tolerance")
    parser.add_argument("--chunk", type=int, default=50_000)
    parser.add_argument("--profile-top", type=int, default=12)
    args = parser.parse_args(argv)
    if args.repeats < 1 or args.seeds < 1:
        parser.error("--repeats and --seeds must be >= 1")
    results = {}
    print(f"bench_sweep (python {platform.python_version()}, numpy {np.__version__}, pymoo "
          f"{pymoo.__version__}, 1 thread; load average {os.getloadavg()[0]:.2f})")
    results["load_average_1min_at_start"] = os.getloadavg()[0]

    # part 1 ----------------------------------------------------------------------------------
    runs = demo_sweep_timing(args.repeats)
    walls = [r["wall_s"] for r in runs]
    med = sorted(runs, key=lambda r: r["wall_s"])[len(runs) // 2]
    wall = med["wall_s"]
    share = {k: med[k] / wall for k in ("physics_s", "pymoo_s", "output_s")}
    print(f"demo sweep: {med['tasks']} tasks, {med['evaluations']:,} evaluations, "
          f"{med['front_rows']} front rows; wall {wall:.2f} s (median of {len(runs)}: "
          f"{', '.join(f'{w:.2f}' for w in walls)})")
    print(f"  physics (sum of task physics_seconds) {med['physics_s']:6.2f} s "
          f"{100 * share['physics_s']:5.1f} %  ({med['evaluations'] / med['physics_s']:,.0f} "
          f"evaluations/s)")
    print(f"  pymoo machinery + archive            {med['pymoo_s']:6.2f} s "
          f"{100 * share['pymoo_s']:5.1f} %")
    print(f"  run folder (front with max_power,    {med['output_s']:6.2f} s "
          f"{100 * share['output_s']:5.1f} %\n   Parquet, run.json)")
    print(f"  physics share of the search loop alone: "
          f"{100 * med['physics_s'] / med['task_s']:.1f} %")
    results.update({
        "wall_s": wall, "wall_s_runs": walls, "evaluations": med["evaluations"],
        "tasks": med["tasks"], "physics_s": med["physics_s"], "pymoo_s": med["pymoo_s"],
        "output_s": med["output_s"], "physics_share": share["physics_s"],
        "pymoo_share": share["pymoo_s"], "output_share": share["output_s"],
        "physics_share_of_search": med["physics_s"] / med["task_s"],
        "evaluations_per_s": med["evaluations"] / wall})

    # where the time of one search task goes (cProfile, functions with the most own time)
    demo = load_sweep(demo_sweep_path())
    m0, c0 = demo.spec.member[0], demo.catalogs[0].name
    prof = cProfile.Profile()
    t0 = time.perf_counter()
    prof.enable()
    run_task(demo, m0, c0, task_seed(demo.spec.seed, m0.name, c0),
             demo.spec.search.generations, demo.spec.search.population)
    prof.disable()
    total = time.perf_counter() - t0
    stats = pstats.Stats(prof).stats
    rows = sorted(((tt, ct, nc, _label(*key)) for key, (_, nc, tt, ct, _) in stats.items()),
                  reverse=True)[:args.profile_top]
    print(f"  one task under cProfile ({m0.name} x {c0}, {total:.2f} s), own time:")
    for tt, ct, nc, label in rows:
        print(f"    {100 * tt / total:5.1f} %  own {tt:6.3f} s  cum {ct:6.3f} s  x{nc:<6d} {label}")
    te11 = sum(ct for key, (_, _, _, ct, _) in stats.items() if key[2] == "te11_cutoff_frequency")
    results["task_profile_te11_share"] = te11 / total
    print(f"    exact TE11 cutoff (physics.modes.te11_cutoff_frequency, cumulative): "
          f"{100 * te11 / total:.1f} % of the task")

    # part 2 ----------------------------------------------------------------------------------
    sweep = fixed_material_sweep()
    member = next(m for m in sweep.spec.member if m.name == args.member)
    catalog_name = sweep.catalogs[0].name
    base_seed = task_seed(sweep.spec.seed, member.name, catalog_name)
    problem = MemberProblem(sweep, member, catalog_name, seed=base_seed)
    # the grid runs over (a, b): the plain layout, without the impedance construction
    problem.layout = replace(problem.layout, impedance_construction=False, bounds={
        k: tuple(getattr(sweep.spec.search, k)) for k in problem.layout.bounds})
    t0 = time.perf_counter()
    f_grid, grid_info = reference_front(problem, args.coarse_grid, args.grid,
                                        args.band_widening, args.chunk)
    t_grid = time.perf_counter() - t0
    n_grid = grid_info["coarse_points"] + grid_info["dense_points"]
    print(f"hypervolume: {member.name} x {catalog_name}, materials "
          f"{', '.join(f'{k}={v[0]}' for k, v in HV_MATERIALS.items())}; objectives "
          f"{', '.join(problem.objectives)}"
          + ("; impedance yield: analytic estimate" if sweep.spec.tolerance else ""))
    print(f"  coarse grid {' x '.join(map(str, args.coarse_grid))} over the box: "
          f"{grid_info['coarse_points']:,} points, {grid_info['coarse_feasible']:,} feasible; "
          f"dense grid {' x '.join(map(str, args.grid))} over a = "
          f"{grid_info['dense_inner_radius_m'][0] * 1e3:.3f}..."
          f"{grid_info['dense_inner_radius_m'][1] * 1e3:.3f} mm, b/a = "
          f"{grid_info['dense_radius_ratio'][0]:.4f}...{grid_info['dense_radius_ratio'][1]:.4f}: "
          f"{grid_info['dense_points']:,} points, {grid_info['dense_feasible']:,} feasible")
    print(f"  {n_grid:,} grid evaluations in {t_grid:.1f} s ({n_grid / t_grid:,.0f}/s); "
          f"{len(f_grid)} points on the grid front")
    ideal, nadir = f_grid.min(axis=0), f_grid.max(axis=0)
    hv = HV(ref_point=np.full(f_grid.shape[1], HV_REFERENCE), ideal=ideal, nadir=nadir,
            zero_to_one=True, norm_ref_point=False)
    hv_grid = float(hv(f_grid))
    population = sweep.spec.search.population
    gens = sorted(set(args.budgets))
    curves, finals = [], [f_grid]
    for k in range(args.seeds):
        snaps = search_curve(sweep, member, catalog_name, population, gens, base_seed + k)
        curves.append({g: (n, float(hv(f)) / hv_grid if len(f) else 0.0, sec)
                       for g, (n, f, sec) in snaps.items()})
        finals.append(snaps[gens[-1]][1])
    # completeness of the grid: how much the searches' final archives add to its front
    union_gain = float(hv(non_dominated(np.vstack(finals)))) / hv_grid
    print(f"  HV of the grid front {hv_grid:.6f} (objectives normalized to the grid front's "
          f"ideal/nadir, reference point {HV_REFERENCE} each); staged search, {args.seeds} "
          f"seeds:")
    print("    budget  evaluations  seconds  HV ratio (median; per seed)")
    by_gen = {}
    for g in gens:
        ratios = [c[g][1] for c in curves]
        by_gen[g] = statistics.median(ratios)
        sec = statistics.median(c[g][2] for c in curves)
        print(f"    {g:7d}  {curves[0][g][0]:11,d}  {sec:7.2f}  {by_gen[g]:.4f}  ("
              + ", ".join(f"{r:.4f}" for r in ratios) + ")")
    print(f"  grid completeness: HV(grid front + final archives) / HV(grid front) = "
          f"{union_gain:.5f} (1 means the searches found nothing the grid had missed)")
    results.update({
        "hv_union_over_grid": union_gain,
        "hv_member": member.name, "hv_catalog": catalog_name, "hv_materials": HV_MATERIALS,
        "hv_coarse_grid": args.coarse_grid, "hv_grid": args.grid, "hv_grid_points": n_grid,
        "hv_grid_info": grid_info, "hv_grid_front": int(len(f_grid)),
        "hv_grid_seconds": t_grid, "hv_reference_point": HV_REFERENCE,
        "hv_population": population, "hv_seeds": args.seeds,
        "hv_ratio_by_budget": {str(g): by_gen[g] for g in gens},
        "hv_evaluations_by_budget": {str(g): curves[0][g][0] for g in gens}})
    print(json.dumps(results, sort_keys=True))


if __name__ == "__main__":
    main()
