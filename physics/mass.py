r"""Mass, material cost, outer diameter and DC loop resistance of a coax, per metre.

Geometry: centre-conductor radius :math:`a`, dielectric outer radius :math:`b`, shield outer
radius :math:`c`, jacket outer radius :math:`d` (:math:`d = c`: no jacket). Every layer is a
full solid annulus; a braid or a foamed dielectric enters through an effective density.
Everything is per metre; :func:`cablefam.physics.units.per_m_to_per_km` converts.
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np

from cablefam.physics.internal_impedance import tube_dc_resistance, wire_dc_resistance


class LayerMasses(NamedTuple):
    """Mass per unit length of each layer and in total [kg m^-1]; arrays of a common shape."""

    inner: np.ndarray
    """Centre conductor [kg m^-1]."""
    dielectric: np.ndarray
    """Dielectric [kg m^-1]."""
    shield: np.ndarray
    """Shield [kg m^-1]."""
    jacket: np.ndarray
    """Jacket, 0 where there is none [kg m^-1]."""
    total: np.ndarray
    """Sum of the four [kg m^-1]."""


def _annulus_area(inner_radius, outer_radius):
    return np.pi * (outer_radius * outer_radius - inner_radius * inner_radius)


def layer_masses(a, b, c, d, inner_density, dielectric_density, shield_density, jacket_density):
    r"""Mass per unit length of the four layers of a coax.

    Parameters
    ----------
    a, b, c, d : array_like
        Radii [m], ``0 < a < b < c <= d``.
    inner_density, dielectric_density, shield_density : array_like
        Densities of the centre conductor, dielectric and shield [kg m^-3].
    jacket_density : array_like
        Density of the jacket [kg m^-3]; not used (any value, NaN too) where ``d == c``.

    Returns
    -------
    LayerMasses
        ``inner``, ``dielectric``, ``shield``, ``jacket``, ``total`` [kg m^-1], broadcast
        shape of the inputs.

    Notes
    -----
    Area of each cross-section times its density:

    .. math::
        m_i = \rho_i\pi a^2,\quad m_d = \rho_d\pi(b^2 - a^2),\quad
        m_s = \rho_s\pi(c^2 - b^2),\quad m_j = \rho_j\pi(d^2 - c^2)
    """
    a, b, c, d, rho_i, rho_d, rho_s, rho_j = np.broadcast_arrays(*(
        np.asarray(x, dtype=float) for x in (a, b, c, d, inner_density, dielectric_density,
                                             shield_density, jacket_density)))
    inner = rho_i * np.pi * a * a
    dielectric = rho_d * _annulus_area(a, b)
    shield = rho_s * _annulus_area(b, c)
    jacket = np.where(d > c, rho_j, 0.0) * _annulus_area(c, d)
    return LayerMasses(inner, dielectric, shield, jacket, inner + dielectric + shield + jacket)


def material_cost(masses: LayerMasses, inner_price, dielectric_price, shield_price,
                  jacket_price):
    r"""Material cost per unit length: each layer's mass times its price per kilogram.

    Parameters
    ----------
    masses : LayerMasses
        From :func:`layer_masses` [kg m^-1].
    inner_price, dielectric_price, shield_price, jacket_price : array_like
        Prices of the materials [currency kg^-1]; ``jacket_price`` is not used (any value, NaN
        too) where the jacket mass is 0.

    Returns
    -------
    numpy.ndarray
        :math:`\sum_k m_k p_k` [currency m^-1].
    """
    jacket_cost = masses.jacket * np.where(masses.jacket > 0.0,
                                           np.asarray(jacket_price, dtype=float), 0.0)
    return (masses.inner * np.asarray(inner_price, dtype=float)
            + masses.dielectric * np.asarray(dielectric_price, dtype=float)
            + masses.shield * np.asarray(shield_price, dtype=float) + jacket_cost)


def dc_loop_resistance(a, b, c, inner_resistivity, shield_resistivity):
    r"""DC resistance per unit length of the loop centre conductor + shield.

    Parameters
    ----------
    a, b, c : array_like
        Radii [m], ``0 < a < b < c``.
    inner_resistivity, shield_resistivity : array_like
        Resistivities of the centre conductor and the shield [ohm m].

    Returns
    -------
    numpy.ndarray
        :math:`R_{loop}` [ohm m^-1].

    Notes
    -----
    .. math:: R_{loop} = \frac{\rho_i}{\pi a^2} + \frac{\rho_s}{\pi(c^2 - b^2)}

    the d.c. resistance :math:`R = \rho/A` of each conductor (clause 2.1.1 of [1]_) in series.

    References
    ----------
    .. [1] IEC 60287-1-1:2006+AMD1:2014, clause 2.1.1.
    """
    return wire_dc_resistance(a, inner_resistivity) + tube_dc_resistance(b, c,
                                                                           shield_resistivity)


def outer_diameter(d):
    r"""Outer diameter of the cable, :math:`D_e = 2d` [m], from the outermost radius [m]."""
    return 2.0 * np.asarray(d, dtype=float)
