r"""Heat leaving the outer surface of a cable in still air: natural convection plus radiation of a
surface of known emissivity (bare metal, or a jacket whose emissivity is given), and the heat the
surface takes up from the sun.

The IEC 60287 free-air constants (:mod:`cablefam.physics.thermal_resistances`) describe a black
cable surface; a bright metal surface radiates far less. For a surface of emissivity
:math:`\varepsilon` the heat per metre leaving a horizontal cylinder of diameter :math:`D` at
:math:`\Delta\theta` above the ambient air (and surroundings at the air temperature) is

.. math::
    W = \pi D\left[h_c\,\Delta\theta + \varepsilon\sigma\left((T_a + \Delta\theta)^4 -
        T_a^4\right)\right], \qquad h_c = \frac{k}{D}\,\mathrm{Nu}_D

with the Churchill-Chu correlation for the mean Nusselt number of a horizontal cylinder in
natural convection, valid for :math:`\mathrm{Ra}_D \le 10^{12}` [1]_,

.. math::
    \mathrm{Nu}_D = \left\{0.60 + \frac{0.387\,\mathrm{Ra}_D^{1/6}}
        {\left[1 + (0.559/\mathrm{Pr})^{9/16}\right]^{8/27}}\right\}^2, \qquad
    \mathrm{Ra}_D = \frac{g\beta\,\Delta\theta\,D^3}{\nu^2}\,\mathrm{Pr}, \quad
    \beta = 1/T_f,

air properties :math:`k`, :math:`\nu`, :math:`\mathrm{Pr}` at the film temperature
:math:`T_f = T_a + \Delta\theta/2` interpolated in :data:`AIR_PROPERTIES` [2]_ (held at the
table's ends outside it).

Sun: a cable of diameter :math:`D_e^*` in direct sunlight of intensity :math:`H` takes up
:math:`\sigma_s D_e^* H` per metre (:math:`\sigma_s` the absorption coefficient of its
surface, clause 2.2.1.2 of [3]_ and Table 4 of [4]_), which leaves the surface with the
generated heat.

References
----------
.. [1] S. W. Churchill, H. H. S. Chu, "Correlating equations for laminar and turbulent free
   convection from a horizontal cylinder", *Int. J. Heat Mass Transfer* 18 (1975) 1049-1053.
.. [2] Y. A. Cengel, A. J. Ghajar, *Heat and Mass Transfer: Fundamentals and Applications*,
   5th ed., McGraw-Hill, 2015, Table A-15 (properties of air at 1 atm).
.. [3] IEC 60287-1-1:2006+AMD1:2014, clause 1.4.1.1 (cables directly exposed to solar
   radiation) and 2.2.1.2.
.. [4] IEC 60287-2-1:2015, clause 4.2.1 and Table 4 (absorption coefficient of solar
   radiation for cable surfaces).
"""

from __future__ import annotations

import numpy as np

from scipy.constants import g as STANDARD_GRAVITY
from scipy.constants import sigma as STEFAN_BOLTZMANN
from scipy.constants import zero_Celsius as ZERO_CELSIUS_K

#: Air at 1 atm: temperature [degC], thermal conductivity k [W m^-1 K^-1], kinematic
#: viscosity nu [m^2 s^-1], Prandtl number [-]; Table A-15 of Cengel and Ghajar, *Heat and
#: Mass Transfer*, 5th ed. (reference [2] of the module).
AIR_PROPERTIES = np.array([
    (-50.0, 0.01979, 9.319e-6, 0.7440),
    (0.0, 0.02364, 1.338e-5, 0.7362),
    (20.0, 0.02514, 1.516e-5, 0.7309),
    (40.0, 0.02662, 1.702e-5, 0.7255),
    (60.0, 0.02808, 1.896e-5, 0.7202),
    (80.0, 0.02953, 2.097e-5, 0.7154),
    (100.0, 0.03095, 2.306e-5, 0.7111),
    (120.0, 0.03235, 2.522e-5, 0.7073),
    (140.0, 0.03374, 2.745e-5, 0.7041),
    (160.0, 0.03511, 2.975e-5, 0.7014),
])

#: Total emissivities of metal surfaces near room temperature [-], for design files and
#: catalogs (not used by the code). From memory of the table of normal total emissivities by
#: H. C. Hottel in W. H. McAdams, *Heat Transmission*, 3rd ed., McGraw-Hill, 1954 (also in
#: Incropera et al., *Fundamentals of Heat and Mass Transfer*, Table A.11): highly polished
#: copper 0.02-0.03, heavily oxidised copper 0.78, highly polished aluminium 0.04-0.06,
#: heavily oxidised aluminium 0.20-0.31.
METAL_EMISSIVITIES = {"copper, bright": 0.03, "copper, oxidised": 0.78,
                      "aluminium, bright": 0.05, "aluminium, oxidised": 0.25}

#: Iterations of :func:`surface_temperature_rise_still_air` (Newton in log-log: each adds
#: more than a digit beyond the third; 12 reach rounding for every case of the tests).
_SURFACE_ITERATIONS = 12


def air_properties(temperature_c):
    """k [W m^-1 K^-1], nu [m^2 s^-1] and Pr [-] of air at 1 atm, linear in
    :data:`AIR_PROPERTIES` (held at its ends)."""
    t = np.asarray(temperature_c, dtype=float)
    table = AIR_PROPERTIES
    return tuple(np.interp(t, table[:, 0], table[:, j]) for j in (1, 2, 3))


