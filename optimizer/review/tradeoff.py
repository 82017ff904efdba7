r"""Small decision-making and front-quality functions on objective matrices.

Every function takes ``F`` of shape ``(n, k)``: ``n`` designs, ``k`` objectives, all to be
minimised (maximised objectives negated first, as :func:`cablefam.optimizer.model.objectives.objective_matrix`
does). They are written here rather than taken from ``pymoo.mcdm`` because, in pymoo 0.6.2,
``HighTradeoffPoints._do`` calls ``warnings.filterwarnings("ignore")`` (silencing every Python
warning in the process from then on) and ``CompromiseProgramming._do`` returns ``None`` (a
stub). ``PseudoWeights`` computes Deb's pseudo-weights correctly but divides by zero on a
degenerate range; :func:`pseudo_weights` below is the same formula with that case handled.
Dominance and the hypervolume are moocore's (:func:`nondominated_mask`, :func:`hypervolume`),
the library pymoo itself delegates them to; it is imported inside those two functions, and
nothing here imports pymoo.
"""

from __future__ import annotations

import numpy as np


def _as_matrix(f) -> np.ndarray:
    f = np.asarray(f, dtype=float)
    if f.ndim != 2:
        raise ValueError(f"objective matrix must have shape (n, k), got {f.shape}")
    if not np.all(np.isfinite(f)):
        raise ValueError("objective matrix holds non-finite values")
    return f


def front_range(f) -> tuple[np.ndarray, np.ndarray]:
    """Ideal (column minima) and nadir (column maxima) of a set of points."""
    f = _as_matrix(f)
    return f.min(axis=0), f.max(axis=0)


def normalize(f, ideal, nadir) -> np.ndarray:
    r"""Scale each objective to the range ``[ideal, nadir]``: :math:`(f - z^*)/(z^{nad} - z^*)`.

    An objective with zero range (all points equal) maps to 0 everywhere.
    """
    f = _as_matrix(f)
    ideal, nadir = np.asarray(ideal, dtype=float), np.asarray(nadir, dtype=float)
    span = nadir - ideal
    return np.where(span > 0.0, (f - ideal) / np.where(span > 0.0, span, 1.0), 0.0)


def nondominated_mask(f) -> np.ndarray:
    """True for points that no other point Pareto-dominates (no worse everywhere, better once).

    Duplicates do not dominate each other, so equal points are all kept
    (``moocore.is_nondominated`` with ``keep_weakly=True``).
    """
    import moocore

    f = _as_matrix(f)
    if len(f) == 0:
        return np.zeros(0, dtype=bool)
    return np.asarray(moocore.is_nondominated(f, keep_weakly=True), dtype=bool)


def knee_distances(f) -> np.ndarray:
    r"""Distance of each point below the hyperplane through the extreme points (larger = kneer).

    The knee of a Pareto front in the sense of Das [1]_: the point farthest from the convex
    hull of individual minima (CHIM), measured along the hull's normal towards the ideal point.
    The objectives are first normalized to the front's range (:func:`normalize`), so the
    result does not depend on units. With the extreme points :math:`e_i` (the point that
    minimises objective :math:`i`) the hyperplane is :math:`n \cdot z = 1` with
    :math:`E n = \mathbf{1}`, and

    .. math:: d(z) = \frac{1 - n \cdot z}{\lVert n \rVert}.

    In two objectives this is the distance to the straight line through the two end points of
    the front. When the extreme points do not span a hyperplane (singular :math:`E`, e.g. one
    point is extreme in two objectives) the plane :math:`\sum_i z_i = 1` through the unit
    points is used instead.

    Parameters
    ----------
    f : array_like, shape (n, k)
        Objective values to be minimised (a non-dominated set).

    Returns
    -------
    numpy.ndarray, shape (n,)
        Signed distance [-] in normalized objective space; the knee is ``argmax``.

    References
    ----------
    .. [1] I. Das, "On characterizing the 'knee' of the Pareto curve based on Normal-Boundary
       Intersection", *Structural Optimization* 18 (1999) 107-115.
    """
    f = _as_matrix(f)
    z = normalize(f, *front_range(f))
    k = z.shape[1]
    extremes = z[np.argmin(z, axis=0)]           # row i: the point minimising objective i
    normal = np.ones(k)
    if np.linalg.matrix_rank(extremes) == k:
        normal = np.linalg.solve(extremes, np.ones(k))
        if not np.all(np.isfinite(normal)) or np.any(normal <= 0.0):
            normal = np.ones(k)
    return (1.0 - z @ normal) / np.linalg.norm(normal)


