"""Property tests of physics invariants (hypothesis): identities, limits and monotonicity that
must hold for every design, whatever its radii, materials and frequency.

Each test names the identity it checks beside the assertion (``# identity: ...``). Examples
are few and the deadline is off: the point is wide coverage of the input space, not speed.
"""

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.constants import epsilon_0, mu_0

from cablefam.physics import thermal, thermal_state
from cablefam.physics.eccentricity import (geometry_factor, geometry_factor_gradient,
                                           wheeler_loss_factor)
from cablefam.physics.fields import max_peak_voltage, peak_electric_field
from cablefam.physics.internal_impedance import (tube_dc_resistance, tube_internal_impedance,
                                                 wire_dc_resistance, wire_internal_impedance)
from cablefam.physics.line import (capacitance, characteristic_impedance,
                                   characteristic_impedance_lossless,
                                   characteristic_impedance_modulus, inductance_external,
                                   line_fixed_parts, line_parameters, propagation_constant)

FEW = settings(max_examples=40, deadline=None)
VERY_FEW = settings(max_examples=15, deadline=None)

# Source: IEC 60028 (copper 1.7241e-8 ohm m, 0.00393 K^-1) and IEC 60889 (hard-drawn
# aluminium 2.8264e-8 ohm m, 0.00403 K^-1) at 20 degC; also IEC 60287-1-1, Table 1.
METALS = ((1.7241e-8, 0.00393), (2.8264e-8, 0.00403))
# Source: IEC 60287-2-1, Table 1: polyethylene 3.5 K m/W, PVC 5.0 K m/W.
PE_THERMAL_RESISTIVITY, PVC_THERMAL_RESISTIVITY = 3.5, 5.0


def log_uniform(low, high):
    """Floats spread evenly in log between ``low`` and ``high``."""
    return st.floats(np.log10(low), np.log10(high)).map(lambda e: 10.0 ** e)


inner_radius = log_uniform(0.05e-3, 10e-3)
radius_ratio = st.floats(1.05, 20.0)
wall_fraction = log_uniform(0.01, 1.0)  # shield wall over b
relative_permittivity = st.floats(1.0, 10.0)
frequency = log_uniform(1e3, 2e10)
resistivity = log_uniform(1.5e-8, 1e-6)
offset_fraction = st.floats(0.0, 0.9)  # offset over the gap b - a
strands = st.sampled_from([1, 7, 19, 37])


# ------------------------------------------------------------------ external parts


@FEW
@given(inner_radius, radius_ratio, relative_permittivity, offset_fraction, strands)
def test_external_inductance_times_capacitance_is_mu_eps(a, ratio, eps_r, frac, n):
    b = a * ratio
    fixed = line_fixed_parts(a, b, 1e9, eps_r, 1e-4, offset=frac * (b - a) / 2.0,
                             inner_strands=n)
    # identity: L_e C = mu_0 eps_0 eps_r for the external (TEM) parts of any two-conductor
    # line, offset or stranded (Pozar, Microwave Engineering, 4th ed., Sec. 2.2 and Table 2.1)
    assert fixed.l_external * fixed.c == pytest.approx(mu_0 * epsilon_0 * eps_r, rel=1e-14)
    # identity: Z0 = sqrt(L_e / C) of the lossless line (Pozar, Sec. 2.1); rtol 1e-11: CODATA
    # mu0 eps0 c0^2 = 1 + 1.2e-12 in scipy.constants
    assert np.sqrt(fixed.l_external / fixed.c) == pytest.approx(
        characteristic_impedance_lossless(a, b, eps_r, geometry_factor=fixed.geometry_factor),
        rel=1e-11)


