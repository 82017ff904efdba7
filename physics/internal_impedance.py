r"""Internal impedance of the centre conductor and of the tubular shield.

Both are exact solutions of the diffusion equation :math:`\nabla^2 J = j\omega\mu\sigma J` in
a round wire and in a tube, written with exponentially scaled Bessel functions so that nothing
overflows for any frequency or radius-to-skin-depth ratio (the plain functions overflow near
:math:`|ka| \approx 700`). Where the argument is large the same expressions are evaluated
through their Hankel asymptotic series, in real arithmetic; the switch point was chosen by
measurement so that both paths agree to better than 1e-9 relative on either side of it
(``tests/physics/test_internal_impedance.py`` checks the seams, the benchmark the whole range).
DC and high-frequency limits come out of these same functions.

Known limit: for a shield wall thinner than about 0.01 skin depth (copper, 50 um wall, below
~200 Hz) the tube formula loses digits to cancellation in its denominator; both paths are then
good to ~1e-4 relative, which is far inside the scatter of real resistivities.

The functions return the internal impedance per unit length :math:`Z_i = R + jX_i`
[ohm m^-1]; the internal inductance is :math:`X_i/\omega`.
"""

from __future__ import annotations

from functools import lru_cache

import numpy as np
from scipy import special

from cablefam.physics.hankel_series import (directed_ratio_series,  # noqa: F401 (re-export)
                                            hankel_asymptotic_coefficients,
                                            hankel_coefficient_tables, horner)
from cablefam.physics.skin import skin_depth

#: Radius-to-skin-depth ratio above which the asymptotic series replaces the Bessel ratio.
#: Chosen by measurement against 40-digit mpmath values: at u = 12 with 12 terms the series
#: of the round wire and of the tube (any wall of at least 0.01 skin depth) agree with the
#: scaled-Bessel form to < 2e-10 relative in R and in X; at u = 10 only to 1e-9.
ASYMPTOTIC_MIN_RATIO = 12.0
#: Number of terms kept in the asymptotic series (asymptotic: more is not better below u ~ 15).
ASYMPTOTIC_TERMS = 12
#: Exponent below which the inner-to-outer wall coupling exp(-2 t / delta) is negligible
#: against double precision (exp(-40) ~ 4e-18).
_WALL_COUPLING_NEGLIGIBLE = 40.0

_METHODS = ("auto", "exact", "asymptotic")


def _complex(re, im):
    """re + j im as one complex array, without complex arithmetic (exact)."""
    out = np.empty(np.shape(re), dtype=complex)
    out.real = re
    out.imag = im
    return out


def _check_method(method):
    if method not in _METHODS:
        raise ValueError(f"method must be one of {_METHODS}, got {method!r}")


# --------------------------------------------------------------------------- round wire


def _wire_factor_exact(u):
    """F = (z/2) J0(z)/J1(z), z = (1 - j) u, from exponentially scaled Bessel functions."""
    z = (1.0 - 1.0j) * u
    with np.errstate(invalid="ignore", divide="ignore"):
        f = 0.5 * z * special.jve(0, z) / special.jve(1, z)
    return np.where(u == 0.0, 1.0 + 0.0j, f)


def _wire_factor_asymptotic(u):
    """Same F from the Hankel series: F = (1 + j) u/2 * sum c_k u^-k, c_k = r_k ((j - 1)/2)^k.

    Returns the real and imaginary parts (real arithmetic).
    """
    re_c, im_c = directed_ratio_series(complex(-0.5, 0.5), ASYMPTOTIC_TERMS)
    v = 1.0 / u
    s_re = horner(re_c, v)
    s_im = horner(im_c, v)
    half_u = 0.5 * u
    return half_u * (s_re - s_im), half_u * (s_re + s_im)


