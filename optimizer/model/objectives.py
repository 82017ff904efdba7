"""The objectives a sweep may ask for: name in the sweep file -> evaluated quantity and sense."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from cablefam.optimizer.model.quantities import QUANTITIES


@dataclass(frozen=True)
class Objective:
    name: str
    """Name used in the sweep file."""
    column: str
    """Key of the evaluated quantity (a ``front.parquet`` column)."""
    maximise: bool

    @property
    def label(self) -> str:
        """Axis label with unit, from :data:`cablefam.optimizer.model.quantities.QUANTITIES`."""
        return QUANTITIES[self.column].with_unit


OBJECTIVES = {o.name: o for o in (
    Objective("attenuation", "attenuation_db_per_100m", False),
    Objective("mass", "mass_kg_per_km", False),
    Objective("outer_diameter", "outer_diameter_m", False),
    Objective("cost", "cost_per_km", False),
    Objective("dc_loop_resistance", "dc_loop_resistance_ohm_per_km", False),
    Objective("max_power", "max_power_w", True),
    Objective("max_peak_voltage", "max_peak_voltage_v", True),
    Objective("impedance_yield", "impedance_yield", True),
)}


def objective_matrix(values: dict, names) -> np.ndarray:
    """Stack the objectives as pymoo minimises them (maximised ones negated), shape (n, k)."""
    cols = []
    for name in names:
        o = OBJECTIVES[name]
        v = np.asarray(values[o.column], dtype=float)
        cols.append(-v if o.maximise else v)
    return np.column_stack(cols)


#: Default resolution of each objective, in the unit of its column: the search keeps one design
#: per resolution box (epsilon-dominance), so two designs of a front differ by at least one step
#: in some objective. Overridable per sweep (``[search.resolution]``).
RESOLUTIONS = {
    "attenuation": 0.01,          # dB/100 m
    "mass": 0.1,                  # kg/km
    "outer_diameter": 1e-5,       # m (0.01 mm)
    "cost": 0.1,                  # currency units per km
    "dc_loop_resistance": 0.01,   # ohm/km
    "max_power": 1.0,             # W
    "max_peak_voltage": 1.0,      # V
    "impedance_yield": 1e-4,      # share
}


def resolutions(names, overrides=None) -> np.ndarray:
    """Resolution of each named objective (defaults, then the sweep's overrides)."""
    overrides = overrides or {}
    return np.array([float(overrides.get(n, RESOLUTIONS[n])) for n in names])
