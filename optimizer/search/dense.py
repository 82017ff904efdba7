"""The dense first stage: scrambled Sobol points of the reduced space, every material combination.

When the material combinations are few (each gets at least :data:`MIN_POINTS_PER_COMBINATION`
points of the stage's budget) they are enumerated and every combination is evaluated at the same
quasi-random points of the continuous variables; otherwise the material choices become extra
Sobol dimensions. Points come in chunks of :data:`CHUNK_ROWS` rows, each evaluated in one
vectorized physics call (cache-sized arrays).
"""

from __future__ import annotations

import itertools
from collections.abc import Iterator

import numpy as np
from scipy.stats import qmc

#: Rows of one physics call in the dense stage.
CHUNK_ROWS = 8192
#: Fewest points per material combination before combinations are sampled, not enumerated.
MIN_POINTS_PER_COMBINATION = 64


def _sobol(dimensions: int, n: int, seed: int) -> np.ndarray:
    """The first n points of a scrambled Sobol sequence in [0, 1)^d (deterministic in seed)."""
    if dimensions == 0:
        return np.zeros((n, 0))
    sampler = qmc.Sobol(d=dimensions, scramble=True, seed=np.random.default_rng(seed))
    m = max(0, int(np.ceil(np.log2(max(n, 1)))))
    return sampler.random_base2(m)[:n]


def dense_points(layout, lower, upper, n_points: int, seed: int) -> np.ndarray:
    """Decision matrix of the dense stage, shape (n <= n_points, n_var), in a fixed order.

    Parameters
    ----------
    layout : cablefam.optimizer.search.layout.Layout
        Which columns are continuous and which are material choices.
    lower, upper : ndarray
        Bounds of the decision vector (integer columns on [-0.5, k - 0.5]).
    """
    n_cont = len(layout.variables)
    counts = [len(layout.material_ids[t]) for t in layout.free_materials]
    n_combos = int(np.prod(counts)) if counts else 1
    lo, hi = lower[:n_cont], upper[:n_cont]
    if n_points // n_combos >= MIN_POINTS_PER_COMBINATION:
        per = n_points // n_combos
        u = _sobol(n_cont, per, seed)
        cont = lo + (hi - lo) * u
        combos = np.array(list(itertools.product(*[range(k) for k in counts])), dtype=float)
        combos = combos.reshape(n_combos, len(counts))
        x = np.hstack([np.tile(cont, (n_combos, 1)), np.repeat(combos, per, axis=0)])
        return x
    u = _sobol(n_cont + len(counts), n_points, seed)
    cont = lo + (hi - lo) * u[:, :n_cont]
    cats = np.floor(u[:, n_cont:] * np.asarray(counts, dtype=float))
    return np.hstack([cont, np.minimum(cats, np.asarray(counts) - 1.0)])


def chunks(x: np.ndarray, start_row: int = 0) -> Iterator[tuple[int, np.ndarray]]:
    """(first row, rows) of consecutive chunks of at most :data:`CHUNK_ROWS` rows."""
    for i in range(start_row, len(x), CHUNK_ROWS):
        yield i, x[i:i + CHUNK_ROWS]