def wire_resistance_reactance(radius, resistivity, frequency, relative_permeability=1.0,
                              method="auto"):
    r"""Internal resistance and reactance of a solid round wire, as two real arrays.

    The real and imaginary parts of :func:`wire_internal_impedance` (same parameters, same
    values to the last bit), for callers that work in real arithmetic.

    Returns
    -------
    tuple of numpy.ndarray
        :math:`(R, X_i)` [ohm m^-1].
    """
    _check_method(method)
    a, rho, f, mu_r = np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in (
        radius, resistivity, frequency, relative_permeability)))
    u = a / skin_depth(rho, f, mu_r)
    r_dc = wire_dc_resistance(a, rho)
    big = u >= ASYMPTOTIC_MIN_RATIO if method == "auto" else None
    if method == "asymptotic" or (big is not None and big.all()):
        f_re, f_im = _wire_factor_asymptotic(u)
    else:
        if method == "exact" or not big.any():
            factor = _wire_factor_exact(u)
        else:
            factor = np.empty(u.shape, dtype=complex)
            factor[big] = _complex(*_wire_factor_asymptotic(u[big]))
            small = ~big
            factor[small] = _wire_factor_exact(u[small])
        f_re, f_im = factor.real, factor.imag
    return r_dc * f_re, r_dc * f_im


def wire_internal_impedance(radius, resistivity, frequency, relative_permeability=1.0,
                            method="auto"):
    r"""Internal impedance per unit length of a solid round wire (exact Bessel form).

    Parameters
    ----------
    radius : array_like
        Wire radius :math:`a` [m], > 0.
    resistivity : array_like
        Resistivity :math:`\rho` [ohm m], > 0.
    frequency : array_like
        Frequency :math:`f` [Hz], > 0.
    relative_permeability : array_like, optional
        Relative permeability :math:`\mu_r` of the wire [-].
    method : {"auto", "exact", "asymptotic"}
        ``"exact"`` evaluates the scaled Bessel ratio everywhere; ``"asymptotic"`` the Hankel
        series everywhere (accurate only for :math:`a/\delta \gtrsim 10`); ``"auto"`` picks
        per element at :data:`ASYMPTOTIC_MIN_RATIO`.

    Returns
    -------
    numpy.ndarray of complex
        :math:`Z_i = R + j\omega L_i` [ohm m^-1].

    Notes
    -----
    With :math:`k = (1-j)/\delta` and :math:`R_{dc} = \rho/(\pi a^2)` (Eq. 6.24 of [1]_):

    .. math:: Z_i = \frac{k\rho}{2\pi a}\frac{J_0(ka)}{J_1(ka)}
              = R_{dc}\,\frac{ka}{2}\frac{J_0(ka)}{J_1(ka)}

    evaluated as ``jve(0, ka)/jve(1, ka)`` (the scale factors cancel). For
    :math:`a/\delta \ge` :data:`ASYMPTOTIC_MIN_RATIO` the ratio comes from the Hankel series
    (A&S 9.2.7 in [2]_) divided term by term; it gives the classic limits
    :math:`R \to R_{dc}` and :math:`\omega L_i \to \omega\mu/(8\pi)` at low frequency and
    :math:`Z_i \to (1+j) R_s/(2\pi a) + R_{dc}/4` at high frequency.

    References
    ----------
    .. [1] S. Ramo, J. R. Whinnery, T. Van Duzer, *Fields and Waves in Communication
       Electronics*, 3rd ed., Wiley, 1994, Sec. 5.5 (Eq. 5.5(12)).
    .. [2] M. Abramowitz, I. A. Stegun, *Handbook of Mathematical Functions*, NBS, 1964.
    .. [3] S. A. Schelkunoff, *Bell Syst. Tech. J.* 13 (1934) 532-579, Eq. (37).
    """
    return _complex(*wire_resistance_reactance(radius, resistivity, frequency,
                                               relative_permeability, method))


# --------------------------------------------------------------------------- tube (shield)


def _tube_ratio_exact(ub, uc):
    """N/D of Schelkunoff's tube formula from scaled Bessel functions (no overflow)."""
    x = (1.0 + 1.0j) * ub
    y = (1.0 + 1.0j) * uc
    # e = I-type/K-type scale bookkeeping: exp((x - y) + Re(x - y)), |e| = exp(-2 (c - b)/delta)
    e = np.exp((x - y) + (ub - uc))
    i0x, i1x = special.ive(0, x), special.ive(1, x)
    k0x, k1x = special.kve(0, x), special.kve(1, x)
    i1y, k1y = special.ive(1, y), special.kve(1, y)
    num = i0x * k1y * e + k0x * i1y
    den = k1x * i1y - i1x * k1y * e
    return num / den


def _tube_ratio_asymptotic_thick(ub):
    """N/D -> K0(x)/K1(x) for a wall many skin depths thick; series c_k = r_k ((1 - j)/2)^k.

    Returns the real and imaginary parts (real arithmetic).
    """
    re_c, im_c = directed_ratio_series(complex(0.5, -0.5), ASYMPTOTIC_TERMS)
    v = 1.0 / ub
    return horner(re_c, v), horner(im_c, v)


