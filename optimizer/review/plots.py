"""Plots of runs and comparisons: each member's fronts (objective pairs, parallel coordinates)
and the overlay of compared fronts, PNG and SVG (style: :mod:`.figure_style`)."""

from __future__ import annotations

from pathlib import Path

import numpy as np
import pandas as pd

from cablefam.optimizer.inputs.sweep_spec import GEOMETRY_KEYS
from cablefam.optimizer.model.objectives import OBJECTIVES
from cablefam.optimizer.model.quantities import display
from cablefam.optimizer.review.figure_style import (DPI, FADED, FIGURE_SIZE_IN, FORMATS, GRID,
                                                    MARKERS, category_colours, choice_markers,
                                                    material_choice, objective_pairs,
                                                    panel_grid, pyplot, safe_name, save_figure)

__all__ = ["DPI", "FIGURE_SIZE_IN", "FORMATS", "comparison_figure", "front_scatter_figure",
           "parallel_figure", "plot_comparison", "plot_run", "read_evaluated", "safe_name",
           "save_figure"]


def front_scatter_figure(front: pd.DataFrame, objectives, evaluated: pd.DataFrame | None = None,
                         title: str = ""):
    """Pairwise objective scatter of one member's front: colour = catalog, marker = materials;
    feasible evaluated designs faded behind when given."""
    plt = pyplot()
    from matplotlib.lines import Line2D

    pairs = objective_pairs(objectives) or [(0, 0)]
    fig, axes = panel_grid(plt, len(pairs))
    catalogs = list(dict.fromkeys(front["catalog"]))
    colours = category_colours(catalogs)
    choice = material_choice(front)
    markers = choice_markers(choice)
    for ax, (i, j) in zip(axes, pairs):
        cx, cy = OBJECTIVES[objectives[i]].column, OBJECTIVES[objectives[j]].column
        sx, lx = display(cx)
        sy, ly = display(cy)
        if evaluated is not None and len(evaluated) and cx in evaluated and cy in evaluated:
            ev = evaluated[evaluated["feasible"]] if "feasible" in evaluated else evaluated
            ax.scatter(sx * ev[cx], sy * ev[cy], s=4, c=FADED, alpha=0.35, linewidths=0,
                       rasterized=True, zorder=1)
        for cat in catalogs:
            for mat, marker in markers.items():
                sel = (front["catalog"] == cat) & (choice == mat)
                if sel.any():
                    ax.scatter(sx * front.loc[sel, cx], sy * front.loc[sel, cy], s=18,
                               marker=marker, facecolors="none" if marker != "o" else
                               colours[cat], edgecolors=colours[cat], linewidths=0.9,
                               alpha=0.85, zorder=2)
        ax.set_xlabel(lx)
        ax.set_ylabel(ly)
        ax.grid(True, color=GRID, linewidth=0.6)
    handles = [Line2D([], [], linestyle="", marker="s", markersize=8, color=colours[c],
                      label=f"catalog {c}") for c in catalogs]
    handles += [Line2D([], [], linestyle="", marker=m, markersize=7, color="#444444",
                       markerfacecolor="none", label=n) for n, m in markers.items()]
    if evaluated is not None and len(evaluated):
        handles.append(Line2D([], [], linestyle="", marker="o", markersize=4, color=FADED,
                              label="feasible evaluated"))
    fig.legend(handles=handles, loc="outside right center", fontsize=8,
               title=f"materials: {choice.name}", title_fontsize=8)
    fig.suptitle(title)
    return fig


def parallel_figure(front: pd.DataFrame, objectives, title: str = ""):
    """Parallel coordinates of one member's front: objectives, geometry and |Z0|, each axis
    scaled to the front's range (limits printed at the ends), lines coloured by catalog."""
    plt = pyplot()
    from matplotlib.collections import LineCollection
    from matplotlib.lines import Line2D

    columns = [OBJECTIVES[o].column for o in objectives]
    columns += [c for c in (*GEOMETRY_KEYS, "z0_ohm")
                if c in front and c not in columns and front[c].nunique() > 1]
    fig, ax = plt.subplots(figsize=FIGURE_SIZE_IN, dpi=DPI, layout="constrained")
    values = front[columns].to_numpy(dtype=float)
    lo, hi = np.nanmin(values, axis=0), np.nanmax(values, axis=0)
    span = np.where(hi > lo, hi - lo, 1.0)
    z = (values - lo) / span
    x = np.arange(len(columns))
    catalogs = list(dict.fromkeys(front["catalog"]))
    colours = category_colours(catalogs)
    for cat in catalogs:
        sel = (front["catalog"] == cat).to_numpy()
        segs = [np.column_stack([x, row]) for row in z[sel]]
        ax.add_collection(LineCollection(segs, colors=colours[cat], linewidths=0.7, alpha=0.4))
    labels = []
    for k, col in enumerate(columns):
        scale, label = display(col)
        ax.axvline(k, color="#444444", linewidth=0.8)
        ax.text(k, -0.04, f"{scale * lo[k]:.4g}", ha="center", va="top", fontsize=8)
        ax.text(k, 1.04, f"{scale * hi[k]:.4g}", ha="center", va="bottom", fontsize=8)
        labels.append(label.replace(" [", "\n["))
    ax.set_xticks(x, labels, fontsize=8)
    ax.set_xlim(-0.3, len(columns) - 0.7)
    ax.set_ylim(-0.12, 1.12)
    ax.set_yticks([0.0, 1.0], ["front min", "front max"], fontsize=8)
    fig.legend(handles=[Line2D([], [], color=colours[c], label=f"catalog {c}")
                        for c in catalogs], loc="outside lower center", ncols=len(catalogs),
               fontsize=8)
    ax.set_title(title)
    return fig


