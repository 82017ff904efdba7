"""The outer-conductor variables of the search (issue 12): braid and foil bounds, construction.

They join the decision vector the way the existing ones do (:mod:`.problem`): the free braid
and foil variables after the free geometry variables (continuous; carriers and ends rounded to
integers when decoded), and the construction as one more integer-coded categorical column
after the material choices. A sweep without ``[search] shield_constructions`` adds nothing:
its decision vector and numbers are what they were.
"""

from __future__ import annotations

import numpy as np

from cablefam.optimizer.inputs.sweep_spec import OUTER_KEYS
from cablefam.optimizer.model.outer_conductor import DEFAULTS
from cablefam.physics import outer_conductor as oc

#: Name of the categorical construction column (a key of ``Layout.material_ids``).
CONSTRUCTION = "shield_construction"


def extend_layout(search, bounds, free_geometry, ids, free_materials, members=()):
    """The layout's bounds, free variables, choices and free choices with the outer ones.

    A sweep without constructions whose members set a screening limit or band searches tubes
    with their transfer impedance computed (``shield_constructions = ["tube"]``), so that the
    limit is checked rather than passed over.
    """
    kinds = search.shield_constructions
    if kinds is None and any(getattr(m, "max_transfer_impedance_ohm_per_m", None) is not None
                             or getattr(m, "screening_band_hz", None) is not None
                             for m in members):
        kinds = ["tube"]
    if kinds is None:
        return bounds, free_geometry, ids, free_materials
    bounds = dict(bounds)
    for key in OUTER_KEYS:
        value = getattr(search, key)
        if value is not None:
            bounds[key] = tuple(float(v) for v in value)
    free_geometry = free_geometry + tuple(k for k in OUTER_KEYS
                                          if k in bounds and bounds[k][1] > bounds[k][0])
    ids = {**ids, CONSTRUCTION: tuple(kinds)}
    if len(kinds) > 1:
        free_materials = free_materials + (CONSTRUCTION,)
    return bounds, free_geometry, ids, free_materials


def categorical(layout):
    """The categorical outer column names of a layout (empty for a tube-only sweep)."""
    return (CONSTRUCTION,) if CONSTRUCTION in layout.material_ids else ()


def design_fields(layout, geometry, idx):
    """Keyword arguments of :class:`~cablefam.optimizer.model.evaluate.Designs` for decoded
    rows: ``shield_thickness`` (the radial build) and, with constructions, the outer arrays."""
    if CONSTRUCTION not in layout.material_ids:
        return {"shield_thickness": geometry["shield_thickness_m"]}
    n = len(geometry["shield_thickness_m"])
    names = np.array([oc.CONSTRUCTIONS.index(k) for k in layout.material_ids[CONSTRUCTION]])
    code = names[idx[CONSTRUCTION]]

    def var(key, default):
        return geometry[key] if key in geometry else np.full(n, default)

    fields = {
        "shield_construction": code,
        "braid_carriers": np.round(var("braid_carriers", DEFAULTS["braid_carriers"])),
        "braid_ends": np.round(var("braid_ends", DEFAULTS["braid_ends"])),
        "braid_wire_diameter": var("braid_wire_diameter_m", DEFAULTS["braid_wire_diameter"]),
        "braid_angle": np.radians(var("braid_angle_deg", np.degrees(DEFAULTS["braid_angle"]))),
        "foil_thickness": var("foil_thickness_m", DEFAULTS["foil_thickness"]),
    }
    outer = oc.OuterConductor(fields["shield_construction"], fields["braid_carriers"],
                              fields["braid_ends"], fields["braid_wire_diameter"],
                              fields["braid_angle"], fields["foil_thickness"], 1.0)
    fields["shield_thickness"] = oc.radial_build(outer, geometry["shield_thickness_m"])
    return fields


def min_build(layout):
    """Smallest radial build of the shield layer any design of the layout can have [m]."""
    tube = layout.bounds["shield_thickness_m"][0]
    if CONSTRUCTION not in layout.material_ids:
        return tube
    d = layout.bounds.get("braid_wire_diameter_m", (np.inf,))[0]
    t = layout.bounds.get("foil_thickness_m", (np.inf,))[0]
    build = {"tube": tube, "foil": t, "braid": 2.0 * d, "foil-braid": t + 2.0 * d,
             "double-braid": 4.0 * d}
    return float(min(build[k] for k in layout.material_ids[CONSTRUCTION]))
