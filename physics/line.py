r"""Transmission-line parameters of a coax: R, L, G, C and what follows from them.

Geometry symbols (used throughout :mod:`physics`): centre-conductor radius :math:`a`,
dielectric outer radius :math:`b` (= shield inner radius), shield outer radius :math:`c`.
The dielectric is taken as non-magnetic.
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np
from scipy.constants import epsilon_0, mu_0, speed_of_light

from cablefam.physics.eccentricity import geometry_factor, wheeler_loss_factors
from cablefam.physics.internal_impedance import tube_internal_impedance, wire_internal_impedance
from cablefam.physics.stranding import (stranded_dc_resistance, stranded_effective_radius,
                               stranded_skin_effect_factor)


class LineParameters(NamedTuple):
    """Per-unit-length parameters of a line; arrays of a common shape."""

    r: np.ndarray
    """Series resistance, centre conductor + shield [ohm m^-1]."""
    l: np.ndarray  # noqa: E741 - the symbol of the trade
    """Series inductance, external + internal [H m^-1]."""
    g: np.ndarray
    """Shunt conductance [S m^-1]."""
    c: np.ndarray
    """Shunt capacitance [F m^-1]."""
    r_inner: np.ndarray
    """Resistance of the centre conductor alone [ohm m^-1]."""
    r_shield: np.ndarray
    """Resistance of the shield alone [ohm m^-1]."""


def capacitance(a, b, relative_permittivity, offset=0.0):
    r"""Capacitance per unit length, :math:`C = 2\pi\varepsilon_0\varepsilon_r/\ln(b/a)` [F m^-1].

    Parameters
    ----------
    a, b : array_like
        Centre-conductor radius and dielectric outer radius [m], ``b > a``.
    relative_permittivity : array_like
        :math:`\varepsilon_r` of the dielectric [-].
    offset : array_like, optional
        Eccentricity of the centre conductor [m]; :math:`\ln(b/a)` becomes the arccosh form
        of :func:`cablefam.physics.eccentricity.geometry_factor`.

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012, Table 2.1.
    """
    return 2.0 * np.pi * epsilon_0 * np.asarray(relative_permittivity, dtype=float) / (
        geometry_factor(a, b, offset))


def inductance_external(a, b, offset=0.0):
    r"""External inductance per unit length, :math:`L_e = \mu_0 \ln(b/a) / (2\pi)` [H m^-1].

    With an ``offset`` [m] of the centre conductor, :math:`\ln(b/a)` becomes the arccosh form
    of :func:`cablefam.physics.eccentricity.geometry_factor`.

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012, Table 2.1.
    """
    return mu_0 / (2.0 * np.pi) * geometry_factor(a, b, offset)


def conductance(capacitance_f_per_m, frequency, loss_tangent):
    r"""Shunt conductance from the loss tangent, :math:`G = \omega C \tan\delta` [S m^-1].

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012, Sec. 2.1 (lossy dielectric).
    """
    return 2.0 * np.pi * np.asarray(frequency, dtype=float) * capacitance_f_per_m * np.asarray(
        loss_tangent, dtype=float)


def line_parameters(a, b, c, frequency, inner_resistivity, shield_resistivity,
                    relative_permittivity, loss_tangent, inner_relative_permeability=1.0,
                    shield_relative_permeability=1.0, method="auto", offset=0.0,
                    inner_strands=1):
    r"""R, L, G, C of a coax at frequency :math:`f`, with exact conductor internal impedance.

    Parameters
    ----------
    a, b, c : array_like
        Centre-conductor radius, dielectric radius, shield outer radius [m], ``a < b < c``.
    frequency : array_like
        Frequency [Hz], > 0.
    inner_resistivity, shield_resistivity : array_like
        Resistivities of centre conductor and shield at their temperatures [ohm m].
    relative_permittivity, loss_tangent : array_like
        Dielectric constants [-].
    inner_relative_permeability, shield_relative_permeability : array_like, optional
        Relative permeabilities of the conductors [-].
    method : {"auto", "exact", "asymptotic"}
        Passed to the internal-impedance functions.
    offset : array_like, optional
        Eccentricity of the centre conductor [m]: external L and C from the arccosh form,
        internal impedances times Wheeler's per-conductor factors
        (:func:`cablefam.physics.eccentricity.wheeler_loss_factors`; skin-effect regime).
    inner_strands : array_like of int, optional
        Strand count of the centre conductor (1, 7, 19, 37; ``a`` is then its overall
        radius): external L and C use the effective radius of
        :func:`cablefam.physics.stranding.stranded_effective_radius`; the internal impedance is that of
        a solid wire of the overall radius times the stranding skin-effect factor, its
        resistance never below the DC resistance of the strands.

    Returns
    -------
    LineParameters
        ``r`` [ohm m^-1], ``l`` [H m^-1], ``g`` [S m^-1], ``c`` [F m^-1] and the split of ``r``.

    Notes
    -----
    .. math::
        R + j\omega L = Z_{i,\mathrm{wire}}(a) + Z_{i,\mathrm{tube}}(b, c)
                        + j\omega\frac{\mu_0}{2\pi}\ln\frac{b}{a}, \qquad
        G + j\omega C = (\tan\delta + j)\,\omega\frac{2\pi\varepsilon_0\varepsilon_r}{\ln(b/a)}

    (Sec. IV of [1]_).

    References
    ----------
    .. [1] S. A. Schelkunoff, *Bell Syst. Tech. J.* 13 (1934) 532-579.
    """
    (a, b, c, frequency, inner_resistivity, shield_resistivity, relative_permittivity,
     loss_tangent) = np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in (
         a, b, c, frequency, inner_resistivity, shield_resistivity, relative_permittivity,
         loss_tangent)))
    omega = 2.0 * np.pi * frequency
    z_inner = wire_internal_impedance(a, inner_resistivity, frequency,
                                      inner_relative_permeability, method=method)
    z_shield = tube_internal_impedance(b, c, shield_resistivity, frequency,
                                       shield_relative_permeability, method=method)
    a_ext = a
    if np.any(np.asarray(inner_strands) != 1):
        a_ext = stranded_effective_radius(a, inner_strands)
        r_dc = stranded_dc_resistance(a, inner_strands, inner_resistivity)
        z_inner = z_inner * stranded_skin_effect_factor(inner_strands)
        z_inner = np.maximum(z_inner.real, r_dc) + 1j * z_inner.imag
    if np.any(offset):
        f_inner, f_shield = wheeler_loss_factors(a_ext, b, offset)
        z_inner = z_inner * f_inner
        z_shield = z_shield * f_shield
    cap = capacitance(a_ext, b, relative_permittivity, offset)
    r_inner = z_inner.real
    r_shield = z_shield.real
    ind = inductance_external(a_ext, b, offset) + (z_inner.imag + z_shield.imag) / omega
    g = conductance(cap, frequency, loss_tangent)
    return LineParameters(r=r_inner + r_shield, l=ind, g=g, c=cap,
                          r_inner=r_inner, r_shield=r_shield)


def propagation_constant(r, l, g, c, frequency):  # noqa: E741
    r"""Propagation constant :math:`\gamma = \sqrt{(R + j\omega L)(G + j\omega C)}` [m^-1].

    Returns a complex array: real part the attenuation constant [Np m^-1], imaginary part the
    phase constant [rad m^-1] (Eq. (2.5) of [1]_).

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012.
    """
    omega = 2.0 * np.pi * np.asarray(frequency, dtype=float)
    return np.sqrt((r + 1j * omega * l) * (g + 1j * omega * c))


def characteristic_impedance(r, l, g, c, frequency):  # noqa: E741
    r"""Complex characteristic impedance :math:`Z_0 = \sqrt{(R + j\omega L)/(G + j\omega C)}`.

    Returns a complex array [ohm], computed as :math:`\gamma/(G + j\omega C)` so that the
    branch of the root is that of :func:`propagation_constant` (Eq. (2.7) of [1]_).

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012.
    """
    omega = 2.0 * np.pi * np.asarray(frequency, dtype=float)
    return propagation_constant(r, l, g, c, frequency) / (g + 1j * omega * c)


def characteristic_impedance_lossless(a, b, relative_permittivity, offset=0.0):
    r"""Lossless characteristic impedance :math:`\sqrt{L_e/C} = \eta_0\ln(b/a)/(2\pi\sqrt{\varepsilon_r})` [ohm].

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012, Table 2.1.
    """
    eta_0 = mu_0 * speed_of_light
    return eta_0 / (2.0 * np.pi * np.sqrt(np.asarray(relative_permittivity, dtype=float))) * (
        geometry_factor(a, b, offset))


def attenuation_split(alpha, r, g, z0_lossless):
    r"""Split the attenuation constant into its conductor and dielectric parts.

    Parameters
    ----------
    alpha : array_like
        Total attenuation constant :math:`\mathrm{Re}\,\gamma` [Np m^-1] (exact RLGC value).
    r, g : array_like
        Series resistance [ohm m^-1] and shunt conductance [S m^-1].
    z0_lossless : array_like
        :math:`\sqrt{L/C}` [ohm].

    Returns
    -------
    tuple of numpy.ndarray
        ``(alpha_conductor, alpha_dielectric)`` [Np m^-1], summing exactly to ``alpha``.

    Notes
    -----
    The low-loss parts :math:`\alpha_c \approx R/(2Z_0)` and :math:`\alpha_d \approx GZ_0/2`
    (Sec. 2.7 of [1]_) set the proportions in which the exact total is shared; the split of
    a lossy line is not unique beyond that first order.

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012.
    """
    a_c = np.asarray(r) / (2.0 * z0_lossless)
    a_d = np.asarray(g) * z0_lossless / 2.0
    total = a_c + a_d
    share_c = np.divide(a_c, total, out=np.zeros(np.shape(total)), where=total > 0)
    return alpha * share_c, alpha * (1.0 - share_c)


def velocity_factor(beta, frequency):
    r"""Phase velocity over the speed of light, :math:`v_p/c_0 = \omega/(\beta c_0)` [-]."""
    return 2.0 * np.pi * np.asarray(frequency, dtype=float) / (np.asarray(beta) * speed_of_light)


def delay_per_metre(beta, frequency):
    r"""Phase delay per unit length, :math:`\beta/\omega` [s m^-1]."""
    return np.asarray(beta) / (2.0 * np.pi * np.asarray(frequency, dtype=float))
