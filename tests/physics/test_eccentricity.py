"""Coax with an offset centre conductor (physics.eccentricity).

The independent check here is the method of images: two non-concentric circles are both
equipotentials of one pair of opposite line charges placed at the pair of points that are
inverse with respect to both circles (Sec. 4.8 of Ramo, Whinnery, Van Duzer, *Fields and Waves
in Communication Electronics*, 3rd ed., 1994, two-wire and offset lines). That gives the
potential everywhere in closed form, hence the capacitance and, through the surface field, the
skin-effect current density on each conductor, which is integrated numerically around the
circles below. Nothing in it uses the arccosh expression.
"""

import numpy as np
import pytest
from scipy.constants import epsilon_0, mu_0, speed_of_light

from cablefam.physics.eccentricity import (
    characteristic_impedance_eccentric,
    geometry_factor,
    wheeler_loss_factor,
)
from cablefam.physics.line import capacitance, characteristic_impedance_lossless, inductance_external
from cablefam.physics.sensitivity import geometry_factor_gradient, resistance_skin_effect_eccentric

# Designs (a, b, D) [m]: RG-58-like and 7 mm air-line-like radii, offsets up to 70 % of the gap.
A = np.array([0.45e-3, 0.45e-3, 1.5202e-3, 1.5202e-3, 0.2e-3, 1.0e-3])
B = np.array([1.47e-3, 1.47e-3, 3.5e-3, 3.5e-3, 2.4e-3, 1.3e-3])
D = np.array([0.05e-3, 0.5e-3, 0.2e-3, 1.3e-3, 1.0e-3, 0.2e-3])


def image_solution(a, b, offset, n_points=4096):
    """Lambda and the surface-field integrals of an eccentric coax by the method of images.

    Outer circle centred at 0, radius b; inner circle centred at (D, 0), radius a. The line
    charges sit at x1 (inside the inner conductor) and x2 = b^2 / x1 (outside the shield),
    with (x1 - D)(x2 - D) = a^2, i.e. D x1^2 - (b^2 + D^2 - a^2) x1 + D b^2 = 0. The potential
    phi = ln|z - x2| - ln|z - x1| is constant on both circles; its flux through each circle
    is 2 pi. Returns (Lambda, I_inner, I_shield) with Lambda = phi_inner - phi_shield and
    I = (1 / 2 pi) * closed integral of |grad phi|^2 dl over that conductor's surface, so that
    the skin-effect resistance of a conductor is Rs * I / (2 pi) per unit length.
    """
    a, b, offset = (np.asarray(x, dtype=float)[..., None] for x in (a, b, offset))
    s = b * b + offset * offset - a * a
    x1 = 2.0 * offset * b * b / (s + np.sqrt(s * s - 4.0 * offset * offset * b * b))
    x2 = b * b / x1

    def phi(z):
        return np.log(np.abs(z - x2)) - np.log(np.abs(z - x1))

    def grad2(z):
        return np.abs(1.0 / (z - x2) - 1.0 / (z - x1)) ** 2

    theta = 2.0 * np.pi * np.arange(n_points) / n_points  # trapezoid rule: periodic, analytic
    z_in = offset + a * np.exp(1j * theta)
    z_out = b * np.exp(1j * theta)
    lam = (phi(offset + a) - phi(b))[..., 0]
    i_in = np.mean(grad2(z_in), axis=-1) * a[..., 0]
    i_out = np.mean(grad2(z_out), axis=-1) * b[..., 0]
    return lam, i_in, i_out


# ------------------------------------------------------------------ closed form, concentric limit


def test_eccentric_impedance_matches_handbook_closed_form():
    # Source: the eccentric coaxial line of B. C. Wadell, Transmission Line Design Handbook,
    # Artech House, 1991, Sec. 2.2, written as handbooks do in diameters (outer conductor inner
    # diameter Do, centre conductor d, offset s): Z0 = (eta0 / (2 pi sqrt(eps_r))) *
    # arccosh((Do^2 + d^2 - 4 s^2) / (2 Do d)) -- recalled from memory (the handbook quotes
    # 60 ohm for eta0 / 2 pi; eta0 = mu0 c0 is written out here). rtol 1e-13: same function,
    # different arithmetic.
    eps_r = 2.25
    big_d, small_d = 2.0 * B, 2.0 * A
    x = (big_d ** 2 + small_d ** 2 - 4.0 * D ** 2) / (2.0 * big_d * small_d)
    expected = mu_0 * speed_of_light / (2.0 * np.pi * np.sqrt(eps_r)) * np.arccosh(x)
    np.testing.assert_allclose(characteristic_impedance_eccentric(A, B, D, eps_r), expected,
                               rtol=1e-13)


