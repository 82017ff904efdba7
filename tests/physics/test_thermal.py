"""Tests of physics.thermal: IEC 60287 formulas, the thermal iteration and the power rating."""

from typing import NamedTuple

import numpy as np
import pytest

from cablefam.physics import thermal
from cablefam.physics.line import characteristic_impedance, line_parameters

# Source: IEC 60028, international standard of annealed copper: 1/58 ohm mm^2 m^-1 at 20 degC,
# constant-mass temperature coefficient 0.00393 K^-1 (also IEC 60287-1-1, Table 1).
COPPER_RESISTIVITY_20C = 1.7241e-8
COPPER_TEMPERATURE_COEFFICIENT = 0.00393
# Source: IEC 60889, hard-drawn aluminium wire: 0.028264 ohm mm^2 m^-1 at 20 degC, 0.00403 K^-1
# (also IEC 60287-1-1, Table 1).
ALUMINIUM_RESISTIVITY_20C = 2.8264e-8
ALUMINIUM_TEMPERATURE_COEFFICIENT = 0.00403
# Source: IEC 60287-2-1, Table 1: polyethylene 3.5 K m/W, PVC (cables up to 3 kV) 5.0 K m/W.
PE_THERMAL_RESISTIVITY = 3.5
PVC_THERMAL_RESISTIVITY = 5.0

COPPER = dict(inner_resistivity_20c=COPPER_RESISTIVITY_20C,
              inner_temperature_coefficient=COPPER_TEMPERATURE_COEFFICIENT,
              shield_resistivity_20c=COPPER_RESISTIVITY_20C,
              shield_temperature_coefficient=COPPER_TEMPERATURE_COEFFICIENT)
PE_PVC = dict(relative_permittivity=2.25, loss_tangent=3e-4,
              dielectric_thermal_resistivity=PE_THERMAL_RESISTIVITY,
              jacket_thermal_resistivity=PVC_THERMAL_RESISTIVITY)


def random_designs(n, seed):
    """Realistic coax designs: a 0.2-5 mm, Z0 35-95 ohm, shield 0.1-1 mm, jacket 0-2 mm."""
    rng = np.random.default_rng(seed)
    a = rng.uniform(0.2e-3, 5e-3, n)
    eps = rng.choice([1.5, 2.1, 2.25], n)
    b = a * np.exp(rng.uniform(35.0, 95.0, n) * np.sqrt(eps) / 60.0)
    c = b + rng.uniform(0.1e-3, 1e-3, n)
    d = c + np.where(rng.random(n) < 0.25, 0.0, rng.uniform(0.3e-3, 2e-3, n))
    aluminium = rng.random(n) < 0.3
    materials = dict(
        inner_resistivity_20c=COPPER_RESISTIVITY_20C,
        inner_temperature_coefficient=COPPER_TEMPERATURE_COEFFICIENT,
        shield_resistivity_20c=np.where(aluminium, ALUMINIUM_RESISTIVITY_20C,
                                        COPPER_RESISTIVITY_20C),
        shield_temperature_coefficient=np.where(aluminium, ALUMINIUM_TEMPERATURE_COEFFICIENT,
                                                COPPER_TEMPERATURE_COEFFICIENT),
        relative_permittivity=eps, loss_tangent=rng.uniform(1e-4, 5e-4, n),
        dielectric_thermal_resistivity=PE_THERMAL_RESISTIVITY,
        jacket_thermal_resistivity=rng.choice([PE_THERMAL_RESISTIVITY, PVC_THERMAL_RESISTIVITY],
                                              n))
    return a, b, c, d, materials


# --------------------------------------------------------------------------- reference iteration


class SurfaceRiseIteration(NamedTuple):
    """Result of :func:`surface_temperature_rise_iec_iteration`; arrays of a common shape."""

    surface_temperature_rise_k: np.ndarray
    """Surface temperature rise above ambient :math:`\\Delta\\theta_s` [K]."""
    iterations: np.ndarray
    """Number of iterations made (int)."""
    converged: np.ndarray
    """True where the stopping rule was met within the allowed iterations (bool)."""


