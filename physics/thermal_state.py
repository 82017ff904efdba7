r"""Steady temperatures of a matched coax in free air carrying CW power: the fixed point of the
IEC 60287 rating equation and the loss of the line (model: :mod:`cablefam.physics.thermal`).

References
----------
.. [1] IEC 60287-1-1:2006+AMD1:2014, clauses 1.4.1.1 and 2.1.1.
.. [2] IEC 60287-2-1:2015, clauses 4.1.2, 4.1.4 and 4.2.1.
"""

from __future__ import annotations

from typing import NamedTuple

import numpy as np

from cablefam.physics import _checks
from cablefam.physics.line import LineFixedParts, conductor_impedances, line_fixed_parts
from cablefam.physics.eccentricity import geometry_factor
from cablefam.physics.standing_wave import matched_line_squares
from cablefam.physics.conductor_surface import surface_at_temperature, take_surface
from cablefam.physics.thermal_inputs import (CoaxThermalInputs, checked_flat_inputs,
                                             resistivity_at_temperature, take)
from cablefam.physics.thermal_resistances import (free_air_heat_transfer_coefficient,
                                                  insulation_thermal_resistance)
from cablefam.physics.thermal_surface import hottest_section, surface_and_standing_wave_parts

#: Conductor temperature [degC] above which a design is taken as thermally run away (no
#: steady state worth reporting; every cable material has melted or burnt far below it).
RUNAWAY_TEMPERATURE_C = 1000.0

#: Designs iterated together in their first passes, and the number of those passes (see
#: :func:`solve_flat`). Only speed depends on them: blocks whose arrays stay in the processor
#: caches, and few passes over nearly empty blocks (measured with
#: tests/benchmarks/bench_physics.py).
BLOCK_DESIGNS = 16384
BLOCK_PASSES = 5


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


def check_iteration_settings(tolerance_k, max_iterations):
    """ValueError unless ``tolerance_k`` is finite and > 0 and ``max_iterations`` an int >= 1."""
    if not (np.isfinite(tolerance_k) and tolerance_k > 0.0):
        raise ValueError(f"tolerance_k must be finite and > 0, got {tolerance_k!r}")
    if int(max_iterations) != max_iterations or max_iterations < 1:
        raise ValueError(f"max_iterations must be an integer >= 1, got {max_iterations!r}")


def _fixed_parts(q: CoaxThermalInputs, power):
    """Everything of a block that the temperatures do not change, as named 1-D arrays."""
    t3 = np.zeros(power.size)
    jacket = q.d > q.c
    t3[jacket] = insulation_thermal_resistance(q.jacket_thermal_resistivity[jacket],
                                               q.c[jacket], q.d[jacket])
    de = 2.0 * q.d
    # T1 of an offset centre conductor: the eccentric geometry factor of the overall radius
    # (the same bipolar solution as the capacitance; exactly ln(b/a) when concentric)
    t1 = q.dielectric_thermal_resistivity / (2.0 * np.pi) * geometry_factor(q.a, q.b, q.offset)
    return {
        "a": q.a, "b": q.b, "c": q.c, "frequency": q.frequency,
        "omega": 2.0 * np.pi * q.frequency, "power": power, "ambient_c": q.ambient_c,
        "rho_i": q.inner_resistivity_20c, "alpha_i": q.inner_temperature_coefficient,
        "rho_s": q.shield_resistivity_20c, "alpha_s": q.shield_temperature_coefficient,
        "mu_i": q.inner_relative_permeability, "mu_s": q.shield_relative_permeability,
        "t1": t1, "t3": t3, "de": de, "h": free_air_heat_transfer_coefficient(de),
        **surface_and_standing_wave_parts(q, t1, de),
    }


def _keep(fixed: LineFixedParts, keep):
    return LineFixedParts(*(None if x is None else x[keep] for x in fixed))


