r"""Sensitivity of a coax's characteristic impedance and conductor attenuation to its dimensions.

Analytic first derivatives of the lossless characteristic impedance

.. math::
    Z_0 = K\Lambda, \qquad K = \frac{\eta_0}{2\pi\sqrt{\varepsilon_r}}, \qquad
    \Lambda = \operatorname{arccosh}X, \qquad X = \frac{a^2 + b^2 - D^2}{2ab}

(:mod:`cablefam.physics.eccentricity`; :math:`\Lambda = \ln(b/a)` at :math:`D = 0`) and of the
skin-effect conductor attenuation :math:`\alpha_c = R/(2Z_0)`, with respect to the
centre-conductor radius :math:`a`, the dielectric radius :math:`b`, the offset :math:`D` of the
centre conductor and the relative permittivity :math:`\varepsilon_r`. The manufacturing spread
of each of these maps to a spread of :math:`Z_0` through these derivatives (first-order error
propagation), and the derivatives point a design away from the edge of its tolerance band.

The derivatives of :math:`\Lambda` itself are those of
:func:`cablefam.physics.eccentricity.geometry_factor_gradient` and
:func:`cablefam.physics.eccentricity.geometry_factor_curvature` (re-exported here).

References
----------
.. [1] S. Ramo, J. R. Whinnery, T. Van Duzer, *Fields and Waves in Communication
   Electronics*, 3rd ed., Wiley, 1994, Sec. 4.8 (two non-concentric circles).
.. [2] H. A. Wheeler, "Formulas for the skin effect", *Proc. IRE* 30 (1942) 412-424
   (incremental-inductance rule).
.. [3] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012, Sec. 2.7 (perturbation
   method for attenuation, :math:`\alpha_c = R/(2Z_0)`) and Table 2.1 (coaxial line).
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np

from cablefam.physics import _checks
from cablefam.physics.eccentricity import (GeometryGradient, geometry_factor,  # noqa: F401
                                           geometry_factor_curvature, geometry_factor_gradient,
                                           geometry_factor_offset_slope)
from cablefam.physics.line import impedance_per_geometry_factor


class ImpedanceSensitivity(NamedTuple):
    """Derivatives of the lossless characteristic impedance; arrays of a common shape."""

    dz0_da: np.ndarray
    """dZ0/da, centre-conductor radius [ohm m^-1]."""
    dz0_db: np.ndarray
    """dZ0/db, dielectric (shield inner) radius [ohm m^-1]."""
    dz0_deps: np.ndarray
    """dZ0/d(eps_r), relative permittivity [ohm]."""
    dz0_doffset: np.ndarray
    """dZ0/dD, offset of the centre conductor [ohm m^-1]."""


class AttenuationSensitivity(NamedTuple):
    """Derivatives of the skin-effect conductor attenuation; arrays of a common shape."""

    dalpha_da: np.ndarray
    """d(alpha_c)/da [Np m^-1 per m]."""
    dalpha_db: np.ndarray
    """d(alpha_c)/db [Np m^-1 per m]."""
    dalpha_deps: np.ndarray
    """d(alpha_c)/d(eps_r) [Np m^-1]."""
    dalpha_doffset: np.ndarray
    """d(alpha_c)/dD [Np m^-1 per m]."""


def resistance_skin_effect_eccentric(a, b, surface_resistance_inner,
                                     surface_resistance_shield, offset=0.0):
    r"""Skin-effect series resistance of a coax with an offset centre conductor [ohm m^-1].

    Parameters
    ----------
    a, b : array_like
        Centre-conductor radius and dielectric (shield inner) radius [m], ``0 < a < b``.
    surface_resistance_inner, surface_resistance_shield : array_like
        Surface resistances :math:`R_{s,i}`, :math:`R_{s,s}` of the two conductors [ohm]
        (:func:`cablefam.physics.skin.surface_resistance`).
    offset : array_like, optional
        Axis offset :math:`D` [m], ``|D| < b - a``.

    Returns
    -------
    numpy.ndarray
        :math:`R` [ohm m^-1], centre conductor plus shield.

    Notes
    -----
    Wheeler's incremental-inductance rule [1]_ applied to each conductor separately (each
    surface recedes by half its own skin depth, the circles keeping their centres):

    .. math::
        R = \frac{R_{s,i}}{2\pi}\left(-\frac{\partial\Lambda}{\partial a}\right)
          + \frac{R_{s,s}}{2\pi}\frac{\partial\Lambda}{\partial b}

    which is :math:`R_{s,i}/(2\pi a) + R_{s,s}/(2\pi b)` at :math:`D = 0` (Table 2.1 of
    [2]_) and, for equal surface resistances, that times
    :func:`cablefam.physics.eccentricity.wheeler_loss_factor`. Skin-effect regime only: valid where
    the skin depth is small against :math:`a` and against the narrowest gap
    :math:`b - a - D`.

    References
    ----------
    .. [1] H. A. Wheeler, "Formulas for the skin effect", *Proc. IRE* 30 (1942) 412-424.
    .. [2] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012.
    """
    grad = geometry_factor_gradient(a, b, offset)
    rs_i = np.asarray(surface_resistance_inner, dtype=float)
    rs_s = np.asarray(surface_resistance_shield, dtype=float)
    return (-rs_i * grad.d_da + rs_s * grad.d_db) / (2.0 * np.pi)


def attenuation_conductor_skin_effect(a, b, surface_resistance_inner,
                                      surface_resistance_shield, relative_permittivity,
                                      offset=0.0):
    r"""Skin-effect conductor attenuation :math:`\alpha_c = R/(2Z_0)` [Np m^-1].

    Parameters
    ----------
    a, b : array_like
        Centre-conductor radius and dielectric (shield inner) radius [m], ``0 < a < b``.
    surface_resistance_inner, surface_resistance_shield : array_like
        Surface resistances of the two conductors [ohm].
    relative_permittivity : array_like
        :math:`\varepsilon_r` of the dielectric [-], > 0.
    offset : array_like, optional
        Axis offset :math:`D` [m], ``|D| < b - a``.

    Returns
    -------
    numpy.ndarray
        :math:`\alpha_c` [Np m^-1].

    Notes
    -----
    .. math::
        \alpha_c = \frac{R}{2Z_0}, \qquad Z_0 = K\Lambda, \qquad
        K = \frac{\eta_0}{2\pi\sqrt{\varepsilon_r}}

    with :math:`R` from :func:`resistance_skin_effect_eccentric` (low-loss perturbation
    result, Sec. 2.7 of [1]_). At :math:`D = 0`:
    :math:`\alpha_c = \sqrt{\varepsilon_r}\,(R_{s,i}/a + R_{s,s}/b)/(2\eta_0\ln(b/a))`.
    Skin-effect regime only (skin depth small against both radii); the exact line model is
    :mod:`cablefam.physics.line`.

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012.
    """
    a, b, d = _checks.coax_radii(a, b, offset)
    eps = _checks.positive("relative_permittivity", relative_permittivity)
    r = resistance_skin_effect_eccentric(a, b, surface_resistance_inner,
                                         surface_resistance_shield, d)
    return r / (2.0 * impedance_per_geometry_factor(eps) * geometry_factor(a, b, d))


def impedance_sensitivity(a, b, relative_permittivity, offset=0.0):
    r"""Derivatives of the lossless characteristic impedance of a (possibly eccentric) coax.

    Parameters
    ----------
    a, b : array_like
        Centre-conductor radius and dielectric (shield inner) radius [m], ``0 < a < b``.
    relative_permittivity : array_like
        :math:`\varepsilon_r` of the dielectric [-], > 0.
    offset : array_like, optional
        Axis offset :math:`D` [m], ``|D| < b - a``; derivative taken for :math:`D \ge 0`.

    Returns
    -------
    ImpedanceSensitivity
        ``dz0_da`` [ohm m^-1], ``dz0_db`` [ohm m^-1], ``dz0_deps`` [ohm],
        ``dz0_doffset`` [ohm m^-1].

    Raises
    ------
    ValueError
        For a design outside ``0 < a < b``, ``|offset| < b - a``, or ``eps_r <= 0``.

    Notes
    -----
    With :math:`Z_0 = K\Lambda`, :math:`K = \eta_0/(2\pi\sqrt{\varepsilon_r})` and the
    derivatives of :math:`\Lambda` of :func:`geometry_factor_gradient`:

    .. math::
        \frac{\partial Z_0}{\partial a} = K\frac{a^2 - b^2 + D^2}{a\sqrt{P}}, \quad
        \frac{\partial Z_0}{\partial b} = K\frac{b^2 - a^2 + D^2}{b\sqrt{P}}, \quad
        \frac{\partial Z_0}{\partial D} = \frac{-2KD}{\sqrt{P}}, \quad
        \frac{\partial Z_0}{\partial\varepsilon_r} = -\frac{Z_0}{2\varepsilon_r}

    At :math:`D = 0` these are :math:`-K/a`, :math:`K/b`, 0 and :math:`-Z_0/(2\varepsilon_r)`
    (the derivatives of :math:`K\ln(b/a)`, Table 2.1 of [1]_); the offset enters to second
    order only, :math:`Z_0 \approx K(\ln(b/a) - D^2/(b^2 - a^2))`. Eccentric form: Sec. 4.8
    of [2]_.

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012.
    .. [2] S. Ramo, J. R. Whinnery, T. Van Duzer, *Fields and Waves in Communication
       Electronics*, 3rd ed., Wiley, 1994.
    """
    a, b, d = _checks.coax_radii(a, b, offset)
    eps = _checks.positive("relative_permittivity", relative_permittivity)
    a, b, d, eps = np.broadcast_arrays(a, b, d, eps)
    k = impedance_per_geometry_factor(eps)
    grad = geometry_factor_gradient(a, b, d)
    z0 = k * geometry_factor(a, b, d)
    return ImpedanceSensitivity(dz0_da=k * grad.d_da, dz0_db=k * grad.d_db,
                                dz0_deps=-z0 / (2.0 * eps), dz0_doffset=k * grad.d_doffset)


def impedance_offset_sensitivity(a, b, relative_permittivity, offset=0.0):
    r"""Derivative of the lossless :math:`Z_0` by the squared offset.

    Parameters as in :func:`impedance_sensitivity` (same checks).

    Returns
    -------
    numpy.ndarray
        :math:`\partial Z_0/\partial(D^2) = K\,\partial\Lambda/\partial(D^2) = -K/\sqrt P`
        [ohm m^-2] (:func:`cablefam.physics.eccentricity.geometry_factor_offset_slope`);
        :math:`-K/(b^2-a^2)` at :math:`D = 0`, where :math:`\partial Z_0/\partial D` vanishes
        and the offset acts through :math:`D^2` only. First-order propagation of a random
        offset of two normal axes uses it with :math:`E\,D^2` and :math:`\mathrm{Var}\,D^2`.
    """
    a, b, d = _checks.coax_radii(a, b, offset)
    eps = _checks.positive("relative_permittivity", relative_permittivity)
    return impedance_per_geometry_factor(eps) * geometry_factor_offset_slope(a, b, d)


def attenuation_sensitivity(a, b, surface_resistance_inner, surface_resistance_shield,
                            relative_permittivity, offset=0.0):
    r"""Derivatives of the skin-effect conductor attenuation :math:`\alpha_c = R/(2Z_0)`.

    Parameters
    ----------
    a, b : array_like
        Centre-conductor radius and dielectric (shield inner) radius [m], ``0 < a < b``.
    surface_resistance_inner, surface_resistance_shield : array_like
        Surface resistances of the two conductors [ohm] (held fixed: in the skin-effect
        regime they depend on material and frequency only, not on the radii).
    relative_permittivity : array_like
        :math:`\varepsilon_r` of the dielectric [-], > 0.
    offset : array_like, optional
        Axis offset :math:`D` [m], ``|D| < b - a``; derivative taken for :math:`D \ge 0`.

    Returns
    -------
    AttenuationSensitivity
        ``dalpha_da``, ``dalpha_db``, ``dalpha_doffset`` [Np m^-1 per m] and
        ``dalpha_deps`` [Np m^-1].

    Notes
    -----
    Skin-effect regime (skin depth small against both radii and the narrowest gap): the
    derivatives are those of :func:`attenuation_conductor_skin_effect`,

    .. math::
        R = \frac{1}{2\pi}\left(-R_{s,i}\Lambda_a + R_{s,s}\Lambda_b\right), \qquad
        \frac{\partial\alpha_c}{\partial x} =
            \alpha_c\left(\frac{R_x}{R} - \frac{\Lambda_x}{\Lambda}\right), \qquad
        \frac{\partial\alpha_c}{\partial\varepsilon_r} = \frac{\alpha_c}{2\varepsilon_r}

    for :math:`x \in \{a, b, D\}`, with the second derivatives of :math:`\Lambda` taken
    analytically from :math:`\Lambda_a = N_a/(a\sqrt P)`, :math:`\Lambda_b = N_b/(b\sqrt P)`,
    :math:`N_a = a^2 - b^2 + D^2`, :math:`N_b = b^2 - a^2 + D^2`. The resistance of the
    offset line is Wheeler's rule [1]_ per conductor, so the offset derivative holds for any
    :math:`D`, not only at :math:`D = 0` (where it vanishes by symmetry). At :math:`D = 0`:

    .. math::
        \frac{\partial\alpha_c}{\partial a} = \frac{1}{2K\ln(b/a)}\left(
            -\frac{R_{s,i}}{2\pi a^2} + \frac{R}{a\ln(b/a)}\right), \qquad
        \frac{\partial\alpha_c}{\partial b} = \frac{1}{2K\ln(b/a)}\left(
            -\frac{R_{s,s}}{2\pi b^2} - \frac{R}{b\ln(b/a)}\right)

    (perturbation method, Sec. 2.7 of [2]_).

    References
    ----------
    .. [1] H. A. Wheeler, "Formulas for the skin effect", *Proc. IRE* 30 (1942) 412-424.
    .. [2] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012.
    """
    a, b, d = _checks.coax_radii(a, b, offset)
    eps = _checks.positive("relative_permittivity", relative_permittivity)
    rs_i = np.asarray(surface_resistance_inner, dtype=float)
    rs_s = np.asarray(surface_resistance_shield, dtype=float)
    a, b, d, eps, rs_i, rs_s = np.broadcast_arrays(a, b, d, eps, rs_i, rs_s)
    la, lb, ld = geometry_factor_gradient(a, b, d)
    laa, lab, lbb, lad, lbd = geometry_factor_curvature(a, b, d)
    lam = geometry_factor(a, b, d)
    rho_i = rs_i / (2.0 * np.pi)
    rho_s = rs_s / (2.0 * np.pi)
    two_k = 2.0 * impedance_per_geometry_factor(eps)
    two_z0 = two_k * lam
    r = -rho_i * la + rho_s * lb
    alpha = r / two_z0
    r_a = -rho_i * laa + rho_s * lab
    r_b = -rho_i * lab + rho_s * lbb
    r_d = -rho_i * lad + rho_s * lbd
    return AttenuationSensitivity(
        dalpha_da=(r_a - alpha * two_k * la) / two_z0,
        dalpha_db=(r_b - alpha * two_k * lb) / two_z0,
        dalpha_deps=alpha / (2.0 * eps),
        dalpha_doffset=(r_d - alpha * two_k * ld) / two_z0,
    )
