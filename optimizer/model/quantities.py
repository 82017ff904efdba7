"""Every quantity shown to a person: key -> label, unit, report group; one table for all readers.

The key is the name the quantity has at the edges (``front.parquet`` column, JSON key, the
dictionary returned by :func:`cablefam.optimizer.model.evaluate.evaluate`), unit included.
This table adds what a person reads: a short label, the unit as printed, the section of the
``cablefam inspect`` report, and how it is scaled on axes and in tables (lengths in mm).

Read by the inspect report and the design sheets (:func:`report_groups`), the plots and pick's
table (:func:`display`) and the objectives' labels
(:attr:`cablefam.optimizer.model.objectives.Objective.label`). Adding a quantity is one entry
here (and its computation in ``evaluate``).
"""

from __future__ import annotations

from dataclasses import dataclass

#: Units shown in another unit on axes and in tables: stored unit -> (shown unit, factor).
DISPLAY_UNITS = {"m": ("mm", 1e3)}


@dataclass(frozen=True)
class Quantity:
    key: str
    """Name at the edges, unit included (``z0_ohm``)."""
    label: str
    """Short name as it reads on an axis or a column header, without the unit."""
    unit: str
    """Unit of the stored value, as printed (``-``: dimensionless)."""
    group: str | None = None
    """Section of the inspect report and of a design sheet; None: in neither."""
    note: str = ""
    """How it is computed or what it assumes, shown in parentheses in the report."""
    part_of: str | None = None
    """Key of the total this quantity is a part of (indented under it in the report)."""

    @property
    def with_unit(self) -> str:
        """``label [unit]`` in the stored unit: ``outer diameter [m]``."""
        return f"{self.label} [{self.unit}]"

    @property
    def report_label(self) -> str:
        """The report's line label: capitalized, the note in parentheses, parts indented."""
        text = self.label + (f" ({self.note})" if self.note else "")
        if self.part_of is not None:
            return "  " + text
        return text[:1].upper() + text[1:]

    def display(self) -> tuple[float, str]:
        """(factor, ``label [shown unit]``) for axes and tables: lengths in mm."""
        shown, factor = DISPLAY_UNITS.get(self.unit, (self.unit, 1.0))
        return factor, f"{self.label} [{shown}]"


_IMPEDANCE = "Impedance"
_LINE = "Line parameters"
_LOSS = "Loss and propagation"
_MODES = "Modes and voltage"
_HEAT = "Heat and power (IEC 60287 method, free air)"
_SIZE = "Size, mass, cost"

_ALL = (
    Quantity("z0_ohm", "|Z0|", "ohm", _IMPEDANCE, "complex, at f"),
    Quantity("z0_real_ohm", "Re Z0", "ohm", _IMPEDANCE),
    Quantity("z0_imag_ohm", "Im Z0", "ohm", _IMPEDANCE),
    Quantity("z0_lossless_ohm", "Z0 lossless", "ohm", _IMPEDANCE, "sqrt(L/C)"),
    Quantity("r_ohm_per_m", "R", "ohm/m", _LINE),
    Quantity("l_h_per_m", "L", "H/m", _LINE, "external + internal"),
    Quantity("g_s_per_m", "G", "S/m", _LINE),
    Quantity("c_f_per_m", "C", "F/m", _LINE),
    Quantity("dc_resistance_inner_ohm_per_m", "R dc, centre conductor", "ohm/m", _LINE,
             "20 degC"),
    Quantity("dc_resistance_shield_ohm_per_m", "R dc, shield", "ohm/m", _LINE, "20 degC"),
    Quantity("dc_loop_resistance_ohm_per_km", "DC loop resistance", "ohm/km", _LINE,
             "20 degC"),
    Quantity("attenuation_db_per_100m", "attenuation", "dB/100 m", _LOSS),
    Quantity("conductor_attenuation_db_per_100m", "conductor attenuation", "dB/100 m", _LOSS,
             part_of="attenuation_db_per_100m"),
    Quantity("dielectric_attenuation_db_per_100m", "dielectric attenuation", "dB/100 m", _LOSS,
             part_of="attenuation_db_per_100m"),
    Quantity("velocity_factor", "velocity factor", "-", _LOSS),
    Quantity("delay_s_per_m", "delay", "s/m", _LOSS),
    Quantity("skin_depth_inner_m", "skin depth, centre conductor", "m", _LOSS),
    Quantity("skin_depth_shield_m", "skin depth, shield", "m", _LOSS),
    Quantity("te11_cutoff_hz", "TE11 cutoff", "Hz", _MODES, "exact root"),
    Quantity("te11_cutoff_approx_hz", "TE11 cutoff approx.", "Hz", _MODES,
             "c/(pi (a+b) sqrt(eps_r))"),
    Quantity("peak_e_field_v_per_m", "peak field at centre conductor", "V/m", _MODES),
    Quantity("max_peak_voltage_v", "max peak voltage", "V", _MODES, "strength / safety factor"),
    Quantity("heat_w_per_m", "heat generated", "W/m", _HEAT),
    Quantity("conductor_temperature_c", "centre-conductor temperature", "degC", _HEAT),
    Quantity("shield_temperature_c", "shield temperature", "degC", _HEAT),
    Quantity("surface_temperature_c", "surface temperature", "degC", _HEAT),
    Quantity("temperature_rise_k", "conductor temperature rise", "K", _HEAT),
    Quantity("max_power_w", "max CW power", "W", _HEAT, "temperature limits"),
    Quantity("outer_diameter_m", "outer diameter", "m", _SIZE),
    Quantity("mass_kg_per_km", "mass", "kg/km", _SIZE),
    Quantity("cost_per_km", "material cost", "per km", _SIZE),
    # --- outer conductors as built and screening (issue 12) ---
    Quantity("shield_construction", "shield construction", "-", _LINE,
             "code: 0 tube, 1 foil, 2 braid, 3 foil-braid, 4 double-braid"),
    Quantity("braid_fill_factor", "braid fill factor", "-", _LINE, "F, MIL-C-17"),
    Quantity("braid_optical_coverage", "braid optical coverage", "-", _LINE, "K = 2F - F^2"),
    Quantity("transfer_impedance_ohm_per_m", "|transfer impedance|", "ohm/m", _LINE, "at f"),
    Quantity("transfer_impedance_max_ohm_per_m", "max |transfer impedance|", "ohm/m", _LINE,
             "over the screening band"),
    Quantity("braid_carriers", "braid carriers", "-"),
    Quantity("braid_ends", "braid ends (wires per carrier)", "-"),
    Quantity("braid_wire_diameter_m", "braid wire diameter", "m"),
    Quantity("braid_angle_deg", "braid angle", "deg"),
    Quantity("foil_thickness_m", "foil thickness", "m"),
    # --- end of the outer-conductor block ---
    # not in the report: a flag, the tolerance results, the decision variables
    Quantity("thermal_converged", "thermal steady state", "-"),
    Quantity("impedance_yield", "impedance yield", "-"),
    Quantity("z0_3sigma_low_ohm", "Z0 3-sigma low", "ohm"),
    Quantity("z0_3sigma_high_ohm", "Z0 3-sigma high", "ohm"),
    Quantity("inner_radius_m", "inner radius a", "m"),
    Quantity("dielectric_radius_m", "dielectric radius b", "m"),
    Quantity("shield_thickness_m", "shield thickness", "m"),
    Quantity("jacket_thickness_m", "jacket thickness", "m"),
    # foamed dielectric by void fraction and dielectric dispersion
    Quantity("void_fraction", "dielectric void fraction", "-", _LINE),
    Quantity("effective_relative_permittivity", "effective permittivity", "-", _LINE, "at f"),
    # clad and plated conductors, surface roughness (conductor_layers)
    Quantity("cladding_thickness_inner_m", "cladding, centre conductor", "m", _LINE,
             "per wire"),
    Quantity("cladding_thickness_shield_m", "plating, shield", "m", _LINE, "inner surface"),
    Quantity("roughness_factor_inner", "roughness factor, centre conductor", "-", _LOSS),
    Quantity("roughness_factor_shield", "roughness factor, shield", "-", _LOSS),
)

