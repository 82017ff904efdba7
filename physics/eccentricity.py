r"""A coax whose centre conductor is off the axis by a distance :math:`D` (eccentricity).

For two non-concentric circles, radius :math:`a` inside radius :math:`b` with centres
:math:`D` apart, the electrostatic problem maps exactly onto a concentric one (bipolar
coordinates), giving

.. math::
    \Lambda = \operatorname{arccosh}\frac{a^2 + b^2 - D^2}{2ab}, \qquad
    C = \frac{2\pi\varepsilon}{\Lambda}, \qquad L_e = \frac{\mu_0}{2\pi}\Lambda, \qquad
    Z_0 = \frac{\eta_0}{2\pi\sqrt{\varepsilon_r}}\Lambda

which is :math:`\ln(b/a)` at :math:`D = 0` (Sec. 4.8 of [1]_; Sec. 2.2 of [2]_). The conductor
loss of the offset line follows from Wheeler's incremental-inductance rule [3]_: with the
surfaces receding by half a skin depth, :math:`R = \frac{R_s}{\mu_0}\left(-\frac{\partial
L_e}{\partial a} + \frac{\partial L_e}{\partial b}\right)`, exact for :math:`\delta \ll a`.

References
----------
.. [1] S. Ramo, J. R. Whinnery, T. Van Duzer, *Fields and Waves in Communication
   Electronics*, 3rd ed., Wiley, 1994.
.. [2] B. C. Wadell, *Transmission Line Design Handbook*, Artech House, 1991, Sec. 2.2
   (eccentric coaxial line).
.. [3] H. A. Wheeler, "Formulas for the skin effect", *Proc. IRE* 30 (1942) 412-424.
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np

from cablefam.physics import _checks
from cablefam.physics.constants import FREE_SPACE_IMPEDANCE, SQRT_ARGUMENT_FLOOR


class GeometryGradient(NamedTuple):
    r"""First derivatives of the geometry factor :math:`\Lambda`; arrays of a common shape."""

    d_da: np.ndarray
    r""":math:`\partial\Lambda/\partial a` [m^-1] (:math:`-1/a` at :math:`D = 0`)."""
    d_db: np.ndarray
    r""":math:`\partial\Lambda/\partial b` [m^-1] (:math:`1/b` at :math:`D = 0`)."""
    d_doffset: np.ndarray
    r""":math:`\partial\Lambda/\partial D` [m^-1] (0 at :math:`D = 0`)."""


class GeometryCurvature(NamedTuple):
    r"""Second derivatives of :math:`\Lambda`; arrays of a common shape [m^-2]."""

    d2_da2: np.ndarray
    d2_dadb: np.ndarray
    d2_db2: np.ndarray
    d2_dadoffset: np.ndarray
    d2_dbdoffset: np.ndarray


def _as_float(*xs):
    return np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in xs))


def geometry_factor(a, b, offset=0.0):
    r"""The logarithm of a coax, :math:`\Lambda` [-]: :math:`\ln(b/a)` or its eccentric form.

    Parameters
    ----------
    a, b : array_like
        Centre-conductor radius and dielectric (shield inner) radius [m], ``b > a``.
    offset : array_like, optional
        Distance between the two axes :math:`D` [m], ``0 <= D < b - a``.

    Returns
    -------
    numpy.ndarray
        :math:`\Lambda = \operatorname{arccosh}((a^2+b^2-D^2)/(2ab))` [-]; exactly
        ``log(b/a)`` (the same floating-point value) where ``D == 0``.
    """
    a, b, d = _as_float(a, b, offset)
    if not np.any(d):
        return np.log(b / a)
    x = (a * a + b * b - d * d) / (2.0 * a * b)
    with np.errstate(invalid="ignore"):
        ecc = np.arccosh(np.maximum(x, 1.0))
    return np.where(d == 0.0, np.log(b / a), ecc)


def _gradient_terms(a, b, d):
    r""":math:`N_a = a^2 - b^2 + D^2`, :math:`N_b = b^2 - a^2 + D^2`, :math:`P`, :math:`\sqrt P`."""
    p = ((b - a) ** 2 - d * d) * ((b + a) ** 2 - d * d)
    return a * a - b * b + d * d, b * b - a * a + d * d, p, np.sqrt(
        np.maximum(p, SQRT_ARGUMENT_FLOOR))


def geometry_factor_gradient(a, b, offset=0.0):
    r"""Derivatives of :math:`\Lambda = \operatorname{arccosh}((a^2+b^2-D^2)/(2ab))`.

    Parameters
    ----------
    a, b : array_like
        Centre-conductor radius and dielectric (shield inner) radius [m], ``0 < a < b``.
    offset : array_like, optional
        Distance :math:`D` between the axes of the two conductors [m], ``|D| < b - a``.
        The derivative with respect to :math:`D` is taken for :math:`D \ge 0` (the sign of
        ``offset`` is ignored: only the distance matters).

    Returns
    -------
    GeometryGradient
        ``d_da``, ``d_db``, ``d_doffset`` [m^-1].

    Raises
    ------
    ValueError
        If any design has ``a <= 0``, ``b <= a`` or ``|offset| >= b - a`` (or NaN).

    Notes
    -----
    With :math:`P = ((b-a)^2 - D^2)((b+a)^2 - D^2)`, so that
    :math:`\sqrt{X^2 - 1} = \sqrt P/(2ab)` without cancellation as :math:`D \to 0`:

    .. math::
        \frac{\partial\Lambda}{\partial a} = \frac{a^2 - b^2 + D^2}{a\sqrt{P}}, \qquad
        \frac{\partial\Lambda}{\partial b} = \frac{b^2 - a^2 + D^2}{b\sqrt{P}}, \qquad
        \frac{\partial\Lambda}{\partial D} = \frac{-2D}{\sqrt{P}}

    from :math:`\partial\Lambda/\partial x = (\partial X/\partial x)/\sqrt{X^2 - 1}`; at
    :math:`D = 0` they are exactly :math:`-1/a`, :math:`1/b`, 0 (the derivatives of
    :math:`\ln(b/a)`). Geometry of the eccentric line: Sec. 4.8 of [1]_.
    """
    a, b, d = _checks.coax_radii(a, b, offset)
    n_a, n_b, _, sq = _gradient_terms(a, b, d)
    zero = d == 0.0
    return GeometryGradient(d_da=np.where(zero, -1.0 / a, n_a / (a * sq)),
                            d_db=np.where(zero, 1.0 / b, n_b / (b * sq)),
                            d_doffset=np.where(zero, 0.0, -2.0 * d / sq))


def geometry_factor_curvature(a, b, offset=0.0):
    r"""Second derivatives of :math:`\Lambda` by the radii and the offset [m^-2].

    Parameters and checks as in :func:`geometry_factor_gradient`.

    Returns
    -------
    GeometryCurvature
        :math:`\Lambda_{aa}, \Lambda_{ab}, \Lambda_{bb}, \Lambda_{aD}, \Lambda_{bD}`; at
        :math:`D = 0` exactly :math:`1/a^2, 0, -1/b^2, 0, 0`.

    Notes
    -----
    Differentiating :math:`\Lambda_a = N_a/(a\sqrt P)` and :math:`\Lambda_b = N_b/(b\sqrt P)`
    (:func:`geometry_factor_gradient`) once more, with :math:`P_a = -4aN_b`,
    :math:`P_b = 4b(b^2 - a^2 - D^2)`, :math:`P_D = -4D(a^2 + b^2 - D^2)`:

    .. math::
        \Lambda_{aa} = \frac{2}{\sqrt P} - \frac{N_a}{a^2\sqrt P} - \frac{N_a P_a}{2aP\sqrt P},
        \quad
        \Lambda_{ab} = -\frac{2b}{a\sqrt P} - \frac{N_a P_b}{2aP\sqrt P},
        \quad
        \Lambda_{aD} = \frac{2D}{a\sqrt P} - \frac{N_a P_D}{2aP\sqrt P}

    and likewise for :math:`\Lambda_{bb}`, :math:`\Lambda_{bD}` with :math:`a \leftrightarrow b`.
    """
    a, b, d = _checks.coax_radii(a, b, offset)
    n_a, n_b, p, sq = _gradient_terms(a, b, d)
    p_a = -4.0 * a * n_b
    p_b = 4.0 * b * (b * b - a * a - d * d)
    p_d = -4.0 * d * (a * a + b * b - d * d)
    zero = d == 0.0
    return GeometryCurvature(
        d2_da2=np.where(zero, 1.0 / (a * a),
                        2.0 / sq - n_a / (a * a * sq) - n_a * p_a / (2.0 * a * p * sq)),
        d2_dadb=np.where(zero, 0.0, -2.0 * b / (a * sq) - n_a * p_b / (2.0 * a * p * sq)),
        d2_db2=np.where(zero, -1.0 / (b * b),
                        2.0 / sq - n_b / (b * b * sq) - n_b * p_b / (2.0 * b * p * sq)),
        d2_dadoffset=np.where(zero, 0.0, 2.0 * d / (a * sq) - n_a * p_d / (2.0 * a * p * sq)),
        d2_dbdoffset=np.where(zero, 0.0, 2.0 * d / (b * sq) - n_b * p_d / (2.0 * b * p * sq)))


def geometry_factor_offset_slope(a, b, offset=0.0):
    r"""Derivative of :math:`\Lambda` by the squared offset [m^-2].

    Parameters and checks as in :func:`geometry_factor_gradient`.

    Returns
    -------
    numpy.ndarray
        :math:`\partial\Lambda/\partial(D^2) = -1/\sqrt P`; :math:`-1/(b^2 - a^2)` at
        :math:`D = 0`, where
        :math:`\Lambda \approx \ln(b/a) - D^2/(b^2 - a^2)`: the offset lowers :math:`\Lambda`
        to second order in :math:`D`.

    Notes
    -----
    :math:`\Lambda` depends on :math:`D` through :math:`X = (a^2+b^2-D^2)/(2ab)` only, so
    :math:`\partial\Lambda/\partial(D^2) = -1/(2ab\sqrt{X^2-1}) = -1/\sqrt P`, exact for any
    :math:`D` (the first-order term of :math:`\Lambda` in :math:`D^2`).
    """
    a, b, d = _checks.coax_radii(a, b, offset)
    *_, sq = _gradient_terms(a, b, d)
    return np.where(d == 0.0, -1.0 / (b * b - a * a), -1.0 / sq)


def wheeler_loss_factors(a, b, offset=0.0):
    r"""Per-conductor loss factors of an offset line, ``(inner, shield)``, each 1 at D = 0.

    .. math:: F_a = -a\,\frac{\partial\Lambda}{\partial a} = -\frac{N_a}{\sqrt P}, \qquad
              F_b = b\,\frac{\partial\Lambda}{\partial b} = \frac{N_b}{\sqrt P}

    with the derivatives of :func:`geometry_factor_gradient` (Wheeler's rule [3]_ per
    conductor, so that different metals keep their own surface resistance). Multiply each
    conductor's skin-effect internal impedance by its factor. Inputs are not checked (the
    caller's geometry is valid).
    """
    a, b, d = _as_float(a, b, offset)
    if not np.any(d):
        one = np.ones(a.shape)
        return one, one
    n_a, n_b, _, sq = _gradient_terms(a, b, d)
    return np.where(d == 0.0, 1.0, -n_a / sq), np.where(d == 0.0, 1.0, n_b / sq)


def wheeler_loss_factor(a, b, offset=0.0):
    r"""Conductor-loss factor of an offset line over the concentric one, :math:`\ge 1` [-].

    .. math::
        F = \frac{-\partial\Lambda/\partial a + \partial\Lambda/\partial b}{1/a + 1/b}
          = \frac{F_a/a + F_b/b}{1/a + 1/b}

    with the per-conductor factors of :func:`wheeler_loss_factors`; Wheeler's rule [3]_
    applied to :math:`\Lambda` (same surface resistance on both conductors). :math:`F = 1` at
    :math:`D = 0`. Multiply the skin-effect resistance of the concentric line by it; valid
    where the skin depth is small against both radii (an upper bound of the increase
    otherwise).
    """
    a, b, d = _as_float(a, b, offset)
    f_a, f_b = wheeler_loss_factors(a, b, d)
    return np.where(d == 0.0, 1.0, (f_a / a + f_b / b) / (1.0 / a + 1.0 / b))


def impedance_per_geometry_factor(relative_permittivity):
    r"""Lossless characteristic impedance per unit of :math:`\Lambda`, :math:`K` [ohm].

    .. math:: K = \frac{\eta_0}{2\pi\sqrt{\varepsilon_r}}, \qquad Z_0 = K\Lambda

    with :math:`\eta_0 = \mu_0 c_0` (:data:`cablefam.physics.constants.FREE_SPACE_IMPEDANCE`)
    and :math:`\Lambda = \ln(b/a)` or its eccentric form (Table 2.1 of [1]_).

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012.
    """
    return FREE_SPACE_IMPEDANCE / (2.0 * np.pi * np.sqrt(
        np.asarray(relative_permittivity, dtype=float)))


def characteristic_impedance_eccentric(a, b, offset, relative_permittivity):
    r"""Lossless characteristic impedance of an eccentric coax,
    :math:`\eta_0\Lambda/(2\pi\sqrt{\varepsilon_r})` [ohm] (see the module notes).

    The same function as :func:`cablefam.physics.line.characteristic_impedance_lossless` with
    an ``offset``, argument order kept for existing callers.
    """
    return impedance_per_geometry_factor(relative_permittivity) * geometry_factor(a, b, offset)


def peak_field_factor(a, b, offset=0.0):
    r"""Ratio of the largest field on the centre conductor of an offset line to
    :math:`V/(a\Lambda)` [-]; 1 at D = 0.

    In bipolar coordinates the centre conductor is the circle :math:`\xi = \xi_a` with
    :math:`\cosh\xi_a = (b^2 - a^2 - D^2)/(2aD)`; the potential is linear in :math:`\xi` and
    the field on that circle is largest where it comes nearest the shield:

    .. math:: E_{max} = \frac{V}{a\Lambda}\,\frac{\cosh\xi_a + 1}{\sinh\xi_a}

    (bipolar-coordinate solution of two non-concentric cylinders, Sec. 4.8 of [1]_).
    """
    a, b, d = _as_float(a, b, offset)
    if not np.any(d):
        return np.ones(a.shape)
    # (cosh + 1)/sinh = sqrt((1 + r)/(1 - r)) with r = 1/cosh: neither cosh nor its square,
    # which overflow for an offset many orders of magnitude below the radii
    with np.errstate(divide="ignore", invalid="ignore"):  # only for D >= b - a (invalid)
        r = 2.0 * a * d / (b * b - a * a - d * d)
        g = np.sqrt((1.0 + r) / np.maximum(1.0 - r, SQRT_ARGUMENT_FLOOR))
    return np.where(d == 0.0, 1.0, g)


def skin_regime_loss_factor(factor, resistance, dc_resistance):
    r"""Wheeler's loss factor of an offset line blended from DC to the skin-effect regime [-].

    Parameters
    ----------
    factor : array_like
        Wheeler's factor of the conductor, :math:`F` (:func:`wheeler_loss_factors`) [-].
    resistance : array_like
        AC resistance of the conductor in the concentric line, :math:`R(u)` [ohm m^-1].
    dc_resistance : array_like
        Its DC resistance :math:`R_\mathrm{dc}` [ohm m^-1], :math:`\le R`.

    Returns
    -------
    numpy.ndarray
        .. math:: F_\mathrm{eff} = 1 + (F - 1)\left(1 - \frac{R_\mathrm{dc}}{R(u)}\right)

        so that :math:`F_\mathrm{eff}R = R + (F - 1)(R - R_\mathrm{dc})`: Wheeler's factor
        acts on the part of the resistance that the skin effect adds, the uniform DC part is
        left alone. The weight :math:`1 - R_\mathrm{dc}/R` depends on radius over skin depth
        :math:`u = a/\delta` only (for a wire: 0 to order :math:`u^4` at DC, :math:`1 -
        2/u` in the skin-effect regime, Sec. 5.5 of [1]_ of :mod:`cablefam.physics.fields`), so
        the DC resistance is that of the concentric line and the factor tends to Wheeler's
        where Wheeler's rule holds (:math:`\delta \ll a`). In between, where the current
        crowding of the offset line grows with frequency, this blend is a documented rule,
        not a field solution.
    """
    f = np.asarray(factor, dtype=float)
    r = np.asarray(resistance, dtype=float)
    weight = 1.0 - np.minimum(np.asarray(dc_resistance, dtype=float) / r, 1.0)
    return 1.0 + (f - 1.0) * weight
