"""Outer conductors as built (tube, foil, braid, foil + braid, double braid) in the evaluation.

:func:`cablefam.optimizer.model.evaluate.evaluate` calls :func:`outer_quantities` for designs
whose ``shield_construction`` is set; designs without it (every design of an older file or
sweep) are tubes and get exactly the numbers and keys they always had. The physics is in
:mod:`cablefam.physics.outer_conductor`.
"""

from __future__ import annotations

import numpy as np

from cablefam.physics import braid
from cablefam.physics import outer_conductor as oc
from cablefam.physics.units import per_m_to_per_km

#: Values of the braid and foil arrays of designs that do not use them (harmless, finite).
DEFAULTS = {"braid_carriers": 16.0, "braid_ends": 8.0, "braid_wire_diameter": 1.27e-4,
            "braid_angle": float(np.radians(30.0)), "foil_thickness": 2.5e-5}
#: Frequencies per decade at which the screening band is sampled (plus both ends).
BAND_POINTS_PER_DECADE = 4

_BRAID_KEYS = ("braid_carriers", "braid_ends", "braid_wire_diameter_m", "braid_angle_deg")
_KEYS_OF = {"tube": ("shield_thickness_m",), "foil": ("foil_thickness_m",),
            "braid": _BRAID_KEYS, "foil-braid": _BRAID_KEYS + ("foil_thickness_m",),
            "double-braid": _BRAID_KEYS}
_ALL_KEYS = ("shield_thickness_m",) + _BRAID_KEYS + ("foil_thickness_m",)


def check_geometry_keys(g):
    """None, or ``(key, value, reason)`` of the first key that does not fit the construction.

    ``g`` is the ``[geometry]`` model of a design file. A construction needs its own keys
    (:data:`_KEYS_OF`) and accepts no other; the braid must be physically possible (fill
    factor at most 1).
    """
    kind = g.shield_construction or "tube"
    need = _KEYS_OF[kind]
    for key in _ALL_KEYS:
        value = getattr(g, key)
        if key not in need and value is not None:
            return key, value, f"does not apply to shield_construction = {kind!r}"
    for key in need:
        if getattr(g, key) is None:
            return key, None, f"required key is missing for shield_construction = {kind!r}"
    if kind in ("braid", "foil-braid", "double-braid"):
        b = g.dielectric_radius_m + (g.foil_thickness_m or 0.0)
        geo = braid.braid_geometry(b, g.braid_carriers, g.braid_ends, g.braid_wire_diameter_m,
                                   np.radians(g.braid_angle_deg))
        fill = float(geo.fill_factor)
        if fill > 1.0:
            return ("braid_angle_deg", g.braid_angle_deg,
                    f"gives a fill factor F = {fill:.3f} > 1 (more wire than fits: fewer "
                    "carriers or ends, a thinner wire or a smaller angle)")
    return None


def design_outer_fields(g, foil_table):
    """Keyword arguments of :class:`~cablefam.optimizer.model.evaluate.Designs` for a design
    file's ``[geometry]`` (``shield_thickness`` is the radial build of the construction)."""
    if g.shield_construction is None:
        return {"shield_thickness": g.shield_thickness_m}
    code = oc.CONSTRUCTIONS.index(g.shield_construction)
    fields = {
        "shield_construction": np.array([code]),
        "braid_carriers": np.array([float(g.braid_carriers or DEFAULTS["braid_carriers"])]),
        "braid_ends": np.array([float(g.braid_ends or DEFAULTS["braid_ends"])]),
        "braid_wire_diameter": np.array([g.braid_wire_diameter_m
                                         or DEFAULTS["braid_wire_diameter"]]),
        "braid_angle": np.array([np.radians(g.braid_angle_deg) if g.braid_angle_deg
                                 else DEFAULTS["braid_angle"]]),
        "foil_thickness": np.array([g.foil_thickness_m or DEFAULTS["foil_thickness"]]),
        "foil": foil_table,
    }
    build = oc.radial_build(outer_of_fields(fields, None), g.shield_thickness_m or 0.0)
    return {"shield_thickness": float(np.ravel(build)[0]), **fields}


def outer_of_fields(fields, foil_resistivity):
    """An :class:`~cablefam.physics.outer_conductor.OuterConductor` of Designs-style fields."""
    return oc.OuterConductor(
        construction=fields["shield_construction"], carriers=fields["braid_carriers"],
        ends=fields["braid_ends"], wire_diameter=fields["braid_wire_diameter"],
        angle=fields["braid_angle"], foil_thickness=fields["foil_thickness"],
        foil_resistivity=1.0 if foil_resistivity is None else foil_resistivity)


def foil_table(d):
    """The foil's material table of designs ``d`` (the shield's where none is given)."""
    return d.shield if d.foil is None else {**d.shield, **d.foil}


#: The outer-conductor fields of ``Designs``, in field order (``foil``, a table, last).
FIELDS = ("shield_construction", "braid_carriers", "braid_ends", "braid_wire_diameter",
          "braid_angle", "foil_thickness", "foil")