@FEW
@given(inner_radius, radius_ratio, relative_permittivity, offset_fraction)
def test_passing_the_geometry_factor_changes_nothing(a, ratio, eps_r, frac):
    b = a * ratio
    d = frac * (b - a)
    lam = geometry_factor(a, b, d)
    # identity: the functions compute Lambda themselves or take it; the same bits either way
    assert capacitance(a, b, eps_r, d, geometry_factor=lam) == capacitance(a, b, eps_r, d)
    assert inductance_external(a, b, d, geometry_factor=lam) == inductance_external(a, b, d)
    with_lam = line_parameters(a, b, 1.2 * b, 1e9, 1.7e-8, 2.8e-8, eps_r, 1e-4, offset=d,
                               geometry_factor=lam)
    without = line_parameters(a, b, 1.2 * b, 1e9, 1.7e-8, 2.8e-8, eps_r, 1e-4, offset=d)
    for x, y in zip(with_lam, without):
        assert x == y


# ------------------------------------------------------------------ internal impedance


@FEW
@given(inner_radius, wall_fraction, resistivity, st.sampled_from([1.0, 100.0]))
def test_internal_impedance_dc_limit(a, wall, rho, mu_r):
    u = 0.01  # radius over skin depth: deviation from the DC values ~ u^4 / 48
    f = rho / (np.pi * mu_0 * mu_r * (a / u) ** 2)
    z = wire_internal_impedance(a, rho, f, mu_r)
    # identity: DC limit of the round wire, R -> rho / (pi a^2), L_i -> mu / (8 pi)
    # (Ramo, Whinnery, Van Duzer, Fields and Waves, 3rd ed., Sec. 5.5)
    assert z.real == pytest.approx(wire_dc_resistance(a, rho), rel=1e-9)
    assert z.real == pytest.approx(rho / (np.pi * a * a), rel=1e-9)
    assert z.imag / (2.0 * np.pi * f) == pytest.approx(mu_0 * mu_r / (8.0 * np.pi), rel=1e-9)
    b, c = a, a * (1.0 + wall)
    f = rho / (np.pi * mu_0 * mu_r * (c / u) ** 2)
    z = tube_internal_impedance(b, c, rho, f, mu_r)
    # identity: DC limit of the tube, R -> rho / (pi (c^2 - b^2)) (uniform current density)
    assert z.real == pytest.approx(tube_dc_resistance(b, c, rho), rel=1e-9)
    # from memory: DC internal inductance of the outer conductor of a coax,
    # L_i = mu/(2 pi) [c^4 ln(c/b)/(c^2 - b^2)^2 - (3c^2 - b^2)/(4(c^2 - b^2))];
    # rtol 1e-5: thin walls lose digits to cancellation at low frequency (module notes)
    s = c * c - b * b
    l_dc = mu_0 * mu_r / (2.0 * np.pi) * (c ** 4 * np.log(c / b) / s ** 2
                                          - (3.0 * c * c - b * b) / (4.0 * s))
    assert z.imag / (2.0 * np.pi * f) == pytest.approx(l_dc, rel=1e-5)


@FEW
@given(inner_radius, resistivity, frequency)
def test_resistance_never_below_dc_and_inductance_never_above_dc(a, rho, f):
    z = wire_internal_impedance(a, rho, f)
    # identity: the current crowds outwards as frequency rises, so R(f) >= R_dc and
    # L_i(f) <= mu/(8 pi) (Ramo, Whinnery, Van Duzer, 3rd ed., Sec. 5.5); slack: rounding in
    # R, and in L_i the digits lost to cancellation far below a/delta = 0.01 (~1e-16 delta^2/a^2)
    assert z.real >= wire_dc_resistance(a, rho) * (1.0 - 1e-12)
    assert z.imag / (2.0 * np.pi * f) <= mu_0 / (8.0 * np.pi) * (1.0 + 1e-8)


# ------------------------------------------------------------------ propagation


@FEW
@given(inner_radius, radius_ratio, wall_fraction, frequency, resistivity,
       relative_permittivity, log_uniform(1e-5, 1e-1))
