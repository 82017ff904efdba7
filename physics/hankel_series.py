r"""Hankel large-argument series of the Bessel functions, as the internal impedances use them.

For :math:`|z| \gg 1` the modified Bessel functions of complex argument
:math:`z = (1 \pm j)u` follow from their Hankel expansions (A&S 9.2.7-9.2.10, 9.7.1-9.7.2 in
[1]_); :mod:`cablefam.physics.internal_impedance` divides them term by term into series of
:math:`1/u` for the ratios it needs, and evaluates those in real arithmetic by Horner's rule.

References
----------
.. [1] M. Abramowitz, I. A. Stegun, *Handbook of Mathematical Functions*, NBS, 1964.
"""

from __future__ import annotations

from functools import lru_cache

import numpy as np


def hankel_asymptotic_coefficients(order, n_terms):
    r"""Coefficients :math:`a_k(\nu)` of the Hankel large-argument expansions.

    .. math:: a_k(\nu) = \frac{(4\nu^2 - 1^2)(4\nu^2 - 3^2)\cdots(4\nu^2 - (2k-1)^2)}{k!\,8^k}

    (A&S 9.2.9-9.2.10 and 9.7.1-9.7.2 in [1]_).

    Parameters
    ----------
    order : float
        Bessel order :math:`\nu`.
    n_terms : int
        Number of coefficients, :math:`k = 0 \ldots n-1`.

    Returns
    -------
    numpy.ndarray
        Real coefficients, shape ``(n_terms,)``.

    References
    ----------
    .. [1] M. Abramowitz, I. A. Stegun, *Handbook of Mathematical Functions*, NBS, 1964.
    """
    mu = 4.0 * order * order
    coeffs = np.ones(n_terms)
    for k in range(1, n_terms):
        coeffs[k] = coeffs[k - 1] * (mu - (2 * k - 1) ** 2) / (k * 8.0)
    return coeffs


@lru_cache(maxsize=None)
def ratio_series(n_terms):
    """Coefficients r_k of S_0(w)/S_1(w), S_nu(w) = sum a_k(nu) w^k (power-series division)."""
    num = hankel_asymptotic_coefficients(0.0, n_terms)
    den = hankel_asymptotic_coefficients(1.0, n_terms)
    r = np.zeros(n_terms)
    for k in range(n_terms):
        r[k] = (num[k] - np.dot(r[:k], den[k:0:-1])) / den[0]
    return r


@lru_cache(maxsize=None)
def directed_ratio_series(direction, n_terms):
    """Real and imaginary parts of c_k = r_k * direction**k, highest power first (for polyval)."""
    c = ratio_series(n_terms) * complex(direction) ** np.arange(n_terms)
    return c.real[::-1].copy(), c.imag[::-1].copy()


def horner(coeffs_high_first, v):
    """Polynomial with real coefficients (highest power first, at least two) at real ``v``."""
    out = v * coeffs_high_first[0]
    out += coeffs_high_first[1]
    for c in coeffs_high_first[2:]:
        out *= v
        out += c
    return out


@lru_cache(maxsize=None)
def hankel_coefficient_tables(n_terms):
    """a_k(0), a_k(1) and (-1)^k, computed once."""
    return (hankel_asymptotic_coefficients(0.0, n_terms),
            hankel_asymptotic_coefficients(1.0, n_terms), (-1.0) ** np.arange(n_terms))