def _iterate(q: CoaxThermalInputs, power, theta_c, theta_s, passes, settings, out, where):
    """Run the given passes of the fixed point on some designs; see :func:`coax_thermal_state`.

    ``q``, ``power``, ``theta_c``, ``theta_s`` are those of the designs at positions ``where``
    of ``out`` (1-D, checked). A design that converges, runs away or reaches the last allowed
    pass is written to ``out`` (its surface *rise* in ``surface_temperature_c``). Returns the
    positions and temperatures of the designs still iterating after the last of ``passes``.
    """
    tolerance_k, max_iterations, runaway_temperature_c = settings
    k = _fixed_parts(q, power)
    line = line_fixed_parts(q.a, q.b, q.frequency, q.relative_permittivity, q.loss_tangent,
                            q.offset, q.inner_strands, q.geometry_factor)
    surface_i, surface_s = q.inner_surface, q.shield_surface  # layers heat with their conductor
    for it in passes:
        if where.size == 0:
            break
        z = conductor_impedances(
            k["a"], k["b"], k["c"], k["frequency"],
            resistivity_at_temperature(k["rho_i"], k["alpha_i"], theta_c),
            resistivity_at_temperature(k["rho_s"], k["alpha_s"], theta_s),
            line, k["mu_i"], k["mu_s"],
            inner_surface=surface_at_temperature(surface_i, theta_c),
            shield_surface=surface_at_temperature(surface_s, theta_s))
        r_i, r_s = z.r_inner, z.r_shield
        inductance = line.l_external + (z.x_inner + z.x_shield) / k["omega"]
        # matched line: P = |I|^2 Re Z0, so that the heat is 2 Re(gamma) P
        current_sq, voltage_sq = matched_line_squares(r_i + r_s, k["omega"] * inductance,
                                                      line.g, k["omega"] * line.c)
        w_i, w_s, w_d, heat, rise_s, new_s, new_c = hottest_section(
            k, current_sq * k["power"] * r_i, current_sq * k["power"] * r_s,
            line.g * k["power"] * voltage_sq)
        if np.isnan(new_c).any():  # checked inputs cannot give NaN: a fault upstream
            bad = int(where[np.flatnonzero(np.isnan(new_c))[0]])
            raise FloatingPointError(f"NaN heat from cablefam.physics.line for design element "
                                     f"{bad}")
        done = (np.abs(new_c - theta_c) <= tolerance_k) & (np.abs(new_s - theta_s) <= tolerance_k)
        runaway = ~(new_c <= runaway_temperature_c)
        leave = done | runaway
        if it == max_iterations:
            leave[:] = True
        if not leave.any():
            theta_c, theta_s = new_c, new_s
            continue
        gone = np.flatnonzero(leave)  # integer indices: gathers 5x faster than masks
        j = where[gone]
        for dst, src in ((out.conductor_temperature_c, new_c), (out.shield_temperature_c, new_s),
                         (out.surface_temperature_c, rise_s), (out.heat_inner_w_per_m, w_i),
                         (out.heat_shield_w_per_m, w_s), (out.heat_dielectric_w_per_m, w_d)):
            dst[j] = src[gone]
        out.iterations[j] = it
        out.converged[j] = ~runaway[gone] & done[gone]
        stay = np.flatnonzero(~leave)
        where, theta_c, theta_s = where[stay], new_c[stay], new_s[stay]
        if where.size:
            k = {name: x[stay] for name, x in k.items()}
            line = _keep(line, stay)
            surface_i, surface_s = take_surface(surface_i, stay), take_surface(surface_s, stay)
    return where, theta_c, theta_s


def solve_flat(q: CoaxThermalInputs, power, tolerance_k, max_iterations,
               runaway_temperature_c) -> ThermalState:
    """The steady state of flat, checked inputs; 1-D fields (see :func:`coax_thermal_state`).

    Blocks of :data:`BLOCK_DESIGNS` designs make their first :data:`BLOCK_PASSES` passes
    each; the few designs still iterating then continue together. Every pass is elementwise,
    so this order of work changes no result.
    """
    n = power.size
    out = ThermalState(*(np.empty(n) for _ in range(8)), np.zeros(n, dtype=bool),
                       np.zeros(n, dtype=int))
    settings = (tolerance_k, int(max_iterations), runaway_temperature_c)
    split = BLOCK_PASSES if n > BLOCK_DESIGNS else int(max_iterations)
    left = []
    for start in range(0, n, BLOCK_DESIGNS):
        block = slice(start, min(n, start + BLOCK_DESIGNS))
        part = take(q, block)
        left.append(_iterate(part, power[block], part.ambient_c.copy(), part.ambient_c.copy(),
                             range(1, split + 1), settings, out, np.arange(block.start,
                                                                           block.stop)))
    if left and split < max_iterations:
        where, theta_c, theta_s = (np.concatenate(x) for x in zip(*left))
        _iterate(take(q, where), power[where], theta_c, theta_s,
                 range(split + 1, int(max_iterations) + 1), settings, out, where)
    failed = ~out.converged
    out.surface_temperature_c[:] += q.ambient_c  # held the surface rise
    for x in (out.conductor_temperature_c, out.shield_temperature_c, out.surface_temperature_c,
              out.heat_inner_w_per_m, out.heat_shield_w_per_m, out.heat_dielectric_w_per_m):
        x[failed] = np.inf
    out.temperature_rise_k[:] = out.conductor_temperature_c - q.ambient_c
    out.heat_w_per_m[:] = out.heat_inner_w_per_m + out.heat_shield_w_per_m + (
        out.heat_dielectric_w_per_m)
    return out