def test_propagation_constant_and_impedance_identities(a, ratio, wall, f, rho, eps_r, tan_d):
    b = a * ratio
    lp = line_parameters(a, b, b * (1.0 + wall), f, rho, rho, eps_r, tan_d)
    gamma = propagation_constant(lp.r, lp.l, lp.g, lp.c, f)
    z0 = characteristic_impedance(lp.r, lp.l, lp.g, lp.c, f)
    omega = 2.0 * np.pi * f
    series, shunt = lp.r + 1j * omega * lp.l, lp.g + 1j * omega * lp.c
    # identity: gamma^2 = Z Y and Z0 = sqrt(Z / Y), gamma Z0 = Z (Pozar, Eqs. 2.5 and 2.7)
    assert gamma * gamma == pytest.approx(series * shunt, rel=1e-13)
    assert gamma * z0 == pytest.approx(series, rel=1e-13)
    # identity: principal root, attenuation and phase constants positive for a passive line
    assert gamma.real > 0.0 and gamma.imag > 0.0
    # identity: |sqrt(z)| = sqrt(|z|), the real-arithmetic modulus of Z0
    assert characteristic_impedance_modulus(lp.r, lp.l, lp.g, lp.c, f) == pytest.approx(
        abs(z0), rel=1e-14)


@FEW
@given(inner_radius, radius_ratio, wall_fraction, resistivity, relative_permittivity,
       st.floats(1.1, 3.0))
def test_attenuation_falls_as_the_line_grows_at_fixed_ratios(a, ratio, wall, rho, eps_r,
                                                             scale):
    b = a * ratio
    f = 1000.0 * rho / (np.pi * mu_0 * a * a)  # a / skin depth ~ 30: skin-effect regime

    def attenuation(s):
        lp = line_parameters(s * a, s * b, s * b * (1.0 + wall), f, rho, rho, eps_r, 1e-4)
        return propagation_constant(lp.r, lp.l, lp.g, lp.c, f).real

    # identity: at fixed b/a, c/b and frequency the conductor loss falls with size
    # (alpha_c = R_s (1/a + 1/b) / (2 eta ln(b/a)) in the skin-effect limit, Pozar Table 2.1)
    # and the dielectric loss does not grow: the attenuation falls
    assert attenuation(scale) < attenuation(1.0)


@FEW
@given(inner_radius, radius_ratio, relative_permittivity, st.floats(1.01, 3.0))
def test_impedance_rises_and_capacitance_falls_with_the_dielectric_radius(a, ratio, eps_r,
                                                                          grow):
    b = a * ratio
    # identity: Z0 = (eta / 2 pi) ln(b/a), C = 2 pi eps / ln(b/a) (Pozar, Table 2.1)
    assert characteristic_impedance_lossless(a, b * grow, eps_r) > (
        characteristic_impedance_lossless(a, b, eps_r))
    assert capacitance(a, b * grow, eps_r) < capacitance(a, b, eps_r)


@FEW
@given(inner_radius, radius_ratio, st.floats(0.01, 0.9), st.floats(0.01, 0.09))
def test_offset_lowers_lambda_and_raises_conductor_loss(a, ratio, frac, more):
    b = a * ratio
    d = frac * (b - a)
    d2 = min(d + more * (b - a), 0.95 * (b - a))
    # identity: moving the centre conductor off the axis lowers Lambda (and Z0) and raises
    # the Wheeler loss factor above 1 (Wheeler, Proc. IRE 30 (1942) 412; Ramo, Whinnery,
    # Van Duzer, 3rd ed., Sec. 4.8)
    assert geometry_factor(a, b, d2) < geometry_factor(a, b, d) < geometry_factor(a, b)
    assert 1.0 < wheeler_loss_factor(a, b, d) < wheeler_loss_factor(a, b, d2)
    # identity: dLambda/dD < 0 off the axis, consistent with the ordering above
    assert geometry_factor_gradient(a, b, d).d_doffset < 0.0


