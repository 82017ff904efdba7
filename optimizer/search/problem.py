"""The pymoo problem of one family member with one catalog: radii and materials -> F, G.

Decision vector: the free geometry variables (those whose bounds differ), then one
integer-coded variable per material choice with more than one candidate. Integer variables
live in ``[-0.5, k - 0.5]`` and are rounded column-wise by :class:`CategoricalRounding`, so
that the end categories get their fair share of samples and evaluation stays vectorized.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from pymoo.core.problem import Problem
from pymoo.core.repair import Repair
from pymoo.core.sampling import Sampling

from cablefam.optimizer.model.constraints import (CONSTRAINTS, MIN_RADIUS_RATIO, NON_FINITE_MARGIN,
                                   constraint_margins)
from cablefam.optimizer.model.evaluate import Designs, OperatingPoint, electrical_inner_radius, evaluate
from cablefam.optimizer.model.objectives import OBJECTIVES, objective_matrix
from cablefam.optimizer.inputs.sweep_spec import GEOMETRY_KEYS, MemberSpec, Sweep
from cablefam.optimizer.model.tolerance import (common_draws, impedance_yield_analytic,
                                 impedance_yield_monte_carlo)
from cablefam.optimizer.inputs.wire_size_table import standard_diameters
from cablefam.physics.constants import FREE_SPACE_IMPEDANCE
from cablefam.physics.wire_sizes import snap_to_sizes

MATERIAL_TABLES = ("conductor", "shield", "dielectric", "jacket")
_CATALOG_KIND = {"conductor": "conductor", "shield": "conductor", "dielectric": "dielectric",
                 "jacket": "jacket"}


@dataclass(frozen=True)
class Layout:
    """Where each design variable sits in the decision vector, and the fixed ones' values."""

    bounds: dict[str, tuple[float, float]]
    free_geometry: tuple[str, ...]
    material_ids: dict[str, tuple[str, ...]]
    free_materials: tuple[str, ...]
    inner_radius_sizes: np.ndarray | None = None
    """Standard radii the centre conductor snaps to (None: continuous)."""

    @property
    def n_var(self):
        return len(self.free_geometry) + len(self.free_materials)

    @property
    def integer_columns(self):
        n = len(self.free_geometry)
        return np.arange(n, n + len(self.free_materials))

    def lower_upper(self):
        xl = [self.bounds[k][0] for k in self.free_geometry]
        xu = [self.bounds[k][1] for k in self.free_geometry]
        xl += [-0.5] * len(self.free_materials)
        xu += [len(self.material_ids[t]) - 0.5 for t in self.free_materials]
        return np.array(xl, dtype=float), np.array(xu, dtype=float)

    def decode(self, x):
        """Geometry arrays [m] and material indices (int arrays) of a decision matrix."""
        x = np.atleast_2d(np.asarray(x, dtype=float))
        n = x.shape[0]
        geometry = {}
        col = 0
        for key in GEOMETRY_KEYS:
            if key in self.free_geometry:
                geometry[key] = x[:, col].copy()
                col += 1
            else:
                geometry[key] = np.full(n, self.bounds[key][0])
        if self.inner_radius_sizes is not None:
            geometry["inner_radius_m"] = 0.5 * snap_to_sizes(2.0 * geometry["inner_radius_m"],
                                                             2.0 * self.inner_radius_sizes)
        indices = {}
        for table in MATERIAL_TABLES:
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
    free_geometry = tuple(k for k in GEOMETRY_KEYS if bounds[k][1] > bounds[k][0])
    ids = sweep.materials[catalog_name]
    free_materials = tuple(t for t in MATERIAL_TABLES if len(ids.get(t, ())) > 1)
    sizes = None
    if s.inner_diameter_series is not None:
        radii = 0.5 * standard_diameters(s.inner_diameter_series)
        lo, hi = bounds["inner_radius_m"]
        sizes = radii[(radii >= lo) & (radii <= hi)]
    return Layout(bounds=bounds, free_geometry=free_geometry, material_ids=dict(ids),
                  free_materials=free_materials, inner_radius_sizes=sizes)


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


class ImpedanceSeededSampling(Sampling):
    r"""Uniform random sampling in which a share of the samples is put on the impedance target.

    The feasible band of a coax is a thin sliver of the (a, b) box: ``b/a`` must sit within a
    few percent of :math:`\exp(2\pi\sqrt{\varepsilon_r} Z_0/\eta_0)`. For ``share`` of the
    initial samples the dielectric radius is set from the sampled inner radius and dielectric
    so that the lossless impedance falls uniformly within the member's tolerance band (clipped
    to the bounds); the rest stay uniform so the whole box is still explored.
    """

    def __init__(self, share=0.5):
        super().__init__()
        self.share = share

    def _do(self, problem, n_samples, *args, random_state=None, **kwargs):
        xl, xu = problem.bounds()
        x = xl + (xu - xl) * random_state.random((n_samples, problem.n_var))
        x = problem.make_repair()._do(problem, x)
        layout = problem.layout
        if {"inner_radius_m", "dielectric_radius_m"} <= set(layout.free_geometry):
            n_seed = int(round(self.share * n_samples))
            rows = np.arange(n_seed)
            computed, _, _ = problem.designs(x[rows])
            eps = computed.dielectric["relative_permittivity"]
            m = problem.member
            z0 = m.impedance_ohm + m.impedance_tolerance_ohm * random_state.uniform(
                -0.9, 0.9, n_seed)
            eta_0 = FREE_SPACE_IMPEDANCE
            col_a = layout.free_geometry.index("inner_radius_m")
            col_b = layout.free_geometry.index("dielectric_radius_m")
            b = x[rows, col_a] * np.exp(2.0 * np.pi * np.sqrt(eps) * z0 / eta_0)
            x[rows, col_b] = np.clip(b, xl[col_b], xu[col_b])
        return x


