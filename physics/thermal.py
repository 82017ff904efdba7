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

The line carries the CW power :math:`P`; the heat is that of the input end, where it is
largest. Matched: :math:`|I|^2 = P/\mathrm{Re}\,Z_0`, :math:`|V| = |Z_0||I|`, so that the heat
per metre is :math:`2\,\mathrm{Re}(\gamma)P` (:mod:`cablefam.physics.standing_wave`); with a
standing wave (VSWR) the hottest section of the line
(:mod:`cablefam.physics.thermal_surface`). The resistivities
follow the temperatures of their conductors (clause 2.1.1 of [1]_), so the heat and the
temperatures are solved together by fixed-point iteration.

The model is spread over modules by what they hold, and every public name is re-exported
here (import from :mod:`cablefam.physics.thermal`):

- :mod:`cablefam.physics.thermal_inputs` -- :class:`CoaxThermalInputs` (the inputs of a
  population, grouped), their checks, :func:`resistivity_at_temperature`;
- :mod:`cablefam.physics.thermal_resistances` -- :math:`T_1`, :math:`T_3`, :math:`T_4` and the
  free-air surface rise;
- :mod:`cablefam.physics.thermal_state` -- :func:`coax_thermal_state` (the fixed point),
  :class:`ThermalState`;
- :mod:`cablefam.physics.thermal_rating` -- :func:`max_power` (the thermal rating);
- :mod:`cablefam.physics.thermal_surface` -- standing wave, surface emissivity and sun in a
  pass (with :mod:`cablefam.physics.standing_wave` and :mod:`cablefam.physics.surface_heat`).

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

from cablefam.physics.thermal_inputs import (CoaxThermalInputs, checked_flat_inputs,
                                             resistivity_at_temperature)
from cablefam.physics.thermal_rating import max_power, power_rating
from cablefam.physics.thermal_resistances import (FREE_AIR_SINGLE_CABLE_E, FREE_AIR_SINGLE_CABLE_G,
                                                  FREE_AIR_SINGLE_CABLE_Z,
                                                  external_thermal_resistance_free_air,
                                                  free_air_heat_transfer_coefficient,
                                                  insulation_thermal_resistance,
                                                  surface_temperature_rise_free_air)
from cablefam.physics.thermal_state import (RUNAWAY_TEMPERATURE_C, ThermalState,
                                            coax_thermal_state, steady_state)

__all__ = [
    "FREE_AIR_SINGLE_CABLE_E", "FREE_AIR_SINGLE_CABLE_G", "FREE_AIR_SINGLE_CABLE_Z",
    "RUNAWAY_TEMPERATURE_C", "CoaxThermalInputs", "ThermalState", "checked_flat_inputs",
    "coax_thermal_state", "external_thermal_resistance_free_air",
    "free_air_heat_transfer_coefficient", "insulation_thermal_resistance", "max_power",
    "power_rating", "resistivity_at_temperature", "steady_state",
    "surface_temperature_rise_free_air",
]