def design_values(d):
    """The outer-conductor arrays of designs ``d`` in field order (without ``foil``)."""
    return [getattr(d, k) for k in FIELDS[:-1]]


def design_fields(d):
    """The outer-conductor fields of designs ``d`` as keyword arguments of ``Designs``."""
    return {k: getattr(d, k) for k in FIELDS}


def outer_of(d):
    """The OuterConductor of designs ``d`` for the physics, or None (every design a tube)."""
    if d.shield_construction is None:
        return None
    fields = {k: getattr(d, k) for k in ("shield_construction", "braid_carriers", "braid_ends",
                                          "braid_wire_diameter", "braid_angle",
                                          "foil_thickness")}
    return outer_of_fields(fields, foil_table(d)["resistivity_ohm_m"])


def screening_frequencies(frequency_hz, band):
    """Sample frequencies [Hz] of the screening band (default: the frequency alone)."""
    if band is None:
        return np.atleast_1d(np.asarray(frequency_hz, dtype=float))
    lo, hi = float(band[0]), float(band[1])
    n = max(2, int(np.ceil(BAND_POINTS_PER_DECADE * np.log10(hi / lo))) + 1)
    return np.geomspace(lo, hi, n)


def transfer_impedance_curve(d, frequencies):
    """|Z_T| [ohm m^-1] of designs ``d`` at ``frequencies``: shape (len(frequencies), n)."""
    outer = outer_of(d)
    f = np.asarray(frequencies, dtype=float).reshape(-1, *([1] * np.ndim(d.inner_radius)))
    z = oc.transfer_impedance(outer, d.dielectric_radius, d.shield_radius,
                              d.shield["resistivity_ohm_m"], f,
                              d.shield.get("relative_permeability", 1.0))
    return np.abs(z)


def outer_quantities(d, op, out):
    """Add the outer-conductor keys to ``out`` and correct the tube-based ones in place.

    New keys: ``braid_fill_factor``, ``braid_optical_coverage`` (0 for a foil or tube),
    ``shield_construction`` (the code of
    :data:`cablefam.physics.outer_conductor.CONSTRUCTIONS`), ``transfer_impedance_ohm_per_m``
    (|Z_T| at the operating frequency), ``transfer_impedance_max_ohm_per_m`` (largest |Z_T|
    over the screening band), and the construction's variables (``braid_carriers``...).
    Corrected for non-tube designs: ``dc_resistance_shield_ohm_per_m``,
    ``dc_loop_resistance_ohm_per_km``, ``mass_kg_per_km``, ``cost_per_km``.
    """
    outer = outer_of(d)
    shape = np.shape(d.inner_radius)
    code = np.broadcast_to(np.asarray(outer.construction), shape)
    b, c = d.dielectric_radius, d.shield_radius
    braided = np.isin(code, (oc.BRAID, oc.FOIL_BRAID, oc.DOUBLE_BRAID))
    b_braid = b + np.where(code == oc.FOIL_BRAID, outer.foil_thickness, 0.0)
    geo = braid.braid_geometry(b_braid, outer.carriers, outer.ends, outer.wire_diameter,
                               outer.angle)
    out["shield_construction"] = code.astype(float)
    # the construction's variables, as a front row needs them to become a design file again
    for key, value in (("braid_carriers", outer.carriers), ("braid_ends", outer.ends),
                       ("braid_wire_diameter_m", outer.wire_diameter),
                       ("braid_angle_deg", np.degrees(outer.angle)),
                       ("foil_thickness_m", outer.foil_thickness)):
        out[key] = np.broadcast_to(np.asarray(value, dtype=float), shape).copy()
    out["braid_fill_factor"] = np.where(braided, geo.fill_factor, 0.0) + 0.0 * b
    out["braid_optical_coverage"] = np.where(braided, geo.optical_coverage, 0.0) + 0.0 * b
    rho_s = d.shield["resistivity_ohm_m"]
    mu_s = d.shield.get("relative_permeability", 1.0)
    band = getattr(op, "screening_band_hz", None)
    if np.ndim(op.frequency_hz) == 0:
        z_f, z_max = oc.transfer_impedance_summary(
            outer, b, c, rho_s, op.frequency_hz,
            None if band is None else screening_frequencies(op.frequency_hz, band), mu_s)
    else:  # a frequency per design: |Z_T| at each, the band (if any) sampled on its own
        z_f = np.abs(oc.transfer_impedance(outer, b, c, rho_s, op.frequency_hz, mu_s))
        z_max = z_f if band is None else np.maximum(z_f, oc.transfer_impedance_summary(
            outer, b, c, rho_s, band[0], screening_frequencies(band[0], band), mu_s)[1])
    out["transfer_impedance_ohm_per_m"] = np.broadcast_to(z_f, shape).copy()
    out["transfer_impedance_max_ohm_per_m"] = np.broadcast_to(z_max, shape).copy()
    if not np.any(code != oc.TUBE):
        return out
    tube = code == oc.TUBE
    r_dc = oc.dc_resistance(outer, b, c, rho_s)
    out["dc_resistance_shield_ohm_per_m"] = np.where(
        tube, out["dc_resistance_shield_ohm_per_m"], r_dc)
    out["dc_loop_resistance_ohm_per_km"] = per_m_to_per_km(
        out["dc_resistance_inner_ohm_per_m"] + out["dc_resistance_shield_ohm_per_m"])
    if "mass_kg_per_km" in out:
        foil = foil_table(d)
        m_new = oc.shield_mass(outer, b, c, d.shield["density_kg_per_m3"],
                               foil.get("density_kg_per_m3", d.shield["density_kg_per_m3"]))
        m_tube = d.shield["density_kg_per_m3"] * np.pi * (c * c - b * b)
        delta_mass = np.where(tube, 0.0, m_new - m_tube)
        out["mass_kg_per_km"] = out["mass_kg_per_km"] + per_m_to_per_km(delta_mass)
        if "cost_per_km" in out:
            foil_mass = np.where(np.isin(code, (oc.FOIL, oc.FOIL_BRAID)),
                                 np.pi * outer.foil_thickness * (2.0 * b + outer.foil_thickness)
                                 * foil.get("density_kg_per_m3", 0.0), 0.0)
            p_s, p_f = d.shield["price_per_kg"], foil.get("price_per_kg", d.shield["price_per_kg"])
            delta_cost = (delta_mass - foil_mass) * p_s + foil_mass * p_f
            out["cost_per_km"] = out["cost_per_km"] + per_m_to_per_km(
                np.where(tube, 0.0, delta_cost))
    return out


