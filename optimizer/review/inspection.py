"""``cablefam inspect``: every quantity of one design, as a report, a JSON object or a profile."""

from __future__ import annotations

import json
import math
from dataclasses import dataclass

import numpy as np
import pandas as pd

from cablefam.optimizer.model.outer_conductor import shield_build_m
from cablefam.optimizer.cautions import CAUTION_LINES
from cablefam.optimizer.inputs.design_file import Design, design_arrays, load_design
from cablefam.optimizer.model.evaluate import evaluate
from cablefam.optimizer.model.quantities import report_groups
from cablefam.physics import fields


@dataclass(frozen=True)
class Inspection:
    """A design and its evaluated quantities (floats, SI, keys with units)."""

    design: Design
    values: dict[str, float]


def inspect_design(path) -> Inspection:
    """Load a design file and evaluate it (the library call behind ``cablefam inspect``)."""
    design = load_design(path)
    return inspect_loaded(design)


def inspect_loaded(design: Design) -> Inspection:
    """Evaluate an already validated design."""
    designs, op = design_arrays(design)
    values = {k: float(np.asarray(v).reshape(-1)[0]) for k, v in evaluate(designs, op).items()}
    return Inspection(design=design, values=values)


def to_json_object(result: Inspection) -> dict:
    """The ``--json`` object: name, material ids and every quantity; non-finite -> null."""
    obj: dict[str, object] = {"name": result.design.name}
    for table, mid in result.design.material_ids.items():
        if mid is not None:
            obj[f"{table}_id"] = mid
    for key, value in result.values.items():
        if key == "thermal_converged":
            obj[key] = bool(value)
        else:
            obj[key] = value if math.isfinite(value) else None
    return obj


def to_json(result: Inspection) -> str:
    return json.dumps(to_json_object(result), indent=2, allow_nan=False)


# ------------------------------------------------------------------------------------ report

_PREFIXES = {-15: "f", -12: "p", -9: "n", -6: "u", -3: "m", 0: "", 3: "k", 6: "M", 9: "G",
             12: "T"}
#: Units shown with an engineering prefix; every other unit is printed as is.
_PREFIXED_UNITS = {"ohm", "ohm/m", "H/m", "F/m", "S/m", "s/m", "Hz", "m", "V/m", "V", "W",
                   "W/m"}

#: Sections of the report: (title, [(key, label, unit), ...]), from the quantity registry.
REPORT_LAYOUT = [(title, [(q.key, q.report_label, q.unit) for q in quantities])
                 for title, quantities in report_groups()]


def engineering(value: float, unit: str) -> str:
    """``value`` with 4 significant figures and, for SI units, an engineering prefix."""
    if not math.isfinite(value):
        return "runaway (no steady state)" if value > 0 else "n/a"
    if unit not in _PREFIXED_UNITS or value == 0.0:
        return f"{value:.4g} {unit}".rstrip(" -") if unit != "-" else f"{value:.4g}"
    exp3 = int(math.floor(math.log10(abs(value)) / 3.0)) * 3
    exp3 = max(min(exp3, 12), -15)
    return f"{value / 10.0 ** exp3:.4g} {_PREFIXES[exp3]}{unit}"