@FEW
@given(inner_radius, radius_ratio, offset_fraction, log_uniform(1e6, 1e8), st.floats(1.0, 5.0))
def test_voltage_rating_is_the_inverse_of_the_peak_field(a, ratio, frac, strength, safety):
    b = a * ratio
    d = frac * (b - a)
    v_max = max_peak_voltage(a, b, strength, safety, offset=d)
    # identity: the rated voltage is the one whose peak field is the allowed field
    # E_bd / k_s (Ramo, Whinnery, Van Duzer, 3rd ed., Sec. 2.3; offset line, Sec. 4.8)
    assert peak_electric_field(a, b, v_max, offset=d) == pytest.approx(strength / safety,
                                                                       rel=1e-14)
    # identity: an offset crowds the field on the near side: the peak field only rises
    # (slack 1e-12: the arccosh form of Lambda rounds to ~1e-16 X/sqrt(X^2 - 1) near D = 0,
    # some 1e-14 of Lambda for b/a = 1.05)
    assert peak_electric_field(a, b, 1.0, offset=d) >= peak_electric_field(a, b, 1.0) * (
        1.0 - 1e-12)


# ------------------------------------------------------------------ thermal


def thermal_designs(seed, n):
    """Random realistic coax designs and materials for the thermal model."""
    rng = np.random.default_rng(seed)
    a = 10.0 ** rng.uniform(np.log10(0.2e-3), np.log10(5e-3), n)
    eps = rng.uniform(1.3, 2.3, n)
    b = a * np.exp(rng.uniform(35.0, 95.0, n) * np.sqrt(eps) / 60.0)
    c = b + rng.uniform(0.1e-3, 1e-3, n)
    d = c + np.where(rng.random(n) < 0.25, 0.0, rng.uniform(0.3e-3, 2e-3, n))
    inner, shield = (np.array(METALS)[rng.integers(0, 2, n)] for _ in range(2))
    kw = dict(inner_resistivity_20c=inner[:, 0], inner_temperature_coefficient=inner[:, 1],
              shield_resistivity_20c=shield[:, 0], shield_temperature_coefficient=shield[:, 1],
              relative_permittivity=eps, loss_tangent=10.0 ** rng.uniform(-4, -2.5, n),
              dielectric_thermal_resistivity=PE_THERMAL_RESISTIVITY,
              jacket_thermal_resistivity=rng.choice([PE_THERMAL_RESISTIVITY,
                                                     PVC_THERMAL_RESISTIVITY], n),
              offset=np.where(rng.random(n) < 0.3, rng.uniform(0.0, 0.5, n) * (b - a), 0.0),
              inner_strands=rng.choice([1, 7, 19], n))
    return a, b, c, d, kw


@VERY_FEW
@given(st.integers(0, 2 ** 31), log_uniform(1e5, 1e10), log_uniform(0.1, 3000.0),
       st.floats(-20.0, 50.0))
