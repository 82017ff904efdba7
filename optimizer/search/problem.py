"""The problem of one family member with one catalog: decision vectors -> designs -> F, G.

Decision vector: the free variables of the reduced space, then one integer-coded variable per
material choice with more than one candidate. When the dielectric radius is free it is not a
variable: the *impedance offset* (in [-1, 1] of the tolerance band) takes its place and the
radius is solved from it (:mod:`cablefam.optimizer.search.impedance_target`), so nearly every
design lands in the impedance band. Integer variables live in ``[-0.5, k - 0.5]`` and are
rounded column-wise by :class:`CategoricalRounding`, so that the end categories get their fair
share of samples and evaluation stays vectorized. With ``[search] void_fraction`` the void
fraction of the foamable dielectrics follows the geometry variables
(:mod:`cablefam.optimizer.search.void_fraction`).
"""

from __future__ import annotations

from dataclasses import replace

import numpy as np
from pymoo.core.problem import Problem

from cablefam.optimizer.inputs import cladding
from cablefam.optimizer.inputs.sweep_spec import MemberSpec, Sweep
from cablefam.optimizer.model.constraints import (CONSTRAINTS, MIN_RADIUS_RATIO,
                                                  NON_FINITE_MARGIN, constraint_margins)
from cablefam.optimizer.model.effective_dielectric import resolve_table
from cablefam.optimizer.model.evaluate import (Designs, OperatingPoint, electrical_inner_radius,
                                               evaluate)
from cablefam.optimizer.model.objectives import OBJECTIVES, objective_matrix
from cablefam.optimizer.model.slots import SLOT_KINDS, SLOT_NAMES
from cablefam.optimizer.model.tolerance import (common_draws, impedance_yield_analytic,
                                                impedance_yield_monte_carlo)
from cablefam.optimizer.search import outer_variables
from cablefam.optimizer.search.archive import pareto_rank
from cablefam.optimizer.search.impedance_target import (dielectric_radius_lossless,
                                                        solve_dielectric_radius, target_impedance)
from cablefam.optimizer.search.layout import (IMPEDANCE_OFFSET,  # noqa: F401 (re-exported)
                                              CategoricalRounding, Layout, make_layout)
from cablefam.optimizer.search.void_fraction import (FOAM_RECORD_KEYS, VOID_FRACTION,
                                                     effective_permittivity_range,
                                                     record_columns, with_design_void_fraction)
from cablefam.physics.stranding import stranded_effective_radius

#: Seed of the Monte Carlo draws of the impedance yield (the same for every task and run seed).
YIELD_DRAW_SEED = 0x7013
#: Fewest designs whose Monte Carlo yield is computed in one round (one array operation).
YIELD_BLOCK = 256
#: Impedance-yield margin of a design whose yield the search did not compute (a tiny violation).
UNKNOWN_YIELD_MARGIN = -1.0e-6

