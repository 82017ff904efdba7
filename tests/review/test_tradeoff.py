"""Knee, weighted sum, nearest, pseudo-weights, coverage and hypervolume on small fronts."""

import warnings

import numpy as np
import pytest
from pymoo.indicators.hv import HV

from cablefam.optimizer.review import tradeoff


def test_knee_of_parabola_front_is_the_analytic_point():
    # Source: knee definition of I. Das, Structural Optimization 18 (1999) 107-115 (largest
    # distance from the line through the extreme points). Closed form: on f2 = (1 - f1)^2,
    # f1 in [0, 1], the extremes are (0, 1) and (1, 0); the distance to f1 + f2 = 1 is
    # proportional to 1 - f1 - (1 - f1)^2, whose maximum is at f1 = 1/2, f2 = 1/4.
    f1 = np.linspace(0.0, 1.0, 2001)
    f = np.column_stack([f1, (1.0 - f1) ** 2])
    k = int(np.argmax(tradeoff.knee_distances(f)))
    assert f[k] == pytest.approx([0.5, 0.25], abs=1e-12)
    # the normalization makes it unit-free: scaled and shifted objectives, same knee
    g = np.column_stack([1e3 * f[:, 0] + 7.0, 0.02 * f[:, 1] - 3.0])
    assert int(np.argmax(tradeoff.knee_distances(g))) == k


def test_knee_of_three_objective_front_is_the_analytic_point():
    # Source: Das (1999) knee as above; closed form: on sum_i sqrt(f_i) = 1 (3 objectives) the
    # extreme points are the unit vectors, the hull plane is sum f = 1, and by Cauchy-Schwarz
    # sum f >= (sum sqrt f)^2 / 3 = 1/3 with equality at f_i = 1/9: the knee.
    n = 30
    u = np.array([(i, j, n - i - j) for i in range(n + 1) for j in range(n + 1 - i)]) / n
    f = u ** 2
    k = int(np.argmax(tradeoff.knee_distances(f)))
    assert f[k] == pytest.approx([1 / 9, 1 / 9, 1 / 9], abs=1e-12)
    assert tradeoff.knee_distances(f)[k] == pytest.approx((1 - 1 / 3) / np.sqrt(3), rel=1e-12)


def test_weighted_scores_equal_a_hand_computation():
    # Source: hand computation. Ideal (1, 10), nadir (4, 30); normalized points (0, 1),
    # (1/3, 1/2), (1, 0); weights 1:3 -> (0.25, 0.75); scores 0.75, 1/12 + 0.375, 0.25.
    f = np.array([[1.0, 30.0], [2.0, 20.0], [4.0, 10.0]])
    s = tradeoff.weighted_scores(f, [1.0, 3.0])
    assert s == pytest.approx([0.75, 1 / 12 + 0.375, 0.25], rel=1e-15)
    assert int(np.argmin(s)) == 2


def test_nearest_distance_is_normalized_euclidean():
    # Source: hand computation: target (2, 20) is the middle point; distance from (1, 30) is
    # sqrt((1/3)^2 + (1/2)^2) in normalized units. NaN leaves an objective out.
    f = np.array([[1.0, 30.0], [2.0, 20.0], [4.0, 10.0]])
    d = tradeoff.nearest_distances(f, [2.0, 20.0])
    assert d == pytest.approx([np.hypot(1 / 3, 1 / 2), 0.0, np.hypot(2 / 3, 1 / 2)], rel=1e-15)
    assert tradeoff.nearest_distances(f, [np.nan, 10.0]) == pytest.approx([1.0, 0.5, 0.0])


def test_pseudo_weights_match_pymoo():
    # Source: pymoo 0.6 reference implementation, pymoo.mcdm.pseudo_weights.PseudoWeights.
    with warnings.catch_warnings():  # pymoo.core.decision_making imports a deprecated scipy path
        warnings.simplefilter("ignore", DeprecationWarning)
        from pymoo.mcdm.pseudo_weights import PseudoWeights
    rng = np.random.default_rng(11)
    x = np.sort(rng.uniform(0.0, 1.0, 25))
    f = np.column_stack([x, 1.0 - np.sqrt(x), rng.uniform(0.0, 1.0, 25)])
    _, expected = PseudoWeights(np.array([1 / 3] * 3)).do(f, return_pseudo_weights=True)
    assert tradeoff.pseudo_weights(f) == pytest.approx(expected, rel=1e-12)


