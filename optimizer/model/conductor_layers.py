"""Clad and plated conductors and surface roughness in the evaluation of designs.

A conductor's material table (``Designs.inner`` / ``Designs.shield``) may carry these keys,
one value or one array per design (absent: homogeneous and smooth; the old numbers bit for bit):

``cladding_thickness_m``, ``cladding_area_fraction``
    the layer, by thickness or by share of each wire's cross-section (0: none; where one is
    > 0 it sets the layer, the thickness first);
``cladding_resistivity_ohm_m``, ``cladding_temperature_coefficient_per_k``,
``cladding_relative_permeability``, ``cladding_density_kg_per_m3``, ``cladding_price_per_kg``
    the layer metal (a layer without a temperature coefficient takes its conductor's, one
    without a permeability is non-magnetic, one without density or price leaves the mass and
    cost to the core's values);
``surface_roughness_m``
    rms roughness of the current-carrying surface.

The centre conductor's layer is on each strand of a stranded conductor (thickness on the
strand, area share of each strand); the shield's plating is on its inner surface (where the
coax current flows), its area share being that of the wall.
"""

from __future__ import annotations

import dataclasses

import numpy as np

from cablefam.physics import conductor_surface, layered_conductor, stranding
from cablefam.physics.internal_impedance import tube_dc_resistance
from cablefam.physics.conductor_surface import ConductorSurface
from cablefam.physics.thermal_inputs import resistivity_at_temperature

#: Keys of a conductor table that describe its layer and roughness.
LAYER_KEYS = ("cladding_thickness_m", "cladding_area_fraction", "cladding_resistivity_ohm_m",
              "cladding_temperature_coefficient_per_k", "cladding_relative_permeability",
              "cladding_density_kg_per_m3", "cladding_price_per_kg", "surface_roughness_m")


def _has_layer(table) -> bool:
    return table is not None and "cladding_resistivity_ohm_m" in table and (
        np.any(table.get("cladding_thickness_m", 0.0))
        or np.any(table.get("cladding_area_fraction", 0.0)))


def _has_surface(table) -> bool:
    return _has_layer(table) or (table is not None and np.any(table.get("surface_roughness_m",
                                                                        0.0)))


def _strand_radius(d):
    """Radius of each wire of the centre conductor [m] (the overall radius when solid)."""
    if np.any(np.asarray(d.inner_strands) != 1):
        return d.inner_radius / stranding.strand_layup(d.inner_strands).diameter_ratio
    return d.inner_radius


def _inner_layer(d):
    """Thickness [m] and area share [-] of the layer on each wire of the centre conductor."""
    t_given = np.asarray(d.inner.get("cladding_thickness_m", 0.0), dtype=float)
    f_given = np.asarray(d.inner.get("cladding_area_fraction", 0.0), dtype=float)
    r = _strand_radius(d)
    by_thickness = t_given > 0.0
    t = np.where(by_thickness, np.minimum(t_given, r),
                 r * (1.0 - np.sqrt(np.clip(1.0 - f_given, 0.0, 1.0))))
    core = np.maximum(r - t, 0.0)
    f = np.where(by_thickness, 1.0 - (core / r) ** 2, f_given)
    return t, f


def _shield_layer(d):
    """Thickness [m] of the plating at the shield's inner surface and its share of the wall."""
    t_given = np.asarray(d.shield.get("cladding_thickness_m", 0.0), dtype=float)
    f_given = np.asarray(d.shield.get("cladding_area_fraction", 0.0), dtype=float)
    b, c = d.dielectric_radius, d.shield_radius
    by_thickness = t_given > 0.0
    t = np.where(by_thickness, np.minimum(t_given, c - b),
                 np.sqrt(b * b + np.clip(f_given, 0.0, 1.0) * (c * c - b * b)) - b)
    f = np.where(by_thickness, ((b + t) ** 2 - b * b) / (c * c - b * b), f_given)
    return t, f


def _layer_coefficient(table):
    """The layer's temperature coefficient [K^-1]; a layer given without one takes its
    conductor's (0 where neither is known: then nothing is heated anyway)."""
    return table.get("cladding_temperature_coefficient_per_k",
                     table.get("temperature_coefficient_per_k", 0.0))


