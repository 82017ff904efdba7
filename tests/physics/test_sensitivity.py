"""Analytic derivatives of Z0 and of the skin-effect conductor attenuation (physics.sensitivity)."""

import numpy as np
import pytest
from scipy.constants import mu_0, speed_of_light

from cablefam.physics.eccentricity import characteristic_impedance_eccentric
from cablefam.physics.line import characteristic_impedance_lossless, line_parameters, propagation_constant
from cablefam.physics.sensitivity import (
    attenuation_conductor_skin_effect,
    attenuation_sensitivity,
    geometry_factor_gradient,
    impedance_offset_sensitivity,
    impedance_sensitivity,
    resistance_skin_effect_eccentric,
)
from cablefam.physics.skin import skin_depth, surface_resistance

# Source: IEC 60028, annealed copper resistivity at 20 degC, 1/58 ohm mm^2 m^-1.
RHO_CU = 1.7241e-8
ETA_0 = mu_0 * speed_of_light

# Several designs: RG-58-like, 7 mm air line, thin-wire high-impedance, fat low-impedance,
# with and without an offset; eps_r of PE, foamed PE, PTFE, air.
A = np.array([0.45e-3, 0.45e-3, 1.5202e-3, 1.5202e-3, 0.2e-3, 1.0e-3, 1.0e-3])
B = np.array([1.47e-3, 1.47e-3, 3.5e-3, 3.5e-3, 2.4e-3, 1.3e-3, 1.3e-3])
D = np.array([0.0, 0.5e-3, 0.0, 1.3e-3, 1.0e-3, 0.0, 0.2e-3])
EPS = np.array([2.25, 2.25, 1.0, 1.0, 1.45, 2.1, 2.1])
RS_I = np.array([0.026, 0.026, 0.082, 0.082, 0.026, 0.05, 0.05])
RS_S = np.array([0.026, 0.034, 0.082, 0.090, 0.040, 0.05, 0.07])


def central(f, x, h):
    return (f(x + h) - f(x - h)) / (2.0 * h)


# ------------------------------------------------------------------ impedance


def test_impedance_derivatives_match_finite_differences():
    s = impedance_sensitivity(A, B, EPS, D)
    # Central differences of characteristic_impedance_eccentric, step 1e-6 of the radius:
    # truncation ~ 1e-12, rounding ~ 1e-16 / 1e-6 relative -> rtol 1e-8.
    h = 1e-6 * A
    z0 = characteristic_impedance_eccentric
    np.testing.assert_allclose(s.dz0_da, central(lambda x: z0(x, B, D, EPS), A, h), rtol=1e-8)
    np.testing.assert_allclose(s.dz0_db, central(lambda x: z0(A, x, D, EPS), B, h), rtol=1e-8)
    np.testing.assert_allclose(s.dz0_deps, central(lambda x: z0(A, B, D, x), EPS, 1e-6 * EPS),
                               rtol=1e-8)
    off = D > 0  # one-sided at D = 0, where the derivative is 0 by symmetry
    np.testing.assert_allclose(
        s.dz0_doffset[off],
        central(lambda x: z0(A[off], B[off], x, EPS[off]), D[off], h[off]), rtol=1e-8)
    np.testing.assert_array_equal(s.dz0_doffset[~off], 0.0)