def shield_build_m(g) -> float:
    """Radial build ``c - b`` [m] of a design file's ``[geometry]`` (the tube's wall, or the
    layers of the construction)."""
    if g.shield_construction is None:
        return g.shield_thickness_m
    return design_outer_fields(g, None)["shield_thickness"]


def outer_geometry_keys(row) -> dict:
    """The ``[geometry]`` outer-conductor keys of a front row (a mapping of its columns).

    Returns a dict to update the row's geometry with: nothing for a row without the
    construction column (a tube as before); otherwise ``shield_construction`` and the
    construction's own keys (``shield_thickness_m`` excepted: the row has it already, and for
    the other constructions the caller drops it).
    """
    code = row.get("shield_construction") if hasattr(row, "get") else None
    if code is None or not np.isfinite(float(code)):
        return {}
    kind = oc.CONSTRUCTIONS[int(code)]
    keys = {"shield_construction": kind}
    for key in _KEYS_OF[kind]:
        if key == "shield_thickness_m":
            continue
        value = float(row[key])
        keys[key] = int(round(value)) if key in ("braid_carriers", "braid_ends") else value
    return keys


def thermal_shield_properties(d, frequency):
    r"""Shield resistivity [ohm m] and relative permeability [-] for the thermal model, which
    knows only a tube.

    Tube designs (and populations without constructions) get the shield's own values (the
    same arrays: today's numbers). A foil or braid gets a tube of the same radial build whose
    resistance at ``frequency`` equals the construction's at 20 degC. In the skin-effect
    regime (:math:`p = \partial\ln R_{tube}/\partial\ln\rho < 3/4`) the permeability is
    scaled, :math:`\mu_{eff} = \mu_r (R_{outer}/R_{tube})^{1/p}` (the resistivity and its
    temperature coefficient stay the wire's, so :math:`R \propto \sqrt{\rho(T)}` as for a
    braid in that regime); nearer DC the resistivity,
    :math:`\rho_{eff} = \rho (R_{outer}/R_{tube})^{1/p}`. :math:`R_{tube}` is the thin-wall
    form :math:`\mathrm{Re}[\rho\gamma\coth(\gamma t)/(2\pi b)]` (exact in the skin-effect
    limit, within :math:`t/2b` at DC), :math:`p` from a second evaluation at
    :math:`1.01\rho`. An approximation, stated in the README.
    """
    rho = d.shield["resistivity_ohm_m"]
    mu = d.shield.get("relative_permeability", 1.0)
    outer = outer_of(d)
    if outer is None or not np.any(np.asarray(outer.construction) != oc.TUBE):
        return rho, mu
    from cablefam.physics.skin import skin_depth

    b, c = d.dielectric_radius, d.shield_radius

    def r_tube(resistivity):
        gamma = (1.0 + 1.0j) / skin_depth(resistivity, frequency, mu)
        q = np.exp(-2.0 * gamma * (c - b))
        return (resistivity * gamma * (1.0 + q) / (1.0 - q) / (2.0 * np.pi * b)).real

    r_t = r_tube(rho)
    p = np.clip(np.log(r_tube(1.01 * rho) / r_t) / np.log(1.01), 0.25, 1.0)
    r_outer = oc.internal_impedance(outer, b, rho, frequency, mu)[0]
    tube = np.asarray(outer.construction) == oc.TUBE
    scale = np.where(tube, 1.0, (r_outer / r_t) ** (1.0 / p))
    skin = p < 0.75
    return (np.where(tube | skin, rho, rho * scale),
            np.where(tube | ~skin, mu, mu * scale))
