r"""IEC 60287 thermal resistances of a coax: dielectric and jacket (:math:`T_1`, :math:`T_3`) and
free air (:math:`T_4`), with the surface temperature rise they give.

The model that combines them is described in :mod:`cablefam.physics.thermal`.

References
----------
.. [1] IEC 60287-2-1:2015, *Electric cables - Calculation of the current rating - Part 2-1:
   Thermal resistance - Calculation of the thermal resistance*, clauses 4.1.2, 4.1.4 and 4.2.1.
"""

from __future__ import annotations

import numpy as np

#: Constants of :func:`free_air_heat_transfer_coefficient` for a single cable in free air
#: (black surface): IEC 60287-2-1:2015, clause 4.2.1, Table 2, installation "single cable".
FREE_AIR_SINGLE_CABLE_Z = 0.21
FREE_AIR_SINGLE_CABLE_E = 3.94
FREE_AIR_SINGLE_CABLE_G = 0.60


def insulation_thermal_resistance(thermal_resistivity, inner_radius, outer_radius):
    r"""Thermal resistance per unit length of a concentric insulating layer.

    Used for the dielectric (:math:`T_1`, radii :math:`a \ldots b`) and for the jacket
    (:math:`T_3`, radii :math:`c \ldots d`).

    Parameters
    ----------
    thermal_resistivity : array_like
        Thermal resistivity of the layer :math:`\rho_T` [K m W^-1].
    inner_radius, outer_radius : array_like
        Radii :math:`r_i \le r_o` of the layer [m].

    Returns
    -------
    numpy.ndarray
        :math:`T` [K m W^-1]; 0 where ``outer_radius == inner_radius``.

    Notes
    -----
    .. math:: T = \frac{\rho_T}{2\pi}\ln\frac{r_o}{r_i}

    which is :math:`T_1 = \frac{\rho_T}{2\pi}\ln\left(1 + \frac{2t_1}{d_c}\right)` of
    clause 4.1.2 of [1]_ (thickness :math:`t_1 = r_o - r_i`, diameter :math:`d_c = 2r_i`) and
    :math:`T_3 = \frac{\rho_T}{2\pi}\ln\left(1 + \frac{2t_3}{D'_a}\right)` of clause 4.1.4.

    References
    ----------
    .. [1] IEC 60287-2-1:2015, clauses 4.1.2 and 4.1.4.
    """
    return np.asarray(thermal_resistivity, dtype=float) / (2.0 * np.pi) * np.log(
        np.asarray(outer_radius, dtype=float) / np.asarray(inner_radius, dtype=float))


def free_air_heat_transfer_coefficient(outer_diameter, z=FREE_AIR_SINGLE_CABLE_Z,
                                       e=FREE_AIR_SINGLE_CABLE_E, g=FREE_AIR_SINGLE_CABLE_G):
    r"""Heat-transfer coefficient of a cable surface in free air.

    Parameters
    ----------
    outer_diameter : array_like
        External diameter of the cable :math:`D_e^*` [m] (metres, as the constants require).
    z, e, g : array_like, optional
        Constants :math:`Z`, :math:`E`, :math:`g`; the defaults 0.21, 3.94, 0.60 are those of a
        single cable in free air (black surface), Table 2 of [1]_.

    Returns
    -------
    numpy.ndarray
        :math:`h` [W m^-2 K^-5/4].

    Notes
    -----
    .. math:: h = \frac{Z}{(D_e^*)^g} + E

    (clause 4.2.1 of [1]_). It combines convection and radiation from a black surface; solar
    radiation is not included.

    References
    ----------
    .. [1] IEC 60287-2-1:2015, clause 4.2.1 and Table 2.
    """
    return np.asarray(z, dtype=float) / np.asarray(outer_diameter, dtype=float) ** np.asarray(
        g, dtype=float) + np.asarray(e, dtype=float)


def external_thermal_resistance_free_air(outer_diameter, heat_transfer_coefficient,
                                         surface_temperature_rise):
    r"""External thermal resistance :math:`T_4` of a cable in free air.

    Parameters
    ----------
    outer_diameter : array_like
        External diameter :math:`D_e^*` [m].
    heat_transfer_coefficient : array_like
        :math:`h` from :func:`free_air_heat_transfer_coefficient` [W m^-2 K^-5/4].
    surface_temperature_rise : array_like
        Surface temperature rise above ambient :math:`\Delta\theta_s` [K], > 0.

    Returns
    -------
    numpy.ndarray
        :math:`T_4` [K m W^-1].

    Notes
    -----
    .. math:: T_4 = \frac{1}{\pi D_e^* h\,(\Delta\theta_s)^{1/4}}

    (clause 4.2.1 of [1]_).

    References
    ----------
    .. [1] IEC 60287-2-1:2015, clause 4.2.1.
    """
    return 1.0 / (np.pi * np.asarray(outer_diameter, dtype=float)
                  * np.asarray(heat_transfer_coefficient, dtype=float)
                  * np.asarray(surface_temperature_rise, dtype=float) ** 0.25)


def surface_temperature_rise_free_air(heat, outer_diameter, heat_transfer_coefficient):
    r"""Surface temperature rise of a cable in free air that gives off a known heat.

    Parameters
    ----------
    heat : array_like
        Total heat leaving the surface per unit length :math:`W` [W m^-1], >= 0.
    outer_diameter : array_like
        External diameter :math:`D_e^*` [m].
    heat_transfer_coefficient : array_like
        :math:`h` [W m^-2 K^-5/4].

    Returns
    -------
    numpy.ndarray
        :math:`\Delta\theta_s` [K].

    Notes
    -----
    The surface rise is :math:`\Delta\theta_s = W T_4` with :math:`T_4` of clause 4.2.1 of
    [1]_, itself a function of :math:`\Delta\theta_s`. The standard finds
    :math:`(\Delta\theta_s)^{1/4}` by iteration because there the conductor temperature is
    given and the current unknown. When :math:`W` is known, as in each pass of
    :func:`cablefam.physics.thermal.coax_thermal_state`, the relation

    .. math:: W = \pi D_e^* h\,(\Delta\theta_s)^{5/4}
        \quad\Longrightarrow\quad
        \Delta\theta_s = \left(\frac{W}{\pi D_e^* h}\right)^{4/5}

    is solved in closed form; it is the fixed point of the standard's iteration.

    References
    ----------
    .. [1] IEC 60287-2-1:2015, clause 4.2.1.
    """
    return (np.asarray(heat, dtype=float) / (
        np.pi * np.asarray(outer_diameter, dtype=float)
        * np.asarray(heat_transfer_coefficient, dtype=float))) ** 0.8
