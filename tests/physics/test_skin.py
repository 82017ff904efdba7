"""Skin depth and surface resistance (physics.skin)."""

import numpy as np
import pytest
from scipy.constants import mu_0
from skrf.tlineFunctions import skin_depth as skrf_skin_depth

from cablefam.physics.skin import skin_depth, surface_resistance

# Source: IEC 60028:1925, International Standard of Resistance for Copper: annealed copper
# at 20 degC has a volume resistivity of 1/58 ohm mm^2 m^-1 = 1.7241e-8 ohm m (100 % IACS).
RHO_COPPER_IEC60028 = 1.7241e-8


@pytest.mark.parametrize(
    ("frequency", "table_depth"),
    [
        # from memory: copper skin depth as handbooks tabulate it, delta = 0.0661/sqrt(f) m
        # with f in Hz, three significant figures (I cannot cite the exact table: the
        # defining formula with the IEC 60028 resistivity, below, is the real check).
        (50.0, 9.35e-3),
        (1.0e6, 66.1e-6),
        (1.0e9, 2.09e-6),
    ],
)
def test_skin_depth_copper_against_table(frequency, table_depth):
    delta = skin_depth(RHO_COPPER_IEC60028, frequency)
    # Source: defining formula delta = 1/sqrt(pi f mu0 sigma) (Ramo, Whinnery, Van Duzer,
    # Fields and Waves in Communication Electronics, 3rd ed., Sec. 5.4), written out here
    # with sigma = 1/rho; rtol 1e-13: same formula, only the order of rounding differs.
    sigma = 1.0 / RHO_COPPER_IEC60028
    by_formula = 1.0 / np.sqrt(np.pi * frequency * mu_0 * sigma)
    assert delta == pytest.approx(by_formula, rel=1e-13)
    # rtol 2e-3: the table gives three significant figures (half a unit in the last place
    # is at most 0.08 % here) and its value of sigma may round differently.
    assert delta == pytest.approx(table_depth, rel=2e-3)


def test_skin_depth_against_scikit_rf():
    # Source: scikit-rf, skrf.tlineFunctions.skin_depth (reference library); rtol 1e-12:
    # same closed form and the same scipy.constants.mu_0.
    rng = np.random.default_rng(20240601)
    f = 10.0 ** rng.uniform(0.0, 11.0, 50)
    rho = rng.uniform(1.5e-8, 1.0e-7, 50)
    mu_r = rng.uniform(1.0, 200.0, 50)
    np.testing.assert_allclose(skin_depth(rho, f, mu_r), skrf_skin_depth(f, rho, mu_r),
                               rtol=1e-12)


def test_surface_resistance_is_rho_over_delta_and_scales_as_sqrt_f():
    # Source: Rs = rho/delta = sqrt(pi f mu rho) (Ramo, Whinnery, Van Duzer, 3rd ed.,
    # Sec. 5.4 and 5.5, from memory of the section); identity, rtol 1e-13.
    f = np.array([1.0, 1e3, 1e6, 1e9, 1e11])
    rs = surface_resistance(RHO_COPPER_IEC60028, f)
    np.testing.assert_allclose(rs, np.sqrt(np.pi * f * mu_0 * RHO_COPPER_IEC60028), rtol=1e-13)
    np.testing.assert_allclose(rs * skin_depth(RHO_COPPER_IEC60028, f), RHO_COPPER_IEC60028,
                               rtol=1e-13)
    # Magnetic conductor: delta shrinks as 1/sqrt(mu_r), Rs grows as sqrt(mu_r).
    np.testing.assert_allclose(skin_depth(RHO_COPPER_IEC60028, f, 100.0),
                               skin_depth(RHO_COPPER_IEC60028, f) / 10.0, rtol=1e-13)
    np.testing.assert_allclose(surface_resistance(RHO_COPPER_IEC60028, f, 100.0), 10.0 * rs,
                               rtol=1e-13)


@pytest.mark.parametrize("function", [skin_depth, surface_resistance])
def test_scalar_list_array_give_same_numbers(function):
    f_list = [50.0, 1e6, 1e9]
    from_list = function(RHO_COPPER_IEC60028, f_list)
    from_array = function(np.full(3, RHO_COPPER_IEC60028), np.array(f_list))
    from_scalars = [function(RHO_COPPER_IEC60028, f) for f in f_list]
    assert from_list.shape == (3,)
    np.testing.assert_array_equal(from_list, from_array)
    np.testing.assert_array_equal(from_list, np.array(from_scalars))
    assert np.ndim(from_scalars[0]) == 0