class MemberProblem(Problem):
    """Vectorized problem: one physics call per generation for the whole population."""

    def __init__(self, sweep: Sweep, member: MemberSpec, catalog_name: str,
                 record_evaluated: bool = False, seed: int = 0):
        self.sweep = sweep
        self.member = member
        self.catalog = next(c for c in sweep.catalogs if c.name == catalog_name)
        self.layout = make_layout(sweep, catalog_name)
        self._tables = {t: self._property_table(t) for t in SLOT_NAMES}
        if self.layout.impedance_construction:
            self.layout = replace(self.layout, bounds={
                **self.layout.bounds, "inner_radius_m": self._reachable_inner_radii()})
        self.objectives = tuple(sweep.spec.search.objectives)
        self.needs_max_power = any(OBJECTIVES[o].column == "max_power_w"
                                   for o in self.objectives)
        self.record_evaluated = record_evaluated
        self.evaluated: list[np.ndarray] = []
        tol = sweep.spec.tolerance
        self.spread = None if tol is None else tol.spread()
        self.draws = None
        if tol is not None and tol.method == "monte-carlo":
            # common random numbers: part of the problem, not of the search, so they do not
            # depend on the run seed (every seed and every catalog is judged by the same draws)
            self.draws = common_draws(self.spread, tol.samples, YIELD_DRAW_SEED)
        xl, xu = self.layout.lower_upper()
        super().__init__(n_var=self.layout.n_var, n_obj=len(self.objectives),
                         n_ieq_constr=len(CONSTRAINTS), xl=xl, xu=xu, vtype=float)

    def _reachable_inner_radii(self) -> tuple[float, float]:
        """Bounds of the centre-conductor radius within which the solved dielectric radius can
        meet its own bounds and the member's outer-diameter limit (with 5 % slack for the lossy
        correction); the sweep's bounds where nothing is gained. A presolve: it removes only
        designs that the geometry or outer-diameter constraint would reject."""
        m, bounds = self.member, self.layout.bounds
        a_lo, a_hi = bounds["inner_radius_m"]
        b_lo, b_hi = bounds["dielectric_radius_m"]
        if m.max_outer_diameter_m is not None:
            b_hi = min(b_hi, 0.5 * m.max_outer_diameter_m
                       - outer_variables.min_build(self.layout)
                       - bounds["jacket_thickness_m"][0])
        eps_min, eps_max = effective_permittivity_range(  # of the foamed, dispersive dielectric
            self._tables["dielectric"], self._foamable, bounds.get(VOID_FRACTION), m.frequency_hz)
        strands = self.sweep.spec.search.inner_strands
        k_el = 1.0 if strands == 1 else float(stranded_effective_radius(1.0, strands))
        z_lo = target_impedance(m.impedance_ohm, m.impedance_tolerance_ohm, -1.0)
        z_hi = target_impedance(m.impedance_ohm, m.impedance_tolerance_ohm, 1.0)
        ratio_lo = dielectric_radius_lossless(1.0, eps_min, z_lo)
        ratio_hi = dielectric_radius_lossless(1.0, eps_max, z_hi)
        hi = min(a_hi, 1.05 * b_hi / (ratio_lo * k_el))
        lo = max(a_lo, b_lo / (1.05 * ratio_hi * k_el))
        if not lo < hi:  # nothing reachable: keep the sweep's bounds (all designs infeasible)
            return a_lo, a_hi
        return float(lo), float(hi)

    def _property_table(self, table):
        ids = self.layout.material_ids.get(table, ())
        if not ids:
            return None
        records = [self.catalog.get(SLOT_KINDS[table], i, table) for i in ids]
        if SLOT_KINDS[table] == "conductor":  # clad conductors: their layers resolved too
            return cladding.property_table(records, self.catalog, str(self.catalog.path))
        keys = [k for k, v in records[0].model_dump().items() if isinstance(v, (int, float))
                and not isinstance(v, bool) and k not in FOAM_RECORD_KEYS]
        out = {k: np.array([getattr(r, k) for r in records], dtype=float) for k in keys}
        if table == "dielectric":  # foamed dielectric by void fraction, dispersion
            extra, self._foamable = record_columns(records, VOID_FRACTION in self.layout.bounds)
            out.update(extra)
        return out

    def make_repair(self):
        """The rounding repair of this problem's integer columns."""
        upper = [len(self.layout.material_ids[t]) - 1 for t in self.layout.free_materials]
        return CategoricalRounding(self.layout.integer_columns, upper)

    def designs(self, x):
        """Decode a decision matrix into :class:`Designs` (invalid radii made computable)."""
        geometry, idx = self.layout.decode(x)
        a = geometry["inner_radius_m"]

        def pick(table):
            t = self._tables[table]
            return None if t is None else {k: v[idx[table]] for k, v in t.items()}

        strands = self.sweep.spec.search.inner_strands
        dielectric = pick("dielectric")
        if VOID_FRACTION in geometry:  # foamed dielectric by void fraction
            dielectric = with_design_void_fraction(dielectric, self._foamable[idx["dielectric"]],
                                                   geometry.pop(VOID_FRACTION))
        if self.layout.impedance_construction:
            geometry["dielectric_radius_m"] = self.constructed_dielectric_radius(
                geometry, pick("conductor"), pick("shield"), dielectric)
        b = geometry["dielectric_radius_m"]
        # b <= a is a constraint violation, not an error: compute with a harmless b instead
        b_safe = np.where(b >= MIN_RADIUS_RATIO * a, b, 1.5 * a)
        outer = outer_variables.design_fields(self.layout, geometry, idx)
        computed = Designs(a, b_safe, outer.pop("shield_thickness"),
                           geometry["jacket_thickness_m"], inner=pick("conductor"),
                           shield=pick("shield"), dielectric=dielectric,
                           jacket=pick("jacket"), inner_strands=strands, **outer)
        actual = Designs(a, b, computed.shield_thickness, computed.jacket_thickness,
                         computed.inner, computed.shield, computed.dielectric, computed.jacket,
                         inner_strands=strands, **outer)
        return computed, actual, idx

    def constructed_dielectric_radius(self, geometry, inner, shield, dielectric):
        """Dielectric radius [m] of the impedance offset, within the sweep's bounds."""
        m = self.member
        a = geometry["inner_radius_m"]
        strands = self.sweep.spec.search.inner_strands
        a_el = a if strands == 1 else stranded_effective_radius(a, strands)
        target = target_impedance(m.impedance_ohm, m.impedance_tolerance_ohm,
                                  geometry.pop(IMPEDANCE_OFFSET))
        b = solve_dielectric_radius(a, a_el, geometry["shield_thickness_m"], m.frequency_hz,
                                    target, inner, shield,
                                    resolve_table(dielectric, m.frequency_hz),  # effective
                                    inner_strands=strands)
        lo, hi = self.layout.bounds["dielectric_radius_m"]
        return np.clip(b, lo, hi)

    def operating_point(self):
        m = self.member
        return OperatingPoint(frequency_hz=m.frequency_hz, peak_voltage_v=m.peak_voltage_v,
                              field_safety_factor=m.field_safety_factor, power_w=m.power_w,
                              ambient_c=m.ambient_c, vswr=m.vswr,
                              solar_irradiance_w_per_m2=m.solar_irradiance_w_per_m2,
                              screening_band_hz=(None if m.screening_band_hz is None
                                                 else tuple(m.screening_band_hz)))

    @property
    def yield_in_search(self) -> bool:
        """Whether the search needs the impedance yield (a constraint or an objective)."""
        return self.spread is not None and (self.member.min_impedance_yield is not None
                                            or "impedance_yield" in self.objectives)

    def evaluate_designs(self, x, include_max_power=None):
        """Quantities and margins of a decision matrix (what the front and inspect use)."""
        values, margins, idx, _ = self.evaluate_rows(x, include_max_power)
        return values, margins, idx

    def evaluate_rows(self, x, include_max_power=None, with_yield=True):
        """Quantities, margins, material indices and the designs (with their solved radii)."""
        computed, actual, idx = self.designs(x)
        values, margins = self._quantities(computed, actual, include_max_power, with_yield)
        return values, margins, idx, actual

    def _quantities(self, computed, actual, include_max_power=None, with_yield=True):
        if include_max_power is None:
            include_max_power = self.needs_max_power
        values = evaluate(computed, self.operating_point(), include_max_power=include_max_power)
        if self.spread is not None and with_yield:
            values.update(self.impedance_yield(computed, values))
        return values, self._margins(values, computed, actual)

    def _margins(self, values, computed, actual):
        diel_max = computed.dielectric.get("max_temperature_c")
        jacket_max = None if computed.jacket is None else computed.jacket.get("max_temperature_c")
        return constraint_margins(values, actual, self.member, diel_max, jacket_max)

    def impedance_yield(self, d: Designs, values, rows=None) -> dict[str, np.ndarray]:
        """Impedance yield and the 3-sigma impedance band of every design (or of ``rows``)."""
        m = self.member
        sel = slice(None) if rows is None else rows
        shape = np.shape(d.inner_radius)
        scale = np.broadcast_to(values["z0_ohm"] / values["z0_lossless_ohm"], shape)[sel]
        eps = np.broadcast_to(values.get("effective_relative_permittivity",
                                         d.dielectric["relative_permittivity"]), shape)[sel]
        a = np.broadcast_to(electrical_inner_radius(d), shape)[sel]
        b = d.dielectric_radius[sel]
        if self.draws is not None:
            y, lo, hi = impedance_yield_monte_carlo(
                a, b, eps, m.impedance_ohm, m.impedance_tolerance_ohm, self.spread, self.draws,
                scale)
        else:
            y, lo, hi = impedance_yield_analytic(
                a, b, eps, m.impedance_ohm, m.impedance_tolerance_ohm, self.spread, scale)
        return {"impedance_yield": y, "z0_3sigma_low_ohm": lo, "z0_3sigma_high_ohm": hi}

    def evaluate_search(self, x, may_enter=None):
        """Objectives F and constraints G (feasible when <= 0) of a batch, for the search.

        The Monte Carlo impedance yield costs a hundred line evaluations per design, so it is
        computed only where it can change the front: for designs that meet every other
        constraint, that the archive does not already dominate (``may_enter``, a function of F),
        in rounds over the best Pareto ranks of those until the non-dominated ones are all
        known and meet the limit (so the archive gets exactly what a full evaluation gives).
        Every other design gets a yield margin of :data:`UNKNOWN_YIELD_MARGIN` (a tiny violation: it ranks below the feasible designs) and the optimistic yield 1 as
        objective. Returns ``f, g, known`` with ``known`` False where the yield was skipped.
        """
        lazy = self.yield_in_search and self.draws is not None
        computed, actual, _ = self.designs(x)  # once: it solves the dielectric radius
        values, margins = self._quantities(computed, actual,
                                           with_yield=self.yield_in_search and not lazy)
        n = len(x)
        known = np.ones(n, dtype=bool)
        if lazy:
            values["impedance_yield"] = np.ones(n)
            margins = self._margins(values, computed, actual)
            others = np.all(np.column_stack([margins[c] for c in CONSTRAINTS
                                             if c != "impedance_yield"]) >= 0.0, axis=1)
            f = objective_matrix(values, self.objectives)
            pool = others & (np.ones(n, dtype=bool) if may_enter is None else may_enter(f))
            known = np.zeros(n, dtype=bool)
            limit = self.member.min_impedance_yield
            while True:
                rows = np.flatnonzero(pool)
                if rows.size == 0:
                    break
                rank = pareto_rank(f[rows])
                if known[rows[rank == 0]].all():
                    break  # the pool's own front is exact: nothing below it can enter
                # the unknown rows of the best ranks, at least YIELD_BLOCK of them at a time
                order = np.argsort(rank, kind="stable")
                unknown = order[~known[rows[order]]]
                cutoff = rank[unknown[min(YIELD_BLOCK, len(unknown)) - 1]]
                need = rows[unknown[rank[unknown] <= cutoff]]
                y = self.impedance_yield(computed, values, need)["impedance_yield"]
                values["impedance_yield"][need] = y
                known[need] = True
                if limit is not None:
                    pool[need] &= y >= limit
                f = objective_matrix(values, self.objectives)
            margins = self._margins(values, computed, actual)
            margins["impedance_yield"] = np.where(known, margins["impedance_yield"],
                                                  UNKNOWN_YIELD_MARGIN)
        f = objective_matrix(values, self.objectives)
        g = -np.column_stack([margins[c] for c in CONSTRAINTS])
        bad = ~np.all(np.isfinite(f), axis=1)
        if bad.any():  # never seen; kept so that a NaN can never reach a front
            f[bad] = 0.0
            g[bad, 0] = -NON_FINITE_MARGIN
        return f, g, known

    def _evaluate(self, x, out, *args, **kwargs):
        f, g, _ = self.evaluate_search(x)
        out["F"] = f
        out["G"] = g