def format_report(result: Inspection) -> str:
    """A readable report of one design, with the cautions."""
    d = result.design
    g, o = d.geometry, d.operating
    lines = [f"cablefam inspect: {d.name}", ""]
    ids = ", ".join(f"{t} {m}" for t, m in d.material_ids.items() if m)
    if d.catalog is not None:
        lines.append(f"catalog     {d.catalog.name} ({d.catalog.path}): {ids}")
    c = g.dielectric_radius_m + shield_build_m(g)
    lines.append(f"geometry    a = {engineering(g.inner_radius_m, 'm')}, "
                 f"b = {engineering(g.dielectric_radius_m, 'm')}, "
                 f"c = {engineering(c, 'm')}, "
                 f"d = {engineering(c + g.jacket_thickness_m, 'm')} "
                 f"(b/a = {g.dielectric_radius_m / g.inner_radius_m:.4g})")
    if g.eccentricity_m:
        lines.append(f"            centre conductor off axis by {engineering(g.eccentricity_m, 'm')}"
                     " (eccentric-line impedance, Wheeler loss factors, field crowding)")
    op = [f"f = {engineering(o.frequency_hz, 'Hz')}"]
    if o.peak_voltage_v is not None:
        op.append(f"peak voltage {engineering(o.peak_voltage_v, 'V')}")
    if o.power_w is not None:
        op.append(f"CW power {engineering(o.power_w, 'W')}")
    op.append(f"ambient {o.ambient_c:g} degC")
    if o.vswr != 1.0:  # ratings on the safe side: standing wave, sun
        op.append(f"VSWR {o.vswr:g} (power delivered; hottest sections, voltage maximum)")
    if o.solar_irradiance_w_per_m2:
        op.append(f"sun {o.solar_irradiance_w_per_m2:g} W/m^2")
    lines.append("operating   " + ", ".join(op))
    if o.power_w is not None:
        lines.append("            (line quantities at the operating temperatures)")
    for title, rows in REPORT_LAYOUT:
        present = [(k, label, u) for k, label, u in rows if k in result.values]
        if not present:
            continue
        lines += ["", title]
        for key, label, unit in present:
            lines.append(f"  {label:<46s} {engineering(result.values[key], unit)}")
    if result.values.get("thermal_converged", 1.0) == 0.0:
        lines += ["", "WARNING: no thermal steady state at this power (thermal runaway)."]
    lines += [""] + CAUTION_LINES
    return "\n".join(lines)


# ----------------------------------------------------------------------------------- profile


def profile_points(a, b, c, outer, delta_inner, delta_shield):
    """Radii across the four regions, dense within a few skin depths of each metal surface."""
    inner = np.concatenate([np.linspace(0.0, a, 41),
                            a - delta_inner * np.linspace(0.0, 8.0, 33)])
    inner = np.clip(inner, 0.0, np.nextafter(a, 0.0))
    inner = np.append(inner, np.nextafter(a, 0.0))
    diel = np.geomspace(a, np.nextafter(b, 0.0), 40)
    wall = np.clip(np.concatenate([np.linspace(b, c, 31),
                                   b + delta_shield * np.linspace(0.0, 8.0, 33)]),
                   b, np.nextafter(c, 0.0))
    outside = np.linspace(c, 1.25 * outer, 11)
    return np.unique(np.concatenate([inner, diel, wall, outside]))


def profile_table(result: Inspection) -> pd.DataFrame:
    """B(r), |J(r)| and E(r) amplitudes across the four regions at the operating point.

    Current: ``current_a`` if given, else the peak current of ``power_w`` in a matched line,
    else 1 A. Voltage: ``peak_voltage_v``, else the peak voltage of ``power_w``, else 1 V.
    """
    d, v = result.design, result.values
    g, o = d.geometry, d.operating
    a, b = g.inner_radius_m, g.dielectric_radius_m
    c = b + shield_build_m(g)
    z0 = v["z0_ohm"]
    re_z0 = v.get("z0_real_ohm", z0)  # matched line: P = |I|^2 Re Z0, |V| = |Z0| |I|
    current = o.current_a if o.current_a is not None else (
        math.sqrt(2.0 * o.power_w / re_z0) if o.power_w else 1.0)
    voltage = o.peak_voltage_v if o.peak_voltage_v is not None else (
        z0 * math.sqrt(2.0 * o.power_w / re_z0) if o.power_w else 1.0)
    r = profile_points(a, b, c, c + g.jacket_thickness_m, v["skin_depth_inner_m"],
                       v["skin_depth_shield_m"])
    args = (r, a, b, c, current, o.frequency_hz, d.conductor.resistivity_ohm_m,
            d.shield.resistivity_ohm_m, d.conductor.relative_permeability,
            d.shield.relative_permeability)
    return pd.DataFrame({
        "r_m": r,
        "b_t": np.abs(fields.magnetic_field_ac(*args)),
        "j_a_per_m2": np.abs(fields.current_density_ac(*args)),
        "e_v_per_m": fields.electric_field(r, a, b, voltage),
    })
