r"""The parts of a thermal pass that go beyond a matched line in shaded, still air behind a black
surface: the standing wave's hottest section, the surface of known emissivity, the sun.

Used by :mod:`cablefam.physics.thermal_state` in every pass of the fixed point.

Hottest section of a standing wave
    With the heat factors :math:`h = m_\mathrm{avg} + s\,m_\mathrm{rip}` and
    :math:`l = m_\mathrm{avg} - s\,m_\mathrm{rip}` of
    :mod:`cablefam.physics.standing_wave` (:math:`s` the share of the ripple that reaches the
    temperatures), the temperatures along the line swing between the sections of largest
    current (conductor heat :math:`\times h`, dielectric heat :math:`\times l`) and of largest
    voltage (the reverse). Each temperature is linear in the local heats except through the
    surface rise, which grows with the total heat :math:`W`; each is therefore taken at its
    own worst section:

    .. math::
        \theta_{sh} = \theta_{amb} + W_{\max} T_3 + \Delta\theta_s(W_{\max} + W_{sun}),
        \qquad
        \theta_c = \theta_{sh} + \max_{\text{sections}}\left(W_i + \tfrac12 W_d\right) T_1

    with :math:`W_{\max}` the larger total of the two sections. Taking the two maxima
    separately is exact where both occur at the same section (conductor loss at least the
    dielectric loss, the usual case) and an upper bound otherwise. The heat reported is that
    of the section with the larger total. At VSWR 1 every factor is 1: the matched line.

Surface
    ``surface_emissivity`` 0: the IEC 60287-2-1 constants of a black surface (today's
    model); in (0, 1]: Churchill-Chu convection and grey radiation
    (:func:`cablefam.physics.surface_heat.surface_temperature_rise_still_air`). The absorbed
    sunlight :math:`W_{sun} = \sigma_s D_e H` leaves through the surface with the generated
    heat (clause 1.4.1.1 of IEC 60287-1-1: the term :math:`\sigma D_e^* H T_4`, with
    :math:`T_4` evaluated at the surface rise that includes it, clause 4.2.1 of
    IEC 60287-2-1).
"""

from __future__ import annotations

import numpy as np

from cablefam.physics.constants import speed_of_light
from cablefam.physics.standing_wave import (metal_thermal_conductivity,
                                            standing_wave_heat_factors, standing_wave_smoothing)
from cablefam.physics.stranding import strand_layup
from cablefam.physics.surface_heat import solar_heat, surface_temperature_rise_still_air
from cablefam.physics.thermal_resistances import surface_temperature_rise_free_air


def surface_and_standing_wave_parts(q, t1, de):
    """Per-design constants of :func:`hottest_section` from flat, checked inputs ``q``
    (:class:`cablefam.physics.thermal_inputs.CoaxThermalInputs`), the dielectric's ``t1``
    [K m W^-1] and the outer diameter ``de`` [m]; a dict of 1-D arrays, holding only the
    parts that some design needs (matched, IEC surface and no sun: none)."""
    parts = {}
    average, ripple = standing_wave_heat_factors(q.vswr)
    if np.any(ripple > 0.0):
        # TEM phase constant omega sqrt(mu0 eps) and the centre conductor's axial conductance
        beta = 2.0 * np.pi * q.frequency * np.sqrt(q.relative_permittivity) / speed_of_light
        area = np.pi * q.a * q.a
        if np.any(q.inner_strands != 1):
            area = area * strand_layup(q.inner_strands.astype(int)).area_ratio
        conductance = metal_thermal_conductivity(q.inner_resistivity_20c) * area
        ripple = ripple * standing_wave_smoothing(beta, conductance, t1)
        parts.update(sw_high=average + ripple, sw_low=average - ripple)
    if np.any(q.surface_emissivity > 0.0):
        parts["emissivity"] = q.surface_emissivity
    solar = solar_heat(de, q.solar_irradiance, q.solar_absorption)
    if np.any(solar > 0.0):
        parts["solar_w"] = solar
    return parts


def _surface_rise(k, heat_out):
    """Surface rise above ambient [K] for the heat leaving the surface, per surface model."""
    rise = surface_temperature_rise_free_air(heat_out, k["de"], k["h"])
    if "emissivity" in k:
        grey = k["emissivity"] > 0.0
        rise = np.where(grey, surface_temperature_rise_still_air(
            heat_out, k["de"], np.where(grey, k["emissivity"], 1.0), k["ambient_c"]), rise)
    return rise


def hottest_section(k, w_i, w_s, w_d):
    r"""Heats and temperatures of one pass at the worst sections of the standing wave.

    Parameters
    ----------
    k : dict
        The pass constants of :mod:`cablefam.physics.thermal_state` with those of
        :func:`surface_and_standing_wave_parts`.
    w_i, w_s, w_d : numpy.ndarray
        Matched-line heats per metre of the centre conductor, shield and dielectric
        [W m^-1].

    Returns
    -------
    tuple of numpy.ndarray
        ``w_i, w_s, w_d, heat`` at the section of the larger total [W m^-1], the surface rise
        [K], the shield and the centre-conductor temperatures [degC] (module notes).
    """
    if "sw_high" not in k:  # matched
        heat = w_i + w_s + w_d
        inner = w_i + 0.5 * w_d
    else:
        high, low = k["sw_high"], k["sw_low"]
        i_a, s_a, d_a = w_i * high, w_s * high, w_d * low  # largest current
        heat_a = i_a + s_a + d_a
        inner_a = i_a + 0.5 * d_a
        i_b, s_b, d_b = w_i * low, w_s * low, w_d * high  # largest voltage
        heat_b = i_b + s_b + d_b
        at_a = heat_a >= heat_b
        w_i, w_s, w_d = (np.where(at_a, x, y) for x, y in ((i_a, i_b), (s_a, s_b), (d_a, d_b)))
        heat = np.maximum(heat_a, heat_b)
        inner = np.maximum(inner_a, i_b + 0.5 * d_b)
    rise_s = _surface_rise(k, heat + k["solar_w"] if "solar_w" in k else heat)
    new_s = k["ambient_c"] + heat * k["t3"] + rise_s
    new_c = new_s + inner * k["t1"]
    return w_i, w_s, w_d, heat, rise_s, new_s, new_c
