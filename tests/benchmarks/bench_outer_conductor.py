"""Full-evaluation rate with braided and foil outer conductors beside the tube (a benchmark).

Evaluates ``--designs`` random designs with
:func:`cablefam.optimizer.model.evaluate.evaluate` (EM + thermal fixed point at ``--power``
(0: none) + mass and cost; ``include_max_power=False``), once for each outer conductor (the
tubes get the braids' radial build, two wire diameters, so the walls are alike):

- ``tube-legacy``: no ``shield_construction`` (the numbers and keys of every older file);
- ``tube``, ``braid``, ``foil-braid``, ``double-braid``: the construction given, so the
  transfer impedance (at f and over a screening band of ``--band`` Hz) is computed too;
- ``mixed``: the five constructions in equal shares.

Prints designs per second (median of ``--repeats``, one thread) and the cost per design
relative to ``tube-legacy``; the issue's target is at most 2x for a braid. The last line is one
JSON object with the figures.

Run from the repository root::

    .venv/bin/python tests/benchmarks/bench_outer_conductor.py
"""

from __future__ import annotations

import os

for _var in ("OMP_NUM_THREADS", "OPENBLAS_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ[_var] = "1"

import argparse  # noqa: E402
import json  # noqa: E402
import statistics  # noqa: E402
import time  # noqa: E402
from importlib import resources  # noqa: E402
from pathlib import Path  # noqa: E402

import numpy as np  # noqa: E402

from cablefam.optimizer.inputs.catalog import load_catalog  # noqa: E402
from cablefam.optimizer.model.evaluate import Designs, OperatingPoint, evaluate  # noqa: E402
from cablefam.physics import outer_conductor as oc  # noqa: E402

#: The issue's limit: cost per design of a braid over that of a tube.
TARGET_BRAID_COST_RATIO = 2.0


def _table(catalog, kind, material_id, n):
    record = catalog.get(kind, material_id, "bench").model_dump(exclude_none=True)
    return {k: np.full(n, float(v)) for k, v in record.items()
            if isinstance(v, (int, float)) and not isinstance(v, bool)}


def designs(n, construction, seed=0):
    """Random designs (RF coax spread) with the given construction (None: legacy tube)."""
    rng = np.random.default_rng(seed)
    root = Path(str(resources.files("cablefam.catalogs")))
    base = load_catalog(root / "baseline.toml")
    a = rng.uniform(0.2e-3, 3.0e-3, n)
    b = a * rng.uniform(2.0, 5.0, n)
    d = rng.uniform(0.08e-3, 0.25e-3, n)
    fields = {}
    thickness = 2.0 * d  # the tubes get the braid's radial build (a like-for-like wall)
    if construction is not None:
        code = (np.arange(n) % 5 if construction == "mixed"
                else np.full(n, oc.CONSTRUCTIONS.index(construction)))
        fields = dict(shield_construction=code, braid_carriers=np.full(n, 16.0),
                      braid_ends=np.round(rng.uniform(4, 8, n)), braid_wire_diameter=d,
                      braid_angle=np.radians(rng.uniform(15, 40, n)),
                      foil_thickness=rng.uniform(10e-6, 50e-6, n))
        outer = oc.OuterConductor(code, fields["braid_carriers"], fields["braid_ends"], d,
                                  fields["braid_angle"], fields["foil_thickness"], 1.0)
        thickness = oc.radial_build(outer, thickness)
    return Designs(a, b, thickness, np.full(n, 1.0e-3),
                   inner=_table(base, "conductor", "copper", n),
                   shield=_table(base, "conductor", "copper", n),
                   dielectric=_table(base, "dielectric", "solid-pe", n),
                   jacket=_table(base, "jacket", "pe", n), **fields)


def rates(populations, op, repeats):
    """Designs per second of each population: the populations take turns within every
    repeat (a shared machine's drift hits them alike), median of ``repeats``."""
    for d in populations.values():
        evaluate(d, op, include_max_power=False)  # untimed first touch
    times = {name: [] for name in populations}
    for _ in range(repeats):
        for name, d in populations.items():
            t0 = time.perf_counter()
            evaluate(d, op, include_max_power=False)
            times[name].append(time.perf_counter() - t0)
    return {name: np.size(populations[name].inner_radius) / statistics.median(t)
            for name, t in times.items()}


def main():
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--designs", type=int, default=100_000)
    p.add_argument("--repeats", type=int, default=3)
    p.add_argument("--frequency", type=float, default=100e6)
    p.add_argument("--band", type=float, nargs=2, default=(1e6, 1e9))
    p.add_argument("--power", type=float, default=50.0,
                   help="CW power [W] for the thermal fixed point; 0: no thermal evaluation")
    args = p.parse_args()
    op = OperatingPoint(frequency_hz=args.frequency, power_w=args.power or None,
                        screening_band_hz=tuple(args.band))
    populations = {("tube-legacy" if kind is None else kind): designs(args.designs, kind)
                   for kind in (None, "tube", "braid", "foil-braid", "double-braid", "mixed")}
    figures = rates(populations, op, args.repeats)
    base = figures["tube-legacy"]
    for name, r in figures.items():
        print(f"{name:13s} {r:12,.0f} designs/s   cost per design {base / r:5.2f} x tube")
    ratio = base / figures["braid"]
    ratio_tube = figures["tube"] / figures["braid"]
    print(f"braid cost ratio {ratio:.2f} x tube-legacy (no screening quantities), "
          f"{ratio_tube:.2f} x tube with its transfer impedance (target <= "
          f"{TARGET_BRAID_COST_RATIO})")
    print(json.dumps({"designs": args.designs, "frequency_hz": args.frequency,
                      "power_w": args.power,
                      "band_hz": list(args.band), "per_s": figures,
                      "braid_cost_ratio": ratio, "braid_cost_ratio_vs_tube": ratio_tube}))


if __name__ == "__main__":
    main()