def plot_run(run_dir, out_dir=None, formats=FORMATS) -> list[Path]:
    """All plots of a run folder (per member: objective scatter, parallel coordinates).

    Written to ``out_dir`` (default ``RUN/plots``); returns the paths written.
    """
    from cablefam.optimizer.run_folder.reader import read_front
    from cablefam.optimizer.run_folder.files import EVALUATED_FILE

    run_dir = Path(run_dir)
    front, provenance = read_front(run_dir)
    objectives = list(provenance["objectives"])
    evaluated = None
    if (run_dir / EVALUATED_FILE).is_file():
        evaluated = read_evaluated(run_dir / EVALUATED_FILE)
    out_dir = Path(out_dir) if out_dir is not None else run_dir / "plots"
    paths: list[Path] = []
    for member in dict.fromkeys(front["member"]):
        sub = front[front["member"] == member]
        if sub.empty:
            continue
        ev = evaluated[evaluated["member"] == member] if evaluated is not None else None
        name = safe_name(member)
        paths += save_figure(front_scatter_figure(
            sub, objectives, ev, f"{run_dir.name}: {member}, Pareto fronts by catalog"),
            out_dir / f"{name}-front", formats)
        paths += save_figure(parallel_figure(
            sub, objectives, f"{run_dir.name}: {member}, parallel coordinates of the front"),
            out_dir / f"{name}-parallel", formats)
    return paths


def read_evaluated(path) -> pd.DataFrame:
    """``evaluated.parquet``; unreadable -> InputError."""
    import pyarrow as pa
    import pyarrow.parquet as pq

    from cablefam.optimizer.errors import InputError
    try:
        return pq.read_table(path).to_pandas()
    except (pa.ArrowException, OSError) as exc:
        raise InputError(f"{path}: unreadable or corrupt Parquet file ({exc})") from None


def comparison_figure(member_comparison):
    """Overlay of every compared front of one member (colour and marker per front)."""
    plt = pyplot()
    mc = member_comparison
    objectives = list(mc.objectives)
    pairs = objective_pairs(objectives) or [(0, 0)]
    fig, axes = panel_grid(plt, len(pairs))
    colours = category_colours(mc.labels)
    for ax, (i, j) in zip(axes, pairs):
        cx, cy = OBJECTIVES[objectives[i]].column, OBJECTIVES[objectives[j]].column
        sx, lx = display(cx)
        sy, ly = display(cy)
        for n, label in enumerate(mc.labels):
            df = mc.fronts[label]
            if df.empty:
                continue
            hv = mc.summaries[label].hypervolume
            ax.scatter(sx * df[cx], sy * df[cy], s=16, marker=MARKERS[n % len(MARKERS)],
                       facecolors="none", edgecolors=colours[label], linewidths=0.9,
                       label=f"{label} (HV {hv:.3g})", zorder=2)
        ax.set_xlabel(lx)
        ax.set_ylabel(ly)
        ax.grid(True, color=GRID, linewidth=0.6)
    axes[0].legend(fontsize=8)
    fig.suptitle(f"{mc.member}: fronts compared", fontsize=11)
    return fig


def plot_comparison(comparison, out_dir, formats=FORMATS) -> list[Path]:
    """One overlay per member of a :class:`cablefam.optimizer.review.compare.Comparison`."""
    paths: list[Path] = []
    for mc in comparison.members:
        if all(df.empty for df in mc.fronts.values()):
            continue
        paths += save_figure(comparison_figure(mc), Path(out_dir) / f"{safe_name(mc.member)}"
                             "-compare", formats)
    return paths
