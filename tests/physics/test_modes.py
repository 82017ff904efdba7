"""TE11 cutoff of a coax (physics.modes)."""

import numpy as np
import pytest
from scipy import optimize, special
from scipy.constants import speed_of_light

from cablefam.physics import modes
from cablefam.physics.modes import (
    te11_cutoff_frequency,
    te11_cutoff_frequency_approx,
    te11_cutoff_wavenumber,
)

# Source: A&S (Abramowitz & Stegun, Handbook of Mathematical Functions, NBS 1964), Table 9.5,
# first zero of J1'(x): j'_{1,1} = 1.84118 (five decimals there; 1.8411837813 from scipy).
J1P_FIRST_ZERO_AS_TABLE_9_5 = 1.84118


def cross_product(x, p):
    """J1'(x) Y1'(p x) - J1'(p x) Y1'(x), plain scipy.special, unscaled."""
    return special.jvp(1, x) * special.yvp(1, p * x) - special.jvp(1, p * x) * special.yvp(1, x)


def first_root_by_brentq(p):
    """First positive root x = kc a of the cross product: scan for a sign change, brentq it."""
    x = np.linspace(1e-3, 3.0, 30001) * (2.0 / (1.0 + p))
    v = cross_product(x, p)
    k = np.flatnonzero(np.sign(v[:-1]) != np.sign(v[1:]))[0]
    return optimize.brentq(cross_product, x[k], x[k + 1], args=(p,), xtol=1e-300, rtol=1e-15)


def test_j1_prime_zero_table_value():
    # Source: A&S Table 9.5 against scipy.special.jnp_zeros; the table's five decimals.
    assert special.jnp_zeros(1, 1)[0] == pytest.approx(J1P_FIRST_ZERO_AS_TABLE_9_5, abs=5e-6)


@pytest.mark.parametrize("p", [1.05, 1.2, 1.5, 2.0, 2.3026, np.e, 3.5911, 5.0, 10.0, 30.0])
def test_exact_root_against_independent_brentq(p):
    # Source: TE11 characteristic equation J1'(kc a) Y1'(kc b) - J1'(kc b) Y1'(kc a) = 0
    # (Marcuvitz, Waveguide Handbook, 1951, Sec. 2.4; Pozar, Microwave Engineering, 4th ed.,
    # Sec. 3.5; section numbers as cited in physics.modes), solved here independently with
    # scipy.optimize.brentq on scipy's jvp/yvp.
    # rtol 1e-11: both roots converge to ~1e-13; the scan guarantees the *first* root.
    a = 1.2e-3
    kc = te11_cutoff_wavenumber(a, p * a)
    assert kc * a == pytest.approx(first_root_by_brentq(p), rel=1e-11)


@pytest.mark.parametrize("p", [1.0 + 1e-4, 1.001, 1.01, 1.05])
def test_thin_gap_limit_is_two_over_a_plus_b(p):
    # Source: as b/a -> 1 the TE11 cutoff tends to kc = 2/(a+b), the mean circumference
    # being one wavelength (Pozar, Microwave Engineering, 4th ed., Sec. 3.5, where the
    # approximation is given; Marcuvitz, Sec. 2.4). The measured deviation is about
    # (p-1)^2/24: bound it by (p-1)^2.
    a = 1.0e-3
    kc = te11_cutoff_wavenumber(a, p * a)
    assert abs(kc * (a + p * a) / 2.0 - 1.0) < (p - 1.0) ** 2


@pytest.mark.parametrize("p", [100.0, 1000.0, 1.0e4])
def test_thin_centre_conductor_limit_is_circular_guide(p):
    # Source: as b/a -> infinity the coax becomes a circular guide of radius b, whose TE11
    # cutoff is kc b = j'_{1,1} = 1.84118 (A&S Table 9.5; Pozar Sec. 3.4). The measured
    # deviation is about 2.1/p^2: bound it by 3/p^2, plus the table's rounding.
    b = 5.0e-3
    kc = te11_cutoff_wavenumber(b / p, b)
    assert abs(kc * b / J1P_FIRST_ZERO_AS_TABLE_9_5 - 1.0) < 3.0 / p**2 + 3e-6
    assert abs(kc * b / special.jnp_zeros(1, 1)[0] - 1.0) < 3.0 / p**2


