"""Fields of a coax in its four regions (physics.fields)."""

import numpy as np
import pytest
from scipy import integrate
from scipy.constants import epsilon_0, mu_0

from cablefam.physics.fields import (
    current_density_ac,
    current_density_dc,
    electric_field,
    magnetic_field_ac,
    magnetic_field_dc,
    max_peak_voltage,
    peak_electric_field,
)
from cablefam.physics.internal_impedance import tube_internal_impedance, wire_internal_impedance
from cablefam.physics.line import capacitance, inductance_external
from cablefam.physics.skin import skin_depth

# Source: IEC 60028, annealed copper resistivity at 20 degC, 1/58 ohm mm^2 m^-1.
RHO_CU = 1.7241e-8
# Source: IEC 60889, hard-drawn aluminium wire, 0.028264 ohm mm^2 m^-1 at 20 degC.
RHO_AL = 2.8264e-8

A, B, C = 0.5e-3, 1.75e-3, 2.0e-3     # a small 50 ohm-ish cable with a 0.25 mm wall
CURRENT = 2.5                          # [A]


def frequency_for_ratio(radius, ratio, resistivity=RHO_CU):
    delta = radius / ratio
    return resistivity / (np.pi * mu_0 * delta * delta)


# --------------------------------------------------------------------------- DC (Ampere)


def test_dc_field_four_regions_analytic_values():
    # Source: Ampere's circuital law, 2 pi r H = enclosed current, with uniform current
    # density in each conductor (Ramo, Whinnery, Van Duzer, 3rd ed., Sec. 2.3, from memory
    # of the section); written out here point by point, rtol 1e-14.
    i = CURRENT
    r = np.array([0.0, 0.2e-3, 0.4e-3, 1.0e-3, 1.5e-3, 1.8e-3, 1.9e-3, 2.5e-3, 1.0])
    inside_wire = i * (np.pi * r**2) / (np.pi * A**2)
    in_wall = i - i * (np.pi * (r**2 - B**2)) / (np.pi * (C**2 - B**2))
    enclosed = np.select([r < A, r < B, r < C], [inside_wire, np.full_like(r, i), in_wall], 0.0)
    with np.errstate(invalid="ignore", divide="ignore"):
        expected = np.where(r > 0.0, mu_0 * enclosed / (2.0 * np.pi * r), 0.0)
    np.testing.assert_allclose(magnetic_field_dc(r, A, B, C, i), expected, rtol=1e-14, atol=0.0)
    assert magnetic_field_dc(0.0, A, B, C, i) == 0.0
    np.testing.assert_array_equal(magnetic_field_dc(np.array([C, 1.1 * C, 10.0]), A, B, C, i), 0.0)


def test_dc_field_continuity_at_each_interface():
    # Ampere's law: with mu_r = 1, B is continuous at r = a and r = b and falls to zero at
    # r = c (no net current); with mu_r != 1 it is H = B/mu that is continuous.
    eps = 1e-12
    for r0 in (A, B):
        value = mu_0 * CURRENT / (2 * np.pi * r0)
        below, above = magnetic_field_dc(np.array([r0 * (1 - eps), r0]), A, B, C, CURRENT)
        assert below == pytest.approx(value, rel=1e-11)
        assert above == pytest.approx(value, rel=1e-11)
    assert magnetic_field_dc(C * (1 - eps), A, B, C, CURRENT) == pytest.approx(
        0.0, abs=1e-11 * mu_0 * CURRENT / (2 * np.pi * B))
    mu_a, mu_c = 50.0, 300.0
    h = magnetic_field_dc(np.array([A * (1 - eps), A, B * (1 - eps), B]), A, B, C, CURRENT,
                          mu_a, mu_c) / mu_0
    np.testing.assert_allclose(h / np.array([mu_a, 1.0, 1.0, mu_c]),
                               CURRENT / (2 * np.pi * np.array([A, A, B, B])), rtol=1e-11)


