"""The outer-conductor part of a design sheet (issue 12): the transfer-impedance figure and
the braid or foil drawn into the cross-section. Designs without ``shield_construction`` (every
run before it) get nothing here, so their sheets are unchanged."""

from __future__ import annotations

from cablefam.optimizer.inputs.design_file import design_arrays
from cablefam.optimizer.review.screening_figures import (draw_outer_conductor,
                                                         transfer_impedance_figure)


def spec_of(provenance: dict, member: str) -> dict:
    """The member's specification as recorded in the run's provenance ({} if absent)."""
    return next((m for m in provenance.get("members", ()) if m.get("name") == member), {})


def screening_sheet_figures(design, spec: dict, section_figure) -> dict:
    """``{"screening": (figure, alt text)}`` for a design with an outer-conductor
    construction, and the braid or foil drawn into ``section_figure``; {} otherwise."""
    g = design.geometry
    if g.shield_construction is None:
        return {}
    designs, op = design_arrays(design)
    b = float(designs.dielectric_radius[0])
    c = b + float(designs.shield_thickness[0])
    ax = section_figure.axes[0]
    draw_outer_conductor(ax, b, c, g.shield_construction, g.braid_wire_diameter_m,
                         g.braid_carriers)
    band = spec.get("screening_band_hz")
    if band is None and g.shield_construction is not None:
        band = design.operating.screening_band_hz
    limit = spec.get("max_transfer_impedance_ohm_per_m")
    fig = transfer_impedance_figure(designs, float(op.frequency_hz), limit,
                                    None if band is None else tuple(band),
                                    f"Transfer impedance, {g.shield_construction}")
    return {"screening": (fig, "transfer impedance versus frequency (log-log) with the "
                                "member's limit")}