def surface_temperature_rise_iec_iteration(conductor_temperature_rise, heat_dielectric,
                                           sheath_loss_factor, t1, t3, outer_diameter,
                                           heat_transfer_coefficient, tolerance=1e-3,
                                           max_iterations=100):
    r"""Surface temperature rise by the iteration of IEC 60287-2-1, clause 4.2.1.

    The standard's own procedure, given the conductor temperature rise; kept here to check
    the closed form of :func:`cablefam.physics.thermal.surface_temperature_rise_free_air`
    against (the package does not use it). Written for a coax: one core (:math:`n = 1`), no armour
    (:math:`\lambda_2 = 0`), nothing between shield and jacket (:math:`T_2 = 0`).

    Parameters
    ----------
    conductor_temperature_rise : array_like
        Conductor temperature rise above ambient :math:`\Delta\theta` [K].
    heat_dielectric : array_like
        Dielectric loss :math:`W_d` [W m^-1].
    sheath_loss_factor : array_like
        :math:`\lambda_1 = W_s/W_i` [-] (any value when :math:`W_i = 0`).
    t1, t3 : array_like
        Thermal resistances of the dielectric and of the jacket [K m W^-1].
    outer_diameter : array_like
        External diameter :math:`D_e^*` [m].
    heat_transfer_coefficient : array_like
        :math:`h` [W m^-2 K^-5/4].
    tolerance : float, optional
        Stop when successive values of :math:`(\Delta\theta_s)^{1/4}` differ by no more than
        this; the standard uses 0.001 [K^1/4].
    max_iterations : int, optional
        Upper bound on the iterations.

    Returns
    -------
    SurfaceRiseIteration
        :math:`\Delta\theta_s` [K], the iteration count and a convergence flag.

    Notes
    -----
    With :math:`\lambda_2 = 0`, :math:`T_2 = 0`, :math:`n = 1` the iteration of clause 4.2.1
    of [1]_ reads

    .. math::
        K_A = \frac{\pi D_e^* h}{1 + \lambda_1}\left[T_1 + (1 + \lambda_1) T_3\right], \qquad
        \Delta\theta_d = W_d\left(\frac{1}{1 + \lambda_1} - \frac{1}{2}\right) T_1,

        (\Delta\theta_s)^{1/4}_{n+1} =
        \left[\frac{\Delta\theta + \Delta\theta_d}{1 + K_A(\Delta\theta_s)^{1/4}_n}\right]^{1/4},
        \qquad (\Delta\theta_s)^{1/4}_0 = 2.

    Its fixed point satisfies the rating equation (clause 1.4.1.1 of [2]_) together with
    :math:`\Delta\theta_s = W T_4`; the map contracts by at most 1/4 per step.

    References
    ----------
    .. [1] IEC 60287-2-1:2015, clause 4.2.1.
    .. [2] IEC 60287-1-1:2006+AMD1:2014, clause 1.4.1.1.
    """
    dtheta, w_d, lam1, t1, t3, de, h = np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in (
        conductor_temperature_rise, heat_dielectric, sheath_loss_factor, t1, t3, outer_diameter,
        heat_transfer_coefficient)))
    k_a = np.pi * de * h / (1.0 + lam1) * (t1 + (1.0 + lam1) * t3)
    numerator = dtheta + w_d * (1.0 / (1.0 + lam1) - 0.5) * t1
    y = np.full(dtheta.shape, 2.0)
    iterations = np.zeros(dtheta.shape, dtype=int)
    converged = np.zeros(dtheta.shape, dtype=bool)
    active = np.ones(dtheta.shape, dtype=bool)
    for it in range(1, max_iterations + 1):
        y_new = (numerator[active] / (1.0 + k_a[active] * y[active])) ** 0.25
        done = np.abs(y_new - y[active]) <= tolerance
        y[active] = y_new
        iterations[active] = it
        converged[active] = done
        active[active] = ~done
        if not active.any():
            break
    return SurfaceRiseIteration(y ** 4, iterations, converged)


# --------------------------------------------------------------------------- published values


def test_reference_resistivities_iec60028_iec60889():
    # Source: IEC 60028 defines the annealed-copper standard as 1/58 ohm mm^2 m^-1 at 20 degC.
    assert 1.0 / 58.0 * 1e-6 == pytest.approx(COPPER_RESISTIVITY_20C, rel=5e-5)  # 5 digits given
    # Source: IEC 60889, hard-drawn aluminium: minimum conductivity 61.0 % IACS.
    assert COPPER_RESISTIVITY_20C / 0.61 == pytest.approx(ALUMINIUM_RESISTIVITY_20C, rel=5e-5)
    # Source: IEC 60228, Annex B, temperature correction k_t = 254.5/(234.5 + t) for copper and
    # 248/(228 + t) for aluminium, i.e. alpha_20 = 1/254.5 and 1/248 (from memory); rtol: the
    # coefficients are given to 3 significant figures.
    assert 1.0 / 254.5 == pytest.approx(COPPER_TEMPERATURE_COEFFICIENT, rel=1e-3)
    assert 1.0 / 248.0 == pytest.approx(ALUMINIUM_TEMPERATURE_COEFFICIENT, rel=1e-3)


