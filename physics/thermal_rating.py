r"""Thermal rating of a coax: the largest CW power that keeps its temperatures within limits
(model: :mod:`cablefam.physics.thermal`).

References
----------
.. [1] IEC 60287-1-1:2006+AMD1:2014, clause 1.4.1.1.
"""

from __future__ import annotations

import numpy as np
from scipy.optimize import elementwise

from cablefam.physics import _checks
from cablefam.physics.conductor_surface import ConductorSurface
from cablefam.physics.thermal_inputs import (INPUT_FIELDS, SURFACE_FIELDS, CoaxThermalInputs,
                                             checked_flat_inputs, take)
from cablefam.physics.thermal_state import (RUNAWAY_TEMPERATURE_C, check_iteration_settings,
                                            solve_flat)

#: Power range searched by :func:`max_power` [W].
_POWER_SEARCH_MIN_W = 1e-20
_POWER_SEARCH_MAX_W = 1e20
#: Function value :func:`max_power` gives the root finder for a run-away design [K]: finite
#: (the root finder rejects non-finite values) and larger than any real excess temperature.
_RUNAWAY_EXCESS_K = 1e6


def power_rating(inputs: CoaxThermalInputs, dielectric_max_temperature_c,
                 jacket_max_temperature_c=None, tolerance_k=1e-4, max_iterations=100):
    """:func:`max_power` of grouped inputs (same parameters, same result)."""
    check_iteration_settings(tolerance_k, max_iterations)
    jacket_limit = np.inf if jacket_max_temperature_c is None else jacket_max_temperature_c
    shape, p, (diel_max, jac_max) = checked_flat_inputs(inputs, dielectric_max_temperature_c,
                                                        jacket_limit)
    _checks.require(np.isfinite(diel_max), "dielectric_max_temperature_c", "finite", diel_max)
    _checks.require(~np.isnan(jac_max), "jacket_max_temperature_c",
                    "not NaN (use None for no limit)", jac_max)
    jac_max = np.where(p.d > p.c, jac_max, np.inf)
    amb = p.ambient_c
    allowed_rise = np.minimum(diel_max - amb, jac_max - amb)
    result = np.zeros(amb.size)
    todo = np.flatnonzero(allowed_rise > 0.0)
    if todo.size == 0:
        return result.reshape(shape)

    q = take(p, todo)
    diel_max, jac_max = diel_max[todo], jac_max[todo]
    has_jac = q.d > q.c
    n_fields = len(INPUT_FIELDS)
    # clad/plated conductors: their surface arrays travel with the others through the root search
    surfaces = [name for name in SURFACE_FIELDS if getattr(q, name) is not None]
    n_surface = len(ConductorSurface._fields)
    args = tuple(getattr(q, name) for name in INPUT_FIELDS) + tuple(
        x for name in surfaces for x in getattr(q, name)) + (diel_max, jac_max)

    def excess(x, *arrays):
        layers = {name: ConductorSurface(*arrays[n_fields + k * n_surface:
                                                 n_fields + (k + 1) * n_surface])
                  for k, name in enumerate(surfaces)}
        sub = CoaxThermalInputs(*arrays[:n_fields], **layers)
        d_max, j_max = arrays[-2:]
        state = solve_flat(sub, np.exp(x), tolerance_k, max_iterations, RUNAWAY_TEMPERATURE_C)
        ok = state.converged
        f = np.full(x.shape, _RUNAWAY_EXCESS_K)
        theta_c, theta_s, j_max = (state.conductor_temperature_c[ok],
                                   state.shield_temperature_c[ok], j_max[ok])
        jacket_excess = np.where((sub.d > sub.c)[ok], theta_s - j_max, -np.inf)
        f[ok] = np.maximum(theta_c - d_max[ok], jacket_excess)
        return f

    # first estimate: the rises at 1 W scaled linearly to the allowed rises
    reference = solve_flat(q, np.ones(todo.size), tolerance_k, max_iterations,
                           RUNAWAY_TEMPERATURE_C)
    with np.errstate(divide="ignore"):
        ratio_c = (diel_max - q.ambient_c) / reference.temperature_rise_k
        ratio_s = np.where(has_jac, (jac_max - q.ambient_c) / (
            reference.shield_temperature_c - q.ambient_c), np.inf)
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


def max_power(a, b, c, d, frequency, ambient_c, inner_resistivity_20c,
              inner_temperature_coefficient, shield_resistivity_20c,
              shield_temperature_coefficient, relative_permittivity, loss_tangent,
              dielectric_thermal_resistivity, jacket_thermal_resistivity,
              dielectric_max_temperature_c, jacket_max_temperature_c=None,
              inner_relative_permeability=1.0, shield_relative_permeability=1.0,
              offset=0.0, inner_strands=1,
              tolerance_k=1e-4, max_iterations=100, geometry_factor=None,
              vswr=1.0, surface_emissivity=0.0, solar_irradiance=0.0, solar_absorption=0.0):
    r"""Maximum CW power of a matched coax in free air (thermal rating).

    Parameters
    ----------
    a, b, c, d, frequency, ambient_c : array_like
        As in :func:`cablefam.physics.thermal.coax_thermal_state` [m], [Hz], [degC].
    inner_resistivity_20c, inner_temperature_coefficient : array_like
        As in :func:`cablefam.physics.thermal.coax_thermal_state` [ohm m], [K^-1].
    shield_resistivity_20c, shield_temperature_coefficient : array_like
        As in :func:`cablefam.physics.thermal.coax_thermal_state` [ohm m], [K^-1].
    relative_permittivity, loss_tangent : array_like
        As in :func:`cablefam.physics.thermal.coax_thermal_state` [-].
    dielectric_thermal_resistivity, jacket_thermal_resistivity : array_like
        As in :func:`cablefam.physics.thermal.coax_thermal_state` [K m W^-1].
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
        As in :func:`cablefam.physics.thermal.coax_thermal_state` [-].
    geometry_factor : array_like, optional
        As in :func:`cablefam.physics.thermal.coax_thermal_state` [-].
    vswr, surface_emissivity, solar_irradiance, solar_absorption : array_like, optional
        Standing-wave ratio (>= 1; ``power`` is then the delivered power), emissivity of the
        outer surface (0: IEC black-surface constants), direct solar radiation [W m^-2] and
        the surface's absorption coefficient; see
        :class:`cablefam.physics.thermal_inputs.CoaxThermalInputs` and
        :mod:`cablefam.physics.thermal_surface`.
    tolerance_k, max_iterations : optional
        Passed to the thermal iteration (:func:`cablefam.physics.thermal.coax_thermal_state`).

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

    where :math:`\theta_c(P)` and :math:`\theta_{sh}(P)` come from
    :func:`cablefam.physics.thermal.coax_thermal_state`;
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
    inputs = CoaxThermalInputs(
        a, b, c, d, frequency, ambient_c, inner_resistivity_20c, inner_temperature_coefficient,
        shield_resistivity_20c, shield_temperature_coefficient, relative_permittivity,
        loss_tangent, dielectric_thermal_resistivity, jacket_thermal_resistivity,
        inner_relative_permeability, shield_relative_permeability, offset, inner_strands,
        geometry_factor, vswr, surface_emissivity, solar_irradiance, solar_absorption)
    return power_rating(inputs, dielectric_max_temperature_c, jacket_max_temperature_c,
                        tolerance_k, max_iterations)