@lru_cache(maxsize=None)
def _tube_series_matrix(n_terms):
    """Rows a_k(0), a_k(0)(-1)^k, a_k(1), a_k(1)(-1)^k, a_k(1), a_k(1)(-1)^k; highest power
    first."""
    a0, a1, alt = hankel_coefficient_tables(n_terms)
    return np.stack((a0, a0 * alt, a1, a1 * alt, a1, a1 * alt))[:, ::-1].copy()


def _tube_ratio_asymptotic_general(ub, uc):
    """N/D from the Hankel series of I and K at both wall surfaces (any wall thickness)."""
    coeffs = _tube_series_matrix(ASYMPTOTIC_TERMS)
    x_inv = 1.0 / ((1.0 + 1.0j) * ub)
    y_inv = 1.0 / ((1.0 + 1.0j) * uc)
    # the six series at once (Horner's rule as numpy.polyval evaluates it, row by row)
    w = np.stack((x_inv, x_inv, x_inv, x_inv, y_inv, y_inv))
    y = w * coeffs[:, :1] + coeffs[:, 1:2]
    for k in range(2, coeffs.shape[1]):
        y = y * w + coeffs[:, k:k + 1]
    s0x, t0x, s1x, t1x, s1y, t1y = y
    q = np.exp(-2.0 * (1.0 + 1.0j) * (uc - ub))
    return (q * t0x * s1y + s0x * t1y) / (s1x * t1y - q * t1x * s1y)


def tube_internal_impedance(inner_radius, outer_radius, resistivity, frequency,
                            relative_permeability=1.0, method="auto"):
    r"""Internal impedance per unit length of a tubular shield, return current inside.

    The shield of a coax carries the return current, which the field of the centre conductor
    pulls to the inner surface of the tube; nothing is outside (perfectly shielded line).

    Parameters
    ----------
    inner_radius : array_like
        Inner radius of the tube :math:`b` [m] (the dielectric radius), > 0.
    outer_radius : array_like
        Outer radius :math:`c` [m], > ``inner_radius``.
    resistivity : array_like
        Resistivity of the tube [ohm m].
    frequency : array_like
        Frequency [Hz], > 0.
    relative_permeability : array_like, optional
        Relative permeability of the tube [-].
    method : {"auto", "exact", "asymptotic"}
        As in :func:`wire_internal_impedance`.

    Returns
    -------
    numpy.ndarray of complex
        :math:`Z_{bb} = R + j\omega L_i` [ohm m^-1].

    Notes
    -----
    Schelkunoff's internal impedance of a tube referred to its inner surface (Eq. (47) of
    [1]_; Eq. 6.25 of [2]_), with :math:`\gamma = (1+j)/\delta`:

    .. math:: Z_{bb} = \frac{\gamma\rho}{2\pi b}\,
        \frac{I_0(\gamma b)K_1(\gamma c) + K_0(\gamma b)I_1(\gamma c)}
             {I_1(\gamma c)K_1(\gamma b) - I_1(\gamma b)K_1(\gamma c)}

    Written with ``ive``/``kve`` the exponential factors collapse to
    :math:`e^{(x-y)+\mathrm{Re}(x-y)}`, of modulus :math:`e^{-2(c-b)/\delta} \le 1`. For
    :math:`b/\delta \ge` :data:`ASYMPTOTIC_MIN_RATIO` all four functions are replaced by their
    Hankel series (A&S 9.7.1-9.7.2 in [3]_); for a wall many skin depths thick this reduces to
    :math:`K_0(\gamma b)/K_1(\gamma b)`. Limits: :math:`\rho/(\pi(c^2-b^2))` at DC and
    :math:`(1+j)R_s/(2\pi b)` at high frequency.

    References
    ----------
    .. [1] S. A. Schelkunoff, "The electromagnetic theory of coaxial transmission lines and
       cylindrical shields", *Bell Syst. Tech. J.* 13 (1934) 532-579.
    .. [2] S. Ramo, J. R. Whinnery, T. Van Duzer, *Fields and Waves in Communication
       Electronics*, 3rd ed., Wiley, 1994, Sec. 5.5.
    .. [3] M. Abramowitz, I. A. Stegun, *Handbook of Mathematical Functions*, NBS, 1964.
    """
    return _complex(*tube_resistance_reactance(inner_radius, outer_radius, resistivity,
                                               frequency, relative_permeability, method))


