"""Clad wires, plated surfaces and roughness (physics.layered_conductor, physics.roughness)."""

import mpmath as mp
import numpy as np
import pytest
from scipy.constants import mu_0

from cablefam.physics.internal_impedance import ASYMPTOTIC_MIN_RATIO, wire_resistance_reactance
from cablefam.physics.layered_conductor import (THICK_LAYER_SKIN_DEPTHS, clad_dc_resistance,
                                                clad_wire_resistance_reactance, core_radius)
from cablefam.physics.conductor_surface import planar_layer_impedance_ratio
from cablefam.physics.roughness import roughness_factor
from cablefam.physics.skin import skin_depth, surface_resistance

# Source: IEC 60028, annealed copper resistivity at 20 degC, 1/58 ohm mm^2 m^-1.
RHO_CU = 1.7241e-8
# Source: IEC 60889, hard-drawn aluminium wire, 0.028264 ohm mm^2 m^-1 at 20 degC.
RHO_AL = 2.8264e-8
# from memory: low-carbon steel (AISI 1010) about 0.143 uohm m; only "a resistive core".
RHO_STEEL = 1.43e-7


def frequency_for_ratio(radius, ratio, resistivity=RHO_CU, relative_permeability=1.0):
    """Frequency [Hz] at which radius/skin depth equals ``ratio``."""
    delta = radius / np.asarray(ratio, dtype=float)
    return resistivity / (np.pi * mu_0 * relative_permeability * delta * delta)


def reference_impedance(r2, r1, rho1, rho2, f, mu1=1.0, mu2=1.0, dps=40):
    """The two-layer wire in 40-digit arithmetic (mpmath Bessel functions, no scaling)."""
    with mp.workdps(dps):
        w = 2 * mp.pi * mp.mpf(f)
        m0 = mp.mpf(mu_0)
        k1 = mp.sqrt(1j * w * m0 * mu1 / mp.mpf(rho1))
        k2 = mp.sqrt(1j * w * m0 * mu2 / mp.mpf(rho2))
        zeta = (k1 * rho1) / (k2 * rho2) * mp.besseli(0, k1 * r1) / mp.besseli(1, k1 * r1)
        x1, x2 = k2 * r1, k2 * r2
        p = mp.besseli(0, x1) - zeta * mp.besseli(1, x1)
        q = mp.besselk(0, x1) + zeta * mp.besselk(1, x1)
        z = k2 * rho2 / (2 * mp.pi * r2) * (mp.besseli(0, x2) * q - p * mp.besselk(0, x2)) / (
            mp.besseli(1, x2) * q + p * mp.besselk(1, x2))
        return complex(z)


# --------------------------------------------------------------------------- limits


@pytest.mark.parametrize("ratio", [0.01, 0.3, 1.0, 3.0, 8.0, 11.9, 12.1, 30.0, 300.0, 3e4])
@pytest.mark.parametrize("share", [0.05, 0.5])
def test_equal_metals_give_the_homogeneous_wire(ratio, share):
    # Identity: a layer of the core's own metal changes nothing. Bessel region to ~1e-12; where
    # the Hankel series are used the two series (ratio series vs I/K series) differ by their
    # truncation, < 2e-10 at the switch (the accuracy of the existing wire code there).
    a = 1e-3
    f = frequency_for_ratio(a, ratio)
    r1 = core_radius(a, area_fraction=share)
    r, x = clad_wire_resistance_reactance(a, r1, RHO_CU, RHO_CU, f)
    r0, x0 = wire_resistance_reactance(a, RHO_CU, f)
    # both codes in their Bessel form: 1e-12 in R; X at u = 0.01 loses digits to cancellation
    # in both (eps/u^2 ~ 2e-12, as in test_internal_impedance)
    tol = 1e-12 if ratio < ASYMPTOTIC_MIN_RATIO else 2e-10
    assert r == pytest.approx(r0, rel=tol, abs=0)
    assert x == pytest.approx(x0, rel=tol if ratio > 0.1 else 1e-11, abs=0)


