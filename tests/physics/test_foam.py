"""Foamed dielectrics by void fraction: the mixing rules against measured air mixtures, their
limits and bounds, and the conservative dielectric strength."""

import numpy as np
import pytest

from cablefam.physics import foam
from cablefam.physics.propagation import velocity_factor
from cablefam.physics.constants import speed_of_light


def test_solid_values_unchanged_at_zero_void_fraction():
    eps, tan = foam.foam_permittivity_loss_tangent(2.25, 2e-4, 0.0)
    assert eps == 2.25 and tan == 2e-4
    assert foam.foam_density(920.0, 0.0) == 920.0
    assert foam.foam_thermal_resistivity(3.5, 0.0) == 3.5
    assert foam.foam_dielectric_strength(2e7, 0.0, 2.25) == 2e7


def test_permittivity_limits_and_inverse():
    v = np.linspace(0.0, 0.999, 50)
    eps = foam.looyenga_permittivity(2.25, v)
    assert np.all(np.diff(eps) < 0) and eps[-1] > 1.0
    np.testing.assert_allclose(foam.void_fraction_for_permittivity(2.25, eps), v, atol=1e-12)


@pytest.mark.parametrize("v", [0.1, 0.3, 0.5, 0.7, 0.9])
def test_within_the_hashin_shtrikman_bounds(v):
    # Source: Z. Hashin, S. Shtrikman, J. Appl. Phys. 33 (1962) 3125, bounds of the
    # permittivity of any isotropic two-phase mixture (here PE 2.25 and air)
    e1, e2, f1 = 2.25, 1.0, 1.0 - v
    upper = e1 + (1.0 - f1) / (1.0 / (e2 - e1) + f1 / (3.0 * e1))
    lower = e2 + f1 / (1.0 / (e1 - e2) + (1.0 - f1) / (3.0 * e2))
    eps = foam.looyenga_permittivity(e1, v)
    assert lower <= eps <= upper


def test_agrees_with_bruggeman_for_polyethylene():
    """The choice between the two symmetric rules does not matter for PE: within 0.5 %."""
    v = np.linspace(0.0, 0.99, 100)
    es = 2.25
    # Source: D. A. G. Bruggeman, Ann. Phys. 24 (1935) 636, symmetric rule for spheres,
    # (1 - v)(es - e)/(es + 2e) + v(1 - e)/(1 + 2e) = 0, solved for its positive root
    b = (2.0 - 3.0 * v) * es + (3.0 * v - 1.0)
    bruggeman = (b + np.sqrt(b * b + 8.0 * es)) / 4.0
    np.testing.assert_allclose(foam.looyenga_permittivity(es, v), bruggeman, rtol=0.005)


@pytest.mark.parametrize("rho", [0.1, 0.2, 0.3, 0.4, 0.5])
def test_against_measured_dry_snow(rho):
    """Dry snow is the best measured closed two-phase dielectric/air mixture (ice, eps 3.15).
    Looyenga's rule lies within 3 % of both published density laws of measurements."""
    eps_ice = 3.15  # from memory: ice below 100 GHz, 3.15 to 3.19
    v = 1.0 - rho / 0.917  # ice density 917 kg/m^3 (from memory)
    eps = foam.looyenga_permittivity(eps_ice, v)
    # Source: M. Hallikainen, F. Ulaby, M. Abdelrazik, IEEE T-AP 34(11) (1986) 1329, dry snow
    # eps' = 1 + 1.83 rho (rho in g/cm^3), 3 to 37 GHz (from memory; the same law is in SMRT's
    # smrt/permittivity/snow_mixing_formula.py)
    np.testing.assert_allclose(eps, 1.0 + 1.83 * rho, rtol=0.03)
    # Source: M. Tiuri et al., IEEE J. Oceanic Eng. 9(5) (1984) 377, dry snow
    # eps' = 1 + 1.7 rho + 0.7 rho^2 (from memory)
    np.testing.assert_allclose(eps, 1.0 + 1.7 * rho + 0.7 * rho ** 2, rtol=0.03)


