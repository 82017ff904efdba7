"""Stranded centre conductors (physics.stranding).

The effective radius and the skin-effect factor of the module are computed values. They are
recomputed here by a solver written for this test: the exterior 2-D potential problem of the
outer layer's contour, u harmonic outside, u = V on the contour, u ~ ln|z| at infinity, so that
V = ln(logarithmic capacity) (T. Ransford, Potential Theory in the Complex Plane, CUP 1995,
Ch. 5). u is a sum of a logarithm and multipoles about every outer strand, N-fold symmetric,
fitted by least squares on one period of the contour. The solver is first checked on a shape
with a closed-form answer (two touching wires).
"""

import numpy as np
import pytest

from cablefam.physics.line import characteristic_impedance_lossless
from cablefam.physics.stranding import (
    DEFAULT_LAY_RATIO,
    EFFECTIVE_RADIUS_FACTORS,
    LAYUPS,
    SKIN_EFFECT_FACTORS_STRAIGHT,
    lay_take_up_factor,
    strand_layup,
    stranded_dc_resistance,
    stranded_effective_radius,
    stranded_skin_effect_factor,
)

# Source: IEC 60028, annealed copper resistivity at 20 degC, 1/58 ohm mm^2 m^-1.
RHO_CU = 1.7241e-8


def ring_of_wires_field(n_wires, pitch_radius, wire_radius, centre=True, terms=40, points=400):
    """Exterior field of n equal round wires on a circle (the outer layer of a lay-up).

    The contour is the outward-facing part of each wire, |theta| <= pi/2 + pi/n about the
    outward radial direction, up to where neighbours touch or, if they do not, closed across
    the narrowest point of the slit by a straight bridge. ``centre`` adds a free share of the
    logarithm at the origin (only where the origin is inside the conductor).

    Returns (capacity, closed integral of |grad u|^2 dl, flux closed integral of |grad u| dl),
    the flux being 2 pi for a converged solution.
    """
    n, rho, r = n_wires, pitch_radius, wire_radius
    c = rho * np.exp(2j * np.pi * np.arange(n) / n)
    w = r * np.exp(2j * np.pi * np.arange(n) / n)  # rotates each multipole with its wire
    t_max = np.pi / 2.0 + np.pi / n
    s = 0.5 * (1.0 - np.cos(np.linspace(0.0, np.pi, points)))  # clustered at both ends
    z = c[0] + r * np.exp(1j * s * t_max)
    start, mid = c[0] + r * np.exp(1j * t_max), 0.5 * (c[0] + c[1])
    gap = abs(mid - start)
    if gap > 1e-12 * r:
        z = np.concatenate([z, start + (mid - start) * np.linspace(0.0, 1.0, 40)[1:]])

    def log_sum(z):
        return np.sum(np.log(np.abs(z[:, None] - c[None, :])), axis=1)

    columns = []
    if centre:
        columns.append(log_sum(z) - n * np.log(np.abs(z)))
        rhs = -np.log(np.abs(z))
    else:
        rhs = -log_sum(z) / n
    for m in range(1, terms + 1):
        columns.append(np.sum((w[None, :] / (z[:, None] - c[None, :])) ** m, axis=1).real)
    columns.append(-np.ones(z.shape))
    x = np.linalg.lstsq(np.array(columns).T, rhs, rcond=None)[0]
    q = x[0] if centre else 1.0 / n
    alpha = x[1:terms + 1] if centre else x[:terms]
    log_capacity = x[-1]

    def grad(z):  # |f'(z)|, u = Re f
        d = z[:, None] - c[None, :]
        f = q * np.sum(1.0 / d, axis=1) + (1.0 - n * q) / z
        for m in range(1, terms + 1):
            f -= alpha[m - 1] * m * np.sum(w ** m * d ** (-m - 1), axis=1)
        return np.abs(f)

    xg, wg = np.polynomial.legendre.leggauss(400)
    arc = c[0] + r * np.exp(1j * (xg + 1.0) / 2.0 * t_max)
    g = grad(arc)
    flux = 2 * n * np.sum(g * wg) * t_max / 2.0 * r
    energy = 2 * n * np.sum(g * g * wg) * t_max / 2.0 * r
    if gap > 1e-12 * r:
        gb = grad(start + (mid - start) * (xg + 1.0) / 2.0)
        flux += 2 * n * np.sum(gb * wg) * gap / 2.0
        energy += 2 * n * np.sum(gb * gb * wg) * gap / 2.0
    return np.exp(log_capacity), energy, flux