def test_offset_sensitivity_matches_finite_differences_in_offset_squared():
    # Z0 depends on the offset through D^2 only; central differences in q = D^2 of
    # characteristic_impedance_eccentric, step 1e-6 q: truncation ~ 1e-12, rounding ~ 1e-10
    # relative -> rtol 1e-7.
    off = D > 0
    q = D[off] ** 2
    h = 1e-6 * q
    z0 = characteristic_impedance_eccentric
    fd = central(lambda x: z0(A[off], B[off], np.sqrt(x), EPS[off]), q, h)
    np.testing.assert_allclose(impedance_offset_sensitivity(A, B, EPS, D)[off], fd, rtol=1e-7)
    # At D = 0 it is -K / (b^2 - a^2), from Lambda = ln(b/a) - D^2/(b^2 - a^2) + O(D^4)
    # (derived in tests/physics/test_eccentricity.py); rtol 1e-15, rounding only.
    a, b, eps = A[~off], B[~off], EPS[~off]
    k = ETA_0 / (2.0 * np.pi * np.sqrt(eps))
    np.testing.assert_allclose(impedance_offset_sensitivity(a, b, eps), -k / (b * b - a * a),
                               rtol=1e-15)
    # ... and the one-sided difference from D = 0 agrees to O(D^2) (rtol 1e-5).
    q0 = 1e-6 * (b - a) ** 2
    np.testing.assert_allclose((z0(a, b, np.sqrt(q0), eps) - z0(a, b, 0.0, eps)) / q0,
                               -k / (b * b - a * a), rtol=1e-5)


def test_impedance_derivatives_concentric_values():
    # Derivatives of K ln(b/a), K = eta0 / (2 pi sqrt(eps_r)) (Pozar, Microwave Engineering,
    # 4th ed., Table 2.1, Z0 of the coax); rtol 1e-15, rounding only.
    a, b, eps = A[D == 0], B[D == 0], EPS[D == 0]
    k = ETA_0 / (2.0 * np.pi * np.sqrt(eps))
    s = impedance_sensitivity(a, b, eps)
    np.testing.assert_allclose(s.dz0_da, -k / a, rtol=1e-15)
    np.testing.assert_allclose(s.dz0_db, k / b, rtol=1e-15)
    np.testing.assert_allclose(s.dz0_deps, -k * np.log(b / a) / (2.0 * eps), rtol=1e-15)
    np.testing.assert_array_equal(s.dz0_doffset, 0.0)
    # The general (arccosh) branch is continuous with them as D -> 0.
    s_small = impedance_sensitivity(a, b, eps, 1e-9 * (b - a))
    np.testing.assert_allclose(s_small.dz0_da, -k / a, rtol=1e-12)
    np.testing.assert_allclose(s_small.dz0_db, k / b, rtol=1e-12)
    # dZ0/dD = -2 K D / sqrt(P) ~ -2 K 1e-9 (b - a) / (b^2 - a^2) at this offset.
    assert np.all(np.abs(s_small.dz0_doffset) < 1e-8 * k / (b - a))


def test_geometry_gradient_second_derivatives_are_symmetric():
    # Indirect check of the second derivatives inside attenuation_sensitivity: finite
    # differences of the analytic gradient must be symmetric, d/db(dL/da) = d/da(dL/db).
    h = 1e-6 * A
    lab = central(lambda x: geometry_factor_gradient(A, x, D).d_da, B, h)
    lba = central(lambda x: geometry_factor_gradient(x, B, D).d_db, A, h)
    np.testing.assert_allclose(lab, lba, rtol=1e-6, atol=1e-6 / A.min() ** 2)


# ------------------------------------------------------------------ attenuation


def test_attenuation_derivatives_match_finite_differences_of_closed_form():
    s = attenuation_sensitivity(A, B, RS_I, RS_S, EPS, D)
    h = 1e-6 * A

    def alpha(a=A, b=B, eps=EPS, d=D):
        return attenuation_conductor_skin_effect(a, b, RS_I, RS_S, eps, d)

    np.testing.assert_allclose(s.dalpha_da, central(lambda x: alpha(a=x), A, h), rtol=1e-7)
    np.testing.assert_allclose(s.dalpha_db, central(lambda x: alpha(b=x), B, h), rtol=1e-7)
    np.testing.assert_allclose(s.dalpha_deps, central(lambda x: alpha(eps=x), EPS, 1e-6 * EPS),
                               rtol=1e-7)
    off = D > 0
    fd = central(lambda x: attenuation_conductor_skin_effect(
        A[off], B[off], RS_I[off], RS_S[off], EPS[off], x), D[off], h[off])
    np.testing.assert_allclose(s.dalpha_doffset[off], fd, rtol=1e-7)
    np.testing.assert_array_equal(s.dalpha_doffset[~off], 0.0)