def test_dc_current_density_carries_plus_and_minus_i():
    j = current_density_dc(np.array([0.1e-3, 1.0e-3, 1.9e-3, 3.0e-3]), A, B, C, CURRENT)
    np.testing.assert_allclose(j[0] * np.pi * A**2, CURRENT, rtol=1e-15)
    assert j[1] == 0.0 and j[3] == 0.0
    np.testing.assert_allclose(j[2] * np.pi * (C**2 - B**2), -CURRENT, rtol=1e-15)


def test_dc_magnetic_energy_gives_the_inductances():
    # Source: L = (1/I^2) int B^2/mu dV (Ramo, Whinnery, Van Duzer, 3rd ed., Sec. 2.17, from
    # memory of the section). Quadrature of our B(r) must give mu0/(8 pi) in the wire,
    # the external mu0 ln(b/a)/(2 pi) and the low-frequency tube inductance of
    # physics.internal_impedance: a cross-check between three modules. rtol 1e-9
    # (quad to 1e-12; the tube's low-frequency reactance is good to ~1e-8 at c/delta=0.01).
    def energy(r0, r1):
        value, _ = integrate.quad(
            lambda r: magnetic_field_dc(r, A, B, C, 1.0) ** 2 / mu_0 * 2 * np.pi * r,
            r0, r1, epsabs=0.0, epsrel=1e-12)
        return value
    assert energy(0.0, A) == pytest.approx(mu_0 / (8 * np.pi), rel=1e-10)
    assert energy(A, B) == pytest.approx(inductance_external(A, B), rel=1e-10)
    f = frequency_for_ratio(C, 0.01)
    tube_l = tube_internal_impedance(B, C, RHO_CU, f).imag / (2 * np.pi * f)
    assert energy(B, C) == pytest.approx(tube_l, rel=1e-7)


# --------------------------------------------------------------------------- AC


def test_ac_field_tends_to_dc_profile_at_low_frequency():
    # At 10 mHz, a/delta ~ 4e-4 and c/delta ~ 1.5e-3: the skin-effect corrections are
    # O((r/delta)^4) < 1e-10. rtol 1e-7 covers the tube's cancellation at small arguments.
    r = np.linspace(0.0, 2.5e-3, 1001)
    dc = magnetic_field_dc(r, A, B, C, CURRENT)
    ac = magnetic_field_ac(r, A, B, C, CURRENT, 1e-2, RHO_CU, RHO_AL)
    np.testing.assert_allclose(ac.real, dc, rtol=1e-7, atol=1e-7 * dc.max())
    np.testing.assert_allclose(ac.imag, 0.0, atol=1e-7 * dc.max())
    j_dc = current_density_dc(r, A, B, C, CURRENT)
    j_ac = current_density_ac(r, A, B, C, CURRENT, 1e-2, RHO_CU, RHO_AL)
    np.testing.assert_allclose(j_ac, j_dc, rtol=1e-7, atol=1e-7 * abs(j_dc).max())


@pytest.mark.parametrize("frequency", [50.0, 1.0e5, 1.0e8, None])
def test_ac_field_continuity_and_zero_outside(frequency):
    if frequency is None:
        frequency = frequency_for_ratio(A, 1000.0)        # a/delta = 1000
    eps = 1e-13
    r = np.array([A * (1 - eps), A, B, B * (1 + eps), C * (1 - eps), C, 1.5 * C, 1.0])
    h = magnetic_field_ac(r, A, B, C, CURRENT, frequency, RHO_CU, RHO_CU) / mu_0
    assert np.isfinite(h).all()
    # Ampere: H(a) = I/(2 pi a) from both sides, H(b) = I/(2 pi b), zero for r >= c.
    # rtol 1e-9: the two sides are different formulas evaluated 1e-13 apart.
    np.testing.assert_allclose(h[:2], CURRENT / (2 * np.pi * A), rtol=1e-9)
    np.testing.assert_allclose(h[2:4], CURRENT / (2 * np.pi * B), rtol=1e-9)
    assert abs(h[4]) < 1e-9 * CURRENT / (2 * np.pi * B)
    np.testing.assert_array_equal(h[5:], 0.0)
    # Dielectric: exactly the DC value (the displacement current is not in this model).
    r_d = np.linspace(A, B, 7, endpoint=False)
    np.testing.assert_allclose(magnetic_field_ac(r_d, A, B, C, CURRENT, frequency, RHO_CU, RHO_CU),
                               magnetic_field_dc(r_d, A, B, C, CURRENT), rtol=1e-15)