@pytest.mark.parametrize("rho20, alpha, t0", [
    (COPPER_RESISTIVITY_20C, COPPER_TEMPERATURE_COEFFICIENT, 234.5),
    (ALUMINIUM_RESISTIVITY_20C, ALUMINIUM_TEMPERATURE_COEFFICIENT, 228.0),
])
def test_resistivity_at_temperature_follows_iec60228_correction(rho20, alpha, t0):
    # IEC 60287-1-1 clause 2.1.1: rho(theta) = rho20 (1 + alpha20 (theta - 20)); at 20 degC
    # it is rho20 exactly.
    assert thermal.resistivity_at_temperature(rho20, alpha, 20.0) == rho20
    t = np.array([-20.0, 0.0, 50.0, 90.0, 250.0])
    rho = thermal.resistivity_at_temperature(rho20, alpha, t)
    np.testing.assert_allclose(rho, rho20 * (1.0 + alpha * (t - 20.0)), rtol=1e-15)
    # Source: IEC 60228, Annex B: R_t/R_20 = (t0 + t)/(t0 + 20) (from memory); rtol: alpha is
    # given to 3 significant figures.
    np.testing.assert_allclose(rho / rho20, (t0 + t) / (t0 + 20.0), rtol=3e-4)


def test_resistance_at_90c_of_1mm2_copper():
    area = 1e-6  # 1 mm^2
    r90 = thermal.resistivity_at_temperature(COPPER_RESISTIVITY_20C,
                                             COPPER_TEMPERATURE_COEFFICIENT, 90.0) / area
    # By hand from the IEC 60028 values: 17.241 ohm/km x (1 + 0.00393 x 70) = 17.241 x 1.2751
    # = 21.984 ohm/km.
    assert r90 * 1e3 == pytest.approx(21.9840, rel=1e-5)
    # Source: IEC 60287-1-1 clause 2.1.1, R' = R0 (1 + alpha20 (theta - 20)), with R0 the
    # maximum d.c. resistance at 20 degC of IEC 60228 Table 1 (class 1 solid, plain annealed
    # copper, 1 mm^2: 18.1 ohm/km): R'(90 degC) = 18.1 x 1.2751 = 23.079 ohm/km.
    r90_iec60228 = 18.1e-3 * (1.0 + COPPER_TEMPERATURE_COEFFICIENT * 70.0)
    assert r90_iec60228 * 1e3 == pytest.approx(23.079, rel=1e-4)
    # IEC 60228's maxima carry an allowance over the nominal resistivity x nominal area: the
    # nominal value is 17.241/18.1 = 0.9525 of it, i.e. below and within 5 %.
    assert r90 / r90_iec60228 == pytest.approx(17.241 / 18.1, rel=1e-4)
    assert 0.95 < r90 / r90_iec60228 < 1.0
    # the skin-effect resistance of physics.line tends to the same d.c. value at low frequency
    a = np.sqrt(area / np.pi)
    lp = line_parameters(a, 3 * a, 3.5 * a, 1e-3, r90 * area, COPPER_RESISTIVITY_20C, 2.25, 0.0)
    assert lp.r_inner == pytest.approx(r90, rel=1e-9)


