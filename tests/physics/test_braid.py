"""Braid and foil geometry, DC resistance and mass (physics.braid, physics.outer_conductor)."""

import numpy as np
import pytest

from cablefam.physics import braid, outer_conductor as oc

# Source: IEC 60028, annealed copper resistivity at 20 degC, 1/58 ohm mm^2 m^-1.
RHO_CU = 1.7241e-8
# Source: IEC 60028, annealed copper density 8.89 g/cm^3.
DENSITY_CU = 8890.0


def test_fill_factor_and_coverage_worked_example():
    # Source: MIL-C-17G braid formulas, tan(alpha) = 2 pi (D + 2 d) P / C, F = N P d / sin(alpha),
    # K = 2F - F^2 (as quoted on cabledatasheet.com, "what is the braid angle and shield
    # coverage"). Worked by hand for D = 2.95 mm under the braid, d = 0.127 mm, C = 16, N = 7,
    # P = 0.4 picks/mm: D_m = 3.204 mm, tan(alpha) = 0.50328, alpha = 26.715 deg,
    # sin(alpha) = 0.44956, F = 7 * 0.4 * 0.127 / 0.44956 = 0.79100, K = 0.95632.
    alpha = np.radians(26.715341656641378)
    g = braid.braid_geometry(2.95e-3 / 2.0, 16, 7, 0.127e-3, alpha)
    assert g.mean_diameter == pytest.approx(3.204e-3, rel=1e-12)
    assert g.picks_per_m == pytest.approx(400.0, rel=1e-9)
    assert g.fill_factor == pytest.approx(0.79100, abs=5e-5)
    assert g.optical_coverage == pytest.approx(0.95632, abs=5e-5)
    # the lay length is the axial length of one carrier turn: C/2 carriers per direction
    # cross a generator line once per lay, so picks = C / (2 lay)
    assert g.picks_per_m == pytest.approx(16 / (2.0 * g.lay_length), rel=1e-12)


def test_braid_dc_resistance_by_hand():
    # 16 carriers x 7 ends of 0.127 mm copper at 30 deg: A = 112 pi/4 (0.127e-3)^2
    # = 1.41878e-6 m^2; R = rho / (A cos 30 deg) = 1.4032e-2 ohm/m (hand computation)
    r = braid.braid_dc_resistance(16, 7, 0.127e-3, np.radians(30.0), RHO_CU)
    assert r == pytest.approx(RHO_CU / (112 * np.pi / 4 * 0.127e-3 ** 2 * np.cos(np.pi / 6)),
                              rel=1e-12)
    assert r == pytest.approx(1.4032e-2, rel=1e-4)


def test_braid_mass_along_the_lay():
    m = braid.braid_mass(16, 7, 0.127e-3, np.radians(30.0), DENSITY_CU)
    straight = DENSITY_CU * 112 * np.pi / 4 * 0.127e-3 ** 2
    assert m == pytest.approx(straight / np.cos(np.radians(30.0)), rel=1e-12)


def test_foil_dc_resistance_is_the_tube_of_its_thickness():
    b, t, rho_al = 1.5e-3, 25e-6, 2.8e-8
    assert braid.foil_dc_resistance(b, t, rho_al) == pytest.approx(
        rho_al / (np.pi * ((b + t) ** 2 - b ** 2)), rel=1e-12)


def _outer(code, n=1):
    return oc.OuterConductor(np.full(n, code), 16.0, 7.0, 0.127e-3, np.radians(30.0), 25e-6,
                             2.8e-8)


def test_radial_build_and_dc_resistance_per_construction():
    b, t = 1.5e-3, 0.2e-3
    builds = [float(oc.radial_build(_outer(k), t)[0]) for k in range(5)]
    assert builds == pytest.approx([t, 25e-6, 2 * 0.127e-3, 25e-6 + 2 * 0.127e-3,
                                    4 * 0.127e-3], rel=1e-12)
    r_b = braid.braid_dc_resistance(16, 7, 0.127e-3, np.radians(30.0), RHO_CU)
    r_f = braid.foil_dc_resistance(b, 25e-6, 2.8e-8)
    got = [float(oc.dc_resistance(_outer(k), b, b + builds[k], RHO_CU)[0]) for k in range(5)]
    assert got[2] == pytest.approx(r_b, rel=1e-12)
    assert got[1] == pytest.approx(r_f, rel=1e-12)
    assert got[3] == pytest.approx(r_b * r_f / (r_b + r_f), rel=1e-12)
    assert got[4] == pytest.approx(r_b / 2.0, rel=1e-12)


def test_braid_internal_impedance_limits():
    args = (1.5e-3, 16, 7, 0.127e-3, np.radians(30.0), RHO_CU)
    r_dc = braid.braid_dc_resistance(*args[1:])
    r_low, _ = braid.braid_internal_impedance(*args, 1e-2)  # rss blend: 1e-7 off at 0.01 Hz
    assert r_low == pytest.approx(r_dc, rel=1e-6)
    r_hi, x_hi = braid.braid_internal_impedance(*args, 1e9)
    rs = np.sqrt(np.pi * 1e9 * 4e-7 * np.pi * RHO_CU)
    expected = braid.BRAID_LOSS_FACTOR * rs / (2 * np.pi * 1.5e-3 * np.cos(np.pi / 6) ** 2)
    assert x_hi == pytest.approx(expected, rel=1e-6)
    assert r_hi == pytest.approx(np.hypot(expected, r_dc), rel=1e-9)


def test_mixed_population_is_finite_and_matches_single_constructions():
    codes = np.arange(5)
    outer = oc.OuterConductor(codes, 16.0, 7.0, 0.127e-3, np.radians(30.0), 25e-6, 2.8e-8)
    b = np.full(5, 1.5e-3)
    c = b + oc.radial_build(outer, 0.2e-3)
    f = 100e6
    r, x = oc.internal_impedance(outer, b, RHO_CU, f)
    z = oc.transfer_impedance(outer, b, c, RHO_CU, f)
    assert np.all(np.isfinite(r)) and np.all(np.isfinite(x)) and np.all(np.isfinite(z))
    for k in range(1, 5):
        rk, xk = oc.internal_impedance(_outer(k), b[:1], RHO_CU, f)
        assert (rk[0], xk[0]) == (r[k], x[k])