def test_loss_tangent_from_the_complex_rule():
    """Air lossless: tan_d falls with v, to first order by (1 - v) eps_s^(1/3) / eps^(1/3)."""
    v = np.array([0.2, 0.5, 0.7])
    eps, tan = foam.foam_permittivity_loss_tangent(2.25, 2e-4, v)
    first_order = 2e-4 * (1 - v) * np.cbrt(2.25) / np.cbrt(eps)
    np.testing.assert_allclose(tan, first_order, rtol=1e-6)


def test_velocity_factor_is_one_over_root_eps():
    # Source: a TEM line in a non-magnetic medium, v/c0 = 1/sqrt(eps_r) (any textbook, e.g.
    # D. M. Pozar, Microwave Engineering, 4th ed., Sec. 2.2)
    eps, _ = foam.foam_permittivity_loss_tangent(2.25, 0.0, np.array([0.5, 0.7]))
    f = 1e9
    beta = 2 * np.pi * f * np.sqrt(eps) / speed_of_light
    np.testing.assert_allclose(velocity_factor(beta, f), 1.0 / np.sqrt(eps), rtol=1e-12)


def test_density_and_thermal_resistivity_match_the_catalog_derivation():
    """The lightweight catalog's foamed PE grades were derived by the same thermal rule."""
    # Source: catalogs/lightweight.toml, foam-pe-50/-70: Maxwell-Eucken 7.54 and 11.66 K m/W
    np.testing.assert_allclose(foam.foam_thermal_resistivity(3.5, [0.5, 0.7]), [7.54, 11.66],
                               atol=0.005)
    np.testing.assert_allclose(foam.foam_density(920.0, 0.5), 460.0)


def test_thermal_conductivity_between_the_wiener_bounds():
    # Source: O. Wiener (1912), parallel and series bounds of a two-phase conductivity
    v = np.linspace(0.05, 0.95, 19)
    km, kd = 1 / 3.5, foam.AIR_THERMAL_CONDUCTIVITY
    k = foam.maxwell_eucken_conductivity(km, v)
    assert np.all(k <= (1 - v) * km + v * kd)
    assert np.all(k >= 1.0 / ((1 - v) / km + v / kd))


def test_dielectric_strength_is_conservative():
    v = np.array([0.0, 0.01, 0.5, 0.7])
    e = foam.foam_dielectric_strength(2e7, v, 2.25)
    assert e[0] == 2e7 and np.all(e[1:] < 2e7) and np.all(e[1:] < foam.AIR_BREAKDOWN_FIELD)
    # Source: J. D. Jackson, Classical Electrodynamics, 3rd ed., Sec. 4.4: the field inside a
    # sphere of eps 1 in a medium of eps_s is 3 eps_s / (2 eps_s + 1) times the applied field
    np.testing.assert_allclose(e[1:] * 3 * 2.25 / (2 * 2.25 + 1), foam.AIR_BREAKDOWN_FIELD)
    # a solid weaker than the cells' inception keeps its own strength
    assert foam.foam_dielectric_strength(1e6, 0.5, 2.25) == 1e6


def test_void_fraction_out_of_range_raises():
    with pytest.raises(ValueError, match="void_fraction"):
        foam.looyenga_permittivity(2.25, 1.0)
    with pytest.raises(ValueError, match="void_fraction"):
        foam.foam_density(920.0, -0.1)


def test_real_arithmetic_form_equals_the_complex_rule():
    rng = np.random.default_rng(0)
    v, e, t = rng.uniform(0, 0.95, 1000), rng.uniform(1.5, 10, 1000), rng.uniform(0, 0.5, 1000)
    mixed = foam.looyenga_permittivity(e * (1 - 1j * t), v)
    eps, tan = foam.foam_permittivity_loss_tangent(e, t, v)
    np.testing.assert_allclose(eps, mixed.real, rtol=1e-13)
    np.testing.assert_allclose(tan, -mixed.imag / mixed.real, rtol=1e-13)