def integrate_current(j_of_r, r0, r1, delta, toward):
    """Integral of J 2 pi r dr over [r0, r1] with break points every few skin depths."""
    marks = [k * delta for k in (1, 3, 10, 30, 100, 300) if k * delta < r1 - r0]
    points = [r1 - m for m in marks] if toward == "outer" else [r0 + m for m in marks]
    value, _ = integrate.quad(lambda r: j_of_r(r) * 2 * np.pi * r, r0, r1, points=points or None,
                              limit=500, complex_func=True, epsabs=1e-13, epsrel=1e-11)
    return value


@pytest.mark.parametrize("ratio", [1e-3, 0.1, 1.0, 3.0, 12.0, 100.0, 1000.0])
def test_ac_current_density_integrates_to_plus_and_minus_i(ratio):
    # Source: charge conservation / Ampere (the wire carries I, the shield returns -I); the
    # integral is done by adaptive quadrature (scipy.integrate.quad), rtol 1e-9.
    f = frequency_for_ratio(A, ratio)
    def j(r):
        return complex(current_density_ac(r, A, B, C, CURRENT, f, RHO_CU, RHO_AL))
    i_wire = integrate_current(j, 0.0, A, skin_depth(RHO_CU, f), "outer")
    i_wall = integrate_current(j, B, C, skin_depth(RHO_AL, f), "inner")
    assert i_wire.real == pytest.approx(CURRENT, rel=1e-9)
    assert i_wire.imag == pytest.approx(0.0, abs=1e-9 * CURRENT)
    assert i_wall.real == pytest.approx(-CURRENT, rel=1e-9)
    assert i_wall.imag == pytest.approx(0.0, abs=1e-9 * CURRENT)
    # The profile itself is finite everywhere, also at a/delta = 1000.
    r = np.linspace(0.0, 3e-3, 3001)
    assert np.isfinite(current_density_ac(r, A, B, C, CURRENT, f, RHO_CU, RHO_AL)).all()
    assert np.isfinite(magnetic_field_ac(r, A, B, C, CURRENT, f, RHO_CU, RHO_AL)).all()


@pytest.mark.parametrize("ratio", [0.3, 5.0, 50.0, 1000.0, 1.0e4])
def test_surface_field_gives_the_internal_impedance(ratio):
    # Source: Z_i = E_z(surface)/I = rho J(surface)/I (Schelkunoff, Bell Syst. Tech. J. 13
    # (1934), definition of the internal impedance); fields and internal_impedance are
    # written independently, so this ties the two modules. rtol 1e-10.
    f = frequency_for_ratio(A, ratio)
    j = current_density_ac(np.array([A * (1 - 1e-15), B]), A, B, C, CURRENT, f, RHO_CU, RHO_AL)
    assert RHO_CU * j[0] / CURRENT == pytest.approx(
        complex(wire_internal_impedance(A, RHO_CU, f)), rel=1e-10)
    assert -RHO_AL * j[1] / CURRENT == pytest.approx(
        complex(tube_internal_impedance(B, C, RHO_AL, f)), rel=1e-10)


def test_ac_current_crowds_to_the_facing_surfaces():
    # Skin and proximity of the return: at a/delta = 20 the wire current sits at its
    # surface and the shield current at the inner surface of the wall.
    f = frequency_for_ratio(A, 20.0)
    j = abs(current_density_ac(np.array([0.0, 0.9 * A, A * (1 - 1e-12), B, 0.5 * (B + C),
                                         C * (1 - 1e-12)]), A, B, C, 1.0, f, RHO_CU, RHO_CU))
    assert j[0] < j[1] < j[2]
    assert j[3] > j[4] > j[5]


# --------------------------------------------------------------------------- electric field