def test_geometry_factor_matches_method_of_images():
    # Source: method of images for two non-concentric circles (Ramo, Whinnery, Van Duzer,
    # 3rd ed., Sec. 4.8); independent of the arccosh form. rtol 1e-12: closed-form images,
    # only rounding (the x1 root is taken in its cancellation-free form).
    lam, _, _ = image_solution(A, B, D)
    np.testing.assert_allclose(geometry_factor(A, B, D), lam, rtol=1e-12)


def test_concentric_limit_is_exactly_log_b_over_a():
    a = np.array([0.1e-3, 0.45e-3, 1.5202e-3, 2.0e-3])
    b = np.array([0.35e-3, 1.47e-3, 3.5e-3, 40.0e-3])
    # Exactly the same floating-point value, as the module promises.
    np.testing.assert_array_equal(geometry_factor(a, b, 0.0), np.log(b / a))
    np.testing.assert_array_equal(geometry_factor(a, b), np.log(b / a))
    # ... and the same Z0, L, C as the concentric line model (rtol 1e-15: same arithmetic).
    for eps_r in (1.0, 2.25):
        np.testing.assert_allclose(characteristic_impedance_eccentric(a, b, 0.0, eps_r),
                                   characteristic_impedance_lossless(a, b, eps_r), rtol=1e-15)


@pytest.mark.parametrize("fraction", [1e-6, 1e-4, 1e-3, 1e-2])
def test_geometry_factor_is_continuous_as_offset_goes_to_zero(fraction):
    # Derived here: X = X0 - D^2/(2ab) and arccosh'(X0) = 2ab/(b^2 - a^2) give
    # Lambda = ln(b/a) - D^2/(b^2 - a^2) + O(D^4): the offset acts to second order and the
    # arccosh branch joins the log branch without a step.
    a, b = np.array([0.45e-3, 1.5202e-3]), np.array([1.47e-3, 3.5e-3])
    d = fraction * (b - a)
    lam = geometry_factor(a, b, d)
    drop = np.log(b / a) - lam
    predicted = d * d / (b * b - a * a)
    # Absolute: rounding of arccosh near X0 is ~ 1e-16 X0 / sqrt(X0^2 - 1), i.e. < 1e-15 here;
    # relative O(D^2 / (b - a)^2) for the truncated series.
    np.testing.assert_allclose(drop, predicted, rtol=10.0 * fraction ** 2, atol=2e-15)


def test_impedance_falls_as_the_centre_conductor_moves_off_axis():
    d = np.linspace(0.0, 0.9, 10) * (3.5e-3 - 1.5202e-3)
    z0 = characteristic_impedance_eccentric(1.5202e-3, 3.5e-3, d, 1.0)
    assert np.all(np.diff(z0) < 0.0)


# ------------------------------------------------------------------ L and C identities


@pytest.mark.parametrize("eps_r", [1.0, 1.45, 2.25])
def test_inductance_capacitance_identities(eps_r):
    # Source: TEM-line identities L C = mu eps and Z0 = sqrt(L / C) (Pozar, Microwave
    # Engineering, 4th ed., Sec. 2.2), with the eccentric per-unit-length parameters of the
    # module notes, C = 2 pi eps / Lambda and L_e = mu0 Lambda / (2 pi).
    lam = geometry_factor(A, B, D)
    cap = 2.0 * np.pi * epsilon_0 * eps_r / lam
    ind = mu_0 * lam / (2.0 * np.pi)
    np.testing.assert_allclose(ind * cap, mu_0 * epsilon_0 * eps_r, rtol=1e-14)
    # rtol 1e-11: Z0 uses eta0 = mu0 c0, sqrt(L/C) uses sqrt(mu0/eps0), and
    # scipy.constants' (CODATA 2022) mu0 eps0 c0^2 = 1 + 1.2e-12.
    np.testing.assert_allclose(characteristic_impedance_eccentric(A, B, D, eps_r),
                               np.sqrt(ind / cap), rtol=1e-11)
    # The capacitance from the image charges (charge 2 pi eps per unit "phi" difference).
    lam_images, _, _ = image_solution(A, B, D)
    np.testing.assert_allclose(cap, 2.0 * np.pi * epsilon_0 * eps_r / lam_images, rtol=1e-12)
    # At D = 0 the same parameters as physics.line.
    np.testing.assert_allclose(2.0 * np.pi * epsilon_0 * eps_r / geometry_factor(A, B),
                               capacitance(A, B, eps_r), rtol=1e-15)
    np.testing.assert_allclose(mu_0 * geometry_factor(A, B) / (2.0 * np.pi),
                               inductance_external(A, B), rtol=1e-15)


# ------------------------------------------------------------------ conductor loss