def layup_lambda_in_shield(k, shield_radius, terms=40, points=400, shield_terms=10):
    """Lambda = u(shield) - u(strands) of a k-layer lay-up (d = 1) inside a round shield.

    Same expansions as ring_of_wires_field plus the regular, N-fold symmetric terms
    Re (z / b)^(pN) for the field reflected by the shield; least squares on one period of
    both contours, with one unknown constant on each.
    """
    n, r = 6 * k, 0.5
    c = k * np.exp(2j * np.pi * np.arange(n) / n)
    w = r * np.exp(2j * np.pi * np.arange(n) / n)
    t_max = np.pi / 2.0 + np.pi / n
    s = 0.5 * (1.0 - np.cos(np.linspace(0.0, np.pi, points)))
    z = c[0] + r * np.exp(1j * s * t_max)
    start, mid = c[0] + r * np.exp(1j * t_max), 0.5 * (c[0] + c[1])
    if abs(mid - start) > 1e-12:
        z = np.concatenate([z, start + (mid - start) * np.linspace(0.0, 1.0, 40)[1:]])
    z_shield = shield_radius * np.exp(1j * np.linspace(0.0, np.pi / n, 100))
    on_shield = np.r_[np.zeros(z.size), np.ones(z_shield.size)]
    z = np.concatenate([z, z_shield])
    columns = [np.sum(np.log(np.abs(z[:, None] - c[None, :])), axis=1) - n * np.log(np.abs(z))]
    for m in range(1, terms + 1):
        columns.append(np.sum((w[None, :] / (z[:, None] - c[None, :])) ** m, axis=1).real)
    for p in range(1, shield_terms + 1):
        columns.append(((z / shield_radius) ** (p * n)).real)
    columns += [-(1.0 - on_shield), -on_shield]
    x = np.linalg.lstsq(np.array(columns).T, -np.log(np.abs(z)), rcond=None)[0]
    return x[-1] - x[-2]


def layup_field(k, strand_diameter=1.0, inflate=0.0):
    """ring_of_wires_field for the outer layer of a k-layer lay-up (6k wires at radius k d)."""
    return ring_of_wires_field(6 * k, k * strand_diameter, strand_diameter / 2.0 + inflate)


# ------------------------------------------------------------------ lay-up geometry (exact)


def test_layup_geometry():
    lay = strand_layup(np.array(LAYUPS))
    np.testing.assert_array_equal(lay.n_strands, [1, 7, 19, 37])
    np.testing.assert_array_equal(lay.layers, [0, 1, 2, 3])
    np.testing.assert_array_equal(lay.diameter_ratio, [1.0, 3.0, 5.0, 7.0])
    # Area ratios n d^2 / D^2: 1, 7/9 = 0.778, 19/25 = 0.76, 37/49 = 0.755 (exact).
    np.testing.assert_allclose(lay.area_ratio, [1.0, 7.0 / 9.0, 19.0 / 25.0, 37.0 / 49.0],
                               rtol=1e-15)
    # The geometry behind it: layer j holds 6j strands at radius j d without overlapping
    # (chord 2 j d sin(pi / 6j) >= d, equality for j = 1); its inner edge j d - d/2 is the
    # circle circumscribing the layer below, (j - 1) d + d/2.
    for j in (1, 2, 3):
        chord = 2.0 * j * np.sin(np.pi / (6 * j))
        assert chord >= 1.0 - 1e-15
    assert 2.0 * np.sin(np.pi / 6.0) == pytest.approx(1.0, rel=1e-15)  # 7 strands touch


def test_solid_is_the_default_and_all_factors_are_one():
    lay = strand_layup(1)
    for field in ("diameter_ratio", "area_ratio", "effective_radius_factor",
                  "dc_resistance_factor", "skin_effect_factor"):
        assert getattr(lay, field) == 1.0
    a = np.array([0.1e-3, 0.45e-3, 1.5e-3])
    np.testing.assert_array_equal(stranded_effective_radius(a, 1), a)
    np.testing.assert_allclose(stranded_dc_resistance(a, 1, RHO_CU), RHO_CU / (np.pi * a * a),
                               rtol=1e-15)
    assert stranded_skin_effect_factor(1) == 1.0
    assert lay_take_up_factor(1, 8.0) == 1.0


# ------------------------------------------------------------------ DC resistance


def test_dc_resistance_of_straight_strands_is_the_area_ratio():
    # Straight strands (lay_ratio = inf): R_dc = rho / (n pi (d/2)^2) exactly.
    a_o = 1.0e-3
    for k, n in enumerate(LAYUPS):
        d = 2.0 * a_o / (2 * k + 1)
        expected = RHO_CU / (n * np.pi * d * d / 4.0)
        assert stranded_dc_resistance(a_o, n, RHO_CU, np.inf) == pytest.approx(expected,
                                                                              rel=1e-14)
        assert strand_layup(n, np.inf).dc_resistance_factor == pytest.approx(
            (2 * k + 1) ** 2 / n, rel=1e-15)


