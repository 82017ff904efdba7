"""Constraints of a family member, as margins: positive inside the limit, negative outside.

Each margin is normalised by its limit, as pymoo expects of ``G = -margin`` (feasible when
``G <= 0``): ``(limit - value) / limit``; temperatures are normalised by the allowed rise above
ambient. The same margins are written to ``front.parquet`` as ``margin_<name>`` columns.
"""

from __future__ import annotations

import numpy as np

#: Smallest b/a the search accepts as a valid coax (Z0 of about 0.6 ohm in air below it).
MIN_RADIUS_RATIO = 1.01
#: Margin given to a design with no thermal steady state (runaway) or a non-finite quantity:
#: far outside every limit, but finite so that pymoo can still rank infeasible designs.
NON_FINITE_MARGIN = -1.0e3

CONSTRAINTS = ("geometry", "impedance", "peak_field", "conductor_temperature",
               "jacket_temperature", "single_mode", "outer_diameter", "shield_skin_depths",
               "impedance_yield",
               # foamed dielectric by void fraction
               "velocity_factor", "capacitance",
               # outer conductors and screening
               "transfer_impedance", "braid_coverage")


def geometry_margin(a, b):
    """(b - 1.01 a) / b: negative when the dielectric radius does not exceed the inner one."""
    return (b - MIN_RADIUS_RATIO * a) / b


def constraint_margins(values, designs, member, dielectric_max_c, jacket_max_c):
    """All margins of a member for evaluated designs; dict name -> array (shape of designs).

    Parameters
    ----------
    values : dict
        Output of :func:`cablefam.optimizer.model.evaluate.evaluate`.
    designs : cablefam.optimizer.model.evaluate.Designs
        The designs evaluated.
    member : cablefam.optimizer.inputs.sweep_spec.MemberSpec
        Limits and operating point.
    dielectric_max_c, jacket_max_c : array_like or None
        Temperature limits of the chosen dielectric and jacket [degC].
    """
    a, b = designs.inner_radius, designs.dielectric_radius
    shape = np.shape(a)
    off = np.full(shape, 1.0)  # an unused constraint is satisfied with unit margin
    m = {"geometry": geometry_margin(a, b)}
    m["impedance"] = (member.impedance_tolerance_ohm
                      - np.abs(values["z0_ohm"] - member.impedance_ohm)
                      ) / member.impedance_tolerance_ohm
    if member.peak_voltage_v is not None and "max_peak_voltage_v" in values:
        m["peak_field"] = (values["max_peak_voltage_v"] - member.peak_voltage_v) / np.maximum(
            values["max_peak_voltage_v"], 1e-30)
    else:
        m["peak_field"] = off
    if member.power_w is not None and "conductor_temperature_c" in values:
        budget = np.maximum(np.asarray(dielectric_max_c) - member.ambient_c, 1.0)
        m["conductor_temperature"] = (dielectric_max_c - values["conductor_temperature_c"]) / budget
        if jacket_max_c is not None:
            budget_j = np.maximum(np.asarray(jacket_max_c) - member.ambient_c, 1.0)
            m["jacket_temperature"] = (jacket_max_c - values["shield_temperature_c"]) / budget_j
        else:
            m["jacket_temperature"] = off
    else:
        m["conductor_temperature"] = off
        m["jacket_temperature"] = off
    if member.single_mode_margin > 0:
        need = member.single_mode_margin * member.frequency_hz
        m["single_mode"] = (values["te11_cutoff_hz"] - need) / need
    else:
        m["single_mode"] = off
    if member.max_outer_diameter_m is not None:
        m["outer_diameter"] = (member.max_outer_diameter_m - values["outer_diameter_m"]
                               ) / member.max_outer_diameter_m
    else:
        m["outer_diameter"] = off
    if member.min_shield_skin_depths > 0:
        need = member.min_shield_skin_depths * values["skin_depth_shield_m"]
        band = getattr(member, "screening_band_hz", None)
        if band is not None:  # at the lowest frequency of the screening band
            need = need * np.sqrt(member.frequency_hz / band[0])
        m["shield_skin_depths"] = (designs.shield_thickness - need) / need
    else:
        m["shield_skin_depths"] = off
    if member.min_impedance_yield is not None and "impedance_yield" in values:
        m["impedance_yield"] = (values["impedance_yield"] - member.min_impedance_yield
                                ) / member.min_impedance_yield
    else:
        m["impedance_yield"] = off
    # foamed dielectric by void fraction: the member's velocity-factor and capacitance limits
    vf_min = getattr(member, "min_velocity_factor", None)
    m["velocity_factor"] = (off if vf_min is None
                            else (values["velocity_factor"] - vf_min) / vf_min)
    c_max = getattr(member, "max_capacitance_f_per_m", None)
    m["capacitance"] = off if c_max is None else (c_max - values["c_f_per_m"]) / c_max
    limit = getattr(member, "max_transfer_impedance_ohm_per_m", None)
    if limit is not None and "transfer_impedance_max_ohm_per_m" in values:
        m["transfer_impedance"] = (limit - values["transfer_impedance_max_ohm_per_m"]) / limit
    else:
        m["transfer_impedance"] = off
    cover = getattr(member, "min_braid_optical_coverage", None)
    if "braid_fill_factor" in values:
        # a braid needs F <= 1 (more wire does not fit) and, if asked, the coverage
        fill = values["braid_fill_factor"]
        margin = 1.0 - fill
        if cover is not None:
            margin = np.minimum(margin, (values["braid_optical_coverage"] - cover) / cover)
        m["braid_coverage"] = np.where(fill > 0.0, margin, 1.0)  # tubes, foils: no braid
    else:
        m["braid_coverage"] = off
    return {k: np.where(np.isfinite(v), v, NON_FINITE_MARGIN).astype(float) * np.ones(shape)
            for k, v in ((k, m[k]) for k in CONSTRAINTS)}