def weighted_scores(f, weights) -> np.ndarray:
    r"""Weighted sum of the objectives normalized to the front's range (smaller is better).

    .. math:: s = \sum_i w_i \frac{f_i - z_i^*}{z_i^{nad} - z_i^*}, \qquad \sum_i w_i = 1

    (the weighting method of Miettinen [1]_, applied to range-normalized objectives).
    ``weights`` (>= 0, not all zero) are rescaled to sum to 1.

    References
    ----------
    .. [1] K. Miettinen, *Nonlinear Multiobjective Optimization*, Kluwer, 1999.
    """
    f = _as_matrix(f)
    w = np.asarray(weights, dtype=float)
    if w.shape != (f.shape[1],) or np.any(w < 0.0) or not w.sum() > 0.0:
        raise ValueError(f"weights must be {f.shape[1]} values >= 0, not all zero; got {w}")
    return normalize(f, *front_range(f)) @ (w / w.sum())


def nearest_distances(f, target) -> np.ndarray:
    """Euclidean distance to a target point in range-normalized objective space.

    ``target`` has one value per objective, in the units of ``f``; NaN entries are left out
    of the distance (objectives the caller does not care about). An objective of zero range
    (e.g. a single point) is scaled by its magnitude instead, a relative distance.
    """
    f = _as_matrix(f)
    t = np.asarray(target, dtype=float)
    if t.shape != (f.shape[1],):
        raise ValueError(f"target must have {f.shape[1]} values, got {t.shape}")
    ideal, nadir = front_range(f)
    use = ~np.isnan(t)
    if not use.any():
        raise ValueError("target gives no objective value")
    magnitude = np.where(np.abs(ideal) > 0.0, np.abs(ideal), 1.0)
    span = np.where(nadir > ideal, nadir - ideal, magnitude)
    d = (f[:, use] - t[use]) / span[use]
    return np.sqrt(np.sum(d * d, axis=1))


def pseudo_weights(f) -> np.ndarray:
    r"""Deb's pseudo-weight vector of each point: its relative distance from the worst value.

    .. math:: w_i = \frac{(z_i^{nad} - f_i)/(z_i^{nad} - z_i^*)}
                         {\sum_j (z_j^{nad} - f_j)/(z_j^{nad} - z_j^*)}

    (Deb [1]_, choosing a solution by pseudo-weights; the formula of
    ``pymoo.mcdm.pseudo_weights.PseudoWeights``). An objective of zero range contributes 0; a
    point at the nadir in every objective gets equal weights.

    References
    ----------
    .. [1] K. Deb, *Multi-Objective Optimization Using Evolutionary Algorithms*, Wiley, 2001.
    """
    f = _as_matrix(f)
    ideal, nadir = front_range(f)
    span = nadir - ideal
    raw = np.where(span > 0.0, (nadir - f) / np.where(span > 0.0, span, 1.0), 0.0)
    total = raw.sum(axis=1, keepdims=True)
    k = f.shape[1]
    return np.where(total > 0.0, raw / np.where(total > 0.0, total, 1.0), 1.0 / k)