def test_lay_take_up_is_the_helix_length():
    # A strand of layer j is a helix of radius j d and lay length L = m (2j + 1) d; its length
    # per unit cable length is sqrt(1 + (2 pi j d / L)^2) (geometry of a helix). 7 strands:
    # one straight strand and six helices in parallel.
    m = 10.0
    f1 = np.hypot(1.0, 2.0 * np.pi / (3.0 * m))
    assert lay_take_up_factor(7, m) == pytest.approx(7.0 / (1.0 + 6.0 / f1), rel=1e-15)
    f2 = np.hypot(1.0, 4.0 * np.pi / (5.0 * m))
    assert lay_take_up_factor(19, m) == pytest.approx(19.0 / (1.0 + 6.0 / f1 + 12.0 / f2),
                                                      rel=1e-15)
    # Over the usual 8-16 lay ratios (common practice, no source) the increase is a few per
    # cent at most, which is the size of the stranding increment quoted in practice
    # (from memory: about 2 %).
    for n in (7, 19, 37):
        t = lay_take_up_factor(n, np.array([8.0, DEFAULT_LAY_RATIO, 16.0]))
        assert np.all(np.diff(t) < 0.0) and np.all((t > 1.003) & (t < 1.05))
    assert lay_take_up_factor(7, np.inf) == 1.0


# ------------------------------------------------------------------ the field solver


def test_solver_two_touching_wires_closed_form():
    # Closed form (derived here): the inversion w = 1/z about the contact point maps the
    # outside of two touching wires of radius r onto the strip |Re w| < 1/(2r), and z = inf to
    # w = 0. The strip's Green function with its pole at 0 is ln|(s + 1)/(s - 1)|,
    # s = exp(i pi r w); near w = 0 it is ln|z| + ln(2 / (pi r)), so the capacity is pi r / 2.
    # On the contour |grad u| dl = sech(x) dx with x = pi r Im(w), and
    # |grad u|^2 dl = r (pi^2/4 + x^2) sech^2(x) dx / pi, whose integral over both wires is
    # 4 pi / (3 r): the skin-effect resistance is 4/3 of that of a wire of radius 2 r.
    r = 0.37
    cap, energy, flux = ring_of_wires_field(2, r, r, centre=False, terms=80, points=800)
    assert cap == pytest.approx(np.pi * r / 2.0, rel=1e-10)
    assert flux == pytest.approx(2.0 * np.pi, rel=1e-8)
    assert 2.0 * r * energy / (2.0 * np.pi) == pytest.approx(4.0 / 3.0, rel=1e-8)


@pytest.mark.parametrize("k", [1, 2, 3])
def test_effective_radius_factors_recomputed(k):
    # Source: the module's values, computed for it by this method; rtol 1e-8 (the solver
    # converges to ~1e-10 at these settings: flux 2 pi to < 1e-8).
    cap, energy, flux = layup_field(k)
    assert flux == pytest.approx(2.0 * np.pi, rel=1e-8)
    a_o = k + 0.5  # overall radius for d = 1
    assert EFFECTIVE_RADIUS_FACTORS[k] == pytest.approx(cap / a_o, rel=1e-8)
    assert SKIN_EFFECT_FACTORS_STRAIGHT[k] == pytest.approx(a_o * energy / (2.0 * np.pi),
                                                            rel=1e-8)


@pytest.mark.parametrize("k", [1, 2])
def test_skin_effect_factor_is_the_derivative_of_the_capacity(k):
    # Hadamard's variation of the Robin constant (Ransford, Ch. 5, and Wheeler's rule,
    # Proc. IRE 30 (1942) 412, in surface form): inflating the contour by eps along its normal
    # raises ln(capacity) by eps * (1 / 2 pi) * closed integral |grad u|^2 dl. Central
    # difference in the wire radius, step 1e-5 d: rtol 1e-6.
    h = 1e-5
    _, energy, _ = layup_field(k)
    up, down = layup_field(k, inflate=h)[0], layup_field(k, inflate=-h)[0]
    assert (np.log(up) - np.log(down)) / (2.0 * h) == pytest.approx(energy / (2.0 * np.pi),
                                                                     rel=1e-6)


@pytest.mark.parametrize("k, ratio, atol", [(1, 1.5, 3e-4), (1, 2.3, 2e-6), (1, 3.2, 1e-7),
                                             (2, 1.5, 2e-6), (3, 1.5, 1e-8)])
