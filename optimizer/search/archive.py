r"""The feasible front of a task at a resolution: one design per box (epsilon-dominance).

Each objective :math:`j` has a resolution :math:`\epsilon_j` (its unit's sensible step, see
:data:`cablefam.optimizer.model.objectives.RESOLUTIONS`). A design's *box* is
:math:`\lfloor f_j / \epsilon_j \rfloor`; the archive keeps the designs whose boxes no other
box dominates, one design per box: the one nearest the box's lower corner (which is never
dominated by another design of the same box). This is the epsilon-Pareto archive of Laumanns
et al. [1]_ (box-dominance variant), updated a whole batch at a time. Two designs on the front
therefore always differ by at least one resolution step in some objective, and the front's
size stays bounded by its extent measured in resolution steps.

Dominance filtering is moocore's (:func:`moocore.is_nondominated`), the same library pymoo
uses.

References
----------
.. [1] M. Laumanns, L. Thiele, K. Deb, E. Zitzler, "Combining convergence and diversity in
   evolutionary multiobjective optimization", Evolutionary Computation 10(3), 263-282, 2002.
"""

from __future__ import annotations

import moocore
import numpy as np


def boxes(f: np.ndarray, resolution: np.ndarray) -> np.ndarray:
    """Box index of each design, floor(f / resolution), as floats (exact integers)."""
    return np.floor(np.asarray(f, dtype=float) / resolution)


def nondominated(f: np.ndarray) -> np.ndarray:
    """Mask of the rows of ``f`` (minimised) that no other row dominates (equal rows kept)."""
    f = np.asarray(f, dtype=float)
    if len(f) <= 1:
        return np.ones(len(f), dtype=bool)
    if f.shape[1] == 1:
        return f[:, 0] == f[:, 0].min()
    return moocore.is_nondominated(f, keep_weakly=True)


def pareto_rank(f: np.ndarray) -> np.ndarray:
    """Pareto rank of each row (0: non-dominated; equal rows share a rank)."""
    f = np.asarray(f, dtype=float)
    if f.shape[1] == 1:
        return np.unique(f[:, 0], return_inverse=True)[1].reshape(-1)
    return moocore.pareto_rank(f)


def epsilon_filter(x: np.ndarray, f: np.ndarray, resolution: np.ndarray) -> np.ndarray:
    """Row indices (ascending) of the epsilon-Pareto set of a batch of feasible designs."""
    n = len(f)
    if n == 0:
        return np.zeros(0, dtype=int)
    box = boxes(f, resolution)
    corner_distance = _corner_distance(f, box, resolution)
    # one design per box: nearest the lower corner; ties broken by f, then x (deterministic)
    keys = [x[:, j] for j in range(x.shape[1] - 1, -1, -1)]
    keys += [f[:, j] for j in range(f.shape[1] - 1, -1, -1)]
    keys += [corner_distance] + [box[:, j] for j in range(box.shape[1] - 1, -1, -1)]
    order = np.lexsort(keys)
    sorted_box = box[order]
    first = np.ones(n, dtype=bool)
    first[1:] = np.any(sorted_box[1:] != sorted_box[:-1], axis=1)
    rep = order[first]
    keep = rep[nondominated(box[rep])]
    return np.sort(keep)


class EpsilonArchive:
    """Feasible designs of a task at the objectives' resolution (decision vectors and F)."""

    def __init__(self, n_var: int, resolution):
        self.resolution = np.asarray(resolution, dtype=float)
        self.x = np.empty((0, n_var))
        self.f = np.empty((0, len(self.resolution)))

    def __len__(self):
        return len(self.f)

    def update(self, x, f) -> None:
        """Merge a batch of *feasible* designs (rows of x and their objectives f)."""
        if len(f) == 0:
            return
        xs = np.vstack([self.x, np.asarray(x, dtype=float)])
        fs = np.vstack([self.f, np.asarray(f, dtype=float)])
        keep = epsilon_filter(xs, fs, self.resolution)
        self.x, self.f = xs[keep], fs[keep]

    def may_enter(self, f) -> np.ndarray:
        """False for designs that cannot enter the archive whatever their other properties.

        A design cannot enter when a box of the archive strictly dominates its box, or when
        the archive already holds a design of its box that is as near the box's lower corner.
        The search uses this to skip costly quantities (the Monte Carlo impedance yield).
        """
        f = np.asarray(f, dtype=float)
        if len(self.f) == 0 or len(f) == 0:
            return np.ones(len(f), dtype=bool)
        own = boxes(self.f, self.resolution)
        cand = boxes(f, self.resolution)
        ok = ~strictly_dominated_by(cand, own)
        # same box as an archive design: only a design nearer the corner may replace it
        _, group = np.unique(np.vstack([own, cand]), axis=0, return_inverse=True)
        group = group.reshape(-1)
        held = np.full(group.max() + 1, np.inf)
        held[group[:len(own)]] = _corner_distance(self.f, own, self.resolution)
        ok &= _corner_distance(f, cand, self.resolution) < held[group[len(own):]]
        return ok


def _corner_distance(f, box, resolution):
    return np.sum(((f - box * resolution) / resolution) ** 2, axis=1)


def strictly_dominated_by(cand: np.ndarray, own: np.ndarray, chunk: int = 2048) -> np.ndarray:
    """True for rows of ``cand`` that some row of ``own`` dominates (both minimised)."""
    k = cand.shape[1]
    if k == 1:
        return cand[:, 0] > own[:, 0].min()
    if k == 2:
        # own sorted by the first objective; prefix minima of the second answer each candidate
        order = np.lexsort((own[:, 1], own[:, 0]))
        o0, prefix = own[order, 0], np.minimum.accumulate(own[order, 1])
        right = np.searchsorted(o0, cand[:, 0], side="right")  # own with o0 <= c0
        left = np.searchsorted(o0, cand[:, 0], side="left")    # own with o0 < c0
        best_le = np.where(right > 0, prefix[np.maximum(right - 1, 0)], np.inf)
        best_lt = np.where(left > 0, prefix[np.maximum(left - 1, 0)], np.inf)
        return (best_le < cand[:, 1]) | (best_lt <= cand[:, 1])
    out = np.zeros(len(cand), dtype=bool)
    for i in range(0, len(cand), chunk):
        c = cand[i:i + chunk, None, :]
        le = np.all(own[None, :, :] <= c, axis=2)
        lt = np.any(own[None, :, :] < c, axis=2)
        out[i:i + chunk] = np.any(le & lt, axis=1)
    return out


def front_hypervolume(f, box=None) -> float | None:
    """Hypervolume of a front in a normalised box, as a share of the box (None: no box).

    ``box`` = (ideal, nadir) fixes the normalisation, so that the figure grows as the front
    improves; the reference point is the nadir plus 10 % of the range in every objective.
    """
    if box is None or len(f) == 0:
        return None
    ideal, nadir = (np.asarray(v, dtype=float) for v in box)
    span = np.where(nadir > ideal, nadir - ideal, 1.0)
    z = (np.asarray(f, dtype=float) - ideal) / span
    ref = np.full(z.shape[1], 1.1)
    inside = np.all(z < ref, axis=1)
    if not inside.any():
        return 0.0
    return float(moocore.hypervolume(z[inside], ref=ref)) / float(np.prod(ref))
