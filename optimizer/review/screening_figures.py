"""Design-sheet figures of the outer conductor: transfer impedance versus frequency, and the
braid or foil drawn into the cross-section."""

from __future__ import annotations

import numpy as np

from cablefam.optimizer.model.outer_conductor import transfer_impedance_curve
from cablefam.optimizer.review.figure_style import DPI, FIGURE_SIZE_IN, GRID, OKABE_ITO, pyplot
from cablefam.physics import outer_conductor as oc

#: Decades shown on either side of the operating frequency (widened to hold the band).
DECADES_AROUND = 2.0
#: Points of the transfer-impedance curve.
CURVE_POINTS = 121


def screening_frequencies(operating_hz: float, band=None) -> np.ndarray:
    """Frequencies [Hz] of the curve: two decades around f, and the whole band if given."""
    lo = operating_hz / 10 ** DECADES_AROUND
    hi = operating_hz * 10 ** DECADES_AROUND
    if band is not None:
        lo, hi = min(lo, band[0] / 3.0), max(hi, band[1] * 3.0)
    return np.geomspace(lo, hi, CURVE_POINTS)


def transfer_impedance_figure(designs, operating_hz: float, limit=None, band=None,
                              title: str = ""):
    """|Z_T| versus frequency (log-log) of one design, with the member's limit over its
    screening band and the operating frequency marked."""
    plt = pyplot()
    f = screening_frequencies(operating_hz, band)
    z = transfer_impedance_curve(designs, f)[:, 0]
    fig, ax = plt.subplots(figsize=FIGURE_SIZE_IN, dpi=DPI, layout="constrained")
    ax.loglog(f, np.where(z > 0.0, z, np.nan), color=OKABE_ITO["blue"], linewidth=1.4,
              label="|Z_T| (transfer impedance)")
    if limit is not None:
        lo, hi = (operating_hz, operating_hz) if band is None else band
        ax.hlines(limit, lo, hi, colors=OKABE_ITO["vermillion"], linewidth=2.0,
                  label=f"member limit {limit:g} ohm/m over the screening band")
    ax.axvline(operating_hz, color="#666666", linestyle="--", linewidth=0.8,
               label=f"operating frequency {operating_hz:.4g} Hz")
    ax.set_xlabel("frequency [Hz]")
    ax.set_ylabel("|Z_T| [ohm/m]")
    ax.grid(True, which="both", color=GRID, linewidth=0.5)
    ax.legend(fontsize=8)
    ax.set_title(title or "Transfer impedance of the outer conductor")
    return fig


def draw_outer_conductor(ax, b, c, construction: str, wire_diameter=None, carriers=None):
    """Overlay the braid wires (two rings of wires per braid layer, to scale) and the foil
    (a ring of its thickness) on a cross-section axis in mm; a tube is left as drawn."""
    from matplotlib.collections import PatchCollection
    from matplotlib.patches import Circle, Wedge

    if construction == "tube":
        return
    layers = {"foil": 0, "braid": 1, "foil-braid": 1, "double-braid": 2}[construction]
    # the shield annulus drawn by the caller becomes the gaps between the wires
    ax.add_patch(Wedge((0.0, 0.0), 1e3 * c, 0.0, 360.0, width=1e3 * (c - b),
                       facecolor="white", edgecolor="#333333", linewidth=0.4, zorder=2))
    r = 1e3 * b
    notes = []
    if construction in ("foil", "foil-braid"):
        t = 1e3 * (c - b) if layers == 0 else 1e3 * (c - b - 2.0 * wire_diameter)
        ax.add_patch(Wedge((0.0, 0.0), r + t, 0.0, 360.0, width=t,
                           facecolor=OKABE_ITO["sky blue"], edgecolor="none", zorder=3))
        notes.append(f"foil {1e3 * t:.3g} mm (light blue)")
        r += t
    if layers:
        d_mm = 1e3 * wire_diameter
        circles = []
        for k in range(2 * layers):
            rho = r + (k + 0.5) * d_mm
            n = int(max(8, min(2000, 2.0 * np.pi * rho / d_mm)))  # wires seen in a cut
            phi = np.linspace(0.0, 2.0 * np.pi, n, endpoint=False) + (k % 2) * np.pi / n
            circles += [Circle((rho * np.cos(p), rho * np.sin(p)), 0.5 * d_mm) for p in phi]
        ax.add_collection(PatchCollection(circles, facecolor=OKABE_ITO["blue"],
                                          edgecolor="none", zorder=4))
        notes.append(f"{'two braids' if layers == 2 else 'braid'}: {int(carriers or 0)} "
                     f"carriers, wire {d_mm:.3g} mm (blue dots, to scale)")
    ax.text(0.01, 0.01, f"outer conductor: {construction}; " + "; ".join(notes),
            transform=ax.transAxes, fontsize=7, va="bottom")


def construction_name(code) -> str:
    """Name of a construction code (``shield_construction`` column)."""
    return oc.CONSTRUCTIONS[int(code)]
