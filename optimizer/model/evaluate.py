"""Evaluate whole populations of designs: physics in, named quantities (unit in the name) out.

This is the one place where physics results get their edge names: the keys of
``cablefam inspect --json``, the columns of ``front.parquet`` and the quantities the search
constrains and minimises are the same strings.
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass

import numpy as np

from cablefam.optimizer.model import (conductor_layers, effective_dielectric, outer_conductor,
                                      ratings)
from cablefam.physics import (eccentricity, line, mass, modes, propagation, stranding,
                              thermal)
from cablefam.physics.internal_impedance import tube_dc_resistance
from cablefam.physics.skin import skin_depth
from cablefam.physics.units import neper_per_m_to_db_per_100m, per_m_to_per_km


@dataclass(frozen=True)
class Designs:
    """Arrays of one common shape describing designs (geometry [m], material properties SI).

    Material dictionaries use the catalog key names (``resistivity_ohm_m``...). A key that is
    absent means the property is unknown; quantities that need it are then not computed.
    """

    inner_radius: np.ndarray
    dielectric_radius: np.ndarray
    shield_thickness: np.ndarray
    jacket_thickness: np.ndarray
    inner: dict[str, np.ndarray]
    shield: dict[str, np.ndarray]
    dielectric: dict[str, np.ndarray]
    jacket: dict[str, np.ndarray] | None
    eccentricity: np.ndarray | float = 0.0
    """Offset of the centre conductor from the axis [m] (0: concentric)."""
    inner_strands: np.ndarray | int = 1
    """Strand count of the centre conductor (1: solid); ``inner_radius`` is then overall."""
    # outer conductors as built (issue 12; :mod:`.outer_conductor`): a code of
    # physics.outer_conductor.CONSTRUCTIONS (None: every design a tube, as before; else
    # shield_thickness is the radial build), braid wire [m], angle [rad], foil [m] and material
    shield_construction: np.ndarray | int | None = None
    braid_carriers: np.ndarray | float = 16.0
    braid_ends: np.ndarray | float = 8.0
    braid_wire_diameter: np.ndarray | float = 1.27e-4
    braid_angle: np.ndarray | float = 0.5235987755982988
    foil_thickness: np.ndarray | float = 2.5e-5
    foil: dict[str, np.ndarray] | None = None

    @property
    def shield_radius(self):
        """c = b + shield thickness [m]."""
        return self.dielectric_radius + self.shield_thickness

    @property
    def outer_radius(self):
        """d = c + jacket thickness [m]."""
        return self.shield_radius + self.jacket_thickness


@dataclass(frozen=True)
class OperatingPoint:
    """Operating conditions, scalars or arrays broadcasting against :class:`Designs`."""

    frequency_hz: float | np.ndarray
    peak_voltage_v: float | np.ndarray | None = None
    current_a: float | np.ndarray | None = None
    field_safety_factor: float | np.ndarray = 1.0
    power_w: float | np.ndarray | None = None
    ambient_c: float | np.ndarray = 20.0
    vswr: float | np.ndarray = 1.0
    """Voltage standing-wave ratio (``power_w`` is then the delivered power)."""
    solar_irradiance_w_per_m2: float | np.ndarray = 0.0
    """Direct solar radiation on the cable [W m^-2] (model/ratings.py)."""
    screening_band_hz: tuple[float, float] | None = None
    """Band over which the largest transfer impedance is taken (None: the frequency alone)."""


def _float_array(value, shape):
    """``value`` as a float array of ``shape`` that owns its data: an array computed here that
    already is one is kept (no copy), anything else (scalars, views, broadcasts) is copied."""
    if (isinstance(value, np.ndarray) and value.shape == shape and value.dtype == np.float64
            and value.flags.c_contiguous and value.flags.owndata):
        return value
    return np.broadcast_to(value, shape).astype(float)


def _has(table, *keys):
    return table is not None and all(k in table for k in keys)


def electromagnetic(d: Designs, op: OperatingPoint, method="auto",
                    reference: Designs | None = None,
                    geometry_factor: np.ndarray | None = None) -> dict[str, np.ndarray]:
    r"""Line parameters, impedance, attenuation, velocity, skin depths and the DC resistances.

    The line is evaluated at the resistivities of ``d``; skin depths and DC resistances at
    those of ``reference`` (default ``d``), so that :func:`evaluate` can give the line at the
    operating temperatures beside the 20 degC reference values. ``geometry_factor``: the
    :math:`\Lambda` of :func:`geometry_factor_of`, when the caller has it.
    """
    a, b, c = d.inner_radius, d.dielectric_radius, d.shield_radius
    f = op.frequency_hz
    lam = geometry_factor_of(d) if geometry_factor is None else geometry_factor
    lp = line.line_parameters(a, b, c, f, d.inner["resistivity_ohm_m"],
                              d.shield["resistivity_ohm_m"],
                              d.dielectric["relative_permittivity"], d.dielectric["loss_tangent"],
                              d.inner.get("relative_permeability", 1.0),
                              d.shield.get("relative_permeability", 1.0), method=method,
                              offset=d.eccentricity, inner_strands=d.inner_strands,
                              geometry_factor=lam,
                              inner_surface=conductor_layers.inner_surface(d),
                              shield_surface=conductor_layers.shield_surface(d),
                              outer=outer_conductor.outer_of(d))
    return _line_quantities(d, op, lp, d if reference is None else reference, lam)


def electrical_inner_radius(d: Designs):
    """The radius the fields see: the overall one, or the effective one of a strand lay-up."""
    if np.any(np.asarray(d.inner_strands) != 1):
        return stranding.stranded_effective_radius(d.inner_radius, d.inner_strands)
    return d.inner_radius


def geometry_factor_of(d: Designs):
    """The geometry factor of the designs (electrical inner radius, offset) [-]."""
    return eccentricity.geometry_factor(electrical_inner_radius(d), d.dielectric_radius,
                                        d.eccentricity)


def _reference_quantities(d: Designs, op: OperatingPoint):
    """Skin depths and DC resistances at the catalog (20 degC) resistivities."""
    a, b, c = d.inner_radius, d.dielectric_radius, d.shield_radius
    f = op.frequency_hz
    out = {
        "skin_depth_inner_m": skin_depth(d.inner["resistivity_ohm_m"], f,
                                         d.inner.get("relative_permeability", 1.0)),
        "skin_depth_shield_m": skin_depth(d.shield["resistivity_ohm_m"], f,
                                          d.shield.get("relative_permeability", 1.0)),
        "dc_resistance_inner_ohm_per_m": stranding.stranded_dc_resistance(
            a, d.inner_strands, d.inner["resistivity_ohm_m"]),
        "dc_resistance_shield_ohm_per_m": tube_dc_resistance(b, c, d.shield["resistivity_ohm_m"]),
    }
    out.update(conductor_layers.reference_quantities(d, op))  # clad conductors, roughness
    return {k: _float_array(v, np.shape(a)) for k, v in out.items()}


def _line_quantities(d: Designs, op: OperatingPoint, lp: line.LineParameters,
                     reference: Designs, lam):
    a, b = d.inner_radius, d.dielectric_radius
    f = op.frequency_hz
    gamma = propagation.propagation_constant(lp.r, lp.l, lp.g, lp.c, f)
    z0 = propagation.characteristic_impedance(lp.r, lp.l, lp.g, lp.c, f, gamma=gamma)
    z0_lossless = line.characteristic_impedance_lossless(
        electrical_inner_radius(d), b, d.dielectric["relative_permittivity"], d.eccentricity,
        geometry_factor=lam)
    alpha_c, alpha_d = propagation.attenuation_split(gamma.real, lp.r, lp.g, z0_lossless)
    out = {
        "z0_ohm": np.abs(z0),
        "z0_real_ohm": z0.real,
        "z0_imag_ohm": z0.imag,
        "z0_lossless_ohm": z0_lossless,
        "r_ohm_per_m": lp.r,
        "l_h_per_m": lp.l,
        "g_s_per_m": lp.g,
        "c_f_per_m": lp.c,
        "attenuation_db_per_100m": neper_per_m_to_db_per_100m(gamma.real),
        "conductor_attenuation_db_per_100m": neper_per_m_to_db_per_100m(alpha_c),
        "dielectric_attenuation_db_per_100m": neper_per_m_to_db_per_100m(alpha_d),
        "velocity_factor": propagation.velocity_factor(gamma.imag, f),
        "delay_s_per_m": propagation.delay_per_metre(gamma.imag, f),
    }
    out = {k: _float_array(v, np.shape(a)) for k, v in out.items()}
    out.update(_reference_quantities(reference, op))
    return out


def evaluate(d: Designs, op: OperatingPoint, method="auto",
             include_max_power: bool = True) -> dict[str, np.ndarray]:
    """Every quantity of a population of designs at one operating point.

    Returns a dict of float arrays (shape of the designs), keyed by the names of
    ``cablefam inspect --json``. Keys whose inputs are missing (no jacket table, no power, no
    peak voltage, no thermal properties) are left out, never filled with NaN. When
    ``power_w`` is given, the line quantities are those at the operating temperatures (skin
    depths and DC resistances stay the 20 degC reference values).
    ``include_max_power=False`` skips the power rating (a root search per design), which the
    search only needs when it is an objective.

    A large 1-D population is evaluated in blocks of :data:`EVALUATE_BLOCK` designs (every
    quantity is elementwise, so the blocks change no value; arrays that stay in the processor
    caches make it faster).
    """
    no_jacket = bool(np.all(d.jacket_thickness == 0.0))
    n = np.size(d.inner_radius)
    if np.ndim(d.inner_radius) != 1 or n <= EVALUATE_BLOCK or not _blockable(d, op, n):
        return _evaluate_block(d, op, method, include_max_power, no_jacket)
    parts = [_evaluate_block(_take_designs(d, s, n), _take_operating_point(op, s, n), method,
                             include_max_power, no_jacket)
             for s in (slice(i, i + EVALUATE_BLOCK) for i in range(0, n, EVALUATE_BLOCK))]
    return {k: np.concatenate([p[k] for p in parts]) for k in parts[0]}


#: Designs evaluated together by :func:`evaluate` (speed only; measured with
#: tests/benchmarks/bench_physics.py).
EVALUATE_BLOCK = 131072


def _per_design(x, n):
    """True for an array with one value per design of a 1-D population of ``n``."""
    return isinstance(x, np.ndarray) and x.shape == (n,)


def _blockable(d: Designs, op: OperatingPoint, n):
    """Every array of the designs and the operating point is per design or a scalar."""
    values = [d.inner_radius, d.dielectric_radius, d.shield_thickness, d.jacket_thickness,
              d.eccentricity, d.inner_strands, *_fields(op),
              *outer_conductor.design_values(d)]
    for table in (d.inner, d.shield, d.dielectric, d.jacket or {}, d.foil or {}):
        values.extend(table.values())
    return all(x is None or isinstance(x, tuple) or np.ndim(x) == 0 or _per_design(x, n)
               for x in values)


def _take_designs(d: Designs, index, n) -> Designs:
    def take(x):
        return x[index] if _per_design(x, n) else x

    def take_table(table):
        return None if table is None else {k: take(v) for k, v in table.items()}

    return Designs(take(d.inner_radius), take(d.dielectric_radius), take(d.shield_thickness),
                   take(d.jacket_thickness), take_table(d.inner), take_table(d.shield),
                   take_table(d.dielectric), take_table(d.jacket), take(d.eccentricity),
                   take(d.inner_strands), *(take(x) for x in outer_conductor.design_values(d)),
                   take_table(d.foil))


def _take_operating_point(op: OperatingPoint, index, n) -> OperatingPoint:
    return OperatingPoint(*(x[index] if _per_design(x, n) else x for x in _fields(op)))


def _fields(op: OperatingPoint):
    """The field values of an operating point, in order (not copied)."""
    return [getattr(op, f.name) for f in dataclasses.fields(op)]


def _evaluate_block(d: Designs, op: OperatingPoint, method, include_max_power,
                    no_jacket) -> dict[str, np.ndarray]:
    """:func:`evaluate` of one block; ``no_jacket`` is decided on the whole population."""
    # a foamed or dispersive dielectric: its effective values at the operating frequency
    d, dielectric_out = effective_dielectric.resolve(d, op.frequency_hz)
    d = conductor_layers.mass_equivalent(d)  # clad conductors: density and price of both layers
    a, b = d.inner_radius, d.dielectric_radius
    c, rd = d.shield_radius, d.outer_radius
    diel = d.dielectric
    jacket = d.jacket if d.jacket is not None else ({} if no_jacket else None)
    thermal_ok = (_has(d.inner, "temperature_coefficient_per_k")
                  and _has(d.shield, "temperature_coefficient_per_k")
                  and _has(diel, "thermal_resistivity_k_m_per_w")
                  and (no_jacket or _has(jacket, "thermal_resistivity_k_m_per_w")))
    # the geometry factor of the electrical radius (stranded: effective; offset: arccosh form),
    # computed once and handed to every function that needs it
    a_el = electrical_inner_radius(d)
    lam = eccentricity.geometry_factor(a_el, b, d.eccentricity)
    inputs = None
    if thermal_ok:
        # a braid or foil enters the (tube) thermal model as an equivalent tube
        shield_thermal = outer_conductor.thermal_shield_properties(d, op.frequency_hz)
        inputs = thermal.CoaxThermalInputs(
            a=a, b=b, c=c, d=rd, frequency=op.frequency_hz, ambient_c=op.ambient_c,
            inner_resistivity_20c=d.inner["resistivity_ohm_m"],
            inner_temperature_coefficient=d.inner["temperature_coefficient_per_k"],
            shield_resistivity_20c=shield_thermal[0],
            shield_temperature_coefficient=d.shield["temperature_coefficient_per_k"],
            relative_permittivity=diel["relative_permittivity"],
            loss_tangent=diel["loss_tangent"],
            dielectric_thermal_resistivity=diel["thermal_resistivity_k_m_per_w"],
            jacket_thermal_resistivity=jacket.get("thermal_resistivity_k_m_per_w", 1.0),
            inner_relative_permeability=d.inner.get("relative_permeability", 1.0),
            shield_relative_permeability=shield_thermal[1],
            offset=d.eccentricity, inner_strands=d.inner_strands, geometry_factor=lam,
            **ratings.thermal_conditions(d, op),
            inner_surface=conductor_layers.inner_surface(d),
            shield_surface=conductor_layers.shield_surface(d),
        )
    state = None
    if thermal_ok and op.power_w is not None:
        state = thermal.steady_state(inputs, op.power_w)
        # the line at the operating temperatures of the two conductors
        hot = Designs(
            a, b, d.shield_thickness, d.jacket_thickness,
            inner={**d.inner, "resistivity_ohm_m": thermal.resistivity_at_temperature(
                d.inner["resistivity_ohm_m"], d.inner["temperature_coefficient_per_k"],
                np.where(state.converged, state.conductor_temperature_c, op.ambient_c))},
            shield={**d.shield, "resistivity_ohm_m": thermal.resistivity_at_temperature(
                d.shield["resistivity_ohm_m"], d.shield["temperature_coefficient_per_k"],
                np.where(state.converged, state.shield_temperature_c, op.ambient_c))},
            dielectric=diel, jacket=d.jacket, eccentricity=d.eccentricity,
            inner_strands=d.inner_strands, **outer_conductor.design_fields(d))
        hot = conductor_layers.heated(  # each layer at its conductor's temperature
            hot, np.where(state.converged, state.conductor_temperature_c, op.ambient_c),
            np.where(state.converged, state.shield_temperature_c, op.ambient_c))
        out = electromagnetic(hot, op, method, reference=d, geometry_factor=lam)
    else:
        out = electromagnetic(d, op, method, geometry_factor=lam)
    out["outer_diameter_m"] = mass.outer_diameter(rd) + 0.0 * a
    out["te11_cutoff_hz"] = modes.te11_cutoff_frequency(a_el, b, diel["relative_permittivity"])
    out["te11_cutoff_approx_hz"] = modes.te11_cutoff_frequency_approx(
        a_el, b, diel["relative_permittivity"])
    # an offset centre conductor: arccosh geometry factor and the field crowding on its near side;
    # stranded: the crowns of the strands; VSWR: the voltage maximum (model/ratings.py)
    out.update(ratings.field_quantities(d, op, a_el, lam))
    out["dc_loop_resistance_ohm_per_km"] = per_m_to_per_km(
        out["dc_resistance_inner_ohm_per_m"] + out["dc_resistance_shield_ohm_per_m"])

    densities = ("density_kg_per_m3",)
    if _has(d.inner, *densities) and _has(d.shield, *densities) and _has(diel, *densities) and (
            no_jacket or _has(jacket, *densities)):
        # a stranded conductor holds less metal than its overall circle (the voids are
        # taken as dielectric-free; their small share of dielectric mass is not counted)
        metal_share = 1.0
        if np.any(np.asarray(d.inner_strands) != 1):
            metal_share = stranding.stranded_metal_fraction(d.inner_strands)
        masses = mass.layer_masses(a, b, c, rd, d.inner["density_kg_per_m3"] * metal_share,
                                   diel["density_kg_per_m3"], d.shield["density_kg_per_m3"],
                                   jacket.get("density_kg_per_m3", 0.0))
        out["mass_kg_per_km"] = per_m_to_per_km(masses.total)
        prices = ("price_per_kg",)
        if _has(d.inner, *prices) and _has(d.shield, *prices) and _has(diel, *prices) and (
                no_jacket or _has(jacket, *prices)):
            out["cost_per_km"] = per_m_to_per_km(mass.material_cost(
                masses, d.inner["price_per_kg"], diel["price_per_kg"], d.shield["price_per_kg"],
                jacket.get("price_per_kg", 0.0)))

    if state is not None:
        out.update({
            "conductor_temperature_c": state.conductor_temperature_c,
            "shield_temperature_c": state.shield_temperature_c,
            "surface_temperature_c": state.surface_temperature_c,
            "temperature_rise_k": state.temperature_rise_k,
            "heat_w_per_m": state.heat_w_per_m,
            "thermal_converged": state.converged.astype(float),
        })
    if thermal_ok and include_max_power and "max_temperature_c" in diel:
        jacket_max = jacket.get("max_temperature_c") if not no_jacket else None
        out["max_power_w"] = thermal.power_rating(inputs, diel["max_temperature_c"], jacket_max)
    out.update(dielectric_out)
    if d.shield_construction is not None:
        outer_conductor.outer_quantities(d, op, out)
    return out