def test_thermal_resistances_worked_case():
    # Worked case by hand: conductor 3.0 mm diameter, PE dielectric to 10.0 mm, shield to
    # 10.6 mm, PVC jacket to 12.6 mm (De = 12.6 mm).
    a, b, c, d = 1.5e-3, 5.0e-3, 5.3e-3, 6.3e-3
    # Source: IEC 60287-2-1 clause 4.1.2, T1 = rho_T/(2 pi) ln(1 + 2 t1/dc), t1 = 3.5 mm,
    # dc = 3.0 mm: 3.5/(2 pi) = 0.557042; ln(1 + 7/3) = ln(3.33333) = 1.203973;
    # T1 = 0.557042 x 1.203973 = 0.670664 K m/W.
    t1 = thermal.insulation_thermal_resistance(PE_THERMAL_RESISTIVITY, a, b)
    assert t1 == pytest.approx(0.670664, rel=1e-5)
    # Source: IEC 60287-2-1 clause 4.1.4, T3 = rho_T/(2 pi) ln(1 + 2 t3/D'a), t3 = 1.0 mm,
    # D'a = 10.6 mm: 5.0/(2 pi) = 0.795775; ln(1 + 2/10.6) = ln(1.188679) = 0.172843;
    # T3 = 0.795775 x 0.172843 = 0.137544 K m/W.
    t3 = thermal.insulation_thermal_resistance(PVC_THERMAL_RESISTIVITY, c, d)
    assert t3 == pytest.approx(0.137544, rel=1e-5)
    # Source: IEC 60287-2-1 clause 4.2.1, h = Z/De^g + E with Table 2 (single cable in free air)
    # Z = 0.21, E = 3.94, g = 0.60; De = 0.0126 m: 0.0126^0.6 = exp(0.6 ln 0.0126)
    # = exp(-2.624434) = 0.072481; 0.21/0.072481 = 2.897323; h = 6.837323 W m^-2 K^-5/4.
    h = thermal.free_air_heat_transfer_coefficient(2 * d)
    assert h == pytest.approx(6.837323, rel=1e-6)
    # explicit Table 2 constants give the same as the defaults
    assert thermal.free_air_heat_transfer_coefficient(2 * d, 0.21, 3.94, 0.60) == h
    # Source: IEC 60287-2-1 clause 4.2.1, T4 = 1/(pi De h dtheta_s^(1/4)); at dtheta_s = 10 K:
    # pi x 0.0126 x 6.837323 = 0.270649; 10^0.25 = 1.778279; T4 = 1/0.481285 = 2.077751 K m/W.
    t4 = thermal.external_thermal_resistance_free_air(2 * d, h, 10.0)
    assert t4 == pytest.approx(2.077751, rel=1e-6)
    # closed-form surface rise for W = 3 W/m: (3/0.270649)^0.8 = exp(0.8 x 2.405545)
    # = 6.851281 K.
    rise = thermal.surface_temperature_rise_free_air(3.0, 2 * d, h)
    assert rise == pytest.approx(6.851281, rel=1e-6)
    # and it is W T4 at that rise
    assert 3.0 * thermal.external_thermal_resistance_free_air(2 * d, h, rise) == pytest.approx(
        rise, rel=1e-12)
    # no jacket: zero thermal resistance
    assert thermal.insulation_thermal_resistance(PVC_THERMAL_RESISTIVITY, c, c) == 0.0


# --------------------------------------------------------------------------- identities


@pytest.fixture(scope="module")
def population_state():
    a, b, c, d, m = random_designs(300, seed=1)
    state = thermal.coax_thermal_state(a, b, c, d, 1e9, 100.0, 25.0, **m)
    return (a, b, c, d, m), state


def test_population_converges(population_state):
    _, st = population_state
    assert st.converged.all()
    assert np.all(st.iterations <= 12)
    assert np.all(st.conductor_temperature_c >= st.shield_temperature_c)
    assert np.all(st.shield_temperature_c >= st.surface_temperature_c)
    assert np.all(st.surface_temperature_c > 25.0)


def test_energy_balance_at_convergence(population_state):
    (a, b, c, d, m), st = population_state
    de = 2 * d
    # Source: IEC 60287-2-1 clause 4.2.1, Table 2, single cable: heat leaving the surface
    # W = pi De h dtheta_s^(5/4), h = 0.21/De^0.6 + 3.94.
    h = 0.21 / de ** 0.6 + 3.94
    dts = st.surface_temperature_c - 25.0
    np.testing.assert_allclose(np.pi * de * h * dts ** 1.25, st.heat_w_per_m, rtol=1e-10)
    np.testing.assert_allclose(st.heat_inner_w_per_m + st.heat_shield_w_per_m
                               + st.heat_dielectric_w_per_m, st.heat_w_per_m, rtol=1e-14)