def test_wheeler_factor_is_one_on_axis_and_larger_off_axis():
    np.testing.assert_array_equal(wheeler_loss_factor(A, B, 0.0), np.ones_like(A))
    assert np.all(wheeler_loss_factor(A, B, D) > 1.0)
    d = np.linspace(0.0, 0.9, 10) * (3.5e-3 - 1.5202e-3)
    assert np.all(np.diff(wheeler_loss_factor(1.5202e-3, 3.5e-3, d)) > 0.0)


def test_wheeler_factor_matches_finite_differences_of_lambda():
    # Definition in the module: F = (-dLambda/da + dLambda/db) / (1/a + 1/b); central
    # differences of geometry_factor, step 1e-6 of the radius: truncation ~ 1e-12, rounding
    # ~ 1e-16 / 1e-6 = 1e-10 relative -> rtol 1e-8.
    h = 1e-6 * A
    lam_a = (geometry_factor(A + h, B, D) - geometry_factor(A - h, B, D)) / (2.0 * h)
    lam_b = (geometry_factor(A, B + h, D) - geometry_factor(A, B - h, D)) / (2.0 * h)
    f_fd = (-lam_a + lam_b) / (1.0 / A + 1.0 / B)
    np.testing.assert_allclose(wheeler_loss_factor(A, B, D), f_fd, rtol=1e-8)


def test_loss_of_each_conductor_matches_image_surface_fields():
    # Independent of Wheeler's rule: the skin-effect loss of a conductor is
    # (Rs / 2) * closed integral of |H_t|^2 dl, and H_t is the surface field of the image
    # solution (TEM: H_t proportional to the normal E). Per conductor, Wheeler's rule says
    # I_inner = -dLambda/da and I_shield = dLambda/db (module notes; H. A. Wheeler, Proc. IRE
    # 30 (1942) 412). rtol 1e-10: 4096-point trapezoid on analytic periodic integrands.
    _, i_in, i_out = image_solution(A, B, D)
    grad = geometry_factor_gradient(A, B, D)
    np.testing.assert_allclose(i_in, -grad.d_da, rtol=1e-10)
    np.testing.assert_allclose(i_out, grad.d_db, rtol=1e-10)
    np.testing.assert_allclose(wheeler_loss_factor(A, B, D),
                               (i_in + i_out) / (1.0 / A + 1.0 / B), rtol=1e-10)
    # With different surface resistances on the two conductors (e.g. copper centre conductor,
    # aluminium shield) the per-conductor split is what counts.
    rs_i, rs_s = 0.026, 0.034
    np.testing.assert_allclose(resistance_skin_effect_eccentric(A, B, rs_i, rs_s, D),
                               (rs_i * i_in + rs_s * i_out) / (2.0 * np.pi), rtol=1e-10)


@pytest.mark.parametrize("fraction", [1e-3, 1e-2, 3e-2])
def test_wheeler_factor_small_offset_expansion(fraction):
    # Derived here from Lambda = ln(b/a) - D^2/(b^2 - a^2) + O(D^4) (see the continuity test):
    # -dLambda/da = 1/a + 2 a D^2/(b^2 - a^2)^2, dLambda/db = 1/b + 2 b D^2/(b^2 - a^2)^2, so
    # F = 1 + 2 a b D^2/(b^2 - a^2)^2 + O(D^4). The relative error of F - 1 is O(D^2/(b-a)^2).
    a, b = np.array([0.45e-3, 1.5202e-3, 0.2e-3]), np.array([1.47e-3, 3.5e-3, 2.4e-3])
    d = fraction * (b - a)
    predicted = 2.0 * a * b * d * d / (b * b - a * a) ** 2
    np.testing.assert_allclose(wheeler_loss_factor(a, b, d) - 1.0, predicted,
                               rtol=20.0 * fraction ** 2 + 1e-6)


# ------------------------------------------------------------------ shapes


def test_scalar_list_and_array_inputs_agree():
    scalar = [float(geometry_factor(A[i], B[i], D[i])) for i in range(A.size)]
    np.testing.assert_array_equal(geometry_factor(list(A), list(B), list(D)), scalar)
    np.testing.assert_array_equal(geometry_factor(A, B, D), scalar)
    assert np.shape(geometry_factor(1e-3, 3e-3, 0.1e-3)) == ()
    assert wheeler_loss_factor(A, B, 0.1e-3).shape == A.shape
    assert characteristic_impedance_eccentric(A, B, D, 2.25).shape == A.shape
    grid = geometry_factor(A[:, None], B[:, None], D[None, :] * 0.1)
    assert grid.shape == (A.size, D.size)
    np.testing.assert_array_equal(grid[:, 0], geometry_factor(A, B, D[0] * 0.1))
