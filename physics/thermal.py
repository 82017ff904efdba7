r"""Steady-state temperature rise and CW power rating of a coax in free air (IEC 60287 method).

The IEC 60287 rating equation of a single-core cable (clause 1.4.1.1 of [1]_) is applied to a
coax carrying radio-frequency power, with this mapping of its terms:

===========================  ===================================================================
IEC 60287 term               coax
===========================  ===================================================================
conductor loss :math:`I^2R`  :math:`W_i = I^2 R_i`, skin-effect resistance of the centre conductor
sheath loss factor           :math:`\lambda_1 = W_s / W_i`, :math:`W_s = I^2 R_s` in the shield
armour loss factor           :math:`\lambda_2 = 0` (no armour)
dielectric loss :math:`W_d`  :math:`W_d = G V^2`
:math:`T_1` (insulation)     dielectric, radii :math:`a \ldots b`
:math:`T_2` (bedding)        0 (nothing between shield and jacket)
:math:`T_3` (serving)        jacket, radii :math:`c \ldots d` (0 when :math:`d = c`)
:math:`T_4` (external)       free air, clause 4.2.1 of [2]_
number of cores :math:`n`    1
===========================  ===================================================================

so that the conductor temperature rise above ambient is

.. math::
    \Delta\theta_c = \left(W_i + \tfrac{1}{2}W_d\right) T_1
                     + \left(W_i + W_s + W_d\right)\left(T_3 + T_4\right).

The line is matched and carries the CW power :math:`P`; the heat is that of the input end,
where it is largest: :math:`I = \sqrt{P/|Z_0|}`, :math:`V = \sqrt{P|Z_0|}`. The resistivities
follow the temperatures of their conductors (clause 2.1.1 of [1]_), so the heat and the
temperatures are solved together by fixed-point iteration.

Temperatures are in degrees Celsius where the standard states them so (``*_c`` names);
temperature differences are in kelvin.

References
----------
.. [1] IEC 60287-1-1:2006+AMD1:2014, *Electric cables - Calculation of the current rating -
   Part 1-1: Current rating equations (100 % load factor) and calculation of losses - General*.
.. [2] IEC 60287-2-1:2015, *Electric cables - Calculation of the current rating - Part 2-1:
   Thermal resistance - Calculation of the thermal resistance*.
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np
from scipy.optimize import elementwise

from cablefam.physics.line import characteristic_impedance, line_parameters

#: Conductor temperature [degC] above which a design is taken as thermally run away (no
#: steady state worth reporting; every cable material has melted or burnt far below it).
RUNAWAY_TEMPERATURE_C = 1000.0

#: Constants of :func:`free_air_heat_transfer_coefficient` for a single cable in free air
#: (black surface): IEC 60287-2-1:2015, clause 4.2.1, Table 2, installation "single cable".
FREE_AIR_SINGLE_CABLE_Z = 0.21
FREE_AIR_SINGLE_CABLE_E = 3.94
FREE_AIR_SINGLE_CABLE_G = 0.60

#: Power range searched by :func:`max_power` [W].
_POWER_SEARCH_MIN_W = 1e-20
_POWER_SEARCH_MAX_W = 1e20
#: Function value :func:`max_power` gives the root finder for a run-away design [K]: finite
#: (the root finder rejects non-finite values) and larger than any real excess temperature.
_RUNAWAY_EXCESS_K = 1e6


class ThermalState(NamedTuple):
    """Steady thermal state of a population of coax designs; arrays of a common shape.

    Designs that did not reach a steady state (``converged`` False) have every temperature and
    heat set to ``+inf``.
    """

    conductor_temperature_c: np.ndarray
    """Centre-conductor temperature [degC]."""
    shield_temperature_c: np.ndarray
    """Shield temperature = jacket inner-surface temperature [degC]."""
    surface_temperature_c: np.ndarray
    """Outer-surface temperature [degC]."""
    temperature_rise_k: np.ndarray
    """Conductor temperature minus ambient [K]."""
    heat_w_per_m: np.ndarray
    """Total heat generated per unit length, :math:`W_i + W_s + W_d` [W m^-1]."""
    heat_inner_w_per_m: np.ndarray
    """Heat in the centre conductor, :math:`I^2 R_i` [W m^-1]."""
    heat_shield_w_per_m: np.ndarray
    """Heat in the shield, :math:`I^2 R_s` [W m^-1]."""
    heat_dielectric_w_per_m: np.ndarray
    """Heat in the dielectric, :math:`G V^2` [W m^-1]."""
    converged: np.ndarray
    """True where the iteration reached a steady state within the tolerance (bool)."""
    iterations: np.ndarray
    """Number of fixed-point passes made for each design (int)."""


class SurfaceRiseIteration(NamedTuple):
    """Result of :func:`surface_temperature_rise_iec_iteration`; arrays of a common shape."""

    surface_temperature_rise_k: np.ndarray
    """Surface temperature rise above ambient :math:`\\Delta\\theta_s` [K]."""
    iterations: np.ndarray
    """Number of iterations made (int)."""
    converged: np.ndarray
    """True where the stopping rule was met within the allowed iterations (bool)."""


# --------------------------------------------------------------------------- building blocks


def resistivity_at_temperature(resistivity_20c, temperature_coefficient, temperature_c):
    r"""Resistivity of a conductor at its operating temperature.

    Parameters
    ----------
    resistivity_20c : array_like
        Resistivity at 20 degC, :math:`\rho_{20}` [ohm m].
    temperature_coefficient : array_like
        Constant-mass temperature coefficient at 20 degC, :math:`\alpha_{20}` [K^-1].
    temperature_c : array_like
        Conductor temperature :math:`\theta` [degC].

    Returns
    -------
    numpy.ndarray
        :math:`\rho(\theta)` [ohm m].

    Notes
    -----
    .. math:: \rho(\theta) = \rho_{20}\left[1 + \alpha_{20}(\theta - 20)\right]

    the temperature correction of the d.c. resistance in clause 2.1.1 of [1]_ (the same
    factor multiplies :math:`R_0`); values of :math:`\rho_{20}` and :math:`\alpha_{20}` for
    copper and aluminium are in Table 1 of [1]_.

    References
    ----------
    .. [1] IEC 60287-1-1:2006+AMD1:2014, clause 2.1.1 and Table 1.
    """
    return np.asarray(resistivity_20c, dtype=float) * (
        1.0 + np.asarray(temperature_coefficient, dtype=float)
        * (np.asarray(temperature_c, dtype=float) - 20.0))


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
    given and the current unknown (see :func:`surface_temperature_rise_iec_iteration`). When
    :math:`W` is known, as in each pass of :func:`coax_thermal_state`, the relation

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


def surface_temperature_rise_iec_iteration(conductor_temperature_rise, heat_dielectric,
                                           sheath_loss_factor, t1, t3, outer_diameter,
                                           heat_transfer_coefficient, tolerance=1e-3,
                                           max_iterations=100):
    r"""Surface temperature rise by the iteration of IEC 60287-2-1, clause 4.2.1.

    The standard's own procedure, given the conductor temperature rise; kept to check the
    closed form of :func:`surface_temperature_rise_free_air` against (it is not used by
    :func:`coax_thermal_state`). Written for a coax: one core (:math:`n = 1`), no armour
    (:math:`\lambda_2 = 0`), nothing between shield and jacket (:math:`T_2 = 0`).

    Parameters
    ----------
    conductor_temperature_rise : array_like
        Conductor temperature rise above ambient :math:`\Delta\theta` [K].
    heat_dielectric : array_like
        Dielectric loss :math:`W_d` [W m^-1].
    sheath_loss_factor : array_like
        :math:`\lambda_1 = W_s/W_i` [-] (any value when :math:`W_i = 0`).
    t1, t3 : array_like
        Thermal resistances of the dielectric and of the jacket [K m W^-1].
    outer_diameter : array_like
        External diameter :math:`D_e^*` [m].
    heat_transfer_coefficient : array_like
        :math:`h` [W m^-2 K^-5/4].
    tolerance : float, optional
        Stop when successive values of :math:`(\Delta\theta_s)^{1/4}` differ by no more than
        this; the standard uses 0.001 [K^1/4].
    max_iterations : int, optional
        Upper bound on the iterations.

    Returns
    -------
    SurfaceRiseIteration
        :math:`\Delta\theta_s` [K], the iteration count and a convergence flag.

    Notes
    -----
    With :math:`\lambda_2 = 0`, :math:`T_2 = 0`, :math:`n = 1` the iteration of clause 4.2.1
    of [1]_ reads

    .. math::
        K_A = \frac{\pi D_e^* h}{1 + \lambda_1}\left[T_1 + (1 + \lambda_1) T_3\right], \qquad
        \Delta\theta_d = W_d\left(\frac{1}{1 + \lambda_1} - \frac{1}{2}\right) T_1,

        (\Delta\theta_s)^{1/4}_{n+1} =
        \left[\frac{\Delta\theta + \Delta\theta_d}{1 + K_A(\Delta\theta_s)^{1/4}_n}\right]^{1/4},
        \qquad (\Delta\theta_s)^{1/4}_0 = 2.

    Its fixed point satisfies the rating equation (clause 1.4.1.1 of [2]_) together with
    :math:`\Delta\theta_s = W T_4`; the map contracts by at most 1/4 per step.

    References
    ----------
    .. [1] IEC 60287-2-1:2015, clause 4.2.1.
    .. [2] IEC 60287-1-1:2006+AMD1:2014, clause 1.4.1.1.
    """
    dtheta, w_d, lam1, t1, t3, de, h = np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in (
        conductor_temperature_rise, heat_dielectric, sheath_loss_factor, t1, t3, outer_diameter,
        heat_transfer_coefficient)))
    k_a = np.pi * de * h / (1.0 + lam1) * (t1 + (1.0 + lam1) * t3)
    numerator = dtheta + w_d * (1.0 / (1.0 + lam1) - 0.5) * t1
    y = np.full(dtheta.shape, 2.0)
    iterations = np.zeros(dtheta.shape, dtype=int)
    converged = np.zeros(dtheta.shape, dtype=bool)
    active = np.ones(dtheta.shape, dtype=bool)
    for it in range(1, max_iterations + 1):
        y_new = (numerator[active] / (1.0 + k_a[active] * y[active])) ** 0.25
        done = np.abs(y_new - y[active]) <= tolerance
        y[active] = y_new
        iterations[active] = it
        converged[active] = done
        active[active] = ~done
        if not active.any():
            break
    return SurfaceRiseIteration(y ** 4, iterations, converged)


# --------------------------------------------------------------------------- input checks


def _check(condition, name, requirement, values):
    """Raise ValueError naming the first element of ``values`` that fails ``condition``."""
    bad = ~condition
    if bad.any():
        i = int(np.flatnonzero(bad)[0])
        raise ValueError(f"{name} must be {requirement}; element {i} is {values[i]!r} "
                         f"({int(bad.sum())} of {bad.size} fail)")


def _prepare(a, b, c, d, frequency, ambient_c, inner_resistivity_20c,
             inner_temperature_coefficient, shield_resistivity_20c,
             shield_temperature_coefficient, relative_permittivity, loss_tangent,
             dielectric_thermal_resistivity, jacket_thermal_resistivity,
             inner_relative_permeability, shield_relative_permeability, offset, inner_strands,
             *extra):
    """Broadcast, flatten and check the common inputs; return (shape, dict of 1-D arrays)."""
    names = ("a", "b", "c", "d", "frequency", "ambient_c", "inner_resistivity_20c",
             "inner_temperature_coefficient", "shield_resistivity_20c",
             "shield_temperature_coefficient", "relative_permittivity", "loss_tangent",
             "dielectric_thermal_resistivity", "jacket_thermal_resistivity",
             "inner_relative_permeability", "shield_relative_permeability", "offset",
             "inner_strands")
    values = (a, b, c, d, frequency, ambient_c, inner_resistivity_20c,
              inner_temperature_coefficient, shield_resistivity_20c,
              shield_temperature_coefficient, relative_permittivity, loss_tangent,
              dielectric_thermal_resistivity, jacket_thermal_resistivity,
              inner_relative_permeability, shield_relative_permeability, offset,
              inner_strands) + extra
    arrays = np.broadcast_arrays(*(np.asarray(x, dtype=float) for x in values))
    shape = arrays[0].shape
    flat = [np.array(x, dtype=float).ravel() for x in arrays]
    p = dict(zip(names, flat[:len(names)]))
    has_jacket = p["d"] > p["c"]
    for name, x in p.items():
        if name != "jacket_thermal_resistivity":
            _check(np.isfinite(x), name, "finite", x)
    _check(p["a"] > 0.0, "a", "> 0", p["a"])
    _check(p["b"] > p["a"], "b", "> a", p["b"])
    _check(p["c"] > p["b"], "c", "> b", p["c"])
    _check(p["d"] >= p["c"], "d", ">= c", p["d"])
    for name in ("frequency", "inner_resistivity_20c", "shield_resistivity_20c",
                 "dielectric_thermal_resistivity", "inner_relative_permeability",
                 "shield_relative_permeability"):
        _check(p[name] > 0.0, name, "> 0", p[name])
    _check(p["relative_permittivity"] >= 1.0, "relative_permittivity", ">= 1",
           p["relative_permittivity"])
    _check(p["loss_tangent"] >= 0.0, "loss_tangent", ">= 0", p["loss_tangent"])
    rho_j = p["jacket_thermal_resistivity"]
    _check(~has_jacket | (np.isfinite(rho_j) & (rho_j > 0.0)), "jacket_thermal_resistivity",
           "finite and > 0 where there is a jacket (d > c)", rho_j)
    for which in ("inner", "shield"):
        coeff = p[f"{which}_temperature_coefficient"]
        _check(1.0 + coeff * (p["ambient_c"] - 20.0) > 0.0,
               f"{which}_temperature_coefficient",
               "such that the resistivity at ambient_c stays > 0", coeff)
    p["has_jacket"] = has_jacket
    return shape, p, flat[len(names):]


def _check_iteration_settings(tolerance_k, max_iterations):
    if not (np.isfinite(tolerance_k) and tolerance_k > 0.0):
        raise ValueError(f"tolerance_k must be finite and > 0, got {tolerance_k!r}")
    if int(max_iterations) != max_iterations or max_iterations < 1:
        raise ValueError(f"max_iterations must be an integer >= 1, got {max_iterations!r}")


# --------------------------------------------------------------------------- steady state


def _solve_flat(p, power, tolerance_k, max_iterations, runaway_temperature_c):
    """Fixed-point iteration on 1-D arrays (already checked); returns ThermalState fields."""
    n = power.size
    amb = p["ambient_c"]
    t1 = insulation_thermal_resistance(p["dielectric_thermal_resistivity"], p["a"], p["b"])
    t3 = np.zeros(n)
    jac = p["has_jacket"]
    t3[jac] = insulation_thermal_resistance(p["jacket_thermal_resistivity"][jac], p["c"][jac],
                                            p["d"][jac])
    de = 2.0 * p["d"]
    surface_conductance = np.pi * de * free_air_heat_transfer_coefficient(de)

    theta_c = amb.copy()
    theta_s = amb.copy()
    rise_surface = np.zeros(n)
    w_i = np.zeros(n)
    w_s = np.zeros(n)
    w_d = np.zeros(n)
    iterations = np.zeros(n, dtype=int)
    converged = np.zeros(n, dtype=bool)
    active = np.arange(n)
    for it in range(1, int(max_iterations) + 1):
        if active.size == 0:
            break
        i = active
        lp = line_parameters(
            p["a"][i], p["b"][i], p["c"][i], p["frequency"][i],
            resistivity_at_temperature(p["inner_resistivity_20c"][i],
                                       p["inner_temperature_coefficient"][i], theta_c[i]),
            resistivity_at_temperature(p["shield_resistivity_20c"][i],
                                       p["shield_temperature_coefficient"][i], theta_s[i]),
            p["relative_permittivity"][i], p["loss_tangent"][i],
            p["inner_relative_permeability"][i], p["shield_relative_permeability"][i],
            offset=p["offset"][i], inner_strands=p["inner_strands"][i].astype(int))
        z0 = np.abs(characteristic_impedance(lp.r, lp.l, lp.g, lp.c, p["frequency"][i]))
        current_sq = power[i] / z0
        wi = current_sq * lp.r_inner
        ws = current_sq * lp.r_shield
        wd = lp.g * power[i] * z0
        w = wi + ws + wd
        rise_s = (w / surface_conductance[i]) ** 0.8
        new_s = amb[i] + w * t3[i] + rise_s
        new_c = new_s + (wi + 0.5 * wd) * t1[i]
        if np.isnan(new_c).any():  # checked inputs cannot give NaN: a fault upstream
            k = int(i[np.flatnonzero(np.isnan(new_c))[0]])
            raise FloatingPointError(f"NaN heat from cablefam.physics.line for design element {k}")
        done = (np.abs(new_c - theta_c[i]) <= tolerance_k) & (
            np.abs(new_s - theta_s[i]) <= tolerance_k)
        runaway = ~(new_c <= runaway_temperature_c)
        theta_c[i], theta_s[i], rise_surface[i] = new_c, new_s, rise_s
        w_i[i], w_s[i], w_d[i] = wi, ws, wd
        iterations[i] = it
        converged[i[done & ~runaway]] = True
        active = i[~done & ~runaway]

    failed = ~converged
    inf = np.inf
    theta_c[failed] = inf
    theta_s[failed] = inf
    surface = amb + rise_surface
    surface[failed] = inf
    for w in (w_i, w_s, w_d):
        w[failed] = inf
    return (theta_c, theta_s, surface, theta_c - amb, w_i + w_s + w_d, w_i, w_s, w_d,
            converged, iterations)


def coax_thermal_state(a, b, c, d, frequency, power, ambient_c, inner_resistivity_20c,
                       inner_temperature_coefficient, shield_resistivity_20c,
                       shield_temperature_coefficient, relative_permittivity, loss_tangent,
                       dielectric_thermal_resistivity, jacket_thermal_resistivity,
                       inner_relative_permeability=1.0, shield_relative_permeability=1.0,
                       offset=0.0, inner_strands=1,
                       tolerance_k=1e-4, max_iterations=100,
                       runaway_temperature_c=RUNAWAY_TEMPERATURE_C):
    r"""Steady temperatures of a matched coax in free air carrying CW power.

    Parameters
    ----------
    a, b, c, d : array_like
        Centre-conductor radius, dielectric outer radius, shield outer radius, jacket outer
        radius [m], ``0 < a < b < c <= d`` (``d == c``: no jacket).
    frequency : array_like
        Frequency [Hz], > 0.
    power : array_like
        CW power carried [W], >= 0.
    ambient_c : array_like
        Ambient air temperature [degC].
    inner_resistivity_20c, shield_resistivity_20c : array_like
        Conductor resistivities at 20 degC [ohm m].
    inner_temperature_coefficient, shield_temperature_coefficient : array_like
        Their temperature coefficients at 20 degC [K^-1].
    relative_permittivity, loss_tangent : array_like
        Dielectric constants [-].
    dielectric_thermal_resistivity : array_like
        Thermal resistivity of the dielectric [K m W^-1].
    jacket_thermal_resistivity : array_like
        Thermal resistivity of the jacket [K m W^-1]; not used (any value, NaN too) where
        ``d == c``.
    offset, inner_strands : array_like, optional
        Eccentricity [m] and strand count of the centre conductor, passed to
        :func:`cablefam.physics.line.line_parameters` (defaults: concentric, solid).
    inner_relative_permeability, shield_relative_permeability : array_like, optional
        Relative permeabilities of the conductors [-].
    tolerance_k : float, optional
        Stop a design when both conductor temperatures change by no more than this between
        passes [K].
    max_iterations : int, optional
        Passes allowed before a design is declared not converged.
    runaway_temperature_c : float, optional
        A design whose conductor temperature passes this [degC] is declared run away.

    Returns
    -------
    ThermalState
        Temperatures [degC], rise [K], heat [W m^-1], ``converged`` and ``iterations``, in the
        broadcast shape of the inputs. Not converged (run away, or still moving after
        ``max_iterations``): temperatures and heat ``+inf``, never NaN. ``power == 0``: every
        temperature equals ``ambient_c``.

    Raises
    ------
    ValueError
        If an input is non-finite or out of range (the message names it and the element).

    Notes
    -----
    Each pass, at the current temperatures :math:`\theta_c` (centre conductor) and
    :math:`\theta_{sh}` (shield):

    1. :math:`\rho_i = \rho_{i,20}[1 + \alpha_i(\theta_c - 20)]`, likewise :math:`\rho_s` at
       :math:`\theta_{sh}` (clause 2.1.1 of [1]_);
    2. :math:`R_i, R_s, G` and the complex :math:`Z_0` from
       :func:`cablefam.physics.line.line_parameters` (exact skin-effect resistance);
    3. :math:`I^2 = P/|Z_0|`, :math:`V^2 = P|Z_0|`, :math:`W_i = I^2R_i`, :math:`W_s = I^2R_s`,
       :math:`W_d = GV^2`, :math:`W = W_i + W_s + W_d`;
    4. :math:`\Delta\theta_s = (W/(\pi D_e h))^{4/5}`, i.e. :math:`W T_4` with :math:`T_4` of
       clause 4.2.1 of [2]_ (see :func:`surface_temperature_rise_free_air`), :math:`D_e = 2d`;
    5. rating equation of clause 1.4.1.1 of [1]_ with the mapping of the module docstring:

       .. math::
           \theta_{sh} = \theta_{amb} + W T_3 + \Delta\theta_s, \qquad
           \theta_c = \theta_{sh} + \left(W_i + \tfrac{1}{2}W_d\right) T_1

       with :math:`T_1` (dielectric) and :math:`T_3` (jacket) of clauses 4.1.2 and 4.1.4 of
       [2]_.

    Starting from ambient, the passes are repeated, on the designs not yet converged only,
    until both temperatures move by no more than ``tolerance_k``. The iteration contracts
    with a factor of about :math:`\alpha\Delta\theta_c/(2(1 + \alpha\Delta\theta_c))` when the
    resistance follows :math:`\sqrt\rho` (skin effect). As the loss grows with temperature,
    the iterates rise monotonically from ambient towards the lowest steady state and never
    overshoot it; an iterate past ``runaway_temperature_c`` therefore means a steady state
    beyond it or none at all (loss growing faster with temperature than the surface can shed
    it: thermal runaway).

    References
    ----------
    .. [1] IEC 60287-1-1:2006+AMD1:2014, clauses 1.4.1.1 and 2.1.1.
    .. [2] IEC 60287-2-1:2015, clauses 4.1.2, 4.1.4 and 4.2.1.
    """
    _check_iteration_settings(tolerance_k, max_iterations)
    shape, p, (power_flat,) = _prepare(
        a, b, c, d, frequency, ambient_c, inner_resistivity_20c, inner_temperature_coefficient,
        shield_resistivity_20c, shield_temperature_coefficient, relative_permittivity,
        loss_tangent, dielectric_thermal_resistivity, jacket_thermal_resistivity,
        inner_relative_permeability, shield_relative_permeability, offset, inner_strands, power)
    _check(np.isfinite(power_flat) & (power_flat >= 0.0), "power", "finite and >= 0",
           power_flat)
    fields = _solve_flat(p, power_flat, tolerance_k, max_iterations, runaway_temperature_c)
    return ThermalState(*(x.reshape(shape) for x in fields))


# --------------------------------------------------------------------------- rating


def max_power(a, b, c, d, frequency, ambient_c, inner_resistivity_20c,
              inner_temperature_coefficient, shield_resistivity_20c,
              shield_temperature_coefficient, relative_permittivity, loss_tangent,
              dielectric_thermal_resistivity, jacket_thermal_resistivity,
              dielectric_max_temperature_c, jacket_max_temperature_c=None,
              inner_relative_permeability=1.0, shield_relative_permeability=1.0,
              offset=0.0, inner_strands=1,
              tolerance_k=1e-4, max_iterations=100):
    r"""Maximum CW power of a matched coax in free air (thermal rating).

    Parameters
    ----------
    a, b, c, d, frequency, ambient_c : array_like
        As in :func:`coax_thermal_state` [m], [Hz], [degC].
    inner_resistivity_20c, inner_temperature_coefficient : array_like
        As in :func:`coax_thermal_state` [ohm m], [K^-1].
    shield_resistivity_20c, shield_temperature_coefficient : array_like
        As in :func:`coax_thermal_state` [ohm m], [K^-1].
    relative_permittivity, loss_tangent : array_like
        As in :func:`coax_thermal_state` [-].
    dielectric_thermal_resistivity, jacket_thermal_resistivity : array_like
        As in :func:`coax_thermal_state` [K m W^-1].
    dielectric_max_temperature_c : array_like
        Highest temperature allowed at the centre conductor (the hottest point of the
        dielectric) [degC].
    jacket_max_temperature_c : array_like or None, optional
        Highest temperature allowed at the jacket's inner surface, i.e. the shield [degC].
        ``None``: no jacket limit. Ignored where ``d == c`` (no jacket).
    offset, inner_strands : array_like, optional
        Eccentricity [m] and strand count of the centre conductor, passed to
        :func:`cablefam.physics.line.line_parameters` (defaults: concentric, solid).
    inner_relative_permeability, shield_relative_permeability : array_like, optional
        As in :func:`coax_thermal_state` [-].
    tolerance_k, max_iterations : optional
        Passed to the thermal iteration (:func:`coax_thermal_state`).

    Returns
    -------
    numpy.ndarray
        Maximum power [W], broadcast shape of the inputs; 0 where the ambient is already at or
        above a limit.

    Raises
    ------
    ValueError
        If an input is non-finite or out of range.

    Notes
    -----
    Solves, for every design at once,

    .. math::
        F(x) = \max\left(\theta_c(e^x) - \theta_{d,\max},\;
                         \theta_{sh}(e^x) - \theta_{j,\max}\right) = 0,
        \qquad P_{\max} = e^x

    where :math:`\theta_c(P)` and :math:`\theta_{sh}(P)` come from :func:`coax_thermal_state`;
    :math:`F` grows monotonically with :math:`P`, so its root is the largest power meeting
    both limits (the conductor temperature limit of clause 1.4.1.1 of [1]_ applied to the
    coax, the second one protecting the jacket). A first estimate scales a 1 W solution
    linearly to the allowed rise; :func:`scipy.optimize.elementwise.bracket_root` widens it
    into a bracket and :func:`scipy.optimize.elementwise.find_root` (Chandrupatla's method [2]_)
    refines :math:`x = \ln P` until the bracket is narrower than 1e-7 (relative 1e-7 in power)
    or :math:`|F| \le 10` ``tolerance_k``. A run-away state counts as far above the limit.
    Should the root finder fail for a design, the largest power found to stay within the
    limits is returned (0 if none): the result errs on the safe side.

    References
    ----------
    .. [1] IEC 60287-1-1:2006+AMD1:2014, clause 1.4.1.1.
    .. [2] T. R. Chandrupatla, "A new hybrid quadratic/bisection algorithm for finding the
       zero of a nonlinear function without using derivatives", *Adv. Eng. Softw.* 28 (1997)
       145-149.
    """
    _check_iteration_settings(tolerance_k, max_iterations)
    jacket_limit = np.inf if jacket_max_temperature_c is None else jacket_max_temperature_c
    shape, p, (diel_max, jac_max) = _prepare(
        a, b, c, d, frequency, ambient_c, inner_resistivity_20c, inner_temperature_coefficient,
        shield_resistivity_20c, shield_temperature_coefficient, relative_permittivity,
        loss_tangent, dielectric_thermal_resistivity, jacket_thermal_resistivity,
        inner_relative_permeability, shield_relative_permeability, offset, inner_strands,
        dielectric_max_temperature_c, jacket_limit)
    _check(np.isfinite(diel_max), "dielectric_max_temperature_c", "finite", diel_max)
    _check(~np.isnan(jac_max), "jacket_max_temperature_c", "not NaN (use None for no limit)",
           jac_max)
    jac_max = np.where(p["has_jacket"], jac_max, np.inf)
    amb = p["ambient_c"]
    allowed_rise = np.minimum(diel_max - amb, jac_max - amb)
    result = np.zeros(amb.size)
    todo = np.flatnonzero(allowed_rise > 0.0)
    if todo.size == 0:
        return result.reshape(shape)

    q = {k: v[todo] for k, v in p.items()}
    keys = tuple(q)
    diel_max, jac_max = diel_max[todo], jac_max[todo]
    has_jac = q["has_jacket"]
    args = tuple(q[k] for k in keys) + (diel_max, jac_max)

    def excess(x, *arrays):
        sub = dict(zip(keys, arrays[:len(keys)]))
        sub["has_jacket"] = sub["has_jacket"].astype(bool)
        d_max, j_max = arrays[len(keys):]
        state = _solve_flat(sub, np.exp(x), tolerance_k, max_iterations, RUNAWAY_TEMPERATURE_C)
        ok = state[8]
        f = np.full(x.shape, _RUNAWAY_EXCESS_K)
        theta_c, theta_s, j_max = state[0][ok], state[1][ok], j_max[ok]
        jacket_excess = np.where(sub["has_jacket"][ok], theta_s - j_max, -np.inf)
        f[ok] = np.maximum(theta_c - d_max[ok], jacket_excess)
        return f

    # first estimate: the rises at 1 W scaled linearly to the allowed rises
    reference = _solve_flat(q, np.ones(todo.size), tolerance_k, max_iterations,
                            RUNAWAY_TEMPERATURE_C)
    with np.errstate(divide="ignore"):
        ratio_c = (diel_max - q["ambient_c"]) / reference[3]
        ratio_s = np.where(has_jac, (jac_max - q["ambient_c"]) / (
            reference[1] - q["ambient_c"]), np.inf)
    ratio = np.minimum(ratio_c, ratio_s)  # 0 if run away at 1 W, inf if no heat at 1 W
    x_min, x_max = np.log(_POWER_SEARCH_MIN_W), np.log(_POWER_SEARCH_MAX_W)
    with np.errstate(divide="ignore"):
        x_guess = np.clip(np.log(ratio), x_min + 1.0, x_max - 1.0)
    bracket = elementwise.bracket_root(excess, x_guess - 0.5, x_guess + 0.5, xmin=x_min,
                                       xmax=x_max, args=args)
    found = bracket.success
    x_safe = np.full(todo.size, -np.inf)  # largest ln P known to meet the limits
    for end, f_end in zip(bracket.bracket, bracket.f_bracket):
        x_safe = np.where(f_end < 0.0, np.maximum(x_safe, end), x_safe)
    power = np.where(np.isfinite(x_safe), np.exp(np.where(np.isfinite(x_safe), x_safe, 0.0)),
                     0.0)
    if found.any():
        k = np.flatnonzero(found)
        root = elementwise.find_root(
            excess, (bracket.bracket[0][k], bracket.bracket[1][k]),
            args=tuple(x[k] for x in args),
            tolerances={"xatol": 1e-7, "xrtol": 0.0, "fatol": 10.0 * tolerance_k})
        power[k] = np.where(root.success, np.exp(root.x), power[k])
    result[todo] = power
    return result.reshape(shape)