def coverage(a, b) -> float | None:
    r"""Set coverage :math:`C(A, B)`: the share of points of ``b`` weakly dominated by a point
    of ``a`` (the C metric of Zitzler and Thiele [1]_).

    .. math:: C(A, B) = \frac{|\{b \in B : \exists a \in A,\ a \preceq b\}|}{|B|}

    with :math:`a \preceq b` when ``a`` is no worse than ``b`` in every objective. Not
    symmetric: compute both :math:`C(A,B)` and :math:`C(B,A)`. ``None`` when ``b`` is empty;
    0 when ``a`` is empty and ``b`` is not.

    References
    ----------
    .. [1] E. Zitzler, L. Thiele, "Multiobjective evolutionary algorithms: a comparative case
       study and the strength Pareto approach", *IEEE Trans. Evol. Comput.* 3(4) (1999)
       257-271.
    """
    b = np.asarray(b, dtype=float)
    if b.size == 0:
        return None
    a = np.asarray(a, dtype=float)
    if a.size == 0:
        return 0.0
    a, b = _as_matrix(a), _as_matrix(b)
    covered = np.any(np.all(a[:, None, :] <= b[None, :, :], axis=2), axis=0)
    return float(covered.mean())


def hypervolume(f_normalized, reference) -> float:
    """Hypervolume of normalized points against ``reference`` (``moocore.hypervolume``).

    No rescaling: the caller normalizes every compared front with the same ideal and nadir
    and passes one reference point. An empty set has hypervolume 0; points beyond the
    reference add nothing.
    """
    import moocore

    f = np.asarray(f_normalized, dtype=float)
    if f.size == 0:
        return 0.0
    return float(moocore.hypervolume(_as_matrix(f), ref=np.asarray(reference, dtype=float)))


def distinct_first(f, order, resolution, n: int) -> np.ndarray:
    """The first ``n`` rows of ``order`` that differ from every row taken before them by more
    than one resolution step in at least one objective (greedy, in ranking order)."""
    f = _as_matrix(f)
    resolution = np.asarray(resolution, dtype=float)
    excluded = np.zeros(len(f), dtype=bool)
    taken = []
    for i in order:
        if len(taken) == n:
            break
        if excluded[i]:
            continue
        taken.append(i)
        excluded |= np.all(np.abs(f - f[i]) <= resolution, axis=1)
    return np.asarray(taken, dtype=int)


#: Spread of :func:`spread_first`: ``n`` picks start at least ``SPREAD / n`` apart in
#: range-normalized objective space, where the front spans 0..1 in every objective (a
#: two-objective front is 1 to 1.4 long there, so ``n`` picks fit along it).
SPREAD = 1.0
#: Halvings of the distance before :func:`spread_first` falls back to
#: :func:`distinct_first` (a front too short for ``n`` picks at the starting distance).
SPREAD_HALVINGS = 6


def spread_first(f, order, resolution, n: int, spread: float = SPREAD) -> np.ndarray:
    """Up to ``n`` rows spread along the front, taken in ranking order.

    Greedy, in the order of ``order`` (best first): a row is taken when it lies at least
    ``spread / n`` from every row taken before (Euclidean distance in objective space
    normalized to the front's range, :func:`normalize`) and differs from each by more than one
    resolution step in at least one objective (as :func:`distinct_first`). When fewer than
    ``n`` rows qualify, the distance is halved and the pass repeated (up to
    :data:`SPREAD_HALVINGS` times), then dropped. The best-ranked row is always the first.
    """
    f = _as_matrix(f)
    order = np.asarray(order, dtype=int)
    if len(f) == 0 or n < 1:
        return np.zeros(0, dtype=int)
    z = normalize(f, *front_range(f))
    resolution = np.asarray(resolution, dtype=float)
    taken: list[int] = []
    radii = [spread / n / 2.0 ** h for h in range(SPREAD_HALVINGS + 1)] + [0.0]
    for radius in radii:
        excluded = np.zeros(len(f), dtype=bool)
        for t in taken:
            excluded |= _near(z, f, t, radius, resolution)
        for i in order:
            if len(taken) == n:
                break
            if excluded[i]:
                continue
            taken.append(int(i))
            excluded |= _near(z, f, i, radius, resolution)
        if len(taken) == n:
            break
    return np.asarray(taken, dtype=int)


def _near(z, f, i, radius, resolution) -> np.ndarray:
    """Rows within ``radius`` of row ``i`` (normalized) or within one resolution step of it in
    every objective."""
    close = np.sqrt(np.sum((z - z[i]) ** 2, axis=1)) < radius
    return close | np.all(np.abs(f - f[i]) <= resolution, axis=1)