def test_coverage_of_constructed_fronts():
    # Source: set coverage C(A, B) of E. Zitzler, L. Thiele, IEEE Trans. Evol. Comput. 3(4)
    # (1999) 257-271, by hand: of B, (1, 2) is dominated by (1, 1), (1, 1) weakly by its
    # equal, (0.5, 0.5) by nothing -> 2/3; of A only (1, 1) is covered by B -> 1/3.
    a = np.array([[0.0, 2.0], [1.0, 1.0], [2.0, 0.0]])
    b = np.array([[1.0, 2.0], [1.0, 1.0], [0.5, 0.5]])
    assert tradeoff.coverage(a, b) == pytest.approx(2 / 3)
    assert tradeoff.coverage(b, a) == pytest.approx(1 / 3)
    assert tradeoff.coverage(a, a) == 1.0
    assert tradeoff.coverage(a, np.empty((0, 2))) is None
    assert tradeoff.coverage(np.empty((0, 2)), a) == 0.0


def test_hypervolume_of_hand_checkable_front():
    # Source: hand computation. Points (0, 1), (0.5, 0.5), (1, 0), reference (1.1, 1.1):
    # slabs 0.5 x 0.1 + 0.5 x 0.6 + 0.1 x 1.1 = 0.05 + 0.30 + 0.11 = 0.46.
    z = np.array([[0.0, 1.0], [0.5, 0.5], [1.0, 0.0]])
    ref = np.array([1.1, 1.1])
    assert tradeoff.hypervolume(z, ref) == pytest.approx(0.46, rel=1e-12)
    # Source: pymoo's indicator called directly (reference library, formerly used here).
    assert tradeoff.hypervolume(z, ref) == pytest.approx(HV(ref_point=ref)(z), rel=1e-12)
    assert tradeoff.hypervolume(np.empty((0, 2)), ref) == 0.0


def test_hypervolume_of_a_staircase_is_the_closed_form():
    # identity/hand computation: n + 1 points (i/n, 1 - i/n) on x + y = 1 against (1, 1);
    # sorted by x, point i owns the slab of width 1/n and height 1 - (1 - i/n) = i/n, so the
    # hypervolume is sum_{i<n} (1/n)(i/n) = (n - 1)/(2n); the last point, (1, 0), adds nothing.
    for n in (1, 2, 7, 100):
        x = np.arange(n + 1) / n
        z = np.column_stack([x, 1.0 - x])
        assert tradeoff.hypervolume(z, [1.0, 1.0]) == pytest.approx((n - 1) / (2 * n),
                                                                    abs=1e-15)
        # shuffled order and a point beyond the reference change nothing
        shuffled = np.vstack([z[::-1], [[1.5, 0.2]]])
        assert tradeoff.hypervolume(shuffled, [1.0, 1.0]) == pytest.approx((n - 1) / (2 * n),
                                                                           abs=1e-15)


def test_hypervolume_equals_pymoo_in_three_objectives():
    # Source: pymoo's indicator (the reference library, formerly used here) on the same set.
    rng = np.random.default_rng(5)
    z = rng.uniform(0.0, 1.0, (60, 3))
    ref = np.full(3, 1.1)
    assert tradeoff.hypervolume(z, ref) == pytest.approx(HV(ref_point=ref)(z), rel=1e-12)


def _nondominated_by_pairs(f):
    """The hand-written O(n^2) filter this module used before moocore (the reference)."""
    le = np.all(f[:, None, :] <= f[None, :, :], axis=2)   # le[i, j]: i no worse than j
    lt = np.any(f[:, None, :] < f[None, :, :], axis=2)
    return ~np.any(le & lt, axis=0)


def test_nondominated_mask_keeps_equal_points():
    f = np.array([[1.0, 1.0], [1.0, 1.0], [2.0, 2.0], [0.0, 3.0]])
    assert tradeoff.nondominated_mask(f).tolist() == [True, True, False, True]
    assert tradeoff.nondominated_mask(np.empty((0, 2))).tolist() == []


@pytest.mark.parametrize("k", [1, 2, 3, 4])
def test_nondominated_mask_equals_the_pairwise_filter(k):
    # small integers: many ties and duplicates, where weak and strict dominance differ
    rng = np.random.default_rng(k)
    f = rng.integers(0, 6, (300, k)).astype(float)
    assert np.array_equal(tradeoff.nondominated_mask(f), _nondominated_by_pairs(f))


def test_functions_leave_warning_filters_alone():
    # pymoo's HighTradeoffPoints calls warnings.filterwarnings("ignore"); ours must not.
    f = np.array([[0.0, 1.0], [0.2, 0.3], [1.0, 0.0]])
    before = list(warnings.filters)
    tradeoff.knee_distances(f)
    tradeoff.weighted_scores(f, [1.0, 1.0])
    tradeoff.pseudo_weights(f)
    tradeoff.hypervolume(f, [1.1, 1.1])
    assert list(warnings.filters) == before