def test_thermal_energy_balance_and_fixed_point(seed, f, power, ambient):
    a, b, c, d, kw = thermal_designs(seed, 40)
    st_ = thermal.coax_thermal_state(a, b, c, d, f, power, ambient, **kw)
    ok = st_.converged
    if not ok.any():
        return
    a, b, c, d = a[ok], b[ok], c[ok], d[ok]
    kw = {k: v[ok] if np.ndim(v) else v for k, v in kw.items()}
    s = thermal.ThermalState(*(x[ok] for x in st_))
    de = 2.0 * d
    h = thermal.free_air_heat_transfer_coefficient(de)
    rise_s = s.surface_temperature_c - ambient
    # identity: energy balance at the surface, the heat generated leaves it,
    # W = pi De h dtheta_s^(5/4) (IEC 60287-2-1, clause 4.2.1)
    np.testing.assert_allclose(np.pi * de * h * rise_s ** 1.25, s.heat_w_per_m, rtol=1e-9)
    np.testing.assert_allclose(s.heat_inner_w_per_m + s.heat_shield_w_per_m
                               + s.heat_dielectric_w_per_m, s.heat_w_per_m, rtol=1e-14)
    # identity: rating equation dtheta = (W_i + W_d/2) T1 + W (T3 + T4)
    # (IEC 60287-1-1, clause 1.4.1.1, n = 1, lambda2 = 0, T2 = 0)
    # (an offset centre conductor: T1 from the eccentric geometry factor, as the capacitance)
    t1 = PE_THERMAL_RESISTIVITY / (2.0 * np.pi) * geometry_factor(a, b, kw["offset"])
    t3 = np.where(d > c, thermal.insulation_thermal_resistance(
        kw["jacket_thermal_resistivity"], c, d), 0.0)
    with np.errstate(divide="ignore"):  # no heat (power 0): T4 unused
        t4 = thermal.external_thermal_resistance_free_air(de, h, rise_s)
    expected = (s.heat_inner_w_per_m + 0.5 * s.heat_dielectric_w_per_m) * t1 + (
        s.heat_w_per_m * (t3 + np.where(s.heat_w_per_m > 0.0, t4, 0.0)))
    np.testing.assert_allclose(s.temperature_rise_k, expected, rtol=1e-9, atol=1e-12)
    # identity: heat flows outwards, so conductor >= shield >= surface >= ambient
    assert np.all(s.conductor_temperature_c >= s.shield_temperature_c)
    assert np.all(s.shield_temperature_c >= s.surface_temperature_c)
    assert np.all(s.surface_temperature_c >= ambient)
    # identity: a steady state is a fixed point: the loss of the line at the reported
    # temperatures reproduces the reported heat (to the tolerance of 1e-4 K, ~1e-7 of it)
    lp = line_parameters(
        a, b, c, f,
        thermal.resistivity_at_temperature(kw["inner_resistivity_20c"],
                                           kw["inner_temperature_coefficient"],
                                           s.conductor_temperature_c),
        thermal.resistivity_at_temperature(kw["shield_resistivity_20c"],
                                           kw["shield_temperature_coefficient"],
                                           s.shield_temperature_c),
        kw["relative_permittivity"], kw["loss_tangent"], offset=kw["offset"],
        inner_strands=kw["inner_strands"])
    re_z0 = characteristic_impedance(lp.r, lp.l, lp.g, lp.c, f).real  # P = |I|^2 Re Z0
    np.testing.assert_allclose(power / re_z0 * lp.r_inner, s.heat_inner_w_per_m, rtol=1e-6)
    np.testing.assert_allclose(power / re_z0 * lp.r_shield, s.heat_shield_w_per_m, rtol=1e-6)


@VERY_FEW
@given(st.integers(0, 2 ** 31), log_uniform(1e6, 1e10), st.floats(1.2, 4.0))
def test_more_power_runs_hotter(seed, f, factor):
    a, b, c, d, kw = thermal_designs(seed, 30)
    low = thermal.coax_thermal_state(a, b, c, d, f, 20.0, 25.0, **kw)
    high = thermal.coax_thermal_state(a, b, c, d, f, 20.0 * factor, 25.0, **kw)
    ok = low.converged & high.converged
    # identity: the loss grows with power and temperature, so the steady temperatures rise
    # monotonically with the power carried (IEC 60287-1-1, clause 1.4.1.1)
    assert np.all(high.conductor_temperature_c[ok] > low.conductor_temperature_c[ok])
    assert np.all(high.shield_temperature_c[ok] > low.shield_temperature_c[ok])


@VERY_FEW
@given(st.integers(0, 2 ** 31), st.integers(1, 40), st.integers(1, 4))
def test_blocks_change_no_result(seed, block, passes):
    a, b, c, d, kw = thermal_designs(seed, 60)
    power = np.random.default_rng(seed).choice([1.0, 100.0, 1e4], a.size)
    whole = thermal.coax_thermal_state(a, b, c, d, 1e9, power, 30.0, **kw)
    with pytest.MonkeyPatch.context() as mp:
        mp.setattr(thermal_state, "BLOCK_DESIGNS", block)
        mp.setattr(thermal_state, "BLOCK_PASSES", passes)
        blocked = thermal.coax_thermal_state(a, b, c, d, 1e9, power, 30.0, **kw)
    # identity: every pass of the fixed point is elementwise, so the order in which blocks
    # of designs are iterated changes no bit of the result
    for x, y in zip(whole, blocked):
        np.testing.assert_array_equal(x, y)