def test_rating_equation_and_fixed_point(population_state):
    (a, b, c, d, m), st = population_state
    # rating equation of IEC 60287-1-1 clause 1.4.1.1 with n = 1, lambda2 = 0, T2 = 0
    t1 = m["dielectric_thermal_resistivity"] / (2 * np.pi) * np.log(b / a)
    t3 = m["jacket_thermal_resistivity"] / (2 * np.pi) * np.log(d / c)
    t4 = thermal.external_thermal_resistance_free_air(
        2 * d, thermal.free_air_heat_transfer_coefficient(2 * d), st.surface_temperature_c - 25.0)
    w = st.heat_w_per_m
    expected = (st.heat_inner_w_per_m + st.heat_dielectric_w_per_m / 2) * t1 + w * (t3 + t4)
    np.testing.assert_allclose(st.temperature_rise_k, expected, rtol=1e-10)
    # the reported heat is that of the reported temperatures (self-consistency)
    lp = line_parameters(
        a, b, c, 1e9,
        thermal.resistivity_at_temperature(m["inner_resistivity_20c"],
                                           m["inner_temperature_coefficient"],
                                           st.conductor_temperature_c),
        thermal.resistivity_at_temperature(m["shield_resistivity_20c"],
                                           m["shield_temperature_coefficient"],
                                           st.shield_temperature_c),
        m["relative_permittivity"], m["loss_tangent"])
    z0c = characteristic_impedance(lp.r, lp.l, lp.g, lp.c, 1e9)
    z0 = np.abs(z0c)
    # matched line: P = |I|^2 Re Z0, |V| = |Z0| |I|
    np.testing.assert_allclose(100.0 / z0c.real * lp.r_inner, st.heat_inner_w_per_m, rtol=1e-6)
    np.testing.assert_allclose(100.0 / z0c.real * lp.r_shield, st.heat_shield_w_per_m,
                               rtol=1e-6)
    np.testing.assert_allclose(lp.g * 100.0 * z0 * z0 / z0c.real, st.heat_dielectric_w_per_m,
                               rtol=1e-6)
    # at 1 GHz the earlier I^2 = P/|Z0|, V^2 = P|Z0| differ from these by far less than 1e-3
    np.testing.assert_allclose(100.0 / z0 * lp.r_inner, st.heat_inner_w_per_m, rtol=1e-4)
    np.testing.assert_allclose(lp.g * 100.0 * z0, st.heat_dielectric_w_per_m, rtol=1e-4)


def test_iec_iteration_converges_to_closed_form(population_state):
    (a, b, c, d, m), st = population_state
    t1 = thermal.insulation_thermal_resistance(m["dielectric_thermal_resistivity"], a, b)
    t3 = thermal.insulation_thermal_resistance(m["jacket_thermal_resistivity"], c, d)
    h = thermal.free_air_heat_transfer_coefficient(2 * d)
    args = (st.temperature_rise_k, st.heat_dielectric_w_per_m,
            st.heat_shield_w_per_m / st.heat_inner_w_per_m, t1, t3, 2 * d, h)
    closed_form = st.surface_temperature_c - 25.0
    # Source: IEC 60287-2-1 clause 4.2.1: start at dtheta_s^(1/4) = 2, stop when successive
    # values differ by <= 0.001.
    standard = surface_temperature_rise_iec_iteration(*args)
    assert standard.converged.all()
    assert np.all(standard.iterations <= 10)
    # 0.001 on dtheta_s^(1/4) is 4 dtheta_s^(3/4) x 0.001 on dtheta_s; contraction <= 1/4
    bound = 4 * closed_form ** 0.75 * 1e-3 / 3
    assert np.all(np.abs(standard.surface_temperature_rise_k - closed_form) <= bound)
    tight = surface_temperature_rise_iec_iteration(*args, tolerance=1e-13)
    assert tight.converged.all()
    np.testing.assert_allclose(tight.surface_temperature_rise_k, closed_form, rtol=1e-9)


