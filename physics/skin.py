"""Skin depth and surface resistance of a good conductor."""

from __future__ import annotations

import numpy as np

from cablefam.physics.constants import mu_0


def skin_depth(resistivity, frequency, relative_permeability=1.0):
    r"""Skin depth of a good conductor.

    Parameters
    ----------
    resistivity : array_like
        Resistivity :math:`\rho` [ohm m].
    frequency : array_like
        Frequency :math:`f` [Hz], > 0.
    relative_permeability : array_like, optional
        Relative permeability :math:`\mu_r` [-].

    Returns
    -------
    numpy.ndarray
        Skin depth :math:`\delta` [m].

    Notes
    -----
    .. math:: \delta = \sqrt{\frac{\rho}{\pi f \mu_0 \mu_r}}

    (Eq. 5.12 in [1]_; Sec. 9.4 of [2]_).

    References
    ----------
    .. [1] S. Ramo, J. R. Whinnery, T. Van Duzer, *Fields and Waves in Communication
       Electronics*, 3rd ed., Wiley, 1994, Sec. 5.4.
    .. [2] S. A. Schelkunoff, "The electromagnetic theory of coaxial transmission lines and
       cylindrical shields", *Bell Syst. Tech. J.* 13 (1934) 532-579.
    """
    rho = np.asarray(resistivity, dtype=float)
    f = np.asarray(frequency, dtype=float)
    return np.sqrt(rho / (np.pi * f * mu_0 * np.asarray(relative_permeability, dtype=float)))


def surface_resistance(resistivity, frequency, relative_permeability=1.0):
    r"""Surface resistance of a good conductor, thick compared to its skin depth.

    Parameters
    ----------
    resistivity : array_like
        Resistivity :math:`\rho` [ohm m].
    frequency : array_like
        Frequency [Hz], > 0.
    relative_permeability : array_like, optional
        Relative permeability [-].

    Returns
    -------
    numpy.ndarray
        :math:`R_s = \rho/\delta = \sqrt{\pi f \mu_0 \mu_r \rho}` [ohm] (per square).

    References
    ----------
    .. [1] Ramo, Whinnery, Van Duzer, *Fields and Waves in Communication Electronics*,
       3rd ed., Wiley, 1994, Eq. 5.13(4).
    """
    return np.asarray(resistivity, dtype=float) / skin_depth(
        resistivity, frequency, relative_permeability
    )