@pytest.mark.parametrize("thickness_skin_depths", [12.0, 19.0])
def test_thick_layer_is_the_layer_metal_alone(thickness_skin_depths):
    # Limit: a layer many skin depths thick hides the core (coupling exp(-2 t/delta) < 4e-11).
    # Below THICK_LAYER_SKIN_DEPTHS the layered formula itself is evaluated.
    a = 1e-3
    f = 1e9
    t = thickness_skin_depths * skin_depth(RHO_CU, f)
    assert t / skin_depth(RHO_CU, f) < THICK_LAYER_SKIN_DEPTHS
    r, x = clad_wire_resistance_reactance(a, a - t, RHO_STEEL, RHO_CU, f, 100.0, 1.0)
    r0, x0 = wire_resistance_reactance(a, RHO_CU, f)
    assert r == pytest.approx(r0, rel=1e-9, abs=0)
    assert x == pytest.approx(x0, rel=1e-9, abs=0)


def test_layer_pi_half_skin_depth_on_an_insulator_is_the_planar_minimum():
    # Source: planar layer on an insulator, Z = eta coth(gamma t), so
    # R/R_s = (sinh 2tau + sin 2tau)/(cosh 2tau - cos 2tau), minimum at tau = pi/2:
    # sinh(pi)/(cosh(pi) + 1) = 0.9171523 (closed form). Radius 1e4 skin depths: curvature
    # correction ~ delta/(2 r) = 5e-5.
    f = 1e9
    delta = skin_depth(RHO_CU, f)
    a = 1e4 * delta
    taus = np.linspace(1.2, 1.9, 71)
    r, _ = clad_wire_resistance_reactance(a, a - taus * delta, RHO_CU * 1e12, RHO_CU, f)
    r_thick = surface_resistance(RHO_CU, f) / (2 * np.pi * a)
    ratio = r / r_thick
    assert ratio.min() == pytest.approx(np.sinh(np.pi) / (np.cosh(np.pi) + 1.0), rel=1e-4)
    assert taus[np.argmin(ratio)] == pytest.approx(np.pi / 2, abs=0.011)


@pytest.mark.parametrize("mu_core", [1.0, 100.0])
def test_dc_limit_is_the_layers_in_parallel(mu_core):
    # Ohm's law: conductances of the two layers add (r2/delta = 0.01 leaves < 1e-9).
    a = 0.5e-3
    f = frequency_for_ratio(a, 0.01, RHO_STEEL, mu_core)
    r1 = core_radius(a, area_fraction=0.2)
    r, _ = clad_wire_resistance_reactance(a, r1, RHO_STEEL, RHO_CU, f, mu_core)
    assert r == pytest.approx(clad_dc_resistance(a, RHO_STEEL, RHO_CU, 0.2), rel=1e-8, abs=0)


# --------------------------------------------------------------------------- against mpmath


@pytest.mark.parametrize("f", [1e3, 1e5, 1e6, 5e6, 1e8, 1e9])
@pytest.mark.parametrize("rho1, mu1", [(RHO_STEEL, 100.0), (RHO_STEEL, 1.0), (RHO_AL, 1.0)])
def test_against_40_digit_bessel_functions(f, rho1, mu1):
    # Reference: the same two-layer solution with mpmath's unscaled Bessel functions at 40
    # digits; 25 um of copper on a 1 mm wire. Covers both Bessel and series regions of the
    # core and of the layer.
    a, t = 0.5e-3, 25e-6
    r, x = clad_wire_resistance_reactance(a, a - t, rho1, RHO_CU, f, mu1)
    z = reference_impedance(a, a - t, rho1, RHO_CU, f, mu1)
    assert r == pytest.approx(z.real, rel=1e-10, abs=0)
    assert x == pytest.approx(z.imag, rel=1e-10, abs=0)


@pytest.mark.parametrize("which", ["layer", "core"])
def test_switch_to_the_series_is_continuous(which):
    # Each side of the switch (r1/delta_2 for the layer, r1/delta_1 for the core) against
    # 40-digit values: both paths within 2e-10.
    a, share = 1e-3, 0.3
    r1 = core_radius(a, area_fraction=share)
    if which == "layer":
        rho1, mu1 = RHO_STEEL, 100.0
        f0 = frequency_for_ratio(r1, ASYMPTOTIC_MIN_RATIO, RHO_CU)
    else:
        rho1, mu1 = RHO_AL, 1.0
        f0 = frequency_for_ratio(r1, ASYMPTOTIC_MIN_RATIO, RHO_AL)
    for f in (f0 * (1 - 1e-9), f0 * (1 + 1e-9)):
        r, x = clad_wire_resistance_reactance(a, r1, rho1, RHO_CU, f, mu1)
        z = reference_impedance(a, r1, rho1, RHO_CU, f, mu1)
        assert r == pytest.approx(z.real, rel=2e-10, abs=0)
        assert x == pytest.approx(z.imag, rel=2e-10, abs=0)