class MemberProblem(Problem):
    """Vectorized problem: one physics call per generation for the whole population."""

    def __init__(self, sweep: Sweep, member: MemberSpec, catalog_name: str,
                 record_evaluated: bool = False, seed: int = 0):
        self.sweep = sweep
        self.member = member
        self.catalog = next(c for c in sweep.catalogs if c.name == catalog_name)
        self.layout = make_layout(sweep, catalog_name)
        self.objectives = tuple(sweep.spec.search.objectives)
        self.needs_max_power = any(OBJECTIVES[o].column == "max_power_w"
                                   for o in self.objectives)
        self.record_evaluated = record_evaluated
        self.evaluated: list[np.ndarray] = []
        self._tables = {t: self._property_table(t) for t in MATERIAL_TABLES}
        tol = sweep.spec.tolerance
        self.spread = None if tol is None else tol.spread()
        self.draws = None
        if tol is not None and tol.method == "monte-carlo":
            # common random numbers: fixed by the task seed, independent of the search's stream
            draw_seed = np.random.SeedSequence([seed, 0x7013]).generate_state(1)[0]
            self.draws = common_draws(self.spread, tol.samples, int(draw_seed))
        xl, xu = self.layout.lower_upper()
        super().__init__(n_var=self.layout.n_var, n_obj=len(self.objectives),
                         n_ieq_constr=len(CONSTRAINTS), xl=xl, xu=xu, vtype=float)

    def _property_table(self, table):
        ids = self.layout.material_ids.get(table, ())
        if not ids:
            return None
        records = [self.catalog.get(_CATALOG_KIND[table], i, table) for i in ids]
        keys = [k for k, v in records[0].model_dump().items() if isinstance(v, (int, float))
                and not isinstance(v, bool)]
        return {k: np.array([getattr(r, k) for r in records], dtype=float) for k in keys}

    def make_repair(self):
        """The rounding repair of this problem's integer columns."""
        upper = [len(self.layout.material_ids[t]) - 1 for t in self.layout.free_materials]
        return CategoricalRounding(self.layout.integer_columns, upper)

    def designs(self, x):
        """Decode a decision matrix into :class:`Designs` (invalid radii made computable)."""
        geometry, idx = self.layout.decode(x)
        a = geometry["inner_radius_m"]
        b = geometry["dielectric_radius_m"]
        # b <= a is a constraint violation, not an error: compute with a harmless b instead
        b_safe = np.where(b >= MIN_RADIUS_RATIO * a, b, 1.5 * a)

        def pick(table):
            t = self._tables[table]
            return None if t is None else {k: v[idx[table]] for k, v in t.items()}

        strands = self.sweep.spec.search.inner_strands
        computed = Designs(a, b_safe, geometry["shield_thickness_m"],
                           geometry["jacket_thickness_m"], inner=pick("conductor"),
                           shield=pick("shield"), dielectric=pick("dielectric"),
                           jacket=pick("jacket"), inner_strands=strands)
        actual = Designs(a, b, computed.shield_thickness, computed.jacket_thickness,
                         computed.inner, computed.shield, computed.dielectric, computed.jacket,
                         inner_strands=strands)
        return computed, actual, idx

    def operating_point(self):
        m = self.member
        return OperatingPoint(frequency_hz=m.frequency_hz, peak_voltage_v=m.peak_voltage_v,
                              field_safety_factor=m.field_safety_factor, power_w=m.power_w,
                              ambient_c=m.ambient_c)

    def evaluate_designs(self, x, include_max_power=None):
        """Quantities and margins of a decision matrix (what ``_evaluate`` and the front use)."""
        computed, actual, idx = self.designs(x)
        if include_max_power is None:
            include_max_power = self.needs_max_power
        values = evaluate(computed, self.operating_point(), include_max_power=include_max_power)
        if self.spread is not None:
            values.update(self.impedance_yield(computed, values))
        diel_max = computed.dielectric.get("max_temperature_c")
        jacket_max = None if computed.jacket is None else computed.jacket.get("max_temperature_c")
        margins = constraint_margins(values, actual, self.member, diel_max, jacket_max)
        return values, margins, idx

    def impedance_yield(self, d: Designs, values) -> dict[str, np.ndarray]:
        """Impedance yield and the 3-sigma impedance band of every design."""
        m = self.member
        scale = values["z0_ohm"] / values["z0_lossless_ohm"]
        eps = d.dielectric["relative_permittivity"]
        a = electrical_inner_radius(d)
        if self.draws is not None:
            y, lo, hi = impedance_yield_monte_carlo(
                a, d.dielectric_radius, eps, m.impedance_ohm,
                m.impedance_tolerance_ohm, self.spread, self.draws, scale)
        else:
            y, lo, hi = impedance_yield_analytic(
                a, d.dielectric_radius, eps, m.impedance_ohm,
                m.impedance_tolerance_ohm, self.spread, scale)
        return {"impedance_yield": y, "z0_3sigma_low_ohm": lo, "z0_3sigma_high_ohm": hi}

    def _evaluate(self, x, out, *args, **kwargs):
        values, margins, _ = self.evaluate_designs(x)
        f = objective_matrix(values, self.objectives)
        g = -np.column_stack([margins[c] for c in CONSTRAINTS])
        bad = ~np.all(np.isfinite(f), axis=1)
        if bad.any():  # never seen; kept so that a NaN can never reach a front
            f[bad] = 0.0
            g[bad, 0] = -NON_FINITE_MARGIN
        out["F"] = f
        out["G"] = g
        if self.record_evaluated:
            self.evaluated.append(np.column_stack([x, f, g]))