def test_attenuation_concentric_closed_form():
    # Source: alpha_c = R / (2 Z0), R = Rs_i / (2 pi a) + Rs_s / (2 pi b) (Pozar, Microwave
    # Engineering, 4th ed., Sec. 2.7 and Table 2.1); its derivatives written out by hand.
    a, b, eps, rs_i, rs_s = (x[D == 0] for x in (A, B, EPS, RS_I, RS_S))
    k = ETA_0 / (2.0 * np.pi * np.sqrt(eps))
    lam = np.log(b / a)
    r = rs_i / (2.0 * np.pi * a) + rs_s / (2.0 * np.pi * b)
    np.testing.assert_allclose(attenuation_conductor_skin_effect(a, b, rs_i, rs_s, eps),
                               r / (2.0 * k * lam), rtol=1e-15)
    s = attenuation_sensitivity(a, b, rs_i, rs_s, eps)
    np.testing.assert_allclose(
        s.dalpha_da, (-rs_i / (2.0 * np.pi * a * a) + r / (a * lam)) / (2.0 * k * lam),
        rtol=1e-14)
    np.testing.assert_allclose(
        s.dalpha_db, (-rs_s / (2.0 * np.pi * b * b) - r / (b * lam)) / (2.0 * k * lam),
        rtol=1e-14)


@pytest.mark.parametrize("frequency", [1.0e9, 1.0e10])
def test_attenuation_derivatives_match_full_line_model(frequency):
    # The exact line model of physics.line (Bessel internal impedances, lossless dielectric)
    # differentiated numerically against the skin-effect closed form. The derivatives are
    # compared on the scale alpha / a of a typical derivative (near the b/a = 3.59 optimum
    # d(alpha)/da itself goes through zero, so a relative comparison would mean nothing).
    a = np.array([0.45e-3, 1.5202e-3, 1.0e-3])
    b = np.array([1.47e-3, 3.5e-3, 1.3e-3])
    c = b + 0.5e-3
    eps = np.array([2.25, 1.0, 2.1])
    rs = surface_resistance(RHO_CU, frequency)
    delta = skin_depth(RHO_CU, frequency)
    lam = np.log(b / a)
    alpha = attenuation_conductor_skin_effect(a, b, rs, rs, eps)
    s = attenuation_sensitivity(a, b, rs, rs, eps)
    h = 1e-5 * a  # the line model is smooth to ~1e-10 relative: rounding 1e-10/1e-5 << tol

    def r_over_2z0(a_, b_):
        p = line_parameters(a_, b_, c, frequency, RHO_CU, RHO_CU, eps, 0.0)
        return p.r / (2.0 * characteristic_impedance_lossless(a_, b_, eps))

    def re_gamma(a_, b_):
        p = line_parameters(a_, b_, c, frequency, RHO_CU, RHO_CU, eps, 0.0)
        return propagation_constant(p.r, p.l, p.g, p.c, frequency).real

    # (1) The exact resistance over the lossless Z0: differs from the closed form only by the
    # curvature terms of the internal impedances, O(delta / a) (measured: < 0.5 delta / a).
    tol = delta / a
    assert np.all(np.abs(alpha / r_over_2z0(a, b) - 1.0) < tol)
    assert np.all(np.abs(s.dalpha_da - central(lambda x: r_over_2z0(x, b), a, h))
                  < tol * alpha / a)
    assert np.all(np.abs(s.dalpha_db - central(lambda x: r_over_2z0(a, x), b, h))
                  < tol * alpha / a)
    # (2) Re(gamma) of the full RLGC line also carries the internal inductance in Z0,
    # L_i / L_e = delta (1/a + 1/b) / (2 Lambda), whose derivative brings a 1/Lambda:
    # tolerance 2 (delta/a + L_i/L_e) / Lambda (measured: < 1/3 of it for these designs).
    share = delta / a + delta * (1.0 / a + 1.0 / b) / (2.0 * lam)
    assert np.all(np.abs(alpha / re_gamma(a, b) - 1.0) < share)
    assert np.all(np.abs(s.dalpha_da - central(lambda x: re_gamma(x, b), a, h))
                  < 2.0 * share / lam * alpha / a)
    assert np.all(np.abs(s.dalpha_db - central(lambda x: re_gamma(a, x), b, h))
                  < 2.0 * share / lam * alpha / a)


