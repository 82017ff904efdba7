"""Throughput of the physics on a million random designs (a benchmark script, not a test).

Measures, at one frequency, designs per second of

1. the vectorized electromagnetic path: ``line_parameters(method="auto")`` +
   ``propagation_constant`` + ``characteristic_impedance`` (R, L, G, C, Z0, attenuation);
2. the same with ``method="exact"`` (scaled Bessel functions everywhere);
3. a per-design Python loop over a subset, calling the same functions with scalars;
4. the vectorized path in chunks;
5. the full evaluation ``cablefam.optimizer.model.evaluate.evaluate`` (EM + thermal fixed point + mass, power
   given, ``include_max_power=False``), and ``physics.thermal.max_power`` on a smaller set;

plus the largest relative difference between the paths, and a profile of where the time goes.
Every figure is the median of ``--repeats`` (``--full-repeats`` for 2 and 5) runs in one process
with one thread, (1) and (5) after one untimed call (first touch of the result memory). The
last line printed is one JSON object with the figures.

Run from the repository root::

    .venv/bin/python tests/benchmarks/bench_physics.py                  # 1 GHz
    .venv/bin/python tests/benchmarks/bench_physics.py --frequency 1e6  # exact-Bessel regime

The file name does not start with ``test_``: pytest does not collect it (speed is measured
here, never in tests).
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
import time  # noqa: E402
from importlib import resources  # noqa: E402
from pathlib import Path  # noqa: E402

import numpy as np  # noqa: E402
import scipy  # noqa: E402

from cablefam.optimizer.inputs.catalog import load_catalog  # noqa: E402
from cablefam.optimizer.model.evaluate import Designs, OperatingPoint, evaluate  # noqa: E402
from cablefam.physics import thermal  # noqa: E402
from cablefam.physics.line import (characteristic_impedance, line_parameters,  # noqa: E402
                          propagation_constant)

#: Targets stated beside the figures.
TARGET_VECTORIZED_PER_S = 5e6
TARGET_MAX_REL_DIFF = 1e-6
TARGET_FULL_EVALUATION_PER_S = 1e6

#: Ranges of the random designs (a realistic spread of RF coax, from thin to thick).
INNER_RADIUS_M = (0.1e-3, 4.0e-3)
RADIUS_RATIO = (1.5, 8.0)
SHIELD_THICKNESS_M = (0.05e-3, 1.5e-3)
JACKET_THICKNESS_M = (0.5e-3, 1.5e-3)
RELATIVE_PERMITTIVITY = (1.3, 2.3)
LOSS_TANGENT = (1e-4, 5e-4)
#: Catalog records used for the material properties (catalog file, kind, id).
CONDUCTORS = (("baseline.toml", "conductor", "copper"),
              ("lightweight.toml", "conductor", "aluminium"))
DIELECTRIC = ("baseline.toml", "dielectric", "solid-pe")
JACKET = ("baseline.toml", "jacket", "pe")
#: Quantities compared between the paths.
COMPARED = ("r", "l", "z0", "attenuation")


# --------------------------------------------------------------------------- inputs


def _record(spec):
    file_name, kind, material_id = spec
    path = Path(str(resources.files("cablefam.catalogs").joinpath(file_name)))
    return load_catalog(path).get(kind, material_id, str(path))


def sample_designs(n, seed):
    """Random designs: radii [m] and material arrays, copper or aluminium per conductor."""
    rng = np.random.default_rng(seed)
    conductors = [_record(s) for s in CONDUCTORS]
    a = rng.uniform(*INNER_RADIUS_M, n)
    b = a * rng.uniform(*RADIUS_RATIO, n)
    t_s = rng.uniform(*SHIELD_THICKNESS_M, n)
    t_j = rng.uniform(*JACKET_THICKNESS_M, n)
    eps = rng.uniform(*RELATIVE_PERMITTIVITY, n)
    tan_d = rng.uniform(*LOSS_TANGENT, n)

    def conductor_table(choice):
        keys = ("resistivity_ohm_m", "temperature_coefficient_per_k", "relative_permeability",
                "density_kg_per_m3", "price_per_kg")
        return {k: np.array([getattr(m, k) for m in conductors])[choice] for k in keys}

    inner = conductor_table(rng.integers(0, len(conductors), n))
    shield = conductor_table(rng.integers(0, len(conductors), n))
    diel = _record(DIELECTRIC)
    dielectric = {"relative_permittivity": eps, "loss_tangent": tan_d}
    for k in ("dielectric_strength_v_per_m", "density_kg_per_m3", "max_temperature_c",
              "thermal_resistivity_k_m_per_w", "price_per_kg"):
        dielectric[k] = np.full(n, float(getattr(diel, k)))
    jac = _record(JACKET)
    jacket = {k: np.full(n, float(getattr(jac, k))) for k in (
        "thermal_resistivity_k_m_per_w", "max_temperature_c", "density_kg_per_m3",
        "price_per_kg")}
    return Designs(a, b, t_s, t_j, inner=inner, shield=shield, dielectric=dielectric,
                   jacket=jacket)


def subset(d: Designs, index):
    """The designs at ``index`` (slice or integer array)."""
    def take(table):
        return None if table is None else {k: v[index] for k, v in table.items()}
    return Designs(d.inner_radius[index], d.dielectric_radius[index], d.shield_thickness[index],
                   d.jacket_thickness[index], take(d.inner), take(d.shield),
                   take(d.dielectric), take(d.jacket))


def em_arrays(d: Designs):
    """The arguments of ``line_parameters`` (after frequency) as plain arrays."""
    return (d.inner_radius, d.dielectric_radius, d.shield_radius, d.inner["resistivity_ohm_m"],
            d.shield["resistivity_ohm_m"], d.dielectric["relative_permittivity"],
            d.dielectric["loss_tangent"])


# --------------------------------------------------------------------------- paths


def em_path(a, b, c, rho_i, rho_s, eps, tan_d, frequency, method):
    """R, L, G, C, complex Z0 and attenuation [Np m^-1] by the public physics functions."""
    lp = line_parameters(a, b, c, frequency, rho_i, rho_s, eps, tan_d, method=method)
    gamma = propagation_constant(lp.r, lp.l, lp.g, lp.c, frequency)
    z0 = characteristic_impedance(lp.r, lp.l, lp.g, lp.c, frequency)
    return {"r": lp.r, "l": lp.l, "g": lp.g, "c": lp.c, "z0": z0, "attenuation": gamma.real}


def em_loop(arrays, frequency, n):
    """The vectorized functions called once per design with Python scalars."""
    out = {k: np.empty(n, dtype=complex if k == "z0" else float)
           for k in ("r", "l", "g", "c", "z0", "attenuation")}
    for i in range(n):
        one = em_path(*(float(x[i]) for x in arrays), frequency, "auto")
        for k, v in one.items():
            out[k][i] = v
    return out


def em_chunked(arrays, frequency, chunk):
    n = arrays[0].size
    out = {k: np.empty(n, dtype=complex if k == "z0" else float)
           for k in ("r", "l", "g", "c", "z0", "attenuation")}
    for start in range(0, n, chunk):
        part = em_path(*(x[start:start + chunk] for x in arrays), frequency, "auto")
        for k, v in part.items():
            out[k][start:start + chunk] = v
    return out


def max_power_inputs(d: Designs, op: OperatingPoint):
    """Keyword arguments of ``physics.thermal.max_power`` as ``evaluate`` builds them."""
    return dict(
        a=d.inner_radius, b=d.dielectric_radius, c=d.shield_radius, d=d.outer_radius,
        frequency=op.frequency_hz, ambient_c=op.ambient_c,
        inner_resistivity_20c=d.inner["resistivity_ohm_m"],
        inner_temperature_coefficient=d.inner["temperature_coefficient_per_k"],
        shield_resistivity_20c=d.shield["resistivity_ohm_m"],
        shield_temperature_coefficient=d.shield["temperature_coefficient_per_k"],
        relative_permittivity=d.dielectric["relative_permittivity"],
        loss_tangent=d.dielectric["loss_tangent"],
        dielectric_thermal_resistivity=d.dielectric["thermal_resistivity_k_m_per_w"],
        jacket_thermal_resistivity=d.jacket["thermal_resistivity_k_m_per_w"],
        inner_relative_permeability=d.inner["relative_permeability"],
        shield_relative_permeability=d.shield["relative_permeability"],
        dielectric_max_temperature_c=d.dielectric["max_temperature_c"],
        jacket_max_temperature_c=d.jacket["max_temperature_c"])


# --------------------------------------------------------------------------- measuring


def timed(fn, repeats):
    """Median wall time [s] of ``repeats`` calls, all the times, and the last result."""
    times, result = [], None
    for _ in range(repeats):
        t0 = time.perf_counter()
        result = fn()
        times.append(time.perf_counter() - t0)
    return statistics.median(times), times, result


def max_rel_diff(x, ref):
    """Largest |x - ref| / |ref| per compared quantity, and the count of non-finite values."""
    out, bad = {}, 0
    for k in COMPARED:
        u, v = np.asarray(x[k]), np.asarray(ref[k])
        finite = np.isfinite(u) & np.isfinite(v)
        bad += int((~finite).sum())
        with np.errstate(divide="ignore", invalid="ignore"):
            rel = np.abs(u[finite] - v[finite]) / np.abs(v[finite])
        out[k] = float(rel.max()) if rel.size else 0.0
    return out, bad


def _label(file_name, line, name, prefix_filter=("physics", "optimizer")):
    parts = Path(file_name).parts
    where = next((p for p in prefix_filter if p in parts), None)
    if where is None:
        return f"{Path(file_name).name}:{name}" if file_name != "~" else name
    return "/".join(parts[parts.index(where):]) + f":{line}({name})"


def profile(fn, top):
    """Run ``fn`` under cProfile; return (total [s], costliest own-time rows, raw stats)."""
    prof = cProfile.Profile()
    t0 = time.perf_counter()
    prof.enable()
    fn()
    prof.disable()
    total = time.perf_counter() - t0
    stats = pstats.Stats(prof).stats
    rows = [(tottime, cumtime, ncalls, _label(*key))
            for key, (_, ncalls, tottime, cumtime, _) in stats.items()]
    rows.sort(reverse=True)
    return total, rows[:top], stats


def callee_times(stats, caller_file_end, caller_name):
    """Cumulative time [s] and calls of every function as called from one caller function."""
    caller = next(k for k in stats if k[0].endswith(caller_file_end) and k[2] == caller_name)
    rows = []
    for key, (_, _, _, _, callers) in stats.items():
        if caller in callers:
            _, ncalls, _, cumtime = callers[caller]
            rows.append((cumtime, ncalls, _label(*key)))
    rows.sort(reverse=True)
    return rows


def print_profile(title, total, rows):
    print(f"  {title}: {total:.3f} s under cProfile; own time of the costliest functions:")
    for tottime, cumtime, ncalls, label in rows:
        print(f"    {100 * tottime / total:5.1f} %  own {tottime:7.3f} s  cum {cumtime:7.3f} s"
              f"  x{ncalls:<4d} {label}")


def verdict(ok):
    return "met" if ok else "MISSED"


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--frequency", type=float, default=1e9, help="frequency [Hz]")
    parser.add_argument("--designs", type=int, default=1_000_000)
    parser.add_argument("--loop-designs", type=int, default=2_000)
    parser.add_argument("--chunk", type=int, default=16_384)
    parser.add_argument("--max-power-designs", type=int, default=20_000)
    parser.add_argument("--power", type=float, default=50.0, help="CW power of the full "
                        "evaluation [W]")
    parser.add_argument("--ambient", type=float, default=25.0, help="ambient [degC]")
    parser.add_argument("--repeats", type=int, default=5, help="runs of the paths (1), (3), (4)")
    parser.add_argument("--full-repeats", type=int, default=3, help="runs of the exact path (2), "
                        "the full evaluation and max_power (5)")
    parser.add_argument("--seed", type=int, default=20240601)
    parser.add_argument("--no-profile", action="store_true", help="skip the cProfile sections")
    args = parser.parse_args(argv)
    if min(args.repeats, args.full_repeats) < 3:
        parser.error("--repeats and --full-repeats must be >= 3 (figures are medians)")
    f, n, reps, full_reps = args.frequency, args.designs, args.repeats, args.full_repeats

    print(f"bench_physics: {n:,} designs, f = {f:.4g} Hz, median of {reps} ({full_reps} for "
          f"(2) and (5)), 1 thread "
          f"(python {platform.python_version()}, numpy {np.__version__}, scipy "
          f"{scipy.__version__}, {platform.machine()}; load average {os.getloadavg()[0]:.2f}, "
          "other processes on the machine skew the figures)")
    d = sample_designs(n, args.seed)
    arrays = em_arrays(d)
    op = OperatingPoint(frequency_hz=f, power_w=args.power, ambient_c=args.ambient)
    results = {"frequency_hz": f, "designs": n, "repeats": reps, "full_repeats": full_reps,
               "seed": args.seed, "load_average_1min_at_start": os.getloadavg()[0]}

    # skin-depth regime of the population (the auto path switches at a/delta = 12)
    from cablefam.physics.internal_impedance import ASYMPTOTIC_MIN_RATIO
    from cablefam.physics.skin import skin_depth
    u_inner = d.inner_radius / skin_depth(d.inner["resistivity_ohm_m"], f)
    u_shield = d.dielectric_radius / skin_depth(d.shield["resistivity_ohm_m"], f)
    share_exact = float(np.mean(u_inner < ASYMPTOTIC_MIN_RATIO))
    share_exact_tube = float(np.mean(u_shield < ASYMPTOTIC_MIN_RATIO))
    print(f"  regime: a/delta {u_inner.min():.3g}..{u_inner.max():.3g}; auto path takes the "
          f"exact Bessel form for {100 * share_exact:.1f} % of wires, "
          f"{100 * share_exact_tube:.1f} % of shields")
    results["auto_exact_share_wire"] = share_exact
    results["auto_exact_share_shield"] = share_exact_tube

    # (1) vectorized, (2) exact; one untimed call first (first-touch of the result memory)
    em_path(*arrays, f, "auto")
    t_vec, all_vec, vec = timed(lambda: em_path(*arrays, f, "auto"), reps)
    t_ex, all_ex, exact = timed(lambda: em_path(*arrays, f, "exact"), full_reps)
    diff, bad = max_rel_diff(vec, exact)
    results["vectorized_designs_per_s"] = n / t_vec
    results["exact_designs_per_s"] = n / t_ex
    results["max_rel_diff"] = max(diff.values())  # over the finite values; count below
    results["max_rel_diff_by_quantity"] = diff
    results["non_finite_values"] = bad
    print(f"(1) vectorized auto : {n / t_vec:12,.0f} designs/s  ({t_vec:.3f} s; runs "
          f"{', '.join(f'{t:.3f}' for t in all_vec)})  target >= {TARGET_VECTORIZED_PER_S:.0e}: "
          f"{verdict(n / t_vec >= TARGET_VECTORIZED_PER_S)}")
    print(f"(2) exact Bessel    : {n / t_ex:12,.0f} designs/s  ({t_ex:.3f} s)  auto/exact = "
          f"{t_ex / t_vec:.2f}x")
    print(f"    max rel diff auto vs exact over {n:,}: "
          + ", ".join(f"{k} {v:.2e}" for k, v in diff.items())
          + f"; non-finite values {bad}; target <= {TARGET_MAX_REL_DIFF:.0e}: "
          f"{verdict(bad == 0 and results['max_rel_diff'] <= TARGET_MAX_REL_DIFF)}")
    del exact

    # (3) per-design loop on a subset
    m = min(args.loop_designs, n)
    em_loop(arrays, f, min(50, m))  # warm-up (imports, caches)
    t_loop, _, loop = timed(lambda: em_loop(arrays, f, m), reps)
    loop_diff, loop_bad = max_rel_diff(loop, {k: v[:m] for k, v in vec.items()})
    results["loop_designs"] = m
    results["loop_designs_per_s"] = m / t_loop
    results["loop_max_rel_diff"] = max(loop_diff.values())
    results["loop_non_finite_values"] = loop_bad
    print(f"(3) Python loop     : {m / t_loop:12,.0f} designs/s  ({m:,} designs, {t_loop:.3f} s)"
          f"  vectorized/loop = {t_loop / m * n / t_vec:,.0f}x; max rel diff loop vs "
          f"vectorized {results['loop_max_rel_diff']:.1e}")

    # (4) chunked
    t_chunk, _, chunked = timed(lambda: em_chunked(arrays, f, args.chunk), reps)
    chunk_diff, _ = max_rel_diff(chunked, vec)
    results["chunk"] = args.chunk
    results["chunked_designs_per_s"] = n / t_chunk
    print(f"(4) chunked {args.chunk:6d} : {n / t_chunk:12,.0f} designs/s  ({t_chunk:.3f} s)  "
          f"chunked/whole = {t_vec / t_chunk:.2f}x; max rel diff "
          f"{max(chunk_diff.values()):.1e}")
    del chunked, loop

    # (5) full evaluation, then max_power on a smaller set; one untimed call first, as for (1):
    # without it the first runs pay for first-touching ~250 MB of result memory
    del vec
    evaluate(d, op, include_max_power=False)
    t_full, all_full, full = timed(lambda: evaluate(d, op, include_max_power=False),
                                        full_reps)
    converged = full["thermal_converged"].astype(bool)
    results["full_evaluation_designs_per_s"] = n / t_full
    results["full_evaluation_power_w"] = args.power
    results["thermal_converged_share"] = float(converged.mean())
    print(f"(5) full evaluation : {n / t_full:12,.0f} designs/s  ({t_full:.3f} s; runs "
          f"{', '.join(f'{t:.2f}' for t in all_full)})  target >= "
          f"{TARGET_FULL_EVALUATION_PER_S:.0e}: "
          f"{verdict(n / t_full >= TARGET_FULL_EVALUATION_PER_S)}")
    print(f"    P = {args.power:g} W, ambient {args.ambient:g} degC: thermal steady state for "
          f"{100 * converged.mean():.1f} % (rest run away); conductor temperature median "
          f"{np.median(full['conductor_temperature_c'][converged]):.1f} degC")
    del full
    k = min(args.max_power_designs, n)
    small = subset(d, slice(0, k))
    mp_kwargs = max_power_inputs(small, op)
    t_mp, _, p_max = timed(lambda: thermal.max_power(**mp_kwargs), full_reps)
    results["max_power_designs"] = k
    results["max_power_designs_per_s"] = k / t_mp
    print(f"    max_power alone : {k / t_mp:12,.0f} designs/s  ({k:,} designs, {t_mp:.3f} s; "
          f"median rating {np.median(p_max):.3g} W)")

    # where the time goes
    if not args.no_profile:
        print("where the time goes:")
        k_prof = min(n, 100_000)
        d_prof = subset(d, slice(0, k_prof))
        # per-pass count of the thermal fixed point (each pass is one line_parameters call)
        state = thermal.coax_thermal_state(
            power=args.power, **{key: v for key, v in max_power_inputs(d_prof, op).items()
                                 if not key.endswith("max_temperature_c")})
        it = state.iterations
        results["thermal_passes_mean"] = float(it.mean())
        results["thermal_passes_max"] = int(it.max())
        print(f"  thermal fixed point ({k_prof:,} designs): {it.mean():.2f} passes per design "
              f"on average "
              f"(median {np.median(it):.0f}, max {it.max()}); line evaluations per design in "
              f"evaluate: {it.mean():.2f} (passes) + 1 (hot) = {1 + it.mean():.2f}; the "
              "temperature-independent parts once")
        del state
        total, rows, _ = profile(lambda: em_path(*arrays, f, "auto"), 12)
        print_profile("vectorized EM path", total, rows)
        total, rows, stats = profile(lambda: evaluate(d_prof, op, include_max_power=False), 12)
        print(f"  stages of evaluate() on {k_prof:,} designs ({total:.3f} s under cProfile), "
              "time inside each call made by evaluate():")
        stages = {}
        for cumtime, ncalls, label in callee_times(stats, "optimizer/model/evaluate.py", "evaluate"):
            if cumtime >= 0.001 * total:
                print(f"    {100 * cumtime / total:5.1f} %  {cumtime:7.3f} s  x{ncalls:<3d} "
                      f"{label}")
                stages[label] = round(cumtime / total, 4)
        te11 = next((ct for ct, _, label in callee_times(stats, "optimizer/model/evaluate.py",
                                                          "evaluate")
                     if label.endswith("(te11_cutoff_frequency)")), 0.0)
        rest = k_prof / (total - te11)
        results["full_evaluation_without_te11_designs_per_s_estimate"] = rest
        print(f"    => everything but the exact TE11 cutoff runs at ~{rest:,.0f} designs/s "
              f"(profiled, {k_prof:,} designs)")
        results["full_evaluation_stage_shares"] = stages
        print_profile(f"full evaluation of {k_prof:,} designs", total, rows)

    results["targets"] = {"vectorized_designs_per_s": TARGET_VECTORIZED_PER_S,
                          "max_rel_diff": TARGET_MAX_REL_DIFF,
                          "full_evaluation_designs_per_s": TARGET_FULL_EVALUATION_PER_S}
    results["targets_met"] = {
        "vectorized_designs_per_s": results["vectorized_designs_per_s"]
        >= TARGET_VECTORIZED_PER_S,
        "max_rel_diff": bad == 0 and results["max_rel_diff"] <= TARGET_MAX_REL_DIFF,
        "full_evaluation_designs_per_s": results["full_evaluation_designs_per_s"]
        >= TARGET_FULL_EVALUATION_PER_S}
    print(json.dumps(results, sort_keys=True))


if __name__ == "__main__":
    main()