def tube_resistance_reactance(inner_radius, outer_radius, resistivity, frequency,
                              relative_permeability=1.0, method="auto"):
    r"""Internal resistance and reactance of the tubular shield, as two real arrays.

    The real and imaginary parts of :func:`tube_internal_impedance` (same parameters, same
    values to the last bit), for callers that work in real arithmetic.

    Returns
    -------
    tuple of numpy.ndarray
        :math:`(R, X_i)` [ohm m^-1].
    """
    _check_method(method)
    b, c, rho, f, mu_r = np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in (
        inner_radius, outer_radius, resistivity, frequency, relative_permeability)))
    delta = skin_depth(rho, f, mu_r)
    ub = b / delta
    uc = c / delta
    if method == "exact":
        ratio = _tube_ratio_exact(ub, uc)
        ratio_re, ratio_im = ratio.real, ratio.imag
    else:
        if method == "asymptotic":
            big = np.ones(ub.shape, dtype=bool)
        else:
            big = ub >= ASYMPTOTIC_MIN_RATIO
        thick = big & (2.0 * (uc - ub) >= _WALL_COUPLING_NEGLIGIBLE)
        if big.all():  # the usual case at radio frequencies: no masks on the thick walls
            ratio_re, ratio_im = _tube_ratio_asymptotic_thick(ub)
            thin = ~thick
            if thin.any():  # the few walls thinner than ~20 skin depths, replaced
                ratio_re, ratio_im = np.asarray(ratio_re), np.asarray(ratio_im)
                ratio = _tube_ratio_asymptotic_general(ub[thin], uc[thin])
                ratio_re[thin], ratio_im[thin] = ratio.real, ratio.imag
        else:
            thin = big & ~thick
            small = ~big
            ratio = np.empty(ub.shape, dtype=complex)
            ratio[thick] = _complex(*_tube_ratio_asymptotic_thick(ub[thick]))
            if thin.any():
                ratio[thin] = _tube_ratio_asymptotic_general(ub[thin], uc[thin])
            if small.any():
                ratio[small] = _tube_ratio_exact(ub[small], uc[small])
            ratio_re, ratio_im = ratio.real, ratio.imag
    # (s (1 + j)) (ratio_re + j ratio_im), s = rho / (2 pi b delta), in real arithmetic
    scale = rho / (2.0 * np.pi * b * delta)
    return scale * ratio_re - scale * ratio_im, scale * ratio_im + scale * ratio_re


# --------------------------------------------------------------------------- DC limits


def wire_dc_resistance(radius, resistivity):
    r"""DC resistance per unit length of a solid round wire, :math:`\rho/(\pi a^2)` [ohm m^-1].

    Parameters
    ----------
    radius : array_like
        Wire radius :math:`a` [m], > 0.
    resistivity : array_like
        Resistivity :math:`\rho` [ohm m].

    Notes
    -----
    :math:`R = \rho/A` (clause 2.1.1 of [1]_), the low-frequency limit of
    :func:`wire_internal_impedance`. A stranded conductor:
    :func:`cablefam.physics.stranding.stranded_dc_resistance`.

    References
    ----------
    .. [1] IEC 60287-1-1:2006+AMD1:2014, clause 2.1.1.
    """
    a = np.asarray(radius, dtype=float)
    return np.asarray(resistivity, dtype=float) / (np.pi * a * a)


def tube_dc_resistance(inner_radius, outer_radius, resistivity):
    r"""DC resistance per unit length of a tube, :math:`\rho/(\pi(c^2-b^2))` [ohm m^-1].

    Parameters
    ----------
    inner_radius, outer_radius : array_like
        Radii :math:`b < c` of the tube [m].
    resistivity : array_like
        Resistivity :math:`\rho` [ohm m].

    Notes
    -----
    :math:`R = \rho/A` (clause 2.1.1 of [1]_), the low-frequency limit of
    :func:`tube_internal_impedance`.

    References
    ----------
    .. [1] IEC 60287-1-1:2006+AMD1:2014, clause 2.1.1.
    """
    b = np.asarray(inner_radius, dtype=float)
    c = np.asarray(outer_radius, dtype=float)
    return np.asarray(resistivity, dtype=float) / (np.pi * (c * c - b * b))
