"""Operating conditions of the ratings beyond a matched line in shade: the standing wave (VSWR),
the outer surface's emissivity, the sun; and the voltage limit with the strand crowns.

Called from :mod:`cablefam.optimizer.model.evaluate` (kept there in a few lines).

- ``vswr`` (operating point, default 1): the power is the *delivered* power; the heat is that
  of the hottest sections of the standing wave (:mod:`cablefam.physics.thermal_surface`) and
  the field limit is checked at the voltage maximum, :math:`(1 + |\\Gamma|)` times the incident
  wave's peak voltage ``peak_voltage_v``. ``max_peak_voltage_v`` is the largest incident peak
  voltage that keeps the field at the voltage maximum within the limit.
- ``surface_emissivity``: of the jacket record, or of the shield's record where there is no
  jacket; absent: the IEC 60287-2-1 black-surface constants (the earlier numbers).
- ``solar_irradiance_w_per_m2`` (operating point, default 0) with the outer surface's
  ``solar_absorption`` (absent: 1, all the sunlight absorbed, which errs on the safe side).
- Stranded centre conductors: the field at the strand crowns
  (:func:`cablefam.physics.stranding.stranded_crown_field_factor`).
"""

from __future__ import annotations

import numpy as np

from cablefam.physics import fields
from cablefam.physics.standing_wave import voltage_maximum_factor
from cablefam.physics.stranding import stranded_crown_field_factor

#: Solar absorption coefficient used where the outer surface's record gives none: all the
#: sunlight is absorbed (a black body; errs on the safe side).
DEFAULT_SOLAR_ABSORPTION = 1.0


def _surface_value(d, key, default):
    """``key`` of the outer surface's record per design: the jacket where it is, the shield
    where there is no jacket; ``default`` where the record has none."""
    jacket = d.jacket or {}
    shield_value = d.shield.get(key, default)
    return np.where(np.asarray(d.jacket_thickness) > 0.0, jacket.get(key, default),
                    shield_value)


def thermal_conditions(d, op) -> dict:
    """The keyword arguments of :class:`cablefam.physics.thermal.CoaxThermalInputs` that
    describe the standing wave, the outer surface and the sun."""
    irradiance = getattr(op, "solar_irradiance_w_per_m2", 0.0)
    return {
        "vswr": getattr(op, "vswr", 1.0),
        "surface_emissivity": _surface_value(d, "surface_emissivity", 0.0),
        "solar_irradiance": irradiance,
        "solar_absorption": (_surface_value(d, "solar_absorption", DEFAULT_SOLAR_ABSORPTION)
                             if np.any(irradiance) else 0.0),
    }


def _field_factor(d, op):
    """Crown factor of the lay-up times the voltage maximum of the standing wave, or None."""
    factor = None
    if np.any(np.asarray(d.inner_strands) != 1):
        factor = stranded_crown_field_factor(d.inner_strands)
    vswr = getattr(op, "vswr", 1.0)
    if np.any(np.asarray(vswr) != 1.0):
        v_max = voltage_maximum_factor(vswr)
        factor = v_max if factor is None else factor * v_max
    return factor


def field_quantities(d, op, a_el, lam) -> dict:
    """``peak_e_field_v_per_m`` and ``max_peak_voltage_v`` with the strand crowns and the
    standing wave's voltage maximum (each only where its inputs are given).

    An offset stranded conductor takes the product of the offset's crowding factor and the
    crown factor: the crowns raise the field locally on whichever side is nearest the shield
    (the crown factor itself is that of a concentric lay-up)."""
    out = {}
    factor = _field_factor(d, op)
    b = d.dielectric_radius
    if op.peak_voltage_v is not None:
        e = fields.peak_electric_field(a_el, b, op.peak_voltage_v, offset=d.eccentricity,
                                       geometry_factor=lam)
        out["peak_e_field_v_per_m"] = e if factor is None else e * factor
    if "dielectric_strength_v_per_m" in d.dielectric:
        v = fields.max_peak_voltage(a_el, b, d.dielectric["dielectric_strength_v_per_m"],
                                    op.field_safety_factor, offset=d.eccentricity,
                                    geometry_factor=lam)
        out["max_peak_voltage_v"] = v if factor is None else v / factor
    return out