def test_no_nan_over_the_whole_range_and_shapes():
    # Arguments from 1e-4 to 1e6 skin depths, cores from nothing to everything.
    a = np.array([1e-4, 1e-3, 1e-2])[:, None, None]
    f = np.logspace(0, 12, 25)[None, :, None]
    r1 = a * np.array([0.0, 0.5, 0.999, 0.999999, 1.0])[None, None, :]
    r, x = clad_wire_resistance_reactance(a, r1, RHO_STEEL, RHO_CU, f, 100.0)
    assert r.shape == (3, 25, 5)
    assert np.isfinite(r).all() and np.isfinite(x).all()
    assert (r > 0).all() and (x > 0).all()
    # no core: the layer metal; no layer: the core metal
    assert np.array_equal(r[..., 0], np.broadcast_to(wire_resistance_reactance(
        a[..., 0], RHO_CU, f[..., 0])[0], r[..., 0].shape))
    assert np.array_equal(r[..., 4], np.broadcast_to(wire_resistance_reactance(
        a[..., 0], RHO_STEEL, f[..., 0], 100.0)[0], r[..., 4].shape))
    # scalar, list and array give the same numbers
    one = clad_wire_resistance_reactance(1e-3, 0.9e-3, RHO_STEEL, RHO_CU, 1e6, 100.0)
    many = clad_wire_resistance_reactance([1e-3, 1e-3], [0.9e-3, 0.9e-3], RHO_STEEL, RHO_CU,
                                          np.array([1e6, 1e6]), 100.0)
    assert float(one[0]) == many[0][0] == many[0][1]


# --------------------------------------------------------------------------- planar plating


def test_planar_ratio_limits():
    f = 1e9
    d_tin = skin_depth(1.15e-7, f)
    # no plating: exactly 1
    assert planar_layer_impedance_ratio(0.0, 1.15e-7, RHO_CU, f) == (1.0, 0.0)
    # thick plating: the plating metal's surface impedance, ratio sqrt(rho2/rho1)
    re, im = planar_layer_impedance_ratio(30 * d_tin, 1.15e-7, RHO_CU, f)
    assert re == pytest.approx(np.sqrt(1.15e-7 / RHO_CU), rel=1e-12)
    assert im == pytest.approx(0.0, abs=1e-12)
    # insulating base: Z_s = eta2 coth(gamma t), so Z_s/eta1 = n coth(gamma t) with
    # n = sqrt(rho2/rho1) (Source: planar layer closed form, as above; the base's own share
    # is of order n/|tanh| ~ 3e-5 here)
    t = 0.5 * d_tin
    re, im = planar_layer_impedance_ratio(t, 1.15e-7, 1e3, f)
    n = np.sqrt(1.15e-7 / 1e3)
    expected = n / np.tanh((1 + 1j) * t / d_tin)
    assert re == pytest.approx(expected.real, rel=1e-4)
    assert im == pytest.approx(expected.imag, rel=1e-4)


def test_planar_ratio_equals_the_cylinder_for_a_large_radius():
    # The planar ratio is the r >> delta limit of the exact two-layer wire: 2.5 um tin on
    # copper, radius 1e4 skin depths of tin; curvature terms ~ delta/r.
    f = 1e9
    rho_tin = 1.15e-7
    a = 1e4 * skin_depth(rho_tin, f)
    r, x = clad_wire_resistance_reactance(a, a - 2.5e-6, RHO_CU, rho_tin, f)
    r0, x0 = wire_resistance_reactance(a, RHO_CU, f)
    re, im = planar_layer_impedance_ratio(2.5e-6, rho_tin, RHO_CU, f)
    z = (r0 + 1j * x0) * (re + 1j * im)
    assert r == pytest.approx(z.real, rel=3e-4)
    assert x == pytest.approx(z.imag, rel=3e-4)