def test_optimum_of_attenuation_at_fixed_shield_radius():
    # Closed-form optimum: with b fixed and equal surface resistances, alpha_c is proportional
    # to (1 + b/a) / ln(b/a), least where ln x = 1 + 1/x, x = b/a = 3.5911 (the "77 ohm" air
    # line; value from memory, root recomputed here with scipy).
    from scipy.optimize import brentq

    x = brentq(lambda t: np.log(t) - 1.0 - 1.0 / t, 2.0, 5.0, xtol=1e-14)
    assert x == pytest.approx(3.5911, abs=1e-4)
    b = 1.0e-3
    a = np.array([b / x])
    s = attenuation_sensitivity(a, b, 0.03, 0.03, 1.0)
    scale = attenuation_conductor_skin_effect(a, b, 0.03, 0.03, 1.0) / a
    # Zero to rounding: |d alpha/da| / (alpha / a) < 1e-12.
    assert np.all(np.abs(s.dalpha_da) < 1e-12 * scale)


def test_eccentric_resistance_equals_wheeler_factor_times_concentric():
    from cablefam.physics.eccentricity import wheeler_loss_factor

    r = resistance_skin_effect_eccentric(A, B, RS_I, RS_I, D)
    expected = RS_I * (1.0 / A + 1.0 / B) / (2.0 * np.pi) * wheeler_loss_factor(A, B, D)
    np.testing.assert_allclose(r, expected, rtol=1e-13)


# ------------------------------------------------------------------ inputs and shapes


def test_invalid_geometry_raises_naming_the_values():
    with pytest.raises(ValueError, match="b = 0.0005"):
        impedance_sensitivity([1e-3, 0.6e-3], [3e-3, 0.5e-3], 2.25)
    with pytest.raises(ValueError, match="offset"):
        impedance_sensitivity(1e-3, 3e-3, 2.25, offset=2e-3)
    with pytest.raises(ValueError, match="relative_permittivity"):
        attenuation_sensitivity(1e-3, 3e-3, 0.03, 0.03, 0.0)
    with pytest.raises(ValueError):
        geometry_factor_gradient(np.nan, 3e-3)


def test_scalar_list_and_array_inputs_agree():
    full = impedance_sensitivity(A, B, EPS, D)
    listed = impedance_sensitivity(list(A), list(B), list(EPS), list(D))
    for i in range(A.size):
        one = impedance_sensitivity(A[i], B[i], EPS[i], D[i])
        for field in full._fields:
            assert np.shape(getattr(one, field)) == ()
            assert getattr(one, field) == getattr(full, field)[i]
            assert getattr(listed, field)[i] == getattr(full, field)[i]
    att = attenuation_sensitivity(A, B, RS_I, RS_S, EPS, D)
    for i in range(A.size):
        one = attenuation_sensitivity(A[i], B[i], RS_I[i], RS_S[i], EPS[i], D[i])
        for field in att._fields:
            assert getattr(one, field) == getattr(att, field)[i]
    # Broadcasting: one permittivity and no offset for a whole population; a 2-D grid.
    s = impedance_sensitivity(A, B, 2.25)
    assert all(np.shape(x) == A.shape for x in s)
    g = attenuation_sensitivity(A[:, None], B[:, None], 0.03, 0.03, EPS[None, :])
    assert all(np.shape(x) == (A.size, EPS.size) for x in g)