def test_dielectric_loss_half_factor():
    # only dielectric loss: near-perfect conductors (R ~ sqrt(rho): 1e-11 of copper's), lossy
    # dielectric, temperature-independent resistance
    a, b, c, d = 1.5e-3, 5.0e-3, 5.3e-3, 6.3e-3
    st = thermal.coax_thermal_state(
        a, b, c, d, 1e9, 200.0, 30.0, 1e-30, 0.0, 1e-30, 0.0, 2.25, 0.01,
        PE_THERMAL_RESISTIVITY, PVC_THERMAL_RESISTIVITY)
    wd = st.heat_dielectric_w_per_m
    assert st.converged
    assert (st.heat_inner_w_per_m + st.heat_shield_w_per_m) / wd < 1e-9
    # by hand: T1 = 0.670664, T3 = 0.137544 K m/W (test_thermal_resistances_worked_case)
    t1, t3 = 0.670664, 0.137544
    h = 6.837323
    t4 = 1.0 / (np.pi * 2 * d * h * (st.surface_temperature_c - 30.0) ** 0.25)
    # Source: IEC 60287-1-1 clause 1.4.1.1, dielectric-loss term W_d (T1/2 + n (T2 + T3 + T4)),
    # n = 1, T2 = 0.
    assert st.temperature_rise_k == pytest.approx(wd * (t1 / 2 + t3 + t4), rel=1e-5)
    # the half factor is visible: full W_d through T1 would be W_d T1/2 (here 21 K) hotter
    assert wd * (t1 + t3 + t4) - st.temperature_rise_k == pytest.approx(wd * t1 / 2, rel=1e-4)
    assert wd * t1 / 2 > 20.0


# --------------------------------------------------------------------------- rating


@pytest.fixture(scope="module")
def rated_population():
    a, b, c, d, m = random_designs(200, seed=2)
    p = thermal.max_power(a, b, c, d, 1e9, 25.0, **m, dielectric_max_temperature_c=85.0,
                          jacket_max_temperature_c=70.0)
    return (a, b, c, d, m), p


def test_max_power_consistency(rated_population):
    (a, b, c, d, m), p = rated_population
    assert np.all(np.isfinite(p)) and np.all(p > 0.0)
    st = thermal.coax_thermal_state(a, b, c, d, 1e9, p, 25.0, **m)
    assert st.converged.all()
    has_jacket = d > c
    excess = np.maximum(st.conductor_temperature_c - 85.0,
                        np.where(has_jacket, st.shield_temperature_c - 70.0, -np.inf))
    np.testing.assert_allclose(excess, 0.0, atol=0.5)
    # both limits bind somewhere in the population; without a jacket only the conductor
    binding_jacket = has_jacket & (st.shield_temperature_c - 70.0 > -0.5)
    assert binding_jacket.any() and (~binding_jacket).any()
    np.testing.assert_allclose(st.conductor_temperature_c[~has_jacket], 85.0, atol=0.5)


def test_max_power_jacket_limit_rules():
    a, b, c = 1.5e-3, 5.0e-3, 5.3e-3
    d = np.array([c, 6.3e-3])
    kw = dict(**COPPER, **PE_PVC, dielectric_max_temperature_c=85.0)
    no_limit = thermal.max_power(a, b, c, d, 1e9, 25.0, **kw)
    high_limit = thermal.max_power(a, b, c, d, 1e9, 25.0, **kw, jacket_max_temperature_c=500.0)
    np.testing.assert_allclose(high_limit, no_limit, rtol=1e-6)
    # a jacket limit below ambient: zero for the jacketed design, ignored without a jacket
    low = thermal.max_power(a, b, c, d, 1e9, 25.0, **kw, jacket_max_temperature_c=20.0)
    assert low[1] == 0.0
    assert low[0] == pytest.approx(no_limit[0], rel=1e-6)


def test_monotonicity():
    a, b, c, d = 1.5e-3, 5.0e-3, 5.3e-3, 6.3e-3
    power = np.geomspace(1.0, 3000.0, 25)
    st = thermal.coax_thermal_state(a, b, c, d, 1e9, power, 25.0, **COPPER, **PE_PVC)
    assert st.converged.all()
    assert np.all(np.diff(st.conductor_temperature_c) > 0)
    assert np.all(np.diff(st.shield_temperature_c) > 0)
    ambient = np.array([-20.0, 0.0, 20.0, 40.0, 60.0, 80.0, 84.9, 85.0, 90.0])
    p = thermal.max_power(a, b, c, d, 1e9, ambient, **COPPER, **PE_PVC,
                          dielectric_max_temperature_c=85.0)
    assert np.all(np.diff(p[:7]) < 0) and np.all(p[:7] > 0)
    # ambient at or above the limit: no power at all
    np.testing.assert_array_equal(p[7:], 0.0)


def test_zero_power_is_ambient():
    a, b, c, d, m = random_designs(20, seed=3)
    st = thermal.coax_thermal_state(a, b, c, d, 1e9, 0.0, 31.5, **m)
    assert st.converged.all()
    for t in (st.conductor_temperature_c, st.shield_temperature_c, st.surface_temperature_c):
        np.testing.assert_array_equal(t, 31.5)
    np.testing.assert_array_equal(st.heat_w_per_m, 0.0)