# --------------------------------------------------------------------------- roughness


def test_hammerstad_jensen_factor():
    # Source: E. Hammerstad, O. Jensen, IEEE MTT-S Digest 1980, pp. 407-409: the closed form
    # K = 1 + (2/pi) arctan(1.4 (Delta/delta)^2): 1 for a smooth surface, 2 in the limit, and
    # its curve passes K = 1.5 at Delta/delta = 1/sqrt(1.4) = 0.845.
    delta = 2e-6
    assert roughness_factor(0.0, delta) == 1.0
    assert roughness_factor(delta / np.sqrt(1.4), delta) == pytest.approx(1.5, rel=1e-15)
    assert roughness_factor(1e3 * delta, delta) == pytest.approx(2.0, rel=1e-6)
    assert roughness_factor(delta, delta) == pytest.approx(1 + 2 / np.pi * np.arctan(1.4))
    # monotone between
    k = roughness_factor(np.linspace(0, 5, 51) * delta, delta)
    assert (np.diff(k) > 0).all()


# --------------------------------------------------------------------------- thermal iteration


def _thermal_inputs(surface, n=3):
    from cablefam.physics.thermal_inputs import CoaxThermalInputs

    return CoaxThermalInputs(
        a=np.full(n, 0.5e-3), b=np.full(n, 2.3e-3), c=np.full(n, 2.5e-3), d=np.full(n, 3.2e-3),
        frequency=np.array([1e6, 5e7, 1e9])[:n], ambient_c=20.0,
        inner_resistivity_20c=RHO_STEEL, inner_temperature_coefficient=0.005,
        shield_resistivity_20c=RHO_CU, shield_temperature_coefficient=0.00393,
        relative_permittivity=2.25, loss_tangent=2e-4, dielectric_thermal_resistivity=3.5,
        jacket_thermal_resistivity=3.5, inner_relative_permeability=100.0,
        inner_surface=surface)


def test_thermal_state_heats_each_layer_with_its_own_coefficient():
    from cablefam.physics.conductor_surface import ConductorSurface, surface_at_temperature
    from cablefam.physics.line import conductor_impedances, line_fixed_parts
    from cablefam.physics.standing_wave import matched_line_squares
    from cablefam.physics.thermal import power_rating, steady_state
    from cablefam.physics.thermal_inputs import resistivity_at_temperature

    t = 0.5e-3 - core_radius(0.5e-3, area_fraction=0.1017)
    surface = ConductorSurface(t, 0.1017, RHO_CU, 0.00393, 1.0, 0.0)
    q = _thermal_inputs(surface)
    state = steady_state(q, np.full(3, 300.0))
    assert state.converged.all()
    # at the solved temperatures, I^2 R of the clad conductor is the heat the state reports
    theta_c = state.conductor_temperature_c
    fixed = line_fixed_parts(q.a, q.b, q.frequency, 2.25, 2e-4)
    z = conductor_impedances(
        q.a, q.b, q.c, q.frequency, resistivity_at_temperature(RHO_STEEL, 0.005, theta_c),
        resistivity_at_temperature(RHO_CU, 0.00393, state.shield_temperature_c), fixed, 100.0,
        inner_surface=surface_at_temperature(surface, theta_c))
    omega = 2 * np.pi * q.frequency
    current_sq, _ = matched_line_squares(
        z.r_inner + z.r_shield, omega * fixed.l_external + z.x_inner + z.x_shield, fixed.g,
        omega * fixed.c)  # matched line: |I|^2 = P / Re Z0
    # the state's heat is that of its last pass (temperatures moved < 1e-4 K since)
    assert state.heat_inner_w_per_m == pytest.approx(300.0 * current_sq * z.r_inner, rel=1e-5)
    # a layer whose resistivity does not follow its temperature runs cooler
    cold = steady_state(_thermal_inputs(surface._replace(temperature_coefficient=0.0)),
                        np.full(3, 300.0))
    assert (cold.conductor_temperature_c < state.conductor_temperature_c).all()
    # the power rating carries the layers through its root search
    rating = power_rating(q, 70.0)
    plain = power_rating(_thermal_inputs(None), 70.0)
    assert np.isfinite(rating).all() and (rating > plain).all()
