"""Where each design variable sits in a member's decision vector (see :mod:`.problem`).

The free geometry variables come first (the dielectric radius replaced by the impedance offset
when it is free), then the void fraction of foamable dielectrics, then one integer-coded
variable per material (and outer-conductor construction) choice with more than one candidate.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from pymoo.core.repair import Repair

from cablefam.optimizer.inputs.sweep_spec import GEOMETRY_KEYS, OUTER_KEYS, Sweep
from cablefam.optimizer.inputs.wire_size_table import standard_diameters
from cablefam.optimizer.model.slots import SLOT_NAMES
from cablefam.optimizer.search import outer_variables
from cablefam.optimizer.search.void_fraction import VOID_FRACTION
from cablefam.physics.wire_sizes import snap_to_sizes

#: Name of the decision variable that replaces the dielectric radius (see the module docstring).
IMPEDANCE_OFFSET = "impedance_offset"

@dataclass(frozen=True)
class Layout:
    """Where each design variable sits in the decision vector, and the fixed ones' values."""

    bounds: dict[str, tuple[float, float]]
    free_geometry: tuple[str, ...]
    material_ids: dict[str, tuple[str, ...]]
    free_materials: tuple[str, ...]
    inner_radius_sizes: np.ndarray | None = None
    """Standard radii the centre conductor snaps to (None: continuous)."""
    impedance_construction: bool = False
    """The dielectric radius is solved from the impedance offset (see the module docstring)."""

    @property
    def variables(self) -> tuple[str, ...]:
        """Names of the continuous decision variables, in decision-vector order."""
        return tuple(IMPEDANCE_OFFSET if (k == "dielectric_radius_m"
                                          and self.impedance_construction) else k
                     for k in self.free_geometry) + self.free_extra

    @property
    def free_extra(self) -> tuple[str, ...]:
        """Continuous variables after the geometry: the void fraction when it is free."""
        lo_hi = self.bounds.get(VOID_FRACTION)
        return (VOID_FRACTION,) if lo_hi is not None and lo_hi[1] > lo_hi[0] else ()

    @property
    def n_var(self):
        return len(self.free_geometry) + len(self.free_extra) + len(self.free_materials)

    @property
    def integer_columns(self):
        n = len(self.free_geometry) + len(self.free_extra)
        return np.arange(n, n + len(self.free_materials))

    def lower_upper(self):
        xl = [-1.0 if k == IMPEDANCE_OFFSET else self.bounds[k][0] for k in self.variables]
        xu = [1.0 if k == IMPEDANCE_OFFSET else self.bounds[k][1] for k in self.variables]
        xl += [-0.5] * len(self.free_materials)
        xu += [len(self.material_ids[t]) - 0.5 for t in self.free_materials]
        return np.array(xl, dtype=float), np.array(xu, dtype=float)

    def decode(self, x):
        """Geometry arrays [m] and material indices (int arrays) of a decision matrix.

        With the impedance construction, ``dielectric_radius_m`` is absent and
        ``impedance_offset`` given instead (the radius needs the materials:
        :meth:`MemberProblem.designs` solves it).
        """
        x = np.atleast_2d(np.asarray(x, dtype=float))
        n = x.shape[0]
        geometry = {}
        col = 0
        for key in GEOMETRY_KEYS + tuple(k for k in OUTER_KEYS if k in self.bounds):
            if key in self.free_geometry:
                name = (IMPEDANCE_OFFSET if key == "dielectric_radius_m"
                        and self.impedance_construction else key)
                geometry[name] = x[:, col].copy()
                col += 1
            else:
                geometry[key] = np.full(n, self.bounds[key][0])
        if VOID_FRACTION in self.bounds:  # foamed dielectric by void fraction
            if self.free_extra:
                geometry[VOID_FRACTION] = x[:, col].copy()
                col += 1
            else:
                geometry[VOID_FRACTION] = np.full(n, self.bounds[VOID_FRACTION][0])
        if self.inner_radius_sizes is not None:
            geometry["inner_radius_m"] = 0.5 * snap_to_sizes(2.0 * geometry["inner_radius_m"],
                                                             2.0 * self.inner_radius_sizes)
        indices = {}
        for table in SLOT_NAMES + outer_variables.categorical(self):
            if table in self.free_materials:
                k = len(self.material_ids[table])
                indices[table] = np.clip(np.floor(x[:, col] + 0.5), 0, k - 1).astype(int)
                col += 1
            else:
                indices[table] = np.zeros(n, dtype=int)
        return geometry, indices


def make_layout(sweep: Sweep, catalog_name: str) -> Layout:
    s = sweep.spec.search
    bounds = {k: tuple(getattr(s, k)) for k in GEOMETRY_KEYS}
    if s.void_fraction is not None:  # foamed dielectric by void fraction
        bounds[VOID_FRACTION] = tuple(s.void_fraction)
    free_geometry = tuple(k for k in GEOMETRY_KEYS if bounds[k][1] > bounds[k][0])
    ids = sweep.materials[catalog_name]
    free_materials = tuple(t for t in SLOT_NAMES if len(ids.get(t, ())) > 1)
    # outer conductors (issue 12): their bounds, free variables and construction choice
    bounds, free_geometry, ids, free_materials = outer_variables.extend_layout(
        s, bounds, free_geometry, ids, free_materials, sweep.spec.member)
    sizes = None
    if s.inner_diameter_series is not None:
        radii = 0.5 * standard_diameters(s.inner_diameter_series)
        lo, hi = bounds["inner_radius_m"]
        sizes = radii[(radii >= lo) & (radii <= hi)]
    return Layout(bounds=bounds, free_geometry=free_geometry, material_ids=dict(ids),
                  free_materials=free_materials, inner_radius_sizes=sizes,
                  impedance_construction="dielectric_radius_m" in free_geometry)


class CategoricalRounding(Repair):
    """Round the integer-coded material columns to the nearest category, column-wise."""

    def __init__(self, columns, upper):
        super().__init__()
        self.columns = np.asarray(columns, dtype=int)
        self.upper = np.asarray(upper, dtype=float)

    def _do(self, problem, X, **kwargs):
        if self.columns.size:
            X = np.array(X, dtype=float)
            X[:, self.columns] = np.clip(np.floor(X[:, self.columns] + 0.5), 0.0,
                                         self.upper)
        return X
