"""Tests of physics.mass: layer masses, cost, DC loop resistance, outer diameter."""

import numpy as np
import pytest

from cablefam.physics import mass

# Source: IEC 60028, annealed copper: density 8.89 g/cm^3 at 20 degC.
COPPER_DENSITY = 8890.0
# Source: IEC 60889, hard-drawn aluminium: density 2.703 g/cm^3 at 20 degC.
ALUMINIUM_DENSITY = 2703.0
# common practice, no source: typical densities of solid PE and of PVC compound.
PE_DENSITY = 920.0
PVC_DENSITY = 1400.0
# Source: IEC 60028, 1.7241e-8 ohm m; IEC 60889, 2.8264e-8 ohm m (both at 20 degC).
COPPER_RESISTIVITY = 1.7241e-8
ALUMINIUM_RESISTIVITY = 2.8264e-8

# Known geometry: copper 2.0 mm wire, PE to 6.0 mm, aluminium tube to 7.0 mm, PVC to 8.0 mm.
A, B, C, D = 1.0e-3, 3.0e-3, 3.5e-3, 4.0e-3


def test_layer_masses_by_hand():
    m = mass.layer_masses(A, B, C, D, COPPER_DENSITY, PE_DENSITY, ALUMINIUM_DENSITY, PVC_DENSITY)
    # by hand: inner pi (1 mm)^2 = 3.141593 mm^2 x 8890 kg/m^3 = 0.0279288 kg/m
    assert m.inner == pytest.approx(0.0279288, rel=1e-5)
    # dielectric pi (9 - 1) mm^2 = 25.13274 mm^2 x 920 = 0.0231221 kg/m
    assert m.dielectric == pytest.approx(0.0231221, rel=1e-5)
    # shield pi (12.25 - 9) mm^2 = 10.21018 mm^2 x 2703 = 0.0275981 kg/m
    assert m.shield == pytest.approx(0.0275981, rel=1e-5)
    # jacket pi (16 - 12.25) mm^2 = 11.78097 mm^2 x 1400 = 0.0164934 kg/m
    assert m.jacket == pytest.approx(0.0164934, rel=1e-5)
    # total 0.0951424 kg/m = 95.14 kg/km
    assert m.total == pytest.approx(0.0951424, rel=1e-5)


def test_one_square_millimetre_of_copper():
    # Source: IEC 60028, density 8.89 g/cm^3: 1 mm^2 of copper weighs 8.89 kg/km.
    a = np.sqrt(1e-6 / np.pi)
    m = mass.layer_masses(a, 2 * a, 3 * a, 3 * a, COPPER_DENSITY, 0.0, 0.0, 0.0)
    assert m.inner * 1e3 == pytest.approx(8.89, rel=1e-12)


def test_no_jacket_has_zero_mass_and_cost_whatever_its_data():
    m = mass.layer_masses(A, B, C, C, COPPER_DENSITY, PE_DENSITY, ALUMINIUM_DENSITY, np.nan)
    assert m.jacket == 0.0
    assert np.isfinite(m.total)
    cost = mass.material_cost(m, 9.0, 2.0, 2.5, np.nan)
    assert np.isfinite(cost)


def test_material_cost_by_hand():
    # illustrative prices per kg (not market data): Cu 9.0, PE 2.0, Al 2.5, PVC 1.5
    m = mass.layer_masses(A, B, C, D, COPPER_DENSITY, PE_DENSITY, ALUMINIUM_DENSITY, PVC_DENSITY)
    cost = mass.material_cost(m, 9.0, 2.0, 2.5, 1.5)
    # by hand: 0.0279288 x 9 + 0.0231221 x 2 + 0.0275981 x 2.5 + 0.0164934 x 1.5
    #        = 0.251359 + 0.046244 + 0.068995 + 0.024740 = 0.391338 per metre
    assert cost == pytest.approx(0.391338, rel=1e-5)


def test_dc_loop_resistance_by_hand():
    r = mass.dc_loop_resistance(A, B, C, COPPER_RESISTIVITY, ALUMINIUM_RESISTIVITY)
    # by hand: 1.7241e-8/3.141593e-6 = 5.48798e-3 ohm/m (5.488 ohm/km, cf. 17.241 ohm/km for
    # 1 mm^2 scaled by 1/3.14159), plus 2.8264e-8/10.21018e-6 = 2.76822e-3 ohm/m:
    # 8.25620e-3 ohm/m.
    assert r == pytest.approx(8.25620e-3, rel=1e-5)
    # Source: IEC 60028, 1 mm^2 of annealed copper: 17.241 ohm/km at 20 degC; a loop of two
    # equal 1 mm^2 conductors is twice that.
    a = np.sqrt(1e-6 / np.pi)
    b = 2 * a
    c = np.sqrt(b * b + a * a)  # shield area = pi a^2 = 1 mm^2
    assert mass.dc_loop_resistance(a, b, c, COPPER_RESISTIVITY, COPPER_RESISTIVITY) * 1e3 == (
        pytest.approx(2 * 17.241, rel=1e-12))


def test_outer_diameter():
    assert mass.outer_diameter(D) == 8.0e-3
    np.testing.assert_array_equal(mass.outer_diameter([C, D]), [7.0e-3, 8.0e-3])


def test_shapes_scalar_list_array():
    scalar = mass.layer_masses(A, B, C, D, COPPER_DENSITY, PE_DENSITY, ALUMINIUM_DENSITY,
                               PVC_DENSITY)
    assert all(np.shape(x) == () for x in scalar)
    listed = mass.layer_masses([A, A], [B, B], [C, C], [D, C], COPPER_DENSITY, PE_DENSITY,
                               ALUMINIUM_DENSITY, [PVC_DENSITY, np.nan])
    assert all(np.shape(x) == (2,) for x in listed)
    for s, v in zip(scalar, listed):
        assert v[0] == s
    assert listed.jacket[1] == 0.0
    cost = mass.material_cost(listed, 9.0, 2.0, 2.5, [1.5, np.nan])
    assert cost.shape == (2,) and np.isfinite(cost).all()
    r = mass.dc_loop_resistance(np.full((2, 3), A), B, C, COPPER_RESISTIVITY,
                                ALUMINIUM_RESISTIVITY)
    assert r.shape == (2, 3)
    np.testing.assert_array_equal(r, mass.dc_loop_resistance(A, B, C, COPPER_RESISTIVITY,
                                                             ALUMINIUM_RESISTIVITY))