def steady_state(inputs: CoaxThermalInputs, power, tolerance_k=1e-4, max_iterations=100,
                 runaway_temperature_c=RUNAWAY_TEMPERATURE_C) -> ThermalState:
    """:func:`coax_thermal_state` of grouped inputs (same parameters, same result)."""
    check_iteration_settings(tolerance_k, max_iterations)
    shape, q, (power_flat,) = checked_flat_inputs(inputs, power)
    _checks.require(np.isfinite(power_flat) & (power_flat >= 0.0), "power", "finite and >= 0",
                    power_flat)
    state = solve_flat(q, power_flat, tolerance_k, max_iterations, runaway_temperature_c)
    return ThermalState(*(x.reshape(shape) for x in state))


def coax_thermal_state(a, b, c, d, frequency, power, ambient_c, inner_resistivity_20c,
                       inner_temperature_coefficient, shield_resistivity_20c,
                       shield_temperature_coefficient, relative_permittivity, loss_tangent,
                       dielectric_thermal_resistivity, jacket_thermal_resistivity,
                       inner_relative_permeability=1.0, shield_relative_permeability=1.0,
                       offset=0.0, inner_strands=1,
                       tolerance_k=1e-4, max_iterations=100,
                       runaway_temperature_c=RUNAWAY_TEMPERATURE_C, geometry_factor=None,
                       vswr=1.0, surface_emissivity=0.0, solar_irradiance=0.0,
                       solar_absorption=0.0):
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
    geometry_factor : array_like, optional
        :math:`\Lambda` of the effective centre-conductor radius, ``b`` and ``offset``
        (:func:`cablefam.physics.eccentricity.geometry_factor`) when the caller has it [-].
    vswr, surface_emissivity, solar_irradiance, solar_absorption : array_like, optional
        Standing-wave ratio (>= 1; ``power`` is then the delivered power), emissivity of the
        outer surface (0: IEC black-surface constants), direct solar radiation [W m^-2] and
        the surface's absorption coefficient; see
        :class:`cablefam.physics.thermal_inputs.CoaxThermalInputs` and
        :mod:`cablefam.physics.thermal_surface`.
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
    2. :math:`R_i, R_s, G` and :math:`|Z_0|` as in
       :func:`cablefam.physics.line.line_parameters` (exact skin-effect resistance); the
       parts that do not depend on temperature (:math:`\Lambda`, :math:`L_e`, :math:`C`,
       :math:`G`, :math:`T_1`, :math:`T_3`, :math:`h`) are computed once, the internal
       impedances (:func:`cablefam.physics.line.conductor_impedances`) every pass;
    3. :math:`I^2 = P/\mathrm{Re}\,Z_0`, :math:`V^2 = P|Z_0|^2/\mathrm{Re}\,Z_0` (so that
       :math:`W = 2\,\mathrm{Re}(\gamma)P`), :math:`W_i = I^2R_i`, :math:`W_s = I^2R_s`,
       :math:`W_d = GV^2`, :math:`W = W_i + W_s + W_d`; with VSWR > 1 these at the hottest
       sections of the standing wave, and the sun's heat added at the surface
       (:mod:`cablefam.physics.thermal_surface`);
    4. :math:`\Delta\theta_s = (W/(\pi D_e h))^{4/5}`, i.e. :math:`W T_4` with :math:`T_4` of
       clause 4.2.1 of [2]_ (see :func:`surface_temperature_rise_free_air`), :math:`D_e = 2d`;
    5. rating equation of clause 1.4.1.1 of [1]_ with the mapping of the module docstring:

       .. math::
           \theta_{sh} = \theta_{amb} + W T_3 + \Delta\theta_s, \qquad
           \theta_c = \theta_{sh} + \left(W_i + \tfrac{1}{2}W_d\right) T_1

       with :math:`T_1` (dielectric) and :math:`T_3` (jacket) of clauses 4.1.2 and 4.1.4 of
       [2]_; for an offset centre conductor :math:`T_1 = \rho_T\Lambda/(2\pi)` with the
       eccentric :math:`\Lambda` of :func:`cablefam.physics.eccentricity.geometry_factor`
       (overall radius): the dielectric between two isothermal cylinders is the same
       two-dimensional potential problem as the capacitance.

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
    inputs = CoaxThermalInputs(
        a, b, c, d, frequency, ambient_c, inner_resistivity_20c, inner_temperature_coefficient,
        shield_resistivity_20c, shield_temperature_coefficient, relative_permittivity,
        loss_tangent, dielectric_thermal_resistivity, jacket_thermal_resistivity,
        inner_relative_permeability, shield_relative_permeability, offset, inner_strands,
        geometry_factor, vswr, surface_emissivity, solar_irradiance, solar_absorption)
    return steady_state(inputs, power, tolerance_k, max_iterations, runaway_temperature_c)