def test_usual_estimate_is_a_few_percent_low():
    # Source: the estimate kc ~ 2/(a+b) (Pozar, Microwave Engineering, 4th ed., Sec. 3.5).
    # Measured against the exact root: 0.6 % to 2.8 % *below* it for 1.5 <= b/a <= 5 (the
    # estimate is on the safe side there), crossing the exact value near b/a = 8.5.
    p = np.linspace(1.5, 5.0, 36)
    a = 0.8e-3
    ratio = te11_cutoff_frequency_approx(a, p * a, 2.1) / te11_cutoff_frequency(a, p * a, 2.1)
    assert ((ratio > 0.97) & (ratio < 0.995)).all()


def test_worked_numbers_7_mm_line_and_ptfe_cable():
    # 7 mm air line (IEEE Std 287 dimensions, from memory: 3.0404 mm / 7.0000 mm):
    #   exact 19.403 GHz, estimate 19.009 GHz.
    # from memory: the 7 mm connector is specified to 18 GHz, below its first higher mode.
    f_exact = te11_cutoff_frequency(3.0404e-3 / 2, 7.0e-3 / 2, 1.0)
    f_approx = te11_cutoff_frequency_approx(3.0404e-3 / 2, 7.0e-3 / 2, 1.0)
    assert f_exact == pytest.approx(19.4035e9, rel=1e-5)
    assert f_approx == pytest.approx(speed_of_light / (np.pi * (3.0404e-3 + 7.0e-3) / 2),
                                     rel=1e-14)
    assert 18.0e9 < f_approx < f_exact < 20.0e9
    # PTFE cable 0.035 in / 0.116 in, eps_r 2.2 (the dimensions of Pozar's RG-142 worked
    # example, from memory): estimate 33.55 GHz, exact 34.50 GHz.
    a, b = 0.035 * 25.4e-3 / 2, 0.116 * 25.4e-3 / 2
    assert te11_cutoff_frequency_approx(a, b, 2.2) == pytest.approx(33.549e9, rel=1e-4)
    assert te11_cutoff_frequency(a, b, 2.2) == pytest.approx(34.499e9, rel=1e-4)


def test_frequency_scales_with_permittivity_and_size():
    a, b = 1.0e-3, 3.3e-3
    f1 = te11_cutoff_frequency(a, b, 1.0)
    assert te11_cutoff_frequency(a, b, 2.25) == pytest.approx(f1 / 1.5, rel=1e-14)
    # Scale invariance of the root: doubling both radii halves the frequency (rtol: the
    # root finder's tolerance, 1e-13 relative).
    assert te11_cutoff_frequency(2 * a, 2 * b, 1.0) == pytest.approx(f1 / 2, rel=1e-12)


def test_scalar_list_array_and_broadcasting():
    a = [0.5e-3, 1.0e-3, 1.5e-3]
    b = [1.75e-3, 3.5e-3, 3.5e-3]
    from_list = te11_cutoff_wavenumber(a, b)
    from_array = te11_cutoff_wavenumber(np.array(a), np.array(b))
    from_scalar = np.array([te11_cutoff_wavenumber(x, y) for x, y in zip(a, b)])
    assert from_list.shape == (3,)
    np.testing.assert_array_equal(from_list, from_array)
    np.testing.assert_allclose(from_list, from_scalar, rtol=1e-13)
    grid = te11_cutoff_frequency(np.array(a), np.array(b)[:, None], 2.1)
    assert grid.shape == (3, 3)
    np.testing.assert_allclose(np.diag(grid), te11_cutoff_frequency(a, b, 2.1), rtol=1e-13)
    assert np.isfinite(te11_cutoff_wavenumber(np.full(1000, 1e-3),
                                              np.geomspace(1.0001e-3, 1.0, 1000))).all()


def test_tabulated_root_agrees_with_exact_root():
    # the spline of the "auto" path against the per-design root (same equation), and the
    # exact path beyond the table's range
    p = np.geomspace(1.0011, 9999.0, 20001)
    a = np.full_like(p, 1e-3)
    exact = modes.te11_cutoff_wavenumber(a, a * p, method="exact")
    auto = modes.te11_cutoff_wavenumber(a, a * p)
    assert np.max(np.abs(auto / exact - 1.0)) < 1e-10
    far = np.array([1.0005, 2e4])
    assert np.array_equal(modes.te11_cutoff_wavenumber(1e-3, 1e-3 * far),
                          modes.te11_cutoff_wavenumber(1e-3, 1e-3 * far, method="exact"))