def test_effective_radius_holds_inside_a_shield(k, ratio, atol):
    # The equivalent radius is that of the unshielded strands (logarithmic capacity); inside a
    # round shield of radius b the coax logarithm is ln(b / a_eff) to within terms of order
    # (a_o / b)^(2N), N = 6k. Measured here with the shield in the solution: the tolerances
    # are the errors quoted in the module notes, rounded up.
    a_o = k + 0.5
    b = ratio * a_o
    lam = layup_lambda_in_shield(k, b)
    assert lam == pytest.approx(np.log(b / (EFFECTIVE_RADIUS_FACTORS[k] * a_o)), abs=atol)


def test_effective_radius_values_and_bounds():
    f = np.array(EFFECTIVE_RADIUS_FACTORS)
    # from memory: about 0.94 of the overall size is the value commonly quoted for the
    # equivalent solid of a 7-strand conductor.
    assert f[1] == pytest.approx(0.94, abs=0.005)
    # Bounds (from memory: capacity is monotone in the set, and at least sqrt(area / pi), the
    # Polya-Szego inequality, Ransford Ch. 5): sqrt(n d^2 / D^2) <= factor <= 1, rising with n
    # from 7 strands on.
    area = strand_layup(np.array(LAYUPS)).area_ratio
    assert np.all((np.sqrt(area) <= f) & (f <= 1.0)) and np.all(np.diff(f[1:]) > 0.0)
    # The skin-effect factor is > 1 and falls as the layers multiply.
    s = np.array(SKIN_EFFECT_FACTORS_STRAIGHT)
    assert np.all(s[1:] > 1.0) and np.all(np.diff(s[1:]) < 0.0)


def test_skin_effect_factor_includes_the_outer_lay():
    lay = strand_layup(np.array([7, 19, 37]), 12.0)
    outer = np.hypot(1.0, 2.0 * np.pi * np.array([1, 2, 3]) / (12.0 * np.array([3, 5, 7])))
    np.testing.assert_allclose(lay.skin_effect_factor,
                               np.array(SKIN_EFFECT_FACTORS_STRAIGHT[1:]) * outer, rtol=1e-15)
    np.testing.assert_array_equal(stranded_skin_effect_factor([7, 19, 37], 12.0),
                                  lay.skin_effect_factor)


def test_stranded_centre_conductor_raises_the_impedance():
    # 7 strands of overall diameter 0.9 mm under a 2.95 mm PE dielectric: Z0 up by
    # 60 ln(1 / 0.9388) / sqrt(2.25) ~ 2.5 ohm over the solid wire of the same diameter.
    a_o, b, eps = 0.45e-3, 1.475e-3, 2.25
    z_solid = characteristic_impedance_lossless(a_o, b, eps)
    z_7 = characteristic_impedance_lossless(stranded_effective_radius(a_o, 7), b, eps)
    k = 376.730313412 / (2.0 * np.pi * 1.5)  # eta0 / (2 pi sqrt(eps_r)), eta0 rounded
    assert z_7 - z_solid == pytest.approx(k * np.log(1.0 / EFFECTIVE_RADIUS_FACTORS[1]),
                                          rel=1e-9)


# ------------------------------------------------------------------ inputs and shapes


@pytest.mark.parametrize("bad", [0, 3, 12, 61, 7.5, -7, np.nan])
def test_unsupported_strand_count_raises_naming_it(bad):
    with pytest.raises(ValueError, match="n_strands = "):
        strand_layup(bad)
    with pytest.raises(ValueError, match="n_strands"):
        stranded_effective_radius(1e-3, [7, bad])


def test_other_bad_inputs():
    with pytest.raises(ValueError, match="n_strands"):
        strand_layup("7")
    with pytest.raises(ValueError, match="lay_ratio"):
        strand_layup(7, 0.0)


def test_shapes():
    assert np.shape(strand_layup(7).effective_radius_factor) == ()
    radii = np.array([[0.3e-3, 0.5e-3], [1.0e-3, 2.0e-3]])
    counts = np.array([[1, 7], [19, 37]])
    assert stranded_effective_radius(radii, counts).shape == (2, 2)
    assert stranded_dc_resistance(radii, counts, RHO_CU).shape == (2, 2)
    assert stranded_skin_effect_factor(counts).shape == (2, 2)
    # float strand counts that are whole numbers are accepted, lists too
    np.testing.assert_array_equal(stranded_effective_radius(1e-3, [7.0, 19.0]),
                                  stranded_effective_radius(1e-3, np.array([7, 19])))
    one = [float(stranded_dc_resistance(radii.ravel()[i], counts.ravel()[i], RHO_CU))
           for i in range(4)]
    np.testing.assert_array_equal(stranded_dc_resistance(radii, counts, RHO_CU).ravel(), one)
    lay = strand_layup(counts, np.array([8.0, 16.0]))
    assert all(np.shape(x) == (2, 2) for x in lay)
