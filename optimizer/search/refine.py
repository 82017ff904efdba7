"""The refinement stage: large vectorized batches of perturbed copies of the archive's designs.

After the dense stage the archive holds a coarse front. Each batch of this stage draws parents
uniformly from the archive and perturbs their continuous variables (normalised to the bounds)
by a normal step whose scale is drawn per row, log-uniformly between :data:`STEP_MIN` and
:data:`STEP_MAX` of the range, so every batch searches both near and far. Steps beyond a bound
are clipped onto it, which is where many optima sit (thinnest allowed jacket, the edge of the
impedance band). A material choice is redrawn with probability :data:`MATERIAL_REDRAW`. It is a
(mu + lambda) evolution strategy with the epsilon archive as the parent set, a whole batch per
physics call, with no per-individual bookkeeping.
"""

from __future__ import annotations

import numpy as np

#: Rows per batch (one physics call).
BATCH_ROWS = 8192
#: Smallest and largest step, as a share of each continuous variable's range.
STEP_MIN, STEP_MAX = 1e-4, 0.2
#: Probability that a row's material choice (each one) is redrawn uniformly.
MATERIAL_REDRAW = 0.05


def perturb(parents: np.ndarray, n_continuous: int, lower, upper, counts, rng) -> np.ndarray:
    """Offspring of parent rows: normal steps of the continuous columns, material redraws."""
    x = parents.copy()
    n = len(x)
    span = (upper - lower)[:n_continuous]
    scale = np.exp(rng.uniform(np.log(STEP_MIN), np.log(STEP_MAX), (n, 1)))
    x[:, :n_continuous] += rng.standard_normal((n, n_continuous)) * scale * span
    for j, k in enumerate(counts):
        col = n_continuous + j
        redraw = rng.random(n) < MATERIAL_REDRAW
        x[redraw, col] = rng.integers(0, k, int(redraw.sum()))
    return np.clip(x, lower, upper)


def run_refine_stage(problem, n_evaluations: int, seed: int, stop=None, on_batch=None,
                     interrupted=Exception):
    """Spend ``n_evaluations`` on perturbations of the archive (or of the reserve if empty)."""
    rng = np.random.default_rng([seed, 0x5EF1])
    lower, upper = problem.bounds()
    layout = problem.layout
    n_cont = len(layout.variables)
    counts = [len(layout.material_ids[t]) for t in layout.free_materials]
    repair = problem.make_repair()
    done = 0
    while done < n_evaluations:
        if stop is not None and stop.is_set():
            raise interrupted("in the refinement stage (no checkpoint yet)")
        parents = problem.archive.x if len(problem.archive) else problem.reserve_x
        if len(parents) == 0:
            return
        n = min(BATCH_ROWS, n_evaluations - done)
        x = perturb(parents[rng.integers(0, len(parents), n)], n_cont, lower, upper, counts,
                    rng)
        problem.evaluate_batch(repair._do(problem, x))
        done += n
        if on_batch is not None:
            on_batch()
