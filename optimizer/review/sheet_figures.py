"""The figures of a design sheet: cross-section, field profiles, frequency response and the
design's place on its member's front (style: :mod:`.figure_style`)."""

from __future__ import annotations

import numpy as np
import pandas as pd

from cablefam.optimizer.model.objectives import OBJECTIVES
from cablefam.optimizer.model.quantities import QUANTITIES, display
from cablefam.optimizer.model.slots import SLOTS
from cablefam.optimizer.review.figure_style import (DPI, FIGURE_SIZE_IN, GRID, MARKERS,
                                                    OKABE_ITO, category_colours,
                                                    objective_pairs, panel_grid, pyplot)


def cross_section_figure(a, b, c, d, names: dict[str, str], offset: float = 0.0):
    """The cable's cross-section to scale (axes in mm, equal aspect); the centre conductor
    is drawn ``offset`` [m] off the axis when it is eccentric."""
    plt = pyplot()
    from matplotlib.patches import Circle

    fig, ax = plt.subplots(figsize=FIGURE_SIZE_IN, dpi=DPI, layout="constrained")
    layers = [("jacket", d, OKABE_ITO["black"]), ("shield", c, OKABE_ITO["blue"]),
              ("dielectric", b, OKABE_ITO["yellow"]), ("conductor", a, OKABE_ITO["vermillion"])]
    for table, radius, colour in layers:
        if table == "jacket" and d <= c:
            continue
        centre = (1e3 * offset if table == "conductor" else 0.0, 0.0)
        ax.add_patch(Circle(centre, 1e3 * radius, facecolor=colour, edgecolor="#333333",
                            linewidth=0.6, alpha=0.85 if table == "jacket" else 1.0,
                            label=f"{SLOTS[table].label}: {names.get(table) or '-'}, "
                                  f"r = {1e3 * radius:.4g} mm"))
    lim = 1.08e3 * max(c, d)
    ax.set_xlim(-lim, lim)
    ax.set_ylim(-lim, lim)
    ax.set_aspect("equal")
    ax.set_xlabel("x [mm]")
    ax.set_ylabel("y [mm]")
    fig.legend(loc="outside lower center", ncols=2, fontsize=8)
    ax.set_title("Cross-section to scale")
    return fig


def profile_figure(profile: pd.DataFrame, a, b, c, d, note: str = ""):
    """B(r), |J(r)| and E(r) amplitudes across the regions, boundaries dashed."""
    plt = pyplot()
    fig, axes = plt.subplots(3, 1, figsize=FIGURE_SIZE_IN, dpi=DPI, layout="constrained",
                             sharex=True)
    r_mm = 1e3 * profile["r_m"].to_numpy()
    j = profile["j_a_per_m2"].to_numpy(dtype=float)
    series = [("b_t", "|B| [mT]", 1e3 * profile["b_t"].to_numpy(), "linear"),
              ("j_a_per_m2", "|J| [A/m$^2$]", np.where(j > 0.0, j, np.nan), "log"),
              ("e_v_per_m", "E [kV/m]", 1e-3 * profile["e_v_per_m"].to_numpy(), "linear")]
    colours = (OKABE_ITO["blue"], OKABE_ITO["vermillion"], OKABE_ITO["bluish green"])
    for ax, (_, label, y, scale), colour in zip(axes, series, colours):
        ax.plot(r_mm, y, color=colour, linewidth=1.2)
        ax.set_yscale(scale)
        ax.set_ylabel(label)
        for radius in (a, b, c, d):
            ax.axvline(1e3 * radius, color="#666666", linestyle="--", linewidth=0.7)
        ax.grid(True, color=GRID, linewidth=0.6)
    if np.any(j > 0.0):
        peak = float(np.nanmax(j))
        axes[1].set_ylim(peak * 1e-4, peak * 2.0)  # four decades: the skin layers
    axes[-1].set_xlabel("radius r [mm] (dashed: a, b, c, d)")
    axes[0].set_title(f"Field profiles at the operating point{': ' + note if note else ''}",
                      fontsize=10)
    return fig


def frequency_figure(freq: pd.DataFrame, operating_hz: float, te11_hz: float | None,
                     power_w: float | None):
    """Attenuation and maximum CW power versus frequency (log axes)."""
    plt = pyplot()
    fig, (ax1, ax2) = plt.subplots(2, 1, figsize=FIGURE_SIZE_IN, dpi=DPI, layout="constrained",
                                   sharex=True)
    f = freq["frequency_hz"].to_numpy() / 1e6
    ax1.loglog(f, freq["attenuation_20c_db_per_100m"], color=OKABE_ITO["blue"],
               label="conductors at 20 degC")
    if "attenuation_hot_db_per_100m" in freq and power_w:
        ax1.loglog(f, freq["attenuation_hot_db_per_100m"], color=OKABE_ITO["vermillion"],
                   linestyle="--", label=f"at {power_w:g} W CW and the member's ambient")
    ax1.set_ylabel(QUANTITIES["attenuation_db_per_100m"].with_unit)
    if "max_power_w" in freq:
        ax2.loglog(f, freq["max_power_w"], color=OKABE_ITO["bluish green"])
    ax2.set_ylabel(QUANTITIES["max_power_w"].with_unit)
    ax2.set_xlabel("frequency [MHz]")
    for ax in (ax1, ax2):
        ax.axvline(operating_hz / 1e6, color="#444444", linewidth=0.8,
                   label="operating frequency")
        if te11_hz is not None and te11_hz <= f[-1] * 1e6 * 1.0001:
            ax.axvline(te11_hz / 1e6, color=OKABE_ITO["reddish purple"], linestyle=":",
                       label="TE11 cutoff")
        ax.grid(True, which="both", color="#E5E5E5", linewidth=0.5)
    ax1.legend(fontsize=8)
    ax1.set_title("Attenuation and power handling versus frequency", fontsize=10)
    return fig


def front_position_figure(member_front: pd.DataFrame, row, objectives, title: str = ""):
    """The member's front by catalog, with one design marked."""
    plt = pyplot()
    pairs = objective_pairs(objectives) or [(0, 0)]
    fig, axes = panel_grid(plt, len(pairs))
    catalogs = list(dict.fromkeys(member_front["catalog"]))
    colours = category_colours(catalogs)
    for ax, (i, j) in zip(axes, pairs):
        cx, cy = OBJECTIVES[objectives[i]].column, OBJECTIVES[objectives[j]].column
        sx, lx = display(cx)
        sy, ly = display(cy)
        for n, cat in enumerate(catalogs):
            sel = member_front["catalog"] == cat
            ax.scatter(sx * member_front.loc[sel, cx], sy * member_front.loc[sel, cy], s=14,
                       marker=MARKERS[n % len(MARKERS)], facecolors="none",
                       edgecolors=colours[cat], linewidths=0.8, label=f"catalog {cat}")
        ax.scatter([sx * row[cx]], [sy * row[cy]], s=180, marker="*", color="black",
                   zorder=3, label="this design")
        ax.set_xlabel(lx)
        ax.set_ylabel(ly)
        ax.grid(True, color=GRID, linewidth=0.6)
    axes[0].legend(fontsize=8)
    fig.suptitle(title, fontsize=10)
    return fig
