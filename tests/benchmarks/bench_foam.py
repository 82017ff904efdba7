"""Full-evaluation rate with foamed and dispersive dielectrics beside the plain rate (a
benchmark script, not a test).

The random designs of ``bench_physics.py`` (``sample_designs``), evaluated by
``cablefam.optimizer.model.evaluate.evaluate`` (power given, ``include_max_power=False``) four
ways: plain (today's constant eps_r, tan d), with a per-design void fraction in [0, 0.75]
(Looyenga permittivity and loss, foam density, Maxwell-Eucken thermal resistivity, foam
strength), with a per-design reference frequency in [100 MHz, 10 GHz] (wideband Debye
dispersion), and with both; then ``MemberProblem.evaluate_search`` on the baseline catalog
without and with ``[search] void_fraction``. Designs per second of wall time and of CPU time,
medians of ``--repeats`` runs, one thread. The
last line is one JSON object with the figures.

    .venv/bin/python tests/benchmarks/bench_foam.py [--designs N] [--frequency F]
"""

from __future__ import annotations

import os

for _var in ("OMP_NUM_THREADS", "OPENBLAS_NUM_THREADS", "MKL_NUM_THREADS",
             "VECLIB_MAXIMUM_THREADS", "NUMEXPR_NUM_THREADS", "BLIS_NUM_THREADS"):
    os.environ[_var] = "1"

import argparse  # noqa: E402
import dataclasses  # noqa: E402
import json  # noqa: E402
import sys  # noqa: E402
from pathlib import Path  # noqa: E402

import numpy as np  # noqa: E402

sys.path.insert(0, str(Path(__file__).resolve().parent))
from bench_physics import sample_designs  # noqa: E402

from cablefam.optimizer.inputs.sweep_spec import parse_sweep  # noqa: E402
from cablefam.optimizer.model.evaluate import OperatingPoint, evaluate  # noqa: E402
from cablefam.optimizer.search.problem import MemberProblem  # noqa: E402

#: A search over the bundled baseline catalog (foamable PE grades), with and without the
#: void-fraction variable: ``MemberProblem.evaluate_search`` rate (solve of b included).
SWEEP = {
    "name": "bench-foam", "catalogs": ["baseline.toml"],
    "search": {"objectives": ["attenuation", "mass"], "inner_radius_m": [0.2e-3, 4e-3],
               "dielectric_radius_m": [0.6e-3, 12e-3], "shield_thickness_m": [0.1e-3, 0.8e-3],
               "jacket_thickness_m": [0.5e-3, 1.5e-3]},
    "member": [{"name": "m", "impedance_ohm": 50.0, "impedance_tolerance_ohm": 1.5,
                "frequency_hz": 1e9, "power_w": 50.0}],
}


def search_rates(n, repeats, seed):
    """Decision vectors per second of ``evaluate_search``, plain and with the void fraction."""
    from importlib import resources
    base = Path(str(resources.files("cablefam.catalogs").joinpath("baseline.toml")))
    out = {}
    for name, extra in (("search_plain", {}), ("search_void_fraction", {"void_fraction":
                                                                        [0.0, 0.75]})):
        raw = json.loads(json.dumps(SWEEP))
        raw["search"].update(extra)
        sweep = parse_sweep(raw, "bench", base.parent)
        problem = MemberProblem(sweep, sweep.spec.member[0], sweep.catalogs[0].name)
        lo, hi = problem.bounds()
        x = lo + (hi - lo) * np.random.default_rng(seed).random((n, problem.n_var))
        x = problem.make_repair()._do(problem, x)
        problem.evaluate_search(x)
        wall, cpu, times = timed(lambda: problem.evaluate_search(x), repeats)
        out[name] = (n / wall, n / cpu, times)
    return out


def timed(fn, repeats):
    """Median wall time and median CPU time of this process [s] over ``repeats`` calls (the
    CPU time is the steadier figure on a shared machine), and the wall times."""
    import statistics
    import time
    wall, cpu = [], []
    for _ in range(repeats):
        t0, c0 = time.perf_counter(), time.process_time()
        fn()
        wall.append(time.perf_counter() - t0)
        cpu.append(time.process_time() - c0)
    return statistics.median(wall), statistics.median(cpu), wall


def variants(d, seed):
    rng = np.random.default_rng(seed)
    n = np.size(d.inner_radius)
    v = rng.uniform(0.0, 0.75, n)
    f_ref = np.exp(rng.uniform(np.log(1e8), np.log(1e10), n))
    diel = d.dielectric
    return {
        "plain": d,
        "foam": dataclasses.replace(d, dielectric={**diel, "void_fraction": v}),
        "dispersion": dataclasses.replace(d, dielectric={**diel, "reference_frequency_hz": f_ref}),
        "foam_and_dispersion": dataclasses.replace(
            d, dielectric={**diel, "void_fraction": v, "reference_frequency_hz": f_ref}),
    }


def main(argv=None):
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--designs", type=int, default=200_000)
    p.add_argument("--frequency", type=float, default=1e9)
    p.add_argument("--power", type=float, default=50.0)
    p.add_argument("--repeats", type=int, default=3)
    p.add_argument("--seed", type=int, default=1)
    args = p.parse_args(argv)
    d = sample_designs(args.designs, args.seed)
    op = OperatingPoint(frequency_hz=args.frequency, power_w=args.power)
    print(f"load average at start: {os.getloadavg()[0]:.2f}; {args.designs} designs, "
          f"f = {args.frequency:g} Hz, P = {args.power:g} W, one thread")
    figures = {"designs": args.designs, "load_average_1min_at_start": os.getloadavg()[0]}
    for name, designs in variants(d, args.seed).items():
        evaluate(designs, op, include_max_power=False)  # untimed first touch
        wall, cpu, times = timed(lambda: evaluate(designs, op, include_max_power=False),
                                 args.repeats)
        figures[f"{name}_designs_per_s"] = args.designs / wall
        figures[f"{name}_designs_per_cpu_s"] = args.designs / cpu
        print(f"  {name:22s} {args.designs / wall:12,.0f} designs/s, "
              f"{args.designs / cpu:12,.0f} per CPU s   (runs: "
              + ", ".join(f"{t:.2f} s" for t in times) + ")")
    for name, (rate, cpu_rate, times) in search_rates(65536, args.repeats, args.seed).items():
        figures[f"{name}_per_s"] = rate
        figures[f"{name}_per_cpu_s"] = cpu_rate
        print(f"  {name:22s} {rate:12,.0f} vectors/s, {cpu_rate:12,.0f} per CPU s   (runs: "
              + ", ".join(f"{t:.2f} s" for t in times) + ")")
    print(json.dumps(figures))


if __name__ == "__main__":
    main()
