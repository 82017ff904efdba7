"""Throughput with clad and plated conductors beside the plain rate (a benchmark, not a test).

The random designs of ``bench_physics.py`` (same ranges, same seed), evaluated

1. plain (homogeneous, smooth conductors, as ``bench_physics.py`` (5));
2. clad: every centre conductor a two-layer wire (copper-clad steel 21 % IACS, copper-clad
   aluminium 15 %, silver-plated copper, tinned copper, drawn per design from the
   ``clad-conductors`` catalog), every shield tinned, 0.4 um rms roughness on both;
3. the layered wire alone (``clad_wire_resistance_reactance``) beside the homogeneous wire
   (``wire_resistance_reactance``) on the same radii.

Full evaluation = ``evaluate(..., include_max_power=False)`` with CW power (thermal fixed point
included). Figures are medians of ``--repeats`` runs in one process, one thread, after one
untimed call; the last line printed is one JSON object.

Run from the repository root::

    .venv/bin/python tests/benchmarks/bench_clad.py                  # 1 GHz
    .venv/bin/python tests/benchmarks/bench_clad.py --frequency 5e6  # Bessel regime of the layer
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
from importlib import resources  # noqa: E402
from pathlib import Path  # noqa: E402

import numpy as np  # noqa: E402

sys.path.insert(0, str(Path(__file__).parent))
from bench_physics import sample_designs, timed  # noqa: E402

from cablefam.optimizer.inputs.catalog import load_catalog  # noqa: E402
from cablefam.optimizer.inputs.cladding import property_table  # noqa: E402
from cablefam.optimizer.model.evaluate import OperatingPoint, evaluate  # noqa: E402
from cablefam.physics.internal_impedance import wire_resistance_reactance  # noqa: E402
from cablefam.physics.layered_conductor import (clad_wire_resistance_reactance,  # noqa: E402
                                                core_radius)

CLAD_IDS = ("ccs-21", "cca-15", "silver-plated-copper", "tinned-copper")
ROUGHNESS_M = 0.4e-6


def clad_designs(d, seed):
    """``d`` with clad centre conductors, tinned shields and rough surfaces."""
    path = Path(str(resources.files("cablefam.catalogs").joinpath("clad-conductors.toml")))
    catalog = load_catalog(path)
    records = [catalog.get("conductor", i, str(path)) for i in CLAD_IDS]
    table = property_table(records, catalog, str(path))
    n = d.inner_radius.size
    rng = np.random.default_rng(seed)
    inner = {k: v[rng.integers(0, len(records), n)] for k, v in table.items()}
    inner["surface_roughness_m"] = np.full(n, ROUGHNESS_M)
    tinned = property_table([catalog.get("conductor", "tinned-copper", str(path))], catalog,
                            str(path))
    shield = {k: np.full(n, v[0]) for k, v in tinned.items()}
    shield["surface_roughness_m"] = np.full(n, ROUGHNESS_M)
    return dataclasses.replace(d, inner=inner, shield=shield)


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--frequency", type=float, default=1e9, help="frequency [Hz]")
    parser.add_argument("--designs", type=int, default=200_000)
    parser.add_argument("--power", type=float, default=50.0, help="CW power [W]")
    parser.add_argument("--repeats", type=int, default=3)
    parser.add_argument("--seed", type=int, default=20240601)
    args = parser.parse_args(argv)
    n, f = args.designs, args.frequency
    plain = sample_designs(n, args.seed)
    clad = clad_designs(plain, args.seed + 1)
    op = OperatingPoint(frequency_hz=f, power_w=args.power, ambient_c=25.0)
    load = os.getloadavg()[0]
    print(f"bench_clad: {n:,} designs, f = {f:.4g} Hz, P = {args.power:g} W, median of "
          f"{args.repeats}; load average {load:.2f}")
    results = {"designs": n, "frequency_hz": f, "load_average_1min_at_start": load}
    for name, d in (("plain", plain), ("clad", clad)):
        evaluate(d, op, include_max_power=False)
        t, runs, out = timed(lambda: evaluate(d, op, include_max_power=False), args.repeats)
        finite = all(np.isfinite(v[out["thermal_converged"] > 0]).all() for v in out.values())
        results[f"full_evaluation_{name}_designs_per_s"] = n / t
        print(f"  full evaluation, {name:5s}: {n / t:12,.0f} designs/s  ({t:.3f} s; runs "
              f"{', '.join(f'{x:.2f}' for x in runs)}); converged "
              f"{100 * out['thermal_converged'].mean():.1f} %, finite: {finite}")
    ratio = results["full_evaluation_plain_designs_per_s"] / results[
        "full_evaluation_clad_designs_per_s"]
    results["clad_slowdown"] = ratio
    print(f"  clad / plain time: {ratio:.2f}x")
    a = plain.inner_radius
    r1 = core_radius(a, area_fraction=clad.inner["cladding_area_fraction"])
    rho1, rho2 = clad.inner["resistivity_ohm_m"], clad.inner["cladding_resistivity_ohm_m"]
    mu1 = clad.inner["relative_permeability"]
    t_h, _, _ = timed(lambda: wire_resistance_reactance(a, rho2, f), args.repeats)
    t_l, _, (r, x) = timed(lambda: clad_wire_resistance_reactance(a, r1, rho1, rho2, f, mu1),
                           args.repeats)
    results["homogeneous_wire_per_s"] = n / t_h
    results["layered_wire_per_s"] = n / t_l
    print(f"  homogeneous wire alone: {n / t_h:12,.0f} /s; layered wire alone: "
          f"{n / t_l:12,.0f} /s (finite: {bool(np.isfinite(r).all() and np.isfinite(x).all())})")
    print(json.dumps(results, sort_keys=True))


if __name__ == "__main__":
    main()