# --------------------------------------------------------------------------- shapes, failures


def test_shapes_scalar_list_array():
    a, b, c, d = 1.5e-3, 5.0e-3, 5.3e-3, 6.3e-3
    scalar = thermal.coax_thermal_state(a, b, c, d, 1e9, 100.0, 25.0, **COPPER, **PE_PVC)
    assert scalar.conductor_temperature_c.shape == ()
    listed = thermal.coax_thermal_state([a, 2 * a], [b, 2 * b], [c, 2 * c], [d, 2 * d], 1e9,
                                        100.0, 25.0, **COPPER, **PE_PVC)
    assert listed.conductor_temperature_c.shape == (2,)
    assert listed.conductor_temperature_c[0] == scalar.conductor_temperature_c
    # designs (3,) x powers (2, 1) broadcast to (2, 3), each element as if alone
    grid = thermal.coax_thermal_state(np.array([a, 2 * a, 3 * a]), np.array([b, 2 * b, 3 * b]),
                                      np.array([c, 2 * c, 3 * c]), np.array([d, 2 * d, 3 * d]),
                                      1e9, np.array([[10.0], [100.0]]), 25.0, **COPPER, **PE_PVC)
    assert grid.converged.shape == (2, 3) and grid.iterations.dtype.kind == "i"
    assert grid.conductor_temperature_c[1, 0] == pytest.approx(
        float(scalar.conductor_temperature_c), abs=1e-3)
    pm_scalar = thermal.max_power(a, b, c, d, 1e9, 25.0, **COPPER, **PE_PVC,
                                  dielectric_max_temperature_c=85.0)
    pm_array = thermal.max_power([a, a], [b, b], [c, c], [d, d], 1e9, 25.0, **COPPER, **PE_PVC,
                                 dielectric_max_temperature_c=85.0)
    assert pm_scalar.shape == () and pm_array.shape == (2,)
    np.testing.assert_allclose(pm_array, pm_scalar, rtol=1e-6)


def test_runaway_flagged_without_nan():
    # thin conductor, 1 GHz: heat grows past what the surface can shed
    a, b, c, d = 0.1e-3, 0.35e-3, 0.45e-3, 0.75e-3
    power = np.array([1.0, 10.0, 300.0, 1e3, 1e5])
    st = thermal.coax_thermal_state(a, b, c, d, 1e9, power, 25.0, **COPPER, **PE_PVC)
    np.testing.assert_array_equal(st.converged, [True, True, True, False, False])
    for field in st[:8]:
        assert not np.isnan(field).any()
        assert np.all(np.isinf(field[~st.converged]))
        assert np.all(field[~st.converged] > 0)
    # too few iterations allowed: flagged, +inf, not NaN
    st2 = thermal.coax_thermal_state(a, b, c, d, 1e9, 300.0, 25.0, **COPPER, **PE_PVC,
                                     max_iterations=2)
    assert not st2.converged and st2.iterations == 2
    assert st2.conductor_temperature_c == np.inf
    # the rating of that design stays below the run-away power and is finite
    p = thermal.max_power(a, b, c, d, 1e9, 25.0, **COPPER, **PE_PVC,
                          dielectric_max_temperature_c=200.0)
    assert 10.0 < p < 1e3


@pytest.mark.parametrize("change, name", [
    (dict(b=1.0e-3), "b"),
    (dict(d=5.0e-3), "d"),
    (dict(power=-1.0), "power"),
    (dict(power=np.nan), "power"),
    (dict(loss_tangent=np.nan), "loss_tangent"),
])
def test_invalid_inputs_raise(change, name):
    kw = dict(a=1.5e-3, b=5.0e-3, c=5.3e-3, d=6.3e-3, frequency=1e9, power=100.0,
              ambient_c=25.0, **COPPER, **PE_PVC)
    kw.update(change)
    with pytest.raises(ValueError, match=name):
        thermal.coax_thermal_state(**kw)


def test_no_jacket_ignores_jacket_resistivity():
    a, b, c = 1.5e-3, 5.0e-3, 5.3e-3
    kw = dict(**COPPER, **{**PE_PVC, "jacket_thermal_resistivity": np.nan})
    st = thermal.coax_thermal_state(a, b, c, c, 1e9, 100.0, 25.0, **kw)
    assert st.converged and st.shield_temperature_c == st.surface_temperature_c