#: key -> quantity, in report order
QUANTITIES = {q.key: q for q in _ALL}


def report_groups() -> list[tuple[str, list[Quantity]]]:
    """The report's sections in order, each with its quantities in order."""
    groups: dict[str, list[Quantity]] = {}
    for q in QUANTITIES.values():
        if q.group is not None:
            groups.setdefault(q.group, []).append(q)
    return list(groups.items())


def display(key: str) -> tuple[float, str]:
    """(factor, axis label with the shown unit) of a column; an unknown column is shown as
    its key, unscaled."""
    q = QUANTITIES.get(key)
    return (1.0, key) if q is None else q.display()


# --- member keys (a sweep file's [[member]] table): labels for design sheets and the report
#: Keys of a family member's specification -> label and unit, as a person reads them. The
#: key is the sweep-file key (unit in its name); read by the design sheets and the run report.
MEMBER_KEYS = {q.key: q for q in (
    Quantity("name", "member", "-"),
    Quantity("impedance_ohm", "nominal impedance", "ohm"),
    Quantity("impedance_tolerance_ohm", "impedance tolerance (+/-)", "ohm"),
    Quantity("frequency_hz", "highest operating frequency", "Hz"),
    Quantity("power_w", "CW power delivered", "W"),
    Quantity("peak_voltage_v", "peak voltage", "V"),
    Quantity("ambient_c", "ambient temperature", "degC"),
    Quantity("max_outer_diameter_m", "max outer diameter", "m"),
    Quantity("field_safety_factor", "field safety factor (strength / peak field)", "-"),
    Quantity("single_mode_margin", "single-mode margin (TE11 cutoff / frequency)", "-"),
    Quantity("min_shield_skin_depths", "min shield wall thickness", "skin depths"),
    Quantity("min_impedance_yield", "min impedance yield", "-"),
    Quantity("vswr", "voltage standing-wave ratio", "-"),
    Quantity("solar_irradiance_w_per_m2", "solar irradiance", "W/m^2"),
    Quantity("min_velocity_factor", "min velocity factor", "-"),
    Quantity("max_capacitance_f_per_m", "max capacitance", "F/m"),
    Quantity("screening_band_hz", "screening band", "Hz"),
    Quantity("max_transfer_impedance_ohm_per_m", "max transfer impedance over the band",
             "ohm/m"),
    Quantity("min_braid_optical_coverage", "min braid optical coverage", "-"),
)}


def member_label(key: str) -> str:
    """``label [unit]`` of a member key (``ambient temperature [degC]``); the key itself when
    the table does not know it (a key added to the sweep format later)."""
    q = MEMBER_KEYS.get(key)
    if q is None:
        return key
    return q.label if q.unit == "-" else q.with_unit