def _surface(table, t, f):
    return ConductorSurface(
        thickness=t, area_fraction=f,
        resistivity_20c=table.get("cladding_resistivity_ohm_m", table["resistivity_ohm_m"]),
        temperature_coefficient=_layer_coefficient(table),
        relative_permeability=table.get("cladding_relative_permeability", 1.0),
        roughness_rms=table.get("surface_roughness_m", 0.0))


def inner_surface(d) -> ConductorSurface | None:
    """The centre conductor's layer and roughness for the physics; None: homogeneous, smooth."""
    if not _has_surface(d.inner):
        return None
    t, f = _inner_layer(d) if _has_layer(d.inner) else (0.0, 0.0)
    return _surface(d.inner, t, f)


def shield_surface(d) -> ConductorSurface | None:
    """The shield's plating and roughness for the physics; None: homogeneous, smooth."""
    if not _has_surface(d.shield):
        return None
    t, f = _shield_layer(d) if _has_layer(d.shield) else (0.0, 0.0)
    return _surface(d.shield, t, f)


def heated(hot, inner_temperature_c, shield_temperature_c):
    """Designs ``hot`` with each layer's resistivity at its conductor's temperature."""
    tables = {}
    for name, theta in (("inner", inner_temperature_c), ("shield", shield_temperature_c)):
        table = getattr(hot, name)
        if _has_layer(table):
            tables[name] = {**table, "cladding_resistivity_ohm_m": resistivity_at_temperature(
                table["cladding_resistivity_ohm_m"], _layer_coefficient(table), theta)}
    return dataclasses.replace(hot, **tables) if tables else hot


def mass_equivalent(d):
    """Designs whose conductor densities and prices are those of their layers together.

    The mass of a clad conductor is that of each layer (area share times density); its price
    per kilogram the cost of both layers over that mass
    (:func:`cablefam.physics.layered_conductor.layer_mass_and_cost`). Unchanged without layers.
    """
    tables = {}
    for name, layer in (("inner", _inner_layer), ("shield", _shield_layer)):
        table = getattr(d, name)
        if not (_has_layer(table) and "density_kg_per_m3" in table
                and "cladding_density_kg_per_m3" in table):
            continue
        _, f = layer(d)
        mass, cost = layered_conductor.layer_mass_and_cost(
            1.0, f, table["density_kg_per_m3"], table["cladding_density_kg_per_m3"],
            table.get("price_per_kg", 0.0), table.get("cladding_price_per_kg",
                                                      table.get("price_per_kg", 0.0)))
        new = {**table, "density_kg_per_m3": mass}
        if "price_per_kg" in table:
            new["price_per_kg"] = cost / mass
        tables[name] = new
    return dataclasses.replace(d, **tables) if tables else d


def reference_quantities(d, op) -> dict[str, np.ndarray]:
    """DC resistances with the layers in parallel, layer thicknesses and roughness factors.

    Empty for designs without layers or roughness (then nothing is overwritten).
    """
    out = {}
    shape = np.shape(d.inner_radius)
    f_hz = op.frequency_hz
    if _has_surface(d.inner):
        s = inner_surface(d)
        rho = d.inner["resistivity_ohm_m"]
        if _has_layer(d.inner):
            out["dc_resistance_inner_ohm_per_m"] = stranding.stranded_dc_resistance(
                d.inner_radius, d.inner_strands,
                conductor_surface.inner_dc_resistivity(rho, s))
            out["cladding_thickness_inner_m"] = s.thickness
        if "surface_roughness_m" in d.inner:
            out["roughness_factor_inner"] = conductor_surface.surface_roughness_factor(
                s, rho, f_hz, d.inner.get("relative_permeability", 1.0))
    if _has_surface(d.shield):
        s = shield_surface(d)
        rho = d.shield["resistivity_ohm_m"]
        if _has_layer(d.shield):
            rho_dc = layered_conductor.parallel_resistivity(rho, s.resistivity, s.area_fraction)
            out["dc_resistance_shield_ohm_per_m"] = tube_dc_resistance(
                d.dielectric_radius, d.shield_radius, rho_dc)
            out["cladding_thickness_shield_m"] = s.thickness
        if "surface_roughness_m" in d.shield:
            out["roughness_factor_shield"] = conductor_surface.surface_roughness_factor(
                s, rho, f_hz, d.shield.get("relative_permeability", 1.0))
    return {k: np.broadcast_to(v, shape).astype(float) for k, v in out.items()}
