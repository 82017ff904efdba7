r"""What follows from the per-unit-length parameters R, L, G, C of any transmission line.

Propagation constant, characteristic impedance, the split of the attenuation into its
conductor and dielectric parts, velocity and delay. The parameters of a coax come from
:mod:`cablefam.physics.line` (which re-exports these functions).
"""

from __future__ import annotations

import numpy as np

from cablefam.physics.constants import speed_of_light


def propagation_constant(r, l, g, c, frequency):  # noqa: E741
    r"""Propagation constant :math:`\gamma = \sqrt{(R + j\omega L)(G + j\omega C)}` [m^-1].

    Returns a complex array: real part the attenuation constant [Np m^-1], imaginary part the
    phase constant [rad m^-1] (Eq. (2.5) of [1]_).

    Notes
    -----
    The principal root of :math:`w = u + jv = (R + jX)(G + jB)`, :math:`X = \omega L`,
    :math:`B = \omega C`, is taken in real arithmetic without cancellation: with
    :math:`t = \sqrt{(|w| + |u|)/2}`,

    .. math:: \sqrt w = t + j\frac{v}{2t}\ (u \ge 0), \qquad
              \sqrt w = \frac{|v|}{2t} + j\,\mathrm{sgn}(v)\,t\ (u < 0)

    (the second is the case of every line: :math:`u \approx -\omega^2LC`), so that the small
    attenuation constant keeps its relative accuracy (Sec. 5.4 of [2]_).

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012.
    .. [2] W. Kahan, "Branch cuts for complex elementary functions", in *The State of the Art
       in Numerical Analysis*, Clarendon Press, 1987, 165-211.
    """
    omega = 2.0 * np.pi * np.asarray(frequency, dtype=float)
    r, l, g, c = (np.asarray(x, dtype=float) for x in (r, l, g, c))  # noqa: E741
    x = omega * l
    b = omega * c
    u = r * g - x * b
    v = r * b + x * g
    t = np.sqrt(0.5 * (np.sqrt(u * u + v * v) + np.abs(u)))
    half_v = np.divide(0.5 * v, t, out=np.zeros(np.shape(t)), where=t > 0.0)
    negative = u < 0.0
    out = np.empty(np.shape(t), dtype=complex)
    out.real = np.where(negative, np.abs(half_v), t)
    out.imag = np.where(negative, np.copysign(t, v), half_v)
    return out


def characteristic_impedance(r, l, g, c, frequency, gamma=None):  # noqa: E741
    r"""Complex characteristic impedance :math:`Z_0 = \sqrt{(R + j\omega L)/(G + j\omega C)}`.

    Returns a complex array [ohm], computed as :math:`\gamma/(G + j\omega C)` so that the
    branch of the root is that of :func:`propagation_constant` (Eq. (2.7) of [1]_); pass
    ``gamma`` [m^-1] when it is computed already.

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012.
    """
    omega = 2.0 * np.pi * np.asarray(frequency, dtype=float)
    if gamma is None:
        gamma = propagation_constant(r, l, g, c, frequency)
    return gamma / (g + 1j * omega * c)


def characteristic_impedance_modulus(r, l, g, c, frequency):  # noqa: E741
    r"""Modulus of the characteristic impedance, :math:`|Z_0|` [ohm], in real arithmetic.

    .. math:: |Z_0| = \sqrt{\frac{|R + j\omega L|}{|G + j\omega C|}}
              = \left(\frac{R^2 + \omega^2L^2}{G^2 + \omega^2C^2}\right)^{1/4}

    the modulus of :func:`characteristic_impedance` (Eq. (2.7) of [1]_) without complex
    square roots; equal to it to rounding (per-unit-length parameters of real lines are far
    from over- or underflow when squared).

    References
    ----------
    .. [1] D. M. Pozar, *Microwave Engineering*, 4th ed., Wiley, 2012.
    """
    omega = 2.0 * np.pi * np.asarray(frequency, dtype=float)
    x = omega * l
    b = omega * c
    return np.sqrt(np.sqrt((r * r + x * x) / (g * g + b * b)))


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
