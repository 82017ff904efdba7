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

import numpy as np


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


def wheeler_loss_factor(a, b, offset=0.0):
    r"""Conductor-loss factor of an offset line over the concentric one, :math:`\ge 1` [-].

    .. math::
        F = \frac{-\partial\Lambda/\partial a + \partial\Lambda/\partial b}{1/a + 1/b},
        \quad \frac{\partial\Lambda}{\partial a} = \frac{a^2 - b^2 + D^2}{2a^2 b\,s},
        \quad \frac{\partial\Lambda}{\partial b} = \frac{b^2 - a^2 + D^2}{2ab^2\,s},
        \quad s = \sqrt{X^2 - 1}

    with :math:`X = (a^2+b^2-D^2)/(2ab)`; Wheeler's rule [3]_ applied to :math:`\Lambda`
    (same surface resistance on both conductors). :math:`F = 1` at :math:`D = 0`.
    Multiply the skin-effect resistance of the concentric line by it; valid where the skin
    depth is small against both radii (an upper bound of the increase otherwise).
    """
    a, b, d = _as_float(a, b, offset)
    x = (a * a + b * b - d * d) / (2.0 * a * b)
    s = np.sqrt(np.maximum(x * x - 1.0, 1e-300))
    d_da = (a * a - b * b + d * d) / (2.0 * a * a * b * s)
    d_db = (b * b - a * a + d * d) / (2.0 * a * b * b * s)
    f = (-d_da + d_db) / (1.0 / a + 1.0 / b)
    return np.where(d == 0.0, 1.0, f)


def characteristic_impedance_eccentric(a, b, offset, relative_permittivity):
    r"""Lossless characteristic impedance of an eccentric coax,
    :math:`\eta_0\Lambda/(2\pi\sqrt{\varepsilon_r})` [ohm] (see the module notes)."""
    from scipy.constants import mu_0, speed_of_light

    eta_0 = mu_0 * speed_of_light
    return eta_0 / (2.0 * np.pi * np.sqrt(np.asarray(relative_permittivity, dtype=float))) * (
        geometry_factor(a, b, offset))


def wheeler_loss_factors(a, b, offset=0.0):
    r"""Per-conductor loss factors of an offset line, ``(inner, shield)``, each 1 at D = 0.

    .. math:: F_a = -a\,\frac{\partial\Lambda}{\partial a}, \qquad
              F_b = b\,\frac{\partial\Lambda}{\partial b}

    (Wheeler's rule [3]_ per conductor, so that different metals keep their own surface
    resistance). Multiply each conductor's skin-effect internal impedance by its factor.
    """
    a, b, d = _as_float(a, b, offset)
    if not np.any(d):
        one = np.ones(a.shape)
        return one, one
    x = (a * a + b * b - d * d) / (2.0 * a * b)
    s = np.sqrt(np.maximum(x * x - 1.0, 1e-300))
    f_a = -(a * a - b * b + d * d) / (2.0 * a * b * s)
    f_b = (b * b - a * a + d * d) / (2.0 * a * b * s)
    return np.where(d == 0.0, 1.0, f_a), np.where(d == 0.0, 1.0, f_b)


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
    with np.errstate(divide="ignore", invalid="ignore"):
        ch = (b * b - a * a - d * d) / (2.0 * a * d)
        g = (ch + 1.0) / np.sqrt(np.maximum(ch * ch - 1.0, 1e-300))
    return np.where(d == 0.0, 1.0, g)