def churchill_chu_nusselt(rayleigh, prandtl):
    r"""Mean Nusselt number of a horizontal cylinder in natural convection [-] (module notes,
    [1]_ of the module; :math:`\mathrm{Ra}_D \le 10^{12}`)."""
    ra = np.asarray(rayleigh, dtype=float)
    pr = np.asarray(prandtl, dtype=float)
    return (0.60 + 0.387 * ra ** (1.0 / 6.0) / (1.0 + (0.559 / pr) ** (9.0 / 16.0)) ** (
        8.0 / 27.0)) ** 2


def heat_loss_still_air(surface_rise, outer_diameter, emissivity, ambient_c):
    r"""Heat per metre leaving a horizontal cylinder in still air, convection plus radiation.

    Parameters
    ----------
    surface_rise : array_like
        Surface temperature above ambient :math:`\Delta\theta` [K], >= 0.
    outer_diameter : array_like
        :math:`D` [m].
    emissivity : array_like
        Total emissivity of the surface :math:`\varepsilon`, in (0, 1] [-].
    ambient_c : array_like
        Air (and surroundings) temperature [degC].

    Returns
    -------
    numpy.ndarray
        :math:`W` [W m^-1] of the module notes.
    """
    dt = np.maximum(np.asarray(surface_rise, dtype=float), 0.0)
    dia = np.asarray(outer_diameter, dtype=float)
    t_a = np.asarray(ambient_c, dtype=float) + ZERO_CELSIUS_K
    k, nu, pr = air_properties(t_a + 0.5 * dt - ZERO_CELSIUS_K)
    ra = STANDARD_GRAVITY / (t_a + 0.5 * dt) * dt * dia ** 3 / (nu * nu) * pr
    h_c = k / dia * churchill_chu_nusselt(ra, pr)
    t_s = t_a + dt
    radiated = np.asarray(emissivity, dtype=float) * STEFAN_BOLTZMANN * (
        (t_s * t_s + t_a * t_a) * (t_s + t_a) * dt)  # T_s^4 - T_a^4 without cancellation
    return np.pi * dia * (h_c * dt + radiated)


def surface_temperature_rise_still_air(heat, outer_diameter, emissivity, ambient_c):
    r"""Surface temperature rise of a horizontal cylinder in still air giving off a known heat.

    Parameters
    ----------
    heat : array_like
        Heat leaving the surface per metre :math:`W` [W m^-1], >= 0.
    outer_diameter, emissivity, ambient_c : array_like
        As in :func:`heat_loss_still_air`.

    Returns
    -------
    numpy.ndarray
        :math:`\Delta\theta` [K] with :func:`heat_loss_still_air` :math:`= W`; 0 where
        :math:`W = 0`.

    Notes
    -----
    :math:`W(\Delta\theta)` rises monotonically, nearly as a power of :math:`\Delta\theta`
    (exponent between 1 and 5/4 for convection, up to 4 for radiation), so Newton's method on
    :math:`\ln W` against :math:`\ln\Delta\theta` converges from the start
    :math:`\Delta\theta_0 = W/(\pi D \cdot 10\ \mathrm{W\,m^{-2}\,K^{-1}})` (the local slope
    by a central difference of relative step 1e-4), a fixed number of steps for all designs
    at once.
    """
    w = np.asarray(heat, dtype=float)
    dia = np.asarray(outer_diameter, dtype=float)
    w, dia, eps, amb = np.broadcast_arrays(w, dia, np.asarray(emissivity, dtype=float),
                                           np.asarray(ambient_c, dtype=float))
    positive = w > 0.0
    w_pos = np.where(positive, w, 1.0)
    x = np.log(w_pos / (np.pi * dia * 10.0))
    step = 1e-4
    for _ in range(_SURFACE_ITERATIONS):
        up = heat_loss_still_air(np.exp(x + step), dia, eps, amb)
        down = heat_loss_still_air(np.exp(x - step), dia, eps, amb)
        here = heat_loss_still_air(np.exp(x), dia, eps, amb)
        slope = (np.log(up) - np.log(down)) / (2.0 * step)
        x = x - (np.log(here) - np.log(w_pos)) / slope
    return np.where(positive, np.exp(x), 0.0)


def solar_heat(outer_diameter, irradiance, absorption):
    r"""Solar heat taken up per metre, :math:`\sigma_s D_e^* H` [W m^-1] (IEC 60287-1-1,
    clause 1.4.1.1; absorption coefficients :math:`\sigma_s` in Table 4 of IEC 60287-2-1).

    Parameters
    ----------
    outer_diameter : array_like
        :math:`D_e^*` [m].
    irradiance : array_like
        Intensity of solar radiation :math:`H` [W m^-2] (the standard suggests
        1000 W m^-2 where no local figure is known).
    absorption : array_like
        Absorption coefficient of the surface :math:`\sigma_s` [-] (Table 4 of IEC 60287-2-1,
        from memory: 0.8 for bitumen/jute servings and polychloroprene, 0.6 for PVC and lead,
        0.4 for polyethylene).
    """
    return (np.asarray(absorption, dtype=float) * np.asarray(outer_diameter, dtype=float)
            * np.asarray(irradiance, dtype=float))