def test_electric_field_gauss_and_voltage():
    # Source: coaxial capacitor, E = V/(r ln(b/a)) (Ramo, Whinnery, Van Duzer, 3rd ed.,
    # Sec. 2.3, from memory). Checks: int_a^b E dr = V (quadrature, rtol 1e-12); Gauss,
    # 2 pi r eps E = C V with the capacitance of physics.line (rtol 1e-14); zero in metal.
    v, eps_r = 1.0e3, 2.3
    value, _ = integrate.quad(lambda r: electric_field(r, A, B, v), A, B, epsrel=1e-13)
    assert value == pytest.approx(v, rel=1e-12)
    r = np.linspace(A, B, 11)
    np.testing.assert_allclose(2 * np.pi * r * epsilon_0 * eps_r * electric_field(r, A, B, v),
                               capacitance(A, B, eps_r) * v, rtol=1e-14)
    np.testing.assert_array_equal(electric_field(np.array([0.0, 0.9 * A, 1.01 * B, C]), A, B, v),
                                  0.0)
    assert peak_electric_field(A, B, v) == pytest.approx(float(electric_field(A, A, B, v)),
                                                         rel=1e-15)


def test_max_peak_voltage_inverts_peak_field():
    rng = np.random.default_rng(11)
    a = rng.uniform(0.1e-3, 3e-3, 40)
    b = a * rng.uniform(1.2, 8.0, 40)
    e_bd, k_s = 20e6, rng.uniform(1.0, 4.0, 40)
    v = max_peak_voltage(a, b, e_bd, k_s)
    np.testing.assert_allclose(peak_electric_field(a, b, v), e_bd / k_s, rtol=1e-14)


# --------------------------------------------------------------------------- shapes


def test_broadcast_designs_against_radius_column():
    # (n,) designs against an (m, 1) column of radii give (m, n), equal to one design at a
    # time (same numbers, to the last bit up to numpy's vectorized-vs-scalar rounding).
    a = np.array([0.5e-3, 1.0e-3, 0.3e-3, 2.0e-3])
    b = np.array([1.75e-3, 3.5e-3, 1.0e-3, 4.6e-3])
    c = b + np.array([0.25e-3, 0.5e-3, 0.05e-3, 1.0e-3])
    f = np.array([50.0, 1e6, 1e9, 3e10])
    r = np.linspace(0.0, 6e-3, 25)[:, None]
    calls = {
        "b_dc": lambda *d: magnetic_field_dc(r, *d[:3], CURRENT),
        "j_dc": lambda *d: current_density_dc(r, *d[:3], CURRENT),
        "b_ac": lambda *d: magnetic_field_ac(r, *d[:3], CURRENT, d[3], RHO_CU, RHO_AL),
        "j_ac": lambda *d: current_density_ac(r, *d[:3], CURRENT, d[3], RHO_CU, RHO_AL),
        "e": lambda *d: electric_field(r, d[0], d[1], 100.0),
    }
    for name, call in calls.items():
        grid = call(a, b, c, f)
        assert grid.shape == (25, 4), name
        assert np.isfinite(grid).all(), name
        for k in range(4):
            one = call(a[k], b[k], c[k], f[k])
            np.testing.assert_allclose(grid[:, k], one[:, 0], rtol=1e-14, atol=0, err_msg=name)


def test_scalar_list_array_give_same_numbers():
    r = [0.2e-3, 1.0e-3, 1.9e-3]
    args = (A, B, C, CURRENT, 1e6, RHO_CU, RHO_CU)
    for function, extra in [(magnetic_field_ac, args), (current_density_ac, args),
                            (magnetic_field_dc, (A, B, C, CURRENT)),
                            (current_density_dc, (A, B, C, CURRENT)),
                            (electric_field, (A, B, 10.0))]:
        from_list = function(r, *extra)
        from_array = function(np.array(r), *extra)
        from_scalar = np.array([function(x, *extra) for x in r])
        np.testing.assert_array_equal(from_list, from_array)
        np.testing.assert_allclose(from_list, from_scalar, rtol=1e-15, atol=0)
    np.testing.assert_array_equal(max_peak_voltage([A, 2 * A], [B, B], 3e6),
                                  [max_peak_voltage(A, B, 3e6), max_peak_voltage(2 * A, B, 3e6)])
